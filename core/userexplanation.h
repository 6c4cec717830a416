// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/evalsettings.h"
#include "core/evaluation.h"
#include "core/metric.h"
#include "core/run.h"
#include "core/warning.h"

#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

namespace slatewise::core {

/// Everything shown when one user is explained under one run: the top-k list with its
/// markers, the withheld items with the run's scores and list ranks, the per-user metrics
/// against the run's mean, every warning sentence and the train history for the genre
/// timeline. A plain value: `slatewise explain` prints it, the GUI's user inspector shows it.
struct UserExplanation {
    struct ListRow {
        std::int32_t rank = 0; ///< 1-based
        ItemIndex item;
        std::string itemId;
        std::string title;
        std::int32_t year = 0;
        std::vector<std::string> genres;
        std::string series;         ///< empty when not in a series
        std::int32_t seriesPart = 0;
        double score = std::nan(""); ///< the list's score; NaN when the lists file had none
        bool withheld = false;      ///< among the user's withheld items
        double withheldRating = std::nan("");
        bool hit = false;           ///< withheld with a rating ≥ relevant_at
        bool seen = false;          ///< already in the train history
        bool orderViolation = false;
        std::vector<std::int32_t> missingParts; ///< for an order violation
        std::vector<std::string> missingTitles;
    };

    struct WithheldRow {
        ItemIndex item;
        std::string itemId;
        std::string title;
        std::int32_t year = 0;
        std::vector<std::string> genres;
        std::string series;
        std::int32_t seriesPart = 0;
        double rating = 0.0;
        bool relevant = false;
        double score = std::nan(""); ///< the run's score; NaN when it gave none
        std::int32_t listRank = 0;   ///< rank in the run's full list; 0 when not listed at all
        bool inTopK = false;
    };

    struct HistoryRow {
        Timestamp time = kNoTimestamp;
        ItemIndex item;
        std::string itemId;
        std::string title;
        double rating = 0.0;
        std::vector<std::int32_t> genres; ///< indices into genreNames
    };

    struct MetricRow {
        Metric metric = Metric::Rmse;
        double user = std::nan("");    ///< NaN when not defined for this user
        double runMean = std::nan(""); ///< mean over the run's users where defined
    };

    UserIndex user;
    std::string userId;
    std::string runName;
    std::int32_t k = 10;
    double relevantAt = 4.0;
    bool evaluated = false;  ///< the user has withheld items, so per-user results exist
    bool runHasLists = false;
    bool runHasScores = false;
    std::int32_t nTrain = 0, nWithheld = 0, nRelevant = 0;
    std::int32_t fullListLength = 0; ///< entries in the run's list before cutting to k
    std::string burstGenre;          ///< recent-burst genre, empty when none

    std::vector<ListRow> list; ///< the top k
    std::vector<WithheldRow> withheld; ///< by rating descending, then title
    std::vector<MetricRow> metrics;    ///< every metric, in Metric order
    std::vector<UserWarning> warnings; ///< in code order
    std::vector<HistoryRow> history;   ///< oldest first
    std::vector<std::string> genreNames;

    /// Builds the explanation from data already in memory; `eval` must be the evaluation
    /// of `run` over `data` (its settings give k and the relevance threshold).
    static UserExplanation build(const Dataset& data, const DatasetStats& stats, const RunData& run,
                                 const RunEvaluation& eval, UserIndex user);

    /// The explanation as a JSON object (NaN as null), for `slatewise explain --json`.
    std::string toJson() const;
};

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"
#include "core/metric.h"
#include "core/warning.h"

#include <array>
#include <cstdint>
#include <string>
#include <vector>

namespace slatewise::core {
struct Dataset;
struct RunData;
struct RunEvaluation;
} // namespace slatewise::core

namespace slatewise::ui {

/// Everything the user inspector shows for one user under one run, as plain values:
/// the run's top-k list and the user's withheld items, each marked for hits, items already
/// seen and series-order problems, the warnings, and the user's metrics beside the run's mean.
struct UserInspection {
    struct ListRow {
        std::int32_t rank = 0; ///< 1-based
        core::ItemIndex item;
        double score = 0.0;          ///< NaN when the list carried no score
        double withheldRating = 0.0; ///< NaN when the item is not among the user's withheld items
        bool hit = false;            ///< withheld and rated at or above the relevance threshold
        bool seen = false;           ///< already in the user's train history
        bool outOfOrder = false;     ///< a later series part whose earlier parts are unseen and not above it
        std::vector<std::int32_t> missingParts; ///< the earlier parts missing, when outOfOrder
    };
    struct WithheldRow {
        core::ItemIndex item;
        double rating = 0.0;
        double score = 0.0;       ///< the run's score for this pair; NaN when missing
        std::int32_t rank = 0;    ///< position in the run's whole list; 0 when not listed at all
        bool relevant = false;    ///< rating >= relevant_at
        bool inTopK = false;      ///< listed within the first k
        bool outOfOrder = false;  ///< it is a series part the list offers out of order
    };

    core::UserIndex user;
    std::string runName;
    std::int32_t k = 10;
    double relevantAt = 4.0;
    std::int32_t trainCount = 0;
    bool found = false; ///< the user has results under this run
    std::vector<ListRow> list;         ///< the top k, by rank
    std::vector<WithheldRow> withheld; ///< by rating descending, then rank (listed first), then item
    std::vector<core::UserWarning> warnings;
    std::array<double, core::kMetricCount> metrics{};
    std::array<double, core::kMetricCount> runMean{};

    std::int32_t hits() const;
    /// Per-metric mean over the users where it is defined (cache it per evaluation).
    static std::array<double, core::kMetricCount> columnMeans(const core::RunEvaluation& eval);
    static UserInspection build(const core::Dataset& data, const core::RunData& run, const core::RunEvaluation& eval,
                                core::UserIndex user, const std::array<double, core::kMetricCount>& runMean);
};

} // namespace slatewise::ui

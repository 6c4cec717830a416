// SPDX-License-Identifier: MIT
#pragma once

#include "core/evalsettings.h"
#include "core/ids.h"
#include "core/metric.h"
#include "core/warning.h"

#include <array>
#include <cmath>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace slatewise::core {

struct Interval {
    double low = std::nan("");
    double high = std::nan("");
};

struct BandStats {
    double rating = 0.0;
    std::int64_t n = 0;
    double rmse = 0.0;
    double mae = 0.0;
    double meanError = 0.0;
};

struct AccuracySummary {
    std::int64_t n = 0;             ///< scored withheld pairs
    std::int64_t missingScores = 0; ///< withheld pairs without a score
    double scoredFraction = 0.0;
    double rmse = 0.0;
    double mae = 0.0;
    double meanError = 0.0;
    double userRmseMean = 0.0;
    double heldoutTopk = std::nan(""); ///< mean over users with a scored withheld item (also in RankingSummary)
    std::vector<BandStats> bands; ///< ascending by rating
};

struct Curves {
    std::vector<std::int32_t> k; ///< 1..curveMaxK
    std::vector<double> precision, recall, ndcg;
};

struct RankingSummary {
    std::int64_t users = 0;            ///< users with at least one relevant withheld item
    std::int64_t usersWithoutList = 0; ///< of those, users the run gave no list
    double precision = 0, recall = 0, hitRate = 0, mrr = 0, map = 0, ndcg = 0, ndcgGraded = 0;
    double heldoutTopk = std::nan(""); ///< NaN when the run has no scores
    Curves curves;
};

struct BeyondSummary {
    double ild = std::nan("");
    double novelty = std::nan("");
    double coverage = 0;
    double gini = 0;
    double popularityLift = std::nan("");
    double calibrationKl = std::nan("");
    double seriesShare = std::nan("");
    std::int64_t orderViolations = 0;
    double orderViolationsUsers = 0; ///< share of users with a list that have at least one
    double burstEcho = 0;            ///< share of users (with timestamps) whose list echoes a burst
    std::int64_t burstSkippedUsers = 0; ///< users without timestamps
    std::int64_t seenInList = 0;
    double seenInListUsers = 0;
};

/// Per-user results, column-wise so that 200,000 users sort and filter fast.
/// Row r describes users[r]; a NaN metric is "not defined for this user".
struct UserResultTable {
    std::vector<UserIndex> users;
    std::vector<std::int32_t> nWithheld, nRelevant, nTrain, warningCount;
    std::array<std::vector<double>, kMetricCount> metrics;

    std::size_t size() const { return users.size(); }
    double value(Metric m, std::size_t row) const { return metrics[static_cast<std::size_t>(m)][row]; }
    std::vector<double>& column(Metric m) { return metrics[static_cast<std::size_t>(m)]; }
    const std::vector<double>& column(Metric m) const { return metrics[static_cast<std::size_t>(m)]; }
    void resize(std::size_t n);
};

/// One run evaluated under one set of settings. Sections a run cannot have are empty.
struct RunEvaluation {
    std::string runName;
    std::int64_t runId = 0;
    EvalSettings settings;
    std::string computedAt;
    std::optional<AccuracySummary> accuracy; ///< needs scores
    std::optional<RankingSummary> ranking;   ///< needs lists
    std::optional<BeyondSummary> beyond;     ///< needs lists
    std::map<std::string, Interval> ci;      ///< by aggregate key ("rmse", "ndcg", ...)
    std::map<std::string, double> warningShare; ///< by warning key: share of evaluated users carrying it
    UserResultTable users;                   ///< users with at least one withheld item
    std::vector<UserWarning> warnings;       ///< sorted by user, then code
};

} // namespace slatewise::core

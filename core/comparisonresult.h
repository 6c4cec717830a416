// SPDX-License-Identifier: MIT
#pragma once

#include "core/comparisonsettings.h"
#include "core/error.h"
#include "core/evaluation.h"
#include "core/ids.h"
#include "core/metric.h"

#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

namespace slatewise::core {

/// The paired comparison of one metric over the users both runs define it for.
/// Differences are candidate - base throughout (the t statistic is scipy's
/// ttest_rel(candidate, base)).
struct MetricComparison {
    Metric metric = Metric::Ndcg;
    std::int64_t n = 0; ///< users with the metric defined in both runs
    double meanBase = std::nan("");
    double meanCandidate = std::nan("");
    double meanDiff = std::nan("");
    double sdDiff = std::nan("");
    Interval ci;                       ///< percentile bootstrap interval of the mean difference
    double t = std::nan("");
    double df = std::nan("");
    double pT = std::nan("");          ///< paired t-test, two-sided
    double wilcoxonW = std::nan("");   ///< min(T+, T-)
    double pWilcoxon = std::nan("");
    bool wilcoxonExact = false;
    std::int64_t wilcoxonZeros = 0;    ///< zero differences dropped by the signed-rank test
    double pHolm = std::nan("");       ///< p_t adjusted by Holm across the family (see notes)
    double pHolmWilcoxon = std::nan(""); ///< p_wilcoxon adjusted the same way
    std::int64_t wins = 0, ties = 0, losses = 0; ///< per user, from the candidate's side
    double effectSize = std::nan("");  ///< mean difference / sd of differences
    bool tooSmall = false;             ///< n below ComparisonSettings::minSegmentSize
    bool significant = false;          ///< pHolm < alpha
    std::string verdict;               ///< one plain sentence or two
};

/// One segment of users with the comparison of every metric inside it.
struct SegmentComparison {
    std::string group; ///< "activity", "genre" or "warning:CODE"
    std::string name;  ///< e.g. "activity:q2", "genre:Comedy", "warning:cold", "not warning:cold"
    std::string label; ///< plain description, e.g. "12 to 30 train interactions"
    std::int64_t size = 0; ///< evaluated users in the segment
    bool tooSmall = false;
    std::vector<MetricComparison> metrics;
};

/// A user who lost most on the primary metric, with the warnings each run raised for them.
struct WorseUser {
    UserIndex user;
    std::string userId;
    double base = std::nan("");
    double candidate = std::nan("");
    double loss = std::nan(""); ///< > 0: how much worse the candidate is, in the metric's unit
    std::vector<std::string> baseWarnings;      ///< warning codes
    std::vector<std::string> candidateWarnings;
};

/// Per-user values of one metric, for the chart of per-user differences.
struct UserDifferences {
    Metric metric = Metric::Ndcg;
    std::vector<UserIndex> users;
    std::vector<double> base;
    std::vector<double> candidate;
};

/// Everything `slatewise compare` and the comparison screen show.
struct RunComparison {
    std::string base;
    std::string candidate;
    std::int64_t baseRunId = 0;
    std::int64_t candidateRunId = 0;
    std::string evaluationSettings; ///< EvalSettings::toJson() both runs were evaluated under
    ComparisonSettings settings;
    std::string computedAt;         ///< set when stored
    std::vector<MetricComparison> metrics;
    std::vector<SegmentComparison> segments;
    bool hasPrimary = false;
    Metric primary = Metric::Ndcg;  ///< the metric of the who-got-worse list
    std::vector<WorseUser> whoGotWorse;
    std::vector<UserDifferences> perUser;
    std::vector<std::string> notes; ///< how p-values were adjusted, skipped metrics, ...

    /// The workspace key of a stored comparison: comparison and evaluation settings.
    std::string settingsKey() const;
    /// JSON as written by `slatewise compare --json` (per-user vectors only when asked).
    std::string toJson(bool includePerUser = false, int indent = 2) const;
    static Result<RunComparison> fromJson(const std::string& json);
};

} // namespace slatewise::core

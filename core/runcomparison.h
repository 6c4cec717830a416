// SPDX-License-Identifier: MIT
#pragma once

#include "core/comparisonresult.h"
#include "core/comparisonsettings.h"
#include "core/dataset.h"
#include "core/error.h"
#include "core/evaluation.h"
#include "core/progress.h"

#include <span>
#include <vector>

namespace slatewise::core {

/// Paired per-user comparison of two runs evaluated under the same settings ("is the
/// candidate better than the base, for whom, and is the difference real?").
///
/// For each metric, over the users both runs define it for (differences candidate - base):
/// means, the percentile bootstrap interval of the mean difference (users resampled), the
/// paired t-test, the Wilcoxon signed-rank test (scipy 1.10 rules), wins/ties/losses in the
/// metric's better direction, the effect size mean/sd of the differences, and p-values adjusted
/// by Holm across all metrics compared (segments form a second family of their own).
/// Segments, the who-got-worse list on the primary metric (the first metric with a better
/// direction) and the per-user values come with it. Pure: reads only its arguments.
/// Errors: Usage when the runs were evaluated under different settings or no metric is defined
/// for both; Cancelled when progress.cancel is raised.
Result<RunComparison> compareRuns(const RunEvaluation& base, const RunEvaluation& candidate, const Dataset& data,
    const DatasetStats& stats, const ComparisonSettings& settings, const Progress& progress = {});

/// The comparison of one metric on paired values (same order, NaN-free). Holm fields and the
/// verdict are filled as for a family of one; compareRuns() adjusts them afterwards.
MetricComparison compareValues(
    Metric metric, std::span<const double> base, std::span<const double> candidate, const ComparisonSettings& settings);

/// When several run pairs are compared at once: Holm across every metric of every pair (and,
/// separately, across every segment row of every pair); verdicts and notes are rewritten.
std::vector<RunComparison> adjustAcrossPairs(std::vector<RunComparison> comparisons);

/// The plain-language verdict of one metric comparison, from its adjusted p-value and interval.
std::string comparisonVerdict(const MetricComparison& m, const ComparisonSettings& settings);

/// The verdict in a few words, for a table column: "significant: candidate better",
/// "not significant", "too small to judge", …
std::string shortVerdict(const MetricComparison& m);

} // namespace slatewise::core

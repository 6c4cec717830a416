// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"

#include <string>
#include <vector>

namespace slatewise::ui {

/// Precision, recall and NDCG against k for several runs, cut to k <= maxK, ready to draw.
struct KCurveSeries {
    enum class Measure { Precision, Recall, Ndcg, Count };

    struct Line {
        std::string run;
        Measure measure = Measure::Precision;
        std::vector<double> k;
        std::vector<double> value;
    };

    std::vector<Line> lines;            ///< run-major: for each run with lists, its three measures
    std::vector<std::string> runs;      ///< runs with lists, input order
    std::vector<std::string> skippedRuns; ///< runs without lists
    int maxK = 50;
    int evaluatedK = 10;                ///< the k of the evaluation (drawn as a marker line)

    static KCurveSeries build(const std::vector<core::RunEvaluation>& runs, int maxK = 50);

    /// The line for (run, measure), or nullptr.
    const Line* line(const std::string& run, Measure measure) const;
    /// Highest value over all lines of one measure (for a shared y range); 0 when none.
    double maxValue(Measure measure) const;
    static const char* label(Measure measure); ///< "precision@k" ...
};

} // namespace slatewise::ui

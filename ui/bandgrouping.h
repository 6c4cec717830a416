// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"

#include <cstdint>
#include <string>
#include <vector>

namespace slatewise::ui {

/// Lays out the error-by-rating-band chart: one group per distinct withheld rating (the
/// union over runs), one bar per run inside each group. Pure geometry and values; a run
/// without a band (or without scores) has NaN there, so the chart leaves a gap.
struct BandGrouping {
    std::vector<double> ratings;        ///< band ratings, ascending
    std::vector<std::string> runs;      ///< runs with scores, in input order
    std::vector<std::vector<double>> rmse;      ///< [run][band]
    std::vector<std::vector<double>> meanError; ///< [run][band], score - rating
    std::vector<std::vector<std::int64_t>> n;   ///< [run][band], 0 when absent
    std::vector<std::string> skippedRuns;       ///< runs without scores (no accuracy section)
    double groupWidth = 0.8;            ///< share of the gap between band centres used by bars

    static BandGrouping build(const std::vector<core::RunEvaluation>& runs);

    /// Width of one bar, in rating units.
    double barWidth() const;
    /// Centre x of run `run`'s bar in band `band`.
    double barCentre(std::size_t run, std::size_t band) const;
    /// Gap between neighbouring band centres (smallest difference of ratings; 1 when one band).
    double bandSpacing() const;
    /// Largest withheld count of a band over runs (for the "n =" label under the group).
    std::int64_t bandCount(std::size_t band) const;
};

} // namespace slatewise::ui

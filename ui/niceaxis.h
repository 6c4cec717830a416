// SPDX-License-Identifier: MIT
#pragma once

#include <vector>

namespace slatewise::ui {

/// A readable axis range: bounds and tick step are 1, 2, 2.5 or 5 times a power of ten,
/// so tick labels are short ("0.25", not "0.2371").
struct NiceAxis {
    double low = 0.0;
    double high = 1.0;
    double step = 0.2;
    std::vector<double> ticks; ///< low, low + step, ..., high

    /// Covers [min, max] with about `targetTicks` intervals. A degenerate range (min == max)
    /// is widened around the value; NaN or infinite input gives [0, 1].
    static NiceAxis compute(double min, double max, int targetTicks = 5);
    /// The nearest "nice" number to `x` (> 0): 1, 2, 2.5, 5 times a power of ten.
    /// `round` picks the nearest; otherwise the smallest nice number >= x.
    static double niceNumber(double x, bool round);
    /// Decimals needed to print every tick of this axis without trailing noise.
    int decimals() const;
};

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/niceaxis.h"

#include <algorithm>
#include <cmath>

namespace slatewise::ui {

double NiceAxis::niceNumber(double x, bool round)
{
    if (!(x > 0.0) || !std::isfinite(x))
        return 1.0;
    const double exponent = std::floor(std::log10(x));
    const double power = std::pow(10.0, exponent);
    const double fraction = x / power;
    double nice = 10.0;
    if (round) {
        // Nearest of 1, 2, 2.5, 5, 10 on a log scale (geometric midpoints).
        if (fraction < std::sqrt(2.0))
            nice = 1.0;
        else if (fraction < std::sqrt(5.0))
            nice = 2.0;
        else if (fraction < std::sqrt(12.5))
            nice = 2.5;
        else if (fraction < std::sqrt(50.0))
            nice = 5.0;
    } else {
        // A tiny slack so 0.3 / 0.1 style rounding noise does not jump a step.
        const double f = fraction * (1.0 - 1e-9);
        if (f <= 1.0)
            nice = 1.0;
        else if (f <= 2.0)
            nice = 2.0;
        else if (f <= 2.5)
            nice = 2.5;
        else if (f <= 5.0)
            nice = 5.0;
    }
    return nice * power;
}

NiceAxis NiceAxis::compute(double min, double max, int targetTicks)
{
    NiceAxis axis;
    if (!std::isfinite(min) || !std::isfinite(max)) {
        axis.ticks = {0.0, 0.2, 0.4, 0.6, 0.8, 1.0};
        return axis;
    }
    if (min > max)
        std::swap(min, max);
    if (min == max) {
        const double pad = min == 0.0 ? 1.0 : std::abs(min) * 0.1;
        min -= pad;
        max += pad;
    }
    targetTicks = std::max(1, targetTicks);
    axis.step = niceNumber((max - min) / targetTicks, false);
    axis.low = std::floor(min / axis.step + 1e-9) * axis.step;
    axis.high = std::ceil(max / axis.step - 1e-9) * axis.step;
    const auto count = static_cast<int>(std::llround((axis.high - axis.low) / axis.step));
    axis.ticks.reserve(static_cast<std::size_t>(count) + 1);
    for (int i = 0; i <= count; ++i) {
        double t = axis.low + axis.step * i;
        if (std::abs(t) < axis.step * 1e-9)
            t = 0.0; // avoid "-0"
        axis.ticks.push_back(t);
    }
    return axis;
}

int NiceAxis::decimals() const
{
    // Steps are 1, 2, 2.5 or 5 x 10^e: 2.5 needs one decimal more than its exponent.
    if (!(step > 0.0))
        return 0;
    int d = 0;
    double s = step;
    while (d < 12 && std::abs(s - std::round(s)) > 1e-6 * std::max(1.0, s)) {
        s *= 10.0;
        ++d;
    }
    return d;
}

} // namespace slatewise::ui

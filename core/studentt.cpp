// SPDX-License-Identifier: MIT
#include "core/studentt.h"

#include "core/incompletebeta.h"
#include "core/normaldistribution.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace slatewise::core {

namespace {

/// P(|T| >= |t|): both pieces of the beta argument are formed directly, not as 1 - x.
double twoTail(double t, double df)
{
    if (std::isinf(df))
        return 2.0 * normalSf(std::fabs(t));
    if (std::isinf(t))
        return 0.0;
    const double t2 = t * t;
    const double x = df / (df + t2);
    const double y = t2 / (df + t2);
    return regularizedIncompleteBeta(0.5 * df, 0.5, x, y);
}

} // namespace

double studentTTwoSidedP(double t, double df)
{
    if (std::isnan(t) || std::isnan(df) || !(df > 0.0))
        return std::numeric_limits<double>::quiet_NaN();
    return twoTail(t, df);
}

double studentTSf(double t, double df)
{
    if (std::isnan(t) || std::isnan(df) || !(df > 0.0))
        return std::numeric_limits<double>::quiet_NaN();
    const double half = 0.5 * twoTail(t, df);
    return t >= 0.0 ? half : 1.0 - half;
}

double studentTCdf(double t, double df)
{
    if (std::isnan(t) || std::isnan(df) || !(df > 0.0))
        return std::numeric_limits<double>::quiet_NaN();
    const double half = 0.5 * twoTail(t, df);
    return t <= 0.0 ? half : 1.0 - half;
}

double studentTQuantile(double q, double df)
{
    if (!(q > 0.0) || !(q < 1.0) || !(df > 0.0))
        return std::numeric_limits<double>::quiet_NaN();
    if (q == 0.5)
        return 0.0;
    // Solve in the tail nearer to q so a quantile such as 0.975 keeps full precision.
    const bool upper = q > 0.5;
    const double tail = upper ? 1.0 - q : q;
    double lo = 0.0;
    double hi = 1.0;
    while (studentTSf(hi, df) > tail && hi < 1e300)
        hi *= 2.0;
    for (int i = 0; i < 400 && hi - lo > 1e-13 * std::max(1.0, hi); ++i) {
        const double mid = 0.5 * (lo + hi);
        if (studentTSf(mid, df) > tail)
            lo = mid;
        else
            hi = mid;
    }
    const double t = 0.5 * (lo + hi);
    return upper ? t : -t;
}

} // namespace slatewise::core

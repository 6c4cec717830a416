// SPDX-License-Identifier: MIT
#include "core/incompletebeta.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace slatewise::core {

namespace {

/// lgamma(z) - ((z - 0.5) ln z - z + 0.5 ln 2pi): the Stirling series remainder, z >= 10.
/// Terms up to z^-9; the next one is below 2e-14 at z = 10.
double stirlingCorrection(double z)
{
    const double r = 1.0 / z;
    const double r2 = r * r;
    return r * (1.0 / 12.0 + r2 * (-1.0 / 360.0 + r2 * (1.0 / 1260.0 + r2 * (-1.0 / 1680.0 + r2 * (1.0 / 1188.0)))));
}

/// Continued fraction for I_x(a, b) (Numerical Recipes' betacf); converges fast for
/// x < (a + 1) / (a + b + 2).
double betaContinuedFraction(double a, double b, double x)
{
    constexpr double tiny = 1e-300;
    constexpr double eps = 1e-16;
    const double qab = a + b;
    const double qap = a + 1.0;
    const double qam = a - 1.0;
    double c = 1.0;
    double d = 1.0 - qab * x / qap;
    if (std::fabs(d) < tiny)
        d = tiny;
    d = 1.0 / d;
    double h = d;
    // Iterations grow like sqrt(max(a, b)); 200000 covers millions of degrees of freedom.
    for (int m = 1; m <= 200000; ++m) {
        const double m2 = 2.0 * m;
        double aa = m * (b - m) * x / ((qam + m2) * (a + m2));
        d = 1.0 + aa * d;
        if (std::fabs(d) < tiny)
            d = tiny;
        c = 1.0 + aa / c;
        if (std::fabs(c) < tiny)
            c = tiny;
        d = 1.0 / d;
        h *= d * c;
        aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
        d = 1.0 + aa * d;
        if (std::fabs(d) < tiny)
            d = tiny;
        c = 1.0 + aa / c;
        if (std::fabs(c) < tiny)
            c = tiny;
        d = 1.0 / d;
        const double del = d * c;
        h *= del;
        if (std::fabs(del - 1.0) < eps)
            break;
    }
    return h;
}

} // namespace

double logBeta(double a, double b)
{
    const double big = std::max(a, b);
    const double small = std::min(a, b);
    if (big < 10.0)
        return std::lgamma(a) + std::lgamma(b) - std::lgamma(a + b);
    // ln B = lgamma(small) + [lgamma(big) - lgamma(big + small)], the bracket from Stirling's
    // series written so that the large logarithms cancel analytically:
    // (big - 0.5) ln big - (big + small - 0.5) ln(big + small) + small
    //   = -(big - 0.5) log1p(small / big) - small ln(big + small) + small.
    const double sum = big + small;
    const double diff = -(big - 0.5) * std::log1p(small / big) - small * std::log(sum) + small
        + stirlingCorrection(big) - stirlingCorrection(sum);
    if (small < 10.0)
        return std::lgamma(small) + diff;
    // Both large: the same series for lgamma(small).
    constexpr double halfLog2Pi = 0.91893853320467274178;
    return (small - 0.5) * std::log(small) - small + halfLog2Pi + stirlingCorrection(small) + diff;
}

double regularizedIncompleteBeta(double a, double b, double x, double y)
{
    if (!(a > 0.0) || !(b > 0.0) || std::isnan(x) || std::isnan(y) || x < 0.0 || y < 0.0)
        return std::numeric_limits<double>::quiet_NaN();
    if (x <= 0.0)
        return 0.0;
    if (y <= 0.0)
        return 1.0;
    const double logX = x > 0.5 ? std::log1p(-y) : std::log(x);
    const double logY = y > 0.5 ? std::log1p(-x) : std::log(y);
    const double front = std::exp(a * logX + b * logY - logBeta(a, b));
    if (x < (a + 1.0) / (a + b + 2.0))
        return front * betaContinuedFraction(a, b, x) / a;
    return 1.0 - front * betaContinuedFraction(b, a, y) / b;
}

} // namespace slatewise::core

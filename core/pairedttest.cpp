// SPDX-License-Identifier: MIT
#include "core/pairedttest.h"

#include "core/studentt.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

namespace slatewise::core {

PairedTTest pairedTTestOnDifferences(std::span<const double> d)
{
    PairedTTest r;
    r.n = d.size();
    if (d.empty())
        return r;
    double sum = 0.0;
    for (double v : d)
        sum += v;
    const double n = static_cast<double>(d.size());
    r.meanDiff = sum / n;
    if (d.size() < 2)
        return r;
    double ss = 0.0;
    for (double v : d)
        ss += (v - r.meanDiff) * (v - r.meanDiff);
    r.sdDiff = std::sqrt(ss / (n - 1.0));
    r.df = n - 1.0;
    const double se = r.sdDiff / std::sqrt(n);
    if (se == 0.0) {
        // scipy divides anyway: 0/0 gives NaN, c/0 gives +-inf with p = 0.
        if (r.meanDiff == 0.0)
            return r;
        r.t = r.meanDiff > 0 ? std::numeric_limits<double>::infinity() : -std::numeric_limits<double>::infinity();
        r.p = 0.0;
        return r;
    }
    r.t = r.meanDiff / se;
    r.p = studentTTwoSidedP(r.t, r.df);
    return r;
}

PairedTTest pairedTTest(std::span<const double> a, std::span<const double> b)
{
    const std::size_t n = std::min(a.size(), b.size());
    std::vector<double> d(n);
    for (std::size_t i = 0; i < n; ++i)
        d[i] = a[i] - b[i];
    return pairedTTestOnDifferences(d);
}

} // namespace slatewise::core

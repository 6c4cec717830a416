// SPDX-License-Identifier: MIT
#include "core/wilcoxontest.h"

#include "core/normaldistribution.h"

#include <algorithm>
#include <numeric>
#include <vector>

namespace slatewise::core {

namespace {

/// P(T+ = r), r = 0..m(m+1)/2, for m untied non-zero differences: each rank is positive with
/// probability 1/2. Counts up to 2^50 are exact in a double, and scaling by 2^-m is exact.
std::vector<double> signedRankDistribution(std::size_t m)
{
    std::vector<double> counts(m * (m + 1) / 2 + 1, 0.0);
    counts[0] = 1.0;
    std::size_t top = 0;
    for (std::size_t k = 1; k <= m; ++k) {
        top += k;
        for (std::size_t r = top; r >= k; --r)
            counts[r] += counts[r - k];
    }
    const double scale = std::ldexp(1.0, -static_cast<int>(m));
    for (double& c : counts)
        c *= scale;
    return counts;
}

} // namespace

WilcoxonSignedRank wilcoxonSignedRank(std::span<const double> differences, WilcoxonMethod method)
{
    WilcoxonSignedRank r;
    r.n = differences.size();
    if (differences.empty())
        return r;
    std::vector<double> d;
    d.reserve(differences.size());
    for (double v : differences) {
        if (v == 0.0)
            ++r.zeros;
        else
            d.push_back(v);
    }
    bool exact = method == WilcoxonMethod::Exact || (method == WilcoxonMethod::Auto && r.n <= 50);
    if (r.zeros > 0)
        exact = false; // scipy 1.10: "Exact p-value calculation does not work if there are zeros"
    const std::size_t m = d.size();
    if (m == 0)
        return r; // every difference is zero: nothing to rank

    // Average ranks of |d|, as scipy.stats.rankdata(method="average").
    std::vector<std::size_t> order(m);
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::sort(order.begin(), order.end(),
              [&](std::size_t i, std::size_t j) { return std::fabs(d[i]) < std::fabs(d[j]); });
    std::vector<double> rank(m);
    double tieTerm = 0.0; // sum over tie groups of t (t^2 - 1)
    for (std::size_t i = 0; i < m;) {
        std::size_t j = i + 1;
        while (j < m && std::fabs(d[order[j]]) == std::fabs(d[order[i]]))
            ++j;
        const double average = 0.5 * static_cast<double>(i + 1 + j); // ranks i+1..j
        for (std::size_t k = i; k < j; ++k)
            rank[order[k]] = average;
        const double t = static_cast<double>(j - i);
        if (j - i > 1)
            tieTerm += t * (t * t - 1.0);
        i = j;
    }
    double plus = 0.0;
    double minus = 0.0;
    for (std::size_t i = 0; i < m; ++i) {
        if (d[i] > 0)
            plus += rank[i];
        else
            minus += rank[i];
    }
    r.rankSumPositive = plus;
    r.rankSumNegative = minus;
    r.statistic = std::min(plus, minus);
    r.exact = exact;

    if (!exact) {
        const double count = static_cast<double>(m);
        const double mean = count * (count + 1.0) * 0.25;
        double var = count * (count + 1.0) * (2.0 * count + 1.0);
        var -= 0.5 * tieTerm;
        const double se = std::sqrt(var / 24.0);
        r.z = (r.statistic - mean) / se;
        r.p = 2.0 * normalSf(std::fabs(r.z));
        return r;
    }

    const std::vector<double> pmf = signedRankDistribution(m);
    const auto rPlus = static_cast<std::size_t>(plus); // scipy: r_plus = int(r_plus)
    if (rPlus == (pmf.size() - 1) / 2) {
        r.p = 1.0;
        return r;
    }
    double less = 0.0;
    for (std::size_t i = 0; i <= rPlus; ++i)
        less += pmf[i];
    double greater = 0.0;
    for (std::size_t i = rPlus; i < pmf.size(); ++i)
        greater += pmf[i];
    r.p = std::clamp(2.0 * std::min(less, greater), 0.0, 1.0);
    return r;
}

WilcoxonSignedRank wilcoxonSignedRank(std::span<const double> a, std::span<const double> b, WilcoxonMethod method)
{
    const std::size_t n = std::min(a.size(), b.size());
    std::vector<double> d(n);
    for (std::size_t i = 0; i < n; ++i)
        d[i] = a[i] - b[i];
    return wilcoxonSignedRank(d, method);
}

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#pragma once

#include <cmath>
#include <cstddef>
#include <span>

namespace slatewise::core {

/// How the p-value of the signed-rank test is found; Auto follows scipy 1.10's rule.
enum class WilcoxonMethod { Auto, Exact, Approximate };

/// Wilcoxon signed-rank test, two-sided (Wilcoxon 1945), matching scipy.stats.wilcoxon of
/// scipy 1.10 with its defaults (zero_method="wilcox", correction=False, method="auto"):
/// - zero differences are dropped (Wilcoxon's original method);
/// - statistic = min(T+, T-), the smaller sum of ranks of |d| (tied |d| get average ranks);
/// - Auto uses the exact null distribution when n <= 50 (n counted before zeros are dropped)
///   and no difference is zero; otherwise the normal approximation with the tie correction
///   sigma^2 = [m(m+1)(2m+1) - sum t(t^2-1)/2] / 24 over the m non-zero differences, no
///   continuity correction. A zero difference forces the approximation even for small n.
/// - In the exact branch scipy 1.10 keeps using the untied distribution when |d| has ties,
///   with T+ truncated to an integer; we do the same so the two agree.
struct WilcoxonSignedRank {
    std::size_t n = 0;       ///< differences given
    std::size_t zeros = 0;   ///< of those, exactly zero (dropped)
    double rankSumPositive = std::nan("");
    double rankSumNegative = std::nan("");
    double statistic = std::nan(""); ///< min(T+, T-)
    double p = std::nan("");         ///< NaN when there is no non-zero difference
    bool exact = false;              ///< exact distribution used
    double z = std::nan("");         ///< standardised statistic of the approximation
};

WilcoxonSignedRank wilcoxonSignedRank(std::span<const double> differences,
                                      WilcoxonMethod method = WilcoxonMethod::Auto);
/// On pairs: the differences a_i - b_i.
WilcoxonSignedRank wilcoxonSignedRank(std::span<const double> a, std::span<const double> b,
                                      WilcoxonMethod method = WilcoxonMethod::Auto);

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#pragma once

#include <cmath>
#include <cstddef>
#include <span>

namespace slatewise::core {

/// Paired t-test on the differences d_i = a_i - b_i (Student 1908), as scipy.stats.ttest_rel(a, b):
/// t = mean(d) / (sd(d) / sqrt(n)), sd with n - 1 in the denominator, df = n - 1, two-sided p.
struct PairedTTest {
    std::size_t n = 0;
    double meanDiff = std::nan("");
    double sdDiff = std::nan(""); ///< sample standard deviation of the differences
    double t = std::nan("");      ///< +-inf when every difference is the same non-zero value
    double df = std::nan("");
    double p = std::nan("");      ///< NaN when n < 2 or every difference is zero
};

PairedTTest pairedTTest(std::span<const double> a, std::span<const double> b);
PairedTTest pairedTTestOnDifferences(std::span<const double> d);

} // namespace slatewise::core

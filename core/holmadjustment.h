// SPDX-License-Identifier: MIT
#pragma once

#include <span>
#include <vector>

namespace slatewise::core {

/// Holm–Bonferroni step-down adjusted p-values (Holm, "A simple sequentially rejective
/// multiple test procedure", Scand. J. Statistics 6, 1979). With the m p-values sorted
/// ascending, p_(1) <= ... <= p_(m): adjusted p_(i) = min(1, max_{j <= i} (m - j + 1) p_(j)).
/// Rejecting where the adjusted value is below alpha controls the family-wise error rate at alpha.
/// NaN entries (tests that could not be run) stay NaN and do not count towards m.
std::vector<double> holmAdjust(std::span<const double> p);

} // namespace slatewise::core

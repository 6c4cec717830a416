// SPDX-License-Identifier: MIT
#pragma once

#include "core/run.h"

#include <span>
#include <vector>

namespace slatewise::core {

/// Relevance in [1/n, 1] for each entry of a ranked list of n, used by the re-rankers.
/// When every entry has a score and the scores do not increase down the list, the scores
/// are min-max normalised: 1/n + (1 − 1/n)(s − min)/(max − min). Otherwise (scores missing,
/// all equal, or out of rank order) relevance is rank-based: (n − rank + 1)/n. Either way
/// relevance never increases down the list, so ordering by it alone returns the list.
std::vector<double> listRelevance(std::span<const ListEntry> list);

} // namespace slatewise::core

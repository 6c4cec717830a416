// SPDX-License-Identifier: MIT
#include "core/listrelevance.h"

#include <cmath>

namespace slatewise::core {

std::vector<double> listRelevance(std::span<const ListEntry> list)
{
    const std::size_t n = list.size();
    std::vector<double> rel(n);
    bool usable = n > 0;
    for (std::size_t k = 0; k < n && usable; ++k)
        usable = std::isfinite(list[k].score) && (k == 0 || list[k].score <= list[k - 1].score);
    const double floor = n ? 1.0 / static_cast<double>(n) : 0.0;
    if (usable && list.front().score > list.back().score) {
        const double hi = list.front().score, lo = list.back().score;
        for (std::size_t k = 0; k < n; ++k)
            rel[k] = floor + (1.0 - floor) * (list[k].score - lo) / (hi - lo);
        return rel;
    }
    for (std::size_t k = 0; k < n; ++k)
        rel[k] = static_cast<double>(n - k) / static_cast<double>(n);
    return rel;
}

} // namespace slatewise::core

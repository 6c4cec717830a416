// SPDX-License-Identifier: MIT
#include "core/heldouttopk.h"

#include <algorithm>
#include <cmath>

namespace slatewise::core {

double heldoutTopk(std::span<ScoredRating> scored, std::int32_t k)
{
    if (scored.empty())
        return std::nan("");
    const std::size_t K = std::min(scored.size(), static_cast<std::size_t>(std::max(k, 1)));

    // t: the K-th highest rating, found before the items are reordered by score.
    std::nth_element(scored.begin(), scored.begin() + static_cast<std::ptrdiff_t>(K - 1), scored.end(),
                     [](const ScoredRating& a, const ScoredRating& b) { return a.rating > b.rating; });
    const double t = scored[K - 1].rating;

    std::partial_sort(scored.begin(), scored.begin() + static_cast<std::ptrdiff_t>(K), scored.end(),
                      [](const ScoredRating& a, const ScoredRating& b) {
                          return a.score != b.score ? a.score > b.score : a.item < b.item;
                      });
    const auto agree = std::count_if(scored.begin(), scored.begin() + static_cast<std::ptrdiff_t>(K),
                                     [t](const ScoredRating& s) { return s.rating >= t; });
    return static_cast<double>(agree) / static_cast<double>(K);
}

} // namespace slatewise::core

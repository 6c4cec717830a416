// SPDX-License-Identifier: MIT
#include "core/rankingmetrics.h"

#include <algorithm>
#include <array>
#include <cmath>

namespace slatewise::core {

namespace {
constexpr std::size_t kTabled = 256;

const std::array<double, kTabled + 1>& discountTable()
{
    static const std::array<double, kTabled + 1> table = [] {
        std::array<double, kTabled + 1> t{};
        for (std::size_t j = 1; j <= kTabled; ++j)
            t[j] = 1.0 / std::log2(static_cast<double>(j) + 1.0);
        return t;
    }();
    return table;
}
} // namespace

double dcgDiscount(std::size_t position)
{
    if (position <= kTabled)
        return discountTable()[position];
    return 1.0 / std::log2(static_cast<double>(position) + 1.0);
}

UserRanking rankUser(std::span<const ListHit> list, std::span<const double> relevantRatingsDesc, std::int32_t k)
{
    UserRanking r;
    const auto kk = static_cast<std::size_t>(std::max(k, 1));
    const std::size_t nRelevant = relevantRatingsDesc.size();
    if (nRelevant == 0)
        return r;
    const std::size_t shown = std::min(list.size(), kk);
    double dcg = 0.0, dcgGraded = 0.0, precisionSum = 0.0;
    for (std::size_t j = 1; j <= shown; ++j) {
        const ListHit& hit = list[j - 1];
        if (!hit.relevant)
            continue;
        ++r.hits;
        if (r.rr == 0.0)
            r.rr = 1.0 / static_cast<double>(j);
        precisionSum += static_cast<double>(r.hits) / static_cast<double>(j);
        dcg += dcgDiscount(j);
        dcgGraded += hit.rating * dcgDiscount(j);
    }
    const std::size_t idealHits = std::min(kk, nRelevant);
    double idcg = 0.0, idcgGraded = 0.0;
    for (std::size_t j = 1; j <= idealHits; ++j) {
        idcg += dcgDiscount(j);
        idcgGraded += relevantRatingsDesc[j - 1] * dcgDiscount(j);
    }
    r.precision = static_cast<double>(r.hits) / static_cast<double>(kk);
    r.recall = static_cast<double>(r.hits) / static_cast<double>(nRelevant);
    r.ap = precisionSum / static_cast<double>(idealHits);
    r.ndcg = dcg / idcg;
    // Only reachable with a relevance threshold at or below zero; no gain to normalise by.
    r.ndcgGraded = idcgGraded > 0.0 ? dcgGraded / idcgGraded : 0.0;
    return r;
}

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#include "core/mmrreranker.h"

#include "core/listrelevance.h"
#include "core/runassembly.h"

#include <algorithm>
#include <limits>

namespace slatewise::core {

double MmrReranker::genreSimilarity(const Item& a, const Item& b)
{
    if (a.genres.empty() && b.genres.empty())
        return 1.0;
    std::size_t common = 0, i = 0, j = 0;
    while (i < a.genres.size() && j < b.genres.size()) {
        if (a.genres[i] == b.genres[j]) {
            ++common;
            ++i;
            ++j;
        } else if (a.genres[i] < b.genres[j]) {
            ++i;
        } else {
            ++j;
        }
    }
    const std::size_t unionSize = a.genres.size() + b.genres.size() - common;
    return static_cast<double>(common) / static_cast<double>(unionSize);
}

std::vector<ListEntry> MmrReranker::rerankList(const Dataset& data, std::span<const ListEntry> list, double lambda)
{
    const std::size_t n = list.size();
    const auto rel = listRelevance(list);
    std::vector<double> maxSim(n, 0.0);
    std::vector<bool> taken(n, false);
    std::vector<ListEntry> out;
    out.reserve(n);
    for (std::size_t step = 0; step < n; ++step) {
        std::size_t best = n;
        double bestValue = -std::numeric_limits<double>::infinity();
        for (std::size_t c = 0; c < n; ++c) {
            if (taken[c])
                continue;
            const double value = lambda * rel[c] - (1.0 - lambda) * maxSim[c];
            if (value > bestValue) { // strict: earlier parent rank wins ties
                bestValue = value;
                best = c;
            }
        }
        taken[best] = true;
        out.push_back(list[best]);
        const Item& picked = data.items[list[best].item.value];
        for (std::size_t c = 0; c < n; ++c)
            if (!taken[c])
                maxSim[c] = std::max(maxSim[c], genreSimilarity(data.items[list[c].item.value], picked));
    }
    return out;
}

Result<RunData> MmrReranker::apply(const Dataset& data, const RunData& parent, const RerankSettings& settings,
                                   const Progress& progress)
{
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const double lambda = std::clamp(settings.lambda, 0.0, 1.0);
    const bool ok = RunAssembly::forEach(data.userCount(), progress, "mmr", 0.0, 1.0, [&](std::size_t u, unsigned) {
        lists[u] = rerankList(data, parent.listOf(UserIndex(static_cast<std::uint32_t>(u))), lambda);
    });
    if (!ok)
        return RunAssembly::cancelled("re-ranking with mmr");
    return RunAssembly::derive(data, parent, std::move(lists));
}

} // namespace slatewise::core

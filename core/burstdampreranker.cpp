// SPDX-License-Identifier: MIT
#include "core/burstdampreranker.h"

#include "core/listrelevance.h"
#include "core/runassembly.h"

#include <algorithm>
#include <numeric>

namespace slatewise::core {

std::vector<BurstDetector::Burst> BurstDampReranker::bursts(const Dataset& data, UserIndex u,
                                                            const RerankSettings& settings)
{
    BurstDetector::Params params;
    params.window = settings.burstWindow;
    params.minShare = settings.burstMinShare;
    params.maxPrior = settings.burstMaxPrior;
    params.minHistory = settings.burstMinHistory;
    const BurstDetector detector(data.items, data.genreNames.size(), params);
    auto finding = detector.detect(data.train.of(u), {});
    if (!finding.hasTimestamps || !finding.enoughHistory)
        return {};
    return std::move(finding.bursts);
}

std::vector<ListEntry> BurstDampReranker::rerankList(const Dataset& data, std::span<const BurstDetector::Burst> bursts,
                                                     std::span<const ListEntry> list, double lambda)
{
    std::vector<ListEntry> out(list.begin(), list.end());
    if (bursts.empty() || list.empty())
        return out;
    const auto rel = listRelevance(list);
    std::vector<double> value(list.size());
    for (std::size_t k = 0; k < list.size(); ++k) {
        double ratio = 1.0;
        for (std::int32_t g : data.items[list[k].item.value].genres)
            for (const auto& b : bursts)
                if (b.genre == g)
                    ratio = std::min(ratio, b.priorShare / b.windowShare);
        value[k] = rel[k] * (1.0 - lambda * (1.0 - ratio));
    }
    std::vector<std::size_t> order(list.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return value[a] > value[b]; });
    for (std::size_t k = 0; k < order.size(); ++k)
        out[k] = list[order[k]];
    return out;
}

Result<RunData> BurstDampReranker::apply(const Dataset& data, const RunData& parent, const RerankSettings& settings,
                                         const Progress& progress)
{
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const double lambda = std::clamp(settings.lambda, 0.0, 1.0);
    const bool ok = RunAssembly::forEach(data.userCount(), progress, "burst-damp", 0.0, 1.0, [&](std::size_t u, unsigned) {
        const UserIndex user(static_cast<std::uint32_t>(u));
        const auto found = bursts(data, user, settings);
        lists[u] = rerankList(data, found, parent.listOf(user), lambda);
    });
    if (!ok)
        return RunAssembly::cancelled("re-ranking with burst-damp");
    return RunAssembly::derive(data, parent, std::move(lists));
}

} // namespace slatewise::core

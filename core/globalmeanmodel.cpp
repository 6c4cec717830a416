// SPDX-License-Identifier: MIT
#include "core/globalmeanmodel.h"

#include "core/runassembly.h"
#include "core/seededrandom.h"

#include <nlohmann/json.hpp>

#include <algorithm>

namespace slatewise::core {

GlobalMeanModel GlobalMeanModel::fit(const TrainMatrix& train)
{
    GlobalMeanModel m;
    m.globalMean = train.globalMean;
    return m;
}

Result<RunData> GlobalMeanModel::toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                                       const Progress& progress) const
{
    auto scores = RunAssembly::scoreWithheld(data, settings.clipToScale, progress, 0.0, 0.2,
                                             [this](std::uint32_t, std::uint32_t) { return globalMean; });
    if (progress.cancelled())
        return RunAssembly::cancelled("fitting the global mean");
    const float score = static_cast<float>(RunAssembly::clamp(data, settings.clipToScale, globalMean));
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const bool ok = RunAssembly::forEach(data.userCount(), progress, "mean: random lists", 0.2, 1.0,
                                         [&](std::size_t u, unsigned) {
        const auto uu = static_cast<std::uint32_t>(u);
        const std::size_t unseen = train.items - train.userCount(uu);
        const std::size_t n = std::min<std::size_t>(static_cast<std::size_t>(std::max(0, settings.listLength)), unseen);
        // Seeded per user so that the lists do not depend on the number of threads.
        SeededRandom rng(settings.seed, u);
        auto& list = lists[u];
        list.reserve(n);
        if (unseen > 4 * n) {
            // Few picks from many items: draw and reject seen or repeated ones.
            while (list.size() < n) {
                const auto i = static_cast<std::uint32_t>(rng.below(train.items));
                if (train.seen(uu, i) ||
                    std::any_of(list.begin(), list.end(), [i](const ListEntry& e) { return e.item.value == i; }))
                    continue;
                list.push_back({ItemIndex(i), score});
            }
            return;
        }
        // Otherwise a partial Fisher–Yates shuffle over the unseen items.
        std::vector<std::uint32_t> pool;
        pool.reserve(unseen);
        for (std::uint32_t i = 0; i < train.items; ++i)
            if (!train.seen(uu, i))
                pool.push_back(i);
        for (std::size_t k = 0; k < n; ++k) {
            const std::size_t pick = k + rng.below(pool.size() - k);
            std::swap(pool[k], pool[pick]);
            list.push_back({ItemIndex(pool[k]), score});
        }
    });
    if (!ok)
        return RunAssembly::cancelled("fitting the global mean");
    return RunAssembly::finish(data, std::move(scores), std::move(lists));
}

std::string GlobalMeanModel::parametersJson() const
{
    nlohmann::ordered_json j;
    j["global_mean"] = globalMean;
    return j.dump();
}

} // namespace slatewise::core

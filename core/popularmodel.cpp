// SPDX-License-Identifier: MIT
#include "core/popularmodel.h"

#include "core/runassembly.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <numeric>

namespace slatewise::core {

Result<PopularModel> PopularModel::fit(const TrainMatrix& train, const Progress& progress)
{
    PopularModel m;
    m.globalMean = train.globalMean;
    m.itemCount.assign(train.items, 0);
    m.itemMean.assign(train.items, train.globalMean);
    const bool ok = RunAssembly::forEach(train.items, progress, "popular: counting", 0.0, 0.5, [&](std::size_t i, unsigned) {
        const auto ratings = train.itemRatingsOf(static_cast<std::uint32_t>(i));
        double sum = 0.0;
        for (float r : ratings)
            sum += r;
        m.itemCount[i] = static_cast<std::int32_t>(ratings.size());
        m.itemMean[i] = (sum + kPseudoRatings * train.globalMean) / (static_cast<double>(ratings.size()) + kPseudoRatings);
    });
    if (!ok)
        return RunAssembly::cancelled("fitting most popular");
    return m;
}

Result<RunData> PopularModel::toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                                    const Progress& progress) const
{
    auto scores = RunAssembly::scoreWithheld(data, settings.clipToScale, progress, 0.5, 0.6,
                                             [this](std::uint32_t, std::uint32_t i) { return itemMean[i]; });
    if (progress.cancelled())
        return RunAssembly::cancelled("fitting most popular");
    std::vector<std::uint32_t> order(train.items);
    std::iota(order.begin(), order.end(), 0u);
    std::stable_sort(order.begin(), order.end(),
                     [this](std::uint32_t a, std::uint32_t b) { return itemCount[a] > itemCount[b]; });
    const std::size_t n = static_cast<std::size_t>(std::max(0, settings.listLength));
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const bool ok = RunAssembly::forEach(data.userCount(), progress, "popular: top-N lists", 0.6, 1.0,
                                         [&](std::size_t u, unsigned) {
        auto& list = lists[u];
        list.reserve(n);
        for (std::uint32_t i : order) {
            if (list.size() >= n)
                break;
            if (!train.seen(static_cast<std::uint32_t>(u), i))
                list.push_back({ItemIndex(i), static_cast<float>(itemCount[i])});
        }
    });
    if (!ok)
        return RunAssembly::cancelled("fitting most popular");
    return RunAssembly::finish(data, std::move(scores), std::move(lists));
}

std::string PopularModel::parametersJson() const
{
    nlohmann::ordered_json j;
    j["global_mean"] = globalMean;
    j["item_count"] = itemCount;
    j["item_mean"] = itemMean;
    return j.dump();
}

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#include "core/popularmodel.h"

#include "core/runassembly.h"

#include <algorithm>
#include <nlohmann/json.hpp>
#include <numeric>

namespace slatewise::core {

Result<PopularModel> PopularModel::fit(const TrainMatrix& train, const Progress& progress)
{
    PopularModel m;
    m.globalMean = train.globalMean;
    m.itemCount.assign(train.items, 0);
    m.itemMean.assign(train.items, train.globalMean);
    const bool ok
        = RunAssembly::forEach(train.items, progress, "popular: counting", 0.0, 0.5, [&](std::size_t i, unsigned) {
              const auto ratings = train.itemRatingsOf(static_cast<std::uint32_t>(i));
              double sum = 0.0;
              for (float r : ratings)
                  sum += r;
              m.itemCount[i] = static_cast<std::int32_t>(ratings.size());
              m.itemMean[i]
                  = (sum + kPseudoRatings * train.globalMean) / (static_cast<double>(ratings.size()) + kPseudoRatings);
          });
    if (!ok)
        return RunAssembly::cancelled("fitting most popular");
    return m;
}

Result<RunData> PopularModel::toRun(
    const Dataset& data, const TrainMatrix& train, const ModelSettings& settings, const Progress& progress) const
{
    auto scores = RunAssembly::scoreWithheld(
        data, settings.clipToScale, progress, 0.5, 0.6, [this](std::uint32_t, std::uint32_t i) { return itemMean[i]; });
    if (progress.cancelled())
        return RunAssembly::cancelled("fitting most popular");
    const auto order = RunAssembly::itemsByDescending(train.items, [this](std::uint32_t i) { return itemCount[i]; });
    auto lists = RunAssembly::listsInSharedOrder(data, train, order,
        static_cast<std::size_t>(std::max(0, settings.listLength)), progress, "popular: top-N lists", 0.6, 1.0,
        [this](std::uint32_t, std::uint32_t i) { return itemCount[i]; });
    if (progress.cancelled())
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

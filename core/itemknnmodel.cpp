// SPDX-License-Identifier: MIT
#include "core/itemknnmodel.h"

#include "core/runassembly.h"
#include "core/topnlist.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>

namespace slatewise::core {

Result<ItemKnnModel> ItemKnnModel::fit(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                                       const Progress& progress, const IterationCallback& onIteration)
{
    ItemKnnModel m;
    m.neighbours = std::max(1, settings.neighbours);
    auto baseline = BiasModel::fit(data, train, settings, progress, onIteration, 0.0, 0.2);
    if (!baseline)
        return baseline.errors();
    m.baseline = std::move(baseline.value());

    // Residuals in the by-user layout; the by-item loop looks them up there.
    std::vector<float> residual(train.nnz());
    for (std::uint32_t u = 0; u < train.users; ++u)
        for (std::uint32_t p = train.userOffsets[u]; p < train.userOffsets[u + 1]; ++p)
            residual[p] = static_cast<float>(train.userRatings[p] - m.baseline.predict(u, train.userItems[p]));

    struct Accumulator {
        std::vector<double> num, sqi, sqj;
        std::vector<std::uint32_t> count;
        std::vector<std::uint32_t> touched;
    };
    const unsigned workers = workerCount();
    std::vector<Accumulator> acc(workers);
    for (auto& a : acc) {
        a.num.assign(train.items, 0.0);
        a.sqi.assign(train.items, 0.0);
        a.sqj.assign(train.items, 0.0);
        a.count.assign(train.items, 0);
    }
    const std::size_t poolSize = static_cast<std::size_t>(std::max(settings.neighbourPool, m.neighbours));
    std::vector<std::vector<Neighbour>> rows(train.items);
    const bool ok = RunAssembly::forEach(train.items, progress, "itemknn: similarities", 0.2, 0.6,
                                         [&](std::size_t item, unsigned w) {
        Accumulator& a = acc[w];
        const auto i = static_cast<std::uint32_t>(item);
        for (std::uint32_t u : train.usersOf(i)) {
            const auto items = train.itemsOf(u);
            const std::uint32_t base = train.userOffsets[u];
            const auto pos = std::lower_bound(items.begin(), items.end(), i) - items.begin();
            const double ei = residual[base + static_cast<std::uint32_t>(pos)];
            for (std::size_t k = 0; k < items.size(); ++k) {
                const std::uint32_t j = items[k];
                if (j == i)
                    continue;
                const double ej = residual[base + k];
                if (a.count[j] == 0)
                    a.touched.push_back(j);
                ++a.count[j];
                a.num[j] += ei * ej;
                a.sqi[j] += ei * ei;
                a.sqj[j] += ej * ej;
            }
        }
        auto& row = rows[i];
        for (std::uint32_t j : a.touched) {
            const double denom = std::sqrt(a.sqi[j] * a.sqj[j]);
            if (denom > 0.0) {
                const double n = a.count[j];
                const double s = n / (n + settings.shrinkage) * (a.num[j] / denom);
                if (s > 0.0)
                    row.push_back({j, static_cast<float>(s), a.count[j]});
            }
            a.num[j] = a.sqi[j] = a.sqj[j] = 0.0;
            a.count[j] = 0;
        }
        a.touched.clear();
        const auto better = [](const Neighbour& x, const Neighbour& y) {
            return x.similarity > y.similarity || (x.similarity == y.similarity && x.item < y.item);
        };
        if (row.size() > poolSize) {
            std::nth_element(row.begin(), row.begin() + static_cast<std::ptrdiff_t>(poolSize), row.end(), better);
            row.resize(poolSize);
        }
        std::sort(row.begin(), row.end(), better);
        row.shrink_to_fit();
    });
    if (!ok)
        return RunAssembly::cancelled("fitting the item neighbourhood model");
    m.poolOffsets.assign(train.items + 1, 0);
    for (std::uint32_t i = 0; i < train.items; ++i)
        m.poolOffsets[i + 1] = m.poolOffsets[i] + static_cast<std::uint32_t>(rows[i].size());
    m.pool.reserve(m.poolOffsets.back());
    for (auto& row : rows) {
        m.pool.insert(m.pool.end(), row.begin(), row.end());
        row = {};
    }
    return m;
}

double ItemKnnModel::predict(std::uint32_t u, std::uint32_t i, std::span<const float> residual) const
{
    double num = 0.0, den = 0.0;
    int used = 0;
    for (const Neighbour& nb : neighboursOf(i)) {
        const float e = residual[nb.item];
        if (e != e)
            continue;
        num += static_cast<double>(nb.similarity) * e;
        den += nb.similarity;
        if (++used >= neighbours)
            break;
    }
    const double base = baseline.predict(u, i);
    return den > 0.0 ? base + num / den : base;
}

Result<RunData> ItemKnnModel::toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                                    const Progress& progress) const
{
    const unsigned workers = workerCount();
    std::vector<std::vector<float>> dense(workers, std::vector<float>(train.items, std::nanf("")));
    std::vector<float> scores(data.withheld.size(), 0.0f);
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const std::size_t n = static_cast<std::size_t>(std::max(0, settings.listLength));
    const bool ok = RunAssembly::forEach(data.userCount(), progress, "itemknn: scores and lists", 0.6, 1.0,
                                         [&](std::size_t user, unsigned w) {
        const auto u = static_cast<std::uint32_t>(user);
        auto& res = dense[w];
        const auto items = train.itemsOf(u);
        const auto ratings = train.ratingsOf(u);
        for (std::size_t k = 0; k < items.size(); ++k)
            res[items[k]] = static_cast<float>(ratings[k] - baseline.predict(u, items[k]));
        for (std::uint32_t r = data.withheld.offsets[u]; r < data.withheld.offsets[u + 1]; ++r)
            scores[r] = static_cast<float>(
                RunAssembly::clamp(data, settings.clipToScale, predict(u, data.withheld.rows[r].item.value, res)));
        TopNList top(n);
        for (std::uint32_t i = 0; i < train.items; ++i)
            if (res[i] != res[i])
                top.offer(i, static_cast<float>(predict(u, i, res)));
        auto list = top.take();
        for (auto& e : list)
            e.score = static_cast<float>(RunAssembly::clamp(data, settings.clipToScale, e.score));
        lists[u] = std::move(list);
        for (std::uint32_t i : items)
            res[i] = std::nanf("");
    });
    if (!ok)
        return RunAssembly::cancelled("fitting the item neighbourhood model");
    return RunAssembly::finish(data, std::move(scores), std::move(lists));
}

std::string ItemKnnModel::parametersJson() const
{
    nlohmann::ordered_json j = nlohmann::ordered_json::parse(baseline.parametersJson());
    j["neighbours"] = neighbours;
    nlohmann::ordered_json pools = nlohmann::ordered_json::array();
    for (std::uint32_t i = 0; i + 1 < poolOffsets.size(); ++i) {
        nlohmann::ordered_json row = nlohmann::ordered_json::array();
        for (const auto& nb : neighboursOf(i))
            row.push_back({nb.item, nb.similarity, nb.support});
        pools.push_back(std::move(row));
    }
    j["similarities"] = std::move(pools);
    return j.dump();
}

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#include "core/itemknnmodel.h"

#include "core/runassembly.h"
#include "core/topnlist.h"

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <numeric>

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
    const bool ok = RunAssembly::forEach(
        train.items, progress, "itemknn: similarities", 0.2, 0.6, [&](std::size_t item, unsigned w) {
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
                        row.push_back({ j, static_cast<float>(s), a.count[j] });
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
    // The k most similar rated neighbours, summed in item order: toRun() accumulates over a
    // user's rated items in that order, so both give the same bits.
    thread_local std::vector<const Neighbour*> used;
    used.clear();
    for (const Neighbour& nb : neighboursOf(i)) {
        if (residual[nb.item] != residual[nb.item])
            continue;
        used.push_back(&nb);
        if (static_cast<std::int32_t>(used.size()) >= neighbours)
            break;
    }
    std::sort(used.begin(), used.end(), [](const Neighbour* a, const Neighbour* b) { return a->item < b->item; });
    double num = 0.0, den = 0.0;
    for (const Neighbour* nb : used) {
        num += static_cast<double>(nb->similarity) * residual[nb->item];
        den += nb->similarity;
    }
    const double base = baseline.predict(u, i);
    return den > 0.0 ? base + num / den : base;
}

Result<RunData> ItemKnnModel::toRun(
    const Dataset& data, const TrainMatrix& train, const ModelSettings& settings, const Progress& progress) const
{
    // Scoring every unseen item by walking its pool costs items × pool per user. Instead each
    // rated item j lists the items whose pools hold it, and a user's rated items are walked
    // once, in item order, adding s_ij e_uj into per-item sums. An item with at most k rated
    // neighbours then has exactly predict()'s sum; one with more (rare) is scored by
    // predict(); one with none scores its baseline, in the item-bias order all users share.
    struct Holder {
        std::uint32_t item; ///< i, whose pool holds j
        float similarity; ///< s_ij
    };
    std::vector<std::uint32_t> heldOffsets(train.items + 1, 0);
    for (const Neighbour& nb : pool)
        ++heldOffsets[nb.item + 1];
    for (std::uint32_t j = 0; j < train.items; ++j)
        heldOffsets[j + 1] += heldOffsets[j];
    std::vector<Holder> held(pool.size());
    {
        std::vector<std::uint32_t> cursor(heldOffsets.begin(), heldOffsets.end() - 1);
        for (std::uint32_t i = 0; i < train.items; ++i)
            for (const Neighbour& nb : neighboursOf(i))
                held[cursor[nb.item]++] = { i, nb.similarity };
    }
    const auto byBias
        = RunAssembly::itemsByDescending(train.items, [this](std::uint32_t i) { return baseline.itemBias[i]; });

    struct Sums {
        double num = 0.0;
        double den = 0.0;
        std::int32_t count = 0;
    };
    struct Scratch {
        std::vector<float> residual; ///< e_uj for rated items, NaN elsewhere
        std::vector<Sums> sums;
        std::vector<std::uint32_t> touched;
    };
    const unsigned workers = workerCount();
    std::vector<Scratch> scratch(workers);
    for (auto& w : scratch) {
        w.residual.assign(train.items, std::nanf(""));
        w.sums.resize(train.items);
    }
    std::vector<float> scores(data.withheld.size(), 0.0f);
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const std::size_t n = static_cast<std::size_t>(std::max(0, settings.listLength));
    const bool ok = RunAssembly::forEach(
        data.userCount(), progress, "itemknn: scores and lists", 0.6, 1.0, [&](std::size_t user, unsigned w) {
            const auto u = static_cast<std::uint32_t>(user);
            Scratch& s = scratch[w];
            auto& res = s.residual;
            const auto items = train.itemsOf(u); // ascending item order
            const auto ratings = train.ratingsOf(u);
            for (std::size_t r = 0; r < items.size(); ++r)
                res[items[r]] = static_cast<float>(ratings[r] - baseline.predict(u, items[r]));
            for (std::uint32_t r = data.withheld.offsets[u]; r < data.withheld.offsets[u + 1]; ++r)
                scores[r] = static_cast<float>(
                    RunAssembly::clamp(data, settings.clipToScale, predict(u, data.withheld.rows[r].item.value, res)));

            for (std::uint32_t j : items) {
                const float e = res[j];
                for (std::uint32_t h = heldOffsets[j]; h < heldOffsets[j + 1]; ++h) {
                    const Holder& x = held[h];
                    if (res[x.item] == res[x.item])
                        continue; // rated: not a candidate
                    Sums& sum = s.sums[x.item];
                    if (sum.count++ == 0)
                        s.touched.push_back(x.item);
                    sum.num += static_cast<double>(x.similarity) * e;
                    sum.den += x.similarity;
                }
            }
            TopNList top(n);
            for (std::uint32_t i : s.touched) {
                const Sums& sum = s.sums[i];
                double score = 0.0;
                if (sum.count > neighbours) {
                    score = predict(u, i, res);
                } else {
                    const double base = baseline.predict(u, i);
                    score = sum.den > 0.0 ? base + sum.num / sum.den : base;
                }
                top.offer(i, static_cast<float>(score));
            }
            // Items without a rated neighbour score their baseline: walk them best bias first
            // until n are offered and the next one cannot beat or tie the last.
            std::size_t offered = 0;
            float last = 0.0f;
            for (std::uint32_t i : byBias) {
                if (res[i] == res[i] || s.sums[i].count > 0)
                    continue;
                const auto score = static_cast<float>(baseline.predict(u, i));
                if (offered >= n && score < last)
                    break;
                top.offer(i, score);
                last = score;
                ++offered;
            }
            auto list = top.take();
            for (auto& e : list)
                e.score = static_cast<float>(RunAssembly::clamp(data, settings.clipToScale, e.score));
            lists[u] = std::move(list);
            for (std::uint32_t i : items)
                res[i] = std::nanf("");
            for (std::uint32_t i : s.touched)
                s.sums[i] = {};
            s.touched.clear();
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
            row.push_back({ nb.item, nb.similarity, nb.support });
        pools.push_back(std::move(row));
    }
    j["similarities"] = std::move(pools);
    return j.dump();
}

} // namespace slatewise::core

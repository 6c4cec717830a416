// SPDX-License-Identifier: MIT
#include "core/biasmodel.h"

#include "core/runassembly.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <nlohmann/json.hpp>
#include <numeric>

namespace slatewise::core {

Result<BiasModel> BiasModel::fit(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
    const Progress& progress, const IterationCallback& onIteration, double progressFrom, double progressTo)
{
    BiasModel m;
    m.globalMean = train.globalMean;
    m.userBias.assign(train.users, 0.0);
    m.itemBias.assign(train.items, 0.0);
    const double mu = m.globalMean;
    const int iterations = std::max(1, settings.biasIterations);
    const double span = (progressTo - progressFrom) / iterations;
    for (int it = 0; it < iterations; ++it) {
        const auto start = std::chrono::steady_clock::now();
        const double at = progressFrom + span * it;
        std::vector<double> change(workerCount(), 0.0);
        bool ok = RunAssembly::forEach(
            train.items, progress, "bias: item biases", at, at + span / 2, [&](std::size_t i, unsigned w) {
                const auto users = train.usersOf(static_cast<std::uint32_t>(i));
                const auto ratings = train.itemRatingsOf(static_cast<std::uint32_t>(i));
                double sum = 0.0;
                for (std::size_t k = 0; k < users.size(); ++k)
                    sum += ratings[k] - mu - m.userBias[users[k]];
                const double b = sum / (settings.biasItemLambda + static_cast<double>(users.size()));
                change[w] = std::max(change[w], std::abs(b - m.itemBias[i]));
                m.itemBias[i] = b;
            });
        ok = ok
            && RunAssembly::forEach(
                train.users, progress, "bias: user biases", at + span / 2, at + span, [&](std::size_t u, unsigned w) {
                    const auto items = train.itemsOf(static_cast<std::uint32_t>(u));
                    const auto ratings = train.ratingsOf(static_cast<std::uint32_t>(u));
                    double sum = 0.0;
                    for (std::size_t k = 0; k < items.size(); ++k)
                        sum += ratings[k] - mu - m.itemBias[items[k]];
                    const double b = sum / (settings.biasUserLambda + static_cast<double>(items.size()));
                    change[w] = std::max(change[w], std::abs(b - m.userBias[u]));
                    m.userBias[u] = b;
                });
        if (!ok)
            return RunAssembly::cancelled("fitting the bias baseline");
        m.iterationsRun = it + 1;
        const double moved = *std::max_element(change.begin(), change.end());
        if (onIteration) {
            FitIteration f;
            f.iteration = it + 1;
            f.iterations = iterations;
            f.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
            const auto predict = [&m](std::uint32_t u, std::uint32_t i) { return m.predict(u, i); };
            f.withheldRmse = RunAssembly::withheldRmse(data, settings.clipToScale, predict);
            double sq = 0.0;
            for (std::uint32_t u = 0; u < train.users; ++u) {
                const auto items = train.itemsOf(u);
                const auto ratings = train.ratingsOf(u);
                for (std::size_t k = 0; k < items.size(); ++k) {
                    const double e
                        = RunAssembly::clamp(data, settings.clipToScale, m.predict(u, items[k])) - ratings[k];
                    sq += e * e;
                }
            }
            f.trainRmse = train.nnz() ? std::sqrt(sq / static_cast<double>(train.nnz())) : std::nan("");
            onIteration(f);
        }
        if (moved < settings.biasTolerance)
            break;
    }
    return m;
}

Result<RunData> BiasModel::toRun(
    const Dataset& data, const TrainMatrix& train, const ModelSettings& settings, const Progress& progress) const
{
    auto scores = RunAssembly::scoreWithheld(data, settings.clipToScale, progress, 0.7, 0.8,
        [this](std::uint32_t u, std::uint32_t i) { return predict(u, i); });
    if (progress.cancelled())
        return RunAssembly::cancelled("fitting the bias baseline");

    // r̂_ui = μ + b_u + b_i ranks items by b_i for every user.
    const auto order = RunAssembly::itemsByDescending(train.items, [this](std::uint32_t i) { return itemBias[i]; });
    auto lists = RunAssembly::listsInSharedOrder(data, train, order,
        static_cast<std::size_t>(std::max(0, settings.listLength)), progress, "bias: top-N lists", 0.8, 1.0,
        [&](std::uint32_t u, std::uint32_t i) {
            return RunAssembly::clamp(data, settings.clipToScale, predict(u, i));
        });
    if (progress.cancelled())
        return RunAssembly::cancelled("fitting the bias baseline");
    return RunAssembly::finish(data, std::move(scores), std::move(lists));
}

std::string BiasModel::parametersJson() const
{
    nlohmann::ordered_json j;
    j["global_mean"] = globalMean;
    j["user_bias"] = userBias;
    j["item_bias"] = itemBias;
    j["iterations_run"] = iterationsRun;
    return j.dump();
}

} // namespace slatewise::core

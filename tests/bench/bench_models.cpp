// SPDX-License-Identifier: MIT
// Benchmark of the reference models (not a timed test): 10 million synthetic train ratings,
// 160,000 users, 40,000 items. Targets on the 2-core machine: one ALS iteration at rank 32
// ≤ 5 s, the bias baseline ≤ 3 s, top-100 lists for all users ≤ 10 s.
// Usage: bench_models [users] [items] [trainPerUser]
#include "core/alsmodel.h"
#include "core/biasmodel.h"
#include "core/itemknnmodel.h"
#include "core/modelsettings.h"
#include "core/parallel.h"
#include "core/seededrandom.h"
#include "core/trainmatrix.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <sys/resource.h>
#include <vector>

using namespace slatewise::core;

namespace {

double seconds(std::chrono::steady_clock::time_point since)
{
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - since).count();
}

double peakMiB()
{
    rusage usage {};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_maxrss) / 1024.0;
}

/// Ratings from a rank-8 model with biases and noise, items drawn with a long-tailed
/// popularity; `withheld` extra pairs per user for the withheld RMSE.
Dataset generate(std::uint32_t users, std::uint32_t items, std::uint32_t trainPerUser, std::uint32_t withheld)
{
    constexpr int kRank = 8;
    Dataset d;
    d.scale = { 1.0, 5.0, 0.0, false };
    d.userIds.resize(users);
    d.items.resize(items);
    for (std::uint32_t i = 0; i < items; ++i)
        d.items[i].externalId = "i" + std::to_string(i);
    std::vector<float> q(static_cast<std::size_t>(items) * kRank), bi(items);
    for (std::uint32_t i = 0; i < items; ++i) {
        SeededRandom rng(7, i);
        bi[i] = static_cast<float>(0.4 * rng.normal());
        for (int f = 0; f < kRank; ++f)
            q[static_cast<std::size_t>(i) * kRank + f] = static_cast<float>(0.35 * rng.normal());
    }
    const std::uint32_t per = trainPerUser + withheld;
    d.train.rows.resize(static_cast<std::size_t>(users) * trainPerUser);
    d.withheld.rows.resize(static_cast<std::size_t>(users) * withheld);
    parallelFor(users, [&](std::size_t begin, std::size_t end, unsigned) {
        std::vector<std::uint32_t> picked;
        for (std::size_t u = begin; u < end; ++u) {
            SeededRandom rng(11, u);
            float p[kRank];
            for (float& v : p)
                v = static_cast<float>(0.35 * rng.normal());
            const float bu = static_cast<float>(0.3 * rng.normal());
            picked.clear();
            while (picked.size() < per) {
                const double x = rng.uniform();
                const auto i = static_cast<std::uint32_t>(x * x * items); // long tail
                if (std::find(picked.begin(), picked.end(), i) == picked.end())
                    picked.push_back(i);
            }
            std::vector<Interaction> wh;
            for (std::uint32_t k = 0; k < per; ++k) {
                const std::uint32_t i = picked[k];
                float r = 3.6f + bu + bi[i] + static_cast<float>(0.8 * rng.normal());
                for (int f = 0; f < kRank; ++f)
                    r += p[f] * q[static_cast<std::size_t>(i) * kRank + f];
                r = std::min(5.0f, std::max(1.0f, std::round(r)));
                const Interaction row { ItemIndex(i), r, static_cast<Timestamp>(k) };
                if (k < trainPerUser)
                    d.train.rows[u * trainPerUser + k] = row;
                else
                    wh.push_back(row);
            }
            std::sort(wh.begin(), wh.end(), [](const Interaction& a, const Interaction& b) { return a.item < b.item; });
            std::copy(wh.begin(), wh.end(), d.withheld.rows.begin() + static_cast<std::ptrdiff_t>(u * withheld));
        }
    });
    d.train.offsets.resize(users + 1);
    d.withheld.offsets.resize(users + 1);
    for (std::uint32_t u = 0; u <= users; ++u) {
        d.train.offsets[u] = u * trainPerUser;
        d.withheld.offsets[u] = u * withheld;
    }
    return d;
}

} // namespace

int main(int argc, char** argv)
{
    const std::uint32_t users = argc > 1 ? static_cast<std::uint32_t>(std::atoi(argv[1])) : 160000;
    const std::uint32_t items = argc > 2 ? static_cast<std::uint32_t>(std::atoi(argv[2])) : 40000;
    const std::uint32_t perUser = argc > 3 ? static_cast<std::uint32_t>(std::atoi(argv[3])) : 63;
    std::printf("bench_models: %u users, %u items, %u train ratings per user, %u worker threads\n", users, items,
        perUser, workerCount());

    auto t = std::chrono::steady_clock::now();
    const Dataset data = generate(users, items, perUser, 5);
    std::printf(
        "generate: %.2f s, %zu train rows, %zu withheld rows\n", seconds(t), data.train.size(), data.withheld.size());

    t = std::chrono::steady_clock::now();
    const TrainMatrix train = TrainMatrix::build(data);
    std::printf("train matrix (both orientations): %.2f s, %zu ratings\n", seconds(t), train.nnz());

    ModelSettings settings;
    settings.kind = ModelKind::Bias;
    t = std::chrono::steady_clock::now();
    auto bias = BiasModel::fit(data, train, settings, {});
    const double biasFit = seconds(t);
    std::printf("bias baseline fit: %.2f s (%d sweeps, target <= 3 s)\n", biasFit, bias->iterationsRun);
    t = std::chrono::steady_clock::now();
    auto biasRun = bias->toRun(data, train, settings, {});
    std::printf("bias baseline withheld scores + top-100 lists: %.2f s (%lld list rows)\n", seconds(t),
        static_cast<long long>(biasRun->info.listRowCount));

    settings.kind = ModelKind::ItemKnn;
    t = std::chrono::steady_clock::now();
    auto knn = ItemKnnModel::fit(data, train, settings, {});
    std::printf("itemknn fit (baseline + similarities, pool %d): %.2f s (%zu pool entries)\n", settings.neighbourPool,
        seconds(t), knn->pool.size());
    t = std::chrono::steady_clock::now();
    auto knnRun = knn->toRun(data, train, settings, {});
    std::printf("itemknn withheld scores + top-100 lists (k = %d): %.2f s (%lld list rows)\n", settings.neighbours,
        seconds(t), static_cast<long long>(knnRun->info.listRowCount));

    settings.kind = ModelKind::Als;
    for (int rank : { 8, 16, 32, 64 }) {
        settings.rank = rank;
        AlsModel m = AlsModel::initial(train, settings);
        t = std::chrono::steady_clock::now();
        m.itemStep(train);
        const double itemStep = seconds(t);
        t = std::chrono::steady_clock::now();
        m.userStep(train);
        const double userStep = seconds(t);
        t = std::chrono::steady_clock::now();
        const double rmse = m.trainRmse(data, train, true);
        const double rmseTime = seconds(t);
        std::printf("als rank %2d: one iteration %.2f s (item step %.2f s, user step %.2f s); train RMSE pass %.2f s "
                    "(RMSE %.4f)%s\n",
            rank, itemStep + userStep, itemStep, userStep, rmseTime, rmse, rank == 32 ? "  [target <= 5 s]" : "");
        if (rank == 32) {
            t = std::chrono::steady_clock::now();
            auto run = m.toRun(data, train, settings, {});
            std::printf("als rank 32 withheld scores + top-100 lists for all users: %.2f s (%lld list rows) "
                        "[target <= 10 s]\n",
                seconds(t), static_cast<long long>(run->info.listRowCount));
        }
    }
    std::printf("peak memory: %.0f MiB\n", peakMiB());
    return 0;
}

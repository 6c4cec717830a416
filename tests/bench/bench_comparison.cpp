// SPDX-License-Identifier: MIT
// Paired comparison at the engine benchmark's scale: 160,000 users, seven metrics, 2000 bootstrap
// resamples, activity segments. Built, not run by CTest; prints wall time per repetition.
#include "core/runcomparison.h"

#include <chrono>
#include <cstdio>
#include <random>

using namespace slatewise::core;

int main()
{
    constexpr std::uint32_t users = 160000;
    Dataset data;
    data.genreNames = {"A", "B"};
    data.train.offsets.assign(users + 1, 0);
    data.withheld.offsets.assign(users + 1, 0);
    DatasetStats stats;
    std::mt19937_64 gen(11);
    std::poisson_distribution<int> activity(30);
    std::normal_distribution<double> noise(0.0, 0.1);
    RunEvaluation base, candidate;
    base.runName = "base";
    candidate.runName = "candidate";
    base.users.resize(users);
    candidate.users.resize(users);
    const Metric metrics[] = {Metric::Ndcg, Metric::Precision, Metric::Recall, Metric::Ap,
                              Metric::Rmse, Metric::Ild, Metric::Novelty};
    for (std::uint32_t u = 0; u < users; ++u) {
        data.userIds.push_back(std::to_string(u));
        stats.userTrainCount.push_back(activity(gen));
        base.users.users[u] = UserIndex(u);
        candidate.users.users[u] = UserIndex(u);
        for (Metric m : metrics) {
            const double b = 0.5 + noise(gen);
            base.users.column(m)[u] = b;
            candidate.users.column(m)[u] = b + 0.002 + noise(gen);
        }
    }
    ComparisonSettings settings;
    settings.segments = {SegmentSpec{SegmentKind::Activity, WarningCode::ColdUser}};
    for (int rep = 0; rep < 3; ++rep) {
        const auto t0 = std::chrono::steady_clock::now();
        auto r = compareRuns(base, candidate, data, stats, settings);
        const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        std::printf("compare: %u users, %zu metrics, %zu segments, B = %d: %.2f s%s\n", users, r->metrics.size(),
                    r->segments.size(), settings.bootstrap, s, r.ok() ? "" : " (failed)");
    }
    return 0;
}

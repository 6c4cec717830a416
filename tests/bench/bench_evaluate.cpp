// SPDX-License-Identifier: MIT
// Benchmark of the evaluation engine (not a test): a synthetic workspace of 160,000 users,
// about 5,000,000 withheld pairs with scores and a top-100 list per user (16 million list
// rows); full evaluation at k = 10 with curves to k = 50, beyond-accuracy measures and 1000
// bootstrap resamples. Target: at most 10 s wall time and 2 GiB peak memory on 2 cores.
//
// usage: bench_evaluate [users] [repeats] [bootstrap]
#include "core/dataset.h"
#include "core/evaluator.h"
#include "core/syntheticdata.h"

#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <vector>

using namespace slatewise::core;

namespace {
double cpuSeconds()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec)
           + 1e-6 * static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec);
}

double maxRssMiB()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_maxrss) / 1024.0; // ru_maxrss is in KiB on Linux
}
} // namespace

int main(int argc, char** argv)
{
    SyntheticSpec spec;
    spec.users = argc > 1 ? static_cast<std::uint32_t>(std::atoi(argv[1])) : 160000;
    spec.items = 40000;
    spec.genres = 20;
    spec.trainPerUser = 40;
    spec.withheldPerUser = 31.25;
    spec.listLength = 100;
    spec.seed = 7;
    const int repeats = argc > 2 ? std::atoi(argv[2]) : 3;
    EvalSettings settings;
    settings.k = 10;
    settings.curveMaxK = 50;
    settings.bootstrap = argc > 3 ? std::atoi(argv[3]) : 1000;

    auto t0 = std::chrono::steady_clock::now();
    const SyntheticWorkspace w = makeSynthetic(spec);
    const DatasetStats stats = computeStats(w.data);
    auto t1 = std::chrono::steady_clock::now();
    std::printf("synthetic data: %zu users, %zu withheld pairs, %zu list rows, %zu train rows (%.2f s to build)\n",
                w.data.userCount(), w.data.withheld.size(), w.run.listRows.size(), w.data.train.size(),
                std::chrono::duration<double>(t1 - t0).count());
    std::printf("memory after building the data: %.0f MiB\n", maxRssMiB());

    // CPU time beside wall time: on a shared machine wall time includes waiting for the cores.
    std::vector<double> seconds, cpu;
    double rmse = 0, ndcg = 0;
    for (int r = 0; r < repeats; ++r) {
        const double cpuStart = cpuSeconds();
        auto start = std::chrono::steady_clock::now();
        // Print when each stage starts, so a slow stage shows itself.
        std::string lastStage;
        Progress progress;
        progress.report = [&](double, std::string_view stage) {
            if (stage == lastStage)
                return;
            lastStage = std::string(stage);
            std::printf("  %7.3f s  %s\n", std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count(),
                        lastStage.c_str());
        };
        auto result = evaluateRun(w.data, stats, w.run, settings, progress);
        auto end = std::chrono::steady_clock::now();
        if (!result) {
            std::fprintf(stderr, "evaluation failed: %s\n", result.error().toString().c_str());
            return 1;
        }
        seconds.push_back(std::chrono::duration<double>(end - start).count());
        cpu.push_back(cpuSeconds() - cpuStart);
        rmse = result->accuracy ? result->accuracy->rmse : 0;
        ndcg = result->ranking ? result->ranking->ndcg : 0;
        std::printf("run %d: %.3f s wall, %.3f s CPU (rmse %.4f, ndcg@10 %.4f, %zu per-user rows, %zu warnings)\n", r + 1, seconds.back(), cpu.back(),
                    rmse, ndcg, result->users.size(), result->warnings.size());
    }
    std::sort(seconds.begin(), seconds.end());
    std::sort(cpu.begin(), cpu.end());
    std::printf("full evaluation at k=10, curves to 50, %d bootstrap resamples: median %.3f s over %d runs "
                "(target <= 10 s)\n",
                settings.bootstrap, seconds[seconds.size() / 2], repeats);
    std::printf("median CPU time %.3f s (both cores: ideal wall time on an idle machine about half of it)\n",
                cpu[cpu.size() / 2]);
    std::printf("peak memory (ru_maxrss): %.0f MiB (target <= 2048 MiB)\n", maxRssMiB());
    return 0;
}

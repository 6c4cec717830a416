// SPDX-License-Identifier: MIT
// Benchmark of the beyond-accuracy measures and warnings (not a test): the engine's synthetic
// workspace of 160,000 users with top-100 lists; computeBeyond at k = 10 on a table already
// holding the evaluator's per-user rows. Target: at most 5 s added to a full evaluation.
// Also times the run-wide exposure pass and one user explanation.
//
// usage: bench_beyond [users] [repeats]
#include "core/beyond.h"
#include "core/dataset.h"
#include "core/syntheticdata.h"
#include "core/userexplanation.h"

#include <time.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <vector>

using namespace slatewise::core;

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

    const auto t0 = std::chrono::steady_clock::now();
    const SyntheticWorkspace w = makeSynthetic(spec);
    const DatasetStats stats = computeStats(w.data);
    const auto t1 = std::chrono::steady_clock::now();
    std::printf("synthetic data: %zu users, %zu items, %zu train rows, %zu list rows (%.2f s to build)\n",
                w.data.userCount(), w.data.itemCount(), w.data.train.size(), w.run.listRows.size(),
                std::chrono::duration<double>(t1 - t0).count());

    // The evaluator's share of the precondition: rows for users with withheld items.
    RunEvaluation shell;
    shell.settings = settings;
    std::vector<std::uint32_t> rows;
    for (std::uint32_t u = 0; u < w.data.userCount(); ++u)
        if (!w.data.withheld.of(UserIndex(u)).empty())
            rows.push_back(u);
    shell.users.resize(rows.size());
    for (std::size_t r = 0; r < rows.size(); ++r) {
        const UserIndex u(rows[r]);
        const auto withheld = w.data.withheld.of(u);
        shell.users.users[r] = u;
        shell.users.nWithheld[r] = static_cast<std::int32_t>(withheld.size());
        shell.users.nRelevant[r] = static_cast<std::int32_t>(std::count_if(
            withheld.begin(), withheld.end(), [&](const Interaction& x) { return x.rating >= settings.relevantAt; }));
        shell.users.nTrain[r] = static_cast<std::int32_t>(w.data.train.of(u).size());
    }

    // The machine is shared: wall time depends on what else runs, so the CPU time of the
    // whole process (all threads) is reported too; CPU / cores is the wall time when idle.
    auto cpuSeconds = [] {
        timespec ts{};
        clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
        return static_cast<double>(ts.tv_sec) + 1e-9 * static_cast<double>(ts.tv_nsec);
    };
    std::vector<double> seconds, cpu;
    RunEvaluation eval;
    for (int r = 0; r < repeats; ++r) {
        eval = shell;
        const auto start = std::chrono::steady_clock::now();
        const double cpuStart = cpuSeconds();
        computeBeyond(w.data, stats, w.run, settings, eval);
        cpu.push_back(cpuSeconds() - cpuStart);
        seconds.push_back(std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count());
    }
    std::sort(seconds.begin(), seconds.end());
    std::sort(cpu.begin(), cpu.end());
    const auto& b = *eval.beyond;
    std::printf("computeBeyond at k=10 over %zu evaluated users: best %.3f s, median %.3f s (%d runs)\n",
                eval.users.size(), seconds.front(), seconds[seconds.size() / 2], repeats);
    std::printf("  CPU time (all threads): best %.3f s; load average when run: see uptime\n", cpu.front());
    std::printf("  ild %.4f novelty %.4f coverage %.4f gini %.4f lift %.2f kl %.4f series %.4f\n", b.ild, b.novelty,
                b.coverage, b.gini, b.popularityLift, b.calibrationKl, b.seriesShare);
    std::printf("  order_violations %lld seen_in_list %lld burst_echo %.4f; %zu warnings\n",
                static_cast<long long>(b.orderViolations), static_cast<long long>(b.seenInList), b.burstEcho,
                eval.warnings.size());

    const auto e0 = std::chrono::steady_clock::now();
    const UserExplanation one = UserExplanation::build(w.data, stats, w.run, eval, eval.users.users.front());
    const double explainMs = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - e0).count();
    std::printf("one user explanation: %.2f ms (%zu list rows, %zu withheld, %zu history)\n", explainMs,
                one.list.size(), one.withheld.size(), one.history.size());
    return seconds.front() <= 5.0 ? 0 : 1;
}

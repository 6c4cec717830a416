// SPDX-License-Identifier: MIT
// Import benchmark: writes synthetic train and withheld files (10 million interaction rows by
// default) into a temporary directory outside the repository, imports them end to end (parse,
// validate, insert, index) and prints rows per second and peak memory. Then times loading the
// dataset back. Usage: bench_import [ROWS_IN_MILLIONS] [DIR]
#include "core/importer.h"
#include "core/syntheticdata.h"
#include "core/workspace.h"

#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <string_view>

using namespace slatewise::core;

namespace {
double peakMiB()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_maxrss) / 1024.0; // ru_maxrss is in KiB on Linux
}
double cpuSeconds()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec)
           + static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec) / 1e6;
}
double seconds(std::chrono::steady_clock::time_point since)
{
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - since).count();
}
std::string loadAverage()
{
    double load[3] = {0, 0, 0};
    if (getloadavg(load, 3) < 1)
        return "unknown";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.2f %.2f %.2f", load[0], load[1], load[2]);
    return buf;
}
} // namespace

int main(int argc, char** argv)
{
    const double millions = argc > 1 ? std::atof(argv[1]) : 10.0;
    const std::string dir = argc > 2 ? argv[2] : "/tmp/slatewise-bench-import-" + std::to_string(::getpid());
    std::filesystem::create_directories(dir);

    // 160,000 users x (50 train + 12.5 withheld) = 10 million rows; 40,000 items.
    SyntheticSpec spec;
    spec.users = static_cast<std::uint32_t>(16000 * millions);
    spec.items = 40000;
    spec.trainPerUser = 50;
    spec.withheldPerUser = 12.5;
    spec.listLength = 1; // lists are not imported here
    spec.seed = 42;

    // Generate in a child process so that its memory does not count in this process's peak.
    auto start = std::chrono::steady_clock::now();
    const pid_t child = fork();
    if (child == 0) {
        const auto status = writeSyntheticFiles(spec, dir);
        std::_Exit(status.ok() ? 0 : 1);
    }
    int status = 0;
    waitpid(child, &status, 0);
    if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) {
        std::fprintf(stderr, "cannot write synthetic files into %s\n", dir.c_str());
        return 1;
    }
    const auto size = [&](const char* name) { return std::filesystem::file_size(dir + "/" + name); };
    std::printf("generated files in %.2f s: train.csv %.1f MiB, withheld.csv %.1f MiB, catalog.csv %.1f MiB\n", seconds(start),
                size("train.csv") / 1048576.0, size("withheld.csv") / 1048576.0, size("catalog.csv") / 1048576.0);

    ImportRequest request;
    request.workspacePath = dir + "/bench.sqlite";
    request.catalogPath = dir + "/catalog.csv";
    request.trainPath = dir + "/train.csv";
    request.withheldPath = dir + "/withheld.csv";
    request.replace = true;
    const double before = peakMiB();
    const double cpuBefore = cpuSeconds();
    start = std::chrono::steady_clock::now();
    // Print when each stage starts, to see where the time goes.
    std::string lastStage;
    Progress progress;
    progress.report = [&](double, std::string_view stage) {
        const std::string head(stage.substr(0, stage.find(':')));
        if (head != lastStage) {
            std::printf("  %6.2f s  %s\n", seconds(start), head.c_str());
            lastStage = head;
        }
    };
    auto report = importWorkspace(request, progress);
    const double importSeconds = seconds(start);
    const double importPeak = peakMiB();
    const double importCpu = cpuSeconds() - cpuBefore;
    if (!report) {
        for (const auto& e : report.errors())
            std::fprintf(stderr, "%s\n", e.toString().c_str());
        return 1;
    }
    const auto rows = static_cast<double>(report->trainRows + report->withheldRows);
    std::printf("import: %lld train + %lld withheld rows, %lld users, %lld items in %.2f s\n",
                static_cast<long long>(report->trainRows), static_cast<long long>(report->withheldRows),
                static_cast<long long>(report->users), static_cast<long long>(report->items), importSeconds);
    std::printf("import: %.0f rows/s end to end (target >= 1,000,000)\n", rows / importSeconds);
    // On a shared machine wall time includes waiting for a core; CPU time (both threads
    // together) bounds what an idle two-core machine would take from above.
    std::printf("import: %.2f s CPU (user+system, all threads), %.0f rows per CPU-second; load average now %s\n", importCpu,
                rows / importCpu, loadAverage().c_str());
    std::printf("import: peak memory %.0f MiB (before import %.0f MiB; target <= 1024)\n", importPeak, before);
    std::printf("workspace file: %.1f MiB\n", std::filesystem::file_size(request.workspacePath) / 1048576.0);

    start = std::chrono::steady_clock::now();
    auto ws = Workspace::open(request.workspacePath, true);
    if (!ws)
        return 1;
    auto data = ws->loadDataset();
    if (!data)
        return 1;
    std::printf("loadDataset: %zu train + %zu withheld rows in %.2f s, peak memory now %.0f MiB\n", data->train.size(),
                data->withheld.size(), seconds(start), peakMiB());

    if (argc <= 2)
        std::filesystem::remove_all(dir);
    return 0;
}

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

using namespace slatewise::core;

namespace {
double peakMiB()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_maxrss) / 1024.0; // ru_maxrss is in KiB on Linux
}
double seconds(std::chrono::steady_clock::time_point since)
{
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - since).count();
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
    start = std::chrono::steady_clock::now();
    auto report = importWorkspace(request);
    const double importSeconds = seconds(start);
    const double importPeak = peakMiB();
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

// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/commands.h"
#include "core/demogenerator.h"

#include <cstdio>
#include <iostream>

namespace slatewise::cli {

int demoDataCommand(const std::vector<std::string>& argv)
{
    const CommandSpec spec { "demo-data", "--out DIR [--seed N]",
        "Regenerates the invented film-club demo: catalog, members, train and withheld ratings and the three "
        "simulated runs. With the default seed the files are byte for byte those committed in demo-catalog/.",
        0,
        { { "out", "DIR",
              "folder to write the files into (created when missing; files of the same name are replaced)" },
            { "seed", "N", "random seed (default " + std::to_string(core::DemoGenerator::kDefaultSeed) + ")" },
            { "quiet", "", "print nothing but errors" } } };
    int exitCode = ExitOk;
    const auto args = parseOrExit(spec, argv, exitCode);
    if (!args)
        return exitCode;
    if (!args->positionals().empty()) {
        std::cerr << "slatewise demo-data: unexpected argument '" << args->positionals().front() << "'\n";
        return ExitUsage;
    }
    if (!args->has("out")) {
        std::cerr << "slatewise demo-data: --out DIR is required\n";
        return ExitUsage;
    }
    std::string error;
    const auto seed = args->integer("seed", static_cast<long long>(core::DemoGenerator::kDefaultSeed), error);
    if (!seed || *seed < 0) {
        std::cerr << "slatewise demo-data: " << (error.empty() ? "--seed must be a non-negative integer" : error)
                  << "\n";
        return ExitUsage;
    }
    const auto output = core::DemoGenerator::generate(static_cast<std::uint64_t>(*seed));
    const std::string dir = args->value("out");
    if (auto status = core::DemoGenerator::write(output, dir); !status) {
        std::cerr << "slatewise demo-data: " << status.error().toString() << "\n";
        return ExitUsage;
    }
    if (!args->has("quiet")) {
        std::size_t bytes = 0;
        for (const auto& f : output.files)
            bytes += f.content.size();
        std::printf("wrote %zu files (%.1f MB) to %s: %zu titles, %zu members, %zu train and %zu withheld ratings, "
                    "%zu runs\n",
            output.files.size(), static_cast<double>(bytes) / 1e6, dir.c_str(), output.facts.titles,
            output.facts.members, output.facts.trainRows, output.facts.withheldRows, output.runs.size());
    }
    return ExitOk;
}

} // namespace slatewise::cli

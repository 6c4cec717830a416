// SPDX-License-Identifier: MIT
#include "app/slatewise/commands.h"

#include <cstring>
#include <iostream>

namespace slatewise::cli {

const std::vector<CommandEntry>& commands()
{
    static const std::vector<CommandEntry> table {
        { "import", "create a workspace from catalog, train and withheld files", importCommand },
        { "add-run", "add a model run (scores and/or ranked lists) to a workspace", addRunCommand },
        { "info", "print what a workspace holds", infoCommand },
        { "evaluate", "compute accuracy, ranking and beyond-accuracy measures", evaluateCommand },
        { "worst", "list the worst-served users of a run", worstCommand },
        { "explain", "show one user's list beside their withheld favourites, with warnings", explainCommand },
        { "compare", "compare two runs user by user, with intervals and tests", compareCommand },
        { "fit", "fit a reference model and store it as a run", fitCommand },
        { "rerank", "derive a what-if run by re-ranking another run's lists", rerankCommand },
        { "export", "write every chart as PNG, SVG and PDF", exportCommand },
        { "report", "write the meeting pack PDF", reportCommand },
        { "demo-data", "regenerate the invented film-club demo files", demoDataCommand },
        { "demo", "build the ready-to-explore demo workspace", demoCommand },
    };
    return table;
}

namespace {
void printUsage(std::ostream& out)
{
    out << "usage: slatewise COMMAND [ARGS]\n\n"
           "Evaluate recommendation runs against withheld interactions.\n\ncommands:\n";
    for (const auto& c : commands()) {
        std::string name = c.name;
        name.resize(12, ' ');
        out << "  " << name << c.summary << "\n";
    }
    out << "\n'slatewise COMMAND --help' describes one command.\n"
           "exit codes: 0 success, 1 usage error, 2 input data error, 3 workspace error\n";
}
} // namespace

} // namespace slatewise::cli

int main(int argc, char** argv)
{
    using namespace slatewise::cli;
    if (argc < 2 || std::strcmp(argv[1], "--help") == 0 || std::strcmp(argv[1], "-h") == 0) {
        printUsage(argc < 2 ? std::cerr : std::cout);
        return argc < 2 ? 1 : 0;
    }
    if (std::strcmp(argv[1], "--version") == 0) {
        std::cout << "slatewise " << SLATEWISE_VERSION << "\n";
        return 0;
    }
    for (const auto& c : commands()) {
        if (std::strcmp(argv[1], c.name) == 0)
            return c.run(std::vector<std::string>(argv + 2, argv + argc));
    }
    std::cerr << "slatewise: unknown command '" << argv[1] << "'\n";
    printUsage(std::cerr);
    return 1;
}

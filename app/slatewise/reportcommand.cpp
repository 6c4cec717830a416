// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/evalsettingsargs.h"
#include "app/slatewise/offscreenapp.h"
#include "app/slatewise/reporting.h"

#include <algorithm>
#include <iostream>

#ifdef SLATEWISE_WITH_UI
#include "core/error.h"
#include "ui/meetingpack.h"
#include "ui/workspacereport.h"

#include <QFileInfo>
#endif

namespace slatewise::cli {

namespace {
const CommandSpec& reportSpec()
{
    static const CommandSpec spec = [] {
        CommandSpec c { "report", "WORKSPACE --out FILE.pdf [--base A --candidate B] [--run NAME]...",
            "Writes the meeting pack: a multi-page A4 PDF with the run summary, the error-by-rating chart, the "
            "k-curves, warning prevalence, the comparison of B against A (when both are given), the ten "
            "worst-served users and three user case studies. Needs no display.",
            1,
            { { .name = "out", .valueName = "FILE", .help = "the PDF to write", .required = true },
                { "base", "NAME", "the run to compare against" },
                { "candidate", "NAME", "the run being judged; its worst-served users are the case studies" },
                { "run", "NAME", "a run to include (repeat for several; default: all runs)", true } } };
        return withEvalSettingsOptions(std::move(c));
    }();
    return spec;
}
} // namespace

#ifdef SLATEWISE_WITH_UI
int reportCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    const auto args = parseOrExit(reportSpec(), argv, exitCode);
    if (!args)
        return exitCode;
    std::string error;
    const auto settings = evalSettingsFromArgs(*args, error);
    if (!settings)
        return usageFailure("report", error);
    if (args->has("base") != args->has("candidate"))
        return usageFailure("report", "give both --base and --candidate, or neither");
    std::vector<std::string> runs = args->values("run");
    if (!runs.empty() && args->has("base")) {
        // The compared runs are always part of the pack.
        for (const auto& name : { args->value("base"), args->value("candidate") })
            if (std::find(runs.begin(), runs.end(), name) == runs.end())
                runs.push_back(name);
    }

    const OffscreenApp app;
    auto report = ui::WorkspaceReport::load(args->positionals().front(), runs, *settings);
    if (!report)
        return printErrors("report", report.errors());

    std::optional<std::size_t> base, candidate;
    if (args->has("base")) {
        base = report->runIndex(args->value("base"));
        candidate = report->runIndex(args->value("candidate"));
        for (const auto& [index, name] :
            { std::pair { base, args->value("base") }, std::pair { candidate, args->value("candidate") } }) {
            if (!index) {
                core::Error e { core::ErrorKind::Usage, args->positionals().front(), 0, 0, name, "no such run",
                    "the name of a run in the workspace (see 'slatewise info')" };
                return printErrors("report", { e });
            }
        }
        if (*base == *candidate) {
            std::cerr << "slatewise report: --base and --candidate name the same run\n";
            return ExitUsage;
        }
    }
    const QString out = QString::fromStdString(args->value("out"));
    const auto status = ui::MeetingPack::write(report->packContent(base, candidate), out);
    if (!status)
        return printErrors("report", status.errors());
    std::cout << "wrote the meeting pack to " << QFileInfo(out).absoluteFilePath().toStdString() << "\n";
    return ExitOk;
}
#else
int reportCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    if (!parseOrExit(reportSpec(), argv, exitCode))
        return exitCode;
    std::cerr << "slatewise report: this build has no Qt layer (configured with SLATEWISE_BUILD_GUI=OFF)\n";
    return ExitUsage;
}
#endif

} // namespace slatewise::cli

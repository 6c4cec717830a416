// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/evalsettingsargs.h"
#include "app/slatewise/offscreenapp.h"
#include "app/slatewise/reporting.h"

#include <iostream>

#ifdef SLATEWISE_WITH_UI
#include "core/error.h"
#include "ui/chartexporter.h"
#include "ui/chartview.h"
#include "ui/csvexporter.h"
#include "ui/workspacereport.h"

#include <QDir>
#include <QStandardItemModel>
#endif

namespace slatewise::cli {

namespace {
const CommandSpec& exportSpec()
{
    static const CommandSpec spec = [] {
        CommandSpec c { "export", "WORKSPACE --out DIR [--run NAME]... [--width PX] [--height PX] [--dpi N]",
            "Evaluates the runs (all runs when no --run is given) and writes every chart as PNG, SVG and PDF "
            "into DIR, plus the tables (run summary, error by rating, k-curves, warning shares, worst-served "
            "users) as CSV. Needs no display.",
            1,
            { { .name = "out",
                  .valueName = "DIR",
                  .help = "directory to write into (created when missing)",
                  .required = true },
                { "run", "NAME", "a run to include (repeat for several; default: all runs)", true },
                { "width", "PX", "PNG width in pixels (default 1600)" },
                { "height", "PX", "PNG height in pixels (default 1000)" },
                { "dpi", "N", "PNG resolution; text keeps its physical size (default 144)" } } };
        return withEvalSettingsOptions(std::move(c));
    }();
    return spec;
}
} // namespace

#ifdef SLATEWISE_WITH_UI
int exportCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    const auto args = parseOrExit(exportSpec(), argv, exitCode);
    if (!args)
        return exitCode;
    std::string error;
    const auto width = args->integer("width", 1600, error);
    const auto height = width ? args->integer("height", 1000, error) : std::nullopt;
    const auto dpi = height ? args->integer("dpi", 144, error) : std::nullopt;
    const auto settings = dpi ? evalSettingsFromArgs(*args, error) : std::nullopt;
    if (!settings)
        return usageFailure("export", error);
    if (*width < 16 || *height < 16 || *width > 20000 || *height > 20000 || *dpi < 24 || *dpi > 1200)
        return usageFailure("export", "--width and --height must be 16..20000 pixels, --dpi 24..1200");

    const OffscreenApp app;
    auto report = ui::WorkspaceReport::load(args->positionals().front(), args->values("run"), *settings);
    if (!report)
        return printErrors("export", report.errors());

    const QString out = QString::fromStdString(args->value("out"));
    if (!QDir().mkpath(out)) {
        core::Error e { core::ErrorKind::Workspace, args->value("out"), 0, 0, {}, "cannot create the output directory",
            "a writable directory" };
        return printErrors("export", { e });
    }
    const QDir dir(out);
    const QSize pixels(static_cast<int>(*width), static_cast<int>(*height));
    // Vector formats at the logical size that matches the PNG's physical size.
    const double scale = static_cast<double>(*dpi) / 96.0;
    const QSize logical(static_cast<int>(*width / scale + 0.5), static_cast<int>(*height / scale + 0.5));
    int files = 0;
    for (const auto& chart : report->charts()) {
        const QString stem = dir.filePath(chart->fileStem());
        for (const auto& status :
            { ui::ChartExporter::savePng(*chart, stem + QStringLiteral(".png"), pixels, static_cast<int>(*dpi)),
                ui::ChartExporter::saveSvg(*chart, stem + QStringLiteral(".svg"), logical),
                ui::ChartExporter::savePdf(*chart, stem + QStringLiteral(".pdf"), logical) }) {
            if (!status)
                return printErrors("export", status.errors());
            ++files;
        }
        std::cout << chart->fileStem().toStdString() << ": " << chart->title().toStdString()
                  << (chart->isEmpty() ? " (no data: the chart says why)" : "") << "\n";
    }
    for (const auto& table : report->tables()) {
        const auto status = ui::CsvExporter::write(*table.model, dir.filePath(table.stem + QStringLiteral(".csv")));
        if (!status)
            return printErrors("export", status.errors());
        ++files;
        std::cout << table.stem.toStdString() << ".csv: " << table.model->rowCount() << " rows\n";
    }
    std::cout << "wrote " << files << " files to " << out.toStdString() << "\n";
    return ExitOk;
}
#else
int exportCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    if (!parseOrExit(exportSpec(), argv, exitCode))
        return exitCode;
    std::cerr << "slatewise export: this build has no Qt layer (configured with SLATEWISE_BUILD_GUI=OFF)\n";
    return ExitUsage;
}
#endif

} // namespace slatewise::cli

// SPDX-License-Identifier: MIT
// Benchmark of the workbench on a large synthetic workspace (not run by CTest):
//   bench_workbench [--users N] [--dir DIR] [--repeat R]
// Builds (once, cached in DIR) a workspace of N users (default 160,000) from core's seeded
// synthetic generator through the importer, evaluates and stores the run, then measures with
// the real window offscreen: open until the overview shows its metrics; re-sorting the user
// browser by another metric; opening a user in the inspector; and peak memory (VmHWM).
// Targets: open <= 2 s, re-sort <= 200 ms, inspector <= 50 ms, memory <= 1.5 GiB.
#include "core/evaluationstore.h"
#include "core/evaluator.h"
#include "core/importer.h"
#include "core/syntheticdata.h"
#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/csvexporter.h"
#include "ui/inspectorscreen.h"
#include "ui/mainwindow.h"
#include "ui/overviewscreen.h"
#include "ui/runmetricsmodel.h"
#include "ui/userbrowsermodel.h"
#include "ui/userbrowserproxy.h"
#include "ui/usersscreen.h"
#include "ui/workspacedocument.h"

#include <QApplication>
#include <QDir>
#include <QElapsedTimer>
#include <QEventLoop>
#include <QFile>
#include <QFileInfo>
#include <QTimer>

#include <algorithm>
#include <cstdio>
#include <functional>
#include <string>
#include <vector>

using namespace slatewise;

namespace {

double median(std::vector<double> v)
{
    std::sort(v.begin(), v.end());
    return v.empty() ? 0.0 : v.size() % 2 ? v[v.size() / 2] : (v[v.size() / 2 - 1] + v[v.size() / 2]) / 2.0;
}

long peakKiB()
{
    QFile f(QStringLiteral("/proc/self/status"));
    if (!f.open(QIODevice::ReadOnly))
        return -1;
    for (const QByteArray& line : f.readAll().split('\n'))
        if (line.startsWith("VmHWM:"))
            return line.mid(6).trimmed().split(' ').front().toLong();
    return -1;
}

void waitUntil(const std::function<bool()>& done)
{
    while (!done()) {
        QEventLoop loop;
        QTimer::singleShot(1, &loop, &QEventLoop::quit);
        loop.exec();
    }
}

bool buildWorkspace(const QString& dir, std::uint32_t users, QString& path)
{
    path = QDir(dir).filePath(QStringLiteral("bench-%1.sqlite").arg(users));
    if (QFileInfo::exists(path))
        return true;
    core::SyntheticSpec spec;
    spec.users = users;
    spec.items = 40000;
    spec.trainPerUser = 50;
    spec.withheldPerUser = 10;
    spec.listLength = 100;
    spec.seed = 160;
    const QString files = QDir(dir).filePath(QStringLiteral("files-%1").arg(users));
    QDir().mkpath(files);
    std::fprintf(stderr, "writing synthetic files to %s\n", qPrintable(files));
    if (!core::writeSyntheticFiles(spec, files.toStdString()).ok())
        return false;
    const auto f = [&](const char* name) { return QDir(files).filePath(QString::fromLatin1(name)).toStdString(); };
    core::ImportRequest request;
    request.workspacePath = path.toStdString();
    request.catalogPath = f("catalog.csv");
    request.trainPath = f("train.csv");
    request.withheldPath = f("withheld.csv");
    std::fprintf(stderr, "importing\n");
    auto imported = core::importWorkspace(request);
    if (!imported) {
        std::fprintf(stderr, "%s\n", imported.error().toString().c_str());
        return false;
    }
    core::AddRunRequest run;
    run.workspacePath = request.workspacePath;
    run.name = "synthetic";
    run.scoresPath = f("scores.csv");
    run.listsPath = f("lists.csv");
    std::fprintf(stderr, "adding the run\n");
    auto added = core::addRun(run);
    if (!added) {
        std::fprintf(stderr, "%s\n", added.error().toString().c_str());
        return false;
    }
    // Evaluate once and store, as `slatewise evaluate` would, so opening reads stored results.
    std::fprintf(stderr, "evaluating\n");
    auto ws = core::Workspace::open(path.toStdString());
    auto data = ws->loadDataset();
    auto loaded = ws->loadRun("synthetic", *data);
    const auto stats = core::computeStats(*data);
    auto eval = core::evaluateRun(*data, stats, *loaded, core::EvalSettings{});
    if (!eval || !core::EvaluationStore::store(ws->db(), eval.value()).ok())
        return false;
    QDir(files).removeRecursively();
    return true;
}

} // namespace

int main(int argc, char** argv)
{
    QApplication app(argc, argv);
    std::uint32_t users = 160000;
    QString dir = QDir::temp().filePath(QStringLiteral("slatewise-bench-ui"));
    int repeat = 5;
    for (int i = 1; i + 1 < argc; i += 2) {
        const std::string opt = argv[i];
        if (opt == "--users")
            users = static_cast<std::uint32_t>(std::stoul(argv[i + 1]));
        else if (opt == "--dir")
            dir = QString::fromLocal8Bit(argv[i + 1]);
        else if (opt == "--repeat")
            repeat = std::stoi(argv[i + 1]);
    }
    QDir().mkpath(dir);
    QString path;
    if (!buildWorkspace(dir, users, path)) {
        std::fprintf(stderr, "could not build the benchmark workspace\n");
        return 1;
    }

    std::vector<double> openMs, fullMs, sortMs, inspectMs;
    double csvMs = 0, csvMiB = 0;
    for (int r = 0; r < repeat; ++r) {
        ui::MainWindow window;
        window.resize(1600, 1000);
        window.show();
        QApplication::processEvents();
        auto* document = window.document();
        QElapsedTimer clock;
        clock.start();
        window.openWorkspace(path);
        // The overview is shown once the metrics table has its run and has painted.
        waitUntil([&] { return window.overview()->metricsModel()->rowCount() > 0 || !document->task()->isRunning(); });
        window.overview()->repaint();
        openMs.push_back(static_cast<double>(clock.nsecsElapsed()) / 1e6);
        waitUntil([&] { return !document->task()->isRunning() && document->isFullyLoaded(); });
        fullMs.push_back(static_cast<double>(clock.nsecsElapsed()) / 1e6);

        window.showScreen(ui::MainWindow::Users);
        auto* screen = window.users();
        const core::Metric order[] = {core::Metric::Rmse, core::Metric::Ndcg, core::Metric::Recall, core::Metric::Ild};
        for (auto m : order) {
            clock.restart();
            screen->sortWorstFirst(m);
            QApplication::processEvents();
            sortMs.push_back(static_cast<double>(clock.nsecsElapsed()) / 1e6);
        }
        if (r == 0) {
            // Saving the whole users table as CSV (the right-click "Save table as CSV…").
            clock.restart();
            const QString csv = QDir(dir).filePath(QStringLiteral("users.csv"));
            const bool saved = ui::CsvExporter::write(*screen->proxy(), csv).ok();
            csvMs = static_cast<double>(clock.nsecsElapsed()) / 1e6;
            csvMiB = static_cast<double>(QFileInfo(csv).size()) / 1048576.0;
            QFile::remove(csv);
            if (!saved)
                csvMs = -1;
        }
        const int rows = screen->proxy()->rowCount();
        for (int i = 0; i < 10; ++i) {
            const auto user = screen->model()->userAt((i * 7919 + r * 104729) % rows);
            clock.restart();
            window.openUser(document->runNames().front(), user, true);
            QApplication::processEvents();
            inspectMs.push_back(static_cast<double>(clock.nsecsElapsed()) / 1e6);
        }
    }
    const double peakMiB = static_cast<double>(peakKiB()) / 1024.0;
    std::printf("users: %u (workspace %s, %.0f MiB)\n", users, qPrintable(path), static_cast<double>(QFileInfo(path).size()) / 1048576.0);
    std::printf("open to overview shown: median %.0f ms (target <= 2000) over %d opens\n", median(openMs), repeat);
    std::printf("dataset and run in memory (inspector ready): median %.0f ms\n", median(fullMs));
    std::printf("re-sort user browser by another metric: median %.1f ms (target <= 200) over %zu sorts\n", median(sortMs), sortMs.size());
    std::printf("open a user in the inspector: median %.1f ms (target <= 50) over %zu users\n", median(inspectMs), inspectMs.size());
    std::printf("save the users table as CSV: %.0f ms (%.1f MiB)\n", csvMs, csvMiB);
    std::printf("peak memory (VmHWM): %.0f MiB (target <= 1536)\n", peakMiB);
    return 0;
}

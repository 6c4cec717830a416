// SPDX-License-Identifier: MIT
#include "ui/application.h"

#include "core/evaluation.h"
#include "ui/backgroundtask.h"
#include "ui/comparescreen.h"
#include "ui/inspectorscreen.h"
#include "ui/mainwindow.h"
#include "ui/usersscreen.h"
#include "ui/workspacedocument.h"

#include <QApplication>
#include <QCommandLineParser>
#include <QDir>
#include <QElapsedTimer>
#include <QEventLoop>
#include <QPalette>
#include <QStyleFactory>
#include <QTimer>

#include <cstdio>
#include <functional>

namespace slatewise::ui {

namespace {

/// Runs the event loop until `done()` holds or `timeoutMs` passes; true when it held.
bool waitUntil(const std::function<bool()>& done, int timeoutMs)
{
    QElapsedTimer clock;
    clock.start();
    while (!done()) {
        if (clock.elapsed() > timeoutMs)
            return false;
        QEventLoop loop;
        QTimer::singleShot(20, &loop, &QEventLoop::quit);
        loop.exec();
    }
    return true;
}

/// A dark palette built from roles, to check that every screen stays legible on one.
QPalette darkPalette()
{
    QPalette p;
    const QColor window(0x2b, 0x2d, 0x31), base(0x1f, 0x21, 0x24), text(0xe8, 0xe8, 0xe8), mid(0x55, 0x58, 0x5e);
    p.setColor(QPalette::Window, window);
    p.setColor(QPalette::WindowText, text);
    p.setColor(QPalette::Base, base);
    p.setColor(QPalette::AlternateBase, window);
    p.setColor(QPalette::ToolTipBase, base);
    p.setColor(QPalette::ToolTipText, text);
    p.setColor(QPalette::PlaceholderText, QColor(0x9a, 0x9a, 0x9a));
    p.setColor(QPalette::Text, text);
    p.setColor(QPalette::Button, window);
    p.setColor(QPalette::ButtonText, text);
    p.setColor(QPalette::BrightText, Qt::white);
    p.setColor(QPalette::Mid, mid);
    p.setColor(QPalette::Dark, QColor(0x18, 0x19, 0x1b));
    p.setColor(QPalette::Light, QColor(0x45, 0x48, 0x4d));
    p.setColor(QPalette::Highlight, QColor(0x3d, 0x6f, 0xb4));
    p.setColor(QPalette::HighlightedText, Qt::white);
    p.setColor(QPalette::Link, QColor(0x7a, 0xb0, 0xf0));
    p.setColor(QPalette::Disabled, QPalette::Text, QColor(0x80, 0x80, 0x80));
    p.setColor(QPalette::Disabled, QPalette::WindowText, QColor(0x80, 0x80, 0x80));
    p.setColor(QPalette::Disabled, QPalette::ButtonText, QColor(0x80, 0x80, 0x80));
    return p;
}

bool save(QWidget& window, const QString& dir, const QString& name, const QString& suffix)
{
    QApplication::processEvents();
    const QString path = QDir(dir).filePath(name + suffix + QStringLiteral(".png"));
    const bool ok = window.grab().save(path);
    std::fprintf(ok ? stdout : stderr, "%s %s\n", ok ? "wrote" : "could not write", qPrintable(path));
    return ok;
}

int renderScreenshots(MainWindow& window, const QString& workspace, const QString& dir, const QString& suffix)
{
    if (!QDir().mkpath(dir)) {
        std::fprintf(stderr, "slatewise-gui: cannot create %s\n", qPrintable(dir));
        return 3;
    }
    window.resize(1600, 1000);
    window.show();
    auto* document = window.document();
    if (!window.openWorkspace(workspace)) {
        std::fprintf(stderr, "slatewise-gui: cannot open %s\n", qPrintable(workspace));
        return 3;
    }
    const bool loaded = waitUntil([&] { return !document->task()->isRunning() && (document->isFullyLoaded() || !document->isOpen()); },
                                  10 * 60 * 1000);
    if (!loaded || !document->isOpen()) {
        std::fprintf(stderr, "slatewise-gui: %s\n", qPrintable(document->lastError()));
        return 3;
    }
    bool ok = true;
    window.showScreen(MainWindow::Overview);
    ok &= save(window, dir, QStringLiteral("overview"), suffix);

    window.showScreen(MainWindow::Users);
    const QStringList runs = document->runNames();
    const QString run = runs.isEmpty() ? QString() : runs.front();
    window.users()->setRun(run);
    window.users()->sortWorstFirst(core::Metric::Ndcg);
    if (auto worst = window.users()->firstUser()) {
        window.users()->selectUser(*worst);
        ok &= save(window, dir, QStringLiteral("users"), suffix);
        window.openUser(run, *worst, true);
        ok &= save(window, dir, QStringLiteral("inspector"), suffix);
    } else {
        ok &= save(window, dir, QStringLiteral("users"), suffix);
    }

    if (runs.size() >= 2) {
        window.showScreen(MainWindow::Compare);
        if (window.compare()->compare(runs[0], runs[1]))
            waitUntil([&] { return !document->task()->isRunning(); }, 10 * 60 * 1000);
        ok &= save(window, dir, QStringLiteral("compare"), suffix);
    }
    return ok ? 0 : 3;
}

} // namespace

int runApplication(int argc, char** argv)
{
    QApplication app(argc, argv);
    QApplication::setApplicationName(QStringLiteral("Slatewise"));
    QApplication::setOrganizationName(QStringLiteral("Slatewise"));
    QApplication::setApplicationVersion(QStringLiteral(SLATEWISE_VERSION));

    QCommandLineParser parser;
    parser.setApplicationDescription(QStringLiteral("Slatewise workbench: browse the worst-served users, inspect one user's list "
                                                    "against their withheld favourites and compare runs."));
    parser.addHelpOption();
    parser.addVersionOption();
    parser.addPositionalArgument(QStringLiteral("WORKSPACE"), QStringLiteral("A Slatewise workspace (.sqlite) to open."));
    const QCommandLineOption screenshots(QStringLiteral("screenshots"),
                                         QStringLiteral("Render each main screen of WORKSPACE to PNG files in DIR, then exit."),
                                         QStringLiteral("DIR"));
    const QCommandLineOption dark(QStringLiteral("dark"), QStringLiteral("Use a dark palette (screenshots get a -dark suffix)."));
    parser.addOption(screenshots);
    parser.addOption(dark);
    parser.process(app);

    const QStringList args = parser.positionalArguments();
    const QString workspace = args.isEmpty() ? QString() : args.front();
    if (parser.isSet(dark)) {
        QApplication::setStyle(QStyleFactory::create(QStringLiteral("Fusion")));
        QApplication::setPalette(darkPalette());
    }

    MainWindow window;
    if (parser.isSet(screenshots)) {
        if (workspace.isEmpty()) {
            std::fprintf(stderr, "slatewise-gui: --screenshots needs a WORKSPACE\n");
            return 1;
        }
        return renderScreenshots(window, workspace, parser.value(screenshots),
                                 parser.isSet(dark) ? QStringLiteral("-dark") : QString());
    }
    window.restoreSettings(workspace.isEmpty());
    window.show();
    if (!workspace.isEmpty())
        window.openWorkspace(workspace);
    return QApplication::exec();
}

} // namespace slatewise::ui

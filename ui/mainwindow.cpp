// SPDX-License-Identifier: MIT
#include "ui/mainwindow.h"

#include "core/comparisonresult.h"
#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/comparescreen.h"
#include "ui/exportcontextmenu.h"
#include "ui/exportsettings.h"
#include "ui/fitdialog.h"
#include "ui/format.h"
#include "ui/importdialog.h"
#include "ui/inspectorscreen.h"
#include "ui/meetingpack.h"
#include "ui/overviewscreen.h"
#include "ui/pngsizedialog.h"
#include "ui/rerankdialog.h"
#include "ui/tablesaveprogress.h"
#include "ui/usersscreen.h"
#include "ui/workspacedocument.h"
#include "ui/workspacereport.h"

#include <QAction>
#include <QApplication>
#include <QCloseEvent>
#include <QDate>
#include <QDir>
#include <QDragEnterEvent>
#include <QDropEvent>
#include <QFileDialog>
#include <QFileInfo>
#include <QKeySequence>
#include <QLabel>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QProgressBar>
#include <QPushButton>
#include <QSettings>
#include <QStatusBar>
#include <QTabWidget>
#include <QTableView>

#include <optional>

namespace slatewise::ui {

namespace {
constexpr int kMaxRecent = 8;
const QString kRecentKey = QStringLiteral("workspace/recent");
const QString kLastKey = QStringLiteral("workspace/last");
} // namespace

MainWindow::MainWindow(QWidget* parent)
    : QMainWindow(parent)
    , m_document(new WorkspaceDocument(this))
    , m_tabs(new QTabWidget(this))
    , m_overview(new OverviewScreen(m_document, this))
    , m_users(new UsersScreen(m_document, this))
    , m_inspector(new InspectorScreen(m_document, this))
    , m_compare(new CompareScreen(m_document, this))
    , m_statusText(new QLabel(this))
    , m_progress(new QProgressBar(this))
    , m_cancel(new QPushButton(tr("Cancel"), this))
{
    setObjectName(QStringLiteral("SlatewiseMainWindow"));
    setAcceptDrops(true);
    m_tabs->addTab(m_overview, tr("Runs overview"));
    m_tabs->addTab(m_users, tr("Users"));
    m_tabs->addTab(m_inspector, tr("User inspector"));
    m_tabs->addTab(m_compare, tr("Compare runs"));
    m_tabs->setDocumentMode(true);
    setCentralWidget(m_tabs);

    m_progress->setRange(0, 1000);
    m_progress->setMaximumWidth(320);
    m_progress->setTextVisible(true);
    m_progress->hide();
    m_cancel->hide();
    m_cancel->setToolTip(tr("Stop the running job; nothing half-done is kept."));
    statusBar()->addWidget(m_statusText, 1);
    statusBar()->addPermanentWidget(m_progress);
    statusBar()->addPermanentWidget(m_cancel);

    auto* task = m_document->task();
    connect(task, &BackgroundTask::runningChanged, this, [this, task](bool running) {
        m_progress->setVisible(running);
        m_cancel->setVisible(running);
        m_cancel->setEnabled(running);
        if (running)
            m_statusText->setText(task->title());
    });
    connect(task, &BackgroundTask::progressed, this, [this](double fraction, const QString& stage) {
        m_progress->setValue(static_cast<int>(fraction * 1000.0));
        m_progress->setFormat(QStringLiteral("%p%"));
        m_statusText->setText(stage);
    });
    connect(m_cancel, &QPushButton::clicked, this, [this] {
        m_document->task()->cancel();
        m_cancel->setEnabled(false);
        m_statusText->setText(tr("Cancelling…"));
    });
    connect(m_document, &WorkspaceDocument::failed, this, [this](const QString& message) {
        m_statusText->setText(message.section(QLatin1Char('\n'), 0, 0));
        if (!m_document->isOpen() && message != tr("Cancelled.") && isVisible())
            QMessageBox::warning(this, tr("Cannot open the workspace"), message);
    });
    connect(m_document, &WorkspaceDocument::opened, this, [this](const QString& path) {
        addRecent(path);
        updateTitle();
    });
    connect(m_document, &WorkspaceDocument::closed, this, &MainWindow::updateTitle);
    connect(m_document, &WorkspaceDocument::evaluationsChanged, this, &MainWindow::updateTitle);
    connect(m_document, &WorkspaceDocument::datasetLoaded, this, &MainWindow::updateTitle);
    connect(m_document, &WorkspaceDocument::settingsChanged, this, &MainWindow::saveSettings);

    connect(m_overview, &OverviewScreen::browseRun, this, [this](const QString& run) {
        m_users->setRun(run);
        showScreen(Users);
    });
    connect(m_users, &UsersScreen::userChosen, this,
        [this](const QString& run, core::UserIndex user, bool open) { openUser(run, user, open); });
    m_inspector->setNeighbourFunction(
        [this](core::UserIndex user, int step) { return m_users->neighbour(user, step); });
    connect(m_inspector, &InspectorScreen::userStepped, this,
        [this](const QString&, core::UserIndex user) { m_users->selectUser(user); });
    connect(m_compare, &CompareScreen::openUser, this,
        [this](const QString& run, core::UserIndex user) { openUser(run, user, true); });

    // File names for "Save tables" and the right-click menus.
    m_users->table()->setObjectName(QStringLiteral("users"));
    ExportContextMenu::attachAll(m_tabs);

    buildMenus();
    updateTitle();
    resize(1400, 900);
}

MainWindow::~MainWindow() = default;

void MainWindow::buildMenus()
{
    QMenu* file = menuBar()->addMenu(tr("&File"));
    QAction* open = file->addAction(tr("&Open workspace…"), this, &MainWindow::openDialog);
    open->setShortcut(QKeySequence::Open);
    m_recent = file->addMenu(tr("Open &recent"));
    file->addSeparator();
    QAction* create = file->addAction(tr("&New workspace from files…"), this, &MainWindow::newFromFiles);
    create->setShortcut(QKeySequence::New);
    m_addRun = file->addAction(tr("&Add a run from files…"), this, &MainWindow::addRunDialog);
    m_addRun->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_A));
    m_fit = file->addAction(tr("&Fit a reference model…"), this, &MainWindow::fitDialog);
    m_fit->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_F));
    m_rerank = file->addAction(tr("Re-ran&k a run (what-if)…"), this, &MainWindow::rerankDialog);
    m_rerank->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_R));
    file->addSeparator();
    QAction* reload = file->addAction(tr("Re&load"), this, [this] { m_document->reload(); });
    reload->setShortcut(QKeySequence::Refresh);
    m_close = file->addAction(tr("&Close workspace"), this, [this] { m_document->close(); });
    m_close->setShortcut(QKeySequence::Close);
    file->addSeparator();
    QAction* quit = file->addAction(tr("&Quit"), this, &QWidget::close);
    quit->setShortcut(QKeySequence::Quit);

    QMenu* view = menuBar()->addMenu(tr("&View"));
    const QStringList names { tr("Runs &overview"), tr("&Users"), tr("User &inspector"), tr("&Compare runs") };
    for (int i = 0; i < names.size(); ++i) {
        QAction* a = view->addAction(names[i], this, [this, i] { showScreen(static_cast<Screen>(i)); });
        a->setShortcut(QKeySequence(Qt::CTRL | static_cast<Qt::Key>(Qt::Key_1 + i)));
    }

    m_export = menuBar()->addMenu(tr("&Export"));
    m_export->setToolTipsVisible(true);
    QAction* pack = m_export->addAction(
        tr("Write the &meeting pack (PDF)"), this, [this] { writeMeetingPack(defaultMeetingPackPath()); });
    pack->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_M));
    pack->setToolTip(tr("One PDF for the meeting: run summary, charts, comparison, worst-served users and three case "
                        "studies. Written to the last export folder."));
    m_export->addAction(tr("Write the meeting pack &to…"), this, &MainWindow::meetingPackAs);
    m_export->addSeparator();
    m_export->addAction(
        tr("Save this screen's charts as &PNG…"), this, [this] { exportChartsDialog(ScreenExport::Format::Png); });
    m_export->addAction(
        tr("Save this screen's charts as &SVG…"), this, [this] { exportChartsDialog(ScreenExport::Format::Svg); });
    m_export->addAction(
        tr("Save this screen's charts as P&DF…"), this, [this] { exportChartsDialog(ScreenExport::Format::Pdf); });
    m_export->addAction(tr("Save this screen's &tables as CSV…"), this, &MainWindow::exportTablesDialog);
    m_export->addSeparator();
    QAction* hint = m_export->addAction(tr("Right-click a chart or table to save just that one"));
    hint->setEnabled(false);
    hint->setData(QStringLiteral("hint")); // stays disabled: it only explains

    QMenu* help = menuBar()->addMenu(tr("&Help"));
    help->addAction(tr("&About Slatewise"), this, [this] {
        QMessageBox::about(this, tr("About Slatewise"),
            tr("<b>Slatewise</b> judges recommendation runs per user: accuracy, ranking and "
               "beyond-accuracy measures, the worst-served users with plain warnings, and honest "
               "comparisons between runs. Hover a column header for the metric's formula."));
    });
    rebuildRecent();
}

void MainWindow::showScreen(Screen screen)
{
    m_tabs->setCurrentIndex(static_cast<int>(screen));
}

MainWindow::Screen MainWindow::currentScreen() const
{
    return static_cast<Screen>(std::max(0, m_tabs->currentIndex()));
}

QWidget* MainWindow::screenWidget(Screen screen) const
{
    return m_tabs->widget(static_cast<int>(screen));
}

core::Result<QStringList> MainWindow::saveScreenCharts(
    const QString& folder, ScreenExport::Format format, const ExportSettings::Png& png)
{
    return ScreenExport::saveCharts(screenWidget(currentScreen()), folder, format, png);
}

core::Result<QStringList> MainWindow::saveScreenTables(const QString& folder)
{
    TableSaveProgress progress(this);
    return ScreenExport::saveTables(screenWidget(currentScreen()), folder, progress.callback());
}

void MainWindow::exportChartsDialog(ScreenExport::Format format)
{
    ExportSettings::Png png = ExportSettings::png();
    if (format == ScreenExport::Format::Png) {
        PngSizeDialog size(png, this);
        if (size.exec() != QDialog::Accepted)
            return;
        png = size.options();
        ExportSettings::setPng(png);
    }
    const QString folder
        = QFileDialog::getExistingDirectory(this, tr("Folder for this screen's charts"), ExportSettings::lastFolder());
    if (folder.isEmpty())
        return;
    ExportSettings::rememberPath(folder);
    const auto written = saveScreenCharts(folder, format, png);
    if (!written) {
        QMessageBox::warning(this, tr("Cannot save the charts"), toQ(written.error().toString()));
        return;
    }
    m_statusText->setText(tr("Saved %n chart(s) to %1", nullptr, static_cast<int>(written->size())).arg(folder));
}

void MainWindow::exportTablesDialog()
{
    const QString folder
        = QFileDialog::getExistingDirectory(this, tr("Folder for this screen's tables"), ExportSettings::lastFolder());
    if (folder.isEmpty())
        return;
    ExportSettings::rememberPath(folder);
    const auto written = saveScreenTables(folder);
    if (!written) {
        if (written.error().kind == core::ErrorKind::Cancelled)
            m_statusText->setText(tr("Saving the tables was cancelled; the table being saved was not written."));
        else
            QMessageBox::warning(this, tr("Cannot save the tables"), toQ(written.error().toString()));
        return;
    }
    m_statusText->setText(tr("Saved %n table(s) as CSV to %1", nullptr, static_cast<int>(written->size())).arg(folder));
}

QString MainWindow::defaultMeetingPackPath() const
{
    const QDir folder(ExportSettings::lastFolder());
    const QString name
        = m_document->isOpen() ? QFileInfo(m_document->path()).completeBaseName() : QStringLiteral("slatewise");
    const QString stem = QStringLiteral("%1-meeting-pack-%2").arg(name, QDate::currentDate().toString(Qt::ISODate));
    QString path = folder.filePath(stem + QStringLiteral(".pdf"));
    for (int n = 2; QFileInfo::exists(path); ++n)
        path = folder.filePath(QStringLiteral("%1-%2.pdf").arg(stem).arg(n));
    return path;
}

void MainWindow::meetingPackAs()
{
    QString path = QFileDialog::getSaveFileName(
        this, tr("Save the meeting pack"), defaultMeetingPackPath(), tr("PDF document (*.pdf)"));
    if (path.isEmpty())
        return;
    if (!path.endsWith(QStringLiteral(".pdf"), Qt::CaseInsensitive))
        path += QStringLiteral(".pdf");
    writeMeetingPack(path);
}

bool MainWindow::writeMeetingPack(const QString& path)
{
    if (!m_document->isOpen() || m_document->task()->isRunning()) {
        m_statusText->setText(m_document->isOpen()
                ? tr("Wait for the running job to finish, then write the meeting pack.")
                : tr("Open a workspace first."));
        return false;
    }
    // The comparison shown on the Compare screen, else the first two runs.
    QString base, candidate;
    if (const auto shown = m_compare->comparison()) {
        base = toQ(shown->base);
        candidate = toQ(shown->candidate);
    } else if (m_document->runNames().size() >= 2) {
        base = m_document->runNames().at(0);
        candidate = m_document->runNames().at(1);
    }
    ExportSettings::rememberPath(path);

    struct Outcome {
        std::optional<MeetingPackContent> content;
        QString error;
        bool cancelled = false;
    };
    auto outcome = std::make_shared<Outcome>();
    const std::string workspace = m_document->path().toStdString();
    const core::EvalSettings settings = m_document->settings();
    const std::string baseName = base.toStdString(), candidateName = candidate.toStdString();
    const bool started = m_document->task()->start(
        tr("Writing the meeting pack"),
        [outcome, workspace, settings, baseName, candidateName](const core::Progress& progress) {
            auto report = WorkspaceReport::load(workspace, {}, settings, progress);
            if (!report) {
                outcome->cancelled = report.error().kind == core::ErrorKind::Cancelled;
                outcome->error = toQ(report.error().toString());
                return;
            }
            if (progress.cancelled()) {
                outcome->cancelled = true;
                return;
            }
            const auto b = baseName.empty() ? std::nullopt : report->runIndex(baseName);
            const auto c = candidateName.empty() ? std::nullopt : report->runIndex(candidateName);
            outcome->content = report->packContent(b && c ? b : std::nullopt, b && c ? c : std::nullopt);
        },
        [this, outcome, path] {
            QString error = outcome->error;
            if (outcome->cancelled) {
                error = tr("Cancelled.");
                m_statusText->setText(tr("Meeting pack cancelled; nothing was written."));
            } else if (error.isEmpty() && outcome->content) {
                // Drawing the charts needs widgets, so the PDF itself is written here, on the GUI thread.
                const auto status = MeetingPack::write(*outcome->content, path);
                if (!status)
                    error = toQ(status.error().toString());
            } else if (error.isEmpty()) {
                error = tr("Nothing to write.");
            }
            if (!error.isEmpty() && !outcome->cancelled) {
                m_statusText->setText(
                    tr("Could not write the meeting pack: %1").arg(error.section(QLatin1Char('\n'), 0, 0)));
                if (isVisible())
                    QMessageBox::warning(this, tr("Cannot write the meeting pack"), error);
            } else if (error.isEmpty()) {
                m_statusText->setText(tr("Wrote the meeting pack to %1").arg(QDir::toNativeSeparators(path)));
            }
            emit meetingPackFinished(path, error);
        });
    if (!started)
        m_statusText->setText(tr("Wait for the running job to finish, then write the meeting pack."));
    return started;
}

bool MainWindow::openWorkspace(const QString& path)
{
    if (!QFileInfo::exists(path)) {
        m_statusText->setText(tr("No such workspace: %1").arg(path));
        return false;
    }
    return m_document->open(QFileInfo(path).absoluteFilePath());
}

void MainWindow::openUser(const QString& runName, core::UserIndex user, bool show)
{
    m_inspector->showUser(runName, user);
    if (show) {
        m_users->setRun(runName);
        m_users->selectUser(user);
        showScreen(Inspector);
    }
}

void MainWindow::openDialog()
{
    const QString path = QFileDialog::getOpenFileName(this, tr("Open workspace"),
        QFileInfo(m_document->path()).absolutePath(), tr("Slatewise workspace (*.sqlite);;All files (*)"));
    if (!path.isEmpty())
        openWorkspace(path);
}

void MainWindow::newFromFiles()
{
    auto* dialog = new ImportDialog(ImportDialog::Mode::NewWorkspace, QString(), this);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    connect(dialog, &ImportDialog::imported, this, [this](const QString& path) { openWorkspace(path); });
    dialog->open();
}

void MainWindow::addRunDialog()
{
    if (!m_document->isOpen())
        return;
    auto* dialog = new ImportDialog(ImportDialog::Mode::AddRun, m_document->path(), this);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    connect(dialog, &ImportDialog::imported, this, [this] { m_document->reload(); });
    dialog->open();
}

void MainWindow::fitDialog()
{
    if (!m_document->isOpen())
        return;
    auto* dialog = new FitDialog(m_document->path(), this);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    connect(dialog, &FitDialog::fitted, this, [this] { m_document->reload(); });
    dialog->open();
}

RerankDialog* MainWindow::createRerankDialog()
{
    auto* dialog = new RerankDialog(m_document->path(), m_document->runNames(), this);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    connect(dialog, &RerankDialog::reranked, this, [this](const QString& name, const QString& parent) {
        // The point of a what-if run is its trade-off against the parent: show that comparison
        // as soon as the reloaded workspace has both runs in memory.
        QObject::disconnect(m_pendingCompare);
        m_pendingCompare = connect(m_document, &WorkspaceDocument::datasetLoaded, this, [this, name, parent] {
            QObject::disconnect(m_pendingCompare);
            m_compare->compare(parent, name);
        });
        m_document->reload();
    });
    return dialog;
}

void MainWindow::rerankDialog()
{
    if (!m_document->isOpen())
        return;
    createRerankDialog()->open();
}

void MainWindow::updateTitle()
{
    const bool open = m_document->isOpen();
    m_addRun->setEnabled(open);
    m_fit->setEnabled(open);
    m_rerank->setEnabled(open);
    for (QAction* action : m_export->actions())
        if (!action->isSeparator() && action->data().toString() != QLatin1String("hint"))
            action->setEnabled(open);
    m_close->setEnabled(open);
    if (!open) {
        setWindowTitle(tr("Slatewise"));
        if (!m_document->task()->isRunning())
            m_statusText->setText(
                tr("No workspace open — File ▸ Open workspace… or drop a .sqlite file on the window."));
        return;
    }
    setWindowTitle(tr("%1 — Slatewise").arg(QFileInfo(m_document->path()).fileName()));
    if (!m_document->task()->isRunning())
        m_statusText->setText(tr("%1 · %2 runs · k = %3 · relevant at ≥ %4")
                                  .arg(m_document->path())
                                  .arg(m_document->runNames().size())
                                  .arg(m_document->settings().k)
                                  .arg(m_document->settings().relevantAt));
}

void MainWindow::rebuildRecent()
{
    m_recent->clear();
    const QStringList recent = QSettings().value(kRecentKey).toStringList();
    for (const QString& path : recent)
        m_recent->addAction(path, this, [this, path] { openWorkspace(path); });
    m_recent->setEnabled(!recent.isEmpty());
}

void MainWindow::addRecent(const QString& path)
{
    QSettings settings;
    QStringList recent = settings.value(kRecentKey).toStringList();
    recent.removeAll(path);
    recent.prepend(path);
    while (recent.size() > kMaxRecent)
        recent.removeLast();
    settings.setValue(kRecentKey, recent);
    settings.setValue(kLastKey, path);
    rebuildRecent();
}

void MainWindow::saveSettings()
{
    QSettings settings;
    settings.setValue(QStringLiteral("evaluation/k"), m_document->settings().k);
    settings.setValue(QStringLiteral("evaluation/relevantAt"), m_document->settings().relevantAt);
}

void MainWindow::restoreSettings(bool reopenLast)
{
    QSettings settings;
    restoreGeometry(settings.value(QStringLiteral("window/geometry")).toByteArray());
    QMainWindow::restoreState(settings.value(QStringLiteral("window/state")).toByteArray());
    auto eval = m_document->settings();
    eval.k = settings.value(QStringLiteral("evaluation/k"), eval.k).toInt();
    eval.relevantAt = settings.value(QStringLiteral("evaluation/relevantAt"), eval.relevantAt).toDouble();
    m_document->setSettings(eval);
    const QString last = settings.value(kLastKey).toString();
    if (reopenLast && !last.isEmpty() && QFileInfo::exists(last))
        openWorkspace(last);
}

void MainWindow::closeEvent(QCloseEvent* event)
{
    QSettings settings;
    settings.setValue(QStringLiteral("window/geometry"), saveGeometry());
    settings.setValue(QStringLiteral("window/state"), saveState());
    saveSettings();
    m_document->task()->cancel();
    event->accept();
}

void MainWindow::dragEnterEvent(QDragEnterEvent* event)
{
    if (event->mimeData()->hasUrls())
        event->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* event)
{
    for (const auto& url : event->mimeData()->urls()) {
        if (url.isLocalFile()) {
            openWorkspace(url.toLocalFile());
            event->acceptProposedAction();
            return;
        }
    }
}

} // namespace slatewise::ui

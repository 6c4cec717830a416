// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/ids.h"
#include "ui/screenexport.h"

#include <QMainWindow>

class QAction;
class QLabel;
class QMenu;
class QProgressBar;
class QPushButton;
class QTabWidget;

namespace slatewise::ui {

class CompareScreen;
class InspectorScreen;
class OverviewScreen;
class RerankDialog;
class UsersScreen;
class WorkspaceDocument;

/// The workbench window: four screens (Runs overview, Users, User inspector, Compare runs)
/// over one WorkspaceDocument, a status bar with progress, rows/s and Cancel, the File
/// menu (open, recent, new from files, add run, fit model, re-rank a run) and the Export
/// menu (the current screen's charts and tables, the meeting pack). Every chart and table
/// also has its own right-click export menu. Window layout, the last workspace, the
/// evaluation settings and the export choices are remembered with QSettings.
class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    enum Screen { Overview, Users, Inspector, Compare };

    explicit MainWindow(QWidget* parent = nullptr);
    ~MainWindow() override;

    WorkspaceDocument* document() const { return m_document; }
    OverviewScreen* overview() const { return m_overview; }
    UsersScreen* users() const { return m_users; }
    InspectorScreen* inspector() const { return m_inspector; }
    CompareScreen* compare() const { return m_compare; }
    void showScreen(Screen screen);
    Screen currentScreen() const;
    QWidget* screenWidget(Screen screen) const;

    /// Saves every chart of the current screen into `folder` (the Export menu's actions
    /// collect the folder and PNG size, then call these). Returns the files written.
    core::Result<QStringList> saveScreenCharts(const QString& folder, ScreenExport::Format format,
                                               const ExportSettings::Png& png = {});
    core::Result<QStringList> saveScreenTables(const QString& folder);

    /// A fresh file name for the meeting pack in the last export folder
    /// ("<workspace>-meeting-pack-<date>.pdf", numbered when taken).
    QString defaultMeetingPackPath() const;
    /// Starts writing the meeting pack to `path` in the background (progress and Cancel in
    /// the status bar); false when no workspace is open or another job runs. The pack
    /// compares the Compare screen's runs when a comparison is shown, else the first two.
    bool writeMeetingPack(const QString& path);

    /// The "Re-rank a run" dialog, wired but not shown: once it stores a run the workspace
    /// reloads and the Compare screen compares the new run with its parent.
    RerankDialog* createRerankDialog();

    bool openWorkspace(const QString& path);
    /// Opens `user` under `runName` in the inspector and shows it.
    void openUser(const QString& runName, core::UserIndex user, bool show = true);

    /// Restores geometry and settings; `reopenLast` also opens the last workspace.
    void restoreSettings(bool reopenLast);

signals:
    /// The meeting pack job ended: `error` is empty on success, "Cancelled." when cancelled.
    void meetingPackFinished(const QString& path, const QString& error);

protected:
    void closeEvent(QCloseEvent* event) override;
    void dragEnterEvent(QDragEnterEvent* event) override;
    void dropEvent(QDropEvent* event) override;

private:
    void buildMenus();
    void rebuildRecent();
    void addRecent(const QString& path);
    void openDialog();
    void newFromFiles();
    void addRunDialog();
    void fitDialog();
    void rerankDialog();
    void exportChartsDialog(ScreenExport::Format format);
    void exportTablesDialog();
    void meetingPackAs();
    void updateTitle();
    void saveSettings();

    WorkspaceDocument* m_document;
    QTabWidget* m_tabs;
    OverviewScreen* m_overview;
    UsersScreen* m_users;
    InspectorScreen* m_inspector;
    CompareScreen* m_compare;
    QMenu* m_recent = nullptr;
    QAction* m_addRun = nullptr;
    QAction* m_fit = nullptr;
    QAction* m_rerank = nullptr;
    QMenu* m_export = nullptr;
    QMetaObject::Connection m_pendingCompare; ///< compare a new derived run once it is loaded
    QAction* m_close = nullptr;
    QLabel* m_statusText;
    QProgressBar* m_progress;
    QPushButton* m_cancel;
};

} // namespace slatewise::ui

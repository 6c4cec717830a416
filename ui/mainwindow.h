// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

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
class UsersScreen;
class WorkspaceDocument;

/// The workbench window: four screens (Runs overview, Users, User inspector, Compare runs)
/// over one WorkspaceDocument, a status bar with progress, rows/s and Cancel, and the File
/// menu (open, recent, new from files, add run, fit model). Window layout, the last
/// workspace and the evaluation settings are remembered with QSettings.
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

    bool openWorkspace(const QString& path);
    /// Opens `user` under `runName` in the inspector and shows it.
    void openUser(const QString& runName, core::UserIndex user, bool show = true);

    /// Restores geometry and settings; `reopenLast` also opens the last workspace.
    void restoreSettings(bool reopenLast);

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
    QAction* m_close = nullptr;
    QLabel* m_statusText;
    QProgressBar* m_progress;
    QPushButton* m_cancel;
};

} // namespace slatewise::ui

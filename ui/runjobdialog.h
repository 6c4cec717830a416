// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/progress.h"

#include <QDialog>

#include <functional>

class QDialogButtonBox;
class QHBoxLayout;
class QLabel;
class QProgressBar;
class QPushButton;

namespace slatewise::core {
class Workspace;
}

namespace slatewise::ui {

class BackgroundTask;

/// Base of the dialogs that make a run in the workspace on the worker thread (fit a model,
/// re-rank a run): the progress bar, status line, start and cancel buttons, and what the
/// user is told at the end. Cancelled work stores nothing, and the status line says so.
class RunJobDialog : public QDialog {
    Q_OBJECT
public:
    ~RunJobDialog() override;

    QString statusText() const;
    void cancel();
    BackgroundTask* task() const { return m_task; }

protected:
    RunJobDialog(
        const QString& workspacePath, const QString& startText, const QString& cancelText, QWidget* parent = nullptr);

    /// The progress bar with the cancel and start buttons, for the subclass's layout.
    QHBoxLayout* jobControls();
    /// A Close button box that cancels running work first.
    QDialogButtonBox* closeButtons();

    /// Opens the workspace on the worker thread and runs `job`. Afterwards the status line
    /// tells of a cancel or of a failure (`failedText` with %1 for the error), or `done` runs
    /// on the GUI thread. false when work is already running.
    using Job = std::function<core::Status(core::Workspace&, const core::Progress&)>;
    bool startJob(
        const QString& title, const QString& busyText, const QString& failedText, Job job, std::function<void()> done);
    void reject() override;

    QString m_path;
    QProgressBar* m_progress;
    QLabel* m_status;
    QPushButton* m_start;
    QPushButton* m_cancel;
    BackgroundTask* m_task;
};

} // namespace slatewise::ui

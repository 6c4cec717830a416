// SPDX-License-Identifier: MIT
#pragma once

#include <QElapsedTimer>
#include <QObject>
#include <QString>

#include <atomic>
#include <functional>
#include <memory>

namespace slatewise::core {
struct Progress;
}

namespace slatewise::ui {

/// Runs one piece of long core work on Qt's thread pool so the window never freezes.
///
/// The work function receives a core::Progress: its report() may be called from any thread
/// and reaches the GUI thread through a queued call (at most ~20 times a second); its cancel
/// flag is raised by cancel(). Results cross threads by value: the work function fills a
/// value captured by both lambdas, and `done` runs on the GUI thread after the work has
/// returned, so nothing is shared while both run.
class BackgroundTask : public QObject {
    Q_OBJECT
public:
    using Work = std::function<void(const core::Progress&)>;
    using Done = std::function<void()>;

    explicit BackgroundTask(QObject* parent = nullptr);
    /// Cancels and waits, so no work outlives the objects it reports to.
    ~BackgroundTask() override;

    /// false (and nothing started) while another job runs.
    bool start(const QString& title, Work work, Done done);
    bool isRunning() const { return m_running; }
    QString title() const { return m_title; }
    /// Asks the running work to stop; core functions return ErrorKind::Cancelled soon after.
    void cancel();
    bool cancelRequested() const { return m_cancel->load(); }
    /// Blocks until the current job's `done` has run (for tests and --screenshots).
    void waitForDone();

    /// Units per second for progress text, given how many units the whole job has
    /// (e.g. estimated rows of an import); 0 when not known yet.
    double rate(double fraction, double totalUnits) const;

signals:
    void runningChanged(bool running);
    void progressed(double fraction, const QString& stage);

private:
    struct Shared;
    std::shared_ptr<Shared> m_shared;
    std::shared_ptr<std::atomic<bool>> m_cancel;
    bool m_running = false;
    QString m_title;
    QElapsedTimer m_clock;
};

} // namespace slatewise::ui

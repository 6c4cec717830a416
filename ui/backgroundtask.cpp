// SPDX-License-Identifier: MIT
#include "ui/backgroundtask.h"

#include "core/progress.h"

#include <QEventLoop>
#include <QFutureWatcher>
#include <QPointer>
#include <QtConcurrent/QtConcurrentRun>


namespace slatewise::ui {

// State the worker thread touches; kept alive by both sides so a late report from the
// worker never reaches a destroyed object.
struct BackgroundTask::Shared {
    QPointer<BackgroundTask> owner;
    std::atomic<std::int64_t> lastReportMs{-1000};
    QElapsedTimer clock;
    QFuture<void> future;
};

BackgroundTask::BackgroundTask(QObject* parent)
    : QObject(parent), m_cancel(std::make_shared<std::atomic<bool>>(false))
{
}

BackgroundTask::~BackgroundTask()
{
    if (m_shared) {
        m_cancel->store(true);
        m_shared->owner = nullptr;
        m_shared->future.waitForFinished();
    }
}

bool BackgroundTask::start(const QString& title, Work work, Done done)
{
    if (m_running)
        return false;
    m_running = true;
    m_title = title;
    m_cancel = std::make_shared<std::atomic<bool>>(false);
    auto shared = std::make_shared<Shared>();
    shared->owner = this;
    shared->clock.start();
    m_shared = shared;
    m_clock.start();
    emit runningChanged(true);
    emit progressed(0.0, title);

    auto cancel = m_cancel;
    shared->future = QtConcurrent::run([shared, cancel, work = std::move(work)] {
        core::Progress progress;
        progress.cancel = cancel.get();
        progress.report = [shared](double fraction, std::string_view stage) {
            const std::int64_t now = shared->clock.elapsed();
            const std::int64_t last = shared->lastReportMs.load();
            // Throttle: the GUI repaints at most ~20 times a second however often core reports.
            if (fraction < 1.0 && now - last < 50)
                return;
            shared->lastReportMs.store(now);
            QString text = QString::fromUtf8(stage.data(), static_cast<qsizetype>(stage.size()));
            QPointer<BackgroundTask> owner = shared->owner;
            if (!owner)
                return;
            QMetaObject::invokeMethod(
                owner.data(),
                [owner, fraction, text] {
                    if (owner && owner->m_running)
                        emit owner->progressed(fraction, text);
                },
                Qt::QueuedConnection);
        };
        work(progress);
    });
    auto* watcher = new QFutureWatcher<void>(this);
    connect(watcher, &QFutureWatcher<void>::finished, this, [this, watcher, done = std::move(done)] {
        watcher->deleteLater();
        m_running = false;
        // Announce the end first: `done` may start the next job at once.
        emit runningChanged(false);
        if (done)
            done();
    });
    watcher->setFuture(shared->future);
    return true;
}

void BackgroundTask::cancel()
{
    m_cancel->store(true);
}

void BackgroundTask::waitForDone()
{
    if (!m_running)
        return;
    QEventLoop loop;
    connect(this, &BackgroundTask::runningChanged, &loop, [&loop](bool running) {
        if (!running)
            loop.quit();
    });
    loop.exec();
}

double BackgroundTask::rate(double fraction, double totalUnits) const
{
    const double seconds = static_cast<double>(m_clock.elapsed()) / 1000.0;
    if (seconds < 0.2 || totalUnits <= 0)
        return 0.0;
    return fraction * totalUnits / seconds;
}

} // namespace slatewise::ui

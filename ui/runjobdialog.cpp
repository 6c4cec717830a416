// SPDX-License-Identifier: MIT
#include "ui/runjobdialog.h"

#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/format.h"

#include <QDialogButtonBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QProgressBar>
#include <QPushButton>

#include <memory>

namespace slatewise::ui {

RunJobDialog::RunJobDialog(
    const QString& workspacePath, const QString& startText, const QString& cancelText, QWidget* parent)
    : QDialog(parent)
    , m_path(workspacePath)
    , m_progress(new QProgressBar(this))
    , m_status(new QLabel(this))
    , m_start(new QPushButton(startText, this))
    , m_cancel(new QPushButton(cancelText, this))
    , m_task(new BackgroundTask(this))
{
    m_progress->setRange(0, 1000);
    m_progress->setValue(0);
    m_status->setWordWrap(true);
    m_cancel->setEnabled(false);
    connect(m_cancel, &QPushButton::clicked, this, &RunJobDialog::cancel);
    connect(m_task, &BackgroundTask::progressed, this, [this](double fraction, const QString& stage) {
        m_progress->setValue(static_cast<int>(fraction * 1000.0));
        m_status->setText(stage);
    });
}

RunJobDialog::~RunJobDialog() = default;

QString RunJobDialog::statusText() const
{
    return m_status->text();
}

void RunJobDialog::cancel()
{
    m_task->cancel();
}

QHBoxLayout* RunJobDialog::jobControls()
{
    auto* row = new QHBoxLayout;
    row->addWidget(m_progress, 1);
    row->addWidget(m_cancel);
    row->addWidget(m_start);
    return row;
}

QDialogButtonBox* RunJobDialog::closeButtons()
{
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    connect(buttons, &QDialogButtonBox::rejected, this, &RunJobDialog::reject);
    return buttons;
}

bool RunJobDialog::startJob(
    const QString& title, const QString& busyText, const QString& failedText, Job job, std::function<void()> done)
{
    if (m_task->isRunning())
        return false;
    struct Outcome {
        QString error;
        bool cancelled = false;
    };
    auto outcome = std::make_shared<Outcome>();
    const std::string path = m_path.toStdString();
    m_start->setEnabled(false);
    m_cancel->setEnabled(true);
    m_progress->setValue(0);
    m_status->setText(busyText);
    return m_task->start(
        title,
        [outcome, path, job = std::move(job)](const core::Progress& progress) {
            auto ws = core::Workspace::open(path);
            if (!ws) {
                outcome->error = toQ(ws.error().toString());
                return;
            }
            auto result = job(ws.value(), progress);
            if (!result) {
                outcome->cancelled = result.error().kind == core::ErrorKind::Cancelled;
                outcome->error = toQ(result.error().toString());
            }
        },
        [this, outcome, failedText, done = std::move(done)] {
            m_start->setEnabled(true);
            m_cancel->setEnabled(false);
            if (outcome->cancelled) {
                m_status->setText(tr("Cancelled — nothing was stored."));
                m_progress->setValue(0);
                return;
            }
            if (!outcome->error.isEmpty()) {
                m_status->setText(failedText.arg(outcome->error));
                return;
            }
            m_progress->setValue(1000);
            done();
        });
}

void RunJobDialog::reject()
{
    if (m_task->isRunning()) {
        m_task->cancel();
        m_task->waitForDone();
    }
    QDialog::reject();
}

} // namespace slatewise::ui

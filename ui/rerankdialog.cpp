// SPDX-License-Identifier: MIT
#include "ui/rerankdialog.h"

#include "core/fitservice.h"
#include "core/reranksettings.h"
#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/format.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QVBoxLayout>

namespace slatewise::ui {

RerankDialog::RerankDialog(const QString& workspacePath, const QStringList& runNames, QWidget* parent)
    : QDialog(parent)
    , m_path(workspacePath)
    , m_parent(new QComboBox(this))
    , m_method(new QComboBox(this))
    , m_lambda(new QDoubleSpinBox(this))
    , m_lambdaHelp(new QLabel(this))
    , m_name(new QLineEdit(this))
    , m_explanation(new QLabel(this))
    , m_progress(new QProgressBar(this))
    , m_status(new QLabel(this))
    , m_start(new QPushButton(tr("&Re-rank"), this))
    , m_cancel(new QPushButton(tr("Cancel re-ranking"), this))
    , m_task(new BackgroundTask(this))
{
    setWindowTitle(tr("Re-rank a run (what-if)"));
    m_parent->addItems(runNames);
    m_parent->setToolTip(tr("The run whose lists are re-ordered; it stays as it is."));
    m_method->addItem(tr("Diversify (mmr)"), QStringLiteral("mmr"));
    m_method->addItem(tr("First parts before sequels (series-order)"), QStringLiteral("series-order"));
    m_method->addItem(tr("Damp a recent binge (burst-damp)"), QStringLiteral("burst-damp"));
    m_lambda->setDecimals(2);
    m_lambda->setRange(0.0, 1.0);
    m_lambda->setSingleStep(0.05);
    m_lambdaHelp->setWordWrap(true);
    m_explanation->setWordWrap(true);
    // Word-wrapped labels get a little more height than they need; keep the text at the top.
    m_lambdaHelp->setAlignment(Qt::AlignLeft | Qt::AlignTop);
    m_explanation->setAlignment(Qt::AlignLeft | Qt::AlignTop);
    m_status->setWordWrap(true);

    auto* form = new QFormLayout;
    form->addRow(tr("&Parent run:"), m_parent);
    form->addRow(tr("&Method:"), m_method);
    form->addRow(QString(), m_explanation);
    form->addRow(tr("&λ:"), m_lambda);
    form->addRow(QString(), m_lambdaHelp);
    form->addRow(tr("New run &name:"), m_name);

    m_progress->setRange(0, 1000);
    m_progress->setValue(0);
    m_cancel->setEnabled(false);
    auto* row = new QHBoxLayout;
    row->addWidget(m_progress, 1);
    row->addWidget(m_cancel);
    row->addWidget(m_start);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    connect(buttons, &QDialogButtonBox::rejected, this, &RerankDialog::reject);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(form);
    layout->addStretch(1);
    layout->addWidget(m_status);
    layout->addLayout(row);
    layout->addWidget(buttons);

    connect(m_parent, &QComboBox::currentIndexChanged, this, &RerankDialog::suggestName);
    connect(m_method, &QComboBox::currentIndexChanged, this, &RerankDialog::methodChanged);
    connect(m_lambda, &QDoubleSpinBox::valueChanged, this, &RerankDialog::suggestName);
    connect(m_start, &QPushButton::clicked, this, &RerankDialog::startRerank);
    connect(m_cancel, &QPushButton::clicked, this, &RerankDialog::cancel);
    connect(m_task, &BackgroundTask::progressed, this, [this](double fraction, const QString& stage) {
        m_progress->setValue(static_cast<int>(fraction * 1000.0));
        m_status->setText(stage);
    });
    m_start->setEnabled(!runNames.isEmpty());
    if (runNames.isEmpty())
        m_status->setText(tr("The workspace has no run to re-rank yet."));
    methodChanged();
    resize(620, 380);
}

RerankDialog::~RerankDialog() = default;

void RerankDialog::setParentRun(const QString& name)
{
    m_parent->setCurrentText(name);
}

void RerankDialog::setMethod(const QString& method)
{
    const int index = m_method->findData(method);
    if (index >= 0)
        m_method->setCurrentIndex(index);
}

void RerankDialog::setLambda(double lambda)
{
    m_lambda->setValue(lambda);
}

void RerankDialog::setRunName(const QString& name)
{
    m_name->setText(name);
}

QString RerankDialog::runName() const
{
    return m_name->text().trimmed();
}

QString RerankDialog::statusText() const
{
    return m_status->text();
}

void RerankDialog::methodChanged()
{
    const QString key = m_method->currentData().toString();
    const auto method = core::rerankMethodFromString(key.toStdString());
    if (!method)
        return;
    const auto defaults = core::RerankSettings::defaults(*method);
    {
        const QSignalBlocker block(m_lambda);
        m_lambda->setValue(defaults.lambda);
    }
    switch (*method) {
    case core::RerankMethod::Mmr:
        m_explanation->setText(tr("Re-orders each list for variety: each next item trades its score against how much "
                                  "its genres repeat the items already chosen (maximal marginal relevance)."));
        m_lambdaHelp->setText(tr("1 keeps the parent's order; lower values favour diversity more."));
        break;
    case core::RerankMethod::SeriesOrder:
        m_explanation->setText(tr("A sequel whose earlier parts the user has not seen is replaced by the earliest "
                                  "unseen part of its series, or moved below it when that part is already listed."));
        m_lambdaHelp->setText(tr("Not used by this method."));
        break;
    case core::RerankMethod::BurstDamp:
        m_explanation->setText(tr("Items of a genre the user binged recently are scored down toward the user's "
                                  "long-term genre shares, so one burst does not fill the list."));
        m_lambdaHelp->setText(tr("Damping strength: 0 keeps the parent's order, 1 damps fully."));
        break;
    }
    m_lambda->setEnabled(*method != core::RerankMethod::SeriesOrder);
    suggestName();
}

void RerankDialog::suggestName()
{
    const QString key = m_method->currentData().toString();
    QString name = m_parent->currentText() + QLatin1Char('-') + key;
    if (m_lambda->isEnabled())
        name += QStringLiteral("-%1").arg(m_lambda->value(), 0, 'g', 3);
    m_name->setText(name);
}

bool RerankDialog::startRerank()
{
    if (m_task->isRunning())
        return false;
    const auto method = core::rerankMethodFromString(m_method->currentData().toString().toStdString());
    if (!method || m_parent->currentText().isEmpty()) {
        m_status->setText(tr("Choose the run to re-rank."));
        return false;
    }
    if (runName().isEmpty()) {
        m_status->setText(tr("Give the new run a name."));
        return false;
    }
    core::RerankRequest request;
    request.parentName = m_parent->currentText().toStdString();
    request.name = runName().toStdString();
    request.settings = core::RerankSettings::defaults(*method);
    request.settings.method = *method;
    request.settings.lambda = m_lambda->value();

    struct Outcome {
        QString error;
        bool cancelled = false;
        std::int64_t users = 0;
    };
    auto outcome = std::make_shared<Outcome>();
    const std::string path = m_path.toStdString();
    m_start->setEnabled(false);
    m_cancel->setEnabled(true);
    m_progress->setValue(0);
    m_status->setText(tr("Re-ranking…"));
    return m_task->start(
        tr("Re-ranking %1").arg(m_parent->currentText()),
        [outcome, path, request](const core::Progress& progress) {
            auto ws = core::Workspace::open(path);
            if (!ws) {
                outcome->error = toQ(ws.error().toString());
                return;
            }
            auto result = core::rerankAndStore(ws.value(), request, progress);
            if (!result) {
                outcome->cancelled = result.error().kind == core::ErrorKind::Cancelled;
                outcome->error = toQ(result.error().toString());
                return;
            }
            outcome->users = result->listUserCount;
        },
        [this, outcome, name = runName(), parent = m_parent->currentText()] {
            m_start->setEnabled(true);
            m_cancel->setEnabled(false);
            if (outcome->cancelled) {
                m_status->setText(tr("Cancelled — nothing was stored."));
                m_progress->setValue(0);
                return;
            }
            if (!outcome->error.isEmpty()) {
                m_status->setText(tr("The re-ranking failed: %1").arg(outcome->error));
                return;
            }
            m_progress->setValue(1000);
            m_status->setText(
                tr("Stored run “%1” (lists of %2 users re-ranked from “%3”). Compare it with its parent on "
                   "the Compare runs screen.")
                    .arg(name)
                    .arg(outcome->users)
                    .arg(parent));
            emit reranked(name, parent);
        });
}

void RerankDialog::cancel()
{
    m_task->cancel();
}

void RerankDialog::reject()
{
    if (m_task->isRunning()) {
        m_task->cancel();
        m_task->waitForDone();
    }
    QDialog::reject();
}

} // namespace slatewise::ui

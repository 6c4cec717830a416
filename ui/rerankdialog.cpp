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
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QVBoxLayout>

#include <memory>

namespace slatewise::ui {

RerankDialog::RerankDialog(const QString& workspacePath, const QStringList& runNames, QWidget* parent)
    : RunJobDialog(workspacePath, tr("&Re-rank"), tr("Cancel re-ranking"), parent)
    , m_parent(new QComboBox(this))
    , m_method(new QComboBox(this))
    , m_lambda(new QDoubleSpinBox(this))
    , m_lambdaHelp(new QLabel(this))
    , m_name(new QLineEdit(this))
    , m_explanation(new QLabel(this))
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

    auto* form = new QFormLayout;
    form->addRow(tr("&Parent run:"), m_parent);
    form->addRow(tr("&Method:"), m_method);
    form->addRow(QString(), m_explanation);
    form->addRow(tr("&λ:"), m_lambda);
    form->addRow(QString(), m_lambdaHelp);
    form->addRow(tr("New run &name:"), m_name);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(form);
    layout->addStretch(1);
    layout->addWidget(m_status);
    layout->addLayout(jobControls());
    layout->addWidget(closeButtons());

    connect(m_parent, &QComboBox::currentIndexChanged, this, &RerankDialog::suggestName);
    connect(m_method, &QComboBox::currentIndexChanged, this, &RerankDialog::methodChanged);
    connect(m_lambda, &QDoubleSpinBox::valueChanged, this, &RerankDialog::suggestName);
    connect(m_start, &QPushButton::clicked, this, &RerankDialog::startRerank);
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

    auto users = std::make_shared<std::int64_t>(0);
    const QString name = runName(), parent = m_parent->currentText();
    return startJob(
        tr("Re-ranking %1").arg(parent), tr("Re-ranking…"), tr("The re-ranking failed: %1"),
        [request, users](core::Workspace& ws, const core::Progress& progress) -> core::Status {
            auto result = core::rerankAndStore(ws, request, progress);
            if (!result)
                return result.errors();
            *users = result->listUserCount;
            return core::Done {};
        },
        [this, users, name, parent] {
            m_status->setText(
                tr("Stored run “%1” (lists of %2 users re-ranked from “%3”). Compare it with its parent on "
                   "the Compare runs screen.")
                    .arg(name)
                    .arg(*users)
                    .arg(parent));
            emit reranked(name, parent);
        });
}

} // namespace slatewise::ui

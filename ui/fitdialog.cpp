// SPDX-License-Identifier: MIT
#include "ui/fitdialog.h"

#include "core/fitservice.h"
#include "core/modelsettings.h"
#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/exportcontextmenu.h"
#include "ui/fitlosschart.h"
#include "ui/format.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPointer>
#include <QPushButton>
#include <QSpinBox>
#include <QVBoxLayout>

#include <memory>

namespace slatewise::ui {

FitDialog::FitDialog(const QString& workspacePath, QWidget* parent)
    : RunJobDialog(workspacePath, tr("&Fit"), tr("Cancel fit"), parent)
    , m_model(new QComboBox(this))
    , m_name(new QLineEdit(this))
    , m_rank(new QSpinBox(this))
    , m_lambda(new QDoubleSpinBox(this))
    , m_iterations(new QSpinBox(this))
    , m_neighbours(new QSpinBox(this))
    , m_seed(new QSpinBox(this))
    , m_chart(new FitLossChart(this))
{
    setWindowTitle(tr("Fit a reference model"));
    const core::ModelSettings defaults;
    m_model->addItem(tr("Most popular"), QStringLiteral("popular"));
    m_model->addItem(tr("Global mean"), QStringLiteral("mean"));
    m_model->addItem(tr("User and item biases"), QStringLiteral("bias"));
    m_model->addItem(tr("Item neighbours (item kNN)"), QStringLiteral("itemknn"));
    m_model->addItem(tr("Matrix factorization (ALS)"), QStringLiteral("als"));
    m_model->setCurrentIndex(4);
    m_name->setText(QStringLiteral("als-r32"));
    m_rank->setRange(1, 512);
    m_rank->setValue(defaults.rank);
    m_lambda->setDecimals(4);
    m_lambda->setRange(0.0, 100.0);
    m_lambda->setSingleStep(0.01);
    m_lambda->setValue(defaults.lambda);
    m_iterations->setRange(1, 200);
    m_iterations->setValue(defaults.iterations);
    m_neighbours->setRange(1, 1000);
    m_neighbours->setValue(defaults.neighbours);
    m_seed->setRange(0, 2147483647);
    m_seed->setValue(static_cast<int>(defaults.seed % 2147483647u));

    auto* form = new QFormLayout;
    form->addRow(tr("&Model:"), m_model);
    form->addRow(tr("Run &name:"), m_name);
    form->addRow(tr("&Rank (factors):"), m_rank);
    form->addRow(tr("&λ (regularization):"), m_lambda);
    form->addRow(tr("&Iterations:"), m_iterations);
    form->addRow(tr("N&eighbours:"), m_neighbours);
    form->addRow(tr("&Seed:"), m_seed);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(form);
    layout->addWidget(m_chart, 1);
    layout->addWidget(m_status);
    layout->addLayout(jobControls());
    layout->addWidget(closeButtons());

    connect(m_model, &QComboBox::currentIndexChanged, this, [this] {
        const QString kind = m_model->currentData().toString();
        m_name->setText(kind == QLatin1String("als") ? QStringLiteral("als-r%1").arg(m_rank->value()) : kind);
        updateEnabled();
    });
    connect(m_start, &QPushButton::clicked, this, &FitDialog::startFit);
    ExportContextMenu::attach(m_chart); // save the loss curve like any other chart
    updateEnabled();
    resize(720, 640);
}

FitDialog::~FitDialog() = default;

void FitDialog::setModel(const QString& key)
{
    const int index = m_model->findData(key);
    if (index >= 0)
        m_model->setCurrentIndex(index);
}

void FitDialog::setRunName(const QString& name)
{
    m_name->setText(name);
}

void FitDialog::setRank(int rank)
{
    m_rank->setValue(rank);
}

void FitDialog::setLambda(double lambda)
{
    m_lambda->setValue(lambda);
}

void FitDialog::setIterations(int iterations)
{
    m_iterations->setValue(iterations);
}

QString FitDialog::runName() const
{
    return m_name->text().trimmed();
}

void FitDialog::updateEnabled()
{
    const QString kind = m_model->currentData().toString();
    const bool als = kind == QLatin1String("als");
    m_rank->setEnabled(als);
    m_lambda->setEnabled(als);
    m_iterations->setEnabled(als || kind == QLatin1String("bias"));
    m_neighbours->setEnabled(kind == QLatin1String("itemknn"));
}

bool FitDialog::startFit()
{
    if (m_task->isRunning())
        return false;
    const auto kind = core::modelKindFromString(m_model->currentData().toString().toStdString());
    if (!kind || m_name->text().trimmed().isEmpty()) {
        m_status->setText(tr("Give the new run a name."));
        return false;
    }
    core::FitRequest request;
    request.name = m_name->text().trimmed().toStdString();
    request.settings.kind = *kind;
    request.settings.rank = m_rank->value();
    request.settings.lambda = m_lambda->value();
    request.settings.iterations = m_iterations->value();
    if (*kind == core::ModelKind::Bias)
        request.settings.biasIterations = m_iterations->value();
    request.settings.neighbours = m_neighbours->value();
    request.settings.seed = static_cast<std::uint64_t>(m_seed->value());
    QPointer<FitLossChart> chart = m_chart;
    request.onIteration = [chart](const core::FitIteration& it) {
        FitLossChart::Iteration point { it.iteration, it.trainRmse, it.withheldRmse };
        QMetaObject::invokeMethod(
            chart.data(),
            [chart, point] {
                if (chart)
                    chart->appendIteration(point);
            },
            Qt::QueuedConnection);
    };
    m_chart->setData({}, m_model->currentText());

    auto seconds = std::make_shared<double>(0.0);
    const QString name = m_name->text().trimmed();
    return startJob(
        tr("Fitting %1").arg(name), tr("Fitting…"), tr("The fit failed: %1"),
        [request, seconds](core::Workspace& ws, const core::Progress& progress) -> core::Status {
            auto result = core::fitAndStore(ws, request, progress);
            if (!result)
                return result.errors();
            *seconds = result->seconds;
            return core::Done {};
        },
        [this, seconds, name] {
            m_status->setText(tr("Stored run “%1” (fitted in %2 s). It is evaluated with the others.")
                                  .arg(name)
                                  .arg(*seconds, 0, 'f', 1));
            emit fitted(name);
        });
}

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/overviewscreen.h"

#include "core/evaluation.h"
#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/banderrorchart.h"
#include "ui/errordistributionchart.h"
#include "ui/format.h"
#include "ui/kcurvechart.h"
#include "ui/runerrors.h"
#include "ui/runmetricsmodel.h"
#include "ui/warningprevalencechart.h"
#include "ui/workspacedocument.h"

#include <QDoubleSpinBox>
#include <QGridLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QSpinBox>
#include <QSplitter>
#include <QTableView>
#include <QTimer>
#include <QVBoxLayout>

namespace slatewise::ui {

OverviewScreen::OverviewScreen(WorkspaceDocument* document, QWidget* parent)
    : QWidget(parent), m_document(document), m_model(new RunMetricsModel(this)), m_table(new QTableView(this)),
      m_k(new QSpinBox(this)), m_relevantAt(new QDoubleSpinBox(this)), m_caption(new QLabel(this)), m_debounce(new QTimer(this)),
      m_bandChart(new BandErrorChart(this)), m_errorChart(new ErrorDistributionChart(this)), m_kChart(new KCurveChart(this)),
      m_warningChart(new WarningPrevalenceChart(this))
{
    auto* controls = new QHBoxLayout;
    auto* kLabel = new QLabel(tr("List length &k:"), this);
    kLabel->setBuddy(m_k);
    m_k->setRange(1, 50);
    m_k->setToolTip(tr("How many top entries of each list are judged (precision@k, recall@k, NDCG@k and the beyond-accuracy measures)."));
    auto* rLabel = new QLabel(tr("&Relevant at rating ≥"), this);
    rLabel->setBuddy(m_relevantAt);
    m_relevantAt->setDecimals(1);
    m_relevantAt->setSingleStep(0.5);
    m_relevantAt->setRange(-1000, 1000);
    m_relevantAt->setToolTip(tr("A withheld item counts as a favourite (relevant) when its rating is at least this."));
    controls->addWidget(kLabel);
    controls->addWidget(m_k);
    controls->addSpacing(16);
    controls->addWidget(rLabel);
    controls->addWidget(m_relevantAt);
    controls->addSpacing(16);
    controls->addWidget(m_caption, 1);
    m_caption->setWordWrap(true);

    m_table->setModel(m_model);
    m_table->setObjectName(QStringLiteral("run-metrics"));
    m_table->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_table->setSelectionMode(QAbstractItemView::SingleSelection);
    m_table->verticalHeader()->hide();
    m_table->setAlternatingRowColors(true);
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_table->setWordWrap(false);
    m_table->setToolTip(tr("Double-click a run to browse its users, worst served first."));
    connect(m_table, &QTableView::doubleClicked, this, [this](const QModelIndex& index) {
        if (const auto* e = m_model->evaluationAt(index.row()))
            emit browseRun(toQ(e->runName));
    });

    auto* charts = new QGridLayout;
    charts->addWidget(m_bandChart, 0, 0);
    charts->addWidget(m_errorChart, 0, 1);
    charts->addWidget(m_kChart, 1, 0);
    charts->addWidget(m_warningChart, 1, 1);
    auto* chartHost = new QWidget(this);
    chartHost->setLayout(charts);
    charts->setContentsMargins(0, 0, 0, 0);

    auto* splitter = new QSplitter(Qt::Vertical, this);
    splitter->addWidget(m_table);
    splitter->addWidget(chartHost);
    splitter->setStretchFactor(0, 1);
    splitter->setStretchFactor(1, 4);
    // Room for a handful of runs above the charts.
    splitter->setSizes({170, 800});

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(controls);
    layout->addWidget(splitter, 1);

    m_debounce->setSingleShot(true);
    m_debounce->setInterval(600);
    connect(m_debounce, &QTimer::timeout, this, &OverviewScreen::applySettings);
    connect(m_k, &QSpinBox::valueChanged, m_debounce, qOverload<>(&QTimer::start));
    connect(m_relevantAt, &QDoubleSpinBox::valueChanged, m_debounce, qOverload<>(&QTimer::start));
    connect(document, &WorkspaceDocument::evaluationsChanged, this, &OverviewScreen::refresh);
    connect(document, &WorkspaceDocument::datasetLoaded, this, &OverviewScreen::refreshErrors);
    connect(document, &WorkspaceDocument::closed, this, &OverviewScreen::refresh);
    connect(document, &WorkspaceDocument::settingsChanged, this, &OverviewScreen::syncControls);
    connect(document, &WorkspaceDocument::busyChanged, this, [this](bool busy) {
        // A running job owns the settings; the debounce re-applies once it finishes.
        if (!busy && m_document->isOpen() &&
            (m_k->value() != m_document->settings().k || m_relevantAt->value() != m_document->settings().relevantAt))
            m_debounce->start();
    });
    syncControls();
    refresh();
}

void OverviewScreen::syncControls()
{
    const QSignalBlocker b1(m_k), b2(m_relevantAt);
    m_k->setValue(m_document->settings().k);
    m_relevantAt->setValue(m_document->settings().relevantAt);
}

void OverviewScreen::applySettings()
{
    auto settings = m_document->settings();
    if (settings.k == m_k->value() && settings.relevantAt == m_relevantAt->value())
        return;
    settings.k = m_k->value();
    settings.relevantAt = m_relevantAt->value();
    if (!m_document->setSettings(settings))
        m_debounce->start(); // busy: try again shortly
}

void OverviewScreen::refresh()
{
    std::vector<std::shared_ptr<const core::RunEvaluation>> evals = m_document->evaluations();
    m_model->setResults(evals);
    const auto& summaries = m_document->summaries();
    m_bandChart->setData(summaries);
    m_kChart->setData(summaries);
    m_warningChart->setData(summaries);
    if (!m_document->isOpen()) {
        m_caption->setText(tr("No workspace open. Use File ▸ Open workspace…, drop a .sqlite file here, or build one with File ▸ New workspace from files…"));
        m_errorChart->setData({});
        return;
    }
    const auto& s = m_document->settings();
    QString text = tr("%n run(s) judged on their top %1, favourites = withheld ratings ≥ %2. Intervals are 95% bootstrap intervals over users.",
                      "", static_cast<int>(evals.size()))
                       .arg(s.k)
                       .arg(s.relevantAt);
    if (const auto* summary = m_document->summary())
        text = tr("%1 users, %2 items, %3 train and %4 withheld ratings. ")
                   .arg(summary->users)
                   .arg(summary->items)
                   .arg(summary->trainRows)
                   .arg(summary->withheldRows) +
               text;
    m_caption->setText(text);
    refreshErrors();
}

void OverviewScreen::refreshErrors()
{
    if (m_document->isFullyLoaded())
        m_errorChart->setData(m_document->runErrors());
}

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/inspectorscreen.h"

#include "core/dataset.h"
#include "core/evaluation.h"
#include "core/run.h"
#include "ui/columnorder.h"
#include "ui/format.h"
#include "ui/genretimelinechart.h"
#include "ui/inspectorlistmodel.h"
#include "ui/scoreratingchart.h"
#include "ui/userinspection.h"
#include "ui/usermetricsmodel.h"
#include "ui/withheldmodel.h"
#include "ui/workspacedocument.h"

#include <QComboBox>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QListWidget>
#include <QPushButton>
#include <QSplitter>
#include <QTableView>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace slatewise::ui {

namespace {
QTableView* makeTable(QAbstractItemModel* model, QWidget* parent)
{
    auto* view = new QTableView(parent);
    view->setModel(model);
    view->setSelectionBehavior(QAbstractItemView::SelectRows);
    view->setAlternatingRowColors(true);
    view->setWordWrap(false);
    view->verticalHeader()->hide();
    view->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    view->horizontalHeader()->setStretchLastSection(true);
    return view;
}

QWidget* titled(const QString& title, QWidget* content, QWidget* parent)
{
    auto* box = new QGroupBox(title, parent);
    auto* layout = new QVBoxLayout(box);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addWidget(content);
    return box;
}
} // namespace

InspectorScreen::InspectorScreen(WorkspaceDocument* document, QWidget* parent)
    : QWidget(parent)
    , m_document(document)
    , m_heading(new QLabel(this))
    , m_run(new QComboBox(this))
    , m_previous(new QPushButton(tr("◀ &Previous user"), this))
    , m_next(new QPushButton(tr("&Next user ▶"), this))
    , m_summary(new QLabel(this))
    , m_listModel(new InspectorListModel(this))
    , m_withheldModel(new WithheldModel(this))
    , m_metricsModel(new UserMetricsModel(this))
    , m_listView(makeTable(m_listModel, this))
    , m_withheldView(makeTable(m_withheldModel, this))
    , m_metricsView(makeTable(m_metricsModel, this))
    , m_warnings(new QListWidget(this))
    , m_scoreChart(new ScoreRatingChart(this))
    , m_timeline(new GenreTimelineChart(this))
{
    QFont headingFont = m_heading->font();
    headingFont.setPointSizeF(headingFont.pointSizeF() * 1.3);
    headingFont.setBold(true);
    m_heading->setFont(headingFont);
    m_heading->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_summary->setWordWrap(true);
    showColumnsEarly(m_listView, { InspectorListModel::Marks, InspectorListModel::Title, InspectorListModel::Score });
    showColumnsEarly(
        m_withheldView, { WithheldModel::Marks, WithheldModel::Title, WithheldModel::Score, WithheldModel::ListRank });
    m_listView->setObjectName(QStringLiteral("user-list"));
    m_withheldView->setObjectName(QStringLiteral("user-withheld"));
    m_metricsView->setObjectName(QStringLiteral("user-metrics"));
    m_previous->setToolTip(tr("The previous user in the Users list's order (Alt+P)."));
    m_next->setToolTip(tr("The next user in the Users list's order (Alt+N)."));
    m_run->setToolTip(tr("See the same user under another run."));

    auto* top = new QHBoxLayout;
    top->addWidget(m_heading, 1);
    auto* runLabel = new QLabel(tr("&Run:"), this);
    runLabel->setBuddy(m_run);
    top->addWidget(runLabel);
    top->addWidget(m_run);
    top->addWidget(m_previous);
    top->addWidget(m_next);

    m_warnings->setWordWrap(true);
    m_warnings->setSelectionMode(QAbstractItemView::ExtendedSelection);

    auto* lists = new QSplitter(Qt::Horizontal, this);
    lists->addWidget(titled(tr("The run's list (top k)"), m_listView, this));
    lists->addWidget(titled(tr("Withheld items, highest rating first"), m_withheldView, this));

    auto* lower = new QSplitter(Qt::Horizontal, this);
    lower->addWidget(titled(tr("Warnings"), m_warnings, this));
    lower->addWidget(titled(tr("This user against the run's average"), m_metricsView, this));
    lower->addWidget(m_scoreChart);
    lower->addWidget(m_timeline);
    lower->setStretchFactor(0, 3);
    lower->setStretchFactor(1, 2);
    lower->setStretchFactor(2, 2);
    lower->setStretchFactor(3, 3);
    // Wide enough for the metric table's three columns and the chart titles.
    lower->setSizes({ 300, 500, 400, 400 }); // the metrics table needs room for its verdict column

    auto* split = new QSplitter(Qt::Vertical, this);
    split->addWidget(lists);
    split->addWidget(lower);
    split->setStretchFactor(0, 3);
    split->setStretchFactor(1, 2);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(top);
    layout->addWidget(m_summary);
    layout->addWidget(split, 1);

    connect(m_previous, &QPushButton::clicked, this, [this] { step(-1); });
    connect(m_next, &QPushButton::clicked, this, [this] { step(+1); });
    connect(m_run, &QComboBox::currentIndexChanged, this, &InspectorScreen::refresh);
    connect(document, &WorkspaceDocument::evaluationsChanged, this, [this] {
        m_meanCache.clear();
        rebuildRuns();
    });
    connect(document, &WorkspaceDocument::datasetLoaded, this, &InspectorScreen::refresh);
    connect(document, &WorkspaceDocument::closed, this, [this] {
        m_user.reset();
        m_meanCache.clear();
        rebuildRuns();
    });
    rebuildRuns();
}

InspectorScreen::~InspectorScreen() = default;

QString InspectorScreen::currentRun() const
{
    return m_run->currentText();
}

void InspectorScreen::rebuildRuns()
{
    const QString previous = m_run->currentText();
    {
        const QSignalBlocker block(m_run);
        m_run->clear();
        m_run->addItems(m_document->runNames());
        const int i = m_run->findText(previous);
        m_run->setCurrentIndex(i >= 0 ? i : 0);
    }
    refresh();
}

bool InspectorScreen::showUser(const QString& runName, core::UserIndex user)
{
    m_user = user;
    const int i = m_run->findText(runName);
    if (i >= 0 && i != m_run->currentIndex()) {
        const QSignalBlocker block(m_run);
        m_run->setCurrentIndex(i);
    }
    refresh();
    return m_inspection != nullptr;
}

void InspectorScreen::step(int delta)
{
    if (!m_user || !m_neighbour)
        return;
    if (auto next = m_neighbour(*m_user, delta)) {
        showUser(m_run->currentText(), *next);
        emit userStepped(m_run->currentText(), *next);
    }
}

void InspectorScreen::updateButtons()
{
    m_previous->setEnabled(m_user && m_neighbour && m_neighbour(*m_user, -1).has_value());
    m_next->setEnabled(m_user && m_neighbour && m_neighbour(*m_user, +1).has_value());
}

QStringList InspectorScreen::warningTexts() const
{
    QStringList texts;
    for (int i = 0; i < m_warnings->count(); ++i)
        texts << m_warnings->item(i)->text();
    return texts;
}

void InspectorScreen::refresh()
{
    const auto data = m_document->dataset();
    const auto eval = m_document->evaluation(m_run->currentText());
    const auto run = m_document->run(m_run->currentText());
    m_inspection.reset();
    m_warnings->clear();
    if (!m_user || !data || !eval || !run) {
        m_heading->setText(tr("No user chosen"));
        m_summary->setText(m_document->isOpen() && !data
                ? tr("Reading the dataset…")
                : tr("Pick a user on the Users screen (Enter or double-click) or in the comparison's "
                     "who-got-worse list."));
        m_listModel->setResults(nullptr, nullptr);
        m_withheldModel->setResults(nullptr, nullptr);
        m_metricsModel->setResults(nullptr);
        m_scoreChart->setData({}, QString(), QString());
        m_timeline->setData(GenreTimeline {}, QString());
        updateButtons();
        return;
    }
    auto cached = m_meanCache.find(eval.get());
    if (cached == m_meanCache.end())
        cached = m_meanCache.emplace(eval.get(), UserInspection::columnMeans(*eval)).first;
    auto inspection
        = std::make_shared<const UserInspection>(UserInspection::build(*data, *run, *eval, *m_user, cached->second));
    m_inspection = inspection;

    const QString userId = m_document->userIdOf(*m_user);
    m_heading->setText(tr("User %1 under run “%2”").arg(userId, m_run->currentText()));
    const int relevant = static_cast<int>(std::count_if(
        inspection->withheld.begin(), inspection->withheld.end(), [](const auto& w) { return w.relevant; }));
    m_summary->setText(tr(
        "History: %1 titles. Withheld: %2 titles, %3 of them favourites (rated ≥ %4). The top %5 holds %6 of them. %7")
                           .arg(inspection->trainCount)
                           .arg(inspection->withheld.size())
                           .arg(relevant)
                           .arg(inspection->relevantAt)
                           .arg(inspection->k)
                           .arg(inspection->hits())
                           .arg(inspection->found ? QString()
                                                  : tr("This run has no results for the user (no withheld items).")));

    m_listModel->setResults(inspection, data);
    m_withheldModel->setResults(inspection, data);
    m_metricsModel->setResults(inspection);
    if (inspection->warnings.empty())
        m_warnings->addItem(tr("No warnings for this user under this run."));
    for (const auto& w : inspection->warnings) {
        const auto& info = core::warningInfo(w.code);
        auto* item = new QListWidgetItem(
            QStringLiteral("%1 [%2] — %3").arg(toQ(info.title), toQ(core::toString(w.severity)), toQ(w.message)),
            m_warnings);
        item->setToolTip(tr("%1\nMeasured %2, threshold %3 (code “%4”).")
                             .arg(toQ(info.explains))
                             .arg(w.value)
                             .arg(w.threshold)
                             .arg(toQ(info.key)));
    }
    std::vector<ScoreRatingChart::Point> points;
    for (const auto& w : inspection->withheld)
        if (!std::isnan(w.score))
            points.push_back({ w.rating, w.score, toQ(data->items[w.item.value].title) });
    m_scoreChart->setData(std::move(points), userId, m_run->currentText(), data->scale.min, data->scale.max);
    m_timeline->setData(GenreTimeline::build(*data, *m_user, eval->settings.burstWindow), userId);
    updateButtons();
}

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/comparescreen.h"

#include "core/comparisonresult.h"
#include "core/dataset.h"
#include "core/evaluation.h"
#include "core/runcomparison.h"
#include "ui/backgroundtask.h"
#include "ui/comparisonmodel.h"
#include "ui/format.h"
#include "ui/segmentmodel.h"
#include "ui/userdifferencechart.h"
#include "ui/workspacedocument.h"
#include "ui/worseusersmodel.h"

#include <QComboBox>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QSplitter>
#include <QTableView>
#include <QVBoxLayout>

namespace slatewise::ui {

namespace {
QTableView* makeTable(QAbstractItemModel* model, QWidget* parent)
{
    auto* view = new QTableView(parent);
    view->setModel(model);
    view->setSelectionBehavior(QAbstractItemView::SelectRows);
    view->setSelectionMode(QAbstractItemView::SingleSelection);
    view->setAlternatingRowColors(true);
    view->setWordWrap(false);
    view->verticalHeader()->hide();
    view->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    view->horizontalHeader()->setStretchLastSection(true);
    return view;
}

QWidget* titled(const QString& title, QWidget* content, QWidget* parent, QWidget* extra = nullptr)
{
    auto* box = new QGroupBox(title, parent);
    auto* layout = new QVBoxLayout(box);
    layout->setContentsMargins(4, 4, 4, 4);
    if (extra)
        layout->addWidget(extra);
    layout->addWidget(content);
    return box;
}
} // namespace

CompareScreen::CompareScreen(WorkspaceDocument* document, QWidget* parent)
    : QWidget(parent), m_document(document), m_base(new QComboBox(this)), m_candidate(new QComboBox(this)),
      m_segmentKind(new QComboBox(this)), m_detailMetric(new QComboBox(this)), m_go(new QPushButton(tr("&Compare"), this)),
      m_headline(new QLabel(this)), m_model(new ComparisonModel(this)), m_segments(new SegmentModel(this)),
      m_worse(new WorseUsersModel(this)), m_table(makeTable(m_model, this)), m_segmentView(makeTable(m_segments, this)),
      m_worseView(makeTable(m_worse, this)), m_worseCaption(new QLabel(this)), m_chart(new UserDifferenceChart(this))
{
    m_segmentKind->addItem(tr("by activity"), QStringLiteral("activity"));
    m_segmentKind->addItem(tr("by favourite genre"), QStringLiteral("genre"));
    m_segmentKind->addItem(tr("cold users or not"), QStringLiteral("warning:cold"));
    m_segmentKind->addItem(tr("sequel-first warning or not"), QStringLiteral("warning:sequel-first"));
    for (auto m : core::ComparisonSettings::defaultMetrics())
        m_detailMetric->addItem(toQ(core::metricInfo(m).label), static_cast<int>(m));
    m_detailMetric->setToolTip(tr("The metric the chart and the segment table show."));
    m_headline->setWordWrap(true);
    m_headline->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_worseCaption->setWordWrap(true);

    auto* bar = new QHBoxLayout;
    const auto add = [&](const QString& label, QWidget* w) {
        auto* l = new QLabel(label, this);
        l->setBuddy(w);
        bar->addWidget(l);
        bar->addWidget(w);
    };
    add(tr("&Base run:"), m_base);
    add(tr("Ca&ndidate run:"), m_candidate);
    add(tr("Se&gments:"), m_segmentKind);
    add(tr("&Detail metric:"), m_detailMetric);
    bar->addWidget(m_go);
    bar->addStretch(1);

    m_table->setObjectName(QStringLiteral("comparison"));
    m_segmentView->setObjectName(QStringLiteral("segments"));
    m_worseView->setObjectName(QStringLiteral("who-got-worse"));
    m_worseView->setToolTip(tr("Double-click or press Enter to open the user in the inspector under the candidate run."));
    connect(m_worseView, &QTableView::activated, this, [this](const QModelIndex& index) {
        if (!m_comparison)
            return;
        const auto user = core::UserIndex(m_worse->data(index, WorseUsersModel::UserIndexRole).toUInt());
        emit openUser(toQ(m_comparison->candidate), user);
    });

    auto* upper = new QSplitter(Qt::Horizontal, this);
    upper->addWidget(titled(tr("Paired comparison per metric (candidate − base)"), m_table, this));
    upper->addWidget(m_chart);
    upper->setStretchFactor(0, 3);
    upper->setStretchFactor(1, 2);
    // The table's p-values and verdicts are the point; the chart's size hint would take most.
    upper->setSizes({900, 600});
    auto* lower = new QSplitter(Qt::Horizontal, this);
    lower->addWidget(titled(tr("By segment"), m_segmentView, this));
    lower->addWidget(titled(tr("Who got worse"), m_worseView, this, m_worseCaption));
    lower->setSizes({750, 750});
    auto* split = new QSplitter(Qt::Vertical, this);
    split->addWidget(upper);
    split->addWidget(lower);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(bar);
    layout->addWidget(m_headline);
    layout->addWidget(split, 1);

    connect(m_go, &QPushButton::clicked, this, &CompareScreen::start);
    connect(m_detailMetric, &QComboBox::currentIndexChanged, this, &CompareScreen::updateDetail);
    connect(document, &WorkspaceDocument::evaluationsChanged, this, [this] {
        rebuildRuns();
        show(nullptr);
    });
    connect(document, &WorkspaceDocument::closed, this, [this] {
        rebuildRuns();
        show(nullptr);
    });
    connect(document, &WorkspaceDocument::busyChanged, this, [this](bool busy) { m_go->setEnabled(!busy); });
    rebuildRuns();
    show(nullptr);
}

CompareScreen::~CompareScreen() = default;

void CompareScreen::rebuildRuns()
{
    const QStringList names = m_document->runNames();
    const QString base = m_base->currentText(), candidate = m_candidate->currentText();
    m_base->clear();
    m_candidate->clear();
    m_base->addItems(names);
    m_candidate->addItems(names);
    m_base->setCurrentIndex(std::max(0, static_cast<int>(names.indexOf(base))));
    const int c = names.indexOf(candidate);
    m_candidate->setCurrentIndex(c >= 0 ? c : std::min(1, static_cast<int>(names.size()) - 1));
}

bool CompareScreen::compare(const QString& base, const QString& candidate)
{
    m_base->setCurrentIndex(m_base->findText(base));
    m_candidate->setCurrentIndex(m_candidate->findText(candidate));
    if (m_document->task()->isRunning() || m_base->currentText() != base || m_candidate->currentText() != candidate)
        return false;
    start();
    return m_document->task()->isRunning();
}

void CompareScreen::start()
{
    const auto base = m_document->evaluation(m_base->currentText());
    const auto candidate = m_document->evaluation(m_candidate->currentText());
    const auto data = m_document->dataset();
    const auto stats = m_document->stats();
    if (!base || !candidate || base == candidate) {
        m_headline->setText(tr("Choose two different runs."));
        return;
    }
    if (!data || !stats) {
        m_headline->setText(tr("The dataset is still being read; try again in a moment."));
        return;
    }
    core::ComparisonSettings settings;
    if (auto spec = core::SegmentSpec::parse(m_segmentKind->currentData().toString().toStdString()))
        settings.segments.push_back(spec.value());
    struct Outcome {
        std::shared_ptr<core::RunComparison> comparison;
        QString error;
    };
    auto outcome = std::make_shared<Outcome>();
    m_headline->setText(tr("Comparing…"));
    m_document->task()->start(
        tr("Comparing %1 with %2").arg(m_candidate->currentText(), m_base->currentText()),
        [outcome, base, candidate, data, stats, settings](const core::Progress& progress) {
            auto result = core::compareRuns(*base, *candidate, *data, *stats, settings, progress);
            if (result)
                outcome->comparison = std::make_shared<core::RunComparison>(std::move(result.value()));
            else
                outcome->error = toQ(result.error().toString());
        },
        [this, outcome] {
            if (!outcome->comparison) {
                show(nullptr);
                m_headline->setText(tr("The comparison failed: %1").arg(outcome->error));
                return;
            }
            show(outcome->comparison);
            emit comparisonReady();
        });
}

void CompareScreen::show(std::shared_ptr<const core::RunComparison> comparison)
{
    m_comparison = std::move(comparison);
    m_model->setResults(m_comparison);
    m_worse->setResults(m_comparison);
    if (!m_comparison) {
        m_headline->setText(m_document->runNames().size() < 2 ? tr("Comparing needs at least two runs in the workspace.")
                                                              : tr("Choose a base and a candidate run, then press Compare."));
        m_worseCaption->clear();
        updateDetail();
        return;
    }
    QStringList lines;
    lines << tr("<b>%1</b> (candidate) against <b>%2</b> (base), over users both runs can be judged on. "
                "A difference whose interval includes 0 or whose Holm-adjusted p ≥ %3 is not significant: treat it as no difference.")
                 .arg(toQ(m_comparison->candidate).toHtmlEscaped(), toQ(m_comparison->base).toHtmlEscaped())
                 .arg(m_comparison->settings.alpha);
    for (const auto& note : m_comparison->notes)
        lines << toQ(note).toHtmlEscaped();
    m_headline->setText(lines.join(QStringLiteral("<br>")));
    m_worseCaption->setText(m_comparison->hasPrimary
                                ? tr("Users who lost most on %1, with the warnings each run raised for them.")
                                      .arg(toQ(core::metricInfo(m_comparison->primary).label))
                                : tr("No metric with a better direction was compared."));
    updateDetail();
}

void CompareScreen::updateDetail()
{
    const auto metric = static_cast<core::Metric>(m_detailMetric->currentData().toInt());
    m_segments->setResults(m_comparison, metric);
    if (!m_comparison) {
        m_chart->setData({}, metric, QString(), QString());
        return;
    }
    std::vector<double> differences;
    for (const auto& per : m_comparison->perUser)
        if (per.metric == metric)
            for (std::size_t i = 0; i < per.base.size(); ++i)
                differences.push_back(per.candidate[i] - per.base[i]);
    m_chart->setData(differences, metric, toQ(m_comparison->base), toQ(m_comparison->candidate), m_comparison->settings.tolerance);
}

} // namespace slatewise::ui

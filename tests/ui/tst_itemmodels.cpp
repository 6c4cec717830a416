// SPDX-License-Identifier: MIT
// The workbench's item models over real evaluation results of a seeded synthetic workspace:
// every model passes QAbstractItemModelTester, and the user browser's worst-first order and
// filters agree with the stored per-user results they read.
#include "core/comparisonresult.h"
#include "core/evaluator.h"
#include "core/runcomparison.h"
#include "core/syntheticdata.h"
#include "ui/comparisonmodel.h"
#include "ui/inspectorlistmodel.h"
#include "ui/runmetricsmodel.h"
#include "ui/segmentmodel.h"
#include "ui/userbrowsermodel.h"
#include "ui/userbrowserproxy.h"
#include "ui/userinspection.h"
#include "ui/usermetricsmodel.h"
#include "ui/withheldmodel.h"
#include "ui/worseusersmodel.h"

#include <QAbstractItemModelTester>
#include <QTest>

#include <algorithm>
#include <cmath>
#include <memory>

#include "support/testsupport.h"

using namespace slatewise;

class TestItemModels : public QObject {
    Q_OBJECT
private:
    std::shared_ptr<core::Dataset> m_data;
    std::shared_ptr<core::RunData> m_run, m_other;
    std::shared_ptr<const core::RunEvaluation> m_eval, m_otherEval;
    std::shared_ptr<const std::vector<std::string>> m_ids;

    /// Checks the proxy's order for one column: defined values in worst-first (ascending)
    /// or best-first (descending) order by the metric's direction, undefined values last.
    void checkOrder(ui::UserBrowserProxy& proxy, int column, Qt::SortOrder order);

private slots:
    void initTestCase();
    void modelsPassTheTester();
    void browseSortOrder_data();
    void browseSortOrder();
    void browseFilters();
    void inspectionAgreesWithTheRun();
};

void TestItemModels::initTestCase()
{
    test::failOnUnexpectedMessages();
    core::SyntheticSpec spec;
    spec.users = 400;
    spec.items = 600;
    spec.trainPerUser = 30;
    spec.withheldPerUser = 8;
    spec.listLength = 20;
    spec.seed = 7;
    auto synthetic = core::makeSynthetic(spec);
    m_data = std::make_shared<core::Dataset>(std::move(synthetic.data));
    m_run = std::make_shared<core::RunData>(std::move(synthetic.run));
    m_run->info.name = "synthetic";
    m_run->info.id = 1;
    // A second run: each list reversed and scores shifted, so the comparison has real differences.
    m_other = std::make_shared<core::RunData>(*m_run);
    m_other->info.name = "reversed";
    m_other->info.id = 2;
    for (std::size_t u = 0; u < m_data->userCount(); ++u)
        std::reverse(m_other->listRows.begin() + m_other->listOffsets[u],
            m_other->listRows.begin() + m_other->listOffsets[u + 1]);
    for (auto& s : m_other->scores)
        s += 0.3f;
    const auto stats = core::computeStats(*m_data);
    core::EvalSettings settings;
    settings.bootstrap = 50;
    auto eval = core::evaluateRun(*m_data, stats, *m_run, settings);
    auto other = core::evaluateRun(*m_data, stats, *m_other, settings);
    QVERIFY(eval.ok());
    QVERIFY(other.ok());
    m_eval = std::make_shared<const core::RunEvaluation>(std::move(eval.value()));
    m_otherEval = std::make_shared<const core::RunEvaluation>(std::move(other.value()));
    m_ids = std::make_shared<const std::vector<std::string>>(m_data->userIds);
    QVERIFY(m_eval->users.size() > 100);
}

void TestItemModels::modelsPassTheTester()
{
    using Mode = QAbstractItemModelTester::FailureReportingMode;
    ui::RunMetricsModel runs;
    QAbstractItemModelTester t1(&runs, Mode::QtTest);
    runs.setResults({ m_eval, m_otherEval });
    QCOMPARE(runs.rowCount(), 2);
    QCOMPARE(runs.data(runs.index(0, ui::RunMetricsModel::Run)).toString(), QStringLiteral("synthetic"));
    QCOMPARE(runs.data(runs.index(0, ui::RunMetricsModel::Ndcg), ui::RunMetricsModel::ValueRole).toDouble(),
        m_eval->ranking->ndcg);
    QCOMPARE(runs.data(runs.index(1, ui::RunMetricsModel::Rmse), ui::RunMetricsModel::ValueRole).toDouble(),
        m_otherEval->accuracy->rmse);
    // Every metric header explains itself with the sentence from core/metric.h.
    const QString tip = runs.headerData(ui::RunMetricsModel::Ndcg, Qt::Horizontal, Qt::ToolTipRole).toString();
    QVERIFY2(tip.contains(QString::fromUtf8(core::metricInfo(core::Metric::Ndcg).summary.data()).toHtmlEscaped()),
        qPrintable(tip));

    ui::UserBrowserModel browser;
    QAbstractItemModelTester t2(&browser, Mode::QtTest);
    browser.setResults(m_eval, m_ids);
    QCOMPARE(browser.rowCount(), static_cast<int>(m_eval->users.size()));
    ui::UserBrowserProxy proxy;
    QAbstractItemModelTester t3(&proxy, Mode::QtTest);
    proxy.setSourceModel(&browser);
    proxy.sortWorstFirst(ui::UserBrowserModel::columnOf(core::Metric::Ndcg));
    proxy.setWarningFilter(ui::UserBrowserProxy::kAnyWarning);
    proxy.setUserText(QStringLiteral("1"));

    const auto inspection = std::make_shared<const ui::UserInspection>(ui::UserInspection::build(
        *m_data, *m_run, *m_eval, m_eval->users.users[0], ui::UserInspection::columnMeans(*m_eval)));
    ui::InspectorListModel list;
    QAbstractItemModelTester t4(&list, Mode::QtTest);
    list.setResults(inspection, m_data);
    QCOMPARE(list.rowCount(), static_cast<int>(inspection->list.size()));
    ui::WithheldModel withheld;
    QAbstractItemModelTester t5(&withheld, Mode::QtTest);
    withheld.setResults(inspection, m_data);
    QCOMPARE(withheld.rowCount(), static_cast<int>(inspection->withheld.size()));
    ui::UserMetricsModel metrics;
    QAbstractItemModelTester t6(&metrics, Mode::QtTest);
    metrics.setResults(inspection);
    QCOMPARE(metrics.rowCount(), static_cast<int>(core::kMetricCount));

    core::ComparisonSettings cs;
    cs.bootstrap = 100;
    cs.segments.push_back(core::SegmentSpec {});
    const auto stats = core::computeStats(*m_data);
    auto comparison = core::compareRuns(*m_eval, *m_otherEval, *m_data, stats, cs);
    QVERIFY2(comparison.ok(), comparison.ok() ? "" : comparison.error().toString().c_str());
    auto shared = std::make_shared<const core::RunComparison>(std::move(comparison.value()));
    ui::ComparisonModel cmp;
    QAbstractItemModelTester t7(&cmp, Mode::QtTest);
    cmp.setResults(shared);
    QCOMPARE(cmp.rowCount(), static_cast<int>(shared->metrics.size()));
    QCOMPARE(cmp.data(cmp.index(0, ui::ComparisonModel::MeanDiff), ui::ComparisonModel::ValueRole).toDouble(),
        shared->metrics[0].meanDiff);
    for (int r = 0; r < cmp.rowCount(); ++r) {
        // The short judgement agrees with the significance the comparison computed.
        const QString judgement = cmp.data(cmp.index(r, ui::ComparisonModel::Judgement)).toString();
        const bool significant = cmp.data(cmp.index(r, 0), ui::ComparisonModel::SignificantRole).toBool();
        QCOMPARE(judgement.startsWith(QStringLiteral("significant")), significant);
    }
    ui::SegmentModel segments;
    QAbstractItemModelTester t8(&segments, Mode::QtTest);
    segments.setResults(shared, core::Metric::Ndcg);
    QCOMPARE(segments.rowCount(), static_cast<int>(shared->segments.size()));
    for (int r = 0; r < segments.rowCount(); ++r) {
        // A segment under the minimum size says so in words.
        if (segments.data(segments.index(r, 0), ui::SegmentModel::TooSmallRole).toBool()) {
            QVERIFY(segments.data(segments.index(r, ui::SegmentModel::Verdict))
                        .toString()
                        .contains(QStringLiteral("too small to judge")));
            QCOMPARE(segments.data(segments.index(r, ui::SegmentModel::Judgement)).toString(),
                QStringLiteral("too small to judge"));
        }
    }
    ui::WorseUsersModel worse;
    QAbstractItemModelTester t9(&worse, Mode::QtTest);
    worse.setResults(shared);
    QCOMPARE(worse.rowCount(), static_cast<int>(shared->whoGotWorse.size()));
    // Resetting to nothing is as valid as resetting to data.
    runs.setResults({});
    browser.setResults(nullptr, nullptr);
    list.setResults(nullptr, nullptr);
    cmp.setResults(nullptr);
    worse.setResults(nullptr);
}

void TestItemModels::checkOrder(ui::UserBrowserProxy& proxy, int column, Qt::SortOrder order)
{
    proxy.sort(column, order);
    const auto* browser = proxy.browser();
    QCOMPARE(proxy.rowCount(), browser->rowCount());
    const auto metric = ui::UserBrowserModel::metricOf(column);
    const auto better = metric ? core::metricInfo(*metric).better : core::Better::Lower;
    // Badness as the product defines it: larger = worse.
    const auto badness = [&](double v) {
        if (!metric)
            return column == ui::UserBrowserModel::Warnings ? v : -v;
        return better == core::Better::Higher ? -v : better == core::Better::Lower ? v : std::abs(v);
    };
    bool seenUndefined = false;
    double previous = 0;
    int defined = 0;
    for (int r = 0; r < proxy.rowCount(); ++r) {
        const int source = proxy.mapToSource(proxy.index(r, column)).row();
        // The value straight from the stored per-user results, not through the model.
        const auto& table = browser->evaluation()->users;
        double v = 0;
        if (metric)
            v = table.value(*metric, static_cast<std::size_t>(source));
        else if (column == ui::UserBrowserModel::Warnings)
            v = table.warningCount[static_cast<std::size_t>(source)];
        else
            v = table.nTrain[static_cast<std::size_t>(source)];
        if (std::isnan(v)) {
            seenUndefined = true;
            continue;
        }
        QVERIFY2(!seenUndefined, "a defined value after an undefined one");
        const double b = badness(v);
        if (defined > 0) {
            if (order == Qt::AscendingOrder)
                QVERIFY2(b <= previous, qPrintable(QStringLiteral("row %1 is worse than the one above").arg(r)));
            else
                QVERIFY2(b >= previous, qPrintable(QStringLiteral("row %1 is better than the one above").arg(r)));
        }
        previous = b;
        ++defined;
    }
    QVERIFY(defined > 0);
}

void TestItemModels::browseSortOrder_data()
{
    QTest::addColumn<int>("column");
    QTest::newRow("warnings") << static_cast<int>(ui::UserBrowserModel::Warnings);
    QTest::newRow("history") << static_cast<int>(ui::UserBrowserModel::Train);
    for (const auto& info : core::allMetrics())
        QTest::newRow(info.key.data()) << ui::UserBrowserModel::columnOf(info.metric);
}

void TestItemModels::browseSortOrder()
{
    QFETCH(int, column);
    ui::UserBrowserModel browser;
    browser.setResults(m_eval, m_ids);
    ui::UserBrowserProxy proxy;
    proxy.setSourceModel(&browser);
    const auto metric = ui::UserBrowserModel::metricOf(column);
    // Metrics undefined for every synthetic user (e.g. burst echo without a burst) have nothing to order.
    if (metric) {
        const auto& values = m_eval->users.column(*metric);
        if (std::all_of(values.begin(), values.end(), [](double v) { return std::isnan(v); }))
            QSKIP("metric undefined for every user of this workspace");
    }
    checkOrder(proxy, column, Qt::AscendingOrder);
    checkOrder(proxy, column, Qt::DescendingOrder);
}

void TestItemModels::browseFilters()
{
    ui::UserBrowserModel browser;
    browser.setResults(m_eval, m_ids);
    ui::UserBrowserProxy proxy;
    proxy.setSourceModel(&browser);
    const auto& table = m_eval->users;

    // Warning filters against the stored warnings list.
    for (const auto& info : core::allWarnings()) {
        std::vector<core::UserIndex> carrying;
        for (const auto& w : m_eval->warnings)
            if (w.code == info.code && (carrying.empty() || carrying.back() != w.user))
                carrying.push_back(w.user);
        proxy.setWarningFilter(static_cast<int>(info.code));
        QCOMPARE(proxy.rowCount(), static_cast<int>(carrying.size()));
        for (int r = 0; r < proxy.rowCount(); ++r) {
            const auto user = browser.userAt(proxy.mapToSource(proxy.index(r, 0)).row());
            QVERIFY(std::binary_search(carrying.begin(), carrying.end(), user));
        }
    }
    const auto warned
        = std::count_if(table.warningCount.begin(), table.warningCount.end(), [](auto c) { return c > 0; });
    proxy.setWarningFilter(ui::UserBrowserProxy::kAnyWarning);
    QCOMPARE(proxy.rowCount(), static_cast<int>(warned));
    proxy.setWarningFilter(ui::UserBrowserProxy::kNoWarning);
    QCOMPARE(proxy.rowCount(), static_cast<int>(table.size() - static_cast<std::size_t>(warned)));
    proxy.setWarningFilter(ui::UserBrowserProxy::kAnyOrNone);
    QCOMPARE(proxy.rowCount(), static_cast<int>(table.size()));

    // Segments: cold users by the stored train counts; the four quarters partition the rest.
    const auto cold = std::count_if(
        table.nTrain.begin(), table.nTrain.end(), [&](auto n) { return n < m_eval->settings.warn.coldTrain; });
    proxy.setSegment(ui::UserBrowserProxy::Segment::Cold);
    QCOMPARE(proxy.rowCount(), static_cast<int>(cold));
    int quarters = 0;
    std::int32_t lastMax = -1;
    for (auto s : { ui::UserBrowserProxy::Segment::Activity1, ui::UserBrowserProxy::Segment::Activity2,
             ui::UserBrowserProxy::Segment::Activity3, ui::UserBrowserProxy::Segment::Activity4 }) {
        proxy.setSegment(s);
        quarters += proxy.rowCount();
        std::int32_t lo = INT32_MAX, hi = -1;
        for (int r = 0; r < proxy.rowCount(); ++r) {
            const auto n = table.nTrain[static_cast<std::size_t>(proxy.mapToSource(proxy.index(r, 0)).row())];
            lo = std::min(lo, n);
            hi = std::max(hi, n);
        }
        if (proxy.rowCount() > 0) {
            QVERIFY2(lo > lastMax, "activity quarters overlap");
            lastMax = hi;
        }
    }
    QCOMPARE(quarters, static_cast<int>(table.size()));
    proxy.setSegment(ui::UserBrowserProxy::Segment::All);

    // Text on the user id.
    const QString id = QString::fromStdString(m_data->userIds[table.users[5].value]);
    proxy.setUserText(id);
    QVERIFY(proxy.rowCount() >= 1);
    for (int r = 0; r < proxy.rowCount(); ++r)
        QVERIFY(proxy.data(proxy.index(r, ui::UserBrowserModel::UserId)).toString().contains(id, Qt::CaseInsensitive));
    proxy.setUserText(QStringLiteral("no user has this id"));
    QCOMPARE(proxy.rowCount(), 0);
}

void TestItemModels::inspectionAgreesWithTheRun()
{
    // The inspected list is the run's list cut to k; hits are withheld items rated at or above
    // the threshold; the per-user precision equals hits / k as stored by the evaluator.
    const auto means = ui::UserInspection::columnMeans(*m_eval);
    int checked = 0;
    for (std::size_t r = 0; r < m_eval->users.size(); r += 37) {
        const auto user = m_eval->users.users[r];
        const auto inspection = ui::UserInspection::build(*m_data, *m_run, *m_eval, user, means);
        const auto list = m_run->listOf(user);
        QCOMPARE(
            inspection.list.size(), std::min<std::size_t>(list.size(), static_cast<std::size_t>(m_eval->settings.k)));
        for (std::size_t i = 0; i < inspection.list.size(); ++i)
            QCOMPARE(inspection.list[i].item, list[i].item);
        const double precision = m_eval->users.value(core::Metric::Precision, r);
        if (!std::isnan(precision))
            QCOMPARE(static_cast<double>(inspection.hits()) / m_eval->settings.k, precision);
        QCOMPARE(static_cast<int>(inspection.withheld.size()), m_eval->users.nWithheld[r]);
        for (std::size_t i = 1; i < inspection.withheld.size(); ++i)
            QVERIFY(inspection.withheld[i - 1].rating >= inspection.withheld[i].rating);
        ++checked;
    }
    QVERIFY(checked > 5);
}

QTEST_MAIN(TestItemModels)
#include "tst_itemmodels.moc"

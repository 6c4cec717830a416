// SPDX-License-Identifier: MIT
// Chart maths: binning, axis ranges, band grouping, k-curves, per-user differences and the
// genre timeline, as pure functions.
#include "core/dataset.h"
#include "core/run.h"
#include "support/testsupport.h"
#include "ui/bandgrouping.h"
#include "ui/differencedistribution.h"
#include "ui/genretimeline.h"
#include "ui/histogram.h"
#include "ui/kcurveseries.h"
#include "ui/niceaxis.h"

#include <QTest>

#include <cmath>
#include <vector>

using namespace slatewise;
using namespace slatewise::ui;

class TestChartMaths : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() { test::failOnUnexpectedMessages(); }

    void histogramMatchesNumpy()
    {
        // Expected counts from numpy.histogram (Debian numpy 1.24.2), which like ours uses
        // half-open bins with the last bin closed:
        //   np.histogram(x, bins=4, range=(-3, 3)) -> [1, 2, 5, 2]
        //   np.histogram(x, bins=8, range=(-2, 2)) -> [0, 0, 1, 1, 2, 1, 2, 1] (numpy drops -2.5 and 3.0)
        const std::vector<double> x{-2.5, -1.0, -0.25, 0, 0, 0.5, 1.0, 1.0, 1.75, 3.0};
        const Histogram a = Histogram::build(x, -3, 3, 4);
        QCOMPARE(a.counts, (std::vector<std::int64_t>{1, 2, 5, 2}));
        QCOMPARE(a.below, 0);
        QCOMPARE(a.above, 0);
        QCOMPARE(a.binWidth, 1.5);
        const Histogram b = Histogram::build(x, -2, 2, 8);
        QCOMPARE(b.counts, (std::vector<std::int64_t>{0, 0, 1, 1, 2, 1, 2, 1}));
        QCOMPARE(b.below, 1);
        QCOMPARE(b.above, 1);
        QCOMPARE(b.total(), 10);
        QCOMPARE(b.share(4), 0.2);
        QCOMPARE(b.binCentre(0), -1.75);
    }

    void histogramCountsNanAndAutoBins()
    {
        const std::vector<double> x{0.1, 0.35, 0.9, std::nan(""), 0.9};
        const Histogram h = Histogram::buildAuto(x, 4);
        QCOMPARE(h.ignored, 1);
        QCOMPARE(h.binWidth, 0.2); // (0.9 - 0.1) / 4 = 0.2, already nice
        QCOMPARE(h.start, 0.0);
        QCOMPARE(h.total(), 4);
        QCOMPARE(h.below + h.above, 0);
        // Every value sits in the bin whose edges enclose it.
        QCOMPARE(h.counts[0], 1); // 0.1 in [0, 0.2)
        QCOMPARE(h.counts[1], 1); // 0.35 in [0.2, 0.4)
        QCOMPARE(h.counts.back(), 2); // 0.9 in [0.8, 1.0)
    }

    void niceAxis_data()
    {
        QTest::addColumn<double>("min");
        QTest::addColumn<double>("max");
        QTest::addColumn<int>("ticks");
        QTest::addColumn<double>("low");
        QTest::addColumn<double>("high");
        QTest::addColumn<double>("step");
        // Hand-computed with the 1-2-2.5-5 rule (common practice for axis labels).
        QTest::newRow("shares") << 0.0 << 0.87 << 5 << 0.0 << 1.0 << 0.2;
        QTest::newRow("errors") << -1.3 << 2.1 << 4 << -2.0 << 3.0 << 1.0;
        QTest::newRow("quarter") << 0.0 << 1.0 << 4 << 0.0 << 1.0 << 0.25;
        QTest::newRow("large") << 0.0 << 1234.0 << 5 << 0.0 << 1250.0 << 250.0;
        QTest::newRow("k") << 1.0 << 50.0 << 5 << 0.0 << 50.0 << 10.0;
        QTest::newRow("point") << 3.0 << 3.0 << 5 << 2.6 << 3.4 << 0.2; // widened by 10 % first
    }
    void niceAxis()
    {
        QFETCH(double, min);
        QFETCH(double, max);
        QFETCH(int, ticks);
        const NiceAxis a = NiceAxis::compute(min, max, ticks);
        QTEST(a.low, "low");
        QTEST(a.high, "high");
        QTEST(a.step, "step");
        QVERIFY(a.low <= min && a.high >= max);
        QCOMPARE(a.ticks.front(), a.low);
        QVERIFY(std::abs(a.ticks.back() - a.high) < 1e-12);
    }

    void niceAxisDecimals()
    {
        QCOMPARE(NiceAxis::compute(0, 1, 4).decimals(), 2);  // 0.25
        QCOMPARE(NiceAxis::compute(0, 100, 5).decimals(), 0); // 20
        QCOMPARE(NiceAxis::compute(0, 0.87, 5).decimals(), 1); // 0.2
        QCOMPARE(NiceAxis::compute(std::nan(""), 1, 5).low, 0.0);
    }

    void bandGroupingUnionOfRatings()
    {
        core::RunEvaluation a;
        a.runName = "a";
        a.accuracy = core::AccuracySummary{};
        a.accuracy->bands = {{1.0, 10, 1.5, 1.2, 1.1}, {4.0, 30, 0.6, 0.5, -0.2}, {5.0, 20, 1.0, 0.9, -0.8}};
        core::RunEvaluation b;
        b.runName = "b";
        b.accuracy = core::AccuracySummary{};
        b.accuracy->bands = {{2.0, 12, 1.1, 1.0, 0.7}, {5.0, 25, 0.7, 0.6, -0.4}};
        core::RunEvaluation lists;
        lists.runName = "lists-only";
        const BandGrouping g = BandGrouping::build({a, b, lists});
        QCOMPARE(g.ratings, (std::vector<double>{1, 2, 4, 5}));
        QCOMPARE(g.runs, (std::vector<std::string>{"a", "b"}));
        QCOMPARE(g.skippedRuns, (std::vector<std::string>{"lists-only"}));
        QCOMPARE(g.rmse[0][2], 0.6);
        QVERIFY(std::isnan(g.rmse[0][1])); // run a has no band 2
        QCOMPARE(g.meanError[1][3], -0.4);
        QCOMPARE(g.n[1][0], 0);
        QCOMPARE(g.bandCount(3), 25);
        // Spacing is the smallest gap (1 star); two runs share 0.8 of it side by side.
        QCOMPARE(g.bandSpacing(), 1.0);
        QCOMPARE(g.barWidth(), 0.4);
        QCOMPARE(g.barCentre(0, 0), 0.8);
        QCOMPARE(g.barCentre(1, 0), 1.2);
    }

    void kCurvesCutAndSkip()
    {
        core::RunEvaluation a;
        a.runName = "a";
        a.settings.k = 10;
        a.ranking = core::RankingSummary{};
        for (int k = 1; k <= 60; ++k) {
            a.ranking->curves.k.push_back(k);
            a.ranking->curves.precision.push_back(1.0 / k);
            a.ranking->curves.recall.push_back(k / 60.0);
            a.ranking->curves.ndcg.push_back(0.5);
        }
        core::RunEvaluation scoresOnly;
        scoresOnly.runName = "scores";
        const KCurveSeries s = KCurveSeries::build({a, scoresOnly}, 50);
        QCOMPARE(s.runs.size(), std::size_t(1));
        QCOMPARE(s.skippedRuns, (std::vector<std::string>{"scores"}));
        QCOMPARE(s.lines.size(), std::size_t(3));
        const auto* recall = s.line("a", KCurveSeries::Measure::Recall);
        QVERIFY(recall);
        QCOMPARE(recall->k.size(), std::size_t(50));
        QCOMPARE(recall->k.back(), 50.0);
        QCOMPARE(recall->value.back(), 50.0 / 60.0);
        QCOMPARE(s.maxValue(KCurveSeries::Measure::Precision), 1.0);
        QCOMPARE(s.maxValue(KCurveSeries::Measure::Recall), 50.0 / 60.0);
        QCOMPARE(s.evaluatedK, 10);
    }

    void differenceDistribution()
    {
        // Sorted values, mean and quantiles checked with numpy (Debian numpy 1.24.2):
        // np.mean = 0.0083333, np.median = 0.025, np.percentile(d, [10, 75]) = [-0.25, 0.1625].
        const std::vector<double> d{0.3, -0.1, 0, 0.2, -0.4, 0.05, std::nan("")};
        const auto dist = DifferenceDistribution::build(d, core::Better::Higher);
        QCOMPARE(dist.sorted, (std::vector<double>{-0.4, -0.1, 0, 0.05, 0.2, 0.3}));
        QCOMPARE(dist.improved, 3);
        QCOMPARE(dist.tied, 1);
        QCOMPARE(dist.worsened, 2);
        QCOMPARE(dist.ignored, 1);
        QVERIFY(std::abs(dist.mean - 0.05 / 6.0) < 1e-15);
        QVERIFY(std::abs(dist.median - 0.025) < 1e-15);
        QVERIFY(std::abs(dist.quantile(0.10) - (-0.25)) < 1e-12);
        QVERIFY(std::abs(dist.quantile(0.75) - 0.1625) < 1e-12);
        QCOMPARE(dist.percentAt(0), 100.0 * 0.5 / 6.0);

        // For a lower-is-better metric (RMSE) a negative difference is a win.
        const auto rmse = DifferenceDistribution::build(d, core::Better::Lower);
        QCOMPARE(rmse.improved, 2);
        QCOMPARE(rmse.worsened, 3);
        const auto neither = DifferenceDistribution::build(d, core::Better::Neither);
        QCOMPARE(neither.improved + neither.worsened, 0);
        QCOMPARE(neither.tied, 6);
    }

    void genreTimelineShowsRecentBinge()
    {
        // 30 older titles: 20 drama, 10 comedy; then a binge of 10 of which 9 are horror.
        core::Dataset data;
        data.genreNames = {"drama", "comedy", "horror", "western"};
        data.userIds = {"u1"};
        auto addItem = [&](std::vector<std::int32_t> genres) {
            core::Item item;
            item.title = "t" + std::to_string(data.items.size());
            item.genres = std::move(genres);
            data.items.push_back(item);
            return core::ItemIndex(static_cast<std::uint32_t>(data.items.size() - 1));
        };
        const auto drama = addItem({0});
        const auto comedy = addItem({1});
        const auto horror = addItem({2});
        const auto mixed = addItem({0, 3}); // half drama, half western
        core::Timestamp t = 1700000000;
        auto add = [&](core::ItemIndex item) { data.train.rows.push_back({item, 4.0f, t += 86400}); };
        for (int i = 0; i < 20; ++i)
            add(drama);
        for (int i = 0; i < 10; ++i)
            add(comedy);
        for (int i = 0; i < 9; ++i)
            add(horror);
        add(mixed);
        data.train.offsets = {0, static_cast<std::uint32_t>(data.train.rows.size())};

        const GenreTimeline tl = GenreTimeline::build(data, core::UserIndex(0), 10, 3, 6);
        QCOMPARE(tl.interactions, 40);
        QVERIFY(tl.hasTimestamps);
        QCOMPARE(tl.buckets.size(), std::size_t(4));
        QCOMPARE(tl.buckets[0].count, 10);
        QCOMPARE(tl.buckets[3].count, 10);
        QVERIFY(tl.buckets[3].recent);
        QVERIFY(!tl.buckets[2].recent);
        // Heaviest overall first: drama 20.5, comedy 10, horror 9, western 0.5.
        QCOMPARE(tl.genres, (std::vector<std::string>{"drama", "comedy", "horror", "western"}));
        QCOMPARE(tl.recentGenre, 2);
        QCOMPARE(tl.recentShare, 0.9);
        QCOMPARE(tl.priorShare, 0.0);
        QCOMPARE(tl.buckets[3].share(2), 0.9);
        QCOMPARE(tl.buckets[3].weight[0], 0.5); // the mixed item splits its unit
        QCOMPARE(tl.buckets[3].weight[3], 0.5);
        double sum = 0;
        for (const double w : tl.buckets[1].weight)
            sum += w;
        QCOMPARE(sum, 10.0);

        // With room for one genre only, the binge genre still shows; the rest is "other".
        const GenreTimeline narrow = GenreTimeline::build(data, core::UserIndex(0), 10, 3, 1);
        QCOMPARE(narrow.genres, (std::vector<std::string>{"horror", "other genres"}));
        QCOMPARE(narrow.recentGenre, 0);
    }
};

QTEST_MAIN(TestChartMaths)
#include "tst_chartmaths.moc"

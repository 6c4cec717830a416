// SPDX-License-Identifier: MIT
// The seeded percentile bootstrap (Efron & Tibshirani, An Introduction to the Bootstrap,
// 1993) used for every aggregate interval and reused by the run comparison.
#include "core/bootstrap.h"
#include "tests/core/evalfixture.h"

#include <QTest>

#include <cmath>
#include <numeric>
#include <vector>

using namespace slatewise::core;

class TestBootstrap : public QObject {
    Q_OBJECT
private slots:
    // For x = [1, 2, 3, 4] the exhaustive bootstrap (all 256 resamples) gives the standard
    // error of the mean sqrt(5)/4 = 0.559017 and the 95% percentile interval [1.5, 3.5]
    // (closed form, recomputed with numpy; see the shared reference values). 40,000 random
    // resamples must land on the same interval, and within 0.01 of the standard error.
    void smallSampleMatchesExhaustiveBootstrap()
    {
        const std::vector<double> x{1, 2, 3, 4};
        const Bootstrap bootstrap(40000, 7);
        const Interval ci = bootstrap.meanInterval(x);
        QCOMPARE(ci.low, 1.5);
        QCOMPARE(ci.high, 3.5);
        const std::vector<double> sums = bootstrap.resampleColumnSums(x, 4, 1);
        double mean = 0, sq = 0;
        for (double s : sums)
            mean += s / 4;
        mean /= static_cast<double>(sums.size());
        for (double s : sums)
            sq += (s / 4 - mean) * (s / 4 - mean);
        COMPARE_NEAR(std::sqrt(sq / static_cast<double>(sums.size() - 1)), std::sqrt(5.0) / 4.0, 0.01);
    }

    void sameSeedSameInterval()
    {
        std::vector<double> x(500);
        for (std::size_t i = 0; i < x.size(); ++i)
            x[i] = std::sin(static_cast<double>(i) * 1.7) * 3.0 + static_cast<double>(i % 7);
        const Interval a = Bootstrap(1000, 42).meanInterval(x);
        const Interval b = Bootstrap(1000, 42).meanInterval(x);
        QCOMPARE(a.low, b.low);
        QCOMPARE(a.high, b.high);
        const Interval c = Bootstrap(1000, 43).meanInterval(x);
        QVERIFY(a.low != c.low || a.high != c.high);
        const double mean = std::accumulate(x.begin(), x.end(), 0.0) / static_cast<double>(x.size());
        QVERIFY2(a.low < mean && mean < a.high, "the interval should contain the sample mean");
    }

    // Indices come from the same per-resample streams as the sums.
    void indicesMatchSums()
    {
        const std::vector<double> x{1, 10, 100, 1000, 10000};
        const Bootstrap bootstrap(5, 99);
        const std::vector<double> sums = bootstrap.resampleColumnSums(x, 5, 1);
        for (std::int32_t b = 0; b < 5; ++b) {
            double s = 0;
            for (auto i : bootstrap.resampleIndices(b, 5))
                s += x[i];
            QCOMPARE(s, sums[static_cast<std::size_t>(b)]);
        }
    }

    // numpy.percentile's default linear interpolation: for 1..5 the 2.5% and 97.5% points
    // are 1.1 and 4.9 (h = p (n − 1)).
    void percentileInterpolatesLinearly()
    {
        const Interval ci = Bootstrap::percentileInterval({5, 3, 1, 4, 2});
        COMPARE_NEAR(ci.low, 1.1, 1e-12);
        COMPARE_NEAR(ci.high, 4.9, 1e-12);
        const Interval none = Bootstrap::percentileInterval({std::nan("")});
        QVERIFY(std::isnan(none.low) && std::isnan(none.high));
    }

    void cancelReturnsNothing()
    {
        std::atomic<bool> cancel{true};
        Progress progress;
        progress.cancel = &cancel;
        const std::vector<double> x{1, 2, 3};
        QVERIFY(Bootstrap(100, 1).resampleColumnSums(x, 3, 1, progress).empty());
    }
};

QTEST_GUILESS_MAIN(TestBootstrap)
#include "tst_bootstrap.moc"

// SPDX-License-Identifier: MIT
// The statistics behind `slatewise compare`, checked against published values, closed forms
// and hand computation. The comparison with scipy on random data is in
// tests/reference/check_comparison.py.
#include "core/bootstrap.h"
#include "core/holmadjustment.h"
#include "core/incompletebeta.h"
#include "core/normaldistribution.h"
#include "core/pairedoutcomes.h"
#include "core/pairedttest.h"
#include "core/studentt.h"
#include "core/wilcoxontest.h"

#include <QTest>

#include <cmath>
#include <numbers>
#include <random>
#include <vector>

using namespace slatewise::core;

namespace {

/// Rounds to `digits` decimals so QCOMPARE can check a published value printed to that many.
double rounded(double v, int digits)
{
    const double scale = std::pow(10.0, digits);
    return std::round(v * scale) / scale;
}

} // namespace

class TestStats : public QObject {
    Q_OBJECT
private slots:
    void incompleteBetaClosedForms_data()
    {
        QTest::addColumn<double>("a");
        QTest::addColumn<double>("b");
        QTest::addColumn<double>("x");
        QTest::addColumn<double>("expected");
        // Closed forms (common practice): I_x(a, 1) = x^a, I_x(1, b) = 1 - (1 - x)^b.
        QTest::newRow("I_x(3,1)") << 3.0 << 1.0 << 0.3 << std::pow(0.3, 3.0);
        QTest::newRow("I_x(1,4)") << 1.0 << 4.0 << 0.7 << 1.0 - std::pow(0.3, 4.0);
        QTest::newRow("I_x(250,1)") << 250.0 << 1.0 << 0.995 << std::pow(0.995, 250.0);
        QTest::newRow("I_x(1,0.5)") << 1.0 << 0.5 << 0.2 << 1.0 - std::sqrt(0.8);
        // I_x(1/2, 1/2) = (2/pi) asin(sqrt x) (arcsine distribution).
        QTest::newRow("I_x(.5,.5)") << 0.5 << 0.5 << 0.4 << 2.0 / std::numbers::pi * std::asin(std::sqrt(0.4));
    }
    void incompleteBetaClosedForms()
    {
        QFETCH(double, a);
        QFETCH(double, b);
        QFETCH(double, x);
        QFETCH(double, expected);
        const double got = regularizedIncompleteBeta(a, b, x);
        QVERIFY2(std::fabs(got - expected) <= 1e-13 * std::max(1.0, std::fabs(expected)),
                 qPrintable(QStringLiteral("%1 vs %2").arg(got, 0, 'g', 17).arg(expected, 0, 'g', 17)));
        // Symmetry I_x(a, b) = 1 - I_{1-x}(b, a).
        QCOMPARE(rounded(got + regularizedIncompleteBeta(b, a, 1.0 - x), 12), 1.0);
    }

    void logBetaLargeArguments()
    {
        // ln B(a, 1/2) for a = 1e5 against the asymptotic ln Gamma(1/2) - 0.5 ln a
        // + 1/(8a) + ... (closed form of Gamma(a)/Gamma(a + 1/2), common practice): the two
        // agree to far better than the 1e-10 that lgamma differences would give.
        const double a = 1e5;
        const double expected = 0.5 * std::log(std::numbers::pi) - 0.5 * std::log(a) + 1.0 / (8.0 * a)
            - 1.0 / (192.0 * a * a * a);
        QVERIFY2(std::fabs(logBeta(a, 0.5) - expected) < 1e-14,
                 qPrintable(QString::number(logBeta(a, 0.5) - expected, 'g', 6)));
    }

    void studentTClosedForms()
    {
        // df = 1 is the Cauchy distribution: F(t) = 1/2 + atan(t)/pi; df = 2:
        // F(t) = 1/2 + t / (2 sqrt(2 + t^2)) (closed forms, common practice).
        for (double t : {-30.0, -3.5, -1.0, -0.2, 0.0, 0.7, 2.0, 12.0}) {
            const double cauchy = 0.5 + std::atan(t) / std::numbers::pi;
            QVERIFY2(std::fabs(studentTCdf(t, 1.0) - cauchy) < 1e-13, qPrintable(QString::number(t)));
            const double two = 0.5 + t / (2.0 * std::sqrt(2.0 + t * t));
            QVERIFY2(std::fabs(studentTCdf(t, 2.0) - two) < 1e-13, qPrintable(QString::number(t)));
        }
        // Far tail keeps relative precision: P(T > 1000), df = 1 = atan(1/1000)/pi.
        const double tail = std::atan(1.0 / 1000.0) / std::numbers::pi;
        QVERIFY(std::fabs(studentTSf(1000.0, 1.0) / tail - 1.0) < 1e-12);
        // Many degrees of freedom approach the normal distribution.
        QCOMPARE(rounded(studentTTwoSidedP(1.959963984540054, 1e9), 8), 0.05);
        QCOMPARE(rounded(normalCdf(1.959963984540054), 12), 0.975);
        // Quantile inverts the distribution function.
        for (double df : {1.0, 5.0, 29.0, 1000.0}) {
            const double q = studentTQuantile(0.975, df);
            QCOMPARE(rounded(studentTCdf(q, df), 11), 0.975);
        }
    }

    void pairedTWorkedExample()
    {
        // Published R worked example (see /work/shared/reference-values.md): Exam1 - Exam2,
        // t = -2.2361, p = 0.07559, 95% CI of the mean difference [-16.121994, 1.121994].
        const std::vector<double> exam1{65, 70, 75, 80, 68, 95};
        const std::vector<double> exam2{75, 71, 90, 98, 65, 99};
        const PairedTTest r = pairedTTest(exam1, exam2);
        QCOMPARE(r.n, std::size_t{6});
        QCOMPARE(r.df, 5.0);
        QCOMPARE(rounded(r.t, 4), -2.2361);
        QCOMPARE(rounded(r.p, 5), 0.07559);
        QCOMPARE(r.meanDiff, -7.5);
        const double half = studentTQuantile(0.975, r.df) * r.sdDiff / std::sqrt(6.0);
        QCOMPARE(rounded(r.meanDiff - half, 6), -16.121994);
        QCOMPARE(rounded(r.meanDiff + half, 6), 1.121994);
    }

    void pairedTDegenerate()
    {
        // Every difference the same non-zero value: t = -inf, p = 0 (as scipy's ttest_rel);
        // every difference zero: NaN (0/0).
        const std::vector<double> a{1, 2, 3};
        const std::vector<double> b{2, 3, 4};
        const PairedTTest shifted = pairedTTest(a, b);
        QVERIFY(std::isinf(shifted.t) && shifted.t < 0);
        QCOMPARE(shifted.p, 0.0);
        QVERIFY(std::isnan(pairedTTest(a, a).p));
        QVERIFY(std::isnan(pairedTTest(std::vector<double>{1.0}, std::vector<double>{2.0}).p));
    }

    void wilcoxonDocstringExample()
    {
        // scipy 1.10 `wilcoxon` docstring: statistic 24, two-sided exact p 0.041259765625;
        // normal approximation p 0.040888133 (see /work/shared/reference-values.md).
        const std::vector<double> d{6, 8, 14, 16, 23, 24, 28, 29, 41, -48, 49, 56, 60, -67, 75};
        const WilcoxonSignedRank exact = wilcoxonSignedRank(d);
        QVERIFY(exact.exact);
        QCOMPARE(exact.statistic, 24.0);
        QCOMPARE(exact.rankSumPositive, 96.0);
        QCOMPARE(exact.p, 0.041259765625);
        const WilcoxonSignedRank approx = wilcoxonSignedRank(d, WilcoxonMethod::Approximate);
        QVERIFY(!approx.exact);
        QCOMPARE(approx.statistic, 24.0);
        QCOMPARE(rounded(approx.p, 9), 0.040888133);
    }

    void wilcoxonZeroForcesApproximation()
    {
        // scipy 1.10: a zero difference switches the exact method to the normal approximation
        // and the zero is dropped ("wilcox"). Hand-computed: d = [0, 1, -2, 3, 4], non-zero
        // |d| = 1, 2, 3, 4 -> ranks 1..4, T+ = 1 + 3 + 4 = 8, T- = 2, statistic 2;
        // m = 4: mean 5, var = 4*5*9/24 = 7.5, z = (2 - 5)/sqrt(7.5).
        const std::vector<double> d{0, 1, -2, 3, 4};
        const WilcoxonSignedRank r = wilcoxonSignedRank(d);
        QVERIFY(!r.exact);
        QCOMPARE(r.zeros, std::size_t{1});
        QCOMPARE(r.statistic, 2.0);
        const double z = -3.0 / std::sqrt(7.5);
        QCOMPARE(rounded(r.z, 14), rounded(z, 14));
        QCOMPARE(rounded(r.p, 14), rounded(std::erfc(std::fabs(z) / std::numbers::sqrt2), 14));
        // Without the zero the same data is small enough for the exact distribution: of the
        // 16 sign patterns of ranks 1..4, T+ <= 2 happens for {}, {1}, {2} -> 3/16; two-sided 6/16.
        const WilcoxonSignedRank exact = wilcoxonSignedRank(std::vector<double>{1, -2, 3, 4});
        QVERIFY(exact.exact);
        QCOMPARE(exact.p, 0.375);
    }

    void wilcoxonTieCorrection()
    {
        // Hand-computed, approximate branch (n > 50 forces it): 60 differences, |d| = 1 for 30 of
        // them (ranks 1..30, average 15.5) and |d| = 2 for 30 (ranks 31..60, average 45.5).
        // Signs: 20 positive among the 1s, 10 positive among the 2s.
        // T+ = 20*15.5 + 10*45.5 = 765, T- = 1830 - 765 = 1065, statistic 765.
        // var = [60*61*121 - (30*899 + 30*899)/2] / 24 = (442860 - 26970)/24 = 17328.75.
        std::vector<double> d;
        for (int i = 0; i < 30; ++i)
            d.push_back(i < 20 ? 1.0 : -1.0);
        for (int i = 0; i < 30; ++i)
            d.push_back(i < 10 ? 2.0 : -2.0);
        const WilcoxonSignedRank r = wilcoxonSignedRank(d);
        QVERIFY(!r.exact);
        QCOMPARE(r.statistic, 765.0);
        const double z = (765.0 - 915.0) / std::sqrt(17328.75);
        QCOMPARE(rounded(r.z, 13), rounded(z, 13));
    }

    void holmHandComputed()
    {
        // Hand-computed: p = [0.01, 0.04, 0.03, 0.005], m = 4. Sorted: 0.005, 0.01, 0.03, 0.04.
        //   0.005 * 4 = 0.02
        //   0.01  * 3 = 0.03  (max(0.02, 0.03) = 0.03)
        //   0.03  * 2 = 0.06  (max(0.03, 0.06) = 0.06)
        //   0.04  * 1 = 0.04  -> max(0.06, 0.04) = 0.06 (adjusted values never decrease)
        // Back in input order: [0.03, 0.06, 0.06, 0.02].
        const std::vector<double> p{0.01, 0.04, 0.03, 0.005};
        const std::vector<double> adjusted = holmAdjust(p);
        QCOMPARE(adjusted.size(), std::size_t{4});
        QCOMPARE(rounded(adjusted[0], 15), 0.03);
        QCOMPARE(rounded(adjusted[1], 15), 0.06);
        QCOMPARE(rounded(adjusted[2], 15), 0.06);
        QCOMPARE(rounded(adjusted[3], 15), 0.02);
        // Hand-computed: a NaN (a test that could not run) is left out of m.
        // [0.4, NaN, 0.3, 0.9] -> m = 3, sorted 0.3, 0.4, 0.9:
        //   0.3*3 = 0.9; 0.4*2 = 0.8 -> max 0.9; 0.9*1 = 0.9 -> 0.9.
        const std::vector<double> q{0.4, std::nan(""), 0.3, 0.9};
        const std::vector<double> aq = holmAdjust(q);
        QCOMPARE(rounded(aq[0], 15), 0.9);
        QVERIFY(std::isnan(aq[1]));
        QCOMPARE(rounded(aq[2], 15), 0.9);
        QCOMPARE(rounded(aq[3], 15), 0.9);
        // Capped at 1: [0.5, 0.6] -> 0.5*2 = 1.0, max(1.0, 0.6) = 1.0.
        const std::vector<double> big = holmAdjust(std::vector<double>{0.5, 0.6});
        QCOMPARE(big[0], 1.0);
        QCOMPARE(big[1], 1.0);
    }

    void outcomesFollowDirection()
    {
        // candidate - base; tolerance 1e-9.
        const std::vector<double> d{0.1, -0.2, 5e-10, -0.3, 0.0};
        const PairedOutcomes higher = countPairedOutcomes(d, Better::Higher, 1e-9);
        QCOMPARE(higher.wins, std::int64_t{1});
        QCOMPARE(higher.ties, std::int64_t{2});
        QCOMPARE(higher.losses, std::int64_t{2});
        // For rmse (lower is better) a decrease is a win for the candidate.
        const PairedOutcomes lower = countPairedOutcomes(d, Better::Lower, 1e-9);
        QCOMPARE(lower.wins, std::int64_t{2});
        QCOMPARE(lower.losses, std::int64_t{1});
    }

    void bootstrapPercentileOnAllResamples()
    {
        // /work/shared/reference-values.md: for x = [1, 2, 3, 4] all 256 resamples give the SE of
        // the mean sqrt(5)/4 = 0.559017 and the 95% percentile interval [1.5, 3.5].
        const double x[4] = {1, 2, 3, 4};
        std::vector<double> means;
        for (int a = 0; a < 4; ++a)
            for (int b = 0; b < 4; ++b)
                for (int c = 0; c < 4; ++c)
                    for (int d = 0; d < 4; ++d)
                        means.push_back((x[a] + x[b] + x[c] + x[d]) / 4.0);
        double sum = 0, ss = 0;
        for (double m : means)
            sum += m;
        for (double m : means)
            ss += (m - sum / 256.0) * (m - sum / 256.0);
        QCOMPARE(rounded(std::sqrt(ss / 256.0), 6), 0.559017);
        const Interval ci = Bootstrap::percentileInterval(means, 0.95);
        QCOMPARE(ci.low, 1.5);
        QCOMPARE(ci.high, 3.5);
    }

    void bootstrapReproducibleWithSeed()
    {
        std::mt19937_64 gen(7);
        std::normal_distribution<double> normal(0.02, 0.1);
        std::vector<double> d(500);
        for (double& v : d)
            v = normal(gen);
        const Interval a = Bootstrap(2000, 42).meanInterval(d);
        const Interval b = Bootstrap(2000, 42).meanInterval(d);
        QCOMPARE(a.low, b.low);
        QCOMPARE(a.high, b.high);
        const Interval other = Bootstrap(2000, 43).meanInterval(d);
        QVERIFY(other.low != a.low || other.high != a.high);
        QVERIFY(a.low < a.high);
    }

    void bootstrapCoverage()
    {
        // 200 samples of n = 60 from N(0.3, 1); the 95% percentile interval of the mean should
        // cover 0.3 in between 90% and 99% of them (Efron & Tibshirani 1993, ch. 13).
        std::mt19937_64 gen(20261202);
        std::normal_distribution<double> normal(0.3, 1.0);
        int covered = 0;
        for (int s = 0; s < 200; ++s) {
            std::vector<double> sample(60);
            for (double& v : sample)
                v = normal(gen);
            const Interval ci = Bootstrap(2000, 1000 + static_cast<std::uint64_t>(s)).meanInterval(sample);
            if (ci.low <= 0.3 && 0.3 <= ci.high)
                ++covered;
        }
        qInfo("bootstrap coverage: %d of 200", covered);
        QVERIFY2(covered >= 180 && covered <= 198, qPrintable(QString::number(covered)));
    }
};

QTEST_GUILESS_MAIN(TestStats)
#include "tst_stats.moc"

// SPDX-License-Identifier: MIT
// Per-user ranking, accuracy and held-out agreement checked against published worked
// examples; each check names its source (see ../shared reference values).
#include "core/accuracyaccumulator.h"
#include "core/heldouttopk.h"
#include "core/rankingcurves.h"
#include "core/rankingmetrics.h"
#include "core/ratingbands.h"
#include "tests/core/evalfixture.h"

#include <QTest>

#include <algorithm>
#include <functional>
#include <string>
#include <vector>

using namespace slatewise::core;

namespace {

/// "RRNN..." → list positions; relevant positions get rating 1.
std::vector<ListHit> fromPattern(const std::string& pattern)
{
    std::vector<ListHit> list;
    for (char c : pattern)
        list.push_back({c == 'R', c == 'R' ? 1.0 : 0.0});
    return list;
}

/// Graded relevances in ranked order; an item is relevant when its grade is > 0.
std::vector<ListHit> fromGrades(const std::vector<double>& grades)
{
    std::vector<ListHit> list;
    for (double g : grades)
        list.push_back({g > 0.0, g});
    return list;
}

std::vector<double> descending(std::vector<double> v)
{
    std::erase_if(v, [](double g) { return g <= 0.0; });
    std::sort(v.begin(), v.end(), std::greater<>());
    return v;
}

} // namespace

class TestRankingMetrics : public QObject {
    Q_OBJECT
private slots:
    // Manning, Raghavan & Schütze, Introduction to Information Retrieval (2008), ch. 8
    // exercise (from memory): R R N N N N N N R N R N N N R N N N N R, 8 relevant.
    // Our AP@k divides by min(k, |R|); at k = 20 that is |R| = 8, the IR-text convention.
    void manningChapter8Ranking()
    {
        const auto list = fromPattern("RRNNNNNNRNRNNNRNNNNR");
        const std::vector<double> relevant(8, 1.0);
        const UserRanking at20 = rankUser(list, relevant, 20);
        COMPARE_NEAR(at20.precision, 0.3, 1e-12);   // P@20 0.3
        COMPARE_NEAR(at20.recall, 0.75, 1e-12);     // R@20 0.75
        COMPARE_NEAR(2 * at20.precision * at20.recall / (at20.precision + at20.recall), 0.428571, 1e-6); // F1
        COMPARE_NEAR(at20.ap, 0.416288, 1e-6);      // AP dividing by all 8 relevant
        const UserRanking at10 = rankUser(list, relevant, 10);
        COMPARE_NEAR(at10.precision, 0.3, 1e-12);   // P@10 0.3
        COMPARE_NEAR(at10.recall, 0.375, 1e-12);    // R@10 0.375
        QCOMPARE(at10.hits, 3);
    }

    // Two queries (from memory; reproduces the published 0.83 / 0.45 / 0.64), Manning et al.
    // ch. 8: AP divides by |R| here, which equals min(k, |R|) for k = 10.
    void manningTwoQueriesMap()
    {
        const UserRanking q1 = rankUser(fromPattern("RRNRNNR"), std::vector<double>(4, 1.0), 10);
        const UserRanking q2 = rankUser(fromPattern("RNRNR"), std::vector<double>(5, 1.0), 10);
        COMPARE_NEAR(q1.ap, 0.830357, 1e-6);
        COMPARE_NEAR(q2.ap, 0.453333, 1e-6);
        COMPARE_NEAR((q1.ap + q2.ap) / 2, 0.641845, 1e-6);
    }

    // Our convention: with k < |R| the AP divisor is k, not |R| (evaluation issue).
    void apDividesByMinOfKAndRelevant()
    {
        const UserRanking r = rankUser(fromPattern("RRN"), std::vector<double>(5, 1.0), 3);
        COMPARE_NEAR(r.ap, 2.0 / 3.0, 1e-15); // (1 + 1) / min(3, 5)
        COMPARE_NEAR(r.ndcg, (1.0 + 1.0 / std::log2(3.0)) / (1.0 + 1.0 / std::log2(3.0) + 0.5), 1e-15);
    }

    // Encyclopedia article "Mean reciprocal rank": first correct answers at ranks 3, 2, 1
    // give MRR 11/18.
    void reciprocalRankExample()
    {
        const std::vector<double> one{1.0};
        const double mrr = (rankUser(fromPattern("NNR"), one, 10).rr + rankUser(fromPattern("NR"), one, 10).rr
                            + rankUser(fromPattern("R"), one, 10).rr)
                           / 3.0;
        COMPARE_NEAR(mrr, 11.0 / 18.0, 1e-15);
        QCOMPARE(rankUser(fromPattern("NNNN"), one, 3).rr, 0.0);
    }

    // Encyclopedia article "Discounted cumulative gain", worked example (from memory):
    // relevances [3, 2, 3, 0, 1, 2], linear gain: DCG6 6.861127, IDCG6 7.140995, NDCG 0.960808;
    // with two more judged unretrieved items (3 and 2) in the ideal pool, NDCG 0.785002.
    void encyclopediaDcgExample()
    {
        const std::vector<double> grades{3, 2, 3, 0, 1, 2};
        const UserRanking r = rankUser(fromGrades(grades), descending(grades), 6);
        COMPARE_NEAR(r.ndcgGraded, 0.960808, 1e-6);
        COMPARE_NEAR(r.ndcgGraded * 7.140995, 6.861127, 1e-5);
        std::vector<double> pool = grades;
        pool.push_back(3);
        pool.push_back(2);
        const UserRanking wider = rankUser(fromGrades(grades), descending(pool), 6);
        COMPARE_NEAR(wider.ndcgGraded, 0.785002, 1e-6);
    }

    // scikit-learn 1.2 `ndcg_score` / `dcg_score` docstrings: true relevance [10, 0, 0, 1, 5],
    // linear gain, ideal list from the row, no tied scores. The ranked order follows the scores.
    void sklearnDocstringNdcg_data()
    {
        QTest::addColumn<std::vector<double>>("scores");
        QTest::addColumn<int>("k");
        QTest::addColumn<double>("expected");
        QTest::newRow("scores .1 .2 .3 4 70") << std::vector<double>{.1, .2, .3, 4, 70} << 5 << 0.695694;
        QTest::newRow("scores .05 1.1 1 .5 0") << std::vector<double>{.05, 1.1, 1, .5, 0} << 5 << 0.493680;
        QTest::newRow("scores .05 1.1 1 .5 0, k=4") << std::vector<double>{.05, 1.1, 1, .5, 0} << 4 << 0.352024;
    }
    void sklearnDocstringNdcg()
    {
        QFETCH(std::vector<double>, scores);
        QFETCH(int, k);
        QFETCH(double, expected);
        const std::vector<double> truth{10, 0, 0, 1, 5};
        std::vector<std::size_t> order{0, 1, 2, 3, 4};
        std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return scores[a] > scores[b]; });
        std::vector<double> ranked;
        for (std::size_t i : order)
            ranked.push_back(truth[i]);
        COMPARE_NEAR(rankUser(fromGrades(ranked), descending(truth), k).ndcgGraded, expected, 1e-6);
    }

    // Same docstring: DCG 9.499458 and, at k = 2, 5.630930 (IDCG here is 10 + 5/log2 3 + 1/2).
    void sklearnDocstringDcg()
    {
        const std::vector<double> ranked{5, 1, 0, 0, 10};
        const double idcg = 10 + 5 / std::log2(3.0) + 1 / std::log2(4.0);
        COMPARE_NEAR(rankUser(fromGrades(ranked), descending(ranked), 5).ndcgGraded * idcg, 9.499458, 1e-6);
        const double idcg2 = 10 + 5 / std::log2(3.0);
        COMPARE_NEAR(rankUser(fromGrades(ranked), descending(ranked), 2).ndcgGraded * idcg2, 5.630930, 1e-6);
    }

    void shortListDividesPrecisionByK()
    {
        const UserRanking r = rankUser(fromPattern("RN"), std::vector<double>(3, 1.0), 10);
        COMPARE_NEAR(r.precision, 0.1, 1e-15);
        COMPARE_NEAR(r.recall, 1.0 / 3.0, 1e-15);
        COMPARE_NEAR(r.ap, 1.0 / 3.0, 1e-15); // one hit at 1, divided by min(10, 3)
    }

    void emptyListScoresZero()
    {
        const UserRanking r = rankUser({}, std::vector<double>{5.0, 4.0}, 10);
        QCOMPARE(r.hits, 0);
        QCOMPARE(r.precision, 0.0);
        QCOMPARE(r.recall, 0.0);
        QCOMPARE(r.ap, 0.0);
        QCOMPARE(r.rr, 0.0);
        QCOMPARE(r.ndcg, 0.0);
        QCOMPARE(r.ndcgGraded, 0.0);
    }

    void perfectListScoresOne()
    {
        const UserRanking r = rankUser(fromGrades({5, 4, 4}), std::vector<double>{5, 4, 4}, 3);
        QCOMPARE(r.precision, 1.0);
        QCOMPARE(r.recall, 1.0);
        QCOMPARE(r.ap, 1.0);
        QCOMPARE(r.ndcg, 1.0);
        QCOMPARE(r.ndcgGraded, 1.0);
    }

    // The curve at each k must agree with rankUser at that k.
    void curvesAgreeWithPointMetrics()
    {
        const auto list = fromPattern("NRNNRRNNNR");
        const std::vector<double> relevant(6, 1.0);
        RankingCurves curves(12);
        curves.add(list, relevant.size());
        curves.add({}, 2); // a user without a list counts with zeros
        const Curves c = curves.result();
        QCOMPARE(c.k.size(), std::size_t{12});
        for (int k = 1; k <= 12; ++k) {
            const UserRanking r = rankUser(list, relevant, k);
            COMPARE_NEAR(c.precision[static_cast<std::size_t>(k - 1)], r.precision / 2, 1e-15);
            COMPARE_NEAR(c.recall[static_cast<std::size_t>(k - 1)], r.recall / 2, 1e-15);
            COMPARE_NEAR(c.ndcg[static_cast<std::size_t>(k - 1)], r.ndcg / 2, 1e-15);
        }
    }

    // scikit-learn 1.2 docstrings of mean_squared_error / mean_absolute_error:
    // y = [3, -0.5, 2, 7], y_hat = [2.5, 0, 2, 8]: MSE 0.375, RMSE 0.612372, MAE 0.5.
    void accuracyDocstringExample()
    {
        AccuracyAccumulator acc;
        const double y[] = {3, -0.5, 2, 7};
        const double yHat[] = {2.5, 0, 2, 8};
        for (int i = 0; i < 4; ++i)
            acc.add(yHat[i], y[i]);
        COMPARE_NEAR(acc.rmse() * acc.rmse(), 0.375, 1e-15);
        COMPARE_NEAR(acc.rmse(), 0.612372, 1e-6);
        COMPARE_NEAR(acc.mae(), 0.5, 1e-15);
        COMPARE_NEAR(acc.meanError(), 0.25, 1e-15); // (−0.5 + 0.5 + 0 + 1) / 4, positive = over-prediction
        QVERIFY(std::isnan(AccuracyAccumulator().rmse()));
    }

    void bandsSplitByRating()
    {
        RatingBands bands;
        bands.add(4.5, 5);
        bands.add(3.5, 5);
        bands.add(2, 1);
        const auto b = bands.result();
        QCOMPARE(b.size(), std::size_t{2});
        QCOMPARE(b[0].rating, 1.0);
        QCOMPARE(b[0].n, std::int64_t{1});
        COMPARE_NEAR(b[0].meanError, 1.0, 1e-15);
        QCOMPARE(b[1].rating, 5.0);
        COMPARE_NEAR(b[1].rmse, std::sqrt((0.25 + 2.25) / 2), 1e-15);
        COMPARE_NEAR(b[1].mae, 1.0, 1e-15);
        COMPARE_NEAR(b[1].meanError, -1.0, 1e-15);
    }

    // Held-out top-k agreement, by its definition in the evaluation issue.
    void heldoutTopkDefinition()
    {
        using S = ScoredRating;
        // k = 2: the two highest scores are items 3 (rating 2) and 1 (rating 5); t = 2nd
        // highest rating = 4; agreement = 1/2.
        std::vector<S> a{{ItemIndex(1), 0.9, 5}, {ItemIndex(2), 0.1, 4}, {ItemIndex(3), 0.95, 2}, {ItemIndex(4), 0.2, 1}};
        COMPARE_NEAR(heldoutTopk(a, 2), 0.5, 1e-15);
        // Score ties broken by item index ascending: items 2 and 7 tie at 0.5, so with k = 1
        // P = {2} (rating 1) while t = 5: agreement 0.
        std::vector<S> b{{ItemIndex(7), 0.5, 5}, {ItemIndex(2), 0.5, 1}};
        COMPARE_NEAR(heldoutTopk(b, 1), 0.0, 1e-15);
        // Rating ties: t = 4 and both chosen items reach it.
        std::vector<S> c{{ItemIndex(1), 3, 4}, {ItemIndex(2), 2, 4}, {ItemIndex(3), 1, 4}};
        COMPARE_NEAR(heldoutTopk(c, 2), 1.0, 1e-15);
        // Fewer scored items than k: K = |S_u|, so everything agrees.
        std::vector<S> d{{ItemIndex(1), 1, 2}, {ItemIndex(2), 2, 5}};
        COMPARE_NEAR(heldoutTopk(d, 10), 1.0, 1e-15);
        std::vector<S> none;
        QVERIFY(std::isnan(heldoutTopk(none, 10)));
    }
};

QTEST_GUILESS_MAIN(TestRankingMetrics)
#include "tst_rankingmetrics.moc"

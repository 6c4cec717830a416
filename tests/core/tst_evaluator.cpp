// SPDX-License-Identifier: MIT
// evaluateRun on hand-built data whose every number is worked out in the comments from the
// definitions in the evaluation issue (docs/metrics.md, "Accuracy and ranking").
#include "core/evaluator.h"
#include "tests/core/evalfixture.h"

#include <QTest>

#include <atomic>
#include <cmath>

using namespace slatewise::core;
using slatewise::test::EvalUser;
using slatewise::test::kNoScore;
using slatewise::test::makeCase;

namespace {

const double kLog3 = std::log2(3.0);

/// u0: four withheld, one score missing, a list with one hit at rank 2.
/// u1: nothing relevant, no list. u2: one relevant item, no score, found at rank 1.
/// u3: no withheld items (not a row). u4: one relevant item, no list.
std::vector<EvalUser> handUsers()
{
    return {
        {{{0, 5}, {1, 4}, {2, 2}, {3, 1}}, {4.5f, 3.0f, 2.5f, kNoScore}, {2, 0, 5, 1}, 3},
        {{{4, 3}, {5, 2}}, {3.0f, 3.0f}, {}, 7},
        {{{6, 4}}, {kNoScore}, {6}, 1},
        {{}, {}, {1}, 2},
        {{{7, 5}}, {5.0f}, {}, 0},
    };
}

EvalSettings settingsK2()
{
    EvalSettings s;
    s.k = 2;
    s.relevantAt = 4.0;
    s.bootstrap = 200;
    s.curveMaxK = 5;
    return s;
}

RunEvaluation evaluate(const slatewise::test::EvalCase& c, const EvalSettings& s)
{
    const DatasetStats stats = computeStats(c.data);
    auto result = evaluateRun(c.data, stats, c.run, s);
    if (!result.ok())
        qFatal("evaluateRun failed: %s", result.error().toString().c_str());
    return std::move(result).value();
}

} // namespace

class TestEvaluator : public QObject {
    Q_OBJECT
private slots:
    void perUserRowsAndValues()
    {
        const auto c = makeCase(10, handUsers());
        const RunEvaluation e = evaluate(c, settingsK2());
        const UserResultTable& t = e.users;
        QCOMPARE(t.size(), std::size_t{4}); // u3 has no withheld item
        QCOMPARE(t.users[3], UserIndex(4));
        QCOMPARE(t.nWithheld[0], 4);
        QCOMPARE(t.nRelevant[0], 2);
        QCOMPARE(t.nTrain[1], 7);
        QCOMPARE(t.nRelevant[1], 0);
        // u0: errors −0.5, −1, +0.5 on the scored pairs.
        COMPARE_NEAR(t.value(Metric::Rmse, 0), std::sqrt(0.5), 1e-15);
        COMPARE_NEAR(t.value(Metric::Mae, 0), 2.0 / 3.0, 1e-15);
        COMPARE_NEAR(t.value(Metric::MeanError, 0), -1.0 / 3.0, 1e-15);
        // k = 2, L = [2, 0]: one hit (rating 5) at rank 2; |R| = 2.
        COMPARE_NEAR(t.value(Metric::Precision, 0), 0.5, 1e-15);
        COMPARE_NEAR(t.value(Metric::Recall, 0), 0.5, 1e-15);
        COMPARE_NEAR(t.value(Metric::Ap, 0), 0.25, 1e-15);
        COMPARE_NEAR(t.value(Metric::Rr, 0), 0.5, 1e-15);
        COMPARE_NEAR(t.value(Metric::Ndcg, 0), (1 / kLog3) / (1 + 1 / kLog3), 1e-15);
        COMPARE_NEAR(t.value(Metric::NdcgGraded, 0), (5 / kLog3) / (5 + 4 / kLog3), 1e-15);
        // Held-out top-2: highest scores are items 0 (5) and 1 (4); t = 4; both agree.
        COMPARE_NEAR(t.value(Metric::HeldoutTopk, 0), 1.0, 1e-15);
        // u1: no relevant item → ranking undefined, accuracy defined.
        QVERIFY(std::isnan(t.value(Metric::Precision, 1)));
        QVERIFY(std::isnan(t.value(Metric::Ndcg, 1)));
        COMPARE_NEAR(t.value(Metric::MeanError, 1), 0.5, 1e-15);
        // u2: no score → accuracy and held-out undefined; found at rank 1 of a 1-item list:
        // precision divides by k = 2 although the list is shorter.
        QVERIFY(std::isnan(t.value(Metric::Rmse, 2)));
        QVERIFY(std::isnan(t.value(Metric::HeldoutTopk, 2)));
        COMPARE_NEAR(t.value(Metric::Precision, 2), 0.5, 1e-15);
        COMPARE_NEAR(t.value(Metric::Ap, 2), 1.0, 1e-15);
        COMPARE_NEAR(t.value(Metric::Ndcg, 2), 1.0, 1e-15);
        // u4: relevant but no list → zeros.
        QCOMPARE(t.value(Metric::Precision, 3), 0.0);
        QCOMPARE(t.value(Metric::NdcgGraded, 3), 0.0);
    }

    void aggregates()
    {
        const auto c = makeCase(10, handUsers());
        const RunEvaluation e = evaluate(c, settingsK2());
        QVERIFY(e.accuracy.has_value());
        const AccuracySummary& a = *e.accuracy;
        QCOMPARE(a.n, std::int64_t{6});
        QCOMPARE(a.missingScores, std::int64_t{2});
        COMPARE_NEAR(a.scoredFraction, 6.0 / 8.0, 1e-15);
        // Squared errors 0.25 + 1 + 0.25 (u0), 0 + 1 (u1), 0 (u4).
        COMPARE_NEAR(a.rmse, std::sqrt(2.5 / 6), 1e-15);
        COMPARE_NEAR(a.mae, 3.0 / 6, 1e-15);
        COMPARE_NEAR(a.meanError, 0.0, 1e-15);
        COMPARE_NEAR(a.userRmseMean, (2 * std::sqrt(0.5) + 0) / 3, 1e-15);
        COMPARE_NEAR(a.heldoutTopk, 1.0, 1e-15);
        // Bands: ratings 2 (errors +0.5, +1), 3 (0), 4 (−1), 5 (−0.5, 0); rating 1 had no score.
        QCOMPARE(a.bands.size(), std::size_t{4});
        QCOMPARE(a.bands[0].rating, 2.0);
        QCOMPARE(a.bands[0].n, std::int64_t{2});
        COMPARE_NEAR(a.bands[0].rmse, std::sqrt(1.25 / 2), 1e-15);
        COMPARE_NEAR(a.bands[0].meanError, 0.75, 1e-15);
        QCOMPARE(a.bands[3].rating, 5.0);
        COMPARE_NEAR(a.bands[3].mae, 0.25, 1e-15);

        QVERIFY(e.ranking.has_value());
        const RankingSummary& r = *e.ranking;
        QCOMPARE(r.users, std::int64_t{3});            // u0, u2, u4
        QCOMPARE(r.usersWithoutList, std::int64_t{1}); // u4 (u1 has no list but nothing relevant)
        COMPARE_NEAR(r.precision, (0.5 + 0.5 + 0) / 3, 1e-15);
        COMPARE_NEAR(r.recall, (0.5 + 1 + 0) / 3, 1e-15);
        COMPARE_NEAR(r.hitRate, 2.0 / 3, 1e-15);
        COMPARE_NEAR(r.mrr, (0.5 + 1 + 0) / 3, 1e-15);
        COMPARE_NEAR(r.map, (0.25 + 1 + 0) / 3, 1e-15);
        COMPARE_NEAR(r.ndcg, ((1 / kLog3) / (1 + 1 / kLog3) + 1) / 3, 1e-15);
        COMPARE_NEAR(r.heldoutTopk, 1.0, 1e-15);
        // Curves at k = settings.k equal the point values.
        QCOMPARE(r.curves.k.size(), std::size_t{5});
        COMPARE_NEAR(r.curves.precision[1], r.precision, 1e-15);
        COMPARE_NEAR(r.curves.recall[1], r.recall, 1e-15);
        COMPARE_NEAR(r.curves.ndcg[1], r.ndcg, 1e-15);
        // At k = 1 only u2 hits: precision 1/3; u0's recall at k = 3 stays 1/2 (item 5 is not withheld).
        COMPARE_NEAR(r.curves.precision[0], 1.0 / 3, 1e-15);
    }

    void intervalsAreReproducibleAndBracketTheEstimate()
    {
        // Forty users, varied, so the intervals have some width.
        std::vector<EvalUser> users;
        for (std::uint32_t u = 0; u < 40; ++u) {
            EvalUser user;
            for (std::uint32_t i = 0; i < 5; ++i) {
                const std::uint32_t item = (u * 3 + i * 7) % 30;
                if (std::any_of(user.withheld.begin(), user.withheld.end(), [&](auto& w) { return w.first == item; }))
                    continue;
                user.withheld.push_back({item, static_cast<float>(1 + (u + i) % 5)});
                user.scores.push_back(static_cast<float>(1 + ((u * 7 + i * 3) % 9) * 0.5));
            }
            for (std::uint32_t j = 0; j < 10; ++j)
                user.list.push_back((u + j * 5) % 30);
            users.push_back(user);
        }
        const auto c = makeCase(30, users);
        EvalSettings s;
        s.bootstrap = 500;
        const RunEvaluation a = evaluate(c, s);
        const RunEvaluation b = evaluate(c, s);
        for (const char* key : {"rmse", "mae", "mean_error", "scored_fraction", "user_rmse_mean", "heldout_topk",
                                "precision", "recall", "hit_rate", "mrr", "map", "ndcg", "ndcg_graded"}) {
            QVERIFY2(a.ci.count(key), key);
            QCOMPARE(a.ci.at(key).low, b.ci.at(key).low);
            QCOMPARE(a.ci.at(key).high, b.ci.at(key).high);
        }
        QVERIFY(a.ci.at("rmse").low <= a.accuracy->rmse && a.accuracy->rmse <= a.ci.at("rmse").high);
        QVERIFY(a.ci.at("ndcg").low <= a.ranking->ndcg && a.ranking->ndcg <= a.ci.at("ndcg").high);
        QVERIFY(a.ci.at("mae").low < a.ci.at("mae").high);
        s.seed += 1;
        const RunEvaluation other = evaluate(c, s);
        QVERIFY(other.ci.at("rmse").low != a.ci.at("rmse").low || other.ci.at("rmse").high != a.ci.at("rmse").high);
    }

    void runWithoutScoresHasNoAccuracy()
    {
        const auto c = makeCase(10, handUsers(), false, true);
        const RunEvaluation e = evaluate(c, settingsK2());
        QVERIFY(!e.accuracy.has_value());
        QVERIFY(e.ranking.has_value());
        QVERIFY(std::isnan(e.ranking->heldoutTopk));
        QVERIFY(std::isnan(e.users.value(Metric::Rmse, 0)));
        QVERIFY(std::isnan(e.users.value(Metric::HeldoutTopk, 0)));
        QVERIFY(!e.ci.count("rmse"));
        QVERIFY(e.ci.count("ndcg"));
    }

    void runWithoutListsHasNoRanking()
    {
        const auto c = makeCase(10, handUsers(), true, false);
        const RunEvaluation e = evaluate(c, settingsK2());
        QVERIFY(e.accuracy.has_value());
        QVERIFY(!e.ranking.has_value());
        QVERIFY(std::isnan(e.users.value(Metric::Precision, 0)));
        COMPARE_NEAR(e.accuracy->heldoutTopk, 1.0, 1e-15);
        QVERIFY(!e.ci.count("ndcg"));
    }

    void oneUserWorkspace()
    {
        const auto c = makeCase(3, {{{{1, 4}}, {3.0f}, {1}, 1}});
        const RunEvaluation e = evaluate(c, settingsK2());
        QCOMPARE(e.users.size(), std::size_t{1});
        COMPARE_NEAR(e.accuracy->rmse, 1.0, 1e-15);
        COMPARE_NEAR(e.ranking->precision, 0.5, 1e-15);
        // With one user every resample is that user: a zero-width interval.
        QCOMPARE(e.ci.at("rmse").low, 1.0);
        QCOMPARE(e.ci.at("rmse").high, 1.0);
    }

    void ratingAtThresholdIsRelevantAndRepeatsCountOnce()
    {
        // Rating 4.0 with relevant_at 4.0 is relevant (>=). Item 1 appears twice in the list.
        const auto c = makeCase(5, {{{{1, 4}, {2, 3.5f}}, {4.0f, 3.5f}, {1, 1, 2}, 1}});
        EvalSettings s = settingsK2();
        s.k = 3;
        const RunEvaluation e = evaluate(c, s);
        QCOMPARE(e.users.nRelevant[0], 1);
        COMPARE_NEAR(e.users.value(Metric::Recall, 0), 1.0, 1e-15);
        COMPARE_NEAR(e.users.value(Metric::Precision, 0), 1.0 / 3, 1e-15);
    }

    void allScoresMissing()
    {
        const auto c = makeCase(5, {{{{1, 4}, {2, 2}}, {kNoScore, kNoScore}, {1}, 1}});
        const RunEvaluation e = evaluate(c, settingsK2());
        QVERIFY(e.accuracy.has_value());
        QCOMPARE(e.accuracy->n, std::int64_t{0});
        QCOMPARE(e.accuracy->missingScores, std::int64_t{2});
        QCOMPARE(e.accuracy->scoredFraction, 0.0);
        QVERIFY(std::isnan(e.accuracy->rmse));
        QVERIFY(std::isnan(e.accuracy->userRmseMean));
        QVERIFY(e.accuracy->bands.empty());
    }

    void cancelledBeforeStart()
    {
        const auto c = makeCase(10, handUsers());
        std::atomic<bool> cancel{true};
        Progress p;
        p.cancel = &cancel;
        const auto result = evaluateRun(c.data, computeStats(c.data), c.run, settingsK2(), p);
        QVERIFY(!result.ok());
        QCOMPARE(result.error().kind, ErrorKind::Cancelled);
    }

    void badSettingsAreRefused()
    {
        const auto c = makeCase(10, handUsers());
        EvalSettings s;
        s.k = 0;
        const auto result = evaluateRun(c.data, computeStats(c.data), c.run, s);
        QVERIFY(!result.ok());
        QCOMPARE(result.error().kind, ErrorKind::Usage);
    }
};

QTEST_GUILESS_MAIN(TestEvaluator)
#include "tst_evaluator.moc"

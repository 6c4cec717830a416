// SPDX-License-Identifier: MIT
// Stored evaluations read back exactly; the JSON and CSV forms follow the contract of the
// evaluation issue (keys, null sections, empty cells).
#include "core/evaluationjson.h"
#include "core/evaluationstore.h"
#include "core/evaluator.h"
#include "core/schema.h"
#include "core/sqlitedb.h"
#include "tests/core/evalfixture.h"

#include <QTemporaryDir>
#include <QTest>

#include <cmath>
#include <cstring>
#include <sstream>

using namespace slatewise::core;
using slatewise::test::EvalUser;
using slatewise::test::kNoScore;
using slatewise::test::makeCase;

namespace {

std::vector<EvalUser> users()
{
    return {
        {{{0, 5}, {1, 4}, {2, 2}, {3, 1}}, {4.5f, 3.0f, 2.5f, kNoScore}, {2, 0, 5, 1}, 3},
        {{{4, 3}, {5, 2}}, {3.0f, 3.0f}, {}, 7},
        {{{6, 4}}, {kNoScore}, {6}, 1},
        {{}, {}, {1}, 2},
        {{{7, 5}}, {5.0f}, {}, 0},
    };
}

/// A fresh workspace-shaped database holding the users, items and one run of `c`.
SqliteDb makeDb(const QString& path, const slatewise::test::EvalCase& c)
{
    SqliteDb db = SqliteDb::open(path.toStdString(), true);
    db.exec(schemaVersion1());
    for (auto step : migrations())
        db.exec(step);
    Statement u(db, "INSERT INTO users(user_id, external_id) VALUES (?, ?)");
    for (std::size_t i = 0; i < c.data.userIds.size(); ++i) {
        u.reset();
        u.bind(1, static_cast<std::int64_t>(i)).bind(2, c.data.userIds[i]).run();
    }
    db.exec("INSERT INTO runs(run_id, name, created_at) VALUES (1, 'run', '2026-12-02T00:00:00Z')");
    return db;
}

bool sameDouble(double a, double b) { return (std::isnan(a) && std::isnan(b)) || std::memcmp(&a, &b, sizeof a) == 0; }

} // namespace

class TestEvaluationStore : public QObject {
    Q_OBJECT
private slots:
    void roundTripIsExact()
    {
        QTemporaryDir dir;
        const auto c = makeCase(10, users());
        SqliteDb db = makeDb(dir.filePath(QStringLiteral("ws.sqlite")), c);
        EvalSettings s;
        s.k = 2;
        s.bootstrap = 100;
        auto evaluated = evaluateRun(c.data, computeStats(c.data), c.run, s);
        QVERIFY(evaluated.ok());
        RunEvaluation e = evaluated.value();
        // A warning with every field set, so the round trip covers them whatever beyond raises.
        e.warnings.push_back({UserIndex(4), WarningCode::NoList, Severity::Severe, 1.0, 0.5, "No list for \"u4\", sorry"});
        std::stable_sort(e.warnings.begin(), e.warnings.end(), [](const UserWarning& a, const UserWarning& b) {
            return a.user != b.user ? a.user < b.user : warningInfo(a.code).key < warningInfo(b.code).key;
        });

        auto id = EvaluationStore::store(db, e);
        QVERIFY2(id.ok(), id.ok() ? "" : id.error().toString().c_str());
        auto again = EvaluationStore::store(db, e); // replaces, does not duplicate
        QVERIFY(again.ok());
        auto listed = EvaluationStore::list(db, 1);
        QVERIFY(listed.ok());
        QCOMPARE(listed->size(), std::size_t{1});

        auto loaded = EvaluationStore::load(db, 1, s);
        QVERIFY(loaded.ok());
        QVERIFY(loaded->has_value());
        const RunEvaluation& l = **loaded;
        QCOMPARE(l.runName, e.runName);
        QCOMPARE(l.computedAt, e.computedAt);
        QCOMPARE(l.settings.toJson(), e.settings.toJson());
        // The summary round trip is exact when its JSON is identical.
        QCOMPARE(EvaluationJson::runSummary(l).dump(), EvaluationJson::runSummary(e).dump());
        QVERIFY(l.accuracy.has_value() && l.ranking.has_value());
        QVERIFY(sameDouble(l.accuracy->rmse, e.accuracy->rmse));
        QCOMPARE(l.ci.size(), e.ci.size());
        QCOMPARE(l.users.size(), e.users.size());
        for (std::size_t r = 0; r < e.users.size(); ++r) {
            QCOMPARE(l.users.users[r], e.users.users[r]);
            QCOMPARE(l.users.nWithheld[r], e.users.nWithheld[r]);
            QCOMPARE(l.users.nRelevant[r], e.users.nRelevant[r]);
            QCOMPARE(l.users.nTrain[r], e.users.nTrain[r]);
            QCOMPARE(l.users.warningCount[r], e.users.warningCount[r]);
            for (std::size_t m = 0; m < kMetricCount; ++m)
                QVERIFY2(sameDouble(l.users.metrics[m][r], e.users.metrics[m][r]),
                         qPrintable(QStringLiteral("row %1 metric %2").arg(r).arg(m)));
        }
        QCOMPARE(l.warnings.size(), e.warnings.size());
        for (std::size_t i = 0; i < e.warnings.size(); ++i) {
            QCOMPARE(l.warnings[i].user, e.warnings[i].user);
            QCOMPARE(l.warnings[i].code, e.warnings[i].code);
            QCOMPARE(static_cast<int>(l.warnings[i].severity), static_cast<int>(e.warnings[i].severity));
            QVERIFY(sameDouble(l.warnings[i].value, e.warnings[i].value));
            QVERIFY(sameDouble(l.warnings[i].threshold, e.warnings[i].threshold));
            QCOMPARE(l.warnings[i].message, e.warnings[i].message);
        }

        // Other settings: nothing stored.
        EvalSettings other = s;
        other.k = 3;
        auto none = EvaluationStore::load(db, 1, other);
        QVERIFY(none.ok());
        QVERIFY(!none->has_value());
        // Deleting the run takes its evaluations with it.
        db.exec("DELETE FROM runs WHERE run_id = 1");
        auto gone = EvaluationStore::load(db, 1, s);
        QVERIFY(gone.ok() && !gone->has_value());
        Statement q(db, "SELECT count(*) FROM user_results");
        QVERIFY(q.step());
        QCOMPARE(q.int64(0), std::int64_t{0});
    }

    void jsonSectionsAndKeys()
    {
        const auto scoresOnly = makeCase(10, users(), true, false);
        EvalSettings s;
        s.bootstrap = 50;
        auto e = evaluateRun(scoresOnly.data, computeStats(scoresOnly.data), scoresOnly.run, s);
        QVERIFY(e.ok());
        const auto doc = EvaluationJson::document({e.value()}, s);
        QCOMPARE(doc["settings"]["k"].get<int>(), 10);
        QCOMPARE(doc["settings"]["relevant_at"].get<double>(), 4.0);
        QCOMPARE(doc["settings"]["bootstrap"].get<int>(), 50);
        const auto& run = doc["runs"][0];
        QVERIFY(run["ranking"].is_null());
        QVERIFY(run["beyond"].is_null());
        QVERIFY(run["accuracy"].is_object());
        for (const char* key : {"n", "missing_scores", "scored_fraction", "rmse", "mae", "mean_error", "user_rmse_mean",
                                "bands"})
            QVERIFY2(run["accuracy"].contains(key), key);
        QCOMPARE(run["ci"]["rmse"].size(), std::size_t{2});

        const auto listsOnly = makeCase(10, users(), false, true);
        auto l = evaluateRun(listsOnly.data, computeStats(listsOnly.data), listsOnly.run, s);
        QVERIFY(l.ok());
        const auto lj = EvaluationJson::runSummary(l.value());
        QVERIFY(lj["accuracy"].is_null());
        for (const char* key : {"users", "users_without_list", "precision", "recall", "hit_rate", "mrr", "map", "ndcg",
                                "ndcg_graded", "heldout_topk", "curves"})
            QVERIFY2(lj["ranking"].contains(key), key);
        QVERIFY(lj["ranking"]["heldout_topk"].is_null()); // needs scores
        QCOMPARE(lj["ranking"]["curves"]["k"].size(), std::size_t{50});
    }

    void perUserCsv()
    {
        const auto c = makeCase(10, users());
        EvalSettings s;
        s.k = 2;
        s.bootstrap = 0;
        auto e = evaluateRun(c.data, computeStats(c.data), c.run, s);
        QVERIFY(e.ok());
        QVERIFY(e->ci.empty());
        std::ostringstream out;
        EvaluationJson::writePerUserCsv(out, {e.value()}, c.data.userIds);
        std::istringstream in(out.str());
        std::string header, first, second;
        std::getline(in, header);
        std::getline(in, first);
        std::getline(in, second);
        QCOMPARE(header, std::string("run,user_id,n_withheld,n_relevant,rmse,mae,mean_error,precision,recall,ap,rr,"
                                     "ndcg,ndcg_graded,heldout_topk,ild,novelty,popularity_lift,calibration_kl,"
                                     "series_share,order_violations,burst_echo,seen_in_list"));
        // u0: rmse sqrt(0.5) written with full precision; precision 0.5, ap 0.25.
        QVERIFY2(first.rfind("run,u0,4,2,0.7071067811865476,", 0) == 0, first.c_str());
        // u1: no relevant item → empty ranking cells.
        QVERIFY2(second.rfind("run,u1,2,0,0.7071067811865476,0.5,0.5,,,,,,,1,", 0) == 0, second.c_str());
        std::size_t rows = 0;
        for (std::string line; std::getline(in, line);)
            ++rows;
        QCOMPARE(rows, std::size_t{2}); // u2 and u4; u3 has no withheld item
    }
};

QTEST_GUILESS_MAIN(TestEvaluationStore)
#include "tst_evaluationstore.moc"

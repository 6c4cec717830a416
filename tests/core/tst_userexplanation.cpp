// SPDX-License-Identifier: MIT
// The data behind "explain one user": list markers, withheld rows with scores and ranks,
// metrics beside the run mean, warnings and history, on a hand-built case.
#include "core/beyond.h"
#include "core/beyondfixture.h"
#include "core/userexplanation.h"

#include <QTest>

#include <nlohmann/json.hpp>

#include <cmath>

using namespace slatewise::core;
using slatewise::test::BeyondFixture;

class TestUserExplanation : public QObject {
    Q_OBJECT
private slots:
    void initTestCase()
    {
        f.item("Harbour Lights", {"Drama"}, "Harbour Lights", 1);
        f.item("Harbour Lights 2", {"Drama"}, "Harbour Lights", 2);
        f.item("Harbour Lights 3", {"Drama"}, "Harbour Lights", 3);
        f.item("Quiet Orchard", {"Comedy"});
        f.item("Paper Kites", {"Comedy", "Drama"});
        f.item("Dust Road", {"Western"});
        f.item("Song of Tin", {"Musical"});
        // Member m1: has seen «Quiet Orchard»; the list (k = 3 below) is
        // HL3, Quiet Orchard, Paper Kites | Dust Road (rank 4, outside the top 3).
        f.user("m1",
               {{"Quiet Orchard", 4, 30}, {"Song of Tin", 3, 10}, {"Harbour Lights", 2, 20}},
               {{"Paper Kites", 5}, {"Dust Road", 4}, {"Harbour Lights 2", 2}},
               {"Harbour Lights 3", "Quiet Orchard", "Paper Kites", "Dust Road"});
        f.user("m2", BeyondFixture::watched({"Song of Tin", "Dust Road", "Quiet Orchard", "Paper Kites", "Harbour Lights"}),
               {{"Harbour Lights 2", 5}}, {"Harbour Lights 2", "Harbour Lights 3"});
        f.finish();
        // Scores for m1's withheld rows (sorted by item: HL2, Paper Kites, Dust Road); the
        // Dust Road score is missing.
        f.run.scores = {2.5f, 4.5f, std::nanf(""), 4.9f};
        settings.k = 3;
        stats = computeStats(f.data);
        eval = f.evaluationShell(settings);
        // Stand-ins for the evaluator's columns, so the run mean is known: ndcg 0.2 and 0.6.
        eval.users.column(Metric::Ndcg) = {0.2, 0.6};
        computeBeyond(f.data, stats, f.run, settings, eval);
    }

    void listRowsCarryTheirMarkers()
    {
        const auto x = UserExplanation::build(f.data, stats, f.run, eval, UserIndex(0));
        QCOMPARE(x.userId, std::string("m1"));
        QCOMPARE(x.k, 3);
        QCOMPARE(x.fullListLength, 4);
        QCOMPARE(x.list.size(), std::size_t{3});
        const auto& first = x.list[0];
        QCOMPARE(first.rank, 1);
        QCOMPARE(first.title, std::string("Harbour Lights 3"));
        QCOMPARE(first.series, std::string("Harbour Lights"));
        QCOMPARE(first.seriesPart, 3);
        QVERIFY(first.orderViolation); // part 1 seen, part 2 neither seen nor ranked above
        QCOMPARE(first.missingParts, std::vector<std::int32_t>{2});
        QCOMPARE(first.missingTitles, std::vector<std::string>{"Harbour Lights 2"});
        QVERIFY(!first.hit);
        QVERIFY(x.list[1].seen);
        QVERIFY(!x.list[1].withheld);
        QVERIFY(x.list[2].hit);
        QCOMPARE(x.list[2].withheldRating, 5.0);
        QCOMPARE(x.list[2].genres, (std::vector<std::string>{"Drama", "Comedy"}));
    }

    void withheldRowsAreBestRatedFirstWithScoreAndRank()
    {
        const auto x = UserExplanation::build(f.data, stats, f.run, eval, UserIndex(0));
        QCOMPARE(x.withheld.size(), std::size_t{3});
        QCOMPARE(x.withheld[0].title, std::string("Paper Kites"));
        QCOMPARE(x.withheld[0].score, 4.5);
        QCOMPARE(x.withheld[0].listRank, 3);
        QVERIFY(x.withheld[0].inTopK);
        QCOMPARE(x.withheld[1].title, std::string("Dust Road"));
        QVERIFY(std::isnan(x.withheld[1].score)); // the run gave no score
        QCOMPARE(x.withheld[1].listRank, 4);
        QVERIFY(!x.withheld[1].inTopK);           // listed, but below the top k
        QCOMPARE(x.withheld[2].title, std::string("Harbour Lights 2"));
        QCOMPARE(x.withheld[2].listRank, 0);      // not listed at all
        QVERIFY(!x.withheld[2].relevant);
    }

    void metricsWarningsAndHistory()
    {
        const auto x = UserExplanation::build(f.data, stats, f.run, eval, UserIndex(0));
        QVERIFY(x.evaluated);
        const auto& ndcg = x.metrics[static_cast<std::size_t>(Metric::Ndcg)];
        QCOMPARE(ndcg.user, 0.2);
        QCOMPARE(ndcg.runMean, 0.4);
        QCOMPARE(x.metrics[static_cast<std::size_t>(Metric::SeenInList)].user, 1.0);
        QStringList codes;
        for (const auto& w : x.warnings)
            codes << QString::fromUtf8(warningInfo(w.code).key.data());
        QCOMPARE(codes, (QStringList{"sequel-first", "seen-again", "cold"}));
        QCOMPARE(x.history.size(), std::size_t{3});
        QCOMPARE(x.history[0].title, std::string("Song of Tin")); // oldest first
        QCOMPARE(x.history[2].title, std::string("Quiet Orchard"));
    }

    void jsonCarriesTheSameFacts()
    {
        const auto x = UserExplanation::build(f.data, stats, f.run, eval, UserIndex(0));
        const auto j = nlohmann::json::parse(x.toJson());
        QCOMPARE(j["user_id"].get<std::string>(), std::string("m1"));
        QCOMPARE(j["list"].size(), std::size_t{3});
        QCOMPARE(j["list"][0]["missing_parts"][0].get<int>(), 2);
        QVERIFY(j["withheld"][1]["score"].is_null());
        QCOMPARE(j["withheld"][1]["list_rank"].get<int>(), 4);
        QCOMPARE(j["warnings"][0]["code"].get<std::string>(), std::string("sequel-first"));
        QCOMPARE(j["metrics"]["ndcg"]["run_mean"].get<double>(), 0.4);
    }

    void userWithoutWithheldItemsIsShownButNotEvaluated()
    {
        BeyondFixture g;
        g.item("A", {"Drama"});
        g.item("B", {"Drama"});
        g.user("only-list", BeyondFixture::watched({"A"}), {}, {"B"});
        g.finish();
        const auto s = computeStats(g.data);
        auto e = g.evaluationShell(settings);
        computeBeyond(g.data, s, g.run, settings, e);
        const auto x = UserExplanation::build(g.data, s, g.run, e, UserIndex(0));
        QVERIFY(!x.evaluated);
        QCOMPARE(x.list.size(), std::size_t{1});
        QVERIFY(x.warnings.empty());
        QVERIFY(std::isnan(x.metrics[0].user));
    }

private:
    BeyondFixture f;
    EvalSettings settings;
    DatasetStats stats;
    RunEvaluation eval;
};

QTEST_GUILESS_MAIN(TestUserExplanation)
#include "tst_userexplanation.moc"

// SPDX-License-Identifier: MIT
// The demo is how a new user meets Slatewise: the workspace `slatewise demo` builds must
// show what the scenario in demo-catalog/README.md promises — every warning somewhere,
// the accuracy/ranking trade-off between the runs, cold members, and the binge members
// echoed by the narrow run.
#include "core/demogenerator.h"
#include "core/evaluationservice.h"
#include "core/evaluationstore.h"
#include "core/warning.h"
#include "core/workspace.h"

#include "support/testsupport.h"

#include <QTemporaryDir>
#include <QTest>

#include <array>
#include <map>
#include <set>

using namespace slatewise::core;

class TestDemoWorkspace : public QObject {
    Q_OBJECT
private:
    QTemporaryDir m_dir;
    QString m_path;
    std::vector<RunEvaluation> m_evals;
    std::vector<std::string> m_userIds;

    const RunEvaluation* run(const std::string& name) const
    {
        for (const auto& e : m_evals)
            if (e.runName == name)
                return &e;
        return nullptr;
    }
    std::size_t membersWith(const RunEvaluation& e, WarningCode code) const
    {
        std::set<std::uint32_t> users;
        for (const auto& w : e.warnings)
            if (w.code == code)
                users.insert(w.user.value);
        return users.size();
    }

private slots:
    void initTestCase()
    {
        slatewise::test::failOnUnexpectedMessages();
        QVERIFY(m_dir.isValid());
        m_path = m_dir.filePath(QStringLiteral("lantern.sqlite"));
        const auto built = slatewise::test::runCli({QStringLiteral("demo"), m_path});
        QVERIFY2(built.exitCode == 0, qPrintable(built.err));
        qInfo("%s", qPrintable(built.out));
        QVERIFY(built.out.contains(QStringLiteral("tight-fit")));
        QVERIFY(built.out.contains(QStringLiteral("slatewise explain")));

        auto ws = Workspace::open(m_path.toStdString());
        QVERIFY(ws.ok());
        // Default settings: the demo stored exactly these, so they are loaded, not recomputed.
        auto evaluated = evaluateRuns(*ws, {}, EvalSettings{});
        QVERIFY(evaluated.ok());
        QCOMPARE(evaluated->evaluations.size(), std::size_t(3));
        for (std::size_t i = 0; i < evaluated->computed.size(); ++i)
            QVERIFY2(!evaluated->computed[i], evaluated->evaluations[i].runName.c_str());
        m_evals = evaluated->evaluations;
        auto ids = EvaluationStore::userIds(ws->db());
        QVERIFY(ids.ok());
        m_userIds = *ids;
    }

    void refusesToOverwriteWithoutReplace()
    {
        const auto again = slatewise::test::runCli({QStringLiteral("demo"), m_path, QStringLiteral("--quiet")});
        QCOMPARE(again.exitCode, 3);
        QVERIFY(again.err.contains(QStringLiteral("--replace")));
        const auto missing = slatewise::test::runCli(
            {QStringLiteral("demo"), m_dir.filePath(QStringLiteral("x.sqlite")), QStringLiteral("--from"),
             m_dir.filePath(QStringLiteral("nowhere"))});
        QCOMPARE(missing.exitCode, 1);
    }

    void everyWarningIsRaisedForTwentyMembersInSomeRun()
    {
        for (const auto& info : allWarnings()) {
            std::size_t best = 0;
            for (const auto& e : m_evals)
                best = std::max(best, membersWith(e, info.code));
            qInfo("%-14s most members in one run: %zu", std::string(info.key).c_str(), best);
            QVERIFY2(best >= 20, std::string(info.key).c_str());
        }
    }

    void accuracyBestIsNotRankingOrDiversityBest()
    {
        const RunEvaluation* rmseBest = nullptr;
        const RunEvaluation* ndcgBest = nullptr;
        const RunEvaluation* ildBest = nullptr;
        for (const auto& e : m_evals) {
            QVERIFY(e.accuracy && e.ranking && e.beyond);
            qInfo("%-14s rmse %.4f ndcg %.4f ild %.4f", e.runName.c_str(), e.accuracy->rmse, e.ranking->ndcg,
                  e.beyond->ild);
            if (!rmseBest || e.accuracy->rmse < rmseBest->accuracy->rmse)
                rmseBest = &e;
            if (!ndcgBest || e.ranking->ndcg > ndcgBest->ranking->ndcg)
                ndcgBest = &e;
            if (!ildBest || e.beyond->ild > ildBest->beyond->ild)
                ildBest = &e;
        }
        QCOMPARE(rmseBest->runName, std::string("tight-fit"));
        QCOMPARE(ndcgBest->runName, std::string("wide-angle"));
        QCOMPARE(ildBest->runName, std::string("wide-angle"));
        QVERIFY(rmseBest != ndcgBest);
    }

    void coldAndLateMembersAreThere()
    {
        const auto facts = DemoGenerator::generate().facts;
        const auto* wide = run("wide-angle");
        QVERIFY(wide);
        QVERIFY(membersWith(*wide, WarningCode::ColdUser) >= 20);
        // Exactly the late joiners have no list.
        std::set<std::string> noList;
        for (const auto& w : wide->warnings)
            if (w.code == WarningCode::NoList)
                noList.insert(m_userIds.at(w.user.value));
        QCOMPARE(noList, std::set<std::string>(facts.lateJoiners.begin(), facts.lateJoiners.end()));
    }

    void bingeMembersAreEchoedByTheNarrowRun()
    {
        const auto facts = DemoGenerator::generate().facts;
        QVERIFY(facts.bingeMembers.size() >= 100);
        const auto* tight = run("tight-fit");
        QVERIFY(tight);
        std::set<std::string> echoed;
        for (const auto& w : tight->warnings)
            if (w.code == WarningCode::BurstEcho)
                echoed.insert(m_userIds.at(w.user.value));
        for (const auto& id : facts.bingeMembers)
            QVERIFY2(echoed.count(id) == 1, id.c_str());
        // The balanced run rarely does it.
        QVERIFY(membersWith(*run("wide-angle"), WarningCode::BurstEcho) < facts.bingeMembers.size() / 10);
    }

    void runCharactersShowInTheirWarnings()
    {
        const auto* tight = run("tight-fit");
        const auto* crowd = run("crowd-pleaser");
        const auto* wide = run("wide-angle");
        QVERIFY(membersWith(*tight, WarningCode::SeriesOrder) > membersWith(*wide, WarningCode::SeriesOrder));
        QVERIFY(membersWith(*tight, WarningCode::OneSeries) >= 20);
        QVERIFY(membersWith(*crowd, WarningCode::AlreadySeen) >= 20);
        QCOMPARE(membersWith(*tight, WarningCode::AlreadySeen), std::size_t(0));
        QCOMPARE(membersWith(*wide, WarningCode::AlreadySeen), std::size_t(0));
        QVERIFY(membersWith(*crowd, WarningCode::PopularOnly) > membersWith(*wide, WarningCode::PopularOnly));
        QCOMPARE(membersWith(*wide, WarningCode::SeriesOrder), std::size_t(0));
    }
};

QTEST_GUILESS_MAIN(TestDemoWorkspace)
#include "tst_demoworkspace.moc"

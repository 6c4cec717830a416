// SPDX-License-Identifier: MIT
// The paired comparison of two evaluated runs on hand-built data whose answers are known:
// which users are compared, direction of better, Holm across metrics, segments, the
// who-got-worse list, JSON keys and the round trip through the workspace's comparisons table.
#include "core/comparisonstore.h"
#include "core/holmadjustment.h"
#include "core/pairedttest.h"
#include "core/runcomparison.h"
#include "core/schema.h"
#include "core/sqlitedb.h"
#include "core/wilcoxontest.h"

#include <QTest>

#include <nlohmann/json.hpp>

#include <atomic>
#include <cmath>
#include <random>

using namespace slatewise::core;

namespace {

constexpr std::size_t kUsers = 120;

/// 120 users; user u has (u % 40) train interactions, all on the film of genre (u % 3), and one
/// withheld item.
Dataset makeDataset()
{
    Dataset d;
    d.genreNames = {"Comedy", "Drama", "Western"};
    for (std::uint32_t i = 0; i < 3; ++i) {
        Item it;
        it.externalId = "film" + std::to_string(i);
        it.title = "Film " + std::to_string(i);
        it.genres = {static_cast<std::int32_t>(i)};
        d.items.push_back(it);
    }
    d.train.offsets.push_back(0);
    d.withheld.offsets.push_back(0);
    for (std::uint32_t u = 0; u < kUsers; ++u) {
        d.userIds.push_back("user" + std::to_string(u));
        for (std::uint32_t k = 0; k < u % 40; ++k)
            d.train.rows.push_back({ItemIndex(u % 3), 4.0f, kNoTimestamp});
        d.train.offsets.push_back(static_cast<std::uint32_t>(d.train.rows.size()));
        d.withheld.rows.push_back({ItemIndex(0), 3.0f, kNoTimestamp});
        d.withheld.offsets.push_back(static_cast<std::uint32_t>(d.withheld.rows.size()));
    }
    return d;
}

DatasetStats makeStats(const Dataset& d)
{
    DatasetStats s;
    for (std::uint32_t u = 0; u < kUsers; ++u)
        s.userTrainCount.push_back(static_cast<std::int32_t>(d.train.of(UserIndex(u)).size()));
    return s;
}

/// Base and candidate: ndcg rises by 0.05 (+ noise) for every user but users 0..4, who lose
/// 0.3, 0.25, ... ; rmse falls by 0.1 for everyone; mean_error is identical (no difference);
/// users 100..119 have no ndcg in the candidate (not compared on it).
struct Pair {
    RunEvaluation base, candidate;
};

Pair makeRuns()
{
    Pair p;
    p.base.runName = "base-model";
    p.candidate.runName = "new-model";
    p.base.runId = 1;
    p.candidate.runId = 2;
    p.base.users.resize(kUsers);
    p.candidate.users.resize(kUsers);
    std::mt19937_64 gen(5);
    std::uniform_real_distribution<double> noise(-0.01, 0.01);
    for (std::uint32_t u = 0; u < kUsers; ++u) {
        p.base.users.users[u] = UserIndex(u);
        p.candidate.users.users[u] = UserIndex(u);
        const double b = 0.3 + 0.004 * u;
        p.base.users.column(Metric::Ndcg)[u] = b;
        if (u < 100)
            p.candidate.users.column(Metric::Ndcg)[u] = u < 5 ? b - 0.3 + 0.05 * u : b + 0.05 + noise(gen);
        p.base.users.column(Metric::Rmse)[u] = 1.0 + 0.01 * u;
        p.candidate.users.column(Metric::Rmse)[u] = 0.9 + 0.01 * u + noise(gen) * 0.1;
        p.base.users.column(Metric::MeanError)[u] = 0.1 * (u % 7);
        p.candidate.users.column(Metric::MeanError)[u] = 0.1 * (u % 7);
    }
    // Warnings: user 0 cold in both; user 1 narrow in the candidate only; users 10..49 narrow in base.
    p.base.warnings.push_back({UserIndex(0), WarningCode::ColdUser, Severity::Info, 0, 5, "cold"});
    p.candidate.warnings.push_back({UserIndex(0), WarningCode::ColdUser, Severity::Info, 0, 5, "cold"});
    p.candidate.warnings.push_back({UserIndex(1), WarningCode::LowDiversity, Severity::Warn, 0.1, 0.35, "narrow"});
    for (std::uint32_t u = 10; u < 50; ++u)
        p.base.warnings.push_back({UserIndex(u), WarningCode::LowDiversity, Severity::Warn, 0.1, 0.35, "narrow"});
    return p;
}

ComparisonSettings settingsFor(std::vector<Metric> metrics)
{
    ComparisonSettings s;
    s.metrics = std::move(metrics);
    s.bootstrap = 500;
    return s;
}

const MetricComparison& find(const RunComparison& c, Metric m)
{
    for (const auto& x : c.metrics)
        if (x.metric == m)
            return x;
    qFatal("metric missing");
}

} // namespace

class TestComparison : public QObject {
    Q_OBJECT
private slots:
    void comparesUsersBothRunsDefine()
    {
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data),
                             settingsFor({Metric::Ndcg, Metric::Rmse, Metric::MeanError}));
        QVERIFY(r.ok());
        const MetricComparison& ndcg = find(*r, Metric::Ndcg);
        QCOMPARE(ndcg.n, std::int64_t{100});
        // Same numbers as the statistics on the 100 paired values directly.
        std::vector<double> b, c;
        for (std::uint32_t u = 0; u < 100; ++u) {
            b.push_back(p.base.users.column(Metric::Ndcg)[u]);
            c.push_back(p.candidate.users.column(Metric::Ndcg)[u]);
        }
        const PairedTTest t = pairedTTest(c, b);
        QCOMPARE(ndcg.t, t.t);
        QCOMPARE(ndcg.pT, t.p);
        QCOMPARE(ndcg.wilcoxonW, wilcoxonSignedRank(c, b).statistic);
        QCOMPARE(ndcg.effectSize, t.meanDiff / t.sdDiff);
        QCOMPARE(ndcg.losses, std::int64_t{5});
        QCOMPARE(ndcg.wins, std::int64_t{95});
        QVERIFY(ndcg.ci.low > 0.0 && ndcg.ci.low < ndcg.meanDiff && ndcg.meanDiff < ndcg.ci.high);
        QVERIFY(ndcg.significant);
        QVERIFY(QString::fromStdString(ndcg.verdict).startsWith(QStringLiteral("Candidate better on ndcg")));
        QCOMPARE(r->perUser.front().users.size(), std::size_t{100});
    }

    void lowerIsBetterCountsDecreaseAsWin()
    {
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), settingsFor({Metric::Rmse}));
        QVERIFY(r.ok());
        const MetricComparison& rmse = find(*r, Metric::Rmse);
        QCOMPARE(rmse.n, std::int64_t{120});
        QVERIFY(rmse.meanDiff < 0);
        QCOMPARE(rmse.wins, std::int64_t{120});
        QCOMPARE(rmse.losses, std::int64_t{0});
        QVERIFY(QString::fromStdString(rmse.verdict).contains(QStringLiteral("a decrease is a win for the candidate")));
    }

    void noDifferenceSaysSo()
    {
        const Dataset data = makeDataset();
        Pair p = makeRuns();
        // ndcg differences symmetric around 0: +-0.01 alternating -> not significant.
        for (std::uint32_t u = 0; u < kUsers; ++u)
            p.candidate.users.column(Metric::Ndcg)[u] = p.base.users.column(Metric::Ndcg)[u] + (u % 2 ? 0.01 : -0.01);
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), settingsFor({Metric::Ndcg, Metric::MeanError}));
        QVERIFY(r.ok());
        const MetricComparison& ndcg = find(*r, Metric::Ndcg);
        QVERIFY(!ndcg.significant);
        QVERIFY(QString::fromStdString(ndcg.verdict).contains(QStringLiteral("not significant after Holm")));
        QVERIFY(QString::fromStdString(ndcg.verdict).contains(QStringLiteral("includes 0")));
        // Identical values: every difference is zero, so no test can run, and the output says so.
        const MetricComparison& me = find(*r, Metric::MeanError);
        QCOMPARE(me.ties, std::int64_t{120});
        QVERIFY(std::isnan(me.pT));
        QVERIFY(std::isnan(me.pWilcoxon));
        QVERIFY(!me.significant);
        QVERIFY(QString::fromStdString(me.verdict).contains(QStringLiteral("cannot be computed")));
    }

    void holmAcrossMetrics()
    {
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data),
                             settingsFor({Metric::Ndcg, Metric::Rmse, Metric::MeanError}));
        QVERIFY(r.ok());
        std::vector<double> raw;
        for (const auto& m : r->metrics)
            raw.push_back(m.pT);
        const std::vector<double> adjusted = holmAdjust(raw);
        for (std::size_t i = 0; i < raw.size(); ++i) {
            if (std::isnan(adjusted[i]))
                QVERIFY(std::isnan(r->metrics[i].pHolm));
            else
                QCOMPARE(r->metrics[i].pHolm, adjusted[i]);
        }
        QVERIFY(QString::fromStdString(r->notes.front()).contains(QStringLiteral("Holm")));
        QVERIFY(QString::fromStdString(r->notes.front()).contains(QStringLiteral("across the 2 tests of")));

        // Two pairs at once: one family of every metric of both pairs.
        auto r2 = compareRuns(p.candidate, p.base, data, makeStats(data),
                              settingsFor({Metric::Ndcg, Metric::Rmse, Metric::MeanError}));
        QVERIFY(r2.ok());
        std::vector<double> both = raw;
        for (const auto& m : r2->metrics)
            both.push_back(m.pT);
        const std::vector<double> joint = holmAdjust(both);
        const auto adjustedPairs = adjustAcrossPairs({*r, *r2});
        QCOMPARE(adjustedPairs[0].metrics[0].pHolm, joint[0]);
        QCOMPARE(adjustedPairs[1].metrics[1].pHolm, joint[4]);
        QVERIFY(QString::fromStdString(adjustedPairs[1].notes.front()).contains(QStringLiteral("2 run pairs")));
    }

    void activitySegments()
    {
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        ComparisonSettings s = settingsFor({Metric::Rmse});
        s.segments = {SegmentSpec{SegmentKind::Activity, WarningCode::ColdUser}};
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), s);
        QVERIFY(r.ok());
        // Train counts u % 40: counts 0..4 are cold (< 5): 5 values x 3 users = 15 users.
        QVERIFY(r->segments.size() >= 2);
        QCOMPARE(QString::fromStdString(r->segments[0].name), QStringLiteral("activity:cold"));
        QCOMPARE(r->segments[0].size, std::int64_t{15});
        QVERIFY(r->segments[0].tooSmall);
        QVERIFY(r->segments[0].metrics[0].tooSmall);
        QVERIFY(!r->segments[0].metrics[0].significant);
        QVERIFY(QString::fromStdString(r->segments[0].metrics[0].verdict).startsWith(QStringLiteral("Too small to judge")));
        // Hand-computed: the remaining 105 users (counts 5..39, 3 users each) sorted; numpy's linear
        // percentiles sit at positions 0.25*104 = 26, 52, 78 -> counts 5 + 26/3 = 13, 22, 31.
        // q1 = 5..13 (9 counts, 27 users), q2 = 14..22 (27), q3 = 23..31 (27), q4 = 32..39 (24).
        QCOMPARE(r->segments.size(), std::size_t{5});
        QCOMPARE(r->segments[1].size, std::int64_t{27});
        QCOMPARE(r->segments[2].size, std::int64_t{27});
        QCOMPARE(r->segments[3].size, std::int64_t{27});
        QCOMPARE(r->segments[4].size, std::int64_t{24});
        QCOMPARE(QString::fromStdString(r->segments[1].label), QStringLiteral("quartile 1: 5 to 13 train interactions"));
        std::int64_t total = 0;
        for (const auto& seg : r->segments)
            total += seg.size;
        QCOMPARE(total, std::int64_t{120});
    }

    void genreAndWarningSegments()
    {
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        ComparisonSettings s = settingsFor({Metric::Rmse});
        s.segments = {SegmentSpec{SegmentKind::Genre, WarningCode::ColdUser},
                      SegmentSpec{SegmentKind::Warning, WarningCode::LowDiversity}};
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), s);
        QVERIFY(r.ok());
        // Users with u % 40 == 0 (0, 40, 80) have no train rows -> "(none)"; the rest by u % 3.
        std::map<QString, std::int64_t> sizes;
        for (const auto& seg : r->segments)
            sizes[QString::fromStdString(seg.name)] = seg.size;
        QCOMPARE(sizes[QStringLiteral("genre:(none)")], std::int64_t{3});
        // Each genre u % 3 has 40 users, less one of 0, 40, 80 (u % 3 = 0, 1, 2 respectively).
        QCOMPARE(sizes[QStringLiteral("genre:Comedy")], std::int64_t{39});
        QCOMPARE(sizes[QStringLiteral("genre:Drama")], std::int64_t{39});
        QCOMPARE(sizes[QStringLiteral("genre:Western")], std::int64_t{39});
        // Narrow in either run: user 1 (candidate) and 10..49 (base) = 41 users.
        QCOMPARE(sizes[QStringLiteral("warning:narrow")], std::int64_t{41});
        QCOMPARE(sizes[QStringLiteral("not warning:narrow")], std::int64_t{79});
        QVERIFY(QString::fromStdString(r->notes[1]).contains(QStringLiteral("separate Holm family")));
    }

    void whoGotWorse()
    {
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        ComparisonSettings s = settingsFor({Metric::MeanError, Metric::Ndcg, Metric::Rmse});
        s.worst = 3;
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), s);
        QVERIFY(r.ok());
        // mean_error has no better direction, so the primary metric is ndcg.
        QVERIFY(r->hasPrimary);
        QCOMPARE(r->primary, Metric::Ndcg);
        // Users 0..4 lose 0.3 - 0.05u: user 0 most, then 1, 2.
        QCOMPARE(r->whoGotWorse.size(), std::size_t{3});
        QCOMPARE(QString::fromStdString(r->whoGotWorse[0].userId), QStringLiteral("user0"));
        QCOMPARE(QString::fromStdString(r->whoGotWorse[1].userId), QStringLiteral("user1"));
        QCOMPARE(QString::fromStdString(r->whoGotWorse[2].userId), QStringLiteral("user2"));
        QCOMPARE(std::round(r->whoGotWorse[0].loss * 1e12) / 1e12, 0.3);
        QCOMPARE(r->whoGotWorse[0].baseWarnings, std::vector<std::string>{"cold"});
        QCOMPARE(r->whoGotWorse[1].baseWarnings, std::vector<std::string>{});
        QCOMPARE(r->whoGotWorse[1].candidateWarnings, std::vector<std::string>{"narrow"});
    }

    void refusesDifferentSettingsAndEmptyMetrics()
    {
        const Dataset data = makeDataset();
        Pair p = makeRuns();
        p.candidate.settings.k = 20;
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), settingsFor({Metric::Ndcg}));
        QVERIFY(!r.ok());
        QCOMPARE(r.error().kind, ErrorKind::Usage);
        QVERIFY(QString::fromStdString(r.error().message).contains(QStringLiteral("different settings")));
        p.candidate.settings.k = 10;
        auto none = compareRuns(p.base, p.candidate, data, makeStats(data), settingsFor({Metric::Ild}));
        QVERIFY(!none.ok());
        QCOMPARE(none.error().kind, ErrorKind::Usage);
        // A default metric that neither run has is left out with a note, not an error.
        auto some = compareRuns(p.base, p.candidate, data, makeStats(data), settingsFor({}));
        QVERIFY(some.ok());
        QCOMPARE(some->metrics.size(), std::size_t{2}); // ndcg and rmse of the defaults
        bool noted = false;
        for (const auto& n : some->notes)
            noted = noted || (n.rfind("Left out", 0) == 0 && n.find("ild") != std::string::npos);
        QVERIFY(noted);
    }

    void cancelStops()
    {
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        std::atomic<bool> cancel{true};
        Progress progress;
        progress.cancel = &cancel;
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), settingsFor({Metric::Ndcg}), progress);
        QVERIFY(!r.ok());
        QCOMPARE(r.error().kind, ErrorKind::Cancelled);
    }

    void jsonHasContractKeys()
    {
        const Dataset data = makeDataset();
        ComparisonSettings s = settingsFor({Metric::Ndcg, Metric::Ap});
        s.segments = {SegmentSpec{SegmentKind::Activity, WarningCode::ColdUser}};
        Pair q = makeRuns();
        for (std::uint32_t u = 0; u < kUsers; ++u) {
            q.base.users.column(Metric::Ap)[u] = 0.5;
            q.candidate.users.column(Metric::Ap)[u] = 0.5 + 0.001 * (u % 5);
        }
        auto r = compareRuns(q.base, q.candidate, data, makeStats(data), s);
        QVERIFY(r.ok());
        const auto j = nlohmann::json::parse(r->toJson());
        QCOMPARE(QString::fromStdString(j.at("base").get<std::string>()), QStringLiteral("base-model"));
        const char* keys[] = {"metric", "n", "mean_base", "mean_candidate", "mean_diff", "ci", "t", "df", "p_t",
                              "wilcoxon_w", "p_wilcoxon", "p_holm", "wins", "ties", "losses", "effect_size"};
        for (const auto& m : j.at("metrics"))
            for (const char* k : keys)
                QVERIFY2(m.contains(k), k);
        QCOMPARE(QString::fromStdString(j.at("metrics")[1].at("metric").get<std::string>()), QStringLiteral("map"));
        QVERIFY(j.at("metrics")[0].at("ci").is_array());
        QCOMPARE(j.at("segments").size(), std::size_t{5 * 2});
        for (const auto& seg : j.at("segments")) {
            for (const char* k : keys)
                QVERIFY2(seg.contains(k), k);
            QVERIFY(seg.contains("segment") && seg.contains("size") && seg.contains("too_small"));
        }
        QVERIFY(!j.contains("per_user"));
        QVERIFY(nlohmann::json::parse(r->toJson(true)).contains("per_user"));
    }

    void storeAndLoadRoundTrip()
    {
        SqliteDb db = SqliteDb::open(":memory:", true);
        db.exec(schemaVersion1());
        for (auto step : migrations())
            db.exec(step);
        db.exec("INSERT INTO runs(run_id, name, created_at) VALUES (1, 'base-model', 'now'), (2, 'new-model', 'now')");
        const Dataset data = makeDataset();
        const Pair p = makeRuns();
        ComparisonSettings s = settingsFor({Metric::Ndcg, Metric::Rmse});
        s.segments = {SegmentSpec{SegmentKind::Warning, WarningCode::ColdUser}};
        auto r = compareRuns(p.base, p.candidate, data, makeStats(data), s);
        QVERIFY(r.ok());
        ComparisonStore store(db);
        auto id = store.store(*r);
        QVERIFY2(id.ok(), id.ok() ? "" : id.error().toString().c_str());
        // Storing again replaces, never duplicates.
        auto again = store.store(*r);
        QVERIFY(again.ok());
        QCOMPARE(*again, *id);
        auto loaded = store.load(1, 2, r->settingsKey());
        QVERIFY(loaded.ok());
        QVERIFY(loaded->has_value());
        const RunComparison& back = **loaded;
        QCOMPARE(back.metrics.size(), r->metrics.size());
        QCOMPARE(back.metrics[0].pHolm, r->metrics[0].pHolm);
        QCOMPARE(back.metrics[0].ci.low, r->metrics[0].ci.low);
        QCOMPARE(back.metrics[1].verdict, r->metrics[1].verdict);
        QCOMPARE(back.segments.size(), r->segments.size());
        QCOMPARE(back.segments[0].metrics.size(), std::size_t{2});
        QCOMPARE(back.whoGotWorse.size(), r->whoGotWorse.size());
        QCOMPARE(back.perUser[0].candidate, r->perUser[0].candidate);
        QCOMPARE(back.settingsKey(), r->settingsKey());
        QVERIFY(!back.computedAt.empty());
        auto missing = store.load(2, 1, r->settingsKey());
        QVERIFY(missing.ok());
        QVERIFY(!missing->has_value());
        auto list = store.list();
        QVERIFY(list.ok());
        QCOMPARE(list->size(), std::size_t{1});
        QCOMPARE(QString::fromStdString(list->front().candidate), QStringLiteral("new-model"));
    }

    void intervalReproducibleAndCovers()
    {
        // The comparison's own mean-difference bootstrap: a fixed seed gives the same interval,
        // and on 200 samples of n = 60 paired differences from N(0.3, 1) the 95% percentile
        // interval covers 0.3 in between 90% and 99% of them (Efron & Tibshirani 1993, ch. 13).
        ComparisonSettings s;
        std::mt19937_64 gen(20261202);
        std::normal_distribution<double> normal(0.3, 1.0);
        int covered = 0;
        for (int rep = 0; rep < 200; ++rep) {
            std::vector<double> base(60, 0.0), candidate(60);
            for (double& v : candidate)
                v = normal(gen);
            s.seed = 1000 + static_cast<std::uint64_t>(rep);
            const MetricComparison a = compareValues(Metric::Ndcg, base, candidate, s);
            if (rep == 0) {
                const MetricComparison b = compareValues(Metric::Ndcg, base, candidate, s);
                QCOMPARE(a.ci.low, b.ci.low);
                QCOMPARE(a.ci.high, b.ci.high);
            }
            if (a.ci.low <= 0.3 && 0.3 <= a.ci.high)
                ++covered;
        }
        qInfo("comparison interval coverage: %d of 200", covered);
        QVERIFY2(covered >= 180 && covered <= 198, qPrintable(QString::number(covered)));
    }

    void segmentSpecParsing()
    {
        QVERIFY(SegmentSpec::parse("activity").ok());
        auto w = SegmentSpec::parse("warning:sequel-first");
        QVERIFY(w.ok());
        QCOMPARE(w->warning, WarningCode::SeriesOrder);
        QCOMPARE(QString::fromStdString(w->key()), QStringLiteral("warning:sequel-first"));
        auto bad = SegmentSpec::parse("warning:nonsense");
        QVERIFY(!bad.ok());
        QCOMPARE(bad.error().kind, ErrorKind::Usage);
        QVERIFY(QString::fromStdString(bad.error().expected).contains(QStringLiteral("sequel-first")));
        QVERIFY(!SegmentSpec::parse("age").ok());
        ComparisonSettings s;
        s.segments = {*w};
        s.metrics = {Metric::Rr};
        auto back = ComparisonSettings::fromJson(s.toJson());
        QVERIFY(back.ok());
        QCOMPARE(back->toJson(), s.toJson());
    }
};

QTEST_GUILESS_MAIN(TestComparison)
#include "tst_comparison.moc"

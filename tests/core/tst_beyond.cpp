// SPDX-License-Identifier: MIT
// computeBeyond on a hand-built club: each member is set up to raise (or not raise) given
// warnings, and every measure is checked against a value worked out by hand here.
#include "core/beyond.h"
#include "core/beyondfixture.h"
#include "core/exposure.h"

#include <QTest>

#include <cmath>

using namespace slatewise::core;
using slatewise::test::BeyondFixture;
using slatewise::test::Watch;

namespace {

double r6(double v) { return std::round(v * 1e6) / 1e6; }

std::vector<std::string> fillers(int from, int to)
{
    std::vector<std::string> out;
    for (int i = from; i < to; ++i)
        out.push_back("Filler " + std::to_string(i));
    return out;
}

std::vector<Watch> bingeHistory()
{
    // 25 older Drama titles, then a window of 6 Horror and 4 Drama titles.
    auto train = BeyondFixture::watched(fillers(0, 25));
    for (const char* t : {"Night Ferry", "Velvet Cellar", "Hollow Pines", "Cold Attic", "Moth Lantern", "Grey Well"})
        train.push_back({t, 4.0f, static_cast<Timestamp>(100 + train.size())});
    for (const auto& t : fillers(25, 29))
        train.push_back({t, 4.0f, static_cast<Timestamp>(100 + train.size())});
    return train;
}

struct Club {
    BeyondFixture f;
    Club(bool withLists = true)
    {
        f.item("Harbour Lights", {"Drama"}, "Harbour Lights", 1);
        f.item("Harbour Lights 2", {"Drama"}, "Harbour Lights", 2);
        f.item("Harbour Lights 3", {"Drama"}, "Harbour Lights", 3);
        for (const char* t : {"Quiet Orchard", "Paper Kites", "Glass Tram"})
            f.item(t, {"Comedy"});
        for (const char* t : {"Night Ferry", "Velvet Cellar", "Hollow Pines", "Cold Attic", "Moth Lantern", "Grey Well",
                              "Red Mire", "Bone Choir"})
            f.item(t, {"Horror"});
        f.item("Dust Road", {"Western"});
        f.item("Iron Mesa", {"Western"});
        f.item("Song of Tin", {"Musical"});
        f.item("Starfall", {"Drama"});
        for (const auto& t : fillers(0, 40))
            f.item(t, {"Drama"});

        const auto six = BeyondFixture::watched(fillers(0, 6));
        // u0: sequels first, one series, one genre.
        f.user("u0", six, {{"Harbour Lights", 5}}, {"Harbour Lights 3", "Harbour Lights 2"});
        // u1: a title already watched, and a list whose genres the history never had.
        auto u1train = six;
        u1train.push_back({"Quiet Orchard", 4, 50});
        f.user("u1", u1train, {{"Paper Kites", 5}}, {"Quiet Orchard", "Night Ferry", "Dust Road", "Song of Tin"});
        // u2: only the most watched title; no withheld favourite.
        f.user("u2", six, {{"Glass Tram", 2}, {"Iron Mesa", 3}}, {"Starfall"});
        // u3: cold.
        f.user("u3", BeyondFixture::watched(fillers(0, 2)), {{"Iron Mesa", 4}}, {"Filler 2", "Quiet Orchard"});
        // u4: no list.
        f.user("u4", six, {{"Harbour Lights", 5}}, {}, false);
        // u5: a Horror binge the list echoes; u6: the same binge, a list that does not.
        f.user("u5", bingeHistory(), {{"Paper Kites", 5}}, {"Red Mire", "Bone Choir", "Glass Tram"});
        f.user("u6", bingeHistory(), {{"Paper Kites", 5}}, {"Filler 30", "Filler 31", "Red Mire"});
        // u7: no timestamps, so the burst check skips the user.
        std::vector<Watch> untimed;
        for (const auto& t : fillers(0, 6))
            untimed.push_back({t, 4.0f, kNoTimestamp});
        f.user("u7", untimed, {{"Paper Kites", 5}}, {"Quiet Orchard", "Filler 7"});
        // Ten members without withheld items make «Starfall» the most watched title; their
        // lists count for coverage and Gini although they are not evaluated.
        for (int b = 0; b < 10; ++b)
            f.user("b" + std::to_string(b), BeyondFixture::watched({"Starfall", "Filler 38"}), {},
                   {"Starfall", "Song of Tin"});
        f.finish();
        if (!withLists) {
            f.run.hasLists = false;
            f.run.listRows.clear();
            f.run.listOffsets.clear();
        }
    }
};

QStringList codesOf(const RunEvaluation& eval, std::uint32_t user)
{
    QStringList out;
    for (const auto& w : eval.warnings)
        if (w.user.value == user)
            out << QString::fromUtf8(warningInfo(w.code).key.data(), static_cast<int>(warningInfo(w.code).key.size()));
    return out;
}

const UserWarning* find(const RunEvaluation& eval, std::uint32_t user, WarningCode code)
{
    for (const auto& w : eval.warnings)
        if (w.user.value == user && w.code == code)
            return &w;
    return nullptr;
}

QString messageOf(const RunEvaluation& eval, std::uint32_t user, WarningCode code)
{
    const auto* w = find(eval, user, code);
    return w ? QString::fromStdString(w->message) : QString();
}

} // namespace

class TestBeyond : public QObject {
    Q_OBJECT
private slots:
    void initTestCase()
    {
        m_club = std::make_unique<Club>();
        m_stats = computeStats(m_club->f.data);
        m_eval = m_club->f.evaluationShell(m_settings);
        computeBeyond(m_club->f.data, m_stats, m_club->f.run, m_settings, m_eval);
    }

    void everyMemberCarriesExactlyTheExpectedWarnings_data()
    {
        QTest::addColumn<uint>("user");
        QTest::addColumn<QStringList>("codes");
        QTest::newRow("sequels first") << 0u << QStringList{"narrow", "one-series", "sequel-first"};
        QTest::newRow("seen and off taste") << 1u << QStringList{"seen-again", "off-taste"};
        QTest::newRow("popular only, no favourites") << 2u << QStringList{"popular-only", "no-favourites"};
        QTest::newRow("cold") << 3u << QStringList{"cold"};
        QTest::newRow("no list") << 4u << QStringList{"no-list"};
        QTest::newRow("binge echoed") << 5u << QStringList{"binge-echo", "off-taste"};
        QTest::newRow("binge not echoed") << 6u << QStringList{};
        QTest::newRow("no timestamps") << 7u << QStringList{};
    }
    void everyMemberCarriesExactlyTheExpectedWarnings()
    {
        QFETCH(uint, user);
        QFETCH(QStringList, codes);
        QCOMPARE(codesOf(m_eval, user), codes);
        QCOMPARE(m_eval.users.warningCount[user], static_cast<std::int32_t>(codes.size()));
    }

    void sentencesNameTheTitles()
    {
        QCOMPARE(messageOf(m_eval, 0, WarningCode::SeriesOrder),
                 QStringLiteral("«Harbour Lights 3» stands at rank 1 while parts 1 and 2 are unseen; "
                                "«Harbour Lights 2» at rank 2 while part 1 is unseen."));
        QCOMPARE(messageOf(m_eval, 0, WarningCode::OneSeries),
                 QStringLiteral("2 of the top 2 titles come from the series «Harbour Lights»: «Harbour Lights 3» and "
                                "«Harbour Lights 2»."));
        QVERIFY(messageOf(m_eval, 0, WarningCode::LowDiversity).contains(QStringLiteral("Drama")));
        QCOMPARE(messageOf(m_eval, 1, WarningCode::AlreadySeen),
                 QStringLiteral("«Quiet Orchard» (rank 1) is already in the user's history."));
        QVERIFY(messageOf(m_eval, 1, WarningCode::Miscalibrated).contains(QStringLiteral("Drama")));
        QVERIFY(messageOf(m_eval, 2, WarningCode::PopularOnly).contains(QStringLiteral("«Starfall»")));
        QVERIFY(messageOf(m_eval, 2, WarningCode::NoRelevant).contains(QStringLiteral("«Iron Mesa», is rated 3")));
        QVERIFY(messageOf(m_eval, 3, WarningCode::ColdUser).contains(QStringLiteral("«Filler 0» and «Filler 1»")));
        QVERIFY(messageOf(m_eval, 4, WarningCode::NoList).contains(QStringLiteral("«Harbour Lights»")));
        const QString binge = messageOf(m_eval, 5, WarningCode::BurstEcho);
        QVERIFY2(binge.contains(QStringLiteral("60% of the last 10 titles watched were Horror against 0% before")),
                 qPrintable(binge));
        QVERIFY(binge.contains(QStringLiteral("«Red Mire» and «Bone Choir»")));
    }

    void warningsCarryValueAndThreshold()
    {
        const auto* order = find(m_eval, 0, WarningCode::SeriesOrder);
        QVERIFY(order);
        QCOMPARE(order->value, 2.0);
        QCOMPARE(static_cast<int>(order->severity), static_cast<int>(Severity::Severe));
        const auto* cold = find(m_eval, 3, WarningCode::ColdUser);
        QVERIFY(cold);
        QCOMPARE(cold->value, 2.0);
        QCOMPARE(cold->threshold, 5.0);
        const auto* narrow = find(m_eval, 0, WarningCode::LowDiversity);
        QVERIFY(narrow);
        QCOMPARE(narrow->value, 0.0);
        QCOMPARE(narrow->threshold, m_settings.warn.lowDiversityIld);
        const auto* echo = find(m_eval, 5, WarningCode::BurstEcho);
        QVERIFY(echo);
        QCOMPARE(r6(echo->value), r6(2.0 / 3.0));
        QCOMPARE(echo->threshold, 0.5);
        const auto* favourites = find(m_eval, 2, WarningCode::NoRelevant);
        QVERIFY(favourites);
        QCOMPARE(favourites->value, 3.0);
        QCOMPARE(favourites->threshold, 4.0);
    }

    void warningsAreSortedByUserThenCode()
    {
        for (std::size_t i = 1; i < m_eval.warnings.size(); ++i) {
            const auto& a = m_eval.warnings[i - 1];
            const auto& b = m_eval.warnings[i];
            QVERIFY(a.user < b.user || (a.user == b.user && a.code < b.code));
        }
    }

    void perUserMeasures()
    {
        const auto& t = m_eval.users;
        QCOMPARE(t.size(), std::size_t{8}); // the ten background members have nothing withheld
        QCOMPARE(t.value(Metric::Ild, 0), 0.0);
        QCOMPARE(t.value(Metric::Ild, 1), 1.0);
        QVERIFY(std::isnan(t.value(Metric::Ild, 2))); // one-item list
        QCOMPARE(t.value(Metric::SeriesShare, 0), 1.0);
        QCOMPARE(t.value(Metric::SeriesShare, 1), 0.0);
        QCOMPARE(t.value(Metric::OrderViolations, 0), 2.0);
        QCOMPARE(t.value(Metric::SeenInList, 1), 1.0);
        QCOMPARE(t.value(Metric::BurstEcho, 5), 1.0);
        QCOMPARE(t.value(Metric::BurstEcho, 6), 0.0);
        QVERIFY(std::isnan(t.value(Metric::BurstEcho, 7))); // no timestamps
        for (std::size_t m = static_cast<std::size_t>(Metric::Ild); m < kMetricCount; ++m)
            QVERIFY(std::isnan(t.metrics[m][4])); // no list: nothing defined

        // Novelty of «Starfall»: N = 18 train users, n_i = 10 → −log2(11/19) (formula as in
        // Zhou et al., PNAS 2010, with the +1 smoothing of docs/metrics.md).
        QCOMPARE(m_stats.trainUsers, 18);
        QCOMPARE(r6(t.value(Metric::Novelty, 2)), r6(-std::log2(11.0 / 19.0)));

        // u3 (cold): history {Drama}; list Drama + Comedy, q̃ = 0.99·0.5 + 0.01·1 for Drama:
        // KL = ln(1 / 0.505).
        QCOMPARE(r6(t.value(Metric::CalibrationKl, 3)), r6(std::log(1.0 / 0.505)));

        // Popularity lift of u2: percentile(Starfall) − mean percentile(Filler 0..5).
        double history = 0;
        for (int i = 0; i < 6; ++i)
            history += m_stats.itemPopularityPercentile[m_club->f.at("Filler " + std::to_string(i)).value];
        const double starfall = m_stats.itemPopularityPercentile[m_club->f.at("Starfall").value];
        QCOMPARE(r6(t.value(Metric::PopularityLift, 2)), r6(starfall - history / 6));
        QVERIFY(starfall >= 95.0);
    }

    void runValues()
    {
        QVERIFY(m_eval.beyond.has_value());
        const auto& b = *m_eval.beyond;
        // Distinct titles in all top-10 lists, background members included: 14 of 58.
        QCOMPARE(m_club->f.data.itemCount(), std::size_t{58});
        QCOMPARE(r6(b.coverage), r6(14.0 / 58.0));
        // Gini over every catalog item, from counts tallied here independently.
        std::vector<double> counts(m_club->f.data.itemCount(), 0.0);
        for (const auto& e : m_club->f.run.listRows)
            counts[e.item.value] += 1.0;
        QCOMPARE(r6(b.gini), r6(Exposure::gini(counts)));
        // Counts by hand: Starfall and Song of Tin 11 each, Quiet Orchard 3, Red Mire 2, ten
        // titles once, 44 titles never; numpy (1/n form, ascending) gives 0.882106.
        QCOMPARE(r6(b.gini), 0.882106);
        QCOMPARE(b.orderViolations, std::int64_t{2});
        QCOMPARE(r6(b.orderViolationsUsers), r6(1.0 / 7.0)); // 7 evaluated members have a list
        QCOMPARE(b.seenInList, std::int64_t{1});
        QCOMPARE(r6(b.seenInListUsers), r6(1.0 / 7.0));
        QCOMPARE(r6(b.burstEcho), r6(1.0 / 6.0)); // u7 has no timestamps
        QCOMPARE(b.burstSkippedUsers, std::int64_t{1});
        QCOMPARE(r6(b.seriesShare), r6(1.0 / 7.0));
        // ild over the 6 members with two or more titles: u0 0, u1 1, u3 1, u5 2/3, u6 2/3, u7 1.
        QCOMPARE(r6(b.ild), r6((0 + 1 + 1 + 2.0 / 3 + 2.0 / 3 + 1) / 6));
        // Shares of the 8 evaluated members.
        QCOMPARE(m_eval.warningShare.at("off-taste"), 2.0 / 8.0);
        QCOMPARE(m_eval.warningShare.at("no-list"), 1.0 / 8.0);
        QCOMPARE(m_eval.warningShare.at("cold"), 1.0 / 8.0);
        QCOMPARE(m_eval.warningShare.size(), kWarningCodeCount);
    }

    void thresholdsComeFromSettings()
    {
        EvalSettings strict = m_settings;
        strict.warn.coldTrain = 7; // u0, u1 (7 rows) stay warm; six-row members turn cold
        strict.warn.lowDiversityIld = 0.9;
        auto eval = m_club->f.evaluationShell(strict);
        computeBeyond(m_club->f.data, m_stats, m_club->f.run, strict, eval);
        QVERIFY(codesOf(eval, 0).contains(QStringLiteral("cold")));
        QVERIFY(!codesOf(eval, 1).contains(QStringLiteral("cold")));
        QVERIFY(codesOf(eval, 5).contains(QStringLiteral("narrow"))); // ild 2/3 < 0.9
    }

    void runWithoutListsHasNoBeyondSectionButStillFlagsUsers()
    {
        Club club(false);
        const auto stats = computeStats(club.f.data);
        auto eval = club.f.evaluationShell(m_settings);
        computeBeyond(club.f.data, stats, club.f.run, m_settings, eval);
        QVERIFY(!eval.beyond.has_value());
        QCOMPARE(codesOf(eval, 3), QStringList{QStringLiteral("cold")});
        QCOMPARE(codesOf(eval, 2), QStringList{QStringLiteral("no-favourites")});
        QCOMPARE(codesOf(eval, 4), QStringList{}); // without any lists, "no list" says nothing
        QVERIFY(std::isnan(eval.users.value(Metric::Ild, 0)));
    }

private:
    EvalSettings m_settings;
    std::unique_ptr<Club> m_club;
    DatasetStats m_stats;
    RunEvaluation m_eval;
};

QTEST_GUILESS_MAIN(TestBeyond)
#include "tst_beyond.moc"

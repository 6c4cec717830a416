// SPDX-License-Identifier: MIT
// The small measuring classes behind the beyond-accuracy measures, each on hand-built cases
// with known answers.
#include "core/burstdetector.h"
#include "core/exposure.h"
#include "core/genremix.h"
#include "core/itemmarks.h"
#include "core/listdiversity.h"
#include "core/seriesorder.h"
#include "core/beyondfixture.h"

#include <QTest>

#include <cmath>

using namespace slatewise::core;
using slatewise::test::BeyondFixture;

namespace {

std::vector<ListEntry> listOf(const BeyondFixture& f, const std::vector<std::string>& titles)
{
    std::vector<ListEntry> out;
    for (const auto& t : titles)
        out.push_back({f.at(t), 1.0f});
    return out;
}

/// Rounds to 6 decimals so that QCOMPARE prints both sides and checks the published value.
double r6(double v) { return std::round(v * 1e6) / 1e6; }

} // namespace

class TestBeyondMeasures : public QObject {
    Q_OBJECT
private slots:
    void ildOfOneGenreIsZero()
    {
        BeyondFixture f;
        f.item("A", {"Drama"});
        f.item("B", {"Drama"});
        f.item("C", {"Drama"});
        const ListDiversity d(f.data.items, f.data.genreNames.size());
        QCOMPARE(d.ild(listOf(f, {"A", "B", "C"})), 0.0);
    }
    void ildOfDisjointGenreSetsIsOne()
    {
        BeyondFixture f;
        f.item("A", {"Drama", "Crime"});
        f.item("B", {"Comedy"});
        f.item("C", {"Horror", "Western"});
        f.item("D", {"Musical"});
        const ListDiversity d(f.data.items, f.data.genreNames.size());
        QCOMPARE(d.ild(listOf(f, {"A", "B", "C", "D"})), 1.0);
    }
    void ildMatchesJaccardReferenceExample()
    {
        // reference-values.md: genre vectors A=[1,0,1], B=[1,1,0], C=[0,0,1] give a mean
        // pairwise Jaccard distance of 0.722222 (closed form: (2/3 + 1/2 + 1) / 3).
        BeyondFixture f;
        f.genre("g0");
        f.genre("g1");
        f.genre("g2");
        f.item("A", {"g0", "g2"});
        f.item("B", {"g0", "g1"});
        f.item("C", {"g2"});
        const ListDiversity d(f.data.items, f.data.genreNames.size());
        QCOMPARE(r6(d.ild(listOf(f, {"A", "B", "C"}))), 0.722222);
        QCOMPARE(r6(ListDiversity::jaccardDistance(f.data.items[0].genres, f.data.items[1].genres)), r6(2.0 / 3.0));
    }
    void ildWithManyGenresUsesTheSameDefinition()
    {
        // More than 64 genres switches from bit masks to merging sorted lists.
        BeyondFixture f;
        for (int g = 0; g < 70; ++g)
            f.genre("g" + std::to_string(g));
        f.item("A", {"g0", "g69"});
        f.item("B", {"g0", "g1"});
        f.item("C", {"g69"});
        const ListDiversity d(f.data.items, f.data.genreNames.size());
        QCOMPARE(r6(d.ild(listOf(f, {"A", "B", "C"}))), 0.722222);
    }
    void ildNeedsTwoItemsAndTreatsEmptyPairsAsSame()
    {
        BeyondFixture f;
        f.item("A", {});
        f.item("B", {});
        const ListDiversity d(f.data.items, f.data.genreNames.size());
        QVERIFY(std::isnan(d.ild(listOf(f, {"A"}))));
        QCOMPARE(d.ild(listOf(f, {"A", "B"})), 0.0);
    }

    void giniClosedForms_data()
    {
        QTest::addColumn<std::vector<double>>("counts");
        QTest::addColumn<double>("expected");
        // Closed forms of G = Σ(2i − n − 1)x_i / (nΣx), x ascending (reference-values.md).
        QTest::newRow("all on one of 4") << std::vector<double>{0, 0, 7, 0} << 3.0 / 4.0;
        QTest::newRow("all on one of 10") << std::vector<double>{0, 0, 0, 0, 0, 0, 0, 0, 0, 5} << 9.0 / 10.0;
        QTest::newRow("equal") << std::vector<double>{3, 3, 3, 3, 3} << 0.0;
        QTest::newRow("3,2,1,0,0,0") << std::vector<double>{3, 2, 1, 0, 0, 0} << 11.0 / 18.0;
        QTest::newRow("10,20,30,40,100") << std::vector<double>{100, 10, 40, 20, 30} << 0.40;
    }
    void giniClosedForms()
    {
        QFETCH(std::vector<double>, counts);
        QFETCH(double, expected);
        QCOMPARE(r6(Exposure::gini(counts)), r6(expected));
    }
    void exposureCountsZeroExposureItemsAndCoverage()
    {
        Exposure e(6);
        for (int i = 0; i < 3; ++i)
            e.add(ItemIndex(0));
        e.add(ItemIndex(1));
        e.add(ItemIndex(1));
        Exposure other(6);
        other.add(ItemIndex(2));
        e.merge(other);
        QCOMPARE(e.total(), std::int64_t{6});
        QCOMPARE(e.distinctShown(), std::size_t{3});
        QCOMPARE(e.coverage(), 0.5);
        QCOMPARE(r6(e.gini()), r6(11.0 / 18.0));
        QVERIFY(std::isnan(Exposure(4).gini())); // nothing shown: undefined, not 0
    }

    void calibrationKlMatchesScipyReference()
    {
        // reference-values.md: scipy.stats.entropy(p, 0.99q + 0.01p) with p = [.5,.25,.25],
        // q = [.75,.25,0] is 0.950229 nats.
        const std::vector<double> p{0.5, 0.25, 0.25};
        const std::vector<double> q{0.75, 0.25, 0.0};
        QCOMPARE(r6(GenreMix::calibrationKl(p, q, 0.01)), 0.950229);
        // Unnormalised weights give the same value: both sides are normalised first.
        const std::vector<double> p2{2, 1, 1};
        const std::vector<double> q2{3, 1, 0};
        QCOMPARE(r6(GenreMix::calibrationKl(p2, q2, 0.01)), 0.950229);
        QCOMPARE(GenreMix::calibrationKl(p, p, 0.01), 0.0);
        QVERIFY(std::isnan(GenreMix::calibrationKl(p, std::vector<double>{0, 0, 0}, 0.01)));
    }
    void genreMixSharesOneUnitPerItem()
    {
        GenreMix mix(3);
        const std::vector<std::int32_t> dramaCrime{0, 1};
        const std::vector<std::int32_t> comedy{2};
        mix.add(dramaCrime);
        mix.add(comedy);
        mix.add(std::vector<std::int32_t>{}); // no genres: adds nothing
        QCOMPARE(mix.total(), 2.0);
        QCOMPARE(mix.share(0), 0.25);
        QCOMPARE(mix.share(1), 0.25);
        QCOMPARE(mix.share(2), 0.5);
        QCOMPARE(mix.dominant(), 2);
    }

    void seriesOrder_data()
    {
        QTest::addColumn<QStringList>("train");
        QTest::addColumn<QStringList>("list");
        QTest::addColumn<QString>("expected"); // "rank:title:missing parts;..." or ""
        QTest::newRow("part 3 without parts 1 and 2") << QStringList{} << QStringList{"X", "HL3"}
                                                      << QStringList{"2:HL3:1,2"}.join(u';');
        QTest::newRow("part 3 after part 1, part 2 missing")
            << QStringList{} << QStringList{"HL1", "HL3"} << QStringLiteral("2:HL3:2");
        QTest::newRow("part 1 seen, part 2 missing") << QStringList{"HL1"} << QStringList{"HL3"} << QStringLiteral("1:HL3:2");
        QTest::newRow("part 2 ranked below part 1") << QStringList{} << QStringList{"HL1", "HL2"} << QString();
        QTest::newRow("part 2 ranked above part 1")
            << QStringList{} << QStringList{"HL2", "HL1"} << QStringLiteral("1:HL2:1");
        QTest::newRow("earlier parts seen") << QStringList{"HL1", "HL2"} << QStringList{"HL3"} << QString();
        QTest::newRow("first part alone") << QStringList{} << QStringList{"HL1"} << QString();
        QTest::newRow("part 2 of a series without part 1 in the catalog")
            << QStringList{} << QStringList{"Tide 2"} << QString();
        QTest::newRow("two violations") << QStringList{} << QStringList{"HL3", "HL2"}
                                        << QStringLiteral("1:HL3:1,2;2:HL2:1");
    }
    void seriesOrder()
    {
        QFETCH(QStringList, train);
        QFETCH(QStringList, list);
        QFETCH(QString, expected);
        BeyondFixture f;
        f.item("HL1", {"Drama"}, "Harbour Lights", 1);
        f.item("HL2", {"Drama"}, "Harbour Lights", 2);
        f.item("HL3", {"Drama"}, "Harbour Lights", 3);
        f.item("Tide 2", {"Drama"}, "Tide", 2);
        f.item("X", {"Comedy"});
        ItemMarks seen(f.data.itemCount());
        for (const auto& t : train)
            seen.insert(f.at(t.toStdString()));
        std::vector<std::string> titles;
        for (const auto& t : list)
            titles.push_back(t.toStdString());
        const SeriesOrder order(f.data.items);
        QStringList got;
        for (const auto& v : order.check(listOf(f, titles), seen)) {
            QStringList parts;
            for (auto p : v.missingParts)
                parts << QString::number(p);
            got << QStringLiteral("%1:%2:%3")
                       .arg(v.rank)
                       .arg(QString::fromStdString(f.data.items[v.item.value].title), parts.join(u','));
            QCOMPARE(v.missingItems.size(), v.missingParts.size());
        }
        QCOMPARE(got.join(u';'), expected);
    }

    void burstDetector()
    {
        BeyondFixture f;
        for (int i = 0; i < 30; ++i)
            f.item("D" + std::to_string(i), {"Drama"});
        for (int i = 0; i < 10; ++i)
            f.item("H" + std::to_string(i), {"Horror", i % 2 ? "Drama" : "Thriller"});
        // 25 older Drama titles, then a window of 8 Horror and 2 Drama titles.
        std::vector<Interaction> train;
        for (int i = 0; i < 25; ++i)
            train.push_back({f.at("D" + std::to_string(i)), 4.0f, 100 + i});
        for (int i = 0; i < 8; ++i)
            train.push_back({f.at("H" + std::to_string(i)), 4.0f, 200 + i});
        train.push_back({f.at("D25"), 4.0f, 300});
        train.push_back({f.at("D26"), 4.0f, 301});
        const BurstDetector detector(f.data.items, f.data.genreNames.size(), BurstDetector::Params{});
        const int horror = f.genre("Horror");

        // Echoing list: 3 of 5 titles Horror (0.6 ≥ 0.5).
        const auto echo = detector.detect(train, listOf(f, {"H8", "D27", "H9", "D28", "H0"}));
        QVERIFY(echo.hasTimestamps);
        QVERIFY(echo.enoughHistory);
        QCOMPARE(echo.bursts.size(), std::size_t{1});
        QCOMPARE(echo.echoed.genre, horror);
        QCOMPARE(echo.echoed.windowShare, 0.8);
        QCOMPARE(echo.echoed.priorShare, 0.0);
        QVERIFY(echo.echoes);
        QCOMPARE(echo.listShare, 0.6);

        // A list that does not follow the burst: 1 of 5 Horror.
        const auto calm = detector.detect(train, listOf(f, {"H8", "D27", "D28", "D29", "D0"}));
        QCOMPARE(calm.bursts.size(), std::size_t{1});
        QVERIFY(!calm.echoes);
        QCOMPARE(calm.listShare, 0.2);

        // Drama fills the older history, so its recent 0.2 share is no burst; and a history
        // with only 15 older rows is too short to call anything a burst.
        std::vector<Interaction> shortHistory(train.begin() + 10, train.end());
        const auto tooShort = detector.detect(shortHistory, listOf(f, {"H8", "H9"}));
        QVERIFY(!tooShort.enoughHistory);
        QVERIFY(!tooShort.echoes);

        // A missing timestamp skips the user.
        auto untimed = train;
        untimed[3].timestamp = kNoTimestamp;
        QVERIFY(!detector.detect(untimed, listOf(f, {"H8"})).hasTimestamps);

        // Prior share above burst_max_prior: Horror already 6 of 25 older rows (0.24 > 0.2).
        auto prior = train;
        for (int i = 0; i < 6; ++i)
            prior[static_cast<std::size_t>(i)].item = f.at("H" + std::to_string(8 + (i % 2)));
        QVERIFY(detector.detect(prior, listOf(f, {"H8", "H9"})).bursts.empty());
    }

    void itemMarksClearsWithoutTouchingSlots()
    {
        ItemMarks marks(4);
        QVERIFY(marks.insert(ItemIndex(2)));
        QVERIFY(!marks.insert(ItemIndex(2)));
        QVERIFY(marks.contains(ItemIndex(2)));
        marks.clear();
        QVERIFY(!marks.contains(ItemIndex(2)));
    }
};

QTEST_GUILESS_MAIN(TestBeyondMeasures)
#include "tst_beyondmeasures.moc"

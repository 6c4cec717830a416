// SPDX-License-Identifier: MIT
// What-if re-rankers: mmr, series-order and burst-damp on hand-built lists with known
// answers and on a synthetic workspace (core/syntheticdata.h).
#include "core/burstdampreranker.h"
#include "core/itemmarks.h"
#include "core/listdiversity.h"
#include "core/mmrreranker.h"
#include "core/runreranker.h"
#include "core/seriesorder.h"
#include "core/seriesorderreranker.h"
#include "core/syntheticdata.h"

#include <QTest>

#include <cmath>
#include <set>

using namespace slatewise::core;

namespace {

RunData singleUserRun(const std::vector<std::uint32_t>& items, const std::vector<float>& scores = {})
{
    RunData run;
    run.hasLists = true;
    run.listOffsets = {0, static_cast<std::uint32_t>(items.size())};
    for (std::size_t k = 0; k < items.size(); ++k)
        run.listRows.push_back({ItemIndex(items[k]), scores.empty() ? std::nanf("") : scores[k]});
    return run;
}

std::vector<std::uint32_t> itemsOf(std::span<const ListEntry> list)
{
    std::vector<std::uint32_t> out;
    for (const auto& e : list)
        out.push_back(e.item.value);
    return out;
}

double meanIld(const Dataset& d, const RunData& run, std::size_t k)
{
    const ListDiversity diversity(d.items, d.genreNames.size());
    double sum = 0;
    int n = 0;
    for (std::uint32_t u = 0; u < d.userCount(); ++u) {
        auto list = run.listOf(UserIndex(u));
        list = list.first(std::min(k, list.size()));
        const double v = diversity.ild(list);
        if (!std::isnan(v)) {
            sum += v;
            ++n;
        }
    }
    return sum / n;
}

ItemMarks seenMarks(const Dataset& d, UserIndex u)
{
    ItemMarks marks(d.itemCount());
    for (const auto& row : d.train.of(u))
        marks.insert(row.item);
    return marks;
}

} // namespace

class TestModelsRerank : public QObject {
    Q_OBJECT
private slots:
    void mmrWithLambdaOneKeepsTheParentOrder()
    {
        // Carbonell & Goldstein 1998: with λ = 1 MMR is ranking by relevance alone.
        SyntheticSpec spec;
        spec.users = 300;
        spec.items = 800;
        spec.listLength = 50;
        const auto ws = makeSynthetic(spec);
        RerankSettings s = RerankSettings::defaults(RerankMethod::Mmr);
        s.lambda = 1.0;
        auto run = rerankRun(ws.data, ws.run, s);
        QVERIFY(run.ok());
        QCOMPARE(run->listRows.size(), ws.run.listRows.size());
        for (std::size_t k = 0; k < run->listRows.size(); ++k)
            QCOMPARE(run->listRows[k].item, ws.run.listRows[k].item);
        QCOMPARE(run->scores, ws.run.scores); // derived runs keep the parent's scores
        QVERIFY(run->info.kind == RunKind::Reranked);
        QCOMPARE(run->info.method, std::string("mmr"));
    }

    void mmrWithSmallerLambdaRaisesIld()
    {
        SyntheticSpec spec;
        spec.users = 300;
        spec.items = 800;
        spec.listLength = 50;
        const auto ws = makeSynthetic(spec);
        double previous = meanIld(ws.data, ws.run, 10);
        qInfo("ild@10 parent %.4f", previous);
        for (double lambda : {0.9, 0.7, 0.5, 0.3}) {
            RerankSettings s = RerankSettings::defaults(RerankMethod::Mmr);
            s.lambda = lambda;
            auto run = rerankRun(ws.data, ws.run, s);
            QVERIFY(run.ok());
            const double ild = meanIld(ws.data, run.value(), 10);
            qInfo("ild@10 at lambda %.1f: %.4f", lambda, ild);
            QVERIFY2(ild > previous, qPrintable(QString("%1 <= %2").arg(ild).arg(previous)));
            previous = ild;
        }
    }

    void mmrHandExample()
    {
        // Items 0 and 1 share genre set {0}; item 2 has {1}. Rank-based relevance 1, 2/3, 1/3.
        // λ = 0.5: first 0 (0.5); then 1: 0.5·2/3 − 0.5·1 = −1/6, 2: 0.5·1/3 − 0 = 1/6 → 2; then 1.
        Dataset d;
        d.genreNames = {"a", "b"};
        d.items.resize(3);
        d.items[0].genres = {0};
        d.items[1].genres = {0};
        d.items[2].genres = {1};
        const RunData parent = singleUserRun({0, 1, 2});
        QCOMPARE(itemsOf(MmrReranker::rerankList(d, parent.listOf(UserIndex(0)), 0.5)),
                 (std::vector<std::uint32_t>{0, 2, 1}));
        QCOMPARE(MmrReranker::genreSimilarity(d.items[0], d.items[2]), 0.0);
        QCOMPARE(MmrReranker::genreSimilarity(d.items[0], d.items[1]), 1.0);
    }

    void seriesOrderHandExample()
    {
        // Series parts: item 0 = part 1, item 1 = part 2, item 2 = part 3; items 3, 4, 5 standalone.
        Dataset d;
        d.seriesNames = {"s"};
        d.items.resize(6);
        for (int p = 0; p < 3; ++p) {
            d.items[static_cast<std::size_t>(p)].series = 0;
            d.items[static_cast<std::size_t>(p)].seriesPart = p + 1;
        }
        const auto series = SeriesOrderReranker::seriesIndex(d);
        // Part 3 at rank 1, part 1 further down, part 2 absent: part 1 moves up, part 2 takes
        // part 3's place.
        const RunData a = singleUserRun({2, 3, 4, 0, 5});
        QCOMPARE(itemsOf(SeriesOrderReranker::rerankList(d, series, {}, a.listOf(UserIndex(0)))),
                 (std::vector<std::uint32_t>{0, 1, 3, 4, 5}));
        // Part 1 seen: part 3 is replaced by part 2 only.
        const std::vector<std::uint32_t> seen{0};
        const RunData c = singleUserRun({2, 3, 4, 5});
        QCOMPARE(itemsOf(SeriesOrderReranker::rerankList(d, series, seen, c.listOf(UserIndex(0)))),
                 (std::vector<std::uint32_t>{1, 3, 4, 5}));
        // Part 2 below part 1 is fine and stays.
        const RunData b = singleUserRun({0, 3, 1});
        QCOMPARE(itemsOf(SeriesOrderReranker::rerankList(d, series, {}, b.listOf(UserIndex(0)))),
                 (std::vector<std::uint32_t>{0, 3, 1}));
    }

    void seriesOrderLeavesNoViolations()
    {
        SyntheticSpec spec;
        spec.users = 400;
        spec.items = 600;
        spec.listLength = 100;
        spec.seed = 9;
        const auto ws = makeSynthetic(spec);
        const SeriesOrder checker(ws.data.items);
        auto run = rerankRun(ws.data, ws.run, RerankSettings::defaults(RerankMethod::SeriesOrder));
        QVERIFY(run.ok());
        std::size_t before = 0, after = 0;
        for (std::uint32_t u = 0; u < ws.data.userCount(); ++u) {
            const UserIndex user(u);
            const ItemMarks seen = seenMarks(ws.data, user);
            before += checker.check(ws.run.listOf(user), seen).size();
            after += checker.check(run->listOf(user), seen).size();
            QCOMPARE(run->listOf(user).size(), ws.run.listOf(user).size());
            std::set<std::uint32_t> distinct;
            for (const auto& e : run->listOf(user)) {
                QVERIFY(!seen.contains(e.item));
                QVERIFY(distinct.insert(e.item.value).second);
            }
        }
        qInfo("order violations: parent %zu, re-ranked %zu", before, after);
        QVERIFY(before > 0); // the check must have had something to fix
        QCOMPARE(after, std::size_t(0));
    }

    void burstDampMovesBurstItemsDown()
    {
        // 30 older interactions in genre 0, the last 10 in genre 1: genre 1 is a burst
        // (window share 1 ≥ 0.6, prior share 0 ≤ 0.2, 30 ≥ 20 older rows).
        Dataset d;
        d.genreNames = {"drama", "horror"};
        d.userIds = {"u"};
        for (int i = 0; i < 50; ++i) {
            Item item;
            item.genres = {i < 25 ? 0 : 1};
            d.items.push_back(item);
        }
        d.train.offsets = {0, 40};
        for (int k = 0; k < 40; ++k)
            d.train.rows.push_back({ItemIndex(static_cast<std::uint32_t>(k < 30 ? k % 25 : 25 + k - 30)), 4.0f, 1000 + k});
        d.withheld.offsets = {0, 0};
        const RunData parent = singleUserRun({40, 41, 20, 42, 21});
        const auto bursts = BurstDampReranker::bursts(d, UserIndex(0), RerankSettings::defaults(RerankMethod::BurstDamp));
        QCOMPARE(bursts.size(), std::size_t(1));
        QCOMPARE(bursts[0].genre, 1);
        QCOMPARE(itemsOf(BurstDampReranker::rerankList(d, bursts, parent.listOf(UserIndex(0)), 1.0)),
                 (std::vector<std::uint32_t>{20, 21, 40, 41, 42}));
        QCOMPARE(itemsOf(BurstDampReranker::rerankList(d, bursts, parent.listOf(UserIndex(0)), 0.0)),
                 (std::vector<std::uint32_t>{40, 41, 20, 42, 21}));
        // Without timestamps the user is skipped.
        for (auto& row : d.train.rows)
            row.timestamp = kNoTimestamp;
        QVERIFY(BurstDampReranker::bursts(d, UserIndex(0), RerankSettings::defaults(RerankMethod::BurstDamp)).empty());
    }

    void lambdaOutsideZeroToOneIsAUsageError()
    {
        SyntheticSpec spec;
        spec.users = 10;
        spec.items = 50;
        const auto ws = makeSynthetic(spec);
        RerankSettings s = RerankSettings::defaults(RerankMethod::Mmr);
        s.lambda = 1.5;
        auto run = rerankRun(ws.data, ws.run, s);
        QVERIFY(!run.ok());
        QCOMPARE(run.error().kind, ErrorKind::Usage);
    }
};

QTEST_GUILESS_MAIN(TestModelsRerank)
#include "tst_modelsrerank.moc"

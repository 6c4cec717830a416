// SPDX-License-Identifier: MIT
// The workspace file: migration from a stored version-1 fixture, refusal of newer versions,
// loading the dataset in the documented order, storing and loading runs, and the synthetic
// generator other benchmarks rely on.
#include "core/importer.h"
#include "core/schema.h"
#include "core/sha256.h"
#include "core/sqlitedb.h"
#include "core/syntheticdata.h"
#include "core/workspace.h"

#include <QDir>
#include <QFile>
#include <QTemporaryDir>
#include <QTest>

#include <algorithm>
#include <cmath>
#include <set>

#include "support/testsupport.h"

using namespace slatewise::core;
using slatewise::test::fileBytes;
using slatewise::test::testData;
using slatewise::test::testDataPath;

namespace {

QString sha(const QString& path)
{
    const QByteArray bytes = fileBytes(path);
    return QString::fromStdString(
        Sha256::hex(std::string_view(bytes.constData(), static_cast<std::size_t>(bytes.size()))));
}

/// Builds a database from SQL text (the stored fixture), as an older Slatewise would have.
void buildFromSql(const QString& dbPath, const QByteArray& sql)
{
    QFile::remove(dbPath);
    SqliteDb db = SqliteDb::open(dbPath.toStdString(), true);
    db.exec(sql.toStdString());
}

} // namespace

class TestWorkspace : public QObject {
    Q_OBJECT
    QTemporaryDir m_tmp;

private slots:
    void initTestCase()
    {
        QVERIFY(m_tmp.isValid());
        slatewise::test::failOnUnexpectedMessages();
    }

    void migratesVersionOneFixture()
    {
        const QString file = m_tmp.filePath(QStringLiteral("v1.sqlite"));
        buildFromSql(file, fileBytes(testDataPath(QStringLiteral("workspace-v1.sql"))));
        auto ws = Workspace::open(file.toStdString());
        QVERIFY2(ws.ok(), ws.ok() ? "" : ws.error().toString().c_str());
        const auto summary = ws->summary();
        QVERIFY(summary.ok());
        QCOMPARE(summary->schemaVersion, kSchemaVersion);
        QCOMPARE(summary->items, qint64(3));
        QCOMPARE(summary->users, qint64(2));
        QCOMPARE(summary->trainRows, qint64(3));
        QCOMPARE(summary->withheldRows, qint64(2));
        QCOMPARE(summary->genres, qint64(3));
        QCOMPARE(summary->series, qint64(1));
        QVERIFY(!summary->scale.inferred);
        QCOMPARE(summary->runs.size(), std::size_t(1));
        QCOMPARE(summary->runs[0].name, std::string("old-run"));
        QCOMPARE(static_cast<int>(summary->runs[0].kind),
            static_cast<int>(RunKind::Imported)); // the column version 2 added, with its default
        QCOMPARE(summary->runs[0].listUserCount, qint64(2));

        // Version 2's tables and index exist.
        Statement tables(ws->db(),
            "SELECT count(*) FROM sqlite_master WHERE name IN ('evaluations','user_results','user_warnings',"
            "'comparisons','fit_log','train_by_user')");
        QVERIFY(tables.step());
        QCOMPARE(tables.int64(0), qint64(6));
        // Version 3 recorded the run's counts from its rows (2 scores, 3 list rows, 2 users).
        Statement counts(ws->db(), "SELECT score_count, list_rows, list_users FROM runs WHERE name = 'old-run'");
        QVERIFY(counts.step());
        QCOMPARE(counts.int64(0), qint64(2));
        QCOMPARE(counts.int64(1), qint64(3));
        QCOMPARE(counts.int64(2), qint64(2));
        QCOMPARE(summary->runs[0].scoreCount, qint64(2));
        QCOMPARE(summary->runs[0].listRowCount, qint64(3));

        // The data survived and loads in the documented order.
        auto data = ws->loadDataset();
        QVERIFY(data.ok());
        QCOMPARE(data->userIds, (std::vector<std::string> { "member-7", "member-9" }));
        QCOMPARE(data->items[1].title, std::string("Harbour Lights Again"));
        QCOMPARE(data->items[1].series, 0);
        QCOMPARE(data->items[1].seriesPart, 2);
        QCOMPARE(data->items[0].genres, (std::vector<std::int32_t> { 0, 2 }));
        QCOMPARE(data->items[2].series, kNone);
        // member-7's train rows sorted by timestamp: f1 (1735689600) before f3 (1735732800).
        const auto train = data->train.of(UserIndex(0));
        QCOMPARE(train.size(), std::size_t(2));
        QCOMPARE(train[0].item, ItemIndex(0));
        QCOMPARE(train[1].item, ItemIndex(2));
        QCOMPARE(data->train.of(UserIndex(1))[0].timestamp, kNoTimestamp);
        auto run = ws->loadRun("old-run", *data);
        QVERIFY(run.ok());
        QVERIFY(run->hasScores && run->hasLists);
        QCOMPARE(run->scores, (std::vector<float> { 4.5f, 3.5f }));
        QCOMPARE(run->listOf(UserIndex(0)).size(), std::size_t(2));
        QCOMPARE(run->listOf(UserIndex(0))[1].item, ItemIndex(2));
        QCOMPARE(run->listOf(UserIndex(1)).size(), std::size_t(1));
        QCOMPARE(run->listOf(UserIndex(1))[0].score, 3.5f);

        // Opening again is a no-op (already current).
        ws = Workspace::open(file.toStdString());
        QVERIFY(ws.ok());
    }

    void refusesNewerVersion()
    {
        const QString file = m_tmp.filePath(QStringLiteral("future.sqlite"));
        buildFromSql(file,
            fileBytes(testDataPath(QStringLiteral("workspace-v1.sql")))
                + "\nUPDATE meta SET value = '99' WHERE key = 'schema_version';");
        const QString before = sha(file);
        auto ws = Workspace::open(file.toStdString());
        QVERIFY(!ws.ok());
        QCOMPARE(static_cast<int>(ws.error().kind), static_cast<int>(ErrorKind::Workspace));
        QCOMPARE(QString::fromStdString(ws.error().toString()),
            file
                + QStringLiteral(
                    ": workspace has schema version 99, newer than this Slatewise understands (up to version ")
                + QString::number(kSchemaVersion)
                + QStringLiteral(") (expected a newer version of Slatewise to open it)"));
        QCOMPARE(sha(file), before);
        const auto cli = slatewise::test::runCli({ QStringLiteral("info"), file });
        QCOMPARE(cli.exitCode, 3);
        QVERIFY(cli.err.contains(QStringLiteral("newer than this Slatewise understands")));
    }

    void refusesOtherFiles()
    {
        const QString text = m_tmp.filePath(QStringLiteral("notes.sqlite"));
        QFile f(text);
        QVERIFY(f.open(QIODevice::WriteOnly));
        f.write("this is not a database, just some text that is long enough to have a header..........");
        f.close();
        auto ws = Workspace::open(text.toStdString());
        QVERIFY(!ws.ok());
        QVERIFY(ws.error().message.find("not a Slatewise workspace") != std::string::npos);
        auto missing = Workspace::open(m_tmp.filePath(QStringLiteral("nothing.sqlite")).toStdString());
        QVERIFY(!missing.ok());
        QCOMPARE(missing.error().message, std::string("workspace file not found"));
    }

    void datasetOrderAfterImport()
    {
        ImportRequest r;
        r.workspacePath = m_tmp.filePath(QStringLiteral("order.sqlite")).toStdString();
        r.catalogPath = testData("import/catalog.csv");
        r.trainPath = testData("import/train.csv");
        r.withheldPath = testData("import/withheld.csv");
        QVERIFY(importWorkspace(r).ok());
        auto ws = Workspace::open(r.workspacePath, true);
        QVERIFY(ws.ok());
        auto data = ws->loadDataset();
        QVERIFY(data.ok());
        // Users in order of first appearance in train, then withheld.
        QCOMPARE(data->userIds, (std::vector<std::string> { "ada", "bo", "cy", "dee" }));
        // Items in catalog order; genres in order of first appearance, ascending per item.
        QCOMPARE(data->items[2].externalId, std::string("m03"));
        QCOMPARE(data->genreNames[0], std::string("Drama"));
        QCOMPARE(data->items[5].title, std::string("Paper Kites, Iron Skies"));
        QCOMPARE(data->items[7].title, std::string("The \"Late\" Show at Fennick Hall"));
        QCOMPARE(data->seriesNames, (std::vector<std::string> { "Tides", "Meridian" }));
        QCOMPARE(data->items[4].seriesPart, 3);
        // ada: m01 (Jan 3), m02 (Jan 10), m03 (1736625600 = Jan 11 20:00Z), m07 (Jan 20 19:00Z).
        std::vector<std::string> ada;
        for (const auto& row : data->train.of(UserIndex(0)))
            ada.push_back(data->items[row.item.value].externalId);
        QCOMPARE(ada, (std::vector<std::string> { "m01", "m02", "m03", "m07" }));
        // bo's row without a timestamp sorts first.
        QCOMPARE(data->items[data->train.of(UserIndex(1))[0].item.value].externalId, std::string("m06"));
        QCOMPARE(data->train.size(), std::size_t(13));
        QCOMPARE(data->withheld.size(), std::size_t(6));
        QCOMPARE(findWithheld(*data, UserIndex(2), ItemIndex(11)), std::int64_t(4)); // cy, m12
        QCOMPARE(data->withheld.rows[4].rating, 1.0f);
    }

    void syntheticIsDeterministicAndConsistent()
    {
        SyntheticSpec spec;
        spec.users = 300;
        spec.items = 800;
        spec.listLength = 40;
        const auto a = makeSynthetic(spec);
        const auto b = makeSynthetic(spec);
        QCOMPARE(a.data.train.size(), b.data.train.size());
        QVERIFY(std::equal(a.data.train.rows.begin(), a.data.train.rows.end(), b.data.train.rows.begin(),
            [](const Interaction& x, const Interaction& y) {
                return x.item == y.item && x.rating == y.rating && x.timestamp == y.timestamp;
            }));
        QCOMPARE(a.run.scores, b.run.scores);
        spec.seed = 2;
        QVERIFY(makeSynthetic(spec).run.scores != a.run.scores);

        const Dataset& d = a.data;
        QCOMPARE(d.userCount(), std::size_t(300));
        QCOMPARE(d.itemCount(), std::size_t(800));
        // Means are close to the spec (counts vary uniformly from half to 1.5 times).
        QVERIFY(std::fabs(double(d.train.size()) / 300.0 - spec.trainPerUser) < 5.0);
        QCOMPARE(a.run.scores.size(), d.withheld.size());
        QCOMPARE(a.run.listRows.size(), std::size_t(300 * 40));
        bool someSeries = false;
        for (const auto& item : d.items) {
            QVERIFY(item.genres.size() >= 1 && item.genres.size() <= 3);
            QVERIFY(std::is_sorted(item.genres.begin(), item.genres.end()));
            someSeries = someSeries || item.series != kNone;
        }
        QVERIFY(someSeries);
        for (std::uint32_t u = 0; u < 300; ++u) {
            std::set<std::uint32_t> train;
            Timestamp last = kNoTimestamp;
            for (const auto& row : d.train.of(UserIndex(u))) {
                train.insert(row.item.value);
                QVERIFY(row.timestamp >= last);
                last = row.timestamp;
                QVERIFY(row.rating >= 1.0f && row.rating <= 5.0f);
            }
            const auto held = d.withheld.of(UserIndex(u));
            for (std::size_t j = 0; j < held.size(); ++j) {
                QVERIFY(!train.count(held[j].item.value)); // no leakage
                QVERIFY(j == 0 || held[j - 1].item < held[j].item);
                QVERIFY(held[j].timestamp > last);
            }
            std::set<std::uint32_t> listed;
            for (const auto& e : a.run.listOf(UserIndex(u))) {
                QVERIFY(!train.count(e.item.value));
                QVERIFY(listed.insert(e.item.value).second);
            }
        }
    }

    void syntheticFilesImportAndRunsRoundTrip()
    {
        SyntheticSpec spec;
        spec.users = 200;
        spec.items = 500;
        spec.listLength = 20;
        spec.seed = 7;
        const QString dir = m_tmp.filePath(QStringLiteral("synthetic"));
        QDir().mkpath(dir);
        QVERIFY(writeSyntheticFiles(spec, dir.toStdString()).ok());
        ImportRequest r;
        r.workspacePath = (dir + QStringLiteral("/ws.sqlite")).toStdString();
        r.catalogPath = (dir + QStringLiteral("/catalog.csv")).toStdString();
        r.trainPath = (dir + QStringLiteral("/train.csv")).toStdString();
        r.withheldPath = (dir + QStringLiteral("/withheld.csv")).toStdString();
        r.options.strict = true;
        auto imported = importWorkspace(r);
        QVERIFY2(imported.ok(), imported.ok() ? "" : imported.error().toString().c_str());
        AddRunRequest add;
        add.workspacePath = r.workspacePath;
        add.name = "from-files";
        add.scoresPath = (dir + QStringLiteral("/scores.csv")).toStdString();
        add.listsPath = (dir + QStringLiteral("/lists.csv")).toStdString();
        auto added = addRun(add);
        QVERIFY2(added.ok(), added.ok() ? "" : added.error().toString().c_str());
        QCOMPARE(added->scoresOutsideWithheld, qint64(0));
        QCOMPARE(added->withheldWithoutScore, qint64(0));

        const SyntheticWorkspace expected = makeSynthetic(spec);
        auto ws = Workspace::open(r.workspacePath);
        QVERIFY(ws.ok());
        auto data = ws->loadDataset();
        QVERIFY(data.ok());
        QCOMPARE(data->userIds, expected.data.userIds);
        QCOMPARE(data->train.offsets, expected.data.train.offsets);
        QCOMPARE(data->withheld.offsets, expected.data.withheld.offsets);
        for (std::size_t i = 0; i < data->withheld.size(); ++i) {
            QCOMPARE(data->withheld.rows[i].item, expected.data.withheld.rows[i].item);
            QCOMPARE(data->withheld.rows[i].timestamp, expected.data.withheld.rows[i].timestamp);
        }
        auto run = ws->loadRun("from-files", *data);
        QVERIFY(run.ok());
        QCOMPARE(run->listOffsets, expected.run.listOffsets);
        for (std::size_t i = 0; i < run->listRows.size(); ++i)
            QCOMPARE(run->listRows[i].item, expected.run.listRows[i].item);
        // Scores pass through text with six significant digits.
        for (std::size_t i = 0; i < run->scores.size(); ++i)
            QVERIFY(std::fabs(run->scores[i] - expected.run.scores[i]) < 1e-4f);

        // storeRun / loadRun / deleteRun on the in-memory run.
        RunData fitted = expected.run;
        fitted.info.name = "stored";
        fitted.info.kind = RunKind::Fitted;
        fitted.info.method = "synthetic";
        fitted.info.parentName = "from-files";
        fitted.scores[3] = std::nanf("");
        auto id = ws->storeRun(fitted, *data);
        QVERIFY2(id.ok(), id.ok() ? "" : id.error().toString().c_str());
        auto back = ws->loadRun("stored", *data);
        QVERIFY(back.ok());
        QCOMPARE(static_cast<int>(back->info.kind), static_cast<int>(RunKind::Fitted));
        QCOMPARE(back->info.parentName, std::string("from-files"));
        QCOMPARE(back->info.scoreCount, qint64(fitted.scores.size() - 1));
        QVERIFY(std::isnan(back->scores[3]));
        QCOMPARE(back->scores[4], fitted.scores[4]);
        QCOMPARE(back->listRows.size(), fitted.listRows.size());
        QCOMPARE(back->listRows[17].score, fitted.listRows[17].score);
        // The counts recorded when each run was written equal counting its rows.
        for (const char* name : { "from-files", "stored" }) {
            Statement c(ws->db(),
                "SELECT r.score_count, r.list_rows, r.list_users,"
                " (SELECT count(*) FROM run_scores s WHERE s.run_id = r.run_id),"
                " (SELECT count(*) FROM run_lists l WHERE l.run_id = r.run_id),"
                " (SELECT count(DISTINCT user_id) FROM run_lists l WHERE l.run_id = r.run_id)"
                " FROM runs r WHERE r.name = ?");
            c.bind(1, name);
            QVERIFY(c.step());
            QVERIFY(c.int64(0) > 0 && c.int64(1) > 0);
            QCOMPARE(c.int64(0), c.int64(3));
            QCOMPARE(c.int64(1), c.int64(4));
            QCOMPARE(c.int64(2), c.int64(5));
        }
        QVERIFY(!ws->storeRun(fitted, *data).ok()); // name taken
        QVERIFY(ws->deleteRun("stored").ok());
        QVERIFY(!ws->run("stored").ok());
        QVERIFY(!ws->deleteRun("stored").ok());
        Statement left(ws->db(), "SELECT count(*) FROM run_lists");
        QVERIFY(left.step());
        QCOMPARE(left.int64(0), qint64(expected.run.listRows.size())); // only from-files remains
    }
};

QTEST_GUILESS_MAIN(TestWorkspace)
#include "tst_workspace.moc"

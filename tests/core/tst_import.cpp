// SPDX-License-Identifier: MIT
// Import and add-run: every bad-input case of docs/formats.md gives its exact message (file,
// line, column) and leaves the workspace byte-for-byte unchanged; good input round-trips
// through `slatewise import` and `slatewise info`.
#include "core/importer.h"
#include "core/sha256.h"
#include "core/workspace.h"

#include "support/testsupport.h"

#include <QDir>
#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QTemporaryDir>
#include <QTest>

#include <algorithm>
#include <atomic>
#include <mutex>

using namespace slatewise::core;
using slatewise::test::fileBytes;
using slatewise::test::runCli;
using slatewise::test::testData;
using slatewise::test::testDataPath;

namespace {

QByteArray fixture(const char* name) { return fileBytes(testDataPath(QStringLiteral("import/") + QLatin1String(name))); }

/// Number of data rows of a fixture (its lines minus the header; fixtures hold no
/// embedded line breaks).
qint64 dataRows(const char* name) { return fixture(name).count('\n') - 1; }

QString sha(const QString& path)
{
    const QByteArray bytes = fileBytes(path);
    return QString::fromStdString(Sha256::hex(std::string_view(bytes.constData(), static_cast<std::size_t>(bytes.size()))));
}

} // namespace

class TestImport : public QObject {
    Q_OBJECT

    QTemporaryDir m_tmp;

    QString path(const QString& name) const { return m_tmp.filePath(name); }
    QString write(const QString& name, const QByteArray& bytes) const
    {
        QFile f(path(name));
        if (!f.open(QIODevice::WriteOnly | QIODevice::Truncate))
            qFatal("cannot write test file");
        f.write(bytes);
        return path(name);
    }
    /// A fresh copy of the good fixtures under `prefix`.
    ImportRequest goodRequest(const QString& prefix, const QString& workspace) const
    {
        ImportRequest r;
        r.workspacePath = path(workspace).toStdString();
        r.catalogPath = write(prefix + QStringLiteral("catalog.csv"), fixture("catalog.csv")).toStdString();
        r.trainPath = write(prefix + QStringLiteral("train.csv"), fixture("train.csv")).toStdString();
        r.withheldPath = write(prefix + QStringLiteral("withheld.csv"), fixture("withheld.csv")).toStdString();
        return r;
    }
    QStringList leftovers() const
    {
        return QDir(m_tmp.path()).entryList({QStringLiteral(".*importing*"), QStringLiteral("*-journal")},
                                            QDir::Files | QDir::Hidden);
    }

private slots:
    void initTestCase()
    {
        QVERIFY(m_tmp.isValid());
        slatewise::test::failOnUnexpectedMessages();
    }

    void roundTripThroughCommandLine()
    {
        const QString ws = path(QStringLiteral("roundtrip.sqlite"));
        const auto imported = runCli({QStringLiteral("import"), ws, QStringLiteral("--catalog"), testDataPath(QStringLiteral("import/catalog.csv")),
                                      QStringLiteral("--train"), testDataPath(QStringLiteral("import/train.csv")), QStringLiteral("--test"),
                                      testDataPath(QStringLiteral("import/withheld.csv")), QStringLiteral("--quiet")});
        QCOMPARE(imported.err, QString());
        QCOMPARE(imported.exitCode, 0);
        QVERIFY(imported.out.contains(QStringLiteral("scale     1 to 5 in steps of 1 (inferred from the ratings)")));
        const auto added = runCli({QStringLiteral("add-run"), ws, QStringLiteral("--name"), QStringLiteral("club-picks"),
                                   QStringLiteral("--scores"), testDataPath(QStringLiteral("import/scores.csv")), QStringLiteral("--lists"),
                                   testDataPath(QStringLiteral("import/lists.csv")), QStringLiteral("--quiet")});
        QCOMPARE(added.exitCode, 0);
        // dee,m06 is not a withheld pair: stored, with a note.
        QVERIFY2(added.err.contains(QStringLiteral("1 score(s) are for pairs outside the withheld set")), qPrintable(added.err));

        const auto info = runCli({QStringLiteral("info"), ws, QStringLiteral("--json")});
        QCOMPARE(info.exitCode, 0);
        const QJsonObject o = QJsonDocument::fromJson(info.out.toUtf8()).object();
        QCOMPARE(o.value(QStringLiteral("items")).toInteger(), dataRows("catalog.csv"));
        QCOMPARE(o.value(QStringLiteral("train")).toInteger(), dataRows("train.csv"));
        QCOMPARE(o.value(QStringLiteral("withheld")).toInteger(), dataRows("withheld.csv"));
        QCOMPARE(o.value(QStringLiteral("users")).toInteger(), qint64(4)); // ada, bo, cy, dee
        QCOMPARE(o.value(QStringLiteral("genres")).toInteger(), qint64(9));
        QCOMPARE(o.value(QStringLiteral("series")).toInteger(), qint64(2));
        QCOMPARE(o.value(QStringLiteral("scale")).toObject().value(QStringLiteral("source")).toString(), QStringLiteral("inferred"));
        const QJsonArray runs = o.value(QStringLiteral("runs")).toArray();
        QCOMPARE(runs.size(), 1);
        QCOMPARE(runs[0].toObject().value(QStringLiteral("scores")).toInteger(), dataRows("scores.csv"));
        QCOMPARE(runs[0].toObject().value(QStringLiteral("list_rows")).toInteger(), dataRows("lists.csv"));
        QCOMPARE(runs[0].toObject().value(QStringLiteral("list_users")).toInteger(), qint64(4));

        const auto text = runCli({QStringLiteral("info"), ws});
        QCOMPARE(text.exitCode, 0);
        QVERIFY(text.out.contains(QStringLiteral("  train     ") + QString::number(dataRows("train.csv")) + QLatin1Char('\n')));
        QVERIFY(text.out.contains(QStringLiteral("club-picks (imported): scores 7, list rows 9 for 4 users")));

        // Provenance: names, sizes and SHA-256 of the source files.
        auto opened = Workspace::open(ws.toStdString(), true);
        QVERIFY(opened.ok());
        Statement q(opened->db(), "SELECT name, size, sha256 FROM source_files WHERE role = 'train'");
        QVERIFY(q.step());
        QCOMPARE(q.text(0), std::string("train.csv"));
        QCOMPARE(q.int64(1), qint64(fixture("train.csv").size()));
        QCOMPARE(QString::fromStdString(q.text(2)), sha(testDataPath(QStringLiteral("import/train.csv"))));
        Statement fk(opened->db(), "PRAGMA foreign_key_check");
        QVERIFY2(!fk.step(), "every key must reference an existing row");
    }

    void exitCodes()
    {
        QCOMPARE(runCli({QStringLiteral("import"), path(QStringLiteral("x.sqlite")), QStringLiteral("--catalog"), QStringLiteral("c.csv")}).exitCode, 1);
        QCOMPARE(runCli({QStringLiteral("info"), path(QStringLiteral("missing.sqlite"))}).exitCode, 3);
        const auto bad = runCli({QStringLiteral("import"), path(QStringLiteral("x.sqlite")), QStringLiteral("--catalog"),
                                 testDataPath(QStringLiteral("import/catalog.csv")), QStringLiteral("--train"),
                                 testDataPath(QStringLiteral("import/withheld.csv")), QStringLiteral("--test"),
                                 testDataPath(QStringLiteral("import/train.csv")), QStringLiteral("--scale"), QStringLiteral("2:5:1")});
        QCOMPARE(bad.exitCode, 2);
        QVERIFY2(bad.err.contains(QStringLiteral("rating is outside the scale: '1' (expected a rating from 2 to 5 in steps of 1)")),
                 qPrintable(bad.err));
        QVERIFY(!QFile::exists(path(QStringLiteral("x.sqlite"))));
        QCOMPARE(runCli({QStringLiteral("import"), QStringLiteral("--help")}).exitCode, 0);
        // A required option is named in the usage error (exit code 1), before any file is read;
        // --help still works without it.
        const auto noRun = runCli({QStringLiteral("worst"), path(QStringLiteral("missing.sqlite")), QStringLiteral("--by"),
                                   QStringLiteral("ndcg")});
        QCOMPARE(noRun.exitCode, 1);
        QVERIFY2(noRun.err.contains(QStringLiteral("--run NAME is required")), qPrintable(noRun.err));
        const auto help = runCli({QStringLiteral("worst"), QStringLiteral("--help")});
        QCOMPARE(help.exitCode, 0);
        QVERIFY2(help.out.contains(QStringLiteral("the run to look at (required)")), qPrintable(help.out));
    }

    void badImport_data()
    {
        QTest::addColumn<QString>("file");    // which input to replace
        QTest::addColumn<QByteArray>("bytes"); // its content
        QTest::addColumn<QString>("scale");
        QTest::addColumn<bool>("strict");
        QTest::addColumn<qint64>("line");
        QTest::addColumn<qint64>("column");
        QTest::addColumn<QString>("message"); // Error::toString() after "<file>:"

        const QByteArray header = "user_id,item_id,rating,timestamp\n";
        QTest::newRow("empty file") << "train.csv" << QByteArray() << QString() << false << qint64(0) << qint64(0)
                                    << ": file is empty (expected a header row followed by data rows)";
        QTest::newRow("header only") << "withheld.csv" << header << QString() << false << qint64(0) << qint64(0)
                                     << ": file has a header but no data rows (expected at least one interaction)";
        QTest::newRow("missing column") << "train.csv" << QByteArray("user_id,item_id,timestamp\nada,m01,1\n") << QString() << false
                                        << qint64(1) << qint64(0)
                                        << ":1: missing required column 'rating': 'user_id,item_id,timestamp' (expected a header with the "
                                           "columns user_id,item_id,rating,[timestamp] in any order)";
        QTest::newRow("non-numeric rating") << "train.csv" << header + "ada,m01,5,\nada,m02,five,\n" << QString() << false << qint64(3)
                                            << qint64(3) << ":3:3: rating is not a number: 'five' (expected a decimal number)";
        QTest::newRow("row with too few fields") << "train.csv" << header + "ada,m01,5\n" << QString() << false << qint64(2) << qint64(4)
                                                 << ":2:4: row has 3 fields, the header has 4 (expected 4 fields as in the header)";
        QTest::newRow("infinite rating") << "train.csv" << header + "ada,m01,inf,\n" << QString() << false << qint64(2) << qint64(3)
                                         << ":2:3: rating is not a finite number: 'inf' (expected a decimal number)";
        QTest::newRow("out-of-scale rating") << "withheld.csv" << header + "ada,m08,4,\nbo,m05,6,\n" << QStringLiteral("1:5:1") << false
                                             << qint64(3) << qint64(3)
                                             << ":3:3: rating is outside the scale: '6' (expected a rating from 1 to 5 in steps of 1)";
        QTest::newRow("off-step rating") << "train.csv" << header + "ada,m01,3.5,\n" << QStringLiteral("1:5:1") << false << qint64(2)
                                         << qint64(3) << ":2:3: rating is outside the scale: '3.5' (expected a rating from 1 to 5 in steps of 1)";
        QTest::newRow("malformed timestamp") << "train.csv" << header + "ada,m01,5,2025-02-30T10:00:00Z\n" << QString() << false
                                             << qint64(2) << qint64(4)
                                             << ":2:4: timestamp is malformed: '2025-02-30T10:00:00Z' (expected Unix seconds or ISO 8601 "
                                                "such as 2026-03-04T20:15:00Z, or an empty cell)";
        QTest::newRow("duplicate withheld pair") << "withheld.csv" << header + "ada,m08,4,\nbo,m05,5,\nada,m08,3,\n" << QString() << false
                                                 << qint64(4) << qint64(1)
                                                 << ":4:1: duplicate (user_id, item_id) pair, first on line 2: 'ada, m08' (expected each "
                                                    "(user_id, item_id) pair at most once in the withheld file)";
        QTest::newRow("unknown item in train") << "train.csv" << header + "ada,m01,5,\nada,m99,4,\n" << QString() << false << qint64(3)
                                               << qint64(2)
                                               << ":3:2: unknown item id: 'm99' (expected an item_id listed in the catalog (or "
                                                  "--allow-unknown-items))";
        QTest::newRow("leakage with strict") << "withheld.csv" << header + "ada,m08,4,\nada,m01,5,\n" << QString() << true << qint64(3)
                                             << qint64(1)
                                             << ":3:1: withheld pair also in train (leakage): 'ada, m01' (expected withheld pairs absent "
                                                "from the train file (or run without --strict))";
        QTest::newRow("invalid UTF-8") << "catalog.csv" << QByteArray("item_id,title\nm01,Caf\xE9 Noir\n") << QString() << false
                                       << qint64(2) << qint64(2) << ":2:2: invalid UTF-8: '0xE9 0x20 0x4E 0x6F' (expected text encoded as UTF-8)";
        QByteArray longLine = header + "ada,m01,5,\"";
        longLine.append(QByteArray(1 << 20, 'x'));
        longLine.append("\"\n");
        QTest::newRow("line over 1 MiB") << "train.csv" << longLine << QString() << false << qint64(2) << qint64(4)
                                         << ":2:4: line is longer than 1 MiB (1048588 bytes) (expected lines of at most 1048576 bytes)";
        QTest::newRow("binary file") << "catalog.csv" << QByteArray("\x89PNG\r\n\x1a\n\0\0\0\rIHDR", 16) << QString() << false << qint64(3)
                                     << qint64(1) << ":3:1: NUL byte: this looks like a binary file, not text (expected a UTF-8 text file)";
        QTest::newRow("duplicate item in catalog") << "catalog.csv" << QByteArray("item_id,title\nm01,A\nm02,B\nm01,C\n") << QString() << false
                                                   << qint64(4) << qint64(1)
                                                   << ":4:1: duplicate item_id, first on line 2: 'm01' (expected each item_id once in the catalog)";
        QTest::newRow("bad series part") << "catalog.csv" << QByteArray("item_id,title,series,series_part\nm01,A,Tides,0\n") << QString() << false
                                         << qint64(2) << qint64(4)
                                         << ":2:4: series_part is not a positive whole number: '0' (expected a positive whole number giving "
                                            "the order within the series (1 = first))";
        QTest::newRow("unclosed quote") << "train.csv" << header + "ada,\"m01,5,\n" << QString() << false << qint64(2) << qint64(2)
                                        << ":2:2: quoted field is not closed before the end of the file (expected a closing double quote)";
        QTest::newRow("id over 256 bytes") << "train.csv" << header + QByteArray(257, 'u') + ",m01,5,\n" << QString() << false << qint64(2)
                                           << qint64(1) << ":2:1: user_id is longer than 256 bytes: '" + QString(77, QLatin1Char('u'))
                                                               + "...' (expected an id of 1 to 256 bytes)";
    }
    void badImport()
    {
        QFETCH(QString, file);
        QFETCH(QByteArray, bytes);
        QFETCH(QString, scale);
        QFETCH(bool, strict);
        QFETCH(qint64, line);
        QFETCH(qint64, column);
        QFETCH(QString, message);

        // An existing workspace that --replace must leave alone when the new import fails.
        ImportRequest good = goodRequest(QStringLiteral("good-"), QStringLiteral("existing.sqlite"));
        good.replace = true;
        QVERIFY(importWorkspace(good).ok());
        const QString before = sha(path(QStringLiteral("existing.sqlite")));

        ImportRequest bad = goodRequest(QStringLiteral("bad-"), QStringLiteral("existing.sqlite"));
        bad.replace = true;
        bad.options.strict = strict;
        if (!scale.isEmpty())
            bad.scale = parseScale(scale.toStdString());
        const QString badFile = write(QStringLiteral("bad-") + file, bytes);
        auto result = importWorkspace(bad);
        QVERIFY(!result.ok());
        const Error& e = result.error();
        QCOMPARE(QString::fromStdString(e.file), badFile);
        QCOMPARE(e.line, line);
        QCOMPARE(e.column, column);
        QCOMPARE(QString::fromStdString(e.toString()), badFile + message);
        QCOMPARE(static_cast<int>(e.kind), static_cast<int>(ErrorKind::InputData));
        QCOMPARE(sha(path(QStringLiteral("existing.sqlite"))), before);
        QCOMPARE(leftovers(), QStringList());
    }

    void twentyErrorsThenStop()
    {
        QByteArray train = "user_id,item_id,rating,timestamp\n";
        for (int i = 0; i < 50; ++i)
            train += "ada,m01,bad,\n";
        ImportRequest r = goodRequest(QStringLiteral("many-"), QStringLiteral("many.sqlite"));
        write(QStringLiteral("many-train.csv"), train);
        auto result = importWorkspace(r);
        QVERIFY(!result.ok());
        QCOMPARE(result.errors().size(), kMaxReportedErrors);
        QCOMPARE(result.errors().back().line, qint64(21));
        QVERIFY(!QFile::exists(path(QStringLiteral("many.sqlite"))));
    }

    void existingWorkspaceNeedsReplace()
    {
        ImportRequest r = goodRequest(QStringLiteral("rep-"), QStringLiteral("rep.sqlite"));
        QVERIFY(importWorkspace(r).ok());
        const QString before = sha(path(QStringLiteral("rep.sqlite")));
        auto again = importWorkspace(r);
        QVERIFY(!again.ok());
        QCOMPARE(QString::fromStdString(again.error().message), QStringLiteral("workspace already exists"));
        QCOMPARE(static_cast<int>(again.error().kind), static_cast<int>(ErrorKind::Usage));
        QCOMPARE(sha(path(QStringLiteral("rep.sqlite"))), before);
        r.replace = true;
        r.scale = RatingScale{0, 5, 0.5, false};
        auto replaced = importWorkspace(r);
        QVERIFY(replaced.ok());
        QVERIFY(!replaced->scale.inferred);
        auto ws = Workspace::open(r.workspacePath);
        QVERIFY(ws.ok());
        const auto s = ws->summary();
        QVERIFY(s.ok());
        QCOMPARE(s->scale.min, 0.0);
        QCOMPARE(s->scale.step, 0.5);
        QVERIFY(!s->scale.inferred);
    }

    void leakageIsAWarningByDefault()
    {
        ImportRequest r = goodRequest(QStringLiteral("leak-"), QStringLiteral("leak.sqlite"));
        write(QStringLiteral("leak-withheld.csv"), "user_id,item_id,rating\nada,m08,4\nada,m01,5\nbo,m04,3\n");
        auto result = importWorkspace(r);
        QVERIFY(result.ok());
        QCOMPARE(result->leakedPairs, qint64(2));
        bool warned = false;
        for (const auto& n : result->notes)
            warned = warned || n.message.find("warning: 2 withheld (user_id, item_id) pair(s) also appear in train (leakage), first on line 3")
                                   != std::string::npos;
        QVERIFY(warned);
    }

    void unknownItemsKeptWhenAllowed()
    {
        ImportRequest r = goodRequest(QStringLiteral("unk-"), QStringLiteral("unk.sqlite"));
        write(QStringLiteral("unk-train.csv"), "user_id,item_id,rating\nada,m01,5\nada,zz1,4\nbo,zz1,2\n");
        r.options.allowUnknownItems = true;
        auto result = importWorkspace(r);
        QVERIFY(result.ok());
        QCOMPARE(result->items, dataRows("catalog.csv") + 1);
        QCOMPARE(result->unknownItemsAdded, qint64(1));
        auto ws = Workspace::open(r.workspacePath);
        QVERIFY(ws.ok());
        auto data = ws->loadDataset();
        QVERIFY(data.ok());
        QCOMPARE(data->items.back().externalId, std::string("zz1"));
        QCOMPARE(data->items.back().title, std::string());
    }

    void unknownColumnsGiveOneNote()
    {
        ImportRequest r = goodRequest(QStringLiteral("tsv-"), QStringLiteral("tsv.sqlite"));
        r.catalogPath = testData("import/catalog-extra.tsv");
        write(QStringLiteral("tsv-train.csv"), "user_id,item_id,rating,source,device\nada,m01,5,app,tv\n");
        write(QStringLiteral("tsv-withheld.csv"), "\xEF\xBB\xBFuser_id,item_id,rating\r\nada,m01,5\r\n");
        auto result = importWorkspace(r);
        QVERIFY(result.ok());
        std::vector<std::string> notes;
        for (const auto& n : result->notes)
            notes.push_back(n.message);
        QVERIFY(std::find(notes.begin(), notes.end(), "ignored column 'notes'") != notes.end());
        QVERIFY(std::find(notes.begin(), notes.end(), "ignored columns 'source', 'device'") != notes.end());
        QCOMPARE(result->items, qint64(1));
    }

    void cancelWritesNothing()
    {
        ImportRequest r = goodRequest(QStringLiteral("cancel-"), QStringLiteral("cancel.sqlite"));
        std::atomic<bool> cancel{true};
        Progress progress;
        progress.cancel = &cancel;
        auto result = importWorkspace(r, progress);
        QVERIFY(!result.ok());
        QCOMPARE(static_cast<int>(result.error().kind), static_cast<int>(ErrorKind::Cancelled));
        QVERIFY(!QFile::exists(path(QStringLiteral("cancel.sqlite"))));
        QCOMPARE(leftovers(), QStringList());

        // A run cancelled while reading its files leaves the workspace as it was.
        cancel = false;
        QVERIFY(importWorkspace(r).ok());
        const QString before = sha(path(QStringLiteral("cancel.sqlite")));
        cancel = true;
        AddRunRequest run;
        run.workspacePath = r.workspacePath;
        run.name = "cancelled";
        run.scoresPath = testData("import/scores.csv");
        auto added = addRun(run, progress);
        QVERIFY(!added.ok());
        QCOMPARE(static_cast<int>(added.error().kind), static_cast<int>(ErrorKind::Cancelled));
        QCOMPARE(sha(path(QStringLiteral("cancel.sqlite"))), before);
    }

    void progressReportsBytesAndRows()
    {
        ImportRequest r = goodRequest(QStringLiteral("prog-"), QStringLiteral("prog.sqlite"));
        double last = 0;
        bool sawRows = false;
        Progress progress;
        std::mutex mutex;
        progress.report = [&](double fraction, std::string_view stage) {
            std::lock_guard lock(mutex);
            QVERIFY(fraction >= 0 && fraction <= 1.0);
            last = fraction;
            sawRows = sawRows || stage.find("reading train.csv: 13 rows") != std::string_view::npos
                      || stage.find("prog-train.csv: 13 rows") != std::string_view::npos;
        };
        QVERIFY(importWorkspace(r, progress).ok());
        QCOMPARE(last, 1.0);
        QVERIFY(sawRows);
    }

    void badAddRun_data()
    {
        QTest::addColumn<QString>("kind"); // scores or lists
        QTest::addColumn<QByteArray>("bytes");
        QTest::addColumn<QString>("name");
        QTest::addColumn<qint64>("line");
        QTest::addColumn<qint64>("column");
        QTest::addColumn<QString>("message"); // after the file name; empty = not a file error
        QTest::addColumn<int>("kindOfError");

        const int input = static_cast<int>(ErrorKind::InputData);
        QTest::newRow("NaN score") << "scores" << QByteArray("user_id,item_id,score\nada,m08,3.5\nada,m09,nan\n") << "r" << qint64(3)
                                   << qint64(3) << ":3:3: score is NaN or infinite: 'nan' (expected a finite decimal number)" << input;
        QTest::newRow("infinite score") << "scores" << QByteArray("user_id,item_id,score\nada,m08,-inf\n") << "r" << qint64(2) << qint64(3)
                                        << ":2:3: score is NaN or infinite: '-inf' (expected a finite decimal number)" << input;
        QTest::newRow("non-numeric score") << "scores" << QByteArray("user_id,item_id,score\nada,m08,high\n") << "r" << qint64(2)
                                           << qint64(3) << ":2:3: score is not a number: 'high' (expected a finite decimal number)" << input;
        QTest::newRow("duplicate score pair") << "scores" << QByteArray("user_id,item_id,score\nada,m08,3\nbo,m05,4\nada,m08,2\n") << "r"
                                              << qint64(4) << qint64(1)
                                              << ":4:1: duplicate (user_id, item_id) pair, first on line 2: 'ada, m08' (expected each "
                                                 "(user_id, item_id) pair at most once in the scores file)"
                                              << input;
        QTest::newRow("unknown item in scores") << "scores" << QByteArray("user_id,item_id,score\nada,m77,3\n") << "r" << qint64(2) << qint64(2)
                                                << ":2:2: unknown item id: 'm77' (expected an item_id listed in the workspace's catalog (or "
                                                   "--allow-unknown-items))"
                                                << input;
        QTest::newRow("missing score column") << "scores" << QByteArray("user_id,item_id,prediction\nada,m08,3\n") << "r" << qint64(1)
                                              << qint64(0)
                                              << ":1: missing required column 'score': 'user_id,item_id,prediction' (expected a header with "
                                                 "the columns user_id,item_id,score in any order)"
                                              << input;
        QTest::newRow("empty scores file") << "scores" << QByteArray("\n\n") << "r" << qint64(0) << qint64(0)
                                           << ": file is empty (expected a header row followed by data rows)" << input;
        QTest::newRow("item twice in a list") << "lists" << QByteArray("user_id,rank,item_id\nada,1,m08\nada,2,m05\nada,3,m08\n") << "r"
                                              << qint64(4) << qint64(3)
                                              << ":4:3: item appears twice in this user's list, first on line 2: 'ada, m08' (expected each "
                                                 "item at most once per list)"
                                              << input;
        QTest::newRow("duplicate user and rank") << "lists" << QByteArray("user_id,rank,item_id\nbo,1,m05\nbo,1,m10\n") << "r" << qint64(3)
                                                 << qint64(2)
                                                 << ":3:2: duplicate (user_id, rank), first on line 2: 'bo, 1' (expected each rank once per user)"
                                                 << input;
        QTest::newRow("rank zero") << "lists" << QByteArray("user_id,rank,item_id\nbo,0,m05\n") << "r" << qint64(2) << qint64(2)
                                   << ":2:2: rank is not a positive whole number: '0' (expected a whole number from 1 (1 = top of the list))"
                                   << input;
        QTest::newRow("fractional rank") << "lists" << QByteArray("user_id,rank,item_id\nbo,1.5,m05\n") << "r" << qint64(2) << qint64(2)
                                         << ":2:2: rank is not a positive whole number: '1.5' (expected a whole number from 1 (1 = top of "
                                            "the list))"
                                         << input;
        QTest::newRow("rank gap") << "lists" << QByteArray("user_id,rank,item_id\nbo,1,m05\nbo,3,m10\n") << "r" << qint64(3) << qint64(2)
                                  << ":3:2: ranks of this user skip 2: 'bo, 3' (expected ranks 1..n without gaps for each user)" << input;
        QTest::newRow("run name already present") << "lists" << QByteArray("user_id,rank,item_id\nbo,1,m05\n") << "first" << qint64(0)
                                                  << qint64(0) << QString() << static_cast<int>(ErrorKind::Usage);
    }
    void badAddRun()
    {
        QFETCH(QString, kind);
        QFETCH(QByteArray, bytes);
        QFETCH(QString, name);
        QFETCH(qint64, line);
        QFETCH(qint64, column);
        QFETCH(QString, message);
        QFETCH(int, kindOfError);

        ImportRequest r = goodRequest(QStringLiteral("run-"), QStringLiteral("runs.sqlite"));
        r.replace = true;
        QVERIFY(importWorkspace(r).ok());
        AddRunRequest first;
        first.workspacePath = r.workspacePath;
        first.name = "first";
        first.scoresPath = testData("import/scores.csv");
        QVERIFY(addRun(first).ok());
        const QString before = sha(path(QStringLiteral("runs.sqlite")));

        AddRunRequest bad;
        bad.workspacePath = r.workspacePath;
        bad.name = name.toStdString();
        const QString file = write(QStringLiteral("bad-") + kind + QStringLiteral(".csv"), bytes);
        (kind == QStringLiteral("scores") ? bad.scoresPath : bad.listsPath) = file.toStdString();
        auto result = addRun(bad);
        QVERIFY(!result.ok());
        const Error& e = result.error();
        QCOMPARE(static_cast<int>(e.kind), kindOfError);
        if (!message.isEmpty()) {
            QCOMPARE(QString::fromStdString(e.file), file);
            QCOMPARE(e.line, line);
            QCOMPARE(e.column, column);
            QCOMPARE(QString::fromStdString(e.toString()), file + message);
        } else {
            QCOMPARE(QString::fromStdString(e.message), QStringLiteral("a run named 'first' already exists in ") + path(QStringLiteral("runs.sqlite")));
        }
        QCOMPARE(sha(path(QStringLiteral("runs.sqlite"))), before);
        QCOMPARE(leftovers(), QStringList());
    }

    void addRunReplacesAndAddsNewUsers()
    {
        ImportRequest r = goodRequest(QStringLiteral("new-"), QStringLiteral("newusers.sqlite"));
        QVERIFY(importWorkspace(r).ok());
        AddRunRequest run;
        run.workspacePath = r.workspacePath;
        run.name = "late";
        run.listsPath = write(QStringLiteral("late-lists.csv"), "user_id,rank,item_id\neve,1,m01\neve,2,m02\nada,1,m05\n").toStdString();
        auto added = addRun(run);
        QVERIFY(added.ok());
        QCOMPARE(added->usersAdded, qint64(1));
        QCOMPARE(added->listUsers, qint64(2));
        run.replace = true;
        run.listsPath = testData("import/lists.csv");
        auto replaced = addRun(run);
        QVERIFY(replaced.ok());
        QVERIFY(replaced->replaced);
        auto ws = Workspace::open(r.workspacePath);
        QVERIFY(ws.ok());
        auto info = ws->run("late");
        QVERIFY(info.ok());
        QCOMPARE(info->listRowCount, dataRows("lists.csv"));
        auto data = ws->loadDataset();
        QVERIFY(data.ok());
        QCOMPARE(data->userIds.back(), std::string("eve"));
        QCOMPARE(data->train.of(UserIndex(4)).size(), std::size_t(0));
    }

    void previewDetectsColumns()
    {
        auto preview = previewFile(testData("import/lists.csv"), 2);
        QVERIFY(preview.ok());
        QCOMPARE(preview->role, std::optional<FileRole>(FileRole::Lists));
        QCOMPARE(preview->header, (std::vector<std::string>{"user_id", "rank", "item_id", "score"}));
        QCOMPARE(preview->rows.size(), std::size_t(2));
        QCOMPARE(preview->rows[1][2], std::string("m05"));
        auto tsv = previewFile(testData("import/catalog-extra.tsv"));
        QVERIFY(tsv.ok());
        QCOMPARE(tsv->delimiter, '\t');
        QCOMPARE(tsv->role, std::optional<FileRole>(FileRole::Catalog));
        QCOMPARE(tsv->columnRoles.back(), std::string());
        QCOMPARE(tsv->notes.size(), std::size_t(1));
        auto train = previewFile(testData("import/train.csv"), 20, FileRole::Scores);
        QVERIFY(train.ok());
        QCOMPARE(train->missingColumns, std::vector<std::string>{"score"});
    }
};

QTEST_GUILESS_MAIN(TestImport)
#include "tst_import.moc"

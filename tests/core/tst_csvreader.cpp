// SPDX-License-Identifier: MIT
// The CSV reader against the rules of RFC 4180 ("Common Format and MIME Type for
// Comma-Separated Values (CSV) Files", Y. Shafranovskiy, 2005), section 2, one test per rule,
// plus the extensions our formats allow (BOM, LF line ends, tabs, blank lines) and the
// byte-level errors (invalid UTF-8, NUL, over-long lines).
#include "core/csvreader.h"
#include "core/sha256.h"
#include "core/timestamp.h"

#include <QCoreApplication>
#include <QDir>
#include <QFile>
#include <QTest>

#include <algorithm>
#include <optional>
#include <string>
#include <vector>

using namespace slatewise::core;

namespace {

struct Parsed {
    std::vector<std::vector<std::string>> records;
    std::vector<std::int64_t> lines;
    std::optional<Error> error;
};

Parsed parse(std::string_view text, char delimiter = ',')
{
    Parsed out;
    CsvParser parser(text, delimiter);
    for (;;) {
        const auto step = parser.next();
        if (step == CsvParser::Step::End)
            break;
        if (step == CsvParser::Step::Error) {
            out.error = parser.error();
            break;
        }
        std::vector<std::string> record;
        for (auto f : parser.fields())
            record.emplace_back(f);
        out.records.push_back(std::move(record));
        out.lines.push_back(parser.line());
    }
    return out;
}

using Records = std::vector<std::vector<std::string>>;

} // namespace

class TestCsvReader : public QObject {
    Q_OBJECT
private slots:
    // RFC 4180 section 2, rule 1: each record is on a separate line, delimited by CRLF.
    void rfc4180Rule1RecordsEndWithCrlf()
    {
        const auto p = parse("aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n");
        QVERIFY(!p.error);
        QCOMPARE(p.records, (Records{{"aaa", "bbb", "ccc"}, {"zzz", "yyy", "xxx"}}));
        QCOMPARE(p.lines, (std::vector<std::int64_t>{1, 2}));
    }
    // Rule 2: the last record may or may not have an ending line break.
    void rfc4180Rule2LastRecordWithoutLineBreak()
    {
        const auto p = parse("aaa,bbb,ccc\r\nzzz,yyy,xxx");
        QVERIFY(!p.error);
        QCOMPARE(p.records, (Records{{"aaa", "bbb", "ccc"}, {"zzz", "yyy", "xxx"}}));
    }
    // Rule 3: an optional header line in the same format as the records, with the same
    // number of fields.
    void rfc4180Rule3HeaderHasRecordFormat()
    {
        const auto p = parse("field_name,field_name,field_name\r\naaa,bbb,ccc\r\nzzz,yyy,xxx\r\n");
        QVERIFY(!p.error);
        QCOMPARE(p.records.size(), std::size_t(3));
        QCOMPARE(p.records[0], (std::vector<std::string>{"field_name", "field_name", "field_name"}));
        QCOMPARE(p.records[0].size(), p.records[1].size());
    }
    // Rule 4: fields separated by commas; spaces are part of a field; no comma after the
    // last field (a trailing comma makes one more, empty field).
    void rfc4180Rule4CommasSeparateSpacesKept()
    {
        const auto p = parse("aaa, bbb ,ccc\n");
        QCOMPARE(p.records, (Records{{"aaa", " bbb ", "ccc"}}));
        const auto trailing = parse("aaa,bbb,\n");
        QCOMPARE(trailing.records, (Records{{"aaa", "bbb", ""}}));
    }
    // Rule 5: each field may or may not be enclosed in double quotes.
    void rfc4180Rule5FieldsMayBeQuoted()
    {
        const auto p = parse("\"aaa\",\"bbb\",\"ccc\"\r\nzzz,yyy,xxx");
        QVERIFY(!p.error);
        QCOMPARE(p.records, (Records{{"aaa", "bbb", "ccc"}, {"zzz", "yyy", "xxx"}}));
    }
    // Rule 6: fields containing line breaks (CRLF), double quotes and commas are enclosed
    // in double quotes.
    void rfc4180Rule6QuotedLineBreaksAndCommas()
    {
        const auto p = parse("\"aaa\",\"b\r\nbb\",\"c,cc\"\r\nzzz,yyy,xxx\r\n");
        QVERIFY(!p.error);
        QCOMPARE(p.records, (Records{{"aaa", "b\r\nbb", "c,cc"}, {"zzz", "yyy", "xxx"}}));
        // The second record starts on physical line 3 because the first spans two lines.
        QCOMPARE(p.lines, (std::vector<std::int64_t>{1, 3}));
    }
    // Rule 7: a double quote inside a quoted field is escaped by a second double quote.
    void rfc4180Rule7DoubledQuotes()
    {
        const auto p = parse("\"aaa\",\"b\"\"bb\",\"ccc\"\r\n\"\"\"\",\"\"\n");
        QVERIFY(!p.error);
        QCOMPARE(p.records, (Records{{"aaa", "b\"bb", "ccc"}, {"\"", ""}}));
    }

    void lineFeedOnlyAndMixedLineEnds()
    {
        const auto p = parse("a,b\nc,d\r\ne,f\n");
        QCOMPARE(p.records, (Records{{"a", "b"}, {"c", "d"}, {"e", "f"}}));
        QCOMPARE(p.lines, (std::vector<std::int64_t>{1, 2, 3}));
    }
    void embeddedLineFeedInQuotes()
    {
        const auto p = parse("id,title\nm1,\"two\nlines\"\nm2,x\n");
        QCOMPARE(p.records, (Records{{"id", "title"}, {"m1", "two\nlines"}, {"m2", "x"}}));
        QCOMPARE(p.lines, (std::vector<std::int64_t>{1, 2, 4}));
    }
    void blankLinesAreSkipped()
    {
        const auto p = parse("a,b\n\n\r\nc,d\n\n");
        QCOMPARE(p.records, (Records{{"a", "b"}, {"c", "d"}}));
        QCOMPARE(p.lines, (std::vector<std::int64_t>{1, 4}));
    }
    void tabDelimiter()
    {
        const auto p = parse("a\tb,c\t\"d\te\"\n", '\t');
        QCOMPARE(p.records, (Records{{"a", "b,c", "d\te"}}));
    }
    void utf8TextIsKept()
    {
        const auto p = parse("id,title\nm1,Café Nocturne – Ω\n");
        QVERIFY(!p.error);
        QCOMPARE(p.records[1][1], std::string("Café Nocturne – Ω"));
    }

    void errors_data()
    {
        QTest::addColumn<QByteArray>("text");
        QTest::addColumn<qint64>("line");
        QTest::addColumn<qint64>("column");
        QTest::addColumn<QString>("message");
        QTest::newRow("unclosed quote") << QByteArray("a,b\nc,\"dd\nee\n") << qint64(2) << qint64(2)
                                        << QStringLiteral("quoted field is not closed before the end of the file");
        QTest::newRow("quote inside unquoted field") << QByteArray("a,b\nc,d\"d\n") << qint64(2) << qint64(2)
                                                     << QStringLiteral("double quote inside an unquoted field");
        QTest::newRow("text after closing quote") << QByteArray("a,b\n\"c\"x,d\n") << qint64(2) << qint64(1)
                                                  << QStringLiteral("text after the closing quote of a quoted field");
        QTest::newRow("invalid UTF-8") << QByteArray("a,b\nc,d\xC3\x28\n") << qint64(2) << qint64(2)
                                       << QStringLiteral("invalid UTF-8");
        QTest::newRow("overlong UTF-8") << QByteArray("a,b\n\xC0\xAF,d\n") << qint64(2) << qint64(1)
                                        << QStringLiteral("invalid UTF-8");
        QTest::newRow("NUL byte") << QByteArray("a,b\nc,d\n1,2\0\n", 13) << qint64(3) << qint64(2)
                                  << QStringLiteral("NUL byte: this looks like a binary file, not text");
        QTest::newRow("lone carriage return") << QByteArray("a,b\rc,d\n") << qint64(1) << qint64(2)
                                              << QStringLiteral("carriage return inside an unquoted field");
    }
    void errors()
    {
        QFETCH(QByteArray, text);
        QFETCH(qint64, line);
        QFETCH(qint64, column);
        QFETCH(QString, message);
        const auto p = parse(std::string_view(text.constData(), static_cast<std::size_t>(text.size())));
        QVERIFY(p.error.has_value());
        QCOMPARE(QString::fromStdString(p.error->message), message);
        QCOMPARE(p.error->line, line);
        QCOMPARE(p.error->column, column);
    }
    void lineOverOneMebibyte()
    {
        std::string text = "a,b\nc,";
        text.append(kMaxLineBytes, 'x');
        text += "\nd,e\n";
        const auto p = parse(text);
        QVERIFY(p.error.has_value());
        QCOMPARE(p.error->line, qint64(2));
        QCOMPARE(QString::fromStdString(p.error->message), QStringLiteral("line is longer than 1 MiB (1048578 bytes)"));
        // Exactly 1 MiB is fine.
        std::string fits = "a\n";
        fits.append(kMaxLineBytes, 'y');
        QVERIFY(!parse(fits).error);
    }

    void readerSkipsBomAndPicksDelimiterByExtension()
    {
        const QString dir = QDir::tempPath() + QStringLiteral("/slatewise-csv-") + QString::number(QCoreApplication::applicationPid());
        QDir().mkpath(dir);
        const std::string tsv = (dir + QStringLiteral("/x.TSV")).toStdString();
        {
            QFile f(QString::fromStdString(tsv));
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("\xEF\xBB\xBFid\ttitle\r\nm1\tA, B\r\n");
        }
        auto reader = CsvReader::open(tsv);
        QVERIFY(reader.ok());
        QVERIFY(reader->hasBom());
        QCOMPARE(reader->delimiter(), '\t');
        const auto p = parse(reader->text(), reader->delimiter());
        QCOMPARE(p.records, (Records{{"id", "title"}, {"m1", "A, B"}}));
        // The whole file, BOM included, is what the hash covers.
        QCOMPARE(reader->sha256(), Sha256::hex("\xEF\xBB\xBFid\ttitle\r\nm1\tA, B\r\n"));

        const std::string empty = (dir + QStringLiteral("/empty.csv")).toStdString();
        QFile(QString::fromStdString(empty)).open(QIODevice::WriteOnly);
        auto none = CsvReader::open(empty);
        QVERIFY(!none.ok());
        QCOMPARE(QString::fromStdString(none.error().toString()),
                 QString::fromStdString(empty) + QStringLiteral(": file is empty (expected a header row followed by data rows)"));

        const std::string binary = (dir + QStringLiteral("/image.csv")).toStdString();
        {
            QFile f(QString::fromStdString(binary));
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write(QByteArray("\x89PNG\r\n\x1a\n\0\0\0\rIHDR", 16));
        }
        auto bin = CsvReader::open(binary);
        QVERIFY(!bin.ok());
        QCOMPARE(QString::fromStdString(bin.error().message), QStringLiteral("NUL byte: this looks like a binary file, not text"));
        QCOMPARE(bin.error().line, qint64(3));
        QDir(dir).removeRecursively();
    }

    // FIPS 180-2, Appendix B: SHA-256 examples ("abc", the 448-bit message, one million 'a').
    void sha256PublishedVectors()
    {
        QCOMPARE(Sha256::hex("abc"), std::string("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"));
        QCOMPARE(Sha256::hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
                 std::string("248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1"));
        Sha256 million;
        // Odd piece sizes exercise the partial-block buffering.
        const std::string chunk(77, 'a');
        std::size_t left = 1000000;
        while (left > 0) {
            const std::size_t n = std::min(left, chunk.size());
            million.update(chunk.data(), n);
            left -= n;
        }
        QCOMPARE(million.hexDigest(), std::string("cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0"));
        // Empty input: the well-known digest of zero bytes (from memory, also printed by sha256sum).
        QCOMPARE(Sha256::hex(""), std::string("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"));
    }

    // Expected values computed with Python's datetime (Debian's /usr/bin/python3):
    // datetime(2026,3,4,20,15,tzinfo=utc).timestamp() == 1772655300 and so on.
    void timestamps_data()
    {
        QTest::addColumn<QString>("text");
        QTest::addColumn<qint64>("expected");
        QTest::newRow("unix seconds") << QStringLiteral("1772655300") << qint64(1772655300);
        QTest::newRow("zulu") << QStringLiteral("2026-03-04T20:15:00Z") << qint64(1772655300);
        QTest::newRow("positive offset") << QStringLiteral("2025-01-20T20:00:00+01:00") << qint64(1737399600);
        QTest::newRow("negative offset, leap day, fraction")
            << QStringLiteral("2024-02-29 23:59:59.75-0530") << qint64(1709270999);
        QTest::newRow("date only") << QStringLiteral("1970-01-02") << qint64(86400);
        QTest::newRow("epoch") << QStringLiteral("1970-01-01T00:00:00Z") << qint64(0);
    }
    void timestamps()
    {
        QFETCH(QString, text);
        QFETCH(qint64, expected);
        const auto t = parseTimestamp(text.toStdString());
        QVERIFY(t.has_value());
        QCOMPARE(*t, expected);
    }
    void malformedTimestamps_data()
    {
        QTest::addColumn<QString>("text");
        for (const char* bad : {"yesterday", "2025-02-30T10:00:00Z", "2025-13-01", "2025-01-01T25:00:00Z", "2025-01-01T10:00:00+",
                                "12:00", "2025-01-01T10:00:00Q", "1.5e9"})
            QTest::newRow(bad) << QString::fromLatin1(bad);
    }
    void malformedTimestamps()
    {
        QFETCH(QString, text);
        QVERIFY(!parseTimestamp(text.toStdString()).has_value());
    }
    void isoFormatRoundTrips()
    {
        QCOMPARE(formatIso8601(1772655300), std::string("2026-03-04T20:15:00Z"));
        QCOMPARE(*parseTimestamp(formatIso8601(-86401)), Timestamp(-86401));
    }
};

QTEST_GUILESS_MAIN(TestCsvReader)
#include "tst_csvreader.moc"

// SPDX-License-Identifier: MIT
// Exports: every chart to PNG, SVG and PDF; tables to CSV with formula escaping; the meeting pack.
#include "core/dataset.h"
#include "core/run.h"
#include "ui/banderrorchart.h"
#include "ui/chartexporter.h"
#include "ui/csvexporter.h"
#include "ui/errordistributionchart.h"
#include "ui/fitlosschart.h"
#include "ui/genretimelinechart.h"
#include "ui/kcurvechart.h"
#include "ui/meetingpack.h"
#include "ui/scoreratingchart.h"
#include "ui/userdifferencechart.h"
#include "ui/warningprevalencechart.h"

#include <QFile>
#include <QImage>
#include <QProcess>
#include <QStandardItemModel>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>
#include <QXmlStreamReader>
#include <qcustomplot.h>

#include <memory>

#include "support/testsupport.h"

using namespace slatewise;
using namespace slatewise::ui;

namespace {

std::vector<core::RunEvaluation> sampleRuns()
{
    std::vector<core::RunEvaluation> runs;
    for (int r = 0; r < 2; ++r) {
        core::RunEvaluation e;
        e.runName = r == 0 ? "baseline" : "candidate";
        e.settings.k = 10;
        e.accuracy = core::AccuracySummary {};
        e.accuracy->rmse = 0.9 - 0.1 * r;
        e.accuracy->scoredFraction = 1.0;
        for (int b = 1; b <= 5; ++b)
            e.accuracy->bands.push_back(
                { double(b), 100 * b, 1.4 - 0.2 * b + 0.1 * r, 1.0, 1.2 - 0.5 * (b - 1) + 0.1 * r });
        e.ranking = core::RankingSummary {};
        e.ranking->users = 500;
        e.ranking->ndcg = 0.3 + 0.02 * r;
        for (int k = 1; k <= 50; ++k) {
            e.ranking->curves.k.push_back(k);
            e.ranking->curves.precision.push_back(0.3 / std::sqrt(k) + 0.01 * r);
            e.ranking->curves.recall.push_back(std::min(1.0, 0.03 * k + 0.02 * r));
            e.ranking->curves.ndcg.push_back(0.2 + 0.004 * k + 0.01 * r);
        }
        e.ci["rmse"] = { e.accuracy->rmse - 0.02, e.accuracy->rmse + 0.02 };
        e.beyond = core::BeyondSummary {};
        e.beyond->ild = 0.5;
        e.beyond->coverage = 0.3;
        e.warningShare = { { "narrow", 0.2 + 0.1 * r }, { "sequel-first", 0.05 }, { "binge-echo", 0.12 - 0.05 * r } };
        runs.push_back(e);
    }
    return runs;
}

core::Dataset sampleDataset()
{
    core::Dataset data;
    data.genreNames = { "drama", "comedy", "mystery" };
    data.userIds = { "u1" };
    for (int i = 0; i < 3; ++i) {
        core::Item item;
        item.title = "Title " + std::to_string(i);
        item.genres = { i };
        data.items.push_back(item);
    }
    for (int i = 0; i < 40; ++i)
        data.train.rows.push_back(
            { core::ItemIndex(i < 30 ? std::uint32_t(i % 2) : 2u), 4.0f, 1700000000 + i * 86400 });
    data.train.offsets = { 0, 40 };
    data.withheld.rows
        = { { core::ItemIndex(0), 5.0f, 0 }, { core::ItemIndex(1), 2.0f, 0 }, { core::ItemIndex(2), 4.0f, 0 } };
    data.withheld.offsets = { 0, 3 };
    return data;
}

std::vector<std::unique_ptr<ChartView>> allCharts()
{
    std::vector<std::unique_ptr<ChartView>> charts;
    const auto runs = sampleRuns();
    auto band = std::make_unique<BandErrorChart>();
    band->setData(runs);
    charts.push_back(std::move(band));
    auto curves = std::make_unique<KCurveChart>();
    curves->setData(runs);
    charts.push_back(std::move(curves));
    auto warnings = std::make_unique<WarningPrevalenceChart>();
    warnings->setData(runs);
    charts.push_back(std::move(warnings));
    auto errors = std::make_unique<ErrorDistributionChart>();
    errors->setData({ { QStringLiteral("baseline"), { -1.0, -0.5, 0.0, 0.2, 0.4, 1.5 } },
        { QStringLiteral("candidate"), { -0.3, 0.0, 0.1, 0.2, 0.3 } } });
    charts.push_back(std::move(errors));
    auto diff = std::make_unique<UserDifferenceChart>();
    diff->setData({ -0.2, -0.1, 0.0, 0.0, 0.1, 0.3, 0.25 }, core::Metric::Ndcg, QStringLiteral("baseline"),
        QStringLiteral("candidate"));
    charts.push_back(std::move(diff));
    const auto data = sampleDataset();
    core::RunData run;
    run.info.name = "baseline";
    run.hasScores = true;
    run.scores = { 3.5f, 3.9f, 4.1f };
    auto scatter = std::make_unique<ScoreRatingChart>();
    scatter->setData(data, run, core::UserIndex(0));
    charts.push_back(std::move(scatter));
    auto timeline = std::make_unique<GenreTimelineChart>();
    timeline->setData(data, core::UserIndex(0));
    charts.push_back(std::move(timeline));
    auto loss = std::make_unique<FitLossChart>();
    loss->setData({ { 1, 1.2, 1.25 }, { 2, 0.95, 1.05 }, { 3, 0.85, 1.0 } }, QStringLiteral("als"));
    charts.push_back(std::move(loss));
    return charts;
}

} // namespace

class TestChartExport : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() { test::failOnUnexpectedMessages(); }

    void chartsAreNotEmpty()
    {
        for (const auto& chart : allCharts()) {
            QVERIFY2(!chart->isEmpty(), qPrintable(chart->title()));
            QVERIFY(!chart->fileStem().isEmpty());
        }
        BandErrorChart empty;
        empty.setData({});
        QVERIFY(empty.isEmpty());
    }

    void pngHasSignatureSizeAndDpi()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        for (const auto& chart : allCharts()) {
            const QString path = dir.filePath(chart->fileStem() + QStringLiteral(".png"));
            const auto status = ChartExporter::savePng(*chart, path, { 1000, 640 }, 192);
            QVERIFY2(status.ok(), status.ok() ? "" : status.error().toString().c_str());
            const QByteArray bytes = test::fileBytes(path);
            // PNG signature (ISO/IEC 15948, section 5.2).
            QCOMPARE(bytes.left(8), QByteArray("\x89PNG\r\n\x1a\n", 8));
            QImage image(path);
            QCOMPARE(image.size(), QSize(1000, 640));
            QCOMPARE(image.dotsPerMeterX(), qRound(192 / 0.0254));
            // Something was drawn: more than a handful of distinct colours.
            QSet<QRgb> colours;
            for (int y = 0; y < image.height(); y += 7)
                for (int x = 0; x < image.width(); x += 7)
                    colours.insert(image.pixel(x, y));
            QVERIFY2(colours.size() > 5, qPrintable(chart->fileStem()));
        }
    }

    void svgParsesAsXml()
    {
        QTemporaryDir dir;
        for (const auto& chart : allCharts()) {
            const QString path = dir.filePath(chart->fileStem() + QStringLiteral(".svg"));
            QVERIFY(ChartExporter::saveSvg(*chart, path, { 900, 600 }).ok());
            QFile file(path);
            QVERIFY(file.open(QIODevice::ReadOnly));
            QXmlStreamReader xml(&file);
            bool sawSvg = false;
            int elements = 0;
            while (!xml.atEnd()) {
                if (xml.readNext() == QXmlStreamReader::StartElement) {
                    ++elements;
                    if (xml.name() == QLatin1String("svg"))
                        sawSvg = true;
                }
            }
            QVERIFY2(!xml.hasError(), qPrintable(xml.errorString()));
            QVERIFY(sawSvg);
            QVERIFY(elements > 20);
        }
    }

    void pdfHasHeaderAndOnePage()
    {
        QTemporaryDir dir;
        for (const auto& chart : allCharts()) {
            const QString path = dir.filePath(chart->fileStem() + QStringLiteral(".pdf"));
            QVERIFY(ChartExporter::savePdf(*chart, path, { 900, 600 }).ok());
            const QByteArray bytes = test::fileBytes(path);
            QVERIFY(bytes.startsWith("%PDF-"));
            QCOMPARE(test::pdfPageCount(bytes), 1);
        }
    }

    void badSizeIsAnError()
    {
        BandErrorChart chart;
        const auto status = ChartExporter::savePng(chart, QStringLiteral("/nonexistent/x.png"), { 0, 10 }, 96);
        QVERIFY(!status.ok());
        QCOMPARE(status.error().kind, core::ErrorKind::Usage);
        const auto unwritable
            = ChartExporter::savePng(chart, QStringLiteral("/nonexistent/dir/x.png"), { 100, 100 }, 96);
        QVERIFY(!unwritable.ok());
    }

    void csvField_data()
    {
        QTest::addColumn<QVariant>("value");
        QTest::addColumn<QString>("expected");
        // Formula injection: text starting with = + - @ tab or CR is prefixed with ' (common
        // practice, as advised for CSV exports by the OWASP "CSV Injection" page, from memory).
        QTest::newRow("sum") << QVariant(QStringLiteral("=SUM(A1)")) << QStringLiteral("'=SUM(A1)");
        QTest::newRow("plus") << QVariant(QStringLiteral("+1")) << QStringLiteral("'+1");
        QTest::newRow("minus text") << QVariant(QStringLiteral("-x")) << QStringLiteral("'-x");
        QTest::newRow("at") << QVariant(QStringLiteral("@cmd")) << QStringLiteral("'@cmd");
        QTest::newRow("tab") << QVariant(QStringLiteral("\tx")) << QStringLiteral("'\tx");
        QTest::newRow("cr") << QVariant(QStringLiteral("\rx")) << QStringLiteral("\"'\rx\"");
        QTest::newRow("formula with comma") << QVariant(QStringLiteral("=A1,B1")) << QStringLiteral("\"'=A1,B1\"");
        // Numbers stay numbers, negative ones too, whether given as numbers or as plain text.
        QTest::newRow("negative double") << QVariant(-3.5) << QStringLiteral("-3.5");
        QTest::newRow("int") << QVariant(42) << QStringLiteral("42");
        QTest::newRow("negative text number") << QVariant(QStringLiteral("-0.125")) << QStringLiteral("-0.125");
        QTest::newRow("exact double") << QVariant(0.1) << QStringLiteral("0.1");
        QTest::newRow("nan") << QVariant(std::nan("")) << QString();
        // RFC 4180 section 2, rules 6 and 7: quote fields with commas, quotes or line breaks;
        // double embedded quotes.
        QTest::newRow("quote") << QVariant(QStringLiteral("say \"hi\"")) << QStringLiteral("\"say \"\"hi\"\"\"");
        QTest::newRow("comma") << QVariant(QStringLiteral("a,b")) << QStringLiteral("\"a,b\"");
        QTest::newRow("newline") << QVariant(QStringLiteral("a\nb")) << QStringLiteral("\"a\nb\"");
        QTest::newRow("plain") << QVariant(QStringLiteral("Night Harbour")) << QStringLiteral("Night Harbour");
        QTest::newRow("invalid") << QVariant() << QString();
    }
    void csvField()
    {
        QFETCH(QVariant, value);
        QFETCH(QString, expected);
        QCOMPARE(CsvExporter::field(value), expected);
    }

    void csvWholeTable()
    {
        QStandardItemModel model(2, 3);
        model.setHorizontalHeaderLabels({ QStringLiteral("user"), QStringLiteral("note"), QStringLiteral("ndcg") });
        model.setData(model.index(0, 0), QStringLiteral("u1"));
        model.setData(model.index(0, 1), QStringLiteral("=HYPERLINK(\"x\")"));
        model.setData(model.index(0, 2), -0.25);
        model.setData(model.index(1, 0), QStringLiteral("u2"));
        model.setData(model.index(1, 1), QStringLiteral("two\nlines"));
        model.setData(model.index(1, 2), 1);
        const QString csv = CsvExporter::toCsv(model).value();
        QCOMPARE(csv,
            QStringLiteral("user,note,ndcg\r\n"
                           "u1,\"'=HYPERLINK(\"\"x\"\")\",-0.25\r\n"
                           "u2,\"two\nlines\",1\r\n"));
        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("t.csv"));
        QVERIFY(CsvExporter::write(model, path).ok());
        QCOMPARE(test::fileBytes(path), csv.toUtf8());

        // A cancelled save reports it and leaves the file that was there untouched.
        int calls = 0;
        const auto cancelled = CsvExporter::write(model, path, Qt::DisplayRole, [&calls](int done, int total) {
            ++calls;
            return done < 0 || total < 0; // false: cancel at the first report
        });
        QVERIFY(!cancelled.ok());
        QCOMPARE(static_cast<int>(cancelled.error().kind), static_cast<int>(core::ErrorKind::Cancelled));
        QCOMPARE(calls, 1);
        QCOMPARE(test::fileBytes(path), csv.toUtf8());
    }

    void scoreAxesFollowTheRatingScale_data()
    {
        QTest::addColumn<double>("scaleMin");
        QTest::addColumn<double>("scaleMax");
        QTest::addColumn<double>("highestScore");
        QTest::newRow("1-5 stars") << 1.0 << 5.0 << 4.6;
        QTest::newRow("0-10 points") << 0.0 << 10.0 << 9.0;
        QTest::newRow("score above the scale") << 1.0 << 5.0 << 5.8;
    }
    void scoreAxesFollowTheRatingScale()
    {
        QFETCH(double, scaleMin);
        QFETCH(double, scaleMax);
        QFETCH(double, highestScore);
        ScoreRatingChart chart;
        chart.setData(
            { { scaleMin, scaleMin + 1.0, QStringLiteral("a") }, { scaleMax, highestScore, QStringLiteral("b") } },
            QStringLiteral("u1"), QStringLiteral("run"), scaleMin, scaleMax);
        const auto rects = chart.plot()->axisRects();
        QCOMPARE(rects.size(), 1);
        const QCPRange x = rects.front()->axis(QCPAxis::atBottom)->range();
        const QCPRange y = rects.front()->axis(QCPAxis::atLeft)->range();
        // The whole scale shows, with a margin under a tenth of the scale's span on each side
        // (it used to run 0-6 for a 1-5 scale).
        const double span = scaleMax - scaleMin;
        QVERIFY2(x.lower < scaleMin && x.lower > scaleMin - 0.1 * span, qPrintable(QString::number(x.lower)));
        QVERIFY2(x.upper > scaleMax && x.upper < scaleMax + 0.1 * span, qPrintable(QString::number(x.upper)));
        QVERIFY2(y.lower < scaleMin && y.lower > scaleMin - 0.1 * span, qPrintable(QString::number(y.lower)));
        const double top = std::max(scaleMax, highestScore);
        QVERIFY2(y.upper > top && y.upper < top + 0.1 * span, qPrintable(QString::number(y.upper)));
    }

    void fitLossIterationsAreWholeNumbers()
    {
        FitLossChart chart;
        chart.setData({ { 1, 1.2, 1.25 }, { 2, 0.95, 1.05 }, { 3, 0.85, 1.0 } }, QStringLiteral("als"));
        const auto rects = chart.plot()->axisRects();
        QCOMPARE(rects.size(), 1);
        QCPAxis* x = rects.front()->axis(QCPAxis::atBottom);
        auto ticker = qSharedPointerDynamicCast<QCPAxisTickerText>(x->ticker());
        QVERIFY(ticker);
        QCOMPARE(ticker->ticks().keys(), (QList<double> { 1.0, 2.0, 3.0 }));
        // Half a step of room on both sides, so the first and last markers are whole.
        QCOMPARE(x->range().lower, 0.5);
        QCOMPARE(x->range().upper, 3.5);
    }

    void verdictSaysNotSignificantInWords()
    {
        PackComparisonRow row;
        row.metric = QStringLiteral("ndcg");
        row.n = 400;
        row.meanDiff = 0.004;
        row.ciLow = -0.002;
        row.ciHigh = 0.010;
        row.pT = 0.21;
        QVERIFY(MeetingPack::verdict(row).startsWith(QStringLiteral("not significant")));
        QVERIFY(MeetingPack::verdict(row).contains(QStringLiteral("includes 0")));
        row.ciLow = 0.001;
        row.pT = 0.01;
        QVERIFY(MeetingPack::verdict(row).startsWith(QStringLiteral("significant: candidate better")));
        row.higherIsBetter = false; // e.g. rmse: a rise is worse
        QVERIFY(MeetingPack::verdict(row).startsWith(QStringLiteral("significant: candidate worse")));
        row.pHolm = 0.0004;
        QVERIFY2(MeetingPack::verdict(row).contains(QStringLiteral("Holm-adjusted p < 0.001")),
            qPrintable(MeetingPack::verdict(row)));
        row.pHolm = 0.2; // adjusted p decides when given
        QVERIFY(MeetingPack::verdict(row).startsWith(QStringLiteral("not significant")));
        QVERIFY2(MeetingPack::verdict(row).contains(QStringLiteral("Holm-adjusted p = 0.200")),
            qPrintable(MeetingPack::verdict(row)));
        row.n = 12;
        QVERIFY(MeetingPack::verdict(row).startsWith(QStringLiteral("too few users")));
    }

    void meetingPackIsMultiPagePdf()
    {
        MeetingPackContent content;
        content.workspaceName = QStringLiteral("test workspace");
        content.generatedAt = QStringLiteral("2026-12-04T10:00:00Z");
        content.settingsText = QStringLiteral("k = 10");
        content.runs = sampleRuns();
        PackComparison cmp;
        cmp.base = QStringLiteral("baseline");
        cmp.candidate = QStringLiteral("candidate");
        PackComparisonRow row;
        row.metric = QStringLiteral("ndcg");
        row.n = 500;
        row.meanDiff = 0.004;
        row.ciLow = -0.003;
        row.ciHigh = 0.011;
        row.pT = 0.3;
        row.pWilcoxon = 0.35;
        cmp.rows.push_back(row);
        cmp.segments.push_back({ QStringLiteral("cold users"), QStringLiteral("ndcg"), 12, 0.1, -0.2, 0.4, 0.5, true });
        cmp.differences = { -0.1, 0.0, 0.2, 0.05 };
        content.comparison = cmp;
        content.worstUsers.headers = { QStringLiteral("user"), QStringLiteral("ndcg") };
        content.worstUsers.rows = { { QStringLiteral("u7"), QStringLiteral("0.000") } };
        PackCaseStudy study;
        study.userId = QStringLiteral("u7");
        study.runName = QStringLiteral("baseline");
        study.why = QStringLiteral("lowest ndcg");
        study.warnings = { QStringLiteral("Part 3 of a series stands at rank 2 while parts 1 and 2 are unseen.") };
        study.list.headers = { QStringLiteral("rank"), QStringLiteral("title") };
        study.list.rows = { { QStringLiteral("1"), QStringLiteral("Title") } };
        for (int i = 0; i < 3; ++i)
            content.caseStudies.push_back(study);

        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("pack.pdf"));
        const auto status = MeetingPack::write(content, path);
        QVERIFY(status.ok());
        const QByteArray bytes = test::fileBytes(path);
        QVERIFY(bytes.startsWith("%PDF-"));
        // Summary + charts, comparison, worst users, and one page per case study.
        const int pages = test::pdfPageCount(bytes);
        QVERIFY2(pages >= 7, qPrintable(QString::number(pages)));

        const QString pdftotext = QStandardPaths::findExecutable(QStringLiteral("pdftotext"));
        if (pdftotext.isEmpty())
            QSKIP("pdftotext (poppler-utils) not installed; text content not checked");
        QProcess p;
        p.start(pdftotext, { path, QStringLiteral("-") });
        QVERIFY(p.waitForFinished(60000));
        // Table cells wrap, so compare with line breaks folded into spaces.
        const QString text = QString::fromUtf8(p.readAllStandardOutput())
                                 .simplified()
                                 .replace(QChar(0xFB01), QStringLiteral("fi")); // pdftotext emits the fi ligature
        QVERIFY(text.contains(QStringLiteral("not significant")));
        QVERIFY(text.contains(QStringLiteral("too small to judge")));
        QVERIFY(text.contains(QStringLiteral("parts 1 and 2 are unseen")));
    }
};

QTEST_MAIN(TestChartExport)
#include "tst_chartexport.moc"

// SPDX-License-Identifier: MIT
// Export from the workbench window, offscreen, on the demo workspace: each screen's charts as
// PNG (signature, pixel size and resolution as asked), SVG (well-formed XML) and PDF (header,
// one page per chart), each screen's tables as CSV (formula escaping, rows as shown), the
// right-click menus, the remembered export choices and the one-click meeting pack (several
// pages, written on the worker thread, cancel writes nothing).
#include "core/comparisonresult.h"
#include "core/evaluation.h"
#include "ui/backgroundtask.h"
#include "ui/chartview.h"
#include "ui/comparescreen.h"
#include "ui/comparisonmodel.h"
#include "ui/exportcontextmenu.h"
#include "ui/exportsettings.h"
#include "ui/inspectorscreen.h"
#include "ui/mainwindow.h"
#include "ui/pngsizedialog.h"
#include "ui/rerankdialog.h"
#include "ui/screenexport.h"
#include "ui/usersscreen.h"
#include "ui/workspacedocument.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QDir>
#include <QElapsedTimer>
#include <QFileInfo>
#include <QImage>
#include <QItemSelectionModel>
#include <QMenu>
#include <QMenuBar>
#include <QPalette>
#include <QProcess>
#include <QRegularExpression>
#include <QSignalSpy>
#include <QStandardItemModel>
#include <QStandardPaths>
#include <QTableView>
#include <QTemporaryDir>
#include <QTest>
#include <QXmlStreamReader>
#include <qcustomplot.h>

#include <functional>
#include <memory>

#include "support/testsupport.h"

using namespace slatewise;
using namespace slatewise::ui;

namespace {

/// Width and height from the PNG's IHDR chunk, read from the bytes (PNG specification,
/// W3C/ISO 15948, sections 5.2 and 11.2.2: 8-byte signature, then IHDR with big-endian
/// width and height).
QSize pngHeaderSize(const QByteArray& bytes)
{
    if (bytes.size() < 24 || bytes.mid(12, 4) != "IHDR")
        return {};
    const auto be32 = [&](int at) {
        return (static_cast<quint32>(static_cast<quint8>(bytes[at])) << 24)
            | (static_cast<quint32>(static_cast<quint8>(bytes[at + 1])) << 16)
            | (static_cast<quint32>(static_cast<quint8>(bytes[at + 2])) << 8)
            | static_cast<quint32>(static_cast<quint8>(bytes[at + 3]));
    };
    return { static_cast<int>(be32(16)), static_cast<int>(be32(20)) };
}

/// RFC 4180 records: comma-separated fields, quoted fields may hold commas, quotes (doubled)
/// and line breaks; records end with CRLF.
std::vector<QStringList> parseCsv(const QString& text)
{
    std::vector<QStringList> records;
    QStringList record;
    QString field;
    bool quoted = false;
    for (qsizetype i = 0; i < text.size(); ++i) {
        const QChar c = text[i];
        if (quoted) {
            if (c == QLatin1Char('"')) {
                if (i + 1 < text.size() && text[i + 1] == QLatin1Char('"')) {
                    field += c;
                    ++i;
                } else {
                    quoted = false;
                }
            } else {
                field += c;
            }
        } else if (c == QLatin1Char('"')) {
            quoted = true;
        } else if (c == QLatin1Char(',')) {
            record << field;
            field.clear();
        } else if (c == QLatin1Char('\r') && i + 1 < text.size() && text[i + 1] == QLatin1Char('\n')) {
            record << field;
            field.clear();
            records.push_back(record);
            record.clear();
            ++i;
        } else {
            field += c;
        }
    }
    if (!field.isEmpty() || !record.isEmpty()) {
        record << field;
        records.push_back(record);
    }
    return records;
}

/// Page count as Debian's poppler-utils `pdfinfo` reads it (an outside PDF parser; installed by
/// scripts/install-deps.sh); -1 when pdfinfo is not there.
int pdfinfoPages(const QString& path)
{
    const QString tool = QStandardPaths::findExecutable(QStringLiteral("pdfinfo"));
    if (tool.isEmpty())
        return -1;
    QProcess process;
    process.start(tool, { path });
    if (!process.waitForFinished(60000) || process.exitCode() != 0)
        return 0;
    const QString out = QString::fromUtf8(process.readAllStandardOutput());
    static const QRegularExpression pages(QStringLiteral("^Pages:\\s+(\\d+)"), QRegularExpression::MultilineOption);
    const auto match = pages.match(out);
    return match.hasMatch() ? match.captured(1).toInt() : 0;
}

bool isPlainNumber(const QString& text)
{
    bool ok = false;
    text.toDouble(&ok);
    return ok;
}

} // namespace

class TestGuiExport : public QObject {
    Q_OBJECT
private:
    QTemporaryDir m_dir;
    QString m_demo;
    std::unique_ptr<MainWindow> m_window;

    QString outDir(const QString& name) const { return m_dir.filePath(name); }

private slots:
    void initTestCase();
    void cleanupTestCase();
    void screenChartsAsPng_data();
    void screenChartsAsPng();
    void screenChartsAsSvgAndPdf_data();
    void screenChartsAsSvgAndPdf();
    void screenTablesAsCsv();
    void csvEscapesFormulasFromAView();
    void contextMenusOnEveryChartAndTable();
    void copyPutsSelectedRowsOnClipboard();
    void pngChoicesAreRemembered();
    void meetingPackIsMultiPage();
    void cancelledMeetingPackWritesNothing();
    void meetingPackChartsStayLightOnADarkDesktop();
    void rerankFromTheWindowIsComparedWithItsParent(); // last: it adds a run
};

void TestGuiExport::initTestCase()
{
    test::failOnUnexpectedMessages();
    QStandardPaths::setTestModeEnabled(true); // QSettings go to a test location
    QCoreApplication::setOrganizationName(QStringLiteral("SlatewiseTest"));
    QCoreApplication::setApplicationName(QStringLiteral("tst_guiexport"));
    QVERIFY(m_dir.isValid());
    m_demo = m_dir.filePath(QStringLiteral("film-club.sqlite"));
    const QString demoError = test::buildDemoWorkspace(m_demo, m_dir.filePath(QStringLiteral("demo-files")));
    QVERIFY2(demoError.isEmpty(), qPrintable(demoError));

    m_window = std::make_unique<MainWindow>();
    // Not shown: the offscreen platform warns about size hints of shown windows, and
    // exports must not depend on the window being on screen.
    m_window->resize(1400, 900);
    QVERIFY(m_window->openWorkspace(m_demo));
    auto* document = m_window->document();
    QVERIFY(test::waitFor([&] { return !document->task()->isRunning() && document->isFullyLoaded(); }));
    const QStringList runs = document->runNames();
    QVERIFY(runs.size() >= 2);

    // A user in the inspector and a comparison on the Compare screen, so every screen has
    // charts and tables with data.
    m_window->users()->setRun(runs.front());
    m_window->users()->sortWorstFirst(core::Metric::Ndcg);
    const auto worst = m_window->users()->firstUser();
    QVERIFY(worst.has_value());
    m_window->openUser(runs.front(), *worst, true);
    QVERIFY(m_window->inspector()->inspection());
    m_window->showScreen(MainWindow::Compare);
    QVERIFY(m_window->compare()->compare(runs[0], runs[1]));
    QVERIFY(
        test::waitFor([&] { return !document->task()->isRunning() && m_window->compare()->comparison() != nullptr; }));
}

void TestGuiExport::cleanupTestCase()
{
    m_window.reset();
}

void TestGuiExport::screenChartsAsPng_data()
{
    QTest::addColumn<int>("screen");
    QTest::addColumn<int>("charts");
    QTest::addColumn<QSize>("pixels");
    QTest::addColumn<int>("dpi");
    QTest::newRow("overview 1000x700 at 192 dpi") << int(MainWindow::Overview) << 4 << QSize(1000, 700) << 192;
    QTest::newRow("inspector 640x400 at 96 dpi") << int(MainWindow::Inspector) << 2 << QSize(640, 400) << 96;
    QTest::newRow("compare 1201x677 at 300 dpi") << int(MainWindow::Compare) << 1 << QSize(1201, 677) << 300;
}

void TestGuiExport::screenChartsAsPng()
{
    QFETCH(int, screen);
    QFETCH(int, charts);
    QFETCH(QSize, pixels);
    QFETCH(int, dpi);
    m_window->showScreen(static_cast<MainWindow::Screen>(screen));
    const QString dir = outDir(QStringLiteral("png-%1").arg(screen));
    const auto written = m_window->saveScreenCharts(dir, ScreenExport::Format::Png, { pixels, dpi });
    QVERIFY2(written.ok(), written.ok() ? "" : written.error().toString().c_str());
    QCOMPARE(written->size(), charts);
    for (const QString& path : *written) {
        const QByteArray bytes = test::fileBytes(path);
        // PNG signature (PNG specification, section 5.2).
        QCOMPARE(bytes.left(8), QByteArray("\x89PNG\r\n\x1a\n", 8));
        QCOMPARE(pngHeaderSize(bytes), pixels);
        const QImage image(path);
        QCOMPARE(image.size(), pixels);
        // The pHYs chunk holds pixels per metre; 1 inch = 0.0254 m (common practice).
        QVERIFY2(
            std::abs(image.dotsPerMeterX() - dpi / 0.0254) < 1.0, qPrintable(QString::number(image.dotsPerMeterX())));
        // A drawn chart, not a blank canvas: more than one colour appears.
        const QColor corner = image.pixelColor(0, 0);
        bool varied = false;
        for (int y = 0; y < image.height() && !varied; y += 7)
            for (int x = 0; x < image.width() && !varied; x += 7)
                varied = image.pixelColor(x, y) != corner;
        QVERIFY2(varied, qPrintable(path));
    }
}

void TestGuiExport::screenChartsAsSvgAndPdf_data()
{
    QTest::addColumn<int>("screen");
    QTest::addColumn<int>("charts");
    QTest::newRow("overview") << int(MainWindow::Overview) << 4;
    QTest::newRow("inspector") << int(MainWindow::Inspector) << 2;
    QTest::newRow("compare") << int(MainWindow::Compare) << 1;
}

void TestGuiExport::screenChartsAsSvgAndPdf()
{
    QFETCH(int, screen);
    QFETCH(int, charts);
    m_window->showScreen(static_cast<MainWindow::Screen>(screen));
    const auto svgs
        = m_window->saveScreenCharts(outDir(QStringLiteral("svg-%1").arg(screen)), ScreenExport::Format::Svg);
    QVERIFY(svgs.ok());
    QCOMPARE(svgs->size(), charts);
    for (const QString& path : *svgs) {
        QFile file(path);
        QVERIFY(file.open(QIODevice::ReadOnly));
        QXmlStreamReader xml(&file);
        QString root;
        int texts = 0;
        while (!xml.atEnd()) {
            if (xml.readNext() == QXmlStreamReader::StartElement) {
                if (root.isEmpty())
                    root = xml.name().toString();
                if (xml.name() == QLatin1String("text"))
                    ++texts;
            }
        }
        QVERIFY2(!xml.hasError(), qPrintable(path + QStringLiteral(": ") + xml.errorString()));
        QCOMPARE(root, QStringLiteral("svg"));
        QVERIFY2(texts > 3, qPrintable(path)); // title, axis labels and ticks are text
    }
    const auto pdfs
        = m_window->saveScreenCharts(outDir(QStringLiteral("pdf-%1").arg(screen)), ScreenExport::Format::Pdf);
    QVERIFY(pdfs.ok());
    QCOMPARE(pdfs->size(), charts);
    for (const QString& path : *pdfs) {
        const QByteArray bytes = test::fileBytes(path);
        // Header "%PDF-1.x" and end marker (ISO 32000-1, sections 7.5.2 and 7.5.5).
        QVERIFY2(bytes.startsWith("%PDF-1."), qPrintable(path));
        QVERIFY(bytes.trimmed().endsWith("%%EOF"));
        QCOMPARE(test::pdfPageCount(bytes), 1);
        const int outside = pdfinfoPages(path);
        QVERIFY2(outside == -1 || outside == 1, qPrintable(path)); // poppler parses it as one page
    }
}

void TestGuiExport::screenTablesAsCsv()
{
    m_window->showScreen(MainWindow::Users);
    const auto written = m_window->saveScreenTables(outDir(QStringLiteral("csv-users")));
    QVERIFY(written.ok());
    QCOMPARE(written->size(), 1);
    QCOMPARE(QFileInfo(written->front()).fileName(), QStringLiteral("users.csv"));
    const auto records = parseCsv(QString::fromUtf8(test::fileBytes(written->front())));
    const QAbstractItemModel* shown = m_window->users()->table()->model();
    // Header plus one record per row as shown (sorted and filtered), in the same order.
    QCOMPARE(static_cast<int>(records.size()), shown->rowCount() + 1);
    QCOMPARE(records.front().size(), shown->columnCount());
    for (int c = 0; c < shown->columnCount(); ++c)
        QCOMPARE(records.front()[c], shown->headerData(c, Qt::Horizontal).toString());
    for (int r : { 0, 1, shown->rowCount() - 1 })
        QCOMPARE(records[static_cast<std::size_t>(r) + 1][0], shown->data(shown->index(r, 0)).toString());

    // Every table of every screen: no cell a spreadsheet would run as a formula (OWASP "CSV
    // Injection" advice, from memory): a field starting with = + - @ tab or CR is a number.
    for (const auto screen : { MainWindow::Overview, MainWindow::Users, MainWindow::Inspector, MainWindow::Compare }) {
        m_window->showScreen(screen);
        const auto files = m_window->saveScreenTables(outDir(QStringLiteral("csv-%1").arg(int(screen))));
        QVERIFY(files.ok());
        QCOMPARE(files->size(), ScreenExport::tables(m_window->screenWidget(screen)).size());
        QVERIFY(!files->isEmpty());
        for (const QString& path : *files) {
            const auto rows = parseCsv(QString::fromUtf8(test::fileBytes(path)));
            QVERIFY2(rows.size() >= 2, qPrintable(path)); // every table shows data on the demo
            for (const auto& row : rows) {
                QCOMPARE(row.size(), rows.front().size());
                for (const QString& cell : row) {
                    if (cell.isEmpty())
                        continue;
                    const QChar first = cell.front();
                    const bool risky = first == QLatin1Char('=') || first == QLatin1Char('+')
                        || first == QLatin1Char('-') || first == QLatin1Char('@') || first == QLatin1Char('\t')
                        || first == QLatin1Char('\r');
                    QVERIFY2(!risky || isPlainNumber(cell), qPrintable(path + QStringLiteral(": ") + cell));
                }
            }
        }
    }
}

void TestGuiExport::csvEscapesFormulasFromAView()
{
    // The same path as "Save table as CSV…" on a table whose cells try to run formulas.
    QStandardItemModel model(5, 2);
    model.setHorizontalHeaderLabels({ QStringLiteral("=title"), QStringLiteral("value") });
    const QStringList texts { QStringLiteral("=HYPERLINK(\"x\")"), QStringLiteral("+1+1"), QStringLiteral("-2+3"),
        QStringLiteral("@SUM(A1)"), QStringLiteral("\tx") };
    for (int r = 0; r < texts.size(); ++r) {
        model.setItem(r, 0, new QStandardItem(texts[r]));
        auto* number = new QStandardItem;
        number->setData(-0.5 * r, Qt::DisplayRole);
        model.setItem(r, 1, number);
    }
    QTableView view;
    view.setModel(&model);
    const QString path = outDir(QStringLiteral("escaping.csv"));
    QVERIFY(ScreenExport::saveTable(view, path).ok());
    const auto rows = parseCsv(QString::fromUtf8(test::fileBytes(path)));
    QCOMPARE(static_cast<int>(rows.size()), 6);
    // A leading apostrophe keeps the text as text (OWASP "CSV Injection", from memory).
    QCOMPARE(rows[0][0], QStringLiteral("'=title"));
    for (int r = 0; r < texts.size(); ++r) {
        QCOMPARE(rows[static_cast<std::size_t>(r) + 1][0], QLatin1Char('\'') + texts[r]);
        // Negative numbers stay numbers.
        QCOMPARE(rows[static_cast<std::size_t>(r) + 1][1].toDouble(), -0.5 * r);
        QVERIFY(!rows[static_cast<std::size_t>(r) + 1][1].startsWith(QLatin1Char('\'')));
    }
}

void TestGuiExport::contextMenusOnEveryChartAndTable()
{
    int charts = 0, tables = 0;
    for (const auto screen : { MainWindow::Overview, MainWindow::Users, MainWindow::Inspector, MainWindow::Compare }) {
        for (ChartView* chart : ScreenExport::charts(m_window->screenWidget(screen))) {
            ++charts;
            QCOMPARE(chart->plot()->contextMenuPolicy(), Qt::CustomContextMenu);
            std::unique_ptr<QMenu> menu(ExportContextMenu::chartMenu(chart, nullptr));
            QStringList texts;
            for (QAction* a : menu->actions())
                texts << a->text().remove(QLatin1Char('&'));
            QCOMPARE(texts,
                (QStringList { QStringLiteral("Save chart as PNG…"), QStringLiteral("Save chart as SVG…"),
                    QStringLiteral("Save chart as PDF…") }));
        }
        for (QTableView* table : ScreenExport::tables(m_window->screenWidget(screen))) {
            ++tables;
            QCOMPARE(table->contextMenuPolicy(), Qt::CustomContextMenu);
            QVERIFY2(!table->objectName().isEmpty(), "every table has a file name for its CSV");
            std::unique_ptr<QMenu> menu(ExportContextMenu::tableMenu(table, nullptr));
            QStringList texts;
            for (QAction* a : menu->actions())
                texts << a->text().remove(QLatin1Char('&'));
            QCOMPARE(texts, (QStringList { QStringLiteral("Copy"), QStringLiteral("Save table as CSV…") }));
        }
    }
    QCOMPARE(charts, 7);
    QCOMPARE(tables, 8);
}

void TestGuiExport::copyPutsSelectedRowsOnClipboard()
{
    m_window->showScreen(MainWindow::Overview);
    QTableView* table = ScreenExport::tables(m_window->screenWidget(MainWindow::Overview)).front();
    QAbstractItemModel* model = table->model();
    QVERIFY(model->rowCount() >= 2);
    table->selectionModel()->select(
        model->index(1, 0), QItemSelectionModel::ClearAndSelect | QItemSelectionModel::Rows);
    ExportContextMenu::copyTable(table);
    const QStringList lines = QApplication::clipboard()->text().split(QLatin1Char('\n'), Qt::SkipEmptyParts);
    QCOMPARE(lines.size(), 2); // header and the one selected row
    const QStringList cells = lines[1].split(QLatin1Char('\t'));
    QCOMPARE(cells.size(), model->columnCount());
    QCOMPARE(cells[0], model->data(model->index(1, 0)).toString());
    QCOMPARE(lines[0].split(QLatin1Char('\t'))[0], model->headerData(0, Qt::Horizontal).toString());
}

void TestGuiExport::pngChoicesAreRemembered()
{
    ExportSettings::setPng({ QSize(1234, 567), 200 });
    const auto png = ExportSettings::png();
    QCOMPARE(png.pixels, QSize(1234, 567));
    QCOMPARE(png.dpi, 200);
    PngSizeDialog dialog(png);
    QCOMPARE(dialog.options().pixels, QSize(1234, 567));
    QCOMPARE(dialog.options().dpi, 200);
    // 1234 px at 200 dpi is 6.17 inches = 15.67 cm (1 inch = 2.54 cm).
    QVERIFY2(dialog.explanation().contains(QStringLiteral("15.7")), qPrintable(dialog.explanation()));

    // Pictures to look at while developing (SLATEWISE_SHOT_DIR=/some/dir).
    const QString shots = qEnvironmentVariable("SLATEWISE_SHOT_DIR");
    if (!shots.isEmpty()) {
        dialog.adjustSize();
        QVERIFY(dialog.grab().save(QDir(shots).filePath(QStringLiteral("png-size-dialog.png"))));
        for (QAction* menu : m_window->menuBar()->actions()) {
            if (menu->menu() && menu->text().remove(QLatin1Char('&')) == QStringLiteral("Export")) {
                menu->menu()->adjustSize();
                QVERIFY(menu->menu()->grab().save(QDir(shots).filePath(QStringLiteral("export-menu.png"))));
            }
        }
    }

    const QString folder = outDir(QStringLiteral("remembered"));
    QVERIFY(QDir().mkpath(folder));
    ExportSettings::rememberPath(QDir(folder).filePath(QStringLiteral("chart.png")));
    QCOMPARE(QFileInfo(ExportSettings::lastFolder()).canonicalFilePath(), QFileInfo(folder).canonicalFilePath());
}

void TestGuiExport::meetingPackIsMultiPage()
{
    const QString folder = outDir(QStringLiteral("pack"));
    QVERIFY(QDir().mkpath(folder));
    ExportSettings::rememberPath(folder);
    const QString path = m_window->defaultMeetingPackPath();
    QCOMPARE(QFileInfo(path).absolutePath(), QFileInfo(folder).absoluteFilePath());
    QVERIFY2(QFileInfo(path).fileName().startsWith(QStringLiteral("film-club-meeting-pack-")), qPrintable(path));

    QSignalSpy finished(m_window.get(), &MainWindow::meetingPackFinished);
    QVERIFY(m_window->writeMeetingPack(path));
    QVERIFY(m_window->document()->task()->isRunning()); // on the worker thread
    QVERIFY(finished.wait(300000));
    QCOMPARE(finished.front().at(0).toString(), path);
    QCOMPARE(finished.front().at(1).toString(), QString());
    const QByteArray bytes = test::fileBytes(path);
    QVERIFY(bytes.startsWith("%PDF-1."));
    // Summary, charts, comparison, worst-served users and three case studies.
    const int pages = test::pdfPageCount(bytes);
    QVERIFY2(pages > 1, qPrintable(QString::number(pages)));
    QVERIFY2(pages >= 5, qPrintable(QString::number(pages)));
    // An outside reader agrees (poppler-utils pdfinfo).
    const int outside = pdfinfoPages(path);
    QVERIFY2(outside == -1 || outside == pages, qPrintable(QString::number(outside)));
    // The next one-click pack does not overwrite this one.
    QVERIFY(m_window->defaultMeetingPackPath() != path);
}

void TestGuiExport::cancelledMeetingPackWritesNothing()
{
    const QString path = outDir(QStringLiteral("cancelled-pack.pdf"));
    QSignalSpy finished(m_window.get(), &MainWindow::meetingPackFinished);
    QVERIFY(m_window->writeMeetingPack(path));
    m_window->document()->task()->cancel();
    QVERIFY(finished.wait(300000));
    QCOMPARE(finished.front().at(1).toString(), QStringLiteral("Cancelled."));
    QVERIFY(!QFileInfo::exists(path));
}

void TestGuiExport::meetingPackChartsStayLightOnADarkDesktop()
{
    const QString pdftoppm = QStandardPaths::findExecutable(QStringLiteral("pdftoppm"));
    if (pdftoppm.isEmpty())
        QSKIP("poppler-utils' pdftoppm is not installed (scripts/install-deps.sh installs it)");
    const QPalette light = QApplication::palette();
    QPalette dark = light;
    for (const auto role : { QPalette::Window, QPalette::Base, QPalette::Button })
        dark.setColor(role, QColor(0x22, 0x22, 0x22));
    for (const auto role : { QPalette::WindowText, QPalette::Text, QPalette::ButtonText })
        dark.setColor(role, QColor(0xee, 0xee, 0xee));
    QApplication::setPalette(dark);
    const QString path = outDir(QStringLiteral("dark-desktop-pack.pdf"));
    QSignalSpy finished(m_window.get(), &MainWindow::meetingPackFinished);
    const bool started = m_window->writeMeetingPack(path);
    const bool done = started && finished.wait(300000);
    QApplication::setPalette(light);
    QVERIFY(done);
    QCOMPARE(finished.front().at(1).toString(), QString());

    // Page 2 is mostly the error charts; rasterized by poppler it must be light paper.
    const QString stem = outDir(QStringLiteral("dark-desktop-page"));
    QProcess process;
    process.start(pdftoppm,
        { QStringLiteral("-f"), QStringLiteral("2"), QStringLiteral("-l"), QStringLiteral("2"), QStringLiteral("-r"),
            QStringLiteral("30"), QStringLiteral("-png"), QStringLiteral("-singlefile"), path, stem });
    QVERIFY(process.waitForFinished(60000));
    QCOMPARE(process.exitCode(), 0);
    const QImage page(stem + QStringLiteral(".png"));
    QVERIFY(!page.isNull());
    double lightness = 0.0;
    int pixels = 0;
    for (int y = 0; y < page.height(); ++y)
        for (int x = 0; x < page.width(); ++x, ++pixels)
            lightness += page.pixelColor(x, y).lightnessF();
    // Dark charts cover over half the page and pull the mean far below this.
    QVERIFY2(lightness / pixels > 0.85, qPrintable(QString::number(lightness / pixels)));
}

void TestGuiExport::rerankFromTheWindowIsComparedWithItsParent()
{
    auto* document = m_window->document();
    const QString parent = document->runNames().front();
    const int runsBefore = static_cast<int>(document->runNames().size());
    RerankDialog* dialog = m_window->createRerankDialog();
    dialog->setParentRun(parent);
    dialog->setMethod(QStringLiteral("series-order"));
    dialog->setRunName(QStringLiteral("window-series-order"));
    QSignalSpy reranked(dialog, &RerankDialog::reranked);
    QVERIFY(dialog->startRerank());
    QVERIFY(reranked.wait(300000));
    dialog->close();
    // The window reloads the workspace, then compares the new run with its parent.
    QVERIFY(test::waitFor([&] {
        const auto shown = m_window->compare()->comparison();
        return !document->task()->isRunning() && shown && shown->candidate == "window-series-order";
    }));
    QCOMPARE(static_cast<int>(document->runNames().size()), runsBefore + 1);
    QCOMPARE(QString::fromStdString(m_window->compare()->comparison()->base), parent);
    QVERIFY(m_window->compare()->comparisonModel()->rowCount() > 0);
}

QTEST_MAIN(TestGuiExport)
#include "tst_guiexport.moc"

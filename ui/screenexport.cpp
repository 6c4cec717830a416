// SPDX-License-Identifier: MIT
#include "ui/screenexport.h"

#include "ui/chartexporter.h"
#include "ui/chartview.h"
#include "ui/csvexporter.h"

#include <QAbstractItemModel>
#include <QDir>
#include <QFileInfo>
#include <QHeaderView>
#include <QItemSelectionModel>
#include <QTableView>

#include <algorithm>
#include <set>

namespace slatewise::ui {

namespace {
core::Error folderError(const QString& folder)
{
    return core::Error { .kind = core::ErrorKind::Workspace,
        .file = folder.toStdString(),
        .message = "cannot create the folder",
        .expected = "a writable folder" };
}

/// Text for the clipboard: tabs and line breaks inside a cell would split it.
QString clipboardCell(const QVariant& value)
{
    QString text = value.toString();
    text.replace(QLatin1Char('\t'), QLatin1Char(' '));
    text.replace(QLatin1Char('\n'), QLatin1Char(' '));
    text.replace(QLatin1Char('\r'), QLatin1Char(' '));
    return text;
}
} // namespace

QString ScreenExport::suffix(Format format)
{
    switch (format) {
    case Format::Png:
        return QStringLiteral("png");
    case Format::Svg:
        return QStringLiteral("svg");
    case Format::Pdf:
        return QStringLiteral("pdf");
    }
    return {};
}

bool ScreenExport::formatFromPath(const QString& path, Format& format)
{
    const QString s = QFileInfo(path).suffix().toLower();
    for (const Format f : { Format::Png, Format::Svg, Format::Pdf }) {
        if (s == suffix(f)) {
            format = f;
            return true;
        }
    }
    return false;
}

QList<ChartView*> ScreenExport::charts(const QWidget* screen)
{
    return screen ? screen->findChildren<ChartView*>() : QList<ChartView*> {};
}

QList<QTableView*> ScreenExport::tables(const QWidget* screen)
{
    return screen ? screen->findChildren<QTableView*>() : QList<QTableView*> {};
}

QString ScreenExport::tableStem(const QTableView& table, int index)
{
    return table.objectName().isEmpty() ? QStringLiteral("table-%1").arg(index + 1) : table.objectName();
}

QSize ScreenExport::vectorSize(const ChartView& chart)
{
    if (chart.isVisible() && chart.width() >= 200 && chart.height() >= 150)
        return chart.size();
    return { 1000, 625 };
}

core::Status ScreenExport::saveChart(
    ChartView& chart, const QString& path, Format format, const ExportSettings::Png& png)
{
    core::Status status = core::Done {};
    switch (format) {
    case Format::Png:
        status = ChartExporter::savePng(chart, path, png.pixels, png.dpi);
        break;
    case Format::Svg:
        status = ChartExporter::saveSvg(chart, path, vectorSize(chart));
        break;
    case Format::Pdf:
        status = ChartExporter::savePdf(chart, path, vectorSize(chart));
        break;
    }
    // Exporting lays the plot out at the export size; lay it out for the screen again.
    chart.refresh();
    return status;
}

core::Status ScreenExport::saveTable(
    const QTableView& table, const QString& path, const CsvExporter::RowProgress& progress)
{
    if (!table.model())
        return core::Error { .kind = core::ErrorKind::Usage,
            .file = path.toStdString(),
            .message = "the table shows nothing",
            .expected = "a table with rows" };
    return CsvExporter::write(*table.model(), path, Qt::DisplayRole, progress);
}

core::Result<QStringList> ScreenExport::saveCharts(
    const QWidget* screen, const QString& folder, Format format, const ExportSettings::Png& png)
{
    if (!QDir().mkpath(folder))
        return folderError(folder);
    QStringList written;
    std::set<QString> used;
    for (ChartView* chart : charts(screen)) {
        // Two charts of one kind on a screen must not overwrite each other.
        QString stem = chart->fileStem().isEmpty() ? QStringLiteral("chart") : chart->fileStem();
        for (int n = 2; used.count(stem); ++n)
            stem = QStringLiteral("%1-%2").arg(chart->fileStem()).arg(n);
        used.insert(stem);
        const QString path = QDir(folder).filePath(stem + QLatin1Char('.') + suffix(format));
        const auto status = saveChart(*chart, path, format, png);
        if (!status)
            return status.errors();
        written << path;
    }
    return written;
}

core::Result<QStringList> ScreenExport::saveTables(
    const QWidget* screen, const QString& folder, const CsvExporter::RowProgress& progress)
{
    if (!QDir().mkpath(folder))
        return folderError(folder);
    QStringList written;
    const auto views = tables(screen);
    for (int i = 0; i < views.size(); ++i) {
        const QString path = QDir(folder).filePath(tableStem(*views[i], i) + QStringLiteral(".csv"));
        const auto status = saveTable(*views[i], path, progress);
        if (!status)
            return status.errors();
        written << path;
    }
    return written;
}

QString ScreenExport::selectionText(const QTableView& table)
{
    const QAbstractItemModel* model = table.model();
    if (!model)
        return {};
    std::vector<int> rows;
    if (const auto* selection = table.selectionModel()) {
        for (const QModelIndex& index : selection->selectedIndexes())
            rows.push_back(index.row());
    }
    std::sort(rows.begin(), rows.end());
    rows.erase(std::unique(rows.begin(), rows.end()), rows.end());
    if (rows.empty()) {
        for (int r = 0; r < model->rowCount(); ++r)
            rows.push_back(r);
    }
    // Columns in the order shown, hidden ones left out.
    std::vector<int> columns;
    const QHeaderView* header = table.horizontalHeader();
    for (int visual = 0; visual < model->columnCount(); ++visual) {
        const int logical = header ? header->logicalIndex(visual) : visual;
        if (logical >= 0 && !table.isColumnHidden(logical))
            columns.push_back(logical);
    }
    QStringList lines;
    QStringList cells;
    for (const int c : columns)
        cells << clipboardCell(model->headerData(c, Qt::Horizontal, Qt::DisplayRole));
    lines << cells.join(QLatin1Char('\t'));
    for (const int r : rows) {
        cells.clear();
        for (const int c : columns)
            cells << clipboardCell(model->data(model->index(r, c), Qt::DisplayRole));
        lines << cells.join(QLatin1Char('\t'));
    }
    return lines.join(QLatin1Char('\n')) + QLatin1Char('\n');
}

} // namespace slatewise::ui

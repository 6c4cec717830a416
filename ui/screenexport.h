// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "ui/csvexporter.h"
#include "ui/exportsettings.h"

#include <QList>
#include <QSize>
#include <QString>
#include <QStringList>

class QTableView;
class QWidget;

namespace slatewise::ui {

class ChartView;

/// Saves what a workbench screen shows: its charts (PNG, SVG, PDF) and its tables (CSV, as
/// sorted and filtered on screen), one file per chart or table named after it. Takes paths
/// and options, so the menus only collect them and tests call these directly.
class ScreenExport {
public:
    enum class Format { Png, Svg, Pdf };

    /// File suffix without the dot ("png").
    static QString suffix(Format format);
    /// Sets `format` from the path's suffix (.png, .svg, .pdf); false for any other suffix.
    static bool formatFromPath(const QString& path, Format& format);

    /// Charts and tables inside `screen`, in creation order.
    static QList<ChartView*> charts(const QWidget* screen);
    static QList<QTableView*> tables(const QWidget* screen);
    /// File name stem of a table: its object name, or "table-N" when it has none.
    static QString tableStem(const QTableView& table, int index);

    /// Size for vector output: the chart as laid out on screen, or 1000 × 625 when it is not shown.
    static QSize vectorSize(const ChartView& chart);
    /// One chart to `path`; `png` is used for PNG only.
    static core::Status saveChart(
        ChartView& chart, const QString& path, Format format, const ExportSettings::Png& png = {});
    /// One table to `path` as CSV, rows in the order shown.
    static core::Status saveTable(
        const QTableView& table, const QString& path, const CsvExporter::RowProgress& progress = {});

    /// Every chart of `screen` into `folder` as "<stem>.<suffix>"; returns the files written.
    static core::Result<QStringList> saveCharts(
        const QWidget* screen, const QString& folder, Format format, const ExportSettings::Png& png = {});
    /// Every table of `screen` into `folder` as "<stem>.csv"; returns the files written.
    static core::Result<QStringList> saveTables(
        const QWidget* screen, const QString& folder, const CsvExporter::RowProgress& progress = {});

    /// The selected rows of `table` (every row when nothing is selected) as tab-separated
    /// text with a header line, for the clipboard.
    static QString selectionText(const QTableView& table);
};

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#pragma once

#include "ui/screenexport.h"

#include <QString>

class QMenu;
class QTableView;
class QWidget;

namespace slatewise::ui {

class ChartView;

/// Right-click menus that export the one chart or table under the mouse: "Save chart as
/// PNG/SVG/PDF…" on charts, "Copy" and "Save table as CSV…" on tables. The menus collect a
/// file name (and the PNG size) in dialogs and call ScreenExport to write.
class ExportContextMenu {
public:
    /// Attaches the menu to every chart and table inside `root` (once per widget).
    static void attachAll(QWidget* root);
    static void attach(ChartView* chart);
    static void attach(QTableView* table);

    /// The menus as shown (the caller owns and deletes them); for tests and the handlers.
    static QMenu* chartMenu(ChartView* chart, QWidget* parent);
    static QMenu* tableMenu(QTableView* table, QWidget* parent);

    /// Asks for a file and saves `chart` in `format` (PNG first asks for the size).
    static void saveChartInteractively(ChartView* chart, ScreenExport::Format format);
    static void saveTableInteractively(QTableView* table);
    /// Puts the selected rows (all rows when none is selected) on the clipboard.
    static void copyTable(const QTableView* table);
    /// Shows the first error of `status` in a message box; true when it succeeded.
    static bool reportStatus(QWidget* parent, const core::Status& status, const QString& what);
};

} // namespace slatewise::ui

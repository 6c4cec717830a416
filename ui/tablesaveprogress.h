// SPDX-License-Identifier: MIT
#pragma once

#include "ui/csvexporter.h"

#include <memory>

class QProgressDialog;
class QWidget;

namespace slatewise::ui {

/// Progress and cancel for saving tables as CSV on the GUI thread (a table model is read
/// where it lives). A window-modal progress dialog appears once a save reaches a large
/// table; updating it keeps the window painting, and its Cancel stops the save.
class TableSaveProgress {
public:
    explicit TableSaveProgress(QWidget* window);
    ~TableSaveProgress();
    TableSaveProgress(const TableSaveProgress&) = delete;
    TableSaveProgress& operator=(const TableSaveProgress&) = delete;

    /// The callback to hand to CsvExporter / ScreenExport; valid while this object lives.
    CsvExporter::RowProgress callback();

    /// Tables below this many rows save without a dialog.
    static constexpr int kLargeTable = 20000;

private:
    bool report(int done, int total);

    QWidget* m_window;
    std::unique_ptr<QProgressDialog> m_dialog;
};

} // namespace slatewise::ui

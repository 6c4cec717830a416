// SPDX-License-Identifier: MIT
#include "ui/tablesaveprogress.h"

#include <QCoreApplication>
#include <QProgressDialog>

namespace slatewise::ui {

TableSaveProgress::TableSaveProgress(QWidget* window)
    : m_window(window)
{
}

TableSaveProgress::~TableSaveProgress() = default;

CsvExporter::RowProgress TableSaveProgress::callback()
{
    return [this](int done, int total) { return report(done, total); };
}

bool TableSaveProgress::report(int done, int total)
{
    if (total < kLargeTable)
        return !(m_dialog && m_dialog->wasCanceled());
    if (!m_dialog) {
        m_dialog = std::make_unique<QProgressDialog>(
            QCoreApplication::translate("TableSaveProgress", "Saving the table as CSV…"),
            QCoreApplication::translate("TableSaveProgress", "Cancel"), 0, total, m_window);
        m_dialog->setWindowModality(Qt::WindowModal);
        m_dialog->setMinimumDuration(300);
    }
    if (m_dialog->maximum() != total)
        m_dialog->setMaximum(total);
    m_dialog->setLabelText(QCoreApplication::translate("TableSaveProgress", "Saving the table as CSV: %1 of %2 rows…")
                               .arg(done)
                               .arg(total));
    m_dialog->setValue(done); // a window-modal dialog processes events here
    return !m_dialog->wasCanceled();
}

} // namespace slatewise::ui

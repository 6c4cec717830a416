// SPDX-License-Identifier: MIT
#include "ui/exportcontextmenu.h"

#include "ui/chartview.h"
#include "ui/exportsettings.h"
#include "ui/format.h"
#include "ui/pngsizedialog.h"
#include "ui/tablesaveprogress.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QDir>
#include <QFileDialog>
#include <QMenu>
#include <QMessageBox>
#include <QPointer>
#include <QTableView>
#include <qcustomplot.h>

namespace slatewise::ui {

namespace {
const char* const kAttached = "slatewiseExportMenu";

QString filterFor(ScreenExport::Format format)
{
    switch (format) {
    case ScreenExport::Format::Png:
        return QObject::tr("PNG image (*.png)");
    case ScreenExport::Format::Svg:
        return QObject::tr("SVG drawing (*.svg)");
    case ScreenExport::Format::Pdf:
        return QObject::tr("PDF document (*.pdf)");
    }
    return {};
}

QString withSuffix(QString path, const QString& suffix)
{
    if (!path.endsWith(QLatin1Char('.') + suffix, Qt::CaseInsensitive))
        path += QLatin1Char('.') + suffix;
    return path;
}
} // namespace

void ExportContextMenu::attachAll(QWidget* root)
{
    if (!root)
        return;
    for (ChartView* chart : root->findChildren<ChartView*>())
        attach(chart);
    for (QTableView* table : root->findChildren<QTableView*>())
        attach(table);
}

void ExportContextMenu::attach(ChartView* chart)
{
    if (!chart || chart->property(kAttached).toBool())
        return;
    chart->setProperty(kAttached, true);
    // The plot fills the chart and receives the click.
    QCustomPlot* plot = chart->plot();
    plot->setContextMenuPolicy(Qt::CustomContextMenu);
    QObject::connect(plot, &QWidget::customContextMenuRequested, chart, [chart](const QPoint& pos) {
        QMenu* menu = chartMenu(chart, chart);
        menu->setAttribute(Qt::WA_DeleteOnClose);
        menu->popup(chart->plot()->mapToGlobal(pos));
    });
}

void ExportContextMenu::attach(QTableView* table)
{
    if (!table || table->property(kAttached).toBool())
        return;
    table->setProperty(kAttached, true);
    table->setContextMenuPolicy(Qt::CustomContextMenu);
    QObject::connect(table, &QWidget::customContextMenuRequested, table, [table](const QPoint& pos) {
        QMenu* menu = tableMenu(table, table);
        menu->setAttribute(Qt::WA_DeleteOnClose);
        menu->popup(table->viewport()->mapToGlobal(pos));
    });
    // Ctrl+C copies the selected rows while the table has focus.
    auto* copy = new QAction(QObject::tr("Copy"), table);
    copy->setShortcut(QKeySequence::Copy);
    copy->setShortcutContext(Qt::WidgetShortcut);
    QObject::connect(copy, &QAction::triggered, table, [table] { copyTable(table); });
    table->addAction(copy);
}

QMenu* ExportContextMenu::chartMenu(ChartView* chart, QWidget* parent)
{
    auto* menu = new QMenu(parent);
    QPointer<ChartView> target = chart;
    const auto add = [&](const QString& text, ScreenExport::Format format) {
        menu->addAction(text, menu, [target, format] {
            if (target)
                saveChartInteractively(target, format);
        });
    };
    add(QObject::tr("Save chart as &PNG…"), ScreenExport::Format::Png);
    add(QObject::tr("Save chart as &SVG…"), ScreenExport::Format::Svg);
    add(QObject::tr("Save chart as P&DF…"), ScreenExport::Format::Pdf);
    return menu;
}

QMenu* ExportContextMenu::tableMenu(QTableView* table, QWidget* parent)
{
    auto* menu = new QMenu(parent);
    QPointer<QTableView> target = table;
    QAction* copy = menu->addAction(QObject::tr("&Copy"), menu, [target] {
        if (target)
            copyTable(target);
    });
    copy->setShortcut(QKeySequence::Copy);
    copy->setToolTip(QObject::tr("Copies the selected rows (all rows when none is selected) as tab-separated text."));
    menu->addAction(QObject::tr("Save table as &CSV…"), menu, [target] {
        if (target)
            saveTableInteractively(target);
    });
    return menu;
}

void ExportContextMenu::saveChartInteractively(ChartView* chart, ScreenExport::Format format)
{
    ExportSettings::Png png = ExportSettings::png();
    if (format == ScreenExport::Format::Png) {
        PngSizeDialog size(png, chart->window());
        if (size.exec() != QDialog::Accepted)
            return;
        png = size.options();
        ExportSettings::setPng(png);
    }
    const QString suffix = ScreenExport::suffix(format);
    const QString proposed = QDir(ExportSettings::lastFolder()).filePath(chart->fileStem() + QLatin1Char('.') + suffix);
    QString path
        = QFileDialog::getSaveFileName(chart->window(), QObject::tr("Save chart"), proposed, filterFor(format));
    if (path.isEmpty())
        return;
    path = withSuffix(path, suffix);
    ExportSettings::rememberPath(path);
    reportStatus(
        chart->window(), ScreenExport::saveChart(*chart, path, format, png), QObject::tr("Cannot save the chart"));
}

void ExportContextMenu::saveTableInteractively(QTableView* table)
{
    const QString stem = table->objectName().isEmpty() ? QStringLiteral("table") : table->objectName();
    const QString proposed = QDir(ExportSettings::lastFolder()).filePath(stem + QStringLiteral(".csv"));
    QString path = QFileDialog::getSaveFileName(
        table->window(), QObject::tr("Save table as CSV"), proposed, QObject::tr("CSV table (*.csv)"));
    if (path.isEmpty())
        return;
    path = withSuffix(path, QStringLiteral("csv"));
    ExportSettings::rememberPath(path);
    TableSaveProgress progress(table->window());
    reportStatus(table->window(), ScreenExport::saveTable(*table, path, progress.callback()),
        QObject::tr("Cannot save the table"));
}

void ExportContextMenu::copyTable(const QTableView* table)
{
    QApplication::clipboard()->setText(ScreenExport::selectionText(*table));
}

bool ExportContextMenu::reportStatus(QWidget* parent, const core::Status& status, const QString& what)
{
    if (status)
        return true;
    if (status.error().kind != core::ErrorKind::Cancelled) // the user knows they cancelled
        QMessageBox::warning(parent, what, toQ(status.error().toString()));
    return false;
}

} // namespace slatewise::ui

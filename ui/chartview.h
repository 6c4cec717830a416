// SPDX-License-Identifier: MIT
#pragma once

#include <QFont>
#include <QString>
#include <QWidget>

class QCustomPlot;
class QCPAxis;
class QCPAxisRect;
class QCPLegend;

namespace slatewise::ui {

class ChartPalette;

/// Base of every Slatewise chart: a widget that owns one QCustomPlot and redraws it from
/// the data last given to the subclass's setData(). It re-themes itself when the palette
/// changes (light/dark) and is exported by ChartExporter. Works without being shown, so
/// the command line renders charts offscreen.
class ChartView : public QWidget {
    Q_OBJECT
public:
    explicit ChartView(QWidget* parent = nullptr);
    ~ChartView() override;

    QCustomPlot* plot() const { return m_plot; }
    /// What the chart shows, as drawn in its title ("RMSE and mean error by withheld rating").
    QString title() const { return m_title; }
    /// Short file name stem for exports, e.g. "error-by-rating".
    QString fileStem() const { return m_fileStem; }
    /// True when setData() received nothing drawable; the chart then shows `emptyText`.
    bool isEmpty() const { return m_empty; }
    /// Redraws everything from the stored data with the current palette.
    void refresh();

    QSize sizeHint() const override;
    QSize minimumSizeHint() const override;

protected:
    void setTitle(const QString& title);
    void setFileStem(const QString& stem) { m_fileStem = stem; }
    void changeEvent(QEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;
    void showEvent(QShowEvent* event) override;

    /// Subclasses clear the plot and draw their data here. `empty` reports "nothing to draw".
    virtual void rebuild(const ChartPalette& palette) = 0;
    void setEmpty(bool empty, const QString& emptyText = {});

    // Helpers shared by the subclasses; all take colours from `palette`. Layout is one column:
    // title, optional subtitle, the subclass's axis rects, then the legend in its own row so
    // it never covers data.
    /// Adds title (and subtitle) rows at the top; returns the next free row.
    int addTitle(const ChartPalette& palette, const QString& subtitle = {});
    /// A new styled axis rect at (row, column) of the main layout.
    QCPAxisRect* addAxisRect(const ChartPalette& palette, int row, int column = 0);
    /// Colours, fonts and label of one axis.
    void styleAxis(QCPAxis* axis, const ChartPalette& palette, const QString& label);
    /// Sets range and ticks from NiceAxis (labels with just enough decimals).
    void setNiceRange(QCPAxis* axis, double min, double max, int ticks = 5);
    /// A legend in its own row below the plots, entries laid out in `columns` columns.
    QCPLegend* addLegendRow(const ChartPalette& palette, int row, int columns = 4);
    /// Shows only the title and the empty text (nothing drawable was given).
    void showEmptyMessage(const ChartPalette& palette);
    /// Base font for chart text (the widget font at a size that reads in exports too).
    QFont chartFont(double scale = 1.0, bool bold = false) const;

private:
    /// `text` broken into lines that fit the plot's current width in `font`.
    QString wrapToWidth(const QString& text, const QFont& font) const;

    QCustomPlot* m_plot = nullptr;
    QCPLegend* m_legend = nullptr; ///< the legend row of the current layout, if any
    QString m_title;
    QString m_fileStem;
    QString m_emptyText;
    bool m_empty = true;
};

} // namespace slatewise::ui

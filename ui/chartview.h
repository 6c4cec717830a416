// SPDX-License-Identifier: MIT
#pragma once

#include <QString>
#include <QWidget>

class QCustomPlot;

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

    /// Subclasses clear the plot and draw their data here. `empty` reports "nothing to draw".
    virtual void rebuild(const ChartPalette& palette) = 0;
    void setEmpty(bool empty, const QString& emptyText = {});

    // Helpers shared by the subclasses; all take colours from `palette`.
    void styleAxes(const ChartPalette& palette);
    void addTitle(const ChartPalette& palette, const QString& subtitle = {});
    void showEmptyMessage(const ChartPalette& palette);

private:
    QCustomPlot* m_plot = nullptr;
    QString m_title;
    QString m_fileStem;
    QString m_emptyText;
    bool m_empty = true;
};

} // namespace slatewise::ui

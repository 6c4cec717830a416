// SPDX-License-Identifier: MIT
#include "ui/chartview.h"

#include "ui/chartpalette.h"
#include "ui/niceaxis.h"

#include <QEvent>
#include <QFontMetrics>
#include <QResizeEvent>
#include <QVBoxLayout>

#include <qcustomplot.h>

namespace slatewise::ui {

ChartView::ChartView(QWidget* parent) : QWidget(parent), m_plot(new QCustomPlot(this))
{
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_plot);
    m_plot->setAntialiasedElements(QCP::aeAll);
    m_plot->setNoAntialiasingOnDrag(true);
}

ChartView::~ChartView() = default;

QSize ChartView::sizeHint() const
{
    return {720, 460};
}

QSize ChartView::minimumSizeHint() const
{
    return {320, 220};
}

void ChartView::setTitle(const QString& title)
{
    m_title = title;
}

void ChartView::setEmpty(bool empty, const QString& emptyText)
{
    m_empty = empty;
    m_emptyText = emptyText;
}

QFont ChartView::chartFont(double scale, bool bold) const
{
    QFont f = font();
    // Point sizes, so PDF and high-DPI output keep their physical size.
    const double base = f.pointSizeF() > 0 ? f.pointSizeF() : 9.0;
    f.setPointSizeF(std::max(7.0, base) * scale);
    f.setBold(bold);
    return f;
}

void ChartView::refresh()
{
    const ChartPalette palette(this->palette());
    m_plot->clearPlottables();
    m_plot->clearItems();
    m_plot->plotLayout()->clear(); // deletes axis rects, their axes and any legend
    m_plot->plotLayout()->simplify();
    m_plot->setBackground(QBrush(palette.background()));
    m_legend = nullptr; // deleted with the layout above
    rebuild(palette);
    if (m_empty)
        showEmptyMessage(palette);
    if (m_legend) {
        // Descenders (g, p) of legend text were clipped at the item's lower edge: QCustomPlot
        // sizes the item by the text's line height but clips it to that exact box.
        for (int i = 0; i < m_legend->itemCount(); ++i)
            if (auto* item = m_legend->item(i))
                item->setMargins(QMargins(0, 1, 0, 4));
        // On a narrow chart long entries ran past the right edge: fewer columns until they fit.
        if (isVisible() && m_plot->width() >= 100) {
            while (m_legend->wrap() > 1 && m_legend->minimumOuterSizeHint().width() > m_plot->width()) {
                m_legend->setWrap(m_legend->wrap() - 1);
                m_legend->setFillOrder(m_legend->fillOrder(), true);
            }
        }
    }
    m_plot->replot(QCustomPlot::rpQueuedReplot);
}

QString ChartView::wrapToWidth(const QString& text, const QFont& font) const
{
    // Only a chart on screen knows its width; exports lay out at their own size.
    if (!isVisible() || m_plot->width() < 100)
        return text;
    const QFontMetrics metrics(font);
    const int available = m_plot->width() - 24;
    if (metrics.horizontalAdvance(text) <= available)
        return text;
    QString wrapped;
    QString line;
    for (const QString& word : text.split(QLatin1Char(' '), Qt::SkipEmptyParts)) {
        const QString candidate = line.isEmpty() ? word : line + QLatin1Char(' ') + word;
        if (!line.isEmpty() && metrics.horizontalAdvance(candidate) > available) {
            wrapped += line + QLatin1Char('\n');
            line = word;
        } else {
            line = candidate;
        }
    }
    return wrapped + line;
}

void ChartView::resizeEvent(QResizeEvent* event)
{
    QWidget::resizeEvent(event);
    // Titles are wrapped to the width, so a visible chart lays out again when it changes.
    if (isVisible() && event->oldSize().width() != event->size().width())
        refresh();
}

void ChartView::showEvent(QShowEvent* event)
{
    QWidget::showEvent(event);
    refresh(); // data may have arrived while hidden, laid out for no width
}

void ChartView::changeEvent(QEvent* event)
{
    QWidget::changeEvent(event);
    if (event->type() == QEvent::PaletteChange || event->type() == QEvent::FontChange)
        refresh();
}

int ChartView::addTitle(const ChartPalette& palette, const QString& subtitle)
{
    auto* layout = m_plot->plotLayout();
    int row = layout->rowCount();
    if (layout->elementCount() == 1 && !layout->elementAt(0))
        row = 0; // the empty grid after clear() still reports one cell
    auto* title = new QCPTextElement(m_plot, wrapToWidth(m_title, chartFont(1.3, true)), chartFont(1.3, true));
    title->setTextColor(palette.text());
    title->setMargins(QMargins(8, 8, 8, subtitle.isEmpty() ? 4 : 0));
    layout->addElement(row++, 0, title);
    if (!subtitle.isEmpty()) {
        auto* sub = new QCPTextElement(m_plot, wrapToWidth(subtitle, chartFont(0.95)), chartFont(0.95));
        sub->setTextColor(palette.axis());
        sub->setMargins(QMargins(8, 2, 8, 4));
        layout->addElement(row++, 0, sub);
    }
    return row;
}

QCPAxisRect* ChartView::addAxisRect(const ChartPalette& palette, int row, int column)
{
    auto* rect = new QCPAxisRect(m_plot);
    m_plot->plotLayout()->addElement(row, column, rect);
    rect->setBackground(QBrush(palette.background()));
    for (auto* axis : rect->axes())
        styleAxis(axis, palette, {});
    // Top and right axes only frame the plot.
    rect->axis(QCPAxis::atTop)->setVisible(false);
    rect->axis(QCPAxis::atRight)->setVisible(false);
    return rect;
}

void ChartView::styleAxis(QCPAxis* axis, const ChartPalette& palette, const QString& label)
{
    const QPen axisPen(palette.axis(), 1);
    axis->setBasePen(axisPen);
    axis->setTickPen(axisPen);
    axis->setSubTickPen(axisPen);
    axis->setTickLabelColor(palette.text());
    axis->setLabelColor(palette.text());
    axis->setTickLabelFont(chartFont(0.95));
    axis->setLabelFont(chartFont(1.0));
    axis->setLabel(label);
    axis->grid()->setPen(QPen(palette.grid(), 1, Qt::SolidLine));
    axis->grid()->setSubGridPen(QPen(palette.subGrid(), 1, Qt::DotLine));
    axis->grid()->setZeroLinePen(QPen(palette.axis(), 1));
    axis->setSubTicks(false);
}

void ChartView::setNiceRange(QCPAxis* axis, double min, double max, int ticks)
{
    const NiceAxis nice = NiceAxis::compute(min, max, ticks);
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    const int decimals = nice.decimals();
    for (const double t : nice.ticks)
        ticker->addTick(t, QLocale().toString(t, 'f', decimals));
    axis->setTicker(ticker);
    axis->setRange(nice.low, nice.high);
}

QCPLegend* ChartView::addLegendRow(const ChartPalette& palette, int row, int columns)
{
    auto* legend = new QCPLegend;
    m_plot->plotLayout()->addElement(row, 0, legend);
    legend->setLayer(QStringLiteral("legend"));
    legend->setFillOrder(QCPLayoutGrid::foColumnsFirst);
    legend->setWrap(std::max(1, columns));
    legend->setBorderPen(Qt::NoPen);
    legend->setBrush(Qt::NoBrush);
    legend->setTextColor(palette.text());
    legend->setFont(chartFont(0.95));
    legend->setIconSize(22, 12);
    legend->setMargins(QMargins(8, 4, 8, 16)); // room below the text, which was clipped at the bottom edge
    m_plot->plotLayout()->setRowStretchFactor(row, 0.001);
    m_plot->legend = legend;
    m_legend = legend;
    return legend;
}

void ChartView::showEmptyMessage(const ChartPalette& palette)
{
    auto* layout = m_plot->plotLayout();
    layout->clear();
    layout->simplify();
    m_legend = nullptr;
    m_plot->clearPlottables();
    m_plot->clearItems();
    const int row = addTitle(palette);
    auto* text = new QCPTextElement(m_plot, m_emptyText.isEmpty() ? tr("Nothing to show yet.") : m_emptyText,
                                    chartFont(1.05));
    text->setTextColor(palette.axis());
    layout->addElement(row, 0, text);
    layout->setRowStretchFactor(row, 10);
}

} // namespace slatewise::ui

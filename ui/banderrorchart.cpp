// SPDX-License-Identifier: MIT
#include "ui/banderrorchart.h"

#include "ui/bandgrouping.h"
#include "ui/chartpalette.h"
#include "ui/format.h"

#include <algorithm>
#include <cmath>

#include <qcustomplot.h>

namespace slatewise::ui {

BandErrorChart::BandErrorChart(QWidget* parent) : ChartView(parent)
{
    setTitle(tr("Error by withheld rating: RMSE and mean error per run"));
    setFileStem(QStringLiteral("error-by-rating"));
    refresh();
}

void BandErrorChart::setData(const std::vector<core::RunEvaluation>& runs)
{
    m_runs.clear();
    for (const auto& run : runs) {
        core::RunEvaluation summary;
        summary.runName = run.runName;
        summary.settings = run.settings;
        summary.accuracy = run.accuracy;
        m_runs.push_back(std::move(summary));
    }
    refresh();
}

void BandErrorChart::rebuild(const ChartPalette& palette)
{
    const BandGrouping g = BandGrouping::build(m_runs);
    if (g.runs.empty() || g.ratings.empty()) {
        setEmpty(true, m_runs.empty() ? tr("No run evaluated yet.")
                                      : tr("No run has scores, so there are no rating errors to show."));
        return;
    }
    setEmpty(false);

    QString subtitle = tr("In rating points. Mean error = score − withheld rating: above 0 the run over-predicts, "
                          "below 0 it under-predicts. n = scored withheld pairs.");
    if (!g.skippedRuns.empty()) {
        QStringList names;
        for (const auto& s : g.skippedRuns)
            names << toQ(s);
        subtitle += QLatin1Char('\n') + tr("Not shown (no scores): %1").arg(names.join(QStringLiteral(", ")));
    }
    int row = addTitle(palette, subtitle);
    QCPAxisRect* top = addAxisRect(palette, row++);
    QCPAxisRect* bottom = addAxisRect(palette, row++);
    auto* margins = new QCPMarginGroup(plot());
    top->setMarginGroup(QCP::msLeft | QCP::msRight, margins);
    bottom->setMarginGroup(QCP::msLeft | QCP::msRight, margins);

    // Shared x: one tick per band, labelled with its rating and count.
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    for (std::size_t b = 0; b < g.ratings.size(); ++b) {
        ticker->addTick(g.ratings[b], tr("%1\nn = %2")
                                          .arg(QLocale().toString(g.ratings[b], 'g', 4))
                                          .arg(QLocale().toString(static_cast<qlonglong>(g.bandCount(b)))));
    }
    const double pad = g.bandSpacing() * 0.6;
    for (QCPAxisRect* rect : {top, bottom}) {
        QCPAxis* x = rect->axis(QCPAxis::atBottom);
        x->setTicker(ticker);
        x->setRange(g.ratings.front() - pad, g.ratings.back() + pad);
        x->grid()->setVisible(false);
    }
    styleAxis(top->axis(QCPAxis::atBottom), palette, {});
    top->axis(QCPAxis::atBottom)->setTickLabels(false);
    styleAxis(bottom->axis(QCPAxis::atBottom), palette, tr("withheld rating (stars)"));
    // Short labels: each must fit beside its own, often low, plot (units are in the subtitle).
    styleAxis(top->axis(QCPAxis::atLeft), palette, tr("RMSE"));
    styleAxis(bottom->axis(QCPAxis::atLeft), palette, tr("mean error"));

    double rmseMax = 0.0, meMin = 0.0, meMax = 0.0;
    const int legendColumns = std::min<int>(4, static_cast<int>(g.runs.size()));
    QCPLegend* legend = addLegendRow(palette, row, std::max(1, legendColumns));
    for (std::size_t r = 0; r < g.runs.size(); ++r) {
        const QColor colour = palette.series(static_cast<int>(r));
        auto makeBars = [&](QCPAxisRect* rect, const std::vector<double>& values, bool inLegend) {
            auto* bars = new QCPBars(rect->axis(QCPAxis::atBottom), rect->axis(QCPAxis::atLeft));
            bars->setWidth(g.barWidth() * 0.92);
            bars->setPen(Qt::NoPen);
            bars->setBrush(colour);
            bars->setName(toQ(g.runs[r]));
            QVector<double> keys, vals;
            for (std::size_t b = 0; b < values.size(); ++b) {
                if (std::isnan(values[b]))
                    continue;
                keys << g.barCentre(r, b);
                vals << values[b];
            }
            bars->setData(keys, vals, true);
            if (!inLegend)
                bars->removeFromLegend();
            return bars;
        };
        makeBars(top, g.rmse[r], true);
        makeBars(bottom, g.meanError[r], false);
        for (std::size_t b = 0; b < g.ratings.size(); ++b) {
            if (!std::isnan(g.rmse[r][b]))
                rmseMax = std::max(rmseMax, g.rmse[r][b]);
            if (!std::isnan(g.meanError[r][b])) {
                meMin = std::min(meMin, g.meanError[r][b]);
                meMax = std::max(meMax, g.meanError[r][b]);
            }
        }
    }
    Q_UNUSED(legend);
    setNiceRange(top->axis(QCPAxis::atLeft), 0.0, rmseMax > 0 ? rmseMax * 1.05 : 1.0, 4);
    // Symmetric around zero so over- and under-prediction read at the same scale.
    const double extent = std::max({std::abs(meMin), std::abs(meMax), 0.1}) * 1.05;
    setNiceRange(bottom->axis(QCPAxis::atLeft), -extent, extent, 2); // few ticks: this plot is low
    bottom->axis(QCPAxis::atLeft)->grid()->setZeroLinePen(QPen(palette.text(), 1.2));

    // Say which side is which right on the lower plot.
    // Runs tend to over-predict low ratings (left) and under-predict high ones (right), so
    // each label goes to the corner its own bars rarely reach.
    auto label = [&](double xFraction, double yFraction, Qt::Alignment align, const QString& text) {
        auto* item = new QCPItemText(plot());
        item->setClipToAxisRect(true);
        item->setClipAxisRect(bottom);
        item->position->setAxisRect(bottom);
        item->position->setType(QCPItemPosition::ptAxisRectRatio);
        item->position->setCoords(xFraction, yFraction);
        item->setPositionAlignment(align);
        item->setText(text);
        item->setFont(chartFont(0.85));
        item->setColor(palette.axis());
    };
    // Anchored to the plot's top and bottom edges, so a low plot does not cut them off.
    label(0.99, 0.0, Qt::AlignRight | Qt::AlignTop, tr("▲ over-predicted"));
    label(0.01, 1.0, Qt::AlignLeft | Qt::AlignBottom, tr("▼ under-predicted"));

    plot()->plotLayout()->setRowStretchFactor(row - 2, 3);
    plot()->plotLayout()->setRowStretchFactor(row - 1, 2.6); // this row also holds the two-line x labels
}

} // namespace slatewise::ui

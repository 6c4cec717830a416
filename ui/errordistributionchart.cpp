// SPDX-License-Identifier: MIT
#include "ui/errordistributionchart.h"

#include "ui/chartpalette.h"
#include "ui/histogram.h"
#include "ui/niceaxis.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

#include <qcustomplot.h>

namespace slatewise::ui {

ErrorDistributionChart::ErrorDistributionChart(QWidget* parent) : ChartView(parent)
{
    setTitle(tr("Distribution of errors (score − withheld rating) per run"));
    setFileStem(QStringLiteral("error-distribution"));
    refresh();
}

void ErrorDistributionChart::setData(std::vector<RunErrors> runs)
{
    m_runs = std::move(runs);
    refresh();
}

void ErrorDistributionChart::rebuild(const ChartPalette& palette)
{
    std::vector<const RunErrors*> drawn;
    QStringList skipped;
    double lo = std::numeric_limits<double>::infinity(), hi = -lo;
    for (const auto& run : m_runs) {
        if (run.errors.empty()) {
            skipped << run.runName;
            continue;
        }
        drawn.push_back(&run);
        for (const double e : run.errors) {
            if (std::isfinite(e)) {
                lo = std::min(lo, e);
                hi = std::max(hi, e);
            }
        }
    }
    if (drawn.empty() || !std::isfinite(lo)) {
        setEmpty(true, m_runs.empty() ? tr("No run evaluated yet.")
                                      : tr("No run has scores, so there are no errors to show."));
        return;
    }
    setEmpty(false);

    // One set of bins for every run so the curves compare; edges symmetric around 0 so
    // "no error" is a bin edge and left/right of it read as under/over-prediction.
    const double extent = std::max({std::abs(lo), std::abs(hi), 0.5});
    const double width = NiceAxis::niceNumber(2.0 * extent / 32.0, false);
    const int half = static_cast<int>(std::ceil(extent / width - 1e-9));
    const double low = -half * width;
    const double high = half * width;

    QString subtitle = tr("Left of 0 the run scored below the rating (under-prediction), right of 0 above it. "
                          "Bins %1 rating points wide.")
                           .arg(QLocale().toString(width, 'g', 3));
    if (!skipped.isEmpty())
        subtitle += QLatin1Char('\n') + tr("Not shown (no scores): %1").arg(skipped.join(QStringLiteral(", ")));
    int row = addTitle(palette, subtitle);
    QCPAxisRect* rect = addAxisRect(palette, row++);
    QCPAxis* x = rect->axis(QCPAxis::atBottom);
    QCPAxis* y = rect->axis(QCPAxis::atLeft);
    styleAxis(x, palette, tr("error = score − withheld rating (rating points)"));
    styleAxis(y, palette, tr("share of the run's scored pairs (%)"));
    // Two columns: three entries with counts in one row ran past the chart's edge.
    addLegendRow(palette, row, std::min<int>(2, static_cast<int>(drawn.size())));

    double yMax = 0.0;
    for (std::size_t r = 0; r < drawn.size(); ++r) {
        const Histogram h = Histogram::build(drawn[r]->errors, low, high, 2 * half);
        QVector<double> keys, values;
        // Step outline: duplicate each bin's edges so the line is exact.
        for (std::size_t i = 0; i < h.counts.size(); ++i) {
            const double share = 100.0 * h.share(i);
            keys << h.binLow(i) << h.binLow(i + 1);
            values << share << share;
            yMax = std::max(yMax, share);
        }
        auto* graph = plot()->addGraph(x, y);
        QPen pen(palette.series(static_cast<int>(r)), 2.0);
        // Second cue besides colour for overlapping lines.
        static const Qt::PenStyle styles[] = {Qt::SolidLine, Qt::DashLine, Qt::DotLine, Qt::DashDotLine};
        pen.setStyle(styles[r % 4]);
        graph->setPen(pen);
        if (r == 0) {
            QColor fill = palette.series(0);
            fill.setAlphaF(0.15f);
            graph->setBrush(fill);
        }
        graph->setData(keys, values, true);
        const double mean =
            std::accumulate(drawn[r]->errors.begin(), drawn[r]->errors.end(), 0.0) / static_cast<double>(drawn[r]->errors.size());
        graph->setName(tr("%1: mean error %3, n = %2")
                           .arg(drawn[r]->runName)
                           .arg(QLocale().toString(static_cast<qlonglong>(drawn[r]->errors.size())))
                           .arg(QLocale().toString(mean, 'f', 2)));
    }
    setNiceRange(x, low, high, 8);
    setNiceRange(y, 0.0, yMax * 1.08, 5);
    auto* zero = new QCPItemStraightLine(plot());
    zero->setClipAxisRect(rect);
    zero->point1->setAxes(x, y);
    zero->point2->setAxes(x, y);
    zero->point1->setCoords(0, 0);
    zero->point2->setCoords(0, 1);
    zero->setPen(QPen(palette.text(), 1, Qt::DashLine));
}

} // namespace slatewise::ui

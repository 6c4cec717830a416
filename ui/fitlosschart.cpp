// SPDX-License-Identifier: MIT
#include "ui/fitlosschart.h"

#include "ui/chartpalette.h"

#include <algorithm>
#include <cmath>

#include <qcustomplot.h>

namespace slatewise::ui {

FitLossChart::FitLossChart(QWidget* parent) : ChartView(parent)
{
    setTitle(tr("Fit progress: RMSE per iteration"));
    setFileStem(QStringLiteral("fit-loss"));
    refresh();
}

void FitLossChart::setData(std::vector<Iteration> iterations, const QString& modelLabel)
{
    m_iterations = std::move(iterations);
    m_model = modelLabel;
    setTitle(modelLabel.isEmpty() ? tr("Fit progress: RMSE per iteration")
                                  : tr("Fit progress of %1: RMSE per iteration").arg(modelLabel));
    refresh();
}

void FitLossChart::appendIteration(const Iteration& it)
{
    m_iterations.push_back(it);
    refresh();
}

void FitLossChart::clear()
{
    m_iterations.clear();
    refresh();
}

void FitLossChart::rebuild(const ChartPalette& palette)
{
    if (m_iterations.empty()) {
        setEmpty(true, tr("No iteration finished yet."));
        return;
    }
    setEmpty(false);
    int row = addTitle(palette, tr("Train RMSE falling while withheld RMSE rises means the model is over-fitting."));
    QCPAxisRect* rect = addAxisRect(palette, row++);
    addLegendRow(palette, row, 2);
    QCPAxis* x = rect->axis(QCPAxis::atBottom);
    QCPAxis* y = rect->axis(QCPAxis::atLeft);
    styleAxis(x, palette, tr("iteration"));
    styleAxis(y, palette, tr("RMSE (rating points)"));
    QVector<double> it, train, held;
    double lo = INFINITY, hi = -INFINITY;
    for (const auto& i : m_iterations) {
        it << i.iteration;
        train << i.trainRmse;
        held << i.withheldRmse;
        for (const double v : {i.trainRmse, i.withheldRmse}) {
            if (std::isfinite(v)) {
                lo = std::min(lo, v);
                hi = std::max(hi, v);
            }
        }
    }
    auto add = [&](const QVector<double>& values, int colour, Qt::PenStyle style, const QString& name) {
        auto* g = plot()->addGraph(x, y);
        g->setPen(QPen(palette.series(colour), 2.0, style));
        g->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssCircle, palette.series(colour), palette.background(), 6));
        g->setName(name);
        g->setData(it, values, true);
    };
    add(train, 0, Qt::SolidLine, tr("train RMSE"));
    if (std::any_of(held.begin(), held.end(), [](double v) { return std::isfinite(v); }))
        add(held, 1, Qt::DashLine, tr("withheld RMSE"));
    // Iterations are whole numbers; half a step of room keeps the end points' markers whole.
    const int last = std::max(2, m_iterations.back().iteration);
    const int step = std::max(1, (last + 9) / 10);
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    for (int i = 1; i <= last; i += step)
        ticker->addTick(i, QString::number(i));
    x->setTicker(ticker);
    x->setRange(0.5, last + 0.5);
    if (!std::isfinite(lo))
        lo = 0, hi = 1;
    const double pad = std::max(0.02, (hi - lo) * 0.1);
    setNiceRange(y, std::max(0.0, lo - pad), hi + pad, 5);
}

} // namespace slatewise::ui

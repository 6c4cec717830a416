// SPDX-License-Identifier: MIT
#include "ui/kcurvechart.h"

#include "ui/chartpalette.h"
#include "ui/format.h"

#include <algorithm>

#include <qcustomplot.h>

namespace slatewise::ui {

KCurveChart::KCurveChart(QWidget* parent) : ChartView(parent)
{
    setTitle(tr("Precision, recall and NDCG against list length k"));
    setFileStem(QStringLiteral("k-curves"));
    refresh();
}

void KCurveChart::setData(const std::vector<core::RunEvaluation>& runs, int maxK)
{
    m_series = KCurveSeries::build(runs, maxK);
    refresh();
}

void KCurveChart::rebuild(const ChartPalette& palette)
{
    if (m_series.runs.empty()) {
        setEmpty(true, m_series.skippedRuns.empty() ? tr("No run evaluated yet.")
                                                    : tr("No run has ranked lists, so there are no curves to show."));
        return;
    }
    setEmpty(false);
    QString subtitle = tr("Each measure averaged over users with at least one relevant withheld item; "
                          "dashed line: k = %1 used in the tables.")
                           .arg(m_series.evaluatedK);
    if (!m_series.skippedRuns.empty()) {
        QStringList names;
        for (const auto& s : m_series.skippedRuns)
            names << toQ(s);
        subtitle += QLatin1Char('\n') + tr("Not shown (no lists): %1").arg(names.join(QStringLiteral(", ")));
    }
    int row = addTitle(palette, subtitle);
    auto* grid = new QCPLayoutGrid;
    plot()->plotLayout()->addElement(row, 0, grid);
    grid->setColumnSpacing(12);
    // The legend exists before the graphs so they add themselves to it.
    addLegendRow(palette, row + 1, std::min<int>(4, static_cast<int>(m_series.runs.size())));
    auto* margins = new QCPMarginGroup(plot());

    static const Qt::PenStyle styles[] = {Qt::SolidLine, Qt::DashLine, Qt::DotLine, Qt::DashDotLine};
    const QString yLabels[] = {tr("precision@k (share of k)"), tr("recall@k (share of relevant)"),
                               tr("NDCG@k (0–1)")};
    for (int m = 0; m < static_cast<int>(KCurveSeries::Measure::Count); ++m) {
        const auto measure = static_cast<KCurveSeries::Measure>(m);
        auto* rect = new QCPAxisRect(plot());
        grid->addElement(0, m, rect);
        rect->setBackground(QBrush(palette.background()));
        rect->setMarginGroup(QCP::msTop | QCP::msBottom, margins);
        rect->axis(QCPAxis::atTop)->setVisible(false);
        rect->axis(QCPAxis::atRight)->setVisible(false);
        QCPAxis* x = rect->axis(QCPAxis::atBottom);
        QCPAxis* y = rect->axis(QCPAxis::atLeft);
        styleAxis(x, palette, tr("k (list length)"));
        styleAxis(y, palette, yLabels[m]);
        for (std::size_t r = 0; r < m_series.runs.size(); ++r) {
            const auto* line = m_series.line(m_series.runs[r], measure);
            if (!line)
                continue;
            auto* graph = plot()->addGraph(x, y);
            graph->setPen(QPen(palette.series(static_cast<int>(r)), 2.0, styles[r % 4]));
            graph->setName(toQ(m_series.runs[r]));
            graph->setData(QVector<double>(line->k.begin(), line->k.end()),
                           QVector<double>(line->value.begin(), line->value.end()), true);
            if (m != 0)
                graph->removeFromLegend();
        }
        setNiceRange(x, 0, m_series.maxK, 5);
        x->setRange(1, m_series.maxK);
        const double top = m_series.maxValue(measure);
        setNiceRange(y, 0.0, top > 0 ? top * 1.05 : 1.0, 5);
        auto* kLine = new QCPItemStraightLine(plot());
        kLine->setClipAxisRect(rect);
        kLine->point1->setAxes(x, y);
        kLine->point2->setAxes(x, y);
        kLine->point1->setCoords(m_series.evaluatedK, 0);
        kLine->point2->setCoords(m_series.evaluatedK, 1);
        kLine->setPen(QPen(palette.axis(), 1, Qt::DashLine));
    }
}

} // namespace slatewise::ui

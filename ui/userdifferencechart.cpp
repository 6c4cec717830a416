// SPDX-License-Identifier: MIT
#include "ui/userdifferencechart.h"

#include "ui/chartpalette.h"
#include "ui/format.h"

#include <algorithm>
#include <cmath>

#include <qcustomplot.h>

namespace slatewise::ui {

namespace {
// Drawing more points than pixels adds nothing; quantiles keep the shape exactly.
constexpr std::size_t kMaxPoints = 2000;
} // namespace

UserDifferenceChart::UserDifferenceChart(QWidget* parent) : ChartView(parent)
{
    setFileStem(QStringLiteral("user-differences"));
    setTitle(tr("Per-user change between two runs"));
    refresh();
}

void UserDifferenceChart::setData(const std::vector<double>& differences, core::Metric metric, const QString& baseName,
                                  const QString& candidateName, double tieTolerance)
{
    m_metric = metric;
    m_base = baseName;
    m_candidate = candidateName;
    m_dist = DifferenceDistribution::build(differences, core::metricInfo(metric).better, tieTolerance);
    setTitle(tr("Per-user change in %1: %2 − %3")
                 .arg(toQ(core::metricInfo(metric).key), candidateName, baseName));
    refresh();
}

void UserDifferenceChart::rebuild(const ChartPalette& palette)
{
    if (m_dist.sorted.empty()) {
        setEmpty(true, tr("No users to compare yet: choose a base and a candidate run."));
        return;
    }
    setEmpty(false);
    const QString key = toQ(core::metricInfo(m_metric).key);
    const auto n = m_dist.count();
    QString direction = betterText(m_metric);
    int row = addTitle(palette, tr("One point per user (%1 users), sorted from the lowest to the highest difference; "
                                   "%2 (%3).")
                                    .arg(QLocale().toString(static_cast<qlonglong>(n)), key, direction));
    QCPAxisRect* rect = addAxisRect(palette, row++);
    addLegendRow(palette, row, 2);
    QCPAxis* x = rect->axis(QCPAxis::atBottom);
    QCPAxis* y = rect->axis(QCPAxis::atLeft);
    styleAxis(x, palette, tr("users, sorted by difference (%)"));
    styleAxis(y, palette, tr("%1 difference (%2 − %3)").arg(key, m_candidate, m_base));

    // Sample positions: all users, or evenly spaced quantiles for large comparisons.
    QVector<double> xs, ys;
    const std::size_t count = m_dist.sorted.size();
    const std::size_t points = std::min(count, kMaxPoints);
    for (std::size_t i = 0; i < points; ++i) {
        if (points == count) {
            xs << m_dist.percentAt(i);
            ys << m_dist.sorted[i];
        } else {
            const double q = (static_cast<double>(i) + 0.5) / static_cast<double>(points);
            xs << 100.0 * q;
            ys << m_dist.quantile(q);
        }
    }
    const bool higherBetter = m_dist.better != core::Better::Lower;
    auto pct = [&](std::int64_t c) { return QLocale().toString(100.0 * static_cast<double>(c) / n, 'f', 1); };
    // Two filled graphs, one per side of zero, coloured by better / worse off.
    auto side = [&](bool positive, const QColor& colour, const QString& name) {
        QVector<double> sx, sy;
        for (int i = 0; i < xs.size(); ++i) {
            sx << xs[i];
            sy << (positive ? std::max(0.0, ys[i]) : std::min(0.0, ys[i]));
        }
        auto* g = plot()->addGraph(x, y);
        g->setPen(QPen(colour, 1.5));
        QColor fill = colour;
        fill.setAlphaF(0.45f);
        g->setBrush(fill);
        g->setName(name);
        g->setData(sx, sy, true);
    };
    const QString betterName = tr("better off under %1: %2 users (%3 %)")
                                   .arg(m_candidate, QLocale().toString(static_cast<qlonglong>(m_dist.improved)),
                                        pct(m_dist.improved));
    const QString worseName = tr("worse off under %1: %2 users (%3 %)")
                                  .arg(m_candidate, QLocale().toString(static_cast<qlonglong>(m_dist.worsened)),
                                       pct(m_dist.worsened));
    if (m_dist.better == core::Better::Neither) {
        side(true, palette.series(0), tr("difference above 0"));
        side(false, palette.series(1), tr("difference below 0"));
    } else {
        side(higherBetter, palette.better(), betterName);
        side(!higherBetter, palette.worse(), worseName);
    }
    // Ties and the mean as legend lines.
    auto* tie = plot()->addGraph(x, y);
    tie->setPen(QPen(palette.axis(), 1));
    tie->setName(tr("tied (|difference| ≤ tolerance): %1 users (%2 %)")
                     .arg(QLocale().toString(static_cast<qlonglong>(m_dist.tied)), pct(m_dist.tied)));
    auto* mean = plot()->addGraph(x, y);
    mean->setPen(QPen(palette.text(), 1.5, Qt::DashLine));
    mean->setName(tr("mean difference %1").arg(QLocale().toString(m_dist.mean, 'f', 4)));
    mean->setData(QVector<double>{0.0, 100.0}, QVector<double>{m_dist.mean, m_dist.mean});

    x->setRange(0, 100);
    setNiceRange(x, 0, 100, 5);
    const double lo = std::min(0.0, m_dist.sorted.front());
    const double hi = std::max(0.0, m_dist.sorted.back());
    setNiceRange(y, lo, hi, 6);
    y->grid()->setZeroLinePen(QPen(palette.text(), 1.2));
}

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/scoreratingchart.h"

#include "core/dataset.h"
#include "core/run.h"

#include "ui/chartpalette.h"
#include "ui/format.h"

#include <algorithm>
#include <cmath>
#include <map>

#include <QLocale>

#include <qcustomplot.h>

namespace slatewise::ui {

ScoreRatingChart::ScoreRatingChart(QWidget* parent) : ChartView(parent)
{
    setTitle(tr("Score against withheld rating"));
    setFileStem(QStringLiteral("score-vs-rating"));
    refresh();
}

std::vector<ScoreRatingChart::Point> ScoreRatingChart::pointsFor(const core::Dataset& data, const core::RunData& run,
                                                                 core::UserIndex user)
{
    std::vector<Point> points;
    if (!run.hasScores || user.value >= data.userCount())
        return points;
    const auto begin = data.withheld.offsets[user.value];
    const auto end = data.withheld.offsets[user.value + 1];
    for (auto r = begin; r < end && r < run.scores.size(); ++r) {
        const float score = run.scores[r];
        if (std::isnan(score))
            continue;
        const auto& row = data.withheld.rows[r];
        points.push_back({row.rating, score, toQ(data.items[row.item.value].title)});
    }
    return points;
}

void ScoreRatingChart::setData(std::vector<Point> points, const QString& userLabel, const QString& runName,
                               double scaleMin, double scaleMax)
{
    m_points = std::move(points);
    m_user = userLabel;
    m_run = runName;
    m_min = scaleMin;
    m_max = scaleMax;
    setTitle(tr("Score against withheld rating: user %1 under %2").arg(userLabel, runName));
    refresh();
}

void ScoreRatingChart::setData(const core::Dataset& data, const core::RunData& run, core::UserIndex user)
{
    const QString label = user.value < data.userCount() ? toQ(data.userIds[user.value]) : QString();
    setData(pointsFor(data, run, user), label, toQ(run.info.name), data.scale.min, data.scale.max);
}

void ScoreRatingChart::rebuild(const ChartPalette& palette)
{
    if (m_points.empty()) {
        setEmpty(true, m_user.isEmpty() ? tr("Choose a user to see their scores.")
                                        : tr("The run gave no score for any of this user's withheld items."));
        return;
    }
    setEmpty(false);
    int row = addTitle(palette, tr("One point per withheld item (%1). Above the diagonal the run over-predicted, "
                                   "below it under-predicted.")
                                    .arg(m_points.size()));
    QCPAxisRect* rect = addAxisRect(palette, row++);
    addLegendRow(palette, row, 2);
    QCPAxis* x = rect->axis(QCPAxis::atBottom);
    QCPAxis* y = rect->axis(QCPAxis::atLeft);
    styleAxis(x, palette, tr("withheld rating (stars)"));
    styleAxis(y, palette, tr("run's score (rating points)"));

    // Items sharing a rating are spread sideways a little so each stays visible.
    std::map<double, int> seen, total;
    for (const auto& p : m_points)
        ++total[p.rating];
    QVector<double> xs, ys;
    double lo = m_min, hi = m_max;
    for (const auto& p : m_points) {
        const int i = seen[p.rating]++;
        const int n = total[p.rating];
        const double spread = n > 1 ? 0.3 * (static_cast<double>(i) / (n - 1) - 0.5) : 0.0;
        xs << p.rating + spread;
        ys << p.score;
        lo = std::min({lo, p.rating, p.score});
        hi = std::max({hi, p.rating, p.score});
    }
    auto* diagonal = plot()->addGraph(x, y);
    diagonal->setPen(QPen(palette.axis(), 1.2, Qt::DashLine));
    diagonal->setName(tr("score = rating (perfect prediction)"));
    diagonal->setData(QVector<double>{lo - 1, hi + 1}, QVector<double>{lo - 1, hi + 1});

    auto* dots = plot()->addGraph(x, y);
    dots->setLineStyle(QCPGraph::lsNone);
    dots->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssDisc, palette.series(0), palette.series(0), 8));
    dots->setName(tr("withheld item"));
    dots->setData(xs, ys, false);

    // Name the three items the run missed most.
    std::vector<std::size_t> order(m_points.size());
    for (std::size_t i = 0; i < order.size(); ++i)
        order[i] = i;
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return std::abs(m_points[a].score - m_points[a].rating) > std::abs(m_points[b].score - m_points[b].rating);
    });
    std::vector<std::size_t> named;
    for (std::size_t k = 0; k < std::min<std::size_t>(3, order.size()); ++k) {
        const auto i = order[k];
        if (std::abs(m_points[i].score - m_points[i].rating) < 0.5)
            break;
        // Two names on nearly the same spot would print over each other.
        const bool crowded = std::any_of(named.begin(), named.end(), [&](std::size_t j) {
            return std::abs(m_points[j].rating - m_points[i].rating) < 0.6 && std::abs(m_points[j].score - m_points[i].score) < 0.4;
        });
        if (crowded)
            continue;
        named.push_back(i);
        auto* text = new QCPItemText(plot());
        text->setClipAxisRect(rect);
        text->position->setAxes(x, y);
        text->position->setCoords(xs[static_cast<int>(i)], ys[static_cast<int>(i)]);
        const bool over = m_points[i].score > m_points[i].rating;
        // Near the right edge the name goes to the left of its point, so it is not cut off.
        const bool rightHalf = m_points[i].rating > (m_min + m_max) / 2.0;
        text->setPositionAlignment((rightHalf ? Qt::AlignRight : Qt::AlignLeft) | (over ? Qt::AlignBottom : Qt::AlignTop));
        text->setPadding(QMargins(2, 6, 2, 6));
        QString title = m_points[i].title;
        if (title.size() > 28)
            title = title.left(27) + QChar(0x2026);
        text->setText(title);
        text->setFont(chartFont(0.8));
        text->setColor(palette.text());
    }
    // The axes follow the workspace's rating scale with a small margin (a 1–5 scale reads
    // 0.75–5.25, not 0–6); the score axis widens only for scores outside the scale.
    const bool scaleKnown = std::isfinite(m_min) && std::isfinite(m_max) && m_max > m_min;
    const double scaleLo = scaleKnown ? m_min : std::floor(lo);
    const double scaleHi = scaleKnown ? m_max : std::ceil(hi);
    const double margin = std::max(0.25, 0.06 * (scaleHi - scaleLo));
    double scoreLo = scaleLo, scoreHi = scaleHi;
    for (const auto& p : m_points) {
        scoreLo = std::min(scoreLo, p.score);
        scoreHi = std::max(scoreHi, p.score);
    }
    setScaleRange(x, scaleLo - margin, scaleHi + margin, scaleLo);
    setScaleRange(y, scoreLo - margin, scoreHi + margin, scaleLo);
}

void ScoreRatingChart::setScaleRange(QCPAxis* axis, double low, double high, double origin)
{
    // Ticks on the scale's whole steps (1, 2, … 5) while they stay few; else nice ticks.
    const double step = std::max(1.0, std::ceil((high - low) / 10.0));
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    const double first = origin + std::ceil((low - origin) / step) * step;
    const int decimals = std::abs(origin - std::round(origin)) > 1e-9 ? 1 : 0;
    for (double t = first; t <= high + 1e-9; t += step)
        ticker->addTick(t, QLocale().toString(t, 'f', decimals));
    axis->setTicker(ticker);
    axis->setRange(low, high);
}

} // namespace slatewise::ui

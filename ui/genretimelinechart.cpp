// SPDX-License-Identifier: MIT
#include "ui/genretimelinechart.h"

#include "core/dataset.h"

#include "ui/chartpalette.h"
#include "ui/format.h"

#include <QDateTime>

#include <algorithm>

#include <qcustomplot.h>

namespace slatewise::ui {

GenreTimelineChart::GenreTimelineChart(QWidget* parent) : ChartView(parent)
{
    setTitle(tr("Viewing history by genre"));
    setFileStem(QStringLiteral("genre-timeline"));
    refresh();
}

void GenreTimelineChart::setData(const GenreTimeline& timeline, const QString& userLabel)
{
    m_timeline = timeline;
    m_user = userLabel;
    setTitle(tr("Train history of user %1 by genre, oldest to newest").arg(userLabel));
    refresh();
}

void GenreTimelineChart::setData(const core::Dataset& data, core::UserIndex user, int recentWindow)
{
    const QString label = user.value < data.userCount() ? toQ(data.userIds[user.value]) : QString();
    setData(GenreTimeline::build(data, user, recentWindow), label);
}

void GenreTimelineChart::rebuild(const ChartPalette& palette)
{
    const auto& t = m_timeline;
    if (t.buckets.empty()) {
        setEmpty(true, m_user.isEmpty() ? tr("Choose a user to see their history.")
                                        : tr("This user has no train history."));
        return;
    }
    setEmpty(false);
    const auto& recent = t.buckets.back();
    QString subtitle;
    if (t.recentGenre >= 0) {
        const QString genre = toQ(t.genres[static_cast<std::size_t>(t.recentGenre)]);
        const QString recentPct = QLocale().toString(100.0 * t.recentShare, 'f', 0);
        const QString priorPct = QLocale().toString(100.0 * t.priorShare, 'f', 0);
        if (t.buckets.size() == 1)
            subtitle = tr("Only %1 titles in the history: too few to tell a recent binge from a taste.").arg(t.interactions);
        else if (t.recentShare >= 0.6 && t.priorShare <= 0.2)
            subtitle = tr("Recent binge: %1 % of the last %2 titles are %3, against %4 % before.")
                           .arg(recentPct)
                           .arg(recent.count)
                           .arg(genre, priorPct);
        else
            subtitle = tr("No recent binge: the last %1 titles are at most %2 % %3 (%4 % before).")
                           .arg(recent.count)
                           .arg(recentPct, genre, priorPct);
    }
    int row = addTitle(palette, subtitle);
    QCPAxisRect* rect = addAxisRect(palette, row++);
    addLegendRow(palette, row, std::min<int>(4, static_cast<int>(t.genres.size())));
    QCPAxis* x = rect->axis(QCPAxis::atBottom);
    QCPAxis* y = rect->axis(QCPAxis::atLeft);
    styleAxis(x, palette, t.hasTimestamps ? tr("titles watched, oldest → newest")
                                          : tr("titles watched, in file order (no dates)"));
    styleAxis(y, palette, tr("share of the bar's titles (%)"));

    // Older buckets at 0..n-2; the recent window after a gap so it reads as separate.
    const auto n = t.buckets.size();
    QVector<double> keys;
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    for (std::size_t b = 0; b < n; ++b) {
        const auto& bucket = t.buckets[b];
        const double key = static_cast<double>(b) + (bucket.recent && n > 1 ? 0.5 : 0.0);
        keys << key;
        QString label = bucket.recent ? tr("last %1").arg(bucket.count)
                                      : tr("%1–%2").arg(bucket.firstIndex + 1).arg(bucket.firstIndex + bucket.count);
        if (t.hasTimestamps && bucket.firstTime != core::kNoTimestamp) {
            // Only the month a bar starts in: start and end ran into the neighbours' labels,
            // and the next bar's label says where this one ends.
            const auto from = QDateTime::fromSecsSinceEpoch(bucket.firstTime, Qt::UTC).date();
            label += QLatin1Char('\n') + from.toString(QStringLiteral("MMM yy"));
        }
        ticker->addTick(key, label);
    }
    x->setTicker(ticker);
    x->setTickLabelFont(chartFont(0.85));
    x->grid()->setVisible(false);
    x->setRange(-0.6, keys.back() + 0.6);
    setNiceRange(y, 0, 100, 5);

    // Shade behind the recent window.
    auto* shade = new QCPItemRect(plot());
    shade->setClipAxisRect(rect);
    shade->topLeft->setAxes(x, y);
    shade->bottomRight->setAxes(x, y);
    shade->topLeft->setCoords(keys.back() - 0.5, 100);
    shade->bottomRight->setCoords(keys.back() + 0.5, 0);
    shade->setPen(Qt::NoPen);
    shade->setBrush(palette.highlight());
    shade->setLayer(QStringLiteral("background"));

    QCPBars* below = nullptr;
    const bool hasOther = !t.genres.empty() && t.genres.back() == "other genres";
    for (std::size_t g = 0; g < t.genres.size(); ++g) {
        auto* bars = new QCPBars(x, y);
        bars->setWidth(0.78);
        const bool other = hasOther && g + 1 == t.genres.size();
        QColor colour = other ? palette.neutral() : palette.series(static_cast<int>(g));
        bars->setBrush(colour);
        bars->setPen(QPen(palette.background(), 1));
        bars->setName(other ? tr("other genres") : toQ(t.genres[g]));
        QVector<double> values;
        for (const auto& bucket : t.buckets)
            values << 100.0 * bucket.share(g);
        bars->setData(keys, values, true);
        if (below)
            bars->moveAbove(below);
        below = bars;
    }
}

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/format.h"

#include "core/evaluation.h"

#include <QCoreApplication>

#include <cmath>

namespace slatewise::ui {

QString formatNumber(double value, int decimals)
{
    if (std::isnan(value))
        return QStringLiteral("–");
    return QString::number(value, 'f', decimals);
}

QString formatMetric(core::Metric m, double value)
{
    if (std::isnan(value))
        return QStringLiteral("–");
    if (m == core::Metric::OrderViolations || m == core::Metric::SeenInList || m == core::Metric::BurstEcho)
        return QString::number(value, 'f', 0);
    if (m == core::Metric::PopularityLift || m == core::Metric::Novelty)
        return QString::number(value, 'f', 2);
    return QString::number(value, 'f', 3);
}

QString formatInterval(const core::Interval& interval, int decimals)
{
    if (std::isnan(interval.low) || std::isnan(interval.high))
        return {};
    return QStringLiteral("[%1, %2]").arg(interval.low, 0, 'f', decimals).arg(interval.high, 0, 'f', decimals);
}

QString betterText(core::Metric m)
{
    switch (core::metricInfo(m).better) {
    case core::Better::Higher:
        return QCoreApplication::translate("Metric", "higher is better");
    case core::Better::Lower:
        return QCoreApplication::translate("Metric", "lower is better");
    case core::Better::Neither:
        break;
    }
    return QCoreApplication::translate("Metric", "neither direction is better");
}

QString metricTooltip(core::Metric m)
{
    const auto& info = core::metricInfo(m);
    return QStringLiteral("<b>%1</b> (%2)<br>%3").arg(toQ(info.label), betterText(m), toQ(info.summary).toHtmlEscaped());
}

QString aggregateTooltip(std::string_view key)
{
    if (auto m = core::metricFromKey(key))
        return metricTooltip(*m);
    struct Entry {
        std::string_view key;
        const char* text;
    };
    static constexpr Entry kEntries[] = {
        {"hit_rate", QT_TRANSLATE_NOOP("Metric", "<b>Hit rate</b> (higher is better)<br>Share of users with at least one relevant withheld item in their top k.")},
        {"coverage", QT_TRANSLATE_NOOP("Metric", "<b>Coverage</b> (higher is better)<br>Distinct items in all top-k lists / items in the catalog.")},
        {"gini", QT_TRANSLATE_NOOP("Metric", "<b>Gini</b> (lower is better)<br>Inequality of exposure over all catalog items: sum((2i - n - 1) x_i) / (n sum x), x ascending.")},
        {"user_rmse_mean", QT_TRANSLATE_NOOP("Metric", "<b>Mean user RMSE</b> (lower is better)<br>Mean of the per-user RMSE over users with at least one scored pair.")},
        {"scored_fraction", QT_TRANSLATE_NOOP("Metric", "<b>Scored</b><br>Scored withheld pairs / all withheld pairs.")},
        {"users", QT_TRANSLATE_NOOP("Metric", "<b>Users</b><br>Users with at least one withheld item.")},
        {"warnings", QT_TRANSLATE_NOOP("Metric", "<b>Users with a warning</b> (lower is better)<br>Share of evaluated users carrying at least one warning.")},
    };
    for (const auto& e : kEntries)
        if (e.key == key)
            return QCoreApplication::translate("Metric", e.text);
    return {};
}

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#pragma once

#include "core/metric.h"

#include <QString>

#include <string_view>

namespace slatewise::core {
struct Interval;
}

namespace slatewise::ui {

/// UTF-8 from core to a QString (core strings are UTF-8 by contract).
inline QString toQ(std::string_view s)
{
    return QString::fromUtf8(s.data(), static_cast<qsizetype>(s.size()));
}

/// A metric value for a table cell: three decimals, counts without decimals, "–" when undefined.
QString formatMetric(core::Metric m, double value);
/// A plain number with `decimals`, "–" for NaN.
QString formatNumber(double value, int decimals = 3);
/// "[0.812, 0.845]", or empty when the interval is undefined.
QString formatInterval(const core::Interval& interval, int decimals = 3);
/// The tooltip every metric column and label shares: name, direction and formula sentence.
QString metricTooltip(core::Metric m);
/// "higher is better" / "lower is better" / "neither direction is better".
QString betterText(core::Metric m);
/// The same for run-level aggregates that are not per-user metrics (coverage, gini, hit rate, ...).
QString aggregateTooltip(std::string_view key);

} // namespace slatewise::ui

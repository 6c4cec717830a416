// SPDX-License-Identifier: MIT
#include "ui/tablemodelbase.h"

#include "ui/format.h"

namespace slatewise::ui {

QVariant TableModelBase::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || section < 0 || section >= columnCount())
        return QAbstractTableModel::headerData(section, orientation, role);
    switch (role) {
    case Qt::DisplayRole:
        return columnSpec(section).title;
    case Qt::ToolTipRole: {
        const QString tip = columnSpec(section).tooltip;
        return tip.isEmpty() ? QVariant() : QVariant(tip);
    }
    case Qt::TextAlignmentRole:
        return alignment(section);
    default:
        return {};
    }
}

TableModelBase::ColumnSpec TableModelBase::metricColumn(core::Metric m)
{
    return {toQ(core::metricInfo(m).label), metricTooltip(m), true};
}

TableModelBase::ColumnSpec TableModelBase::textColumn(const QString& title, const QString& tooltip)
{
    return {title, tooltip, false};
}

TableModelBase::ColumnSpec TableModelBase::numberColumn(const QString& title, const QString& tooltip)
{
    return {title, tooltip, true};
}

QVariant TableModelBase::alignment(int column) const
{
    const Qt::Alignment a = columnSpec(column).numeric ? (Qt::AlignRight | Qt::AlignVCenter) : (Qt::AlignLeft | Qt::AlignVCenter);
    return QVariant::fromValue(static_cast<int>(a));
}

} // namespace slatewise::ui

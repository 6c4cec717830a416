// SPDX-License-Identifier: MIT
#pragma once

#include "core/metric.h"

#include <QAbstractTableModel>
#include <QString>

namespace slatewise::ui {

/// Shared base of every table model: header text and header tooltips come from one
/// columnSpec() per model, and metric columns take their tooltip (name, direction, formula)
/// from core/metric.h, so every table explains a metric the same way.
class TableModelBase : public QAbstractTableModel {
    Q_OBJECT
public:
    using QAbstractTableModel::QAbstractTableModel;

    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

    struct ColumnSpec {
        QString title;
        QString tooltip;
        bool numeric = true; ///< right-aligned
    };
    /// Title and tooltip of a column (also used by CSV export and tests).
    virtual ColumnSpec columnSpec(int column) const = 0;

protected:
    static ColumnSpec metricColumn(core::Metric m);
    static ColumnSpec textColumn(const QString& title, const QString& tooltip);
    static ColumnSpec numberColumn(const QString& title, const QString& tooltip);
    /// Qt::TextAlignmentRole value for a column.
    QVariant alignment(int column) const;
};

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/inspectorlistmodel.h"

#include "core/dataset.h"
#include "ui/format.h"
#include "ui/itemtext.h"
#include "ui/userinspection.h"

#include <QFont>

#include <cmath>

namespace slatewise::ui {

InspectorListModel::InspectorListModel(QObject* parent) : TableModelBase(parent) {}
InspectorListModel::~InspectorListModel() = default;

void InspectorListModel::setResults(std::shared_ptr<const UserInspection> inspection, std::shared_ptr<const core::Dataset> data)
{
    beginResetModel();
    m_inspection = std::move(inspection);
    m_data = std::move(data);
    endResetModel();
}

int InspectorListModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_inspection || !m_data ? 0 : static_cast<int>(m_inspection->list.size());
}

int InspectorListModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QString InspectorListModel::marks(int row) const
{
    const auto& r = m_inspection->list[static_cast<std::size_t>(row)];
    QStringList parts;
    if (r.hit)
        parts << tr("✔ hit (rated %1)").arg(r.withheldRating);
    else if (!std::isnan(r.withheldRating))
        parts << tr("withheld, rated %1 (below the threshold)").arg(r.withheldRating);
    if (r.seen)
        parts << tr("already seen");
    if (r.outOfOrder) {
        QStringList missing;
        for (auto p : r.missingParts)
            missing << QString::number(p);
        parts << (missing.size() > 1 ? tr("⚠ sequel first: parts %1 unseen") : tr("⚠ sequel first: part %1 unseen"))
                     .arg(missing.join(QStringLiteral(", ")));
    }
    return parts.join(QStringLiteral("; "));
}

QVariant InspectorListModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const auto& r = m_inspection->list[static_cast<std::size_t>(index.row())];
    switch (role) {
    case Qt::DisplayRole:
        switch (index.column()) {
        case Rank:
            return r.rank;
        case Title:
            return ItemText::title(*m_data, r.item);
        case Year:
            return ItemText::year(*m_data, r.item);
        case Genres:
            return ItemText::genres(*m_data, r.item);
        case Series:
            return ItemText::series(*m_data, r.item);
        case Score:
            return formatNumber(r.score, 2);
        case Marks:
            return marks(index.row());
        default:
            return {};
        }
    case Qt::FontRole:
        if (r.hit || r.outOfOrder || r.seen) {
            QFont f;
            f.setBold(true);
            return f;
        }
        return {};
    case Qt::TextAlignmentRole:
        return alignment(index.column());
    case Qt::ToolTipRole:
        if (index.column() == Marks || index.column() == Title) {
            const QString m = marks(index.row());
            return m.isEmpty() ? QVariant() : QVariant(m);
        }
        return {};
    case HitRole:
        return r.hit;
    case SeenRole:
        return r.seen;
    case OutOfOrderRole:
        return r.outOfOrder;
    case ItemIndexRole:
        return QVariant::fromValue<quint32>(r.item.value);
    default:
        return {};
    }
}

TableModelBase::ColumnSpec InspectorListModel::columnSpec(int column) const
{
    switch (column) {
    case Rank:
        return numberColumn(tr("Rank"), tr("Position in the run's list (1 = top)."));
    case Title:
        return textColumn(tr("Title"), {});
    case Year:
        return numberColumn(tr("Year"), {});
    case Genres:
        return textColumn(tr("Genres"), {});
    case Series:
        return textColumn(tr("Series"), tr("Series and part number, when the title belongs to one."));
    case Score:
        return numberColumn(tr("Score"), tr("The score the run gave the title (as given with the list)."));
    case Marks:
        return textColumn(tr("Notes"),
                          tr("Hit: a withheld favourite. Already seen: in the user's history. Sequel first: earlier parts "
                             "are neither seen nor ranked above."));
    default:
        return {};
    }
}

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#include "ui/withheldmodel.h"

#include "core/dataset.h"
#include "ui/format.h"
#include "ui/itemtext.h"
#include "ui/userinspection.h"

#include <QFont>

namespace slatewise::ui {

WithheldModel::WithheldModel(QObject* parent) : TableModelBase(parent) {}
WithheldModel::~WithheldModel() = default;

void WithheldModel::setResults(std::shared_ptr<const UserInspection> inspection, std::shared_ptr<const core::Dataset> data)
{
    beginResetModel();
    m_inspection = std::move(inspection);
    m_data = std::move(data);
    endResetModel();
}

int WithheldModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_inspection || !m_data ? 0 : static_cast<int>(m_inspection->withheld.size());
}

int WithheldModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QString WithheldModel::rankText(int row) const
{
    const auto& r = m_inspection->withheld[static_cast<std::size_t>(row)];
    if (r.rank == 0)
        return tr("not listed");
    if (!r.inTopK)
        return tr("%1 (below top %2)").arg(r.rank).arg(m_inspection->k);
    return QString::number(r.rank);
}

QString WithheldModel::marks(int row) const
{
    const auto& r = m_inspection->withheld[static_cast<std::size_t>(row)];
    QStringList parts;
    if (r.relevant && r.inTopK)
        parts << tr("✔ hit");
    else if (r.relevant)
        parts << tr("✘ favourite missing from the top %1").arg(m_inspection->k);
    if (r.outOfOrder)
        parts << tr("⚠ listed before earlier parts");
    return parts.join(QStringLiteral("; "));
}

QVariant WithheldModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const auto& r = m_inspection->withheld[static_cast<std::size_t>(index.row())];
    switch (role) {
    case Qt::DisplayRole:
        switch (index.column()) {
        case Rating:
            return QString::number(r.rating);
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
        case ListRank:
            return rankText(index.row());
        case Marks:
            return marks(index.row());
        default:
            return {};
        }
    case Qt::FontRole:
        if (r.relevant) {
            QFont f;
            f.setBold(r.inTopK);
            f.setItalic(!r.inTopK);
            return f;
        }
        return {};
    case Qt::TextAlignmentRole:
        return alignment(index.column());
    case RelevantRole:
        return r.relevant;
    case InTopKRole:
        return r.inTopK;
    case RankRole:
        return r.rank;
    case ItemIndexRole:
        return QVariant::fromValue<quint32>(r.item.value);
    default:
        return {};
    }
}

TableModelBase::ColumnSpec WithheldModel::columnSpec(int column) const
{
    switch (column) {
    case Rating:
        return numberColumn(tr("Rating"), tr("The user's own rating of the withheld title."));
    case Title:
        return textColumn(tr("Title"), {});
    case Year:
        return numberColumn(tr("Year"), {});
    case Genres:
        return textColumn(tr("Genres"), {});
    case Series:
        return textColumn(tr("Series"), tr("Series and part number, when the title belongs to one."));
    case Score:
        return numberColumn(tr("Score"), tr("The run's predicted score for this title (– when the run gave none)."));
    case ListRank:
        return numberColumn(tr("Rank in list"), tr("Where the run's list places the title; not listed when absent."));
    case Marks:
        return textColumn(tr("Notes"), tr("Hit: a favourite inside the top k. Missing: a favourite the top k left out."));
    default:
        return {};
    }
}

} // namespace slatewise::ui

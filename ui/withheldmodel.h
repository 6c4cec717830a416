// SPDX-License-Identifier: MIT
#pragma once

#include "ui/tablemodelbase.h"

#include <memory>

namespace slatewise::core {
struct Dataset;
}

namespace slatewise::ui {

struct UserInspection;

/// The inspected user's withheld items, highest rating first, each with the score the run
/// gave it and its rank in the run's list (or that it is missing from the top k).
class WithheldModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column { Rating, Title, Year, Genres, Series, Score, ListRank, Marks, ColumnCount };
    enum Role {
        RelevantRole = Qt::UserRole, ///< bool
        InTopKRole,                  ///< bool
        RankRole,                    ///< int, 0 when not listed
        ItemIndexRole,               ///< quint32
    };

    explicit WithheldModel(QObject* parent = nullptr);
    ~WithheldModel() override;

    void setResults(std::shared_ptr<const UserInspection> inspection, std::shared_ptr<const core::Dataset> data);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

    QString rankText(int row) const;
    QString marks(int row) const;

private:
    std::shared_ptr<const UserInspection> m_inspection;
    std::shared_ptr<const core::Dataset> m_data;
};

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#pragma once

#include "ui/tablemodelbase.h"

#include <memory>

namespace slatewise::core {
struct Dataset;
}

namespace slatewise::ui {

struct UserInspection;

/// The inspected user's top-k list under one run: rank, title, year, genres, series part,
/// the run's score and what is notable about the item (hit, already seen, sequel first).
class InspectorListModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column { Rank, Title, Year, Genres, Series, Score, Marks, ColumnCount };
    enum Role {
        HitRole = Qt::UserRole, ///< bool
        SeenRole,               ///< bool
        OutOfOrderRole,         ///< bool
        ItemIndexRole,          ///< quint32
    };

    explicit InspectorListModel(QObject* parent = nullptr);
    ~InspectorListModel() override;

    void setResults(std::shared_ptr<const UserInspection> inspection, std::shared_ptr<const core::Dataset> data);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

    /// "hit (rated 5)", "already seen", "part 3 before parts 1, 2" joined with "; ".
    QString marks(int row) const;

private:
    std::shared_ptr<const UserInspection> m_inspection;
    std::shared_ptr<const core::Dataset> m_data;
};

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#pragma once

#include "ui/tablemodelbase.h"

#include <memory>

namespace slatewise::core {
struct RunComparison;
}

namespace slatewise::ui {

/// Who got worse: the users with the largest loss from base to candidate on the primary
/// metric, with the warnings each run raised for them. Double-clicking opens the inspector.
class WorseUsersModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column { User, Base, Candidate, Loss, BaseWarnings, CandidateWarnings, ColumnCount };
    enum Role {
        UserIndexRole = Qt::UserRole, ///< quint32 core::UserIndex
        ValueRole,                    ///< double behind numeric cells
    };

    explicit WorseUsersModel(QObject* parent = nullptr);
    ~WorseUsersModel() override;

    void setResults(std::shared_ptr<const core::RunComparison> comparison);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

private:
    std::shared_ptr<const core::RunComparison> m_comparison;
};

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#pragma once

#include "ui/tablemodelbase.h"

#include <memory>

namespace slatewise::ui {

struct UserInspection;

/// The inspected user's per-user metrics beside the run's average over all users.
class UserMetricsModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column { Metric, User, RunMean, Comparison, ColumnCount };
    enum Role {
        MetricRole = Qt::UserRole, ///< int core::Metric
        ValueRole,                 ///< double (user or mean)
    };

    explicit UserMetricsModel(QObject* parent = nullptr);
    ~UserMetricsModel() override;

    void setResults(std::shared_ptr<const UserInspection> inspection);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

private:
    std::shared_ptr<const UserInspection> m_inspection;
};

} // namespace slatewise::ui

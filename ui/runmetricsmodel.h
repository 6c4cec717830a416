// SPDX-License-Identifier: MIT
#pragma once

#include "ui/tablemodelbase.h"

#include <memory>
#include <vector>

namespace slatewise::core {
struct RunEvaluation;
}

namespace slatewise::ui {

/// The overview's metrics table: one row per run, one column per run-level aggregate,
/// each cell the value with its 95% bootstrap interval when the evaluation has one.
class RunMetricsModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column {
        Run,
        Users,
        Rmse,
        Mae,
        MeanError,
        Precision,
        Recall,
        Ndcg,
        Map,
        Mrr,
        HitRate,
        HeldoutTopk,
        Ild,
        Novelty,
        Coverage,
        Gini,
        WarnedUsers,
        ColumnCount
    };
    enum Role {
        ValueRole = Qt::UserRole, ///< double aggregate (NaN when the run cannot have it)
        LowRole,                  ///< double interval low (NaN when none)
        HighRole,                 ///< double interval high
        RunNameRole,              ///< QString
    };

    explicit RunMetricsModel(QObject* parent = nullptr);
    ~RunMetricsModel() override;

    void setResults(std::vector<std::shared_ptr<const core::RunEvaluation>> evaluations);
    const core::RunEvaluation* evaluationAt(int row) const;

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

    /// Key of the aggregate in RunEvaluation::ci and the JSON ("rmse", "ndcg", ...).
    static const char* keyOf(int column);
    double value(int row, int column) const;

private:
    std::vector<std::shared_ptr<const core::RunEvaluation>> m_evals;
};

} // namespace slatewise::ui

// SPDX-License-Identifier: MIT
#pragma once

#include "ui/tablemodelbase.h"

#include <memory>

namespace slatewise::core {
struct RunComparison;
}

namespace slatewise::ui {

/// The paired comparison table: one row per metric with the mean difference (candidate −
/// base), its interval, both p-values, the Holm-adjusted p, wins/ties/losses, effect size
/// and the verdict in words.
class ComparisonModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column {
        Metric,
        Judgement,
        Users,
        MeanBase,
        MeanCandidate,
        MeanDiff,
        Interval,
        PT,
        PWilcoxon,
        PHolm,
        Wins,
        Ties,
        Losses,
        Effect,
        Verdict,
        ColumnCount
    };
    enum Role {
        ValueRole = Qt::UserRole, ///< double behind numeric cells
        SignificantRole, ///< bool
        MetricRole, ///< int core::Metric
    };

    explicit ComparisonModel(QObject* parent = nullptr);
    ~ComparisonModel() override;

    void setResults(std::shared_ptr<const core::RunComparison> comparison);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

private:
    std::shared_ptr<const core::RunComparison> m_comparison;
};

} // namespace slatewise::ui

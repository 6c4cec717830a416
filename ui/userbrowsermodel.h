// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"
#include "core/metric.h"
#include "ui/tablemodelbase.h"

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace slatewise::core {
struct RunEvaluation;
}

namespace slatewise::ui {

/// Every evaluated user of one run, one row each, read straight from the stored per-user
/// results (core::UserResultTable is column-wise, so data() is an array read). Sorting and
/// filtering live in UserBrowserProxy; nothing here allocates per row except the warning masks.
class UserBrowserModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column {
        UserId,
        Warnings,
        Train,
        Withheld,
        Relevant,
        FirstMetric,
        ColumnCount = FirstMetric + static_cast<int>(core::kMetricCount)
    };
    enum Role {
        SortValueRole = Qt::UserRole, ///< double, NaN when undefined
        UserIndexRole,                ///< quint32 core::UserIndex
        WarningMaskRole,              ///< quint32, bit i set when the user carries WarningCode i
    };

    explicit UserBrowserModel(QObject* parent = nullptr);
    ~UserBrowserModel() override;

    void setResults(std::shared_ptr<const core::RunEvaluation> evaluation,
                    std::shared_ptr<const std::vector<std::string>> userIds);
    const core::RunEvaluation* evaluation() const { return m_eval.get(); }

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

    static std::optional<core::Metric> metricOf(int column);
    static int columnOf(core::Metric m) { return FirstMetric + static_cast<int>(m); }

    /// Raw value behind a cell (NaN when undefined); the proxy sorts on this.
    double sortValue(int row, int column) const;
    core::UserIndex userAt(int row) const;
    /// Row of a user, or -1 when the user has no withheld items.
    int rowOfUser(core::UserIndex user) const;
    QString userId(int row) const;
    QString userIdOf(core::UserIndex user) const;
    std::uint32_t warningMask(int row) const { return m_warningMask[static_cast<std::size_t>(row)]; }
    /// 1..4: the user's train-activity quartile among evaluated users (1 = least active).
    int activityQuartile(int row) const;
    bool isCold(int row) const;
    /// Train counts splitting the quartiles (q1, median, q3), for labels.
    std::vector<std::int32_t> quartileBounds() const { return m_bounds; }

private:
    std::shared_ptr<const core::RunEvaluation> m_eval;
    std::shared_ptr<const std::vector<std::string>> m_userIds;
    std::vector<std::uint32_t> m_warningMask;
    std::vector<std::int32_t> m_bounds;
};

} // namespace slatewise::ui

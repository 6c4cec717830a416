// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/evalsettings.h"
#include "core/evaluation.h"
#include "core/metric.h"
#include "core/progress.h"
#include "core/run.h"
#include "ui/meetingpack.h"

#include <QString>

#include <memory>
#include <optional>
#include <string>
#include <vector>

class QStandardItemModel;

namespace slatewise::ui {

class ChartView;

/// A workspace loaded and evaluated for export: the dataset, the chosen runs and their
/// evaluations, and everything the headless `export` and `report` commands (and the GUI's
/// export actions) draw from them: the charts, the CSV tables and the meeting pack content.
class WorkspaceReport {
public:
    /// A table for CSV export with its file name stem.
    struct NamedTable {
        QString stem;
        std::shared_ptr<QStandardItemModel> model;
    };

    /// Opens `path` read-only, loads the dataset and the runs named (all runs when empty)
    /// and evaluates each with `settings`.
    static core::Result<WorkspaceReport> load(const std::string& path, const std::vector<std::string>& runNames,
                                              const core::EvalSettings& settings = {},
                                              const core::Progress& progress = {});

    const core::Dataset& data() const { return *m_data; }
    const std::vector<core::RunData>& runs() const { return *m_runs; }
    const std::vector<core::RunEvaluation>& evaluations() const { return *m_evals; }
    QString workspaceName() const { return m_name; }
    /// Index of a run by name, or nullopt.
    std::optional<std::size_t> runIndex(const std::string& name) const;

    /// Every chart with data set: the overview charts, the per-user difference chart of the
    /// first two runs, and the score and genre charts of the first run's worst-served user.
    std::vector<std::unique_ptr<ChartView>> charts() const;
    /// Run summary, rating bands, k-curves, warning shares and the worst-served users per run.
    std::vector<NamedTable> tables() const;

    /// The run's users with at least one relevant withheld item, worst first: lowest NDCG
    /// (then highest RMSE); by RMSE alone when the run has no lists. At most `limit`.
    std::vector<core::UserIndex> worstUsers(std::size_t run, std::size_t limit) const;
    /// The metric worstUsers() sorts by for this run.
    core::Metric worstMetric(std::size_t run) const;
    PackTable worstUsersTable(std::size_t run, std::size_t limit) const;
    PackCaseStudy caseStudy(std::size_t run, core::UserIndex user, const QString& why) const;
    /// candidate − base per user, over users defined in both runs.
    std::vector<double> userDifferences(std::size_t base, std::size_t candidate, core::Metric metric) const;
    /// Paired comparison of two runs (core::compareRuns) with activity segments, for the pack.
    PackComparison comparison(std::size_t base, std::size_t candidate) const;

    /// Everything for the meeting pack; with a comparison when both indices are given.
    MeetingPackContent packContent(std::optional<std::size_t> base, std::optional<std::size_t> candidate) const;

private:
    // Shared so that the object stays cheap to move out of a Result.
    std::shared_ptr<core::Dataset> m_data;
    std::shared_ptr<core::DatasetStats> m_stats;
    std::shared_ptr<std::vector<core::RunData>> m_runs;
    std::shared_ptr<std::vector<core::RunEvaluation>> m_evals;
    QString m_name;
};

} // namespace slatewise::ui

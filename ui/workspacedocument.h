// SPDX-License-Identifier: MIT
#pragma once

#include "core/evalsettings.h"
#include "core/ids.h"

#include <QObject>
#include <QString>
#include <QStringList>

#include <map>
#include <optional>
#include <memory>
#include <string>
#include <vector>

namespace slatewise::core {
struct Dataset;
struct DatasetStats;
struct RunData;
struct RunEvaluation;
struct WorkspaceSummary;
} // namespace slatewise::core

namespace slatewise::ui {

class BackgroundTask;
struct RunErrors;

/// The one document of the workbench: the open workspace, its dataset, every run and the
/// current evaluations. Views and models subscribe to its signals; nothing else holds
/// workspace state.
///
/// Opening happens in two background steps so the overview appears early: first the
/// summary and the evaluations (stored ones are read, missing ones computed), then the
/// dataset and the runs themselves, which the user browser ids, the inspector and the
/// error distribution need. Changing settings recomputes the evaluations in the background.
/// All shared data is immutable once published (shared_ptr to const), so a background job
/// can keep reading it while the GUI shows it.
class WorkspaceDocument : public QObject {
    Q_OBJECT
public:
    explicit WorkspaceDocument(QObject* parent = nullptr);
    ~WorkspaceDocument() override;

    /// Starts opening `path` in the background; false when another job runs.
    bool open(const QString& path);
    /// Re-reads the workspace (after an import, an added run or a fitted model).
    bool reload();
    void close();

    bool isOpen() const { return !m_path.isEmpty(); }
    QString path() const { return m_path; }
    /// The last error of open/reload/recompute (empty when none).
    QString lastError() const { return m_lastError; }

    const core::EvalSettings& settings() const { return m_settings; }
    /// Changing k or the relevance threshold recomputes every run in the background.
    bool setSettings(const core::EvalSettings& settings);

    const core::WorkspaceSummary* summary() const { return m_summary.get(); }
    std::shared_ptr<const core::Dataset> dataset() const { return m_data; }
    std::shared_ptr<const core::DatasetStats> stats() const { return m_stats; }
    std::shared_ptr<const std::vector<std::string>> userIds() const { return m_userIds; }
    /// Evaluations in run order (the workspace's order).
    const std::vector<std::shared_ptr<const core::RunEvaluation>>& evaluations() const { return m_evaluations; }
    /// The same without per-user tables, for charts that take values.
    const std::vector<core::RunEvaluation>& summaries() const { return m_summaries; }
    std::shared_ptr<const core::RunEvaluation> evaluation(const QString& runName) const;
    std::shared_ptr<const core::RunData> run(const QString& runName) const;
    const std::vector<RunErrors>& runErrors() const { return *m_errors; }
    QStringList runNames() const;
    /// Index of a user by external id (needs the dataset), or nullopt when unknown.
    std::optional<core::UserIndex> findUser(const QString& userId) const;
    QString userIdOf(core::UserIndex user) const;

    BackgroundTask* task() const { return m_task; }
    /// true once both opening steps are done.
    bool isFullyLoaded() const { return m_data != nullptr && m_runsLoaded; }

signals:
    void opened(const QString& path);
    void closed();
    void evaluationsChanged();
    /// The dataset and runs are in memory (user ids, inspector, error distribution).
    void datasetLoaded();
    void settingsChanged();
    void failed(const QString& message);
    void busyChanged(bool busy);

private:
    void startEvaluations(bool thenLoadData);
    void startDataLoad(std::shared_ptr<core::Dataset> known);
    void publishEvaluations(std::vector<std::shared_ptr<const core::RunEvaluation>> evaluations);

    BackgroundTask* m_task = nullptr;
    QString m_path;
    QString m_lastError;
    core::EvalSettings m_settings;
    std::shared_ptr<const core::WorkspaceSummary> m_summary;
    std::shared_ptr<const core::Dataset> m_data;
    std::shared_ptr<const core::DatasetStats> m_stats;
    std::shared_ptr<const std::vector<std::string>> m_userIds;
    std::map<std::string, std::shared_ptr<const core::RunData>> m_runs;
    bool m_runsLoaded = false;
    std::vector<std::shared_ptr<const core::RunEvaluation>> m_evaluations;
    std::vector<core::RunEvaluation> m_summaries;
    std::unique_ptr<std::vector<RunErrors>> m_errors;
    mutable std::unique_ptr<std::map<std::string, core::UserIndex>> m_userLookup;
};

} // namespace slatewise::ui

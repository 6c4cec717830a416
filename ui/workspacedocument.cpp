// SPDX-License-Identifier: MIT
#include "ui/workspacedocument.h"

#include "core/dataset.h"
#include "core/evaluation.h"
#include "core/evaluationstore.h"
#include "core/evaluator.h"
#include "core/progress.h"
#include "core/run.h"
#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/format.h"
#include "ui/runerrors.h"

#include <algorithm>

namespace slatewise::ui {

namespace {

QString errorText(const std::vector<core::Error>& errors)
{
    QStringList lines;
    for (const auto& e : errors)
        lines << toQ(e.toString());
    return lines.join(QLatin1Char('\n'));
}

bool wasCancelled(const std::vector<core::Error>& errors)
{
    return !errors.empty() && errors.front().kind == core::ErrorKind::Cancelled;
}

/// What the first opening step hands to the GUI thread.
struct EvaluationStep {
    std::shared_ptr<core::WorkspaceSummary> summary;
    std::shared_ptr<std::vector<std::string>> userIds;
    std::vector<std::shared_ptr<const core::RunEvaluation>> evaluations;
    std::shared_ptr<core::Dataset> data; ///< when it had to be read to compute
    std::vector<core::Error> errors;
};

/// What the second step hands over.
struct DataStep {
    std::shared_ptr<core::Dataset> data;
    std::shared_ptr<core::DatasetStats> stats;
    std::map<std::string, std::shared_ptr<const core::RunData>> runs;
    std::vector<RunErrors> errors;
    std::vector<core::Error> problems;
};

core::Error cancelledError()
{
    return core::Error{core::ErrorKind::Cancelled, {}, 0, 0, {}, "cancelled", {}};
}

/// The evaluation of every run under `settings`: stored ones are read (fast, no dataset
/// needed), missing ones computed from the dataset and stored for next time.
EvaluationStep evaluateWorkspace(const std::string& path, const core::EvalSettings& settings, const core::Progress& progress)
{
    EvaluationStep step;
    auto ws = core::Workspace::open(path);
    if (!ws)
        ws = core::Workspace::open(path, true); // a read-only file still opens; results are then not kept
    if (!ws) {
        step.errors = ws.errors();
        return step;
    }
    auto summary = ws->summary();
    if (!summary) {
        step.errors = summary.errors();
        return step;
    }
    step.summary = std::make_shared<core::WorkspaceSummary>(std::move(summary.value()));
    auto ids = core::EvaluationStore::userIds(ws->db());
    if (!ids) {
        step.errors = ids.errors();
        return step;
    }
    step.userIds = std::make_shared<std::vector<std::string>>(std::move(ids.value()));

    const auto& runs = step.summary->runs;
    std::vector<std::shared_ptr<const core::RunEvaluation>> byRun(runs.size());
    std::vector<std::size_t> missing;
    for (std::size_t i = 0; i < runs.size(); ++i) {
        progress(0.05 * static_cast<double>(i) / static_cast<double>(runs.size()), "Reading stored results of " + runs[i].name);
        auto stored = core::EvaluationStore::load(ws->db(), runs[i].id, settings);
        if (stored && stored->has_value())
            byRun[i] = std::make_shared<const core::RunEvaluation>(std::move(**stored));
        else
            missing.push_back(i);
    }
    if (!missing.empty()) {
        progress(0.05, "Reading the dataset");
        auto data = ws->loadDataset();
        if (!data) {
            step.errors = data.errors();
            return step;
        }
        step.data = std::make_shared<core::Dataset>(std::move(data.value()));
        const auto stats = core::computeStats(*step.data);
        for (std::size_t n = 0; n < missing.size(); ++n) {
            const std::size_t i = missing[n];
            if (progress.cancelled()) {
                step.errors = {cancelledError()};
                return step;
            }
            const double base = 0.2 + 0.8 * static_cast<double>(n) / static_cast<double>(missing.size());
            const double span = 0.8 / static_cast<double>(missing.size());
            const std::string stage = "Evaluating run " + runs[i].name;
            progress(base, stage);
            auto run = ws->loadRun(runs[i].name, *step.data);
            if (!run) {
                step.errors = run.errors();
                return step;
            }
            core::Progress inner;
            inner.cancel = progress.cancel;
            inner.report = [&](double f, std::string_view) { progress(base + span * f, stage); };
            auto eval = core::evaluateRun(*step.data, stats, *run, settings, inner);
            if (!eval) {
                step.errors = eval.errors();
                return step;
            }
            // Keeping the result is a convenience; a read-only workspace still shows it.
            (void)core::EvaluationStore::store(ws->db(), eval.value());
            byRun[i] = std::make_shared<const core::RunEvaluation>(std::move(eval.value()));
        }
    }
    step.evaluations = std::move(byRun);
    progress(1.0, "Evaluated");
    return step;
}

DataStep loadData(const std::string& path, std::shared_ptr<core::Dataset> known, const std::vector<std::string>& runNames,
                  const core::Progress& progress)
{
    DataStep step;
    auto ws = core::Workspace::open(path, true);
    if (!ws) {
        step.problems = ws.errors();
        return step;
    }
    if (known) {
        step.data = std::move(known);
    } else {
        progress(0.0, "Reading the dataset");
        auto data = ws->loadDataset();
        if (!data) {
            step.problems = data.errors();
            return step;
        }
        step.data = std::make_shared<core::Dataset>(std::move(data.value()));
    }
    step.stats = std::make_shared<core::DatasetStats>(core::computeStats(*step.data));
    for (std::size_t i = 0; i < runNames.size(); ++i) {
        if (progress.cancelled())
            return step;
        progress(0.4 + 0.6 * static_cast<double>(i) / static_cast<double>(runNames.size()), "Reading run " + runNames[i]);
        auto run = ws->loadRun(runNames[i], *step.data);
        if (!run) {
            step.problems = run.errors();
            return step;
        }
        auto shared = std::make_shared<const core::RunData>(std::move(run.value()));
        step.errors.push_back(RunErrors::fromRun(*step.data, *shared));
        step.runs.emplace(runNames[i], std::move(shared));
    }
    progress(1.0, "Loaded");
    return step;
}

} // namespace

WorkspaceDocument::WorkspaceDocument(QObject* parent)
    : QObject(parent), m_task(new BackgroundTask(this)), m_errors(std::make_unique<std::vector<RunErrors>>())
{
    connect(m_task, &BackgroundTask::runningChanged, this, &WorkspaceDocument::busyChanged);
}

WorkspaceDocument::~WorkspaceDocument() = default;

bool WorkspaceDocument::open(const QString& path)
{
    if (m_task->isRunning())
        return false;
    close();
    m_path = path;
    m_lastError.clear();
    startEvaluations(true);
    return true;
}

bool WorkspaceDocument::reload()
{
    if (m_path.isEmpty() || m_task->isRunning())
        return false;
    const QString path = m_path;
    return open(path);
}

void WorkspaceDocument::close()
{
    if (m_path.isEmpty())
        return;
    m_path.clear();
    m_summary.reset();
    m_data.reset();
    m_stats.reset();
    m_userIds.reset();
    m_runs.clear();
    m_runsLoaded = false;
    m_evaluations.clear();
    m_summaries.clear();
    m_errors->clear();
    m_userLookup.reset();
    emit closed();
}

bool WorkspaceDocument::setSettings(const core::EvalSettings& settings)
{
    if (m_task->isRunning())
        return false;
    m_settings = settings;
    emit settingsChanged();
    if (!m_path.isEmpty())
        startEvaluations(false);
    return true;
}

void WorkspaceDocument::startEvaluations(bool thenLoadData)
{
    auto result = std::make_shared<EvaluationStep>();
    const std::string path = m_path.toStdString();
    const core::EvalSettings settings = m_settings;
    const bool opening = thenLoadData;
    m_task->start(
        opening ? tr("Opening %1").arg(m_path) : tr("Recomputing for k = %1, relevant at ≥ %2").arg(settings.k).arg(settings.relevantAt),
        [result, path, settings](const core::Progress& progress) { *result = evaluateWorkspace(path, settings, progress); },
        [this, result, opening] {
            if (!result->errors.empty()) {
                m_lastError = wasCancelled(result->errors) ? tr("Cancelled.") : errorText(result->errors);
                if (opening) {
                    m_path.clear();
                    emit closed();
                }
                emit failed(m_lastError);
                return;
            }
            if (opening) {
                m_summary = result->summary;
                m_userIds = result->userIds;
                emit opened(m_path);
            }
            publishEvaluations(std::move(result->evaluations));
            if (opening)
                startDataLoad(result->data);
        });
}

void WorkspaceDocument::publishEvaluations(std::vector<std::shared_ptr<const core::RunEvaluation>> evaluations)
{
    m_evaluations = std::move(evaluations);
    m_summaries.clear();
    for (const auto& e : m_evaluations) {
        core::RunEvaluation copy;
        copy.runName = e->runName;
        copy.runId = e->runId;
        copy.settings = e->settings;
        copy.computedAt = e->computedAt;
        copy.accuracy = e->accuracy;
        copy.ranking = e->ranking;
        copy.beyond = e->beyond;
        copy.ci = e->ci;
        copy.warningShare = e->warningShare;
        m_summaries.push_back(std::move(copy));
    }
    emit evaluationsChanged();
}

void WorkspaceDocument::startDataLoad(std::shared_ptr<core::Dataset> known)
{
    auto result = std::make_shared<DataStep>();
    const std::string path = m_path.toStdString();
    std::vector<std::string> names;
    for (const auto& r : m_summary->runs)
        names.push_back(r.name);
    m_task->start(
        tr("Reading the dataset and runs"),
        [result, path, names, known](const core::Progress& progress) { *result = loadData(path, known, names, progress); },
        [this, result] {
            if (!result->problems.empty() || !result->data) {
                m_lastError = errorText(result->problems);
                if (!m_lastError.isEmpty())
                    emit failed(m_lastError);
                return;
            }
            m_data = result->data;
            m_stats = result->stats;
            m_runs = std::move(result->runs);
            *m_errors = std::move(result->errors);
            m_runsLoaded = true;
            m_userLookup.reset();
            emit datasetLoaded();
        });
}

std::shared_ptr<const core::RunEvaluation> WorkspaceDocument::evaluation(const QString& runName) const
{
    const std::string name = runName.toStdString();
    for (const auto& e : m_evaluations)
        if (e->runName == name)
            return e;
    return nullptr;
}

std::shared_ptr<const core::RunData> WorkspaceDocument::run(const QString& runName) const
{
    auto it = m_runs.find(runName.toStdString());
    return it == m_runs.end() ? nullptr : it->second;
}

QStringList WorkspaceDocument::runNames() const
{
    QStringList names;
    for (const auto& e : m_evaluations)
        names << toQ(e->runName);
    return names;
}

std::optional<core::UserIndex> WorkspaceDocument::findUser(const QString& userId) const
{
    if (!m_data)
        return std::nullopt;
    if (!m_userLookup) {
        auto lookup = std::make_unique<std::map<std::string, core::UserIndex>>();
        for (std::size_t u = 0; u < m_data->userIds.size(); ++u)
            lookup->emplace(m_data->userIds[u], core::UserIndex(static_cast<std::uint32_t>(u)));
        m_userLookup = std::move(lookup);
    }
    auto it = m_userLookup->find(userId.toStdString());
    if (it == m_userLookup->end())
        return std::nullopt;
    return it->second;
}

QString WorkspaceDocument::userIdOf(core::UserIndex user) const
{
    if (m_data && user.value < m_data->userIds.size())
        return toQ(m_data->userIds[user.value]);
    return QStringLiteral("#%1").arg(user.value);
}

} // namespace slatewise::ui

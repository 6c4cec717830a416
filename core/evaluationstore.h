// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/evaluation.h"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace slatewise::core {

class SqliteDb;

/// One stored evaluation, as listed without loading its per-user rows.
struct StoredEvaluation {
    std::int64_t evaluationId = 0;
    std::int64_t runId = 0;
    std::string settingsJson;
    std::string computedAt;
};

/// Evaluations in the workspace: the `evaluations` row (settings as EvalSettings::toJson(),
/// the summary as EvaluationJson::runSummary()), its `user_results` and `user_warnings`.
/// A run's evaluations are keyed by its run_id and the exact settings text; replacing a run
/// gives it a new run_id, so its old evaluations go with it (ON DELETE CASCADE).
class EvaluationStore {
public:
    /// Writes `eval` (eval.runId must name a stored run) in one transaction, replacing an
    /// earlier evaluation of the same run and settings. Returns the evaluation_id.
    static Result<std::int64_t> store(SqliteDb& db, const RunEvaluation& eval);

    /// The evaluation of run `runId` under `settings`, or nullopt when none is stored.
    /// Reads back exactly what store() wrote, per-user rows and warnings included.
    static Result<std::optional<RunEvaluation>> load(const SqliteDb& db, std::int64_t runId,
                                                     const EvalSettings& settings);

    /// Every stored evaluation of a run, newest first.
    static Result<std::vector<StoredEvaluation>> list(const SqliteDb& db, std::int64_t runId);

    /// External user ids by user index (user_id), for CSV and the command line.
    static Result<std::vector<std::string>> userIds(const SqliteDb& db);
};

} // namespace slatewise::core

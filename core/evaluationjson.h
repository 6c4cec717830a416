// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/evaluation.h"

#include <nlohmann/json.hpp>

#include <ostream>
#include <string>
#include <vector>

namespace slatewise::core {

/// The evaluation's JSON and CSV forms (docs/metrics.md and the evaluation issue give the
/// keys). Doubles are written so that they read back bit for bit; NaN ("not defined") is
/// written as null and read back as NaN. A section a run cannot have is null.
class EvaluationJson {
public:
    /// One run: {"name", "run_id", "computed_at", "accuracy", "ranking", "beyond", "ci", "warnings"}.
    /// Everything in RunEvaluation except the per-user rows and warnings; the workspace
    /// stores this object as the evaluation's summary.
    static nlohmann::ordered_json runSummary(const RunEvaluation& eval);
    /// Reads runSummary()'s object back into `eval` (users and warnings untouched).
    static Status readRunSummary(const nlohmann::json& json, RunEvaluation& eval);

    /// The whole document: {"settings": {"k", "relevant_at", "bootstrap", ...}, "runs": [...]}.
    static nlohmann::ordered_json document(const std::vector<RunEvaluation>& evals, const EvalSettings& settings);

    /// Per-user CSV header line (no newline): run,user_id,n_withheld,...,seen_in_list.
    static std::string perUserCsvHeader();
    /// Writes the header and one row per run and user with a withheld item; empty cell for
    /// NaN. `userIds` maps UserIndex to the external id.
    static void writePerUserCsv(std::ostream& out, const std::vector<RunEvaluation>& evals,
                                const std::vector<std::string>& userIds);
};

/// Shortest decimal text that reads back as the same double ("" for NaN).
std::string formatDouble(double v);

} // namespace slatewise::core

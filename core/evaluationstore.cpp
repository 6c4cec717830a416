// SPDX-License-Identifier: MIT
#include "core/evaluationstore.h"

#include "core/evaluationjson.h"
#include "core/sqlitedb.h"

#include <cmath>

namespace slatewise::core {

namespace {

Error workspaceError(const std::string& what) { return Error{ErrorKind::Workspace, {}, 0, 0, {}, what, {}}; }

// The metric columns of user_results in Metric order; the names equal the metric keys.
std::string metricColumns()
{
    std::string cols;
    for (const auto& info : allMetrics()) {
        cols += ", ";
        cols += info.key;
    }
    return cols;
}

Severity severityFrom(const std::string& text)
{
    if (text == "info")
        return Severity::Info;
    if (text == "severe")
        return Severity::Severe;
    return Severity::Warn;
}

} // namespace

Result<std::int64_t> EvaluationStore::store(SqliteDb& db, const RunEvaluation& eval)
{
    try {
        const std::string settings = eval.settings.toJson();
        const std::string summary = EvaluationJson::runSummary(eval).dump();
        Transaction tx(db);
        Statement remove(db, "DELETE FROM evaluations WHERE run_id = ? AND settings = ?");
        remove.bind(1, eval.runId).bind(2, settings).run();
        Statement insert(db, "INSERT INTO evaluations(run_id, settings, computed_at, summary) VALUES (?, ?, ?, ?)");
        insert.bind(1, eval.runId).bind(2, settings).bind(3, eval.computedAt).bind(4, summary).run();
        const std::int64_t id = db.lastInsertId();

        std::string sql = "INSERT INTO user_results(evaluation_id, user_id, n_withheld, n_relevant, n_train, "
                          "warning_count"
                          + metricColumns() + ") VALUES (?, ?, ?, ?, ?, ?";
        for (std::size_t m = 0; m < kMetricCount; ++m)
            sql += ", ?";
        sql += ")";
        Statement row(db, sql);
        const UserResultTable& t = eval.users;
        for (std::size_t r = 0; r < t.size(); ++r) {
            row.reset();
            row.bind(1, id)
                .bind(2, static_cast<std::int64_t>(t.users[r].value))
                .bind(3, t.nWithheld[r])
                .bind(4, t.nRelevant[r])
                .bind(5, t.nTrain[r])
                .bind(6, r < t.warningCount.size() ? t.warningCount[r] : 0);
            for (std::size_t m = 0; m < kMetricCount; ++m)
                row.bindOptional(7 + static_cast<int>(m), t.metrics[m][r]);
            row.run();
        }

        Statement warning(db, "INSERT INTO user_warnings(evaluation_id, user_id, code, severity, value, threshold, "
                              "message) VALUES (?, ?, ?, ?, ?, ?, ?)");
        for (const auto& w : eval.warnings) {
            warning.reset();
            warning.bind(1, id)
                .bind(2, static_cast<std::int64_t>(w.user.value))
                .bind(3, warningInfo(w.code).key)
                .bind(4, toString(w.severity))
                .bindOptional(5, w.value)
                .bindOptional(6, w.threshold)
                .bind(7, w.message);
            warning.run();
        }
        tx.commit();
        return id;
    } catch (const SqliteError& e) {
        return workspaceError(std::string("cannot store the evaluation of run '") + eval.runName + "': " + e.what());
    }
}

Result<std::optional<RunEvaluation>> EvaluationStore::load(const SqliteDb& db, std::int64_t runId,
                                                           const EvalSettings& settings)
{
    try {
        const std::string settingsText = settings.toJson();
        Statement head(db, "SELECT evaluation_id, computed_at, summary FROM evaluations WHERE run_id = ? AND settings = ?");
        head.bind(1, runId).bind(2, settingsText);
        if (!head.step())
            return std::optional<RunEvaluation>{};
        const std::int64_t id = head.int64(0);
        RunEvaluation eval;
        eval.settings = settings;
        const nlohmann::json summary = nlohmann::json::parse(head.text(2), nullptr, false);
        if (summary.is_discarded())
            return workspaceError("the stored evaluation summary is not valid JSON (evaluation " + std::to_string(id) + ")");
        if (auto status = EvaluationJson::readRunSummary(summary, eval); !status.ok())
            return status.errors();
        eval.runId = runId;
        eval.computedAt = head.text(1);

        Statement count(db, "SELECT count(*) FROM user_results WHERE evaluation_id = ?");
        count.bind(1, id);
        count.step();
        UserResultTable& t = eval.users;
        t.resize(static_cast<std::size_t>(count.int64(0)));
        Statement rows(db, "SELECT user_id, n_withheld, n_relevant, n_train, warning_count" + metricColumns()
                               + " FROM user_results WHERE evaluation_id = ? ORDER BY user_id");
        rows.bind(1, id);
        std::size_t r = 0;
        while (rows.step() && r < t.size()) {
            t.users[r] = UserIndex(static_cast<std::uint32_t>(rows.int64(0)));
            t.nWithheld[r] = static_cast<std::int32_t>(rows.int64(1));
            t.nRelevant[r] = static_cast<std::int32_t>(rows.int64(2));
            t.nTrain[r] = static_cast<std::int32_t>(rows.int64(3));
            t.warningCount[r] = static_cast<std::int32_t>(rows.int64(4));
            for (std::size_t m = 0; m < kMetricCount; ++m)
                t.metrics[m][r] = rows.real(5 + static_cast<int>(m));
            ++r;
        }

        Statement warnings(db, "SELECT user_id, code, severity, value, threshold, message FROM user_warnings "
                               "WHERE evaluation_id = ? ORDER BY user_id, code, rowid");
        warnings.bind(1, id);
        while (warnings.step()) {
            UserWarning w;
            w.user = UserIndex(static_cast<std::uint32_t>(warnings.int64(0)));
            const auto code = warningFromKey(warnings.text(1));
            if (!code)
                return workspaceError("unknown warning code '" + warnings.text(1) + "' in stored evaluation "
                                      + std::to_string(id));
            w.code = *code;
            w.severity = severityFrom(warnings.text(2));
            w.value = warnings.real(3);
            w.threshold = warnings.real(4);
            w.message = warnings.text(5);
            eval.warnings.push_back(std::move(w));
        }
        return std::optional<RunEvaluation>(std::move(eval));
    } catch (const SqliteError& e) {
        return workspaceError(std::string("cannot read a stored evaluation: ") + e.what());
    }
}

Result<std::vector<StoredEvaluation>> EvaluationStore::list(const SqliteDb& db, std::int64_t runId)
{
    try {
        std::vector<StoredEvaluation> out;
        Statement q(db, "SELECT evaluation_id, run_id, settings, computed_at FROM evaluations WHERE run_id = ? "
                        "ORDER BY computed_at DESC, evaluation_id DESC");
        q.bind(1, runId);
        while (q.step())
            out.push_back({q.int64(0), q.int64(1), q.text(2), q.text(3)});
        return out;
    } catch (const SqliteError& e) {
        return workspaceError(std::string("cannot list stored evaluations: ") + e.what());
    }
}

Result<std::vector<std::string>> EvaluationStore::userIds(const SqliteDb& db)
{
    try {
        std::vector<std::string> ids;
        Statement q(db, "SELECT user_id, external_id FROM users ORDER BY user_id");
        while (q.step()) {
            const auto u = static_cast<std::size_t>(q.int64(0));
            if (u >= ids.size())
                ids.resize(u + 1);
            ids[u] = q.text(1);
        }
        return ids;
    } catch (const SqliteError& e) {
        return workspaceError(std::string("cannot read user ids: ") + e.what());
    }
}

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#include "ui/workspacereport.h"

#include "core/comparisonsettings.h"
#include "core/evaluationstore.h"
#include "core/evaluator.h"
#include "core/runcomparison.h"
#include "core/workspace.h"
#include "ui/banderrorchart.h"
#include "ui/errordistributionchart.h"
#include "ui/format.h"
#include "ui/genretimelinechart.h"
#include "ui/kcurvechart.h"
#include "ui/scoreratingchart.h"
#include "ui/userdifferencechart.h"
#include "ui/warningprevalencechart.h"

#include <QCoreApplication>
#include <QDateTime>
#include <QFileInfo>
#include <QStandardItemModel>

#include <algorithm>
#include <cmath>
#include <numeric>
#include <unordered_map>
#include <unordered_set>

namespace slatewise::ui {

namespace {

QString tr(const char* text)
{
    return QCoreApplication::translate("WorkspaceReport", text);
}

// File names from run and user names: letters, digits, '-', '_' and '.' only.
QString safeStem(const QString& s)
{
    QString out;
    for (const QChar c : s)
        out += (c.isLetterOrNumber() || c == QLatin1Char('-') || c == QLatin1Char('_') || c == QLatin1Char('.'))
                   ? c
                   : QLatin1Char('_');
    return out;
}

QVariant numberOrEmpty(double v)
{
    return std::isnan(v) ? QVariant() : QVariant(v);
}

std::shared_ptr<QStandardItemModel> makeModel(const QStringList& headers)
{
    auto model = std::make_shared<QStandardItemModel>(0, static_cast<int>(headers.size()));
    model->setHorizontalHeaderLabels(headers);
    return model;
}

void addRow(QStandardItemModel& model, const QVariantList& cells)
{
    QList<QStandardItem*> items;
    for (const auto& cell : cells) {
        auto* item = new QStandardItem;
        item->setData(cell, Qt::DisplayRole);
        items << item;
    }
    model.appendRow(items);
}

} // namespace

core::Result<WorkspaceReport> WorkspaceReport::load(const std::string& path, const std::vector<std::string>& runNames,
                                                    const core::EvalSettings& settings, const core::Progress& progress)
{
    auto ws = core::Workspace::open(path, true);
    if (!ws)
        return ws.errors();
    auto data = ws->loadDataset();
    if (!data)
        return data.errors();
    std::vector<std::string> names = runNames;
    if (names.empty()) {
        auto runs = ws->runs();
        if (!runs)
            return runs.errors();
        for (const auto& r : *runs)
            names.push_back(r.name);
    }
    WorkspaceReport report;
    report.m_name = QFileInfo(QString::fromStdString(path)).completeBaseName();
    report.m_data = std::make_shared<core::Dataset>(std::move(*data));
    report.m_runs = std::make_shared<std::vector<core::RunData>>();
    report.m_evals = std::make_shared<std::vector<core::RunEvaluation>>();
    report.m_stats = std::make_shared<core::DatasetStats>(core::computeStats(*report.m_data));
    const core::DatasetStats& stats = *report.m_stats;
    for (std::size_t i = 0; i < names.size(); ++i) {
        auto run = ws->loadRun(names[i], *report.m_data);
        if (!run)
            return run.errors();
        core::Progress part;
        part.cancel = progress.cancel;
        const double share = 1.0 / static_cast<double>(names.size());
        part.report = [&, i, share](double f, std::string_view stage) {
            progress(share * (static_cast<double>(i) + f), stage);
        };
        // Stored results under the same settings are used as they are; otherwise evaluate now
        // (the workspace is opened read-only, so nothing is written).
        auto stored = core::EvaluationStore::load(ws->db(), run->info.id, settings);
        if (stored && stored->has_value()) {
            report.m_evals->push_back(std::move(**stored));
        } else {
            auto eval = core::evaluateRun(*report.m_data, stats, *run, settings, part);
            if (!eval)
                return eval.errors();
            report.m_evals->push_back(std::move(*eval));
        }
        report.m_runs->push_back(std::move(*run));
    }
    return report;
}

std::optional<std::size_t> WorkspaceReport::runIndex(const std::string& name) const
{
    for (std::size_t i = 0; i < m_runs->size(); ++i) {
        if ((*m_runs)[i].info.name == name)
            return i;
    }
    return std::nullopt;
}

core::Metric WorkspaceReport::worstMetric(std::size_t run) const
{
    return (*m_evals)[run].ranking ? core::Metric::Ndcg : core::Metric::Rmse;
}

std::vector<core::UserIndex> WorkspaceReport::worstUsers(std::size_t run, std::size_t limit) const
{
    const auto& eval = (*m_evals)[run];
    const auto& users = eval.users;
    const bool byNdcg = worstMetric(run) == core::Metric::Ndcg;
    const auto& ndcg = users.column(core::Metric::Ndcg);
    const auto& rmse = users.column(core::Metric::Rmse);
    std::vector<std::size_t> rows;
    for (std::size_t r = 0; r < users.size(); ++r) {
        const double key = byNdcg ? ndcg[r] : rmse[r];
        if (std::isnan(key) || (byNdcg && users.nRelevant[r] < 1))
            continue;
        rows.push_back(r);
    }
    auto rmseOf = [&](std::size_t r) { return std::isnan(rmse[r]) ? -1.0 : rmse[r]; };
    std::sort(rows.begin(), rows.end(), [&](std::size_t a, std::size_t b) {
        if (byNdcg && ndcg[a] != ndcg[b])
            return ndcg[a] < ndcg[b];
        if (rmseOf(a) != rmseOf(b))
            return rmseOf(a) > rmseOf(b);
        // Among equals, the user with more relevant withheld items was failed more often.
        if (users.nRelevant[a] != users.nRelevant[b])
            return users.nRelevant[a] > users.nRelevant[b];
        return users.users[a] < users.users[b];
    });
    if (rows.size() > limit)
        rows.resize(limit);
    std::vector<core::UserIndex> out;
    for (const auto r : rows)
        out.push_back(users.users[r]);
    return out;
}

namespace {
std::optional<std::size_t> rowOf(const core::UserResultTable& users, core::UserIndex u)
{
    const auto it = std::lower_bound(users.users.begin(), users.users.end(), u);
    if (it == users.users.end() || *it != u)
        return std::nullopt;
    return static_cast<std::size_t>(it - users.users.begin());
}

QStringList warningCodesOf(const core::RunEvaluation& eval, core::UserIndex u)
{
    QStringList codes;
    const auto range = std::equal_range(eval.warnings.begin(), eval.warnings.end(), u,
                                        [](const auto& a, const auto& b) {
                                            if constexpr (std::is_same_v<std::decay_t<decltype(a)>, core::UserIndex>)
                                                return a < b.user;
                                            else
                                                return a.user < b;
                                        });
    for (auto it = range.first; it != range.second; ++it)
        codes << toQ(core::warningInfo(it->code).key);
    return codes;
}
} // namespace

PackTable WorkspaceReport::worstUsersTable(std::size_t run, std::size_t limit) const
{
    const auto& eval = (*m_evals)[run];
    const core::Metric by = worstMetric(run);
    PackTable t;
    t.title = tr("Worst-served users under %1, by %2 (worst first)")
                  .arg(toQ(eval.runName), toQ(core::metricInfo(by).key));
    const int k = eval.settings.k;
    t.headers << tr("#") << tr("user") << tr("withheld / relevant") << tr("train titles") << tr("NDCG@%1").arg(k)
              << tr("precision@%1").arg(k) << tr("recall@%1").arg(k) << tr("RMSE") << tr("warnings");
    int rank = 1;
    for (const auto u : worstUsers(run, limit)) {
        const auto r = rowOf(eval.users, u);
        if (!r)
            continue;
        const auto& users = eval.users;
        t.rows.push_back({QString::number(rank++), toQ(m_data->userIds[u.value]),
                          QStringLiteral("%1 / %2").arg(users.nWithheld[*r]).arg(users.nRelevant[*r]),
                          QString::number(users.nTrain[*r]), formatNumber(users.value(core::Metric::Ndcg, *r)),
                          formatNumber(users.value(core::Metric::Precision, *r)),
                          formatNumber(users.value(core::Metric::Recall, *r)),
                          formatNumber(users.value(core::Metric::Rmse, *r)),
                          warningCodesOf(eval, u).join(QStringLiteral(", "))});
    }
    if (t.rows.empty())
        t.note = tr("No user has a relevant withheld item, so no one can be called worst served.");
    return t;
}

PackCaseStudy WorkspaceReport::caseStudy(std::size_t run, core::UserIndex u, const QString& why) const
{
    const auto& eval = (*m_evals)[run];
    const auto& runData = (*m_runs)[run];
    const auto& data = *m_data;
    PackCaseStudy s;
    s.userId = toQ(data.userIds[u.value]);
    s.runName = toQ(eval.runName);
    s.why = why;
    const int k = eval.settings.k;
    const double relevantAt = eval.settings.relevantAt;

    std::unordered_set<std::uint32_t> seen;
    for (const auto& row : data.train.of(u))
        seen.insert(row.item.value);
    std::unordered_map<std::uint32_t, double> withheldRating;
    for (const auto& row : data.withheld.of(u))
        withheldRating[row.item.value] = row.rating;

    auto titleOf = [&](core::ItemIndex item) {
        const auto& it = data.items[item.value];
        QString title = toQ(it.title);
        if (it.year > 0)
            title += QStringLiteral(" (%1)").arg(it.year);
        return title;
    };
    auto genresOf = [&](core::ItemIndex item) {
        QStringList g;
        for (const auto gi : data.items[item.value].genres)
            g << toQ(data.genreNames[static_cast<std::size_t>(gi)]);
        return g.join(QStringLiteral(", "));
    };
    auto seriesOf = [&](core::ItemIndex item) {
        const auto& it = data.items[item.value];
        if (it.series == core::kNone)
            return QString();
        return tr("%1, part %2").arg(toQ(data.seriesNames[static_cast<std::size_t>(it.series)])).arg(it.seriesPart);
    };

    // The list as the user sees it: top k with what we know about each entry.
    s.list.title = tr("The run's top %1 for this user").arg(k);
    s.list.headers << tr("rank") << tr("title") << tr("genres") << tr("series") << tr("score") << tr("marks");
    const auto list = runData.listOf(u);
    std::unordered_map<std::uint32_t, int> rankOf;
    for (std::size_t i = 0; i < list.size(); ++i) {
        rankOf.emplace(list[i].item.value, static_cast<int>(i) + 1);
        if (static_cast<int>(i) >= k)
            continue;
        const auto item = list[i].item;
        QStringList marks;
        const auto w = withheldRating.find(item.value);
        if (w != withheldRating.end())
            marks << (w->second >= relevantAt ? tr("hit (rated %1)").arg(w->second) : tr("withheld, rated %1").arg(w->second));
        if (seen.count(item.value))
            marks << tr("already seen");
        s.list.rows.push_back({QString::number(i + 1), titleOf(item), genresOf(item), seriesOf(item),
                               formatNumber(list[i].score, 2), marks.join(QStringLiteral("; "))});
    }
    if (!runData.hasLists)
        s.list.note = tr("This run has no ranked lists.");
    else if (list.empty())
        s.list.note = tr("The run gave this user no list.");

    // Withheld items, favourites first, with where the run placed them.
    s.withheld.title = tr("This user's withheld titles, highest rated first");
    s.withheld.headers << tr("title") << tr("genres") << tr("rating") << tr("run's score") << tr("rank in list");
    std::vector<std::size_t> rows(data.withheld.offsets[u.value + 1] - data.withheld.offsets[u.value]);
    std::iota(rows.begin(), rows.end(), static_cast<std::size_t>(data.withheld.offsets[u.value]));
    std::stable_sort(rows.begin(), rows.end(),
                     [&](std::size_t a, std::size_t b) { return data.withheld.rows[a].rating > data.withheld.rows[b].rating; });
    for (const auto r : rows) {
        const auto& row = data.withheld.rows[r];
        const double score = runData.hasScores && r < runData.scores.size() ? runData.scores[r] : std::nan("");
        const auto rank = rankOf.find(row.item.value);
        QString rankText;
        if (!runData.hasLists)
            rankText = tr("(no lists)");
        else if (rank == rankOf.end())
            rankText = tr("not in the list");
        else if (rank->second > k)
            rankText = tr("%1 (outside the top %2)").arg(rank->second).arg(k);
        else
            rankText = QString::number(rank->second);
        s.withheld.rows.push_back({titleOf(row.item), genresOf(row.item), QString::number(row.rating),
                                   runData.hasScores ? formatNumber(score, 2) : tr("(no scores)"), rankText});
    }

    const auto range = std::equal_range(eval.warnings.begin(), eval.warnings.end(), u, [](const auto& a, const auto& b) {
        if constexpr (std::is_same_v<std::decay_t<decltype(a)>, core::UserIndex>)
            return a < b.user;
        else
            return a.user < b;
    });
    for (auto it = range.first; it != range.second; ++it) {
        const auto& info = core::warningInfo(it->code);
        s.warnings << QStringLiteral("%1 (%2): %3").arg(toQ(info.title), toQ(core::toString(it->severity)), toQ(it->message));
    }

    if (const auto r = rowOf(eval.users, u)) {
        for (const auto m : {core::Metric::Ndcg, core::Metric::Precision, core::Metric::Recall, core::Metric::Rmse,
                             core::Metric::Ild}) {
            const double v = eval.users.value(m, *r);
            if (std::isnan(v))
                continue;
            const auto& col = eval.users.column(m);
            double sum = 0;
            std::size_t n = 0;
            for (const double x : col) {
                if (!std::isnan(x)) {
                    sum += x;
                    ++n;
                }
            }
            s.metrics << tr("%1: %2 (run mean over users %3)")
                             .arg(toQ(core::metricInfo(m).label), formatNumber(v), formatNumber(n ? sum / n : std::nan("")));
        }
        s.metrics << tr("%1 train titles, %2 withheld, %3 of them relevant (rated ≥ %4)")
                         .arg(eval.users.nTrain[*r])
                         .arg(eval.users.nWithheld[*r])
                         .arg(eval.users.nRelevant[*r])
                         .arg(relevantAt);
    }
    return s;
}

std::vector<double> WorkspaceReport::userDifferences(std::size_t base, std::size_t candidate, core::Metric metric) const
{
    const auto& a = (*m_evals)[base].users;
    const auto& b = (*m_evals)[candidate].users;
    std::vector<double> out;
    // Both tables are sorted by user index: merge.
    std::size_t i = 0, j = 0;
    while (i < a.size() && j < b.size()) {
        if (a.users[i] < b.users[j]) {
            ++i;
        } else if (b.users[j] < a.users[i]) {
            ++j;
        } else {
            const double va = a.value(metric, i), vb = b.value(metric, j);
            if (!std::isnan(va) && !std::isnan(vb))
                out.push_back(vb - va);
            ++i;
            ++j;
        }
    }
    return out;
}

PackComparison WorkspaceReport::comparison(std::size_t base, std::size_t candidate) const
{
    const auto& evalA = (*m_evals)[base];
    const auto& evalB = (*m_evals)[candidate];
    PackComparison c;
    c.base = toQ(evalA.runName);
    c.candidate = toQ(evalB.runName);
    core::ComparisonSettings settings;
    settings.segments = {core::SegmentSpec{core::SegmentKind::Activity, core::WarningCode::ColdUser}};
    auto result = core::compareRuns(evalA, evalB, *m_data, *m_stats, settings);
    if (!result) {
        c.note = tr("No comparison: %1").arg(QString::fromStdString(result.error().message));
        return c;
    }
    const auto& cmp = *result;
    auto toRow = [](const core::MetricComparison& m) {
        PackComparisonRow row;
        row.metric = toQ(core::comparisonMetricKey(m.metric));
        row.higherIsBetter = core::metricInfo(m.metric).better != core::Better::Lower;
        row.n = m.n;
        row.meanBase = m.meanBase;
        row.meanCandidate = m.meanCandidate;
        row.meanDiff = m.meanDiff;
        row.ciLow = m.ci.low;
        row.ciHigh = m.ci.high;
        row.pT = m.pT;
        row.pWilcoxon = m.pWilcoxon;
        row.pHolm = std::isnan(m.pHolm) ? -1.0 : m.pHolm;
        row.wins = m.wins;
        row.ties = m.ties;
        row.losses = m.losses;
        return row;
    };
    for (const auto& m : cmp.metrics)
        c.rows.push_back(toRow(m));
    // Segments on the primary metric only, so the table stays one page.
    for (const auto& seg : cmp.segments) {
        for (const auto& m : seg.metrics) {
            if (cmp.hasPrimary && m.metric != cmp.primary)
                continue;
            PackSegmentRow row;
            row.segment = toQ(seg.label.empty() ? seg.name : seg.name + " (" + seg.label + ")");
            row.metric = toQ(core::comparisonMetricKey(m.metric));
            row.n = m.n;
            row.meanDiff = m.meanDiff;
            row.ciLow = m.ci.low;
            row.ciHigh = m.ci.high;
            row.p = std::isnan(m.pHolm) ? m.pT : m.pHolm;
            row.tooSmall = seg.tooSmall || m.tooSmall;
            c.segments.push_back(row);
            break;
        }
    }
    for (const auto& pu : cmp.perUser) {
        if (cmp.hasPrimary && pu.metric != cmp.primary)
            continue;
        c.differenceMetric = pu.metric;
        for (std::size_t i = 0; i < pu.base.size() && i < pu.candidate.size(); ++i)
            c.differences.push_back(pu.candidate[i] - pu.base[i]);
        break;
    }
    if (c.differences.empty() && cmp.hasPrimary) {
        c.differenceMetric = cmp.primary;
        c.differences = userDifferences(base, candidate, cmp.primary);
    }
    QStringList notes;
    for (const auto& n : cmp.notes)
        notes << QString::fromStdString(n);
    c.note = notes.join(QLatin1Char(' '));
    return c;
}

std::vector<std::unique_ptr<ChartView>> WorkspaceReport::charts() const
{
    std::vector<std::unique_ptr<ChartView>> out;
    auto band = std::make_unique<BandErrorChart>();
    band->setData(*m_evals);
    out.push_back(std::move(band));
    auto errors = std::make_unique<ErrorDistributionChart>();
    std::vector<RunErrors> runErrors;
    for (const auto& run : *m_runs)
        runErrors.push_back(RunErrors::fromRun(*m_data, run));
    errors->setData(std::move(runErrors));
    out.push_back(std::move(errors));
    auto curves = std::make_unique<KCurveChart>();
    curves->setData(*m_evals);
    out.push_back(std::move(curves));
    auto warnings = std::make_unique<WarningPrevalenceChart>();
    warnings->setData(*m_evals);
    out.push_back(std::move(warnings));
    if (m_evals->size() >= 2) {
        const auto metric = worstMetric(0);
        auto diff = std::make_unique<UserDifferenceChart>();
        diff->setData(userDifferences(0, 1, metric), metric, toQ((*m_evals)[0].runName), toQ((*m_evals)[1].runName));
        out.push_back(std::move(diff));
    }
    if (!m_evals->empty()) {
        const auto worst = worstUsers(0, 1);
        if (!worst.empty()) {
            auto scatter = std::make_unique<ScoreRatingChart>();
            scatter->setData(*m_data, (*m_runs)[0], worst.front());
            out.push_back(std::move(scatter));
            auto timeline = std::make_unique<GenreTimelineChart>();
            timeline->setData(*m_data, worst.front(), (*m_evals)[0].settings.burstWindow);
            out.push_back(std::move(timeline));
        }
    }
    return out;
}

std::vector<WorkspaceReport::NamedTable> WorkspaceReport::tables() const
{
    std::vector<NamedTable> out;
    {
        QStringList headers{QStringLiteral("run"), QStringLiteral("k"), QStringLiteral("relevant_at")};
        const char* keys[] = {"rmse", "mae", "mean_error", "precision", "recall", "hit_rate", "mrr", "map", "ndcg",
                              "ndcg_graded", "heldout_topk", "ild", "novelty", "coverage", "gini"};
        for (const char* key : keys) {
            headers << QString::fromLatin1(key) << QString::fromLatin1(key) + QStringLiteral("_ci_low")
                    << QString::fromLatin1(key) + QStringLiteral("_ci_high");
        }
        auto model = makeModel(headers);
        for (const auto& e : *m_evals) {
            const double nan = std::nan("");
            std::map<std::string, double> v;
            if (e.accuracy)
                v = {{"rmse", e.accuracy->rmse}, {"mae", e.accuracy->mae}, {"mean_error", e.accuracy->meanError}};
            if (e.ranking) {
                const auto& r = *e.ranking;
                v.insert({{"precision", r.precision}, {"recall", r.recall}, {"hit_rate", r.hitRate}, {"mrr", r.mrr},
                          {"map", r.map}, {"ndcg", r.ndcg}, {"ndcg_graded", r.ndcgGraded}, {"heldout_topk", r.heldoutTopk}});
            }
            if (e.beyond) {
                const auto& b = *e.beyond;
                v.insert({{"ild", b.ild}, {"novelty", b.novelty}, {"coverage", b.coverage}, {"gini", b.gini}});
            }
            QVariantList row{toQ(e.runName), e.settings.k, e.settings.relevantAt};
            for (const char* key : keys) {
                const auto it = v.find(key);
                row << numberOrEmpty(it == v.end() ? nan : it->second);
                const auto ci = e.ci.find(key);
                row << numberOrEmpty(ci == e.ci.end() ? nan : ci->second.low)
                    << numberOrEmpty(ci == e.ci.end() ? nan : ci->second.high);
            }
            addRow(*model, row);
        }
        out.push_back({QStringLiteral("runs"), model});
    }
    {
        auto model = makeModel({QStringLiteral("run"), QStringLiteral("rating"), QStringLiteral("n"),
                                QStringLiteral("rmse"), QStringLiteral("mae"), QStringLiteral("mean_error")});
        for (const auto& e : *m_evals) {
            if (!e.accuracy)
                continue;
            for (const auto& b : e.accuracy->bands)
                addRow(*model, {toQ(e.runName), b.rating, static_cast<qlonglong>(b.n), b.rmse, b.mae, b.meanError});
        }
        out.push_back({QStringLiteral("error-by-rating"), model});
    }
    {
        auto model = makeModel({QStringLiteral("run"), QStringLiteral("k"), QStringLiteral("precision"),
                                QStringLiteral("recall"), QStringLiteral("ndcg")});
        for (const auto& e : *m_evals) {
            if (!e.ranking)
                continue;
            const auto& c = e.ranking->curves;
            for (std::size_t i = 0; i < c.k.size(); ++i)
                addRow(*model, {toQ(e.runName), c.k[i], numberOrEmpty(c.precision[i]), numberOrEmpty(c.recall[i]),
                                numberOrEmpty(c.ndcg[i])});
        }
        out.push_back({QStringLiteral("k-curves"), model});
    }
    {
        auto model = makeModel({QStringLiteral("run"), QStringLiteral("warning"), QStringLiteral("title"),
                                QStringLiteral("share_of_users")});
        for (const auto& e : *m_evals) {
            for (const auto& w : core::allWarnings()) {
                const auto it = e.warningShare.find(std::string(w.key));
                addRow(*model, {toQ(e.runName), toQ(w.key), toQ(w.title), it == e.warningShare.end() ? 0.0 : it->second});
            }
        }
        out.push_back({QStringLiteral("warning-prevalence"), model});
    }
    for (std::size_t r = 0; r < m_evals->size(); ++r) {
        const auto& e = (*m_evals)[r];
        auto model = makeModel({QStringLiteral("rank"), QStringLiteral("user_id"), QStringLiteral("n_withheld"),
                                QStringLiteral("n_relevant"), QStringLiteral("n_train"), QStringLiteral("ndcg"),
                                QStringLiteral("precision"), QStringLiteral("recall"), QStringLiteral("rmse"),
                                QStringLiteral("warnings")});
        int rank = 1;
        for (const auto u : worstUsers(r, 100)) {
            const auto row = rowOf(e.users, u);
            if (!row)
                continue;
            addRow(*model, {rank++, toQ(m_data->userIds[u.value]), e.users.nWithheld[*row], e.users.nRelevant[*row],
                            e.users.nTrain[*row], numberOrEmpty(e.users.value(core::Metric::Ndcg, *row)),
                            numberOrEmpty(e.users.value(core::Metric::Precision, *row)),
                            numberOrEmpty(e.users.value(core::Metric::Recall, *row)),
                            numberOrEmpty(e.users.value(core::Metric::Rmse, *row)),
                            warningCodesOf(e, u).join(QLatin1Char(' '))});
        }
        out.push_back({QStringLiteral("worst-users-") + safeStem(toQ(e.runName)), model});
    }
    return out;
}

MeetingPackContent WorkspaceReport::packContent(std::optional<std::size_t> base, std::optional<std::size_t> candidate) const
{
    MeetingPackContent c;
    c.workspaceName = m_name;
    c.generatedAt = QDateTime::currentDateTimeUtc().toString(Qt::ISODate);
    if (!m_evals->empty()) {
        const auto& s = m_evals->front().settings;
        c.settingsText = tr("k = %1, relevant when the withheld rating is at least %2, %3 bootstrap resamples")
                             .arg(s.k)
                             .arg(s.relevantAt)
                             .arg(s.bootstrap);
    }
    for (const auto& e : *m_evals) {
        core::RunEvaluation summary = e;
        summary.users = {};
        summary.warnings.clear();
        c.runs.push_back(std::move(summary));
    }
    for (const auto& run : *m_runs)
        c.errors.push_back(RunErrors::fromRun(*m_data, run));
    if (base && candidate)
        c.comparison = comparison(*base, *candidate);
    // The worst-served users of the candidate (or the first run) and three of them in depth.
    const std::size_t focus = candidate ? *candidate : 0;
    if (focus < m_evals->size()) {
        c.worstUsers = worstUsersTable(focus, 10);
        const auto metric = worstMetric(focus);
        const auto worst = worstUsers(focus, 3);
        int place = 1;
        for (const auto u : worst) {
            const auto row = rowOf((*m_evals)[focus].users, u);
            const double value = row ? (*m_evals)[focus].users.value(metric, *row) : std::nan("");
            const QString why = tr("Number %1 of the worst-served users under %2: %3 = %4.")
                                    .arg(place++)
                                    .arg(toQ((*m_evals)[focus].runName), toQ(core::metricInfo(metric).key),
                                         formatNumber(value));
            c.caseStudies.push_back(caseStudy(focus, u, why));
        }
    }
    return c;
}

} // namespace slatewise::ui

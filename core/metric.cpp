// SPDX-License-Identifier: MIT
#include "core/metric.h"

namespace slatewise::core {

namespace {
constexpr std::array<MetricInfo, kMetricCount> kMetrics{{
    {Metric::Rmse, "rmse", "RMSE", Better::Lower,
     "Root mean squared error of the scores on the user's withheld ratings: sqrt(mean((score - rating)^2))."},
    {Metric::Mae, "mae", "MAE", Better::Lower, "Mean absolute error: mean(|score - rating|)."},
    {Metric::MeanError, "mean_error", "Mean error", Better::Neither,
     "Mean signed error, mean(score - rating); positive means the run over-predicts."},
    {Metric::Precision, "precision", "Precision@k", Better::Higher,
     "Share of the k list slots holding a relevant withheld item: hits / k."},
    {Metric::Recall, "recall", "Recall@k", Better::Higher,
     "Share of the user's relevant withheld items found in the top k: hits / |relevant|."},
    {Metric::Ap, "ap", "AP@k", Better::Higher,
     "Average precision at k: sum of precision at each hit position, divided by min(k, |relevant|)."},
    {Metric::Rr, "rr", "RR", Better::Higher, "Reciprocal rank of the first hit in the top k (0 when none)."},
    {Metric::Ndcg, "ndcg", "NDCG@k", Better::Higher,
     "Binary normalized discounted cumulative gain: sum(hit_j / log2(j+1)) over the ideal ordering's value."},
    {Metric::NdcgGraded, "ndcg_graded", "NDCG@k (graded)", Better::Higher,
     "NDCG with the withheld rating of each relevant hit as its gain."},
    {Metric::HeldoutTopk, "heldout_topk", "Held-out top-k", Better::Higher,
     "Of the withheld items the run scores highest, the share that are among the user's own top-rated."},
    {Metric::Ild, "ild", "ILD", Better::Higher,
     "Intra-list diversity: mean Jaccard distance between the genre sets of every pair in the list."},
    {Metric::Novelty, "novelty", "Novelty", Better::Higher,
     "Mean self-information of the list items, -log2((n_i + 1) / (N + 1)), in bits."},
    {Metric::PopularityLift, "popularity_lift", "Popularity lift", Better::Neither,
     "Mean popularity percentile of the list minus that of the user's own history, in points."},
    {Metric::CalibrationKl, "calibration_kl", "Calibration KL", Better::Lower,
     "KL divergence from the user's history genre mix to the list's genre mix (smoothed), in nats."},
    {Metric::SeriesShare, "series_share", "Series share", Better::Lower,
     "Largest share of the top k taken by a single series."},
    {Metric::OrderViolations, "order_violations", "Order violations", Better::Lower,
     "List items that are a later part of a series whose earlier parts are unseen and not ranked above."},
    {Metric::BurstEcho, "burst_echo", "Burst echo", Better::Lower,
     "1 when the list mostly repeats a genre the user only recently binged, else 0."},
    {Metric::SeenInList, "seen_in_list", "Already seen", Better::Lower,
     "List items the user already has in their train history."},
}};
} // namespace

const std::array<MetricInfo, kMetricCount>& allMetrics() { return kMetrics; }

const MetricInfo& metricInfo(Metric m) { return kMetrics[static_cast<std::size_t>(m)]; }

std::optional<Metric> metricFromKey(std::string_view key)
{
    if (key == "map")
        return Metric::Ap;
    if (key == "mrr")
        return Metric::Rr;
    for (const auto& info : kMetrics)
        if (info.key == key)
            return info.metric;
    return std::nullopt;
}

} // namespace slatewise::core

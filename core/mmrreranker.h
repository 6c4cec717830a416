// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/progress.h"
#include "core/reranksettings.h"
#include "core/run.h"

#include <span>
#include <vector>

namespace slatewise::core {

/// Maximal marginal relevance (Carbonell & Goldstein, "The use of MMR, diversity-based
/// reranking for reordering documents and producing summaries", SIGIR 1998) over each
/// user's list: repeatedly take
///   argmax_{i ∉ S} [ λ · rel(i) − (1 − λ) · max_{j ∈ S} sim(i, j) ]
/// where rel is listRelevance() of the parent's list and sim is the Jaccard similarity of
/// the genre sets (1 when both are empty, matching the ild measure). Ties go to the
/// parent's order, so λ = 1 returns the parent's list unchanged.
class MmrReranker {
public:
    static double genreSimilarity(const Item& a, const Item& b);
    static std::vector<ListEntry> rerankList(const Dataset& data, std::span<const ListEntry> list, double lambda);
    static Result<RunData> apply(const Dataset& data, const RunData& parent, const RerankSettings& settings,
                                 const Progress& progress);
};

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <cstdint>
#include <span>

namespace slatewise::core {

/// A withheld item of one user that the run scored.
struct ScoredRating {
    ItemIndex item;
    double score = 0.0;
    double rating = 0.0;
};

/// Held-out top-k agreement of one user: with K = min(k, |S_u|), P = the K scored withheld
/// items with the highest score (ties broken by item index ascending) and t = the K-th
/// highest withheld rating among S_u, returns |{i in P : rating_i >= t}| / K.
/// NaN when `scored` is empty. Reorders `scored` (it is the caller's scratch space).
double heldoutTopk(std::span<ScoredRating> scored, std::int32_t k);

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#include "core/ratingbands.h"

namespace slatewise::core {

std::vector<BandStats> RatingBands::result() const
{
    std::vector<BandStats> out;
    out.reserve(m_bands.size());
    for (const auto& [rating, acc] : m_bands)
        out.push_back({rating, acc.n(), acc.rmse(), acc.mae(), acc.meanError()});
    return out;
}

} // namespace slatewise::core

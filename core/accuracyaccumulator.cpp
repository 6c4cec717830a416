// SPDX-License-Identifier: MIT
#include "core/accuracyaccumulator.h"

#include <cmath>

namespace slatewise::core {

double AccuracyAccumulator::rmse() const
{
    return m_n ? std::sqrt(m_sumSquares / static_cast<double>(m_n)) : std::nan("");
}

double AccuracyAccumulator::mae() const { return m_n ? m_sumAbs / static_cast<double>(m_n) : std::nan(""); }

double AccuracyAccumulator::meanError() const { return m_n ? m_sum / static_cast<double>(m_n) : std::nan(""); }

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#include "core/pairedoutcomes.h"

#include <cmath>

namespace slatewise::core {

PairedOutcomes countPairedOutcomes(std::span<const double> differences, Better better, double tolerance)
{
    PairedOutcomes o;
    for (double d : differences) {
        if (std::fabs(d) <= tolerance) {
            ++o.ties;
            continue;
        }
        const bool up = d > 0;
        const bool candidateBetter = better == Better::Lower ? !up : up;
        if (candidateBetter)
            ++o.wins;
        else
            ++o.losses;
    }
    return o;
}

} // namespace slatewise::core

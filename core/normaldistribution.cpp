// SPDX-License-Identifier: MIT
#include "core/normaldistribution.h"

#include <cmath>

namespace slatewise::core {

namespace {
constexpr double kInvSqrt2 = 0.70710678118654752440;
}

double normalCdf(double z)
{
    return 0.5 * std::erfc(-z * kInvSqrt2);
}

double normalSf(double z)
{
    return 0.5 * std::erfc(z * kInvSqrt2);
}

} // namespace slatewise::core

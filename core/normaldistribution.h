// SPDX-License-Identifier: MIT
#pragma once

namespace slatewise::core {

/// Standard normal distribution function Phi(z), through erfc so both tails keep their digits.
double normalCdf(double z);
/// Upper tail 1 - Phi(z), accurate far into the tail.
double normalSf(double z);

} // namespace slatewise::core

// SPDX-License-Identifier: MIT
#pragma once

namespace slatewise::core {

/// Student's t distribution with `df` > 0 degrees of freedom, through the regularized
/// incomplete beta function: P(|T| > |t|) = I_{df/(df+t^2)}(df/2, 1/2) (Abramowitz & Stegun
/// 26.7.1). Infinite df gives the normal distribution.
double studentTCdf(double t, double df);
/// Upper tail P(T > t).
double studentTSf(double t, double df);
/// Two-sided p-value P(|T| >= |t|), as scipy's 2 * stdtr(df, -|t|).
double studentTTwoSidedP(double t, double df);
/// The q-quantile (0 < q < 1), by bisection on the distribution function to ~1e-12.
double studentTQuantile(double q, double df);

} // namespace slatewise::core

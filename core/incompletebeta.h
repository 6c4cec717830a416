// SPDX-License-Identifier: MIT
#pragma once

namespace slatewise::core {

/// Natural log of the beta function B(a, b), a, b > 0. For large arguments it avoids the
/// cancellation of lgamma(a) + lgamma(b) - lgamma(a + b) (Stirling series of the difference),
/// so that Student t p-values stay accurate at hundreds of thousands of degrees of freedom.
double logBeta(double a, double b);

/// Regularized incomplete beta function I_x(a, b) for a, b > 0 and 0 <= x <= 1, with y = 1 - x
/// passed separately so a caller that knows 1 - x exactly loses no digits near x = 1.
/// Continued fraction evaluated by the modified Lentz method (Press et al., Numerical Recipes,
/// 3rd ed., section 6.4); relative accuracy about 1e-13 or better.
double regularizedIncompleteBeta(double a, double b, double x, double y);
inline double regularizedIncompleteBeta(double a, double b, double x)
{
    return regularizedIncompleteBeta(a, b, x, 1.0 - x);
}

} // namespace slatewise::core

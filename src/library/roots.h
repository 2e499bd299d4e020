// Bracketed scalar root finding for the library's implicit relations.
// Header-only so that the function object is inlined and nothing allocates.
#pragma once

#include <cmath>
#include <limits>

namespace heatdeck::library {

// Brent's method (R. P. Brent, "Algorithms for Minimization without
// Derivatives", 1973, ch. 4: inverse quadratic interpolation and secant steps,
// falling back to bisection whenever they do not shrink the bracket fast
// enough), so convergence is guaranteed once the root is bracketed.
//
// f(lo) = f_lo and f(hi) = f_hi must have opposite signs (or one be zero);
// otherwise returns NaN without calling f.  Stops when the bracket is narrower
// than 2*(rel_tol*|x| + abs_tol) or f(x) == 0, and returns the best x; returns
// the best x found after max_iter evaluations as well.
template <typename F>
double BrentRoot(F&& f, double lo, double hi, double f_lo, double f_hi, double rel_tol,
                 double abs_tol = 0.0, int max_iter = 200) {
  if (f_lo == 0) return lo;
  if (f_hi == 0) return hi;
  if ((f_lo > 0) == (f_hi > 0)) return std::numeric_limits<double>::quiet_NaN();
  // b is the best estimate, a the previous one, c the far end of the bracket
  // [b, c]; d is the last step and e the one before it.
  double a = lo, fa = f_lo, b = hi, fb = f_hi;
  double c = a, fc = fa;
  double d = b - a, e = d;
  for (int iter = 0; iter < max_iter; ++iter) {
    if ((fb > 0) == (fc > 0)) {
      c = a;
      fc = fa;
      d = e = b - a;
    }
    if (std::fabs(fc) < std::fabs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const double tol = 2 * std::numeric_limits<double>::epsilon() * std::fabs(b) +
                       rel_tol * std::fabs(b) + abs_tol;
    const double m = 0.5 * (c - b);
    if (std::fabs(m) <= tol || fb == 0) return b;
    if (std::fabs(e) >= tol && std::fabs(fa) > std::fabs(fb)) {
      const double s = fb / fa;
      double p, q;
      if (a == c) {  // two points: secant
        p = 2 * m * s;
        q = 1 - s;
      } else {  // three points: inverse quadratic interpolation
        const double qa = fa / fc, r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) {
        q = -q;
      } else {
        p = -p;
      }
      // Accept the interpolation only if it stays well inside the bracket and
      // shrinks faster than the step before last; else bisect.
      if (2 * p < std::fmin(3 * m * q - std::fabs(tol * q), std::fabs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = e = m;
      }
    } else {
      d = e = m;
    }
    a = b;
    fa = fb;
    b += std::fabs(d) > tol ? d : (m > 0 ? tol : -tol);
    fb = f(b);
  }
  return b;
}

}  // namespace heatdeck::library

#pragma once

#include <boost/math/tools/toms748_solve.hpp>

#include <cstdint>

namespace settlewell::analytical {

/// The root of f in [lo, hi], where f(lo) and f(hi) differ in sign, to full double
/// precision: Alefeld, Potra & Shi's (1995) algorithm 748, from Boost.Math.
template <typename F>
double bracketed_root(F f, double lo, double hi) {
  std::uintmax_t max_iterations = 200;
  const auto [a, b] = boost::math::tools::toms748_solve(
      f, lo, hi, boost::math::tools::eps_tolerance<double>(), max_iterations);
  return 0.5 * (a + b);
}

} // namespace settlewell::analytical

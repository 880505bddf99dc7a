#pragma once

#include "settlewell/physics/biot_problem.h"

#include <deal.II/base/point.h>

#include <string>

namespace settlewell {

/// The primary fields at one point.
struct PointValues {
  double ux = 0.0;              ///< m
  double uy = 0.0;              ///< m (positive up)
  double excess_pressure = 0.0; ///< kPa
};

/// Evaluates the solution at a point that may lie on any process. Collective;
/// every process gets the same values. Throws InputError if no cell holds `x`.
PointValues probe(const BiotProblem& problem, const dealii::Point<2>& x);

} // namespace settlewell

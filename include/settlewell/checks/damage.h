#pragma once

#include <string>
#include <vector>

/// Screening of damage to buildings from the movement of their foundation.
/// Pure functions; lengths and movements in m, strains and rotations as ratios.
namespace settlewell::checks {

/// The movement along a foundation, sampled at increasing x.
struct FoundationMovement {
  std::vector<double> x;          ///< m
  std::vector<double> settlement; ///< m, positive down
  std::vector<double> ux;         ///< m, horizontal displacement
};

/// Burland & Wroth (1974) measures of a foundation's deformation.
struct Distortion {
  double max_settlement = 0.0;     ///< m
  double differential = 0.0;       ///< largest minus smallest settlement, m
  double tilt = 0.0;               ///< rigid rotation, end-to-end slope of settlement
  double angular_distortion = 0.0; ///< largest |slope - tilt| over the spans
  double deflection_ratio = 0.0;   ///< largest deviation from the chord / length
  bool hogging = false;            ///< the deviation is upward (the middle settles less)
  double horizontal_strain = 0.0;  ///< average, tension positive
  double length = 0.0;             ///< m
};

Distortion distortion(const FoundationMovement& movement);

/// A damage category of Burland et al. (1977), Boscardin & Cording (1989) and
/// Burland (1995) by limiting tensile strain: 0 negligible (< 0.05 %), 1 very
/// slight (0.05-0.075 %), 2 slight (0.075-0.15 %), 3 moderate (0.15-0.3 %),
/// 4 severe to very severe (> 0.3 %; categories 4-5).
struct DamageCategory {
  int category = 0;
  std::string degree;      ///< "negligible", ...
  std::string crack_width; ///< typical crack width
};
DamageCategory category_from_strain(double tensile_strain);

/// Boscardin & Cording (1989): the largest tensile strain in a wall with
/// horizontal strain eh and angular distortion beta,
/// eps_p = eh/2 + sqrt((eh/2)^2 + (beta/2)^2) (so eps_p = beta/2 at eh = 0).
double principal_tensile_strain(double horizontal_strain, double angular_distortion);

/// Burland (1995) deep-beam strains from the deflection ratio, for a building of
/// length L and height H (E/G = 2.6, nu = 0.3; neutral axis at mid-height when
/// sagging, at the base when hogging) [from memory in docs/verification-references.md].
struct BeamStrains {
  double bending = 0.0;  ///< eps_bmax + eh
  double diagonal = 0.0; ///< eh (1 - nu)/2 + sqrt(eh^2 ((1 + nu)/2)^2 + eps_dmax^2)
};
BeamStrains deep_beam_strains(double deflection_ratio,
                              bool hogging,
                              double length,
                              double height,
                              double horizontal_strain);

} // namespace settlewell::checks

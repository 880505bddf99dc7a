#pragma once

#include <limits>
#include <optional>
#include <string>
#include <vector>

/// The 1D hand estimate of settlement caused by a head change, built from a
/// column of horizontal layers. Pure functions; m, kPa, s.
namespace settlewell::checks {

struct ColumnLayer {
  std::string name;
  double top = 0.0, bottom = 0.0; ///< elevations, m
  double mv = 0.0;                ///< 1/kPa (1 / constrained modulus)
  double cv = 0.0;                ///< m^2/s
  bool consolidating = false;     ///< low permeability: drains slowly to its neighbours
  double head_fall = 0.0;         ///< final fall of head in a draining layer, m
  double conductivity = 0.0;      ///< vertical k, m/s (0: the same in every layer)
  /// Final fall of head at the layer's top and bottom faces, m (the 2D heads there).
  /// NaN: the draining neighbour's head_fall (none at the ground surface).
  double fall_top = std::numeric_limits<double>::quiet_NaN();
  double fall_bottom = std::numeric_limits<double>::quiet_NaN();
  /// A clay described by its oedometer indices (a Cam Clay layer): its settlement
  /// follows the e-log form, H/(1 + e0) [Cr log10(sigma'p/sigma'0) + Cc
  /// log10(sigma'f/sigma'p)] through its thickness, instead of mv; its cv is
  /// k / (gamma_w mv) with the secant mv of that settlement.
  struct Oedometer {
    double compression_index = 0.0, recompression_index = 0.0, void_ratio = 0.0;
    double start_top = 0.0, start_bottom = 0.0; ///< sigma'v0 at the faces, kPa
    double past_top = 0.0, past_bottom = 0.0;   ///< sigma'p at the faces, kPa
  };
  std::optional<Oedometer> oedometer = std::nullopt;
};

/// The e-log strain of a clay from sigma'v0 = `start` to `start + change` with the
/// preconsolidation `past` (kPa): recompression (Cr) up to sigma'p, virgin
/// compression (Cc) beyond it, swelling (Cr) when the stress falls.
double
elog_strain(const ColumnLayer::Oedometer& clay, double start, double past, double change);

/// One layer's share of the estimate.
struct LayerEstimate {
  std::string name;
  bool consolidating = false;
  double settlement = 0.0;     ///< ultimate, m
  double drainage_path = 0.0;  ///< Hdr, m (0 for a draining layer)
  int drained_faces = 0;       ///< 0, 1 or 2
  double t50 = 0.0, t90 = 0.0; ///< s, from Tv = 0.197 and 0.848 (common practice)
  double cv = 0.0;
};

struct OneDEstimate {
  std::vector<LayerEstimate> layers;
  double ultimate = 0.0; ///< m
  /// Settlement at time t after an instantaneous head change (Terzaghi 1925) or
  /// after one ramped linearly over `ramp` s (Olson 1977), draining layers
  /// following the head change at once.
  double settlement_at(double t, double ramp) const;
  /// The time at which settlement_at reaches half of `target` (by default the
  /// ultimate settlement).
  double t50(double ramp, double target = -1.0) const;
};

/// Layers top down. Adjacent consolidating layers form one sequence, which drains
/// through each outer face that touches a draining layer and, at the top of the
/// column, through the ground surface when `surface_drained`; the head falls at
/// those faces are the outer layers' fall_top and fall_bottom. Each layer's
/// ultimate settlement is mv * gamma_w * H times its mean final head fall: with two
/// drained faces that of steady vertical seepage across the sequence (the fall
/// varies linearly through each layer, by its share of the sum of H / k), with one
/// the fall at that face throughout, with none nothing. The sequence's time scale
/// is that of one layer of the same (sum of H / sqrt(cv)), common practice (the
/// transformed-thickness approximation, no single source; from memory): each
/// layer's drainage path is that sequence expressed in its own cv.
OneDEstimate estimate_one_d(const std::vector<ColumnLayer>& layers,
                            double gamma_w,
                            bool surface_drained);

} // namespace settlewell::checks

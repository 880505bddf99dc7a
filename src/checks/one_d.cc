#include "settlewell/checks/one_d.h"

#include "settlewell/analytical/consolidation.h"
#include "settlewell/analytical/roots.h"

#include <cmath>

namespace settlewell::checks {

namespace {

LayerEstimate consolidating_layer(const std::vector<ColumnLayer>& layers,
                                  std::size_t k,
                                  double gamma_w,
                                  bool surface_drained) {
  const ColumnLayer& l = layers[k];
  LayerEstimate e{l.name, true, 0.0, 0.0, 0, 0.0, 0.0, l.cv};
  const double H = l.top - l.bottom;
  const bool top_drained = k == 0 ? surface_drained : !layers[k - 1].consolidating;
  const bool bottom_drained = k + 1 < layers.size() && !layers[k + 1].consolidating;
  const double fall_top = k == 0 ? 0.0 : layers[k - 1].head_fall;
  const double fall_bottom = k + 1 < layers.size() ? layers[k + 1].head_fall : 0.0;
  e.drained_faces = int(top_drained) + int(bottom_drained);
  if (e.drained_faces == 0)
    return e;
  // Final effective-stress change gamma_w * (head fall): linear between two
  // drained faces, uniform when only one drains.
  const double mean_fall = e.drained_faces == 2 ? 0.5 * (fall_top + fall_bottom)
                                                : (top_drained ? fall_top : fall_bottom);
  e.settlement = l.mv * gamma_w * mean_fall * H;
  e.drainage_path = e.drained_faces == 2 ? H / 2 : H;
  e.t50 = 0.197 * e.drainage_path * e.drainage_path / l.cv;
  e.t90 = 0.848 * e.drainage_path * e.drainage_path / l.cv;
  return e;
}

} // namespace

OneDEstimate estimate_one_d(const std::vector<ColumnLayer>& layers,
                            double gamma_w,
                            bool surface_drained) {
  OneDEstimate out;
  for (std::size_t k = 0; k < layers.size(); ++k) {
    const ColumnLayer& l = layers[k];
    LayerEstimate e{l.name, false, 0.0, 0.0, 0, 0.0, 0.0, l.cv};
    if (l.consolidating)
      e = consolidating_layer(layers, k, gamma_w, surface_drained);
    else // a draining layer compresses as its head falls
      e.settlement = l.mv * gamma_w * l.head_fall * (l.top - l.bottom);
    out.ultimate += e.settlement;
    out.layers.push_back(e);
  }
  return out;
}

double OneDEstimate::settlement_at(double t, double ramp) const {
  double s = 0.0;
  for (const auto& e : layers) {
    if (!e.consolidating || e.drained_faces == 0) {
      s += e.settlement * (ramp > 0.0 ? std::min(1.0, t / ramp) : (t > 0.0 ? 1.0 : 0.0));
      continue;
    }
    const double T = e.cv * t / (e.drainage_path * e.drainage_path);
    const double Tc = e.cv * ramp / (e.drainage_path * e.drainage_path);
    s += e.settlement * (ramp > 0.0 ? analytical::olson_average_degree(T, Tc)
                                    : analytical::terzaghi_average_degree(T));
  }
  return s;
}

double OneDEstimate::t50(double ramp, double target) const {
  const double half = 0.5 * (target > 0.0 ? target : ultimate);
  if (!(half > 0.0))
    return 0.0;
  double hi = 1.0;
  while (settlement_at(hi, ramp) < half && hi < 1e15)
    hi *= 2.0;
  return analytical::bracketed_root(
      [&](double t) { return settlement_at(t, ramp) - half; }, 0.0, hi);
}

} // namespace settlewell::checks

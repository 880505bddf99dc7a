#include "settlewell/checks/one_d.h"

#include "settlewell/analytical/consolidation.h"
#include "settlewell/analytical/roots.h"

#include <cmath>

namespace settlewell::checks {

namespace {

double resistance(const ColumnLayer& l) {
  return (l.top - l.bottom) / (l.conductivity > 0.0 ? l.conductivity : 1.0);
}

/// The final head fall at the outer faces of the sequence first..last, m.
double face_fall(const std::vector<ColumnLayer>& layers, std::size_t k, bool top) {
  const double given = top ? layers[k].fall_top : layers[k].fall_bottom;
  if (!std::isnan(given))
    return given;
  if (top)
    return k == 0 ? 0.0 : layers[k - 1].head_fall;
  return k + 1 < layers.size() ? layers[k + 1].head_fall : 0.0;
}

/// The estimates of the consolidating layers first..last (one sequence).
void consolidating_sequence(const std::vector<ColumnLayer>& layers,
                            std::size_t first,
                            std::size_t last,
                            double gamma_w,
                            bool surface_drained,
                            std::vector<LayerEstimate>& out) {
  const bool top_drained = first == 0 ? surface_drained : true;
  const bool bottom_drained = last + 1 < layers.size();
  const int faces = int(top_drained) + int(bottom_drained);
  const double fall_top = face_fall(layers, first, true);
  const double fall_bottom = face_fall(layers, last, false);
  double total_resistance = 0.0, time_scale = 0.0; // sum H/k, sum H/sqrt(cv)
  for (std::size_t k = first; k <= last; ++k) {
    total_resistance += resistance(layers[k]);
    time_scale += (layers[k].top - layers[k].bottom) / std::sqrt(layers[k].cv);
  }
  double above = 0.0; // resistance above the current layer
  for (std::size_t k = first; k <= last; ++k) {
    const ColumnLayer& l = layers[k];
    LayerEstimate e{l.name, true, 0.0, 0.0, faces, 0.0, 0.0, l.cv};
    const double share = (above + 0.5 * resistance(l)) / total_resistance;
    above += resistance(l);
    if (faces == 0) {
      out.push_back(e);
      continue;
    }
    const double mean_fall = faces == 2 ? fall_top + (fall_bottom - fall_top) * share
                                        : (top_drained ? fall_top : fall_bottom);
    e.settlement = l.mv * gamma_w * mean_fall * (l.top - l.bottom);
    const double sequence = time_scale * std::sqrt(l.cv); // in this layer's cv, m
    e.drainage_path = faces == 2 ? sequence / 2 : sequence;
    e.t50 = 0.197 * e.drainage_path * e.drainage_path / l.cv;
    e.t90 = 0.848 * e.drainage_path * e.drainage_path / l.cv;
    out.push_back(e);
  }
}

} // namespace

OneDEstimate estimate_one_d(const std::vector<ColumnLayer>& layers,
                            double gamma_w,
                            bool surface_drained) {
  OneDEstimate out;
  for (std::size_t k = 0; k < layers.size(); ++k) {
    const ColumnLayer& l = layers[k];
    if (l.consolidating) {
      std::size_t last = k;
      while (last + 1 < layers.size() && layers[last + 1].consolidating)
        ++last;
      consolidating_sequence(layers, k, last, gamma_w, surface_drained, out.layers);
      k = last;
      continue;
    }
    // A draining layer compresses as its head falls.
    out.layers.push_back({l.name, false,
                          l.mv * gamma_w * l.head_fall * (l.top - l.bottom), 0.0, 0, 0.0,
                          0.0, l.cv});
  }
  for (const auto& e : out.layers)
    out.ultimate += e.settlement;
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

#include "settlewell/checks/one_d.h"

#include "settlewell/analytical/consolidation.h"
#include "settlewell/analytical/roots.h"

#include <cmath>
#include <tuple>
#include <utility>

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

/// A layer's ultimate settlement for a final head fall varying linearly from
/// `fall_top` at its top to `fall_bottom` at its bottom (m), and its cv (m^2/s):
/// mv and the given cv, or the e-log form (Simpson's rule on 20 slices) and the
/// cv of its secant mv.
std::pair<double, double> layer_settlement(const ColumnLayer& l,
                                           double fall_top,
                                           double fall_bottom,
                                           double gamma_w) {
  const double h = l.top - l.bottom;
  const double mean_fall = 0.5 * (fall_top + fall_bottom);
  if (!l.oedometer)
    return {l.mv * gamma_w * mean_fall * h, l.cv};
  const auto& o = *l.oedometer;
  constexpr int slices = 20;
  double sum = 0.0;
  for (int i = 0; i <= slices; ++i) {
    const double f = double(i) / slices; // 0 at the top
    const double strain =
        elog_strain(o, o.start_top + f * (o.start_bottom - o.start_top),
                    o.past_top + f * (o.past_bottom - o.past_top),
                    gamma_w * (fall_top + f * (fall_bottom - fall_top)));
    sum += strain * (i == 0 || i == slices ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0));
  }
  const double settlement = sum * h / (3.0 * slices);
  // The secant mv of the increment; without one, the recompression mv at the
  // layer's middle.
  const double mid = 0.5 * (o.start_top + o.start_bottom);
  const double mv =
      std::abs(mean_fall) > 1e-9 && settlement != 0.0
          ? settlement / (gamma_w * mean_fall * h)
          : o.recompression_index / (std::log(10.0) * (1.0 + o.void_ratio) * mid);
  const double k = l.conductivity > 0.0 ? l.conductivity : l.cv * gamma_w * l.mv;
  return {settlement, k / (gamma_w * mv)};
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
  double total_resistance = 0.0; // sum H/k
  for (std::size_t k = first; k <= last; ++k)
    total_resistance += resistance(layers[k]);
  const std::size_t begin = out.size();
  double above = 0.0, time_scale = 0.0; // resistance above the layer; sum H/sqrt(cv)
  for (std::size_t k = first; k <= last; ++k) {
    const ColumnLayer& l = layers[k];
    LayerEstimate e{l.name, true, 0.0, 0.0, faces, 0.0, 0.0, l.cv};
    const double at_top = above / total_resistance;
    above += resistance(l);
    const double at_bottom = above / total_resistance;
    if (faces == 2) {
      std::tie(e.settlement, e.cv) =
          layer_settlement(l, fall_top + (fall_bottom - fall_top) * at_top,
                           fall_top + (fall_bottom - fall_top) * at_bottom, gamma_w);
    } else if (faces == 1) {
      const double fall = top_drained ? fall_top : fall_bottom;
      std::tie(e.settlement, e.cv) = layer_settlement(l, fall, fall, gamma_w);
    }
    time_scale += (l.top - l.bottom) / std::sqrt(e.cv);
    out.push_back(e);
  }
  for (std::size_t i = begin; faces > 0 && i < out.size(); ++i) {
    LayerEstimate& e = out[i];
    const double sequence = time_scale * std::sqrt(e.cv); // in this layer's cv, m
    e.drainage_path = faces == 2 ? sequence / 2 : sequence;
    e.t50 = 0.197 * e.drainage_path * e.drainage_path / e.cv;
    e.t90 = 0.848 * e.drainage_path * e.drainage_path / e.cv;
  }
}

} // namespace

double elog_strain(const ColumnLayer::Oedometer& clay,
                   double start,
                   double past,
                   double change) {
  const double final_stress = start + change;
  if (!(start > 0.0 && final_stress > 0.0))
    return 0.0; // no effective stress to compress: outside the e-log form
  const double cr = clay.recompression_index, cc = clay.compression_index;
  double e; // change of void ratio, positive in compression
  if (change <= 0.0 || final_stress <= past)
    e = cr * std::log10(final_stress / start);
  else if (start >= past)
    e = cc * std::log10(final_stress / start);
  else
    e = cr * std::log10(past / start) + cc * std::log10(final_stress / past);
  return e / (1.0 + clay.void_ratio);
}

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
    const auto [settlement, cv] = layer_settlement(l, l.head_fall, l.head_fall, gamma_w);
    out.layers.push_back({l.name, false, settlement, 0.0, 0, 0.0, 0.0, cv});
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

#include "settlewell/model/initial_state.h"

#include "settlewell/core/errors.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/model_builder.h"

#include <algorithm>

namespace settlewell::model {

using namespace dealii;

namespace {

const std::vector<scenario::Layer>* layers_of(const scenario::Scenario& s) {
  if (s.section)
    return &s.section->layers;
  if (s.box)
    return &s.box->layers;
  return nullptr;
}

double bottom_of(const scenario::Scenario& s) {
  return s.section ? s.section->bottom : s.box->bottom;
}

/// Heads at the layer interfaces: given heads are constant in their layer; a run
/// of layers without one between two layers with heads carries the steady
/// leakage profile, linear in the hydraulic resistance sum(dz / ky).
std::vector<std::pair<double, double>> head_knots(const scenario::Scenario& s) {
  const auto& layers = *layers_of(s);
  const std::size_t n = layers.size();
  std::vector<double> top(n), bottom(n), ky(n);
  std::vector<std::optional<double>> given(n);
  for (std::size_t k = 0; k < n; ++k) {
    top[k] = layers[k].top;
    bottom[k] = k + 1 < n ? layers[k + 1].top : bottom_of(s);
    ky[k] = s.materials.at(layers[k].material).poroelastic.conductivity_y;
    const auto found = s.groundwater.layer_heads.find(layers[k].name);
    if (found != s.groundwater.layer_heads.end())
      given[k] = found->second;
  }
  if (!given[0])
    given[0] = s.groundwater.water_table;
  std::vector<std::pair<double, double>> knots;
  for (std::size_t k = 0; k < n;) {
    const double h_above = *given[k];
    knots.emplace_back(top[k], h_above);
    knots.emplace_back(bottom[k], h_above);
    std::size_t next = k + 1;
    while (next < n && !given[next])
      ++next;
    if (next == n) { // no head below: the rest keeps this one
      for (std::size_t j = k + 1; j < n; ++j)
        knots.emplace_back(bottom[j], h_above);
      break;
    }
    double resistance = 0.0;
    for (std::size_t j = k + 1; j < next; ++j)
      resistance += (top[j] - bottom[j]) / ky[j];
    double r = 0.0;
    for (std::size_t j = k + 1; j < next; ++j) {
      r += (top[j] - bottom[j]) / ky[j];
      knots.emplace_back(bottom[j], h_above + (*given[next] - h_above) * r / resistance);
    }
    k = next;
  }
  return knots;
}

/// Linear interpolation in a top-down list of (y, value) knots.
std::pair<double, double>
value_and_slope(const std::vector<std::pair<double, double>>& knots, double y) {
  if (y >= knots.front().first)
    return {knots.front().second, 0.0};
  for (std::size_t i = 1; i < knots.size(); ++i) {
    const auto& [y0, v0] = knots[i - 1];
    const auto& [y1, v1] = knots[i];
    if (y >= y1 && y0 > y1) {
      const double slope = (v0 - v1) / (y0 - y1);
      return {v1 + slope * (y - y1), slope};
    }
  }
  return {knots.back().second, 0.0};
}

} // namespace

InitialState::InitialState(const scenario::Scenario& s, const Mesh& mesh)
    : gamma_w_(s.gamma_w)
    , gravity_loading_(s.gravity_loading) {
  const auto regions = region_materials(s, mesh);
  for (const auto& [region, material] : regions) {
    const auto id = mesh.names.region_id(region);
    if (region_unit_weight_.size() <= id)
      region_unit_weight_.resize(id + 1), region_k0_.resize(id + 1);
    region_unit_weight_[id] = s.materials.at(material).unit_weight;
    region_k0_[id] = s.materials.at(material).k0;
    if (region_retention_.size() <= id)
      region_retention_.resize(id + 1);
    region_retention_[id] = s.materials.at(material).retention;
  }
  top_ = -1e300;
  for (const auto& v : mesh.triangulation->get_vertices())
    top_ = std::max(top_, v[1]);
  if (const auto* layers = layers_of(s)) {
    head_knots_ = head_knots(s);
    for (const auto& l : *layers) {
      weight_knots_.emplace_back(l.top, s.materials.at(l.material).unit_weight);
      layer_retention_.push_back(s.materials.at(l.material).retention);
    }
  } else {
    if (!s.groundwater.layer_heads.empty())
      throw InputError(s.location_of("groundwater") +
                       ": groundwater.layer_heads needs a [section] or [box] geometry");
    head_knots_ = {{top_, s.groundwater.water_table},
                   {top_ - 1.0, s.groundwater.water_table}};
  }
}

double InitialState::head(const Point<2>& x) const {
  return value_and_slope(head_knots_, x[1]).first;
}

Tensor<1, 2> InitialState::head_gradient(const Point<2>& x) const {
  Tensor<1, 2> g;
  g[1] = value_and_slope(head_knots_, x[1]).second;
  return g;
}

double InitialState::pore_pressure(const Point<2>& x) const {
  return gamma_w_ * (head(x) - x[1]);
}

double InitialState::deficit_between(const RetentionCurve& curve,
                                     const Point<2>& x,
                                     double y_low,
                                     double y_high) const {
  // Only above the water table (p0 < 0) does the soil lack water; its edge is a
  // kink of the integrand, found by bisection (p0 falls upward within a layer,
  // where the head is linear with a slope below 1), so that Simpson's rule on 64
  // slices sees a smooth water content.
  const auto p0 = [&](double y) { return pore_pressure(Point<2>(x[0], y)); };
  if (!(y_high > y_low) || !(p0(y_high) < 0.0))
    return 0.0;
  if (p0(y_low) >= 0.0) {
    double wet = y_low, dry = y_high;
    for (int i = 0; i < 60; ++i) {
      const double mid = 0.5 * (wet + dry);
      (p0(mid) >= 0.0 ? wet : dry) = mid;
    }
    y_low = dry;
  }
  constexpr int n = 64;
  const double h = (y_high - y_low) / n;
  double sum = 0.0;
  for (int i = 0; i <= n; ++i) {
    const Point<2> at(x[0], y_low + i * h);
    const double lacking =
        curve.saturated_content - curve.at(pore_pressure(at) / gamma_w_).content;
    sum += lacking * (i == 0 || i == n ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0));
  }
  return gamma_w_ * sum * h / 3.0;
}

double InitialState::vertical_total_stress(const Point<2>& x,
                                           types::material_id region) const {
  // The saturated unit weights, less the water a soil with a retention curve does
  // not hold above its water table.
  if (weight_knots_.empty()) { // a user's mesh: the local soil over the full depth
    const auto& curve = region_retention_.at(region);
    return region_unit_weight_.at(region) * std::max(0.0, top_ - x[1]) -
           (curve ? deficit_between(*curve, x, x[1], top_) : 0.0);
  }
  double stress = 0.0;
  for (std::size_t k = 0; k < weight_knots_.size(); ++k) {
    const double layer_top = weight_knots_[k].first;
    const double layer_bottom =
        k + 1 < weight_knots_.size() ? weight_knots_[k + 1].first : -1e300;
    if (x[1] >= layer_top)
      break;
    const double from = std::max(x[1], layer_bottom);
    stress += weight_knots_[k].second * (layer_top - from);
    if (layer_retention_[k])
      stress -= deficit_between(*layer_retention_[k], x, from, layer_top);
  }
  return stress;
}

SymmetricTensor<2, 3> InitialState::effective_stress(const Point<2>& x,
                                                     types::material_id region) const {
  const double p = pore_pressure(x);
  const auto& curve = region_retention_.at(region);
  const double chi = curve && p < 0.0 ? curve->at(p / gamma_w_).saturation : 1.0;
  const double vertical = vertical_total_stress(x, region) - chi * p;
  SymmetricTensor<2, 3> sigma;
  sigma[1][1] = -vertical;
  sigma[0][0] = sigma[2][2] = -region_k0_.at(region) * vertical;
  return sigma;
}

SymmetricTensor<2, 3>
InitialState::start_effective_stress(const Point<2>& x, types::material_id region) const {
  return gravity_loading_ ? SymmetricTensor<2, 3>() : effective_stress(x, region);
}

InitialFields InitialState::fields() const {
  InitialFields f;
  f.head = [this](const Point<2>& x) { return head(x); };
  f.head_gradient = [this](const Point<2>& x) { return head_gradient(x); };
  f.effective_stress = [this](const Point<2>& x, types::material_id r) {
    return start_effective_stress(x, r);
  };
  return f;
}

} // namespace settlewell::model

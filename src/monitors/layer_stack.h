#pragma once

// Private to src/monitors: the horizontal layers of a section or box.
#include "settlewell/scenario/scenario.h"

#include <algorithm>
#include <vector>

namespace settlewell::monitors {

/// The layers of a section or box (nullptr for a user's mesh).
inline const std::vector<scenario::Layer>* layers_of(const scenario::Scenario& s) {
  return s.section ? &s.section->layers : (s.box ? &s.box->layers : nullptr);
}

/// The base of a section or box model, m.
inline double model_base(const scenario::Scenario& s) {
  return s.section ? s.section->bottom : s.box->bottom;
}

/// The layer that holds elevation y (the lowest for y at or below its top).
inline const scenario::Layer& layer_at(const std::vector<scenario::Layer>& layers,
                                       double y) {
  for (std::size_t k = 0; k + 1 < layers.size(); ++k)
    if (y > layers[k + 1].top)
      return layers[k];
  return layers.back();
}

/// The bottom of layer k: the next layer's top, or the model base.
inline double
bottom_of(const std::vector<scenario::Layer>& layers, std::size_t k, double base) {
  return k + 1 < layers.size() ? layers[k + 1].top : base;
}

/// The integral of a per-layer quantity over elevation between `from` and `to`.
template <typename F>
double integrate_layers(const std::vector<scenario::Layer>& layers,
                        double base,
                        double from,
                        double to,
                        F per_layer) {
  double total = 0.0;
  for (std::size_t k = 0; k < layers.size(); ++k) {
    const double top = std::min(layers[k].top, to);
    const double bottom = std::max(bottom_of(layers, k, base), from);
    if (top > bottom)
      total += per_layer(layers[k]) * (top - bottom);
  }
  return total;
}

} // namespace settlewell::monitors

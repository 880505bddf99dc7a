#include "settlewell/physics/resolved_conditions.h"

#include "settlewell/core/errors.h"

#include <algorithm>
#include <map>
#include <set>

namespace settlewell {

namespace {

FieldFunction excess_from(const HydraulicCondition& c, const BiotSetup& setup) {
  const double gw = setup.gamma_w;
  const auto h0 = setup.initial_head;
  const FieldFunction value = c.value;
  if (c.kind == HydraulicCondition::Kind::head)
    return
        [=](const dealii::Point<2>& x, double t) { return gw * (value(x, t) - h0(x)); };
  // pore pressure: p0 = gamma_w (h0 - y)
  return [=](const dealii::Point<2>& x, double t) {
    return value(x, t) - gw * (h0(x) - x[1]);
  };
}

/// A one-way line's absolute pore pressure, at least zero (atmospheric above the
/// water it holds).
FieldFunction held_pressure_from(const HydraulicCondition& c, double gw) {
  const FieldFunction value = c.value;
  if (c.kind == HydraulicCondition::Kind::head)
    return [=](const dealii::Point<2>& x, double t) {
      return std::max(0.0, gw * (value(x, t) - x[1]));
    };
  return [=](const dealii::Point<2>& x, double t) { return std::max(0.0, value(x, t)); };
}

ExcessPressureBoundary
one_way_line(const HydraulicCondition& c, const BiotSetup& setup, LineRef line) {
  const double gw = setup.gamma_w;
  const auto h0 = setup.initial_head;
  const FieldFunction held = held_pressure_from(c, gw);
  return {std::move(line),
          [=](const dealii::Point<2>& x, double t) {
            return held(x, t) - gw * (h0(x) - x[1]);
          },
          c.window, c.exchange, held};
}

LineRef line_of(const std::string& name, const Mesh& mesh) {
  if (mesh.names.has_boundary(name))
    return {name, false, mesh.names.boundary_id(name)};
  if (mesh.internal_lines.count(name))
    return {name, true, 0};
  std::string known;
  for (const auto& b : mesh.names.boundary_names())
    known += (known.empty() ? "" : ", ") + b;
  for (const auto& [line, segments] : mesh.internal_lines)
    known += (known.empty() ? "" : ", ") + line;
  throw InputError("no boundary or internal line named '" + name +
                   "' in the mesh (known: " + known + ")");
}

void resolve_hydraulic(const BiotSetup& setup,
                       const Mesh& mesh,
                       ResolvedConditions& out) {
  std::map<std::string, std::vector<TimeWindow>> seen;
  for (const auto& c : setup.conditions.hydraulic) {
    const LineRef line = line_of(c.boundary, mesh);
    if (!c.value)
      throw InternalError("hydraulic condition on '" + c.boundary + "' has no value");
    for (const auto& w : seen[c.boundary])
      if (w.overlaps(c.window))
        throw InputError("'" + c.boundary +
                         "' has two hydraulic conditions at the same time");
    seen[c.boundary].push_back(c.window);
    const bool one_way = c.exchange != HydraulicCondition::Exchange::both_ways;
    if (one_way && c.kind == HydraulicCondition::Kind::normal_flux)
      throw InternalError("a one-way condition on '" + c.boundary +
                          "' must hold a head or a pore pressure");
    if (c.kind == HydraulicCondition::Kind::normal_flux)
      out.fluxes.push_back({line, c.value, c.window});
    else if (one_way)
      out.pressures.push_back(one_way_line(c, setup, line));
    else
      out.pressures.push_back({line, excess_from(c, setup), c.window, c.exchange, {}});
  }
}

void resolve_mechanical(const BiotSetup& setup,
                        const NameTable& names,
                        ResolvedConditions& out) {
  std::set<std::string> fixed_names, loaded_names;
  for (const auto& c : setup.conditions.mechanical) {
    const auto id = names.boundary_id(c.boundary);
    if (c.kind == MechanicalCondition::Kind::fixed) {
      if (!fixed_names.insert(c.boundary).second)
        throw InputError("boundary '" + c.boundary +
                         "' is fixed twice; give the "
                         "components in one condition");
      out.fixed.push_back({id, c.fixed_components});
      continue;
    }
    if (!c.value)
      throw InternalError("load on boundary '" + c.boundary + "' has no value");
    if (!loaded_names.insert(c.boundary).second)
      throw InputError("boundary '" + c.boundary + "' carries more than one load");
    if (c.kind == MechanicalCondition::Kind::normal_traction) {
      out.tractions.push_back({id, c.value});
    } else {
      if (out.plate)
        throw InputError("only one rigid plate is supported; '" + c.boundary +
                         "' is a second one");
      const FieldFunction f = c.value;
      out.plate = PlateBoundary{id, [f](double t) { return f(dealii::Point<2>(), t); }};
    }
  }
  if (out.plate && fixed_names.count(names.boundary_name(out.plate->id)))
    throw InputError("boundary '" + names.boundary_name(out.plate->id) +
                     "' is both a rigid plate and fixed");
}

void resolve_body_forces(const BiotSetup& setup,
                         const NameTable& names,
                         ResolvedConditions& out) {
  for (const auto& b : setup.conditions.body_forces) {
    const auto id = names.region_id(b.region);
    for (const auto& f : b.components)
      if (!f)
        throw InputError("body force change in region '" + b.region +
                         "' needs both components");
    out.body_forces.emplace_back(id, b.components);
  }
}

} // namespace

dealii::Tensor<1, 2> ResolvedConditions::body_force(dealii::types::material_id region,
                                                    double t) const {
  dealii::Tensor<1, 2> b;
  for (const auto& [id, f] : body_forces)
    if (id == region)
      for (unsigned int d = 0; d < 2; ++d)
        b[d] += f[d](t);
  return b;
}

ResolvedConditions resolve_conditions(const BiotSetup& setup, const Mesh& mesh) {
  ResolvedConditions out;
  resolve_hydraulic(setup, mesh, out);
  resolve_mechanical(setup, mesh.names, out);
  resolve_body_forces(setup, mesh.names, out);
  return out;
}

} // namespace settlewell

#include "settlewell/boundary/conditions.h"

namespace settlewell {

BoundaryConditions& BoundaryConditions::head(const std::string& boundary,
                                             FieldFunction h,
                                             TimeWindow window) {
  hydraulic.push_back({boundary, HydraulicCondition::Kind::head, std::move(h), window});
  return *this;
}

BoundaryConditions& BoundaryConditions::pumped_head(const std::string& boundary,
                                                    FieldFunction h,
                                                    TimeWindow window) {
  hydraulic.push_back({boundary, HydraulicCondition::Kind::head, std::move(h), window,
                       HydraulicCondition::Exchange::pumped});
  return *this;
}

BoundaryConditions& BoundaryConditions::pore_pressure(const std::string& boundary,
                                                      FieldFunction p) {
  hydraulic.push_back(
      {boundary, HydraulicCondition::Kind::pore_pressure, std::move(p), {}});
  return *this;
}

BoundaryConditions& BoundaryConditions::outflow(const std::string& boundary,
                                                FieldFunction q,
                                                TimeWindow window) {
  hydraulic.push_back(
      {boundary, HydraulicCondition::Kind::normal_flux, std::move(q), window});
  return *this;
}

BoundaryConditions& BoundaryConditions::fix(const std::string& boundary, bool x, bool y) {
  mechanical.push_back({boundary, MechanicalCondition::Kind::fixed, {{x, y}}, {}});
  return *this;
}

BoundaryConditions& BoundaryConditions::normal_traction(const std::string& boundary,
                                                        FieldFunction t) {
  mechanical.push_back({boundary,
                        MechanicalCondition::Kind::normal_traction,
                        {{false, false}},
                        std::move(t)});
  return *this;
}

BoundaryConditions& BoundaryConditions::rigid_plate(const std::string& boundary,
                                                    TimeFunction force) {
  mechanical.push_back({boundary,
                        MechanicalCondition::Kind::rigid_plate,
                        {{false, false}},
                        uniform(std::move(force))});
  return *this;
}

} // namespace settlewell

#pragma once

#include "settlewell/physics/biot_problem.h"

#include <memory>
#include <vector>

namespace settlewell::verification {

/// A clay column 1 m wide, top at y = 0, water table at the top initially.
/// Sides: ux = 0, no flow; base: ux = uy = 0, no flow unless drained.
/// The parameters are invented for these checks (a soft clay).
struct ColumnSpec {
  double height = 8.0; ///< m
  double mv = 0.8e-3;  ///< 1/kPa
  double poisson_ratio = 0.3;
  double conductivity = 1.5e-9; ///< m/s
  bool drained_base = false;
  double head_drop = 0.0;    ///< m, at every drained face, applied at t = 0+
  double surface_load = 0.0; ///< kPa, compressive, applied at t = 0+
  unsigned int n_cells = 24; ///< cells over the height
  double growth = 1.0;       ///< cell growth away from the drained face(s)
  AnalysisType analysis = AnalysisType::plane_strain;
  double inner_radius = 2.0; ///< m, the column's inner face when axisymmetric
};

/// The column, its problem and the 1D quantities that go with it.
class ColumnModel {
public:
  ColumnModel(const ColumnSpec& spec, MPI_Comm comm);

  BiotProblem& problem() { return *problem_; }
  double cv() const;             ///< m^2/s
  double drainage_path() const;  ///< Hdr, m
  double initial_excess() const; ///< u0, kPa: gamma_w dh for a head drop, q0 for a load
  double ultimate_settlement() const; ///< mv (gamma_w dh + q0) H, m
  double time_of(double Tv) const {
    return Tv * drainage_path() * drainage_path() / cv();
  }

  double settlement() const; ///< top settlement now, m (positive down)
  /// Excess over the final state, divided by u0, at Z = z/Hdr below the top.
  double excess_ratio(double Z) const;

private:
  ColumnSpec spec_;
  std::unique_ptr<Mesh> mesh_;
  std::unique_ptr<BiotProblem> problem_;
};

} // namespace settlewell::verification

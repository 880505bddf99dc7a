#pragma once

/// Choices shared by several modules (the scenario, the model and the Biot core).
namespace settlewell {

enum class AnalysisType {
  plane_strain, ///< x horizontal, y up, per metre run
  axisymmetric  ///< x is the radius r >= 0, y is z up; integrals over the full circle
};

/// How the linear systems are solved. automatic: direct up to a size limit,
/// iterative above (see BiotSetup::direct_limit).
enum class SolverChoice { automatic, direct, iterative };

} // namespace settlewell

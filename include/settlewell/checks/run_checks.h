#pragma once

#include "settlewell/checks/damage.h"
#include "settlewell/checks/one_d.h"
#include "settlewell/output/samples.h"
#include "settlewell/scenario/scenario.h"

#include <optional>
#include <string>
#include <vector>

/// The engineering checks of a run, evaluated from sampled results (heads,
/// gradients, displacements) at the output times. They read results only.
namespace settlewell::checks {

/// Base stability at one time (plane-strain or axisymmetric section only).
struct BaseStability {
  double time = 0.0;          ///< s
  double exit_gradient = 0.0; ///< largest upward gradient below the base
  double exit_x = 0.0;        ///< where, m
  double critical_gradient = 0.0;
  double piping_factor = 0.0;
  struct Heave {
    std::string side;              ///< "right" or "left"
    double depth = 0.0;            ///< embedment below the excavation level, m
    double mean_excess_head = 0.0; ///< m
    double factor = 0.0;
  };
  std::vector<Heave> heave;
  struct Uplift {
    std::string layer;
    double underside = 0.0;     ///< elevation, m
    double overburden = 0.0;    ///< kPa, from the excavation level down
    double pore_pressure = 0.0; ///< kPa, largest along the underside in the pit
    double factor = 0.0;
  };
  std::vector<Uplift> uplift;
};

/// A neighbour's foundation movement and its damage screening at one time.
struct NeighbourState {
  std::string name;
  double time = 0.0;
  Distortion distortion;
  double principal_strain = 0.0;   ///< Boscardin & Cording (1989)
  std::optional<BeamStrains> beam; ///< Burland (1995), if a height was given
  DamageCategory category;         ///< the more severe of the two routes
};

/// The 1D estimate at a column beside the 2D settlement there.
struct ColumnComparison {
  std::string name;
  double x = 0.0;
  OneDEstimate design; ///< head falls the scenario sets (wells' and boundaries' targets)
  OneDEstimate computed; ///< head falls the 2D model computed at this column
  bool design_known = false;
  double ramp = 0.0;                        ///< s, of the stage that lowers the heads
  std::vector<double> times, settlement_2d; ///< every step
  std::vector<std::string> notes;
};

/// Samples and evaluates every check of a scenario.
class RunChecks {
public:
  /// Collective; `initial_head` is h0(x).
  RunChecks(const BiotProblem& problem,
            const scenario::Scenario& scenario,
            const std::function<double(const dealii::Point<2>&)>& initial_head);

  /// At an output time: base stability and neighbours. Collective.
  void evaluate(const BiotProblem& problem, const Derivation& derivation);
  /// Every step: the 2D settlement of each column. Collective.
  void record_columns(const BiotProblem& problem, const Derivation& derivation);
  /// At the end: the 1D estimates from the final heads. Collective.
  void finish_columns(const BiotProblem& problem, const Derivation& derivation);

  bool has_base_checks() const { return section_ != nullptr; }
  const std::vector<BaseStability>& base_stability() const { return base_; }
  const std::vector<NeighbourState>& neighbours() const { return neighbours_; }
  const std::vector<ColumnComparison>& columns() const { return columns_; }

private:
  BaseStability evaluate_base(const BiotProblem& problem,
                              const Derivation& derivation) const;
  std::vector<ColumnLayer> column_layers() const;

  const scenario::Scenario& scenario_;
  const scenario::Section* section_ = nullptr;
  std::optional<SamplePoints> exit_points_;
  std::vector<std::pair<std::string, std::pair<SamplePoints, SamplePoints>>> prisms_;
  std::vector<std::pair<scenario::Layer, SamplePoints>> uplift_lines_;
  std::vector<SamplePoints> foundations_;
  std::vector<SamplePoints> column_tops_;
  std::vector<SamplePoints> column_layers_mid_;
  std::vector<BaseStability> base_;
  std::vector<NeighbourState> neighbours_;
  std::vector<ColumnComparison> columns_;
  std::vector<double> design_fall_; ///< per layer of the stack, m (NaN: none set)
};

} // namespace settlewell::checks

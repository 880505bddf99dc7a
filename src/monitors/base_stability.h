#pragma once

// Private to src/monitors: the factors of safety of the excavation base at the
// level the pit is dug to, at every output time (checks/base_stability.csv), their
// histories and each stage's least values (results.toml).
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/samples.h"

#include <map>
#include <optional>

namespace settlewell::monitors {

/// A factor of safety at one time: empty when it is not evaluated (the reason is
/// said beside it); +infinity when nothing drives the failure.
using Factor = std::optional<double>;

/// Base stability at one time, with the pit as dug then.
struct BaseState {
  double time = 0.0;               ///< s
  std::optional<double> dig_level; ///< m; empty: not dug yet
  double exit_gradient = 0.0;      ///< largest upward gradient below the floor
  double exit_x = 0.0;             ///< where, m
  double critical_gradient = 0.0;
  Factor piping;
  std::string piping_reason; ///< why piping is not evaluated, if it is dug
  struct Heave {
    std::string side;              ///< "right" or "left"
    double depth = 0.0;            ///< embedment below the dig level, m
    double width = 0.0;            ///< of the prism, m
    double mean_excess_head = 0.0; ///< m
    Factor factor;
  };
  std::vector<Heave> heave; ///< one per wall side
  struct Uplift {
    std::string layer;
    double underside = 0.0;     ///< elevation, m
    double overburden = 0.0;    ///< kPa, from the dig level down
    double pore_pressure = 0.0; ///< kPa, largest along the underside in the pit
    Factor factor;
  };
  std::vector<Uplift> uplift; ///< one per low-permeability layer over a permeable one
};

class BaseStability : public Monitor {
public:
  /// A section, or a mesh file whose pit is dug (mesh_file.excavation_regions):
  /// the pit is then the extent of those regions, the layers under it those a
  /// column through its centre crosses, and the wall the region named "wall"
  /// (without one, heave is not checked and the results say why). Collective.
  explicit BaseStability(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  void at_output_time(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  /// Where the checks sample for one dig level.
  struct Samples {
    std::optional<SamplePoints> exit;
    std::vector<std::pair<SamplePoints, SamplePoints>> prisms; ///< base, top per side
    std::vector<double> prism_widths;
    std::vector<std::optional<SamplePoints>> uplift_lines; ///< per candidate layer
  };
  const Samples& samples_at(double dig_level, const BiotProblem& problem);
  std::optional<double> dig_level_at(double t) const;
  /// The pit's water level at an output time, m.
  double pit_water_level_at(double t) const;
  BaseState evaluate(const RunView& view);
  /// Per stage: the dig level at its end and the least factors of its output times.
  toml::array stage_table(const RunView& view) const;

  /// What the checks need of the pit, from a section or from a user's mesh.
  struct Pit {
    double x0 = 0.0, x1 = 0.0;           ///< the inside of the pit, m
    double ground = 0.0;                 ///< the pit's top, m
    double bottom = 0.0;                 ///< the model base under it, m
    std::optional<double> toe;           ///< the wall toe, m (none: no wall found)
    std::vector<scenario::Layer> layers; ///< under the pit's centre, top down
  };
  static Pit section_pit(const scenario::Scenario& s);
  static Pit mesh_pit(const RunContext& run, std::vector<std::string>& sides);

  const scenario::Scenario& scenario_;
  Pit pit_;
  std::vector<std::string> sides_;              ///< sides with a wall
  std::vector<std::size_t> uplift_layers_;      ///< layer index of each candidate
  std::vector<std::pair<double, double>> digs_; ///< (removal time, dig level)
  std::vector<double> stage_start_;             ///< s, per stage
  std::map<double, Samples> samples_;
  std::vector<BaseState> history_;
  std::optional<CsvFile> table_;
};

} // namespace settlewell::monitors

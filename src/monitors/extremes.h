#pragma once

// Private to src/monitors: the largest settlement and drawdown of the run, inside
// and outside the wall and anywhere (results.toml [summary]), each with where and
// when it was reached; the largest drawdown outside the wall in each region
// (layer); and the largest settlement outside the wall in each stage. When the pit
// is dug, the settlement of the pit surface counts until the first lift and the
// heave of the ground left inside the wall after it.
#include "settlewell/monitors/monitor.h"

#include <deal.II/base/point.h>

#include <cstdint>
#include <map>
#include <string>
#include <unordered_map>

namespace settlewell::monitors {

/// A largest value, and where (the dof's support point and the region of a cell
/// holding it) and when (the first step that reached it) it was found.
struct Located {
  double value = 0.0;
  double x = 0.0, y = 0.0; ///< m
  double time = 0.0;       ///< s
  std::string region;
  /// Keeps `now` (found at `time`) if it is larger.
  void keep_larger(const Located& now, double at);
};
void visit(StateArchive& a, Located& l);

/// The largest of the candidates over every process, and its place when it is
/// clearly larger than `kept` (the maximum so far, the same on every process): only
/// a new maximum is gathered. Of the places whose value is the same maximum, the
/// one with the least x, then y: the same place for any partition. Collective.
Located share_largest(const std::vector<Located>& candidates, MPI_Comm comm, double kept);

class Extremes : public Monitor {
public:
  explicit Extremes(const RunContext& run);
  void visit_state(StateArchive& a) override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  /// Owned dofs of one field with their support points and regions.
  struct Sites {
    std::vector<dealii::types::global_dof_index> dofs;
    std::vector<dealii::Point<2>> points;
    std::vector<std::string> regions;
    void add(dealii::types::global_dof_index dof,
             const dealii::Point<2>& at,
             const std::string& region);
  };
  /// The largest of factor * solution over `sites` of every process (0 if none is
  /// larger), and where when it is clearly larger than `kept`.
  static Located
  largest(const BiotProblem& problem, const Sites& sites, double factor, double kept);
  /// The largest upward displacement of the ground still in the model inside the
  /// wall, over every process, and where.
  Located floor_heave_now(const BiotProblem& problem) const;

  /// The largest suction (minus the absolute pore pressure) at the pressure dofs
  /// of the soil still in the model, and where; `over`: somewhere the analysis
  /// raised it beyond its soil's limit. Collective.
  Located suction_now(const BiotProblem& problem, bool& over) const;
  /// The suction each region's soil holds before it drains, by region id, kPa.
  std::vector<double> suction_limits_;
  /// The start's pore pressure at each locally relevant pressure dof, kPa.
  std::unordered_map<dealii::types::global_dof_index, double> start_pressure_;
  Located suction_;
  double suction_limit_ = 0.0;      ///< kPa
  std::uint64_t suction_steps_ = 0; ///< steps with a suction above the limit

  bool has_wall_zone_ = false;
  double inner_ = 0.0;      ///< half the pit's width, m
  double first_dig_ = -1.0; ///< s; negative: the pit is not dug
  Sites pit_surface_uy_, outside_surface_uy_, all_uy_, outside_p_, all_p_;
  std::map<std::string, Sites> outside_p_by_region_;
  Located floor_heave_, pit_, outside_, anywhere_, drawdown_outside_, drawdown_;
  std::map<std::string, Located> drawdown_outside_by_region_;
  std::vector<double> stage_outside_; ///< per stage, m
};

} // namespace settlewell::monitors

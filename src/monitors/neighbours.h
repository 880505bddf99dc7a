#pragma once

// Private to src/monitors: the movement of every neighbouring building's foundation
// and its damage screening at every output time (checks/neighbours.csv), and the
// worst state of each (results.toml).
#include "settlewell/checks/damage.h"
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/samples.h"

#include <optional>

namespace settlewell::monitors {

/// A neighbour's foundation movement and its damage screening at one time.
struct NeighbourState {
  std::string name;
  double time = 0.0;
  checks::Distortion distortion;
  double principal_strain = 0.0;           ///< Boscardin & Cording (1989)
  std::optional<checks::BeamStrains> beam; ///< Burland (1995), if a height was given
  checks::DamageCategory category;         ///< the more severe of the two routes
};

class Neighbours : public Monitor {
public:
  explicit Neighbours(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  void at_output_time(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  NeighbourState evaluate(std::size_t n, const RunView& view) const;

  const scenario::Scenario& scenario_;
  std::vector<SamplePoints> foundations_;
  std::vector<NeighbourState> history_;
  std::optional<CsvFile> table_;
};

} // namespace settlewell::monitors

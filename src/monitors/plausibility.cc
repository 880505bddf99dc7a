#include "plausibility.h"

#include "dof_values.h"

#include "settlewell/core/units.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/base/mpi.h>
#include <deal.II/dofs/dof_tools.h>

#include <algorithm>
#include <cmath>
#include <iostream>
#include <limits>

namespace settlewell::monitors {

using namespace dealii;

namespace {

/// The model's height (largest minus smallest y of the cells' vertices), m.
double model_height(const Mesh& mesh, MPI_Comm comm) {
  double low = std::numeric_limits<double>::max(), high = -low;
  for (const auto& cell : mesh.triangulation->active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int v : cell->vertex_indices()) {
        low = std::min(low, cell->vertex(v)[1]);
        high = std::max(high, cell->vertex(v)[1]);
      }
  return Utilities::MPI::max(high, comm) + Utilities::MPI::max(-low, comm);
}

} // namespace

Plausibility::Plausibility(const RunContext& run)
    : height_(model_height(run.problem.mesh(), run.problem.communicator()))
    , limit_(0.05 * height_) {
  const IndexSet owned = DoFTools::extract_dofs(run.problem.dof_handler(),
                                                run.problem.layout().displacement_mask());
  displacement_dofs_.assign(owned.begin(), owned.end());
}

std::vector<double> Plausibility::after_step(const RunView& view) {
  const auto& u = view.run.problem.reported_solution();
  double largest = 0.0;
  for (const double x : values_at(u, displacement_dofs_))
    largest = std::max(largest, std::abs(x));
  largest = Utilities::MPI::max(largest, view.comm());
  largest_ = std::max(largest_, largest);
  if (largest > limit_ && steps_over_++ == 0 &&
      Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::cerr << "settlewell: warning: at day " << units::to_days(view.time())
              << " the largest movement, " << largest
              << " m, is more than 5 % of the model's height (" << height_
              << " m): far beyond the small strains the model assumes; check the "
                 "stiffnesses and loads (the run's last lines count such steps)\n";
  return {};
}

void Plausibility::finish(const RunView&, toml::table& results) {
  results.insert_or_assign(
      "plausibility", toml::table{{"largest_movement_m", largest_},
                                  {"movement_limit_m", limit_},
                                  {"steps_over_movement_limit", int64_t(steps_over_)}});
}

void Plausibility::visit_state(StateArchive& a) {
  a.mark("plausibility");
  a& largest_& steps_over_;
}

} // namespace settlewell::monitors

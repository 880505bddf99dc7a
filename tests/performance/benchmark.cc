// Settlewell benchmark: one scenario at one mesh refinement with one solver,
// timing set-up, assembly, factorisation or preconditioner set-up, and solves
// at a constant time step, against the time of one matrix-vector product.
//
//   settlewell_benchmark SCENARIO --refine L --solver direct|iterative [--steps N]
//
// Prints one line "key=value ..." for run_benchmarks.sh to collect. Not a test:
// it measures, it does not pass or fail.
#include "settlewell/core/threads.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/model/schedule.h"
#include "settlewell/physics/biot_problem.h"
#include "settlewell/scenario/parse.h"

#include <CLI/CLI.hpp>
#include <deal.II/base/mpi.h>

#include <chrono>
#include <cstdio>
#include <iostream>
#include <sys/resource.h>

using namespace settlewell;

namespace {

double since(std::chrono::steady_clock::time_point t) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t).count();
}

/// Peak resident memory of all processes together, bytes.
double peak_memory(MPI_Comm comm) {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return dealii::Utilities::MPI::sum(double(usage.ru_maxrss) * 1024.0, comm);
}

} // namespace

int main(int argc, char** argv) {
  setenv("OMP_NUM_THREADS", "1", 0);
  setenv("OPENBLAS_NUM_THREADS", "1", 0);
  CLI::App app{"Settlewell benchmark"};
  std::string file, solver = "direct";
  unsigned int refine = 0, steps = 4;
  double dt_days = 1.0;
  app.add_option("scenario", file)->required()->check(CLI::ExistingFile);
  app.add_option("--refine", refine);
  app.add_option("--solver", solver)->check(CLI::IsMember({"direct", "iterative"}));
  app.add_option("--steps", steps, "steps at a constant dt after the first");
  app.add_option("--dt-days", dt_days);
  CLI11_PARSE(app, argc, argv);
  int petsc_argc = 1;
  dealii::Utilities::MPI::MPI_InitFinalize mpi(petsc_argc, argv, 1);
  settlewell::limit_blas_threads();
  const MPI_Comm comm = MPI_COMM_WORLD;
  const bool root = dealii::Utilities::MPI::this_mpi_process(comm) == 0;

  auto scenario = scenario::read_scenario(file);
  scenario.numerics.refinements = refine;
  const auto start = std::chrono::steady_clock::now();
  const Mesh mesh = make_scenario_mesh(scenario, comm);
  const model::InitialState initial(scenario, mesh);
  const model::Schedule schedule(scenario);
  auto model = model::build_model(scenario, mesh, initial, schedule);
  model.setup.solver =
      solver == "direct" ? SolverChoice::direct : SolverChoice::iterative;
  BiotProblem problem(mesh, model.setup);
  const double setup_s = since(start);

  // The first step assembles the matrix and factorises it (or sets up the
  // preconditioner); the next ones reuse it, as equal steps do in a run.
  const double dt = units::days(dt_days);
  const StepReport first = problem.advance_to(dt);
  double assembly = 0.0, solve = 0.0, iterations = 0.0;
  for (unsigned int n = 2; n <= steps + 1; ++n) {
    const StepReport r = problem.advance_to(n * dt);
    assembly += r.assembly_seconds / steps;
    solve += r.solve_seconds / steps;
    iterations += double(r.iterations) / steps;
  }
  const double matvec = problem.time_matrix_vector_product(20);
  const double memory = peak_memory(comm);
  const double dofs = double(problem.dof_handler().n_dofs());
  if (root)
    std::printf("solver=%s processes=%u refine=%u cells=%zu dofs=%.0f setup_s=%.3f "
                "first_assembly_s=%.3f factor_s=%.3f first_solve_s=%.3f assembly_s=%.4f "
                "solve_s=%.4f iterations=%.1f matvec_s=%.6f step_over_matvec=%.1f "
                "peak_memory_MB=%.1f bytes_per_dof=%.0f\n",
                solver.c_str(), dealii::Utilities::MPI::n_mpi_processes(comm), refine,
                std::size_t(mesh.triangulation->n_global_active_cells()), dofs, setup_s,
                first.assembly_seconds, first.factorisation_seconds, first.solve_seconds,
                assembly, solve, iterations, matvec, (assembly + solve) / matvec,
                memory / 1e6, memory / dofs);
  return 0;
}

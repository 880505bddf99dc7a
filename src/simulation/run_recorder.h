#pragma once

// Private to src/simulation: everything a run writes, step by step.
#include "run_extremes.h"

#include "settlewell/checks/run_checks.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/output/field_writer.h"
#include "settlewell/output/samples.h"
#include "settlewell/simulation/run_files.h"

#include <toml++/toml.h>

#include <memory>
#include <optional>

namespace settlewell {

/// The initial state in the form the output module takes.
InitialFields initial_fields(const model::InitialState& initial);

/// What a run reads while it records (all owned by the simulation).
struct RunContext {
  const scenario::Scenario& scenario;
  const model::Schedule& schedule;
  const model::Model& model;
  const model::InitialState& initial;
  const BiotProblem& problem;
  const Derivation& derivation;
  const SamplePoints& points;
  const std::vector<SamplePoints>& lines;
  MPI_Comm comm;
  std::string started; ///< UTC, ISO 8601
};

/// Writes the run folder: fields and profiles at output times, points, steps,
/// discharges and water balance every step, the checks, and at the end the
/// 1D-against-2D comparison and results.toml.
class RunRecorder {
public:
  RunRecorder(const RunContext& context, const std::string& folder);
  ~RunRecorder();

  void start();                                            ///< t = 0
  void step(const StepReport& report, std::size_t number); ///< after each step
  void finish(RunSummary& summary);                        ///< after the last step

private:
  void write_samples(const std::string& stage);
  void write_output_time();
  std::vector<double> discharges_and_balance(const StepReport& report, std::size_t stage);

  RunContext c_;
  std::string folder_;
  FieldWriter fields_;
  CsvFile steps_, points_;
  std::vector<CsvFile> profiles_;
  std::unique_ptr<CsvFile> base_table_, neighbour_table_;
  RunExtremes extremes_;
  checks::RunChecks checks_;
  RunSummary partial_;
  bool warned_balance_ = false;
};

/// results.toml: the headline numbers and every check, for reports and scripts.
void write_results(const std::string& path,
                   const RunContext& context,
                   const RunSummary& summary,
                   const checks::RunChecks& checks);

/// The inputs as the report shows them: materials, geometry, boundaries, stages.
toml::table inputs_table(const scenario::Scenario& s,
                         const Mesh& mesh,
                         const model::Schedule& schedule);

/// one_d/<column>.csv: the 2D settlement and the 1D estimates over time.
void write_column_tables(const std::string& folder,
                         const checks::RunChecks& checks,
                         MPI_Comm comm);

} // namespace settlewell

#pragma once

#include "settlewell/verification/check_row.h"

#include <mpi.h>

#include <string>
#include <vector>

namespace settlewell::verification {

struct CaseSettings {
  /// When not empty, each case writes its fields (VTU per report time + PVD) into
  /// <vtk_directory>/<case name>/.
  std::string vtk_directory;
};

/// A verification case: a model of a published problem, run at a quick setting,
/// and its comparisons with the published solution.
struct VerificationCase {
  std::string name;
  std::string summary;
  std::vector<CheckRow> (*run)(const CaseSettings& settings, MPI_Comm comm);
};

const std::vector<VerificationCase>& all_cases();
/// Throws InputError listing the case names if `name` is unknown.
const VerificationCase& find_case(const std::string& name);

// The cases, one file each under src/verification/.
std::vector<CheckRow> run_terzaghi_head_drop_double(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_terzaghi_head_drop_single(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_terzaghi_surface_load(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_terzaghi_axisymmetric(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_mandel(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_thiem(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_theis(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_convergence(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_harr(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_excavation_column(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_gravity_start(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_drained_formation(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_strip_excavation(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_cam_clay_paths(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_cam_clay_column(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_davis_raymond(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_unsaturated_infiltration(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_lowered_water_table(const CaseSettings&, MPI_Comm);
std::vector<CheckRow> run_seepage_face_bank(const CaseSettings&, MPI_Comm);

} // namespace settlewell::verification

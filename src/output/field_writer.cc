#include "settlewell/output/field_writer.h"

#include "settlewell/core/file_writing.h"
#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>
#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <filesystem>
#include <fstream>
#include <iomanip>
#include <sstream>

namespace settlewell {

using namespace dealii;

namespace {

/// Fields derived point by point from the primary unknowns (see DerivedState).
/// The movements (settlement, volumetric strain) come from the displacement
/// reported, the state (heads, pressures, stresses, flow) from the solution: when
/// displacements are reported from a reference the two are different vectors, each
/// with its own instance.
class DerivedFields : public DataPostprocessor<2> {
public:
  enum class Part { all, movement, state };
  DerivedFields(const Derivation& derivation, Part part)
      : derivation_(derivation) {
    using namespace DataComponentInterpretation;
    const std::vector<Field> fields{
        {"settlement", true, component_is_scalar,
         [](const DerivedState& d) { return d.settlement; }},
        {"hydraulic_head", false, component_is_scalar,
         [](const DerivedState& d) { return d.head; }},
        {"drawdown", false, component_is_scalar,
         [](const DerivedState& d) { return d.drawdown; }},
        {"pore_pressure", false, component_is_scalar,
         [](const DerivedState& d) { return d.pore_pressure; }},
        {"mean_effective_stress", false, component_is_scalar,
         [](const DerivedState& d) { return d.mean_effective_stress; }},
        {"deviator_stress", false, component_is_scalar,
         [](const DerivedState& d) { return d.deviator_stress; }},
        {"vertical_effective_stress", false, component_is_scalar,
         [](const DerivedState& d) { return d.vertical_effective_stress; }},
        {"volumetric_strain", true, component_is_scalar,
         [](const DerivedState& d) { return d.volumetric_strain; }},
        {"effective_stress_out_of_plane", false, component_is_scalar,
         [](const DerivedState& d) { return d.effective_stress[2][2]; }},
        {"darcy_flux", false, component_is_part_of_vector,
         [](const DerivedState& d) { return d.darcy_flux[0]; }},
        {"darcy_flux", false, component_is_part_of_vector,
         [](const DerivedState& d) { return d.darcy_flux[1]; }},
        {"effective_stress", false, component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[0][0]; }},
        {"effective_stress", false, component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[0][1]; }},
        {"effective_stress", false, component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[0][1]; }},
        {"effective_stress", false, component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[1][1]; }}};
    for (const auto& f : fields)
      if (part == Part::all || (part == Part::movement) == f.movement)
        fields_.push_back(f);
  }

  void evaluate_vector_field(const DataPostprocessorInputs::Vector<2>& in,
                             std::vector<Vector<double>>& out) const override {
    const auto cell = in.template get_cell<2>();
    for (unsigned int q = 0; q < in.solution_values.size(); ++q) {
      const DerivedState d =
          derivation_.at(in.evaluation_points[q], cell->material_id(),
                         in.solution_values[q], in.solution_gradients[q]);
      for (unsigned int c = 0; c < fields_.size(); ++c)
        out[q][c] = fields_[c].value(d);
    }
  }
  std::vector<std::string> get_names() const override {
    std::vector<std::string> names;
    for (const auto& f : fields_)
      names.push_back(f.name);
    return names;
  }
  std::vector<DataComponentInterpretation::DataComponentInterpretation>
  get_data_component_interpretation() const override {
    std::vector<DataComponentInterpretation::DataComponentInterpretation> kinds;
    for (const auto& f : fields_)
      kinds.push_back(f.kind);
    return kinds;
  }
  UpdateFlags get_needed_update_flags() const override {
    return update_values | update_gradients | update_quadrature_points;
  }

private:
  struct Field {
    std::string name;
    bool movement;
    DataComponentInterpretation::DataComponentInterpretation kind;
    double (*value)(const DerivedState&);
  };
  const Derivation& derivation_;
  std::vector<Field> fields_;
};

} // namespace

FieldWriter::FieldWriter(std::string directory,
                         std::string basename,
                         MPI_Comm comm,
                         std::optional<InitialFields> initial)
    : directory_(std::move(directory))
    , basename_(std::move(basename))
    , comm_(comm)
    , initial_(std::move(initial)) {
  if (Utilities::MPI::this_mpi_process(comm_) == 0)
    std::filesystem::create_directories(directory_);
  MPI_Barrier(comm_);
}

std::string FieldWriter::series_path() const {
  return directory_ + "/" + basename_ + ".pvd";
}

std::string FieldWriter::write(const BiotProblem& problem) {
  DataOut<2> data_out;
  data_out.attach_dof_handler(problem.dof_handler());
  // The cells of this process that are in the model (excavated ones are not shown).
  data_out.set_cell_selection([&problem](const Triangulation<2>::cell_iterator& cell) {
    return cell->is_active() && cell->is_locally_owned() &&
           !problem.is_removed(cell->active_cell_index());
  });
  std::vector<std::string> names{"displacement", "displacement", "excess_pore_pressure"};
  std::vector<DataComponentInterpretation::DataComponentInterpretation> kinds{
      DataComponentInterpretation::component_is_part_of_vector,
      DataComponentInterpretation::component_is_part_of_vector,
      DataComponentInterpretation::component_is_scalar};
  const auto& moved = problem.reported_solution();
  data_out.add_data_vector(moved, names, DataOut<2>::type_dof_data, kinds);
  const Derivation derivation(
      problem, initial_ ? *initial_ : InitialFields::from_setup(problem.setup()));
  using Part = DerivedFields::Part;
  const bool one_vector = &moved == &problem.solution();
  const DerivedFields movement(derivation, one_vector ? Part::all : Part::movement),
      state(derivation, Part::state);
  data_out.add_data_vector(moved, movement);
  if (!one_vector)
    data_out.add_data_vector(problem.solution(), state);

  const auto& tria = problem.dof_handler().get_triangulation();
  Vector<float> region(tria.n_active_cells());
  for (const auto& cell : tria.active_cell_iterators())
    if (cell->is_locally_owned())
      region[cell->active_cell_index()] = cell->material_id();
  data_out.add_data_vector(region, "region");
  Vector<float> subdomain(tria.n_active_cells());
  subdomain = static_cast<float>(Utilities::MPI::this_mpi_process(comm_));
  data_out.add_data_vector(subdomain, "process");
  data_out.build_patches(problem.mapping(), FieldLayout::displacement_degree);

  DataOutBase::VtkFlags flags;
  flags.time = units::to_days(problem.time());
  flags.write_higher_order_cells = true;
  // zlib's best compression took a fifth of the demo's run for files about 10 %
  // smaller than its fastest level gives.
  flags.compression_level = DataOutBase::VtkFlags::best_speed;
  data_out.set_flags(flags);

  const unsigned int counter = series_.size();
  std::string file;
  if (Utilities::MPI::n_mpi_processes(comm_) == 1) {
    std::ostringstream name;
    name << basename_ << '_' << std::setw(4) << std::setfill('0') << counter << ".vtu";
    file = name.str();
    write_whole_file(directory_ + "/" + file,
                     [&](std::ostream& out) { data_out.write_vtu(out); });
  } else {
    file = data_out.write_vtu_with_pvtu_record(directory_ + "/", basename_, counter,
                                               comm_, 4, 0);
  }
  series_.emplace_back(units::to_days(problem.time()), file);
  if (Utilities::MPI::this_mpi_process(comm_) == 0) {
    write_whole_file(series_path(), [&](std::ostream& pvd) {
      DataOutBase::write_pvd_record(pvd, series_);
    });
  }
  return directory_ + "/" + file;
}

void visit(StateArchive& a, FieldWriter& writer) {
  a& writer.series_;
}

} // namespace settlewell

#include "settlewell/output/field_writer.h"

#include "settlewell/core/file_writing.h"
#include "settlewell/core/units.h"
#include "settlewell/core/vtu_extras.h"

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

std::string number(unsigned int n, unsigned int digits) {
  std::ostringstream os;
  os << std::setw(digits) << std::setfill('0') << n;
  return os.str();
}

/// Fields derived point by point from the primary unknowns (see DerivedState).
/// The movements (settlement, volumetric strain) come from the displacement
/// reported, the state (heads, pressures, stresses, flow) from the solution: when
/// displacements are reported from a reference the two are different vectors, each
/// with its own instance.
class DerivedFields : public DataPostprocessor<2> {
public:
  enum class Part { all, movement, state };
  DerivedFields(const Derivation& derivation, Part part, bool clays, bool unsaturated)
      : derivation_(derivation) {
    using namespace DataComponentInterpretation;
    const std::vector<Field> fields{
        {"settlement", "m, positive downward", true, component_is_scalar,
         [](const DerivedState& d) { return d.settlement; }},
        {"hydraulic_head", "m", false, component_is_scalar,
         [](const DerivedState& d) { return d.head; }},
        {"drawdown", "m, positive when heads fall", false, component_is_scalar,
         [](const DerivedState& d) { return d.drawdown; }},
        {"pore_pressure", "kPa, absolute, compression positive", false,
         component_is_scalar, [](const DerivedState& d) { return d.pore_pressure; }},
        {"mean_effective_stress", "kPa, compression positive", false, component_is_scalar,
         [](const DerivedState& d) { return d.mean_effective_stress; }},
        {"deviator_stress", "kPa", false, component_is_scalar,
         [](const DerivedState& d) { return d.deviator_stress; }},
        {"vertical_effective_stress", "kPa, compression positive", false,
         component_is_scalar,
         [](const DerivedState& d) { return d.vertical_effective_stress; }},
        {"volumetric_strain", "1 (dimensionless), tension positive", true,
         component_is_scalar, [](const DerivedState& d) { return d.volumetric_strain; }},
        {"effective_stress_out_of_plane", "kPa, tension positive", false,
         component_is_scalar,
         [](const DerivedState& d) { return d.effective_stress[2][2]; }},
        {"darcy_flux", "m/s", false, component_is_part_of_vector,
         [](const DerivedState& d) { return d.darcy_flux[0]; }},
        {"darcy_flux", "m/s", false, component_is_part_of_vector,
         [](const DerivedState& d) { return d.darcy_flux[1]; }},
        {"effective_stress", "kPa, absolute, tension positive", false,
         component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[0][0]; }},
        {"effective_stress", "kPa, absolute, tension positive", false,
         component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[0][1]; }},
        {"effective_stress", "kPa, absolute, tension positive", false,
         component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[0][1]; }},
        {"effective_stress", "kPa, absolute, tension positive", false,
         component_is_part_of_tensor,
         [](const DerivedState& d) { return d.effective_stress[1][1]; }}};
    const std::vector<Field> clay_fields{
        {"yield_size", "kPa, p'c of the Cam Clay yield ellipse, mean over the cell",
         false, component_is_scalar, [](const DerivedState& d) { return d.yield_size; }},
        {"yield_ratio",
         "-, p'c over the ellipse through the stress: 1 yielding, above 1 inside, "
         "mean over the cell",
         false, component_is_scalar,
         [](const DerivedState& d) { return d.yield_ratio; }}};
    const std::vector<Field> unsaturated_fields{
        {"degree_of_saturation", "-, S_r from the retention curve", false,
         component_is_scalar, [](const DerivedState& d) { return d.saturation; }},
        {"suction", "kPa, max(0, -pore pressure)", false, component_is_scalar,
         [](const DerivedState& d) { return d.suction; }}};
    for (const auto* list : {&fields, &clay_fields, &unsaturated_fields})
      for (const auto& f : *list)
        if ((list == &fields || (list == &clay_fields && clays) ||
             (list == &unsaturated_fields && unsaturated)) &&
            (part == Part::all || (part == Part::movement) == f.movement))
          fields_.push_back(f);
  }

  void evaluate_vector_field(const DataPostprocessorInputs::Vector<2>& in,
                             std::vector<Vector<double>>& out) const override {
    const auto cell = in.template get_cell<2>();
    for (unsigned int q = 0; q < in.solution_values.size(); ++q) {
      const DerivedState d = derivation_.at(
          in.evaluation_points[q], cell, in.solution_values[q], in.solution_gradients[q]);
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
  /// "name: unit" for each field, once.
  std::vector<std::string> units() const {
    std::vector<std::string> out;
    for (std::size_t c = 0; c < fields_.size(); ++c)
      if (c == 0 || fields_[c].name != fields_[c - 1].name)
        out.push_back(fields_[c].name + ": " + fields_[c].unit);
    return out;
  }
  UpdateFlags get_needed_update_flags() const override {
    return update_values | update_gradients | update_quadrature_points;
  }

private:
  struct Field {
    std::string name;
    std::string unit;
    bool movement;
    DataComponentInterpretation::DataComponentInterpretation kind;
    double (*value)(const DerivedState&);
  };
  const Derivation& derivation_;
  std::vector<Field> fields_;
};

/// Per cell, in DataOut's order (the selected active cells, level by level): the
/// region's id and name and the owning process; for the whole file: the region
/// names and the fields' units.
VtuExtras annotations(const BiotProblem& problem,
                      MPI_Comm comm,
                      std::vector<std::string> field_units) {
  const auto& names = problem.mesh().names;
  const int rank = static_cast<int>(Utilities::MPI::this_mpi_process(comm));
  VtuExtras extras;
  extras.cell_integers = {{"region", {}}, {"process", {}}};
  extras.cell_texts = {{"region_name", {}}};
  for (const auto& cell : problem.dof_handler().active_cell_iterators())
    if (cell->is_locally_owned() && !problem.is_removed(cell->active_cell_index())) {
      extras.cell_integers[0].values.push_back(cell->material_id());
      extras.cell_integers[1].values.push_back(rank);
      extras.cell_texts[0].values.push_back(names.region_name(cell->material_id()));
    }
  std::vector<std::string> regions;
  for (const auto& name : names.region_names())
    regions.push_back(std::to_string(names.region_id(name)) + ": " + name);
  extras.field_texts = {{"region_names", regions}, {"units", std::move(field_units)}};
  return extras;
}

/// One VTU file (one process), or a piece per process and a PVTU record written by
/// rank 0, named `stem`.vtu or `stem`.R.vtu and `stem`.pvtu in `directory`.
/// Returns the name of the file that stands for this time.
std::string write_pieces(const DataOut<2>& data_out,
                         const VtuExtras& extras,
                         const std::string& directory,
                         const std::string& stem,
                         MPI_Comm comm) {
  auto write_vtu = [&](const std::string& file) {
    std::ostringstream vtu;
    data_out.write_vtu(vtu);
    write_whole_file(directory + "/" + file, [&](std::ostream& out) {
      out << with_vtu_extras(vtu.str(), extras);
    });
  };
  const unsigned int n = Utilities::MPI::n_mpi_processes(comm);
  if (n == 1) {
    write_vtu(stem + ".vtu");
    return stem + ".vtu";
  }
  const unsigned int digits = Utilities::needed_digits(n - 1);
  const unsigned int rank = Utilities::MPI::this_mpi_process(comm);
  write_vtu(stem + "." + number(rank, digits) + ".vtu");
  if (rank == 0) {
    std::vector<std::string> pieces;
    for (unsigned int r = 0; r < n; ++r)
      pieces.push_back(stem + "." + number(r, digits) + ".vtu");
    std::ostringstream record;
    data_out.write_pvtu_record(record, pieces);
    write_whole_file(directory + "/" + stem + ".pvtu", [&](std::ostream& out) {
      out << with_pvtu_extras(record.str(), extras);
    });
  }
  return stem + ".pvtu";
}

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
  const bool clays = problem.has_clays();
  const bool unsaturated = !problem.setup().unsaturated.empty();
  const DerivedFields movement(derivation, one_vector ? Part::all : Part::movement, clays,
                               unsaturated),
      state(derivation, Part::state, clays, unsaturated);
  data_out.add_data_vector(moved, movement);
  if (!one_vector)
    data_out.add_data_vector(problem.solution(), state);

  data_out.build_patches(problem.mapping(), FieldLayout::displacement_degree);

  DataOutBase::VtkFlags flags;
  flags.time = units::to_days(problem.time());
  flags.write_higher_order_cells = true;
  // zlib's best compression took a fifth of the demo's run for files about 10 %
  // smaller than its fastest level gives.
  flags.compression_level = DataOutBase::VtkFlags::best_speed;
  data_out.set_flags(flags);

  std::vector<std::string> field_units{"displacement: m",
                                       "excess_pore_pressure: kPa, change "
                                       "from the initial state, compression "
                                       "positive"};
  for (const auto* fields : {&movement, &state})
    if (fields == &movement || !one_vector)
      for (const auto& u : fields->units())
        field_units.push_back(u);
  const std::string file =
      write_pieces(data_out, annotations(problem, comm_, std::move(field_units)),
                   directory_, basename_ + '_' + number(series_.size(), 4), comm_);
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

#include "neighbours.h"

#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>

#include <filesystem>

namespace settlewell::checks {

static void visit(StateArchive& a, Distortion& d) {
  a& d.max_settlement& d.differential& d.tilt& d.angular_distortion& d.deflection_ratio& d
      .hogging& d.horizontal_strain& d.length;
}
static void visit(StateArchive& a, BeamStrains& b) {
  a& b.bending& b.diagonal;
}
static void visit(StateArchive& a, DamageCategory& c) {
  a& c.category& c.degree& c.crack_width;
}

} // namespace settlewell::checks

namespace settlewell::monitors {

using dealii::Point;
using units::to_days;

namespace {

const std::vector<std::string> csv_header{
    "neighbour",        "time_days", "max_settlement_m",
    "differential_m",   "tilt",      "angular_distortion",
    "deflection_ratio", "hogging",   "horizontal_strain",
    "principal_strain", "category"};

/// The worst state of one neighbour: the highest category, then the largest strain.
const NeighbourState* worst_of(const std::string& name,
                               const std::vector<NeighbourState>& history) {
  const NeighbourState* w = nullptr;
  for (const auto& st : history)
    if (st.name == name && (w == nullptr || st.category.category > w->category.category ||
                            (st.category.category == w->category.category &&
                             st.principal_strain > w->principal_strain)))
      w = &st;
  return w;
}

toml::table worst_table(const scenario::Neighbour& spec,
                        const std::vector<NeighbourState>& history) {
  const NeighbourState& w = *worst_of(spec.name, history);
  double largest_settlement = 0.0, largest_distortion = 0.0, at_end = 0.0;
  for (const auto& st : history)
    if (st.name == spec.name) {
      largest_settlement = std::max(largest_settlement, st.distortion.max_settlement);
      largest_distortion = std::max(largest_distortion, st.distortion.angular_distortion);
      at_end = st.distortion.max_settlement; // the history is in time order
    }
  const auto& d = w.distortion;
  toml::table t{{"name", spec.name},
                {"x_from_m", spec.x_from},
                {"x_to_m", spec.x_to},
                {"foundation_level_m", spec.foundation_level},
                {"largest_settlement_m", largest_settlement},
                {"settlement_at_end_m", at_end},
                {"largest_angular_distortion", largest_distortion},
                {"time_days", to_days(w.time)},
                {"max_settlement_m", d.max_settlement},
                {"differential_m", d.differential},
                {"tilt", d.tilt},
                {"angular_distortion", d.angular_distortion},
                {"deflection_ratio", d.deflection_ratio},
                {"hogging", d.hogging},
                {"horizontal_strain", d.horizontal_strain},
                {"principal_strain", w.principal_strain},
                {"category", w.category.category},
                {"degree", w.category.degree},
                {"crack_width", w.category.crack_width}};
  if (w.beam) {
    t.insert("beam_bending_strain", w.beam->bending);
    t.insert("beam_diagonal_strain", w.beam->diagonal);
  }
  return t;
}

} // namespace

Neighbours::Neighbours(const RunContext& run)
    : scenario_(run.scenario) {
  for (const auto& n : scenario_.neighbours) {
    std::vector<Point<2>> points;
    for (unsigned int i = 0; i < n.samples; ++i)
      points.emplace_back(n.x_from + (n.x_to - n.x_from) * i / (n.samples - 1),
                          n.foundation_level);
    foundations_.emplace_back(run.problem, points, "neighbour '" + n.name + "'");
  }
}

void Neighbours::start(const RunView& view) {
  if (scenario_.neighbours.empty())
    return;
  if (dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::filesystem::create_directories(view.folder + "/checks");
  table_.emplace(view.folder + "/checks/neighbours.csv", csv_header, view.comm());
}

NeighbourState Neighbours::evaluate(std::size_t n, const RunView& view) const {
  const auto& spec = scenario_.neighbours[n];
  const auto values = foundations_[n].evaluate(view.run.problem, view.run.derivation);
  checks::FoundationMovement m;
  for (std::size_t i = 0; i < values.size(); ++i) {
    m.x.push_back(foundations_[n].points()[i][0]);
    m.settlement.push_back(values[i].settlement);
    m.ux.push_back(values[i].ux);
  }
  NeighbourState st;
  st.name = spec.name;
  st.time = view.time();
  st.distortion = checks::distortion(m);
  st.principal_strain = checks::principal_tensile_strain(
      st.distortion.horizontal_strain, st.distortion.angular_distortion);
  double strain = st.principal_strain;
  if (spec.height) {
    st.beam = checks::deep_beam_strains(st.distortion.deflection_ratio,
                                        st.distortion.hogging, st.distortion.length,
                                        *spec.height, st.distortion.horizontal_strain);
    strain = std::max({strain, st.beam->bending, st.beam->diagonal});
  }
  st.category = checks::category_from_strain(strain);
  return st;
}

void Neighbours::at_output_time(const RunView& view) {
  for (std::size_t n = 0; n < foundations_.size(); ++n) {
    const NeighbourState st = evaluate(n, view);
    const auto& d = st.distortion;
    table_->row({to_days(st.time), d.max_settlement, d.differential, d.tilt,
                 d.angular_distortion, d.deflection_ratio, d.hogging ? 1.0 : 0.0,
                 d.horizontal_strain, st.principal_strain, double(st.category.category)},
                {st.name});
    history_.push_back(st);
  }
}

void Neighbours::finish(const RunView&, toml::table& results) {
  if (!scenario_.neighbours.empty()) {
    toml::array worst;
    for (const auto& spec : scenario_.neighbours)
      worst.push_back(worst_table(spec, history_));
    results.insert("neighbours", worst);
  }
  results.insert(
      "neighbour_limits",
      toml::table{{"settlement_m", scenario_.limits.settlement},
                  {"angular_distortion", scenario_.limits.angular_distortion}});
}

static void visit(StateArchive& a, NeighbourState& s) {
  a& s.name& s.time& s.distortion& s.principal_strain& s.beam& s.category;
}

void Neighbours::visit_state(StateArchive& a) {
  a.mark("neighbours");
  a& history_& table_;
}

} // namespace settlewell::monitors

#include "settlewell/verification/case_support.h"

#include "settlewell/mesh/box_mesh.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>

namespace settlewell::verification {

void march(BiotProblem& problem,
           const std::vector<double>& times,
           const std::function<void(const BiotProblem&)>& after_step,
           FieldWriter* writer,
           const std::vector<double>& write_times) {
  if (writer != nullptr)
    writer->write(problem);
  for (const double t : times) {
    problem.advance_to(t);
    if (after_step)
      after_step(problem);
    const bool write_now =
        std::any_of(write_times.begin(), write_times.end(),
                    [t](double w) { return std::abs(w - t) <= 1e-9 * std::abs(w); });
    if (writer != nullptr && write_now)
      writer->write(problem);
  }
}

std::unique_ptr<FieldWriter>
writer_for(const CaseSettings& settings, const std::string& case_name, MPI_Comm comm) {
  if (settings.vtk_directory.empty())
    return nullptr;
  return std::make_unique<FieldWriter>(settings.vtk_directory + "/" + case_name,
                                       case_name, comm);
}

void set_clay_column(BiotSetup& setup,
                     const ClaySkeleton& clay,
                     double conductivity,
                     double unit_weight,
                     const std::function<double(double)>& vertical_start,
                     double k0) {
  PoroelasticMaterial flow;
  flow.youngs_modulus = 5000.0; // the iterative solver's preconditioner's only
  flow.poisson_ratio = clay.parameters.poisson_ratio;
  flow.conductivity_x = flow.conductivity_y = conductivity;
  setup.materials["soil"] = flow;
  setup.clays["soil"] = clay;
  setup.geostatic.unit_weights["soil"] = unit_weight;
  setup.geostatic.effective_stress = [vertical_start, k0](const dealii::Point<2>& x,
                                                          auto) {
    dealii::SymmetricTensor<2, 3> s;
    s[1][1] = -vertical_start(x[1]);
    s[0][0] = s[2][2] = k0 * s[1][1];
    return s;
  };
}

void NewtonOrders::add(const StepReport& step) {
  const auto& r = step.newton_residuals;
  for (std::size_t k = 1; k + 1 < r.size(); ++k)
    if (r[k] < 1e-2 && r[k + 1] > 1e-12)
      orders_.push_back(std::log(r[k + 1] / r[k]) / std::log(r[k] / r[k - 1]));
}

void WaterBalance::add(const BiotProblem& problem, const StepReport& step) {
  const auto storage = problem.storage_change();
  const double out = problem.water_exchange().net_outflow * step.last_dt;
  largest_moved_ = std::max(
      {largest_moved_, storage.gross, problem.water_exchange().gross * step.last_dt});
  worst_ =
      std::max(worst_, std::abs(storage.net + out) / std::max(largest_moved_, 1e-30));
}

CheckRow water_balance_row(const std::string& case_name, double worst) {
  return scaled_row(case_name, "water balance, worst step (over the most water moved)",
                    worst, 0.0, 1.0, 1e-6,
                    "conservation of mass (the mixed form, Celia et al. 1990)");
}

double NewtonOrders::median() const {
  if (orders_.empty())
    return std::numeric_limits<double>::quiet_NaN();
  std::vector<double> sorted = orders_;
  std::nth_element(sorted.begin(), sorted.begin() + sorted.size() / 2, sorted.end());
  return sorted[sorted.size() / 2];
}

void show_newton_order(NewtonSettings& newton) {
  newton.tolerance = 1e-11;
  newton.linear_tolerance = 1e-13;
  newton.carry_trend = false;
}

double crossing_time(const std::vector<double>& t,
                     const std::vector<double>& value,
                     double level) {
  for (std::size_t i = 1; i < t.size(); ++i) {
    if (value[i - 1] < level && value[i] >= level) {
      const double w = (level - value[i - 1]) / (value[i] - value[i - 1]);
      return std::exp((1.0 - w) * std::log(t[i - 1]) + w * std::log(t[i]));
    }
  }
  return std::numeric_limits<double>::quiet_NaN();
}

std::string label(const std::string& name, double value) {
  std::ostringstream os;
  os << name << '=' << value;
  return os.str();
}

} // namespace settlewell::verification

#include "settlewell/verification/cases.h"

#include "settlewell/core/errors.h"

namespace settlewell::verification {

const std::vector<VerificationCase>& all_cases() {
  static const std::vector<VerificationCase> cases{
      {"terzaghi-drop-double", "clay column, head lowered at top and base",
       run_terzaghi_head_drop_double},
      {"terzaghi-drop-single", "clay column, head lowered at the top, base sealed",
       run_terzaghi_head_drop_single},
      {"terzaghi-load", "clay column under a sudden surface load",
       run_terzaghi_surface_load},
      {"terzaghi-axisymmetric", "the head-drop column run axisymmetric",
       run_terzaghi_axisymmetric},
      {"mandel", "Mandel's problem, plane strain, rigid plate", run_mandel},
      {"thiem", "steady drawdown around a well, coupled run", run_thiem},
      {"theis", "transient drawdown around a well, rigid skeleton", run_theis},
      {"convergence", "observed orders in mesh size and time step", run_convergence},
      {"harr",
       "steady seepage under a cutoff wall: discharge, exit gradient, heave prism",
       run_harr},
  };
  return cases;
}

const VerificationCase& find_case(const std::string& name) {
  std::string known;
  for (const auto& c : all_cases()) {
    if (c.name == name)
      return c;
    known += (known.empty() ? "" : ", ") + c.name;
  }
  throw InputError("no verification case named '" + name + "' (known: " + known + ")");
}

} // namespace settlewell::verification

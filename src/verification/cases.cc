#include "settlewell/verification/cases.h"

#include "settlewell/core/errors.h"

namespace settlewell::verification {

const std::vector<VerificationCase>& all_cases() {
  static const std::vector<VerificationCase> cases{
      {"terzaghi-drop-double",
       "head lowered 3.5 m at the top and base of an 8 m clay column: U(Tv) from "
       "Tv = 0.005 to 2, isochrones, t50, ultimate settlement",
       run_terzaghi_head_drop_double},
      {"terzaghi-drop-single", "the same column with its base sealed",
       run_terzaghi_head_drop_single},
      {"terzaghi-load",
       "a sudden 45 kPa surface load on the column: undrained p = q0, U(Tv), "
       "isochrones, t50, ultimate settlement",
       run_terzaghi_surface_load},
      {"terzaghi-axisymmetric",
       "the head-drop column run axisymmetric equals the plane-strain one",
       run_terzaghi_axisymmetric},
      {"mandel",
       "Mandel's problem (plane strain, rigid plate): centre pressure over time with "
       "the Mandel-Cryer rise, plate and side displacement, drained limit",
       run_mandel},
      {"thiem", "steady drawdown differences around a pumped well, fully coupled run",
       run_thiem},
      {"theis",
       "transient drawdown at 5, 20 and 100 m after 0.01, 0.1 and 1 day (rigid "
       "skeleton)",
       run_theis},
      {"convergence",
       "observed orders of the pore pressure in L2 under mesh and time-step "
       "refinement",
       run_convergence},
      {"harr",
       "steady seepage under a cutoff wall at d/T = 0.25 and 0.5: discharge, exit "
       "gradient, Terzaghi's heave-prism head",
       run_harr},
      {"excavation-column",
       "the top 2.4 m of a layered column dug away at once: undrained pore pressure, "
       "the clay's swelling against time, the drained heave of each layer",
       run_excavation_column},
      {"gravity-start",
       "the same column started by a drained gravity-loading solve: stresses against "
       "the K0 state with K0 = nu/(1 - nu), nothing reported as movement; after the "
       "fill is dug, the drained heave and the stresses left",
       run_gravity_start},
      {"drained-formation",
       "steady seepage through a dug column whose floor drains to the pit one way: "
       "upward flow leaves at the pit's pressure, downward drainage seals the floor",
       run_drained_formation},
      {"strip-excavation",
       "a long strip dug 0.05 m into level ground: undrained pore pressure and drained "
       "stress changes below it against the strip-load solution, as an unloading",
       run_strip_excavation},
      {"cam-clay-paths",
       "Modified Cam Clay at one point: undrained and drained triaxial compression "
       "and one-dimensional loading and unloading of a soft clay, against the "
       "model's closed forms and the e-log line",
       run_cam_clay_paths},
      {"cam-clay-column",
       "a Cam Clay column whose heads fall 3 m at both faces: final settlement "
       "against the e-log form, recompression and normally consolidated; Newton's "
       "convergence",
       run_cam_clay_column},
      {"davis-raymond",
       "a Cam Clay column with a permeability change index Ck = Cc under a sudden "
       "load: degree of settlement and pore pressure against Davis & Raymond's "
       "closed form; the observed order under mesh and step refinement",
       run_davis_raymond},
      {"unsaturated-infiltration",
       "rain on a column of Gardner soil 2 m above its water table (rigid skeleton): "
       "pressure head and water taken in against Srivastava & Yeh's closed form, "
       "the water balance, Newton's convergence",
       run_unsaturated_infiltration},
      {"lowered-water-table",
       "a silty sand column whose water table falls 3 m from its top: final settlement "
       "with the soil above the new water table drained along its retention curve, "
       "at its moist weight, under Bishop's stress",
       run_lowered_water_table},
      {"seepage-face-bank",
       "steady flow through a Gardner sand bank from a pond to a ditch, its downstream "
       "face a seepage face: discharge against Dupuit's value (Charny) and the "
       "Kirchhoff integral of the face, no water entering the face",
       run_seepage_face_bank},
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

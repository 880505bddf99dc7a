#pragma once

#include "settlewell/core/types.h"
#include "settlewell/core/units.h"
#include "settlewell/materials/cam_clay.h"
#include "settlewell/materials/poroelastic.h"
#include "settlewell/materials/retention.h"

#include <map>
#include <optional>
#include <string>
#include <vector>

/// A validated scenario in SI units (m, s, kN, kPa). Only src/scenario/ reads
/// files to fill it; every other module takes these plain structs. Defaults are
/// declared once, in the key registry (src/scenario/keys.cc), and set by the parser.
namespace settlewell::scenario {

/// A soil or wall material as the user describes it.
struct Material {
  std::string name;
  double unit_weight = 0.0; ///< saturated, kN/m^3
  double k0 = 0.0;          ///< coefficient of earth pressure at rest
  /// kPa: the suction the soil holds before it drains (unset: checks.suction_limit);
  /// only flags where the saturated model goes beyond it.
  std::optional<double> air_entry_suction;
  /// The soil drains above the water table along this curve (retention not
  /// "none").
  std::optional<RetentionCurve> retention;
  PoroelasticMaterial poroelastic;
  /// What the storage was computed from, when it was given as a porosity.
  struct StorageInputs {
    double porosity = 0.0;
    double water_bulk_modulus = 0.0; ///< kPa
    double grain_bulk_modulus = 0.0; ///< kPa (0: incompressible grains)
  };
  std::optional<StorageInputs> storage_from;
  /// A skeleton that follows Modified Cam Clay (model = "cam_clay"), with the
  /// values the user gave. `poroelastic` then holds its conductivity and storage,
  /// and a stiffness for the iterative solver's preconditioner only.
  struct CamClay {
    CamClayParameters parameters;
    double compression_index = 0.0, recompression_index = 0.0, void_ratio = 0.0;
    double friction_angle = 0.0; ///< phi'cs, degrees
    /// Ck: the conductivity falls tenfold for each Ck of void ratio lost (Taylor
    /// 1948); 0 (not given): it stays.
    double permeability_change_index = 0.0;
    /// How the preconsolidation is given: sigma'p (kPa), OCR, or POP (kPa).
    enum class Past { pressure, ocr, pop } past = Past::ocr;
    /// Its value: a constant, or a profile of (elevation m, value) pairs sorted by
    /// elevation, linear between them and constant beyond the ends.
    double past_value = 1.0;
    std::vector<std::pair<double, double>> past_profile; ///< empty: the constant
    double past_at(double elevation) const;
    /// sigma'p at a point (elevation, m) whose start vertical effective stress is
    /// sigma'v0, kPa.
    double preconsolidation(double vertical_start, double elevation) const;
    /// "POP 25 kPa", "OCR 1.5 at -9 m, 1.2 at -4 m (linear between, constant
    /// beyond)": how the past was given.
    std::string past_text() const;
    /// The oedometer's terms in one line: Cc, Cr, e0, phi'cs, the past, Ck.
    std::string summary() const;
  };
  std::optional<CamClay> cam_clay;
};

struct Layer {
  std::string name; ///< region name (defaults to the material's)
  std::string material;
  double top = 0.0; ///< elevation of the layer's top, m
};

struct Wall {
  double thickness = 0.0; ///< m
  double toe = 0.0;       ///< elevation of the toe, m
  std::string material;
  bool left = false, right = true; ///< sides that have a wall (half model: right only)
  /// A thin zone of soil along both faces, ground to toe, with its own material:
  /// the wall-soil interface as thin-layer elements (Desai et al. 1984). 0: none.
  double interface_thickness = 0.0; ///< m
  std::string interface_material;
};

struct Well {
  std::string name;
  double x = 0.0;      ///< m (plane strain: position of the row of wells)
  double radius = 0.0; ///< m (axisymmetric: the model starts at this radius)
  /// m, plane strain: the distance between the wells of the row (0: not given);
  /// with the radius, it gives the water level in a well (Muskat 1937).
  double spacing = 0.0;
  double screen_top = 0.0; ///< elevation, m
  double screen_bottom = 0.0;
  /// A recharge well may put water into the ground; any other well held at a head
  /// takes water only (its screen is sealed where the ground's head is lower).
  bool recharge = false;
};

struct MeshSizes {
  double near_wall = 0.0; ///< cell size at the wall faces, m
  double near_well = 0.0; ///< cell size at well screens, m
  double far = 0.0;       ///< largest cell size, m
  double growth = 1.0;    ///< ratio of neighbouring cell sizes away from a feature
};

/// A prop (strut) level against the wall's inner face, installed at the start of a
/// stage. In plane strain a spring per metre run; in a shaft a ring (waling).
struct Prop {
  std::string name;
  double level = 0.0;     ///< elevation on the inner wall face, m
  double stiffness = 0.0; ///< plane strain: kN/m per metre run; shaft: ring EA, kN
  double preload = 0.0;   ///< kN per metre run of wall (of circumference in a shaft)
  std::string stage;      ///< installed at this stage's start
};

/// Geometry (a): a parametric excavation section.
struct Section {
  double ground_surface = 0.0;   ///< elevation, m
  double bottom = 0.0;           ///< elevation of the model base, m
  bool half_model = false;       ///< model x >= 0 with a symmetry line at x = 0
  double excavation_width = 0.0; ///< between the inner wall faces, m (shaft: diameter)
  double excavation_depth = 0.0; ///< below the ground surface, m
  double far_distance = 0.0;     ///< from the outer wall face to the far boundary, m
  std::vector<Layer> layers;     ///< top to bottom
  std::optional<Wall> wall;
  std::vector<Well> wells;
  std::vector<Prop> props;
  MeshSizes mesh;
  double excavation_level() const { return ground_surface - excavation_depth; }
};

/// Geometry (b): a box with horizontal layers (columns, simple cases).
/// What the analysis couples: Biot (flow and deformation) or flow alone, the
/// skeleton held rigid (transient seepage with the storage S only).
enum class Coupling { biot, flow_only };

struct Box {
  double x_origin = 0.0;     ///< m: x (or the radius r) of the box's left side
  double width = 0.0;        ///< m
  double bottom = 0.0;       ///< elevation, m
  std::vector<Layer> layers; ///< top to bottom; the first top is the box's top
  unsigned int cells_x = 0;
  double cell_height = 0.0; ///< m
};

/// Geometry (c): a user's Gmsh file; its physical group names are the region and
/// boundary names.
struct MeshFile {
  std::string path;
  std::map<std::string, std::string> region_materials; ///< region -> material
  /// Regions a stage's dig_level takes out (their cells above it), in the order given.
  std::vector<std::string> excavation_regions;
};

struct Groundwater {
  double water_table = 0.0;                  ///< elevation, m
  std::map<std::string, double> layer_heads; ///< piezometric head per layer, m
};

/// A part of a boundary that takes conditions of its own (a river over part of a
/// far boundary or of the ground surface): the faces of `of` whose midpoints lie
/// on `side` (left: x < 0, right: x > 0) and inside the window. The rest of `of`
/// keeps its conditions; what the part does not set, it takes from `of`.
struct BoundaryPart {
  std::string of;
  std::optional<std::string> side;                  ///< "left" or "right"
  std::optional<double> x_from, x_to, y_from, y_to; ///< m
  bool contains(double x, double y) const;
};

/// What holds on a named boundary for the whole analysis (stages may change heads).
struct BoundarySpec {
  /// seepage_face: water leaves at atmospheric pressure where the soil's would be
  /// higher, and none enters.
  enum class Hydraulic { unset, no_flow, fixed_head, seepage_face };
  enum class Mechanical { unset, free, fixed, roller, rigid_plate };
  Hydraulic hydraulic = Hydraulic::unset;
  std::optional<double> head; ///< m; fixed_head without it keeps the initial head
  Mechanical mechanical = Mechanical::unset;
  /// kPa: the mean pressure on a rigid plate, applied at the start and held.
  double plate_pressure = 0.0;
  std::optional<BoundaryPart> part; ///< set when the boundary is a part of another
};

/// A change a stage makes to one controlled item, reached at the end of the ramp.
struct Target {
  enum class Kind { head, discharge };
  Kind kind = Kind::head;
  double value = 0.0; ///< head m, or discharge m^3/s (per metre run, or per well)
};

struct SurfaceLoad {
  std::string boundary;
  double pressure = 0.0; ///< kPa, compressive, on the part x_from..x_to
  double x_from = 0.0, x_to = 0.0;
};

struct TimeSteps {
  double first = 0.0;        ///< s; 0: 1/1000 of the stage
  double growth = 2.0;       ///< ratio of one rung's step to the one before
  unsigned int per_rung = 8; ///< steps of one size (one factorisation)
  double largest = 0.0;      ///< s; 0: 1/40 of the stage, 1/100 of a ramp
};

struct Stage {
  std::string name;
  double duration = 0.0; ///< s
  double ramp = 0.0;     ///< s from the stage start; 0: changes apply at once
  std::map<std::string, Target> wells; ///< by well name
  /// By boundary or line name: a head (m) or a total discharge leaving (m^3/s per
  /// metre run, or in all in axisymmetric; negative: water entering).
  std::map<std::string, Target> boundary_targets;
  std::optional<double> excavation_level_head; ///< m
  std::optional<double> dig_level;       ///< elevation the pit is dug to in this stage, m
  std::optional<double> pit_water_level; ///< elevation of the water in the pit, m
  std::vector<SurfaceLoad> loads;
  TimeSteps steps;
};

struct MonitoringPoint {
  std::string name;
  double x = 0.0, y = 0.0;
};

struct SectionLine {
  std::string name;
  std::vector<std::pair<double, double>> points;
  unsigned int samples = 0;
};

struct Column {
  std::string name;
  double x = 0.0;
};

struct Output {
  std::vector<double> times;  ///< s, extra to the stage ends
  unsigned int per_stage = 0; ///< log-spaced output times inside each stage
  /// The stage from whose start displacements are reported; empty: the start.
  std::string displacements_from;
  std::vector<MonitoringPoint> points;
  std::vector<SectionLine> lines;
  std::vector<Column> columns;
};

/// A neighbouring building whose foundation movement is screened.
struct Neighbour {
  std::string name;
  double x_from = 0.0, x_to = 0.0; ///< m
  double foundation_level = 0.0;   ///< elevation, m
  std::optional<double> height;    ///< m, for the deep-beam strains
  unsigned int samples = 0;
};

/// The thresholds the checks flag against (defaults, in the key registry, are
/// common practice).
struct CheckLimits {
  double piping_factor = 0.0;
  double heave_factor = 0.0;
  double uplift_factor = 0.0;
  double low_permeability = 0.0; ///< m/s: layers at or below consolidate / confine
  double settlement = 0.0;       ///< m
  double angular_distortion = 0.0;
  double mass_balance = 0.0; ///< relative
  double suction = 0.0;      ///< kPa: a saturated soil's suction beyond this is flagged
  double head_rise = 0.0; ///< m: a head rising this much in a lowering stage is flagged
};

/// How the equations are discretised and solved.
struct Numerics {
  unsigned int refinements = 0; ///< global refinements of the generated or read mesh
  SolverChoice solver = SolverChoice::automatic;
  double tolerance = 0.0;    ///< relative residual of the iterative solver
  std::string petsc_options; ///< extra PETSc options, for experts
  /// Lift the bounds on steps and memory (command line --allow-large).
  bool allow_large = false;
};

/// The most time steps a run may take, and the share of the machine's memory its
/// estimate may reach, unless Numerics::allow_large.
inline constexpr double largest_step_count = 200000;
inline constexpr double largest_memory_share = 0.8;

struct Scenario {
  std::string source_path; ///< the file it was read from
  std::string title;
  AnalysisType analysis = AnalysisType::plane_strain;
  Coupling coupling = Coupling::biot;
  double gamma_w = 0.0; ///< kN/m^3
  std::map<std::string, Material> materials;
  std::optional<Section> section;
  std::optional<Box> box;
  std::optional<MeshFile> mesh_file;
  Groundwater groundwater;
  /// The start from a drained gravity-loading solve, not the K0 state.
  bool gravity_loading = false;
  std::map<std::string, BoundarySpec> boundaries;
  std::vector<Stage> stages;
  Output output;
  std::vector<Neighbour> neighbours;
  CheckLimits limits;
  Numerics numerics;
  /// Where keys were given, for messages after parsing: key path -> "FILE:LINE:COL".
  std::map<std::string, std::string> locations;

  double end_time() const;
  /// "FILE:LINE:COL" of a key path if known, else the file name.
  std::string location_of(const std::string& key_path) const;
  /// The names of the boundaries that are parts of others, each after the part it
  /// is a part of (if that is a part too). The parser has refused loops.
  std::vector<std::string> boundary_parts_parents_first() const;
};

} // namespace settlewell::scenario

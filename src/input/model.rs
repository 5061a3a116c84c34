//! The validated model: the design file checked and turned into SI numbers and geometry.
//!
//! Only [`crate::input::validate::file::load`] builds a [`Model`]: it reads the file, parses it
//! ([`crate::input::schema`]) and checks every value against what is physically and practically
//! valid, so the engine never computes on something it would have to question.

use crate::input::units::UnitSystem;
use crate::physics::potential::Aquifer;
use crate::physics::radius;
use geo::Polygon;
use std::path::PathBuf;

/// Default grid spacing of check points inside an outline, m.
pub const DEFAULT_GRID_SPACING: f64 = 2.0;
/// Default contingency on the computed flow (common practice (no source): 50–100 %).
pub const DEFAULT_CONTINGENCY: f64 = 0.5;
/// Length/width ratio from which an outline is treated as a trench (line-slot flow).
pub const DEFAULT_TRENCH_ASPECT: f64 = 3.0;
/// Default well radius when `[wells]` is absent, m (a 300 mm bore; common practice (no source)).
pub const DEFAULT_WELL_RADIUS: f64 = 0.15;
/// Default wellpoint suction limit, m (common practice (no source): 5–6 m below the header).
pub const DEFAULT_SUCTION_LIMIT: f64 = 5.5;
/// Default pump submergence, m (common practice (no source)).
pub const DEFAULT_SUBMERGENCE: f64 = 1.0;

/// Everything the engine computes on.
#[derive(Debug, Clone)]
pub struct Model {
    /// The design file, for messages and relative paths.
    pub file: PathBuf,
    /// Project name.
    pub name: String,
    /// What level 0 means.
    pub datum: String,
    /// Ground level, m.
    pub ground_level: f64,
    /// Grid name (free text) or "local".
    pub grid: String,
    /// The aquifer (in layered ground: the one holding the first excavation's target).
    pub aquifer: Aquifer,
    /// The ground below `aquifer`, when `[[layer]]` entries are given.
    pub layers: Option<crate::input::model_layers::LayeredGround>,
    /// Excavations, at least one.
    pub excavations: Vec<Excavation>,
    /// Radius-of-influence method.
    pub influence: InfluenceMethod,
    /// Contingency f: design flow = (1 + f)·Q.
    pub contingency: f64,
    /// Length/width ratio from which an outline counts as a trench.
    pub trench_aspect_ratio: f64,
    /// Well construction.
    pub wells: WellSpec,
    /// Layout, when given.
    pub layout: Option<LayoutSpec>,
    /// Wells listed in the file.
    pub listed_wells: Vec<ListedWell>,
    /// Straight boundaries.
    pub boundaries: Vec<Boundary>,
    /// Cut-off walls (`[[wall]]`); with a toe inside an aquifer, `layers` holds that aquifer
    /// split at the toe.
    pub walls: Vec<crate::input::model_walls::Wall>,
    /// Keep-out polygons.
    pub keep_outs: Vec<NamedPolygon>,
    /// Neighbouring buildings.
    pub neighbours: Vec<Neighbour>,
    /// Check-point settings.
    pub checks: CheckSettings,
    /// Base-uplift check.
    pub uplift: Option<Uplift>,
    /// Output unit system.
    pub units: UnitSystem,
    /// What the map contours.
    pub map_quantity: MapQuantity,
    /// Wells as they are built: anisotropy, header, well loss, spacing and recharge limits.
    pub as_built: AsBuilt,
    /// Design allowances for `drydig design` and the bid: margin, capacity fraction, one well
    /// out, pumps.
    pub design: DesignSettings,
    /// The pumping programme in time, when given.
    pub programme: Option<Programme>,
    /// The bid's durations and rules of thumb (`[bid]`).
    pub bid: crate::input::model_bid::BidSettings,
    /// A rolling run (`[rolling]`): the trench dug in lengths, when given.
    pub rolling: Option<Rolling>,
    /// Map extent, contour interval and the section line of `[output]`.
    pub output: OutputSettings,
    /// The site's coordinate system (`[site] crs`: an EPSG code or a proj string), when given.
    pub crs: Option<String>,
    /// Warnings about the site CRS at the site (scale factor, local coordinates with a
    /// national grid), printed with every output.
    pub crs_warnings: Vec<String>,
    /// What was done to geometry read from drawings (arcs flattened, units converted).
    pub import_notes: Vec<crate::input::import::notes::ImportNote>,
    /// The unit of the DXF drawing the design file reads (`design.dxf` is written in it);
    /// `None` without one (metres).
    pub drawing_unit: Option<crate::input::import::dxf_in::DrawingUnit>,
    /// The drawings (DXF, GeoJSON) the design file reads geometry from: inputs of the run, listed
    /// in the manifest and never overwritten by an output.
    pub drawings: Vec<std::path::PathBuf>,
    /// `[uncertainty]`: the inputs `drydig uncertainty` samples, when given.
    pub uncertainty: Option<crate::input::model_uncertainty::Uncertainty>,
}

/// Output settings of `[output]` beyond units and map quantity, in SI.
#[derive(Debug, Clone, Default)]
pub struct OutputSettings {
    /// Half-width of the map around the features, m (default: reaches the 0.5 m drawdown
    /// contour or the radius of influence).
    pub map_extent: Option<f64>,
    /// Contour interval, m (default: a round step for the range).
    pub contour_interval: Option<f64>,
    /// Section line `[[x1, y1], [x2, y2]]`, m (default: through the excavation towards the
    /// worst neighbour, or along its longest axis).
    pub section: Option<[[f64; 2]; 2]>,
}

/// Default operating margin below every target that `design` keeps, m (common practice (no
/// source): a few decimetres of reserve for the scatter of K and of levels).
pub const DEFAULT_OPERATING_MARGIN: f64 = 0.3;
/// Default fraction of a well's capacity that `design` lets it run at (common practice (no
/// source): wells are not run at their full capacity; 0.7–0.8 is usual).
pub const DEFAULT_CAPACITY_FRACTION: f64 = 0.8;

/// Design allowances (`[allowances]` and `[pumps]`), in SI.
#[derive(Debug, Clone)]
pub struct DesignSettings {
    /// Depth below every target the design keeps with every well running, m.
    pub operating_margin: f64,
    /// Fraction of each well's capacity (Sichardt and pump) the design may use.
    pub capacity_fraction: f64,
    /// The targets must still hold (at the target itself, without the margin) with any one
    /// well out of service.
    pub one_well_out: bool,
    /// Pumps and pipes.
    pub pumps: PumpSettings,
}

/// Pump selection and pipework (`[pumps]`), in SI.
#[derive(Debug, Clone)]
pub struct PumpSettings {
    /// Standard pump duties to choose from, m³/s, ascending.
    pub duties: Vec<f64>,
    /// Pump efficiency (wire-to-water), 0 < η ≤ 1.
    pub efficiency: f64,
    /// Level the water is pumped up to (discharge), m.
    pub discharge_level: f64,
    /// Internal diameter of each well's riser main, m.
    pub riser_diameter: f64,
    /// Internal diameter of the header main, m.
    pub header_diameter: f64,
    /// Hazen–Williams C of the pipes.
    pub hazen_williams_c: f64,
    /// Running hours a day.
    pub hours_per_day: f64,
    /// Wells whose running rates are within this fraction of the largest in a class share it.
    pub class_tolerance: f64,
    /// Run every well of a class at the class's largest rate (one rate per class).
    pub one_rate_per_class: bool,
    /// Header length served by one wellpoint pump set, m.
    pub wellpoint_set_length: f64,
    /// Wellpoints on one pump set share one rate (`pumps.rates = "per-set"`, the default): a
    /// header runs its wellpoints at one vacuum. `false`: a valve on each wellpoint.
    pub rates_per_set: bool,
}

/// What an excavation's groundwater control must achieve.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Control {
    /// Lower the water to the target level (formation − margin).
    Dewater,
    /// Relieve the confined layer below to the uplift head only; the water table is left.
    Relieve,
    /// Both: the stricter of the two everywhere.
    Both,
}

/// An excavation with its outline and levels.
#[derive(Debug, Clone)]
pub struct Excavation {
    /// Unique name.
    pub name: String,
    /// Outline polygon in site coordinates, m.
    pub outline: Polygon<f64>,
    /// Formation level, m.
    pub formation_level: f64,
    /// Target margin below formation, m.
    pub target_margin: f64,
    /// User's shape choice.
    pub shape: ShapeChoice,
    /// Dewater to a level, relieve only, or both.
    pub control: Control,
    /// Centre line of a trench given in the design file, m (`None`: derived from the outline).
    pub centre_line: Option<Vec<[f64; 2]>>,
}

impl Excavation {
    /// Level the water must be drawn to, m: formation − margin.
    pub fn target_level(&self) -> f64 {
        self.formation_level - self.target_margin
    }
}

/// Whether the excavation is treated as a pit or a trench.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ShapeChoice {
    /// By the outline's length/width ratio.
    Auto,
    /// Equivalent-well method.
    Pit,
    /// Line-slot method.
    Trench,
}

/// How the distance of influence L₀ is found.
#[derive(Debug, Clone)]
pub enum InfluenceMethod {
    /// Sichardt, R = C·s·√K.
    Sichardt {
        /// C for radial flow.
        c_radial: f64,
        /// C for flow to a line.
        c_line: f64,
    },
    /// Kusakin, R = 575·s·√(H·K).
    Kusakin,
    /// Cooper–Jacob, R = √(2.25·T·t/S).
    CooperJacob {
        /// Pumping time, s.
        time: f64,
        /// Storage coefficient used.
        storage: f64,
    },
    /// A fixed distance of influence, m.
    Fixed {
        /// L₀, m.
        distance: f64,
    },
    /// From a pumping test's distance–drawdown line.
    PumpingTest {
        /// Fitted radius of influence of the test well, m.
        radius: f64,
        /// Transmissivity from the same fit, m²/s.
        transmissivity: f64,
    },
}

impl InfluenceMethod {
    /// Name for reports.
    pub fn name(&self) -> &'static str {
        match self {
            InfluenceMethod::Sichardt { .. } => "Sichardt",
            InfluenceMethod::Kusakin => "Kusakin",
            InfluenceMethod::CooperJacob { .. } => "Cooper–Jacob",
            InfluenceMethod::Fixed { .. } => "fixed value",
            InfluenceMethod::PumpingTest { .. } => "pumping test",
        }
    }

    /// Distance of influence L₀, m, for drawdown `s` (m), radial (`line = false`) or to a line.
    pub fn distance(&self, aquifer: &Aquifer, s: f64, line: bool) -> f64 {
        let k = aquifer.conductivity;
        match *self {
            InfluenceMethod::Sichardt { c_radial, c_line } => {
                radius::sichardt(s, k, if line { c_line } else { c_radial })
            }
            InfluenceMethod::Kusakin => {
                radius::kusakin(s, aquifer.initial_saturated_thickness(), k)
            }
            InfluenceMethod::CooperJacob { time, storage } => {
                radius::cooper_jacob_radius(aquifer.transmissivity(), time, storage)
            }
            InfluenceMethod::Fixed { distance } => distance,
            InfluenceMethod::PumpingTest { radius, .. } => radius,
        }
    }
}

/// Well or wellpoint.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum WellKind {
    /// Deep well with a submersible pump.
    DeepWell,
    /// Wellpoint on a suction header.
    Wellpoint,
}

/// Construction of the wells.
#[derive(Debug, Clone)]
pub struct WellSpec {
    /// Deep well or wellpoint.
    pub kind: WellKind,
    /// Radius, m.
    pub radius: f64,
    /// Screen top level, m.
    pub screen_top: f64,
    /// Screen base level, m.
    pub screen_base: f64,
    /// Top of the filter (sand) column round the screen, m: water enters the well over the
    /// filter column (capacity, partial penetration); the screen top when not given.
    pub filter_top: f64,
    /// Base of the filter column, m (the screen base when not given).
    pub filter_base: f64,
    /// Pump intake level, m.
    pub pump_intake: f64,
    /// Submergence kept above the intake, m.
    pub submergence: f64,
    /// Pump capacity, m³/s, when given.
    pub pump_capacity: Option<f64>,
    /// Suction limit below the header (wellpoints), m.
    pub suction_limit: f64,
    /// Standby wells for the bid.
    pub standby: u32,
}

/// Layout settings.
#[derive(Debug, Clone)]
pub struct LayoutSpec {
    /// What kind of layout.
    pub kind: LayoutKind,
    /// Index of the excavation it serves.
    pub excavation: usize,
    /// Offset from the outline (ring) or trench edge (line), m.
    pub offset: f64,
    /// Rate for every generated well, m³/s.
    pub rate: Option<f64>,
    /// Ring (without corner wells): distance along the ring of the first well from the ring's
    /// first vertex; line: distance of the first and last wellpoint inside each end, m.
    pub start: f64,
    /// Ring: where `drydig design` may put wells. `None` (`placement = "even"`): evenly spaced
    /// rings only; else the fewest wells on candidate positions (the default).
    pub free: Option<FreePlacementSpec>,
}

/// Candidate positions for the fewest-wells placement (`placement = "fewest"`).
#[derive(Debug, Clone, PartialEq)]
pub struct FreePlacementSpec {
    /// Step between candidates along each ring, m (`layout.candidate_step`; `None`: the
    /// minimum spacing between wells).
    pub step: Option<f64>,
    /// Offsets of further candidate rings outside the outline, m (`layout.candidate_offsets`;
    /// the layout's own offset is always one).
    pub offsets: Vec<f64>,
    /// Positions the user offers, m (`layout.candidates`).
    pub points: Vec<[f64; 2]>,
}

/// The layout kinds.
#[derive(Debug, Clone)]
pub enum LayoutKind {
    /// A ring around the outline.
    Ring {
        /// By count or by spacing.
        count: RingCount,
        /// A well at each corner.
        corner_wells: bool,
    },
    /// Wellpoints along a trench line.
    Line {
        /// Spacing along the line, m.
        spacing: f64,
        /// Both sides of the trench.
        both_sides: bool,
        /// Centre line vertices, m (derived from the outline when not given).
        centre_line: Option<Vec<[f64; 2]>>,
        /// How far the lines run past each trench end, m (`None`: half-width + offset).
        end_extension: Option<f64>,
    },
    /// The wells listed in the file.
    Listed,
    /// Wells from a CSV file.
    Csv {
        /// Path of the CSV file.
        path: PathBuf,
    },
}

/// How many wells a ring has.
#[derive(Debug, Clone, Copy)]
pub enum RingCount {
    /// Exactly this many.
    Count(u32),
    /// As few as keep every gap at most this long, m.
    MaxSpacing(f64),
}

/// A well listed in the design file.
#[derive(Debug, Clone)]
pub struct ListedWell {
    /// Name.
    pub name: String,
    /// Position, m.
    pub position: [f64; 2],
    /// Rate, m³/s (negative: recharge).
    pub rate: f64,
    /// Radius, m.
    pub radius: f64,
}

/// A straight boundary.
#[derive(Debug, Clone)]
pub struct Boundary {
    /// Name.
    pub name: String,
    /// Constant head or barrier.
    pub kind: crate::physics::images::BoundaryKind,
    /// Two points on the line, m.
    pub line: [[f64; 2]; 2],
}

/// A named polygon.
#[derive(Debug, Clone)]
pub struct NamedPolygon {
    /// Name.
    pub name: String,
    /// Polygon, m.
    pub polygon: Polygon<f64>,
}

/// A neighbouring building.
#[derive(Debug, Clone)]
pub struct Neighbour {
    /// Name.
    pub name: String,
    /// Footprint, m.
    pub footprint: Polygon<f64>,
    /// Foundation level, m.
    pub foundation_level: Option<f64>,
    /// Allowable drawdown, m.
    pub allowable_drawdown: Option<f64>,
    /// Allowable rise above the original level, m (`None`: the rule of thumb).
    pub allowable_rise: Option<f64>,
    /// Allowable settlement, m.
    pub allowable_settlement: Option<f64>,
    /// Allowable angular distortion.
    pub allowable_distortion: Option<f64>,
    /// Soil layers top down.
    pub layers: Vec<SoilLayer>,
    /// Use the buoyancy-loss form Δσ′ = Δh·(γ_w − (γ_sat − γ_moist)) instead of γ_w·Δh.
    pub buoyancy_loss: bool,
    /// Marked to be held to its limits when recharge is sized.
    pub protect_with_recharge: bool,
    /// Building height, m, when given.
    pub height: Option<f64>,
    /// How long the water stays lowered under it, s, when given.
    pub dewatering_duration: Option<f64>,
}

/// Compressibility of a soil layer.
#[derive(Debug, Clone, Copy)]
pub enum Compressibility {
    /// m_v, 1/kPa.
    Mv(f64),
    /// Compression index form: recompression (C_r) up to σ′_p, virgin (C_c) beyond.
    Cc {
        /// C_c.
        cc: f64,
        /// e₀.
        e0: f64,
        /// σ′₀, kPa.
        sigma0: f64,
        /// Pre-consolidation pressure σ′_p, kPa (σ′₀ for a normally consolidated clay).
        sigma_p: f64,
        /// Recompression index C_r (unused when σ′_p = σ′₀).
        cr: f64,
    },
    /// Does not compress.
    Incompressible,
}

/// One soil layer under a neighbour.
#[derive(Debug, Clone)]
pub struct SoilLayer {
    /// Name.
    pub name: String,
    /// Thickness, m.
    pub thickness: f64,
    /// How it compresses.
    pub compressibility: Compressibility,
    /// Saturated unit weight, kN/m³, when given.
    pub unit_weight: Option<f64>,
    /// Unit weight once drained (moist), kN/m³, when given.
    pub moist_unit_weight: Option<f64>,
    /// Once above the lowered water table, the layer drains (u → 0) instead of staying
    /// saturated under suction.
    pub drains_above_water_table: bool,
    /// Rate of consolidation, when c_v is given.
    pub consolidation: Option<ConsolidationRate>,
}

/// How fast a layer consolidates.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ConsolidationRate {
    /// Coefficient of consolidation c_v, m²/s.
    pub cv: f64,
    /// Faces it drains through.
    pub drainage: DrainageFaces,
}

/// The faces a layer drains through.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DrainageFaces {
    /// Top and base: drainage path H/2.
    Both,
    /// Top only: drainage path H.
    Top,
    /// Base only: drainage path H.
    Bottom,
}

/// Check-point settings.
#[derive(Debug, Clone)]
pub struct CheckSettings {
    /// Grid spacing inside outlines, m.
    pub grid_spacing: f64,
    /// Spacing along edges, m.
    pub edge_spacing: f64,
    /// User's named points: name, position, optional target level.
    pub points: Vec<(String, [f64; 2], Option<f64>)>,
}

/// Base-uplift data.
#[derive(Debug, Clone)]
pub struct Uplift {
    /// Top of the confined layer, m.
    pub layer_top: f64,
    /// Its piezometric level, m.
    pub piezometric_level: f64,
    /// Soil unit weight above it, kN/m³.
    pub soil_unit_weight: f64,
    /// Required factor of safety.
    pub factor_of_safety: f64,
}

/// What the map contours.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MapQuantity {
    /// Drawdown, m.
    Drawdown,
    /// Water level, m above datum.
    WaterLevel,
}

/// Default injection capacity as a fraction of the abstraction capacity of the same well
/// (common practice (no source): a recharge well takes about half what it would give).
pub const DEFAULT_INJECTION_FRACTION: f64 = 0.5;
/// Default margin kept between the level in a recharge well and ground, m (common practice
/// (no source)).
pub const DEFAULT_INJECTION_MARGIN: f64 = 1.0;
/// Default closest wellpoint spacing, m (common practice (no source): 0.75–2 m in fine sands
/// and silts, checks.md §15; jetting and the header set the lower end).
pub const DEFAULT_MIN_SPACING_WELLPOINT: f64 = 0.75;
/// Default widest wellpoint spacing, m (common practice (no source): rarely more than 3 m).
pub const DEFAULT_MAX_SPACING_WELLPOINT: f64 = 3.0;
/// Default closest deep-well spacing, m (common practice (no source): rigs and pipework).
pub const DEFAULT_MIN_SPACING_DEEP_WELL: f64 = 3.0;
/// Default widest deep-well spacing, m (common practice (no source): deep wells stand some
/// 10–50 m apart; wider gaps leave the ground between them undrained).
pub const DEFAULT_MAX_SPACING_DEEP_WELL: f64 = 50.0;

/// The loss inside a pumped well over the aquifer just outside its screen.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum WellLossSpec {
    /// No well loss.
    None,
    /// Jacob's C·Q², C in s²/m⁵.
    Jacob(f64),
    /// Well efficiency E in (0, 1]: loss = (1/E − 1) × the well's own drawdown at its face.
    Efficiency(f64),
}

/// Wells as they are built and run.
#[derive(Debug, Clone)]
pub struct AsBuilt {
    /// Vertical anisotropy K_v/K_h of the aquifer (default 1).
    pub anisotropy: f64,
    /// Wellpoint header (pump) level, m: the suction limit is measured from it down to the
    /// water in the wellpoint (default ground level).
    pub header_level: f64,
    /// Whether the header level was given.
    pub header_given: bool,
    /// Well loss.
    pub loss: WellLossSpec,
    /// Closest spacing the design may use, m.
    pub min_spacing: f64,
    /// Widest spacing the design may use, m.
    pub max_spacing: f64,
    /// Whether the spacing limits are the rule-of-thumb defaults.
    pub spacing_default: bool,
    /// Injection capacity as a fraction of the abstraction capacity.
    pub injection_fraction: f64,
    /// Highest level allowed in a recharge well, m (ground − margin, or given).
    pub max_injection_level: f64,
    /// How that level was set, for reports.
    pub injection_basis: InjectionBasis,
}

/// How the highest level allowed in a recharge well was set; worded in the run's units by
/// [`InjectionBasis::words`] (JSON carries the SI words).
#[derive(Debug, Clone, PartialEq)]
pub enum InjectionBasis {
    /// `wells.max_injection_level` given in the design file, m.
    Given {
        /// The level given, m.
        level_m: f64,
    },
    /// Ground level less `wells.injection_margin`.
    BelowGround {
        /// The margin below ground, m.
        margin_m: f64,
        /// No margin given: the common-practice default.
        default: bool,
    },
}

impl InjectionBasis {
    /// In words, lengths in `units`: "ground − 1.00 m (default margin, common practice (no
    /// source))", "given max_injection_level 4.50 m".
    pub fn words(&self, units: UnitSystem) -> String {
        match self {
            InjectionBasis::Given { level_m } => {
                format!(
                    "given max_injection_level {}",
                    units.length_words(*level_m, 2)
                )
            }
            InjectionBasis::BelowGround { margin_m, default } => format!(
                "ground − {}{}",
                units.length_words(*margin_m, 2),
                if *default {
                    " (default margin, common practice (no source))"
                } else {
                    ""
                }
            ),
        }
    }
}

impl std::fmt::Display for InjectionBasis {
    /// The SI words (design-file units), as JSON and solver labels carry them.
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.words(UnitSystem::Si))
    }
}

impl serde::Serialize for InjectionBasis {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(&self.to_string())
    }
}

impl AsBuilt {
    /// The lowest water level a wellpoint can hold by suction: header − suction limit, m.
    /// One definition for `estimate`, `check` and `design`.
    pub fn suction_floor(&self, suction_limit: f64) -> f64 {
        self.header_level - suction_limit
    }
}

/// A straight trench installed and dug in lengths (`[rolling]`, see
/// [`crate::input::validate::rolling`]): the model's excavation is its open length and the
/// layout's line the installed length; the whole trench is kept here. Lengths in m.
#[derive(Debug, Clone)]
pub struct Rolling {
    /// The whole trench along its centre line.
    pub trench_length: f64,
    /// Its width (area ÷ length).
    pub trench_width: f64,
    /// Trench open at one time.
    pub open_length: f64,
    /// Dug a day, m/day.
    pub advance_per_day: f64,
    /// Line installed ahead of the open length.
    pub run_in: f64,
    /// Line kept behind the open length.
    pub run_out: f64,
    /// Whether run-in and run-out are the defaults (common practice (no source)).
    pub run_in_default: bool,
    pub run_out_default: bool,
    /// Chainage along the trench of the open length designed for (the set in the middle).
    pub open_from: f64,
}

impl Rolling {
    /// Line installed at one time: run-out + open length + run-in.
    pub fn installed_length(&self) -> f64 {
        self.run_out + self.open_length + self.run_in
    }
}

/// The pumping programme (times in s from day 0).
#[derive(Debug, Clone)]
pub struct Programme {
    /// Calendar date of day 0, as days since 1970-01-01, when given.
    pub start_day: Option<i64>,
    /// Pumping duration, s; every pump stops at its end.
    pub duration: f64,
    /// Step between output times, s.
    pub output_step: f64,
    /// Time followed after switch-off, s.
    pub recovery: f64,
    /// Times of the drawdown maps, s.
    pub map_times: Vec<f64>,
    /// Stages, start times strictly increasing.
    pub stages: Vec<Stage>,
    /// Extra hydrograph points: name, position m.
    pub points: Vec<(String, [f64; 2])>,
}

/// One stage of the dig.
#[derive(Debug, Clone)]
pub struct Stage {
    /// Name.
    pub name: String,
    /// Start, s after day 0.
    pub start: f64,
    /// Index of the excavation dug.
    pub excavation: usize,
    /// Formation level reached, m.
    pub formation_level: f64,
    /// Wells running (names); `None`: every well.
    pub wells: Option<Vec<String>>,
    /// Rate of the running wells.
    pub rate: StageRate,
}

/// Rate of the wells that run in a stage.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum StageRate {
    /// Each well's rate in the design file.
    AsDesigned,
    /// This rate in every running well, m³/s.
    Each(f64),
}

//! The design file as written (TOML): every section and field, with units still attached to
//! positions in the file. [`crate::input::model`] turns it into the validated model the engine computes
//! on; nothing else reads these types.

use crate::input::units::{
    Compressibility, Conductivity, Consolidation, Duration, Flow, Length, Ratio, Stress,
    UnitSystem, UnitWeight,
};
use serde::Deserialize;

/// Whole design file.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DesignFile {
    /// Project and datum.
    pub site: Site,
    /// The water-bearing layer.
    pub aquifer: Aquifer,
    /// One or more excavation outlines.
    #[serde(default)]
    pub excavation: Vec<Excavation>,
    /// The ground below `[aquifer]`, from the top down (layered ground).
    #[serde(default)]
    pub layer: Vec<Layer>,
    /// Radius-of-influence method.
    pub influence: Influence,
    /// Flow contingency and other design allowances.
    #[serde(default)]
    pub allowances: Option<Allowances>,
    /// The kind and dimensions of the wells.
    #[serde(default)]
    pub wells: Option<WellSpec>,
    /// How wells are placed.
    #[serde(default)]
    pub layout: Option<Layout>,
    /// Wells listed one by one (used when `layout.kind = "listed"`).
    #[serde(default)]
    pub well: Vec<ListedWell>,
    /// Straight boundaries (rivers, cut-off walls), by the method of images.
    #[serde(default)]
    pub boundary: Vec<Boundary>,
    /// Cut-off walls of any shape (line doublets solved with the wells).
    #[serde(default)]
    pub wall: Vec<Wall>,
    /// Areas where no well may be placed.
    #[serde(default)]
    pub keep_out: Vec<KeepOut>,
    /// Neighbouring buildings.
    #[serde(default)]
    pub neighbour: Vec<Neighbour>,
    /// Check-point grid settings and named points.
    #[serde(default)]
    pub checks: Option<Checks>,
    /// Confined layer below the formation, for the base-uplift check.
    #[serde(default)]
    pub uplift: Option<Uplift>,
    /// Output preferences.
    #[serde(default)]
    pub output: Option<Output>,
    /// Pump selection and pipework for the bid.
    #[serde(default)]
    pub pumps: Option<Pumps>,
    /// The pumping programme in time (stages of the dig), for `drydig programme`.
    #[serde(default)]
    pub programme: Option<Programme>,
    /// The bid's durations and rules of thumb.
    #[serde(default)]
    pub bid: Option<BidTimes>,
    /// A trench installed and dug in lengths (a rolling run of wellpoints).
    #[serde(default)]
    pub rolling: Option<Rolling>,
    /// Uncertain inputs and their sampling, for `drydig uncertainty`.
    #[serde(default)]
    pub uncertainty: Option<crate::input::schema_uncertainty::UncertaintySection>,
}

/// `[rolling]`: a trench installed and dug in lengths.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Rolling {
    /// Length of trench open at one time.
    pub open_length: Length,
    /// Length dug (and piped and backfilled) a day.
    pub advance_per_day: Length,
    /// Line installed ahead of the open length (default: two days of advance, at least 10 m).
    #[serde(default)]
    pub run_in: Option<Length>,
    /// Line kept behind the open length (default: one day of advance, at least 10 m).
    #[serde(default)]
    pub run_out: Option<Length>,
}

/// `[bid]`: durations and rules of thumb for the bid (each has a labelled default).
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct BidTimes {
    /// How long the pumps run ("12 weeks"); default: `[programme] duration` when given.
    #[serde(default)]
    pub pumping_duration: Option<Duration>,
    /// Mobilisation ("2 days").
    #[serde(default)]
    pub mobilise: Option<Duration>,
    /// Deep wells drilled and installed per day (a number).
    #[serde(default)]
    pub wells_per_day: Option<f64>,
    /// Header (wellpoints) or collecting main (deep wells) installed per day ("50 m").
    #[serde(default)]
    pub header_per_day: Option<Length>,
    /// Deep wells removed per day (a number).
    #[serde(default)]
    pub removal_wells_per_day: Option<f64>,
    /// Header or main removed per day ("150 m").
    #[serde(default)]
    pub removal_header_per_day: Option<Length>,
    /// Settlement tank retention at the design flow ("15 min").
    #[serde(default)]
    pub retention_time: Option<Duration>,
    /// Generators on hire, running + standby (0 with a mains supply).
    #[serde(default)]
    pub generators: Option<u32>,
    /// Excavation perimeter per monitoring piezometer ("50 m").
    #[serde(default)]
    pub piezometer_spacing: Option<Length>,
}

/// `[pumps]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Pumps {
    /// Standard pump duties to choose from (`["2 L/s", "5 L/s", …]`).
    #[serde(default)]
    pub duties: Option<Vec<Flow>>,
    /// Pump efficiency (`"60 %"`).
    #[serde(default)]
    pub efficiency: Option<Ratio>,
    /// Level the water is pumped up to.
    #[serde(default)]
    pub discharge_level: Option<Length>,
    /// Internal diameter of each well's riser.
    #[serde(default)]
    pub riser_diameter: Option<Length>,
    /// Internal diameter of the header main.
    #[serde(default)]
    pub header_diameter: Option<Length>,
    /// Hazen–Williams C of the pipes.
    #[serde(default)]
    pub hazen_williams_c: Option<f64>,
    /// Running hours a day.
    #[serde(default)]
    pub hours_per_day: Option<f64>,
    /// Rates within this fraction of a class's largest share its pump (`"25 %"`).
    #[serde(default)]
    pub class_tolerance: Option<Ratio>,
    /// Every well of a class runs at the class's largest rate.
    #[serde(default)]
    pub one_rate_per_class: Option<bool>,
    /// Header length one wellpoint pump set serves.
    #[serde(default)]
    pub wellpoint_set_length: Option<Length>,
    /// Wellpoints: "per-set" (default: the wellpoints of one pump set share its rate) or
    /// "per-well" (a valve on each wellpoint).
    #[serde(default)]
    pub rates: Option<String>,
}

/// `[site]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Site {
    /// Project name for titles.
    pub name: String,
    /// What level 0 means, in words.
    #[serde(default)]
    pub datum: Option<String>,
    /// Ground level (elevation above datum).
    pub ground_level: Length,
    /// Name of the projected grid the coordinates are in (free text, e.g. "EPSG:32632"), or
    /// "local".
    #[serde(default)]
    pub grid: Option<String>,
    /// Coordinate system of the site grid for GIS output: "EPSG:27700" or a proj string.
    #[serde(default)]
    pub crs: Option<String>,
}

/// `[aquifer]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Aquifer {
    /// "unconfined", "confined" or "leaky".
    pub kind: String,
    /// Hydraulic conductivity.
    pub conductivity: Conductivity,
    /// Level of the aquifer base.
    pub base_level: Length,
    /// Level of the aquifer top (confined, leaky).
    #[serde(default)]
    pub top_level: Option<Length>,
    /// Groundwater level before pumping (water table or piezometric level).
    pub groundwater_level: Length,
    /// Storativity S (confined), dimensionless.
    #[serde(default)]
    pub storativity: Option<f64>,
    /// Specific yield S_y (unconfined), dimensionless.
    #[serde(default)]
    pub specific_yield: Option<f64>,
    /// Leakage factor B = √(T·c) (leaky).
    #[serde(default)]
    pub leakage_factor: Option<Length>,
    /// Hydraulic resistance c = b′/K′ of the aquitard (leaky), a time.
    #[serde(default)]
    pub aquitard_resistance: Option<Duration>,
    /// Vertical anisotropy K_v/K_h (default 1), for partial penetration.
    #[serde(default)]
    pub anisotropy: Option<f64>,
}

/// `[[layer]]`: one layer below `[aquifer]` (or below the layer before), from the top down.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Layer {
    /// Name for messages and reports.
    pub name: String,
    /// "aquifer" or "aquitard".
    pub kind: String,
    /// Level of the layer's base (its top is the base of the layer above).
    pub base_level: Length,
    /// Horizontal hydraulic conductivity K_h (aquifer).
    #[serde(default)]
    pub conductivity: Option<Conductivity>,
    /// Vertical hydraulic conductivity K_v (aquitard; or aquifer, instead of anisotropy).
    #[serde(default)]
    pub vertical_conductivity: Option<Conductivity>,
    /// K_v/K_h of an aquifer (default 1).
    #[serde(default)]
    pub anisotropy: Option<f64>,
    /// Hydraulic resistance c = thickness/K_v of an aquitard, a time.
    #[serde(default)]
    pub resistance: Option<Duration>,
    /// Storativity S of an aquifer (kept for time-dependent work), dimensionless.
    #[serde(default)]
    pub storativity: Option<f64>,
}

/// `[[excavation]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Excavation {
    /// Unique name.
    pub name: String,
    /// Outline vertices `[[x, y], …]` in metres in the site grid.
    pub outline: toml::Spanned<Vec<Vec<f64>>>,
    /// Formation (dig) level.
    pub formation_level: Length,
    /// Target water level margin below formation.
    pub target_margin: Length,
    /// "auto" (default), "pit" or "trench".
    #[serde(default)]
    pub shape: Option<String>,
    /// "dewater" (to the target level), "relieve" (the uplift head only) or "both" (default).
    #[serde(default)]
    pub control: Option<String>,
    /// Trench centre line `[[x, y], …]`, any number of vertices (default: derived from the
    /// outline).
    #[serde(default)]
    pub centre_line: Option<toml::Spanned<Vec<Vec<f64>>>>,
}

/// `[influence]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Influence {
    /// "sichardt", "kusakin", "cooper-jacob", "fixed" or "pumping-test".
    pub method: String,
    /// Sichardt's C for radial flow (default 3000).
    #[serde(default)]
    pub sichardt_c: Option<f64>,
    /// Sichardt's C for flow to a line (default 1500).
    #[serde(default)]
    pub sichardt_c_line: Option<f64>,
    /// Pumping time before the dig (Cooper–Jacob).
    #[serde(default)]
    pub pumping_time: Option<Duration>,
    /// Distance of influence (fixed), counted from the excavation's equivalent radius.
    #[serde(default)]
    pub distance: Option<Length>,
    /// Pumping-test results to fit a distance-drawdown line to.
    #[serde(default)]
    pub test: Option<PumpingTest>,
}

/// `[influence.test]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PumpingTest {
    /// Steady test rate.
    pub rate: Flow,
    /// Observations at steady state.
    pub observation: Vec<Observation>,
}

/// `[[influence.test.observation]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Observation {
    /// Distance from the test well.
    pub distance: Length,
    /// Steady drawdown observed.
    pub drawdown: Length,
}

/// `[allowances]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Allowances {
    /// Contingency f on the computed flow: design flow = (1 + f)·Q.
    #[serde(default)]
    pub contingency: Option<Ratio>,
    /// Outline length/width ratio from which an excavation counts as a trench.
    #[serde(default)]
    pub trench_aspect_ratio: Option<f64>,
    /// Depth below every target that `design` keeps with every well running.
    #[serde(default)]
    pub operating_margin: Option<Length>,
    /// Fraction of each well's capacity `design` may use (`"80 %"`).
    #[serde(default)]
    pub capacity_fraction: Option<Ratio>,
    /// The targets must still hold with any one well out of service.
    #[serde(default)]
    pub one_well_out: Option<bool>,
}

/// `[wells]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct WellSpec {
    /// "deep-well" or "wellpoint".
    #[serde(default)]
    pub kind: Option<String>,
    /// Radius of the well (borehole or screen).
    pub radius: Length,
    /// Top of screen level.
    #[serde(default)]
    pub screen_top: Option<Length>,
    /// Base of screen level.
    #[serde(default)]
    pub screen_base: Option<Length>,
    /// Top of the filter (sand) column round the screen (default: the screen top).
    #[serde(default)]
    pub filter_top: Option<Length>,
    /// Base of the filter column (default: the screen base).
    #[serde(default)]
    pub filter_base: Option<Length>,
    /// Length of the filter column up from its base (instead of `filter_top`).
    #[serde(default)]
    pub filter_length: Option<Length>,
    /// Pump intake level.
    #[serde(default)]
    pub pump_intake: Option<Length>,
    /// Water depth kept above the intake.
    #[serde(default)]
    pub submergence: Option<Length>,
    /// Largest rate the chosen pump gives.
    #[serde(default)]
    pub pump_capacity: Option<Flow>,
    /// Most drawdown a wellpoint can lift by suction, below its header.
    #[serde(default)]
    pub suction_limit: Option<Length>,
    /// Standby wells added to the count for the bid.
    #[serde(default)]
    pub standby: Option<u32>,
    /// Wellpoint header (pump) level; the suction limit is measured from it (default ground).
    #[serde(default)]
    pub header_level: Option<Length>,
    /// Jacob's well-loss coefficient C in s²/m⁵ (loss = C·Q²).
    #[serde(default)]
    pub loss_coefficient: Option<f64>,
    /// Well efficiency E in (0, 1] (loss = (1/E − 1) × the well's own drawdown at its face).
    #[serde(default)]
    pub efficiency: Option<f64>,
    /// Closest spacing the design may use.
    #[serde(default)]
    pub min_spacing: Option<Length>,
    /// Widest spacing the design may use.
    #[serde(default)]
    pub max_spacing: Option<Length>,
    /// Injection capacity of a recharge well as a fraction of its abstraction capacity.
    #[serde(default)]
    pub injection_fraction: Option<f64>,
    /// Margin kept between the level in a recharge well and ground.
    #[serde(default)]
    pub injection_margin: Option<Length>,
    /// Highest level allowed in a recharge well (instead of ground − margin).
    #[serde(default)]
    pub max_injection_level: Option<Length>,
}

/// `[layout]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Layout {
    /// "ring", "line", "listed" or "csv".
    pub kind: String,
    /// Name of the excavation the ring or line serves (default: the first).
    #[serde(default)]
    pub excavation: Option<String>,
    /// Ring: offset outside the outline; line: offset outside the trench edge.
    #[serde(default)]
    pub offset: Option<Length>,
    /// Ring: number of wells.
    #[serde(default)]
    pub count: Option<u32>,
    /// Ring: largest spacing along the ring (alternative to count).
    #[serde(default)]
    pub max_spacing: Option<Length>,
    /// Ring: put a well at each corner.
    #[serde(default)]
    pub corner_wells: Option<bool>,
    /// Line: spacing along the line.
    #[serde(default)]
    pub spacing: Option<Length>,
    /// Line: "one" or "both".
    #[serde(default)]
    pub sides: Option<String>,
    /// Line: the trench centre line `[[x, y], …]` (default: derived from the outline).
    #[serde(default)]
    pub centre_line: Option<toml::Spanned<Vec<Vec<f64>>>>,
    /// Line: how far the wellpoint lines run past each end of the trench (default: half the
    /// trench width plus the offset).
    #[serde(default)]
    pub end_extension: Option<Length>,
    /// Rate given to every generated well (for `check`).
    #[serde(default)]
    pub rate: Option<Flow>,
    /// CSV file of wells (kind = "csv"), relative to the design file.
    #[serde(default)]
    pub file: Option<String>,
    /// Ring: distance along the ring of the first well; line: distance of the end wellpoints
    /// inside each end of the line.
    #[serde(default)]
    pub start: Option<Length>,
    /// Ring, `drydig design`: "fewest" (default: the fewest wells on candidate positions) or
    /// "even" (evenly spaced rings only).
    #[serde(default)]
    pub placement: Option<String>,
    /// Ring, placement "fewest": step between candidate positions along the ring.
    #[serde(default)]
    pub candidate_step: Option<Length>,
    /// Ring, placement "fewest": offsets of further candidate rings outside the outline.
    #[serde(default)]
    pub candidate_offsets: Option<Vec<Length>>,
    /// Ring, placement "fewest": further candidate positions `[[x, y], …]`.
    #[serde(default)]
    pub candidates: Option<toml::Spanned<Vec<Vec<f64>>>>,
}

/// `[[well]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ListedWell {
    /// Unique name.
    pub name: String,
    /// Easting, m.
    pub x: f64,
    /// Northing, m.
    pub y: f64,
    /// Rate (negative: recharge).
    pub rate: Flow,
    /// Radius (default from `[wells]`).
    #[serde(default)]
    pub radius: Option<Length>,
}

/// `[[boundary]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Boundary {
    /// Name for reports.
    pub name: String,
    /// "constant-head" or "barrier".
    pub kind: String,
    /// Two points on the straight line `[[x1, y1], [x2, y2]]`.
    pub line: toml::Spanned<Vec<Vec<f64>>>,
}

/// `[[wall]]`: a cut-off wall (sheet piles, secant piles, slurry wall) along a polyline.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Wall {
    /// Name for reports.
    pub name: String,
    /// Vertices `[[x, y], …]` in the site grid, m.
    pub line: toml::Spanned<Vec<Vec<f64>>>,
    /// Whether the last vertex joins the first (a wall round the dig).
    #[serde(default)]
    pub closed: bool,
    /// Level of the toe; without it the wall cuts every aquifer.
    #[serde(default)]
    pub toe_level: Option<Length>,
    /// Resistance of a leaky wall c = wall thickness / K of the wall, a time.
    #[serde(default)]
    pub resistance: Option<Duration>,
}

/// `[[keep_out]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct KeepOut {
    /// Name for reports.
    pub name: String,
    /// Polygon `[[x, y], …]`.
    pub outline: toml::Spanned<Vec<Vec<f64>>>,
}

/// `[[neighbour]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Neighbour {
    /// Unique name.
    pub name: String,
    /// Footprint polygon `[[x, y], …]`.
    pub footprint: toml::Spanned<Vec<Vec<f64>>>,
    /// Underside of foundation level.
    #[serde(default)]
    pub foundation_level: Option<Length>,
    /// Largest drawdown allowed under it.
    #[serde(default)]
    pub allowable_drawdown: Option<Length>,
    /// Largest rise of the water above its original level (beside recharge wells).
    #[serde(default)]
    pub allowable_rise: Option<Length>,
    /// Largest total settlement allowed.
    #[serde(default)]
    pub allowable_settlement: Option<Length>,
    /// Largest angular distortion allowed ("1/500").
    #[serde(default)]
    pub allowable_distortion: Option<Ratio>,
    /// Soil profile under it, top down.
    #[serde(default)]
    pub layer: Vec<SoilLayer>,
    /// Effective-stress change: "simple" (γ_w·Δh, default) or "buoyancy-loss".
    #[serde(default)]
    pub stress_change: Option<String>,
    /// Hold this building to its limits when sizing recharge (`check --size-recharge`).
    #[serde(default)]
    pub protect_with_recharge: Option<bool>,
    /// Height of the building (for the deflection ratio's tensile strain and damage category).
    #[serde(default)]
    pub height: Option<Length>,
    /// How long the water stays lowered, for consolidation in time (default: the programme's
    /// duration, when there is one).
    #[serde(default)]
    pub dewatering_duration: Option<Duration>,
}

/// `[[neighbour.layer]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SoilLayer {
    /// Name ("soft clay").
    pub name: String,
    /// Thickness.
    pub thickness: Length,
    /// Coefficient of volume compressibility.
    #[serde(default)]
    pub m_v: Option<Compressibility>,
    /// Compression index (with `e0` and `sigma0`).
    #[serde(default)]
    pub c_c: Option<f64>,
    /// Initial void ratio.
    #[serde(default)]
    pub e0: Option<f64>,
    /// Initial vertical effective stress at mid-layer.
    #[serde(default)]
    pub sigma0: Option<Stress>,
    /// True for layers that do not compress (sand, rock).
    #[serde(default)]
    pub incompressible: Option<bool>,
    /// Saturated unit weight.
    #[serde(default)]
    pub unit_weight: Option<UnitWeight>,
    /// Unit weight once drained above the lowered water table (buoyancy-loss form).
    #[serde(default)]
    pub moist_unit_weight: Option<UnitWeight>,
    /// Recompression index (with `c_c` and `sigma_p` or `ocr`).
    #[serde(default)]
    pub c_r: Option<f64>,
    /// Pre-consolidation pressure σ′_p at mid-layer.
    #[serde(default)]
    pub sigma_p: Option<Stress>,
    /// Over-consolidation ratio σ′_p/σ′₀.
    #[serde(default)]
    pub ocr: Option<f64>,
    /// Coefficient of consolidation (consolidation in time).
    #[serde(default)]
    pub c_v: Option<Consolidation>,
    /// Faces the layer drains through: "both" (default), "top" or "bottom".
    #[serde(default)]
    pub drainage: Option<String>,
    /// Once the water table falls below it: "saturated" (held by suction, default for
    /// compressible layers) or "drains" (default for incompressible ones).
    #[serde(default)]
    pub above_water_table: Option<String>,
}

/// `[checks]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Checks {
    /// Grid spacing inside each outline.
    #[serde(default)]
    pub grid_spacing: Option<Length>,
    /// Spacing of points along each edge.
    #[serde(default)]
    pub edge_spacing: Option<Length>,
    /// Named points of the user's.
    #[serde(default)]
    pub point: Vec<NamedPoint>,
}

/// `[[checks.point]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct NamedPoint {
    /// Name.
    pub name: String,
    /// Easting, m.
    pub x: f64,
    /// Northing, m.
    pub y: f64,
    /// Level the water must be drawn below here (optional; without it the point is reported).
    #[serde(default)]
    pub target_level: Option<Length>,
}

/// `[uplift]`: a confined layer below the formation.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Uplift {
    /// Level of the top of the confined layer.
    pub layer_top: Length,
    /// Its piezometric level before pumping.
    pub piezometric_level: Length,
    /// Unit weight of the soil between formation and the layer top.
    pub soil_unit_weight: UnitWeight,
    /// Required factor of safety.
    #[serde(default)]
    pub factor_of_safety: Option<f64>,
}

/// `[output]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Output {
    /// "si" or "us".
    #[serde(default)]
    pub units: Option<UnitSystem>,
    /// Map shows "drawdown" or "water-level".
    #[serde(default)]
    pub map: Option<String>,
    /// How far the map reaches beyond the excavations, wells and neighbours.
    #[serde(default)]
    pub map_extent: Option<Length>,
    /// Contour interval of the map.
    #[serde(default)]
    pub contour_interval: Option<Length>,
    /// Cross-section line `[[x1, y1], [x2, y2]]`, m in the site grid.
    #[serde(default)]
    pub section: Option<toml::Spanned<Vec<Vec<f64>>>>,
}

/// `[programme]`: the pumping programme in time.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Programme {
    /// Calendar date of day 0 ("2027-03-01"), needed when a stage gives a date.
    #[serde(default)]
    pub start_date: Option<String>,
    /// How long the pumps run from day 0 ("120 days"); they are switched off at its end.
    pub duration: Duration,
    /// Step between output times ("1 day").
    #[serde(default)]
    pub output_step: Option<Duration>,
    /// How long the levels are followed after switch-off ("30 days").
    #[serde(default)]
    pub recovery: Option<Duration>,
    /// Times of the drawdown maps (["14 days", "60 days"]).
    #[serde(default)]
    pub map_times: Vec<Duration>,
    /// Stages of the dig, in time order.
    #[serde(default)]
    pub stage: Vec<Stage>,
    /// Extra points with a hydrograph (piezometers, services).
    #[serde(default)]
    pub point: Vec<ProgrammePoint>,
}

/// `[[programme.stage]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Stage {
    /// Name ("Dig to 2.5 m").
    pub name: String,
    /// Start, as time after day 0 ("0 days", "3 weeks").
    #[serde(default)]
    pub start: Option<Duration>,
    /// Start as a calendar date ("2027-03-15"), with `programme.start_date`.
    #[serde(default)]
    pub date: Option<String>,
    /// The excavation this stage digs (default: the first).
    #[serde(default)]
    pub excavation: Option<String>,
    /// Formation level reached in this stage.
    pub formation_level: Length,
    /// Wells running in this stage (default: every well).
    #[serde(default)]
    pub wells: Option<Vec<String>>,
    /// "as designed" (each well's design-file rate) or one rate for each running well ("4 L/s").
    #[serde(default)]
    pub rate: Option<String>,
}

/// `[[programme.point]]`
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ProgrammePoint {
    /// Name.
    pub name: String,
    /// x, m.
    pub x: f64,
    /// y, m.
    pub y: f64,
}

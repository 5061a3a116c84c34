//! The validated model: the design file checked and turned into SI numbers and geometry.
//!
//! [`load`] is the only way to get a [`Model`]; it reads the file, parses it ([`crate::input::schema`]),
//! and checks every value against what is physically and practically valid, so the engine never
//! computes on something it would have to question.

use crate::input::error::{InputError, Reporter};
use crate::input::schema::{self, DesignFile};
use crate::input::units::UnitSystem;
use crate::physics::potential::{Aquifer, AquiferKind};
use crate::physics::{hantush, radius};
use geo::{Area, Coord, LineString, Polygon, Validation};
use std::collections::HashSet;
use std::path::{Path, PathBuf};

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
    /// The aquifer.
    pub aquifer: Aquifer,
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
}

/// Compressibility of a soil layer.
#[derive(Debug, Clone, Copy)]
pub enum Compressibility {
    /// m_v, 1/kPa.
    Mv(f64),
    /// Compression index form.
    Cc {
        /// C_c.
        cc: f64,
        /// e₀.
        e0: f64,
        /// σ′₀, kPa.
        sigma0: f64,
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

/// Read, parse and validate a design file.
pub fn load(path: &Path) -> Result<Model, InputError> {
    let bytes = std::fs::read(path).map_err(|e| InputError {
        file: path.to_path_buf(),
        field: String::new(),
        line: None,
        message: format!("cannot read the design file: {e}"),
    })?;
    let source = String::from_utf8(bytes).map_err(|e| InputError {
        file: path.to_path_buf(),
        field: String::new(),
        line: None,
        message: format!(
            "not a text file (invalid UTF-8 at byte {}); a design file is TOML text — run `drydig new FILE` for a starter",
            e.utf8_error().valid_up_to()
        ),
    })?;
    from_str(path, &source)
}

/// Parse and validate design text that came from `path`.
pub fn from_str(path: &Path, source: &str) -> Result<Model, InputError> {
    let rep = Reporter::new(path, source);
    let only_comments = source
        .lines()
        .all(|l| l.trim().is_empty() || l.trim_start().starts_with('#'));
    if only_comments {
        return Err(rep.error(
            "",
            None,
            "the file is empty (nothing but blank lines and comments); a design file needs at least [site], [aquifer], one [[excavation]] and [influence] — run `drydig new FILE` for a starter",
        ));
    }
    if source.contains('\0') {
        return Err(rep.error(
            "",
            None,
            "the file holds binary data; a design file is TOML text",
        ));
    }
    let raw: DesignFile = toml::from_str(source).map_err(|e| parse_error(&rep, source, &e))?;
    validate(path, &rep, raw)
}

/// Turn a TOML/serde error into an input error with field, line and a "did you mean" hint.
fn parse_error(rep: &Reporter, source: &str, e: &toml::de::Error) -> InputError {
    let span = e.span();
    let mut message = e.message().trim().to_string();
    let mut field = String::new();
    if let Some(s) = &span {
        let line_start = source[..s.start.min(source.len())]
            .rfind('\n')
            .map_or(0, |i| i + 1);
        let line_text = source[line_start..].lines().next().unwrap_or("");
        if let Some((key, _)) = line_text.split_once('=') {
            field = key.trim().to_string();
        } else if line_text.trim_start().starts_with('[') {
            field = line_text.trim().to_string();
        }
    }
    // serde: "unknown field `foo`, expected one of `a`, `b`"
    if let Some(rest) = message.strip_prefix("unknown field `") {
        if let Some((name, expected)) = rest.split_once('`') {
            let options: Vec<&str> = expected.split('`').skip(1).step_by(2).collect();
            let best = options
                .iter()
                .map(|o| (strsim::levenshtein(o, name), *o))
                .min()
                .filter(|(d, o)| *d <= 3.max(o.len() / 3));
            field = name.to_string();
            message = format!(
                "unknown field `{name}`{}; valid fields here: {}",
                best.map(|(_, o)| format!(" — did you mean `{o}`?"))
                    .unwrap_or_default(),
                options.join(", ")
            );
        }
    }
    let mut span = span;
    if let Some(rest) = message.strip_prefix("missing field `") {
        let name = rest.split('`').next().unwrap_or_default().to_string();
        // A field missing from the top level is reported against the whole file: no line.
        if span
            .as_ref()
            .is_some_and(|s| s.start == 0 && (s.end == 0 || s.end >= source.trim_end().len()))
        {
            span = None;
            field = name;
        }
        message.push_str(" (see `drydig new FILE` for a starter that has every field)");
    } else if let Some(i) = message.find("expected struct ") {
        let section = if field.is_empty() { "section" } else { &field };
        message = format!(
            "{}expected a [{section}] section (a table of `key = value` lines), not a single value",
            &message[..i]
        );
    } else if message.contains("expected u32") {
        message = message.replace("expected u32", "expected a whole number, 0 or more");
    } else if message.starts_with("duplicate key") {
        message.push_str("; give each field once in its section");
    } else if field.is_empty() {
        message.push_str(
            "; a design file is TOML: `key = value` lines under [section] headers (see `drydig new FILE` for a starter)",
        );
    }
    rep.error(field, span, message)
}

fn check_positive(
    rep: &Reporter,
    field: &str,
    q: &crate::input::units::Quantity<impl crate::input::units::Kind>,
    what: &str,
) -> Result<f64, InputError> {
    if q.si > 0.0 {
        Ok(q.si)
    } else {
        Err(rep.error(
            field,
            q.span.clone(),
            format!("must be greater than zero ({what})"),
        ))
    }
}

/// Turn `[[x, y], …]` into points, refusing anything but finite pairs.
fn points(
    rep: &Reporter,
    field: &str,
    raw: &toml::Spanned<Vec<Vec<f64>>>,
) -> Result<Vec<[f64; 2]>, InputError> {
    raw.get_ref()
        .iter()
        .enumerate()
        .map(|(i, p)| match p.as_slice() {
            [x, y] if x.is_finite() && y.is_finite() => Ok([*x, *y]),
            _ => Err(rep.error(
                field,
                Some(raw.span()),
                format!(
                    "point {} must be [x, y], two finite numbers in metres",
                    i + 1
                ),
            )),
        })
        .collect()
}

/// A valid simple polygon from at least three points in projected metres.
fn polygon(
    rep: &Reporter,
    field: &str,
    raw: &toml::Spanned<Vec<Vec<f64>>>,
) -> Result<Polygon<f64>, InputError> {
    let mut pts = points(rep, field, raw)?;
    if pts.len() > 1 && pts.first() == pts.last() {
        pts.pop();
    }
    let span = Some(raw.span());
    if pts.len() < 3 {
        return Err(rep.error(
            field,
            span,
            format!(
                "an outline needs at least 3 distinct points [x, y] in metres; found {}",
                pts.len()
            ),
        ));
    }
    looks_geographic(&pts).map_or(Ok(()), |m| Err(rep.error(field, span.clone(), m)))?;
    let ring: LineString<f64> = pts.iter().map(|p| Coord { x: p[0], y: p[1] }).collect();
    let poly = Polygon::new(ring, vec![]);
    if let Err(problem) = poly.check_validation() {
        return Err(rep.error(
            field,
            span,
            format!("the outline is not a simple polygon ({problem}); list the corners in order around the outline without crossing edges"),
        ));
    }
    if poly.unsigned_area() <= 0.0 {
        return Err(rep.error(field, span, "the outline encloses no area"));
    }
    Ok(poly)
}

/// Coordinates that look like longitude/latitude degrees rather than metres.
fn looks_geographic(pts: &[[f64; 2]]) -> Option<String> {
    let (mut xmin, mut xmax, mut ymin, mut ymax) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for p in pts {
        xmin = xmin.min(p[0]);
        xmax = xmax.max(p[0]);
        ymin = ymin.min(p[1]);
        ymax = ymax.max(p[1]);
    }
    let in_range = xmin >= -180.0 && xmax <= 180.0 && ymin >= -90.0 && ymax <= 90.0;
    let tiny = (xmax - xmin) < 0.05 && (ymax - ymin) < 0.05;
    (in_range && tiny).then(|| {
        format!(
            "the coordinates look like longitude/latitude degrees (x {xmin}…{xmax}, y {ymin}…{ymax}); drydig works in metres on a flat grid: project them first to a local grid or a projected system such as UTM"
        )
    })
}

fn validate(path: &Path, rep: &Reporter, raw: DesignFile) -> Result<Model, InputError> {
    // Site.
    if raw.site.name.trim().is_empty() {
        return Err(rep.error("site.name", None, "must not be empty"));
    }
    let ground = raw.site.ground_level.si;

    // Aquifer.
    let a = &raw.aquifer;
    let k = a.conductivity.si;
    if !(1e-9..=1.0).contains(&k) {
        return Err(rep.error(
            "aquifer.conductivity",
            a.conductivity.span.clone(),
            format!("{k:e} m/s is outside 1e-9 … 1 m/s; below 1e-9 m/s the ground cannot be drained by wells, above 1 m/s no soil conducts"),
        ));
    }
    let base = a.base_level.si;
    let initial = a.groundwater_level.si;
    if initial <= base {
        return Err(rep.error(
            "aquifer.groundwater_level",
            a.groundwater_level.span.clone(),
            format!(
                "the groundwater level ({initial} m) must be above the aquifer base ({base} m)"
            ),
        ));
    }
    let top = a.top_level.as_ref().map(|t| t.si);
    let kind_name = a.kind.trim().to_lowercase();
    let kind = match kind_name.as_str() {
        "unconfined" => {
            if top.is_some() {
                return Err(rep.error(
                    "aquifer.top_level",
                    a.top_level.as_ref().and_then(|t| t.span.clone()),
                    "an unconfined aquifer has no top level; remove it, or set kind = \"confined\"",
                ));
            }
            if initial > ground + 1e-9 {
                return Err(rep.error("aquifer.groundwater_level", a.groundwater_level.span.clone(), format!("a water table at {initial} m is above ground level ({ground} m); the site would be flooded — for an artesian head use kind = \"confined\"")));
            }
            AquiferKind::Unconfined
        }
        "confined" | "leaky" => {
            let Some(t) = top else {
                return Err(rep.error(
                    "aquifer.top_level",
                    None,
                    format!(
                        "a {kind_name} aquifer needs top_level, the level of its confining top"
                    ),
                ));
            };
            if t <= base {
                return Err(rep.error(
                    "aquifer.top_level",
                    a.top_level.as_ref().and_then(|q| q.span.clone()),
                    format!("the top ({t} m) must be above the base ({base} m)"),
                ));
            }
            if t > ground + 1e-9 {
                return Err(rep.error(
                    "aquifer.top_level",
                    a.top_level.as_ref().and_then(|q| q.span.clone()),
                    format!("the top ({t} m) is above ground level ({ground} m)"),
                ));
            }
            if initial < t {
                return Err(rep.error("aquifer.groundwater_level", a.groundwater_level.span.clone(), format!("the piezometric level ({initial} m) is below the confining top ({t} m), so the aquifer is unconfined at rest: set kind = \"unconfined\" and drop top_level")));
            }
            if kind_name == "leaky" {
                let b_conf = t - base;
                let trans = k * b_conf;
                match (&a.leakage_factor, &a.aquitard_resistance) {
                    (Some(b), None) => AquiferKind::Leaky { leakage_factor: check_positive(rep, "aquifer.leakage_factor", b, "leakage factor B = √(T·c), m")? },
                    (None, Some(c)) => AquiferKind::Leaky { leakage_factor: hantush::leakage_factor(trans, check_positive(rep, "aquifer.aquitard_resistance", c, "resistance c = b′/K′ of the aquitard, e.g. \"500 days\"")?) },
                    (Some(b), Some(_)) => return Err(rep.error("aquifer.leakage_factor", b.span.clone(), "give leakage_factor or aquitard_resistance, not both")),
                    (None, None) => return Err(rep.error("aquifer", None, "a leaky aquifer needs leakage_factor (e.g. \"800 m\") or aquitard_resistance (e.g. \"500 days\")")),
                }
            } else {
                AquiferKind::Confined
            }
        }
        other => {
            return Err(rep.error(
                "aquifer.kind",
                None,
                format!(
                "unknown aquifer kind \"{other}\"; valid: \"unconfined\", \"confined\", \"leaky\""
            ),
            ))
        }
    };
    if !matches!(kind, AquiferKind::Leaky { .. })
        && (a.leakage_factor.is_some() || a.aquitard_resistance.is_some())
    {
        return Err(rep.error(
            "aquifer.leakage_factor",
            None,
            "leakage_factor and aquitard_resistance apply only to kind = \"leaky\"",
        ));
    }
    if let Some(s) = a.storativity {
        if !(s > 0.0 && s < 0.5) {
            return Err(rep.error(
                "aquifer.storativity",
                None,
                format!("{s} is outside 0 < S < 0.5 (confined values are usually 1e-5 … 1e-3)"),
            ));
        }
    }
    if let Some(sy) = a.specific_yield {
        if !(sy > 0.0 && sy <= 0.5) {
            return Err(rep.error(
                "aquifer.specific_yield",
                None,
                format!("{sy} is outside 0 < S_y ≤ 0.5 (usual values 0.05 … 0.3)"),
            ));
        }
    }
    let aquifer = Aquifer {
        kind,
        conductivity: k,
        base_level: base,
        top_level: top,
        initial_level: initial,
        storativity: a.storativity,
        specific_yield: a.specific_yield,
    };

    // Excavations.
    if raw.excavation.is_empty() {
        return Err(rep.error("excavation", None, "at least one [[excavation]] with name, outline, formation_level and target_margin is needed"));
    }
    let mut names = HashSet::new();
    let mut excavations = Vec::new();
    for (i, e) in raw.excavation.iter().enumerate() {
        let f = |name: &str| format!("excavation[{}].{name}", i + 1);
        if e.name.trim().is_empty() {
            return Err(rep.error(f("name"), None, "must not be empty"));
        }
        if !names.insert(e.name.trim().to_string()) {
            return Err(rep.error(
                f("name"),
                Some(e.outline.span()),
                format!(
                    "duplicate excavation name \"{}\"; each excavation needs its own name",
                    e.name
                ),
            ));
        }
        let outline = polygon(rep, &f("outline"), &e.outline)?;
        let formation = e.formation_level.si;
        if formation >= ground {
            return Err(rep.error(
                f("formation_level"),
                e.formation_level.span.clone(),
                format!("the formation ({formation} m) must be below ground level ({ground} m)"),
            ));
        }
        let margin = e.target_margin.si;
        if !(0.0..=5.0).contains(&margin) {
            return Err(rep.error(
                f("target_margin"),
                e.target_margin.span.clone(),
                format!("{margin} m is outside 0 … 5 m (usually 0.5 … 1 m below formation)"),
            ));
        }
        let target = formation - margin;
        if target <= base + 0.1 {
            return Err(rep.error(f("target_margin"), e.target_margin.span.clone(), format!("the target level ({target:.2} m = formation − margin) is at or below the aquifer base ({base} m): the aquifer would have to be pumped dry; wells cannot do that — consider a cut-off into the layer below or relief of a deeper aquifer")));
        }
        let shape = match e.shape.as_deref().map(str::trim) {
            None | Some("auto") => ShapeChoice::Auto,
            Some("pit") => ShapeChoice::Pit,
            Some("trench") => ShapeChoice::Trench,
            Some(other) => {
                return Err(rep.error(
                    f("shape"),
                    None,
                    format!("unknown shape \"{other}\"; valid: \"auto\", \"pit\", \"trench\""),
                ))
            }
        };
        excavations.push(Excavation {
            name: e.name.trim().to_string(),
            outline,
            formation_level: formation,
            target_margin: margin,
            shape,
        });
    }

    // Influence.
    let inf = &raw.influence;
    let check_c = |c: Option<f64>, default: f64, field: &str| -> Result<f64, InputError> {
        let c = c.unwrap_or(default);
        if c > 0.0 && c <= 10_000.0 {
            Ok(c)
        } else {
            Err(rep.error(
                format!("influence.{field}"),
                None,
                format!(
                    "{c} is outside 0 … 10000 (Sichardt's C: 3000 radial, 1500–2000 to a line)"
                ),
            ))
        }
    };
    let influence = match inf.method.trim().to_lowercase().as_str() {
        "sichardt" => InfluenceMethod::Sichardt {
            c_radial: check_c(inf.sichardt_c, radius::SICHARDT_C_RADIAL, "sichardt_c")?,
            c_line: check_c(inf.sichardt_c_line, radius::SICHARDT_C_LINE, "sichardt_c_line")?,
        },
        "kusakin" => InfluenceMethod::Kusakin,
        "cooper-jacob" => {
            let Some(t) = &inf.pumping_time else {
                return Err(rep.error("influence.pumping_time", None, "method \"cooper-jacob\" needs pumping_time, the time pumped before digging (e.g. \"14 days\")"));
            };
            let time = check_positive(rep, "influence.pumping_time", t, "a duration such as \"14 days\"")?;
            let Some(storage) = aquifer.storage() else {
                return Err(rep.error("aquifer", None, format!("method \"cooper-jacob\" needs the aquifer's {}", if matches!(aquifer.kind, AquiferKind::Unconfined) { "specific_yield (S_y)" } else { "storativity (S)" })));
            };
            InfluenceMethod::CooperJacob { time, storage }
        }
        "fixed" => {
            let Some(d) = &inf.distance else {
                return Err(rep.error("influence.distance", None, "method \"fixed\" needs distance, the distance of influence L₀ beyond the excavation (e.g. \"150 m\")"));
            };
            InfluenceMethod::Fixed { distance: check_positive(rep, "influence.distance", d, "distance of influence, m")? }
        }
        "pumping-test" => {
            let Some(test) = &inf.test else {
                return Err(rep.error("influence.test", None, "method \"pumping-test\" needs [influence.test] with rate and at least two [[influence.test.observation]] (distance, drawdown)"));
            };
            let q = check_positive(rep, "influence.test.rate", &test.rate, "the steady test rate")?;
            let mut obs = Vec::new();
            for (i, o) in test.observation.iter().enumerate() {
                let fname = format!("influence.test.observation[{}]", i + 1);
                obs.push((
                    check_positive(rep, &format!("{fname}.distance"), &o.distance, "distance from the test well")?,
                    check_positive(rep, &format!("{fname}.drawdown"), &o.drawdown, "steady drawdown")?,
                ));
            }
            match crate::physics::pumping_test::distance_drawdown_fit(&obs) {
                Some((r, slope)) => InfluenceMethod::PumpingTest {
                    radius: r,
                    transmissivity: q / (2.0 * std::f64::consts::PI * slope),
                },
                None => return Err(rep.error("influence.test.observation", None, "need at least two observations at different distances whose drawdown falls with distance")),
            }
        }
        other => {
            return Err(rep.error("influence.method", None, format!("unknown method \"{other}\"; valid: \"sichardt\", \"kusakin\", \"cooper-jacob\", \"fixed\", \"pumping-test\"")))
        }
    };

    // Allowances.
    let allow = raw.allowances.as_ref();
    let contingency = allow.and_then(|a| a.contingency.as_ref());
    let contingency_value = contingency.map_or(DEFAULT_CONTINGENCY, |c| c.value);
    if !(0.0..=3.0).contains(&contingency_value) {
        return Err(rep.error(
            "allowances.contingency",
            contingency.and_then(|c| c.span.clone()),
            format!(
                "{contingency_value} is outside 0 … 3 (as a fraction: 0.5 = 50 %; usual 0.5 … 1.0)"
            ),
        ));
    }
    let aspect = allow
        .and_then(|a| a.trench_aspect_ratio)
        .unwrap_or(DEFAULT_TRENCH_ASPECT);
    if aspect.is_nan() || aspect < 1.0 {
        return Err(rep.error(
            "allowances.trench_aspect_ratio",
            None,
            format!("{aspect} must be at least 1"),
        ));
    }

    // Wells.
    let wells = well_spec(rep, raw.wells.as_ref(), &aquifer, ground)?;

    // Listed wells.
    let mut well_names = HashSet::new();
    let mut listed_wells = Vec::new();
    for (i, w) in raw.well.iter().enumerate() {
        let f = format!("well[{}]", i + 1);
        if !well_names.insert(w.name.clone()) {
            return Err(rep.error(
                format!("{f}.name"),
                w.rate.span.clone(),
                format!("duplicate well name \"{}\"", w.name),
            ));
        }
        if !(w.x.is_finite() && w.y.is_finite()) {
            return Err(rep.error(
                format!("{f}.x"),
                None,
                "x and y must be finite numbers in metres",
            ));
        }
        let radius = match &w.radius {
            Some(r) => check_positive(rep, &format!("{f}.radius"), r, "well radius")?,
            None => wells.radius,
        };
        listed_wells.push(ListedWell {
            name: w.name.clone(),
            position: [w.x, w.y],
            rate: w.rate.si,
            radius,
        });
    }

    let layout = match &raw.layout {
        Some(l) => Some(layout_spec(
            rep,
            path,
            l,
            &excavations,
            listed_wells.is_empty(),
        )?),
        None => None,
    };

    // Boundaries.
    let mut boundaries = Vec::new();
    for (i, b) in raw.boundary.iter().enumerate() {
        let f = format!("boundary[{}]", i + 1);
        let kind = match b.kind.trim() {
            "constant-head" => crate::physics::images::BoundaryKind::ConstantHead,
            "barrier" => crate::physics::images::BoundaryKind::Barrier,
            other => return Err(rep.error(format!("{f}.kind"), Some(b.line.span()), format!("unknown boundary kind \"{other}\"; valid: \"constant-head\" (river, lake) or \"barrier\" (cut-off wall, rock)"))),
        };
        let pts = points(rep, &format!("{f}.line"), &b.line)?;
        if pts.len() != 2 || (pts[0][0] - pts[1][0]).hypot(pts[0][1] - pts[1][1]) < 1e-6 {
            return Err(rep.error(
                format!("{f}.line"),
                Some(b.line.span()),
                "a boundary line is two distinct points [[x1, y1], [x2, y2]]",
            ));
        }
        for e in &excavations {
            let ring = e.outline.exterior();
            let p0 = ring.0[0];
            let side0 = side_of(pts[0], pts[1], [p0.x, p0.y]);
            if ring
                .0
                .iter()
                .any(|c| side_of(pts[0], pts[1], [c.x, c.y]) * side0 <= 0.0)
            {
                return Err(rep.error(format!("{f}.line"), Some(b.line.span()), format!("the boundary line crosses excavation \"{}\"; an image boundary must lie wholly to one side of the site", e.name)));
            }
        }
        boundaries.push(Boundary {
            name: b.name.clone(),
            kind,
            line: [pts[0], pts[1]],
        });
    }

    if boundaries.len() > 1 {
        let lines: Vec<_> = boundaries
            .iter()
            .map(|b| (b.line[0], b.line[1], b.kind))
            .collect();
        let probe = excavations[0].outline.exterior().0[0];
        if let Err(why) = crate::physics::images::image_set([probe.x, probe.y], &lines, 1.0e5) {
            return Err(rep.error("boundary", None, why));
        }
    }

    let mut keep_outs = Vec::new();
    for (i, k) in raw.keep_out.iter().enumerate() {
        keep_outs.push(NamedPolygon {
            name: k.name.clone(),
            polygon: polygon(rep, &format!("keep_out[{}].outline", i + 1), &k.outline)?,
        });
    }

    let mut neighbours = Vec::new();
    let mut neighbour_names = HashSet::new();
    for (i, n) in raw.neighbour.iter().enumerate() {
        neighbours.push(neighbour(rep, i, n, &mut neighbour_names)?);
    }

    let checks = check_settings(rep, raw.checks.as_ref())?;

    let uplift = match &raw.uplift {
        Some(u) => {
            let lowest = excavations
                .iter()
                .map(|e| e.formation_level)
                .fold(f64::INFINITY, f64::min);
            if u.layer_top.si >= lowest {
                return Err(rep.error("uplift.layer_top", u.layer_top.span.clone(), format!("the confined layer's top ({} m) must be below the formation level of every excavation (lowest {lowest} m); the uplift check is for a layer under the dig", u.layer_top.si)));
            }
            let fos = u.factor_of_safety.unwrap_or(1.2);
            if !(1.0..=3.0).contains(&fos) {
                return Err(rep.error(
                    "uplift.factor_of_safety",
                    None,
                    format!("{fos} is outside 1 … 3 (usual 1.1 … 1.5)"),
                ));
            }
            Some(Uplift {
                layer_top: u.layer_top.si,
                piezometric_level: u.piezometric_level.si,
                soil_unit_weight: check_positive(
                    rep,
                    "uplift.soil_unit_weight",
                    &u.soil_unit_weight,
                    "unit weight, e.g. \"19 kN/m3\"",
                )?,
                factor_of_safety: fos,
            })
        }
        None => None,
    };

    let output = raw.output.as_ref();
    let map_quantity = match output.and_then(|o| o.map.as_deref()) {
        None | Some("drawdown") => MapQuantity::Drawdown,
        Some("water-level") => MapQuantity::WaterLevel,
        Some(other) => {
            return Err(rep.error(
                "output.map",
                None,
                format!("unknown map quantity \"{other}\"; valid: \"drawdown\", \"water-level\""),
            ))
        }
    };

    Ok(Model {
        file: path.to_path_buf(),
        name: raw.site.name.trim().to_string(),
        datum: raw
            .site
            .datum
            .clone()
            .unwrap_or_else(|| "site datum".into()),
        ground_level: ground,
        grid: raw.site.grid.clone().unwrap_or_else(|| "local".into()),
        aquifer,
        excavations,
        influence,
        contingency: contingency_value,
        trench_aspect_ratio: aspect,
        wells,
        layout,
        listed_wells,
        boundaries,
        keep_outs,
        neighbours,
        checks,
        uplift,
        units: output.and_then(|o| o.units).unwrap_or_default(),
        map_quantity,
    })
}

/// Sign of the cross product: which side of the line a→b the point p lies on.
fn side_of(a: [f64; 2], b: [f64; 2], p: [f64; 2]) -> f64 {
    (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0])
}

fn well_spec(
    rep: &Reporter,
    raw: Option<&schema::WellSpec>,
    aquifer: &Aquifer,
    ground: f64,
) -> Result<WellSpec, InputError> {
    let default_top = aquifer
        .top_level
        .unwrap_or(aquifer.initial_level)
        .min(ground);
    let Some(w) = raw else {
        return Ok(WellSpec {
            kind: WellKind::DeepWell,
            radius: DEFAULT_WELL_RADIUS,
            screen_top: default_top,
            screen_base: aquifer.base_level,
            pump_intake: aquifer.base_level + 0.5,
            submergence: DEFAULT_SUBMERGENCE,
            pump_capacity: None,
            suction_limit: DEFAULT_SUCTION_LIMIT,
            standby: 0,
        });
    };
    let kind = match w.kind.as_deref().map(str::trim) {
        None | Some("deep-well") => WellKind::DeepWell,
        Some("wellpoint") => WellKind::Wellpoint,
        Some(other) => {
            return Err(rep.error(
                "wells.kind",
                None,
                format!("unknown well kind \"{other}\"; valid: \"deep-well\", \"wellpoint\""),
            ))
        }
    };
    let radius = check_positive(
        rep,
        "wells.radius",
        &w.radius,
        "well radius, e.g. \"0.15 m\"",
    )?;
    if radius > 2.0 {
        return Err(rep.error("wells.radius", w.radius.span.clone(), format!("{radius} m is not a well radius (usual 0.025 … 0.5 m); is it a diameter in mm written as m?")));
    }
    let screen_top = w.screen_top.as_ref().map_or(default_top, |q| q.si);
    if screen_top > ground + 1e-9 {
        return Err(rep.error(
            "wells.screen_top",
            w.screen_top.as_ref().and_then(|q| q.span.clone()),
            format!("the screen top ({screen_top} m) is above ground level ({ground} m); give a level at or below ground"),
        ));
    }
    let screen_base = w.screen_base.as_ref().map_or(aquifer.base_level, |q| q.si);
    if screen_base >= screen_top {
        return Err(rep.error(
            "wells.screen_base",
            w.screen_base.as_ref().and_then(|q| q.span.clone()),
            format!(
                "the screen base ({screen_base} m) must be below the screen top ({screen_top} m)"
            ),
        ));
    }
    if screen_base < aquifer.base_level - 1e-9 {
        return Err(rep.error(
            "wells.screen_base",
            w.screen_base.as_ref().and_then(|q| q.span.clone()),
            format!(
                "the screen base ({screen_base} m) is below the aquifer base ({} m)",
                aquifer.base_level
            ),
        ));
    }
    let pump_intake = w.pump_intake.as_ref().map_or(screen_base + 0.5, |q| q.si);
    if pump_intake < aquifer.base_level - 5.0 || pump_intake > ground {
        return Err(rep.error("wells.pump_intake", w.pump_intake.as_ref().and_then(|q| q.span.clone()), format!("the pump intake ({pump_intake} m) must lie between the aquifer base and ground level")));
    }
    let submergence = w.submergence.as_ref().map_or(DEFAULT_SUBMERGENCE, |q| q.si);
    if !(0.0..=10.0).contains(&submergence) {
        return Err(rep.error(
            "wells.submergence",
            None,
            format!("{submergence} m is outside 0 … 10 m"),
        ));
    }
    let pump_capacity = match &w.pump_capacity {
        Some(q) => Some(check_positive(
            rep,
            "wells.pump_capacity",
            q,
            "pump capacity, e.g. \"5 L/s\"",
        )?),
        None => None,
    };
    let suction_limit = w
        .suction_limit
        .as_ref()
        .map_or(DEFAULT_SUCTION_LIMIT, |q| q.si);
    if !(0.5..=9.0).contains(&suction_limit) {
        return Err(rep.error("wells.suction_limit", None, format!("{suction_limit} m is outside 0.5 … 9 m (one stage lifts about 5–6 m; the vacuum limit is about 9.5 m)")));
    }
    Ok(WellSpec {
        kind,
        radius,
        screen_top,
        screen_base,
        pump_intake,
        submergence,
        pump_capacity,
        suction_limit,
        standby: w.standby.unwrap_or(0),
    })
}

fn layout_spec(
    rep: &Reporter,
    path: &Path,
    l: &schema::Layout,
    excavations: &[Excavation],
    no_listed_wells: bool,
) -> Result<LayoutSpec, InputError> {
    let excavation = match &l.excavation {
        None => 0,
        Some(name) => excavations
            .iter()
            .position(|e| e.name == *name)
            .ok_or_else(|| {
                rep.error(
                    "layout.excavation",
                    None,
                    format!(
                        "no excavation named \"{name}\"; valid: {}",
                        excavations
                            .iter()
                            .map(|e| format!("\"{}\"", e.name))
                            .collect::<Vec<_>>()
                            .join(", ")
                    ),
                )
            })?,
    };
    let offset = l.offset.as_ref().map_or(2.0, |q| q.si);
    if !(0.0..=100.0).contains(&offset) {
        return Err(rep.error(
            "layout.offset",
            l.offset.as_ref().and_then(|q| q.span.clone()),
            format!("{offset} m is outside 0 … 100 m"),
        ));
    }
    let kind = match l.kind.trim() {
        "ring" => {
            let count = match (l.count, &l.max_spacing) {
                (Some(n), None) if n >= 3 => RingCount::Count(n),
                (Some(n), None) => return Err(rep.error("layout.count", None, format!("a ring needs at least 3 wells; got {n}"))),
                (None, Some(s)) => RingCount::MaxSpacing(check_positive(rep, "layout.max_spacing", s, "largest gap between wells")?),
                (Some(_), Some(_)) => return Err(rep.error("layout.count", None, "give count or max_spacing, not both")),
                (None, None) => return Err(rep.error("layout", None, "a ring needs count (number of wells) or max_spacing (largest gap, e.g. \"10 m\")")),
            };
            LayoutKind::Ring {
                count,
                corner_wells: l.corner_wells.unwrap_or(false),
            }
        }
        "line" => {
            let Some(s) = &l.spacing else {
                return Err(rep.error(
                    "layout.spacing",
                    None,
                    "a wellpoint line needs spacing, e.g. \"1.5 m\"",
                ));
            };
            let spacing = check_positive(rep, "layout.spacing", s, "spacing along the line")?;
            let both_sides = match l.sides.as_deref().map(str::trim) {
                None | Some("both") => true,
                Some("one") => false,
                Some(other) => {
                    return Err(rep.error(
                        "layout.sides",
                        None,
                        format!("unknown value \"{other}\"; valid: \"one\", \"both\""),
                    ))
                }
            };
            let end_extension = match &l.end_extension {
                Some(q) if (0.0..=500.0).contains(&q.si) => Some(q.si),
                Some(q) => {
                    return Err(rep.error(
                        "layout.end_extension",
                        q.span.clone(),
                        format!("{} m is outside 0 … 500 m", q.si),
                    ))
                }
                None => None,
            };
            let centre_line = match &l.centre_line {
                Some(c) => {
                    let pts = points(rep, "layout.centre_line", c)?;
                    if pts.len() < 2 {
                        return Err(rep.error(
                            "layout.centre_line",
                            Some(c.span()),
                            "a centre line needs at least 2 points",
                        ));
                    }
                    Some(pts)
                }
                None => None,
            };
            LayoutKind::Line {
                spacing,
                both_sides,
                centre_line,
                end_extension,
            }
        }
        "listed" => {
            if no_listed_wells {
                return Err(rep.error(
                    "layout.kind",
                    None,
                    "layout kind \"listed\" needs at least one [[well]] with name, x, y and rate",
                ));
            }
            LayoutKind::Listed
        }
        "csv" => {
            let Some(f) = &l.file else {
                return Err(rep.error(
                    "layout.file",
                    None,
                    "layout kind \"csv\" needs file, a CSV with columns name,x,y,rate_l_per_s",
                ));
            };
            let p = path.parent().unwrap_or(Path::new(".")).join(f);
            LayoutKind::Csv { path: p }
        }
        other => {
            return Err(rep.error(
                "layout.kind",
                None,
                format!(
                "unknown layout kind \"{other}\"; valid: \"ring\", \"line\", \"listed\", \"csv\""
            ),
            ))
        }
    };
    Ok(LayoutSpec {
        kind,
        excavation,
        offset,
        rate: l.rate.as_ref().map(|q| q.si),
    })
}

fn neighbour(
    rep: &Reporter,
    i: usize,
    n: &schema::Neighbour,
    names: &mut HashSet<String>,
) -> Result<Neighbour, InputError> {
    let f = |s: &str| format!("neighbour[{}].{s}", i + 1);
    if !names.insert(n.name.clone()) {
        return Err(rep.error(
            f("name"),
            Some(n.footprint.span()),
            format!(
                "duplicate neighbour name \"{}\"; each neighbour needs its own name",
                n.name
            ),
        ));
    }
    let footprint = polygon(rep, &f("footprint"), &n.footprint)?;
    let positive =
        |q: &Option<crate::input::units::Length>, name: &str| -> Result<Option<f64>, InputError> {
            q.as_ref()
                .map(|q| check_positive(rep, &f(name), q, "a limit greater than zero"))
                .transpose()
        };
    let mut layers = Vec::new();
    for (j, l) in n.layer.iter().enumerate() {
        let lf = format!("neighbour[{}].layer[{}]", i + 1, j + 1);
        let thickness = check_positive(
            rep,
            &format!("{lf}.thickness"),
            &l.thickness,
            "layer thickness",
        )?;
        let compressibility = match (&l.m_v, l.c_c, l.incompressible.unwrap_or(false)) {
            (Some(mv), None, false) => Compressibility::Mv(check_positive(
                rep,
                &format!("{lf}.m_v"),
                mv,
                "m_v, e.g. \"2e-4 1/kPa\"",
            )?),
            (None, Some(cc), false) => {
                let (Some(e0), Some(s0)) = (l.e0, &l.sigma0) else {
                    return Err(rep.error(&lf, None, "the C_c form needs c_c, e0 and sigma0 (initial effective stress, e.g. \"60 kPa\")"));
                };
                if !(cc > 0.0 && e0 > 0.0) {
                    return Err(rep.error(&lf, None, "c_c and e0 must be greater than zero"));
                }
                Compressibility::Cc {
                    cc,
                    e0,
                    sigma0: check_positive(
                        rep,
                        &format!("{lf}.sigma0"),
                        s0,
                        "initial effective stress",
                    )?,
                }
            }
            (None, None, true) => Compressibility::Incompressible,
            _ => {
                return Err(rep.error(
                    &lf,
                    None,
                    "give exactly one of: m_v; c_c with e0 and sigma0; or incompressible = true",
                ))
            }
        };
        let unit_weight = l
            .unit_weight
            .as_ref()
            .map(|q| check_positive(rep, &format!("{lf}.unit_weight"), q, "unit weight"))
            .transpose()?;
        let moist_unit_weight = l
            .moist_unit_weight
            .as_ref()
            .map(|q| check_positive(rep, &format!("{lf}.moist_unit_weight"), q, "unit weight"))
            .transpose()?;
        layers.push(SoilLayer {
            name: l.name.clone(),
            thickness,
            compressibility,
            unit_weight,
            moist_unit_weight,
        });
    }
    let buoyancy_loss = match n.stress_change.as_deref() {
        None | Some("simple") => false,
        Some("buoyancy-loss") => true,
        Some(other) => return Err(rep.error(f("stress_change"), None, format!("unknown stress_change \"{other}\"; valid: \"simple\" (γ_w·Δh, default) or \"buoyancy-loss\" (needs unit_weight and moist_unit_weight on every layer)"))),
    };
    if buoyancy_loss {
        for (j, l) in layers.iter().enumerate() {
            match (l.unit_weight, l.moist_unit_weight) {
                (Some(sat), Some(moist)) if moist <= sat => {}
                (Some(sat), Some(moist)) => return Err(rep.error(format!("neighbour[{}].layer[{}].moist_unit_weight", i + 1, j + 1), None, format!("{moist} kN/m3 is above the saturated unit weight {sat} kN/m3; a drained soil is lighter"))),
                _ => return Err(rep.error(format!("neighbour[{}].layer[{}]", i + 1, j + 1), None, "stress_change = \"buoyancy-loss\" needs unit_weight (saturated) and moist_unit_weight on every layer, e.g. \"20 kN/m3\" and \"17 kN/m3\"")),
            }
        }
    }
    if let Some(r) = &n.allowable_distortion {
        if !(r.value > 0.0 && r.value < 1.0) {
            return Err(rep.error(
                f("allowable_distortion"),
                r.span.clone(),
                format!("{} is not an angular distortion; give a fraction between 0 and 1, e.g. \"1/500\" (usual 1/1000 … 1/300)", r.value),
            ));
        }
    }
    Ok(Neighbour {
        name: n.name.clone(),
        footprint,
        foundation_level: n.foundation_level.as_ref().map(|q| q.si),
        allowable_drawdown: positive(&n.allowable_drawdown, "allowable_drawdown")?,
        allowable_settlement: positive(&n.allowable_settlement, "allowable_settlement")?,
        allowable_distortion: n.allowable_distortion.as_ref().map(|r| r.value),
        layers,
        buoyancy_loss,
        protect_with_recharge: n.protect_with_recharge.unwrap_or(false),
    })
}

fn check_settings(rep: &Reporter, c: Option<&schema::Checks>) -> Result<CheckSettings, InputError> {
    let grid = c.and_then(|c| c.grid_spacing.as_ref());
    let grid_spacing = match grid {
        Some(q) => check_positive(rep, "checks.grid_spacing", q, "grid spacing, e.g. \"2 m\"")?,
        None => DEFAULT_GRID_SPACING,
    };
    let edge = c.and_then(|c| c.edge_spacing.as_ref());
    let edge_spacing = match edge {
        Some(q) => check_positive(rep, "checks.edge_spacing", q, "spacing along edges")?,
        None => grid_spacing,
    };
    for (name, value, q) in [
        ("checks.grid_spacing", grid_spacing, grid),
        ("checks.edge_spacing", edge_spacing, edge),
    ] {
        if value < 0.1 {
            return Err(rep.error(name, q.and_then(|q| q.span.clone()), format!("{value} m is below 0.1 m: the check points would run to millions; usual 1 … 5 m (a unit slip, mm for m?)")));
        }
    }
    if let Some(p) = c.and_then(|c| {
        c.point
            .iter()
            .find(|p| !(p.x.is_finite() && p.y.is_finite()))
    }) {
        return Err(rep.error(
            "checks.point.x",
            None,
            format!(
                "point \"{}\": x and y must be finite numbers in metres",
                p.name
            ),
        ));
    }
    let points = c
        .map(|c| {
            c.point
                .iter()
                .map(|p| {
                    (
                        p.name.clone(),
                        [p.x, p.y],
                        p.target_level.as_ref().map(|q| q.si),
                    )
                })
                .collect()
        })
        .unwrap_or_default();
    Ok(CheckSettings {
        grid_spacing,
        edge_spacing,
        points,
    })
}

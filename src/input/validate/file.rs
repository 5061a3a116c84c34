//! Reading a design file: size-capped read, TOML parse with line numbers, and the assembly of the
//! validated [`Model`] from its checked parts.

use crate::input::error::{InputError, Reporter};
use crate::input::model::*;
use crate::input::schema::{self, DesignFile};
use crate::input::validate::shapes::{self, check_positive};
use crate::input::validate::wells;
use std::collections::HashSet;
use std::path::Path;

/// Largest design file read, bytes (16 MiB): a design file of 10⁵-vertex outlines is a few MiB.
pub const MAX_FILE_BYTES: u64 = crate::input::read::MAX_DESIGN_BYTES;

/// The one capped reader of input files (regular files only), see [`crate::input::read`].
pub use crate::input::read::read_capped;

/// Read, parse and validate a design file.
pub fn load(path: &Path) -> Result<Model, InputError> {
    let bytes = read_capped(path, MAX_FILE_BYTES, "design file")?;
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
    // A GeoJSON drawing in longitude/latitude is projected with the site's grid, if named.
    let site_crs = crate::input::import::resolve::mentions_drawings(source)
        .then(|| source.parse::<toml::Table>().ok())
        .flatten()
        .and_then(|t| t.get("site")?.get("crs")?.as_str().map(str::to_string));
    let resolved = crate::input::import::geojson_in::with_site_crs(site_crs.as_deref(), || {
        crate::input::import::resolve::resolve(path, source)
    })?;
    if let Some(r) = resolved {
        // Errors in the rewritten text cite the user's design file or drawing, not the rewrite.
        let rep = Reporter::new(path, &r.text);
        let raw: DesignFile = toml::from_str(&r.text)
            .map_err(|e| r.locate(source, parse_error(&rep, &r.text, &e)))?;
        let mut model = validate(path, &rep, raw).map_err(|e| r.locate(source, e))?;
        model.import_notes = r.notes;
        model.drawing_unit = r.drawing_unit;
        model.drawings = r.files;
        return Ok(model);
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
    } else if message.contains("invalid type: map, expected a sequence") {
        // `[excavation]` (one table) where the schema takes a list, `[[excavation]]`.
        let name = field
            .trim_matches(|c| c == '[' || c == ']')
            .trim()
            .to_string();
        let name = if name.is_empty() {
            "name".to_string()
        } else {
            name
        };
        message = format!(
            "[{name}] is written as a single table, but drydig takes a list of them here: write [[{name}]] (double brackets) before each one"
        );
        field = name;
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

/// The allowances: contingency (0 … 3) and the length/width ratio from which an excavation is a
/// trench (at least 1). Returns (contingency, trench aspect ratio).
fn allowances(rep: &Reporter, raw: &DesignFile) -> Result<(f64, f64), InputError> {
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
    Ok((contingency_value, aspect))
}

/// The listed wells (`[[well]]`): unique names, finite positions, a positive radius (default the
/// wells' radius).
fn listed_wells(
    rep: &Reporter,
    raw: &DesignFile,
    wells: &WellSpec,
) -> Result<Vec<ListedWell>, InputError> {
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
    Ok(listed_wells)
}

/// The neighbouring structures (`[[neighbour]]`), with unique names.
fn neighbours(rep: &Reporter, raw: &DesignFile) -> Result<Vec<Neighbour>, InputError> {
    let mut neighbours = Vec::new();
    let mut neighbour_names = HashSet::new();
    for (i, n) in raw.neighbour.iter().enumerate() {
        neighbours.push(crate::input::validate::neighbours::neighbour(
            rep,
            i,
            n,
            &mut neighbour_names,
        )?);
    }
    Ok(neighbours)
}

/// The quantity the maps show: drawdown (the default) or water level.
fn map_quantity(
    rep: &Reporter,
    output: Option<&schema::Output>,
) -> Result<MapQuantity, InputError> {
    let quantity = match output.and_then(|o| o.map.as_deref()) {
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
    Ok(quantity)
}

fn validate(path: &Path, rep: &Reporter, raw: DesignFile) -> Result<Model, InputError> {
    crate::input::validate::ranges::check(rep, &raw)?;
    // Site.
    if raw.site.name.trim().is_empty() {
        return Err(rep.error("site.name", None, "must not be empty"));
    }
    let ground = raw.site.ground_level.si;

    let aquifer = crate::input::validate::aquifer::aquifer(rep, &raw, ground)?;
    let layers = crate::input::validate::layers::layers(rep, &raw, &aquifer)?;
    let walls = crate::input::validate::walls::walls(rep, &raw, &aquifer)?;
    let top_kv = aquifer.conductivity * raw.aquifer.anisotropy.unwrap_or(1.0);
    let layers =
        crate::input::validate::walls::split_at_toes(rep, layers, &aquifer, top_kv, &walls)?;
    let top_aquifer = aquifer.clone();
    // with layers, excavations and screens may reach down to the lowest aquifer's base
    let base = layers
        .as_ref()
        .map_or(aquifer.base_level, |l| l.lowest_base());
    let mut excavations = shapes::excavations(rep, &raw, ground, base)?;
    // in layered ground the design works in the aquifer holding the first excavation's target
    // (the gravel under a shaft, the sand round a basement); the others are in `layers`
    let aquifer = match (&layers, excavations.first()) {
        (Some(g), Some(e)) => g.aquifers[g.aquifer_at(e.target_level())].aquifer.clone(),
        _ => aquifer,
    };
    let influence = crate::input::validate::aquifer::influence(rep, &raw, &aquifer)?;
    let (contingency_value, aspect) = allowances(rep, &raw)?;

    // Wells.
    let screened_ground = crate::physics::potential::Aquifer {
        base_level: base,
        ..aquifer.clone()
    };
    let wells = wells::well_spec(rep, raw.wells.as_ref(), &screened_ground, ground)?;
    let as_built = crate::input::validate::as_built::as_built(
        rep,
        &raw.aquifer,
        raw.wells.as_ref(),
        &wells,
        ground,
    )?;

    let listed_wells = listed_wells(rep, &raw, &wells)?;

    let mut layout = match &raw.layout {
        Some(l) => Some(wells::layout_spec(
            rep,
            path,
            l,
            &excavations,
            listed_wells.is_empty(),
        )?),
        None => None,
    };

    // a rolling run: the excavation becomes its open length, the line its installed length
    let rolling = crate::input::validate::rolling::rolling(
        rep,
        raw.rolling.as_ref(),
        &mut excavations,
        layout.as_mut(),
    )?;
    if rolling.is_some() && raw.programme.is_some() {
        return Err(rep.error(
            "programme",
            None,
            "drydig programme does not yet move a rolling set along the trench; run the [programme] without [rolling] (the trench dug in stages), or leave out [programme]",
        ));
    }
    let (boundaries, keep_outs) = shapes::boundaries_and_keep_outs(rep, &raw, &excavations)?;
    crate::input::validate::walls::check_sealed(
        rep,
        &walls,
        layers.as_ref(),
        &top_aquifer,
        &excavations,
        &listed_wells,
    )?;
    let neighbours = neighbours(rep, &raw)?;

    let checks = check_settings(rep, raw.checks.as_ref())?;
    crate::input::validate::walls::check_positions(rep, &walls, &listed_wells, &checks.points)?;
    let uplift = crate::input::validate::neighbours::uplift(rep, &raw, &excavations)?;
    let output = raw.output.as_ref();
    let map_quantity = map_quantity(rep, output)?;

    let programme = crate::input::validate::programme::programme(
        rep,
        raw.programme.as_ref(),
        &excavations,
        &aquifer,
        ground,
    )?;

    let design =
        crate::input::validate::design_settings::design_settings(rep, &raw, ground, wells.kind)?;
    let bid = crate::input::validate::bid::bid_settings(
        rep,
        raw.bid.as_ref(),
        wells.kind == crate::input::model::WellKind::Wellpoint,
    )?;
    let (crs, crs_warnings) =
        crate::input::validate::site_grid::site_crs(rep, raw.site.crs.as_deref(), &excavations)?;
    let mut model = Model {
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
        layers,
        excavations,
        influence,
        contingency: contingency_value,
        trench_aspect_ratio: aspect,
        wells,
        layout,
        listed_wells,
        boundaries,
        walls,
        keep_outs,
        neighbours,
        checks,
        uplift,
        units: output.and_then(|o| o.units).unwrap_or_default(),
        map_quantity,
        as_built,
        design,
        programme,
        bid,
        rolling,
        output: crate::input::validate::output::output_settings(rep, output)?,
        crs,
        crs_warnings,
        import_notes: Vec::new(),
        drawing_unit: None,
        drawings: Vec::new(),
        uncertainty: None,
    };
    model.uncertainty =
        crate::input::validate::uncertainty::uncertainty(rep, raw.uncertainty.as_ref(), &model)?;
    crate::input::validate::sides::check_points_and_neighbours(&model)?;
    let listed: Vec<(&str, [f64; 2], f64)> = model
        .listed_wells
        .iter()
        .map(|w| (w.name.as_str(), w.position, w.radius))
        .collect();
    crate::input::validate::sides::check_wells(&model, &listed, "well")?;
    crate::input::validate::derived::check(rep, &model)?;
    Ok(model)
}

/// The check-point settings: grid spacing, edge points, named points.
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

//! Geometry taken from drawings named in the design file: `outline_from` (excavations),
//! `footprint_from` (neighbours), `line_from` (boundaries, and cut-off walls: `wall_from`),
//! `outline_from` (keep-out zones) and
//! `[layout] wells_from` (given wells), each `{ file = "drawings/site.dxf", layer = "EXCAVATION" }`
//! for a DXF drawing or `{ file = "site.geojson", property = "layer", value = "excavation" }`
//! for GeoJSON, with optional `name` (pick one of several items), `units` (a unitless DXF) and,
//! for wells, `rate`. Paths are relative to the design file.
//!
//! The design text is rewritten before it is parsed: each `…_from` table is replaced by the
//! coordinates it names, so validation sees an ordinary design file. What the readers did (arcs
//! flattened, units converted) comes back as notes for the report.

use super::dxf_in::{self, DrawingUnit, DxfOptions};
use super::geojson_in::{self, PropertyFilter};
use super::Drawing;
use crate::input::error::InputError;
use crate::input::import::notes::ImportNote;
use std::path::{Path, PathBuf};
use toml::{Table, Value};

/// The design text with every drawing reference replaced, and the readers' notes.
#[derive(Debug, Clone)]
pub struct Resolved {
    /// The rewritten design text (TOML).
    pub text: String,
    /// What was read from where, and what was done to it.
    pub notes: Vec<ImportNote>,
    /// The unit of the first DXF drawing read (`design.dxf` is written in it).
    pub drawing_unit: Option<DrawingUnit>,
    /// Fields of the rewritten text that came from a drawing (`well[3]`,
    /// `excavation[1].outline`), each with where in which drawing.
    pub sources: Vec<(String, String)>,
    /// Every drawing read, once each, in the order first read (inputs of the run).
    pub files: Vec<PathBuf>,
}

impl Resolved {
    /// An error found in the rewritten text, made to cite the user's files: a field read from a
    /// drawing names the drawing and the entity (no line: the user's design file has none for
    /// it); any other field gets the line of the user's design file (`original`) that holds the
    /// same text, or no line.
    pub fn locate(&self, original: &str, mut e: InputError) -> InputError {
        let from = self
            .sources
            .iter()
            .find(|(f, _)| e.field == *f || e.field.starts_with(&format!("{f}.")));
        if let Some((_, place)) = from {
            e.line = None;
            e.message = format!("{} (read from {place})", e.message);
            return e;
        }
        e.line = e.line.and_then(|l| {
            let wanted = self.text.lines().nth(l.checked_sub(1)?)?.trim();
            if wanted.is_empty() {
                return None;
            }
            original
                .lines()
                .position(|o| o.trim() == wanted)
                .map(|i| i + 1)
        });
        e
    }
}

fn err(file: &Path, field: &str, message: impl Into<String>) -> InputError {
    InputError {
        file: file.to_path_buf(),
        field: field.to_string(),
        line: None,
        message: message.into(),
    }
}

const KEYS: [&str; 4] = ["outline_from", "footprint_from", "line_from", "wells_from"];

/// True when the text may name a drawing (a cheap test before parsing twice).
pub fn mentions_drawings(source: &str) -> bool {
    KEYS.iter().any(|k| source.contains(k))
}

struct Reference {
    file: PathBuf,
    shown: String,
    layer: Option<String>,
    property: Option<(String, String)>,
    name: Option<String>,
    units: Option<DrawingUnit>,
}

fn reference(design: &Path, field: &str, v: &Value) -> Result<Reference, InputError> {
    let help = "give { file = \"drawings/site.dxf\", layer = \"EXCAVATION\" } for a DXF drawing or { file = \"site.geojson\", property = \"layer\", value = \"excavation\" } for GeoJSON (optional: name, units)";
    let t = v
        .as_table()
        .ok_or_else(|| err(design, field, format!("expected a table; {help}")))?;
    for k in t.keys() {
        if ![
            "file", "layer", "property", "value", "name", "units", "rate",
        ]
        .contains(&k.as_str())
        {
            return Err(err(
                design,
                &format!("{field}.{k}"),
                format!("unknown key `{k}`; valid keys: file, layer, property, value, name, units (and rate for wells)"),
            ));
        }
    }
    let s = |k: &str| t.get(k).and_then(Value::as_str).map(str::to_string);
    let shown = s("file").ok_or_else(|| {
        err(
            design,
            &format!("{field}.file"),
            format!("missing `file`; {help}"),
        )
    })?;
    let base = design.parent().unwrap_or(Path::new("."));
    let units = match s("units") {
        None => None,
        Some(u) => Some(DrawingUnit::parse(&u).ok_or_else(|| {
            err(
                design,
                &format!("{field}.units"),
                format!("unknown drawing unit \"{u}\"; valid: mm, cm, m, ft, in"),
            )
        })?),
    };
    let property = match (s("property"), s("value")) {
        (Some(p), Some(v)) => Some((p, v)),
        (None, None) => None,
        _ => return Err(err(
            design,
            field,
            "give both `property` and `value` (e.g. property = \"layer\", value = \"excavation\")",
        )),
    };
    Ok(Reference {
        file: base.join(&shown),
        shown,
        layer: s("layer"),
        property,
        name: s("name"),
        units,
    })
}

fn read(design: &Path, field: &str, r: &Reference, lines: bool) -> Result<Drawing, InputError> {
    let ext = r
        .file
        .extension()
        .and_then(|e| e.to_str())
        .unwrap_or("")
        .to_ascii_lowercase();
    match ext.as_str() {
        "dxf" => {
            let layer = r.layer.clone().ok_or_else(|| {
                err(
                    design,
                    &format!("{field}.layer"),
                    "a DXF reference needs `layer` (the CAD layer holding the item)",
                )
            })?;
            let mut o = DxfOptions::layer(layer);
            o.unit = r.units;
            o.open_as_lines = lines;
            dxf_in::read(&r.file, &o)
        }
        "geojson" | "json" => {
            let filter = match (&r.property, &r.layer) {
                (Some((p, v)), _) => PropertyFilter::new(p, v),
                (None, Some(l)) => PropertyFilter::new("layer", l),
                (None, None) => {
                    return Err(err(design, field, "a GeoJSON reference needs `property` and `value` (or `layer`, read as the property \"layer\")"))
                }
            };
            geojson_in::read(&r.file, &filter)
        }
        _ => Err(err(
            design,
            &format!("{field}.file"),
            format!("\"{}\": expected a .dxf or .geojson file", r.shown),
        )),
    }
}

/// What a drawing reference picks: an outline (closed), a wall line (open or closed) or a
/// boundary line (open).
#[derive(Clone, Copy)]
enum Wanted {
    Outline,
    WallLine,
    BoundaryLine,
}

impl Wanted {
    /// The noun in messages: "outline", "wall line", "line".
    fn noun(self) -> &'static str {
        match self {
            Wanted::Outline => "outline",
            Wanted::WallLine => "wall line",
            Wanted::BoundaryLine => "line",
        }
    }

    /// The error when the layer or property selects nothing of this kind in `shown`.
    fn none_found(self, shown: &str) -> String {
        let kind = match self {
            Wanted::Outline => "closed outline (closed polyline or polygon)",
            Wanted::WallLine => "wall line (polyline, open or closed)",
            Wanted::BoundaryLine => "open line (polyline or LineString)",
        };
        format!("no {kind} found in {shown} with that layer or property")
    }
}

fn pick<'a, T>(
    design: &Path,
    field: &str,
    r: &Reference,
    items: &'a [super::Shape<T>],
    wanted: Wanted,
) -> Result<&'a super::Shape<T>, InputError> {
    let what = wanted.noun();
    let names: Vec<&str> = items.iter().map(|s| s.name.as_str()).collect();
    match &r.name {
        Some(n) => items
            .iter()
            .find(|s| s.name.eq_ignore_ascii_case(n))
            .ok_or_else(|| {
                err(
                    design,
                    &format!("{field}.name"),
                    format!(
                        "no {what} named \"{n}\" in {}; found: {}",
                        r.shown,
                        names.join(", ")
                    ),
                )
            }),
        None if items.len() == 1 => Ok(&items[0]),
        None if items.is_empty() => Err(err(design, field, wanted.none_found(&r.shown))),
        None => Err(err(
            design,
            &format!("{field}.name"),
            format!(
                "{} holds {} {what}s ({}); pick one with `name = \"…\"`",
                r.shown,
                items.len(),
                names.join(", ")
            ),
        )),
    }
}

fn coords(c: impl Iterator<Item = (f64, f64)>) -> Value {
    Value::Array(
        c.map(|(x, y)| Value::Array(vec![Value::Float(x), Value::Float(y)]))
            .collect(),
    )
}

fn ring(p: &geo::Polygon<f64>) -> Value {
    let mut v: Vec<(f64, f64)> = p.exterior().0.iter().map(|c| (c.x, c.y)).collect();
    if v.len() > 1 && v.first() == v.last() {
        v.pop();
    }
    coords(v.into_iter())
}

/// What the readers did: notes for the report, the first DXF unit, and which rewritten fields
/// came from where.
#[derive(Default)]
struct Log {
    notes: Vec<ImportNote>,
    unit: Option<DrawingUnit>,
    sources: Vec<(String, String)>,
    files: Vec<PathBuf>,
}

impl Log {
    /// Remember that `target` (a field of the rewritten text) came from `source` of `r`.
    fn source(&mut self, target: String, r: &Reference, source: &str) {
        self.sources
            .push((target, format!("{}, {source}", r.shown)));
    }
}

fn note(log: &mut Log, field: &str, r: &Reference, got: &Drawing, item: &str) {
    if log.unit.is_none() {
        log.unit = got.unit;
    }
    if !log.files.contains(&r.file) {
        log.files.push(r.file.clone());
    }
    let mut read = format!("{field}: {item} read from {}", r.shown);
    if let Some(l) = &r.layer {
        read.push_str(&format!(", layer {l}"));
    }
    log.notes.push(ImportNote {
        read,
        did: got.notes.clone(),
    });
}

/// Replace `key` (a drawing reference) in `t` by `target` geometry.
fn polygon_from(
    design: &Path,
    field: &str,
    t: &mut Table,
    key: &str,
    target: &str,
    log: &mut Log,
) -> Result<(), InputError> {
    let Some(v) = t.remove(key) else {
        return Ok(());
    };
    let f = format!("{field}.{key}");
    if t.contains_key(target) {
        return Err(err(
            design,
            &f,
            format!("give either `{target}` or `{key}`, not both"),
        ));
    }
    let r = reference(design, &f, &v)?;
    let got = read(design, &f, &r, false)?;
    if got.polygons.is_empty() && !got.lines.is_empty() {
        let names: Vec<&str> = got.lines.iter().map(|l| l.name.as_str()).collect();
        return Err(err(
            design,
            &f,
            format!(
                "{} holds only open lines there ({}); an outline must be a closed polyline — close it in the drawing (last vertex joined to the first)",
                r.shown,
                names.join(", ")
            ),
        ));
    }
    let s = pick(design, &f, &r, &got.polygons, Wanted::Outline)?;
    note(log, &f, &r, &got, &format!("\"{}\" ({})", s.name, s.source));
    log.source(format!("{field}.{target}"), &r, &s.source);
    t.insert(target.into(), ring(&s.geometry));
    Ok(())
}

/// A wall line picked from a drawing: its vertices (m) and whether it closes on itself.
type WallLine = super::Shape<(Vec<(f64, f64)>, bool)>;

/// Replace a wall's `line_from` (a drawing reference) in `t` by its `line` and `closed`: an
/// open polyline (DXF LWPOLYLINE/POLYLINE/LINE/ARC, GeoJSON LineString) gives an open wall, a
/// closed one (DXF closed polyline, GeoJSON Polygon) a wall round on itself, as does an open
/// polyline whose ends meet (within 1 mm: drawn round but not flagged closed). A `closed` given
/// beside `line_from` must agree with the drawing.
fn wall_from(design: &Path, field: &str, t: &mut Table, log: &mut Log) -> Result<(), InputError> {
    let Some(v) = t.remove("line_from") else {
        return Ok(());
    };
    let f = format!("{field}.line_from");
    if t.contains_key("line") {
        return Err(err(
            design,
            &f,
            "give either `line` (the vertices typed) or `line_from` (read from a drawing), not both",
        ));
    }
    let r = reference(design, &f, &v)?;
    if v.get("rate").is_some() {
        return Err(err(
            design,
            &format!("{f}.rate"),
            "unknown key `rate` for a wall; valid keys: file, layer, property, value, name, units",
        ));
    }
    let got = read(design, &f, &r, true)?;
    // Every line and every closed outline picked, as (vertices, closed).
    let mut found: Vec<WallLine> = Vec::new();
    for s in &got.lines {
        let mut pts: Vec<(f64, f64)> = s.geometry.0.iter().map(|c| (c.x, c.y)).collect();
        let (a, b) = (pts[0], pts[pts.len() - 1]);
        let ends_meet = pts.len() > 3 && (b.0 - a.0).hypot(b.1 - a.1) < 1e-3;
        if ends_meet {
            pts.pop();
        }
        found.push(super::Shape {
            name: s.name.clone(),
            source: s.source.clone(),
            geometry: (pts, ends_meet),
        });
    }
    for s in &got.polygons {
        if !s.geometry.interiors().is_empty() {
            return Err(err(
                design,
                &f,
                format!(
                    "\"{}\" ({}) in {} is a polygon with holes; a wall is one line — draw it as a polyline or a polygon without holes",
                    s.name, s.source, r.shown
                ),
            ));
        }
        let mut pts: Vec<(f64, f64)> = s.geometry.exterior().0.iter().map(|c| (c.x, c.y)).collect();
        if pts.len() > 1 && pts.first() == pts.last() {
            pts.pop();
        }
        found.push(super::Shape {
            name: s.name.clone(),
            source: s.source.clone(),
            geometry: (pts, true),
        });
    }
    if found.is_empty() {
        return Err(err(
            design,
            &f,
            format!(
                "no line or outline found in {} with that layer or property (only points); draw the wall as a polyline, open or closed",
                r.shown
            ),
        ));
    }
    let s = pick(design, &f, &r, &found, Wanted::WallLine)?;
    let (pts, closed) = &s.geometry;
    match t.get("closed").map(Value::as_bool) {
        None => {}
        Some(Some(c)) if c == *closed => {}
        Some(Some(c)) => {
            return Err(err(
                design,
                &format!("{field}.closed"),
                format!(
                    "closed = {c}, but \"{}\" in {} is {}; leave `closed` out when the line comes from a drawing (the drawing says whether it closes)",
                    s.name,
                    r.shown,
                    if *closed { "a closed polyline or polygon" } else { "an open polyline" }
                ),
            ))
        }
        Some(None) => {
            return Err(err(
                design,
                &format!("{field}.closed"),
                "expected true or false",
            ))
        }
    }
    let shape = if *closed { "closed" } else { "open" };
    note(
        log,
        &f,
        &r,
        &got,
        &format!(
            "\"{}\" ({}, {shape}, {} vertices)",
            s.name,
            s.source,
            pts.len()
        ),
    );
    log.source(format!("{field}.line"), &r, &s.source);
    t.insert("line".into(), coords(pts.iter().copied()));
    t.insert("closed".into(), Value::Boolean(*closed));
    Ok(())
}

/// Rewrite `source` when it names drawings; `None` when it names none.
pub fn resolve(design: &Path, source: &str) -> Result<Option<Resolved>, InputError> {
    if !mentions_drawings(source) {
        return Ok(None);
    }
    // A file that does not parse is left to the ordinary parser, which explains why.
    let Ok(mut doc) = source.parse::<Table>() else {
        return Ok(None);
    };
    let mut log = Log::default();
    let mut any = false;
    for (section, key, target) in [
        ("excavation", "outline_from", "outline"),
        ("neighbour", "footprint_from", "footprint"),
        ("keep_out", "outline_from", "outline"),
    ] {
        if let Some(Value::Array(items)) = doc.get_mut(section) {
            for (i, item) in items.iter_mut().enumerate() {
                if let Some(t) = item.as_table_mut() {
                    any |= t.contains_key(key);
                    polygon_from(
                        design,
                        &format!("{section}[{}]", i + 1),
                        t,
                        key,
                        target,
                        &mut log,
                    )?;
                }
            }
        }
    }
    if let Some(Value::Array(items)) = doc.get_mut("boundary") {
        for (i, item) in items.iter_mut().enumerate() {
            let Some(t) = item.as_table_mut() else {
                continue;
            };
            let Some(v) = t.remove("line_from") else {
                continue;
            };
            any = true;
            let f = format!("boundary[{}].line_from", i + 1);
            let r = reference(design, &f, &v)?;
            let got = read(design, &f, &r, true)?;
            let s = pick(design, &f, &r, &got.lines, Wanted::BoundaryLine)?;
            let pts = &s.geometry.0;
            let (a, b) = (pts[0], pts[pts.len() - 1]);
            note(
                &mut log,
                &f,
                &r,
                &got,
                &format!("\"{}\" (straight from its first to its last point)", s.name),
            );
            log.source(format!("boundary[{}].line", i + 1), &r, &s.source);
            t.insert("line".into(), coords([(a.x, a.y), (b.x, b.y)].into_iter()));
        }
    }
    if let Some(Value::Array(items)) = doc.get_mut("wall") {
        for (i, item) in items.iter_mut().enumerate() {
            if let Some(t) = item.as_table_mut() {
                any |= t.contains_key("line_from");
                wall_from(design, &format!("wall[{}]", i + 1), t, &mut log)?;
            }
        }
    }
    if let Some(layout) = doc.get_mut("layout").and_then(Value::as_table_mut) {
        if let Some(v) = layout.remove("wells_from") {
            any = true;
            let f = "layout.wells_from";
            let r = reference(design, f, &v)?;
            let rate = v.get("rate").and_then(Value::as_str).ok_or_else(|| {
                err(
                    design,
                    &format!("{f}.rate"),
                    "give the rate of every well read from the drawing, e.g. rate = \"4 L/s\"",
                )
            })?;
            let got = read(design, f, &r, false)?;
            if got.points.is_empty() {
                return Err(err(
                    design,
                    f,
                    format!(
                        "no wells (points, circles or block inserts) found in {}",
                        r.shown
                    ),
                ));
            }
            let listed = doc
                .get("well")
                .and_then(Value::as_array)
                .map_or(0, Vec::len);
            let mut wells = Vec::new();
            for m in &got.points {
                log.source(format!("well[{}]", listed + wells.len() + 1), &r, &m.source);
                let mut w = Table::new();
                w.insert("name".into(), Value::String(m.name.clone()));
                w.insert("x".into(), Value::Float(m.at.x()));
                w.insert("y".into(), Value::Float(m.at.y()));
                w.insert("rate".into(), Value::String(rate.to_string()));
                if let Some(rad) = m.radius {
                    w.insert("radius".into(), Value::String(format!("{rad} m")));
                }
                wells.push(Value::Table(w));
            }
            note(&mut log, f, &r, &got, &format!("{} wells", wells.len()));
            let list = doc
                .entry("well")
                .or_insert_with(|| Value::Array(Vec::new()));
            if let Value::Array(a) = list {
                a.extend(wells);
            }
        }
    }
    if !any {
        return Ok(None);
    }
    let text = toml::to_string(&doc).map_err(|e| {
        err(
            design,
            "",
            format!("cannot rewrite the design file after reading its drawings: {e}"),
        )
    })?;
    Ok(Some(Resolved {
        text,
        notes: log.notes,
        drawing_unit: log.unit,
        sources: log.sources,
        files: log.files,
    }))
}

#[cfg(test)]
mod tests {
    use super::Wanted;

    /// A boundary line is an open polyline: the error for an empty selection must not ask for
    /// a closed one, while an outline's must (an excavation outline encloses an area).
    #[test]
    fn empty_selection_names_the_kind_of_line_wanted() {
        let boundary = Wanted::BoundaryLine.none_found("site.dxf");
        assert!(boundary.starts_with("no open line"), "{boundary}");
        assert!(!boundary.contains("closed"), "{boundary}");
        let outline = Wanted::Outline.none_found("site.dxf");
        assert!(outline.starts_with("no closed outline"), "{outline}");
        let wall = Wanted::WallLine.none_found("site.geojson");
        assert!(wall.contains("open or closed"), "{wall}");
    }
}

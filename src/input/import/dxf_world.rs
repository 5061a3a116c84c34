//! DXF entities placed in the world: object coordinates (OCS) to world coordinates (WCS), block
//! references (INSERT) expanded with their transform, bulges flattened — all in drawing units,
//! in plan (x east, y north), before any unit conversion.
//!
//! **Arbitrary axis algorithm** (Autodesk, *DXF Reference*, "Object Coordinate Systems (OCS)" /
//! "Arbitrary Axis Algorithm"): an entity with extrusion N has OCS axes
//! Ax = (W_y × N)/|…| when |N_x| < 1/64 and |N_y| < 1/64, else (W_z × N)/|…|; Ay = (N × Ax)/|…|;
//! a point (x, y, z) of the OCS is x·Ax + y·Ay + z·N in the world. A mirrored entity has
//! N = (0, 0, −1), so Ax = (−1, 0, 0), Ay = (0, 1, 0): x changes sign. LWPOLYLINE, 2D
//! POLYLINE, CIRCLE, ARC, TEXT and INSERT are OCS entities; LINE, POINT, MTEXT and 3D polylines
//! are given in world coordinates already (their extrusion only sets the thickness direction).
//! Entities whose N is not along ±z (drawn in a tilted plane: a circle would be an ellipse in
//! plan) are refused.
//!
//! **INSERT** (*DXF Reference*, INSERT group codes 10/41/42/50/70/71/44/45 and BLOCK 10): a
//! block point p lands at OCS(N)·(P + R(θ)·(S·(p − B) + (c·Δc, r·Δr))), with B the block's base
//! point, S = diag(x scale, y scale) (negative = mirrored), θ the rotation, P the insertion
//! point and (c, r) the column and row of a MINSERT array. Nested blocks compose their
//! transforms. Entities on layer `0` inside a block take the layer of the INSERT that places
//! them (the CAD convention); others keep their own layer.
//!
//! Arcs (bulges, ARC entities) are flattened in the entity's own coordinates with the chord
//! tolerance divided by the largest stretch of the transform, so the flattened line stays within
//! the tolerance in the world even under an unequal scale. Work is bounded: the vertices an arc
//! will become are counted before it is expanded, and the entities visited, the nesting depth
//! and the vertices in all are capped.

use super::dxf_arcs::{arc_steps, flatten, planned_vertices};
use dxf::entities::{Entity, EntityType, Insert};
use dxf::{Point as DxfPoint, Vector};
use std::collections::HashMap;

/// Most vertices one outline or line may have after its arcs are flattened (the design file's
/// own limit for an outline).
pub const MAX_ITEM_VERTICES: usize = crate::input::validate::ranges::MAX_VERTICES;
/// Most vertices read from one layer in all, after flattening and block expansion.
pub const MAX_TOTAL_VERTICES: usize = 2_000_000;
/// Most entities visited while expanding block references (copies of arrays included).
pub const MAX_VISITS: usize = 2_000_000;
/// Deepest nesting of blocks followed.
pub const MAX_DEPTH: usize = 16;
pub use super::dxf_arcs::MAX_ARC_STEPS;

/// A plane affine map, x' = a·x + b·y + c, y' = d·x + e·y + f.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Affine {
    m: [f64; 6],
}

impl Affine {
    /// The identity.
    pub const IDENTITY: Affine = Affine {
        m: [1.0, 0.0, 0.0, 0.0, 1.0, 0.0],
    };

    fn new(a: f64, b: f64, c: f64, d: f64, e: f64, f: f64) -> Affine {
        Affine {
            m: [a, b, c, d, e, f],
        }
    }

    fn translate(x: f64, y: f64) -> Affine {
        Affine::new(1.0, 0.0, x, 0.0, 1.0, y)
    }

    fn rotate_degrees(deg: f64) -> Affine {
        let (s, c) = deg.to_radians().sin_cos();
        Affine::new(c, -s, 0.0, s, c, 0.0)
    }

    fn scale(sx: f64, sy: f64) -> Affine {
        Affine::new(sx, 0.0, 0.0, 0.0, sy, 0.0)
    }

    /// `self` first, then `outer`.
    pub fn then(self, outer: Affine) -> Affine {
        let [a, b, c, d, e, f] = self.m;
        let [p, q, r, s, t, u] = outer.m;
        Affine::new(
            p * a + q * d,
            p * b + q * e,
            p * c + q * f + r,
            s * a + t * d,
            s * b + t * e,
            s * c + t * f + u,
        )
    }

    /// The image of (x, y).
    pub fn apply(&self, x: f64, y: f64) -> (f64, f64) {
        let [a, b, c, d, e, f] = self.m;
        (a * x + b * y + c, d * x + e * y + f)
    }

    /// Determinant of the linear part (negative: mirrored).
    pub fn det(&self) -> f64 {
        self.m[0] * self.m[4] - self.m[1] * self.m[3]
    }

    /// The largest factor by which the map stretches a length (the larger singular value).
    pub fn max_stretch(&self) -> f64 {
        let [a, b, _, d, e, _] = self.m;
        let s = a * a + b * b + d * d + e * e;
        let det = self.det();
        ((s + (s * s - 4.0 * det * det).max(0.0).sqrt()) / 2.0).sqrt()
    }

    /// The scale factor when the map keeps shapes (rotation, uniform scale, mirror), else `None`.
    pub fn uniform_scale(&self) -> Option<f64> {
        let [a, b, _, d, e, _] = self.m;
        let s = self.max_stretch();
        let eps = 1e-9 * s.max(1e-300);
        let similar = ((a - e).abs() < eps && (b + d).abs() < eps)
            || ((a + e).abs() < eps && (b - d).abs() < eps);
        similar.then_some(s)
    }
}

/// The plan map of an entity's OCS with extrusion `n` (arbitrary axis algorithm, module notes);
/// an error for a zero or tilted extrusion.
pub fn ocs_to_world(n: &Vector) -> Result<Affine, String> {
    let len = (n.x * n.x + n.y * n.y + n.z * n.z).sqrt();
    if !len.is_finite() || len == 0.0 {
        return Err(format!(
            "the extrusion direction ({}, {}, {}) is not a direction",
            n.x, n.y, n.z
        ));
    }
    let (nx, ny, nz) = (n.x / len, n.y / len, n.z / len);
    if nx.abs() > 1e-9 || ny.abs() > 1e-9 {
        return Err(format!(
            "drawn in a tilted plane (extrusion {:.4}, {:.4}, {:.4}); drydig reads entities drawn \
             in plan (extrusion 0, 0, ±1): flatten it onto the plan in the CAD program",
            nx, ny, nz
        ));
    }
    let cross = |a: (f64, f64, f64), b: (f64, f64, f64)| {
        (
            a.1 * b.2 - a.2 * b.1,
            a.2 * b.0 - a.0 * b.2,
            a.0 * b.1 - a.1 * b.0,
        )
    };
    let unit = |v: (f64, f64, f64)| {
        let l = (v.0 * v.0 + v.1 * v.1 + v.2 * v.2).sqrt();
        (v.0 / l, v.1 / l, v.2 / l)
    };
    let nn = (nx, ny, nz);
    let ax = if nx.abs() < 1.0 / 64.0 && ny.abs() < 1.0 / 64.0 {
        unit(cross((0.0, 1.0, 0.0), nn))
    } else {
        unit(cross((0.0, 0.0, 1.0), nn))
    };
    let ay = unit(cross(nn, ax));
    // The OCS z (elevation) times N has no plan component for N along ±z.
    Ok(Affine::new(ax.0, ay.0, 0.0, ax.1, ay.1, 0.0))
}

/// One thing found on the layer, placed in the world (drawing units).
#[derive(Debug, Clone)]
pub struct Placed {
    /// Where it came from: `handle 2F` or `handle 2F, block WELL`.
    pub source: String,
    /// The innermost block reference that placed it, an index into [`World::instances`].
    pub instance: Option<usize>,
    /// What it is.
    pub kind: PlacedKind,
}

/// The kinds of thing read.
#[derive(Debug, Clone)]
pub enum PlacedKind {
    /// A polyline (closed or open), a LINE, or an ARC, arcs flattened.
    Path {
        /// Vertices, the first not repeated at the end of a closed one.
        points: Vec<(f64, f64)>,
        /// Closed (an outline).
        closed: bool,
        /// A LINE or ARC entity (never an outline).
        line_entity: bool,
    },
    /// A POINT, a CIRCLE (with its radius when its shape is kept), or the insertion point of a
    /// block reference holding no point or circle on the layer (a symbol).
    Point {
        /// Position.
        at: (f64, f64),
        /// Radius, drawing units.
        radius: Option<f64>,
    },
    /// A TEXT or MTEXT: position, height (drawing units) and the text.
    Text {
        /// Insertion point.
        at: (f64, f64),
        /// Text height (0 when unknown).
        height: f64,
        /// The words, formatting removed.
        text: String,
    },
}

/// A block reference on the layer that was expanded.
#[derive(Debug, Clone)]
pub struct Instance {
    /// Its insertion point in the world.
    pub at: (f64, f64),
    /// Its attributes, (tag, value).
    pub attributes: Vec<(String, String)>,
    /// The reference that placed it (nested blocks).
    pub parent: Option<usize>,
}

/// Everything on one layer, in the world.
#[derive(Debug, Default)]
pub struct World {
    /// The items, in drawing order.
    pub items: Vec<Placed>,
    /// Block references on the layer, each expanded.
    pub instances: Vec<Instance>,
    /// Effective layers of the model-space entities (for "layers in the drawing").
    pub layers: Vec<String>,
    /// Arcs flattened and the straight segments they became.
    pub arcs: usize,
    /// Straight segments the arcs became.
    pub arc_segments: usize,
    /// Circles whose shape an unequal scale changed (their radius is not taken).
    pub distorted_circles: usize,
    /// Mirrored entities or references converted (extrusion −z or a negative scale).
    pub mirrored: usize,
    /// Block references expanded.
    pub inserts: usize,
}

/// An error: the entity (`handle …`) and what is wrong.
pub type Refusal = (String, String);

struct Walker<'a> {
    blocks: HashMap<String, &'a dxf::Block>,
    layer: String,
    tol: f64,
    world: World,
    visits: usize,
    vertices: usize,
    stack: Vec<String>,
}

/// Place every model-space entity on `layer` (compared without regard to case), expanding block
/// references, with arcs flattened within `tol` drawing units.
pub fn place(drawing: &dxf::Drawing, layer: &str, tol: f64) -> Result<World, Refusal> {
    let blocks = drawing
        .blocks()
        .map(|b| (b.name.to_ascii_lowercase(), b))
        .collect();
    let mut w = Walker {
        blocks,
        layer: layer.to_string(),
        tol,
        world: World::default(),
        visits: 0,
        vertices: 0,
        stack: Vec::new(),
    };
    for e in drawing.entities() {
        if e.common.is_in_paper_space {
            continue;
        }
        if !w.world.layers.contains(&e.common.layer) {
            w.world.layers.push(e.common.layer.clone());
        }
        let source = format!("handle {}", e.common.handle.as_string());
        w.entity(e, &e.common.layer, Affine::IDENTITY, &source, None)?;
    }
    Ok(w.world)
}

fn finite(p: &DxfPoint) -> bool {
    p.x.is_finite() && p.y.is_finite() && p.z.is_finite()
}

impl Walker<'_> {
    fn on_layer(&self, layer: &str) -> bool {
        layer.eq_ignore_ascii_case(&self.layer)
    }

    fn push(&mut self, source: &str, instance: Option<usize>, kind: PlacedKind) {
        self.world.items.push(Placed {
            source: source.to_string(),
            instance,
            kind,
        });
    }

    fn count_vertices(&mut self, source: &str, n: usize) -> Result<(), Refusal> {
        self.vertices = self.vertices.saturating_add(n);
        if self.vertices > MAX_TOTAL_VERTICES {
            return Err((
                source.to_string(),
                format!(
                    "the layer holds more than {MAX_TOTAL_VERTICES} vertices once arcs are \
                     flattened and blocks expanded, more than drydig reads; export only what the \
                     design needs"
                ),
            ));
        }
        Ok(())
    }

    /// One entity, `parent_layer` being the layer a `0` layer inherits, `to_world` the map of
    /// the block it sits in.
    fn entity(
        &mut self,
        e: &Entity,
        parent_layer: &str,
        to_world: Affine,
        source: &str,
        instance: Option<usize>,
    ) -> Result<(), Refusal> {
        self.visits += 1;
        if self.visits > MAX_VISITS {
            return Err((
                source.to_string(),
                format!(
                    "expanding the block references visits more than {MAX_VISITS} entities, more \
                     than drydig reads; explode or simplify the blocks"
                ),
            ));
        }
        let layer = if e.common.layer == "0" && instance.is_some() {
            parent_layer.to_string()
        } else {
            e.common.layer.clone()
        };
        if let EntityType::Insert(i) = &e.specific {
            return self.insert(i, &layer, to_world, source, instance);
        }
        if !self.on_layer(&layer) {
            return Ok(());
        }
        let ocs = |n: &Vector| -> Result<Affine, Refusal> {
            let m = ocs_to_world(n).map_err(|m| (source.to_string(), m))?;
            Ok(m.then(to_world))
        };
        match &e.specific {
            EntityType::LwPolyline(p) => {
                let v: Vec<(f64, f64, f64)> =
                    p.vertices.iter().map(|v| (v.x, v.y, v.bulge)).collect();
                let m = ocs(&p.extrusion_direction)?;
                self.polyline(v, p.is_closed(), m, source, instance)?;
            }
            EntityType::Polyline(p) => {
                if p.is_3d_polyline() || p.is_3d_polygon_mesh() || p.is_polyface_mesh() {
                    return Err((
                        source.to_string(),
                        "a 3D polyline or mesh is not an outline; draw it as a 2D polyline".into(),
                    ));
                }
                // Spline frame control points (vertex flag 16) are not on the curve.
                let v: Vec<(f64, f64, f64)> = p
                    .vertices()
                    .filter(|v| v.flags & 16 == 0)
                    .map(|v| (v.location.x, v.location.y, v.bulge))
                    .collect();
                let m = ocs(&p.normal)?;
                self.polyline(v, p.is_closed(), m, source, instance)?;
            }
            EntityType::Line(l) => {
                if !finite(&l.p1) || !finite(&l.p2) {
                    return Err((source.to_string(), "a coordinate is not a number".into()));
                }
                let points = vec![
                    to_world.apply(l.p1.x, l.p1.y),
                    to_world.apply(l.p2.x, l.p2.y),
                ];
                self.count_vertices(source, 2)?;
                let kind = PlacedKind::Path {
                    points,
                    closed: false,
                    line_entity: true,
                };
                self.push(source, instance, kind);
            }
            EntityType::Arc(a) => {
                let m = ocs(&a.normal)?;
                self.arc(a, m, source, instance)?;
            }
            EntityType::ModelPoint(p) => {
                if !finite(&p.location) {
                    return Err((source.to_string(), "a coordinate is not a number".into()));
                }
                let at = to_world.apply(p.location.x, p.location.y);
                self.push(source, instance, PlacedKind::Point { at, radius: None });
            }
            EntityType::Circle(c) => {
                if !(c.radius.is_finite() && c.radius > 0.0 && finite(&c.center)) {
                    return Err((
                        source.to_string(),
                        "the circle's centre or radius is not a usable number (radius > 0)".into(),
                    ));
                }
                let m = ocs(&c.normal)?;
                if m.det() < 0.0 {
                    self.world.mirrored += 1;
                }
                let radius = m.uniform_scale().map(|s| c.radius * s);
                if radius.is_none() {
                    self.world.distorted_circles += 1;
                }
                let at = m.apply(c.center.x, c.center.y);
                self.push(source, instance, PlacedKind::Point { at, radius });
            }
            EntityType::Text(t) => {
                let m = ocs(&t.normal)?;
                let at = m.apply(t.location.x, t.location.y);
                let height = t.text_height.abs() * m.uniform_scale().unwrap_or(1.0);
                self.text(source, instance, at, height, &t.value);
            }
            EntityType::MText(t) => {
                let at = to_world.apply(t.insertion_point.x, t.insertion_point.y);
                let height = t.initial_text_height.abs() * to_world.uniform_scale().unwrap_or(1.0);
                let mut s = t.extended_text.concat();
                s.push_str(&t.text);
                self.text(source, instance, at, height, &s);
            }
            EntityType::Spline(_) | EntityType::Ellipse(_) => {
                return Err((
                    source.to_string(),
                    "a SPLINE or ELLIPSE is not read; convert it to a polyline in the CAD program \
                     (its arcs are then flattened within the chord tolerance)"
                        .into(),
                ));
            }
            _ => {}
        }
        Ok(())
    }

    fn text(
        &mut self,
        source: &str,
        instance: Option<usize>,
        at: (f64, f64),
        height: f64,
        raw: &str,
    ) {
        let text = plain_text(raw);
        if !text.is_empty() && at.0.is_finite() && at.1.is_finite() {
            let height = if height.is_finite() { height } else { 0.0 };
            self.push(source, instance, PlacedKind::Text { at, height, text });
        }
    }

    fn polyline(
        &mut self,
        mut v: Vec<(f64, f64, f64)>,
        mut closed: bool,
        m: Affine,
        source: &str,
        instance: Option<usize>,
    ) -> Result<(), Refusal> {
        for (i, &(x, y, b)) in v.iter().enumerate() {
            if !(x.is_finite() && y.is_finite()) {
                return Err((
                    source.to_string(),
                    format!("vertex {} is not a pair of finite numbers", i + 1),
                ));
            }
            if !b.is_finite() {
                return Err((
                    source.to_string(),
                    format!(
                        "the bulge of vertex {} is {b}, not a finite number (bulge = tan of a \
                         quarter of the arc's angle)",
                        i + 1
                    ),
                ));
            }
        }
        if v.len() >= 3 && !closed {
            let (a, b) = (v[0], v[v.len() - 1]);
            if (a.0 - b.0).hypot(a.1 - b.1) <= 1e-9 * (1.0 + a.0.abs().max(a.1.abs())) {
                v.pop();
                closed = true;
            }
        }
        let tol = self.tol / m.max_stretch().max(1e-300);
        let n = planned_vertices(&v, closed, tol);
        if n > MAX_ITEM_VERTICES {
            return Err((
                source.to_string(),
                format!(
                    "the polyline would have {n} vertices once its arcs are flattened, more than \
                     the {MAX_ITEM_VERTICES} drydig takes in one outline or line; simplify it or \
                     give a larger chord tolerance"
                ),
            ));
        }
        self.count_vertices(source, n)?;
        if m.det() < 0.0 {
            self.world.mirrored += 1;
        }
        let (pts, arcs, segs) = flatten(&v, closed, tol);
        self.world.arcs += arcs;
        self.world.arc_segments += segs;
        let points = pts.into_iter().map(|(x, y)| m.apply(x, y)).collect();
        let kind = PlacedKind::Path {
            points,
            closed,
            line_entity: false,
        };
        self.push(source, instance, kind);
        Ok(())
    }

    fn arc(
        &mut self,
        a: &dxf::entities::Arc,
        m: Affine,
        source: &str,
        instance: Option<usize>,
    ) -> Result<(), Refusal> {
        let ok = finite(&a.center)
            && a.radius.is_finite()
            && a.radius > 0.0
            && a.start_angle.is_finite()
            && a.end_angle.is_finite();
        if !ok {
            return Err((
                source.to_string(),
                "the arc's centre, radius or angles are not usable numbers".into(),
            ));
        }
        // Counter-clockwise from the start angle to the end angle, in the OCS.
        let mut sweep = (a.end_angle - a.start_angle).rem_euclid(360.0);
        if sweep == 0.0 {
            sweep = 360.0;
        }
        let theta = sweep.to_radians();
        let tol = self.tol / m.max_stretch().max(1e-300);
        let k = arc_steps(theta, a.radius, tol);
        self.count_vertices(source, k + 1)?;
        let a0 = a.start_angle.to_radians();
        let points = (0..=k)
            .map(|j| {
                let t = a0 + theta * j as f64 / k as f64;
                m.apply(
                    a.center.x + a.radius * t.cos(),
                    a.center.y + a.radius * t.sin(),
                )
            })
            .collect();
        self.world.arcs += 1;
        self.world.arc_segments += k;
        if m.det() < 0.0 {
            self.world.mirrored += 1;
        }
        let kind = PlacedKind::Path {
            points,
            closed: false,
            line_entity: true,
        };
        self.push(source, instance, kind);
        Ok(())
    }

    fn insert(
        &mut self,
        i: &Insert,
        layer: &str,
        to_world: Affine,
        source: &str,
        parent: Option<usize>,
    ) -> Result<(), Refusal> {
        let Some(block) = self.blocks.get(&i.name.to_ascii_lowercase()).copied() else {
            if self.on_layer(layer) {
                return Err((
                    source.to_string(),
                    format!("the block \"{}\" it inserts is not in the drawing", i.name),
                ));
            }
            return Ok(());
        };
        if block.is_xref() {
            if self.on_layer(layer) {
                return Err((
                    source.to_string(),
                    format!(
                        "\"{}\" is an external reference; bind it into the drawing first",
                        i.name
                    ),
                ));
            }
            return Ok(());
        }
        if self.stack.len() >= MAX_DEPTH || self.stack.iter().any(|b| b == &block.name) {
            return Err((
                source.to_string(),
                format!(
                    "block \"{}\" is nested more than {MAX_DEPTH} deep or inserts itself",
                    block.name
                ),
            ));
        }
        let numbers = [
            i.location.x,
            i.location.y,
            i.x_scale_factor,
            i.y_scale_factor,
            i.rotation,
            i.column_spacing,
            i.row_spacing,
            block.base_point.x,
            block.base_point.y,
        ];
        if numbers.iter().any(|v| !v.is_finite()) || i.x_scale_factor == 0.0 {
            return Err((
                source.to_string(),
                "the block reference's position, scale or rotation is not a usable number \
                 (scale must not be 0)"
                    .into(),
            ));
        }
        if i.y_scale_factor == 0.0 {
            return Err((
                source.to_string(),
                "the block reference's y scale is 0".into(),
            ));
        }
        let ocs = ocs_to_world(&i.extrusion_direction).map_err(|m| (source.to_string(), m))?;
        let (cols, rows) = (i.column_count.max(1) as usize, i.row_count.max(1) as usize);
        let inner_source = if source.contains(", block ") {
            format!("{source} > {}", block.name)
        } else {
            format!("{source}, block {}", block.name)
        };
        self.stack.push(block.name.clone());
        for r in 0..rows {
            for c in 0..cols {
                let m = Affine::translate(-block.base_point.x, -block.base_point.y)
                    .then(Affine::scale(i.x_scale_factor, i.y_scale_factor))
                    .then(Affine::translate(
                        c as f64 * i.column_spacing,
                        r as f64 * i.row_spacing,
                    ))
                    .then(Affine::rotate_degrees(i.rotation))
                    .then(Affine::translate(i.location.x, i.location.y))
                    .then(ocs)
                    .then(to_world);
                self.expand(i, block, layer, m, &inner_source, parent)?;
            }
        }
        self.stack.pop();
        Ok(())
    }

    /// One copy of a block, placed by `m`.
    fn expand(
        &mut self,
        i: &Insert,
        block: &dxf::Block,
        layer: &str,
        m: Affine,
        source: &str,
        parent: Option<usize>,
    ) -> Result<(), Refusal> {
        let on = self.on_layer(layer);
        let id = self.world.instances.len();
        self.world.instances.push(Instance {
            at: m.apply(block.base_point.x, block.base_point.y),
            attributes: i
                .attributes()
                .map(|a| (a.attribute_tag.clone(), plain_text(&a.value)))
                .collect(),
            parent,
        });
        let first = self.world.items.len();
        for e in &block.entities {
            self.entity(e, layer, m, source, Some(id))?;
        }
        if !on {
            return Ok(());
        }
        self.world.inserts += 1;
        if m.det() < 0.0 {
            self.world.mirrored += 1;
        }
        let holds_point = self.world.items[first..]
            .iter()
            .any(|p| matches!(p.kind, PlacedKind::Point { .. }));
        if !holds_point {
            // A symbol (a cross, a hatch, text): the well is at the insertion point.
            let at = self.world.instances[id].at;
            let kind = PlacedKind::Point { at, radius: None };
            self.push(source, Some(id), kind);
        }
        Ok(())
    }
}

/// Text without MTEXT formatting: `\P` (paragraph) becomes a space, `\X…;` codes and braces go,
/// `%%c`-style codes are kept as written; whitespace is collapsed.
pub fn plain_text(raw: &str) -> String {
    let mut out = String::new();
    let mut chars = raw.chars().peekable();
    while let Some(ch) = chars.next() {
        match ch {
            '{' | '}' => {}
            '\\' => match chars.next() {
                Some('P') | Some('~') => out.push(' '),
                Some('\\') => out.push('\\'),
                Some('{') => out.push('{'),
                Some('}') => out.push('}'),
                Some(c) if "fFHWQTACcpS".contains(c) => {
                    for c in chars.by_ref() {
                        if c == ';' {
                            break;
                        }
                    }
                }
                _ => {}
            },
            c if c.is_control() => out.push(' '),
            c => out.push(c),
        }
    }
    out.split_whitespace().collect::<Vec<_>>().join(" ")
}

#[cfg(test)]
mod tests {
    use super::*;

    // Arbitrary axis algorithm, DXF reference: N = (0, 0, −1) gives Ax = (−1, 0, 0),
    // Ay = (0, 1, 0), so the OCS point (150, 195) is the world point (−150, 195).
    #[test]
    fn ocs_mirror_flips_x() {
        let m = ocs_to_world(&Vector::new(0.0, 0.0, -1.0)).unwrap();
        assert_eq!(m.apply(150.0, 195.0), (-150.0, 195.0));
        assert!(m.det() < 0.0);
        assert_eq!(
            ocs_to_world(&Vector::new(0.0, 0.0, 1.0)).unwrap(),
            Affine::IDENTITY
        );
        assert!(ocs_to_world(&Vector::new(0.0, 0.6, 0.8)).is_err());
        assert!(ocs_to_world(&Vector::new(0.0, 0.0, 0.0)).is_err());
    }

    // A rotation by 90° then a scale of 2: (1, 0) → (0, 1) → (0, 2) (plane geometry).
    #[test]
    fn affine_composition_order() {
        let m = Affine::rotate_degrees(90.0).then(Affine::scale(2.0, 2.0));
        let (x, y) = m.apply(1.0, 0.0);
        assert!(x.abs() < 1e-12 && (y - 2.0).abs() < 1e-12);
        assert!((m.uniform_scale().unwrap() - 2.0).abs() < 1e-12);
        assert!(Affine::scale(1.0, 3.0).uniform_scale().is_none());
        assert!((Affine::scale(1.0, -3.0).max_stretch() - 3.0).abs() < 1e-12);
        assert_eq!(Affine::scale(-1.0, 1.0).uniform_scale(), Some(1.0));
    }

    // MTEXT codes (DXF reference, MTEXT inline codes): \P paragraph, \f…; font, braces groups.
    #[test]
    fn mtext_formatting_removed() {
        assert_eq!(plain_text("{\\fArial|b1;W-3}\\PNorth"), "W-3 North");
        assert_eq!(plain_text("  PW 12 "), "PW 12");
    }
}

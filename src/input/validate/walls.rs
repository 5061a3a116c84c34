//! `[[wall]]`: cut-off walls checked, and the ground split at each toe that stops inside an
//! aquifer, as a multi-layer analytic-element code does (the wall then cuts the upper
//! sublayer only and water passes under the toe through the lower one; the resistance between
//! the two is c = ½·d₁/K_v + ½·d₂/K_v, [`sublayer_resistance`]).

use crate::input::error::{InputError, Reporter};
use crate::input::model::{Excavation, ListedWell};
use crate::input::model_layers::{GroundAquifer, LayeredGround};
use crate::input::model_walls::Wall;
use crate::input::schema::DesignFile;
use crate::input::validate::shapes::points;
use crate::physics::multi_aquifer::sublayer_resistance;
use crate::physics::potential::{Aquifer, AquiferKind};
use geo::{Contains, Coord, LineString, Point, Polygon};

/// A toe closer than this to an aquifer's top or base (m) is taken as at it: no split.
const SPLIT_MIN: f64 = 0.1;

/// The walls of the design file, each checked.
pub fn walls(rep: &Reporter, raw: &DesignFile, top: &Aquifer) -> Result<Vec<Wall>, InputError> {
    let mut out: Vec<Wall> = Vec::new();
    for (i, w) in raw.wall.iter().enumerate() {
        let f = |s: &str| format!("wall[{}].{s}", i + 1);
        if w.name.trim().is_empty() {
            return Err(rep.error(f("name"), None, "must not be empty"));
        }
        if out.iter().any(|o| o.name == w.name.trim()) {
            return Err(rep.error(
                f("name"),
                None,
                format!(
                    "\"{}\" is used by another wall; give each wall its own name",
                    w.name.trim()
                ),
            ));
        }
        let pts = points(rep, &f("line"), &w.line)?;
        let need = if w.closed { 3 } else { 2 };
        if pts.len() < need {
            return Err(rep.error(
                f("line"),
                Some(w.line.span()),
                format!(
                    "a {} wall needs at least {need} points [[x, y], …]",
                    if w.closed { "closed" } else { "open" }
                ),
            ));
        }
        let wall = Wall {
            name: w.name.trim().to_string(),
            vertices: pts,
            closed: w.closed,
            toe_level: w.toe_level.as_ref().map(|t| t.si),
            resistance: match &w.resistance {
                Some(c) if c.si.is_finite() && c.si >= 60.0 => Some(c.si),
                Some(c) => return Err(rep.error(f("resistance"), c.span.clone(), "the resistance of a leaky wall is a time c = wall thickness / K of the wall, at least a minute (e.g. \"5 days\"); leave it out for an impermeable wall")),
                None => None,
            },
        };
        if wall
            .pieces()
            .iter()
            .any(|(a, b)| (b[0] - a[0]).hypot(b[1] - a[1]) < 0.01)
        {
            return Err(rep.error(
                f("line"),
                Some(w.line.span()),
                "two consecutive points are less than 1 cm apart; remove the repeated point",
            ));
        }
        if let Some(z) = wall.toe_level {
            if z >= top.initial_level - SPLIT_MIN {
                return Err(rep.error(f("toe_level"), w.toe_level.as_ref().and_then(|t| t.span.clone()), format!("the toe ({z} m) is not below the groundwater level ({} m): such a wall cuts off no flow; give a toe below it, or leave toe_level out for a wall down to the impermeable base", top.initial_level)));
            }
        }
        out.push(wall);
    }
    Ok(out)
}

/// The ground with each aquifer a wall's toe stops inside split at the toe: `None` when nothing
/// is layered and no toe needs a split (one aquifer, walls down to the base).
pub fn split_at_toes(
    rep: &Reporter,
    layers: Option<LayeredGround>,
    top: &Aquifer,
    top_kv: f64,
    walls: &[Wall],
) -> Result<Option<LayeredGround>, InputError> {
    let mut ground = layers.clone().unwrap_or_else(|| LayeredGround {
        aquifers: vec![GroundAquifer {
            name: "aquifer".into(),
            aquifer: top.clone(),
            top: top.top_level.unwrap_or(top.initial_level),
            vertical_conductivity: top_kv,
        }],
        resistances: Vec::new(),
        aquitards: Vec::new(),
    });
    let mut split = false;
    for (wi, w) in walls.iter().enumerate() {
        let Some(z) = w.toe_level else { continue };
        let Some(i) = ground.aquifers.iter().position(|a| {
            let wet_top = a.top.min(a.aquifer.initial_level);
            z > a.aquifer.base_level + SPLIT_MIN && z < wet_top - SPLIT_MIN
        }) else {
            continue;
        };
        if matches!(top.kind, AquiferKind::Leaky { .. }) {
            return Err(rep.error(format!("wall[{}].toe_level", wi + 1), None, "a wall stopping inside a leaky aquifer is not offered yet (the aquifer would be split at the toe, and layered ground takes no leaky top): give the aquitard above as a [[layer]] with kind = \"confined\" at the top, or leave toe_level out"));
        }
        let a = ground.aquifers[i].clone();
        let kv = a.vertical_conductivity;
        let wet_top = a.top.min(a.aquifer.initial_level);
        let upper = GroundAquifer {
            name: format!("{} above the toe of {}", a.name, w.name),
            aquifer: Aquifer {
                base_level: z,
                ..a.aquifer.clone()
            },
            top: a.top,
            vertical_conductivity: kv,
        };
        let lower = GroundAquifer {
            name: format!("{} below the toe of {}", a.name, w.name),
            aquifer: Aquifer {
                kind: AquiferKind::Confined,
                top_level: Some(z),
                specific_yield: None,
                storativity: a.aquifer.storativity.or(Some(1e-4)),
                ..a.aquifer.clone()
            },
            top: z,
            vertical_conductivity: kv,
        };
        let c = sublayer_resistance(wet_top - z, kv, z - a.aquifer.base_level, kv);
        ground.aquifers[i] = upper;
        ground.aquifers.insert(i + 1, lower);
        ground.resistances.insert(i, c);
        split = true;
    }
    Ok(if split || layers.is_some() {
        Some(ground)
    } else {
        None
    })
}

/// A closed impermeable wall cutting every aquifer seals what it encloses: no steady flow
/// reaches a well inside. Refused when it encloses an excavation (its wells stand round it)
/// or a listed well.
pub fn check_sealed(
    rep: &Reporter,
    walls: &[Wall],
    ground: Option<&LayeredGround>,
    top: &Aquifer,
    excavations: &[Excavation],
    listed: &[ListedWell],
) -> Result<(), InputError> {
    if matches!(top.kind, AquiferKind::Leaky { .. }) && ground.is_none() {
        return Ok(());
    }
    for (i, w) in walls.iter().enumerate() {
        let all = match ground {
            Some(g) => g.cut_by_wall(w.toe_level).len() == g.aquifers.len(),
            None => true,
        };
        if !w.closed || w.resistance.is_some() || !all {
            continue;
        }
        let ring: Vec<Coord<f64>> = w
            .vertices
            .iter()
            .map(|p| Coord { x: p[0], y: p[1] })
            .collect();
        let poly = Polygon::new(LineString::from(ring), vec![]);
        let inside = excavations
            .iter()
            .filter(|e| poly.contains(&e.outline))
            .map(|e| format!("excavation \"{}\"", e.name))
            .chain(
                listed
                    .iter()
                    .filter(|l| poly.contains(&Point::new(l.position[0], l.position[1])))
                    .map(|l| format!("well \"{}\"", l.name)),
            )
            .next();
        if let Some(what) = inside {
            return Err(rep.error(format!("wall[{}]", i + 1), None, format!("closed wall \"{}\" is impermeable and cuts every aquifer down to the impermeable base, so it seals {what} inside: no steady flow reaches wells there. Give toe_level above the base (flow under the toe), or resistance for a leaky wall, or an aquitard and aquifer below as [[layer]] entries", w.name)));
        }
    }
    Ok(())
}

/// Distance from point p to the wall's line, m.
fn distance_to(w: &Wall, p: [f64; 2]) -> f64 {
    w.pieces()
        .iter()
        .map(|(a, b)| {
            let d = [b[0] - a[0], b[1] - a[1]];
            let l2 = d[0] * d[0] + d[1] * d[1];
            let t = (((p[0] - a[0]) * d[0] + (p[1] - a[1]) * d[1]) / l2).clamp(0.0, 1.0);
            (p[0] - a[0] - t * d[0]).hypot(p[1] - a[1] - t * d[1])
        })
        .fold(f64::INFINITY, f64::min)
}

/// A listed well standing in a wall (within its radius + 5 cm) or a named check point on a
/// wall's line (within 5 cm: the head jumps there, so it has no one value) is refused. Points
/// and wells behind a wall are allowed.
pub fn check_positions(
    rep: &Reporter,
    walls: &[Wall],
    listed: &[ListedWell],
    points: &[(String, [f64; 2], Option<f64>)],
) -> Result<(), InputError> {
    for (i, w) in walls.iter().enumerate() {
        if let Some(l) = listed
            .iter()
            .find(|l| distance_to(w, l.position) < l.radius + 0.05)
        {
            return Err(rep.error(format!("wall[{}].line", i + 1), None, format!("well \"{}\" stands in wall \"{}\"; move the well (or the wall) so that at least 5 cm of ground lie between the screen and the wall", l.name, w.name)));
        }
        if let Some((name, _, _)) = points.iter().find(|(_, p, _)| distance_to(w, *p) < 0.05) {
            return Err(rep.error(format!("wall[{}].line", i + 1), None, format!("check point \"{name}\" lies on wall \"{}\", where the head jumps from one side to the other; move it to the side it is meant to watch (5 cm is enough)", w.name)));
        }
    }
    Ok(())
}

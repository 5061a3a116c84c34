//! Names of wells read from a DXF drawing: an attribute of the block reference that placed the
//! well (a tag such as NAME, WELL, ID, TAG, NO or NUMBER first, else the first attribute with a
//! value), else a TEXT or MTEXT label on the layer next to it (nearest well within five text
//! heights, or 2 m for text of no height), else the layer and a number (`WELLS 3`). Two wells
//! of one name are refused naming both, in the user's drawing.

use super::dxf_world::World;
use super::Marker;
use crate::input::error::InputError;
use std::path::Path;

/// A point found on the layer, before it is named.
pub(crate) struct Found {
    pub(crate) marker: Marker,
    /// Position in drawing units (for the distance to labels).
    pub(crate) drawn_at: (f64, f64),
    pub(crate) instance: Option<usize>,
}

/// Attribute tags taken as a well's name, in order of preference (compared without case).
const NAME_TAGS: [&str; 10] = [
    "NAME",
    "WELL",
    "WELL_NAME",
    "ID",
    "TAG",
    "NO",
    "NUMBER",
    "NR",
    "LABEL",
    "REF",
];

/// The name an attribute list gives, if any.
fn attribute_name(attributes: &[(String, String)]) -> Option<&str> {
    NAME_TAGS
        .iter()
        .find_map(|t| {
            attributes
                .iter()
                .find(|(tag, v)| tag.eq_ignore_ascii_case(t) && !v.is_empty())
        })
        .or_else(|| attributes.iter().find(|(_, v)| !v.is_empty()))
        .map(|(_, v)| v.as_str())
}

/// Name every well (see the module notes). `texts` are (position, height, words) in drawing
/// units; `reach` is how far, in drawing units, a label of no height may be from its well.
/// Returns each marker with how it was named ("attribute", "label" or "layer and number").
pub(crate) fn name_wells(
    world: &World,
    found: Vec<Found>,
    texts: &[((f64, f64), f64, String)],
    reach: f64,
) -> Vec<(Marker, &'static str)> {
    // The block reference whose attribute names each well, and how many wells it names.
    let by_attribute: Vec<Option<(usize, String)>> = found
        .iter()
        .map(|f| {
            let mut at = f.instance;
            while let Some(id) = at {
                let inst = &world.instances[id];
                if let Some(v) = attribute_name(&inst.attributes) {
                    return Some((id, v.to_string()));
                }
                at = inst.parent;
            }
            None
        })
        .collect();
    let shared = |id: usize| {
        by_attribute
            .iter()
            .filter(|a| a.as_ref().is_some_and(|(i, _)| *i == id))
            .count()
    };
    // Each label goes to its nearest well, when near enough; a well keeps its nearest label.
    let mut label: Vec<Option<(f64, &str)>> = vec![None; found.len()];
    for (at, height, text) in texts {
        let nearest = found
            .iter()
            .enumerate()
            .map(|(i, f)| (i, (f.drawn_at.0 - at.0).hypot(f.drawn_at.1 - at.1)))
            .min_by(|a, b| a.1.total_cmp(&b.1));
        let limit = if *height > 0.0 { 5.0 * height } else { reach };
        if let Some((i, d)) = nearest {
            if d <= limit && label[i].is_none_or(|(best, _)| d < best) {
                label[i] = Some((d, text.as_str()));
            }
        }
    }
    let mut seen_in: Vec<(usize, usize)> = Vec::new();
    found
        .into_iter()
        .enumerate()
        .map(|(i, f)| {
            let mut m = f.marker;
            let how = if let Some((id, v)) = &by_attribute[i] {
                m.name = if shared(*id) > 1 {
                    let k = match seen_in.iter_mut().find(|(j, _)| j == id) {
                        Some(e) => {
                            e.1 += 1;
                            e.1
                        }
                        None => {
                            seen_in.push((*id, 1));
                            1
                        }
                    };
                    format!("{v} {k}")
                } else {
                    v.clone()
                };
                "attribute"
            } else if let Some((_, t)) = label[i] {
                m.name = t.to_string();
                "label"
            } else {
                "layer and number"
            };
            (m, how)
        })
        .collect()
}

/// Refuse two wells of one name (compared without case, as the design file compares names),
/// naming both where they are in the drawing.
pub(crate) fn refuse_duplicates(
    path: &Path,
    named: &[(Marker, &'static str)],
) -> Result<(), InputError> {
    for (i, (a, how)) in named.iter().enumerate() {
        if let Some((b, _)) = named[..i]
            .iter()
            .find(|(b, _)| b.name.eq_ignore_ascii_case(&a.name))
        {
            return Err(InputError::at(
                path,
                a.source.clone(),
                format!(
                    "two wells are named \"{}\" (by {how}): this one and {}; give each well its \
                     own name in the drawing (an attribute of its block, or a label next to it)",
                    a.name, b.source
                ),
            ));
        }
    }
    Ok(())
}

/// A note saying how the wells were named, e.g. "wells named by attribute (8)".
pub(crate) fn how_named(named: &[(Marker, &'static str)]) -> String {
    let mut parts = Vec::new();
    for how in ["attribute", "label", "layer and number"] {
        let n = named.iter().filter(|(_, h)| *h == how).count();
        if n > 0 && !(how == "layer and number" && n == named.len()) {
            parts.push(format!("{how} ({n})"));
        }
    }
    if parts.is_empty() {
        String::new()
    } else {
        format!("wells named by {}", parts.join(", "))
    }
}

//! The layers of one plan, bottom to top, each an SVG group with a fixed id (ids take a prefix
//! for the detail plan), with the clip paths to the plan's rectangle and to the aquifer side of
//! every boundary, and the fixed stacking order the page is written in.

use crate::field::grid::LevelGrid;
use crate::report::map::page::{CONTOUR, FONT};
use crate::report::map::text::r1;
use crate::report::map::view::{polygon_data, View};
use svg::node::element::{ClipPath, Definitions, Group, Path, Rectangle};

/// Everything drawn, layer by layer.
pub(super) struct Layers {
    /// Prefix of every id in this plan ("" for the main plan), so a detail's ids differ.
    pub(super) prefix: String,
    pub(super) defs: Definitions,
    /// `url(#…)` of the clip to the plan's rectangle.
    pub(super) plan_clip: String,
    /// `url(#…)` of the clip to the aquifer side of every boundary.
    pub(super) aquifer_clip: String,
    pub(super) bands: Group,
    pub(super) far_side: Group,
    pub(super) contours: Group,
    pub(super) paths: Group,
    pub(super) keep_outs: Group,
    pub(super) neighbours: Group,
    pub(super) excavations: Group,
    pub(super) boundaries: Group,
    pub(super) dry: Group,
    pub(super) wells: Group,
    pub(super) failed: Group,
    pub(super) excavation_labels: Group,
    pub(super) contour_labels: Group,
    pub(super) frame: Group,
}

pub(super) fn group(id: &str) -> Group {
    Group::new().set("id", id)
}

impl Layers {
    /// Empty layers whose ids start with `prefix` ("" for the main plan).
    pub(super) fn new(prefix: &str, view: &View, plan_px: [f64; 4], grid: &LevelGrid) -> Layers {
        let id = |name: &str| format!("{prefix}{name}");
        let plan_clip = id("plan-clip");
        let aquifer_clip = id("aquifer-clip");
        let defs = Definitions::new()
            .add(
                ClipPath::new().set("id", plan_clip.clone()).add(
                    Rectangle::new()
                        .set("x", r1(plan_px[0]))
                        .set("y", r1(plan_px[1]))
                        .set("width", r1(plan_px[2] - plan_px[0]))
                        .set("height", r1(plan_px[3] - plan_px[1])),
                ),
            )
            .add(
                ClipPath::new()
                    .set("id", aquifer_clip.clone())
                    .add(Path::new().set("d", polygon_data(view, &grid.aquifer_area()))),
            );
        let plan_clip = format!("url(#{plan_clip})");
        Layers {
            prefix: prefix.to_string(),
            defs,
            aquifer_clip: format!("url(#{aquifer_clip})"),
            bands: group(&id("bands")),
            far_side: group(&id("far-side")),
            contours: group(&id("contours"))
                .set("fill", "none")
                .set("stroke", CONTOUR)
                .set("stroke-linejoin", "round")
                .set("clip-path", plan_clip.clone()),
            paths: group(&id("paths"))
                .set("fill", "none")
                .set("stroke", "#8a8f96")
                .set("stroke-width", 1)
                .set("stroke-dasharray", "2 4"),
            keep_outs: group(&id("keep-outs")),
            neighbours: group(&id("neighbours")),
            excavations: group(&id("excavations")),
            boundaries: group(&id("boundaries")),
            dry: group(&id("dry-area")),
            wells: group(&id("wells")),
            failed: group(&id("failed-points")),
            excavation_labels: group(&id("excavation-labels")),
            contour_labels: group(&id("contour-labels"))
                .set("font-family", FONT)
                .set("fill", CONTOUR)
                .set("text-anchor", "middle"),
            frame: group(&id("frame")),
            plan_clip,
        }
    }

    /// The layers in stacking order.
    pub(super) fn stacked(self) -> Vec<Group> {
        vec![
            self.bands,
            self.far_side,
            self.contours,
            self.paths,
            self.keep_outs,
            self.neighbours,
            self.excavations,
            self.boundaries,
            self.dry,
            self.wells,
            self.failed,
            self.excavation_labels,
            self.contour_labels,
            self.frame,
        ]
    }
}

//! Well layouts (`drydig::field::layout`) against plain geometry facts, checked here with geometry
//! written out in the test (point–segment distances, arc length along a polyline), not with the
//! layout code's own helpers:
//!
//! - a ring of N wells by count is evenly spaced by arc length along the offset ring, and a well
//!   on a straight stretch stands exactly `offset` from the outline;
//! - with corner wells, every corner of the outline has a well within offset·√2 (the mitred
//!   corner of a ring grown by `offset` around a right angle lies offset·√2 from it);
//! - by max_spacing, no gap along the ring exceeds the spacing;
//! - a trench line on both sides stands width/2 + offset from the centre line, with gaps no
//!   larger than the spacing, and runs past both ends;
//! - a well that would fall in a keep-out polygon is moved out, and a note says so;
//! - the wells CSV reader refuses a bad row and names its line.
//!
//! The geometry facts are plane geometry (common practice (no source)).

use drydig::field::layout::{from_model, generate, line, ring, Placement};
use drydig::field::wells_csv::read_csv;
use drydig::input::model::{LayoutKind, Model, RingCount};
use drydig::input::validate::file::from_str;
use std::f64::consts::SQRT_2;
use std::path::Path;

// ---------------------------------------------------------------------------------------------
// Models from design-file text

const HEAD: &str = r#"
[site]
name = "Layout test site"
datum = "0.00 m = local datum"
ground_level = "10.0 m"
grid = "local"

[aquifer]
kind = "unconfined"
conductivity = "2e-4 m/s"
base_level = "-6.0 m"
groundwater_level = "8.5 m"
specific_yield = 0.15

[influence]
method = "sichardt"
sichardt_c = 3000
sichardt_c_line = 1500

[wells]
kind = "deep-well"
radius = "0.15 m"
screen_top = "6.0 m"
screen_base = "-5.0 m"
pump_intake = "-4.5 m"
submergence = "1.0 m"
pump_capacity = "6 L/s"
standby = 1
"#;

fn excavation(name: &str, outline: &[[f64; 2]]) -> String {
    let pts: Vec<String> = outline
        .iter()
        .map(|p| format!("[{}, {}]", p[0], p[1]))
        .collect();
    format!(
        "\n[[excavation]]\nname = \"{name}\"\noutline = [{}]\nformation_level = \"5.0 m\"\ntarget_margin = \"0.5 m\"\n",
        pts.join(", ")
    )
}

fn model(outline: &[[f64; 2]], layout: &str, extra: &str) -> Model {
    let text = format!(
        "{HEAD}{}\n[layout]\n{layout}\n{extra}",
        excavation("Pit", outline)
    );
    from_str(Path::new("layout_test.toml"), &text)
        .unwrap_or_else(|e| panic!("the test design file is valid: {e}\n{text}"))
}

fn placement(m: &Model) -> Placement {
    let spec = m.layout.as_ref().expect("a layout");
    generate(m, spec, spec.rate.unwrap_or(0.0)).expect("the layout places wells")
}

// ---------------------------------------------------------------------------------------------
// Plane geometry, written out here

fn dist(a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - b[0]).hypot(a[1] - b[1])
}

/// Distance from p to segment ab, and whether the foot of the perpendicular is inside it.
fn seg_dist(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> (f64, bool) {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let t = ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy);
    let inside = (0.0..=1.0).contains(&t);
    let t = t.clamp(0.0, 1.0);
    (dist(p, [a[0] + t * dx, a[1] + t * dy]), inside)
}

/// Distance from p to a closed outline, and whether the nearest point is on an edge's interior
/// (not at a corner).
fn outline_dist(p: [f64; 2], outline: &[[f64; 2]]) -> (f64, bool) {
    let n = outline.len();
    let mut best = (f64::INFINITY, false);
    for i in 0..n {
        let (d, inside) = seg_dist(p, outline[i], outline[(i + 1) % n]);
        if d < best.0 {
            best = (d, inside);
        }
    }
    best
}

/// Arc length along the closed polyline `ring` (last point = first) of the point nearest p.
fn arc_position(p: [f64; 2], ring: &[[f64; 2]]) -> (f64, f64) {
    let mut walked = 0.0;
    let mut best = (f64::INFINITY, 0.0);
    for w in ring.windows(2) {
        let (a, b) = (w[0], w[1]);
        let len = dist(a, b);
        let t = (((p[0] - a[0]) * (b[0] - a[0]) + (p[1] - a[1]) * (b[1] - a[1])) / (len * len))
            .clamp(0.0, 1.0);
        let q = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
        let d = dist(p, q);
        if d < best.0 {
            best = (d, walked + t * len);
        }
        walked += len;
    }
    (best.1, best.0)
}

fn ring_length(ring: &[[f64; 2]]) -> f64 {
    ring.windows(2).map(|w| dist(w[0], w[1])).sum()
}

/// Gaps by arc length between consecutive wells around a closed ring.
fn arc_gaps(placement: &Placement) -> (Vec<f64>, f64) {
    let ring = &placement.paths[0];
    let total = ring_length(ring);
    let mut s: Vec<f64> = placement
        .wells
        .iter()
        .map(|w| {
            let (s, off) = arc_position(w.position, ring);
            assert!(off < 1e-9, "{} is {off} m off its ring", w.name);
            s
        })
        .collect();
    s.sort_by(f64::total_cmp);
    let mut gaps: Vec<f64> = s.windows(2).map(|w| w[1] - w[0]).collect();
    gaps.push(total - s[s.len() - 1] + s[0]);
    (gaps, total)
}

fn inside_polygon(p: [f64; 2], poly: &[[f64; 2]]) -> bool {
    // even–odd ray casting
    let mut inside = false;
    let n = poly.len();
    for i in 0..n {
        let (a, b) = (poly[i], poly[(i + 1) % n]);
        if (a[1] > p[1]) != (b[1] > p[1]) {
            let x = a[0] + (p[1] - a[1]) / (b[1] - a[1]) * (b[0] - a[0]);
            if p[0] < x {
                inside = !inside;
            }
        }
    }
    inside
}

const RECT: [[f64; 2]; 4] = [[0.0, 0.0], [40.0, 0.0], [40.0, 20.0], [0.0, 20.0]];
const ELL: [[f64; 2]; 6] = [
    [0.0, 0.0],
    [56.0, 0.0],
    [56.0, 22.0],
    [30.0, 22.0],
    [30.0, 44.0],
    [0.0, 44.0],
];

// ---------------------------------------------------------------------------------------------
// Rings

#[test]
fn ring_by_count_is_evenly_spaced_at_the_offset() {
    for (n, offset) in [(12u32, 3.0), (7, 2.0), (30, 5.0)] {
        let m = model(
            &RECT,
            &format!("kind = \"ring\"\noffset = \"{offset} m\"\ncount = {n}\nrate = \"2 L/s\""),
            "",
        );
        let p = placement(&m);
        assert_eq!(p.wells.len(), n as usize);
        // mitred corners (src/layout.rs: "corners stay corners"): the ring's vertices are the
        // corners of the rectangle grown by `offset` on every side
        let grown = [
            [-offset, -offset],
            [40.0 + offset, -offset],
            [40.0 + offset, 20.0 + offset],
            [-offset, 20.0 + offset],
        ];
        let ring_pts = &p.paths[0];
        assert_eq!(
            ring_pts.len(),
            5,
            "four corners and the closing point: {ring_pts:?}"
        );
        for g in grown {
            assert!(
                ring_pts.iter().any(|q| dist(*q, g) < 1e-9),
                "corner {g:?} missing from {ring_pts:?}"
            );
        }
        // the ring of a rectangle grown by `offset` with mitred corners is the rectangle
        // (a + 2d) × (b + 2d): perimeter 2(a + b) + 8d
        let (gaps, total) = arc_gaps(&p);
        assert!(
            (total - (2.0 * (40.0 + 20.0) + 8.0 * offset)).abs() < 1e-9,
            "ring length {total}"
        );
        let even = total / n as f64;
        for g in &gaps {
            assert!(
                (g - even).abs() <= 1e-9 * even,
                "n = {n}: gap {g} vs {even}"
            );
        }
        let mut on_edges = 0;
        for w in &p.wells {
            let (d, on_edge) = outline_dist(w.position, &RECT);
            assert!(
                !inside_polygon(w.position, &RECT),
                "{} inside the pit",
                w.name
            );
            if on_edge {
                on_edges += 1;
                assert!(
                    (d - offset).abs() < 1e-9,
                    "{} is {d} m from the outline, not {offset}",
                    w.name
                );
            } else {
                // beside a corner: between d and d·√2
                assert!(d >= offset - 1e-9 && d <= offset * SQRT_2 + 1e-9, "{d}");
            }
        }
        // wells beside a corner hold arc lengths within `offset` of it: 8d of the ring
        assert!(
            on_edges >= n as usize / 2,
            "{on_edges} of {n} on straight edges"
        );
    }
}

#[test]
fn corner_wells_stand_at_every_corner() {
    for (outline, n, offset) in [
        (&RECT[..], 10u32, 3.0),
        (&ELL[..], 14, 3.0),
        (&ELL[..], 9, 1.5),
    ] {
        let m = model(
            outline,
            &format!(
                "kind = \"ring\"\noffset = \"{offset} m\"\ncount = {n}\ncorner_wells = true\nrate = \"2 L/s\""
            ),
            "",
        );
        let p = placement(&m);
        assert_eq!(p.wells.len(), n as usize);
        for c in outline {
            let nearest = p
                .wells
                .iter()
                .map(|w| dist(w.position, *c))
                .fold(f64::INFINITY, f64::min);
            assert!(
                nearest <= offset * SQRT_2 + 1e-9,
                "corner {c:?}: nearest well {nearest} m away (offset {offset})"
            );
        }
        for w in &p.wells {
            let (d, _) = outline_dist(w.position, outline);
            assert!(
                d >= offset - 1e-9 && d <= offset * SQRT_2 + 1e-9,
                "{}: {d}",
                w.name
            );
        }
    }
}

#[test]
fn ring_by_max_spacing_has_no_gap_longer_than_the_spacing() {
    for (outline, spacing, corners) in [
        (&RECT[..], 7.0, false),
        (&RECT[..], 7.0, true),
        (&ELL[..], 10.0, true),
        (&ELL[..], 4.5, false),
    ] {
        let m = model(
            outline,
            &format!(
                "kind = \"ring\"\noffset = \"2 m\"\nmax_spacing = \"{spacing} m\"\ncorner_wells = {corners}\nrate = \"2 L/s\""
            ),
            "",
        );
        let p = placement(&m);
        let (gaps, total) = arc_gaps(&p);
        assert!(p.wells.len() as f64 >= total / spacing, "enough wells");
        for g in &gaps {
            assert!(*g <= spacing * (1.0 + 1e-9), "gap {g} > {spacing}");
        }
        // the straight-line gap between neighbours on the ring is no longer than the arc
        let mut by_arc: Vec<(f64, [f64; 2])> = p
            .wells
            .iter()
            .map(|w| (arc_position(w.position, &p.paths[0]).0, w.position))
            .collect();
        by_arc.sort_by(|a, b| a.0.total_cmp(&b.0));
        for i in 0..by_arc.len() {
            let j = (i + 1) % by_arc.len();
            assert!(dist(by_arc[i].1, by_arc[j].1) <= spacing * (1.0 + 1e-9));
        }
    }
}

/// The same ring through the public `ring` function and through the design file agree.
#[test]
fn ring_function_and_design_file_place_the_same_wells() {
    let m = model(
        &ELL,
        "kind = \"ring\"\noffset = \"3 m\"\ncount = 14\ncorner_wells = true\nrate = \"5 L/s\"",
        "",
    );
    let a = placement(&m);
    let b = ring(&m, &m.excavations[0], 3.0, RingCount::Count(14), true, 5e-3);
    let c = from_model(&m, None).expect("the layout of the file");
    for ((x, y), z) in a.wells.iter().zip(&b.wells).zip(&c.wells) {
        assert_eq!(x.position, y.position);
        assert_eq!(x.position, z.position);
        assert!((z.rate - 5e-3).abs() < 1e-15);
    }
}

// ---------------------------------------------------------------------------------------------
// Trench lines

#[test]
fn trench_line_on_both_sides_at_half_width_plus_offset() {
    // a 400 m × 3 m trench, along x and turned by 30°
    for angle in [0.0f64, 30.0] {
        let (s, c) = angle.to_radians().sin_cos();
        let rot = |p: [f64; 2]| [c * p[0] - s * p[1], s * p[0] + c * p[1]];
        let outline: Vec<[f64; 2]> = [[0.0, -1.5], [400.0, -1.5], [400.0, 1.5], [0.0, 1.5]]
            .iter()
            .map(|p| rot(*p))
            .collect();
        let (offset, spacing) = (1.0, 1.5);
        let m = model(
            &outline,
            &format!(
                "kind = \"line\"\noffset = \"{offset} m\"\nspacing = \"{spacing} m\"\nsides = \"both\"\nrate = \"0.04 L/s\""
            ),
            "",
        );
        let p = placement(&m);
        // centre line: the long axis y = 0 of the unrotated trench
        let along = |q: [f64; 2]| c * q[0] + s * q[1];
        let across = |q: [f64; 2]| -s * q[0] + c * q[1];
        let side = 3.0 / 2.0 + offset;
        let mut left: Vec<f64> = Vec::new();
        let mut right: Vec<f64> = Vec::new();
        for w in &p.wells {
            let d = across(w.position);
            assert!(
                (d.abs() - side).abs() < 1e-9,
                "angle {angle}: {} is {d} m from the centre line, not ±{side}",
                w.name
            );
            if d > 0.0 {
                left.push(along(w.position));
            } else {
                right.push(along(w.position));
            }
        }
        assert_eq!(left.len(), right.len(), "both sides");
        for xs in [&mut left, &mut right] {
            xs.sort_by(f64::total_cmp);
            for g in xs.windows(2) {
                assert!(g[1] - g[0] <= spacing * (1.0 + 1e-9), "gap {}", g[1] - g[0]);
                assert!(g[1] - g[0] > 0.5 * spacing, "wells do not pile up");
            }
            // the line runs past each end of the trench (documented: by width/2 + offset)
            assert!(xs[0] <= -side + 1e-9 && xs[xs.len() - 1] >= 400.0 + side - 1e-9);
        }
        // the public `line` function with the same settings gives the same wells
        let again = line(&m, &m.excavations[0], offset, spacing, true, None, 4e-5);
        assert_eq!(again.wells.len(), p.wells.len());
    }
}

#[test]
fn trench_line_on_one_side() {
    let outline = [[0.0, -1.5], [120.0, -1.5], [120.0, 1.5], [0.0, 1.5]];
    let m = model(
        &outline,
        "kind = \"line\"\noffset = \"0.5 m\"\nspacing = \"2 m\"\nsides = \"one\"\nrate = \"0.05 L/s\"",
        "",
    );
    assert!(matches!(
        m.layout.as_ref().map(|l| &l.kind),
        Some(LayoutKind::Line {
            both_sides: false,
            ..
        })
    ));
    let p = placement(&m);
    let ys: Vec<f64> = p.wells.iter().map(|w| w.position[1]).collect();
    assert!(ys.iter().all(|y| (y.abs() - 2.0).abs() < 1e-9));
    assert!(
        ys.iter().all(|y| y.signum() == ys[0].signum()),
        "all on one side"
    );
}

// ---------------------------------------------------------------------------------------------
// Keep-out zones

#[test]
fn a_well_in_a_keep_out_zone_is_moved_out_and_noted() {
    let layout = "kind = \"ring\"\noffset = \"3 m\"\ncount = 12\nrate = \"2 L/s\"";
    let free = placement(&model(&RECT, layout, ""));
    // a 4 m square crane base centred on the fourth well of the free layout
    let c = free.wells[3].position;
    let square = [
        [c[0] - 2.0, c[1] - 2.0],
        [c[0] + 2.0, c[1] - 2.0],
        [c[0] + 2.0, c[1] + 2.0],
        [c[0] - 2.0, c[1] + 2.0],
    ];
    assert!(inside_polygon(c, &square));
    let pts: Vec<String> = square
        .iter()
        .map(|p| format!("[{}, {}]", p[0], p[1]))
        .collect();
    let extra = format!(
        "[[keep_out]]\nname = \"Crane base\"\noutline = [{}]\n",
        pts.join(", ")
    );
    let m = model(&RECT, layout, &extra);
    let p = placement(&m);
    assert_eq!(p.wells.len(), 12, "moved, not dropped");
    for w in &p.wells {
        assert!(
            !inside_polygon(w.position, &square),
            "{} stands in the keep-out zone",
            w.name
        );
        // still on the ring: `offset` from the outline (or up to offset·√2 beside a corner)
        let (d, _) = outline_dist(w.position, &RECT);
        assert!((3.0 - 1e-9..=3.0 * SQRT_2 + 1e-9).contains(&d), "{d}");
    }
    let moved = &p.wells[3];
    // it left the square, so it moved at least the 2 m half-width along the ring
    assert!(dist(moved.position, c) >= 2.0 - 1e-9);
    assert!(
        dist(moved.position, c) < 4.0,
        "moved to the nearest free place"
    );
    let note = moved
        .note
        .as_deref()
        .expect("the moved well carries a note");
    assert!(
        note.contains("moved") && note.contains("Crane base"),
        "{note}"
    );
    assert!(p.notes.iter().any(|n| matches!(
        n,
        drydig::field::layout_notes::LayoutNote::Moved { well, zone, .. }
            if *well == moved.name && zone == "Crane base"
    )));
    // the other wells did not move
    for (i, (a, b)) in free.wells.iter().zip(&p.wells).enumerate() {
        if i != 3 {
            assert!(dist(a.position, b.position) < 1e-9, "{} moved", a.name);
            assert!(b.note.is_none());
        }
    }
}

// ---------------------------------------------------------------------------------------------
// Wells CSV

#[test]
fn wells_csv_is_read_and_a_bad_row_is_refused_with_its_line() {
    let m = model(&RECT, "kind = \"ring\"\noffset = \"3 m\"\ncount = 6", "");
    let dir = tempfile::tempdir().expect("a temporary directory");
    let write = |name: &str, text: &str| {
        let path = dir.path().join(name);
        std::fs::write(&path, text).expect("written");
        path
    };

    let good = write(
        "good.csv",
        "name,x,y,rate_l_per_s,radius_m\nW1,-3,-3,2.5,0.2\nW2,43,-3,2.5,0.2\nR1,20,30,-1.0,0.1\n",
    );
    let wells = read_csv(&m, &good).expect("a good file is read");
    assert_eq!(wells.len(), 3);
    assert_eq!(wells[1].position, [43.0, -3.0]);
    assert!((wells[0].rate - 2.5e-3).abs() < 1e-15, "L/s to m³/s");
    assert!(
        (wells[2].rate + 1.0e-3).abs() < 1e-15,
        "recharge stays negative"
    );
    assert_eq!(wells[2].radius, 0.1);

    // (file text, line of the bad row, field named)
    let cases = [
        (
            "name,x,y,rate_l_per_s\nW1,0,0,2\nW2,5,0,2\nW3,abc,0,2\nW4,9,0,2\n",
            4,
            "x",
        ),
        (
            "name,x,y,rate_l_per_s\nW1,0,0,2\nW2,5,0,two\n",
            3,
            "rate_l_per_s",
        ),
        ("name,x,y,rate_l_per_s\nW1,0,0,2\nW1,5,0,2\n", 3, "name"),
        (
            "name,x,y,rate_l_per_s,radius_m\nW1,0,0,2,0.15\nW2,5,0,2,7\n",
            3,
            "radius_m",
        ),
        ("name,x,y,rate_l_per_s\nW1,0,0,2\nW2,5,0\n", 3, ""),
        (
            "name,x,y,rate_l_per_s\nW1,0,0,2\n# stage 2 wells\nW2,5,inf,2\n",
            4,
            "y",
        ),
    ];
    for (i, (text, line, field)) in cases.iter().enumerate() {
        let path = write(&format!("bad{i}.csv"), text);
        let e = read_csv(&m, &path).expect_err("a bad row is refused");
        assert_eq!(e.line, Some(*line), "case {i}: {e}");
        assert_eq!(e.field, *field, "case {i}: {e}");
        assert!(e.to_string().contains(&format!(":{line}")), "{e}");
        // the design file route gives the same refusal
        let e2 = from_model(&m, Some(&path)).expect_err("refused through from_model too");
        assert_eq!(e2.line, Some(*line));
    }
}

// Geometry fact: with `end_extension = E` the wellpoint lines run exactly E past each trench end
// (x = −E and x = 400 + E for a 400 m trench along x), at no more than the spacing.
#[test]
fn trench_line_runs_the_given_distance_past_each_end() {
    let outline = [[0.0, -1.5], [400.0, -1.5], [400.0, 1.5], [0.0, 1.5]];
    let m = model(
        &outline,
        "kind = \"line\"\noffset = \"1 m\"\nspacing = \"1.5 m\"\nsides = \"one\"\nend_extension = \"20 m\"\nrate = \"0.04 L/s\"",
        "",
    );
    let p = placement(&m);
    let xs: Vec<f64> = p.wells.iter().map(|w| w.position[0]).collect();
    let lo = xs.iter().cloned().fold(f64::MAX, f64::min);
    let hi = xs.iter().cloned().fold(f64::MIN, f64::max);
    assert!((lo + 20.0).abs() < 1e-9, "first wellpoint at x = {lo}");
    assert!((hi - 420.0).abs() < 1e-9, "last wellpoint at x = {hi}");
    assert!(p.wells.len() as f64 >= 440.0 / 1.5);
}

//! The shared parts of the charts (sweep, programme, pumping test, section): a plot area that maps
//! data to the page, axis ticks on round values, tick labels that print each tick exactly,
//! grid lines, axis titles and a legend.
//!
//! Ticks follow the 1-2-5 rule: the step is 1, 2 or 5 × 10ᵏ, the smallest of these giving no
//! more than about the number of intervals asked for, and every tick is a whole multiple of the
//! step (common practice (no source)). A label prints as many decimals as the step needs, so a
//! tick at 2.5 never reads "2" or "3".

use svg::node::element::{Group, Line, Rectangle, Text};
use svg::Document;

/// A coordinate on the page, one decimal.
pub fn r1(v: f64) -> String {
    format!("{v:.1}")
}

/// A text element in the charts' font at (`x`, `y`), `anchor` start, middle or end.
pub fn text(x: f64, y: f64, size: f64, anchor: &str, content: impl Into<String>) -> Text {
    Text::new(content.into())
        .set("x", r1(x))
        .set("y", r1(y))
        .set("font-size", size)
        .set("text-anchor", anchor)
        .set("font-family", "sans-serif")
}

/// Tick values on one axis and the step between them.
#[derive(Debug, Clone, PartialEq)]
pub struct Ticks {
    /// The ticks, ascending, each a whole multiple of `step`.
    pub values: Vec<f64>,
    /// The step: 1, 2 or 5 × 10ᵏ.
    pub step: f64,
}

/// The 1-2-5 step for about `intervals` intervals over `span`.
pub fn step_125(span: f64, intervals: usize) -> f64 {
    let raw = (span.abs() / intervals.max(1) as f64).max(1e-12);
    let mag = 10f64.powf(raw.log10().floor());
    [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|m| m * mag)
        .find(|s| *s >= raw * (1.0 - 1e-9))
        .unwrap_or(10.0 * mag)
}

/// Ticks from `lo` to `hi` (both included when they fall on a tick) with a 1-2-5 step giving
/// about `intervals` intervals. Non-finite or reversed bounds give no ticks.
pub fn ticks(lo: f64, hi: f64, intervals: usize) -> Ticks {
    if !(lo.is_finite() && hi.is_finite()) || hi < lo {
        return Ticks {
            values: Vec::new(),
            step: 1.0,
        };
    }
    let step = step_125((hi - lo).max(1e-12), intervals);
    let first = (lo / step - 1e-9).ceil() as i64;
    let last = (hi / step + 1e-9).floor() as i64;
    let values = (first..=last.min(first + 1000))
        .map(|k| k as f64 * step)
        .collect();
    Ticks { values, step }
}

/// Decimals a label needs so that every multiple of `step` prints exactly: 0 for a step of 1
/// or more, else as many as the step's first significant digit is behind the point.
pub fn decimals(step: f64) -> usize {
    if !(step.is_finite() && step > 0.0) || step >= 1.0 - 1e-9 {
        return 0;
    }
    let mut d = 0;
    let mut s = step;
    while d < 12 && (s - s.round()).abs() > 1e-6 * s.max(1e-300) {
        s *= 10.0;
        d += 1;
    }
    d
}

/// The label of tick `v` on an axis stepped by `step`: the tick exactly, never "-0".
pub fn tick_label(v: f64, step: f64) -> String {
    let d = decimals(step);
    let s = format!("{v:.d$}");
    if s.trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        s.trim_start_matches('-').to_string()
    } else {
        s
    }
}

impl Ticks {
    /// Each tick with its label.
    pub fn labelled(&self) -> impl Iterator<Item = (f64, String)> + '_ {
        self.values.iter().map(|v| (*v, tick_label(*v, self.step)))
    }
}

/// A rectangular plot area on the page and the data ranges it shows.
#[derive(Debug, Clone, Copy)]
pub struct Frame {
    /// Left edge on the page.
    pub left: f64,
    /// Top edge on the page.
    pub top: f64,
    /// Width on the page.
    pub width: f64,
    /// Height on the page.
    pub height: f64,
    /// Data range across (lowest, highest).
    pub x: (f64, f64),
    /// Data range up (lowest, highest).
    pub y: (f64, f64),
}

impl Frame {
    /// Page x of data value `v`.
    pub fn px(&self, v: f64) -> f64 {
        self.left + (v - self.x.0) / (self.x.1 - self.x.0).max(1e-300) * self.width
    }
    /// Page y of data value `v` (up is up).
    pub fn py(&self, v: f64) -> f64 {
        self.top + self.height - (v - self.y.0) / (self.y.1 - self.y.0).max(1e-300) * self.height
    }
    /// Bottom edge on the page.
    pub fn bottom(&self) -> f64 {
        self.top + self.height
    }
    /// Right edge on the page.
    pub fn right(&self) -> f64 {
        self.left + self.width
    }

    /// Grid lines and labels of the ticks across (`xt`, labels below) and up (`yt`, labels on
    /// the left).
    pub fn grid(&self, xt: &Ticks, yt: &Ticks) -> Group {
        let mut grid = Group::new()
            .set("stroke", "#dddddd")
            .set("stroke-width", 0.6);
        let mut labels = Group::new();
        for (v, l) in yt.labelled() {
            let y = self.py(v);
            grid = grid.add(line(self.left, y, self.right(), y));
            labels = labels.add(text(self.left - 6.0, y + 4.0, 11.0, "end", l));
        }
        for (v, l) in xt.labelled() {
            let x = self.px(v);
            grid = grid.add(line(x, self.top, x, self.bottom()));
            labels = labels.add(text(x, self.bottom() + 16.0, 11.0, "middle", l));
        }
        Group::new().add(grid).add(labels)
    }

    /// Labels of ticks `t` on the right edge (a second axis); `page_y` maps a tick to the page.
    pub fn right_labels(&self, t: &Ticks, page_y: impl Fn(f64) -> f64) -> Group {
        let mut g = Group::new();
        for (v, l) in t.labelled() {
            g = g.add(text(self.right() + 6.0, page_y(v) + 4.0, 11.0, "start", l));
        }
        g
    }

    /// The title across, centred under the tick labels.
    pub fn x_title(&self, title: &str) -> Text {
        text(
            self.left + self.width / 2.0,
            self.bottom() + 36.0,
            12.0,
            "middle",
            title,
        )
    }

    /// A title turned up the page, centred on the plot's height, at page x `x` (left of the
    /// plot for the left axis, right of it for a second axis).
    pub fn y_title(&self, title: &str, x: f64) -> Text {
        let y = self.top + self.height / 2.0;
        text(x, y, 12.0, "middle", title)
            .set("transform", format!("rotate(-90 {} {})", r1(x), r1(y)))
    }
}

/// A thin line from (x1, y1) to (x2, y2); stroke from the enclosing group or set by the caller.
pub fn line(x1: f64, y1: f64, x2: f64, y2: f64) -> Line {
    Line::new()
        .set("x1", r1(x1))
        .set("y1", r1(y1))
        .set("x2", r1(x2))
        .set("y2", r1(y2))
}

/// One row of a legend: a short line in `colour` (dashed by `dash`, e.g. "6 4") and its label.
#[derive(Debug, Clone)]
pub struct LegendRow {
    /// Line colour.
    pub colour: String,
    /// SVG dash pattern, if dashed.
    pub dash: Option<String>,
    /// The label.
    pub label: String,
}

/// A legend: one row per entry from (`x`, `y`) down, `step` apart.
pub fn legend(x: f64, y: f64, step: f64, rows: &[LegendRow]) -> Group {
    let mut g = Group::new();
    for (i, r) in rows.iter().enumerate() {
        let ly = y + i as f64 * step;
        let mut l = line(x, ly, x + 22.0, ly)
            .set("stroke", r.colour.as_str())
            .set("stroke-width", 2);
        if let Some(d) = &r.dash {
            l = l.set("stroke-dasharray", d.as_str());
        }
        g = g
            .add(l)
            .add(text(x + 28.0, ly + 4.0, 10.5, "start", r.label.clone()));
    }
    g
}

/// A blank chart page `width` × `height` px on a white ground.
pub fn white_page(width: f64, height: f64) -> Document {
    Document::new()
        .set("viewBox", (0, 0, width as i64, height as i64))
        .set("width", width as i64)
        .set("height", height as i64)
        .add(
            Rectangle::new()
                .set("width", "100%")
                .set("height", "100%")
                .set("fill", "white"),
        )
}

/// The caution at the foot of a chart: wrapped at `wrap_at` characters, the first line's
/// baseline at `y`, one line every `step` px, in grey text of `size` px from `x`.
pub fn caution_block(x: f64, y: f64, size: f64, step: f64, wrap_at: usize) -> Group {
    let mut g = Group::new().set("id", "caution");
    let words = format!("CAUTION: {}", crate::caution::CAUTION);
    for (k, l) in super::words::wrap(&words, wrap_at, "").lines().enumerate() {
        g = g.add(text(x, y + step * k as f64, size, "start", l.to_string()).set("fill", "#555"));
    }
    g
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The rule: steps of 1, 2 or 5 × 10ᵏ, ticks whole multiples of the step covering the range
    /// to within one step, and each label reading back as its tick (common practice (no
    /// source)).
    #[test]
    fn ticks_follow_the_1_2_5_rule_and_print_faithfully() {
        let ranges = [
            (0.0, 10.0, 4),
            (0.0, 10.0, 10),
            (-3.7, 12.2, 8),
            (0.0, 33.0, 10),
            (0.013, 0.087, 6),
            (1250.0, 1730.0, 5),
            (-0.4, 0.0, 4),
            (2.0, 2.0000001, 5),
        ];
        for (lo, hi, n) in ranges {
            let t = ticks(lo, hi, n);
            let mant = t.step / 10f64.powf(t.step.log10().floor());
            assert!(
                [1.0, 2.0, 5.0].iter().any(|m| (mant - m).abs() < 1e-9),
                "step {} for {lo}…{hi}",
                t.step
            );
            assert!(!t.values.is_empty(), "{lo}…{hi}");
            assert!(t.values[0] >= lo - 1e-9 && t.values[0] < lo + t.step + 1e-9);
            let last = *t.values.last().unwrap();
            assert!(last <= hi + 1e-9 && last > hi - t.step - 1e-9);
            assert!(t.values.len() <= n + 1, "{lo}…{hi}: {:?}", t.values);
            for (v, l) in t.labelled() {
                let back: f64 = l.parse().unwrap();
                assert!((back - v).abs() < t.step * 1e-6, "{v} printed {l}");
                assert!((v / t.step - (v / t.step).round()).abs() < 1e-6);
            }
        }
    }

    #[test]
    fn half_steps_keep_their_decimal() {
        // The section axis used to print 2.5 as "2" and 7.5 as "8" (rounding to whole numbers
        // with a 2.5 step): a 0.5 step prints one decimal.
        assert_eq!(tick_label(2.5, 0.5), "2.5");
        assert_eq!(tick_label(7.5, 0.5), "7.5");
        assert_eq!(tick_label(-0.0001, 0.2), "0.0");
        assert_eq!(tick_label(1500.0, 500.0), "1500");
        assert_eq!(tick_label(0.05, 0.01), "0.05");
        let t = ticks(0.0, 10.0, 20);
        assert_eq!(t.step, 0.5);
        let labels: Vec<String> = t.labelled().map(|(_, l)| l).collect();
        assert_eq!(labels[5], "2.5");
        assert_eq!(labels[15], "7.5");
    }
}

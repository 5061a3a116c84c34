//! Counts of the work a command did, for `drydig design -v`: linear programmes solved, layouts
//! tried, full evaluations, kernel sums (one per point summed over the wells in range) and how
//! often a layout's unit matrix was built and reused. Process-wide counters (relaxed atomics:
//! exact totals, no ordering); they only report, nothing reads them to decide.

use std::sync::atomic::{AtomicUsize, Ordering};
use std::sync::RwLock;

/// Linear programmes handed to a solver.
pub static LP_SOLVES: AtomicUsize = AtomicUsize::new(0);
/// Layouts tried (rows of the count table, placements below the count found included).
pub static TRIALS: AtomicUsize = AtomicUsize::new(0);
/// Full evaluations of a layout at every check point and well.
pub static EVALUATIONS: AtomicUsize = AtomicUsize::new(0);
/// Kernel sums: points at which the effect of every well in range was summed.
pub static KERNEL_SUMS: AtomicUsize = AtomicUsize::new(0);
/// Unit matrices (ΔΦ per unit rate, every target and well × every well) built.
pub static UNIT_MATRIX_BUILDS: AtomicUsize = AtomicUsize::new(0);
/// Uses of a unit matrix already built (rate options, one-well-out rows and report).
pub static UNIT_MATRIX_REUSES: AtomicUsize = AtomicUsize::new(0);
/// Wall systems (line-doublet jumps, one right-hand side per unit well) factorised and solved.
pub static WALL_SOLVES: AtomicUsize = AtomicUsize::new(0);

/// Layouts the count search still has to try once it has bracketed the count between a
/// failure `lo` and a success `hi`: ⌈log₂(hi − lo)⌉ bisection steps, the one being tried
/// included; 0 before there is a bracket and after. Read by the progress display for its ETA.
pub static BISECTION_LEFT: AtomicUsize = AtomicUsize::new(0);

/// The count search has bracketed its count between `lo` (failed) and `hi` (met).
pub fn bisecting(lo: usize, hi: usize) {
    BISECTION_LEFT.store(bisection_steps(hi.saturating_sub(lo)), Ordering::Relaxed);
}

/// Steps a bisection takes to close a gap of `gap` counts down to 1: ⌈log₂ gap⌉.
fn bisection_steps(gap: usize) -> usize {
    if gap <= 1 {
        0
    } else {
        (usize::BITS - (gap - 1).leading_zeros()) as usize
    }
}

/// Add `n` to `counter`.
#[inline]
pub fn add(counter: &AtomicUsize, n: usize) {
    counter.fetch_add(n, Ordering::Relaxed);
}

/// The counts in one line.
pub fn summary() -> String {
    let g = |c: &AtomicUsize| c.load(Ordering::Relaxed);
    let walls = match g(&WALL_SOLVES) {
        0 => String::new(),
        n => format!(", wall systems solved {n} times"),
    };
    format!(
        "work: {} LP solves, {} layouts tried, {} full evaluations, {} kernel sums, unit matrix built {} times and reused {} times{}",
        g(&LP_SOLVES),
        g(&TRIALS),
        g(&EVALUATIONS),
        g(&KERNEL_SUMS),
        g(&UNIT_MATRIX_BUILDS),
        g(&UNIT_MATRIX_REUSES),
        walls
    )
}

/// What a progress display is told as each layout is tried: its well count and spacing (m).
pub type ProgressSink = Box<dyn Fn(usize, f64) + Send + Sync>;

static PROGRESS: RwLock<Option<ProgressSink>> = RwLock::new(None);

/// Set (or, with `None`, remove) the progress display told of each layout tried. Like the
/// counters it only reports: nothing in the search reads it.
pub fn set_progress(sink: Option<ProgressSink>) {
    if let Ok(mut p) = PROGRESS.write() {
        *p = sink;
    }
}

/// A layout of `count` wells at `spacing` (m) is being tried.
pub fn trying(count: usize, spacing: f64) {
    if let Ok(p) = PROGRESS.read() {
        if let Some(sink) = p.as_ref() {
            sink(count, spacing);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bisection_steps_bound_the_worst_case() {
        // The worst case of halving [lo, hi] (m = lo + (hi − lo)/2, either half kept) counted
        // step by step: the bound is exact (⌈log₂ n⌉, Knuth, TAOCP vol. 3, 6.2.1).
        fn worst(gap: usize) -> usize {
            if gap <= 1 {
                0
            } else {
                let m = gap / 2;
                1 + worst(m).max(worst(gap - m))
            }
        }
        for gap in 0..2000 {
            assert_eq!(bisection_steps(gap), worst(gap), "gap {gap}");
        }
    }
}

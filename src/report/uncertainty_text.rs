//! `drydig uncertainty` in words and tables: the terminal summary, uncertainty.csv (one row per
//! sample: inputs and outputs, SI machine columns and the user's units) and uncertainty.json
//! (percentiles, swings, the robust design, the implied contingency, the caution).

use super::format::Fmt;
use crate::caution::CAUTION;
use crate::findings::uncertainty::UncertaintyFindings;
use crate::input::model::Model;
use crate::input::model_uncertainty::InputKind;
use crate::input::units::UnitSystem;
use crate::report::words::{thousands, wrap};
use crate::uncertainty::run::{Measure, Mode, Series, UncertaintyRun};
use serde_json::json;

/// How the samples are drawn, in words (stated in every output).
pub const SAMPLING: &str = "Latin hypercube (McKay, Beckman & Conover 1979), one ChaCha8 stream per input from the seed; K–S rank correlation by Iman–Conover reordering (1982)";

/// Days to dig are not sampled yet: said wherever a `[programme]` is given.
pub const NO_DAYS: &str = "days to dig: not sampled here (sampled with `uncertainty` on a given layout whose [programme] `drydig programme` can set up; run `drydig programme` for the time answers)";

/// How the convergence figure is found.
pub const CONVERGENCE_METHOD: &str = "half-width of the 95 % bootstrap percentile interval of P90 (resamples of the samples with replacement), divided by P90; the bootstrap treats the samples as independent, so for a Latin hypercube and an output that rises or falls with its inputs it is an upper bound";

/// How the replicate figure is found.
pub const REPLICATE_METHOD: &str = "the same Latin hypercube sampling repeated with other seeds (the run's own seed first); sample standard deviation of their P90s and the largest move from the run's P90, each divided by the run's P90";

/// The convergence line: how far the P90 of the first output may move with other samples.
pub fn convergence_line(run: &UncertaintyRun) -> Option<String> {
    let c = run.convergence?;
    let label = &run.series.first()?.label;
    if let Some(r) = c.replicates {
        return Some(format!(
            "sampling convergence: P90 of {label} moves by {:.1} % (standard deviation; largest move {:.1} %) over {} Latin hypercubes of N = {} ({REPLICATE_METHOD}); the bootstrap bound is ± {:.1} %\n",
            100.0 * r.relative_sd,
            100.0 * r.relative_max,
            r.count,
            c.samples,
            100.0 * c.relative_half_width
        ));
    }
    Some(format!(
        "sampling convergence: P90 of {label} within ± {:.1} % at N = {} ({CONVERGENCE_METHOD}, {} resamples)\n",
        100.0 * c.relative_half_width,
        c.samples,
        c.resamples
    ))
}

/// The note on sampled days to dig: the method, and the stages not ready in some samples (left
/// out of the percentiles, so the P90 then reads short of the truth).
fn days_note(not_ready: &[(String, usize)]) -> String {
    let mut s = "days to dig: the earliest day each stage's check points meet its target, on each sample's T and S, by the programme's Theis superposition in time (as `drydig programme`)".to_string();
    let short: Vec<String> = not_ready
        .iter()
        .filter(|(_, n)| *n > 0)
        .map(|(name, n)| format!("{name}: {n}"))
        .collect();
    if !short.is_empty() {
        s.push_str(&format!(
            "; samples not ready within the programme, left out of its percentiles (so its P90 is at least the value shown) — {}",
            short.join(", ")
        ));
    }
    s
}

/// An input's value in the user's units, with its unit.
pub fn input_value(kind: InputKind, v: f64, f: &Fmt) -> String {
    match kind {
        InputKind::Conductivity => f.conductivity(v),
        InputKind::Transmissivity => f.transmissivity(v),
        InputKind::Distance => f.length(v),
        InputKind::GroundwaterLevel => f.level(v),
        InputKind::AquitardResistance => format!("{} days", thousands(v / 86_400.0, 1)),
        InputKind::SichardtC => format!("{v:.0}"),
        _ => format!("{v:.3}"),
    }
}

/// An output value in the user's units, with its unit.
pub fn output_value(m: Measure, v: f64, f: &Fmt) -> String {
    match m {
        Measure::Flow => f.flow(v),
        Measure::Length => f.length(v),
        Measure::Settlement => f.small_length(v),
        Measure::Count => format!("{v:.0}"),
        Measure::Duration => format!("{:.1} days", v / 86_400.0),
    }
}

/// An output value as a number in the user's unit, and that unit (for charts and CSV).
pub fn output_number(m: Measure, v: f64, units: UnitSystem) -> (f64, &'static str) {
    let f = Fmt::new(units, 0.0);
    match (m, units) {
        (Measure::Flow, UnitSystem::Si) => (v * 86_400.0, "m3_per_day"),
        (Measure::Flow, UnitSystem::Us) => (crate::input::units::m3s_to_gpm(v), "gpm"),
        (Measure::Length, _) => (f.length_number(v), f.length_suffix()),
        (Measure::Settlement, UnitSystem::Si) => (v * 1e3, "mm"),
        (Measure::Settlement, UnitSystem::Us) => (v / 0.0254, "in"),
        (Measure::Count, _) => (v, "wells"),
        (Measure::Duration, _) => (v / 86_400.0, "days"),
    }
}

/// The SI unit word of a measure's machine column.
fn si_suffix(m: Measure) -> &'static str {
    match m {
        Measure::Flow => "m3_per_s",
        Measure::Length | Measure::Settlement => "m",
        Measure::Count => "",
        Measure::Duration => "s",
    }
}

/// Whether an output gets a second column in the user's unit (not when it is the SI one).
fn user_column(m: Measure, units: UnitSystem) -> bool {
    m != Measure::Count && output_number(m, 0.0, units).1 != si_suffix(m)
}

fn column(stem: &str, suffix: &str) -> String {
    if suffix.is_empty() {
        stem.to_string()
    } else {
        format!("{stem}_{suffix}")
    }
}

/// The implied contingency in words: P90 ÷ P50 flow beside the file's contingency.
pub fn implied_contingency(run: &UncertaintyRun) -> String {
    match run.implied_ratio {
        Some(r) => format!(
            "implied contingency: P90 flow ÷ P50 flow = {r:.2} (+{:.0} %), beside the file's +{:.0} %: {}",
            (r - 1.0) * 100.0,
            run.contingency * 100.0,
            if r - 1.0 <= run.contingency {
                "the file's contingency covers the P90 ground"
            } else {
                "the file's contingency is thinner than the spread of the ground"
            }
        ),
        None => "implied contingency: not computed (no flow in the samples)".into(),
    }
}

fn mode_words(m: Mode) -> &'static str {
    match m {
        Mode::Check => "the file's layout at its rates (as `check`)",
        Mode::Design => "the fewest-wells design on each sample (as `design`)",
    }
}

/// The notes every output carries besides the caution.
pub fn notes(run: &UncertaintyRun) -> Vec<String> {
    let mut n = vec![format!("sampling: {SAMPLING}")];
    if run.mode == Mode::Check {
        n.push("flow needed: the given rates scaled together to just meet every target, the radius of influence held at the value the given rates produce (with Sichardt a larger flow spreads R a little further)".into());
    }
    if run.mode == Mode::Design {
        n.push("robust design: the samples' designs ranked by wells then flow; the one at the reliability's rank is evaluated on every sample at its own rates, and the next up tried when it falls short".into());
    }
    match &run.days_not_ready {
        Some(not_ready) => n.push(days_note(not_ready)),
        None if run.has_programme => n.push(NO_DAYS.into()),
        None => {}
    }
    n
}

fn series_row(s: &Series, f: &Fmt) -> String {
    match &s.percentiles {
        Some(p) => format!(
            "{:<44} {:>16} {:>16} {:>16}",
            s.label.chars().take(44).collect::<String>(),
            output_value(s.measure, p.p10, f),
            output_value(s.measure, p.p50, f),
            output_value(s.measure, p.p90, f)
        ),
        None => format!("{:<44} {:>16}", s.label, "not computed"),
    }
}

/// The terminal summary.
pub fn to_text(model: &Model, found: &UncertaintyFindings) -> String {
    let run = &found.run;
    let f = Fmt::new(model.units, model.ground_level);
    let mut out = format!("drydig uncertainty — {}\n", model.name);
    out.push_str(&wrap(
        &format!(
            "{} samples (seed {}) of {}; {SAMPLING}",
            run.samples,
            run.seed,
            mode_words(run.mode)
        ),
        96,
        "",
    ));
    out.push_str(&format!(
        "\n{:<24} {:>22} {:>22} {:>22}\n",
        "input", "P10", "P50", "P90"
    ));
    for i in &run.inputs {
        let q = |p: f64| input_value(i.kind, i.distribution.quantile(p), &f);
        out.push_str(&format!(
            "{:<24} {:>22} {:>22} {:>22}\n",
            i.kind.field(),
            q(0.1),
            q(0.5),
            q(0.9)
        ));
    }
    for i in &run.inputs {
        out.push_str(&format!("  {}: {}\n", i.kind.field(), i.text));
    }
    if let Some(r) = run.rank_correlation {
        out.push_str(&format!("rank correlation of K and S: {r:.2}\n"));
    }
    out.push_str(&format!(
        "\n{:<44} {:>16} {:>16} {:>16}\n",
        "output", "P10", "P50", "P90"
    ));
    for s in &run.series {
        out.push_str(&series_row(s, &f));
        out.push('\n');
    }
    out.push('\n');
    match run.mode {
        Mode::Check => {
            out.push_str(&format!(
                "every target met with the given rates, every well within its limits: {:.1} % of samples\n",
                run.fraction_met * 100.0
            ));
            if let Some(w) = run.fraction_wells_ok {
                out.push_str(&format!(
                    "every well within its limits (capacity, lowest level): {:.1} % of samples; a well past a limit in {} samples (counted as not met)\n",
                    w * 100.0,
                    run.wells_past_limit
                ));
            }
        }
        Mode::Design => out.push_str(&design_lines(run, &f)),
    }
    out.push_str(&implied_contingency(run));
    out.push('\n');
    if let Some(c) = convergence_line(run) {
        out.push_str(&wrap(&c, 96, ""));
    }
    out.push_str(&tornado_lines(run, &f));
    for n in notes(run) {
        out.push_str(&wrap(&format!("note: {n}"), 96, "  "));
    }
    out.push_str(&format!(
        "\nRESULT: {}\n\n",
        super::verdict::headline(&found.verdict, &f)
    ));
    out.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, ""));
    out
}

/// The design lines: the P50 design and the robust one.
fn design_lines(run: &UncertaintyRun, f: &Fmt) -> String {
    let mut out = format!(
        "a layout meeting every target was found in {:.1} % of samples\n",
        run.fraction_met * 100.0
    );
    match run.p50_design {
        Some((w, q)) => out.push_str(&format!(
            "P50 ground (every input at its median): {w} wells, {}\n",
            f.flow(q)
        )),
        None => out.push_str("P50 ground: no layout meets every target\n"),
    }
    match &run.robust {
        Some(r) => out.push_str(&format!(
            "robust design for {:.0} %: {} wells, {} (the design of sample {}), every target met in {:.1} % of samples at its rates\n",
            run.reliability * 100.0,
            r.wells,
            f.flow(r.total_flow_m3_per_s),
            r.sample + 1,
            r.fraction_met * 100.0
        )),
        None => out.push_str("robust design: none (no sample's design meets every target)\n"),
    }
    out
}

fn tornado_lines(run: &UncertaintyRun, f: &Fmt) -> String {
    let Some(s) = run.series.iter().find(|s| s.key == run.tornado.0) else {
        return String::new();
    };
    let mut out = format!(
        "\nswings of {} (each input at its P10 and P90, the others at P50; all at P50: {}):\n",
        s.label,
        run.tornado
            .1
            .map_or("—".into(), |v| output_value(s.measure, v, f))
    );
    for w in &run.tornado.2 {
        let v = |x: Option<f64>| x.map_or("—".into(), |v| output_value(s.measure, v, f));
        out.push_str(&format!(
            "  {:<24} P10 → {:>16}   P90 → {:>16}\n",
            w.input,
            v(w.at_p10),
            v(w.at_p90)
        ));
    }
    out
}

/// uncertainty.csv: one row per sample — its inputs (SI and the user's units) and outputs.
pub fn to_csv(model: &Model, run: &UncertaintyRun) -> anyhow::Result<Vec<u8>> {
    let units = model.units;
    let mut w = csv::Writer::from_writer(Vec::new());
    let mut head = vec!["sample".to_string()];
    for i in &run.inputs {
        head.push(column(
            i.kind.field(),
            &i.kind.si_unit().replace('/', "_per_"),
        ));
    }
    for s in &run.series {
        head.push(column(&s.key, si_suffix(s.measure)));
        if user_column(s.measure, units) {
            head.push(column(&s.key, output_number(s.measure, 0.0, units).1));
        }
    }
    head.push("targets_met".into());
    w.write_record(&head)?;
    for (k, v) in run.values.iter().enumerate() {
        let mut rec = vec![(k + 1).to_string()];
        rec.extend(v.iter().map(|x| format!("{x:.6e}")));
        for s in &run.series {
            let x = s.values.get(k).copied().flatten();
            rec.push(x.map_or(String::new(), |x| format!("{x:.6e}")));
            if user_column(s.measure, units) {
                rec.push(x.map_or(String::new(), |x| {
                    format!("{:.4}", output_number(s.measure, x, units).0)
                }));
            }
        }
        rec.push(run.sample_met.get(k).copied().unwrap_or(false).to_string());
        w.write_record(&rec)?;
    }
    Ok(w.into_inner()?)
}

/// uncertainty.json: the percentiles (SI), the swings, the robust design, the verdict.
pub fn to_json(model: &Model, found: &UncertaintyFindings) -> serde_json::Value {
    let run = &found.run;
    let f = Fmt::new(model.units, model.ground_level);
    let inputs: Vec<_> = run
        .inputs
        .iter()
        .map(|i| {
            json!({
                "input": i.kind.field(),
                "as_written": i.text,
                "si_unit": i.kind.si_unit(),
                "p10": i.distribution.quantile(0.1),
                "p50": i.distribution.quantile(0.5),
                "p90": i.distribution.quantile(0.9),
            })
        })
        .collect();
    let outputs: Vec<_> = run
        .series
        .iter()
        .map(|s| {
            json!({
                "output": s.key,
                "label": s.label,
                "si_unit": si_suffix(s.measure),
                "percentiles": s.percentiles,
            })
        })
        .collect();
    json!({
        "command": "uncertainty",
        "mode": run.mode,
        "samples": run.samples,
        "seed": run.seed,
        "sampling": SAMPLING,
        "rank_correlation_k_s": run.rank_correlation,
        "inputs": inputs,
        "outputs": outputs,
        "fraction_targets_met": run.fraction_met,
        "fraction_wells_within_limits": run.fraction_wells_ok,
        "samples_with_a_well_past_a_limit": run.wells_past_limit,
        "reliability": run.reliability,
        "p50_design": run.p50_design.map(|(w, q)| json!({"wells": w, "total_flow_m3_per_s": q})),
        "robust_design": run.robust,
        "contingency": run.contingency,
        "implied_contingency_p90_over_p50": run.implied_ratio,
        "convergence_p90": run.convergence.map(|c| json!({
            "output": run.series.first().map(|s| s.key.clone()),
            "p": c.p,
            "samples": c.samples,
            "resamples": c.resamples,
            "relative_half_width_95": c.relative_half_width,
            "method": CONVERGENCE_METHOD,
            "replicates": c.replicates.map(|r| json!({
                "latin_hypercubes": r.count,
                "relative_sd": r.relative_sd,
                "relative_largest_move": r.relative_max,
                "method": REPLICATE_METHOD,
            })),
        })),
        "tornado": {"output": run.tornado.0, "all_at_p50": run.tornado.1, "swings": run.tornado.2},
        "notes": notes(run),
        "result": super::verdict::headline(&found.verdict, &f),
        "caution": CAUTION,
    })
}

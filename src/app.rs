//! One command from its arguments to its outputs: read the model, build the findings once,
//! render every output from them. The binary writes the files, prints the text and exits with
//! the verdict's code; nothing here prints.

use crate::cli::{Chatter, Command};
use crate::findings::check::CheckFindings;
use crate::findings::commands::{
    by_day_verdict, programme_verdict, sweep_verdict, PumpingTestFindings,
};
use crate::findings::design::DesignFindings;
use crate::findings::verdict::Verdict;
use crate::input::error::InputError;
use crate::input::model::Model;
use crate::input::units::UnitSystem;
use crate::input::validate::file as model;
use crate::report;
use std::path::{Path, PathBuf};

/// Every output of a command, rendered, and its verdict.
pub struct Outputs {
    /// The folder the files go to, when the command writes files.
    pub out: Option<PathBuf>,
    /// The files, (name, bytes).
    pub files: Vec<(String, Vec<u8>)>,
    /// The input files recorded in the manifest.
    pub inputs: Vec<PathBuf>,
    /// The text for the terminal (stdout).
    pub text: String,
    /// Messages for stderr (the work counts of `design -v`, the note of `new`).
    pub messages: Vec<String>,
    /// Met, or what is short: decides the exit code.
    pub verdict: Verdict,
}

impl Outputs {
    fn printed(text: String, messages: Vec<String>) -> Self {
        Outputs {
            out: None,
            files: Vec::new(),
            inputs: Vec::new(),
            text,
            messages,
            verdict: Verdict::Met,
        }
    }

    fn written(out: PathBuf, files: Vec<(String, Vec<u8>)>, inputs: Vec<PathBuf>) -> Self {
        Outputs {
            out: Some(out),
            files,
            inputs,
            text: String::new(),
            messages: Vec::new(),
            verdict: Verdict::Met,
        }
    }
}

/// Run `command`: parse the model, build the findings, render the outputs. `chatter` decides
/// the progress display on a terminal (`-q`, `-v`) and the work counts of `design -v`.
pub fn run(command: Command, chatter: Chatter) -> anyhow::Result<Outputs> {
    match command {
        Command::Estimate { file, json, units } => {
            let model = model::load(&file)?;
            let units = units.map(Into::into).unwrap_or(model.units);
            let est = crate::estimate::estimate(&model);
            let text = if json {
                let v = report::estimate_text::to_json(&est, units);
                format!("{}\n", serde_json::to_string_pretty(&v)?)
            } else {
                report::estimate_text::to_text(&est, units)
            };
            Ok(Outputs::printed(text, Vec::new()))
        }
        Command::Check {
            file,
            out,
            wells,
            units,
            size_recharge,
        } => {
            let mut model = model::load(&file)?;
            // The files (report, maps) follow `--units` too.
            model.units = units.map(Into::into).unwrap_or(model.units);
            check(&model, out, wells.as_deref(), size_recharge, chatter)
        }
        Command::Design {
            file,
            out,
            rates,
            units,
            prices,
            by_day,
        } => {
            let mut model = model::load(&file)?;
            model.units = units.map(Into::into).unwrap_or(model.units);
            if let Some(day) = by_day {
                return by_day_outputs(&model, day, out);
            }
            design(&model, out, rates.into(), prices, chatter)
        }
        Command::Sweep {
            file,
            from,
            to,
            step,
            out,
            units,
        } => {
            let mut model = model::load(&file)?;
            // The engine's notes (placement, binding limit) follow `--units` too.
            model.units = units.map(Into::into).unwrap_or(model.units);
            let units = model.units;
            let ring = model
                .layout
                .as_ref()
                .is_some_and(|l| matches!(l.kind, crate::input::model::LayoutKind::Ring { .. }));
            let [from, to, step] = crate::cli::sweep_bounds(
                ring,
                [("--from", Some(from)), ("--to", Some(to)), ("--step", step)],
            )
            .map_err(|(flag, e)| bad_arg(flag, e))?;
            let bounds = (from.unwrap_or(0.0), to.unwrap_or(0.0), step);
            sweep(&model, bounds, out, units, chatter)
        }
        Command::Programme {
            file,
            out,
            wells,
            units,
        } => {
            let mut model = model::load(&file)?;
            // The text, the added CSV columns, the charts and the maps follow `--units`.
            model.units = units.map(Into::into).unwrap_or(model.units);
            programme(&model, out, wells.as_deref())
        }
        Command::PumpingTest {
            file,
            rate,
            distance,
            thickness,
            recovery_after,
            method,
            units,
            out,
        } => {
            let prefer = method.map(Into::into);
            let units = units.map_or(UnitSystem::Si, Into::into);
            let data = pumping_test_data(&file, &rate, &distance, thickness.as_deref())?;
            let recovery = recovery_after
                .as_deref()
                .map(|t| {
                    crate::input::units::parse::<crate::input::units::TimeKind>(t)
                        .map_err(|e| bad_arg("--recovery-after", e))
                })
                .transpose()?;
            let found = PumpingTestFindings::build(data, recovery, prefer);
            let files = report::pumping_test_text::files(&found.data, found.best(), units);
            let mut o = Outputs::written(out, files, Vec::new());
            o.text =
                report::pumping_test_text::to_text(&found.data, &found.fits, found.best(), units);
            o.verdict = found.verdict;
            Ok(o)
        }
        Command::Uncertainty {
            file,
            out,
            of,
            samples,
            seed,
            reliability,
            rates,
            units,
        } => {
            let mut model = model::load(&file)?;
            model.units = units.map(Into::into).unwrap_or(model.units);
            let settings = uncertainty_settings(of, samples, seed, reliability, rates)?;
            uncertainty(&model, out, settings, chatter)
        }
        Command::New { file } => {
            crate::input::starter::write_new(&file)?;
            let note = format!(
                "wrote {} — edit it, then run: drydig estimate {}",
                file.display(),
                file.display()
            );
            Ok(Outputs::printed(String::new(), vec![note]))
        }
    }
}

/// How much of a long table the terminal lists: all of it with `-v`.
fn table_rows(chatter: Chatter) -> report::table::Rows {
    if chatter == Chatter::Verbose {
        report::table::Rows::All
    } else {
        report::table::Rows::Short
    }
}

/// `check`: one layout evaluated (with recharge wells sized when asked).
fn check(
    model: &Model,
    out: PathBuf,
    wells: Option<&Path>,
    size_recharge: bool,
    chatter: Chatter,
) -> anyhow::Result<Outputs> {
    let found = if size_recharge {
        let (run, sizing) = crate::optimise::recharge::run_sized(model, wells)?;
        CheckFindings::build(run, Some(sizing))
    } else {
        CheckFindings::build(crate::check::run::run(model, wells)?, None)
    };
    let inputs = report::files::inputs_of(model, wells);
    let mut o = Outputs::written(out, report::check_outputs::check_files(&found)?, inputs);
    o.text = report::check_text::to_text(&found, model.units, table_rows(chatter));
    o.verdict = found.verdict;
    Ok(o)
}

/// `design`: the fewest wells, the chosen layout checked, the bid priced with `prices`.
fn design(
    model: &Model,
    out: PathBuf,
    rates: crate::optimise::rates::RateOption,
    prices: Option<PathBuf>,
    chatter: Chatter,
) -> anyhow::Result<Outputs> {
    let price_list = prices
        .as_deref()
        .map(crate::input::prices::read)
        .transpose()?;
    let progress = crate::cli::progress_layouts(chatter, model.units);
    let searched = crate::optimise::search::design(model, rates);
    progress.finish();
    let found = DesignFindings::build(model, searched?, price_list.as_deref())?;
    let mut inputs = report::files::inputs_of(model, None);
    inputs.extend(prices);
    let files = report::design_text::files(model, &found)?;
    let mut o = Outputs::written(out, files, inputs);
    if chatter == Chatter::Verbose {
        o.messages.push(crate::work_counts::summary());
    }
    o.text = report::design_text::to_text(model, &found, model.units, table_rows(chatter));
    o.verdict = found.verdict;
    Ok(o)
}

/// `sweep`: a range of counts or spacings, `[from, to, step]` as given.
fn sweep(
    model: &Model,
    (from, to, step): (f64, f64, Option<f64>),
    out: PathBuf,
    units: UnitSystem,
    chatter: Chatter,
) -> anyhow::Result<Outputs> {
    let plan = crate::optimise::sweep::plan(model, from, to, step)?;
    let bar = crate::cli::progress_counted(chatter, plan.values.len(), "layouts");
    let sweep = crate::optimise::sweep::run(model, &plan, &|| bar.inc(1));
    bar.finish_and_clear();
    let sweep = sweep?;
    let files = vec![
        (
            "sweep.csv".to_string(),
            report::design_text::trials_csv(&sweep.trials, Some(&sweep.values), units)?,
        ),
        (
            "sweep.svg".to_string(),
            report::sweep_chart::render_in(&model.name, &sweep, units).into_bytes(),
        ),
    ];
    let mut o = Outputs::written(out, files, report::files::inputs_of(model, None));
    o.text = report::design_text::sweep_text(model, &sweep, units);
    o.verdict = sweep_verdict(&sweep);
    Ok(o)
}

/// `programme`: days to dig each stage, hydrographs, volumes and maps in time.
fn programme(model: &Model, out: PathBuf, wells: Option<&Path>) -> anyhow::Result<Outputs> {
    let setup = crate::transient::programme::setup_from(model, wells)?;
    let answers = crate::transient::answers::answer(model, &setup);
    let mut files = vec![(
        "programme.csv".to_string(),
        report::programme_text::to_csv(model, &answers),
    )];
    files.extend(report::programme_charts::charts(model, &answers));
    let positions: Vec<[f64; 2]> = setup.wells.iter().map(|w| w.position).collect();
    for m in &answers.maps {
        files.push((
            crate::input::validate::programme::map_file_name(m.time),
            report::programme_map::map_svg(model, m, &positions).into_bytes(),
        ));
    }
    let mut o = Outputs::written(out, files, report::files::inputs_of(model, wells));
    o.text = report::programme_text::to_text(model, &answers);
    o.verdict = programme_verdict(&answers);
    Ok(o)
}

/// The settings of `uncertainty` from its flags (reliability and samples checked).
fn uncertainty_settings(
    of: crate::cli::UncertaintyOf,
    samples: Option<usize>,
    seed: Option<u64>,
    reliability: f64,
    rates: crate::cli::RatesArg,
) -> anyhow::Result<crate::uncertainty::run::Settings> {
    if !(50.0..=99.9).contains(&reliability) {
        return Err(bad_arg(
            "--reliability",
            format!("{reliability} is outside 50 … 99.9 (per cent of samples; 90 is usual)"),
        ));
    }
    let max = crate::input::model_uncertainty::MAX_SAMPLES;
    if let Some(n) = samples.filter(|n| !(10..=max).contains(n)) {
        return Err(bad_arg(
            "--samples",
            format!("{n} is outside 10 … {max} (1 000 is usual)"),
        ));
    }
    Ok(crate::uncertainty::run::Settings {
        mode: of.into(),
        samples,
        seed,
        reliability: reliability / 100.0,
        rates: rates.into(),
    })
}

/// `uncertainty`: the samples evaluated, their distributions, charts and report.
fn uncertainty(
    model: &Model,
    out: PathBuf,
    settings: crate::uncertainty::run::Settings,
    chatter: Chatter,
) -> anyhow::Result<Outputs> {
    let spec = crate::uncertainty::run::spec_of(model)?;
    let n = settings.samples.unwrap_or(spec.samples);
    let bar = crate::cli::progress_counted(chatter, n, "samples");
    let run = crate::uncertainty::run::run(model, settings, &|| bar.inc(1));
    bar.finish_and_clear();
    let found = crate::findings::uncertainty::UncertaintyFindings::build(run?);
    let files = report::uncertainty_files::files(model, &found)?;
    let mut o = Outputs::written(out, files, report::files::inputs_of(model, None));
    o.text = report::uncertainty_text::to_text(model, &found);
    o.verdict = found.verdict;
    Ok(o)
}

/// `design --by-day`: the design for one day of the programme.
fn by_day_outputs(model: &Model, day: f64, out: PathBuf) -> anyhow::Result<Outputs> {
    let d = crate::transient::by_date::design_by_day(model, day)?;
    let csv = report::by_day_text::to_csv(&d, model.units);
    let files = vec![("by_day.csv".to_string(), csv)];
    let mut o = Outputs::written(out, files, report::files::inputs_of(model, None));
    o.text = report::by_day_text::to_text(model, &d, model.units);
    o.verdict = by_day_verdict(&d);
    Ok(o)
}

fn bad_arg(field: &str, message: String) -> anyhow::Error {
    InputError {
        file: PathBuf::from("command line"),
        field: field.into(),
        line: None,
        message,
    }
    .into()
}

/// The pumping-test data from the CSV and the command-line values (rate, distances, thickness).
fn pumping_test_data(
    file: &Path,
    rate: &str,
    distance: &[String],
    thickness: Option<&str>,
) -> anyhow::Result<crate::test_analysis::PumpingTestData> {
    use crate::input::units::{parse, FlowKind, LengthKind};
    let text = crate::input::read::read_text_capped(
        file,
        crate::input::read::MAX_PUMPING_TEST_BYTES,
        "pumping-test data",
    )?;
    let err = |m: String| InputError {
        file: file.to_path_buf(),
        field: String::new(),
        line: None,
        message: m,
    };
    let rate = parse::<FlowKind>(rate).map_err(|e| bad_arg("--rate", e))?;
    if rate.is_nan() || rate <= 0.0 {
        return Err(bad_arg(
            "--rate",
            "the pumping rate must be greater than 0".into(),
        ));
    }
    let name = file.file_stem().map_or("observation".to_string(), |s| {
        s.to_string_lossy().into_owned()
    });
    let series = crate::test_analysis::csv_input::read_observations(&text, &name).map_err(err)?;
    let mut named = Vec::new();
    let mut plain = None;
    for d in distance {
        match d.split_once('=') {
            Some((n, v)) => named.push((
                n.trim().to_string(),
                parse::<LengthKind>(v).map_err(|e| bad_arg("--distance", e))?,
            )),
            None => plain = Some(parse::<LengthKind>(d).map_err(|e| bad_arg("--distance", e))?),
        }
    }
    let wells = series
        .into_iter()
        .map(|s| {
            let d = named
                .iter()
                .find(|(n, _)| *n == s.name)
                .map(|(_, v)| *v)
                .or(plain);
            s.into_well(d).map_err(|m| bad_arg("--distance", m))
        })
        .collect::<Result<Vec<_>, _>>()?;
    let thickness = thickness
        .map(|t| parse::<LengthKind>(t).map_err(|e| bad_arg("--thickness", e)))
        .transpose()?;
    Ok(crate::test_analysis::PumpingTestData {
        rate,
        wells,
        thickness,
    })
}

//! One command from its arguments to its outputs: read the model, build the findings once,
//! render every output from them. The binary writes the files, prints the text and exits with
//! the verdict's code; nothing here prints.

use crate::cli::Command;
use crate::findings::check::CheckFindings;
use crate::findings::commands::{
    by_day_verdict, programme_verdict, sweep_verdict, PumpingTestFindings,
};
use crate::findings::design::DesignFindings;
use crate::findings::verdict::Verdict;
use crate::input::error::InputError;
use crate::input::validate::file as model;
use crate::report;
use std::path::{Path, PathBuf};

/// Reports progress of long runs (the binary draws it on a terminal).
pub trait Progress: Sync {
    /// `total` steps are about to be done.
    fn start(&self, total: usize);
    /// One step done.
    fn tick(&self);
    /// All done.
    fn finish(&self);
}

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

/// Run `command`: parse the model, build the findings, render the outputs.
pub fn run(command: Command, progress: &dyn Progress) -> anyhow::Result<Outputs> {
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
            Ok(Outputs {
                out: None,
                files: Vec::new(),
                inputs: Vec::new(),
                text,
                messages: Vec::new(),
                verdict: Verdict::Met,
            })
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
            let found = if size_recharge {
                let (run, sizing) = crate::optimise::recharge::run_sized(&model, wells.as_deref())?;
                CheckFindings::build(run, Some(sizing))
            } else {
                CheckFindings::build(crate::check::run::run(&model, wells.as_deref())?, None)
            };
            let mut o = Outputs::written(
                out,
                report::check_files(&found)?,
                report::files::inputs_of(&model, wells.as_deref()),
            );
            o.text = report::check_text::to_text(&found, model.units);
            o.verdict = found.verdict;
            Ok(o)
        }
        Command::Design {
            file,
            out,
            rates,
            units,
            prices,
            by_day,
            verbose,
        } => {
            let mut model = model::load(&file)?;
            if let Some(day) = by_day {
                return by_day_outputs(&model, day, out);
            }
            model.units = units.map(Into::into).unwrap_or(model.units);
            let price_list = prices
                .as_deref()
                .map(crate::input::prices::read)
                .transpose()?;
            let design = crate::optimise::search::design(&model, rates.into())?;
            let found = DesignFindings::build(&model, design);
            let mut inputs = report::files::inputs_of(&model, None);
            inputs.extend(prices);
            let files = report::design_text::files(&model, &found, price_list.as_deref())?;
            let mut o = Outputs::written(out, files, inputs);
            if verbose {
                o.messages.push(crate::work_counts::summary());
            }
            o.text =
                report::design_text::to_text(&model, &found, model.units, price_list.as_deref());
            o.verdict = found.verdict;
            Ok(o)
        }
        Command::Sweep {
            file,
            from,
            to,
            step,
            out,
            units,
        } => {
            let model = model::load(&file)?;
            let units = units.map(Into::into).unwrap_or(model.units);
            let plan = crate::optimise::sweep::plan(&model, from, to, step)?;
            progress.start(plan.values.len());
            let sweep = crate::optimise::sweep::run(&model, &plan, &|| progress.tick())?;
            progress.finish();
            let files = vec![
                (
                    "sweep.csv".to_string(),
                    report::design_text::trials_csv(&sweep.trials, Some(&sweep.values))?,
                ),
                (
                    "sweep.svg".to_string(),
                    report::sweep_chart::render_in(&model.name, &sweep, units).into_bytes(),
                ),
            ];
            let mut o = Outputs::written(out, files, report::files::inputs_of(&model, None));
            o.text = report::design_text::sweep_text(&model, &sweep, units);
            o.verdict = sweep_verdict(&sweep);
            Ok(o)
        }
        Command::Programme { file, out, wells } => {
            let model = model::load(&file)?;
            let setup = crate::transient::programme::setup_from(&model, wells.as_deref())?;
            let answers = crate::transient::answers::answer(&model, &setup);
            let mut files = vec![(
                "programme.csv".to_string(),
                report::programme_text::to_csv(&model, &answers),
            )];
            files.extend(report::programme_charts::charts(&model, &answers));
            let positions: Vec<[f64; 2]> = setup.wells.iter().map(|w| w.position).collect();
            for m in &answers.maps {
                files.push((
                    crate::input::validate::programme::map_file_name(m.time),
                    report::programme_map::map_svg(&model, m, &positions).into_bytes(),
                ));
            }
            let inputs = report::files::inputs_of(&model, wells.as_deref());
            let mut o = Outputs::written(out, files, inputs);
            o.text = report::programme_text::to_text(&model, &answers);
            o.verdict = programme_verdict(&answers);
            Ok(o)
        }
        Command::PumpingTest {
            file,
            rate,
            distance,
            thickness,
            recovery_after,
            method,
            out,
        } => {
            let prefer = method
                .as_deref()
                .map(report::pumping_test_text::method_named)
                .transpose()
                .map_err(|e| bad_arg("--method", e))?;
            let data = pumping_test_data(&file, &rate, &distance, thickness.as_deref())?;
            let recovery = recovery_after
                .as_deref()
                .map(|t| {
                    crate::input::units::parse::<crate::input::units::TimeKind>(t)
                        .map_err(|e| bad_arg("--recovery-after", e))
                })
                .transpose()?;
            let found = PumpingTestFindings::build(data, recovery, prefer);
            let files = report::pumping_test_text::files(&found.data, found.best());
            let mut o = Outputs::written(out, files, Vec::new());
            o.text = report::pumping_test_text::to_text(&found.data, &found.fits, found.best());
            o.verdict = found.verdict;
            Ok(o)
        }
        Command::New { file } => {
            crate::input::starter::write_new(&file)?;
            Ok(Outputs {
                out: None,
                files: Vec::new(),
                inputs: Vec::new(),
                text: String::new(),
                messages: vec![format!(
                    "wrote {} — edit it, then run: drydig estimate {}",
                    file.display(),
                    file.display()
                )],
                verdict: Verdict::Met,
            })
        }
    }
}

/// `design --by-day`: the design for one day of the programme.
fn by_day_outputs(
    model: &crate::input::model::Model,
    day: f64,
    out: PathBuf,
) -> anyhow::Result<Outputs> {
    let d = crate::transient::by_date::design_by_day(model, day)?;
    let files = vec![("by_day.csv".to_string(), report::by_day_text::to_csv(&d))];
    let mut o = Outputs::written(out, files, report::files::inputs_of(model, None));
    o.text = report::by_day_text::to_text(model, &d);
    o.verdict = by_day_verdict(&d);
    Ok(o)
}

fn bad_arg(field: &str, message: String) -> anyhow::Error {
    InputError {
        file: PathBuf::new(),
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

//! The `drydig` binary: parses arguments, calls the library, prints, and sets the exit code.
//!
//! Exit codes: 0 done (targets met), 1 internal error, 2 bad input, 3 computed but a target or
//! limit is not met (outputs still written).

use clap::Parser;
use drydig::cli::{Cli, Command};
use drydig::estimate;
use drydig::input::error::InputError;
use drydig::input::starter;
use drydig::input::validate::file as model;
use drydig::report;
use std::io::Write;
use std::process::ExitCode;

fn main() -> ExitCode {
    let cli = Cli::parse();
    match run(cli) {
        Ok(code) => code,
        Err(e) => {
            if let Some(input) = e.downcast_ref::<InputError>() {
                eprintln!("error: {input}");
                ExitCode::from(2)
            } else {
                eprintln!("error: {e:#}");
                ExitCode::from(1)
            }
        }
    }
}

fn print(text: &str) -> anyhow::Result<()> {
    report::files::ensure_finite("the terminal text", text.as_bytes())?;
    let mut out = std::io::stdout().lock();
    match out.write_all(text.as_bytes()).and_then(|_| out.flush()) {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => Ok(other?),
    }
}

fn run(cli: Cli) -> anyhow::Result<ExitCode> {
    let chatter = cli.chatter();
    match cli.command {
        Command::Estimate { file, json, units } => {
            let model = model::load(&file)?;
            let units = units.map(Into::into).unwrap_or(model.units);
            let est = estimate::estimate(&model);
            if json {
                let v = report::estimate_text::to_json(&est, units);
                print(&format!("{}\n", serde_json::to_string_pretty(&v)?))?;
            } else {
                print(&report::estimate_text::to_text(&est, units))?;
            }
            Ok(ExitCode::SUCCESS)
        }
        Command::Check {
            file,
            out,
            wells,
            units,
            size_recharge,
        } => {
            let mut model = model::load(&file)?;
            let units = units.map(Into::into).unwrap_or(model.units);
            // The files (report, maps) follow `--units` too.
            model.units = units;
            let (run, recharge) = if size_recharge {
                let (run, sizing) =
                    drydig::optimise::recharge::run_sized(&model, wells.as_deref())?;
                (run, Some(sizing))
            } else {
                (drydig::check::run::run(&model, wells.as_deref())?, None)
            };
            let files = report::check_files(&run, recharge.as_ref())?;
            let inputs = report::files::inputs_of(&model, wells.as_deref());
            report::files::write_set(&out, &files, &inputs)?;
            print(&report::check_text::to_text(&run, recharge.as_ref(), units))?;
            print(&format!("outputs written to {}\n", out.display()))?;
            let e = &run.evaluation;
            let neighbours_ok = drydig::safety::neighbours::all_pass(&run);
            Ok(if e.targets_met && e.wells_ok && neighbours_ok {
                ExitCode::SUCCESS
            } else {
                ExitCode::from(3)
            })
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
            if let Some(day) = by_day {
                let units = units.map(Into::into).unwrap_or(model.units);
                let d = drydig::transient::by_date::design_by_day(&model, day)?;
                let csv = report::by_day_text::to_csv(&d, units);
                let files = vec![("by_day.csv".to_string(), csv)];
                let inputs = report::files::inputs_of(&model, None);
                report::files::write_set(&out, &files, &inputs)?;
                print(&report::by_day_text::to_text(&model, &d, units))?;
                print(&format!("outputs written to {}\n", out.display()))?;
                return Ok(if d.met {
                    ExitCode::SUCCESS
                } else {
                    ExitCode::from(3)
                });
            }
            let units = units.map(Into::into).unwrap_or(model.units);
            model.units = units;
            let prices_file = prices.clone();
            let prices = prices
                .as_deref()
                .map(drydig::input::prices::read)
                .transpose()?;
            let progress = drydig::cli::progress_layouts(chatter, model.units);
            let design = drydig::optimise::search::design(&model, rates.into())?;
            progress.finish();
            let run = drydig::optimise::outcome::final_run(&model, &design);
            if chatter == drydig::cli::Chatter::Verbose {
                eprintln!("{}", drydig::work_counts::summary());
            }
            let files =
                report::design_text::files(&model, &design, run.as_ref(), prices.as_deref())?;
            let mut inputs = report::files::inputs_of(&model, None);
            inputs.extend(prices_file.clone());
            report::files::write_set(&out, &files, &inputs)?;
            print(&report::design_text::to_text(
                &model,
                &design,
                run.as_ref(),
                units,
                prices.as_deref(),
            ))?;
            print(&format!("outputs written to {}\n", out.display()))?;
            let neighbours_ok = run
                .as_ref()
                .is_none_or(drydig::safety::neighbours::all_pass);
            Ok(
                if drydig::optimise::outcome::is_met(&design, run.as_ref()) && neighbours_ok {
                    ExitCode::SUCCESS
                } else {
                    ExitCode::from(3)
                },
            )
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
            let ring = model
                .layout
                .as_ref()
                .is_some_and(|l| matches!(l.kind, drydig::input::model::LayoutKind::Ring { .. }));
            let [from, to, step] = drydig::cli::sweep_bounds(
                ring,
                [("--from", Some(from)), ("--to", Some(to)), ("--step", step)],
            )
            .map_err(|(flag, e)| bad_arg(flag, e))?;
            let (from, to) = (from.unwrap_or(0.0), to.unwrap_or(0.0));
            let plan = drydig::optimise::sweep::plan(&model, from, to, step)?;
            let bar = drydig::cli::progress_counted(chatter, plan.values.len(), "layouts");
            let sweep = drydig::optimise::sweep::run(&model, &plan, &|| bar.inc(1))?;
            bar.finish_and_clear();
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
            let inputs = report::files::inputs_of(&model, None);
            report::files::write_set(&out, &files, &inputs)?;
            print(&report::design_text::sweep_text(&model, &sweep, units))?;
            print(&format!("outputs written to {}\n", out.display()))?;
            let any = sweep
                .trials
                .iter()
                .any(|t| t.uniform_met || t.individual_met);
            Ok(if any {
                ExitCode::SUCCESS
            } else {
                ExitCode::from(3)
            })
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
            let setup = drydig::transient::programme::setup_from(&model, wells.as_deref())?;
            let answers = drydig::transient::answers::answer(&model, &setup);
            let mut files = vec![(
                "programme.csv".to_string(),
                report::programme_text::to_csv(&model, &answers),
            )];
            files.extend(report::programme_charts::charts(&model, &answers));
            let positions: Vec<[f64; 2]> = setup.wells.iter().map(|w| w.position).collect();
            for m in &answers.maps {
                files.push((
                    drydig::input::validate::programme::map_file_name(m.time),
                    report::programme_map::map_svg(&model, m, &positions).into_bytes(),
                ));
            }
            let inputs = report::files::inputs_of(&model, wells.as_deref());
            report::files::write_set(&out, &files, &inputs)?;
            print(&report::programme_text::to_text(&model, &answers))?;
            print(&format!("outputs written to {}\n", out.display()))?;
            // A stage that waits for the water is information; one never reached is not met,
            // nor is a well scheduled to pump below its lowest allowed level.
            let reached = answers.stages.iter().all(|s| s.earliest.is_some())
                && answers.well_breaches.is_empty();
            Ok(if reached {
                ExitCode::SUCCESS
            } else {
                ExitCode::from(3)
            })
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
            let units = units.map_or(drydig::input::units::UnitSystem::Si, Into::into);
            let data = pumping_test_data(&file, &rate, &distance, thickness.as_deref())?;
            let recovery = recovery_after
                .as_deref()
                .map(|t| {
                    drydig::input::units::parse::<drydig::input::units::TimeKind>(t)
                        .map_err(|e| bad_arg("--recovery-after", e))
                })
                .transpose()?;
            let fits = report::pumping_test_text::fits(&data, recovery);
            report::files::write_all(
                &out,
                &report::pumping_test_text::files(&data, &fits, prefer, units),
            )?;
            print(&report::pumping_test_text::to_text(
                &data, &fits, prefer, units,
            ))?;
            print(&format!("outputs written to {}\n", out.display()))?;
            Ok(if fits.iter().any(|(_, f)| f.is_ok()) {
                ExitCode::SUCCESS
            } else {
                ExitCode::from(3)
            })
        }
        Command::New { file } => {
            starter::write_new(&file)?;
            eprintln!(
                "wrote {} — edit it, then run: drydig estimate {}",
                file.display(),
                file.display()
            );
            Ok(ExitCode::SUCCESS)
        }
    }
}

fn bad_arg(field: &str, message: String) -> anyhow::Error {
    InputError {
        file: std::path::PathBuf::from("command line"),
        field: field.into(),
        line: None,
        message,
    }
    .into()
}

/// The pumping-test data from the CSV and the command-line values (rate, distances, thickness).
fn pumping_test_data(
    file: &std::path::Path,
    rate: &str,
    distance: &[String],
    thickness: Option<&str>,
) -> anyhow::Result<drydig::test_analysis::PumpingTestData> {
    use drydig::input::units::{parse, FlowKind, LengthKind};
    let text = drydig::input::read::read_text_capped(
        file,
        drydig::input::read::MAX_PUMPING_TEST_BYTES,
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
    let series = drydig::test_analysis::csv_input::read_observations(&text, &name).map_err(err)?;
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
    Ok(drydig::test_analysis::PumpingTestData {
        rate,
        wells,
        thickness,
    })
}

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
    let mut out = std::io::stdout().lock();
    match out.write_all(text.as_bytes()).and_then(|_| out.flush()) {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => Ok(other?),
    }
}

fn run(cli: Cli) -> anyhow::Result<ExitCode> {
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
            report::files::write_all(&out, &files)?;
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
        } => {
            let mut model = model::load(&file)?;
            let units = units.map(Into::into).unwrap_or(model.units);
            model.units = units;
            let design = drydig::optimise::search::design(&model, rates.into())?;
            let run = drydig::optimise::outcome::final_run(&model, &design);
            let files = report::design_text::files(&model, &design, run.as_ref())?;
            report::files::write_all(&out, &files)?;
            print(&report::design_text::to_text(
                &model,
                &design,
                run.as_ref(),
                units,
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
            let plan = drydig::optimise::sweep::plan(&model, from, to, step)?;
            let bar = indicatif::ProgressBar::new(plan.values.len() as u64);
            if !std::io::IsTerminal::is_terminal(&std::io::stderr()) || plan.values.len() < 4 {
                bar.set_draw_target(indicatif::ProgressDrawTarget::hidden());
            }
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
            report::files::write_all(&out, &files)?;
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

//! The `drydig` binary: parses arguments, calls the library, prints, and sets the exit code.
//!
//! Exit codes: 0 done (targets met), 1 internal error, 2 bad input, 3 computed but a target or
//! limit is not met (outputs still written).

use clap::Parser;
use drydig::cli::{Cli, Command};
use drydig::error::InputError;
use drydig::{estimate, model, report, starter};
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
        } => {
            let model = model::load(&file)?;
            let units = units.map(Into::into).unwrap_or(model.units);
            let run = drydig::check::run(&model, wells.as_deref())?;
            let files = report::check_files(&run)?;
            report::files::write_all(&out, &files)?;
            print(&report::check_text::to_text(&run, units))?;
            print(&format!("outputs written to {}\n", out.display()))?;
            let e = &run.evaluation;
            Ok(if e.targets_met && e.wells_ok {
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

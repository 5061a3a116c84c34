//! The `drydig` binary: parse → model → findings → render ([`drydig::app::run`]) → write →
//! print → exit.
//!
//! Exit codes: 0 done (targets met), 1 internal error, 2 bad input, 3 computed but a target or
//! limit is not met (outputs still written).

use clap::Parser;
use drydig::app::{Outputs, Progress};
use drydig::cli::Cli;
use drydig::input::error::InputError;
use drydig::report;
use indicatif::{ProgressBar, ProgressDrawTarget};
use std::io::{IsTerminal, Write};
use std::process::ExitCode;

fn main() -> ExitCode {
    let cli = Cli::parse();
    let bar = Bar(ProgressBar::hidden());
    match drydig::app::run(cli.command, &bar).and_then(finish) {
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

/// Write the files, print the text, and exit with the verdict's code.
fn finish(o: Outputs) -> anyhow::Result<ExitCode> {
    for m in &o.messages {
        eprintln!("{m}");
    }
    if let Some(out) = &o.out {
        report::files::write_set(out, &o.files, &o.inputs)?;
    }
    print(&o.text)?;
    if let Some(out) = &o.out {
        print(&format!("outputs written to {}\n", out.display()))?;
    }
    Ok(ExitCode::from(o.verdict.exit_code()))
}

fn print(text: &str) -> anyhow::Result<()> {
    report::files::ensure_finite("the terminal text", text.as_bytes())?;
    let mut out = std::io::stdout().lock();
    match out.write_all(text.as_bytes()).and_then(|_| out.flush()) {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => Ok(other?),
    }
}

/// A progress bar on stderr, drawn only on a terminal and for four steps or more.
struct Bar(ProgressBar);

impl Progress for Bar {
    fn start(&self, total: usize) {
        self.0.set_length(total as u64);
        if std::io::stderr().is_terminal() && total >= 4 {
            self.0.set_draw_target(ProgressDrawTarget::stderr());
        }
    }
    fn tick(&self) {
        self.0.inc(1);
    }
    fn finish(&self) {
        self.0.finish_and_clear();
    }
}

//! The `drydig` binary: parse → model → findings → render ([`drydig::app::run`]) → write →
//! print → exit.
//!
//! Exit codes: 0 done (targets met), 1 internal error, 2 bad input, 3 computed but a target or
//! limit is not met (outputs still written).

use clap::Parser;
use drydig::app::Outputs;
use drydig::cli::Cli;
use drydig::input::error::InputError;
use drydig::report;
use std::io::Write;
use std::process::ExitCode;

fn main() -> ExitCode {
    let cli = Cli::parse();
    let chatter = cli.chatter();
    match drydig::app::run(cli.command, chatter).and_then(finish) {
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

//! Command-line arguments (clap). The binary turns these into calls on the library.

use crate::input::units::UnitSystem;
use clap::{Parser, Subcommand, ValueEnum};
use std::path::PathBuf;

/// drydig — construction dewatering well-field design by superposition.
#[derive(Debug, Parser)]
#[command(name = "drydig", version, about, long_about = None)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
    /// Print only the result lines and errors: no progress, no notes on stderr.
    #[arg(short = 'q', long, global = true, conflicts_with = "verbose")]
    pub quiet: bool,
    /// Also print, on stderr, the work done (for `design`: linear programmes solved, layouts
    /// tried, full evaluations, kernel sums, unit matrices built and reused).
    #[arg(short = 'v', long, global = true)]
    pub verbose: bool,
}

/// How much the terminal is told besides the results.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Chatter {
    /// `-q`: results and errors only.
    Quiet,
    /// Progress on a terminal's stderr.
    Normal,
    /// `-v`: progress and the work counts.
    Verbose,
}

impl Cli {
    /// The chatter level from `-q` / `-v`.
    pub fn chatter(&self) -> Chatter {
        if self.quiet {
            Chatter::Quiet
        } else if self.verbose {
            Chatter::Verbose
        } else {
            Chatter::Normal
        }
    }
}

/// The pumping-test fit whose aquifer lines are printed and drawn.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum MethodArg {
    /// Theis type curve (the default).
    Theis,
    /// Cooper–Jacob straight line on late data.
    CooperJacob,
    /// Hantush–Jacob leaky type curves.
    #[value(alias = "leaky")]
    Hantush,
    /// Theis on Jacob-corrected drawdowns (needs --thickness).
    Unconfined,
    /// Theis recovery straight line (needs --recovery-after).
    Recovery,
    /// Distance–drawdown straight line (two or more observation wells).
    #[value(alias = "distance-drawdown")]
    Distance,
}

impl From<MethodArg> for crate::test_analysis::Method {
    fn from(m: MethodArg) -> Self {
        use crate::test_analysis::Method;
        match m {
            MethodArg::Theis => Method::Theis,
            MethodArg::CooperJacob => Method::CooperJacob,
            MethodArg::Hantush => Method::Hantush,
            MethodArg::Unconfined => Method::TheisUnconfined,
            MethodArg::Recovery => Method::TheisRecovery,
            MethodArg::Distance => Method::DistanceDrawdown,
        }
    }
}

/// A sweep bound: a well count (bare number) or a spacing, with its unit as in the design file
/// ("5 m", "16 ft"); a bare number for a spacing is taken in metres.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SweepValue {
    /// The count, or the spacing in m.
    pub value: f64,
    /// Whether the text carried a length unit.
    pub with_unit: bool,
}

/// Parses a sweep bound for clap: a plain number, or a length through `input::units`.
pub fn parse_sweep_value(text: &str) -> Result<SweepValue, String> {
    if let Ok(v) = text.trim().parse::<f64>() {
        return Ok(SweepValue {
            value: v,
            with_unit: false,
        });
    }
    crate::input::units::parse::<crate::input::units::LengthKind>(text)
        .map(|value| SweepValue {
            value,
            with_unit: true,
        })
        .map_err(|e| {
            format!("give a well count (\"12\") or a spacing with its unit (\"5 m\"): {e}")
        })
}

/// The sweep bounds as numbers for `optimise::sweep::plan`: a ring is swept by count, so a
/// length unit on its bounds is refused: `Err` names the flag and why.
pub fn sweep_bounds(
    ring: bool,
    bounds: [(&str, Option<SweepValue>); 3],
) -> Result<[Option<f64>; 3], (&str, String)> {
    let mut out = [None; 3];
    for (slot, (flag, v)) in out.iter_mut().zip(bounds) {
        if let Some(v) = v {
            if ring && v.with_unit {
                return Err((
                    flag,
                    "a ring is swept by well count: give a whole number without a unit".into(),
                ));
            }
            *slot = Some(v.value);
        }
    }
    Ok(out)
}

/// Unit system for what people read.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum UnitsArg {
    /// Metres, m³/day, L/s.
    Si,
    /// Feet, US gallons per minute.
    Us,
}

impl From<UnitsArg> for UnitSystem {
    fn from(u: UnitsArg) -> Self {
        match u {
            UnitsArg::Si => UnitSystem::Si,
            UnitsArg::Us => UnitSystem::Us,
        }
    }
}

/// What each sample of `uncertainty` answers.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum UncertaintyOf {
    /// The file's layout at its rates, as `check` evaluates it.
    Check,
    /// The fewest wells and their rates, as `design` finds them.
    Design,
}

impl From<UncertaintyOf> for crate::uncertainty::run::Mode {
    fn from(u: UncertaintyOf) -> Self {
        match u {
            UncertaintyOf::Check => crate::uncertainty::run::Mode::Check,
            UncertaintyOf::Design => crate::uncertainty::run::Mode::Design,
        }
    }
}

/// Rate option for `design`.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum RatesArg {
    /// A rate per well, least total flow (linear programme).
    Individual,
    /// The same rate in every well (one pump size on site).
    Uniform,
}

impl From<RatesArg> for crate::optimise::rates::RateOption {
    fn from(r: RatesArg) -> Self {
        match r {
            RatesArg::Individual => crate::optimise::rates::RateOption::Individual,
            RatesArg::Uniform => crate::optimise::rates::RateOption::Uniform,
        }
    }
}

/// The subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Quick flow estimate for each excavation (equivalent well or line slot).
    Estimate {
        /// Design file (TOML).
        file: PathBuf,
        /// Print one JSON object instead of the table.
        #[arg(long)]
        json: bool,
        /// Units for the output (default: the design file's).
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
    },
    /// Evaluate the design file's layout: levels at every check point and well, maps and tables.
    Check {
        /// Design file (TOML).
        file: PathBuf,
        /// Output folder for summary.json, wells.csv, checkpoints.csv, map.svg, GeoJSON.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
        /// Take the wells from this CSV (columns name, x, y, rate_l_per_s and optionally radius_m) instead of the layout.
        #[arg(long)]
        wells: Option<PathBuf>,
        /// Units for the terminal text and the files people read (default: the design file's).
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
        /// Size the recharge wells (listed wells with a negative rate, the rate being each one's
        /// largest injection) so every neighbour keeps within its limit while the excavation still
        /// meets its target; reports the net flow.
        #[arg(long)]
        size_recharge: bool,
    },
    /// Find the fewest wells and their rates that meet every target within the well limits;
    /// writes what `check` writes for the chosen layout, plus design.json, design.csv, bid.csv.
    Design {
        /// Design file (TOML).
        file: PathBuf,
        /// Output folder.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
        /// Rates for the chosen layout: individual (least total flow) or uniform (one pump size).
        #[arg(long, value_enum, default_value = "individual")]
        rates: RatesArg,
        /// Units for the terminal text and the files people read (default: the design file's).
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
        /// Your own unit prices (CSV with columns item,price,unit; items named as in bid.csv,
        /// the unit each price is per, e.g. ft or m): adds the cost lines to the bid sheet. No
        /// prices are built in.
        #[arg(long)]
        prices: Option<PathBuf>,
        /// Size for levels reached by this day of pumping (Theis/Hantush in time) instead of
        /// the steady state: the fewest wells and least total flow meeting every target then.
        #[arg(long = "by-day")]
        by_day: Option<f64>,
    },
    /// Try a range of well counts (ring) or spacings (trench line): table, sweep.csv and
    /// sweep.svg.
    Sweep {
        /// Design file (TOML).
        file: PathBuf,
        /// First count (ring, "12") or spacing (line, with its unit: "5 m", "16 ft"; a bare
        /// number is metres).
        #[arg(long, value_parser = parse_sweep_value)]
        from: SweepValue,
        /// Last count or spacing (inclusive).
        #[arg(long, value_parser = parse_sweep_value)]
        to: SweepValue,
        /// Step (default 1 well, or a tenth of the spacing range).
        #[arg(long, value_parser = parse_sweep_value)]
        step: Option<SweepValue>,
        /// Output folder for sweep.csv and sweep.svg.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
        /// Units for the terminal text and the files people read (default: the design file's).
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
    },
    /// Run the design file's programme section in time: days to dig each stage, hydrographs, flow and
    /// volume, maps at chosen times, recovery and time to flood; writes programme.csv and SVGs.
    Programme {
        /// Design file (TOML) with a programme section.
        file: PathBuf,
        /// Output folder.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
        /// Take the wells from this CSV (as `check --wells`: columns name, x, y, rate_l_per_s and
        /// optionally radius_m; a design's wells.csv) instead of the layout.
        #[arg(long)]
        wells: Option<PathBuf>,
        /// Units for the terminal text, programme.csv's added columns, charts and maps
        /// (default: the design file's).
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
    },
    /// Fit a constant-rate pumping test (CSV of time and drawdown, units in the header): Theis,
    /// Cooper–Jacob, Hantush, unconfined Theis, recovery, distance–drawdown; prints the aquifer
    /// lines to paste into a design file and writes pumping_test.svg.
    PumpingTest {
        /// CSV with columns time_UNIT, drawdown_UNIT, optionally well and distance_UNIT (e.g. time_min, drawdown_m).
        file: PathBuf,
        /// Constant pumping rate, with its unit ("8 L/s").
        #[arg(long)]
        rate: String,
        /// Distance of the observation well from the pumped well ("30 m"), or NAME=DISTANCE for
        /// each well of a file with a well column; not needed when the file has a distance column.
        #[arg(long)]
        distance: Vec<String>,
        /// Aquifer (saturated) thickness ("12 m"): for the unconfined fit and K = T / thickness.
        #[arg(long)]
        thickness: Option<String>,
        /// The data are recovery after this much pumping ("2 days"): Theis recovery only.
        #[arg(long = "recovery-after")]
        recovery_after: Option<String>,
        /// The fit whose aquifer lines are printed and drawn (default: theis, or the first
        /// that could be made).
        #[arg(long, value_enum)]
        method: Option<MethodArg>,
        /// Units for the terminal text and the chart (default: SI; the aquifer lines keep
        /// their units written out either way).
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
        /// Output folder for pumping_test.svg.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
    },
    /// Sample the inputs of the design file's uncertainty table (Latin hypercube) and give P10/P50/P90 of
    /// the answers: for the file's layout (flow it needs, lowest margin, share of samples meeting
    /// every target, neighbours' drawdown and settlement) or for the design (fewest wells, flow,
    /// a robust design); writes uncertainty.csv, uncertainty.json, SVG charts, report.html.
    Uncertainty {
        /// Design file (TOML) with an uncertainty table.
        file: PathBuf,
        /// Output folder.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
        /// What each sample answers: check (the file's layout at its rates) or design (the
        /// fewest wells).
        #[arg(long, value_enum, default_value = "check")]
        of: UncertaintyOf,
        /// Number of samples (default: the file's, else 1 000).
        #[arg(long)]
        samples: Option<usize>,
        /// Seed of the sampling (default: the file's, else 1).
        #[arg(long)]
        seed: Option<u64>,
        /// Share of samples, in per cent, in which every target must be met (the robust
        /// design is sized for it; a check passes at it).
        #[arg(long, default_value_t = 90.0)]
        reliability: f64,
        /// Rates of each sample's design: individual (least total flow) or uniform.
        #[arg(long, value_enum, default_value = "individual")]
        rates: RatesArg,
        /// Units for the terminal text and the files people read (default: the design file's).
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
    },
    /// Write a commented starter design file (never overwrites).
    New {
        /// Where to write it.
        file: PathBuf,
    },
}

/// A progress display on stderr: drawn only when stderr is a terminal and not `-q`.
fn progress_target(chatter: Chatter) -> indicatif::ProgressDrawTarget {
    if chatter == Chatter::Quiet || !std::io::IsTerminal::is_terminal(&std::io::stderr()) {
        indicatif::ProgressDrawTarget::hidden()
    } else {
        indicatif::ProgressDrawTarget::stderr()
    }
}

/// A bar over `total` known steps (a sweep's layouts) with its ETA; hidden for fewer than 4.
pub fn progress_counted(chatter: Chatter, total: usize, what: &str) -> indicatif::ProgressBar {
    let bar =
        indicatif::ProgressBar::with_draw_target(Some(total as u64), progress_target(chatter));
    if total < 4 {
        bar.set_draw_target(indicatif::ProgressDrawTarget::hidden());
    }
    if let Ok(style) = indicatif::ProgressStyle::with_template(&format!(
        "{{bar:30}} {{pos}}/{{len}} {what}, {{elapsed}} so far, about {{eta}} left"
    )) {
        bar.set_style(style);
    }
    bar
}

/// The progress of a design's count search, told by `work_counts::trying` as each layout is
/// tried: its well count and spacing, how many were tried and the time each takes. The search
/// bisects, so its length is not known beforehand: the display gives the time per layout until
/// the count is bracketed, then an ETA from the bisection steps left
/// ([`crate::work_counts::BISECTION_LEFT`]).
pub struct LayoutProgress {
    bar: indicatif::ProgressBar,
}

/// Starts the display of a design's layouts (hidden when piped or `-q`).
pub fn progress_layouts(chatter: Chatter, units: UnitSystem) -> LayoutProgress {
    let bar = indicatif::ProgressBar::with_draw_target(None, progress_target(chatter));
    if let Ok(style) =
        indicatif::ProgressStyle::with_template("{spinner} layout {pos}: {msg}  ({elapsed} so far)")
    {
        bar.set_style(style);
    }
    bar.enable_steady_tick(std::time::Duration::from_millis(200));
    let shown = bar.clone();
    let f = crate::report::format::Fmt::new(units, 0.0);
    let start = std::time::Instant::now();
    crate::work_counts::set_progress(Some(Box::new(move |count, spacing| {
        // Once the count is bracketed the bisection's steps left are known: ETA = steps ×
        // the mean time of the layouts tried so far.
        let left = crate::work_counts::BISECTION_LEFT.load(std::sync::atomic::Ordering::Relaxed);
        let each = match shown.position() {
            0 => String::new(),
            done => {
                let per = start.elapsed().as_secs_f64() / done as f64;
                if left > 0 {
                    let eta = per * left as f64;
                    if eta < 1.0 {
                        format!(", under 1 s left ({left} more)")
                    } else {
                        format!(", about {eta:.0} s left ({left} more)")
                    }
                } else {
                    format!(", about {per:.1} s a layout")
                }
            }
        };
        shown.inc(1);
        shown.set_message(if spacing > 0.0 {
            format!("trying {count} wells, {} apart{each}", f.length(spacing))
        } else {
            format!("trying {count} wells{each}")
        });
    })));
    LayoutProgress { bar }
}

impl LayoutProgress {
    /// Clears the display and stops listening.
    pub fn finish(self) {
        crate::work_counts::set_progress(None);
        self.bar.finish_and_clear();
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use clap::CommandFactory;

    #[test]
    fn sweep_bounds_take_units_as_the_design_file_does() {
        // 1 ft = 0.3048 m (NIST SP 811 (2008) App. B).
        let v = parse_sweep_value("16 ft").unwrap();
        assert!((v.value - 4.8768).abs() < 1e-12 && v.with_unit);
        assert_eq!(
            parse_sweep_value("12").unwrap(),
            SweepValue {
                value: 12.0,
                with_unit: false
            }
        );
        assert!((parse_sweep_value("5 m").unwrap().value - 5.0).abs() < 1e-12);
        let e = parse_sweep_value("5 furlongs").unwrap_err();
        assert!(e.contains("ft") && e.contains("well count"), "{e}");
        // a ring is swept by count: a unit is refused, naming the flag
        let to = parse_sweep_value("8 m").unwrap();
        let (flag, why) = sweep_bounds(
            true,
            [
                ("--from", Some(parse_sweep_value("4").unwrap())),
                ("--to", Some(to)),
                ("--step", None),
            ],
        )
        .unwrap_err();
        assert_eq!(flag, "--to");
        assert!(why.contains("whole number"), "{why}");
        let ok = sweep_bounds(
            false,
            [("--from", Some(to)), ("--to", Some(to)), ("--step", None)],
        );
        assert_eq!(ok.unwrap(), [Some(8.0), Some(8.0), None]);
    }

    #[test]
    fn help_lists_the_choices() {
        let mut cmd = Cli::command();
        cmd.build();
        let help = cmd
            .find_subcommand_mut("pumping-test")
            .unwrap()
            .render_long_help()
            .to_string();
        for choice in [
            "theis",
            "cooper-jacob",
            "hantush",
            "unconfined",
            "recovery",
            "distance",
            "si",
            "us",
        ] {
            assert!(help.contains(choice), "{choice} missing from:\n{help}");
        }
        let help = cmd
            .find_subcommand_mut("design")
            .unwrap()
            .render_long_help()
            .to_string();
        assert!(
            help.contains("individual") && help.contains("uniform") && help.contains("--quiet")
        );
        // -q and -v exclude each other
        assert!(Cli::try_parse_from(["drydig", "-q", "-v", "new", "x.toml"]).is_err());
        let cli = Cli::try_parse_from(["drydig", "estimate", "f.toml", "-q"]).unwrap();
        assert_eq!(cli.chatter(), Chatter::Quiet);
    }
}

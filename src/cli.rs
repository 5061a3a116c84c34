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
}

/// Unit system for terminal output.
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
        /// Units for the output (default: the design file's, else SI).
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
        /// Units for the terminal output.
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
        /// Units for the terminal output.
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
        /// Also print, on stderr, the work the design did: linear programmes solved, layouts
        /// tried, full evaluations, kernel sums, unit matrices built and reused.
        #[arg(short = 'v', long)]
        verbose: bool,
    },
    /// Try a range of well counts (ring) or spacings in m (trench line): table, sweep.csv and
    /// sweep.svg.
    Sweep {
        /// Design file (TOML).
        file: PathBuf,
        /// First count (ring) or spacing in m (line).
        #[arg(long)]
        from: f64,
        /// Last count or spacing (inclusive).
        #[arg(long)]
        to: f64,
        /// Step (default 1 well, or a tenth of the spacing range).
        #[arg(long)]
        step: Option<f64>,
        /// Output folder for sweep.csv and sweep.svg.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
        /// Units for the terminal output.
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
        /// The fit whose aquifer lines are printed and drawn: theis (default), cooper-jacob,
        /// hantush, unconfined, distance.
        #[arg(long)]
        method: Option<String>,
        /// Output folder for pumping_test.svg.
        #[arg(short = 'o', long = "out", default_value = "drydig-out")]
        out: PathBuf,
    },
    /// Write a commented starter design file (never overwrites).
    New {
        /// Where to write it.
        file: PathBuf,
    },
}

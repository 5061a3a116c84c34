//! Command-line arguments (clap). The binary turns these into calls on the library.

use crate::units::UnitSystem;
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
        /// Take the wells from this CSV (name,x,y,rate_l_per_s[,radius_m]) instead of the layout.
        #[arg(long)]
        wells: Option<PathBuf>,
        /// Units for the terminal output.
        #[arg(long, value_enum)]
        units: Option<UnitsArg>,
    },
    /// Write a commented starter design file (never overwrites).
    New {
        /// Where to write it.
        file: PathBuf,
    },
}

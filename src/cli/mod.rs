//! The command line: clap definitions and the glue from arguments to the library.
//! The library never depends on this module.

use std::io::{self, Write};
use std::path::{Path, PathBuf};

use clap::{Parser, Subcommand};

pub mod output;
pub mod outputs;
pub mod studies;

use crate::checks;
use crate::model::Rig;
use crate::report::{text, Report};
use crate::rig;
use crate::solve::{self, SolveOptions};

/// Exit code: the rig moves and every check passes.
pub const EXIT_OK: i32 = 0;
/// Exit code: a check fails (cannot move, safety factor, drum slip, ...).
pub const EXIT_CHECK_FAILED: i32 = 1;
/// Exit code: bad input or an unsolvable rig.
pub const EXIT_BAD_INPUT: i32 = 2;

/// Rope-and-pulley friction analysis: efforts, tensions, pin loads and checks.
#[derive(Debug, Parser)]
#[command(name = "reeve", version, about, long_about = None)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// Options shared by every command that reads a rig.
#[derive(Debug, clap::Args)]
pub struct RigArgs {
    /// The rig file (YAML, format 1).
    pub rig: PathBuf,
    /// Change one value of the rig before solving, by the file's own keys
    /// (e.g. `parts.head.bearing.mu=0.08`); may be repeated.
    #[arg(long = "set", value_name = "KEY=VALUE")]
    pub set: Vec<String>,
}

/// The commands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Solve a rig and print the summary, warnings and checks.
    Check {
        /// The rig.
        #[command(flatten)]
        rig: RigArgs,
        /// Print the whole result as one JSON document (SI units) instead.
        #[arg(long)]
        json: bool,
    },
    /// Print the drawing-set tables: tension in every span; wrap, fleet, D/d, ratio,
    /// pin load and loss share at every part.
    Table(outputs::TableArgs),
    /// Draw the rig to scale as an SVG, spans coloured by tension.
    Draw(outputs::DrawArgs),
    /// Write a self-contained HTML report: summary, drawing, tables, losses, notes.
    Report(outputs::ReportArgs),
    /// Compare rigs, or one rig's named variants, side by side.
    Compare(studies::CompareArgs),
    /// Sweep one value over a range, or move the drive through its stroke.
    Sweep(studies::SweepArgs),
    /// Rank parts by the effort their friction costs, and friction sensitivities.
    Rank(studies::RankArgs),
    /// Monte Carlo spread over the values the rig gives as ranges.
    Spread(studies::SpreadArgs),
}

/// What went wrong, already worded for the user.
#[derive(Debug)]
pub struct Failure {
    /// The message (may span lines).
    pub message: String,
    /// Exit code.
    pub code: i32,
}

impl Failure {
    pub(crate) fn input(message: impl Into<String>) -> Failure {
        Failure {
            message: message.into(),
            code: EXIT_BAD_INPUT,
        }
    }
}

pub(crate) fn parse_sets(sets: &[String]) -> Result<Vec<(String, String)>, Failure> {
    sets.iter()
        .map(|s| {
            s.split_once('=')
                .map(|(k, v)| (k.trim().to_string(), v.trim().to_string()))
                .ok_or_else(|| {
                    Failure::input(format!(
                        "--set `{s}`: expected KEY=VALUE, e.g. parts.head.bearing.mu=0.08"
                    ))
                })
        })
        .collect()
}

/// Loads a rig with its overrides; errors come back worded with file and line.
pub fn load(args: &RigArgs) -> Result<Rig, Failure> {
    let overrides = parse_sets(&args.set)?;
    let result = if overrides.is_empty() {
        rig::load_file(&args.rig)
    } else {
        rig::load::load_file_with(&args.rig, &overrides)
    };
    result.map_err(|e| Failure::input(e.to_string()))
}

/// Loads and solves.
pub fn load_and_solve(args: &RigArgs) -> Result<(Rig, solve::Solution), Failure> {
    let rig = load(args)?;
    let solution = solve::solve(&rig, &SolveOptions::default())
        .map_err(|e| Failure::input(locate(&args.rig, &rig, &e)))?;
    Ok((rig, solution))
}

/// `file:line:column: key: message` for a solve error, as far as it can be located.
pub fn locate(path: &Path, rig: &Rig, error: &solve::SolveError) -> String {
    match error.location(rig) {
        Some((l, subject)) if l.line > 0 => {
            format!(
                "{}:{}:{}: {subject}: {error}",
                path.display(),
                l.line,
                l.column
            )
        }
        _ => format!("{}: {error}", path.display()),
    }
}

pub(crate) fn write_out(f: impl FnOnce(&mut dyn Write) -> io::Result<()>) -> Result<(), Failure> {
    let stdout = io::stdout();
    let mut lock = stdout.lock();
    match f(&mut lock).and_then(|_| lock.flush()) {
        Ok(()) => Ok(()),
        // A closed pipe (`reeve check x | head`) is not an error.
        Err(e) if e.kind() == io::ErrorKind::BrokenPipe => Ok(()),
        Err(e) => Err(Failure {
            message: format!("cannot write output: {e}"),
            code: EXIT_BAD_INPUT,
        }),
    }
}

fn display(path: &Path) -> String {
    path.display().to_string()
}

/// Runs a parsed command line; returns the exit code.
pub fn run(cli: Cli) -> Result<i32, Failure> {
    match cli.command {
        Command::Check { rig: args, json } => {
            let (rig, solution) = load_and_solve(&args)?;
            let warnings = checks::run(&rig, &solution);
            let report = Report::build(&rig, &solution, warnings);
            if json {
                let json = serde_json::to_string_pretty(&report)
                    .map_err(|e| Failure::input(format!("cannot encode the report: {e}")))?;
                write_out(|w| writeln!(w, "{json}"))?;
            } else {
                write_out(|w| text::write_check(w, &rig, &report, &display(&args.rig)))?;
            }
            Ok(if report.fails() {
                EXIT_CHECK_FAILED
            } else {
                EXIT_OK
            })
        }
        Command::Table(args) => outputs::run_table(args),
        Command::Draw(args) => outputs::run_draw(args),
        Command::Report(args) => outputs::run_report(args),
        Command::Compare(args) => studies::run_compare(args),
        Command::Sweep(args) => studies::run_sweep(args),
        Command::Rank(args) => studies::run_rank(args),
        Command::Spread(args) => studies::run_spread(args),
    }
}

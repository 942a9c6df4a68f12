//! The command line: clap definitions and the glue from arguments to the library. These
//! modules belong to the binary (`src/main.rs` declares them); the library knows no clap.
//! Every failure is a [`Failure`] that keeps the library's error as its `source()`, so
//! the binary prints the whole chain once.

use std::io::{self, Write};
use std::path::{Path, PathBuf};

use clap::{Parser, Subcommand};

pub mod args;
pub mod destination;
pub mod motion;
pub mod outputs;
pub mod snippet;
pub mod studies;
pub mod tools;

// The designer's tools of issue 13: schema, starter rigs, live re-solve, progress.
pub mod progress;
pub mod schema;
pub mod starter;
pub mod watch;

use reeve::checks;
use reeve::model::Rig;
use reeve::report::{text, Report};
use reeve::rig::{self, LoadError};
use reeve::solve::{self, SolveError, SolveOptions};
use reeve::study::StudyError;

use args::{JsonArg, RigArgs, UnitsArg};

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

/// The commands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Solve a rig and print the summary, warnings and checks.
    Check {
        /// The rig.
        #[command(flatten)]
        rig: RigArgs,
        /// JSON instead of text.
        #[command(flatten)]
        json: JsonArg,
        /// Units of the text.
        #[command(flatten)]
        units: UnitsArg,
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
    /// Run the rig in time from rest: events, strokes, time series.
    Motion(motion::MotionArgs),
    /// Print a shell completion script (bash, zsh, fish, powershell).
    Completions(tools::CompletionsArgs),
    /// Print the manual page (roff), or write it with -o.
    Manual(tools::ManualArgs),

    // The designer's tools of issue 13.
    /// Print the JSON Schema of the rig format (for editors), or write it with -o.
    Schema(schema::SchemaArgs),
    /// Write a starter rig for a common job; without KIND, list the kinds.
    New(starter::NewArgs),
    /// Re-solve a rig on every save: print the summary or the first error, rewrite -o.
    Watch(watch::WatchArgs),
}

/// Why a command could not do its work (exit 2). The library's error stays the
/// `source()`; the message of each variant is only the context the command line adds.
#[derive(Debug, thiserror::Error)]
pub enum Failure {
    /// A flag's value is wrong (the message says what was expected).
    #[error("{0}")]
    Input(String),
    /// The rig file, with its overrides, does not load.
    #[error(transparent)]
    Load(Box<LoadError>),
    /// The rig loads but cannot be solved; the context is the file, line, column and
    /// part where the error can be located.
    #[error("{location}")]
    Solve {
        /// `rig.yaml:6:3: parts.h`, or the file alone.
        location: String,
        /// Why.
        #[source]
        source: Box<SolveError>,
    },
    /// A study cannot run.
    #[error(transparent)]
    Study(Box<StudyError>),
    /// A flag's value is refused by the library (`--to BEARING` that does not load).
    #[error("{flag}")]
    Flag {
        /// The flag and its value as typed (`--to `x``).
        flag: String,
        /// Why.
        #[source]
        source: Box<StudyError>,
    },
    /// A result could not be encoded as JSON.
    #[error("cannot encode the {what}")]
    Encode {
        /// What (`report`, `tables`).
        what: &'static str,
        /// Why.
        #[source]
        source: serde_json::Error,
    },
    /// Writing to stdout failed (other than a closed pipe).
    #[error("cannot write output")]
    Stdout(#[source] io::Error),
    /// Writing a file failed.
    #[error("cannot write `{}`", path.display())]
    File {
        /// The file.
        path: PathBuf,
        /// Why.
        #[source]
        source: io::Error,
    },
}

// The library's errors are boxed: they are large, and a failure is the rare path.
impl From<LoadError> for Failure {
    fn from(e: LoadError) -> Failure {
        Failure::Load(Box::new(e))
    }
}

impl From<StudyError> for Failure {
    fn from(e: StudyError) -> Failure {
        Failure::Study(Box::new(e))
    }
}

impl Failure {
    /// The exit code: every failure is bad input or an unsolvable rig.
    pub fn code(&self) -> i32 {
        EXIT_BAD_INPUT
    }

    /// The message with its causes, `context: cause: cause`, as the binary prints it.
    pub fn chain(&self) -> String {
        reeve::text::error_chain(self)
    }
}

/// `KEY=VALUE` pairs of `--set`.
///
/// A value that is the user's home folder (or a path in it) is refused: no rig key takes
/// a path, and a shell turns an unquoted `KEY=~` (remove the key) into `KEY=$HOME`.
pub fn parse_sets(sets: &[String]) -> Result<Vec<(String, String)>, Failure> {
    let home = std::env::var("HOME")
        .ok()
        .filter(|h| h.starts_with('/') && h.len() > 1);
    sets.iter()
        .map(|s| {
            let (k, v) = s
                .split_once('=')
                .map(|(k, v)| (k.trim().to_string(), v.trim().to_string()))
                .ok_or_else(|| {
                    Failure::Input(format!(
                        "--set `{s}`: expected KEY=VALUE, e.g. parts.head.bearing.mu=0.08"
                    ))
                })?;
            if let Some(home) = home.as_deref() {
                if let Some(rest) = v.strip_prefix(home).filter(|r| r.is_empty() || r.starts_with('/')) {
                    return Err(Failure::Input(format!(
                        "--set `{s}`: the value is your home folder; the shell turns an unquoted `~` after `=` into it, so quote the override: --set '{k}=~{rest}'"
                    )));
                }
            }
            Ok((k, v))
        })
        .collect()
}

/// Loads a rig with its overrides; errors name file and line.
pub fn load(args: &RigArgs) -> Result<Rig, Failure> {
    let overrides = parse_sets(&args.sets.set)?;
    let rig = if overrides.is_empty() {
        rig::load_file(&args.rig)?
    } else {
        rig::load::load_file_with(&args.rig, &overrides)?
    };
    Ok(rig)
}

/// Loads and solves.
pub fn load_and_solve(args: &RigArgs) -> Result<(Rig, solve::Solution), Failure> {
    load_and_solve_in(args, None)
}

/// Loads and solves, showing the rig in `units` (the file's own when `None`) from the
/// moment every value is SI, so that a solve error's figures read in them as the
/// report's do.
pub fn load_and_solve_in(
    args: &RigArgs,
    units: Option<UnitsArg>,
) -> Result<(Rig, solve::Solution), Failure> {
    let mut rig = load(args)?;
    if let Some(units) = units {
        rig.units = units.shown(rig.units);
    }
    let solution =
        solve::solve(&rig, &SolveOptions::default()).map_err(|source| Failure::Solve {
            location: locate(&args.rig, &rig, &source),
            source: Box::new(source),
        })?;
    Ok((rig, solution))
}

/// `file:line:column: key` for a solve error, as far as it can be located.
fn locate(path: &Path, rig: &Rig, error: &SolveError) -> String {
    match error.location(rig) {
        Some((l, subject)) if l.line > 0 => {
            format!("{}:{}:{}: {subject}", path.display(), l.line, l.column)
        }
        _ => path.display().to_string(),
    }
}

/// Writes to stdout; a closed pipe (`reeve check x | head`) is not an error.
pub fn write_out(f: impl FnOnce(&mut dyn Write) -> io::Result<()>) -> Result<(), Failure> {
    let stdout = io::stdout();
    let mut lock = stdout.lock();
    match f(&mut lock).and_then(|_| lock.flush()) {
        Ok(()) => Ok(()),
        Err(e) if e.kind() == io::ErrorKind::BrokenPipe => Ok(()),
        Err(e) => Err(Failure::Stdout(e)),
    }
}

/// Runs a parsed command line; returns the exit code.
pub fn run(cli: Cli) -> Result<i32, Failure> {
    match cli.command {
        Command::Check {
            rig: args,
            json,
            units,
        } => {
            // Every value is SI once loaded: only what the text shows changes.
            let (rig, solution) = load_and_solve_in(&args, (!json.json).then_some(units))?;
            let warnings = checks::run(&rig, &solution);
            let report = Report::build(&rig, &solution, warnings);
            if json.json {
                let json =
                    serde_json::to_string_pretty(&report).map_err(|source| Failure::Encode {
                        what: "report",
                        source,
                    })?;
                write_out(|w| writeln!(w, "{json}"))?;
            } else {
                let source = args.rig.display().to_string();
                write_out(|w| text::write_check(w, &rig, &report, &source))?;
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
        Command::Motion(args) => motion::run_motion(args),
        Command::Completions(args) => tools::run_completions(args),
        Command::Manual(args) => tools::run_manual(args),
        Command::Schema(args) => schema::run_schema(args),
        Command::New(args) => starter::run_new(args),
        Command::Watch(args) => watch::run_watch(args),
    }
}

//! Command glue for the design studies (`compare`, `sweep`, `rank`, `spread`): parse
//! the study's settings, run it from [`reeve::study`], and write the chosen format with
//! the study's writer in [`reeve::report::study`].

use std::io::{self, Write};
use std::path::{Path, PathBuf};

use reeve::model::PartKind;
use reeve::report::study as writers;
use reeve::rig::RigText;
use reeve::study::{compare, rank, spread, sweep, RigSource, StudyError};

use super::progress::Bar;

use super::args::{FormatArgs, RigArgs, SetArgs, UnitsArg};
use super::destination::{emit, Destination};
use super::{parse_sets, write_out, Failure, EXIT_CHECK_FAILED, EXIT_OK};

/// Arguments of `compare`.
#[derive(Debug, clap::Args)]
pub struct CompareArgs {
    /// The rig files; the first is the reference column.
    #[arg(required = true)]
    pub rigs: Vec<PathBuf>,
    /// Compare the rig as written with each of its named `variants:` instead.
    #[arg(long)]
    pub variants: bool,
    /// Overrides applied to every rig.
    #[command(flatten)]
    pub sets: SetArgs,
    /// Output format.
    #[command(flatten)]
    pub format: FormatArgs,
    /// Units of the tables and charts (not of JSON).
    #[command(flatten)]
    pub units: UnitsArg,
}

/// Arguments of `sweep`.
#[derive(Debug, clap::Args)]
pub struct SweepArgs {
    /// The rig.
    #[command(flatten)]
    pub rig: RigArgs,
    /// The value to vary: `KEY=FROM..TO` (e.g. `parts.head.bearing.mu=0.05..0.2`).
    #[arg(
        long,
        value_name = "KEY=FROM..TO",
        conflicts_with = "stroke",
        required_unless_present = "stroke"
    )]
    pub vary: Option<String>,
    /// Move the drive forward through this travel instead (a length such as `500 mm`,
    /// or an angle such as `90 deg` for a drum drive); without a distance, over the
    /// rig's `travel` from its back stop to its forward stop.
    #[arg(long, value_name = "DISTANCE", num_args = 0..=1, default_missing_value = "")]
    pub stroke: Option<String>,
    /// Number of steps, both ends included for `--vary` (default 11; 10 for `--stroke`).
    #[arg(long)]
    pub steps: Option<usize>,
    /// Also write a line chart to this SVG file.
    #[arg(long, value_name = "FILE")]
    pub plot: Option<PathBuf>,
    /// Output format.
    #[command(flatten)]
    pub format: FormatArgs,
    /// Units of the tables and charts (not of JSON).
    #[command(flatten)]
    pub units: UnitsArg,
}

/// Arguments of `rank`.
#[derive(Debug, clap::Args)]
pub struct RankArgs {
    /// The rig.
    #[command(flatten)]
    pub rig: RigArgs,
    /// Alternative bearing: `rolling` (bore = plain pin diameter, mu 0.0015) or a
    /// bearing in YAML, e.g. `{kind: plain, pin_diameter: 8, mu: 0.08}`.
    #[arg(long, value_name = "BEARING")]
    pub to: Option<String>,
    /// Output format.
    #[command(flatten)]
    pub format: FormatArgs,
    /// Units of the tables and charts (not of JSON).
    #[command(flatten)]
    pub units: UnitsArg,
}

/// Arguments of `spread`.
#[derive(Debug, clap::Args)]
pub struct SpreadArgs {
    /// The rig.
    #[command(flatten)]
    pub rig: RigArgs,
    /// Number of Monte Carlo samples.
    #[arg(long, default_value_t = 1000)]
    pub samples: usize,
    /// Seed of the random streams (same seed, same numbers).
    #[arg(long, default_value_t = 1)]
    pub seed: u64,
    /// Worker threads (0: one per core).
    #[arg(long, default_value_t = 0)]
    pub threads: usize,
    /// Output format.
    #[command(flatten)]
    pub format: FormatArgs,
    /// Units of the tables and charts (not of JSON).
    #[command(flatten)]
    pub units: UnitsArg,
}

/// The most `--samples` accepted: about a minute of solving for a small rig on two
/// cores (measured: 100 000 samples of `rigs/sash-window.yaml` in 5.5 s; running the
/// checks on every sample adds about a quarter, 2.2 s to 2.8 s for 5000 samples on one
/// thread in a debug build); more than this is a typo, and an absurd count would
/// otherwise abort on allocation.
pub const MAX_SAMPLES: usize = 1_000_000;

/// The most `--steps` accepted (measured: 10 000 stroke steps of a one-sheave rig in
/// 1.6 s); a chart or table of more steps shows nothing more.
pub const MAX_STEPS: usize = 100_000;

/// `--steps` checked: at least 1 and at most [`MAX_STEPS`].
fn checked_steps(steps: Option<usize>, default: usize) -> Result<usize, Failure> {
    match steps.unwrap_or(default) {
        0 => Err(Failure::Input("--steps: expected at least 1".into())),
        n if n > MAX_STEPS => Err(Failure::Input(format!(
            "--steps {n}: at most {MAX_STEPS} steps; a finer sweep shows nothing more"
        ))),
        n => Ok(n),
    }
}

/// A study's exit code: 1 where any of its runs fails a check, as `check` would.
fn exit_code(fails: bool) -> i32 {
    if fails {
        EXIT_CHECK_FAILED
    } else {
        EXIT_OK
    }
}

/// Reads the rig file at `path` for a study, with the `--set` overrides `sets`.
fn read_source(path: &Path, sets: &[(String, String)]) -> Result<RigSource, StudyError> {
    Ok(RigSource::new(RigText::read(path)?, sets))
}

fn source(args: &RigArgs) -> Result<RigSource, Failure> {
    let sets = parse_sets(&args.sets.set)?;
    let s = read_source(&args.rig, &sets)?;
    // Load once so that a bad file or override is reported before any study runs.
    s.load(&[])?;
    Ok(s)
}

/// `reeve compare`.
pub fn run_compare(args: CompareArgs) -> Result<i32, Failure> {
    let format = args.format.format();
    let sets = parse_sets(&args.sets.set)?;
    let mut c = if args.variants {
        if args.rigs.len() != 1 {
            return Err(Failure::Input(
                "--variants compares the variants of one rig; give exactly one rig file".into(),
            ));
        }
        let s = read_source(&args.rigs[0], &sets)?;
        compare::compare_variants(&s)?
    } else {
        let sources = args
            .rigs
            .iter()
            .map(|p| read_source(p, &sets))
            .collect::<Result<Vec<_>, _>>()?;
        compare::compare_rigs(&sources)?
    };
    (c.units, c.csv_units) = args.units.shown_in_csv(c.units);
    write_out(|w| writers::compare::write(w, &c, format))?;
    Ok(exit_code(c.fails()))
}

/// Writes a study's result to an output.
type Writer = Box<dyn Fn(&mut dyn Write) -> io::Result<()>>;

/// `reeve sweep`.
pub fn run_sweep(args: SweepArgs) -> Result<i32, Failure> {
    let format = args.format.format();
    let steps = checked_steps(args.steps, if args.stroke.is_some() { 10 } else { 11 })?;
    let s = source(&args.rig)?;
    let (chart, write, fails): (String, Writer, bool) = if let Some(distance) = &args.stroke {
        let mut st = sweep::stroke(&s, distance, steps, 8, &Bar::new("stroke"))?;
        (st.units, st.csv_units) = args.units.shown_in_csv(st.units);
        let fails = st.fails();
        (
            writers::sweep::stroke_chart(&st),
            Box::new(move |w| writers::sweep::write_stroke(w, &st, format)),
            fails,
        )
    } else {
        let text = args.vary.as_deref().unwrap_or_default();
        let vary = sweep::parse_vary(text)?;
        let mut sw = sweep::sweep(&s, &vary, steps, &Bar::new("sweep"))?;
        (sw.units, sw.csv_units) = args.units.shown_in_csv(sw.units);
        // A key that no step can take (no such part, a value in the wrong unit) is bad
        // input, not a table of dashes.
        if sw.steps.iter().all(|st| st.error.is_some()) {
            let why = sw.steps.iter().find_map(|st| st.error.clone());
            return Err(Failure::Input(format!(
                "--vary `{text}`: no step could be solved; at the first: {}",
                why.unwrap_or_default()
            )));
        }
        let fails = sw.fails();
        (
            writers::sweep::sweep_chart(&sw),
            Box::new(move |w| writers::sweep::write_sweep(w, &sw, format)),
            fails,
        )
    };
    if let Some(path) = &args.plot {
        // Atomic, and never over the input rig (`--plot rig.yaml` is a slip of the hand).
        emit(&Destination::File(path.clone()), &args.rig.rig, |w| {
            w.write_all(chart.as_bytes())
        })?;
    }
    write_out(|w| write(w))?;
    Ok(exit_code(fails))
}

/// `reeve rank`.
pub fn run_rank(args: RankArgs) -> Result<i32, Failure> {
    let format = args.format.format();
    let s = source(&args.rig)?;
    let alt = args.to.as_deref().map(rank::Alternative::parse);
    if let Some(rank::Alternative::Bearing(text)) = &alt {
        // Check the bearing once on the first part that takes it, so that a typo is
        // reported rather than shown as "—" on every row.
        let rig = s.load(&[])?;
        if let Some(id) = rig
            .parts
            .position(|p| matches!(p.kind, PartKind::Sheave(_)))
        {
            let key = format!("parts.{}.bearing", rig.parts[id].name);
            s.load(&[(key, text.clone())])
                .map_err(|source| Failure::Flag {
                    flag: format!("--to `{text}`"),
                    source: Box::new(source),
                })?;
        }
    }
    let mut r = rank::rank(&s, alt.as_ref(), &Bar::new("rank"))?;
    (r.units, r.csv_units) = args.units.shown_in_csv(r.units);
    write_out(|w| writers::rank::write(w, &r, format))?;
    Ok(exit_code(r.fails()))
}

/// `reeve spread`.
pub fn run_spread(args: SpreadArgs) -> Result<i32, Failure> {
    let format = args.format.format();
    if args.samples == 0 {
        return Err(Failure::Input("--samples: expected at least 1".into()));
    }
    if args.samples > MAX_SAMPLES {
        return Err(Failure::Input(format!(
            "--samples {}: at most {MAX_SAMPLES} samples (about a minute for a small rig); the percentiles settle long before",
            args.samples
        )));
    }
    let s = source(&args.rig)?;
    let mut r = spread::spread(
        &s,
        args.samples,
        args.seed,
        args.threads,
        &Bar::new("spread"),
    )?;
    (r.units, r.csv_units) = args.units.shown_in_csv(r.units);
    write_out(|w| writers::spread::write(w, &r, format))?;
    Ok(exit_code(r.fails()))
}

//! `reeve motion`: the rig in time from rest (DESIGN.md §7), written as text, CSV or
//! JSON, with an optional SVG chart.

use std::path::PathBuf;

use reeve::report::format::Format;
use reeve::report::motion as writer;
use reeve::solve::motion::{motion_told, MotionOptions};
use reeve::units::{parse_quantity, parse_unit_of, Dimension};

use super::args::{FormatArgs, RigArgs, UnitsArg};
use super::destination::{emit, Destination};
use super::progress::Bar;
use super::{load, write_out, Failure, EXIT_OK};

/// Arguments of `motion`.
#[derive(Debug, clap::Args)]
pub struct MotionArgs {
    /// The rig.
    #[command(flatten)]
    pub rig: RigArgs,
    /// How long to run (`90 s`, `20 min`, `2 h`; bare numbers are seconds). Default:
    /// the latest schedule (the drive's or another part's) and half as long again, plus
    /// 10 s (60 s without a schedule).
    #[arg(long, value_name = "T", allow_hyphen_values = true)]
    pub duration: Option<String>,
    /// Also write the chart (position, speed, drive value and holding band) to this SVG.
    #[arg(long, value_name = "FILE")]
    pub plot: Option<PathBuf>,
    /// Output format: text, csv (the time series) or json.
    #[command(flatten)]
    pub format: FormatArgs,
    /// Units of the text, CSV and chart (JSON stays SI).
    #[command(flatten)]
    pub units: UnitsArg,
}

/// `reeve motion`.
pub fn run_motion(args: MotionArgs) -> Result<i32, Failure> {
    let format = args.format.format();
    let rig = load(&args.rig)?;
    let duration = match &args.duration {
        Some(text) => {
            let seconds = parse_unit_of("s", Dimension::Time)
                .and_then(|s| parse_quantity(text, Dimension::Time, s))
                .map_err(|e| Failure::Input(format!("--duration `{text}`: {e}")))?;
            if !(seconds > 0.0 && seconds <= 1e7) {
                return Err(Failure::Input(format!(
                    "--duration `{text}`: expected a time above 0 and at most 10^7 s"
                )));
            }
            Some(seconds)
        }
        None => None,
    };
    let options = MotionOptions {
        duration,
        ..MotionOptions::default()
    };
    // A bar on a terminal only (stderr), never in piped output.
    let m = motion_told(&rig, &options, &Bar::new("motion")).map_err(|e| {
        Failure::Input(format!(
            "{}: {}",
            args.rig.rig.display(),
            reeve::text::error_chain(&e)
        ))
    })?;
    let title = rig.title.clone();
    // The CSV stays SI unless `--units` names a system.
    let (units, csv_units) = args.units.shown_in_csv(rig.units);
    if let Some(path) = &args.plot {
        let svg = writer::chart(&m, &units);
        emit(&Destination::File(path.clone()), &args.rig.rig, |w| {
            w.write_all(svg.as_bytes())
        })?;
    }
    match format {
        Format::Json => {
            let json = serde_json::to_string_pretty(&writer::json(&m)).map_err(|source| {
                Failure::Encode {
                    what: "motion",
                    source,
                }
            })?;
            write_out(|w| writeln!(w, "{json}"))?;
        }
        Format::Csv => write_out(|w| writer::write_csv(w, &m, csv_units.as_ref()))?,
        _ => write_out(|w| writer::write_text(w, &m, &units, &title))?,
    }
    Ok(EXIT_OK)
}

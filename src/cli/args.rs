//! The flags more than one command takes, each defined once as an argument group that
//! the commands flatten: the rig and its `--set` overrides ([`RigArgs`], [`SetArgs`]),
//! `--format` with `--json` ([`FormatArgs`], [`JsonArg`]), `-o` ([`OutputArg`]),
//! `--view` ([`ViewArg`]) and `--units` ([`UnitsArg`]). The words a choice accepts come
//! from the library's own enums ([`reeve::report::Format`], [`View`], [`CaseFilter`],
//! [`TableChoice`], [`UnitChoice`]) through
//! [`one_of`], so the command line and the library cannot disagree on a spelling.

use std::path::PathBuf;

use clap::builder::{PossibleValue, PossibleValuesParser, TypedValueParser};

use reeve::report::svg::View;
use reeve::report::table::{CaseFilter, TableChoice};
use reeve::report::{DrawingFormat, Format};
use reeve::units::{UnitChoice, UnitSystem};

/// A value parser over one of the library's enums: each value's word, its other
/// spellings and its line of help. Only the listed words parse.
pub fn one_of<T: Copy + Send + Sync + 'static>(
    values: impl IntoIterator<Item = (T, &'static str, &'static [&'static str], &'static str)>,
) -> impl TypedValueParser<Value = T> {
    let values: Vec<_> = values.into_iter().collect();
    let possible: Vec<PossibleValue> = values
        .iter()
        .map(|&(_, name, aliases, help)| {
            PossibleValue::new(name)
                .aliases(aliases.iter().copied())
                .help(help)
        })
        .collect();
    PossibleValuesParser::new(possible).try_map(move |word: String| {
        values
            .iter()
            .find(|(_, name, aliases, _)| *name == word || aliases.contains(&word.as_str()))
            .map(|&(value, ..)| value)
            .ok_or("not one of the listed values")
    })
}

/// `--format`: the words of [`Format`] (`txt` and `markdown` as other spellings).
fn format_parser() -> impl TypedValueParser<Value = Format> {
    one_of(
        Format::ALL
            .into_iter()
            .map(|f| (f, f.name(), f.aliases(), f.describe())),
    )
}

/// `draw --format`: the words of [`DrawingFormat`].
pub fn drawing_format_parser() -> impl TypedValueParser<Value = DrawingFormat> {
    one_of(
        DrawingFormat::ALL
            .into_iter()
            .map(|f| (f, f.name(), &[][..], f.describe())),
    )
}

/// `--view`: the words of [`View`].
fn view_parser() -> impl TypedValueParser<Value = View> {
    one_of(
        View::ALL
            .into_iter()
            .map(|v| (v, v.name(), &[][..], v.description())),
    )
}

/// `--units`: the words of [`UnitChoice`].
fn units_parser() -> impl TypedValueParser<Value = UnitChoice> {
    one_of(
        UnitChoice::ALL
            .into_iter()
            .map(|u| (u, u.name(), &[][..], u.describe())),
    )
}

/// `--case`: the words of [`CaseFilter`].
pub fn case_parser() -> impl TypedValueParser<Value = CaseFilter> {
    one_of(
        CaseFilter::ALL
            .into_iter()
            .map(|c| (c, c.name(), &[][..], c.describe())),
    )
}

/// `--table`: the words of [`TableChoice`].
pub fn table_parser() -> impl TypedValueParser<Value = TableChoice> {
    one_of(
        TableChoice::ALL
            .into_iter()
            .map(|t| (t, t.name(), &[][..], t.describe())),
    )
}

/// `--set KEY=VALUE`, repeatable.
#[derive(Debug, Clone, Default, clap::Args)]
pub struct SetArgs {
    /// Change one value of the rig before solving, by the file's own keys
    /// (e.g. `parts.head.bearing.mu=0.08`); may be repeated.
    #[arg(long = "set", value_name = "KEY=VALUE")]
    pub set: Vec<String>,
}

/// The rig file and its overrides: what every one-rig command reads.
#[derive(Debug, Clone, clap::Args)]
pub struct RigArgs {
    /// The rig file (YAML, format 1).
    pub rig: PathBuf,
    /// Overrides.
    #[command(flatten)]
    pub sets: SetArgs,
}

/// `--json`.
#[derive(Debug, Clone, Copy, Default, clap::Args)]
pub struct JsonArg {
    /// Print one JSON document (SI units, keys carrying their units) instead of text;
    /// where the command has `--format`, the same as `--format json`.
    #[arg(long)]
    pub json: bool,
}

/// `--format` and `--json`.
#[derive(Debug, Clone, Copy, clap::Args)]
pub struct FormatArgs {
    /// Output format.
    #[arg(long, value_name = "FORMAT", value_parser = format_parser(), default_value = "text")]
    pub format: Format,
    /// JSON instead.
    #[command(flatten)]
    pub json: JsonArg,
}

impl FormatArgs {
    /// The format asked for: `--json` wins over `--format`.
    pub fn format(self) -> Format {
        if self.json.json {
            Format::Json
        } else {
            self.format
        }
    }
}

/// `-o FILE`. Optional here; a command that always writes a file makes it required
/// (`#[command(mut_arg("output", ...))]`) with help of its own.
#[derive(Debug, Clone, Default, clap::Args)]
pub struct OutputArg {
    /// Write to this file instead of stdout (`-` is stdout); a file is written whole or
    /// not at all, and never over the rig file.
    #[arg(short = 'o', long = "output", value_name = "FILE")]
    pub output: Option<PathBuf>,
}

/// `--view`.
#[derive(Debug, Clone, Copy, Default, clap::Args)]
pub struct ViewArg {
    /// Projection of the drawing; default: the one among front, side and top that
    /// spreads the rig most.
    #[arg(long, value_name = "VIEW", value_parser = view_parser())]
    pub view: Option<View>,
}

/// `--units`.
#[derive(Debug, Clone, Copy, Default, clap::Args)]
pub struct UnitsArg {
    /// Units of the text, Markdown, CSV, HTML and drawings (JSON stays SI): the rig
    /// file's own, SI, a metric drawing set or US customary; the unit is in every header.
    #[arg(long, value_name = "UNITS", value_parser = units_parser(), default_value = "file")]
    pub units: UnitChoice,
}

impl UnitsArg {
    /// The units to show for a rig whose file shows `file`.
    pub fn shown(self, file: UnitSystem) -> UnitSystem {
        self.units.system(file)
    }

    /// The units a study shows, and those of its CSV: SI (as its JSON, and as it always
    /// was) unless `--units` names a system.
    pub fn shown_in_csv(self, file: UnitSystem) -> (UnitSystem, Option<UnitSystem>) {
        let shown = self.shown(file);
        (shown, (self.units != UnitChoice::File).then_some(shown))
    }
}

/// Options whose value may start with a minus sign: a stroke backward (`--stroke "-500
/// mm"`), and the settings whose values may be negative (`--set`, `--vary`). Clap reads
/// `-5…` after an option as a short flag unless the value is joined (`--stroke=-500
/// mm`); [`join_negative_values`] joins it. `--stroke` takes an optional value, so
/// clap's `allow_hyphen_values` would swallow the next flag (`--stroke --steps 4`).
pub const NEGATIVE_VALUE_OPTIONS: &[&str] = &["--stroke", "--set", "--vary"];

/// The command line with each option of [`NEGATIVE_VALUE_OPTIONS`] that is followed by
/// a value starting with a minus and a digit or a point (`-500 mm`, `-.5`) joined to it
/// (`--stroke=-500 mm`), so that clap takes the value as the option's. Flags (`-o`,
/// `--steps`) are left alone, and so is everything after `--`.
pub fn join_negative_values(
    args: impl IntoIterator<Item = std::ffi::OsString>,
) -> Vec<std::ffi::OsString> {
    let negative = |a: &std::ffi::OsString| {
        a.to_str().is_some_and(|s| {
            let mut c = s.chars();
            c.next() == Some('-') && c.next().is_some_and(|d| d.is_ascii_digit() || d == '.')
        })
    };
    let mut out: Vec<std::ffi::OsString> = Vec::new();
    let mut args = args.into_iter().peekable();
    while let Some(a) = args.next() {
        if a == "--" {
            out.push(a);
            out.extend(args);
            break;
        }
        let option = a.to_str().filter(|s| NEGATIVE_VALUE_OPTIONS.contains(s));
        match (option, args.peek()) {
            (Some(option), Some(next)) if negative(next) => {
                let mut joined = std::ffi::OsString::from(format!("{option}="));
                joined.push(args.next().unwrap_or_default());
                out.push(joined);
            }
            _ => out.push(a),
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn joined(args: &[&str]) -> Vec<String> {
        join_negative_values(args.iter().map(std::ffi::OsString::from))
            .into_iter()
            .map(|a| a.into_string().unwrap())
            .collect()
    }

    #[test]
    fn negative_values_are_joined_to_their_option_and_flags_are_not() {
        assert_eq!(
            joined(&["reeve", "sweep", "r.yaml", "--stroke", "-500 mm", "--steps", "3"]),
            [
                "reeve",
                "sweep",
                "r.yaml",
                "--stroke=-500 mm",
                "--steps",
                "3"
            ]
        );
        assert_eq!(joined(&["--stroke", "-.5"]), ["--stroke=-.5"]);
        // An optional value left out: the next flag stays a flag.
        assert_eq!(
            joined(&["--stroke", "--steps", "3"]),
            ["--stroke", "--steps", "3"]
        );
        assert_eq!(joined(&["--stroke", "-o", "x"]), ["--stroke", "-o", "x"]);
        // Other options, and anything after `--`, are left as typed.
        assert_eq!(joined(&["--steps", "-3"]), ["--steps", "-3"]);
        assert_eq!(joined(&["--", "--stroke", "-5"]), ["--", "--stroke", "-5"]);
        assert_eq!(
            joined(&["--stroke", "-5", "--set", "-1"]),
            ["--stroke=-5", "--set=-1"]
        );
    }
}

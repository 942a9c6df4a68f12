//! The writers of the design studies (`compare`, `sweep` and `stroke`, `rank`,
//! `spread`): each takes a study's result from [`crate::study`] and writes it as text,
//! Markdown, CSV or JSON; [`super::chart`] draws the sweep and stroke charts. A study's
//! human-readable document is a title, one table per section, notes and the caution.

use std::io::{self, Write};

use super::escape::write_printable;
use super::table::{csv_number, write_markdown_table, write_text_table, Table};
use crate::math::Real;
use crate::study::Verdict;
use crate::units::{Dimension, UnitSystem};

use super::{Format, CAUTION};

pub mod compare;
pub mod rank;
pub mod spread;
pub mod sweep;

/// The unit of one figure in a study's CSV: SI, spelt as the JSON's keys spell it, unless
/// `--units` named a system (the study's `csv_units`).
pub(super) struct CsvUnit {
    /// SI value of one of the unit.
    si: Real,
    /// Its symbol for the header.
    pub(super) symbol: &'static str,
}

impl CsvUnit {
    /// The unit of a figure of `dimension` whose SI spelling is `si_symbol`.
    pub(super) fn new(
        shown: Option<&UnitSystem>,
        dimension: Dimension,
        si_symbol: &'static str,
    ) -> CsvUnit {
        match shown {
            Some(u) => {
                let unit = u.unit(dimension);
                CsvUnit {
                    si: unit.si,
                    symbol: unit.symbol,
                }
            }
            None => CsvUnit {
                si: 1.0,
                symbol: si_symbol,
            },
        }
    }

    /// A travel or span length: [`UnitSystem::span_length`] where `--units` is given.
    pub(super) fn span(shown: Option<&UnitSystem>, si_symbol: &'static str) -> CsvUnit {
        match shown {
            Some(u) => CsvUnit {
                si: u.span_length.si,
                symbol: u.span_length.symbol,
            },
            None => CsvUnit {
                si: 1.0,
                symbol: si_symbol,
            },
        }
    }

    /// An SI value in this unit, full precision, empty when missing.
    pub(super) fn number(&self, x: Option<Real>) -> String {
        csv_number(x.map(|v| v / self.si))
    }
}

/// Writes a titled study table in a human-readable format (text or Markdown), with
/// notes, ending with the caution; unsafe characters in names are escaped.
pub fn write_human(
    w: &mut dyn Write,
    format: Format,
    title: &str,
    table: &Table,
    notes: &[String],
) -> io::Result<()> {
    write_printable(w, |w| {
        write_human_sections(w, format, title, &[(String::new(), table.clone())], notes)
    })
}

/// Writes a titled study in a human-readable format (text or Markdown): one table per
/// section, each under its heading (none where the heading is empty), then the notes,
/// ending with the caution; unsafe characters in names are escaped.
pub fn write_human_sections(
    w: &mut dyn Write,
    format: Format,
    title: &str,
    sections: &[(String, Table)],
    notes: &[String],
) -> io::Result<()> {
    write_printable(w, |w| write_sections_raw(w, format, title, sections, notes))
}

fn write_sections_raw(
    w: &mut dyn Write,
    format: Format,
    title: &str,
    sections: &[(String, Table)],
    notes: &[String],
) -> io::Result<()> {
    if format == Format::Markdown {
        writeln!(w, "## {title}\n")?;
        for (heading, table) in sections {
            if !heading.is_empty() {
                writeln!(w, "### {heading}\n")?;
            }
            write_markdown_table(w, table)?;
            writeln!(w)?;
        }
        for n in notes {
            if n.is_empty() || n.starts_with('|') || n.contains('\n') {
                writeln!(w, "{n}")?;
            } else {
                writeln!(w, "- {n}")?;
            }
        }
        if !notes.is_empty() {
            writeln!(w)?;
        }
        writeln!(w, "*{CAUTION}*")
    } else {
        writeln!(w, "{title}\n")?;
        for (heading, table) in sections {
            if !heading.is_empty() {
                writeln!(w, "{heading}:")?;
            }
            write_text_table(w, table)?;
            writeln!(w)?;
        }
        for n in notes {
            writeln!(w, "{n}")?;
        }
        if !notes.is_empty() {
            writeln!(w)?;
        }
        writeln!(w, "{CAUTION}")
    }
}

/// A verdict as a table cell: `ok` or `FAIL` with the failing codes, and the stalled sheaves.
pub fn verdict_cell(verdict: &Verdict) -> String {
    let mut cell = if verdict.fails {
        format!("FAIL {}", verdict.failing.join(", "))
    } else {
        "ok".to_string()
    };
    if !verdict.stalled.is_empty() {
        cell.push_str(&format!("; stalled: {}", verdict.stalled.join(", ")));
    }
    cell
}

/// A note for a table with stalled rows: why their values stop changing.
pub fn stalled_note(stalled_rows: usize, rows: usize) -> Option<String> {
    (stalled_rows > 0).then(|| {
        format!(
            "{stalled_rows} of {rows} rows have a stalled sheave (`stalled` in checks): it does not turn and the rope slides over it at the capstan ratio, so its bearing no longer changes the values there."
        )
    })
}

/// The note of a study some of whose runs could not be solved (it then exits 1).
pub fn unsolved_note(unsolved_rows: usize, rows: usize, what: &str) -> Option<String> {
    (unsolved_rows > 0).then(|| {
        format!(
            "{unsolved_rows} of {rows} steps could not be solved (their rows read `—`): the {what} is incomplete, and exits 1 as a failing check does."
        )
    })
}

/// A margin as a table cell (`12.5 %`, `—`).
pub fn margin_cell(margin: Option<Real>) -> String {
    margin.map_or("—".into(), |m| format!("{:.1} %", m * 100.0))
}

//! A plain table of text cells and its writers: aligned text, Markdown and CSV. JSON
//! comes from each study's own serializable result.

use std::io::{self, Write};

use crate::report::escape::{csv_field, markdown_cell, write_printable};
use crate::report::CAUTION;
use crate::text::printable;

pub use crate::report::Format;

/// A table: a header row and body rows of cells; the first column is left-aligned,
/// the others right-aligned in text.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Table {
    /// Column headings.
    pub headers: Vec<String>,
    /// Body rows.
    pub rows: Vec<Vec<String>>,
}

impl Table {
    /// Writes aligned text.
    pub fn write_text(&self, w: &mut dyn Write) -> io::Result<()> {
        let n = self.headers.len();
        // Unsafe characters escaped before the columns are measured.
        let headers: Vec<String> = self
            .headers
            .iter()
            .map(|h| printable(h).into_owned())
            .collect();
        let rows: Vec<Vec<String>> = self
            .rows
            .iter()
            .map(|r| r.iter().map(|c| printable(c).into_owned()).collect())
            .collect();
        let mut widths: Vec<usize> = headers.iter().map(|h| h.chars().count()).collect();
        for row in &rows {
            for (i, c) in row.iter().enumerate().take(n) {
                widths[i] = widths[i].max(c.chars().count());
            }
        }
        let line = |w: &mut dyn Write, cells: &[String]| -> io::Result<()> {
            let mut out = String::new();
            for (i, width) in widths.iter().enumerate() {
                let c = cells.get(i).map_or("", String::as_str);
                let pad = width.saturating_sub(c.chars().count());
                if i == 0 {
                    out.push_str(c);
                    out.push_str(&" ".repeat(pad));
                } else {
                    out.push_str("  ");
                    out.push_str(&" ".repeat(pad));
                    out.push_str(c);
                }
            }
            writeln!(w, "{}", out.trim_end())
        };
        line(w, &headers)?;
        for row in &rows {
            line(w, row)?;
        }
        Ok(())
    }

    /// Writes a Markdown table.
    pub fn write_markdown(&self, w: &mut dyn Write) -> io::Result<()> {
        let head: Vec<String> = self.headers.iter().map(|h| markdown_cell(h)).collect();
        writeln!(w, "| {} |", head.join(" | "))?;
        let rule: Vec<&str> = (0..self.headers.len())
            .map(|i| if i == 0 { "---" } else { "---:" })
            .collect();
        writeln!(w, "| {} |", rule.join(" | "))?;
        for row in &self.rows {
            let cells: Vec<String> = row.iter().map(|c| markdown_cell(c)).collect();
            writeln!(w, "| {} |", cells.join(" | "))?;
        }
        Ok(())
    }

    /// Writes CSV (RFC 4180 quoting; a cell that reads as a formula is prefixed with `'`).
    pub fn write_csv(&self, w: &mut dyn Write) -> io::Result<()> {
        for row in std::iter::once(&self.headers).chain(&self.rows) {
            let cells: Vec<String> = row.iter().map(|c| csv_field(c)).collect();
            writeln!(w, "{}", cells.join(","))?;
        }
        Ok(())
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
            table.write_markdown(w)?;
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
            table.write_text(w)?;
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

/// A CSV number: full precision, empty when missing.
pub fn csv_number(x: Option<f64>) -> String {
    match x {
        Some(v) if v.is_finite() => format!("{v}"),
        _ => String::new(),
    }
}

//! Writes a comparison ([`crate::study::compare`]): one row per figure, one column per
//! rig or variant, the change against the first column of its group in parentheses.

use std::io::{self, Write};

use crate::math::Real;
use crate::study::compare::{Changes, Comparison, Group};
use crate::study::Figures;
use crate::units::{Dimension, UnitSystem};

use super::super::table::{csv_number, write_csv, Table};
use super::super::text::{capitalise, number};
use super::super::Format;
use super::{margin_cell, verdict_cell, write_human, write_human_sections, CsvUnit};

/// A row: label, SI unit for CSV, value per column, change per column, how to show.
struct Row {
    label: &'static str,
    unit: &'static str,
    values: Vec<Option<Real>>,
    changes: Vec<Option<Real>>,
    show: Box<dyn Fn(usize, Option<Real>) -> String>,
    /// Cells for CSV where the row is words, not numbers.
    csv_text: Option<Vec<String>>,
}

fn rows(c: &Comparison, _rig_units: &UnitSystem) -> Vec<Row> {
    let units = c.units;
    let dimensions: Vec<Dimension> = c
        .columns
        .iter()
        .map(|f| f.solve_for.quantity.dimension())
        .collect();
    let asked =
        move |i: usize, x: Option<Real>| super::super::text::quantity(x, dimensions[i], &units);
    let force =
        move |_: usize, x: Option<Real>| super::super::text::quantity(x, Dimension::Force, &units);
    let pct = |_: usize, x: Option<Real>| match x {
        Some(v) => format!("{:.1} %", v * 100.0),
        None => "—".to_string(),
    };
    let plain = |_: usize, x: Option<Real>| number(x, 4);
    let deg = |_: usize, x: Option<Real>| match x {
        Some(v) => format!("{}°", number(Some(v), 3)),
        None => "—".to_string(),
    };
    let col = |f: &dyn Fn(&Figures) -> Option<Real>| c.columns.iter().map(f).collect::<Vec<_>>();
    let chg = |f: &dyn Fn(&Changes) -> Option<Real>| c.change_pct.iter().map(f).collect::<Vec<_>>();
    let unit = c.columns.first().map_or("N", |f| f.solve_for.unit());
    let mut out = vec![
        Row {
            label: "ideal",
            unit,
            values: col(&|f| f.ideal),
            changes: chg(&|x| x.ideal),
            show: Box::new(asked.clone()),
            csv_text: None,
        },
        Row {
            label: "forward",
            unit,
            values: col(&|f| f.forward),
            changes: chg(&|x| x.forward),
            show: Box::new(asked.clone()),
            csv_text: None,
        },
        Row {
            label: "back",
            unit,
            values: col(&|f| f.back),
            changes: chg(&|x| x.back),
            show: Box::new(asked.clone()),
            csv_text: None,
        },
        Row {
            label: "efficiency",
            unit: "1",
            values: col(&|f| f.efficiency),
            changes: chg(&|x| x.efficiency),
            show: Box::new(pct),
            csv_text: None,
        },
        Row {
            label: "friction forward",
            unit,
            values: col(&|f| f.friction_forward),
            changes: chg(&|x| x.friction_forward),
            show: Box::new(asked.clone()),
            csv_text: None,
        },
        Row {
            label: "friction back",
            unit,
            values: col(&|f| f.friction_back),
            changes: chg(&|x| x.friction_back),
            show: Box::new(asked.clone()),
            csv_text: None,
        },
        Row {
            label: "holding band low",
            unit,
            values: col(&|f| f.holding_band[0]),
            changes: vec![None; c.columns.len()],
            show: Box::new(asked.clone()),
            csv_text: None,
        },
        Row {
            label: "holding band high",
            unit,
            values: col(&|f| f.holding_band[1]),
            changes: vec![None; c.columns.len()],
            show: Box::new(asked),
            csv_text: None,
        },
        Row {
            label: "self-locking",
            unit: "",
            values: col(&|f| Some(if f.self_locking { 1.0 } else { 0.0 })),
            changes: vec![None; c.columns.len()],
            show: Box::new(yes_no),
            csv_text: None,
        },
        Row {
            label: "largest tension",
            unit: "N",
            values: col(&|f| f.largest_tension_n),
            changes: chg(&|x| x.largest_tension_n),
            show: Box::new(force),
            csv_text: None,
        },
        Row {
            label: "lowest safety factor",
            unit: "1",
            values: col(&|f| f.lowest_safety_factor),
            changes: chg(&|x| x.lowest_safety_factor),
            show: Box::new(plain),
            csv_text: None,
        },
        Row {
            label: "largest fleet angle",
            unit: "deg",
            values: col(&|f| f.largest_fleet_deg),
            changes: chg(&|x| x.largest_fleet_deg),
            show: Box::new(deg),
            csv_text: None,
        },
        Row {
            label: "smallest D/d",
            unit: "1",
            values: col(&|f| f.smallest_bend_ratio),
            changes: chg(&|x| x.smallest_bend_ratio),
            show: Box::new(plain),
            csv_text: None,
        },
        Row {
            label: "warnings",
            unit: "",
            values: col(&|f| Some(f.warnings as Real)),
            changes: vec![None; c.columns.len()],
            // A count: no decimals.
            show: Box::new(|_, x: Option<Real>| x.map_or("—".into(), |v| format!("{v:.0}"))),
            csv_text: None,
        },
    ];
    // The margin and whether the drive moves, where any column gives what is available
    // (or a stated load); then every column's checks, as `check` would judge it.
    if c.columns.iter().any(|f| f.verdict.margin.is_some()) {
        let at = out
            .iter()
            .position(|r| r.label == "self-locking")
            .map_or(out.len(), |i| i + 1);
        out.splice(
            at..at,
            [
                Row {
                    label: "margin",
                    unit: "1",
                    values: col(&|f| f.verdict.margin),
                    changes: vec![None; c.columns.len()],
                    show: Box::new(|_, x| margin_cell(x)),
                    csv_text: None,
                },
                Row {
                    label: "moves",
                    unit: "",
                    values: col(&|f| f.verdict.moves.map(|m| if m { 1.0 } else { 0.0 })),
                    changes: vec![None; c.columns.len()],
                    show: Box::new(yes_no),
                    csv_text: None,
                },
            ],
        );
    }
    let checks: Vec<String> = c.columns.iter().map(|f| verdict_cell(&f.verdict)).collect();
    let shown = checks.clone();
    out.push(Row {
        label: "checks",
        unit: "",
        values: col(&|f| Some(if f.verdict.fails { 1.0 } else { 0.0 })),
        changes: vec![None; c.columns.len()],
        show: Box::new(move |i, _| shown[i].clone()),
        csv_text: Some(checks),
    });
    out
}

/// `yes` for 1, `no` for 0, `—` for nothing.
fn yes_no(_: usize, x: Option<Real>) -> String {
    match x {
        Some(1.0) => "yes".into(),
        Some(_) => "no".into(),
        None => "—".into(),
    }
}

/// The human table: a cell per column, with the change against the first in
/// parentheses.
pub fn human_table(c: &Comparison) -> Table {
    let mut headers = vec!["".to_string()];
    headers.extend(c.columns.iter().map(|f| f.label.clone()));
    let rows = rows(c, &c.units)
        .into_iter()
        .map(|r| {
            let mut cells = vec![r.label.to_string()];
            for (i, v) in r.values.iter().enumerate() {
                let mut cell = (r.show)(i, *v);
                if i > 0 {
                    if let Some(ch) = r.changes[i] {
                        cell.push_str(&format!(" ({ch:+.1} %)"));
                    }
                }
                cells.push(cell);
            }
            cells
        })
        .collect();
    Table::study_with(headers, rows)
}

/// The CSV table: SI numbers, a unit column, then the change columns.
pub fn csv_table(c: &Comparison) -> Table {
    let mut headers = vec!["figure".to_string(), "unit".to_string()];
    headers.extend(c.columns.iter().map(|f| f.label.clone()));
    headers.extend(
        c.columns
            .iter()
            .skip(1)
            .map(|f| format!("{} change %", f.label)),
    );
    // The asked quantity's rows and the tension's carry a unit `--units` may change.
    let asked = c
        .columns
        .first()
        .map(|f| (f.solve_for.unit(), f.solve_for.quantity.dimension()));
    let rows = rows(c, &c.units)
        .into_iter()
        .map(|r| {
            let dimension = match asked {
                Some((si, d)) if r.unit == si => Some(d),
                _ if r.unit == "N" => Some(Dimension::Force),
                _ => None,
            };
            let u = dimension.map(|d| CsvUnit::new(c.csv_units.as_ref(), d, r.unit));
            let unit = u.as_ref().map_or(r.unit, |u| u.symbol);
            let mut cells = vec![r.label.to_string(), unit.to_string()];
            match &r.csv_text {
                Some(text) => cells.extend(text.iter().cloned()),
                None => cells.extend(r.values.iter().map(|v| match &u {
                    Some(u) => u.number(*v),
                    None => csv_number(*v),
                })),
            }
            cells.extend(r.changes.iter().skip(1).map(|v| csv_number(*v)));
            cells
        })
        .collect();
    Table::study_with(headers, rows)
}

/// Writes the comparison in a format.
///
/// # Errors
/// I/O errors of the writer.
pub fn write(w: &mut dyn Write, c: &Comparison, format: Format) -> io::Result<()> {
    match format {
        Format::Json => {
            let json = serde_json::to_string_pretty(c).map_err(io::Error::other)?;
            writeln!(w, "{json}")
        }
        // One CSV table per group, a blank line between.
        Format::Csv => {
            for (i, g) in c.groups.iter().enumerate() {
                if i > 0 {
                    writeln!(w)?;
                }
                write_csv(w, &csv_table(&c.group(g)))?;
            }
            Ok(())
        }
        _ if c.groups.len() <= 1 => write_human(
            w,
            format,
            &format!(
                "Comparison of {} columns ({}); change against the first column in parentheses",
                c.columns.len(),
                c.groups
                    .first()
                    .map(|g| asked_words(c, g))
                    .unwrap_or_default()
            ),
            &human_table(c),
            &[],
        ),
        _ => {
            let sections: Vec<(String, Table)> = c
                .groups
                .iter()
                .map(|g| (capitalise(&asked_words(c, g)), human_table(&c.group(g))))
                .collect();
            write_human_sections(
                w,
                format,
                &format!(
                    "Comparison of {} columns in {} groups by the asked quantity; change against the first column of the same group in parentheses, none between groups",
                    c.columns.len(),
                    c.groups.len()
                ),
                &sections,
                &[],
            )
        }
    }
}

/// `the force at `winch`, `hand``: a group's quantity and every part its columns ask
/// about.
fn asked_words(c: &Comparison, g: &Group) -> String {
    let mut parts: Vec<String> = Vec::new();
    for &i in &g.columns {
        let p = format!("`{}`", c.columns[i].solve_for.part);
        if !parts.contains(&p) {
            parts.push(p);
        }
    }
    let role = if g.solve_for.role == crate::report::Role::Load {
        " (a load: forward is the most the drive moves)"
    } else {
        ""
    };
    format!(
        "the {} at {}{role}",
        g.solve_for.quantity.name(),
        parts.join(", ")
    )
}

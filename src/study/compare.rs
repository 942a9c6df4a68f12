//! `compare`: rigs or named variants side by side, one column each, with every
//! column's change against the first in percent. Rigs of different make-up (sheave
//! counts, drives) compare as they are: each column is its own rig's answer.
//!
//! Only like compares with like: columns are grouped by the asked quantity (its unit,
//! and whether it is a drive's effort or a load's greatest value), each group is its
//! own table, and a change is against the first column of the same group; between
//! groups (a mass and a force) there is no percentage.

use std::io::{self, Write};

use serde::Serialize;

use crate::math::Real;
use crate::model::Rig;
use crate::report::text::number;
use crate::report::CAUTION;
use crate::units::{Dimension, UnitSystem};

use super::table::{csv_number, write_human, write_human_sections, Format, Table};
use super::{figures, margin_cell, AskedQuantity, Figures, RigSource, StudyError};
use crate::report::text::capitalise;

/// The comparison: one [`Figures`] per column, grouped by the asked quantity; the first
/// column of each group is that group's reference.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Comparison {
    /// The columns, in the order given.
    pub columns: Vec<Figures>,
    /// Per column, the change of each figure against the first column of its group,
    /// percent.
    pub change_pct: Vec<Changes>,
    /// The groups of like columns, in order of first appearance.
    pub groups: Vec<Group>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the first rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
}

/// Columns that ask for the same quantity (and unit, of a drive or of a load alike).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Group {
    /// The asked quantity (the part of the group's first column).
    pub solve_for: AskedQuantity,
    /// Indices into `columns`, the first the group's reference.
    pub columns: Vec<usize>,
}

/// Changes against the first column of the group, percent (None where either value is missing or
/// the reference is zero).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Changes {
    /// Ideal value.
    pub ideal: Option<Real>,
    /// Forward value.
    pub forward: Option<Real>,
    /// Back value.
    pub back: Option<Real>,
    /// Forward efficiency.
    pub efficiency: Option<Real>,
    /// Friction at the drive, forward.
    pub friction_forward: Option<Real>,
    /// Friction at the drive, back.
    pub friction_back: Option<Real>,
    /// Largest span tension.
    pub largest_tension_n: Option<Real>,
    /// Lowest safety factor.
    pub lowest_safety_factor: Option<Real>,
    /// Largest fleet angle.
    pub largest_fleet_deg: Option<Real>,
    /// Smallest D/d.
    pub smallest_bend_ratio: Option<Real>,
}

/// Percent change of `x` against `reference`.
pub fn change_pct(x: Option<Real>, reference: Option<Real>) -> Option<Real> {
    let (x, r) = (x?, reference?);
    let c = (x - r) / r.abs() * 100.0;
    // Round-off differences show as no change rather than "-0.0 %".
    let c = if c.abs() < 1e-9 { 0.0 } else { c };
    (r != 0.0 && c.is_finite()).then_some(c)
}

/// Builds the comparison from labelled, solved rigs.
pub fn compare(columns: Vec<Figures>, units: UnitSystem) -> Comparison {
    let mut groups: Vec<Group> = Vec::new();
    for (i, f) in columns.iter().enumerate() {
        match groups.iter_mut().find(|g| g.solve_for.like(&f.solve_for)) {
            Some(g) => g.columns.push(i),
            None => groups.push(Group {
                solve_for: f.solve_for.clone(),
                columns: vec![i],
            }),
        }
    }
    let reference = |i: usize| {
        groups
            .iter()
            .find(|g| g.columns.contains(&i))
            .map(|g| &columns[g.columns[0]])
    };
    let change_pct = columns
        .iter()
        .enumerate()
        .map(|(i, c)| {
            let r = reference(i);
            let ch = |f: &dyn Fn(&Figures) -> Option<Real>| change_pct(f(c), r.and_then(f));
            Changes {
                ideal: ch(&|f| f.ideal),
                forward: ch(&|f| f.forward),
                back: ch(&|f| f.back),
                efficiency: ch(&|f| f.efficiency),
                friction_forward: ch(&|f| f.friction_forward),
                friction_back: ch(&|f| f.friction_back),
                largest_tension_n: ch(&|f| f.largest_tension_n),
                lowest_safety_factor: ch(&|f| f.lowest_safety_factor),
                largest_fleet_deg: ch(&|f| f.largest_fleet_deg),
                smallest_bend_ratio: ch(&|f| f.smallest_bend_ratio),
            }
        })
        .collect();
    Comparison {
        columns,
        change_pct,
        groups,
        caution: CAUTION,
        units,
    }
}

/// Solves each source as it is, labelled by its file name.
///
/// # Errors
/// The first rig that does not load or solve.
pub fn compare_rigs(sources: &[RigSource]) -> Result<Comparison, StudyError> {
    let mut columns = Vec::new();
    let mut units = None;
    for s in sources {
        let (rig, solution) = s.solve(&[])?;
        units.get_or_insert(rig.units);
        columns.push(figures(&label_of(&s.source), &rig, &solution));
    }
    Ok(compare(columns, units.unwrap_or_default()))
}

/// Solves the rig as written (column `base`) and then each of its variants.
///
/// # Errors
/// When the file has no variants, or one does not load or solve (named).
pub fn compare_variants(source: &RigSource) -> Result<Comparison, StudyError> {
    let variants = source.variants()?;
    if variants.is_empty() {
        return Err(StudyError::Input(format!(
            "{}: the rig has no `variants:` to compare; add e.g. `variants: {{rolling: [\"parts.head.bearing={{kind: rolling, bore: 10, mu: 0.0015}}\"]}}`",
            source.source
        )));
    }
    let (rig, solution) = source.solve(&[])?;
    let units = rig.units;
    let mut columns = vec![figures("base", &rig, &solution)];
    for v in &variants {
        let (rig, solution) = source
            .solve(&v.settings)
            .map_err(|e| StudyError::Input(format!("variant `{}`: {e}", v.name)))?;
        columns.push(figures(&v.name, &rig, &solution));
    }
    Ok(compare(columns, units))
}

/// The file name of a path, for a column heading.
pub fn label_of(source: &str) -> String {
    std::path::Path::new(source)
        .file_name()
        .map_or(source.to_string(), |f| f.to_string_lossy().into_owned())
}

fn dimension_of(quantity: &str) -> Dimension {
    match quantity {
        "mass" => Dimension::Mass,
        "torque" => Dimension::Torque,
        _ => Dimension::Force,
    }
}

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
    let quantities: Vec<&'static str> = c.columns.iter().map(|f| f.solve_for.quantity).collect();
    let asked = move |i: usize, x: Option<Real>| {
        crate::report::text::quantity(x, dimension_of(quantities[i]), &units)
    };
    let force =
        move |_: usize, x: Option<Real>| crate::report::text::quantity(x, Dimension::Force, &units);
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
    let chg = |f: &dyn Fn(&super::compare::Changes) -> Option<Real>| {
        c.change_pct.iter().map(f).collect::<Vec<_>>()
    };
    let unit = c.columns.first().map_or("N", |f| f.solve_for.unit);
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
    let checks: Vec<String> = c.columns.iter().map(|f| f.verdict.cell()).collect();
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
    Table { headers, rows }
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
    let rows = rows(c, &c.units)
        .into_iter()
        .map(|r| {
            let mut cells = vec![r.label.to_string(), r.unit.to_string()];
            match &r.csv_text {
                Some(text) => cells.extend(text.iter().cloned()),
                None => cells.extend(r.values.iter().map(|v| csv_number(*v))),
            }
            cells.extend(r.changes.iter().skip(1).map(|v| csv_number(*v)));
            cells
        })
        .collect();
    Table { headers, rows }
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
                csv_table(&c.group(g)).write_csv(w)?;
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
    let role = if g.solve_for.role == "load" {
        " (a load: forward is the most the drive moves)"
    } else {
        ""
    };
    format!("the {} at {}{role}", g.solve_for.quantity, parts.join(", "))
}

impl Comparison {
    /// The comparison of one group's columns alone (its changes are already against
    /// the group's first column).
    pub fn group(&self, g: &Group) -> Comparison {
        Comparison {
            columns: g.columns.iter().map(|&i| self.columns[i].clone()).collect(),
            change_pct: g
                .columns
                .iter()
                .map(|&i| self.change_pct[i].clone())
                .collect(),
            groups: vec![Group {
                solve_for: g.solve_for.clone(),
                columns: (0..g.columns.len()).collect(),
            }],
            caution: self.caution,
            units: self.units,
        }
    }

    /// Whether any column fails a check (the comparison exits 1, as `check` would).
    pub fn fails(&self) -> bool {
        self.columns.iter().any(|f| f.verdict.fails)
    }
}

/// Units of a rig (for callers that build a comparison by hand).
pub fn units_of(rig: &Rig) -> UnitSystem {
    rig.units
}

//! The table of the rope as a material (DESIGN.md §7): stretch, end tensions and sag
//! per span, after the span table.

use crate::solve::Case;
use crate::units::{Dimension, UnitSystem};

use super::super::{Report, SpanReport};
use super::{in_units, Align, CaseFilter, Cell, Style, Table, FIGURES};

/// The rope as a material (DESIGN.md §7), a table of its own after the spans: per
/// span, stretch per case where a rope gives `stiffness`, the tension at the span's end
/// per case and the sag where a rope gives `mass_per_length` (the span table has the
/// tension at its start). None for a rig without either key, which keeps today's tables.
pub fn material_table(
    report: &Report,
    units: &UnitSystem,
    cases: CaseFilter,
    style: Style,
) -> Option<Table> {
    let material = MaterialColumns::of(report);
    if !(material.stretch || material.weight) {
        return None;
    }
    let mut t = Table::new("Rope as a material");
    super::span_columns(&mut t, style);
    material.headers(&mut t, units, cases);
    for s in &report.spans {
        let mut row = vec![Cell::Text(s.line.clone()), Cell::Text(s.index.to_string())];
        match style {
            Style::Human => row.push(Cell::Text(format!("{} → {}", s.from, s.to))),
            Style::Data => {
                row.push(Cell::Text(s.from.clone()));
                row.push(Cell::Text(s.to.clone()));
            }
        }
        material.cells(&mut row, s, units, cases);
        t.rows.push(row);
    }
    Some(t)
}

/// The material columns appended to the span table `t` (rows in the report's span
/// order), for a spreadsheet: a CSV file holds one table, so there they are columns of
/// the span table rather than a table of their own.
pub fn append_material_columns(
    t: &mut Table,
    report: &Report,
    units: &UnitSystem,
    cases: CaseFilter,
) {
    let material = MaterialColumns::of(report);
    if !(material.stretch || material.weight) {
        return;
    }
    material.headers(t, units, cases);
    for (row, s) in t.rows.iter_mut().zip(&report.spans) {
        material.cells(row, s, units, cases);
    }
}

/// Which columns of the material table apply.
struct MaterialColumns {
    stretch: bool,
    weight: bool,
}

impl MaterialColumns {
    fn of(report: &Report) -> MaterialColumns {
        MaterialColumns {
            stretch: report.spans.iter().any(|s| s.stretch_m.is_some()),
            weight: report.spans.iter().any(|s| {
                s.sag_m.is_some()
                    || s.tension_n.ideal_end.is_some()
                    || s.tension_n.forward_end.is_some()
                    || s.tension_n.back_end.is_some()
            }),
        }
    }

    fn cases(cases: CaseFilter) -> Vec<Case> {
        [
            (cases.ideal(), Case::Ideal),
            (cases.forward(), Case::Forward),
            (cases.back(), Case::Back),
        ]
        .into_iter()
        .filter_map(|(shown, c)| shown.then_some(c))
        .collect()
    }

    fn headers(&self, t: &mut Table, units: &UnitSystem, cases: CaseFilter) {
        let (len, force) = (units.length.symbol, units.force.symbol);
        for c in Self::cases(cases) {
            if self.stretch {
                t.column(format!("stretch {} ({len})", c.name()), Align::Right);
            }
            if self.weight {
                t.column(
                    format!("tension {} at end ({force})", c.name()),
                    Align::Right,
                );
            }
        }
        if self.weight {
            t.column(format!("largest sag ({len})"), Align::Right);
        }
    }

    fn cells(&self, row: &mut Vec<Cell>, s: &SpanReport, units: &UnitSystem, cases: CaseFilter) {
        for c in Self::cases(cases) {
            if self.stretch {
                let stretch = s.stretch_m.as_ref().and_then(|p| match c {
                    Case::Ideal => p.ideal,
                    Case::Forward => p.forward,
                    Case::Back => p.back,
                });
                row.push(Cell::Number(
                    stretch.map(|v| units.from_si(v, Dimension::Length)),
                    FIGURES,
                ));
            }
            if self.weight {
                row.push(in_units(s.tension_n.ends(c).1, Dimension::Force, units));
            }
        }
        if self.weight {
            row.push(in_units(s.sag_m, Dimension::Length, units));
        }
    }
}

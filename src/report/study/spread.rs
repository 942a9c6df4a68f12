//! Writes a Monte Carlo spread ([`crate::study::spread`]): nominal value and
//! percentiles of each figure.

use std::io::{self, Write};

use crate::math::Real;
use crate::study::spread::{Percentiles, Spread};
use crate::units::Dimension;

use super::super::table::{csv_number, write_csv, Table};
use super::super::text::{capitalise, number, quantity};
use super::super::Format;
use super::{margin_cell, write_human, CsvUnit};

/// A row of the spread table: name, SI unit, dimension (none: a ratio shown in
/// percent), nominal value, percentiles.
type Row<'a> = (
    &'a str,
    &'a str,
    Option<Dimension>,
    Option<Real>,
    Option<Percentiles>,
);

/// Writes a spread.
///
/// # Errors
/// I/O errors of the writer.
pub fn write(w: &mut dyn Write, s: &Spread, format: Format) -> io::Result<()> {
    if format == Format::Json {
        let json = serde_json::to_string_pretty(s).map_err(io::Error::other)?;
        return writeln!(w, "{json}");
    }
    let d = s.solve_for.quantity.dimension();
    let si = s.solve_for.unit();
    let mut rows: Vec<Row> = vec![
        ("forward", si, Some(d), s.nominal_forward, s.forward),
        ("back", si, Some(d), s.nominal_back, s.back),
        (
            "largest tension",
            "N",
            Some(Dimension::Force),
            None,
            s.largest_tension_n,
        ),
    ];
    if s.margin.is_some() || s.nominal_verdict.margin.is_some() {
        rows.push(("margin", "1", None, s.nominal_verdict.margin, s.margin));
    }
    let mut t = Table::study();
    if format == Format::Csv {
        t.headers(
            ["figure", "unit", "nominal", "p5", "p50", "p95"]
                .map(String::from)
                .to_vec(),
        );
        for (name, unit, dim, nominal, p) in rows {
            let u = dim.map(|d| CsvUnit::new(s.csv_units.as_ref(), d, unit));
            let n = |x: Option<Real>| u.as_ref().map_or_else(|| csv_number(x), |u| u.number(x));
            t.text_row(vec![
                name.into(),
                u.as_ref().map_or(unit, |u| u.symbol).into(),
                n(nominal),
                n(p.map(|p| p.p5)),
                n(p.map(|p| p.p50)),
                n(p.map(|p| p.p95)),
            ]);
        }
        return write_csv(w, &t);
    }
    t.headers(
        ["", "nominal", "P5", "P50", "P95"]
            .map(String::from)
            .to_vec(),
    );
    for (name, _, dim, nominal, p) in rows {
        let q = |x| match dim {
            None => margin_cell(x),
            Some(dim) => quantity(x, dim, &s.units),
        };
        t.text_row(vec![
            name.into(),
            q(nominal),
            q(p.map(|p| p.p5)),
            q(p.map(|p| p.p50)),
            q(p.map(|p| p.p95)),
        ]);
    }
    let mut notes = vec![format!(
        "{} samples, seed {}; {} could not be solved.",
        s.samples, s.seed, s.failed
    )];
    if s.failed > 0 {
        notes.push(format!(
            "{} of {} samples could not be solved: the spread is incomplete, and exits 1 as a failing check does.",
            s.failed, s.samples
        ));
    }
    for i in &s.inputs {
        let u = if i.unit.is_empty() {
            String::new()
        } else {
            format!(" {}", i.unit)
        };
        notes.push(match i.distribution {
            "uniform" => format!(
                "`{}`: uniform from {}{u} to {}{u}",
                i.key,
                number(Some(i.parameters[0]), 4),
                number(Some(i.parameters[1]), 4)
            ),
            _ => format!(
                "`{}`: normal, mean {}{u}, sd {}{u}, truncated at zero",
                i.key,
                number(Some(i.parameters[0]), 4),
                number(Some(i.parameters[1]), 4)
            ),
        });
    }
    if let Some(share) = s.share_not_moving {
        notes.push(format!(
            "{} in {:.1} % of the samples.",
            capitalise(&s.not_moving),
            share * 100.0
        ));
    }
    if s.nominal_verdict.fails {
        notes.push(format!(
            "The nominal rig fails a check: {}.",
            s.nominal_verdict.failing.join(", ")
        ));
    }
    if let Some(share) = s.share_failing.filter(|&x| x > 0.0) {
        let codes: Vec<String> = s
            .failing_share
            .iter()
            .map(|(code, x)| format!("{code} in {:.1} %", x * 100.0))
            .collect();
        notes.push(format!(
            "A check fails in {:.1} % of the solved samples ({}); `reeve check` with the sample's values gives the details.",
            share * 100.0,
            codes.join(", ")
        ));
    }
    write_human(
        w,
        format,
        &format!(
            "Spread of the {} at `{}` over the ranged inputs",
            s.solve_for.quantity.name(),
            s.solve_for.part
        ),
        &t,
        &notes,
    )
}

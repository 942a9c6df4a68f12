//! Writes a sweep and a stroke ([`crate::study::sweep`]) as tables, and draws their
//! charts ([`super::super::chart`]).

use std::io::{self, Write};

use crate::math::Real;
use crate::report::Asked;
use crate::study::sweep::{Stroke, StrokeStep, Sweep, SweepStep};
use crate::study::Verdict;
use crate::units::Dimension;

use super::super::chart::{self, Panel, Series};
use super::super::table::{csv_number, write_csv, Table};
use super::super::text::{number, quantity};
use super::super::Format;
use super::{margin_cell, stalled_note, unsolved_note, verdict_cell, write_human, CsvUnit};

/// Whether any row has a margin (something given to compare with).
fn any_margin(verdicts: &[&Verdict]) -> bool {
    verdicts.iter().any(|v| v.margin.is_some())
}

/// The margin (where shown) and checks cells of a row; a row that could not be solved
/// has no checks.
fn verdict_cells(v: &Verdict, margin: bool, unsolved: bool) -> Vec<String> {
    let mut cells = Vec::new();
    if margin {
        cells.push(margin_cell(v.margin));
    }
    cells.push(if unsolved {
        "—".into()
    } else {
        verdict_cell(v)
    });
    cells
}

/// CSV headers of a verdict.
fn verdict_headers() -> [String; 5] {
    ["margin", "moves", "fails", "failing", "stalled"].map(String::from)
}

/// CSV cells of a verdict: margin, moves, fails, failing codes and stalled sheaves
/// (space-separated).
fn verdict_csv(v: &Verdict) -> [String; 5] {
    [
        csv_number(v.margin),
        v.moves.map_or(String::new(), |m| m.to_string()),
        v.fails.to_string(),
        v.failing.join(" "),
        v.stalled.join(" "),
    ]
}

fn value_heading(key: &str, unit: &str) -> String {
    if unit.is_empty() {
        key.to_string()
    } else {
        format!("{key} ({unit})")
    }
}

/// Writes a sweep.
///
/// # Errors
/// I/O errors of the writer.
pub fn write_sweep(w: &mut dyn Write, s: &Sweep, format: Format) -> io::Result<()> {
    if format == Format::Json {
        let json = serde_json::to_string_pretty(s).map_err(io::Error::other)?;
        return writeln!(w, "{json}");
    }
    let si = s.solve_for.as_ref().map_or("N", Asked::unit);
    let d = s
        .solve_for
        .as_ref()
        .map_or(Dimension::Force, |a| a.quantity.dimension());
    let mut t = Table::study();
    if format == Format::Csv {
        let u = CsvUnit::new(s.csv_units.as_ref(), d, si);
        let si = u.symbol;
        t.headers(vec![
            value_heading(&s.key, &s.unit),
            format!("ideal_{si}"),
            format!("forward_{si}"),
            format!("back_{si}"),
            "efficiency".into(),
            "error".into(),
        ]);
        t.headers(verdict_headers());
        for st in &s.steps {
            let mut row = vec![
                format!("{}", st.value),
                u.number(st.ideal),
                u.number(st.forward),
                u.number(st.back),
                csv_number(st.efficiency),
                st.error.clone().unwrap_or_default(),
            ];
            row.extend(verdict_csv(&st.verdict));
            t.text_row(row);
        }
        return write_csv(w, &t);
    }
    t.headers(vec![
        value_heading(&s.key, &s.unit),
        "ideal".into(),
        "forward".into(),
        "back".into(),
        "efficiency".into(),
    ]);
    let verdicts: Vec<&Verdict> = s.steps.iter().map(|st| &st.verdict).collect();
    let margins = any_margin(&verdicts);
    if margins {
        t.header("margin");
    }
    t.header("checks");
    let mut notes = Vec::new();
    for st in &s.steps {
        let q = |x| quantity(x, d, &s.units);
        let mut row = vec![
            number(Some(st.value), 4),
            q(st.ideal),
            q(st.forward),
            q(st.back),
            st.efficiency
                .map_or("—".into(), |e| format!("{:.1} %", e * 100.0)),
        ];
        row.extend(verdict_cells(&st.verdict, margins, st.error.is_some()));
        t.text_row(row);
        if let Some(e) = &st.error {
            notes.push(format!("at {} = {}: {e}", s.key, number(Some(st.value), 4)));
        }
    }
    notes.extend(stalled_note(
        verdicts.iter().filter(|v| !v.stalled.is_empty()).count(),
        verdicts.len(),
    ));
    notes.extend(unsolved_note(s.unsolved(), s.steps.len(), "sweep"));
    let title = match &s.solve_for {
        Some(a) => format!(
            "Sweep of `{}`: the {} at `{}`",
            s.key,
            a.quantity.name(),
            a.part
        ),
        None => format!("Sweep of `{}`", s.key),
    };
    write_human(w, format, &title, &t, &notes)
}

/// The chart of a sweep: ideal, forward and back against the varied value.
pub fn sweep_chart(s: &Sweep) -> String {
    let (qname, part) = s.solve_for.as_ref().map_or(("value", String::new()), |a| {
        (a.quantity.name(), a.part.clone())
    });
    let d = s
        .solve_for
        .as_ref()
        .map_or(Dimension::Force, |a| a.quantity.dimension());
    let unit = s.units.unit(d);
    let series = |name: &str, f: &dyn Fn(&SweepStep) -> Option<Real>| Series {
        name: name.to_string(),
        points: s
            .steps
            .iter()
            .map(|st| (st.value, f(st).map(|v| v / unit.si)))
            .collect(),
    };
    chart::svg(&[Panel {
        title: format!("Sweep of {}: the {qname} at {part}", s.key),
        x_label: value_heading(&s.key, &s.unit),
        y_label: format!("{qname} ({})", unit.symbol),
        series: vec![
            series("ideal", &|st| st.ideal),
            series("forward", &|st| st.forward),
            series("back", &|st| st.back),
        ],
    }])
}

fn travel_shown(s: &Stroke, t: Real) -> (Real, String) {
    if s.travel_unit == "rad" {
        (t.to_degrees(), "deg".to_string())
    } else {
        let u = s.units.span_length;
        (t / u.si, u.symbol.to_string())
    }
}

/// Writes a stroke.
///
/// # Errors
/// I/O errors of the writer.
pub fn write_stroke(w: &mut dyn Write, s: &Stroke, format: Format) -> io::Result<()> {
    if format == Format::Json {
        let json = serde_json::to_string_pretty(s).map_err(io::Error::other)?;
        return writeln!(w, "{json}");
    }
    let (qname, si) = s
        .solve_for
        .as_ref()
        .map_or(("value", "N"), |a| (a.quantity.name(), a.unit()));
    let d = s
        .solve_for
        .as_ref()
        .map_or(Dimension::Force, |a| a.quantity.dimension());
    let mut t = Table::study();
    if format == Format::Csv {
        let shown = s.csv_units.as_ref();
        let u = CsvUnit::new(shown, d, si);
        let force = CsvUnit::new(shown, Dimension::Force, "n");
        // An angle of a drum's travel stays in radians, as the JSON gives it.
        let (travel, travel_unit) = if s.travel_unit == "rad" {
            (CsvUnit::new(None, d, "rad"), "rad")
        } else {
            let t = CsvUnit::span(shown, "m");
            let symbol = t.symbol;
            (t, symbol)
        };
        t.headers(vec![
            format!("travel_{travel_unit}"),
            format!("forward_{}", u.symbol),
            format!("back_{}", u.symbol),
            "velocity_ratio".into(),
            "largest_fleet_deg".into(),
            format!("largest_tension_{}", force.symbol),
            "error".into(),
        ]);
        let spots = s.steps.iter().any(|st| st.available.is_some());
        if spots {
            t.headers(vec![format!("available_{}", u.symbol), "dead_spot".into()]);
        }
        t.headers(verdict_headers());
        for st in &s.steps {
            let mut row = vec![
                if s.csv_units.is_some() {
                    travel.number(Some(st.travel))
                } else {
                    format!("{}", st.travel)
                },
                u.number(st.forward),
                u.number(st.back),
                csv_number(st.velocity_ratio),
                csv_number(st.largest_fleet_deg),
                force.number(st.largest_tension_n),
                st.error.clone().unwrap_or_default(),
            ];
            if spots {
                row.push(u.number(st.available));
                row.push(st.dead_spot.unwrap_or_default().to_string());
            }
            row.extend(verdict_csv(&st.verdict));
            t.text_row(row);
        }
        return write_csv(w, &t);
    }
    let (_, tu) = travel_shown(s, 0.0);
    t.headers(vec![
        format!("travel ({tu})"),
        format!("{qname} forward"),
        "back".into(),
        "velocity ratio".into(),
        "largest fleet".into(),
        "largest tension".into(),
    ]);
    let verdicts: Vec<&Verdict> = s.steps.iter().map(|st| &st.verdict).collect();
    let margins = any_margin(&verdicts);
    // The available drive and the dead spots, where the drive's value is given and
    // something changes over the travel (DESIGN.md §7).
    let spots = s.steps.iter().any(|st| st.dead_spot.is_some());
    if spots {
        t.header("available");
        t.header("dead spot");
    }
    if margins {
        t.header("margin");
    }
    t.header("checks");
    let mut notes = Vec::new();
    for st in &s.steps {
        let (tv, _) = travel_shown(s, st.travel);
        let unsolved = st.forward.is_none() && st.error.is_some();
        let mut row = vec![
            number(Some(tv), 4),
            quantity(st.forward, d, &s.units),
            quantity(st.back, d, &s.units),
            number(st.velocity_ratio, 4),
            st.largest_fleet_deg
                .map_or("—".into(), |f| format!("{}°", number(Some(f), 3))),
            quantity(st.largest_tension_n, Dimension::Force, &s.units),
        ];
        if spots {
            row.push(quantity(st.available, d, &s.units));
            row.push(match st.dead_spot {
                Some("held") => "held: stops".to_string(),
                Some(other) => other.to_string(),
                None => String::new(),
            });
        }
        row.extend(verdict_cells(&st.verdict, margins, unsolved));
        t.text_row(row);
        if let Some(e) = &st.error {
            notes.push(format!(
                "at travel {} {tu}: {e}; the stroke stops here",
                number(Some(tv), 4)
            ));
        }
    }
    notes.extend(stalled_note(
        verdicts.iter().filter(|v| !v.stalled.is_empty()).count(),
        verdicts.len(),
    ));
    notes.extend(unsolved_note(s.unsolved(), s.steps.len(), "stroke"));
    write_human(
        w,
        format,
        &format!("Stroke of the drive `{}`", s.drive),
        &t,
        &notes,
    )
}

/// The chart of a stroke: effort, largest fleet angle and largest span tension against
/// travel, one panel each.
pub fn stroke_chart(s: &Stroke) -> String {
    let (qname, part) = s.solve_for.as_ref().map_or(("value", String::new()), |a| {
        (a.quantity.name(), a.part.clone())
    });
    let d = s
        .solve_for
        .as_ref()
        .map_or(Dimension::Force, |a| a.quantity.dimension());
    let unit = s.units.unit(d);
    let force = s.units.unit(Dimension::Force);
    let (_, tu) = travel_shown(s, 0.0);
    let series = |name: &str, f: &dyn Fn(&StrokeStep) -> Option<Real>| Series {
        name: name.to_string(),
        points: s
            .steps
            .iter()
            .map(|st| (travel_shown(s, st.travel).0, f(st)))
            .collect(),
    };
    let x_label = format!("travel of {} ({tu})", s.drive);
    chart::svg(&[
        Panel {
            title: format!("The {qname} at {part} through the stroke"),
            x_label: x_label.clone(),
            y_label: format!("{qname} ({})", unit.symbol),
            series: {
                let mut lines = vec![
                    series("forward", &|st| st.forward.map(|v| v / unit.si)),
                    series("back", &|st| st.back.map(|v| v / unit.si)),
                ];
                // The available drive, and its dead spots as marks on it.
                if s.steps.iter().any(|st| st.available.is_some()) {
                    lines.push(series("available", &|st| st.available.map(|v| v / unit.si)));
                    lines.push(series("dead spot: held", &|st| {
                        st.available
                            .filter(|_| st.dead_spot == Some("held"))
                            .map(|v| v / unit.si)
                    }));
                    lines.push(series("dead spot: runs back", &|st| {
                        st.available
                            .filter(|_| st.dead_spot == Some("runs-back"))
                            .map(|v| v / unit.si)
                    }));
                }
                lines
            },
        },
        Panel {
            title: "Largest fleet angle".into(),
            x_label: x_label.clone(),
            y_label: "fleet angle (deg)".into(),
            series: vec![series("largest fleet angle", &|st| st.largest_fleet_deg)],
        },
        Panel {
            title: "Largest span tension".into(),
            x_label,
            y_label: format!("tension ({})", force.symbol),
            series: vec![series("largest tension", &|st| {
                st.largest_tension_n.map(|v| v / force.si)
            })],
        },
    ])
}

//! Writes a ranking ([`crate::study::rank`]): the upgrade table and the friction
//! sensitivities.

use std::io::{self, Write};

use crate::math::Real;
use crate::study::rank::{RankRow, Ranking};
use crate::study::Verdict;

use super::super::table::{csv_number, write_csv, write_markdown_table, write_text_table, Table};
use super::super::text::{number, quantity};
use super::super::Format;
use super::{margin_cell, verdict_cell, write_human, CsvUnit};

/// Writes a ranking.
///
/// # Errors
/// I/O errors of the writer.
pub fn write(w: &mut dyn Write, r: &Ranking, format: Format) -> io::Result<()> {
    if format == Format::Json {
        let json = serde_json::to_string_pretty(r).map_err(io::Error::other)?;
        return writeln!(w, "{json}");
    }
    let d = r.solve_for.quantity.dimension();
    let si = r.solve_for.unit();
    let mut t = Table::study();
    let mut s = Table::study();
    if format == Format::Csv {
        let u = CsvUnit::new(r.csv_units.as_ref(), d, si);
        let si = u.symbol;
        t.headers(vec![
            "rank".into(),
            "part".into(),
            "kind".into(),
            format!("frictionless_{si}"),
            format!("frictionless_saved_{si}"),
            format!("frictionless_worse_by_{si}"),
            format!("alternative_{si}"),
            format!("alternative_saved_{si}"),
            format!("alternative_worse_by_{si}"),
            "note".into(),
            "frictionless_margin".into(),
            "frictionless_failing".into(),
            "alternative_margin".into(),
            "alternative_failing".into(),
        ]);
        let verdict_csv = |v: &Option<Verdict>| {
            [
                csv_number(v.as_ref().and_then(|v| v.margin)),
                v.as_ref().map_or(String::new(), |v| v.failing.join(" ")),
            ]
        };
        for (i, p) in r.parts.iter().enumerate() {
            let mut row = vec![
                (i + 1).to_string(),
                p.part.clone(),
                p.kind.into(),
                u.number(p.frictionless),
                u.number(p.frictionless_saved),
                u.number(p.frictionless_worse_by),
                u.number(p.alternative),
                u.number(p.alternative_saved),
                u.number(p.alternative_worse_by),
                p.note.clone().unwrap_or_default(),
            ];
            row.extend(verdict_csv(&p.frictionless_verdict));
            row.extend(verdict_csv(&p.alternative_verdict));
            t.text_row(row);
        }
        write_csv(w, &t)?;
        writeln!(w)?;
        s.headers(vec![
            "coefficient".into(),
            "value".into(),
            format!("saved_with_10pct_less_friction_{si}"),
            format!("worse_with_10pct_less_friction_{si}"),
            format!("derivative_{si}"),
            "elasticity".into(),
        ]);
        for x in &r.sensitivities {
            s.text_row(vec![
                x.key.clone(),
                format!("{}", x.value),
                u.number(x.saved_with_10pct_less_friction),
                u.number(x.worse_with_10pct_less_friction),
                u.number(x.derivative),
                csv_number(x.elasticity),
            ]);
        }
        return write_csv(w, &s);
    }
    let q = |x| quantity(x, d, &r.units);
    // A saving, or how much worse it is: never a negative saving.
    let saves = |saved: Option<Real>, worse: Option<Real>| match worse {
        Some(w) => format!("worse by {}", q(Some(w))),
        None => q(saved),
    };
    // Margins where something is given to compare with; a checks column where a row
    // fails a check or stalls a sheave.
    let margins = r.verdict.margin.is_some();
    let margin = |v: &Option<Verdict>| margin_cell(v.as_ref().and_then(|v| v.margin));
    let row_checks = |p: &RankRow| {
        let found: Vec<String> = [
            ("frictionless", &p.frictionless_verdict),
            ("alternative", &p.alternative_verdict),
        ]
        .into_iter()
        .filter_map(|(what, v)| {
            v.as_ref()
                .filter(|v| v.fails || !v.stalled.is_empty())
                .map(|v| format!("{what}: {}", verdict_cell(v)))
        })
        .collect();
        found.join("; ")
    };
    let checks = r.parts.iter().any(|p| !row_checks(p).is_empty());
    t.headers(vec![
        "rank".into(),
        "part".into(),
        "kind".into(),
        "frictionless".into(),
        "saves".into(),
    ]);
    if margins {
        t.header("margin");
    }
    if r.alternative.is_some() {
        t.header("alternative");
        t.header("saves");
        if margins {
            t.header("margin");
        }
    }
    if checks {
        t.header("checks");
    }
    let mut notes = vec![format!(
        "Forward {} at `{}` as written: {}{}; checks: {}.",
        r.solve_for.quantity.name(),
        r.solve_for.part,
        q(r.forward),
        r.verdict.margin.map_or(String::new(), |m| format!(
            " (margin {})",
            margin_cell(Some(m))
        )),
        verdict_cell(&r.verdict)
    )];
    if let Some(a) = &r.alternative {
        notes.push(format!("Alternative bearing: {a}."));
    }
    for (i, p) in r.parts.iter().enumerate() {
        let mut row = vec![
            (i + 1).to_string(),
            p.part.clone(),
            p.kind.into(),
            q(p.frictionless),
            saves(p.frictionless_saved, p.frictionless_worse_by),
        ];
        if margins {
            row.push(margin(&p.frictionless_verdict));
        }
        if r.alternative.is_some() {
            row.push(q(p.alternative));
            row.push(saves(p.alternative_saved, p.alternative_worse_by));
            if margins {
                row.push(margin(&p.alternative_verdict));
            }
        }
        if checks {
            let c = row_checks(p);
            row.push(if c.is_empty() { "ok".into() } else { c });
        }
        t.text_row(row);
        if let Some(n) = &p.note {
            notes.push(format!("`{}`: {n}", p.part));
        }
    }
    let worse: Vec<String> = r
        .parts
        .iter()
        .filter(|p| p.alternative_worse_by.is_some())
        .map(|p| format!("`{}`", p.part))
        .collect();
    if !worse.is_empty() {
        notes.push(format!(
            "The alternative is worse than the bearing as written at {}: it is no upgrade there.",
            worse.join(", ")
        ));
    }
    notes.push(String::new());
    notes.push(format!(
        "What 10 % less friction at each coefficient saves (the ranking's measure: the forward {} with that friction cut, against the rig as written):",
        r.solve_for.quantity.name()
    ));
    s.headers(vec!["coefficient".into(), "value".into(), "saves".into()]);
    for x in &r.sensitivities {
        s.text_row(vec![
            x.key.clone(),
            number(Some(x.value), 4),
            saves(
                x.saved_with_10pct_less_friction,
                x.worse_with_10pct_less_friction,
            ),
        ]);
    }
    let mut buf = Vec::new();
    if format == Format::Markdown {
        write_markdown_table(&mut buf, &s)?;
    } else {
        write_text_table(&mut buf, &s)?;
    }
    notes.push(String::from_utf8_lossy(&buf).trim_end().to_string());
    notes.push(
        "10 % less friction: a coefficient μ times 0.9; a rated sheave's loss K − 1 times 0.9 (for an efficiency η, K = 1/η); a rope's bend loss β times 0.9. Derivatives and elasticities are in the JSON."
            .into(),
    );
    write_human(
        w,
        format,
        &format!(
            "Upgrade ranking: the forward {} at `{}`, each part alone made frictionless",
            r.solve_for.quantity.name(),
            r.solve_for.part
        ),
        &t,
        &notes,
    )
}

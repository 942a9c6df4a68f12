//! The HTML report of `reeve report`: one self-contained file (no scripts, fonts or
//! network) holding the summary, the drawing inline, the span and part tables, the
//! loss breakdown as a bar chart, drum torques, warnings, the method notes with their
//! published sources, and the caution. A print stylesheet lays it out for paper; a
//! viewport tag and scrolling table boxes make it read on a phone.

use std::io::{self, Write};

use crate::math::Real;
use crate::model::Rig;
use crate::solve::Solution;
use crate::units::{Dimension, UnitSystem};

use super::escape::xml as esc;
use super::svg::{self, DrawOptions};
use super::table::{self, Align, CaseFilter, Style, Table, TableChoice};
use super::text::quantity;
use super::{Headline, Report, CAUTION};

/// Escaped text with its `code` spans (between backticks) as `<code>` elements.
pub fn code_spans(escaped: &str) -> String {
    let mut out = String::with_capacity(escaped.len() + 16);
    let mut parts = escaped.split('`');
    if let Some(first) = parts.next() {
        out.push_str(first);
    }
    let rest: Vec<&str> = parts.collect();
    // An odd backtick left over is text, not the start of a span.
    let pairs = rest.len() / 2 * 2;
    for (i, part) in rest.iter().enumerate() {
        if i >= pairs {
            out.push('`');
            out.push_str(part);
        } else if i % 2 == 0 {
            out.push_str("<code>");
            out.push_str(part);
            out.push_str("</code>");
        } else {
            out.push_str(part);
        }
    }
    out
}

const STYLE: &str = r#"
:root { --ink: #1d1d1f; --muted: #5b5b60; --rule: #d6d6da; --accent: #1f4e9c; --bad: #b00000; --warn: #9a5b00; }
* { box-sizing: border-box; }
body { margin: 0; padding: 1rem; font: 15px/1.45 system-ui, -apple-system, "Segoe UI", Roboto, "DejaVu Sans", sans-serif; color: var(--ink); background: #fff; }
main { max-width: 1100px; margin: 0 auto; }
h1 { font-size: 1.55rem; margin: 0.2rem 0 0.3rem; }
h2 { font-size: 1.2rem; margin: 1.8rem 0 0.6rem; border-bottom: 1px solid var(--rule); padding-bottom: 0.2rem; }
.meta { color: var(--muted); margin: 0 0 1rem; }
.table-scroll { overflow-x: auto; -webkit-overflow-scrolling: touch; border: 1px solid var(--rule); border-radius: 4px; }
table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; }
th, td { padding: 0.3rem 0.55rem; border-bottom: 1px solid var(--rule); white-space: nowrap; }
th { background: #f3f4f6; text-align: left; font-weight: 600; }
td.num, th.num { text-align: right; }
tbody tr:nth-child(even) { background: #fafafb; }
table.summary { width: auto; }
table.summary th[scope=row] { background: none; font-weight: 600; }
figure { margin: 0; }
figure svg { display: block; width: 100%; height: auto; max-width: 1000px; }
figcaption { color: var(--muted); font-size: 0.9rem; margin-top: 0.3rem; }
.bars { max-width: 760px; }
.loss { margin: 0 0 0.55rem; }
.loss-label { display: flex; flex-wrap: wrap; justify-content: space-between; gap: 0 1rem; font-size: 0.92rem; }
.loss-value { color: var(--muted); font-variant-numeric: tabular-nums; }
.bar-track { background: #eef0f3; border-radius: 3px; height: 0.9rem; }
.bar { background: var(--accent); height: 100%; border-radius: 3px; min-width: 2px; }
.table-scroll.fit { display: inline-block; max-width: 100%; }
ul.warnings { padding-left: 1.2rem; }
.tag { display: inline-block; font-size: 0.75rem; font-weight: 700; padding: 0 0.35rem; border-radius: 3px; color: #fff; margin-right: 0.4rem; }
.tag.fail { background: var(--bad); }
.tag.warn { background: var(--warn); }
.ok { color: #1f6f3f; font-weight: 600; }
.bad { color: var(--bad); font-weight: 600; }
dl.methods dt { font-weight: 600; margin-top: 0.7rem; }
dl.methods dd { margin: 0.2rem 0 0 1rem; }
.caution { margin-top: 2rem; padding: 0.8rem 1rem; border-left: 4px solid var(--warn); background: #fff8ec; }
@media (max-width: 700px) {
  body { padding: 0.6rem; font-size: 14px; }
  h1 { font-size: 1.3rem; }
  .table-scroll.fit { display: block; }
}
@media print {
  @page { margin: 14mm; }
  body { padding: 0; font-size: 10pt; }
  main { max-width: none; }
  .table-scroll { overflow: visible; border: none; }
  /* An A4 page inside 14 mm margins is 182 mm wide: the 16-column parts table fits
     with narrow padding and directions wrapping at their commas. */
  th, td { padding: 0.1rem 0.15rem; white-space: normal; }
  table.data { font-size: 7.5pt; }
  figure, .loss, table.summary, .caution { break-inside: avoid; }
  tr { break-inside: avoid; }
  h2 { break-after: avoid; }
  figure svg { max-width: 100%; max-height: 130mm; border: none; }
  .bar, .tag, th { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
"#;

/// The method notes: what each friction model is and where it is published.
const METHODS: &[(&str, &str)] = &[
    (
        "Rope on a non-turning surface: capstan equation (Euler–Eytelwein)",
        "T_tight / T_slack = exp(μ′ (φ + 2πn)), with μ′ = μ / sin(β/2) in a V-groove of \
included angle β. Used for guides, pins, carabiners, stalled sheaves and the drum slip \
check. Published by L. Euler (1762) and J. A. Eytelwein (1808); treated as belt friction \
in statics texts, e.g. F. P. Beer and E. R. Johnston, Vector Mechanics for Engineers: \
Statics, chapter 8 (Friction), section \"Belt Friction\", and J. L. Meriam and \
L. G. Kraige, Engineering Mechanics: Statics, chapter on friction (flexible belts).",
    ),
    (
        "Sheave on a plain bearing: friction circle",
        "The pin reaction passes tangent to the friction circle of radius r_f = r sin(atan μ); \
the moment balance (T_tight − T_slack) R = r_f |F_pin| gives the tension ratio \
k = b + √(b² − 1), b = (1 − ρ² cos φ) / (1 − ρ²), ρ = r_f / R. Axle (journal) friction \
as in Beer and Johnston, chapter 8, section \"Journal Bearings. Axle Friction\".",
    ),
    (
        "Sheave on a rolling bearing: constant-coefficient catalogue model",
        "Friction moment M = μ_b |F_pin| d_bore / 2, i.e. r_f = μ_b d_bore / 2, then as for \
the friction circle. The simplified friction moment of rolling-bearing makers' general \
catalogues (a constant coefficient per bearing type, M = 0.5 μ P d, about 0.0015 for an \
open deep groove ball bearing), as presented in bearing-design texts, e.g. Harnoy, Bearing \
Design in Machinery, chapter on rolling-element bearings (friction).",
    ),
    (
        "Rated sheaves and multi-part tackle: wire-rope handbook reeving efficiency",
        "A sheave rated at efficiency η (bearing factor K = 1/η) at 180° wrap is modelled with \
ρ = (K − 1)/(K + 1). For N parts and S sheaves the handbook reeving efficiency is \
E = (K^N − 1) / (K^S N (K − 1)), and the general solver reproduces it for the matching \
rig. See e.g. the Wire Rope Users Manual (Wire Rope Technical Board) and rope makers' \
handbooks on reeving efficiency.",
    ),
    (
        "Rope bending loss",
        "The rope's own stiffness costs a fraction β (the rope's bend_loss, default 0) of \
tension at each passage over a turning sheave, whatever the wrap: the rope bends on and \
off once. With the rope running from the tight side to the slack side, T_slack = (1 − β) \
times the tension the bearing model alone would leave. Basis: K. Feyrer, Wire Ropes: \
Tension, Endurance, Reliability (Springer), on the efficiency of rope sheaves (bending at \
the run-on and run-off points plus bearing friction); rope-rescue measurements comparing \
one 180° deflection with two 90° deflections over the same pulleys (T. Pöysti, \
\"Line deviation and pulley efficiency\", 2020).",
    ),
    (
        "Sheaves at fleet angles: 3-D pin loads",
        "Where spans leave a sheave's plane, the pin load P = T_t u_t + T_s u_s (+ the \
sheave's weight) splits by the axle n into a radial part |P − (P·n) n|, which loads the \
journal: (T_t − T_s) R = r_f |P_radial|, and an axial part P·n (the axial load), carried \
by the sheave's cheeks or a thrust face, whose friction μ r_eff |P·n| joins the moment \
balance where the sheave has one.",
    ),
    (
        "Drum shafts: thrust (pivot and collar) friction",
        "M_thrust = μ W r_eff with r_eff = (2/3)(Ro³ − Ri³)/(Ro² − Ri²) for uniform pressure \
(new surfaces) and r_eff = (Ro + Ri)/2 for uniform wear (run-in surfaces); a conical \
pivot of half-angle α (the file's cone_angle: half the pivot's included angle) divides \
by sin α. As in Beer and Johnston, chapter 8, section \"Thrust \
Bearings. Disk Friction\", and in machine-design texts on disc clutches, e.g. Shigley's Mechanical \
Engineering Design (clutches and brakes: uniform wear and uniform pressure).",
    ),
    (
        "Rope as a material",
        "Where a rope gives `stiffness` (EA), each span stretches by its mean tension times its \
length over EA (Gere and Goodno, Mechanics of Materials, section 2.3); lines that share a \
block split its load so that their stretches match as the block moves rigidly (equilibrium \
plus compatibility, section 2.4). The spring rate at the drive holds every loaded part and \
lets the ropes stretch; the lost travel is the drive's ideal value over that rate \
(Castigliano's theorem, section 9.9, is its check). Where a rope gives `mass_per_length`, the \
tension along each span grows by the weight per length times the rise, the weight across \
the span hangs half on each end, and the sag is the catenary's (Meriam and Kraige, \
Engineering Mechanics: Statics, section 5/9 on flexible cables; the parabola is its check).",
    ),
    (
        "Solver",
        "Quasi-static: kinematics from the inextensible lines, then equilibrium of every block, \
weight and drum for three cases: ideal (no friction), forward (the drive moves the load) \
and back (the load drives back), with friction reversing between forward and back. An \
energy audit (drive power = load power + losses) checks every solution and gives the loss \
breakdown. Gravity is standard gravity, 9.806 65 m/s².",
    ),
];

fn write_table(w: &mut dyn Write, table: &Table, id: &str) -> io::Result<()> {
    writeln!(
        w,
        "<div class=\"table-scroll\"><table id=\"{id}\" class=\"data\"><thead><tr>"
    )?;
    for c in &table.columns {
        let class = match c.align {
            Align::Right => " class=\"num\"",
            Align::Left => "",
        };
        write!(w, "<th scope=\"col\"{class}>{}</th>", esc(&c.header))?;
    }
    writeln!(w, "</tr></thead><tbody>")?;
    for row in &table.rows {
        write!(w, "<tr>")?;
        for (cell, c) in row.iter().zip(&table.columns) {
            let class = match c.align {
                Align::Right => " class=\"num\"",
                Align::Left => "",
            };
            write!(w, "<td{class}>{}</td>", esc(&cell.text()))?;
        }
        writeln!(w, "</tr>")?;
    }
    writeln!(w, "</tbody></table></div>")
}

fn percent(x: Option<Real>) -> String {
    match x {
        Some(v) if v.is_finite() => format!("{:.1} %", v * 100.0),
        _ => "—".to_string(),
    }
}

fn write_summary(w: &mut dyn Write, h: &Headline, units: &UnitSystem, id: &str) -> io::Result<()> {
    let dim = h.solve_for.quantity.dimension();
    let q = |x| esc(&quantity(x, dim, units));
    writeln!(
        w,
        "<p>Asked: the <strong>{}</strong> at <code>{}</code>; drive: <code>{}</code>.</p>",
        esc(h.solve_for.quantity.name()),
        esc(&h.solve_for.part),
        esc(&h.drive)
    )?;
    if let Some(note) = &h.solve_for.note {
        writeln!(w, "<p class=\"meta\">{}.</p>", esc(note))?;
    }
    writeln!(
        w,
        "<div class=\"table-scroll fit\"><table id=\"{id}\" class=\"summary\"><thead><tr><th scope=\"col\"></th><th scope=\"col\" class=\"num\">ideal</th><th scope=\"col\" class=\"num\">forward</th><th scope=\"col\" class=\"num\">back</th></tr></thead><tbody>"
    )?;
    writeln!(
        w,
        "<tr><th scope=\"row\">{}</th><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>",
        esc(h.solve_for.quantity.name()),
        q(h.ideal.value),
        q(h.forward.value),
        q(h.back.value)
    )?;
    writeln!(
        w,
        "<tr><th scope=\"row\">efficiency</th><td class=\"num\"></td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>",
        percent(h.forward.efficiency),
        percent(h.back.efficiency)
    )?;
    writeln!(
        w,
        "<tr><th scope=\"row\">friction</th><td class=\"num\"></td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>",
        q(h.friction_forward),
        q(h.friction_back)
    )?;
    writeln!(w, "</tbody></table></div>")?;
    writeln!(w, "<ul>")?;
    for note in h.efficiency_notes() {
        writeln!(w, "<li>{}</li>", esc(&note))?;
    }
    if let (Some(vr), ma) = h.ratio_words(units) {
        write!(w, "<li>Velocity ratio {}", esc(&vr))?;
        if let Some(p) = &h.load_part {
            write!(w, " (drive speed over <code>{}</code> speed)", esc(p))?;
        }
        if let Some(ma) = ma {
            write!(w, "; mechanical advantage {}", esc(&ma))?;
        }
        writeln!(w, ".</li>")?;
    }
    let [lo, hi] = h.holding_band;
    writeln!(
        w,
        "<li>Holding band: friction alone holds the rig still between {} and {}.</li>",
        q(lo),
        q(hi)
    )?;
    writeln!(w, "<li>{}.</li>", h.self_locking_words())?;
    if let Some((travel, rate)) = super::text::drive_spring_words(h, units) {
        writeln!(
            w,
            "<li>Lost travel at the drive: {} (spring rate {}, loaded parts held, no friction).</li>",
            esc(&travel),
            esc(&rate)
        )?;
    }
    if let Some((sentence, moves)) = super::text::outcome(h, units) {
        writeln!(
            w,
            "<li><span class=\"{}\">{}</span></li>",
            if moves { "ok" } else { "bad" },
            code_spans(&esc(&sentence))
        )?;
    }
    writeln!(w, "</ul>")
}

/// Writes the whole HTML report.
///
/// # Errors
/// Only those of `w`.
pub fn write_html(
    w: &mut dyn Write,
    rig: &Rig,
    solution: &Solution,
    report: &Report,
    options: &DrawOptions,
    source: &str,
) -> io::Result<()> {
    let units = &rig.units;
    writeln!(
        w,
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">"
    )?;
    writeln!(
        w,
        "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">"
    )?;
    writeln!(
        w,
        "<meta name=\"generator\" content=\"reeve {}\">",
        env!("CARGO_PKG_VERSION")
    )?;
    writeln!(w, "<title>{} — reeve report</title>", esc(&report.title))?;
    writeln!(w, "<style>{STYLE}</style>\n</head>\n<body>\n<main>")?;
    writeln!(w, "<h1>{}</h1>", esc(&report.title))?;
    writeln!(
        w,
        "<p class=\"meta\">Rig file <code>{}</code> · units: {} · {} · reeve {}</p>",
        esc(source),
        esc(&table::units_line(units)),
        esc(&options.date),
        env!("CARGO_PKG_VERSION")
    )?;

    writeln!(w, "<section id=\"summary\">\n<h2>Summary</h2>")?;
    write_summary(w, &report.headline, units, "summary-table")?;
    for (i, sub) in report.subrigs.iter().enumerate() {
        writeln!(
            w,
            "<h3>Independent sub-rig driven by <code>{}</code></h3>",
            esc(&sub.drive)
        )?;
        write_summary(w, sub, units, &format!("summary-table-{}", i + 1))?;
    }
    let fails = report.warnings.iter().filter(|w| w.fails).count();
    writeln!(
        w,
        "<p>Checks: {}.</p>\n</section>",
        if report.warnings.is_empty() {
            "<span class=\"ok\">no warnings</span>".to_string()
        } else if fails > 0 {
            format!(
                "<span class=\"bad\">{fails} failing</span>, {} warning(s) in all (see Warnings)",
                report.warnings.len()
            )
        } else {
            format!("{} warning(s) (see Warnings)", report.warnings.len())
        }
    )?;

    writeln!(w, "<section id=\"drawing\">\n<h2>Drawing</h2>\n<figure>")?;
    let drawing = svg::render(rig, solution, report, options);
    w.write_all(drawing.as_bytes())?;
    writeln!(
        w,
        "<figcaption>Drawn at the scale in its title block (on the sheet printed at full size); spans coloured and labelled by forward tension; parts with warnings ringed in red.</figcaption>\n</figure>\n</section>"
    )?;

    let tables = table::tables(
        report,
        units,
        CaseFilter::All,
        TableChoice::Both,
        Style::Human,
    );
    writeln!(w, "<section id=\"span-table\">\n<h2>Spans</h2>")?;
    if let Some(t) = tables.first() {
        write_table(w, t, "spans")?;
    }
    writeln!(w, "</section>\n<section id=\"part-table\">\n<h2>Parts</h2>")?;
    if let Some(t) = tables.get(1) {
        // The axial loads are listed under the losses: the part table fits a page.
        write_table(w, &t.without_columns("axial load"), "parts")?;
    }
    writeln!(
        w,
        "<p class=\"meta\">Pin load: the resultant of the rope pulls and the part's own weight; direction as a unit vector (x, y, z) in the rig's frame. Loss share: this part's part of all friction losses, forward case. Where shown, bend loss share: the part of all losses that the rope's bending takes there; axial loads, the pin loads along the parts' axles, are listed under the losses.</p>\n</section>"
    )?;
    if let Some(t) = table::material_table(report, units, table::CaseFilter::Forward, Style::Human)
    {
        writeln!(
            w,
            "<section id=\"material-table\">\n<h2>Rope as a material</h2>"
        )?;
        write_table(w, &t, "material")?;
        writeln!(
            w,
            "<p class=\"meta\">Forward case. Stretch: mean tension × length / EA. Tension at end: where the rope's weight makes the span's ends differ (the span table shows the tension at its start). Sag: the catenary's largest vertical distance below the chord, the largest over the cases (the slackest case), for spans within 45° of level.</p>\n</section>"
        )?;
    }

    // Loss breakdown, forward.
    writeln!(
        w,
        "<section id=\"losses\">\n<h2>Where the losses go (forward)</h2>"
    )?;
    let mut losses: Vec<_> = report
        .parts
        .iter()
        .filter(|p| p.loss_share.unwrap_or(0.0) > 0.0)
        .collect();
    losses.sort_by(|a, b| {
        b.loss_share
            .unwrap_or(0.0)
            .total_cmp(&a.loss_share.unwrap_or(0.0))
    });
    if losses.is_empty() {
        writeln!(w, "<p>No friction losses.</p>")?;
    } else {
        writeln!(w, "<div class=\"bars\" role=\"list\">")?;
        for p in &losses {
            let share = p.loss_share.unwrap_or(0.0).clamp(0.0, 1.0);
            writeln!(
                w,
                "<div class=\"loss\" role=\"listitem\"><div class=\"loss-label\"><span><code>{}</code> <small>{}</small></span><span class=\"loss-value\">{} of losses · {} of input</span></div><div class=\"bar-track\"><div class=\"bar\" style=\"width: {:.1}%\"></div></div></div>",
                esc(&p.name),
                esc(p.kind),
                percent(p.loss_share),
                percent(p.loss_of_input),
                share * 100.0
            )?;
        }
        writeln!(w, "</div>")?;
    }
    if let Some(kinds) = report.headline.loss.words(units) {
        writeln!(w, "<p>By kind, at the drive: {}.</p>", esc(&kinds))?;
    }
    if let Some(axial) = super::loss::axial_words(report, units) {
        writeln!(
            w,
            "<p>Axial pin loads (forward, along each axle): {}.</p>",
            esc(&axial)
        )?;
    }
    writeln!(w, "</section>")?;

    if !report.drums.is_empty() {
        let t = |x| esc(&quantity(x, Dimension::Torque, units));
        writeln!(
            w,
            "<section id=\"drums\">\n<h2>Drum torques (forward)</h2>\n<div class=\"table-scroll\"><table class=\"data\"><thead><tr><th scope=\"col\">drum</th><th scope=\"col\" class=\"num\">rope</th><th scope=\"col\" class=\"num\">load</th><th scope=\"col\" class=\"num\">drag</th><th scope=\"col\" class=\"num\">journal</th><th scope=\"col\" class=\"num\">thrust</th><th scope=\"col\" class=\"num\">margin</th></tr></thead><tbody>"
        )?;
        for d in &report.drums {
            writeln!(
                w,
                "<tr><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>",
                esc(&d.name),
                t(d.rope_torque_nm.forward),
                t(d.load_torque_nm),
                t(d.drag_nm),
                t(d.journal_nm.forward),
                t(d.thrust_nm),
                t(d.margin_nm)
            )?;
        }
        writeln!(w, "</tbody></table></div>\n</section>")?;
    }

    writeln!(w, "<section id=\"warnings\">\n<h2>Warnings</h2>")?;
    if report.warnings.is_empty() {
        writeln!(w, "<p>No warnings: every check passes.</p>")?;
    } else {
        writeln!(w, "<ul class=\"warnings\">")?;
        for warning in &crate::checks::grouped(&report.warnings) {
            let (class, tag) = if warning.fails {
                ("fail", "FAIL")
            } else {
                ("warn", "warn")
            };
            // Name the part only where the message does not already.
            let at = warning
                .part
                .as_deref()
                .filter(|p| !warning.message.contains(&format!("`{p}`")))
                .map(|p| format!(" at <code>{}</code>", esc(p)))
                .unwrap_or_default();
            writeln!(
                w,
                "<li><span class=\"tag {class}\">{tag}</span><code>{}</code>{at}: {}</li>",
                esc(warning.code),
                code_spans(&esc(&warning.message))
            )?;
        }
        writeln!(w, "</ul>")?;
    }
    writeln!(w, "</section>")?;

    super::motion::write_html_section(w, rig)?;

    writeln!(
        w,
        "<section id=\"methods\">\n<h2>Methods and sources</h2>\n<dl class=\"methods\">"
    )?;
    for (title, text) in METHODS {
        writeln!(w, "<dt>{}</dt><dd>{}</dd>", esc(title), esc(text))?;
    }
    writeln!(w, "</dl>\n</section>")?;
    writeln!(
        w,
        "<p class=\"caution\" id=\"caution\"><strong>{}</strong></p>",
        esc(CAUTION)
    )?;
    writeln!(w, "</main>\n</body>\n</html>")
}

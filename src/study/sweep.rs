//! `sweep`: the asked quantity and efficiency as one value of the rig file steps from
//! one end of a range to the other ([`sweep`]), or as the drive moves the rig through
//! its travel ([`stroke`]).
//!
//! The stroke integrates the kinematics: with the drive at unit forward speed,
//! `Solution::kinematics.forward` gives every degree of freedom's speed, so each
//! translating part (block, weight, haul end, and every sheave a block carries) moves
//! by `direction × speed × dt`; drums only turn, which changes no geometry. Each step is
//! split into sub-steps taken by the midpoint rule, re-solving the geometry at every
//! evaluation. A step where the rig cannot be solved (a point enters a sheave, the
//! geometry fails, a span goes slack) is reported and ends the stroke.

use std::io::{self, Write};

use serde::Serialize;

use crate::math::Real;
use crate::model::Rig;
use crate::report::text::{number, quantity};
use crate::report::{finite, CAUTION};
use crate::solve::kinematics::Motion;
use crate::solve::Solution;
use crate::units::{parse_quantity, Dimension, UnitSystem};

use super::plot::{self, Panel, Series};
use super::table::{csv_number, write_human, Format, Table};
use super::{
    largest_fleet_deg, largest_tension, margin_cell, number_and_unit, stalled_note, with_unit,
    AskedQuantity, RigSource, StudyError, Verdict,
};

/// A value to vary: `KEY=FROM..TO`, the bounds in the unit written (or the file's).
#[derive(Debug, Clone, PartialEq)]
pub struct Vary {
    /// Key path, as `--set` takes it.
    pub key: String,
    /// First value.
    pub from: Real,
    /// Last value.
    pub to: Real,
    /// Unit written after the numbers (empty: the file's unit or a plain number).
    pub unit: String,
}

/// Reads `KEY=FROM..TO` (`parts.head.bearing.mu=0.05..0.2`,
/// `parts.hook.load.mass=400 kg..900 kg` or `=400..900 kg`).
///
/// # Errors
/// [`StudyError::Input`] saying what was expected.
pub fn parse_vary(text: &str) -> Result<Vary, StudyError> {
    let bad = || {
        StudyError::Input(format!(
            "--vary `{text}`: expected KEY=FROM..TO, e.g. parts.head.bearing.mu=0.05..0.2 or parts.hook.load.mass=400..900 kg"
        ))
    };
    let (key, range) = text.split_once('=').ok_or_else(bad)?;
    let (a, b) = range.split_once("..").ok_or_else(bad)?;
    let (from, ua) = number_and_unit(a).ok_or_else(bad)?;
    let (to, ub) = number_and_unit(b).ok_or_else(bad)?;
    let unit = match (ua.as_str(), ub.as_str()) {
        (x, y) if x == y => ua.clone(),
        ("", _) => ub.clone(),
        _ => {
            return Err(StudyError::Input(format!(
                "--vary `{text}`: the two ends must use the same unit, found `{ua}` and `{ub}`"
            )))
        }
    };
    let key = key.trim();
    if key.is_empty() {
        return Err(bad());
    }
    Ok(Vary {
        key: key.to_string(),
        from,
        to,
        unit,
    })
}

/// `n` evenly spaced values from `from` to `to`, both ends included (one value: `from`).
pub fn steps_between(from: Real, to: Real, n: usize) -> Vec<Real> {
    match n {
        0 => Vec::new(),
        1 => vec![from],
        _ => (0..n)
            .map(|i| {
                if i == n - 1 {
                    to
                } else {
                    from + (to - from) * i as Real / (n - 1) as Real
                }
            })
            .collect(),
    }
}

/// One step of a sweep. Values SI.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct SweepStep {
    /// The varied value, in the written unit.
    pub value: Real,
    /// Ideal value of the asked quantity.
    pub ideal: Option<Real>,
    /// Forward value.
    pub forward: Option<Real>,
    /// Back value.
    pub back: Option<Real>,
    /// Forward efficiency.
    pub efficiency: Option<Real>,
    /// Why this step has no values.
    pub error: Option<String>,
    /// What `check` concludes about this step (empty where it could not be solved).
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// A parameter sweep.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Sweep {
    /// The varied key.
    pub key: String,
    /// Unit of the varied values as written (empty: the file's unit or a ratio).
    pub unit: String,
    /// The asked quantity (from the first step that solved).
    pub solve_for: Option<AskedQuantity>,
    /// The steps.
    pub steps: Vec<SweepStep>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
}

impl Sweep {
    /// Whether any step fails a check (the sweep exits 1, as `check` would).
    pub fn fails(&self) -> bool {
        self.steps.iter().any(|s| s.verdict.fails)
    }
}

impl Stroke {
    /// Whether any step fails a check (the stroke exits 1, as `check` would).
    pub fn fails(&self) -> bool {
        self.steps.iter().any(|s| s.verdict.fails)
    }
}

/// Sweeps one value over `steps` evenly spaced steps.
///
/// # Errors
/// When the rig does not load as written, or both ends are equal over more than one
/// step. Steps that fail carry their error.
pub fn sweep(source: &RigSource, vary: &Vary, steps: usize) -> Result<Sweep, StudyError> {
    if vary.from == vary.to && steps > 1 {
        return Err(StudyError::Input(format!(
            "--vary `{}`: both ends are {}, so every step would be the same rig: nothing to sweep (give two different ends, or --steps 1)",
            vary.key,
            with_unit(vary.from, &vary.unit)
        )));
    }
    let units = source.load(&[])?.units;
    let mut solve_for = None;
    let mut out = Vec::new();
    for value in steps_between(vary.from, vary.to, steps) {
        let setting = (vary.key.clone(), with_unit(value, &vary.unit));
        match source.solve(&[setting]) {
            Ok((rig, solution)) => {
                let main = solution.main();
                solve_for.get_or_insert_with(|| AskedQuantity::of(&rig, main));
                out.push(SweepStep {
                    value,
                    ideal: finite(main.ideal.value),
                    forward: finite(main.forward.value),
                    back: finite(main.back.value),
                    efficiency: crate::report::efficiency(main.forward_efficiency()),
                    error: None,
                    verdict: Verdict::assess(&rig, &solution),
                });
            }
            Err(e) => out.push(SweepStep {
                value,
                ideal: None,
                forward: None,
                back: None,
                efficiency: None,
                error: Some(e.to_string()),
                verdict: Verdict::default(),
            }),
        }
    }
    Ok(Sweep {
        key: vary.key.clone(),
        unit: vary.unit.clone(),
        solve_for,
        steps: out,
        caution: CAUTION,
        units,
    })
}

fn dimension_of(quantity: &str) -> Dimension {
    match quantity {
        "mass" => Dimension::Mass,
        "torque" => Dimension::Torque,
        _ => Dimension::Force,
    }
}

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
    cells.push(if unsolved { "—".into() } else { v.cell() });
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
    let (qname, si) = s
        .solve_for
        .as_ref()
        .map_or(("value", "N"), |a| (a.quantity, a.unit));
    let d = dimension_of(qname);
    let mut t = Table::default();
    if format == Format::Csv {
        t.headers = vec![
            value_heading(&s.key, &s.unit),
            format!("ideal_{si}"),
            format!("forward_{si}"),
            format!("back_{si}"),
            "efficiency".into(),
            "error".into(),
        ];
        t.headers.extend(verdict_headers());
        for st in &s.steps {
            let mut row = vec![
                format!("{}", st.value),
                csv_number(st.ideal),
                csv_number(st.forward),
                csv_number(st.back),
                csv_number(st.efficiency),
                st.error.clone().unwrap_or_default(),
            ];
            row.extend(verdict_csv(&st.verdict));
            t.rows.push(row);
        }
        return t.write_csv(w);
    }
    t.headers = vec![
        value_heading(&s.key, &s.unit),
        "ideal".into(),
        "forward".into(),
        "back".into(),
        "efficiency".into(),
    ];
    let verdicts: Vec<&Verdict> = s.steps.iter().map(|st| &st.verdict).collect();
    let margins = any_margin(&verdicts);
    if margins {
        t.headers.push("margin".into());
    }
    t.headers.push("checks".into());
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
        t.rows.push(row);
        if let Some(e) = &st.error {
            notes.push(format!("at {} = {}: {e}", s.key, number(Some(st.value), 4)));
        }
    }
    notes.extend(stalled_note(
        verdicts.iter().filter(|v| !v.stalled.is_empty()).count(),
        verdicts.len(),
    ));
    let title = match &s.solve_for {
        Some(a) => format!("Sweep of `{}`: the {} at `{}`", s.key, a.quantity, a.part),
        None => format!("Sweep of `{}`", s.key),
    };
    write_human(w, format, &title, &t, &notes)
}

/// The chart of a sweep: ideal, forward and back against the varied value.
pub fn sweep_chart(s: &Sweep) -> String {
    let (qname, part) = s
        .solve_for
        .as_ref()
        .map_or(("value", String::new()), |a| (a.quantity, a.part.clone()));
    let d = dimension_of(qname);
    let unit = s.units.unit(d);
    let series = |name: &str, f: &dyn Fn(&SweepStep) -> Option<Real>| Series {
        name: name.to_string(),
        points: s
            .steps
            .iter()
            .map(|st| (st.value, f(st).map(|v| v / unit.si)))
            .collect(),
    };
    plot::svg(&[Panel {
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

/// One step of a stroke. SI units.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct StrokeStep {
    /// Drive travel from the start (m, or rad for a drum drive).
    pub travel: Real,
    /// Ideal value of the asked quantity.
    pub ideal: Option<Real>,
    /// Forward value (the effort, when the asked part is the drive).
    pub forward: Option<Real>,
    /// Back value.
    pub back: Option<Real>,
    /// Velocity ratio.
    pub velocity_ratio: Option<Real>,
    /// Largest fleet angle, degrees.
    pub largest_fleet_deg: Option<Real>,
    /// Largest span tension, N.
    pub largest_tension_n: Option<Real>,
    /// Why the stroke ends here.
    pub error: Option<String>,
    /// What `check` concludes at this position (empty where it could not be solved).
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// A stroke: the drive moved forward through its travel.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Stroke {
    /// The drive.
    pub drive: String,
    /// Unit of `travel`: `m` or `rad`.
    pub travel_unit: &'static str,
    /// The asked quantity.
    pub solve_for: Option<AskedQuantity>,
    /// The steps (the first at zero travel).
    pub steps: Vec<StrokeStep>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
}

/// Speeds of the main sub-rig's translating parts per unit drive speed:
/// `(part, velocity)`, including sheaves carried by a moving block.
fn velocities(rig: &Rig, solution: &Solution) -> Vec<(usize, crate::math::Vector)> {
    let main = solution.main().component;
    let k = &solution.kinematics;
    let mut out = Vec::new();
    for (i, dof) in k.dofs.iter().enumerate() {
        if solution.network.component_of[dof.part] != main {
            continue;
        }
        if let Motion::Translate(dir) = dof.motion {
            let v = dir.into_inner() * k.forward[i];
            out.push((dof.part, v));
            // Sheaves and pick points carried by the block move with it.
            for (s, part) in rig.parts.iter().enumerate() {
                if part.block == Some(dof.part) {
                    out.push((s, v));
                }
            }
        }
    }
    out
}

/// A span that closed up or turned round between two positions: a moving part has
/// reached (or passed through) the part at the span's other end.
fn closed_span(rig: &Rig, before: &Solution, after: &Solution) -> Option<String> {
    for (l, line) in rig.lines.iter().enumerate() {
        let (a, b) = (
            &before.geometry.lines[l].spans,
            &after.geometry.lines[l].spans,
        );
        for (j, (x, y)) in a.iter().zip(b).enumerate() {
            if x.direction.dot(&y.direction) < 0.0 || y.length <= 1e-9 * x.length.max(1e-9) {
                let from = &rig.parts[line.path[j].part].name;
                let to = &rig.parts[line.path[j + 1].part].name;
                return Some(format!(
                    "span {j} of line `{}` closes up: `{from}` and `{to}` meet",
                    line.name
                ));
            }
        }
    }
    None
}

fn moved(rig: &Rig, v: &[(usize, crate::math::Vector)], dt: Real) -> Rig {
    let mut r = rig.clone();
    for (p, vel) in v {
        r.parts[*p].at += vel * dt;
    }
    r
}

/// The drive's travel, parsed: a length for a translating drive, an angle (degrees by
/// default, or `rad`) for a drum.
fn parse_travel(text: &str, rig: &Rig, rotates: bool) -> Result<Real, StudyError> {
    if rotates {
        let (v, unit) = number_and_unit(text).ok_or_else(|| {
            StudyError::Input(format!(
                "--stroke `{text}`: expected an angle for the drum drive, e.g. `90 deg` or `1.5 rad`"
            ))
        })?;
        return match unit.as_str() {
            "" | "deg" | "°" => Ok(v.to_radians()),
            "rad" => Ok(v),
            _ => Err(StudyError::Input(format!(
                "--stroke `{text}`: expected an angle in deg or rad for the drum drive"
            ))),
        };
    }
    parse_quantity(text, Dimension::Length, rig.units.length)
        .map_err(|e| StudyError::Input(format!("--stroke `{text}`: {e}")))
}

/// Moves the drive forward through `distance` in `steps` equal steps, each split into
/// `substeps` midpoint-rule sub-steps, solving at every step.
///
/// # Errors
/// When the rig does not load or solve at its starting position, or the travel is not
/// a length (an angle for a drum drive).
pub fn stroke(
    source: &RigSource,
    distance: &str,
    steps: usize,
    substeps: usize,
) -> Result<Stroke, StudyError> {
    let (mut rig, first) = source.solve(&[])?;
    let drive = rig.drive;
    let rotates = first
        .kinematics
        .dof_of_part
        .get(drive)
        .copied()
        .flatten()
        .is_some_and(|i| matches!(first.kinematics.dofs[i].motion, Motion::Rotate(_)));
    let total = parse_travel(distance, &rig, rotates)?;
    if total == 0.0 || !total.is_finite() {
        return Err(StudyError::Input(format!(
            "--stroke `{distance}`: expected a travel other than zero (negative moves the drive back)"
        )));
    }
    let steps = steps.max(1);
    let substeps = substeps.max(1);
    let dt = total / (steps * substeps) as Real;
    let asked = AskedQuantity::of(&rig, first.main());
    let mut out = Vec::new();
    let record = |travel: Real, rig: &Rig, s: &Solution| {
        let main = s.main();
        let slack = !main.forward.slack.is_empty() || !main.back.slack.is_empty();
        StrokeStep {
            travel,
            ideal: finite(main.ideal.value),
            forward: finite(main.forward.value),
            back: finite(main.back.value),
            velocity_ratio: main.velocity_ratio,
            largest_fleet_deg: largest_fleet_deg(s),
            largest_tension_n: largest_tension(s),
            verdict: Verdict::assess(rig, s),
            error: slack.then(|| {
                let (l, j) = main
                    .forward
                    .slack
                    .first()
                    .or(main.back.slack.first())
                    .copied()
                    .unwrap_or((0, 0));
                format!(
                    "span {j} of line `{}` turns slack",
                    rig.lines.get(l).map_or("?", |l| l.name.as_str())
                )
            }),
        }
    };
    out.push(record(0.0, &rig, &first));
    let mut current = first;
    'outer: for step in 1..=steps {
        if out.last().is_some_and(|s: &StrokeStep| s.error.is_some()) {
            break;
        }
        // Translating parts move (also when a drum drives: then per radian of the drum).
        for _ in 0..substeps {
            // Midpoint rule: velocities at the half step carry the whole step.
            let v0 = velocities(&rig, &current);
            let half = moved(&rig, &v0, 0.5 * dt);
            let mid = match source.solve_rig(&half) {
                Ok(s) => s,
                Err(e) => {
                    out.push(failed(step as Real * total / steps as Real, e));
                    break 'outer;
                }
            };
            let v1 = velocities(&half, &mid);
            let next_rig = moved(&rig, &v1, dt);
            let next = match source.solve_rig(&next_rig) {
                Ok(s) => s,
                Err(e) => {
                    out.push(failed(step as Real * total / steps as Real, e));
                    break 'outer;
                }
            };
            if let Some(why) = closed_span(&next_rig, &current, &next) {
                // The figures past that point describe a rope through a part: none.
                out.push(stopped(step as Real * total / steps as Real, why));
                break 'outer;
            }
            rig = next_rig;
            current = next;
        }
        out.push(record(step as Real * total / steps as Real, &rig, &current));
    }
    Ok(Stroke {
        drive: rig.parts[drive].name.clone(),
        travel_unit: if rotates { "rad" } else { "m" },
        solve_for: Some(asked),
        steps: out,
        caution: CAUTION,
        units: rig.units,
    })
}

fn failed(travel: Real, e: StudyError) -> StrokeStep {
    stopped(travel, format!("the rig cannot be solved here: {e}"))
}

/// A step with no figures, only the reason the stroke stops there.
fn stopped(travel: Real, why: String) -> StrokeStep {
    StrokeStep {
        travel,
        ideal: None,
        forward: None,
        back: None,
        velocity_ratio: None,
        largest_fleet_deg: None,
        largest_tension_n: None,
        error: Some(why),
        verdict: Verdict::default(),
    }
}

fn travel_shown(s: &Stroke, t: Real) -> (Real, String) {
    if s.travel_unit == "rad" {
        (t.to_degrees(), "deg".to_string())
    } else {
        let u = s.units.unit(Dimension::Length);
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
        .map_or(("value", "N"), |a| (a.quantity, a.unit));
    let d = dimension_of(qname);
    let mut t = Table::default();
    if format == Format::Csv {
        t.headers = vec![
            format!("travel_{}", s.travel_unit),
            format!("forward_{si}"),
            format!("back_{si}"),
            "velocity_ratio".into(),
            "largest_fleet_deg".into(),
            "largest_tension_n".into(),
            "error".into(),
        ];
        t.headers.extend(verdict_headers());
        for st in &s.steps {
            let mut row = vec![
                format!("{}", st.travel),
                csv_number(st.forward),
                csv_number(st.back),
                csv_number(st.velocity_ratio),
                csv_number(st.largest_fleet_deg),
                csv_number(st.largest_tension_n),
                st.error.clone().unwrap_or_default(),
            ];
            row.extend(verdict_csv(&st.verdict));
            t.rows.push(row);
        }
        return t.write_csv(w);
    }
    let (_, tu) = travel_shown(s, 0.0);
    t.headers = vec![
        format!("travel ({tu})"),
        format!("{qname} forward"),
        "back".into(),
        "velocity ratio".into(),
        "largest fleet".into(),
        "largest tension".into(),
    ];
    let verdicts: Vec<&Verdict> = s.steps.iter().map(|st| &st.verdict).collect();
    let margins = any_margin(&verdicts);
    if margins {
        t.headers.push("margin".into());
    }
    t.headers.push("checks".into());
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
        row.extend(verdict_cells(&st.verdict, margins, unsolved));
        t.rows.push(row);
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
    let (qname, part) = s
        .solve_for
        .as_ref()
        .map_or(("value", String::new()), |a| (a.quantity, a.part.clone()));
    let d = dimension_of(qname);
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
    plot::svg(&[
        Panel {
            title: format!("The {qname} at {part} through the stroke"),
            x_label: x_label.clone(),
            y_label: format!("{qname} ({})", unit.symbol),
            series: vec![
                series("forward", &|st| st.forward.map(|v| v / unit.si)),
                series("back", &|st| st.back.map(|v| v / unit.si)),
            ],
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn vary_reads_units() {
        let v = parse_vary("parts.hook.load.mass=400..900 kg").unwrap();
        assert_eq!((v.from, v.to, v.unit.as_str()), (400.0, 900.0, "kg"));
        let v = parse_vary("parts.head.bearing.mu=0.05..0.2").unwrap();
        assert_eq!((v.from, v.to, v.unit.as_str()), (0.05, 0.2, ""));
        assert!(parse_vary("parts.head.bearing.mu=0.05").is_err());
        assert!(parse_vary("a=1 kg..2 N").is_err());
    }

    #[test]
    fn steps_include_both_ends() {
        assert_eq!(steps_between(0.0, 1.0, 5), vec![0.0, 0.25, 0.5, 0.75, 1.0]);
        assert_eq!(steps_between(3.0, 4.0, 1), vec![3.0]);
    }
}

//! The writers of `reeve motion` ([`crate::solve::motion`]): the JSON document of
//! DESIGN.md §7, the text summary (events, strokes, warnings, energy, caution), the
//! time series as CSV, and the SVG chart (position, speed, drive value with the holding
//! band's thresholds).

use std::io::{self, Write};

use serde::Serialize;

use super::chart::{self, Panel, Series};
use super::escape;
use super::text::number;
use super::CAUTION;
use crate::math::Real;
use crate::solve::motion::integrate::{ATOL, RTOL};
use crate::solve::motion::{Motion, Stroke};
use crate::units::{Dimension, UnitSystem};

/// An event in the JSON.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct EventJson {
    /// Time, s.
    pub t_s: Real,
    /// What.
    pub event: &'static str,
    /// Drive position, m or rad.
    pub position: Real,
    /// Drive value, SI.
    pub drive_value: Real,
    /// Speed just before (the impact speed at a stop), m/s or rad/s.
    pub speed: Real,
}

/// A stroke in the JSON.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct StrokeJson {
    /// `forward` or `back`.
    pub direction: &'static str,
    /// Start, s.
    pub start_s: Real,
    /// End, s.
    pub end_s: Real,
    /// Duration, s.
    pub duration_s: Real,
    /// Largest speed.
    pub peak_speed: Real,
    /// Largest span tension, N.
    pub peak_tension_n: Real,
    /// Stops and restarts the same way within the stroke.
    pub stick_slip_cycles: usize,
    /// Speed at the end stop, where it ends at one.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub stop_speed: Option<Real>,
    /// From the drive value's last turn to the start (a scheduled drive), s.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub lag_s: Option<Real>,
}

/// A time sample in the JSON.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct SampleJson {
    /// Time, s.
    pub t_s: Real,
    /// Position.
    pub position: Real,
    /// Speed.
    pub speed: Real,
    /// Drive value.
    pub drive_value: Real,
    /// Largest span tension, N.
    pub tension_n: Real,
}

/// A warning in the JSON.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct WarningJson {
    /// Stable code.
    pub code: &'static str,
    /// Text.
    pub message: String,
}

/// The energy balance in the JSON, J.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct EnergyJson {
    /// Work by the drive.
    pub drive_j: Real,
    /// Into the loads.
    pub loads_j: Real,
    /// Friction.
    pub friction_j: Real,
    /// Lost at the end stops.
    pub impacts_j: Real,
    /// Kinetic at the end.
    pub kinetic_j: Real,
    /// Given to mass added while moving (a filling tank), `−∫ ½·(dM/dt)·v² dt`.
    pub added_mass_j: Real,
    /// Change of the rope's strain energy (two degrees of freedom).
    pub spring_j: Real,
    /// Drive work minus the rest.
    pub residual_j: Real,
}

/// The JSON document of `motion` (DESIGN.md §7, with the extra keys `drive`,
/// `drive_unit`, `effective_mass`, `holding_band`, `energy`, `tolerance`).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct MotionJson {
    /// 1.
    pub format: u32,
    /// Run length, s.
    pub duration_s: Real,
    /// `m` or `rad`.
    pub position_unit: &'static str,
    /// The drive.
    pub drive: String,
    /// SI unit of the drive value.
    pub drive_unit: &'static str,
    /// `Σ m·v² + Σ I·ω²` at the drawn position for unit drive speed (kg, or kg·m²),
    /// the drive itself and the sheaves included.
    pub effective_mass: Real,
    /// The holding band at the drawn position `[start_back, start_forward]`.
    pub holding_band: [Real; 2],
    /// Events.
    pub events: Vec<EventJson>,
    /// Strokes.
    pub strokes: Vec<StrokeJson>,
    /// Samples.
    pub samples: Vec<SampleJson>,
    /// Energy balance.
    pub energy: EnergyJson,
    /// The integrator's tolerance.
    pub tolerance: String,
    /// 1, or 2 where a stretchy rope joins the drive weight to the rig side.
    pub degrees_of_freedom: u32,
    /// The spring rate joining them, N/m (two degrees of freedom).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub drive_stiffness: Option<Real>,
    /// Warnings.
    pub warnings: Vec<WarningJson>,
    /// The caution.
    pub caution: &'static str,
}

fn tolerance() -> String {
    format!("Dormand-Prince 5(4), relative {RTOL:e} and absolute {ATOL:e} per step; events located by bisection")
}

fn stroke_json(s: &Stroke) -> StrokeJson {
    StrokeJson {
        direction: if s.direction > 0.0 { "forward" } else { "back" },
        start_s: s.start,
        end_s: s.end,
        duration_s: s.end - s.start,
        peak_speed: s.peak_speed,
        peak_tension_n: s.peak_tension,
        stick_slip_cycles: s.stick_slip_cycles,
        stop_speed: s.stop_speed,
        lag_s: s.lag,
    }
}

/// The effective mass at the drive at the drawn position (the drive's own mass at t = 0
/// included).
fn effective_mass(m: &Motion) -> Real {
    let s = m.profile.at(0.0);
    let own = if m.profile.drive_is_weight {
        m.drive_value.at(0.0)
    } else {
        0.0
    };
    s.effective_mass + s.own_inertia + own
}

/// The JSON document.
pub fn json(m: &Motion) -> MotionJson {
    let s0 = m.profile.at(0.0);
    let e = &m.run.energy;
    MotionJson {
        format: 1,
        duration_s: m.duration,
        position_unit: if m.profile.rotates { "rad" } else { "m" },
        drive: m.drive.clone(),
        drive_unit: m.quantity.si_unit(),
        effective_mass: effective_mass(m),
        holding_band: [s0.start_back, s0.start_forward],
        events: m
            .run
            .events
            .iter()
            .map(|e| EventJson {
                t_s: e.t,
                event: e.kind.name(),
                position: e.position,
                drive_value: e.drive_value,
                speed: e.speed,
            })
            .collect(),
        strokes: m.strokes.iter().map(stroke_json).collect(),
        samples: m
            .run
            .points
            .iter()
            .map(|p| SampleJson {
                t_s: p.t,
                position: p.x,
                speed: p.v,
                drive_value: p.drive,
                tension_n: p.tension,
            })
            .collect(),
        energy: EnergyJson {
            drive_j: e.drive,
            loads_j: e.loads,
            friction_j: e.friction,
            impacts_j: e.impacts,
            kinetic_j: e.kinetic,
            added_mass_j: e.added_mass,
            spring_j: e.spring,
            residual_j: e.residual(),
        },
        tolerance: tolerance(),
        degrees_of_freedom: if m.two_dof.is_some() { 2 } else { 1 },
        drive_stiffness: m.two_dof,
        warnings: m
            .warnings
            .iter()
            .map(|w| WarningJson {
                code: w.code,
                message: w.message.clone(),
            })
            .collect(),
        caution: CAUTION,
    }
}

/// How positions and drive values are shown in text: (scale from SI, unit).
fn shown(m: &Motion, units: &UnitSystem) -> ((Real, String), (Real, String)) {
    let pos = if m.profile.rotates {
        (1f64.to_degrees(), "deg".to_string())
    } else {
        let u = units.unit(Dimension::Length);
        (1.0 / u.si, u.symbol.to_string())
    };
    let u = units.unit(m.quantity.dimension());
    (pos, (1.0 / u.si, u.symbol.to_string()))
}

/// How the other figures are shown: (scale from SI, unit) of speed, force (span
/// tension), energy, effective mass and the rope's spring rate at the drive. Metric
/// systems keep m/s, the force unit, J, kg (or kg*m^2) and N/m (or N*m/rad); a system
/// in lbf (US customary) shows ft/s, lbf, lbf*ft, lb (or lb*ft^2) and lbf/in (or
/// lbf*ft/rad).
struct Others {
    position: (Real, String),
    span_length: (Real, String),
    speed: (Real, &'static str),
    force: (Real, String),
    energy: (Real, &'static str),
    mass: (Real, &'static str),
    spring: (Real, &'static str),
}

/// A warning's text in the shown units (its message is SI).
fn warning_text(wn: &crate::solve::motion::Warning, o: &Others) -> String {
    use crate::solve::motion::WarningFigures;
    let n = |x: Real| number(Some(x), 4);
    match &wn.figures {
        Some(WarningFigures::GeometryEnd {
            t,
            position,
            speed,
            reason,
            rope_drawn,
        }) => {
            let (sv, su) = o.speed;
            let (ps, pu) = &o.position;
            let (ls, lu) = &o.span_length;
            match reason {
                Some(words) => format!(
                    "at {t:.3} s the drive reaches {} {pu} from the drawn position, where the rig's geometry ends ({words}), at {} {su}: the run ends there; give `travel` for the real end stops",
                    n(position * ps),
                    n(speed * sv)
                ),
                None => format!(
                    "at {t:.3} s the drive has moved {} {pu} and its geometry sets no limit that way: the run ends there, where its fastest part has moved as far as the rope drawn ({} {lu}), at {} {su}; give `travel` for the real end stops",
                    n(position * ps),
                    n(rope_drawn * ls),
                    n(speed * sv)
                ),
            }
        }
        Some(WarningFigures::StopSpeed {
            start,
            speed,
            limit,
        }) => {
            let (sv, su) = o.speed;
            format!(
                "the stroke starting at {start:.3} s hits its end stop at {} {su}, faster than limits.stop_speed {} {su}",
                n(speed * sv),
                n(limit * sv)
            )
        }
        Some(WarningFigures::Slack {
            position,
            tension,
            line,
            span,
        }) => {
            let (ps, pu) = &o.position;
            let (fs, fu) = (o.force.0, &o.force.1);
            format!(
                "at drive position {} {pu} a stroke runs where span {span} of line `{line}` would need a negative tension ({} {fu}): the rope goes slack there and the figures there do not hold",
                n(position * ps),
                n(tension * fs)
            )
        }
        Some(WarningFigures::StiffRope { rate, period }) => {
            let (ks, ku) = o.spring;
            format!(
                "the rope's spring rate at the drive ({} {ku}) swings the drive on it with a period of {} s, more than {:e} times over the run: too fast to follow, and a real rope damps it; the run takes the rope as inextensible (one degree of freedom)",
                n(rate * ks),
                number(Some(*period), 3),
                crate::solve::motion::MOST_ROPE_SWINGS
            )
        }
        Some(WarningFigures::Unresolved {
            dropped,
            largest,
            resolution,
        }) => {
            let (ps, pu) = &o.position;
            format!(
                "the rig moves by at most {} {pu} between stops ({dropped} stop(s) and restart(s) of less than {} {pu} left out of the events and stick-slip counts): below the run's resolution, as a very stiff rope or spring gives; the rig creeps or stays put there, and those stops are not stick-slip",
                number(Some(largest * ps), 3),
                number(Some(resolution * ps), 3)
            )
        }
        Some(WarningFigures::DynamicTension {
            peak,
            static_peak,
            allowed,
        }) => {
            let (fs, fu) = (o.force.0, &o.force.1);
            format!(
                "a span tension reaches {} {fu} in motion (the static check's largest is {} {fu}), beyond the breaking strength over the design factor ({} {fu})",
                n(peak * fs),
                n(static_peak * fs),
                n(allowed * fs)
            )
        }
        None => wn.message.clone(),
    }
}

fn others(m: &Motion, units: &UnitSystem) -> Others {
    use crate::units::unit;
    let imperial = units.force.symbol == unit::LBF.symbol;
    let force = units.unit(Dimension::Force);
    let lbf_ft = unit::LBF_FT.si;
    let lb_ft2 = unit::LB.si * unit::FT.si * unit::FT.si;
    let ((ps, pu), _) = shown(m, units);
    let span = units.span_length;
    Others {
        position: (ps, pu),
        span_length: (1.0 / span.si, span.symbol.to_string()),
        speed: match (m.profile.rotates, imperial) {
            (true, _) => (1f64.to_degrees(), "deg/s"),
            (false, false) => (1.0, "m/s"),
            (false, true) => (1.0 / unit::FT.si, "ft/s"),
        },
        force: (1.0 / force.si, force.symbol.to_string()),
        energy: if imperial {
            (1.0 / lbf_ft, "lbf*ft")
        } else {
            (1.0, "J")
        },
        mass: match (m.profile.rotates, imperial) {
            (true, false) => (1.0, "kg*m^2"),
            (true, true) => (1.0 / lb_ft2, "lb*ft^2"),
            (false, false) => (1.0, "kg"),
            (false, true) => (1.0 / unit::LB.si, "lb"),
        },
        spring: match (m.profile.rotates, imperial) {
            (true, false) => (1.0, "N*m/rad"),
            (true, true) => (1.0 / lbf_ft, "lbf*ft/rad"),
            (false, false) => (1.0, "N/m"),
            (false, true) => (1.0 / unit::LBF_PER_IN.si, "lbf/in"),
        },
    }
}

/// Writes the text summary.
///
/// # Errors
/// I/O errors of the writer.
pub fn write_text(
    w: &mut dyn Write,
    m: &Motion,
    units: &UnitSystem,
    title: &str,
) -> io::Result<()> {
    let ((ps, pu), (ds, du)) = shown(m, units);
    let o = others(m, units);
    let (sv, su) = o.speed;
    let (fs, fu) = (o.force.0, o.force.1.as_str());
    let (es, eu) = o.energy;
    let n = |x: Real| number(Some(x), 4);
    writeln!(
        w,
        "Motion of `{}` over {} s  ({})",
        escape::text_line(&m.drive),
        n(m.duration),
        escape::text_line(title)
    )?;
    writeln!(w)?;
    let s0 = m.profile.at(0.0);
    writeln!(
        w,
        "Holding band at the drawn position: {} {du} to {} {du} (static); running: back {} {du}, forward {} {du}",
        n(s0.start_back * ds),
        n(s0.start_forward * ds),
        n(s0.back * ds),
        n(s0.forward * ds)
    )?;
    writeln!(
        w,
        "Effective mass at the drive: {} {}",
        n(effective_mass(m) * o.mass.0),
        o.mass.1
    )?;
    writeln!(w)?;
    writeln!(w, "Events:")?;
    writeln!(
        w,
        "  {:>10}  {:<22} {:>12} {:>12} {:>12}",
        "t (s)",
        "event",
        format!("at ({pu})"),
        format!("drive ({du})"),
        format!("speed ({su})")
    )?;
    for e in &m.run.events {
        writeln!(
            w,
            "  {:>10}  {:<22} {:>12} {:>12} {:>12}",
            n(e.t),
            e.kind.name(),
            n(e.position * ps),
            n(e.drive_value * ds),
            n(e.speed.abs() * sv)
        )?;
    }
    if m.run.events.is_empty() {
        writeln!(w, "  (none: the rig stays at rest)")?;
    }
    writeln!(w)?;
    writeln!(w, "Strokes:")?;
    writeln!(
        w,
        "  {:<8} {:>10} {:>10} {:>10} {:>10} {:>12} {:>12} {:>6}",
        "way",
        "lag (s)",
        "start (s)",
        "end (s)",
        "time (s)",
        format!("peak ({su})"),
        format!("peak T ({fu})"),
        "jerks"
    )?;
    for s in &m.strokes {
        writeln!(
            w,
            "  {:<8} {:>10} {:>10} {:>10} {:>10} {:>12} {:>12} {:>6}",
            if s.direction > 0.0 { "forward" } else { "back" },
            s.lag.map_or("—".to_string(), n),
            n(s.start),
            n(s.end),
            n(s.end - s.start),
            n(s.peak_speed * sv),
            n(s.peak_tension * fs),
            s.stick_slip_cycles
        )?;
    }
    if m.strokes.is_empty() {
        writeln!(w, "  (none)")?;
    }
    let e = &m.run.energy;
    writeln!(w)?;
    writeln!(
        w,
        "Energy: drive {} {eu} = loads {} {eu} + friction {} {eu} + at the stops {} {eu} + kinetic {} {eu} + rope strain {} {eu} + given to mass added in motion {} {eu} (residual {} {eu})",
        n(e.drive * es),
        n(e.loads * es),
        n(e.friction * es),
        n(e.impacts * es),
        n(e.kinetic * es),
        n(e.spring * es),
        n(e.added_mass * es),
        number(Some(e.residual() * es), 2)
    )?;
    writeln!(w, "Integrator: {}; {} steps.", tolerance(), m.run.steps)?;
    let (ks, ku) = o.spring;
    match m.two_dof {
        Some(k) if m.profile.drive_is_weight => writeln!(w, "Two degrees of freedom: the drive weight and the rig joined by the rope's spring rate at the drive, {} {ku} (no rope damping: the weight keeps swinging).", n(k * ks))?,
        Some(k) if m.profile.drive_inertia > 0.0 => writeln!(w, "Two degrees of freedom: the drive drum's own inertia and the rig joined by the rope's spring rate at the drive, {} {ku} (no rope damping: the drum keeps swinging).", n(k * ks))?,
        Some(k) => writeln!(w, "Rope spring rate at the drive {} {ku}: the haul's end has no mass, so its stretch follows its force and the rig moves as with one degree of freedom; the strain energy joins the balance.", n(k * ks))?,
        None => writeln!(w, "One degree of freedom along the drive's motion.")?,
    }
    writeln!(w, "Inertia passes through the friction as linearised at constant speed; a varying velocity ratio's ½·(dM/dx)·v² is in the motion (frictionless, not passed through the friction; on a two-degree run it is left out).")?;
    if !m.warnings.is_empty() {
        writeln!(w)?;
        writeln!(w, "Warnings:")?;
        for wn in &m.warnings {
            writeln!(
                w,
                "  warn [{}] {}",
                wn.code,
                escape::text_line(&warning_text(wn, &o))
            )?;
        }
    }
    writeln!(w)?;
    writeln!(w, "{CAUTION}")
}

/// Writes the time series as CSV: SI, or in `units` where `--units` names a system
/// (the unit in every header).
///
/// # Errors
/// I/O errors of the writer.
pub fn write_csv(w: &mut dyn Write, m: &Motion, units: Option<&UnitSystem>) -> io::Result<()> {
    let Some(units) = units else {
        let pu = if m.profile.rotates { "rad" } else { "m" };
        let du = m.quantity.si_unit();
        writeln!(
            w,
            "t_s,position_{pu},speed_{pu}_per_s,drive_value_{du},tension_n"
        )?;
        for p in &m.run.points {
            writeln!(w, "{},{},{},{},{}", p.t, p.x, p.v, p.drive, p.tension)?;
        }
        return Ok(());
    };
    let ((ps, pu), (ds, du)) = shown(m, units);
    let o = others(m, units);
    let (sv, su) = o.speed;
    let (fs, fu) = (o.force.0, o.force.1);
    let csv_unit = |u: &str| u.replace('/', "_per_").replace('*', "_");
    writeln!(
        w,
        "t_s,position_{},speed_{},drive_value_{},tension_{}",
        csv_unit(&pu),
        csv_unit(su),
        csv_unit(&du),
        csv_unit(&fu)
    )?;
    for p in &m.run.points {
        writeln!(
            w,
            "{},{},{},{},{}",
            p.t,
            p.x * ps,
            p.v * sv,
            p.drive * ds,
            p.tension * fs
        )?;
    }
    Ok(())
}

/// The chart: position, speed, and the drive value with the holding band's thresholds
/// where the rig stands, against time.
pub fn chart(m: &Motion, units: &UnitSystem) -> String {
    let ((ps, pu), (ds, du)) = shown(m, units);
    let (sv, su) = others(m, units).speed;
    let pts = &m.run.points;
    let series = |name: &str, f: &dyn Fn(&crate::solve::motion::Point) -> Real| Series {
        name: name.to_string(),
        points: pts
            .iter()
            .map(|p| (p.t, Some(f(p)).filter(|v| v.is_finite())))
            .collect(),
    };
    chart::svg(&[
        Panel {
            title: format!("Position of {}", m.drive),
            x_label: "time (s)".into(),
            y_label: format!("position ({pu})"),
            series: vec![series("position", &|p| p.x * ps)],
        },
        Panel {
            title: "Speed".into(),
            x_label: "time (s)".into(),
            y_label: format!("speed ({su})"),
            series: vec![series("speed", &|p| p.v * sv)],
        },
        Panel {
            title: "Drive value and the holding band where the rig stands".into(),
            x_label: "time (s)".into(),
            y_label: format!("drive ({du})"),
            series: vec![
                series("drive value", &|p| p.drive * ds),
                series("starts forward above", &|p| {
                    m.profile.at_t(p.t, p.x).start_forward * ds
                }),
                series("starts back below", &|p| {
                    m.profile.at_t(p.t, p.x).start_back * ds
                }),
            ],
        },
    ])
}

/// The HTML report's motion section, for a rig that gives a `travel` or a schedule
/// (nothing otherwise): the events and strokes, and the chart.
///
/// # Errors
/// Only those of `w`.
pub fn write_html_section(w: &mut dyn Write, rig: &crate::model::Rig) -> io::Result<()> {
    use super::escape::xml as esc;
    if rig.changing.travel.is_none() && !rig.changing.has_schedule() {
        return Ok(());
    }
    writeln!(w, "<section id=\"motion\">\n<h2>Motion from rest</h2>")?;
    let m = match crate::solve::motion::motion(rig, &Default::default()) {
        Ok(m) => m,
        Err(e) => {
            writeln!(
                w,
                "<p>No motion run: {}.</p>\n</section>",
                esc(&crate::text::error_chain(&e))
            )?;
            return Ok(());
        }
    };
    let ((ps, pu), (ds, du)) = shown(&m, &rig.units);
    let o = others(&m, &rig.units);
    let n = |x: Real| esc(&number(Some(x), 4));
    writeln!(w, "<div class=\"table-scroll\"><table class=\"data\"><thead><tr><th scope=\"col\" class=\"num\">t (s)</th><th scope=\"col\">event</th><th scope=\"col\" class=\"num\">at ({})</th><th scope=\"col\" class=\"num\">drive ({})</th></tr></thead><tbody>", esc(&pu), esc(&du))?;
    for e in &m.run.events {
        writeln!(
            w,
            "<tr><td class=\"num\">{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>",
            n(e.t),
            e.kind.name(),
            n(e.position * ps),
            n(e.drive_value * ds)
        )?;
    }
    writeln!(w, "</tbody></table></div>")?;
    if m.run.events.is_empty() {
        writeln!(w, "<p>The rig stays at rest over the run.</p>")?;
    }
    for s in &m.strokes {
        writeln!(
            w,
            "<p>Stroke {} from {} s to {} s ({} s): peak speed {} {}, peak span tension {} {}, {} stick-slip cycle(s).</p>",
            if s.direction > 0.0 { "forward" } else { "back" },
            n(s.start),
            n(s.end),
            n(s.end - s.start),
            n(s.peak_speed * o.speed.0),
            o.speed.1,
            n(s.peak_tension * o.force.0),
            esc(&o.force.1),
            s.stick_slip_cycles
        )?;
    }
    if !m.warnings.is_empty() {
        writeln!(w, "<ul class=\"warnings\">")?;
        for wn in &m.warnings {
            writeln!(
                w,
                "<li><span class=\"tag warn\">warn</span><code>{}</code>: {}</li>",
                esc(wn.code),
                esc(&warning_text(wn, &o))
            )?;
        }
        writeln!(w, "</ul>")?;
    }
    // The chart scales to the page.
    let svg = chart(&m, &rig.units);
    let svg = svg.replacen(" width=\"720\"", " width=\"100%\"", 1);
    let svg = match (svg.find(" height=\""), svg.find('>')) {
        (Some(h), Some(end)) if h < end => {
            let close = svg[h + 9..].find('"').map_or(h, |c| h + 9 + c + 1);
            format!("{}{}", &svg[..h], &svg[close..])
        }
        _ => svg,
    };
    writeln!(w, "<figure>{svg}</figure>\n</section>")
}

//! The human-readable summary of `reeve check`: headline first, then the largest losses
//! and drum torques, the geometry, warnings, and the caution. Quantities are shown in
//! the rig file's own units.

use std::io::{self, Write};

use crate::math::Real;
use crate::rig::model::Rig;
use crate::units::{Dimension, UnitSystem};

use super::{Headline, Report, CAUTION};

/// Formats a number with about `sig` significant figures, without exponent for the
/// everyday range, and `—` for a missing value.
pub fn number(x: Option<Real>, sig: usize) -> String {
    let Some(x) = x.filter(|x| x.is_finite()) else {
        return "—".to_string();
    };
    if x == 0.0 {
        return "0".to_string();
    }
    let mag = x.abs().log10().floor() as i32;
    if !(-4..=9).contains(&mag) {
        return format!("{:.*e}", sig.saturating_sub(1), x);
    }
    let decimals = (sig as i32 - 1 - mag).max(0) as usize;
    format!("{:.*}", decimals, x)
}

/// A quantity in the report's units: `12.3 N`.
pub fn quantity(x: Option<Real>, dimension: Dimension, units: &UnitSystem) -> String {
    let unit = units.unit(dimension);
    match x {
        Some(v) if v.is_finite() => format!("{} {}", number(Some(v / unit.si), 4), unit.symbol),
        _ => "—".to_string(),
    }
}

fn percent(x: Option<Real>) -> String {
    match x {
        Some(v) if v.is_finite() => format!("{:.1} %", v * 100.0),
        _ => "—".to_string(),
    }
}

fn dimension_of(quantity: &str) -> Dimension {
    match quantity {
        "mass" => Dimension::Mass,
        "torque" => Dimension::Torque,
        _ => Dimension::Force,
    }
}

fn write_headline(w: &mut dyn Write, h: &Headline, units: &UnitSystem) -> io::Result<()> {
    let d = dimension_of(h.solve_for.quantity);
    let q = |x| quantity(x, d, units);
    writeln!(
        w,
        "Asked: the {} at `{}` (drive: `{}`)",
        h.solve_for.quantity, h.solve_for.part, h.drive
    )?;
    writeln!(
        w,
        "  {:<12} {:>14} {:>14} {:>14}",
        "", "ideal", "forward", "back"
    )?;
    writeln!(
        w,
        "  {:<12} {:>14} {:>14} {:>14}",
        h.solve_for.quantity,
        q(h.ideal.value),
        q(h.forward.value),
        q(h.back.value)
    )?;
    writeln!(
        w,
        "  {:<12} {:>14} {:>14} {:>14}",
        "efficiency",
        "",
        percent(h.forward.efficiency),
        percent(h.back.efficiency)
    )?;
    for note in h.efficiency_notes() {
        writeln!(w, "  {note}")?;
    }
    if let Some(b) = &h.breakaway {
        writeln!(
            w,
            "  {:<12} {:>14} {:>14}   (forward from rest, static coefficients; efficiency {})",
            "breakaway",
            "",
            q(b.value),
            percent(b.efficiency)
        )?;
    }
    if let Some(vr) = h.velocity_ratio {
        write!(w, "Velocity ratio {}", number(Some(vr), 4))?;
        if h.velocity_ratio_unit != "1" {
            write!(w, " {}", h.velocity_ratio_unit)?;
        }
        if let Some(p) = &h.load_part {
            write!(w, " (drive speed over `{p}` speed)")?;
        }
        match h.mechanical_advantage {
            Some(ma) => {
                // Load force per drive torque is per metre; the reverse is metres.
                let unit = match h.velocity_ratio_unit {
                    "rad/m" => " per m",
                    "m/rad" => " m",
                    _ => "",
                };
                writeln!(w, ", mechanical advantage {}{unit}", number(Some(ma), 4))?
            }
            None => writeln!(w)?,
        }
    }
    let [lo, hi] = h.holding_band;
    writeln!(
        w,
        "Holding band: friction alone holds the rig still between {} and {}.",
        q(lo),
        q(hi)
    )?;
    writeln!(w, "{}.", h.self_locking_words())?;
    if let Some(a) = h.available {
        let what = h.given_word();
        let verdict = match h.moves {
            Some(true) => "the drive moves the rig",
            Some(false) => "THE DRIVE CANNOT MOVE THE RIG",
            None => "",
        };
        writeln!(
            w,
            "{} {}: {}; {} (margin {})",
            capitalise(what),
            h.solve_for.quantity,
            q(Some(a)),
            verdict,
            percent(h.margin)
        )?;
    }
    Ok(())
}

/// The first letter in upper case.
pub(crate) fn capitalise(s: &str) -> String {
    let mut c = s.chars();
    match c.next() {
        Some(f) => f.to_uppercase().collect::<String>() + c.as_str(),
        None => String::new(),
    }
}

/// Writes the `check` summary (names, title and source with unsafe characters escaped).
pub fn write_check(w: &mut dyn Write, rig: &Rig, report: &Report, source: &str) -> io::Result<()> {
    super::escape::write_printable(w, |w| write_check_raw(w, rig, report, source))
}

fn write_check_raw(w: &mut dyn Write, rig: &Rig, report: &Report, source: &str) -> io::Result<()> {
    let units = &rig.units;
    let len = |x| quantity(x, Dimension::Length, units);
    let force = |x| quantity(x, Dimension::Force, units);
    writeln!(w, "{}  ({source})", report.title)?;
    writeln!(w)?;
    write_headline(w, &report.headline, units)?;

    // Largest losses, forward.
    let mut losses: Vec<_> = report
        .parts
        .iter()
        .filter(|p| p.in_main && p.loss_share.unwrap_or(0.0) > 0.0)
        .collect();
    losses.sort_by(|a, b| {
        b.loss_share
            .unwrap_or(0.0)
            .total_cmp(&a.loss_share.unwrap_or(0.0))
    });
    if !losses.is_empty() {
        writeln!(w)?;
        writeln!(w, "Largest losses (forward):")?;
        writeln!(
            w,
            "  {:<16} {:<8} {:>12} {:>12}",
            "part", "kind", "of losses", "of input"
        )?;
        for p in losses.iter().take(8) {
            writeln!(
                w,
                "  {:<16} {:<8} {:>12} {:>12}",
                p.name,
                p.kind,
                percent(p.loss_share),
                percent(p.loss_of_input)
            )?;
        }
        if losses.len() > 8 {
            writeln!(w, "  ... and {} more (see `reeve table`)", losses.len() - 8)?;
        }
    }
    if !report.drums.is_empty() {
        let t = |x| quantity(x, Dimension::Torque, units);
        writeln!(w)?;
        writeln!(
            w,
            "Drum torques (forward; rope torque is signed along the drum's motion):"
        )?;
        writeln!(
            w,
            "  {:<16} {:>13} {:>13} {:>13} {:>13} {:>13}",
            "drum", "rope", "load", "drag", "journal", "thrust"
        )?;
        for d in &report.drums {
            writeln!(
                w,
                "  {:<16} {:>13} {:>13} {:>13} {:>13} {:>13}",
                d.name,
                t(d.rope_torque_nm.forward),
                t(d.load_torque_nm),
                t(d.drag_nm),
                t(d.journal_nm.forward),
                t(d.thrust_nm)
            )?;
        }
    }
    for sub in &report.subrigs {
        writeln!(w)?;
        writeln!(w, "Independent sub-rig driven by `{}`:", sub.drive)?;
        write_headline(w, sub, units)?;
    }

    writeln!(w)?;
    writeln!(w, "Spans:")?;
    writeln!(
        w,
        "  {:<10} {:>3}  {:<26} {:>12} {:>12} {:>12} {:>8}",
        "line", "#", "from → to", "length", "forward", "back", "safety"
    )?;
    for s in &report.spans {
        writeln!(
            w,
            "  {:<10} {:>3}  {:<26} {:>12} {:>12} {:>12} {:>8}",
            s.line,
            s.index,
            format!("{} → {}", s.from, s.to),
            len(s.length_m),
            force(s.tension_n.forward),
            force(s.tension_n.back),
            number(s.safety_factor, 3)
        )?;
    }
    writeln!(w)?;
    writeln!(w, "Passages:")?;
    writeln!(
        w,
        "  {:<16} {:<10} {:>9} {:>9} {:>9} {:>7} {:>9} {:>12}",
        "part", "line", "wrap °", "fleet in", "fleet out", "D/d", "ratio fwd", "pin load fwd"
    )?;
    for p in &report.parts {
        for pass in &p.passages {
            writeln!(
                w,
                "  {:<16} {:<10} {:>9} {:>9} {:>9} {:>7} {:>9} {:>12}",
                p.name,
                pass.line,
                number(pass.wrap_deg, 4),
                number(pass.fleet_in_deg, 3),
                number(pass.fleet_out_deg, 3),
                number(pass.bend_ratio, 3),
                number(pass.tension_ratio.forward, 5),
                force(p.pin_load_n.forward)
            )?;
        }
    }
    writeln!(w)?;
    if report.warnings.is_empty() {
        writeln!(w, "Checks: no warnings.")?;
    } else {
        writeln!(w, "Warnings:")?;
        for warning in &report.warnings {
            let mark = if warning.fails { "FAIL" } else { "warn" };
            writeln!(w, "  {mark} [{}] {}", warning.code, warning.message)?;
        }
    }
    writeln!(w)?;
    writeln!(w, "{CAUTION}")?;
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_have_stable_significant_figures() {
        assert_eq!(number(Some(196.133), 4), "196.1");
        assert_eq!(number(Some(0.012345), 3), "0.0123");
        assert_eq!(number(Some(12345.6), 4), "12346");
        assert_eq!(number(None, 4), "—");
        assert_eq!(number(Some(Real::NAN), 4), "—");
    }
}

//! The human-readable summary of `reeve check`: headline first, then the largest losses
//! and drum torques, the geometry, warnings, and the caution. Quantities are shown in
//! the rig file's own units.

use std::io::{self, Write};

use crate::math::Real;
use crate::model::Rig;
use crate::solve::Outcome;
use crate::units::{Dimension, UnitSystem};

use super::{DriveKind, Headline, Report, Travel, CAUTION};

/// Formats a number with about `sig` significant figures, without exponent for the
/// everyday range, and `—` for a missing value.
pub fn number(x: Option<Real>, sig: usize) -> String {
    x.map_or("—".to_string(), |x| crate::units::significant(x, sig))
}

/// A quantity in the report's units: `12.3 N` ([`UnitSystem::show`]).
pub fn quantity(x: Option<Real>, dimension: Dimension, units: &UnitSystem) -> String {
    x.map_or("—".to_string(), |v| units.show(v, dimension))
}

fn percent(x: Option<Real>) -> String {
    match x {
        Some(v) if v.is_finite() => format!("{:.1} %", v * 100.0),
        _ => "—".to_string(),
    }
}

fn write_headline(w: &mut dyn Write, h: &Headline, units: &UnitSystem) -> io::Result<()> {
    let d = h.solve_for.quantity.dimension();
    let q = |x| quantity(x, d, units);
    writeln!(
        w,
        "Asked: the {} at `{}` (drive: `{}`)",
        h.solve_for.quantity.name(),
        h.solve_for.part,
        h.drive
    )?;
    if let Some(note) = &h.solve_for.note {
        writeln!(w, "  ({note})")?;
    }
    writeln!(
        w,
        "  {:<12} {:>14} {:>14} {:>14}",
        "", "ideal", "forward", "back"
    )?;
    writeln!(
        w,
        "  {:<12} {:>14} {:>14} {:>14}",
        h.solve_for.quantity.name(),
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
    writeln!(
        w,
        "  {:<12} {:>14} {:>14} {:>14}",
        "friction",
        "",
        q(h.friction_forward),
        q(h.friction_back)
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
    if let (Some(vr), ma) = h.ratio_words(units) {
        write!(w, "Velocity ratio {vr}")?;
        if let Some(p) = &h.load_part {
            write!(w, " (drive speed over `{p}` speed)")?;
        }
        match ma {
            Some(ma) => writeln!(w, ", mechanical advantage {ma}")?,
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
    if let Some((sentence, _)) = outcome(h, units) {
        writeln!(w, "{sentence}")?;
    }
    Ok(())
}

/// The drive's kind as a noun (`the counterweight`).
fn drive_noun(kind: DriveKind) -> &'static str {
    match kind {
        DriveKind::Pull => "the pull",
        DriveKind::Drum => "the drum",
        DriveKind::Counterweight => "the counterweight",
        DriveKind::FallingBlock => "the falling block",
    }
}

/// The drive as the outcome names it (`the pull at `hand``, `the counterweight `cw``;
/// a part already named for its kind, `counterweight`, by its name alone).
fn drive_name(h: &Headline) -> String {
    let d = &h.drive;
    let noun = drive_noun(h.drive_kind);
    match h.drive_kind {
        DriveKind::Pull => format!("{noun} at `{d}`"),
        _ if noun.ends_with(d.to_lowercase().as_str()) => format!("`{d}`"),
        _ => format!("{noun} `{d}`"),
    }
}

/// What happens, worded for what the drive is (a pull or a drum, which can give less
/// than they have; a counterweight or a falling block, which move the rig by themselves
/// or not at all), where the asked quantity is given: the sentence, and whether the
/// drive moves the rig. Failing outcomes carry a word in capitals for the terminal.
pub fn outcome(h: &Headline, units: &UnitSystem) -> Option<(String, bool)> {
    let given = h.available?;
    let moves = h.moves?;
    let d = h.solve_for.quantity.dimension();
    let q = |x: Real| quantity(Some(x), d, units);
    let margin = percent(h.margin);
    let drive_unknown = h.solve_for.part == h.drive;
    let [low, high] = h.holding_band;
    let (Some(forward), Some(low), Some(high)) = (h.forward.value, low, high) else {
        return None;
    };
    // Where the loads do the work forward (the drive holds them back or lets them run
    // away), or the given drive acts backward, the verdict of the outcome says what
    // happens in its own words.
    let reversed = drive_unknown && (h.ideal.value.is_some_and(|v| v < 0.0) || given < 0.0);
    if reversed || matches!(h.outcome, Some(Outcome::HoldsBack | Outcome::RunsAway)) {
        let (ok, head, why) = h.verdict(units)?;
        let head = if ok {
            head.to_string()
        } else {
            head.to_uppercase()
        };
        let why = if why.is_empty() {
            why
        } else {
            format!(": {why}")
        };
        return Some((
            format!(
                "{} {}: {}; {head}{why} (margin {margin})",
                capitalise(h.given_word()),
                h.solve_for.quantity.name(),
                q(given)
            ),
            ok,
        ));
    }
    let drive = drive_name(h);
    let subject = h.subject.as_ref();
    let load = subject.map_or("the rig".to_string(), |(n, _)| format!("`{n}`"));
    let (ahead, back) = Travel::words(subject.and_then(|(_, t)| *t));
    let fixed = h.drive_kind.fixed();
    let does = match h.drive_kind {
        DriveKind::Drum => "it turns and ",
        DriveKind::Counterweight | DriveKind::FallingBlock => "it sinks and ",
        DriveKind::Pull => "",
    };
    // Where the given value stands against the band, in the words of the quantity.
    let head = if drive_unknown {
        if fixed {
            format!("{}: {}", capitalise(&drive), q(given))
        } else {
            format!("{}: {} available", capitalise(&drive), q(given))
        }
    } else {
        format!(
            "The stated {} of {load}, {},",
            h.solve_for.quantity.name(),
            q(given)
        )
    };
    let sentence = match (drive_unknown, fixed, moves) {
        (true, false, true) => format!(
            "{head}, above the {} needed forward: {does}{load} {ahead}",
            q(forward)
        ),
        (true, false, false) => format!(
            "{head}, below the {} needed forward: IT CANNOT MOVE {load}",
            q(forward)
        ),
        (true, true, true) => format!(
            "{head}, above the forward value {}: {does}{load} {ahead} by itself",
            q(forward)
        ),
        (false, false, true) => format!(
            "{head} is within the {} that {drive} moves: {does}{load} {ahead}",
            q(forward)
        ),
        (false, false, false) => format!(
            "{head} is above the {} that {drive} moves: IT CANNOT MOVE {load}",
            q(forward)
        ),
        (false, true, true) => format!(
            "{head} is within the {} that {drive} moves: {does}{load} {ahead} by itself",
            q(forward)
        ),
        // A fixed drive that does not move the rig: held by friction inside the band,
        // or run back below it (drive unknown: below the back value; a load unknown:
        // a load above its back value).
        (true, true, false) | (false, true, false) => {
            let runs_back = if drive_unknown {
                given < low
            } else {
                given > high
            };
            let is = if drive_unknown { "," } else { " is" };
            let noun = drive_noun(h.drive_kind);
            if runs_back {
                format!(
                    "{head}{is} beyond the back value {}: {load} {back} by itself and lifts {noun}",
                    q(if drive_unknown { low } else { high })
                )
            } else {
                format!(
                    "{head}{is} inside the holding band ({} to {}): friction holds {load} still; {noun} does not move it by itself",
                    q(low),
                    q(high)
                )
            }
        }
    };
    Some((format!("{sentence} (margin {margin})."), moves))
}

/// What a drive that does not move the rig fails to do, for counting samples: `the
/// pull at `hand` cannot move `hook``, ``cw` does not raise `sash` by itself`.
pub fn not_moving_words(h: &Headline) -> String {
    let subject = h.subject.as_ref();
    let load = subject.map_or("the rig".to_string(), |(n, _)| format!("`{n}`"));
    let verb = match subject.and_then(|(_, t)| *t) {
        Some(Travel::Up) => "raise",
        Some(Travel::Down) => "lower",
        Some(Travel::Turns) => "turn",
        _ => "move",
    };
    if h.drive_kind.fixed() {
        format!("`{}` does not {verb} {load} by itself", h.drive)
    } else {
        format!("{} cannot {verb} {load}", drive_name(h))
    }
}

/// The lost travel and spring rate at the drive in the report's units: a length and
/// force per length for a linear drive, degrees and torque per degree for a drum.
pub fn drive_spring_words(h: &Headline, units: &UnitSystem) -> Option<(String, String)> {
    let (travel, rate) = (h.lost_travel?, h.drive_stiffness?);
    Some(if h.drive_kind == DriveKind::Drum {
        let torque = units.torque;
        (
            format!("{}°", crate::units::significant(travel.to_degrees(), 4)),
            format!(
                "{} {}/°",
                crate::units::significant(rate.to_radians() / torque.si, 4),
                torque.symbol
            ),
        )
    } else {
        let (force, length) = (units.force, units.length);
        (
            quantity(Some(travel), Dimension::Length, units),
            format!(
                "{} {}/{}",
                crate::units::significant(rate * length.si / force.si, 4),
                force.symbol,
                length.symbol
            ),
        )
    })
}

/// The rope as a material (DESIGN.md §7), where a rope has `stiffness` or
/// `mass_per_length`: lost travel and spring rate at the drive, then each span's
/// stretch and end tensions in the forward case, and its sag (the largest over the
/// cases, as `sag_m`).
fn write_material(w: &mut dyn Write, report: &Report, units: &UnitSystem) -> io::Result<()> {
    let spans: Vec<_> = report
        .spans
        .iter()
        .filter(|s| s.stretch_m.is_some() || s.tension_n.forward_end.is_some() || s.sag_m.is_some())
        .collect();
    let spring = drive_spring_words(&report.headline, units);
    if spans.is_empty() && spring.is_none() {
        return Ok(());
    }
    let len = |x| quantity(x, Dimension::Length, units);
    let force = |x| quantity(x, Dimension::Force, units);
    writeln!(w)?;
    writeln!(w, "Rope as a material (forward):")?;
    if let Some((travel, rate)) = spring {
        writeln!(
            w,
            "  Lost travel at the drive: {travel} (spring rate {rate}, loaded parts held, no friction)."
        )?;
    }
    if !spans.is_empty() {
        writeln!(
            w,
            "  {:<10} {:>3}  {:<26} {:>12} {:>12} {:>12} {:>12}",
            "line", "#", "from → to", "stretch", "T at start", "T at end", "largest sag"
        )?;
        for s in spans {
            let (start, end) = s.tension_n.ends(crate::solve::Case::Forward);
            writeln!(
                w,
                "  {:<10} {:>3}  {:<26} {:>12} {:>12} {:>12} {:>12}",
                s.line,
                s.index,
                format!("{} → {}", s.from, s.to),
                len(s.stretch_m.as_ref().and_then(|p| p.forward)),
                force(start),
                force(end),
                len(s.sag_m)
            )?;
        }
    }
    Ok(())
}

/// The first letter in upper case.
pub fn capitalise(s: &str) -> String {
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
    let len = |x: Option<Real>| x.map_or("—".to_string(), |v| units.show_span(v));
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
        // Where the rope's bending costs anything, the part of each share it takes.
        let bending = report.headline.loss.has_bending();
        let bend = |x: Option<Real>| {
            if bending {
                format!(" {:>12}", percent(x))
            } else {
                String::new()
            }
        };
        writeln!(
            w,
            "  {:<16} {:<8} {:>12} {:>12}{}",
            "part",
            "kind",
            "of losses",
            "of input",
            if bending {
                format!(" {:>12}", "bending")
            } else {
                String::new()
            }
        )?;
        for p in losses.iter().take(8) {
            writeln!(
                w,
                "  {:<16} {:<8} {:>12} {:>12}{}",
                p.name,
                p.kind,
                percent(p.loss_share),
                percent(p.loss_of_input),
                bend(p.material.bend_loss_share)
            )?;
        }
        if losses.len() > 8 {
            writeln!(w, "  ... and {} more (see `reeve table`)", losses.len() - 8)?;
        }
    }
    // The rope-as-material lines (DESIGN.md §7), only where the rig has them.
    if let Some(kinds) = report.headline.loss.words(units) {
        writeln!(w, "Losses by kind (forward, at the drive): {kinds}")?;
    }
    if let Some(axial) = super::loss::axial_words(report, units) {
        writeln!(w)?;
        writeln!(w, "Axial pin loads (forward, along each axle): {axial}")?;
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
    write_material(w, report, units)?;
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
        "  {:<16} {:<10} {:>9} {:>10} {:>11} {:>7} {:>9} {:>12}",
        "part", "line", "wrap °", "fleet in °", "fleet out °", "D/d", "ratio fwd", "pin load fwd"
    )?;
    for p in &report.parts {
        for pass in &p.passages {
            writeln!(
                w,
                "  {:<16} {:<10} {:>9} {:>10} {:>11} {:>7} {:>9} {:>12}",
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
        for warning in &crate::checks::grouped(&report.warnings) {
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

//! Checks on the rope as a material (DESIGN.md §7): values that load fine and solve,
//! but describe no rope, so the figures they give mean nothing (issue 11, "never
//! silently wrong"). Each is a warning, not a failure: the figures stand as computed
//! from the inputs, and the warning says why they should not be trusted.
//!
//! Limits and their basis:
//! - Strain above [`STRAIN_LIMIT`] (10 %): the stretch model `T·L/EA` holds the spans at
//!   their drawn lengths and EA constant, a small-strain model. Steel wire rope
//!   stretches about 1 % at working load, fibre ropes a few per cent and the stretchiest
//!   a little over 10 % (common practice); beyond that the given `stiffness` is not an
//!   EA (often a spring rate or a modulus written where a force belongs).
//! - `bend_loss` above [`BEND_LOSS_LIMIT`] (0.2): the handbooks take about 2 % per
//!   wire-rope sheave for bending and bearing together, and the rescue-pulley figures of
//!   [`crate::friction::bending`] (84.2 % efficiency for one 180° deflection, bearing
//!   included) leave under 16 % for bending; 0.2 is above both (often a percentage
//!   written as a fraction's hundredfold, or a sheave's whole loss).
//! - A rope heavier or stiffer than a solid steel bar of its nominal diameter: steel
//!   7850 kg/m³ and E = 210 GPa (handbook values, from memory); a rope's metallic area
//!   is well below its circle's (about 0.4 d² against 0.785 d² for 6x19 wire rope,
//!   common practice), so the limits keep a 25 % margin for a measured diameter above
//!   nominal.
//! - A rope diameter outside [`ROPE_DIAMETER_RANGE`] (0.05 mm to 0.25 m): the finest
//!   monofilament line is about 0.08 mm and the largest mooring hawsers about 0.2 m
//!   (common practice); outside that the value is almost always written in the wrong
//!   unit (`diameter: 6` in a metre file), and every figure that follows reads clean.
//! - A span whose own weight pulls its ends more than [`SAG_SLOPE_LIMIT`] (0.2 rad,
//!   about 11°) off the straight chord the statics keeps: with run `a`, weight `q` per
//!   length and tension `T`, the parabolic cable leaves each end at `q·a/(2T)` to its
//!   chord (J. L. Meriam and L. G. Kraige, *Engineering Mechanics: Statics*, §5/9,
//!   "Flexible cables": sag `q·a²/(8T)`, end slope `4·sag/a`), so wraps, pin load
//!   directions and end tensions are off by that much; beyond 1 the tension shown cannot
//!   even carry half the span's weight.

use super::{warn, Warning};
use crate::math::Real;
use crate::model::Rig;
use crate::solve::Solution;
use crate::units::{show_in, significant, unit, Dimension};

/// Strain (tension over EA) above which a span's stretch is flagged.
pub const STRAIN_LIMIT: Real = 0.10;
/// Bend loss per passage above which a rope's `bend_loss` is flagged.
pub const BEND_LOSS_LIMIT: Real = 0.2;
/// End slope to the chord (rad) above which a span's sag is flagged.
pub const SAG_SLOPE_LIMIT: Real = 0.2;
/// Rope diameters, m, outside which no rope exists (see the module notes).
pub const ROPE_DIAMETER_RANGE: (Real, Real) = (0.05e-3, 0.25);
/// Density of steel, kg/m³ (handbook value, from memory).
const STEEL_DENSITY: Real = 7850.0;
/// Young's modulus of steel, Pa (handbook value, from memory).
const STEEL_MODULUS: Real = 210e9;
/// Margin over a solid steel bar of the nominal diameter.
const SOLID_MARGIN: Real = 1.25;

/// Rope keys that describe no rope: a diameter no rope has, a bend loss far above
/// published figures, a rope heavier or stiffer than solid steel of its diameter.
pub fn rope_checks(rig: &Rig) -> Vec<Warning> {
    let mut out = Vec::new();
    for rope in &rig.ropes {
        let name = &rope.name;
        let (thinnest, thickest) = ROPE_DIAMETER_RANGE;
        if rope.diameter < thinnest || rope.diameter > thickest {
            out.push(warn(
                "rope-diameter",
                None,
                false,
                format!(
                    "rope `{name}`: `diameter` {} is {} than any rope (about {} to {}); check the value and its unit (bare numbers are in the file's length unit, {})",
                    rig.units.show(rope.diameter, crate::units::Dimension::Length),
                    if rope.diameter > thickest { "thicker" } else { "thinner" },
                    rig.units.show(thinnest, crate::units::Dimension::Length),
                    rig.units.show(thickest, crate::units::Dimension::Length),
                    rig.units.length.symbol
                ),
            ));
        }
        if rope.bend_loss > BEND_LOSS_LIMIT {
            out.push(warn(
                "bend-loss",
                None,
                false,
                format!(
                    "rope `{name}`: `bend_loss` {} loses {} % of the tension at every passage; published figures are a few per cent (about 2 % per wire-rope sheave, bearing included), so check that it is a fraction (0.02 for 2 %) and not a sheave's whole loss",
                    significant(rope.bend_loss, 3),
                    significant(100.0 * rope.bend_loss, 3)
                ),
            ));
        }
        let area = std::f64::consts::PI * rope.diameter * rope.diameter / 4.0;
        if area.is_nan() || area <= 0.0 {
            continue;
        }
        if let Some(m) = rope.mass_per_length {
            let solid = STEEL_DENSITY * area;
            // No `units` key names a mass per length (bare numbers are kg/m); shown in
            // lb/ft where the masses are shown in pounds.
            let per_length = if rig.units.mass.symbol == unit::LB.symbol {
                unit::LB_PER_FT
            } else {
                unit::KG_PER_M
            };
            if m > SOLID_MARGIN * solid {
                out.push(warn(
                    "rope-weight",
                    None,
                    false,
                    format!(
                        "rope `{name}`: `mass_per_length` {} is {} times a solid steel bar of its diameter ({}); no rope weighs that, so check the value and its unit",
                        show_in(m, per_length),
                        significant(m / solid, 3),
                        show_in(solid, per_length)
                    ),
                ));
            }
        }
        if let Some(ea) = rope.stiffness {
            let solid = STEEL_MODULUS * area;
            if ea > SOLID_MARGIN * solid {
                out.push(warn(
                    "rope-stiffness",
                    None,
                    false,
                    format!(
                        "rope `{name}`: `stiffness` {} is {} times the EA of a solid steel bar of its diameter ({}); no rope is that stiff, so check the value and its unit (EA is a force: the tension that would double the length)",
                        rig.units.show(ea, Dimension::Force),
                        significant(ea / solid, 3),
                        rig.units.show(solid, Dimension::Force)
                    ),
                ));
            }
        }
    }
    out
}

/// Lines whose rope stretches beyond [`STRAIN_LIMIT`] in some span and case: the
/// stretch, lost travel and spring rate shown are outside the model's range.
pub fn stretch_checks(rig: &Rig, solution: &Solution) -> Vec<Warning> {
    let mut out = Vec::new();
    for (l, line) in rig.lines.enumerate() {
        let Some(ea) = rig.rope_of(l).stiffness else {
            continue;
        };
        // The largest strain of the line over its spans, the three cases and sub-rigs.
        let mut worst: Option<(Real, usize, &'static str)> = None;
        for sub in &solution.subrigs {
            for case in [&sub.ideal, &sub.forward, &sub.back] {
                let (Some(start), Some(end)) = (case.tension.get(l), case.tension_end.get(l))
                else {
                    continue;
                };
                for (j, (&a, &b)) in start.iter().zip(end).enumerate() {
                    let strain = a.max(b) / ea;
                    if strain.is_finite() && !matches!(worst, Some((w, _, _)) if w >= strain) {
                        worst = Some((strain, j, case.case.name()));
                    }
                }
            }
        }
        if let Some((strain, span, case)) = worst.filter(|w| w.0 > STRAIN_LIMIT) {
            out.push(warn(
                "large-stretch",
                Some(&line.name),
                false,
                format!(
                    "line `{}`: the rope stretches {} % of its length in span {span} ({case}) at its `stiffness` {}; the stretch model holds for small strains (spans at their drawn lengths), and ropes stretch at most about 10 % at working load, so the stretch, lost travel and split shown mean nothing (check that `stiffness` is EA, a force)",
                    line.name,
                    significant(100.0 * strain, 3),
                    rig.units.show(ea, crate::units::Dimension::Force)
                ),
            ));
        }
    }
    out
}

/// Spans whose own weight pulls them far off the straight chord the statics keeps
/// ([`SAG_SLOPE_LIMIT`]), in their slackest case.
pub fn sag_checks(rig: &Rig, solution: &Solution) -> Vec<Warning> {
    let mut out = Vec::new();
    let up = -rig.gravity.into_inner();
    for (l, line) in rig.lines.enumerate() {
        let q = rig.rope_of(l).mass_per_length.unwrap_or(0.0) * crate::math::STANDARD_GRAVITY;
        let Some(spans) = solution.geometry.lines.get(l).map(|g| &g.spans) else {
            continue;
        };
        if q.is_nan() || q <= 0.0 {
            continue;
        }
        // The largest end slope over the spans, cases and sub-rigs: (slope, span, T).
        let mut worst: Option<(Real, usize, Real)> = None;
        for sub in &solution.subrigs {
            for case in [&sub.ideal, &sub.forward, &sub.back] {
                let (Some(start), Some(end)) = (case.tension.get(l), case.tension_end.get(l))
                else {
                    continue;
                };
                for (j, ((&a, &b), span)) in start.iter().zip(end).zip(spans).enumerate() {
                    let chord = span.end - span.start;
                    let run = (chord - up * chord.dot(&up)).norm();
                    let tension = 0.5 * (a + b);
                    // A slack span is the `slack-span` check's.
                    if tension.is_nan() || tension <= 0.0 {
                        continue;
                    }
                    let slope = q * run / (2.0 * tension);
                    if slope.is_finite() && !matches!(worst, Some((w, _, _)) if w >= slope) {
                        worst = Some((slope, j, tension));
                    }
                }
            }
        }
        if let Some((slope, j, tension)) = worst.filter(|w| w.0 > SAG_SLOPE_LIMIT) {
            let span = &spans[j];
            let chord = span.end - span.start;
            let run = (chord - up * chord.dot(&up)).norm();
            let force = |x| rig.units.show(x, crate::units::Dimension::Force);
            let tail = if slope >= 1.0 {
                format!(
                    "the tension shown ({}) cannot even carry half the span's weight ({}), so the figures of this line mean nothing",
                    force(tension),
                    force(0.5 * q * run)
                )
            } else {
                "so its wraps, pin load directions and end tensions are off by that much"
                    .to_string()
            };
            out.push(warn(
                "large-sag",
                Some(&line.name),
                false,
                format!(
                    "line `{}`: span {j} sags so far under the rope's own weight that its ends leave the straight chord the statics assumes by about {}° (rope weight across the span {} against a tension of {}); {tail}",
                    line.name,
                    significant(slope.atan().to_degrees(), 3),
                    force(q * run),
                    force(tension)
                ),
            ));
        }
    }
    out
}

//! One [`Report`] built from a solved rig, then one writer per format. The report's
//! fields are the `check --json` contract of DESIGN.md §5: SI numbers, keys carrying
//! their units, angles in degrees; `None` becomes JSON `null`, never NaN.

pub mod asked;
pub mod chart;
mod drive;
pub mod dxf;
pub mod escape;
pub mod file;
pub mod format;
pub mod html;
pub mod loss;
pub mod material;
pub mod motion;
pub mod study;
pub mod svg;
pub mod table;
pub mod text;

mod owners;
use owners::Owners;

use serde::Serialize;

use crate::checks::Warning;
use crate::math::{Real, Vector};
use crate::model::{PartId, PartKind, Rig};
use crate::solve::{given_quantity, Case, Outcome, Solution, SubRigSolution};
use crate::units::UnitSystem;

pub use asked::{Asked, Role};
use drive::travel;
pub use drive::{DriveKind, Travel};
pub use format::{DrawingFormat, Format};
use material::span_material;
pub use material::SpanTension;

/// The caution every human-readable report ends with (DESIGN.md §6).
pub const CAUTION: &str =
    "Caution: these figures are estimates from the stated friction models and inputs. \
Rigging that holds loads over people or is used for life safety must follow local codes and \
standards and be checked by a competent, licensed person.";

/// Finite or nothing: keeps NaN and infinities out of every output.
pub fn finite(x: Real) -> Option<Real> {
    x.is_finite().then_some(x)
}

/// An efficiency fit to show: a share of the power between 0 and 1 (round-off within 1e-9
/// of either end is clamped). Anything else (a back value of the opposite sign to the ideal
/// value, as in a self-locking rig, gives `back/ideal < 0`) is not an efficiency and is
/// `None`: JSON leaves it out, and the text says why ([`Headline::efficiency_notes`]).
pub fn efficiency(x: Option<Real>) -> Option<Real> {
    const ROUND_OFF: Real = 1e-9;
    match x? {
        e if (-ROUND_OFF..=1.0 + ROUND_OFF).contains(&e) => Some(e.clamp(0.0, 1.0)),
        _ => None,
    }
}

/// One case's headline.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct CaseHeadline {
    /// The asked quantity in this case, SI.
    pub value: Option<Real>,
    /// Efficiency (DESIGN.md §3), between 0 and 1 ([`efficiency`]); absent for the ideal
    /// case and where no efficiency applies.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub efficiency: Option<Real>,
}

/// Three numbers, one per case.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct PerCase {
    /// No friction.
    pub ideal: Option<Real>,
    /// Driving forward.
    pub forward: Option<Real>,
    /// Running back.
    pub back: Option<Real>,
}

/// Forward and back only.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct ForwardBack<T> {
    /// Driving forward.
    pub forward: T,
    /// Running back.
    pub back: T,
}

/// A span row.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct SpanReport {
    /// Line name.
    pub line: String,
    /// Span index along the line, from 0.
    pub index: usize,
    /// Part it leaves.
    pub from: String,
    /// Part it reaches.
    pub to: String,
    /// Length, m.
    pub length_m: Option<Real>,
    /// Tension per case, N, at the span's start; with rope weight also at its end.
    pub tension_n: SpanTension,
    /// Stretch per case, m, where the rope has a `stiffness` (DESIGN.md §7).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub stretch_m: Option<PerCase>,
    /// Sag under the rope's own weight, m: the largest vertical distance of the catenary
    /// below the chord, the largest over the cases, for a span within 45° of level
    /// where the rope has a `mass_per_length`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sag_m: Option<Real>,
    /// Breaking strength over the larger of the forward and back tensions.
    pub safety_factor: Option<Real>,
    /// Unit direction from `from` to `to`.
    pub direction: [Real; 3],
}

/// A passage of a line over a round part.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct PassageReport {
    /// Line name.
    pub line: String,
    /// Path entry index.
    pub entry: usize,
    /// Wrap, degrees (extra turns included).
    pub wrap_deg: Option<Real>,
    /// Fleet angle of the arriving span, degrees.
    pub fleet_in_deg: Option<Real>,
    /// Fleet angle of the leaving span, degrees.
    pub fleet_out_deg: Option<Real>,
    /// Tread diameter over rope diameter.
    pub bend_ratio: Option<Real>,
    /// Tight over slack tension.
    pub tension_ratio: ForwardBack<Option<Real>>,
}

/// A part row.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct PartReport {
    /// Name.
    pub name: String,
    /// Whether the part is in the main sub-rig (the drive's), whose losses text reports
    /// list. Not in the JSON.
    #[serde(skip_serializing)]
    pub in_main: bool,
    /// Kind as written.
    pub kind: &'static str,
    /// Largest wrap over its passages, degrees.
    pub wrap_deg: Option<Real>,
    /// Largest fleet angle over its passages, degrees.
    pub fleet_deg: Option<Real>,
    /// Tread diameter over rope diameter (smallest over its passages).
    pub bend_ratio: Option<Real>,
    /// Magnitude of the resultant load on the part, N (own weight included).
    pub pin_load_n: ForwardBack<Option<Real>>,
    /// Unit direction of that load.
    pub pin_load_direction: ForwardBack<Option<[Real; 3]>>,
    /// Magnitude of the resultant load without friction (ideal case), N.
    pub pin_load_ideal_n: Option<Real>,
    /// Unit direction of the ideal-case load.
    pub pin_load_direction_ideal: Option<[Real; 3]>,
    /// Share of all losses lost at this part, forward case (0 to 1).
    pub loss_share: Option<Real>,
    /// Power lost here over the power put in (the drive's, or the loads' where they
    /// drive the rig), forward case (0 to 1).
    pub loss_of_input: Option<Real>,
    /// Axial pin load and bending share (DESIGN.md §7), flattened into the part.
    #[serde(flatten)]
    pub material: loss::PartLoads,
    /// The part's passages.
    pub passages: Vec<PassageReport>,
}

/// Torques at a drum.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct DrumReport {
    /// Drum name.
    pub name: String,
    /// Net rope torque along the motion, N·m.
    pub rope_torque_nm: ForwardBack<Option<Real>>,
    /// Steady load torque, N·m.
    pub load_torque_nm: Option<Real>,
    /// Drag torque, N·m.
    pub drag_nm: Option<Real>,
    /// Journal friction torque, N·m.
    pub journal_nm: ForwardBack<Option<Real>>,
    /// Thrust friction torque, N·m.
    pub thrust_nm: Option<Real>,
    /// Forward rope torque minus (load + drag), N·m: what journal, thrust and bending take.
    pub margin_nm: Option<Real>,
}

/// The headline of one sub-rig.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Headline {
    /// What is solved for.
    #[serde(serialize_with = "Asked::serialize_in_report")]
    pub solve_for: Asked,
    /// The drive part.
    pub drive: String,
    /// Ideal case.
    pub ideal: CaseHeadline,
    /// Forward case.
    pub forward: CaseHeadline,
    /// Back case.
    pub back: CaseHeadline,
    /// Forward from rest with static coefficients, where any bearing gives `mu_static`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub breakaway: Option<CaseHeadline>,
    /// Whether the rig will not run back by itself.
    pub self_locking: bool,
    /// The friction at the drive going forward, in the asked quantity's SI unit: forward
    /// − ideal for a drive unknown (the effort friction costs), ideal − forward for a
    /// load unknown (the load friction keeps the drive from moving). Where loads balance
    /// (a line set) efficiency says little and this says what friction costs.
    pub friction_forward: Option<Real>,
    /// The friction at the drive running back, same unit: ideal − back for a drive
    /// unknown, back − ideal for a load unknown.
    pub friction_back: Option<Real>,
    /// Drive speed over load speed.
    pub velocity_ratio: Option<Real>,
    /// Unit of the velocity ratio: `1`, or `rad/m` / `m/rad` where a drum drives a
    /// linear load or the reverse.
    pub velocity_ratio_unit: &'static str,
    /// The load part for the velocity ratio.
    pub load_part: Option<String>,
    /// Velocity ratio × forward efficiency.
    pub mechanical_advantage: Option<Real>,
    /// Values between which friction holds the rig still: [low, high].
    pub holding_band: [Option<Real>; 2],
    /// Given value of the asked quantity (available drive or stated load), SI.
    pub available: Option<Real>,
    /// Relative margin of the given value over what the rig needs, positive exactly when
    /// `moves` ([`SubRigSolution::margin`]): (available − forward)/|forward| for a drive
    /// unknown, the reverse where the drive holds the load back, (forward − stated)/|stated|
    /// for a load unknown.
    pub margin: Option<Real>,
    /// Whether the drive does what the rig needs: moves it forward, or, where the load
    /// runs the rig forward by itself, holds it back (None when nothing is given).
    pub moves: Option<bool>,
    /// What the given value does: `moves`, `holds-back`, `held-still`, `runs-back` or
    /// `runs-away` (None when nothing is given).
    pub outcome: Option<Outcome>,
    /// Energy audit misfit per case (fraction of drive power).
    pub energy_audit: PerCase,
    /// The lost travel at the drive, in the drive's SI unit (m, or rad for a drum),
    /// where ropes have a `stiffness` ([`SubRigSolution::lost_travel`]).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub lost_travel: Option<Real>,
    /// The rig's spring rate at the drive, N/m (N*m/rad for a drum), where ropes have a
    /// `stiffness` ([`SubRigSolution::drive_stiffness`]).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub drive_stiffness: Option<Real>,
    /// The audit's losses by kind (`loss.bearing`, `loss.bending`, ...; DESIGN.md §7).
    pub loss: loss::LossReport,
    /// What drives the rig, for the outcome's wording. Not in the JSON.
    #[serde(skip_serializing)]
    pub drive_kind: DriveKind,
    /// The part the outcome speaks of (the moved load for a drive unknown, the asked
    /// load otherwise) and which way it goes forward. Not in the JSON.
    #[serde(skip_serializing)]
    pub subject: Option<(String, Option<Travel>)>,
    /// Whether a span would need a negative tension forward or back (the slack-span
    /// check fails): the efficiency notes say so. Not in the JSON.
    #[serde(skip_serializing)]
    pub slack: bool,
}

impl Headline {
    /// The self-locking sentence, as every human-readable report words it.
    pub fn self_locking_words(&self) -> &'static str {
        let drive_unknown = self.solve_for.part == self.drive;
        if self.self_locking && drive_unknown && self.ideal.value.is_some_and(|v| v < 0.0) {
            "Self-locking: yes; friction alone stops the load driving it forward"
        } else if self.self_locking {
            "Self-locking: yes; it will not run back by itself"
        } else if drive_unknown && self.forward.value.is_some_and(|v| v < 0.0) {
            "Self-locking: no; the load drives it forward by itself unless the drive holds back harder than the forward value"
        } else if drive_unknown {
            "Self-locking: no; it runs back by itself below the back value"
        } else {
            // A load unknown: `back` is the least load that drives the rig back.
            "Self-locking: no; a load above the back value runs it back"
        }
    }

    /// What the given value does, in words: whether that is what the rig needs, the
    /// verdict (`the drive cannot hold the rig`) and why (`the load runs it forward by
    /// itself and that pushes the same way, so it runs away`); None when nothing is
    /// given. Quantities in the report's units.
    pub fn verdict(&self, units: &UnitSystem) -> Option<(bool, &'static str, String)> {
        let given = self.available?;
        let q = |x: Option<Real>| x.map_or("—".to_string(), |v| units.show(v, self.dimension()));
        let forward = q(self.forward.value);
        let back = q(self.back.value);
        let drive_unknown = self.solve_for.part == self.drive;
        let backward = drive_unknown && given < 0.0;
        const MOVES: &str = "the drive moves the rig";
        const CANNOT_MOVE: &str = "the drive cannot move the rig";
        const CANNOT_HOLD: &str = "the drive cannot hold the rig";
        Some(match self.outcome? {
            Outcome::Moves => (true, MOVES, String::new()),
            Outcome::HoldsBack => (
                true,
                "the drive holds it back",
                "the load runs the rig forward by itself".to_string(),
            ),
            Outcome::HeldStill if backward => (
                false,
                CANNOT_MOVE,
                "that acts backward, so friction holds it still".to_string(),
            ),
            Outcome::HeldStill if drive_unknown => (
                false,
                CANNOT_MOVE,
                format!("friction holds it still; it needs {forward} to start forward"),
            ),
            Outcome::HeldStill => (
                false,
                CANNOT_MOVE,
                format!("that is above the most the drive moves, {forward}"),
            ),
            Outcome::RunsBack if backward => (
                false,
                CANNOT_MOVE,
                "that acts backward, so the rig runs back".to_string(),
            ),
            Outcome::RunsBack if drive_unknown => (
                false,
                CANNOT_MOVE,
                format!("it runs back below {back}; it needs {forward} to go forward"),
            ),
            Outcome::RunsBack => (
                false,
                CANNOT_MOVE,
                format!("that runs it back (above {back})"),
            ),
            Outcome::RunsAway if given >= 0.0 => (
                false,
                CANNOT_HOLD,
                format!("the load runs it forward by itself and that pushes the same way, so it runs away; holding it needs {forward} or less"),
            ),
            Outcome::RunsAway => (
                false,
                CANNOT_HOLD,
                format!("the load runs it forward by itself and that holds back less than the {forward} needed, so it runs away"),
            ),
        })
    }

    /// The velocity ratio and the mechanical advantage as the reports show them. Where a
    /// drum drives a linear load or the reverse they carry a length: that of the rig's
    /// torque unit, so that the mechanical advantage is the load over the effort in the
    /// units shown (`2.125 in/rad` and `2.125 in` for torques in lbf*in; `18.89 rad/m`
    /// and `17.94 per m` for N*m).
    pub fn ratio_words(&self, units: &UnitSystem) -> (Option<String>, Option<String>) {
        let length = units
            .torque
            .symbol
            .split('*')
            .nth(1)
            .and_then(crate::units::parse_unit)
            .unwrap_or(units.length);
        // The ratio's value per the file's length unit, and the two unit suffixes.
        let (scale, vr_unit, ma_unit) = match self.velocity_ratio_unit {
            "rad/m" => (
                length.si,
                format!(" rad/{}", length.symbol),
                format!(" per {}", length.symbol),
            ),
            "m/rad" => (
                1.0 / length.si,
                format!(" {}/rad", length.symbol),
                format!(" {}", length.symbol),
            ),
            _ => (1.0, String::new(), String::new()),
        };
        let show = |x: Option<Real>, unit: &str| {
            x.map(|x| format!("{}{unit}", crate::units::significant(x * scale, 4)))
        };
        (
            show(self.velocity_ratio, &vr_unit),
            show(self.mechanical_advantage, &ma_unit),
        )
    }

    /// The report dimension of the asked quantity.
    pub fn dimension(&self) -> crate::units::Dimension {
        self.solve_for.quantity.dimension()
    }

    /// Why a case shows no efficiency, one sentence per case that has a value but no
    /// efficiency (an out-of-range figure is never shown as a number).
    pub fn efficiency_notes(&self) -> Vec<String> {
        let ideal = self.ideal.value;
        [("forward", &self.forward), ("back", &self.back)]
            .into_iter()
            .filter(|(_, c)| c.value.is_some() && c.efficiency.is_none())
            .map(|(name, c)| {
                let why = match (ideal, c.value) {
                    (Some(0.0), _) => "the ideal value is zero".to_string(),
                    (Some(i), Some(v)) if i * v < 0.0 => {
                        let runs = if name == "back" { "back" } else { "forward" };
                        format!(
                            "the {name} value has the opposite sign to the ideal value, so the rig does not run {runs} by itself and no share of the power passes through"
                        )
                    }
                    // A rope that would have to push: the figures are no running rig's.
                    _ if self.slack => {
                        "the rope goes slack (see slack-span below), so no share of the power passes through it".to_string()
                    }
                    _ => "the figure would fall outside 0–100 %, which friction cannot give; please report this rig".to_string(),
                };
                format!("No {name} efficiency: {why}.")
            })
            .collect()
    }

    /// What the given value of the asked quantity is: the drive's `available` effort,
    /// or a load's `stated` value.
    pub fn given_word(&self) -> &'static str {
        if self.solve_for.part == self.drive {
            "available"
        } else {
            "stated"
        }
    }
}

/// The whole report.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Report {
    /// Format version of the rig file.
    pub format: u32,
    /// Rig title.
    pub title: String,
    /// Main sub-rig headline, flattened so the top level carries the contract keys.
    #[serde(flatten)]
    pub headline: Headline,
    /// Every span of every line.
    pub spans: Vec<SpanReport>,
    /// Every part.
    pub parts: Vec<PartReport>,
    /// Every drum.
    pub drums: Vec<DrumReport>,
    /// Findings.
    pub warnings: Vec<Warning>,
    /// Headlines of independent sub-rigs other than the main one.
    pub subrigs: Vec<Headline>,
    /// The cautionary note.
    pub caution: &'static str,
}

fn dir(v: &Vector) -> Option<[Real; 3]> {
    let n = v.norm();
    (n > 0.0 && n.is_finite()).then(|| [v.x / n, v.y / n, v.z / n])
}

/// Why the asked block's quantity is what it is, when the file states no `load`.
fn quantity_note(rig: &Rig, sub: &SubRigSolution) -> Option<String> {
    let part = &rig.parts[sub.solve_for];
    let PartKind::Block(b) = &part.kind else {
        return None;
    };
    if b.load_stated {
        return None;
    }
    Some(if b.load.is_force() {
        format!(
            "`{}` states no load and its travel is square to gravity, so the figure is the force against its `moves`",
            part.name
        )
    } else {
        format!(
            "`{}` states no load, so the figure is the mass it carries (acting along gravity); write `load: {{force: ~}}` for a force against its `moves`",
            part.name
        )
    })
}

fn headline(rig: &Rig, solution: &Solution, sub: &SubRigSolution) -> Headline {
    let available = given_quantity(rig, sub.solve_for);
    let (f, b) = (sub.forward.value, sub.back.value);
    let margin = available.and_then(|a| sub.margin(a));
    let outcome = available.map(|a| sub.outcome(a));
    let moves = outcome.map(Outcome::succeeds);
    Headline {
        solve_for: Asked::of(rig, sub),
        drive: rig.parts[sub.drive].name.clone(),
        slack: !sub.forward.slack.is_empty() || !sub.back.slack.is_empty(),
        ideal: CaseHeadline {
            value: finite(sub.ideal.value),
            efficiency: None,
        },
        forward: CaseHeadline {
            value: finite(f),
            efficiency: efficiency(sub.forward_efficiency()),
        },
        back: CaseHeadline {
            value: finite(b),
            efficiency: efficiency(sub.back_efficiency()),
        },
        breakaway: sub.breakaway.as_ref().map(|c| CaseHeadline {
            value: finite(c.value),
            efficiency: efficiency(finite(if sub.drive_unknown() {
                sub.ideal.value / c.value
            } else {
                c.value / sub.ideal.value
            })),
        }),
        self_locking: sub.self_locking(),
        friction_forward: finite(if sub.drive_unknown() {
            f - sub.ideal.value
        } else {
            sub.ideal.value - f
        }),
        friction_back: finite(if sub.drive_unknown() {
            sub.ideal.value - b
        } else {
            b - sub.ideal.value
        }),
        velocity_ratio: sub.velocity_ratio,
        velocity_ratio_unit: {
            let turns = |p: PartId| matches!(rig.parts[p].kind, PartKind::Drum(_));
            match (turns(sub.drive), sub.load_part.map(turns)) {
                (true, Some(false)) => "rad/m",
                (false, Some(true)) => "m/rad",
                _ => "1",
            }
        },
        load_part: sub.load_part.map(|p| rig.parts[p].name.clone()),
        mechanical_advantage: efficiency(sub.forward_efficiency()).and(sub.mechanical_advantage()),
        holding_band: [finite(f.min(b)), finite(f.max(b))],
        available,
        margin,
        moves,
        outcome,
        energy_audit: PerCase {
            ideal: finite(sub.ideal.audit_residual),
            forward: finite(sub.forward.audit_residual),
            back: finite(sub.back.audit_residual),
        },
        lost_travel: sub.lost_travel.and_then(finite),
        drive_stiffness: sub.drive_stiffness.and_then(finite),
        loss: loss::LossReport::of(rig, solution, sub),
        drive_kind: DriveKind::of(&rig.parts[sub.drive].kind),
        subject: (if sub.drive_unknown() {
            sub.load_part
        } else {
            Some(sub.solve_for)
        })
        .map(|p| (rig.parts[p].name.clone(), travel(rig, solution, p))),
    }
}

/// The wrap shown for a passage, radians: the geometry's, and at a line end, where
/// the rope is tied to a drum, the turns wound on it (`turns` of that path entry).
fn passage_wrap(
    rig: &Rig,
    line: &crate::model::Line,
    e: usize,
    g: &crate::geometry::EntryGeometry,
) -> Real {
    let end = e == 0 || e + 1 == line.path.len();
    if end && matches!(rig.parts[g.part].kind, PartKind::Drum(_)) {
        std::f64::consts::TAU * Real::from(g.turns)
    } else {
        g.wrap
    }
}

impl Report {
    /// Builds the report of a solved rig.
    pub fn build(rig: &Rig, solution: &Solution, warnings: Vec<Warning>) -> Report {
        let main = solution.main();
        let owners = Owners::of(rig, solution);
        let subrig = |k: Option<usize>| k.map(|k| &solution.subrigs[k]);
        // Each sub-rig's forward losses and input power, once.
        let forward_power: Vec<(Real, Real)> = solution
            .subrigs
            .iter()
            .map(|s| (s.forward.total_loss(), s.forward.input_power()))
            .collect();
        let mut spans = Vec::new();
        for (l, line) in rig.lines.enumerate() {
            let sub = subrig(owners.line[l]);
            let rope = rig.rope_of(l);
            for (j, span) in solution.geometry.lines[l].spans.iter().enumerate() {
                let t = |c: Case| {
                    sub.and_then(|s| s.case(c).tension[l].get(j).copied())
                        .and_then(finite)
                };
                let (ti, tf, tb) = (t(Case::Ideal), t(Case::Forward), t(Case::Back));
                let material = span_material(rig, solution, sub, l, j);
                let worst = [ti, tf, tb]
                    .into_iter()
                    .chain([
                        material.ends.ideal,
                        material.ends.forward,
                        material.ends.back,
                    ])
                    .flatten()
                    .fold(0.0, Real::max);
                spans.push(SpanReport {
                    line: line.name.clone(),
                    index: j,
                    from: rig.parts[line.path[j].part].name.clone(),
                    to: rig.parts[line.path[j + 1].part].name.clone(),
                    length_m: finite(span.length),
                    tension_n: SpanTension {
                        ideal: ti,
                        forward: tf,
                        back: tb,
                        ideal_end: material.ends.ideal,
                        forward_end: material.ends.forward,
                        back_end: material.ends.back,
                    },
                    stretch_m: material.stretch,
                    sag_m: material.sag,
                    safety_factor: rope.breaking_strength.and_then(|s| finite(s / worst)),
                    direction: [span.direction.x, span.direction.y, span.direction.z],
                });
            }
        }
        let mut parts = Vec::new();
        let mut drums = Vec::new();
        for (id, part) in rig.parts.enumerate() {
            let sub = subrig(owners.part[id]);
            let mut passages = Vec::new();
            if part.kind.round().is_some() {
                for &(l, e) in &owners.entries[id] {
                    let line = &rig.lines[l];
                    let g = &solution.geometry.lines[l].entries[e];
                    let lsub = subrig(owners.line[l]);
                    let ratio = |c: Case| lsub.and_then(|s| s.case(c).ratio[l][e]).and_then(finite);
                    passages.push(PassageReport {
                        line: line.name.clone(),
                        entry: e,
                        wrap_deg: finite(passage_wrap(rig, line, e, g).to_degrees()),
                        fleet_in_deg: g.fleet_in.map(Real::to_degrees),
                        fleet_out_deg: g.fleet_out.map(Real::to_degrees),
                        bend_ratio: g.bend_ratio,
                        tension_ratio: ForwardBack {
                            forward: ratio(Case::Forward),
                            back: ratio(Case::Back),
                        },
                    });
                }
            }
            let max = |f: &dyn Fn(&PassageReport) -> Option<Real>| {
                passages
                    .iter()
                    .filter_map(f)
                    .fold(None, |a: Option<Real>, x| Some(a.map_or(x, |a| a.max(x))))
            };
            let wrap_deg = max(&|p| p.wrap_deg);
            let fleet_deg = max(&|p| {
                p.fleet_in_deg
                    .into_iter()
                    .chain(p.fleet_out_deg)
                    .reduce(Real::max)
            });
            let bend_ratio = passages
                .iter()
                .filter_map(|p| p.bend_ratio)
                .fold(None, |a: Option<Real>, x| Some(a.map_or(x, |a| a.min(x))));
            // A fixed anchor belongs to no sub-rig; every sub-rig whose lines pull on it
            // adds to its load.
            // Only sub-rigs whose lines reach a part put a load on it.
            let pin = |c: Case| {
                owners.reached_by[id]
                    .iter()
                    .filter_map(|&k| solution.subrigs[k].case(c).pin_load[id])
                    .reduce(|a, b| a + b)
            };
            let (loss_share, loss_of_input) = match (sub, owners.part[id]) {
                (Some(s), Some(k)) => {
                    let (total, input) = forward_power[k];
                    let here = s.forward.loss[id];
                    (
                        if total > 0.0 {
                            finite(here / total)
                        } else {
                            Some(0.0)
                        },
                        finite(here / input),
                    )
                }
                _ => (None, None),
            };
            parts.push(PartReport {
                in_main: sub.is_some_and(|s| s.component == main.component),
                name: part.name.clone(),
                kind: part.kind.name(),
                wrap_deg,
                fleet_deg,
                bend_ratio,
                pin_load_n: ForwardBack {
                    forward: pin(Case::Forward).and_then(|v| finite(v.norm())),
                    back: pin(Case::Back).and_then(|v| finite(v.norm())),
                },
                pin_load_direction: ForwardBack {
                    forward: pin(Case::Forward).and_then(|v| dir(&v)),
                    back: pin(Case::Back).and_then(|v| dir(&v)),
                },
                pin_load_ideal_n: pin(Case::Ideal).and_then(|v| finite(v.norm())),
                pin_load_direction_ideal: pin(Case::Ideal).and_then(|v| dir(&v)),
                loss_share,
                loss_of_input,
                material: loss::PartLoads::of(
                    rig,
                    sub,
                    owners.part[id].map_or(0.0, |k| forward_power[k].0),
                    id,
                ),
                passages,
            });
            if let (PartKind::Drum(d), Some(s)) = (&part.kind, sub) {
                let fw = s.forward.drums[id];
                let bk = s.back.drums[id];
                drums.push(DrumReport {
                    name: part.name.clone(),
                    rope_torque_nm: ForwardBack {
                        forward: fw.and_then(|t| finite(t.rope)),
                        back: bk.and_then(|t| finite(t.rope)),
                    },
                    // A driving drum has no load torque: its torque is the asked one.
                    load_torque_nm: fw.map(|t| t.load).filter(|_| id != s.drive),
                    drag_nm: Some(d.drag),
                    journal_nm: ForwardBack {
                        forward: fw.map(|t| t.journal),
                        back: bk.map(|t| t.journal),
                    },
                    thrust_nm: fw.map(|t| t.thrust),
                    // A driving drum's rope torque resists it, so rope − load − drag
                    // is not what its bearings take; its margin is the headline's.
                    margin_nm: fw
                        .and_then(|t| finite(t.rope - t.load - t.drag))
                        .filter(|_| id != s.drive),
                });
            }
        }
        Report {
            format: 1,
            title: rig.title.clone(),
            headline: headline(rig, solution, main),
            spans,
            parts,
            drums,
            warnings,
            subrigs: solution
                .subrigs
                .iter()
                .skip(1)
                .map(|s| headline(rig, solution, s))
                .collect(),
            caution: CAUTION,
        }
    }

    /// Whether any warning fails the check (exit code 1).
    pub fn fails(&self) -> bool {
        self.warnings.iter().any(|w| w.fails)
    }
}

//! The quasi-static solver: kinematics, then statics for three cases (ideal, forward,
//! back), with the energy audit that doubles as the per-part loss breakdown.
//!
//! Each sub-rig (graph component) is solved on its own, with its own drive. The main
//! sub-rig is the one holding the rig's `drive`; its unknown is `solve_for`. Every other
//! moving sub-rig needs exactly one haul end, which is then its drive and its unknown.

pub mod bearing;
pub mod changing;
pub mod elastic;
mod error;
pub mod kinematics;
pub mod motion;
pub mod selfweight;
pub mod statics;
pub mod travel;
pub mod walk;

use std::borrow::Cow;

use crate::geometry::{self, Geometry, GeometryOptions};
use crate::math::{Real, Vector};
use crate::model::Network;
use crate::model::{PartId, PartKind, Rig};

use error::unknown_does_no_work;
pub use error::SolveError;
pub use kinematics::Kinematics;
pub use statics::{CaseResult, DrumTorques, Status};

/// Settings of the solve, with documented defaults.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SolveOptions {
    /// Relative change of every tension below which the fixed-point iteration for
    /// load-dependent pin friction stops (default 1e-12).
    pub tolerance: Real,
    /// Iteration cap of that fixed point (default 200).
    pub max_iterations: usize,
    /// Relative singular-value threshold for rank decisions in the statics (default 1e-9).
    pub rank_tolerance: Real,
    /// Relative singular-value threshold below which a combination of line-length
    /// constraints counts as a motion (default 1e-4). Nearly parallel lines that share
    /// one block (the lift lines of a batten, a few milliradians apart) would lock the
    /// rig if the rope were perfectly rigid; real rope takes up the misfit (here at most
    /// 1e-4 of the travel) by stretch, so the rig moves.
    pub motion_tolerance: Real,
    /// Geometry settings.
    pub geometry: GeometryOptions,
}

impl Default for SolveOptions {
    fn default() -> Self {
        SolveOptions {
            tolerance: 1e-12,
            max_iterations: 200,
            rank_tolerance: 1e-9,
            motion_tolerance: 1e-4,
            geometry: GeometryOptions::default(),
        }
    }
}

/// Which of the three cases.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Case {
    /// No friction anywhere.
    Ideal,
    /// The drive moves the load.
    Forward,
    /// The load moves the drive back.
    Back,
}

impl Case {
    /// Lowercase name, as in the JSON.
    pub fn name(self) -> &'static str {
        match self {
            Case::Ideal => "ideal",
            Case::Forward => "forward",
            Case::Back => "back",
        }
    }
    /// Direction of motion: +1 forward (and ideal), −1 back.
    pub fn sign(self) -> Real {
        match self {
            Case::Back => -1.0,
            _ => 1.0,
        }
    }
}

/// The natural quantity of the unknown part.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Quantity {
    /// Force, N.
    Force,
    /// Mass, kg.
    Mass,
    /// Torque, N·m.
    Torque,
}

impl Quantity {
    /// Lowercase name.
    pub fn name(self) -> &'static str {
        match self {
            Quantity::Force => "force",
            Quantity::Mass => "mass",
            Quantity::Torque => "torque",
        }
    }
    /// SI unit symbol.
    pub fn si_unit(self) -> &'static str {
        match self {
            Quantity::Force => "N",
            Quantity::Mass => "kg",
            Quantity::Torque => "N*m",
        }
    }
    /// The matching report dimension.
    pub fn dimension(self) -> crate::units::Dimension {
        match self {
            Quantity::Force => crate::units::Dimension::Force,
            Quantity::Mass => crate::units::Dimension::Mass,
            Quantity::Torque => crate::units::Dimension::Torque,
        }
    }
}

/// The natural quantity of a part (what `solve_for` asks for).
pub fn natural_quantity(rig: &Rig, part: PartId) -> Option<Quantity> {
    match &rig.parts[part].kind {
        PartKind::Haul(_) => Some(Quantity::Force),
        PartKind::Weight(_) => Some(Quantity::Mass),
        PartKind::Drum(_) => Some(Quantity::Torque),
        PartKind::Block(b) => Some(if b.load.is_force() {
            Quantity::Force
        } else {
            Quantity::Mass
        }),
        _ => None,
    }
}

/// The given value of a part's natural quantity (available drive or stated load), SI.
pub fn given_quantity(rig: &Rig, part: PartId) -> Option<Real> {
    match &rig.parts[part].kind {
        PartKind::Haul(h) => h.force,
        PartKind::Weight(w) => w.mass,
        PartKind::Drum(d) => d.torque,
        PartKind::Block(b) => b.load.value(),
        _ => None,
    }
}

/// What the given value of the asked quantity (the drive's available effort, or a
/// stated load) does to the rig: the one verdict that the report, the checks and the
/// studies all read.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Outcome {
    /// The drive moves the rig forward (available ≥ forward, or stated load ≤ forward).
    Moves,
    /// The load runs the rig forward by itself (forward value below zero) and the drive
    /// holds it back (available ≤ forward): it lowers under control, or stands.
    HoldsBack,
    /// Friction holds the rig still: the drive cannot move it.
    HeldStill,
    /// The rig runs back: the drive cannot move it.
    RunsBack,
    /// The load runs the rig forward by itself and the drive does not hold it back
    /// (available above the forward value, the same way the load drives it or too weak).
    RunsAway,
}

impl Outcome {
    /// Whether the drive does what the rig needs of it (moves it, or holds it back).
    pub fn succeeds(self) -> bool {
        matches!(self, Outcome::Moves | Outcome::HoldsBack)
    }
}

/// One sub-rig's answer.
#[derive(Debug, Clone)]
pub struct SubRigSolution {
    /// Index of the sub-rig in [`Network::components`].
    pub component: usize,
    /// Its drive.
    pub drive: PartId,
    /// Its unknown.
    pub solve_for: PartId,
    /// The unknown's quantity.
    pub quantity: Quantity,
    /// The ideal, forward and back cases.
    pub ideal: CaseResult,
    /// Forward.
    pub forward: CaseResult,
    /// Back.
    pub back: CaseResult,
    /// Forward from rest with static coefficients, when any bearing gives `mu_static`.
    pub breakaway: Option<CaseResult>,
    /// Drive speed over load speed (natural units), when a load moves.
    pub velocity_ratio: Option<Real>,
    /// The load part used for the velocity ratio.
    pub load_part: Option<PartId>,
    /// The rig's spring rate at the drive, N/m or N·m/rad, frictionless, with every
    /// loaded part held ([`elastic::drive_stiffness`]); None without rope `stiffness`.
    pub drive_stiffness: Option<Real>,
    /// The lost travel at the drive, m or rad: how far the drive moves from the
    /// unloaded rig (ropes just taut) until it holds its ideal value with every loaded
    /// part still where it stands (DESIGN.md §7), by the unit-load method over the ideal
    /// case's stretches ([`elastic::lost_travel`]): `|F_ideal| / drive_stiffness` where
    /// the ropes are weightless and the tensions in proportion to the drive's value; a
    /// rope's own weight counts as it hangs (half a span's weight at each end).
    pub lost_travel: Option<Real>,
}

impl SubRigSolution {
    /// The case result by name.
    pub fn case(&self, case: Case) -> &CaseResult {
        match case {
            Case::Ideal => &self.ideal,
            Case::Forward => &self.forward,
            Case::Back => &self.back,
        }
    }

    /// Whether the unknown is the drive's own quantity.
    pub fn drive_unknown(&self) -> bool {
        self.drive == self.solve_for
    }

    /// Whether the power flows from the drive to the loads in the forward case: always
    /// for a load unknown, and for a drive unknown when its ideal value is positive. A
    /// negative ideal drive value means the loads drive the rig forward by themselves
    /// (a winch drum paying out under its load) and the drive holds them back.
    fn drive_gives_power(&self) -> bool {
        !self.drive_unknown() || self.ideal.value >= 0.0
    }

    /// Forward efficiency, power out over power in (DESIGN.md §3): ideal/forward for a
    /// drive unknown, forward/ideal for a load unknown. Where the loads drive the rig
    /// forward (negative ideal drive value) the drive takes the power out, and the
    /// efficiency is forward/ideal.
    pub fn forward_efficiency(&self) -> Option<Real> {
        let (i, f) = (self.ideal.value, self.forward.value);
        let e = if self.drive_unknown() && self.drive_gives_power() {
            i / f
        } else {
            f / i
        };
        e.is_finite().then_some(e)
    }

    /// Back efficiency: back/ideal for a drive unknown, ideal/back for a load unknown;
    /// where the loads drive the rig forward (negative ideal drive value), running back
    /// is the drive lifting them, and the efficiency is ideal/back.
    pub fn back_efficiency(&self) -> Option<Real> {
        let (i, b) = (self.ideal.value, self.back.value);
        let e = if self.drive_unknown() && self.drive_gives_power() {
            b / i
        } else {
            i / b
        };
        e.is_finite().then_some(e)
    }

    /// Self-locking: with no effort from the drive, friction holds the rig where it is.
    ///
    /// For a drive unknown that is a holding band `[back, forward]` with zero inside it.
    /// Where the ideal value is positive this is DESIGN.md's rule, `back` of the opposite
    /// sign to `ideal` (it will not run back by itself); where the ideal value is negative
    /// (the load drives the rig forward, e.g. a winch paying out), it means friction
    /// alone stops the load running it forward. For a load unknown: `back` of the
    /// opposite sign to `ideal`.
    pub fn self_locking(&self) -> bool {
        if self.drive_unknown() {
            self.back.value < 0.0 && self.forward.value > 0.0
        } else {
            self.back.value * self.ideal.value < 0.0
        }
    }

    /// Whether the drive's job is to hold the load back: the unknown is the drive's own
    /// quantity and its forward value is below zero (the load runs the rig forward by
    /// itself, e.g. a winch paying out; DESIGN.md §3).
    pub fn drive_holds_back(&self) -> bool {
        self.drive_unknown() && self.forward.value < 0.0
    }

    /// What the given value `given` (SI) of the asked quantity does.
    ///
    /// Drive unknown, forward value `f ≥ 0`: moves at `given ≥ f`, held still down to the
    /// back value, runs back below it. `f < 0` (the load runs it forward): the drive
    /// holds it back at `given ≤ f`, else it runs away. Load unknown (`forward` is the
    /// greatest load moved, `back` the least that runs it back): moves at `given ≤ f`,
    /// held still up to `back`, runs back above it.
    pub fn outcome(&self, given: Real) -> Outcome {
        let (f, b) = (self.forward.value, self.back.value);
        if self.drive_holds_back() {
            if given <= f {
                Outcome::HoldsBack
            } else {
                Outcome::RunsAway
            }
        } else if self.drive_unknown() {
            if given >= f {
                Outcome::Moves
            } else if given >= b {
                Outcome::HeldStill
            } else {
                Outcome::RunsBack
            }
        } else if given <= f {
            Outcome::Moves
        } else if given <= b {
            Outcome::HeldStill
        } else {
            Outcome::RunsBack
        }
    }

    /// The relative margin of the given value over what the rig needs, positive exactly
    /// when [`Outcome::succeeds`]: `(given − f)/|f|` for a drive that moves the rig,
    /// `(f − given)/|f|` for a drive that holds the load back, `(f − given)/|given|` for a
    /// stated load. None when it is not finite (a zero divisor).
    pub fn margin(&self, given: Real) -> Option<Real> {
        let f = self.forward.value;
        let m = if self.drive_holds_back() {
            (f - given) / f.abs()
        } else if self.drive_unknown() {
            (given - f) / f.abs()
        } else {
            (f - given) / given.abs()
        };
        m.is_finite().then_some(m)
    }

    /// Mechanical advantage: velocity ratio × forward efficiency.
    pub fn mechanical_advantage(&self) -> Option<Real> {
        Some(self.velocity_ratio? * self.forward_efficiency()?)
    }
}

/// The whole answer for a rig.
#[derive(Debug, Clone)]
pub struct Solution {
    /// Geometry the solve used.
    pub geometry: Geometry,
    /// The graph and its sub-rigs.
    pub network: Network,
    /// Kinematics.
    pub kinematics: Kinematics,
    /// The main sub-rig (holding the drive) first, then the others.
    pub subrigs: Vec<SubRigSolution>,
}

impl Solution {
    /// The main sub-rig's solution.
    pub fn main(&self) -> &SubRigSolution {
        &self.subrigs[0]
    }
}

/// Solves a rig: geometry, kinematics, statics for ideal / forward / back.
///
/// # Errors
/// [`SolveError`] for rigs that cannot be built, moved, or balanced.
pub fn solve(rig: &Rig, options: &SolveOptions) -> Result<Solution, SolveError> {
    let geometry = geometry::compute(rig, &options.geometry)?;
    let network = Network::build(rig);

    // Pick each sub-rig's drive and unknown.
    let main_component = network.component_of[rig.drive];
    if rig.solve_for != rig.drive && network.component_of[rig.solve_for] != main_component {
        return Err(SolveError::NotDriven {
            part: rig.parts[rig.solve_for].name.clone(),
            drive: rig.parts[rig.drive].name.clone(),
        });
    }
    // A block drives only as a falling weight: its load must act along its travel.
    if let PartKind::Block(b) = &rig.parts[rig.drive].kind {
        if b.load.is_force() || rig.gravity.dot(&b.moves) <= 0.0 {
            return Err(SolveError::DriveAgainstItsLoad {
                drive: rig.parts[rig.drive].name.clone(),
            });
        }
    }
    let mut drives = vec![None; network.components.len()];
    let mut unknowns = vec![None; network.components.len()];
    for (c, members) in network.components.iter().enumerate() {
        let movers: Vec<PartId> = members
            .iter()
            .copied()
            .filter(|&p| {
                matches!(
                    rig.parts[p].kind,
                    PartKind::Block(_)
                        | PartKind::Weight(_)
                        | PartKind::Haul(_)
                        | PartKind::Drum(_)
                ) && !network.lines_at(p).is_empty()
            })
            .collect();
        if movers.is_empty() {
            continue;
        }
        if c == main_component {
            drives[c] = Some(rig.drive);
            unknowns[c] = Some(rig.solve_for);
        } else {
            let hauls: Vec<PartId> = members
                .iter()
                .copied()
                .filter(|&p| matches!(rig.parts[p].kind, PartKind::Haul(_)))
                .collect();
            if hauls.len() != 1 {
                return Err(SolveError::SubRigWithoutHaul {
                    parts: movers.iter().map(|&p| rig.parts[p].name.clone()).collect(),
                });
            }
            drives[c] = Some(hauls[0]);
            unknowns[c] = Some(hauls[0]);
        }
    }

    let kinematics =
        Kinematics::build(rig, &network, &geometry, &drives, options.motion_tolerance)?;

    let mut order: Vec<usize> = (0..network.components.len())
        .filter(|&c| drives[c].is_some())
        .collect();
    order.sort_by_key(|&c| (c != main_component, c));
    let mut subrigs = Vec::new();
    // Rig-wide: any static coefficient gives every sub-rig a breakaway case.
    let breakaway_case = has_static_friction(rig);
    for c in order {
        let (Some(drive), Some(solve_for)) = (drives[c], unknowns[c]) else {
            continue;
        };
        let parts = Parts {
            network: &network,
            geometry: &geometry,
            kinematics: &kinematics,
        };
        subrigs.push(solve_subrig(
            rig,
            &parts,
            c,
            drive,
            solve_for,
            breakaway_case,
            options,
            None,
        )?);
    }
    Ok(Solution {
        geometry,
        network,
        kinematics,
        subrigs,
    })
}

/// What the sub-rigs of one rig share: the graph, the geometry and the kinematics.
struct Parts<'a> {
    network: &'a Network,
    geometry: &'a Geometry,
    kinematics: &'a Kinematics,
}

/// Solves sub-rig `c` of `rig` with its drive and unknown: its statics for the three
/// cases (and breakaway when `breakaway_case`), its velocity ratio and load part; on
/// `layout` where the caller has the sub-rig's statics layout already.
#[allow(clippy::too_many_arguments)]
fn solve_subrig(
    rig: &Rig,
    parts: &Parts,
    c: usize,
    drive: PartId,
    solve_for: PartId,
    breakaway_case: bool,
    options: &SolveOptions,
    layout: Option<&statics::Layout>,
) -> Result<SubRigSolution, SolveError> {
    let Parts {
        network,
        geometry,
        kinematics,
    } = *parts;
    let quantity = natural_quantity(rig, solve_for).ok_or(SolveError::MissingQuantity {
        part: rig.parts[solve_for].name.clone(),
        quantity: "natural quantity (solve_for must be a haul, weight, block or drum)",
    })?;
    if let Some((reason, fix)) = unknown_does_no_work(rig, kinematics, drive, solve_for) {
        return Err(SolveError::UnknownDoesNoWork {
            part: rig.parts[solve_for].name.clone(),
            quantity: quantity.name(),
            reason,
            fix,
        });
    }
    let layout = match layout {
        Some(layout) => Cow::Borrowed(layout),
        None => Cow::Owned(statics::Layout::new(rig, network, geometry, kinematics, c)),
    };
    let problem =
        statics::Problem::with_layout(rig, geometry, kinematics, layout, drive, solve_for)?;
    if drive == solve_for {
        let square = problem.square_loads();
        if let Some(&first) = square.first() {
            let PartKind::Block(b) = &rig.parts[first].kind else {
                unreachable!("square_loads lists blocks only")
            };
            return Err(SolveError::LoadsDoNoWork {
                parts: square.iter().map(|&p| rig.parts[p].name.clone()).collect(),
                moves: b.moves.into_inner(),
                gravity: rig.gravity.into_inner(),
            });
        }
    }
    let ideal = problem.solve(Case::Ideal, options)?;
    let forward = problem.solve(Case::Forward, options)?;
    let back = problem.solve(Case::Back, options)?;
    let breakaway = if breakaway_case {
        Some(problem.solve_breakaway(options)?)
    } else {
        None
    };
    let load_part = if solve_for != drive {
        Some(solve_for)
    } else {
        // The part that takes the most power in the ideal case.
        ideal
            .load_power
            .entries()
            .filter(|(p, _)| *p != drive && network.component_of[*p] == c)
            .filter(|(_, w)| w.abs() > 0.0)
            .max_by(|a, b| a.1.abs().total_cmp(&b.1.abs()))
            .map(|(p, _)| p)
    };
    let velocity_ratio = load_part.and_then(|p| {
        let v = kinematics.dof_of_part[p].map(|i| kinematics.forward[i])?;
        let r = 1.0 / v.abs();
        r.is_finite().then_some(r)
    });
    let drive_stiffness = problem.drive_stiffness();
    let lost_travel = problem.lost_travel(&ideal);
    Ok(SubRigSolution {
        drive_stiffness,
        lost_travel,
        component: c,
        drive,
        solve_for,
        quantity,
        ideal,
        forward,
        back,
        breakaway,
        velocity_ratio,
        load_part,
    })
}

/// Solves sub-rig `subrigs[k]` of `base` again for `rig`, a copy of the rig `base`
/// solved that differs only in friction (bearings, coefficients of friction, drum
/// drag): the geometry, the graph and the kinematics do not depend on friction, so
/// `base`'s serve, and the other sub-rigs' answers cannot change. A study that changes
/// one part's friction solves one sub-rig, not the rig.
///
/// `breakaway_case` is [`has_static_friction`] of `rig` (the caller knows it from the
/// change it made, without a pass over the rig). The answer is the one [`solve`] gives
/// for that sub-rig of `rig`, to the bit.
///
/// # Errors
/// As [`solve`], for that sub-rig.
pub fn solve_again(
    rig: &Rig,
    base: &Solution,
    k: usize,
    breakaway_case: bool,
    options: &SolveOptions,
) -> Result<SubRigSolution, SolveError> {
    solve_again_on(rig, base, k, breakaway_case, options, None)
}

/// The statics layout of sub-rig `subrigs[k]` of `base` (`rig` the rig it solved):
/// what [`solve_again_on`] shares between the rigs it solves.
pub fn layout_of(rig: &Rig, base: &Solution, k: usize) -> statics::Layout {
    statics::Layout::new(
        rig,
        &base.network,
        &base.geometry,
        &base.kinematics,
        base.subrigs[k].component,
    )
}

/// [`solve_again`] on the sub-rig's [`layout_of`] made once (None: made here): a study
/// that solves the same sub-rig for many rigs that differ only in friction and loads
/// (a spread's samples) builds it once. The same answer, to the bit.
///
/// # Errors
/// As [`solve_again`].
pub fn solve_again_on(
    rig: &Rig,
    base: &Solution,
    k: usize,
    breakaway_case: bool,
    options: &SolveOptions,
    layout: Option<&statics::Layout>,
) -> Result<SubRigSolution, SolveError> {
    let sub = &base.subrigs[k];
    let parts = Parts {
        network: &base.network,
        geometry: &base.geometry,
        kinematics: &base.kinematics,
    };
    solve_subrig(
        rig,
        &parts,
        sub.component,
        sub.drive,
        sub.solve_for,
        breakaway_case,
        options,
        layout,
    )
}

/// Whether any bearing gives a static coefficient (then a breakaway case is solved).
pub fn has_static_friction(rig: &Rig) -> bool {
    rig.parts.ids().any(|p| static_friction_at(rig, p))
}

/// Whether part `part`'s bearing (a sheave's, or a drum's shaft's) gives a static
/// coefficient.
pub fn static_friction_at(rig: &Rig, part: PartId) -> bool {
    use crate::model::Bearing;
    let is_static = |b: &Bearing| {
        matches!(
            b,
            Bearing::Plain {
                mu_static: Some(_),
                ..
            }
        )
    };
    match &rig.parts[part].kind {
        PartKind::Sheave(s) => is_static(&s.bearing),
        PartKind::Drum(d) => d.shaft.as_ref().is_some_and(|s| is_static(&s.bearing)),
        _ => false,
    }
}

/// Resultant of a list of forces.
pub fn resultant(forces: &[Vector]) -> Vector {
    forces.iter().fold(Vector::zeros(), |a, f| a + f)
}

//! What drives a sub-rig and which way its parts travel, for wording its outcome.

use crate::model::{PartId, PartKind, Rig};
use crate::solve::kinematics::Motion;
use crate::solve::Solution;

/// What drives a sub-rig, for wording its outcome.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DriveKind {
    /// A haul end: a person, a hand or a powered pull; it can pull less than it has.
    Pull,
    /// A hanging weight (a counterweight): its value is what it is, and it moves the
    /// rig by itself or not at all.
    Counterweight,
    /// A drum (a winch or crank); it can turn with less torque than it has.
    Drum,
    /// A block whose load drives it forward (a falling block), fixed like a weight.
    FallingBlock,
}

impl DriveKind {
    /// The drive kind of a part.
    pub fn of(kind: &PartKind) -> DriveKind {
        match kind {
            PartKind::Weight(_) => DriveKind::Counterweight,
            PartKind::Drum(_) => DriveKind::Drum,
            PartKind::Block(_) => DriveKind::FallingBlock,
            _ => DriveKind::Pull,
        }
    }

    /// Whether its value is fixed (a weight's mass, a block's load): then it moves the
    /// rig by itself above the forward value, friction holds it inside the holding band,
    /// and the rig runs back by itself below the back value.
    pub fn fixed(self) -> bool {
        matches!(self, DriveKind::Counterweight | DriveKind::FallingBlock)
    }
}

/// Which way a part goes when the rig moves forward.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Travel {
    /// More than 10° above the horizontal (against gravity).
    Up,
    /// More than 10° below the horizontal.
    Down,
    /// Within 10° of the horizontal.
    Across,
    /// It turns (a drum).
    Turns,
}

impl Travel {
    /// What the part does going forward and running back: `rises` / `drops back`.
    pub fn words(travel: Option<Travel>) -> (&'static str, &'static str) {
        match travel {
            Some(Travel::Up) => ("rises", "drops back"),
            Some(Travel::Down) => ("lowers", "rises back"),
            Some(Travel::Turns) => ("turns forward", "turns back"),
            Some(Travel::Across) | None => ("moves forward", "runs back"),
        }
    }
}

/// The way `part` travels in the forward motion, if it moves.
pub(super) fn travel(rig: &Rig, solution: &Solution, part: PartId) -> Option<Travel> {
    let k = &solution.kinematics;
    let i = (*k.dof_of_part.get(part)?)?;
    match k.dofs[i].motion {
        Motion::Rotate(_) => Some(Travel::Turns),
        Motion::Translate(d) => {
            let v = d.into_inner() * k.forward[i];
            let n = v.norm();
            if !(n > 0.0 && n.is_finite()) {
                return None;
            }
            // sin 10° ≈ 0.17: steeper than that reads as going up or down.
            let up = v.dot(&-rig.gravity.into_inner()) / n;
            Some(if up > 0.17 {
                Travel::Up
            } else if up < -0.17 {
                Travel::Down
            } else {
                Travel::Across
            })
        }
    }
}

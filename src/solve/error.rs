//! Why a rig cannot be solved: [`SolveError`], whose messages name the rig file's parts
//! and lines and say what to change.

use crate::geometry::GeometryError;
use crate::math::{Real, Vector};
use crate::model::{PartId, PartKind, Rig};

use super::Kinematics;

/// Why a rig cannot be solved (exit 2). Names are the rig file's.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SolveError {
    /// The rope geometry could not be built.
    #[error(transparent)]
    Geometry(#[from] GeometryError),
    /// The lines hold every part of a sub-rig still.
    #[error("the rig cannot move: the lines hold {} still; check the reeving (a line tied at both ends with no moving block between cannot run)", list(parts))]
    CannotMove {
        /// The parts that were expected to move.
        parts: Vec<String>,
    },
    /// A sub-rig can move but nothing drives it.
    #[error(
        "{} can move but nothing drives them; add a haul end to that line or name it in `drive`",
        list(parts)
    )]
    NoDrive {
        /// The free parts.
        parts: Vec<String>,
    },
    /// The drive cannot move while the rest can.
    #[error("the drive `{drive}` cannot move: its line holds it still")]
    DriveCannotMove {
        /// The drive.
        drive: String,
    },
    /// More motions than drives.
    #[error("{} can move while the drive `{drive}` stands still; the rig has more motions than drives (tie them to a line, or add a drive)", list(parts))]
    FreeParts {
        /// The drive.
        drive: String,
        /// The parts free to move without it.
        parts: Vec<String>,
    },
    /// A part's natural quantity is needed but not given.
    #[error("part `{part}`: its {quantity} is needed (only `solve_for` may leave it out)")]
    MissingQuantity {
        /// The part.
        part: String,
        /// What is missing.
        quantity: &'static str,
    },
    /// A sub-rig other than the main one has no single haul to drive it.
    #[error(
        "the sub-rig of {} is not connected to the drive and has no single haul end to drive it",
        list(parts)
    )]
    SubRigWithoutHaul {
        /// Its parts.
        parts: Vec<String>,
    },
    /// The asked part is not connected to the drive (it is in another sub-rig).
    #[error("`solve_for` names `{part}`, which no line connects to the drive `{drive}`; name a part that the drive moves, or drive that sub-rig")]
    NotDriven {
        /// The asked part.
        part: String,
        /// The drive.
        drive: String,
    },
    /// A block named as the drive whose own load works against its forward travel.
    #[error("the drive `{drive}` is a block whose load works against its own travel (a force load always does; a mass load does unless `moves` points down); a block drives a rig only as a falling weight: drive it with a haul, a weight or a drum, or point `moves` along gravity")]
    DriveAgainstItsLoad {
        /// The block.
        drive: String,
    },
    /// The rope sliding over a part (a guide, or a sheave that stalls) would need a
    /// capstan ratio no rope can span.
    #[error("line `{line}`: the rope sliding over {}`{part}` needs a tension ratio of {} (capstan equation: μ' {} over {}), too large to be physical: no rope spans more than {:e} in tension, it would lock on the part; check the `turns` on that path entry and the `mu` of the part and the rope", if *stalled { "the stalled sheave " } else { "" }, exp_words(mu * wrap), crate::units::significant(*mu, 4), wrap_words(*wrap), crate::friction::PHYSICAL_RATIO_LIMIT)]
    ImplausibleCapstan {
        /// The line.
        line: String,
        /// The part the rope slides over.
        part: String,
        /// Effective coefficient μ' (groove wedge included).
        mu: Real,
        /// Total wrap, radians (extra turns included).
        wrap: Real,
        /// Whether the part is a sheave that does not turn.
        stalled: bool,
    },
    /// A turning sheave whose bearing needs a tension ratio no rope can span.
    #[error("line `{line}`: the bearing of `{part}` needs a tension ratio of {ratio:.3e} to turn, too large to be physical (no rope spans more than {:e} in tension); check its `bearing`", crate::friction::PHYSICAL_RATIO_LIMIT)]
    ImplausibleBearing {
        /// The line.
        line: String,
        /// The sheave.
        part: String,
        /// Tight over slack tension.
        ratio: Real,
    },
    /// A number in the solve is not finite (an overflow, or a value beyond what the
    /// solver can represent).
    #[error("{stage}: {what} is not a finite number{}; the inputs are beyond what the solver can represent: check `mu`, `turns`, sizes and loads there", at_part(part.as_deref()))]
    NonFinite {
        /// Where: `the kinematics`, `the forward case`, ...
        stage: &'static str,
        /// What overflowed.
        what: &'static str,
        /// The line concerned, if known.
        line: Option<String>,
        /// The part concerned, if known.
        part: Option<String>,
    },
    /// A speed or tension that the walk of a determinate rig finds beyond what a double
    /// holds (below the smallest normal `f64`, 2.2e-308, relative to the drive's, or
    /// above the largest): no figure in double precision would be right.
    #[error("{stage}: {what} at `{part}` is beyond what double precision holds (its size relative to the drive's is below 2.2e-308 or above 1.8e308), so every figure of this rig would be wrong; split the rig into fewer stages in series, or solve its parts one at a time")]
    BeyondPrecision {
        /// Where: `the kinematics`, `the forward case`, ...
        stage: &'static str,
        /// What: `the speed`, `a tension`.
        what: &'static str,
        /// The part whose equation gave it.
        part: String,
    },
    /// Every load acts square to the motion (a block travelling across gravity, a rig
    /// drawn with Y up while `gravity` is left at −Z): every figure would be zero.
    #[error("the loads do no work as the rig moves, so every figure would be zero: {}; if the rig is drawn with the blocks' `moves` pointing up, set `gravity: {}`; otherwise point `moves` the way the block travels, or give what resists its travel as `load: {{force: ...}}`", square_words(parts, moves, gravity), vector_words(&-moves))]
    LoadsDoNoWork {
        /// The blocks whose weight does no work.
        parts: Vec<String>,
        /// The first one's direction of travel.
        moves: Vector,
        /// The rig's gravity direction.
        gravity: Vector,
    },
    /// The asked quantity does no work as the rig moves, so no value of it balances
    /// the drive.
    #[error("`{part}` is asked for its {quantity}, which does no work as the rig moves: {reason}, so no {quantity} balances the drive; {fix}")]
    UnknownDoesNoWork {
        /// The asked part.
        part: String,
        /// Its quantity.
        quantity: &'static str,
        /// Why it does no work.
        reason: String,
        /// What to change.
        fix: &'static str,
    },
    /// The equilibrium equations have no solution.
    #[error("no equilibrium exists for {case}: the equations are inconsistent{}{}; {hint}", misfit_words(*residual), at_part(part.as_deref()))]
    NoEquilibrium {
        /// Which case.
        case: &'static str,
        /// Size of the misfit relative to the largest term of the balance (a ratio: the
        /// balance mixes forces and torques, so it has no one unit); NaN where no
        /// system was solved.
        residual: Real,
        /// The part whose equation fails, where one can be named.
        part: Option<String>,
        /// What to look at, for that cause.
        hint: &'static str,
    },
    /// Following the travel, a span closes up: a moving part reaches (or passes
    /// through) the part at the span's other end before the end stop.
    #[error("span {span} of line `{line}` closes up: `{from}` and `{to}` meet before the end of the travel; shorten `travel` to where the rig can go")]
    SpanClosesUp {
        /// The line.
        line: String,
        /// The span's index on the line.
        span: usize,
        /// The part at the span's start.
        from: String,
        /// The part at the span's end.
        to: String,
    },
}

impl SolveError {
    /// The line and part the error is about, where there is one, for locating it in
    /// the rig file.
    pub fn subject(&self) -> (Option<&str>, Option<&str>) {
        match self {
            SolveError::Geometry(g) => match g {
                GeometryError::InsideCircle { line, point, .. } => (Some(line), Some(point)),
                GeometryError::Coincident { line, b, .. } => (Some(line), Some(b)),
                GeometryError::AmbiguousSide { line, part } => (Some(line), Some(part)),
                GeometryError::NotConverged { line, a, .. } => (Some(line), Some(a)),
            },
            SolveError::CannotMove { parts }
            | SolveError::NoDrive { parts }
            | SolveError::SubRigWithoutHaul { parts } => (None, parts.first().map(String::as_str)),
            SolveError::FreeParts { parts, .. } => (None, parts.first().map(String::as_str)),
            SolveError::DriveCannotMove { drive } => (None, Some(drive)),
            SolveError::NotDriven { part, .. } => (None, Some(part)),
            SolveError::DriveAgainstItsLoad { drive } => (None, Some(drive)),
            SolveError::MissingQuantity { part, .. } => (None, Some(part)),
            SolveError::ImplausibleCapstan { line, part, .. }
            | SolveError::ImplausibleBearing { line, part, .. } => (Some(line), Some(part)),
            SolveError::NonFinite { line, part, .. } => (line.as_deref(), part.as_deref()),
            SolveError::UnknownDoesNoWork { part, .. } => (None, Some(part)),
            SolveError::LoadsDoNoWork { parts, .. } => (None, parts.first().map(String::as_str)),
            SolveError::NoEquilibrium { part, .. } => (None, part.as_deref()),
            SolveError::BeyondPrecision { part, .. } => (None, Some(part)),
            SolveError::SpanClosesUp { line, to, .. } => (Some(line), Some(to)),
        }
    }

    /// Where in the rig file the error points: the path entry of the line, else the
    /// part's definition.
    pub fn location(&self, rig: &Rig) -> Option<(crate::model::Location, String)> {
        let (line, part) = self.subject();
        let part_id = part.and_then(|p| rig.part_named(p));
        if let (Some(line), Some(pid)) = (line, part_id) {
            if let Some(l) = rig.lines.iter().find(|l| l.name == line) {
                if let Some(entry) = l.path.iter().find(|e| e.part == pid) {
                    return Some((entry.location, format!("lines.{line}")));
                }
            }
        }
        part_id.map(|p| {
            (
                rig.parts[p].location,
                format!("parts.{}", rig.parts[p].name),
            )
        })
    }
}

/// A direction as the file writes one: `[1, 0, 0]`.
fn vector_words(v: &Vector) -> String {
    let c: Vec<String> = v
        .iter()
        .map(|x| {
            let text = crate::units::significant(if x.abs() < 1e-12 { 0.0 } else { *x }, 4);
            if text.contains('.') && !text.contains('e') {
                text.trim_end_matches('0').trim_end_matches('.').to_string()
            } else {
                text
            }
        })
        .collect();
    format!("[{}]", c.join(", "))
}

/// `` `hook` travels along its `moves` [0, 1, 0], square to gravity [0, 0, -1], so its weight does no work``.
fn square_words(parts: &[String], moves: &Vector, gravity: &Vector) -> String {
    let (subject, verb, whose) = if parts.len() == 1 {
        (list(parts), "travels", "its weight does")
    } else {
        (list(parts), "travel", "their weights do")
    };
    format!(
        "{subject} {verb} along `moves` {}, square to gravity {}, so {whose} no work",
        vector_words(moves),
        vector_words(gravity)
    )
}

/// Why the asked load quantity does no work as the rig moves, with the fix to suggest;
/// None when it does work (a drive unknown always does: it moves at unit speed).
pub(super) fn unknown_does_no_work(
    rig: &Rig,
    kinematics: &Kinematics,
    drive: PartId,
    solve_for: PartId,
) -> Option<(String, &'static str)> {
    if solve_for == drive {
        return None;
    }
    if let PartKind::Block(b) = &rig.parts[solve_for].kind {
        if !b.load.is_force() && crate::model::square_to_gravity(&b.moves, &rig.gravity) {
            return Some((
                format!(
                    "its `moves` {} is square to gravity {}",
                    vector_words(&b.moves),
                    vector_words(&rig.gravity)
                ),
                "ask for the force against its travel (`load: {force: ~}`), or, if the rig is drawn with another axis up, set `gravity` to match",
            ));
        }
    }
    let speed = kinematics.dof_of_part[solve_for].map_or(0.0, |i| kinematics.forward[i]);
    (speed == 0.0).then(|| {
        (
            "the drive's motion does not move it".to_string(),
            "name in `solve_for` a part that moves with the drive",
        )
    })
}

/// `e^1571`, or the number itself where it fits an f64.
fn exp_words(exponent: Real) -> String {
    let ratio = exponent.exp();
    if ratio.is_finite() {
        format!("{ratio:.3e}")
    } else {
        format!("e^{exponent:.0}, beyond what a number holds")
    }
}

/// A wrap in degrees, with the turns where it passes one.
fn wrap_words(wrap: Real) -> String {
    let degrees = crate::units::significant(wrap.to_degrees(), 4);
    if wrap >= std::f64::consts::TAU {
        let turns = crate::units::significant(wrap / std::f64::consts::TAU, 4);
        format!("{degrees}° of wrap, {turns} turns")
    } else {
        format!("{degrees}° of wrap")
    }
}

/// ` at `part``, or nothing.
/// The misfit of an inconsistent balance, in words, where there is one.
fn misfit_words(relative: Real) -> String {
    if relative.is_finite() {
        format!(
            " (the misfit is {} of the largest term)",
            crate::units::significant(relative, 2)
        )
    } else {
        String::new()
    }
}

fn at_part(part: Option<&str>) -> String {
    part.map_or(String::new(), |p| format!(" at `{p}`"))
}

fn list(parts: &[String]) -> String {
    let quoted: Vec<String> = parts.iter().map(|p| format!("`{p}`")).collect();
    quoted.join(", ")
}

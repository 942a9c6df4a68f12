//! The rig moved along its motion: the velocity of every part for the drive moving
//! forward at unit speed, and a step of the drive's travel that moves the parts and
//! solves the rig again where they are. `sweep --stroke` walks the drive through its
//! travel with these; motion over time can take the same steps.
//!
//! With the drive at unit forward speed, [`Kinematics::forward`](super::Kinematics)
//! gives every degree of freedom's speed, so each translating part (block, weight,
//! haul end, and every sheave or pick point a block carries) moves by
//! `direction × speed × dt`; drums only turn, which changes no geometry. A step is
//! taken by the midpoint rule ([`midpoint_step`]): the velocities at the half step
//! carry the whole step, second-order accurate in `dt`.

use crate::math::{Real, Vector};
use crate::model::{IdVec, LineId, PartId, Rig};

use super::kinematics::Motion;
use super::Solution;

/// Whether the drive of the main sub-rig turns (a drum: its travel is an angle) rather
/// than translates.
pub fn drive_rotates(rig: &Rig, solution: &Solution) -> bool {
    let k = &solution.kinematics;
    k.dof_of_part
        .get(rig.drive)
        .copied()
        .flatten()
        .is_some_and(|i| matches!(k.dofs[i].motion, Motion::Rotate(_)))
}

/// Velocities of the main sub-rig's translating parts per unit drive speed (m/s per
/// m/s of a translating drive, per rad/s of a turning one): `(part, velocity)`, the
/// parts a moving block carries (sheaves, pick points) with their block.
pub fn part_velocities(rig: &Rig, solution: &Solution) -> Vec<(PartId, Vector)> {
    let main = solution.main().component;
    let k = &solution.kinematics;
    let mut of_part: IdVec<PartId, Option<Vector>> = IdVec::filled(None, rig.parts.len());
    let mut out = Vec::new();
    for (i, dof) in k.dofs.iter().enumerate() {
        if solution.network.component_of[dof.part] != main {
            continue;
        }
        if let Motion::Translate(dir) = dof.motion {
            let v = dir.into_inner() * k.forward[i];
            of_part[dof.part] = Some(v);
            out.push((dof.part, v));
        }
    }
    for (p, part) in rig.parts.enumerate() {
        if let Some(v) = part.block.and_then(|b| of_part[b]) {
            out.push((p, v));
        }
    }
    out
}

/// The rig with each listed part moved by `velocity × dt`.
pub fn moved(rig: &Rig, velocities: &[(PartId, Vector)], dt: Real) -> Rig {
    let mut r = rig.clone();
    for (p, v) in velocities {
        r.parts[*p].at += v * dt;
    }
    r
}

/// Advances each moving part's offset from its drawn position
/// ([`crate::model::changing::PartChanging::offset`]: m along its motion, rad of a
/// drum's turn) by its speed in `rates` times `dt`: what the levers and springs read.
/// Parts of `rig` keep their offsets; only the main sub-rig moves.
pub fn advance_offsets(rig: &mut Rig, rates: &Solution, dt: Real) {
    let main = rates.main().component;
    let k = &rates.kinematics;
    for (i, dof) in k.dofs.iter().enumerate() {
        if rates.network.component_of[dof.part] == main {
            rig.changing.of_mut(dof.part).offset += k.forward[i] * dt;
        }
    }
}

/// One step of the drive's travel by `dt` (m, or rad for a drum) from `rig`, whose
/// solution is `current`, by the midpoint rule: the parts move half a step with the
/// velocities at the start, the rig is solved there, and the velocities of that
/// midpoint carry the whole step; the rig is solved again at its end. `solve` solves a
/// moved rig (the caller's options and error wording).
///
/// # Errors
/// The first error of `solve` (the rig cannot be solved at the midpoint or the end).
pub fn midpoint_step<E>(
    rig: &Rig,
    current: &Solution,
    dt: Real,
    solve: impl FnMut(&Rig) -> Result<Solution, E>,
) -> Result<(Rig, Solution), E> {
    midpoint_step_closing(rig, current, dt, solve).map(|(next, solution, _)| (next, solution))
}

/// [`midpoint_step`], also telling the first span that closed up (or turned round) on
/// the way: between the start and the midpoint, or the midpoint and the end. A step
/// long against the rig can pass a part at its midpoint, whose reversed velocities then
/// carry the end back to the near side, where comparing the ends alone sees nothing.
///
/// # Errors
/// As [`midpoint_step`].
pub fn midpoint_step_closing<E>(
    rig: &Rig,
    current: &Solution,
    dt: Real,
    mut solve: impl FnMut(&Rig) -> Result<Solution, E>,
) -> Result<(Rig, Solution, Option<ClosedSpan>), E> {
    let start = part_velocities(rig, current);
    let mut half = moved(rig, &start, 0.5 * dt);
    advance_offsets(&mut half, current, 0.5 * dt);
    let mid = solve(&half)?;
    let carry = part_velocities(&half, &mid);
    let mut next = moved(rig, &carry, dt);
    advance_offsets(&mut next, &mid, dt);
    let solution = solve(&next)?;
    let closed = closed_span(&half, current, &mid).or_else(|| closed_span(&next, &mid, &solution));
    Ok((next, solution, closed))
}

/// A span that closed up or turned round between two positions of the same rig: a
/// moving part has reached (or passed through) the part at the span's other end.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct ClosedSpan {
    /// The line.
    pub line: LineId,
    /// The span's index on the line.
    pub span: usize,
}

/// The first span of the rig that closed up (length below 1e-9 of its length before)
/// or turned round (its direction reversed) between `before` and `after`, or whose
/// parts moved by more than its length towards each other (a block rising through its
/// sheave's tangent point: the new tangent lies on another branch, not short).
pub fn closed_span(rig: &Rig, before: &Solution, after: &Solution) -> Option<ClosedSpan> {
    for l in rig.lines.ids() {
        let (a, b) = (&before.geometry.lines[l], &after.geometry.lines[l]);
        for (j, (x, y)) in a.spans.iter().zip(&b.spans).enumerate() {
            // The length the parts' displacement leaves the span, to first order
            // (`u · (Δc_end − Δc_start)`, exact for translating circles, DESIGN.md §2):
            // at or below zero the span closed within the step, even where the tangent
            // went over to another branch past the part and the new length is not small.
            let moved = |e: usize| b.entries[e].centre - a.entries[e].centre;
            let predicted = x.length + x.direction.dot(&(moved(j + 1) - moved(j)));
            if x.direction.dot(&y.direction) < 0.0
                || y.length <= 1e-9 * x.length.max(1e-9)
                || predicted <= 0.0
            {
                return Some(ClosedSpan { line: l, span: j });
            }
        }
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::rig::load_str;
    use crate::solve::{solve, SolveOptions};

    #[test]
    fn a_step_moves_carried_sheaves_with_their_block_and_the_drive_by_dt() {
        // DESIGN.md §4's two-part hoist: the hook block carries `hook.a`.
        let rig = load_str(
            include_str!("../../tests/rigs/design-example.yaml"),
            "design-example.yaml",
        )
        .unwrap();
        let options = SolveOptions::default();
        let first = solve(&rig, &options).unwrap();
        assert!(!drive_rotates(&rig, &first));
        let dt = 1e-3;
        let (next, _) = midpoint_step(&rig, &first, dt, |r| solve(r, &options)).unwrap();
        let part = |name: &str| rig.part_named(name).unwrap();
        let shift = |name: &str| next.parts[part(name)].at - rig.parts[part(name)].at;
        assert_eq!(shift("hook"), shift("hook.a"));
        assert!(shift("hook").z > 0.0, "the hook rises: {:?}", shift("hook"));
        // The haul end pays in its unit speed along its pull: it moves by dt.
        assert!(
            (shift("hand").norm() - dt).abs() < 1e-9,
            "{}",
            shift("hand").norm()
        );
        // Fixed parts stay.
        assert_eq!(shift("head").norm(), 0.0);
        assert!(closed_span(&next, &first, &solve(&next, &options).unwrap()).is_none());
    }
}

//! The rope as a spring (`stiffness`, EA; DESIGN.md §7): span stretch, the load split
//! where lines share a block, the rig's spring rate at the drive and the lost travel.
//!
//! Everything here is linear elasticity about the drawn geometry (stretch is small next
//! to the rig), with the rope's strain `ε = T / EA` (Hooke's law for an axial member).
//!
//! # Sources
//! - Axial member: `δ = ∫ T ds / EA`, for a uniform tension `T·L/EA`, for a tension
//!   varying linearly along the member `T_mean·L/EA` (J. M. Gere and B. J. Goodno,
//!   *Mechanics of Materials*, §2.3 "Changes in lengths under nonuniform conditions").
//! - Statically indeterminate members sharing a load: equilibrium plus compatibility
//!   of deformation (Gere & Goodno §2.4 "Statically indeterminate structures": two bars
//!   between a rigid bar and supports share the load in proportion to `EA/L`).
//! - Lost travel and spring rate: Castigliano's second theorem, `δ = ∂U*/∂F` with the
//!   complementary energy `U* = Σ T²L/(2EA)` (Gere & Goodno §9.9 "Castigliano's
//!   theorem"); checked in the tests against the displacement solve of this module.

use std::ops::Index;

use nalgebra::{DMatrix, DVector};

use crate::geometry::Geometry;
use crate::math::Real;
use crate::model::{IdVec, LineId, Rig};

use super::kinematics::{Kinematics, Segment};

/// The stretch of a span, m: `max(0, (T_start + T_end)/2)·L / EA`.
///
/// # Formula
/// `δ = T_mean·L / EA`, exact for a tension that varies linearly along the span (a rope
/// under its own weight); a slack span (negative mean tension) does not shorten.
///
/// # Arguments
/// `t_start`, `t_end` the tensions at the span's ends, N; `length` m; `stiffness` EA, N
/// (> 0).
///
/// # Example
/// A vertical rope 100 m long, 1 kg/m, 10 kN at its foot, EA = 9.80665 MN:
/// `δ = (T_bottom·L + w·g·L²/2)/EA = 0.10697 m` (Gere & Goodno §2.3, a hanging bar
/// under its own weight plus an end load).
/// ```
/// use reeve::solve::elastic::span_stretch;
/// let top = 10_000.0 + 1.0 * 9.80665 * 100.0;
/// let d = span_stretch(10_000.0, top, 100.0, 9.80665e6);
/// assert!((d - 0.10697).abs() < 5e-6);
/// ```
pub fn span_stretch(t_start: Real, t_end: Real, length: Real, stiffness: Real) -> Real {
    (0.5 * (t_start + t_end)).max(0.0) * length / stiffness
}

/// The stretch of every span of every line in one case, m (tensions by the rig's line
/// ids, as a `Vec` or a case's [`super::statics::ById`]); None for lines whose rope
/// has no `stiffness` (or lines of another sub-rig: no tensions).
pub fn stretches(
    rig: &Rig,
    geometry: &Geometry,
    tension: &impl Index<LineId, Output = Vec<Real>>,
    tension_end: &impl Index<LineId, Output = Vec<Real>>,
) -> IdVec<LineId, Vec<Option<Real>>> {
    rig.lines
        .ids()
        .map(|l| {
            let ea = rig.rope_of(l).stiffness;
            geometry.lines[l]
                .spans
                .iter()
                .enumerate()
                .map(|(j, s)| {
                    let (a, b) = (tension[l].get(j)?, tension_end[l].get(j)?);
                    Some(span_stretch(*a, *b, s.length, ea?))
                })
                .collect()
        })
        .collect()
}

/// A basis of the null space of `mat` (columns), from an SVD of the matrix padded with
/// zero rows to square (a thin SVD would drop the directions beyond its rank).
fn null_space(mat: &DMatrix<Real>, relative: Real) -> DMatrix<Real> {
    let (n, m) = mat.shape();
    let mut square = DMatrix::zeros(n.max(m), m);
    square.view_mut((0, 0), (n, m)).copy_from(mat);
    let scale = square.amax().max(1e-300);
    let svd = square.svd(false, true);
    let Some(v_t) = svd.v_t else {
        return DMatrix::zeros(m, 0);
    };
    let null: Vec<usize> = (0..m)
        .filter(|&i| svd.singular_values[i] <= relative * scale)
        .collect();
    let mut basis = DMatrix::zeros(m, null.len());
    for (c, &i) in null.iter().enumerate() {
        basis.set_column(c, &v_t.row(i).transpose());
    }
    basis
}

/// What the compatibility split needs of one sub-rig's statics.
pub struct SplitInput<'a> {
    /// The rig.
    pub rig: &'a Rig,
    /// Its geometry.
    pub geometry: &'a Geometry,
    /// Its kinematics.
    pub kin: &'a Kinematics,
    /// Global segment indices (the statics' columns, the asked quantity last).
    pub segs: &'a [usize],
    /// For each of `segs`, its line's local index (the index of `coef` and `rise`).
    pub seg_line: &'a [usize],
    /// Global dof indices (the statics' rows), ascending.
    pub dofs: &'a [usize],
    /// Per local line and span, the start tension `c·τ + c0` in its segment's first
    /// tension.
    pub coef: &'a [Vec<(Real, Real)>],
    /// Per local line and span, the rise of the tension along the span (rope weight), N.
    pub rise: &'a dyn Fn(usize, usize) -> Real,
}

/// The kinematic matrix of a sub-rig: one row per segment, the segment's rate of
/// lengthening per unit speed of each dof (columns `dofs`, ascending).
fn segment_rows(kin: &Kinematics, segs: &[usize], dofs: &[usize]) -> DMatrix<Real> {
    let mut a = DMatrix::zeros(segs.len(), dofs.len());
    for (r, &g) in segs.iter().enumerate() {
        let Segment { line, first, last } = kin.segments[g];
        for row in &kin.span_rows[line][first..last] {
            for (i, rate) in row.iter() {
                if let Ok(c) = dofs.binary_search(&i) {
                    a[(r, c)] += rate;
                }
            }
        }
    }
    a
}

/// The load split by compatibility of stretch where statics alone leaves it open
/// (lines sharing a block): of the solutions `x = x_p + N·α` of the equilibria
/// `mat·x = rhs` (segment tensions, then the asked quantity), the one whose segment
/// stretches the rig can take up by moving its parts rigidly: `Wᵀ·s(x) = 0` for every
/// `w` with `wᵀA = 0` (`A` the segments' rates of lengthening; Gere & Goodno §2.4).
///
/// Returns None when a line of the sub-rig has no `stiffness` (then the least-squares
/// split stands), else the solution and whether compatibility fixed every freedom.
pub fn compatible_split(
    input: &SplitInput,
    mat: &DMatrix<Real>,
    column_norms: &[Real],
    particular: &DVector<Real>,
    rank_tolerance: Real,
    motion_tolerance: Real,
) -> Option<(DVector<Real>, bool)> {
    let SplitInput {
        rig,
        geometry,
        kin,
        segs,
        seg_line,
        dofs,
        coef,
        rise,
    } = input;
    let m = segs.len() + 1;
    // Stretch of each segment, affine in its first tension: s = a·τ + b.
    let mut a = DVector::zeros(m);
    let mut b = DVector::zeros(m);
    for (col, (&g, &li)) in segs.iter().zip(seg_line.iter()).enumerate() {
        let seg = kin.segments[g];
        let ea = rig.rope_of(seg.line).stiffness?;
        for j in seg.first..seg.last {
            let length = geometry.lines[seg.line].spans[j].length;
            let (c, c0) = coef[li][j];
            a[col] += c * length / ea;
            b[col] += (c0 + 0.5 * rise(li, j)) * length / ea;
        }
    }
    // Null space of the equilibria, in the equilibrated columns.
    let mut scaled = mat.clone();
    for (j, n) in column_norms.iter().enumerate() {
        scaled.column_mut(j).unscale_mut(*n);
    }
    if !scaled.iter().all(|v| v.is_finite()) {
        return None;
    }
    let mut null = null_space(&scaled, rank_tolerance);
    for (j, n) in column_norms.iter().enumerate() {
        null.row_mut(j).unscale_mut(*n);
    }
    if null.ncols() == 0 {
        return Some((particular.clone(), true));
    }
    // Self-stress states of the rigid rig: w with wᵀA = 0.
    let rows = segment_rows(kin, segs, dofs);
    // The same threshold as the kinematics' motions: nearly parallel lines that the
    // kinematics lets move together share their load by stretch too.
    let w = null_space(&rows.transpose(), motion_tolerance);
    let mut wt = DMatrix::zeros(w.ncols(), m);
    wt.view_mut((0, 0), (w.ncols(), m - 1))
        .copy_from(&w.transpose());
    let s_null = DMatrix::from_diagonal(&a) * &null;
    let lhs = &wt * &s_null;
    let stretch_p = a.component_mul(particular) + &b;
    let rhs = -(&wt * stretch_p);
    // Nothing that is not a finite number may reach the SVD (an absurdly small EA
    // overflows the compliances): the least-squares split stands then.
    if !(lhs.iter().all(|v| v.is_finite()) && rhs.iter().all(|v| v.is_finite())) {
        return None;
    }
    let scale = lhs.amax().max(1e-300);
    let svd = lhs.svd(true, true);
    let rank = svd.rank(1e-9 * scale);
    let alpha = svd.solve(&rhs, 1e-9 * scale).ok()?;
    let x = particular + &null * alpha;
    x.iter()
        .all(|v| v.is_finite())
        .then_some((x, rank == null.ncols()))
}

/// What the spring-rate solve needs of one sub-rig.
pub struct SpringInput<'a> {
    /// The rig.
    pub rig: &'a Rig,
    /// Its geometry.
    pub geometry: &'a Geometry,
    /// Its kinematics.
    pub kin: &'a Kinematics,
    /// Global segment indices.
    pub segs: &'a [usize],
    /// Global dof indices, ascending.
    pub dofs: &'a [usize],
    /// Position of the drive in `dofs`.
    pub drive: usize,
    /// Per position in `dofs`: whether the part is held (it carries a load).
    pub held: Vec<bool>,
}

/// The rig's spring rate at the drive, N/m (or N·m/rad for a drum), frictionless:
/// the force at the drive per unit of its travel with every loaded part held where it
/// stands, unloaded parts (a running block with nothing on it) free to settle in
/// balance, the ropes stretching by `T·L/EA` (a line with no `stiffness` is rigid).
///
/// # Formula
/// A mixed (force and displacement) solve: `C_g·τ_g − Σ_f A_gf·q_f = A_gd` for every
/// segment `g` (stretch = its compliance `C_g = Σ L/EA` times its tension), `Σ_g A_gf·τ_g
/// = 0` for every free part `f`, and `k = Σ_g A_gd·τ_g`, with `A` the segments' rates of
/// lengthening per unit speed. For one line from the drive to a held load,
/// `k = EA / L` (Gere & Goodno §2.2, axial stiffness of a bar).
///
/// Returns None when no rope of the sub-rig has a stiffness, or the system is singular
/// (a free part that nothing holds).
pub fn drive_stiffness(input: &SpringInput) -> Option<Real> {
    drive_spring(input).map(|(k, _)| k)
}

/// [`drive_stiffness`] and, beside it, each segment's tension per unit of drive travel
/// `τ_g` (in the order of `input.segs`): the solve's own unknowns.
fn drive_spring(input: &SpringInput) -> Option<(Real, Vec<Real>)> {
    let SpringInput {
        rig,
        geometry,
        kin,
        segs,
        dofs,
        drive,
        held,
    } = input;
    let compliance: Vec<Real> = segs
        .iter()
        .map(|&g| {
            let seg = kin.segments[g];
            rig.rope_of(seg.line).stiffness.map_or(0.0, |ea| {
                geometry.lines[seg.line].spans[seg.first..seg.last]
                    .iter()
                    .map(|s| s.length)
                    .sum::<Real>()
                    / ea
            })
        })
        .collect();
    if compliance.iter().all(|c| *c == 0.0) {
        return None;
    }
    let rows = segment_rows(kin, segs, dofs);
    let free: Vec<usize> = (0..dofs.len())
        .filter(|&k| k != *drive && !held[k])
        .collect();
    let (ns, nf) = (segs.len(), free.len());
    let mut mat = DMatrix::zeros(ns + nf, ns + nf);
    let mut rhs = DVector::zeros(ns + nf);
    for g in 0..ns {
        mat[(g, g)] = compliance[g];
        for (c, &f) in free.iter().enumerate() {
            mat[(g, ns + c)] = -rows[(g, f)];
            mat[(ns + c, g)] = rows[(g, f)];
        }
        rhs[g] = rows[(g, *drive)];
    }
    if !(mat.iter().all(|v| v.is_finite()) && rhs.iter().all(|v| v.is_finite())) {
        return None;
    }
    let scale = mat.amax().max(1e-300);
    let svd = mat.svd(true, true);
    if svd.rank(1e-10 * scale) < ns + nf {
        return None;
    }
    let x = svd.solve(&rhs, 1e-10 * scale).ok()?;
    let k: Real = (0..ns).map(|g| rows[(g, *drive)] * x[g]).sum();
    (k.is_finite() && k > 0.0).then(|| (k, x.iter().take(ns).copied().collect()))
}

/// The lost travel at the drive, m (or rad), by the unit-load method: a unit force at
/// the drive, every loaded part held, puts `n_g = τ_g / k` in segment `g`
/// (`drive_spring`), and the drive moves by `δ = Σ_g n_g·e_g`, `e_g` the segment's
/// stretch in the loaded rig (`stretch(line, span)` summed over its spans: the mean
/// tension times `L/EA`, so a rope's own weight counts as it hangs, half a span's weight
/// at each end). For one rope from the drive to a held load, `n = 1` and `δ` is the
/// rope's stretch `(T_b·L + w·g·L²/2)/EA` (Gere & Goodno, *Mechanics of Materials*,
/// §2.3 and §2.8, the unit-load method). Where every tension is in proportion to the
/// drive's value and the ropes are weightless it equals `F/k` and Castigliano's
/// [`castigliano_lost_travel`]. None where [`drive_stiffness`] is.
pub fn lost_travel(
    input: &SpringInput,
    stretch: impl Fn(LineId, usize) -> Option<Real>,
) -> Option<Real> {
    let (k, tau) = drive_spring(input)?;
    let mut travel = 0.0;
    for (c, &g) in input.segs.iter().enumerate() {
        let seg = input.kin.segments[g];
        let e: Real = (seg.first..seg.last)
            .map(|j| stretch(seg.line, j).unwrap_or(0.0))
            .sum();
        travel += tau[c] / k * e;
    }
    (travel.is_finite()).then_some(travel.abs())
}

/// The lost travel by Castigliano's theorem over a case's tensions, for a rig whose
/// tensions are all in proportion to the drive's value `drive_value` (one load held
/// by the drive): `δ = ∂U*/∂F = Σ_spans (T/F)·T·L/EA`, m (or rad). None where a span's
/// rope has no stiffness or the drive's value is zero.
///
/// The library reports the displacement solve ([`drive_stiffness`]); this closed form is
/// its check (they agree where the proportionality holds).
pub fn castigliano_lost_travel(
    rig: &Rig,
    geometry: &Geometry,
    lines: &[LineId],
    tension: &impl Index<LineId, Output = Vec<Real>>,
    drive_value: Real,
) -> Option<Real> {
    if drive_value == 0.0 {
        return None;
    }
    let mut travel = 0.0;
    for &l in lines {
        let ea = rig.rope_of(l).stiffness?;
        for (j, s) in geometry.lines[l].spans.iter().enumerate() {
            let t = tension[l][j];
            travel += (t / drive_value) * t * s.length / ea;
        }
    }
    Some(travel.abs())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn null_space_of_a_wide_matrix_is_complete() {
        let mat = DMatrix::from_row_slice(1, 3, &[1.0, 1.0, 0.0]);
        let n = null_space(&mat, 1e-9);
        assert_eq!(n.ncols(), 2);
        assert!((&mat * &n).amax() < 1e-12);
    }

    #[test]
    fn doubling_stiffness_halves_stretch() {
        let a = span_stretch(100.0, 120.0, 9.0, 1e6);
        let b = span_stretch(100.0, 120.0, 9.0, 2e6);
        assert!((a - 2.0 * b).abs() < 1e-18);
        assert_eq!(span_stretch(-5.0, -1.0, 9.0, 1e6), 0.0);
    }
}

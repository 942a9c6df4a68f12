//! Statics: one unknown tension per line segment plus the asked quantity, from the
//! equilibrium of every moving part along its motion (blocks, weights, haul ends) and
//! the moment balance of every drum.
//!
//! Walking a segment from its first span, each passage multiplies the tension by its
//! ratio `k` (or `1/k`, by the rope's direction over the part) and may add a constant
//! (the part of a sheave's friction that comes from its own weight), so every span's
//! tension is affine in the segment's first tension. For degree of freedom `i`:
//! `Σ_j T_j B_ji − X x_i = Q_i`, with `B_ji` the span's rate of lengthening per unit
//! speed of `i` (see [`super::kinematics`]), `x_i` the unknown's generalized force per
//! unit and `Q_i` the known loads and drum friction. Load-dependent friction (sheave
//! weight in the pin load, drum journals) is settled by fixed-point iteration.

use nalgebra::{DMatrix, DVector};
use std::borrow::Cow;

use crate::friction::{self, BearingResistance};
use crate::geometry::Geometry;
use crate::math::{Real, Vector, STANDARD_GRAVITY};
use crate::model::Network;
use crate::model::{square_to_gravity, BlockLoad, LineId, PartId, PartKind, Rig};

use super::bearing::{bearing_resistance, thrust_moment};
use super::kinematics::Kinematics;
use super::{Case, SolveError, SolveOptions};

mod by_id;
mod layout;
mod material;
mod passage;
mod result;
mod system;

use system::{dense_column_norms, sparse_column_norms};

pub use by_id::ById;
pub use layout::Layout;

pub use passage::DrumFriction;
pub use result::{CaseResult, Losses};

/// How the fixed-point iteration ended.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Status {
    /// Settled within the tolerance.
    Converged {
        /// Iterations used.
        iterations: usize,
    },
    /// Stopped at the cap without settling; the figures are not to be trusted.
    OutOfIterations {
        /// Iterations used.
        iterations: usize,
        /// Last relative change of the tensions.
        change: Real,
    },
}

/// Torques on a drum, N·m, about its axle; `rope` is what the lines apply in the
/// direction of the case's motion, the others oppose it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DrumTorques {
    /// Net torque of the rope tensions, signed along the drum's motion in this case.
    pub rope: Real,
    /// Steady load torque (positive when it opposes this case's motion).
    pub load: Real,
    /// Drag torque (always opposes).
    pub drag: Real,
    /// Journal friction torque.
    pub journal: Real,
    /// Thrust friction torque.
    pub thrust: Real,
    /// The rope's bending on and off the drum (DESIGN.md §7).
    pub bending: Real,
    /// Angular speed in this case per unit drive speed, rad/s (signed about the axle).
    pub speed: Real,
}

/// A passage where the rope slips on an untied drum.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Slip {
    /// The line.
    pub line: LineId,
    /// The path entry.
    pub entry: usize,
    /// Tension ratio needed.
    pub ratio: Real,
    /// Capstan ratio available.
    pub limit: Real,
}

/// The statics problem of one sub-rig.
///
/// Every array it works on is the sub-rig's: its degrees of freedom, its lines
/// (`local` line index = position in `lines`) and the parts they reach (`parts`); the
/// results are keyed by the rig's ids only at the end ([`ById`]).
pub struct Problem<'a> {
    rig: &'a Rig,
    geometry: &'a Geometry,
    kin: &'a Kinematics,
    solve_for: PartId,
    drive: PartId,
    /// The sub-rig's dofs, lines, parts and how they meet: shared by every rig that
    /// differs from the one it was made for only in friction and loads.
    layout: Cow<'a, Layout>,
    /// Known generalized load forces (global dof index order of `dofs`).
    q_load: DVector<Real>,
    /// Unknown's generalized force per unit.
    x_coef: DVector<Real>,
}

/// A block's own mass and that of the sheaves it carries (`carried`, from
/// `layout::carried_by`), kg.
fn block_mass(rig: &Rig, block: PartId, carried: &[PartId]) -> Real {
    let own = match &rig.parts[block].kind {
        PartKind::Block(b) => b.mass.unwrap_or(0.0),
        _ => 0.0,
    };
    own + carried
        .iter()
        .filter_map(|&p| match &rig.parts[p].kind {
            PartKind::Sheave(s) => s.mass,
            _ => None,
        })
        .sum::<Real>()
}

fn gravity_force(rig: &Rig, mass: Real) -> Vector {
    rig.gravity.into_inner() * (mass * STANDARD_GRAVITY)
}

impl<'a> Problem<'a> {
    /// Sets up the statics of sub-rig `component` driven by `drive`, with unknown `solve_for`.
    ///
    /// # Errors
    /// [`SolveError::MissingQuantity`] when a load that is not the unknown is not given.
    pub fn new(
        rig: &'a Rig,
        network: &'a Network,
        geometry: &'a Geometry,
        kin: &'a Kinematics,
        component: usize,
        drive: PartId,
        solve_for: PartId,
    ) -> Result<Problem<'a>, SolveError> {
        let layout = Cow::Owned(Layout::new(rig, network, geometry, kin, component));
        Problem::with_layout(rig, geometry, kin, layout, drive, solve_for)
    }

    /// [`Problem::new`] on a layout made for this sub-rig of `rig` or of a rig that
    /// differs from `rig` only in friction and loads (the same parts, reeving, graph,
    /// motion and ropes): the same problem, to the bit, without building the layout
    /// again.
    ///
    /// # Errors
    /// As [`Problem::new`].
    pub fn with_layout(
        rig: &'a Rig,
        geometry: &'a Geometry,
        kin: &'a Kinematics,
        layout: Cow<'a, Layout>,
        drive: PartId,
        solve_for: PartId,
    ) -> Result<Problem<'a>, SolveError> {
        let Layout { dofs, carried, .. } = &*layout;
        let mut q_load = DVector::zeros(dofs.len());
        let mut x_coef = DVector::zeros(dofs.len());
        for (k, &i) in dofs.iter().enumerate() {
            let part = kin.dofs[i].part;
            let unknown = part == solve_for;
            let fwd = kin.forward[i];
            let missing = |quantity| SolveError::MissingQuantity {
                part: rig.parts[part].name.clone(),
                quantity,
            };
            match &rig.parts[part].kind {
                PartKind::Block(b) => {
                    let moves = b.moves.into_inner();
                    let mass = block_mass(rig, part, &carried[k]);
                    let mut q = gravity_force(rig, mass).dot(&moves);
                    if unknown {
                        x_coef[k] = if b.load.is_force() {
                            -1.0
                        } else {
                            gravity_force(rig, 1.0).dot(&moves)
                        };
                    } else {
                        match b.load {
                            BlockLoad::Mass(Some(m)) => q += gravity_force(rig, m).dot(&moves),
                            BlockLoad::Force(Some(f)) => q -= f,
                            _ => {}
                        }
                    }
                    q_load[k] = q;
                }
                PartKind::Weight(w) => {
                    if unknown {
                        x_coef[k] = STANDARD_GRAVITY;
                    } else {
                        q_load[k] = STANDARD_GRAVITY * w.mass.ok_or_else(|| missing("mass"))?;
                    }
                }
                PartKind::Haul(h) => {
                    if unknown {
                        x_coef[k] = 1.0;
                    } else {
                        q_load[k] = h.force.ok_or_else(|| missing("force"))?;
                    }
                }
                PartKind::Drum(d) => {
                    let forward_sign = if fwd > 0.0 {
                        1.0
                    } else if fwd < 0.0 {
                        -1.0
                    } else {
                        0.0
                    };
                    if part == drive {
                        // A driving drum's torque turns it forward (right-handed about its axle).
                        if unknown {
                            x_coef[k] = 1.0;
                        } else {
                            q_load[k] = d.torque.ok_or_else(|| missing("torque"))?;
                        }
                    } else if unknown {
                        x_coef[k] = -forward_sign;
                    } else {
                        q_load[k] = -forward_sign * d.torque.unwrap_or(0.0);
                    }
                }
                _ => {}
            }
            // Levers, springs and d'Alembert loads where the rig stands (DESIGN.md §7).
            q_load[k] += super::changing::dof_load(rig, part, fwd);
        }
        Ok(Problem {
            rig,
            geometry,
            kin,
            solve_for,
            drive,
            layout,
            q_load,
            x_coef,
        })
    }

    /// Blocks of the sub-rig whose weight does no work because they travel square to
    /// gravity, when every load together does no work along the motion (so every
    /// figure would be zero); empty otherwise.
    ///
    /// The test is per load, not on the sum: a balanced rig (a counterweight equal to
    /// its batten) has loads that each do work, cancelling, and is a real answer. The
    /// loads do no work when `Σ |Q_k v_k| ≤ 10⁻⁹ Σ L_k |v_k|`, with `Q_k` a load's
    /// generalized force along its motion, `L_k` its size, `v_k` its forward speed.
    pub fn square_loads(&self) -> Vec<PartId> {
        let mut work = 0.0;
        let mut scale = 0.0;
        let mut square = Vec::new();
        for (k, &i) in self.layout.dofs.iter().enumerate() {
            let part = self.kin.dofs[i].part;
            let speed = self.kin.forward[i].abs();
            if part == self.drive || speed == 0.0 {
                continue;
            }
            let size = match &self.rig.parts[part].kind {
                PartKind::Block(b) => {
                    let mass = block_mass(self.rig, part, &self.layout.carried[k])
                        + match b.load {
                            BlockLoad::Mass(Some(m)) => m,
                            _ => 0.0,
                        };
                    let force = match b.load {
                        BlockLoad::Force(Some(f)) => f.abs(),
                        _ => 0.0,
                    };
                    if mass > 0.0 && square_to_gravity(&b.moves, &self.rig.gravity) {
                        square.push(part);
                    }
                    mass * STANDARD_GRAVITY + force
                }
                _ => self.q_load[k].abs(),
            };
            work += (self.q_load[k] * speed).abs();
            scale += size * speed;
        }
        if scale > 0.0 && work <= 1e-9 * scale {
            square
        } else {
            Vec::new()
        }
    }

    /// Solves one case.
    ///
    /// # Errors
    /// [`SolveError::NoEquilibrium`] when the equations have no solution.
    pub fn solve(&self, case: Case, options: &SolveOptions) -> Result<CaseResult, SolveError> {
        self.solve_with(case, options, false)
    }

    /// Solves the forward case with static coefficients (`mu_static`) where given: the
    /// effort that starts the rig from rest (breakaway).
    ///
    /// # Errors
    /// As [`Problem::solve`].
    pub fn solve_breakaway(&self, options: &SolveOptions) -> Result<CaseResult, SolveError> {
        self.solve_with(Case::Forward, options, true)
    }

    /// Solves the forward or back case with static coefficients (`mu_static`) where
    /// given: the value at which the rig leaves rest that way (`motion`'s holding band).
    ///
    /// # Errors
    /// As [`Problem::solve`].
    pub fn solve_static(
        &self,
        case: Case,
        options: &SolveOptions,
    ) -> Result<CaseResult, SolveError> {
        self.solve_with(case, options, true)
    }

    fn solve_with(
        &self,
        case: Case,
        options: &SolveOptions,
        breakaway: bool,
    ) -> Result<CaseResult, SolveError> {
        let rig = self.rig;
        let sign = case.sign();
        let n = self.layout.dofs.len();
        let m = self.layout.segs.len() + 1;
        // The sub-rig's dof speeds in this case (`velocity[k]` for `dofs[k]`).
        let velocity: Vec<Real> = self
            .layout
            .dofs
            .iter()
            .map(|&i| self.kin.forward[i] * sign)
            .collect();
        // Tensions by local line.
        let mut previous: Option<Vec<Vec<Real>>> = None;
        let mut status = Status::Converged { iterations: 1 };
        let mut outcome = None;
        let needs_iteration = case != Case::Ideal && self.load_dependent();
        for iteration in 1..=options.max_iterations.max(1) {
            // Walk every segment: T_span = c τ + e.
            let mut coef: Vec<Vec<(Real, Real)>> = self
                .layout
                .lines
                .iter()
                .map(|&l| vec![(0.0, 0.0); rig.lines[l].path.len().saturating_sub(1)])
                .collect();
            let mut stalled = Vec::new();
            for (&g, &li) in self.layout.segs.iter().zip(&self.layout.seg_line) {
                let seg = self.kin.segments[g];
                coef[li][seg.first] = (1.0, 0.0);
                for e in seg.first + 1..seg.last {
                    let (k, delta, stall) =
                        self.passage(case, seg.line, li, e, previous.as_deref(), breakaway)?;
                    if stall {
                        stalled.push((seg.line, e));
                    }
                    // Into the passage at the previous span's end tension; out of it
                    // with the arc's rise (both zero for a weightless rope).
                    let (c, c0) = coef[li][e - 1];
                    let c0 = c0 + self.layout.weight.rise(li, e - 1);
                    let next = (k * c, k * c0 + delta + self.layout.weight.arc(li, e));
                    if !(next.0.is_finite() && next.1.is_finite()) {
                        // Ratios in series that each hold but together overflow.
                        return Err(self.non_finite(
                            stage_name(case, breakaway),
                            "the tension along the line",
                            seg.line,
                            e,
                        ));
                    }
                    coef[li][e] = next;
                }
            }
            // Drum friction from the previous tensions.
            let mut q = self.q_load.clone();
            let mut drum_friction = vec![DrumFriction::default(); n];
            if case != Case::Ideal {
                for (k, &i) in self.layout.dofs.iter().enumerate() {
                    let part = self.kin.dofs[i].part;
                    if matches!(rig.parts[part].kind, PartKind::Drum(_)) {
                        let lp = self.layout.dof_part[k];
                        let friction = match previous.as_deref() {
                            Some(t) => self.drum_friction(part, self.contacts(lp, t), breakaway),
                            None => self.drum_friction(part, std::iter::empty(), breakaway),
                        };
                        // The rope's bending on and off the drum (DESIGN.md §7).
                        let friction = DrumFriction {
                            bending: self.drum_bending(part, previous.as_deref()),
                            ..friction
                        };
                        drum_friction[k] = friction;
                        let v = velocity[k];
                        let s = if v > 1e-15 {
                            1.0
                        } else if v < -1e-15 {
                            -1.0
                        } else {
                            0.0
                        };
                        q[k] -= s * friction.total();
                    }
                }
            }
            // Assemble, sparse: `rows[k]` holds the nonzero pattern of dof k's
            // equation, `(column, value)` in column order (the entries a dense matrix
            // would hold, summed in the same order).
            let mut rows: Vec<Vec<(usize, Real)>> = vec![Vec::new(); n];
            let mut rhs = q + &self.layout.rope_load;
            for (col, (&g, &li)) in self
                .layout
                .segs
                .iter()
                .zip(&self.layout.seg_line)
                .enumerate()
            {
                let seg = self.kin.segments[g];
                let spans = &self.kin.span_rows[seg.line][seg.first..seg.last];
                for (&(c, c0), row) in coef[li][seg.first..seg.last].iter().zip(spans) {
                    for (i, b) in row.iter() {
                        let Ok(k) = self.layout.dofs.binary_search(&i) else {
                            continue;
                        };
                        match rows[k].last_mut() {
                            Some(last) if last.0 == col => last.1 += c * b,
                            _ => rows[k].push((col, 0.0 + c * b)),
                        }
                        rhs[k] -= c0 * b;
                    }
                }
            }
            for (k, row) in rows.iter_mut().enumerate() {
                row.push((m - 1, -self.x_coef[k]));
            }
            // Nothing that is not a finite number may reach the SVD (it panics on NaN).
            if let Some(k) =
                (0..n).find(|&k| !rhs[k].is_finite() || rows[k].iter().any(|e| !e.1.is_finite()))
            {
                let part = self.kin.dofs[self.layout.dofs[k]].part;
                return Err(SolveError::NonFinite {
                    stage: stage_name(case, breakaway),
                    what: "the balance of forces",
                    line: None,
                    part: Some(rig.parts[part].name.clone()),
                });
            }
            // Equilibrate the columns first: a long chain of friction passages makes
            // some tension coefficients many orders of magnitude larger than others,
            // and a rank decision on the raw matrix would drop the small ones.
            let column_norms = sparse_column_norms(&rows, n, m);
            // A determinate system is walked, unknown by unknown, to full precision
            // (super::walk); a pivot must pass the rank threshold of the dense solve on
            // the equilibrated matrix, so the walk answers only where that solve would
            // find full rank too.
            let row_max: Vec<Real> = rows
                .iter()
                .map(|row| {
                    row.iter()
                        .map(|&(j, v)| v.abs() / column_norms[j])
                        .fold(0.0, Real::max)
                })
                .collect();
            let entry = |k: usize, j: usize| {
                rows[k]
                    .binary_search_by_key(&j, |e| e.0)
                    .map_or(0.0, |p| rows[k][p].1)
            };
            let walked =
                super::walk::substitute_rows(&rows, m, rhs.as_slice(), &vec![None; m], |k, j| {
                    entry(k, j).abs() / column_norms[j] > options.rank_tolerance * row_max[k]
                })
                .map_err(|e| {
                    let part = self.kin.dofs[self.layout.dofs[e.row]].part;
                    SolveError::BeyondPrecision {
                        stage: stage_name(case, breakaway),
                        what: "a tension",
                        part: rig.parts[part].name.clone(),
                    }
                })?;
            let (solution, rank, residual, terms_max, by_stiffness) = match walked {
                Some(x) => {
                    // The misfit and the size of the terms, over the pattern.
                    let misfit: DVector<Real> = DVector::from_iterator(
                        n,
                        rows.iter()
                            .zip(rhs.iter())
                            .map(|(row, b)| row.iter().map(|&(j, v)| v * x[j]).sum::<Real>() - b),
                    );
                    let terms = rows
                        .iter()
                        .map(|row| row.iter().map(|&(j, v)| v.abs() * x[j].abs()).sum::<Real>())
                        .fold(0.0, Real::max);
                    (DVector::from_vec(x), m, misfit.norm(), terms, false)
                }
                None => {
                    let mut mat = DMatrix::zeros(n, m);
                    for (k, row) in rows.iter().enumerate() {
                        for &(j, v) in row {
                            mat[(k, j)] = v;
                        }
                    }
                    let column_norms = dense_column_norms(&mat);
                    let (solution, rank) = self.dense_solve(&mat, &rhs, &column_norms, options);
                    // Lines sharing a block: the split by stiffness where ropes give one.
                    let (solution, by_stiffness) = if rank < m {
                        self.stiffness_split(&mat, &column_norms, &coef, solution, options)
                    } else {
                        (solution, false)
                    };
                    let residual = (&mat * &solution - &rhs).norm();
                    let terms = (mat.abs() * solution.abs()).amax();
                    (solution, rank, residual, terms, by_stiffness)
                }
            };
            // Compare the misfit with the size of the terms that should cancel.
            let rhs_scale = rhs.norm().max(terms_max).max(1e-300);
            if !solution.iter().all(|v| v.is_finite()) || !residual.is_finite() {
                return Err(SolveError::NonFinite {
                    stage: stage_name(case, breakaway),
                    what: "the solution of the balance of forces",
                    line: None,
                    part: None,
                });
            }
            if residual > 1e-7 * rhs_scale {
                // Name the cause: a moving part whose equation no tension reaches (its
                // lines pull only sideways to its motion), else friction itself.
                let tension_scale = rows
                    .iter()
                    .flatten()
                    .map(|e| e.1.abs())
                    .fold(0.0, Real::max)
                    .max(1e-300);
                let sideways = (0..n).find(|&k| {
                    rows[k].iter().all(|e| e.1.abs() <= 1e-12 * tension_scale)
                        && rhs[k].abs() > 1e-7 * rhs_scale
                });
                let (part, hint) = match sideways {
                    Some(k) => (
                        Some(rig.parts[self.kin.dofs[self.layout.dofs[k]].part].name.clone()),
                        "that part is loaded along its motion, but its lines pull only sideways to it; check its `moves` and the lines that hold it",
                    ),
                    None => (
                        None,
                        "friction leaves the asked quantity no way to balance the loads in this case; please report this rig",
                    ),
                };
                return Err(SolveError::NoEquilibrium {
                    case: case.name(),
                    residual: residual / rhs_scale,
                    part,
                    hint,
                });
            }
            let mut tension: Vec<Vec<Real>> = self
                .layout
                .lines
                .iter()
                .map(|&l| vec![0.0; rig.lines[l].path.len().saturating_sub(1)])
                .collect();
            for (col, (&g, &li)) in self
                .layout
                .segs
                .iter()
                .zip(&self.layout.seg_line)
                .enumerate()
            {
                let seg = self.kin.segments[g];
                for j in seg.first..seg.last {
                    let (c, c0) = coef[li][j];
                    tension[li][j] = c * solution[col] + c0;
                }
            }
            let change = previous.as_ref().map(|p| relative_change(p, &tension));
            let converged = !needs_iteration || change.is_some_and(|c| c <= options.tolerance);
            let last = options.max_iterations.max(1) == iteration;
            // The tensions go to the answer, and are kept for the next iteration only
            // where there is one.
            let kept = (!converged && !last).then(|| tension.clone());
            outcome = Some((
                tension,
                solution[m - 1],
                stalled,
                drum_friction,
                rank < m,
                by_stiffness,
            ));
            if converged {
                status = Status::Converged {
                    iterations: iteration,
                };
                break;
            }
            status = Status::OutOfIterations {
                iterations: iteration,
                change: change.unwrap_or(Real::INFINITY),
            };
            previous = kept;
        }
        let Some((tension, value, stalled, drum_friction, indeterminate, by_stiffness)) = outcome
        else {
            return Err(SolveError::NoEquilibrium {
                case: case.name(),
                residual: Real::NAN,
                part: None,
                hint: "no iteration ran",
            });
        };
        let mut result = self.finish(
            case,
            value,
            tension,
            stalled,
            drum_friction,
            indeterminate,
            status,
            &velocity,
        );
        result.split_by_stiffness = by_stiffness;
        Ok(result)
    }

    /// The error for a tension coefficient that overflowed at entry `e` of `line`.
    fn non_finite(
        &self,
        stage: &'static str,
        what: &'static str,
        line: LineId,
        e: usize,
    ) -> SolveError {
        SolveError::NonFinite {
            stage,
            what,
            line: Some(self.rig.lines[line].name.clone()),
            part: Some(
                self.rig.parts[self.rig.lines[line].path[e].part]
                    .name
                    .clone(),
            ),
        }
    }

    /// Whether any friction of the sub-rig depends on the tensions themselves.
    fn load_dependent(&self) -> bool {
        self.layout
            .parts
            .iter()
            .enumerate()
            .any(|(lp, &p)| match &self.rig.parts[p].kind {
                PartKind::Sheave(s) => {
                    // The rope on its arc weighs on a journal as the sheave's own weight does.
                    Problem::sheave_load_dependent(s)
                        || (self.layout.arc_load[lp].norm() > 0.0
                            && matches!(
                                bearing_resistance(&s.bearing, false),
                                BearingResistance::FrictionCircle { .. }
                            ))
                }
                PartKind::Drum(d) => {
                    d.shaft.as_ref().is_some_and(|s| {
                        !matches!(
                            bearing_resistance(&s.bearing, false),
                            BearingResistance::Free
                        )
                    }) || self.rope_bends_on_drums()
                }
                _ => false,
            })
    }
}

/// The case's name in messages.
fn stage_name(case: Case, breakaway: bool) -> &'static str {
    match (case, breakaway) {
        (_, true) => "the breakaway case",
        (Case::Ideal, _) => "the ideal case",
        (Case::Forward, _) => "the forward case",
        (Case::Back, _) => "the back case",
    }
}

/// Largest change between two sets of the sub-rig's tensions over the largest tension.
fn relative_change(a: &[Vec<Real>], b: &[Vec<Real>]) -> Real {
    let mut worst: Real = 0.0;
    let mut scale: Real = 0.0;
    for (a, b) in a.iter().zip(b) {
        for (x, y) in a.iter().zip(b) {
            worst = worst.max((x - y).abs());
            scale = scale.max(y.abs());
        }
    }
    worst / scale.max(1e-300)
}

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

use crate::friction::{self, BearingResistance};
use crate::geometry::Geometry;
use crate::math::{Real, Vector, STANDARD_GRAVITY};
use crate::model::Network;
use crate::model::{square_to_gravity, BlockLoad, LineId, PartId, PartKind, Rig};

use super::bearing::{bearing_resistance, thrust_moment};
use super::kinematics::{line_component, Kinematics};
use super::selfweight::RopeWeight;
use super::{Case, SolveError, SolveOptions};

mod passage;
mod result;

pub use passage::DrumFriction;
pub use result::Losses;

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

/// The answer for one case of one sub-rig.
#[derive(Debug, Clone)]
pub struct CaseResult {
    /// Which case.
    pub case: Case,
    /// The asked quantity, SI.
    pub value: Real,
    /// `tension[line][span]`, N, at the span's start (empty for lines of other
    /// sub-rigs).
    pub tension: Vec<Vec<Real>>,
    /// `tension_end[line][span]`, N, at the span's end: the start tension plus the
    /// rope's weight times the rise (equal to `tension` for a weightless rope).
    pub tension_end: Vec<Vec<Real>>,
    /// Power into the ropes' potential energy per unit drive speed, W (zero for
    /// weightless ropes); the energy audit counts it.
    pub rope_power: Real,
    /// `ratio[line][entry]`: tight over slack tension at a middle passage.
    pub ratio: Vec<Vec<Option<Real>>>,
    /// Power lost at each part per unit drive speed, W (per m/s or rad/s of the drive).
    pub loss: Vec<Real>,
    /// Power taken by each part's load per unit drive speed, W (negative where a load
    /// gives power, and at the drive).
    pub load_power: Vec<Real>,
    /// Power the drive puts in per unit drive speed.
    pub drive_power: Real,
    /// Resultant force the lines (and own weight) put on each part, N.
    pub pin_load: Vec<Option<Vector>>,
    /// Drum torques, per part.
    pub drums: Vec<Option<DrumTorques>>,
    /// Sheaves that do not turn: (line, entry).
    pub stalled: Vec<(LineId, usize)>,
    /// Untied drum passages where the rope slips.
    pub slipping: Vec<Slip>,
    /// Spans with negative tension (slack): (line, span).
    pub slack: Vec<(LineId, usize)>,
    /// Whether statics alone could not fix every tension (the split among parallel
    /// lines is then the least-squares one, or the stiffness one).
    pub indeterminate: bool,
    /// Whether the split among lines sharing a block follows the ropes' stiffness
    /// (compatibility of stretch; DESIGN.md §7) rather than least squares.
    pub split_by_stiffness: bool,
    /// Fixed-point status.
    pub status: Status,
    /// Energy audit misfit: |drive − loads − losses| over the drive power.
    pub audit_residual: Real,
    /// `loss` by kind (bearing, bending, surface, drum), per part.
    pub losses: Losses,
}

impl CaseResult {
    /// Total losses per unit drive speed, W.
    pub fn total_loss(&self) -> Real {
        self.loss.iter().sum()
    }

    /// Power put into the rig per unit drive speed, W: the drive's power where the
    /// drive gives power, else (the loads drive the rig, the drive holds them back) the
    /// power the loads give.
    pub fn input_power(&self) -> Real {
        if self.drive_power >= 0.0 {
            self.drive_power
        } else {
            self.load_power
                .iter()
                .filter(|p| **p < 0.0)
                .map(|p| -p)
                .sum()
        }
    }
}

/// The statics problem of one sub-rig.
pub struct Problem<'a> {
    rig: &'a Rig,
    geometry: &'a Geometry,
    kin: &'a Kinematics,
    solve_for: PartId,
    drive: PartId,
    /// Global dof indices of the sub-rig.
    dofs: Vec<usize>,
    /// Global segment indices of the sub-rig.
    segs: Vec<usize>,
    /// Lines of the sub-rig.
    lines: Vec<LineId>,
    /// Known generalized load forces (global dof index order of `dofs`).
    q_load: DVector<Real>,
    /// Unknown's generalized force per unit.
    x_coef: DVector<Real>,
    /// The ropes' own weight on each span (zero for weightless ropes; DESIGN.md §7).
    weight: RopeWeight,
    /// The generalized load of the ropes' weight beyond the start tensions, per dof
    /// (order of `dofs`).
    rope_load: DVector<Real>,
}

/// A block's own mass and that of the sheaves it carries, kg.
fn block_mass(rig: &Rig, block: PartId) -> Real {
    let own = match &rig.parts[block].kind {
        PartKind::Block(b) => b.mass.unwrap_or(0.0),
        _ => 0.0,
    };
    own + rig
        .parts
        .iter()
        .filter_map(|p| match &p.kind {
            PartKind::Sheave(s) if p.block == Some(block) => s.mass,
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
        let dofs: Vec<usize> = (0..kin.dofs.len())
            .filter(|&i| network.component_of[kin.dofs[i].part] == component)
            .collect();
        let lines: Vec<LineId> = (0..rig.lines.len())
            .filter(|&l| line_component(rig, network, l) == Some(component))
            .collect();
        let segs: Vec<usize> = (0..kin.segments.len())
            .filter(|&g| lines.contains(&kin.segments[g].line))
            .collect();
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
                    let mass = block_mass(rig, part);
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
        let weight = RopeWeight::build(rig, geometry);
        let rope_load = weight.generalized_load(rig, geometry, kin, &lines, &dofs);
        Ok(Problem {
            rig,
            geometry,
            kin,
            solve_for,
            drive,
            dofs,
            segs,
            lines,
            q_load,
            x_coef,
            weight,
            rope_load,
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
        for (k, &i) in self.dofs.iter().enumerate() {
            let part = self.kin.dofs[i].part;
            let speed = self.kin.forward[i].abs();
            if part == self.drive || speed == 0.0 {
                continue;
            }
            let size = match &self.rig.parts[part].kind {
                PartKind::Block(b) => {
                    let mass = block_mass(self.rig, part)
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
        let n = self.dofs.len();
        let m = self.segs.len() + 1;
        let velocity: DVector<Real> = self.kin.forward.clone() * sign;
        let mut previous: Option<Vec<Vec<Real>>> = None;
        let mut status = Status::Converged { iterations: 1 };
        let mut outcome = None;
        let needs_iteration = case != Case::Ideal && self.load_dependent();
        for iteration in 1..=options.max_iterations.max(1) {
            // Walk every segment: T_span = c τ + e.
            let mut coef: Vec<Vec<(Real, Real)>> = rig
                .lines
                .iter()
                .map(|l| vec![(0.0, 0.0); l.path.len().saturating_sub(1)])
                .collect();
            let mut stalled = Vec::new();
            for &g in &self.segs {
                let seg = self.kin.segments[g];
                coef[seg.line][seg.first] = (1.0, 0.0);
                for e in seg.first + 1..seg.last {
                    let (k, delta, stall) =
                        self.passage(case, seg.line, e, previous.as_ref(), breakaway)?;
                    if stall {
                        stalled.push((seg.line, e));
                    }
                    // Into the passage at the previous span's end tension; out of it
                    // with the arc's rise (both zero for a weightless rope).
                    let (c, c0) = coef[seg.line][e - 1];
                    let c0 = c0 + self.weight.rise(seg.line, e - 1);
                    let next = (k * c, k * c0 + delta + self.weight.arc(seg.line, e));
                    if !(next.0.is_finite() && next.1.is_finite()) {
                        // Ratios in series that each hold but together overflow.
                        return Err(self.non_finite(
                            stage_name(case, breakaway),
                            "the tension along the line",
                            seg.line,
                            e,
                        ));
                    }
                    coef[seg.line][e] = next;
                }
            }
            // Drum friction from the previous tensions.
            let forces = previous.as_ref().map(|t| self.contact_forces(t));
            let mut q = self.q_load.clone();
            let mut drum_friction = vec![DrumFriction::default(); n];
            if case != Case::Ideal {
                for (k, &i) in self.dofs.iter().enumerate() {
                    let part = self.kin.dofs[i].part;
                    if matches!(rig.parts[part].kind, PartKind::Drum(_)) {
                        let empty = Vec::new();
                        let f = forces.as_ref().map(|f| &f[part]).unwrap_or(&empty);
                        let friction = self.drum_friction(part, f, breakaway);
                        // The rope's bending on and off the drum (DESIGN.md §7).
                        let friction = DrumFriction {
                            bending: self.drum_bending(part, previous.as_ref()),
                            ..friction
                        };
                        drum_friction[k] = friction;
                        let v = velocity[i];
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
            // Assemble.
            let mut mat = DMatrix::zeros(n, m);
            let mut rhs = q.clone() + &self.rope_load;
            for (col, &g) in self.segs.iter().enumerate() {
                let seg = self.kin.segments[g];
                let rows = &self.kin.span_rows[seg.line][seg.first..seg.last];
                for (&(c, c0), row) in coef[seg.line][seg.first..seg.last].iter().zip(rows) {
                    for (k, &i) in self.dofs.iter().enumerate() {
                        mat[(k, col)] += c * row[i];
                        rhs[k] -= c0 * row[i];
                    }
                }
            }
            for k in 0..n {
                mat[(k, m - 1)] = -self.x_coef[k];
            }
            // Nothing that is not a finite number may reach the SVD (it panics on NaN).
            if let Some(k) =
                (0..n).find(|&k| !rhs[k].is_finite() || mat.row(k).iter().any(|v| !v.is_finite()))
            {
                let part = self.kin.dofs[self.dofs[k]].part;
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
            let column_norms: Vec<Real> = (0..m)
                .map(|j| {
                    let n = mat.column(j).norm();
                    if n > 0.0 && n.is_finite() {
                        n
                    } else {
                        1.0
                    }
                })
                .collect();
            // A determinate system is walked, unknown by unknown, to full precision
            // (super::walk); a pivot must pass the rank threshold of the dense solve on
            // the equilibrated matrix, so the walk answers only where that solve would
            // find full rank too.
            let row_max: Vec<Real> = (0..n)
                .map(|k| {
                    (0..m)
                        .map(|j| mat[(k, j)].abs() / column_norms[j])
                        .fold(0.0, Real::max)
                })
                .collect();
            let walked = super::walk::substitute(&mat, rhs.as_slice(), &vec![None; m], |k, j| {
                mat[(k, j)].abs() / column_norms[j] > options.rank_tolerance * row_max[k]
            })
            .map_err(|e| {
                let part = self.kin.dofs[self.dofs[e.row]].part;
                SolveError::BeyondPrecision {
                    stage: stage_name(case, breakaway),
                    what: "a tension",
                    part: rig.parts[part].name.clone(),
                }
            })?;
            let (solution, rank) = match walked {
                Some(x) => (DVector::from_vec(x), m),
                None => self.dense_solve(&mat, &rhs, &column_norms, options),
            };
            // Lines sharing a block: the split by stiffness where ropes give one.
            let (solution, by_stiffness) = if rank < m {
                self.stiffness_split(&mat, &column_norms, &coef, solution, options)
            } else {
                (solution, false)
            };
            let residual = (&mat * &solution - &rhs).norm();
            // Compare the misfit with the size of the terms that should cancel.
            let terms = mat.abs() * solution.abs();
            let rhs_scale = rhs.norm().max(terms.amax()).max(1e-300);
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
                let tension_scale = mat.amax().max(1e-300);
                let sideways = (0..n).find(|&k| {
                    (0..m).all(|j| mat[(k, j)].abs() <= 1e-12 * tension_scale)
                        && rhs[k].abs() > 1e-7 * rhs_scale
                });
                let (part, hint) = match sideways {
                    Some(k) => (
                        Some(rig.parts[self.kin.dofs[self.dofs[k]].part].name.clone()),
                        "that part is loaded along its motion, but its lines pull only sideways to it; check its `moves` and the lines that hold it",
                    ),
                    None => (
                        None,
                        "friction leaves the asked quantity no way to balance the loads in this case; please report this rig",
                    ),
                };
                return Err(SolveError::NoEquilibrium {
                    case: case.name(),
                    residual,
                    part,
                    hint,
                });
            }
            let mut tension: Vec<Vec<Real>> = rig
                .lines
                .iter()
                .map(|l| vec![0.0; l.path.len().saturating_sub(1)])
                .collect();
            for (col, &g) in self.segs.iter().enumerate() {
                let seg = self.kin.segments[g];
                for j in seg.first..seg.last {
                    let (c, c0) = coef[seg.line][j];
                    tension[seg.line][j] = c * solution[col] + c0;
                }
            }
            let change = previous
                .as_ref()
                .map(|p| relative_change(p, &tension, &self.lines));
            let converged = !needs_iteration || change.is_some_and(|c| c <= options.tolerance);
            outcome = Some((
                tension.clone(),
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
            previous = Some(tension);
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

    /// The load split by compatibility of stretch ([`super::elastic::compatible_split`])
    /// when every rope of the sub-rig has a `stiffness`; else the least-squares
    /// `solution` as it is. Also whether the stiffness fixed the split.
    fn stiffness_split(
        &self,
        mat: &DMatrix<Real>,
        column_norms: &[Real],
        coef: &[Vec<(Real, Real)>],
        solution: DVector<Real>,
        options: &SolveOptions,
    ) -> (DVector<Real>, bool) {
        let input = super::elastic::SplitInput {
            rig: self.rig,
            geometry: self.geometry,
            kin: self.kin,
            segs: &self.segs,
            dofs: &self.dofs,
            coef,
            rise: &|l, j| self.weight.rise(l, j),
        };
        match super::elastic::compatible_split(
            &input,
            mat,
            column_norms,
            &solution,
            options.rank_tolerance,
            options.motion_tolerance,
        ) {
            Some((x, fixed)) => (x, fixed),
            None => (solution, false),
        }
    }

    /// The rig's spring rate at the drive ([`super::elastic::drive_stiffness`]): every
    /// part with a load (or the asked quantity) held, the others free.
    pub fn drive_stiffness(&self) -> Option<Real> {
        super::elastic::drive_stiffness(&self.spring_input()?)
    }

    /// The lost travel at the drive from the just-taut to the loaded rig, by the
    /// unit-load method over the stretches of `case` ([`super::elastic::lost_travel`]).
    pub fn lost_travel(&self, case: &CaseResult) -> Option<Real> {
        let ea = |l: LineId| self.rig.rope_of(l).stiffness;
        super::elastic::lost_travel(&self.spring_input()?, |l, j| {
            let (a, b) = (case.tension[l].get(j)?, case.tension_end[l].get(j)?);
            let s = &self.geometry.lines[l].spans[j];
            Some(super::elastic::span_stretch(*a, *b, s.length, ea(l)?))
        })
    }

    /// What the spring solve needs: the sub-rig's segments and motions, the drive's
    /// motion, and which motions are held (a part with a load, or the asked quantity).
    fn spring_input(&self) -> Option<super::elastic::SpringInput<'_>> {
        let drive = self
            .dofs
            .iter()
            .position(|&i| self.kin.dofs[i].part == self.drive)?;
        let held: Vec<bool> = (0..self.dofs.len())
            .map(|k| self.q_load[k] != 0.0 || self.x_coef[k] != 0.0 || self.rope_load[k] != 0.0)
            .collect();
        Some(super::elastic::SpringInput {
            rig: self.rig,
            geometry: self.geometry,
            kin: self.kin,
            segs: &self.segs,
            dofs: &self.dofs,
            drive,
            held,
        })
    }

    /// The lines of the sub-rig.
    pub fn lines(&self) -> &[LineId] {
        &self.lines
    }

    /// The equilibrated least-squares solve of `mat x = rhs` by SVD, and the rank it
    /// finds: for systems the walk cannot order (lines sharing a block, coupled
    /// drums).
    fn dense_solve(
        &self,
        mat: &DMatrix<Real>,
        rhs: &DVector<Real>,
        column_norms: &[Real],
        options: &SolveOptions,
    ) -> (DVector<Real>, usize) {
        let (n, m) = mat.shape();
        let mut scaled = mat.clone();
        for (j, n) in column_norms.iter().enumerate() {
            scaled.column_mut(j).unscale_mut(*n);
        }
        // Then the rows (equations), which leaves the solutions of a consistent
        // system unchanged.
        let mut scaled_rhs = rhs.clone();
        for i in 0..n {
            let r = scaled.row(i).amax();
            if r > 0.0 && r.is_finite() {
                scaled.row_mut(i).unscale_mut(r);
                scaled_rhs[i] /= r;
            }
        }
        let scale = scaled.amax().max(1e-300);
        let svd = scaled.svd(true, true);
        let rank = svd.rank(options.rank_tolerance * scale);
        let mut solution = svd
            .solve(&scaled_rhs, options.rank_tolerance * scale)
            .unwrap_or_else(|_| DVector::zeros(m));
        for (j, n) in column_norms.iter().enumerate() {
            solution[j] /= n;
        }
        (solution, rank)
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

    /// Whether any friction depends on the tensions themselves.
    fn load_dependent(&self) -> bool {
        self.rig.parts.iter().any(|p| match &p.kind {
            PartKind::Sheave(s) => Problem::sheave_load_dependent(s),
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

fn relative_change(a: &[Vec<Real>], b: &[Vec<Real>], lines: &[LineId]) -> Real {
    let mut worst: Real = 0.0;
    let mut scale: Real = 0.0;
    for &l in lines {
        for (x, y) in a[l].iter().zip(&b[l]) {
            worst = worst.max((x - y).abs());
            scale = scale.max(y.abs());
        }
    }
    worst / scale.max(1e-300)
}

//! Turning one case's solved tensions into its [`CaseResult`]: drum torques, slips,
//! pin loads and the energy audit.

use super::*;

/// The energy audit's losses by kind, per part, W per unit drive speed (as
/// [`CaseResult::loss`], which is their sum part by part).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Losses {
    /// A turning sheave's bearing: journal (friction circle, rolling or rated) and
    /// thrust face.
    pub bearing: Vec<Real>,
    /// The rope's own bending over a turning sheave (the rope's `bend_loss`).
    pub bending: Vec<Real>,
    /// Rope sliding on a fixed surface: a guide, a stalled sheave (capstan).
    pub surface: Vec<Real>,
    /// A drum's drag, journal and thrust.
    pub drum: Vec<Real>,
}

impl Losses {
    /// Each kind summed over the parts: (bearing, bending, surface, drum).
    pub fn totals(&self) -> (Real, Real, Real, Real) {
        let sum = |v: &[Real]| v.iter().sum::<Real>();
        (
            sum(&self.bearing),
            sum(&self.bending),
            sum(&self.surface),
            sum(&self.drum),
        )
    }
}

impl Problem<'_> {
    #[allow(clippy::too_many_arguments)]
    pub(super) fn finish(
        &self,
        case: Case,
        value: Real,
        tension: Vec<Vec<Real>>,
        stalled: Vec<(LineId, usize)>,
        drum_friction: Vec<DrumFriction>,
        indeterminate: bool,
        status: Status,
        velocity: &DVector<Real>,
    ) -> CaseResult {
        let rig = self.rig;
        let nparts = rig.parts.len();
        let mut loss = vec![0.0; nparts];
        let mut losses = Losses {
            bearing: vec![0.0; nparts],
            bending: vec![0.0; nparts],
            surface: vec![0.0; nparts],
            drum: vec![0.0; nparts],
        };
        let mut ratio: Vec<Vec<Option<Real>>> =
            rig.lines.iter().map(|l| vec![None; l.path.len()]).collect();
        let mut slack = Vec::new();
        let mut slipping = Vec::new();
        let tension_end = self.end_tensions(&tension);
        for &l in &self.lines {
            let path = &rig.lines[l].path;
            for (j, &t) in tension[l].iter().enumerate() {
                if t.min(tension_end[l][j]) < -1e-9 * (1.0 + value.abs()) {
                    slack.push((l, j));
                }
            }
            for e in 1..path.len() - 1 {
                let (a, b) = (tension_end[l][e - 1], tension[l][e]);
                let (hi, lo) = if a.abs() >= b.abs() { (a, b) } else { (b, a) };
                if lo.abs() > 0.0 {
                    ratio[l][e] = Some(hi / lo);
                }
                let part = path[e].part;
                if matches!(rig.parts[part].kind, PartKind::Drum(_)) {
                    // Untied drum passage: the rope must not slip.
                    let entry = &self.geometry.lines[l].entries[e];
                    let round = rig.parts[part].kind.round();
                    let limit = friction::capstan::capstan_ratio(
                        self.surface_mu(l, part),
                        round.and_then(|r| r.groove_angle),
                        entry.wrap,
                    );
                    if lo > 0.0 && hi / lo > limit * (1.0 + 1e-9) {
                        slipping.push(Slip {
                            line: l,
                            entry: e,
                            ratio: hi / lo,
                            limit,
                        });
                    }
                } else {
                    let s = case.sign() * self.kin.rope_speed[l][e];
                    // The arc's rise is the rope's weight, not friction; what is left of
                    // it at round-off (a frictionless passage) is no loss.
                    let friction = b - a - self.weight.arc(l, e);
                    let lost = if friction.abs() > 1e-13 * (a.abs() + b.abs()) {
                        friction * s
                    } else {
                        0.0
                    };
                    loss[part] += lost;
                    let stall = stalled.contains(&(l, e));
                    if matches!(rig.parts[part].kind, PartKind::Sheave(_)) && !stall {
                        let bending = self.bending_loss(case, (l, e), (a, b), stall);
                        losses.bending[part] += bending;
                        losses.bearing[part] += lost - bending;
                    } else {
                        losses.surface[part] += lost;
                    }
                }
            }
        }
        // Drum friction losses, per-dof powers.
        let mut load_power = vec![0.0; nparts];
        let mut drive_power = 0.0;
        for (k, &i) in self.dofs.iter().enumerate() {
            let part = self.kin.dofs[i].part;
            let v = velocity[i];
            let friction = drum_friction[k];
            loss[part] += friction.total() * v.abs();
            losses.drum[part] += (friction.total() - friction.bending) * v.abs();
            losses.bending[part] += friction.bending * v.abs();
            let p = (self.q_load[k] + value * self.x_coef[k]) * v;
            if part == self.drive {
                drive_power += p;
            } else {
                load_power[part] -= p;
            }
        }
        let total_loss: Real = loss.iter().sum();
        let total_load: Real = load_power.iter().sum();
        // The ropes' own weight: its potential energy counts (DESIGN.md §7).
        let rope_power = self.rope_power(velocity);
        let stretch_power = self.misfit_power(&tension_end, velocity);
        let scale = drive_power
            .abs()
            .max(total_load.abs())
            .max(total_loss.abs())
            .max(rope_power.abs())
            .max(1e-300);
        let audit_residual =
            (drive_power - total_load - total_loss - rope_power - stretch_power).abs() / scale;

        // Pin loads and drum torques.
        let forces = self.contact_forces(&tension);
        let mut pin_load = vec![None; nparts];
        let mut drums = vec![None; nparts];
        for (id, part) in rig.parts.iter().enumerate() {
            if forces[id].is_empty() {
                continue;
            }
            let own = match &part.kind {
                PartKind::Sheave(s) => s.mass.unwrap_or(0.0),
                PartKind::Drum(d) => d.mass.unwrap_or(0.0),
                _ => 0.0,
            };
            let total = forces[id]
                .iter()
                .fold(gravity_force(rig, own), |a, (f, _)| a + f);
            pin_load[id] = Some(total);
            if let PartKind::Drum(d) = &part.kind {
                let axle = d.axle.into_inner();
                let torque: Real = forces[id]
                    .iter()
                    .map(|(f, at)| (at - part.at).cross(f).dot(&axle))
                    .sum();
                let k = self.dofs.iter().position(|&i| self.kin.dofs[i].part == id);
                let speed = self.kin.dof_of_part[id].map(|i| velocity[i]).unwrap_or(0.0);
                let dir = if speed < 0.0 { -1.0 } else { 1.0 };
                let friction = k.map(|k| drum_friction[k]).unwrap_or_default();
                let load = if id == self.solve_for && id != self.drive {
                    value
                } else if id == self.drive {
                    0.0
                } else {
                    d.torque.unwrap_or(0.0)
                };
                let fwd = self.kin.dof_of_part[id]
                    .map(|i| self.kin.forward[i])
                    .unwrap_or(0.0);
                // A lever's and a spring's torque against forward turning (DESIGN.md §7).
                let load = if id == self.drive {
                    load
                } else {
                    load - fwd.signum() * crate::solve::changing::dof_load(rig, id, fwd)
                };
                drums[id] = Some(DrumTorques {
                    rope: torque * dir,
                    load: load * if fwd * speed >= 0.0 { 1.0 } else { -1.0 },
                    drag: friction.drag,
                    journal: friction.journal,
                    thrust: friction.thrust,
                    bending: friction.bending,
                    speed,
                });
            }
        }
        CaseResult {
            case,
            value,
            tension,
            tension_end,
            rope_power,
            ratio,
            loss,
            load_power,
            drive_power,
            pin_load,
            drums,
            stalled,
            slipping,
            slack,
            indeterminate,
            split_by_stiffness: false,
            status,
            audit_residual,
            losses,
        }
    }
}

impl Problem<'_> {
    /// Every span's tension at its end, from the tension at its start (they differ by
    /// the rope's weight, DESIGN.md §7).
    fn end_tensions(&self, tension: &[Vec<Real>]) -> Vec<Vec<Real>> {
        tension
            .iter()
            .enumerate()
            .map(|(l, t)| {
                t.iter()
                    .enumerate()
                    .map(|(j, t)| {
                        if self.weight.per_length[l] > 0.0 {
                            t + self.weight.rise(l, j)
                        } else {
                            *t
                        }
                    })
                    .collect()
            })
            .collect()
    }

    /// Power into the ropes' stretch where the rig's motion is not exactly rigid
    /// (nearly parallel lines sharing a block move within the motion tolerance, the
    /// misfit taken up by stretch, see [`super::super::SolveOptions::motion_tolerance`]):
    /// each segment's rate of lengthening times its tension where the walk of rope
    /// speeds leaves the misfit, its last span's end. Zero, to round-off, for a rig
    /// whose motion is exact.
    fn misfit_power(&self, tension_end: &[Vec<Real>], velocity: &DVector<Real>) -> Real {
        self.segs
            .iter()
            .map(|&g| {
                let seg = self.kin.segments[g];
                let rate: Real = self.kin.span_rows[seg.line][seg.first..seg.last]
                    .iter()
                    .map(|row| row.dot(velocity))
                    .sum();
                tension_end[seg.line][seg.last - 1] * rate
            })
            .sum()
    }

    /// Power into the ropes' potential energy per unit drive speed in this case, W.
    fn rope_power(&self, velocity: &DVector<Real>) -> Real {
        if !self.weight.any() {
            return 0.0;
        }
        self.weight
            .potential_rate(self.rig, self.geometry, self.kin, &self.lines, velocity)
    }
}

//! Turning one case's solved tensions into its [`CaseResult`]: drum torques, slips,
//! pin loads and the energy audit.

use super::*;

/// The answer for one case of one sub-rig.
#[derive(Debug, Clone)]
pub struct CaseResult {
    /// Which case.
    pub case: Case,
    /// The asked quantity, SI.
    pub value: Real,
    /// `tension[line][span]`, N, at the span's start (empty for lines of other
    /// sub-rigs).
    pub tension: ById<LineId, Vec<Real>>,
    /// `tension_end[line][span]`, N, at the span's end: the start tension plus the
    /// rope's weight times the rise (equal to `tension` for a weightless rope; empty
    /// for lines of other sub-rigs).
    pub tension_end: ById<LineId, Vec<Real>>,
    /// Power into the ropes' potential energy per unit drive speed, W (zero for
    /// weightless ropes); the energy audit counts it.
    pub rope_power: Real,
    /// `ratio[line][entry]`: tight over slack tension at a middle passage (empty for
    /// lines of other sub-rigs).
    pub ratio: ById<LineId, Vec<Option<Real>>>,
    /// Power lost at each part per unit drive speed, W (per m/s or rad/s of the drive);
    /// zero outside the sub-rig.
    pub loss: ById<PartId, Real>,
    /// Power taken by each part's load per unit drive speed, W (negative where a load
    /// gives power, and at the drive); zero outside the sub-rig.
    pub load_power: ById<PartId, Real>,
    /// Power the drive puts in per unit drive speed.
    pub drive_power: Real,
    /// Resultant force the sub-rig's lines (and own weight) put on each part, N; None
    /// at parts its lines do not reach.
    pub pin_load: ById<PartId, Option<Vector>>,
    /// Drum torques, per part (None but at the sub-rig's drums).
    pub drums: ById<PartId, Option<DrumTorques>>,
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
        self.loss.entries().map(|(_, x)| x).sum()
    }

    /// Power put into the rig per unit drive speed, W: the drive's power where the
    /// drive gives power, else (the loads drive the rig, the drive holds them back) the
    /// power the loads give.
    pub fn input_power(&self) -> Real {
        if self.drive_power >= 0.0 {
            self.drive_power
        } else {
            self.load_power
                .entries()
                .map(|(_, p)| p)
                .filter(|p| **p < 0.0)
                .map(|p| -p)
                .sum()
        }
    }
}

/// The energy audit's losses by kind, per part, W per unit drive speed (as
/// [`CaseResult::loss`], which is their sum part by part).
#[derive(Debug, Clone, PartialEq)]
pub struct Losses {
    /// A turning sheave's bearing: journal (friction circle, rolling or rated) and
    /// thrust face.
    pub bearing: ById<PartId, Real>,
    /// The rope's own bending over a turning sheave (the rope's `bend_loss`).
    pub bending: ById<PartId, Real>,
    /// Rope sliding on a fixed surface: a guide, a stalled sheave (capstan).
    pub surface: ById<PartId, Real>,
    /// A drum's drag, journal and thrust.
    pub drum: ById<PartId, Real>,
}

impl Losses {
    /// Each kind summed over the parts: (bearing, bending, surface, drum).
    pub fn totals(&self) -> (Real, Real, Real, Real) {
        let sum = |v: &ById<PartId, Real>| v.entries().map(|(_, x)| x).sum::<Real>();
        (
            sum(&self.bearing),
            sum(&self.bending),
            sum(&self.surface),
            sum(&self.drum),
        )
    }
}

impl Problem<'_> {
    /// `tension` by local line; `velocity[k]` is the case's speed of `dofs[k]`.
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
        velocity: &[Real],
    ) -> CaseResult {
        let rig = self.rig;
        // By local part (`parts`) and local line (`lines`), keyed by the rig's ids at
        // the end.
        let nlocal = self.layout.parts.len();
        let mut loss = vec![0.0; nlocal];
        let mut losses = [(); 4].map(|_| vec![0.0; nlocal]);
        let [bearing, bending_by_part, surface, drum] = &mut losses;
        let mut ratio: Vec<Vec<Option<Real>>> = self
            .layout
            .lines
            .iter()
            .map(|&l| vec![None; rig.lines[l].path.len()])
            .collect();
        let mut slack = Vec::new();
        let mut slipping = Vec::new();
        let tension_end = self.end_tensions(&tension);
        for (li, &l) in self.layout.lines.iter().enumerate() {
            let path = &rig.lines[l].path;
            for (j, &t) in tension[li].iter().enumerate() {
                if t.min(tension_end[li][j]) < -1e-9 * (1.0 + value.abs()) {
                    slack.push((l, j));
                }
            }
            for e in 1..path.len() - 1 {
                let (a, b) = (tension_end[li][e - 1], tension[li][e]);
                let (hi, lo) = if a.abs() >= b.abs() { (a, b) } else { (b, a) };
                if lo.abs() > 0.0 {
                    ratio[li][e] = Some(hi / lo);
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
                    let friction = b - a - self.layout.weight.arc(li, e);
                    let lost = if friction.abs() > 1e-13 * (a.abs() + b.abs()) {
                        friction * s
                    } else {
                        0.0
                    };
                    let lp = self.layout.path_part[li][e];
                    loss[lp] += lost;
                    let stall = stalled.contains(&(l, e));
                    if matches!(rig.parts[part].kind, PartKind::Sheave(_)) && !stall {
                        let bending = self.bending_loss(case, (l, e), (a, b), stall);
                        bending_by_part[lp] += bending;
                        bearing[lp] += lost - bending;
                    } else {
                        surface[lp] += lost;
                    }
                }
            }
        }
        // Drum friction losses, per-dof powers.
        let mut load_power = vec![0.0; self.layout.parts.len()];
        let mut drive_power = 0.0;
        for (k, &i) in self.layout.dofs.iter().enumerate() {
            let part = self.kin.dofs[i].part;
            let v = velocity[k];
            let friction = drum_friction[k];
            let lp = self.layout.dof_part[k];
            loss[lp] += friction.total() * v.abs();
            drum[lp] += (friction.total() - friction.bending) * v.abs();
            bending_by_part[lp] += friction.bending * v.abs();
            let p = (self.q_load[k] + value * self.x_coef[k]) * v;
            if part == self.drive {
                drive_power += p;
            } else {
                load_power[self.layout.dof_part[k]] -= p;
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
        let mut pin_load = vec![None; self.layout.parts.len()];
        let mut drums = vec![None; self.layout.parts.len()];
        for (lp, &id) in self.layout.parts.iter().enumerate() {
            let part = &rig.parts[id];
            if self.layout.touch_start[lp] == self.layout.touch_start[lp + 1] {
                continue;
            }
            let own = match &part.kind {
                PartKind::Sheave(s) => s.mass.unwrap_or(0.0),
                PartKind::Drum(d) => d.mass.unwrap_or(0.0),
                _ => 0.0,
            };
            let total = self
                .contacts(lp, &tension)
                .fold(gravity_force(rig, own), |a, (f, _)| a + f);
            pin_load[lp] = Some(total);
            if let PartKind::Drum(d) = &part.kind {
                let axle = d.axle.into_inner();
                let torque: Real = self
                    .contacts(lp, &tension)
                    .map(|(f, at)| (at - part.at).cross(&f).dot(&axle))
                    .sum();
                let k = self
                    .layout
                    .dofs
                    .iter()
                    .position(|&i| self.kin.dofs[i].part == id);
                let speed = k.map(|k| velocity[k]).unwrap_or(0.0);
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
                drums[lp] = Some(DrumTorques {
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
        let (nparts, nlines) = (rig.parts.len(), rig.lines.len());
        CaseResult {
            case,
            value,
            tension: ById::keyed(nlines, self.layout.line_ids.clone(), tension, Vec::new()),
            tension_end: ById::keyed(
                nlines,
                self.layout.line_ids.clone(),
                tension_end,
                Vec::new(),
            ),
            rope_power,
            ratio: ById::keyed(nlines, self.layout.line_ids.clone(), ratio, Vec::new()),
            loss: ById::keyed(nparts, self.layout.part_ids.clone(), loss, 0.0),
            load_power: ById::keyed(nparts, self.layout.part_ids.clone(), load_power, 0.0),
            drive_power,
            pin_load: ById::keyed(nparts, self.layout.part_ids.clone(), pin_load, None),
            drums: ById::keyed(nparts, self.layout.part_ids.clone(), drums, None),
            stalled,
            slipping,
            slack,
            indeterminate,
            split_by_stiffness: false,
            status,
            audit_residual,
            losses: {
                let [bearing, bending, surface, drum] =
                    losses.map(|v| ById::keyed(nparts, self.layout.part_ids.clone(), v, 0.0));
                Losses {
                    bearing,
                    bending,
                    surface,
                    drum,
                }
            },
        }
    }
}

impl Problem<'_> {
    /// Every span's tension at its end, from the tension at its start (they differ by
    /// the rope's weight, DESIGN.md §7).
    fn end_tensions(&self, tension: &[Vec<Real>]) -> Vec<Vec<Real>> {
        // By local line, as `tension`.
        tension
            .iter()
            .enumerate()
            .map(|(l, t)| {
                t.iter()
                    .enumerate()
                    .map(|(j, t)| {
                        if self.layout.weight.per_length[l] > 0.0 {
                            t + self.layout.weight.rise(l, j)
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
    fn misfit_power(&self, tension_end: &[Vec<Real>], velocity: &[Real]) -> Real {
        let speed = |i: usize| {
            self.layout
                .dofs
                .binary_search(&i)
                .map_or(0.0, |k| velocity[k])
        };
        self.layout
            .segs
            .iter()
            .zip(&self.layout.seg_line)
            .map(|(&g, &li)| {
                let seg = self.kin.segments[g];
                let rate: Real = self.kin.span_rows[seg.line][seg.first..seg.last]
                    .iter()
                    .map(|row| row.iter().map(|(i, b)| b * speed(i)).sum::<Real>())
                    .sum();
                tension_end[li][seg.last - 1] * rate
            })
            .sum()
    }

    /// Power into the ropes' potential energy per unit drive speed in this case, W.
    fn rope_power(&self, velocity: &[Real]) -> Real {
        if !self.layout.weight.any() {
            return 0.0;
        }
        self.layout.weight.potential_rate(
            self.rig,
            self.geometry,
            self.kin,
            &self.layout.lines,
            &self.layout.dofs,
            velocity,
        )
    }
}

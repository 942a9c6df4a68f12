//! Turning one case's solved tensions into its [`CaseResult`]: drum torques, slips,
//! pin loads and the energy audit.

use super::*;

impl Problem<'_> {
    /// `tension` by local line; `velocity[k]` is the case's speed of `dofs[k]`.
    #[allow(clippy::too_many_arguments)]
    pub(super) fn finish(
        &self,
        case: Case,
        value: Real,
        tension: Vec<Vec<Real>>,
        stalled: Vec<(LineId, usize)>,
        drum_friction: Vec<(Real, Real, Real)>,
        indeterminate: bool,
        status: Status,
        velocity: &[Real],
    ) -> CaseResult {
        let rig = self.rig;
        // By local part (`parts`) and local line (`lines`), keyed by the rig's ids at
        // the end.
        let mut loss = vec![0.0; self.parts.len()];
        let mut ratio: Vec<Vec<Option<Real>>> = self
            .lines
            .iter()
            .map(|&l| vec![None; rig.lines[l].path.len()])
            .collect();
        let mut slack = Vec::new();
        let mut slipping = Vec::new();
        for (li, &l) in self.lines.iter().enumerate() {
            let path = &rig.lines[l].path;
            for (j, &t) in tension[li].iter().enumerate() {
                if t < -1e-9 * (1.0 + value.abs()) {
                    slack.push((l, j));
                }
            }
            for e in 1..path.len() - 1 {
                let (a, b) = (tension[li][e - 1], tension[li][e]);
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
                    loss[self.path_part[li][e]] += (b - a) * s;
                }
            }
        }
        // Drum friction losses, per-dof powers.
        let mut load_power = vec![0.0; self.parts.len()];
        let mut drive_power = 0.0;
        for (k, &i) in self.dofs.iter().enumerate() {
            let part = self.kin.dofs[i].part;
            let v = velocity[k];
            let (drag, journal, thrust) = drum_friction[k];
            loss[self.dof_part[k]] += (drag + journal + thrust) * v.abs();
            let p = (self.q_load[k] + value * self.x_coef[k]) * v;
            if part == self.drive {
                drive_power += p;
            } else {
                load_power[self.dof_part[k]] -= p;
            }
        }
        let total_loss: Real = loss.iter().sum();
        let total_load: Real = load_power.iter().sum();
        let scale = drive_power
            .abs()
            .max(total_load.abs())
            .max(total_loss.abs())
            .max(1e-300);
        let audit_residual = (drive_power - total_load - total_loss).abs() / scale;

        // Pin loads and drum torques.
        let mut pin_load = vec![None; self.parts.len()];
        let mut drums = vec![None; self.parts.len()];
        for (lp, &id) in self.parts.iter().enumerate() {
            let part = &rig.parts[id];
            if self.touch_start[lp] == self.touch_start[lp + 1] {
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
                let k = self.dofs.iter().position(|&i| self.kin.dofs[i].part == id);
                let speed = k.map(|k| velocity[k]).unwrap_or(0.0);
                let dir = if speed < 0.0 { -1.0 } else { 1.0 };
                let (drag, journal, thrust) =
                    k.map(|k| drum_friction[k]).unwrap_or((0.0, 0.0, 0.0));
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
                drums[lp] = Some(DrumTorques {
                    rope: torque * dir,
                    load: load * if fwd * speed >= 0.0 { 1.0 } else { -1.0 },
                    drag,
                    journal,
                    thrust,
                    speed,
                });
            }
        }
        let (nparts, nlines) = (rig.parts.len(), rig.lines.len());
        CaseResult {
            case,
            value,
            tension: ById::new(nlines, self.line_ids.clone(), tension, Vec::new()),
            ratio: ById::new(nlines, self.line_ids.clone(), ratio, Vec::new()),
            loss: ById::new(nparts, self.part_ids.clone(), loss, 0.0),
            load_power: ById::new(nparts, self.part_ids.clone(), load_power, 0.0),
            drive_power,
            pin_load: ById::new(nparts, self.part_ids.clone(), pin_load, None),
            drums: ById::new(nparts, self.part_ids.clone(), drums, None),
            stalled,
            slipping,
            slack,
            indeterminate,
            status,
            audit_residual,
        }
    }
}

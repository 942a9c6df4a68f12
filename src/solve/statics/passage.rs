//! The passages of a line: rope-on-surface friction, each passage's tension ratio
//! (bearing or capstan, with stall), the contact forces on every part and drum friction.

use super::*;

impl Problem<'_> {
    /// Rope-on-surface friction for a part on a line.
    pub(super) fn surface_mu(&self, line: LineId, part: PartId) -> Real {
        let own = self.rig.parts[part].kind.round().and_then(|r| r.mu);
        own.unwrap_or(self.rig.rope_of(line).mu)
    }

    /// `T_after = k T_before + delta` for middle entry `e` of `line`; also whether the
    /// sheave stalls there.
    ///
    /// # Errors
    /// [`SolveError::ImplausibleCapstan`] or [`SolveError::ImplausibleBearing`] when the
    /// passage's ratio is above [`friction::PHYSICAL_RATIO_LIMIT`] (or overflows).
    pub(super) fn passage(
        &self,
        case: Case,
        line: LineId,
        e: usize,
        previous: Option<&Vec<Vec<Real>>>,
        breakaway: bool,
    ) -> Result<(Real, Real, bool), SolveError> {
        let (k, delta, stall) = self.passage_ratio(case, line, e, previous, breakaway);
        let ratio = k.max(1.0 / k);
        if ratio.is_finite() && ratio <= friction::PHYSICAL_RATIO_LIMIT {
            return Ok((k, delta, stall));
        }
        let entry = &self.geometry.lines[line].entries[e];
        let part = &self.rig.parts[entry.part];
        let names = (self.rig.lines[line].name.clone(), part.name.clone());
        let is_sheave = matches!(part.kind, PartKind::Sheave(_));
        Err(if stall || !is_sheave {
            let groove = part.kind.round().and_then(|r| r.groove_angle);
            SolveError::ImplausibleCapstan {
                line: names.0,
                part: names.1,
                mu: friction::capstan::effective_mu(self.surface_mu(line, entry.part), groove),
                wrap: entry.wrap,
                stalled: is_sheave,
            }
        } else {
            SolveError::ImplausibleBearing {
                line: names.0,
                part: names.1,
                ratio,
            }
        })
    }

    /// The ratio, constant and stall of a passage, as [`Problem::passage`] checks them.
    pub(super) fn passage_ratio(
        &self,
        case: Case,
        line: LineId,
        e: usize,
        previous: Option<&Vec<Vec<Real>>>,
        breakaway: bool,
    ) -> (Real, Real, bool) {
        if case == Case::Ideal {
            return (1.0, 0.0, false);
        }
        let s = case.sign() * self.kin.rope_speed[line][e];
        if s.abs() < self.kin.rope_speed_floor[line] {
            return (1.0, 0.0, false);
        }
        let entry = &self.geometry.lines[line].entries[e];
        let part = &self.rig.parts[entry.part];
        let wrap = entry.wrap;
        let Some(round) = part.kind.round() else {
            return (1.0, 0.0, false);
        };
        let capstan = friction::capstan::capstan_ratio(
            self.surface_mu(line, entry.part),
            round.groove_angle,
            wrap,
        );
        let orient = |k: Real| if s > 0.0 { k } else { 1.0 / k };
        match &part.kind {
            PartKind::Guide(_) => (orient(capstan), 0.0, false),
            PartKind::Sheave(sheave) => {
                let r = entry.pitch_radius;
                match bearing_resistance(&sheave.bearing, breakaway) {
                    BearingResistance::Free => (1.0, 0.0, false),
                    BearingResistance::Rated { rho } => {
                        let k = friction::sheave_ratio(rho, wrap);
                        if k > capstan {
                            (orient(capstan), 0.0, true)
                        } else {
                            (orient(k), 0.0, false)
                        }
                    }
                    BearingResistance::FrictionCircle { radius } => {
                        let k0 = friction::sheave_ratio(radius / r, wrap);
                        let weight = gravity_force(self.rig, sheave.mass.unwrap_or(0.0));
                        // The weightless ratio decides the stall only while there is no
                        // weight or no tension estimate yet: the sheave's own weight can
                        // lower the pin load (a sheave hanging in its falls), and then
                        // the balance below, not `k0`, says whether it turns.
                        let prev = previous.filter(|_| weight.norm() > 0.0);
                        let Some(prev) = prev else {
                            return if k0 > capstan {
                                (orient(capstan), 0.0, true)
                            } else {
                                (orient(k0), 0.0, false)
                            };
                        };
                        let spans = &self.geometry.lines[line].spans;
                        let u_in = spans[e - 1].direction.into_inner();
                        let u_out = spans[e].direction.into_inner();
                        let before = (prev[line][e - 1] + self.weight.rise(line, e - 1)).max(0.0);
                        let after = if s > 0.0 {
                            friction::tight_tension(before, &u_out, &(-u_in), &weight, radius, r)
                        } else {
                            friction::slack_tension(before, &(-u_in), &u_out, &weight, radius, r)
                        };
                        match after {
                            Some(t) => {
                                let (tight, slack) =
                                    if s > 0.0 { (t, before) } else { (before, t) };
                                if slack > 0.0 && tight / slack > capstan {
                                    (orient(capstan), 0.0, true)
                                } else {
                                    let k = orient(k0);
                                    (k, t - k * before, false)
                                }
                            }
                            None => (orient(capstan), 0.0, true),
                        }
                    }
                }
            }
            _ => (1.0, 0.0, false),
        }
    }

    /// Force each span puts on each part it touches, for the pin loads and drums.
    pub(super) fn contact_forces(
        &self,
        tension: &[Vec<Real>],
    ) -> Vec<Vec<(Vector, crate::math::Point)>> {
        let mut forces = vec![Vec::new(); self.rig.parts.len()];
        for &l in &self.lines {
            let path = &self.rig.lines[l].path;
            for (j, span) in self.geometry.lines[l].spans.iter().enumerate() {
                let u = span.direction.into_inner();
                let (at_start, at_end) = self.weight.end_forces(l, j, &u, tension[l][j]);
                forces[path[j].part].push((at_start, span.start));
                forces[path[j + 1].part].push((at_end, span.end));
            }
        }
        forces
    }

    /// Friction torques of a drum for given tensions: (drag, journal, thrust).
    pub(super) fn drum_friction(
        &self,
        part: PartId,
        forces: &[(Vector, crate::math::Point)],
        breakaway: bool,
    ) -> (Real, Real, Real) {
        let PartKind::Drum(d) = &self.rig.parts[part].kind else {
            return (0.0, 0.0, 0.0);
        };
        let mut journal = 0.0;
        let mut thrust = 0.0;
        if let Some(shaft) = &d.shaft {
            let axle = d.axle.into_inner();
            let total = forces.iter().fold(
                gravity_force(self.rig, d.mass.unwrap_or(0.0)),
                |a, (f, _)| a + f,
            );
            let radial = (total - axle * total.dot(&axle)).norm();
            journal = match bearing_resistance(&shaft.bearing, breakaway) {
                BearingResistance::Free => 0.0,
                BearingResistance::FrictionCircle { radius } => radius * radial,
                BearingResistance::Rated { rho } => rho * 0.5 * d.diameter * radial,
            };
            if let Some(t) = &shaft.thrust {
                thrust = thrust_moment(t);
            }
        }
        (d.drag, journal, thrust)
    }
}

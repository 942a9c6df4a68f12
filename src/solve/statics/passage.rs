//! The passages of a line: rope-on-surface friction, each passage's tension ratio
//! (bearing or capstan, with stall), the contact forces on every part and drum friction.

use super::*;
use crate::model::Thrust;

/// The passage's bearing result `(k, delta, stall)` with the rope's bending loss: on
/// a turning sheave the slack side keeps `keep = 1 − β` of what the bearing alone
/// leaves (`T_after = k T_before + delta` in the bearing's terms, `T_before` or
/// `T_after` the slack side by the rope's direction `s`). A stalled sheave slides
/// the rope at the capstan ratio: no bending term.
fn with_bending((k, delta, stall): (Real, Real, bool), keep: Real, s: Real) -> (Real, Real, bool) {
    if stall || keep == 1.0 {
        return (k, delta, stall);
    }
    if s > 0.0 {
        // Before is the slack side: the bearing sees T_before / keep.
        (k / keep, delta, false)
    } else {
        // After is the slack side: keep of the bearing's.
        (k * keep, delta * keep, false)
    }
}

impl Problem<'_> {
    /// Rope-on-surface friction for a part on a line.
    pub(super) fn surface_mu(&self, line: LineId, part: PartId) -> Real {
        let own = self.rig.parts[part].kind.round().and_then(|r| r.mu);
        own.unwrap_or(self.rig.rope_of(line).mu)
    }

    /// `T_after = k T_before + delta` for middle entry `e` of `line` (local index `li`,
    /// by which `previous` holds the last tensions); also whether the sheave stalls
    /// there.
    ///
    /// # Errors
    /// [`SolveError::ImplausibleCapstan`] or [`SolveError::ImplausibleBearing`] when the
    /// passage's ratio is above [`friction::PHYSICAL_RATIO_LIMIT`] (or overflows).
    pub(super) fn passage(
        &self,
        case: Case,
        line: LineId,
        li: usize,
        e: usize,
        previous: Option<&[Vec<Real>]>,
        breakaway: bool,
    ) -> Result<(Real, Real, bool), SolveError> {
        let (k, delta, stall) = self.passage_ratio(case, line, li, e, previous, breakaway);
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
        li: usize,
        e: usize,
        previous: Option<&[Vec<Real>]>,
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
                let keep = friction::bending::slack_factor(self.rig.rope_of(line).bend_loss);
                // The last tension estimate of the span before the passage, if any, at
                // that span's end (the rope's weight makes its ends differ).
                let before =
                    previous.map(|p| (p[li][e - 1] + self.layout.weight.rise(li, e - 1)).max(0.0));
                // The rope on the arc weighs on the pin beside the sheave's own weight.
                let on_arc = self.layout.weight.arc_weight(li, e);
                if let Some(turning) =
                    self.sheave_3d(sheave, (line, e), on_arc, s, capstan, before, breakaway)
                {
                    return with_bending(turning, keep, s);
                }
                let r = entry.pitch_radius;
                let planar = match bearing_resistance(&sheave.bearing, breakaway) {
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
                        let weight = gravity_force(self.rig, sheave.mass.unwrap_or(0.0)) + on_arc;
                        // The weightless ratio decides the stall only while there is no
                        // weight or no tension estimate yet: the sheave's own weight can
                        // lower the pin load (a sheave hanging in its falls), and then
                        // the balance below, not `k0`, says whether it turns.
                        let Some(before) = before.filter(|_| weight.norm() > 0.0) else {
                            return with_bending(
                                if k0 > capstan {
                                    (orient(capstan), 0.0, true)
                                } else {
                                    (orient(k0), 0.0, false)
                                },
                                keep,
                                s,
                            );
                        };
                        let spans = &self.geometry.lines[line].spans;
                        let u_in = spans[e - 1].direction.into_inner();
                        let u_out = spans[e].direction.into_inner();
                        // The bearing model meets the tension it alone would leave on
                        // the slack side (`T_b`); bending takes its share after it.
                        let after = if s > 0.0 {
                            friction::tight_tension(
                                before / keep,
                                &u_out,
                                &(-u_in),
                                &weight,
                                radius,
                                r,
                            )
                        } else {
                            friction::slack_tension(before, &(-u_in), &u_out, &weight, radius, r)
                                .map(|t| keep * t)
                        };
                        match after {
                            Some(t) => {
                                let (tight, slack) = if s > 0.0 {
                                    (t, before / keep)
                                } else {
                                    (before, t / keep)
                                };
                                if slack > 0.0 && tight / slack > capstan {
                                    (orient(capstan), 0.0, true)
                                } else {
                                    let k = orient(k0);
                                    let k = if s > 0.0 { k / keep } else { k * keep };
                                    return (k, t - k * before, false);
                                }
                            }
                            None => (orient(capstan), 0.0, true),
                        }
                    }
                };
                with_bending(planar, keep, s)
            }
            _ => (1.0, 0.0, false),
        }
    }

    /// The passage over a sheave whose spans leave its groove plane (fleet angles), whose
    /// weight has a part along the axle, or which has a thrust face: the journal takes
    /// the radial part of the pin load and the thrust face its axial part
    /// ([`friction::tight_tension_3d`]). `None` for a planar passage without thrust,
    /// which keeps the planar formulas (and their figures) exactly. The result is the
    /// bearing's alone, before [`with_bending`].
    #[allow(clippy::too_many_arguments)]
    fn sheave_3d(
        &self,
        sheave: &crate::model::Sheave,
        (line, e): (LineId, usize),
        on_arc: Vector,
        s: Real,
        capstan: Real,
        before: Option<Real>,
        breakaway: bool,
    ) -> Option<(Real, Real, bool)> {
        // sin of a fleet angle below which a span counts as in the groove plane.
        const IN_PLANE: Real = 1e-9;
        let entry = &self.geometry.lines[line].entries[e];
        let spans = &self.geometry.lines[line].spans;
        let n = sheave.axle.into_inner();
        let u_in = spans[e - 1].direction.into_inner();
        let u_out = spans[e].direction.into_inner();
        let resistance = bearing_resistance(&sheave.bearing, breakaway);
        let weight = match resistance {
            // A rating fixes the ratio whatever the load: the planar model ignores the
            // sheave's weight there, and so does this one.
            BearingResistance::Rated { .. } => Vector::zeros(),
            _ => gravity_force(self.rig, sheave.mass.unwrap_or(0.0)) + on_arc,
        };
        let skew = u_in.dot(&n).abs() > IN_PLANE
            || u_out.dot(&n).abs() > IN_PLANE
            || weight.dot(&n).abs() > IN_PLANE * weight.norm();
        if !skew && sheave.thrust.is_none() {
            return None;
        }
        let r = entry.pitch_radius;
        let (thrust_arm, thrust_preload) = match &sheave.thrust {
            Some(t) => (thrust_moment(&Thrust { load: 1.0, ..*t }), t.load),
            None => (0.0, 0.0),
        };
        let friction = friction::SheaveFriction {
            friction_radius: resistance.friction_radius(r),
            pitch_radius: r,
            axle: Some(n),
            thrust_arm,
            thrust_preload,
        };
        let (u_tight, u_slack) = if s > 0.0 {
            (u_out, -u_in)
        } else {
            (-u_in, u_out)
        };
        let orient = |k: Real| if s > 0.0 { k } else { 1.0 / k };
        // The load-independent ratio: no weight, no preload.
        let bare = friction::SheaveFriction {
            thrust_preload: 0.0,
            ..friction
        };
        let Some(k0) = friction::tight_tension_3d(1.0, &u_tight, &u_slack, &Vector::zeros(), &bare)
        else {
            return Some((orient(capstan), 0.0, true));
        };
        let constant = weight.norm() > 0.0 || thrust_preload > 0.0;
        let Some(before) = before.filter(|_| constant) else {
            return Some(if k0 > capstan {
                (orient(capstan), 0.0, true)
            } else {
                (orient(k0), 0.0, false)
            });
        };
        let keep = friction::bending::slack_factor(self.rig.rope_of(line).bend_loss);
        // The bearing alone, between the tight side and `T_b`, the slack tension it
        // would leave; bending takes its share after it (`with_bending`).
        let solved = if s > 0.0 {
            let slack = before / keep;
            friction::tight_tension_3d(slack, &u_tight, &u_slack, &weight, &friction)
                .map(|tight| (tight, slack))
        } else {
            friction::slack_tension_3d(before, &u_tight, &u_slack, &weight, &friction)
                .map(|slack| (before, slack))
        };
        let Some((tight, slack)) = solved else {
            // No turning balance: the sheave stands and the rope slides over it.
            return Some((orient(capstan), 0.0, true));
        };
        if slack > 0.0 && tight / slack > capstan {
            return Some((orient(capstan), 0.0, true));
        }
        // T_after = k T_before + delta, in the bearing's terms: `with_bending` scales
        // both to the real slack side.
        let k = orient(k0);
        let after = if s > 0.0 { tight } else { slack };
        let before_b = if s > 0.0 { slack } else { before };
        Some((k, after - k * before_b, false))
    }

    /// Whether a sheave's friction depends on the tensions in a way the walk cannot
    /// hold as one ratio (its weight or a thrust preload), so the statics iterate.
    pub(super) fn sheave_load_dependent(sheave: &crate::model::Sheave) -> bool {
        let weighed = sheave.mass.unwrap_or(0.0) > 0.0;
        let journal = matches!(
            bearing_resistance(&sheave.bearing, false),
            BearingResistance::FrictionCircle { .. }
        );
        (weighed && (journal || sheave.thrust.is_some()))
            || sheave.thrust.is_some_and(|t| t.load > 0.0)
    }

    /// The force each span touching local part `lp` (an index into `parts`) puts on
    /// it, and where, from the tensions by local line: for the pin loads and drums. A
    /// span with rope weight is tighter at its higher end and hangs half its weight
    /// square to the chord on each end ([`RopeWeight::end_forces`](crate::solve::selfweight::RopeWeight::end_forces)); the rope lying on
    /// the part's arcs adds its weight, at the part's centre: it loads the pin, and a
    /// drum's torque stays that of its spans.
    pub(super) fn contacts<'b>(
        &'b self,
        lp: usize,
        tension: &'b [Vec<Real>],
    ) -> impl Iterator<Item = (Vector, crate::math::Point)> + 'b {
        let on_arcs = self.layout.arc_load[lp];
        let centre = self.rig.parts[self.layout.parts[lp]].at;
        self.layout.touches[self.layout.touch_start[lp]..self.layout.touch_start[lp + 1]]
            .iter()
            .map(move |&(li, j, at_end)| {
                let span = &self.geometry.lines[self.layout.lines[li]].spans[j];
                let u = span.direction.into_inner();
                let (on_start, on_end) = self.layout.weight.end_forces(li, j, &u, tension[li][j]);
                if at_end {
                    (on_end, span.end)
                } else {
                    (on_start, span.start)
                }
            })
            .chain((on_arcs.norm() > 0.0).then_some((on_arcs, centre)))
    }

    /// Power lost to the rope's bending at middle entry `e` of `line`, with the tensions
    /// of the spans before and after it, W per unit drive speed: `β/(1 − β) T_slack |s|` over a turning sheave
    /// ([`friction::bending::bending_power`]); 0 for a stalled sheave (the rope slides,
    /// the capstan ratio rules), a guide, or a drum.
    pub(super) fn bending_loss(
        &self,
        case: Case,
        (line, e): (LineId, usize),
        (before, after): (Real, Real),
        stalled: bool,
    ) -> Real {
        let beta = self.rig.rope_of(line).bend_loss;
        let part = self.geometry.lines[line].entries[e].part;
        let s = case.sign() * self.kin.rope_speed[line][e];
        let turning = case != Case::Ideal
            && !stalled
            && s.abs() >= self.kin.rope_speed_floor[line]
            && matches!(self.rig.parts[part].kind, PartKind::Sheave(_));
        if beta == 0.0 || !turning {
            return 0.0;
        }
        let slack = if s > 0.0 { before } else { after };
        friction::bending::bending_power(beta, slack) * s.abs()
    }

    /// The rope's bending torque at a drum, N·m, from the previous tensions: over each
    /// passage round the drum (not a tied end), `β/(1 − β) T_slack R`, the slack side
    /// the smaller of its two spans' tensions ([`friction::bending`]); the power it
    /// takes is `β/(1 − β) T_slack |s|` with `s = R ω`, as over a sheave. Zero without
    /// tensions yet (the first pass of the fixed-point iteration).
    pub(super) fn drum_bending(&self, part: PartId, tension: Option<&[Vec<Real>]>) -> Real {
        let Some(tension) = tension else {
            return 0.0;
        };
        let mut torque = 0.0;
        for (li, &l) in self.layout.lines.iter().enumerate() {
            let beta = self.rig.rope_of(l).bend_loss;
            let path = &self.rig.lines[l].path;
            if beta == 0.0 || path.len() < 3 {
                continue;
            }
            for e in 1..path.len() - 1 {
                if path[e].part != part {
                    continue;
                }
                let slack = tension[li][e - 1].min(tension[li][e]);
                let r = self.geometry.lines[l].entries[e].pitch_radius;
                torque += friction::bending::bending_power(beta, slack) * r;
            }
        }
        torque
    }

    /// Whether a rope with a bend loss passes round a drum of the sub-rig (then drum
    /// friction depends on the tensions and the statics iterate).
    pub(super) fn rope_bends_on_drums(&self) -> bool {
        self.layout.lines.iter().any(|&l| {
            let path = &self.rig.lines[l].path;
            self.rig.rope_of(l).bend_loss > 0.0
                && path.len() > 2
                && path[1..path.len() - 1]
                    .iter()
                    .any(|p| matches!(self.rig.parts[p.part].kind, PartKind::Drum(_)))
        })
    }

    /// Friction torques of a drum for given tensions (drag, journal, thrust; the
    /// bending is [`Problem::drum_bending`]).
    pub(super) fn drum_friction(
        &self,
        part: PartId,
        forces: impl Iterator<Item = (Vector, crate::math::Point)>,
        breakaway: bool,
    ) -> DrumFriction {
        let PartKind::Drum(d) = &self.rig.parts[part].kind else {
            return DrumFriction::default();
        };
        let mut journal = 0.0;
        let mut thrust = 0.0;
        if let Some(shaft) = &d.shaft {
            let axle = d.axle.into_inner();
            let total = forces.fold(
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
        DrumFriction {
            drag: d.drag,
            journal,
            thrust,
            bending: 0.0,
        }
    }
}

/// The torques that resist a drum's turning, N·m, each opposing its motion.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct DrumFriction {
    /// Drag torque as given.
    pub drag: Real,
    /// Journal friction.
    pub journal: Real,
    /// Thrust friction.
    pub thrust: Real,
    /// The rope's bending on and off the drum (its `bend_loss`).
    pub bending: Real,
}

impl DrumFriction {
    /// All of them.
    pub fn total(&self) -> Real {
        self.drag + self.journal + self.thrust + self.bending
    }
}

//! The rope's own weight (`mass_per_length`, DESIGN.md §7), as the statics sees it.
//!
//! Each span stays a straight chord (the sag of a taut span is reported apart, by
//! [`crate::geometry::catenary`]), and its weight `W = w·g·L` (along gravity) is split
//! into the part along the chord and the part square to it:
//!
//! - along the chord it changes the tension: `T_end = T_start + w·g·(h_end − h_start)`,
//!   the higher end tighter (`h` the height against gravity);
//! - square to it, `W⊥ = W − (W·u)u`, it hangs half on each end, as the end shears of a
//!   uniformly loaded taut string.
//!
//! The span's forces on its parts are then `T_start·u + W⊥/2` at its start and
//! `−T_end·u + W⊥/2` at its end; with the weight they are in balance
//! (`(T_end − T_start)·u = −(W·u)u`). Over a turning or fixed round part the rope's
//! tension changes by `w·g·Δh` between the two tangent points, as a frictionless rope's
//! does on a sheave, and the rope lying on the arc, `w·g·R·φ` along gravity (its length
//! `R·φ`, wrap `φ` with any extra turns), bears on the part: the rope on the arc, pulled
//! by the spans at the tangent points and held by the part, puts
//! `T_a·u_a + T_b·u_b + w·g·R·φ·ĝ` on the pin. A part that moves (a block's sheave)
//! carries that weight with it.
//!
//! # Source
//! Statics of a flexible cable under its own weight: the tension grows by the weight per
//! length times the rise, `dT = w·dy` (J. L. Meriam and L. G. Kraige, *Engineering
//! Mechanics: Statics*, §5/9 "Flexible cables", catenary: `T = T₀ + μy`); the taut-string
//! end shears `W⊥/2` are the parabolic-cable case of the same section.

use nalgebra::DVector;

use crate::geometry::Geometry;
use crate::math::{Point, Real, Vector, STANDARD_GRAVITY};
use crate::model::{LineId, PartId, PartKind, Rig};

use super::kinematics::{Kinematics, Motion};

/// The rope weight on one span.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SpanWeight {
    /// `T_end − T_start = w·g·(h_end − h_start)`, N.
    pub rise: Real,
    /// The weight's part square to the chord, `W⊥`, N (half goes to each end).
    pub normal: Vector,
    /// The whole weight `w·g·L`, N.
    pub weight: Real,
}

/// The rope's weight on every span of some lines (a sub-rig's), by local line: the
/// position of the line in the list it was built for; all zero for weightless ropes.
#[derive(Debug, Clone, PartialEq)]
pub struct RopeWeight {
    /// `spans[local line][span]`.
    pub spans: Vec<Vec<SpanWeight>>,
    /// `arcs[local line][entry]`: the tension change over the arc of a middle entry,
    /// `w·g·(h at the next span's start − h at the previous span's end)`, N.
    pub arcs: Vec<Vec<Real>>,
    /// Weight per length `w·g` of each line's rope, N/m.
    pub per_length: Vec<Real>,
    /// `arc_weights[local line][entry]`: the weight of the rope lying on the arc of a
    /// middle entry round a round part, `w·g·R·φ` along gravity, N (zero at a point
    /// part and at the line's ends).
    pub arc_weights: Vec<Vec<Vector>>,
}

/// Height against gravity of a point, m.
fn height(rig: &Rig, at: &Point) -> Real {
    -rig.gravity.dot(&at.coords)
}

impl RopeWeight {
    /// The weight of every span of lines `lines` of `rig` in `geometry`, local line
    /// `li` being `lines[li]`.
    pub fn build(rig: &Rig, geometry: &Geometry, lines: &[LineId]) -> RopeWeight {
        let mut spans = Vec::with_capacity(lines.len());
        let mut arcs = Vec::with_capacity(lines.len());
        let mut per_length = Vec::with_capacity(lines.len());
        let mut arc_weights = Vec::with_capacity(lines.len());
        let down = rig.gravity.into_inner();
        for &l in lines {
            let line = &rig.lines[l];
            let wg = rig.rope_of(l).mass_per_length.unwrap_or(0.0) * STANDARD_GRAVITY;
            let g = &geometry.lines[l];
            spans.push(
                g.spans
                    .iter()
                    .map(|s| {
                        let u = s.direction.into_inner();
                        let w = down * (wg * s.length);
                        SpanWeight {
                            rise: wg * (height(rig, &s.end) - height(rig, &s.start)),
                            normal: w - u * w.dot(&u),
                            weight: wg * s.length,
                        }
                    })
                    .collect(),
            );
            let mut a = vec![0.0; line.path.len()];
            for (e, arc) in a
                .iter_mut()
                .enumerate()
                .take(line.path.len().saturating_sub(1))
                .skip(1)
            {
                *arc = wg * (height(rig, &g.spans[e].start) - height(rig, &g.spans[e - 1].end));
            }
            arcs.push(a);
            let mut on_arc = vec![Vector::zeros(); line.path.len()];
            for (e, w) in on_arc
                .iter_mut()
                .enumerate()
                .take(line.path.len().saturating_sub(1))
                .skip(1)
            {
                let entry = &g.entries[e];
                *w = down * (wg * entry.pitch_radius * entry.wrap);
            }
            arc_weights.push(on_arc);
            per_length.push(wg);
        }
        RopeWeight {
            spans,
            arcs,
            per_length,
            arc_weights,
        }
    }

    /// Whether any rope has weight.
    pub fn any(&self) -> bool {
        self.per_length.iter().any(|w| *w > 0.0)
    }

    /// `T_end − T_start` of a span of local line `line`, N.
    pub fn rise(&self, line: usize, span: usize) -> Real {
        self.spans[line][span].rise
    }

    /// The tension change over the arc of middle entry `entry` of local line `line`, N.
    pub fn arc(&self, line: usize, entry: usize) -> Real {
        self.arcs[line][entry]
    }

    /// The weight of the rope on the arc of middle entry `entry` of local line `line`,
    /// along gravity, N: it loads the part's pin.
    pub fn arc_weight(&self, line: usize, entry: usize) -> Vector {
        self.arc_weights[line][entry]
    }

    /// The forces a span with start tension `t_start` puts on the part at its start and
    /// the part at its end, N (`line` local).
    pub fn end_forces(
        &self,
        line: usize,
        span: usize,
        u: &Vector,
        t_start: Real,
    ) -> (Vector, Vector) {
        let w = &self.spans[line][span];
        let half = w.normal * 0.5;
        (u * t_start + half, -u * (t_start + w.rise) + half)
    }

    /// The generalized load of the rope's weight on each degree of freedom `dofs[k]`
    /// (global dof indices, ascending), beyond what the start tensions carry: the statics adds it
    /// to the known loads. With `V_P`, `V_Q` the velocities of a span's start and end
    /// contact points per unit speed of the dof and `D` its rise:
    /// `G = Σ_spans (−D·(u·V_Q) + W⊥·(V_P + V_Q)/2)`. `lines` are the ones it was
    /// built for.
    pub fn generalized_load(
        &self,
        rig: &Rig,
        geometry: &Geometry,
        kin: &Kinematics,
        lines: &[LineId],
        dofs: &[usize],
    ) -> DVector<Real> {
        let mut g = DVector::zeros(dofs.len());
        for (li, &l) in lines.iter().enumerate() {
            if self.per_length[li] == 0.0 {
                continue;
            }
            let path = &rig.lines[l].path;
            for (j, span) in geometry.lines[l].spans.iter().enumerate() {
                let u = span.direction.into_inner();
                let w = &self.spans[li][j];
                for (part, at, is_end) in [
                    (path[j].part, &span.start, false),
                    (path[j + 1].part, &span.end, true),
                ] {
                    let Some((i, v)) = contact_velocity(rig, kin, part, at) else {
                        continue;
                    };
                    let Ok(k) = dofs.binary_search(&i) else {
                        continue;
                    };
                    g[k] += w.normal.dot(&v) * 0.5;
                    if is_end {
                        g[k] -= w.rise * u.dot(&v);
                    }
                }
            }
            // The rope on each arc moves with its part's centre (a block's sheave; a
            // drum's centre stands, the rope running over it).
            for (e, entry) in geometry.lines[l].entries.iter().enumerate() {
                let weight = self.arc_weights[li][e];
                let Some((i, v)) = contact_velocity(rig, kin, entry.part, &entry.centre) else {
                    continue;
                };
                if let Ok(k) = dofs.binary_search(&i) {
                    g[k] += weight.dot(&v);
                }
            }
        }
        g
    }

    /// Power into the rope's potential energy per unit drive speed, W, for the dof
    /// speeds `velocity[k]` of dofs `dofs[k]` (global dof indices, ascending; `lines`
    /// the ones it was built for): the rate of `Σ_spans w·g·L·h_mid`,
    /// `w·g·[u·(V_Q − V_P)·(h_P + h_Q)/2 + L·ĥ·(V_P + V_Q)/2]` per span (`ĥ` up), plus
    /// `−W_arc·V_c` for the rope on each arc, moving with its part's centre `V_c`.
    pub fn potential_rate(
        &self,
        rig: &Rig,
        geometry: &Geometry,
        kin: &Kinematics,
        lines: &[LineId],
        dofs: &[usize],
        velocity: &[Real],
    ) -> Real {
        let up = -rig.gravity.into_inner();
        let mut rate = 0.0;
        for (li, &l) in lines.iter().enumerate() {
            let wg = self.per_length[li];
            if wg == 0.0 {
                continue;
            }
            let path = &rig.lines[l].path;
            let speed = |part: PartId, at: &Point| {
                contact_velocity(rig, kin, part, at)
                    .and_then(|(i, v)| Some(v * velocity[dofs.binary_search(&i).ok()?]))
                    .unwrap_or_else(Vector::zeros)
            };
            for (j, span) in geometry.lines[l].spans.iter().enumerate() {
                let u = span.direction.into_inner();
                let vp = speed(path[j].part, &span.start);
                let vq = speed(path[j + 1].part, &span.end);
                let mid = 0.5 * (height(rig, &span.start) + height(rig, &span.end));
                rate += wg * (u.dot(&(vq - vp)) * mid + span.length * up.dot(&(vp + vq)) * 0.5);
            }
            // The rope on each arc rises with its part's centre.
            for (e, entry) in geometry.lines[l].entries.iter().enumerate() {
                rate -= self.arc_weights[li][e].dot(&speed(entry.part, &entry.centre));
            }
        }
        rate
    }
}

/// The dof that moves the contact point of `part` at `at`, and the point's velocity per
/// unit speed of that dof (the same rule as the kinematics' span rows: carried sheaves
/// and pick points move with their block, a drum's surface turns about its axle).
pub fn contact_velocity(
    rig: &Rig,
    kin: &Kinematics,
    part: PartId,
    at: &Point,
) -> Option<(usize, Vector)> {
    let mover = match &rig.parts[part].kind {
        PartKind::Sheave(_) | PartKind::Anchor => rig.parts[part].block,
        _ => Some(part),
    }?;
    let i = kin.dof_of_part[mover]?;
    Some((
        i,
        match kin.dofs[i].motion {
            Motion::Translate(d) => d.into_inner(),
            Motion::Rotate(axle) => axle.cross(&(at - rig.parts[mover].at)),
        },
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The span's forces on its two ends carry its whole weight: with the end tension
    /// `T_start + w·g·Δh` along the chord and `W⊥/2` on each end, the rope is in
    /// balance (Meriam & Kraige, *Statics*, §5/9).
    #[test]
    fn a_span_hangs_its_weight_on_its_ends() {
        let wg = 0.5 * STANDARD_GRAVITY;
        let (run, rise) = (8.0_f64, 6.0_f64);
        let length = run.hypot(rise);
        let u = Vector::new(run, 0.0, rise) / length;
        let w = Vector::new(0.0, 0.0, -wg * length);
        let weight = RopeWeight {
            spans: vec![vec![SpanWeight {
                rise: wg * rise,
                normal: w - u * w.dot(&u),
                weight: wg * length,
            }]],
            arcs: vec![vec![0.0, 0.0]],
            per_length: vec![wg],
            arc_weights: vec![vec![Vector::zeros(); 2]],
        };
        let (at_start, at_end) = weight.end_forces(0, 0, &u, 100.0);
        // Forces on the rope are the reactions: −(on the parts); with its weight, zero.
        let balance = -(at_start + at_end) + w;
        assert!(balance.norm() < 1e-12, "{balance}");
        assert!(((at_end + u * (100.0 + wg * rise)) - (w - u * w.dot(&u)) * 0.5).norm() < 1e-12);
    }
}

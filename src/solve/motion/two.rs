//! The second degree of freedom of `motion` (DESIGN.md §7): where the rope has
//! `stiffness` and the drive has inertia of its own (a weight, or a drum), the drive side
//! and the rig side are joined by the rig's spring rate at the drive, `k`
//! (`drive_stiffness`). The drive side carries the drive's own inertia `m_d` and its
//! value; the rig side the rest, with the friction:
//!
//! `m_d·ÿ = c·D(t) − P`, `M_σ·ẍ = P − c·F_σ(x)` moving, `P = k·u` (`u = y − x`, the
//! stretch; a slack rope pushes nothing, `P ≥ 0`), and at rest the rig side stays while
//! `P / c` lies in the holding band. The drive side starts in equilibrium, `k·u₀ = c·D(0)`.
//! The rope's own damping is not modelled, so the drive side keeps what oscillation the
//! rig's starts and stops give it; while the rig side is stuck it is integrated too (no
//! jump over the wait: the drive side still swings).

use crate::math::Real;

use super::integrate::{
    dp_step_n, relabel_stick_slip, DriveValue, Energy, Event, EventKind, Point, Run, Settings,
    EVENT_TOL,
};
use super::profile::Profile;

/// x, v (rig side), u, u̇ (stretch), drive work, loads, friction, added mass.
type State = [Real; 8];

/// Runs the two-degree-of-freedom rig with spring rate `k` (generalized) and the drive's
/// own inertia `own` (None: the drive weight's scheduled mass).
pub fn run(
    profile: &Profile,
    drive: &DriveValue,
    settings: &Settings,
    k: Real,
    own: Option<Real>,
) -> Run {
    let c = profile.scale();
    let end = settings.duration.max(0.0);
    let (lo, hi) = profile.limits();
    let m_d = |t: Real| own.unwrap_or_else(|| drive.at(t)).max(1e-9);
    // A drum drive's own inertia is on the drive side, not the rig side.
    let own_rig = if own.is_some() {
        profile.drive_inertia
    } else {
        0.0
    };
    let pull = |u: Real| (k * u).max(0.0);
    let mut t = 0.0;
    let u0 = c * drive.at(0.0) / k;
    let mut y: State = [0.0, 0.0, u0, 0.0, 0.0, 0.0, 0.0, 0.0];
    // σ = 0 at rest.
    let mut sigma: Real = 0.0;
    let mut out = Run {
        events: Vec::new(),
        points: Vec::new(),
        energy: Energy::default(),
        steps: 0,
        at_geometry_end: false,
    };
    let rhs = |sigma: Real| {
        move |t: Real, z: &State| -> State {
            let (x, v, u, du) = (z[0], z[1], z[2], z[3]);
            let s = profile.at_t(t, x);
            let p = pull(u);
            let d = drive.at(t);
            let ydd = (c * d - p) / m_d(t);
            let (a, friction) = if sigma == 0.0 {
                (0.0, 0.0)
            } else {
                let (f, mu) = if sigma > 0.0 {
                    (s.forward, s.inertia_forward)
                } else {
                    (s.back, s.inertia_back)
                };
                let m = (c * mu + s.own_inertia - own_rig).max(1e-12);
                let a = (p - c * f) / m;
                (a, c * ((f - s.ideal) + (mu - s.inertia_ideal) * a))
            };
            let ydot = v + du;
            let delta = 1e-6;
            let m_dot = (m_d(t + delta) - m_d(t - delta)) / (2.0 * delta);
            [
                v,
                a,
                du,
                ydd - a,
                c * d * ydot,
                c * s.ideal * v,
                friction * v,
                -0.5 * m_dot * ydot * ydot,
            ]
        }
    };
    let point = |t: Real, z: &State| Point {
        t,
        x: z[0],
        v: z[1],
        drive: drive.at(t),
        tension: {
            // The rope's pull at the drive over the drive value at constant speed scales
            // the largest span tension of that case.
            let s = profile.at_t(t, z[0]);
            let (t0, f) = if z[1] < 0.0 {
                (s.tension_back.0, s.back)
            } else {
                (s.tension_forward.0, s.forward)
            };
            if c * f > 0.0 {
                t0 * pull(z[2]) / (c * f)
            } else {
                t0
            }
        },
    };
    out.points.push(point(0.0, &y));
    let mut h = (settings.max_step * 0.01).max(1e-6);
    let mut impacts = 0.0;
    let mut guard = 0usize;
    while t < end && guard < 4_000_000 {
        guard += 1;
        // Leaving rest: the rope's pull outside the band (a stop holds its own side).
        let band = |t: Real, x: Real| {
            let s = profile.at_t(t, x);
            (
                if x <= lo {
                    Real::NEG_INFINITY
                } else {
                    s.start_back
                },
                if x >= hi {
                    Real::INFINITY
                } else {
                    s.start_forward
                },
            )
        };
        if sigma == 0.0 {
            let (b, f) = band(t, y[0]);
            let p = pull(y[2]) / c;
            if p > f || p < b {
                sigma = if p > f { 1.0 } else { -1.0 };
                out.events.push(Event {
                    t,
                    kind: if sigma > 0.0 {
                        EventKind::StartsForward
                    } else {
                        EventKind::StartsBack
                    },
                    position: y[0],
                    drive_value: drive.at(t),
                    speed: 0.0,
                });
            }
        }
        let f = rhs(sigma);
        let mut step = h.min(settings.max_step).min(end - t);
        if let Some(b) = super::integrate::next_break(drive, profile, t) {
            step = step.min(b - t);
        }
        let (y1, err) = dp_step_n(&f, t, &y, step, settings.tolerance_scale);
        if err > 1.0 && step > 1e-12 {
            h = step * (0.9 * err.powf(-0.2)).max(0.1);
            continue;
        }
        out.steps += 1;
        let crossed = |tz: Real, z: &State| {
            if sigma == 0.0 {
                let (b, f) = band(tz, z[0]);
                let p = pull(z[2]) / c;
                p > f || p < b
            } else {
                sigma * z[1] <= 0.0 || z[0] >= hi || z[0] <= lo
            }
        };
        let (t_new, mut y_new) = if crossed(t + step, &y1) {
            let (mut a, mut b) = (0.0, step);
            let mut yb = y1;
            while b - a > EVENT_TOL * step.max(1e-12) {
                let m = 0.5 * (a + b);
                let (ym, _) = dp_step_n(&f, t, &y, m, settings.tolerance_scale);
                if crossed(t + m, &ym) {
                    b = m;
                    yb = ym;
                } else {
                    a = m;
                }
            }
            (t + b, yb)
        } else {
            (t + step, y1)
        };
        if sigma != 0.0 && crossed(t_new, &y_new) {
            let kind = if y_new[0] >= hi {
                y_new[0] = hi;
                EventKind::ReachesForwardStop
            } else if y_new[0] <= lo {
                y_new[0] = lo;
                EventKind::ReachesBackStop
            } else {
                EventKind::Stops
            };
            let speed = y_new[1];
            let s = profile.at_t(t_new, y_new[0]);
            let m_rig = c * s.inertia_ideal + s.own_inertia - own_rig;
            if kind != EventKind::Stops {
                impacts += 0.5 * m_rig * speed * speed;
            }
            // The rig side stops; the drive side keeps its own speed (u̇ takes up v).
            y_new[3] += y_new[1];
            y_new[1] = 0.0;
            out.events.push(Event {
                t: t_new,
                kind,
                position: y_new[0],
                drive_value: drive.at(t_new),
                speed: if kind == EventKind::Stops { 0.0 } else { speed },
            });
            sigma = 0.0;
            if kind != EventKind::Stops && profile.limits_end_run() {
                // The geometry ends here: the run ends, the arrival speed its event's.
                let last = out.events.len() - 1;
                out.events[last].kind = EventKind::Stops;
                out.events[last].speed = speed;
                out.at_geometry_end = true;
                t = t_new;
                y = y_new;
                out.points.push(point(t, &y));
                break;
            }
        }
        let event = out.events.last().is_some_and(|e| e.t == t_new)
            || drive.next_break(t).is_some_and(|b| b <= t_new);
        t = t_new;
        y = y_new;
        // Output at most every quarter of the largest step, and at every event.
        if event
            || t - out.points.last().map_or(0.0, |p| p.t) >= 0.25 * settings.max_step
            || t >= end
        {
            out.points.push(point(t, &y));
        }
        let grow = if err > 0.0 {
            (0.9 * err.powf(-0.2)).min(5.0)
        } else {
            5.0
        };
        h = (step * grow).max(1e-9);
    }
    // A start at once after a stop in the open (it turns round) is one event, not two.
    let mut i = 0;
    while i + 1 < out.events.len() {
        let (a, b) = (out.events[i], out.events[i + 1]);
        if a.kind == EventKind::Stops
            && b.t == a.t
            && matches!(b.kind, EventKind::StartsForward | EventKind::StartsBack)
        {
            out.events.remove(i);
        } else {
            i += 1;
        }
    }
    relabel_stick_slip(&mut out.events);
    let s = profile.at_t(t, y[0]);
    let m_rig = c * s.inertia_ideal + s.own_inertia - own_rig;
    let ydot = y[1] + y[3];
    out.energy = Energy {
        drive: y[4],
        loads: y[5],
        friction: y[6],
        impacts,
        kinetic: 0.5 * m_rig * y[1] * y[1] + 0.5 * m_d(t) * ydot * ydot,
        spring: 0.5 * k * (y[2].max(0.0).powi(2) - u0 * u0),
        added_mass: y[7],
    };
    out
}

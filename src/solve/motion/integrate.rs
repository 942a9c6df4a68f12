//! The integrator of `motion`: the drive's position and speed in time, with the holding
//! band at rest, running friction in motion, and end stops.
//!
//! Moving (direction σ = ±1), the equation of motion along the drive is
//! `M·a = c·(D(t) − F_σ(x))` with `M = c·μ_σ(x) + I_own(x) + m_w(t)`: `c` the
//! generalized scale (g for a mass drive, else 1), `F_σ` the running value of that case,
//! `μ_σ` the inertia through the friction of that case, `I_own` the sheaves' and the
//! drive's own inertia, `m_w` the drive weight's own mass (its scheduled value). Where
//! the velocity ratio changes over the travel the frictionless effective mass `M(x)`
//! changes, and Lagrange's equation adds `−½·(∂M/∂x)·v²` to the right-hand side
//! (`d/dt(M·v) − ½·(∂M/∂x)·v² = Q`); it is not passed through the friction.
//!
//! Steps: Dormand–Prince 5(4) (Hairer, Nørsett & Wanner, *Solving ODEs I*, §II.5) with
//! step-size control on the state (position, speed and the energy integrals), relative
//! tolerance [`RTOL`] and absolute [`ATOL`]; no step crosses a schedule point. Events
//! (the speed reaching zero, an end stop reached) are located by bisection on the step
//! to [`EVENT_TOL`] of the step's time. At rest the rig stays while the drive value lies
//! in the holding band `[start_back, start_forward]`; the next time it leaves the band
//! is found exactly on the piecewise-linear schedule, so a long stuck period costs one
//! step.

use crate::math::Real;
use crate::model::changing::Schedule;

use super::profile::Profile;

/// Relative tolerance per step.
pub const RTOL: Real = 1e-9;
/// Absolute tolerance per step (m, rad, m/s, rad/s, J).
pub const ATOL: Real = 1e-11;
/// Events are located to this fraction of the step (bisection).
pub const EVENT_TOL: Real = 1e-10;

/// What happens at an event (DESIGN.md §7's names).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum EventKind {
    /// Leaves rest forward.
    StartsForward,
    /// Leaves rest backward.
    StartsBack,
    /// Comes to rest inside the holding band.
    Stops,
    /// Reaches the forward end stop.
    ReachesForwardStop,
    /// Reaches the back end stop.
    ReachesBackStop,
    /// Comes to rest in the open and sets off again the same way later (stick-slip).
    Sticks,
    /// Sets off again the way it was moving before it stuck.
    Slips,
}

impl EventKind {
    /// The JSON name.
    pub fn name(self) -> &'static str {
        match self {
            EventKind::StartsForward => "starts-forward",
            EventKind::StartsBack => "starts-back",
            EventKind::Stops => "stops",
            EventKind::ReachesForwardStop => "reaches-forward-stop",
            EventKind::ReachesBackStop => "reaches-back-stop",
            EventKind::Sticks => "sticks",
            EventKind::Slips => "slips",
        }
    }
}

/// One event.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Event {
    /// Time, s.
    pub t: Real,
    /// What.
    pub kind: EventKind,
    /// Drive position, m or rad.
    pub position: Real,
    /// Drive value (natural SI unit).
    pub drive_value: Real,
    /// Speed just before (at a stop: the impact speed), m/s or rad/s.
    pub speed: Real,
}

/// One output point.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Point {
    /// Time, s.
    pub t: Real,
    /// Position.
    pub x: Real,
    /// Speed.
    pub v: Real,
    /// Drive value.
    pub drive: Real,
    /// Largest span tension, N (with the inertia loads).
    pub tension: Real,
}

/// Energy integrals over the run, J.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Energy {
    /// Work done by the drive, `∫ c·D·v dt`.
    pub drive: Real,
    /// Work into the loads (potential energy of weights, springs, levers), `∫ c·F_ideal·v dt`.
    pub loads: Real,
    /// Lost to friction, `∫ c·((F_σ − F_ideal) + (μ_σ − μ_ideal)·a)·v dt`.
    pub friction: Real,
    /// Kinetic energy lost at the end stops.
    pub impacts: Real,
    /// Kinetic energy at the end, `½·M·v²`.
    pub kinetic: Real,
    /// Change of the rope's strain energy (two degrees of freedom), `½·k·(u² − u₀²)`.
    pub spring: Real,
    /// Kinetic energy given to mass added while moving, `−∫ ½·(dM/dt)·v² dt` (`M` the
    /// frictionless effective mass, changing as a drive weight fills or drains or the
    /// velocity ratio changes): `M·a·v = d(½·M·v²)/dt − ½·(dM/dt)·v²`.
    pub added_mass: Real,
}

impl Energy {
    /// Drive work minus everything it went to: zero to the integrator's tolerance.
    pub fn residual(&self) -> Real {
        self.drive
            - self.loads
            - self.friction
            - self.impacts
            - self.kinetic
            - self.spring
            - self.added_mass
    }
}

/// The whole run.
#[derive(Debug, Clone, PartialEq)]
pub struct Run {
    /// Events in time order.
    pub events: Vec<Event>,
    /// Output points.
    pub points: Vec<Point>,
    /// Energy over the run.
    pub energy: Energy,
    /// Accepted steps.
    pub steps: usize,
    /// Whether the run ended where the geometry of a rig without `travel` ends (its
    /// last event, a `stops` with the speed it arrived at), before the duration.
    pub at_geometry_end: bool,
}

/// Settings.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Settings {
    /// Run length, s.
    pub duration: Real,
    /// Largest step, s (the output resolution in motion).
    pub max_step: Real,
    /// Scale of the tolerances (1 = [`RTOL`], [`ATOL`]); tests vary it.
    pub tolerance_scale: Real,
}

/// The drive value over time: a schedule or a constant.
#[derive(Debug, Clone, PartialEq)]
pub enum DriveValue {
    /// Constant.
    Constant(Real),
    /// Piecewise linear.
    Scheduled(Schedule),
}

impl DriveValue {
    /// At `t`.
    pub fn at(&self, t: Real) -> Real {
        match self {
            DriveValue::Constant(v) => *v,
            DriveValue::Scheduled(s) => s.at(t),
        }
    }

    /// Schedule times after `t` (strictly).
    pub(super) fn next_break(&self, t: Real) -> Option<Real> {
        match self {
            DriveValue::Constant(_) => None,
            DriveValue::Scheduled(s) => s.times().find(|&b| b > t + 1e-12 * b.abs().max(1.0)),
        }
    }

    /// The first time ≥ `t` (≤ `end`) at which the value leaves `[lo, hi]`, exact on
    /// the piecewise-linear schedule.
    pub(super) fn leaves(&self, t: Real, end: Real, lo: Real, hi: Real) -> Option<Real> {
        let outside = |v: Real| v > hi || v < lo;
        if outside(self.at(t)) {
            return Some(t);
        }
        let DriveValue::Scheduled(s) = self else {
            return None;
        };
        let mut t0 = t;
        let mut q0 = self.at(t);
        let mut breaks: Vec<Real> = s.times().filter(|&b| b > t).collect();
        breaks.push(end.max(t));
        for t1 in breaks {
            let t1 = t1.min(end);
            if t1 <= t0 {
                continue;
            }
            let q1 = self.at(t1);
            for bound in [hi, lo] {
                let crosses = (q0 - bound) * (q1 - bound) < 0.0 || (q1 == bound && q0 != bound);
                if crosses {
                    // Just past the bound, so that the rig is outside the band there.
                    let tc = t0 + (bound - q0) / (q1 - q0) * (t1 - t0);
                    let nudge = 1e-9 * (t1 - t0);
                    let mut tx = tc;
                    for _ in 0..60 {
                        if outside(self.at(tx)) {
                            return Some(tx);
                        }
                        tx += nudge;
                        if tx > t1 {
                            break;
                        }
                    }
                }
            }
            if t1 >= end {
                break;
            }
            // A step in the schedule (two points at one time) jumps at `t1`: the next
            // piece starts from the value just after it, which may already be outside.
            let after = just_after(t1);
            t0 = t1;
            q0 = self.at(after);
            if outside(q0) {
                return Some(after);
            }
        }
        None
    }
}

/// The next time after `t` at which the drive's schedule or the profile's figures
/// change slope.
pub(super) fn next_break(drive: &DriveValue, profile: &Profile, t: Real) -> Option<Real> {
    match (drive.next_break(t), profile.next_time(t)) {
        (Some(a), Some(b)) => Some(a.min(b)),
        (a, b) => a.or(b),
    }
}

/// The first time ≥ `t` (≤ `end`) at which the drive value leaves the holding band
/// `band(t) = (lo, hi)`: both are piecewise linear in time with their slopes changing
/// only at the schedule's and the profile's times, so each piece is solved exactly.
pub(super) fn leaves_band(
    drive: &DriveValue,
    profile: &Profile,
    t: Real,
    end: Real,
    band: &dyn Fn(Real) -> (Real, Real),
) -> Option<Real> {
    if profile.later.is_empty() {
        let (lo, hi) = band(t);
        return drive.leaves(t, end, lo, hi);
    }
    let outside = |t: Real| {
        let (lo, hi) = band(t);
        let v = drive.at(t);
        v > hi || v < lo
    };
    if outside(t) {
        return Some(t);
    }
    let mut t0 = t;
    loop {
        let t1 = next_break(drive, profile, t0).unwrap_or(end).min(end);
        if t1 > t0 {
            let (lo0, hi0) = band(t0);
            let (lo1, hi1) = band(t1);
            let (q0, q1) = (drive.at(t0), drive.at(t1));
            let mut first: Option<Real> = None;
            for (g0, g1) in [(q0 - hi0, q1 - hi1), (lo0 - q0, lo1 - q1)] {
                // Each of `v − hi` and `lo − v` is linear on the piece; outside once > 0.
                if g0.is_finite() && g1.is_finite() && g1 > 0.0 && g0 <= 0.0 {
                    let tc = t0 + (-g0) / (g1 - g0) * (t1 - t0);
                    first = Some(first.map_or(tc, |f: Real| f.min(tc)));
                }
            }
            if let Some(tc) = first {
                let nudge = 1e-9 * (t1 - t0);
                let mut tx = tc;
                for _ in 0..60 {
                    if outside(tx) {
                        return Some(tx);
                    }
                    tx += nudge;
                    if tx > t1 {
                        break;
                    }
                }
            }
        }
        if t1 >= end {
            return None;
        }
        // A step in a schedule jumps at `t1`: outside just after it is outside there.
        let after = just_after(t1);
        if outside(after) {
            return Some(after);
        }
        t0 = t1;
    }
}

/// A time just after `t` (by 1e-12 relative, at least 1e-12 s): the value of a
/// schedule after a step at `t`.
fn just_after(t: Real) -> Real {
    t + 1e-12 * t.abs().max(1.0)
}

/// The state integrated in motion: position, speed, and the energy integrals.
type State = [Real; 6];

struct Dynamics<'a> {
    profile: &'a Profile,
    drive: &'a DriveValue,
    sign: Real,
    c: Real,
}

impl Dynamics<'_> {
    fn mass(&self, t: Real, x: Real) -> Real {
        let s = self.profile.at_t(t, x);
        let mu = if self.sign > 0.0 {
            s.inertia_forward
        } else {
            s.inertia_back
        };
        let own = if self.profile.drive_is_weight {
            self.drive.at(t)
        } else {
            0.0
        };
        (self.c * mu + s.own_inertia + own).max(1e-12)
    }

    /// `a = (c·(D − F_σ) − ½·(∂M/∂x)·v²) / M_σ`: the Lagrange term of a velocity ratio
    /// that changes along the travel, with `M` the frictionless effective mass (the
    /// term is not passed through the friction).
    fn accel(&self, t: Real, x: Real, v: Real) -> Real {
        let m_x = mass_slope(self.profile, self.drive, t, x);
        self.accel_of_loads(t, x) - 0.5 * m_x * v * v / self.mass(t, x)
    }

    /// `c·(D − F_σ) / M_σ`: the acceleration whose d'Alembert loads the parts carry
    /// (their own accelerations include the ratio's change, `a + (∂ratio/∂x)·v²`,
    /// which together with `a` makes up this), for the span tension.
    fn accel_of_loads(&self, t: Real, x: Real) -> Real {
        let s = self.profile.at_t(t, x);
        let f = if self.sign > 0.0 { s.forward } else { s.back };
        self.c * (self.drive.at(t) - f) / self.mass(t, x)
    }

    fn rhs(&self, t: Real, y: &State) -> State {
        let (x, v) = (y[0], y[1]);
        let s = self.profile.at_t(t, x);
        let a = self.accel(t, x, v);
        let (f, mu) = if self.sign > 0.0 {
            (s.forward, s.inertia_forward)
        } else {
            (s.back, s.inertia_back)
        };
        let d = self.drive.at(t);
        let friction = self.c * ((f - s.ideal) + (mu - s.inertia_ideal) * a);
        // ∂M/∂t of the frictionless effective mass where the rig is (a drive weight
        // filling, a scheduled load): the kinetic energy given to mass added in motion.
        // The change along the travel is in the equation of motion itself.
        let delta = 1e-6;
        let m_dot = (profile_mass_ideal(self.profile, self.drive, t + delta, x)
            - profile_mass_ideal(self.profile, self.drive, t - delta, x))
            / (2.0 * delta);
        [
            v,
            a,
            self.c * d * v,
            self.c * s.ideal * v,
            friction * v,
            -0.5 * m_dot * v * v,
        ]
    }
}

/// Dormand–Prince 5(4) coefficients (Hairer, Nørsett & Wanner, Table 5.2).
const C: [Real; 7] = [0.0, 0.2, 0.3, 0.8, 8.0 / 9.0, 1.0, 1.0];
const A: [[Real; 6]; 7] = [
    [0.0; 6],
    [0.2, 0.0, 0.0, 0.0, 0.0, 0.0],
    [3.0 / 40.0, 9.0 / 40.0, 0.0, 0.0, 0.0, 0.0],
    [44.0 / 45.0, -56.0 / 15.0, 32.0 / 9.0, 0.0, 0.0, 0.0],
    [
        19372.0 / 6561.0,
        -25360.0 / 2187.0,
        64448.0 / 6561.0,
        -212.0 / 729.0,
        0.0,
        0.0,
    ],
    [
        9017.0 / 3168.0,
        -355.0 / 33.0,
        46732.0 / 5247.0,
        49.0 / 176.0,
        -5103.0 / 18656.0,
        0.0,
    ],
    [
        35.0 / 384.0,
        0.0,
        500.0 / 1113.0,
        125.0 / 192.0,
        -2187.0 / 6784.0,
        11.0 / 84.0,
    ],
];
const B5: [Real; 7] = [
    35.0 / 384.0,
    0.0,
    500.0 / 1113.0,
    125.0 / 192.0,
    -2187.0 / 6784.0,
    11.0 / 84.0,
    0.0,
];
const B4: [Real; 7] = [
    5179.0 / 57600.0,
    0.0,
    7571.0 / 16695.0,
    393.0 / 640.0,
    -92097.0 / 339200.0,
    187.0 / 2100.0,
    1.0 / 40.0,
];

/// One Dormand–Prince step: the fifth-order result and the error estimate's norm
/// (scaled by the tolerances; ≤ 1 accepts).
fn dp_step(d: &Dynamics, t: Real, y: &State, h: Real, scale: Real) -> (State, Real) {
    dp_step_n(&|t, y| d.rhs(t, y), t, y, h, scale)
}

/// One Dormand–Prince 5(4) step of `y' = rhs(t, y)` with `N` states: the fifth-order
/// result and the scaled error norm (≤ 1 accepts).
pub(super) fn dp_step_n<const N: usize>(
    rhs: &dyn Fn(Real, &[Real; N]) -> [Real; N],
    t: Real,
    y: &[Real; N],
    h: Real,
    scale: Real,
) -> ([Real; N], Real) {
    let mut k = [[0.0; N]; 7];
    for i in 0..7 {
        let mut yi = *y;
        for (j, kj) in k.iter().enumerate().take(i) {
            for n in 0..N {
                yi[n] += h * A[i][j] * kj[n];
            }
        }
        k[i] = rhs(t + C[i] * h, &yi);
    }
    let mut y5 = *y;
    let mut err: Real = 0.0;
    for n in 0..N {
        let mut s5 = 0.0;
        let mut s4 = 0.0;
        for i in 0..7 {
            s5 += B5[i] * k[i][n];
            s4 += B4[i] * k[i][n];
        }
        y5[n] += h * s5;
        let tol = scale * (ATOL + RTOL * y[n].abs().max(y5[n].abs()));
        err = err.max((h * (s5 - s4)).abs() / tol);
    }
    (y5, err)
}

/// Where the rig is and how.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Mode {
    /// At rest (possibly against a stop).
    Rest,
    /// Moving forward (+1) or back (−1).
    Moving(Real),
}

/// Runs the rig from rest at the drawn position.
pub fn run(profile: &Profile, drive: &DriveValue, settings: &Settings) -> Run {
    let c = profile.scale();
    let end = settings.duration.max(0.0);
    let (lo, hi) = profile.limits();
    let mut t = 0.0;
    let mut y: State = [0.0; 6];
    let mut mode = Mode::Rest;
    let mut out = Run {
        events: Vec::new(),
        points: Vec::new(),
        energy: Energy::default(),
        steps: 0,
        at_geometry_end: false,
    };
    let tension_at = |t: Real, x: Real, v: Real, a: Real| {
        let s = profile.at_t(t, x);
        let (t0, dt) = if v < 0.0 {
            s.tension_back
        } else {
            s.tension_forward
        };
        t0 + dt * a
    };
    let push = |out: &mut Run, t: Real, y: &State, a: Real| {
        out.points.push(Point {
            t,
            x: y[0],
            v: y[1],
            drive: drive.at(t),
            tension: tension_at(t, y[0], y[1], a),
        });
    };
    push(&mut out, 0.0, &y, 0.0);
    let mut h = (settings.max_step * 0.01).max(1e-6);
    let mut guard = 0usize;
    while t < end && guard < 2_000_000 {
        guard += 1;
        match mode {
            Mode::Rest => {
                let x = y[0];
                let at_hi = x >= hi;
                let at_lo = x <= lo;
                // Against a stop, the stop holds the rig on that side.
                let band = |t: Real| {
                    let s = profile.at_t(t, x);
                    (
                        if at_lo {
                            Real::NEG_INFINITY
                        } else {
                            s.start_back
                        },
                        if at_hi {
                            Real::INFINITY
                        } else {
                            s.start_forward
                        },
                    )
                };
                let tl = leaves_band(drive, profile, t, end, &band);
                // The schedule's points while it waits, so the drive value is drawn true.
                let until = tl.unwrap_or(end);
                let mut b = t;
                while let Some(next) = next_break(drive, profile, b).filter(|&n| n < until) {
                    push(&mut out, next, &y, 0.0);
                    b = next;
                }
                let Some(tl) = tl else {
                    t = end;
                    push(&mut out, t, &y, 0.0);
                    break;
                };
                if tl > t {
                    t = tl;
                    push(&mut out, t, &y, 0.0);
                }
                let d = drive.at(t);
                let sign = if d > band(t).1 { 1.0 } else { -1.0 };
                out.events.push(Event {
                    t,
                    kind: if sign > 0.0 {
                        EventKind::StartsForward
                    } else {
                        EventKind::StartsBack
                    },
                    position: y[0],
                    drive_value: d,
                    speed: 0.0,
                });
                mode = Mode::Moving(sign);
                h = h.min(settings.max_step * 0.01).max(1e-9);
            }
            Mode::Moving(sign) => {
                let dyn_ = Dynamics {
                    profile,
                    drive,
                    sign,
                    c,
                };
                let mut step = h.min(settings.max_step).min(end - t);
                if let Some(b) = next_break(drive, profile, t) {
                    step = step.min(b - t);
                }
                let (y1, err) = dp_step(&dyn_, t, &y, step, settings.tolerance_scale);
                if err > 1.0 && step > 1e-12 {
                    h = step * (0.9 * err.powf(-0.2)).max(0.1);
                    continue;
                }
                out.steps += 1;
                // Events on this step: the speed reaching zero, a stop reached.
                let crossed = |z: &State| sign * z[1] <= 0.0 || z[0] >= hi || z[0] <= lo;
                let (t_new, y_new) = if crossed(&y1) {
                    // Bisect the step for the first event.
                    let (mut a, mut b) = (0.0, step);
                    let mut yb = y1;
                    while b - a > EVENT_TOL * step.max(1e-12) {
                        let m = 0.5 * (a + b);
                        let (ym, _) = dp_step(&dyn_, t, &y, m, settings.tolerance_scale);
                        if crossed(&ym) {
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
                let a_new = dyn_.accel_of_loads(t_new, y_new[0]);
                t = t_new;
                y = y_new;
                if crossed(&y) {
                    let mass_ideal = profile_mass_ideal(profile, drive, t, y[0]);
                    let kind = if y[0] >= hi {
                        y[0] = hi;
                        Some(EventKind::ReachesForwardStop)
                    } else if y[0] <= lo {
                        y[0] = lo;
                        Some(EventKind::ReachesBackStop)
                    } else {
                        None
                    };
                    let speed = y[1];
                    if kind.is_some() {
                        out.energy.impacts += 0.5 * mass_ideal * speed * speed;
                    }
                    y[1] = 0.0;
                    push(&mut out, t, &y, a_new);
                    if kind.is_some() && profile.limits_end_run() {
                        // The geometry ends here (parts meet, or nothing is known past
                        // it): the run ends, with the speed it arrived at.
                        out.events.push(Event {
                            t,
                            kind: EventKind::Stops,
                            position: y[0],
                            drive_value: drive.at(t),
                            speed,
                        });
                        out.at_geometry_end = true;
                        mode = Mode::Rest;
                        break;
                    }
                    // A stop always records the impact; coming to rest in the open
                    // records `stops` unless it sets off again at once (the rest step).
                    let s = profile.at_t(t, y[0]);
                    let d = drive.at(t);
                    let kind = kind.unwrap_or(EventKind::Stops);
                    let reverses = kind == EventKind::Stops
                        && ((sign > 0.0 && d < s.start_back)
                            || (sign < 0.0 && d > s.start_forward));
                    if !reverses {
                        out.events.push(Event {
                            t,
                            kind,
                            position: y[0],
                            drive_value: d,
                            // Coming to rest in the open: no impact.
                            speed: if kind == EventKind::Stops { 0.0 } else { speed },
                        });
                    }
                    mode = Mode::Rest;
                } else {
                    push(&mut out, t, &y, a_new);
                    let grow = if err > 0.0 {
                        (0.9 * err.powf(-0.2)).min(5.0)
                    } else {
                        5.0
                    };
                    h = (step * grow).max(1e-9);
                }
            }
        }
    }
    relabel_stick_slip(&mut out.events);
    out.energy.drive = y[2];
    out.energy.loads = y[3];
    out.energy.friction = y[4];
    out.energy.added_mass = y[5];
    out.energy.kinetic = if let Mode::Moving(_) = mode {
        0.5 * profile_mass_ideal(profile, drive, t, y[0]) * y[1] * y[1]
    } else {
        0.0
    };
    out
}

/// A stop in the open followed by a start the same way it was moving is stick-slip:
/// `sticks` and `slips` instead of `stops` and `starts-…`.
pub(super) fn relabel_stick_slip(events: &mut [Event]) {
    let mut moving: Option<EventKind> = None;
    for i in 0..events.len() {
        match events[i].kind {
            EventKind::StartsForward | EventKind::StartsBack => moving = Some(events[i].kind),
            EventKind::Stops => {
                if let (Some(way), Some(next)) = (moving, events.get(i + 1).map(|e| e.kind)) {
                    if next == way {
                        events[i].kind = EventKind::Sticks;
                        events[i + 1].kind = EventKind::Slips;
                    }
                }
            }
            _ => {}
        }
    }
}

/// `∂M/∂x` of the frictionless effective mass at `x` (kg/m or kg·m²/rad). The samples
/// give `M` at their positions; its slope there is the central difference of the
/// neighbours (one-sided at the ends), interpolated linearly between samples, so that
/// the acceleration has no jumps at the samples for the steps to cross (a jump there
/// cost the energy balance 1e-5 of the work on a rig whose ratio changes steeply).
pub(super) fn mass_slope(profile: &Profile, drive: &DriveValue, t: Real, x: Real) -> Real {
    let s = &profile.samples;
    let n = s.len();
    if n < 2 {
        return 0.0;
    }
    let mass = |j: usize| profile_mass_ideal(profile, drive, t, s[j].x);
    let node = |j: usize| {
        let (a, b) = (j.saturating_sub(1), (j + 1).min(n - 1));
        (mass(b) - mass(a)) / (s[b].x - s[a].x)
    };
    if x <= s[0].x || x >= s[n - 1].x {
        return 0.0;
    }
    let i = s.partition_point(|p| p.x <= x).clamp(1, n - 1);
    let w = (x - s[i - 1].x) / (s[i].x - s[i - 1].x);
    node(i - 1) * (1.0 - w) + node(i) * w
}

/// The frictionless effective mass at the drive, generalized (kg or kg·m²).
pub(super) fn profile_mass_ideal(profile: &Profile, drive: &DriveValue, t: Real, x: Real) -> Real {
    let s = profile.at_t(t, x);
    let own = if profile.drive_is_weight {
        drive.at(t)
    } else {
        0.0
    };
    profile.scale() * s.inertia_ideal + s.own_inertia + own
}

#[cfg(test)]
mod tests {
    use super::*;

    fn ramp() -> DriveValue {
        DriveValue::Scheduled(Schedule {
            points: vec![(0.0, 0.0), (10.0, 10.0), (20.0, 10.0), (30.0, 0.0)],
        })
    }

    #[test]
    fn the_band_exit_is_found_on_the_schedule_itself() {
        let d = ramp();
        // Up through 4 at t = 4 (just past it), down through 2 at t = 28.
        let up = d.leaves(0.0, 100.0, -1.0, 4.0).unwrap();
        assert!((up - 4.0).abs() < 1e-7 && d.at(up) > 4.0, "{up}");
        let down = d.leaves(12.0, 100.0, 2.0, 11.0).unwrap();
        assert!((down - 28.0).abs() < 1e-7 && d.at(down) < 2.0, "{down}");
        // Never leaves a band it stays in; already outside: now.
        assert_eq!(d.leaves(0.0, 100.0, -1.0, 11.0), None);
        assert_eq!(d.leaves(15.0, 100.0, 0.0, 5.0), Some(15.0));
        assert_eq!(DriveValue::Constant(3.0).leaves(0.0, 9.0, 0.0, 5.0), None);
        assert_eq!(d.next_break(10.0), Some(20.0));
    }

    #[test]
    fn a_dormand_prince_step_integrates_a_cubic_exactly() {
        // y' = 3t² from 0: y = t³, within a fifth-order method's exactness.
        let f = |t: Real, _: &[Real; 1]| [3.0 * t * t];
        let (y, err) = dp_step_n(&f, 0.0, &[0.0], 2.0, 1.0);
        assert!((y[0] - 8.0).abs() < 1e-12 && err < 1.0, "{y:?} {err}");
    }
}

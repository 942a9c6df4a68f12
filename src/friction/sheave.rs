//! Turning sheaves: the moment balance about the axle, `(T_t − T_s) R = r_f |F_pin|`,
//! in closed form for a weightless sheave ([`sheave_ratio`]) and by a safeguarded root
//! solve where a constant force (the sheave's own weight) joins the pin load
//! ([`tight_tension`], [`slack_tension`]); in 3-D, where spans leave the groove plane,
//! the journal takes only the pin load's part normal to the axle and a thrust face its
//! axial part ([`tight_tension_3d`], [`slack_tension_3d`], [`SheaveFriction`];
//! DESIGN.md §7). Plain numbers in SI: tensions in N, radii in m, directions as unit
//! vectors.
//!
//! # Sign conventions
//! Span directions `u` point *away from* the sheave along each span, so the rope pulls
//! the sheave with `T u` and the pin load is `T_t u_t + T_s u_s + W`. The wrap `φ` is
//! the angle through which the rope's direction turns, so `u_t · u_s = −cos φ`
//! (parallel spans, `φ = 180°`, give `u_t = u_s`).

use crate::math::{Real, Vector};

/// Tension ratio `k = T_tight / T_slack ≥ 1` of a turning sheave with no own weight.
///
/// # Formula
/// `b = (1 − ρ² cos φ) / (1 − ρ²)`, `k = b + √(b² − 1)`; at φ = 180°, `(1 + ρ)/(1 − ρ)`.
/// Returns `f64::INFINITY` when `ρ ≥ 1` (the sheave cannot turn).
///
/// It is the larger root of `(k − 1)² = ρ² (k² + 1 − 2k cos φ)`, the moment balance
/// `(T_t − T_s) R = r_f |T_t u_t + T_s u_s|` divided by `T_s R`; the other root is
/// `1/k`, the same sheave turning the other way. Computed as
/// `b − 1 = 2ρ² sin²(φ/2)/(1 − ρ²)`, `k = 1 + (b − 1) + √((b − 1)(b + 1))`, which
/// keeps full relative precision for small `ρ` and gives exactly 1 at `ρ = 0`.
///
/// # Arguments
/// - `rho`: `ρ = r_f / R ≥ 0`, friction-circle radius over pitch radius.
/// - `wrap`: wrap angle `φ`, radians, `0 ≤ φ ≤ 2π` (the ratio is even and 2π-periodic
///   in `φ`, so other finite values are accepted too).
///
/// NaN or negative `ρ` counts as 0 and non-finite `φ` as 0 in release builds
/// (`debug_assert!`ed).
///
/// # Returns
/// `k ≥ 1`, or `f64::INFINITY` for `ρ ≥ 1`.
///
/// # Example
/// Rated sheave `K = 1.09` (`ρ = 0.09/2.09`): `k(180°) = 1.09`, and at 90°
/// `k = 1.062 842`.
/// ```
/// use reeve::friction::sheave_ratio;
/// use std::f64::consts::PI;
/// let rho = 0.09 / 2.09;
/// assert!((sheave_ratio(rho, PI) - 1.09).abs() < 1e-12);
/// assert!((sheave_ratio(rho, PI / 2.0) - 1.062_842).abs() < 1e-6);
/// ```
///
/// # Source
/// Friction circle (Beer & Johnston, *Statics*, §8.7; Meriam & Kraige, *Statics*,
/// §6/7), moment balance solved in closed form (DESIGN.md §1).
pub fn sheave_ratio(rho: Real, wrap: Real) -> Real {
    debug_assert!(rho >= 0.0, "rho must be ≥ 0, got {rho}");
    debug_assert!(wrap.is_finite(), "wrap angle must be finite, got {wrap}");
    let rho = rho.max(0.0);
    let wrap = if wrap.is_finite() { wrap } else { 0.0 };
    if rho >= 1.0 {
        return Real::INFINITY;
    }
    let rho2 = rho * rho;
    let half_sin = (wrap / 2.0).sin();
    let b_minus_1 = 2.0 * rho2 * half_sin * half_sin / (1.0 - rho2);
    let b_plus_1 = b_minus_1 + 2.0;
    1.0 + b_minus_1 + (b_minus_1 * b_plus_1).sqrt()
}

/// Tight-side tension of a turning sheave given its slack-side tension, with the
/// sheave's own weight (or any other constant force) in the pin load, by solving
/// `(T_t − T_s) R = r_f |T_t u_t + T_s u_s + W|` for `T_t ≥ T_s`.
///
/// `u_tight`, `u_slack`: unit directions of the two spans *away from* the sheave;
/// `weight`: the extra pin force, N; `friction_radius` r_f and `pitch_radius` R in m.
/// Returns None when no finite solution exists (the sheave cannot turn).
///
/// # Formula
/// `g(T) = (T − T_s) R − r_f |T u_t + c|`, `c = T_s u_s + W`. `g(T_s) ≤ 0`, and `g`
/// rises with slope between `R − r_f` and `R + r_f`, so for `r_f < R` it has exactly
/// one root in `[T_s, (T_s R + r_f |c|)/(R − r_f)]`. `g` is concave, so Newton's method
/// started at `T_s` climbs to the root without overshooting; it runs safeguarded by
/// bisection inside the bracket to full precision. Without weight the result is
/// `k(φ) T_s` ([`sheave_ratio`]).
///
/// # Arguments
/// - `slack`: slack-side tension `T_s`, N, `≥ 0`.
/// - `u_tight`, `u_slack`: unit vectors along the spans away from the sheave (they are
///   normalized here; a zero vector gives None).
/// - `weight`: constant extra pin force `W`, N (any direction; zero for none).
/// - `friction_radius`: `r_f`, m, `≥ 0`.
/// - `pitch_radius`: `R`, m, `> 0`.
///
/// # Returns
/// `Some(T_t)` with `T_t ≥ T_s`; `None` when `r_f ≥ R` (the sheave cannot turn) or an
/// input is NaN, infinite or out of range.
///
/// # Example
/// Pulley of 1 ft diameter, weight 4 lb, on a 1 in axle with μ = 0.20, lifting a 20 lb
/// block, both spans vertical (pounds and inches are used as they stand: the balance
/// is homogeneous). Hand calculation: `r_f = 0.5 × 0.2/√1.04 = 0.098 058 in`,
/// `(P − 20) 6 = r_f (P + 24)`, `P = (120 + 24 r_f)/(6 − r_f) = 20.731 lb`.
/// ```
/// use reeve::friction::{journal::friction_circle_radius, tight_tension};
/// use reeve::math::Vector;
/// let down = -Vector::y();
/// let r_f = friction_circle_radius(0.5, 0.2);
/// let p = tight_tension(20.0, &down, &down, &(4.0 * down), r_f, 6.0).unwrap();
/// assert!((p - 20.731).abs() < 1e-3, "P = {p}");
/// ```
///
/// # Source
/// Friction circle: Beer & Johnston, *Statics*, §8.7; Hibbeler, *Statics*, §8.7
/// "Frictional forces on journal bearings" (problem 8-120 of the 14th edition is the
/// example above).
pub fn tight_tension(
    slack: Real,
    u_tight: &Vector,
    u_slack: &Vector,
    weight: &Vector,
    friction_radius: Real,
    pitch_radius: Real,
) -> Option<Real> {
    tight_tension_3d(
        slack,
        u_tight,
        u_slack,
        weight,
        &SheaveFriction::journal(friction_radius, pitch_radius),
    )
}

/// Slack-side tension given the tight side, the inverse of [`tight_tension`].
/// Returns None when no non-negative solution exists.
///
/// # Formula
/// Solves `q(S) = (T_t − S) R − r_f |T_t u_t + S u_s + W| = 0` for `0 ≤ S ≤ T_t`.
/// `q(T_t) ≤ 0` and `q` falls with slope at most `−(R − r_f)`; it is concave, so
/// Newton's method from `T_t` descends to the root without overshooting (safeguarded
/// by bisection). When `q(0) < 0` even a slack side of zero tension cannot balance the
/// friction moment of `T_t` and `W`: there is no non-negative solution.
///
/// # Arguments
/// As [`tight_tension`], with `tight` = `T_t`, N, `≥ 0`.
///
/// # Returns
/// `Some(T_s)` with `0 ≤ T_s ≤ T_t`; `None` when `r_f ≥ R`, an input is invalid, or
/// the required slack tension would be negative.
///
/// # Example
/// The 20 lb block of the [`tight_tension`] example lowered at constant speed: the
/// block's span is now the tight one. Hand calculation: `(20 − P) 6 = r_f (20 + P + 4)`,
/// `P = (120 − 24 r_f)/(6 + r_f) = 19.293 lb` with `r_f = 0.098 058 in`.
/// ```
/// use reeve::friction::{journal::friction_circle_radius, slack_tension};
/// use reeve::math::Vector;
/// let down = -Vector::y();
/// let r_f = friction_circle_radius(0.5, 0.2);
/// let p = slack_tension(20.0, &down, &down, &(4.0 * down), r_f, 6.0).unwrap();
/// assert!((p - 19.293).abs() < 1e-3, "P = {p}");
/// ```
///
/// # Source
/// As [`tight_tension`].
pub fn slack_tension(
    tight: Real,
    u_tight: &Vector,
    u_slack: &Vector,
    weight: &Vector,
    friction_radius: Real,
    pitch_radius: Real,
) -> Option<Real> {
    slack_tension_3d(
        tight,
        u_tight,
        u_slack,
        weight,
        &SheaveFriction::journal(friction_radius, pitch_radius),
    )
}

/// What resists a sheave's turning, for [`tight_tension_3d`] and [`slack_tension_3d`]:
/// its journal, the axle that splits the pin load into a radial and an axial part, and
/// an optional thrust face that carries the axial part.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SheaveFriction {
    /// Journal friction-circle radius `r_f`, m, `≥ 0`.
    pub friction_radius: Real,
    /// Pitch radius `R`, m, `> 0`.
    pub pitch_radius: Real,
    /// Unit axle direction `n`; `None` takes the whole pin load as radial (the planar
    /// model of DESIGN.md §1).
    pub axle: Option<Vector>,
    /// Thrust-face lever `μ_t r_eff / sin α`, m, `≥ 0`: the thrust friction moment is
    /// this times the axial load `|P·n| + W_0` ([`crate::friction::thrust::moment`]
    /// per newton of axial load).
    pub thrust_arm: Real,
    /// Axial preload `W_0` on the thrust face, N, `≥ 0` (a spring or a set collar).
    pub thrust_preload: Real,
}

impl SheaveFriction {
    /// A journal alone, the whole pin load radial: the planar model.
    pub fn journal(friction_radius: Real, pitch_radius: Real) -> SheaveFriction {
        SheaveFriction {
            friction_radius,
            pitch_radius,
            axle: None,
            thrust_arm: 0.0,
            thrust_preload: 0.0,
        }
    }
}

/// Tight-side tension of a turning sheave in 3-D: the journal takes only the pin
/// load's part normal to the axle, a thrust face (if any) its axial part.
///
/// # Formula
/// `P = T_t u_t + T_s u_s + W`, `P_r = P − (P·n) n`, `P_a = P·n`;
/// `(T_t − T_s) R = r_f |P_r| + a_t (|P_a| + W_0)` with `a_t = μ_t r_eff / sin α`
/// (DESIGN.md §7 "3-D pin loads"). The right side is convex in `T_t` and grows by at
/// most `r_f + a_t` per newton, so for `r_f + a_t < R` the left minus the right is
/// increasing and concave, with one root in the bracket of [`tight_tension`]; it is
/// solved by the same safeguarded Newton iteration. Without an axle (`n` None) and
/// without a thrust face this is [`tight_tension`]; with spans in the groove plane
/// (fleet angles zero) and a weight in that plane the two agree.
///
/// # Arguments
/// As [`tight_tension`], with the resistances in `friction` ([`SheaveFriction`]).
///
/// # Returns
/// `Some(T_t ≥ T_s)`; `None` when `r_f + a_t ≥ R` (cannot turn) or an input is invalid.
///
/// # Example
/// Spans 10° out of the groove plane on both sides, parallel (180° in the plane),
/// `ρ = r_f/R = 0.1`, no thrust face: the radial pin load is `(T_t + T_s) cos 10°`, so
/// `T_t/T_s = (1 + ρ cos 10°)/(1 − ρ cos 10°) = 1.218 48`.
/// ```
/// use reeve::friction::sheave::{tight_tension_3d, SheaveFriction};
/// use reeve::math::Vector;
/// let a = 10f64.to_radians();
/// let u = Vector::new(0.0, a.sin(), -a.cos()); // both spans hang down, 10° off plane
/// let f = SheaveFriction { axle: Some(Vector::y()), ..SheaveFriction::journal(0.005, 0.05) };
/// let t = tight_tension_3d(100.0, &u, &u, &Vector::zeros(), &f).unwrap();
/// let c = 0.1 * a.cos();
/// assert!((t / 100.0 - (1.0 + c) / (1.0 - c)).abs() < 1e-12);
/// ```
///
/// # Source
/// Friction circle as [`tight_tension`]; thrust face as
/// [`crate::friction::thrust::moment`] (Hibbeler, *Statics*, §8.6); the split of the
/// pin load by the axle is the bearing's geometry (a journal carries only loads normal
/// to its axis, the axial part goes to a thrust face: DESIGN.md §7; as in the journal
/// bearing chapter of Shigley's *Mechanical Engineering Design*, from memory).
pub fn tight_tension_3d(
    slack: Real,
    u_tight: &Vector,
    u_slack: &Vector,
    weight: &Vector,
    friction: &SheaveFriction,
) -> Option<Real> {
    let balance = Balance::new(u_tight, u_slack, weight, friction)?;
    if !(slack.is_finite() && slack >= 0.0) {
        return None;
    }
    if balance.r_f == 0.0 && balance.a_t == 0.0 {
        return Some(slack);
    }
    let c = slack * balance.u_slack + balance.weight;
    let (r, u) = (balance.r, balance.u_tight);
    // g(T) = (T − T_s) R − resist(T u_t + c), increasing and concave.
    let g = |t: Real| -> (Real, Real) {
        let (resist, slope) = balance.resist(&(t * u + c), &u);
        ((t - slack) * r - resist, r - slope)
    };
    let upper = (slack * r + balance.resist(&c, &u).0) / (r - balance.r_f - balance.a_t);
    if !upper.is_finite() {
        return None;
    }
    let root = solve_increasing(g, slack, upper.max(slack))?;
    Some(root.max(slack))
}

/// Slack-side tension given the tight side in 3-D, the inverse of
/// [`tight_tension_3d`] (as [`slack_tension`] is of [`tight_tension`]).
///
/// # Formula
/// Solves `(T_t − S) R = r_f |P_r| + a_t (|P_a| + W_0)` for `0 ≤ S ≤ T_t`, with `P` as
/// in [`tight_tension_3d`]; the same safeguarded solve as [`slack_tension`].
///
/// # Returns
/// `Some(T_s)` with `0 ≤ T_s ≤ T_t`; `None` when the sheave cannot turn, an input is
/// invalid, or the slack side would need a negative tension.
///
/// # Example
/// The inverse of the [`tight_tension_3d`] example.
/// ```
/// use reeve::friction::sheave::{slack_tension_3d, SheaveFriction};
/// use reeve::math::Vector;
/// let a = 10f64.to_radians();
/// let u = Vector::new(0.0, a.sin(), -a.cos());
/// let f = SheaveFriction { axle: Some(Vector::y()), ..SheaveFriction::journal(0.005, 0.05) };
/// let s = slack_tension_3d(121.848, &u, &u, &Vector::zeros(), &f).unwrap();
/// assert!((s - 100.0).abs() < 1e-3, "{s}");
/// ```
///
/// # Source
/// As [`tight_tension_3d`].
pub fn slack_tension_3d(
    tight: Real,
    u_tight: &Vector,
    u_slack: &Vector,
    weight: &Vector,
    friction: &SheaveFriction,
) -> Option<Real> {
    let balance = Balance::new(u_tight, u_slack, weight, friction)?;
    if !(tight.is_finite() && tight >= 0.0) {
        return None;
    }
    if balance.r_f == 0.0 && balance.a_t == 0.0 {
        return Some(tight);
    }
    let c = tight * balance.u_tight + balance.weight;
    let (r, u) = (balance.r, balance.u_slack);
    // −q(S) = resist(c + S u_s) − (T_t − S) R is increasing in S (and convex); solve it
    // with the same increasing-function solver.
    let minus_q = |s: Real| -> (Real, Real) {
        let (resist, slope) = balance.resist(&(s * u + c), &u);
        (resist - (tight - s) * r, r + slope)
    };
    let at_zero = minus_q(0.0).0;
    // Round-off allowance: a tight side computed by `tight_tension` from zero slack
    // must come back as zero, not as "no solution".
    let allowance = 8.0 * Real::EPSILON * (tight * r + balance.resist(&c, &u).0);
    if at_zero > allowance {
        // Even zero slack tension leaves more friction moment than T_t R can turn.
        return None;
    }
    if at_zero >= 0.0 {
        return Some(0.0);
    }
    let root = solve_increasing(minus_q, 0.0, tight)?;
    Some(root.clamp(0.0, tight))
}

/// Validated inputs of the sheave moment balance.
struct Balance {
    u_tight: Vector,
    u_slack: Vector,
    weight: Vector,
    r_f: Real,
    r: Real,
    axle: Option<Vector>,
    a_t: Real,
    preload: Real,
}

impl Balance {
    fn new(
        u_tight: &Vector,
        u_slack: &Vector,
        weight: &Vector,
        friction: &SheaveFriction,
    ) -> Option<Balance> {
        let finite = |v: &Vector| v.iter().all(|x| x.is_finite());
        if !(finite(u_tight) && finite(u_slack) && finite(weight)) {
            return None;
        }
        let SheaveFriction {
            friction_radius,
            pitch_radius,
            axle,
            thrust_arm,
            thrust_preload,
        } = *friction;
        let valid = |x: Real| x.is_finite() && x >= 0.0;
        if !(valid(friction_radius) && valid(thrust_arm) && valid(thrust_preload)) {
            return None;
        }
        if !(pitch_radius.is_finite() && pitch_radius > 0.0)
            || friction_radius + thrust_arm >= pitch_radius
        {
            return None;
        }
        let axle = match axle {
            Some(n) if finite(&n) => Some(n.try_normalize(0.0)?),
            Some(_) => return None,
            None => None,
        };
        let u_tight = u_tight.try_normalize(0.0)?;
        let u_slack = u_slack.try_normalize(0.0)?;
        Some(Balance {
            u_tight,
            u_slack,
            weight: *weight,
            r_f: friction_radius,
            r: pitch_radius,
            axle,
            a_t: thrust_arm,
            preload: thrust_preload,
        })
    }

    /// Friction moment `r_f |P_r| + a_t (|P_a| + W_0)` of pin load `pin`, and its rate
    /// of change as the pin load grows along `u`. Where a part of the pin load passes
    /// through zero its derivative jumps; any value in range is a valid slope for the
    /// safeguarded step.
    fn resist(&self, pin: &Vector, u: &Vector) -> (Real, Real) {
        let Some(n) = self.axle else {
            let norm = pin.norm();
            let slope = if norm > 0.0 {
                self.r_f * u.dot(pin) / norm
            } else {
                0.0
            };
            return (self.r_f * norm, slope);
        };
        let axial = pin.dot(&n);
        let radial = pin - axial * n;
        let norm = radial.norm();
        let slope_r = if norm > 0.0 {
            self.r_f * u.dot(&radial) / norm
        } else {
            0.0
        };
        let slope_a = self.a_t * u.dot(&n) * axial.signum();
        (
            self.r_f * norm + self.a_t * (axial.abs() + self.preload),
            slope_r + slope_a,
        )
    }
}

/// Root of an increasing function on `[lo, hi]` with `f(lo) ≤ 0 ≤ f(hi)`: Newton steps
/// kept inside a shrinking bracket, bisection where a step would leave it. `f` returns
/// `(value, slope)`. Returns None only if a value is NaN.
fn solve_increasing<F>(f: F, lo: Real, hi: Real) -> Option<Real>
where
    F: Fn(Real) -> (Real, Real),
{
    let (mut lo, mut hi) = (lo, hi);
    let (f_lo, _) = f(lo);
    if f_lo.is_nan() {
        return None;
    }
    if f_lo >= 0.0 {
        return Some(lo);
    }
    let (f_hi, _) = f(hi);
    if f_hi.is_nan() {
        return None;
    }
    if f_hi <= 0.0 {
        return Some(hi);
    }
    let mut x = lo;
    // 200 iterations: each one at least halves the bracket when Newton misbehaves, and
    // 2⁻²⁰⁰ of any finite bracket is below the spacing of f64 near its ends.
    for _ in 0..200 {
        let (value, slope) = f(x);
        if value.is_nan() {
            return None;
        }
        if value == 0.0 {
            return Some(x);
        }
        if value < 0.0 {
            lo = x;
        } else {
            hi = x;
        }
        let newton = x - value / slope;
        let next = if slope > 0.0 && newton > lo && newton < hi {
            newton
        } else {
            lo + (hi - lo) / 2.0
        };
        // Converged: the step no longer moves x beyond a few ulps.
        if (next - x).abs() <= 4.0 * Real::EPSILON * x.abs().max(Real::MIN_POSITIVE)
            || hi - lo <= 4.0 * Real::EPSILON * hi.abs()
        {
            return Some(next);
        }
        x = next;
    }
    Some(x)
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::PI;

    /// Unit span directions away from a sheave for a wrap `phi` in the x-y plane:
    /// `u_t · u_s = −cos φ`.
    fn spans(phi: Real) -> (Vector, Vector) {
        let u_t = Vector::new(0.0, -1.0, 0.0);
        // Rotate u_t by (π − φ) about z.
        let a = PI - phi;
        let u_s = Vector::new(a.sin(), -a.cos(), 0.0);
        (u_t, u_s)
    }

    #[test]
    fn ratio_limits() {
        assert_eq!(sheave_ratio(0.0, PI), 1.0);
        assert_eq!(sheave_ratio(0.3, 0.0), 1.0);
        assert_eq!(sheave_ratio(1.0, PI), Real::INFINITY);
        assert_eq!(sheave_ratio(1.5, 0.1), Real::INFINITY);
        for &rho in &[1e-6, 0.01, 0.1, 0.5, 0.9, 0.999] {
            let k = sheave_ratio(rho, PI);
            let closed = (1.0 + rho) / (1.0 - rho);
            assert!(
                (k - closed).abs() < 1e-12 * closed,
                "rho {rho}: {k} vs {closed}"
            );
        }
    }

    #[test]
    fn ratio_solves_the_quadratic_and_its_inverse_is_the_other_root() {
        for &rho in &[0.001, 0.05, 0.3, 0.8] {
            for &phi in &[0.1, 0.5, PI / 2.0, 2.0, PI, 4.0, 1.9 * PI] {
                let k = sheave_ratio(rho, phi);
                let b = (1.0 - rho * rho * phi.cos()) / (1.0 - rho * rho);
                // Roots of k² − 2bk + 1 = 0: k and 1/k.
                assert!(
                    (k * k - 2.0 * b * k + 1.0).abs() < 1e-12 * k * k,
                    "{rho} {phi}"
                );
                let other = b - (b * b - 1.0).max(0.0).sqrt();
                assert!((k * other - 1.0).abs() < 1e-9, "{rho} {phi}: {k} × {other}");
            }
        }
    }

    #[test]
    fn weightless_balance_matches_the_closed_form() {
        for &rho in &[0.0, 0.02, 0.2, 0.7] {
            for &phi in &[0.3, PI / 2.0, PI, 5.0] {
                let (u_t, u_s) = spans(phi);
                let r = 0.05;
                let k = sheave_ratio(rho, phi);
                let t = tight_tension(100.0, &u_t, &u_s, &Vector::zeros(), rho * r, r).unwrap();
                assert!(
                    (t / 100.0 - k).abs() < 1e-12 * k,
                    "rho {rho} phi {phi}: {t} vs {k}"
                );
                let s = slack_tension(100.0, &u_t, &u_s, &Vector::zeros(), rho * r, r).unwrap();
                assert!(
                    (100.0 / s - k).abs() < 1e-12 * k,
                    "rho {rho} phi {phi}: {s}"
                );
            }
        }
    }

    #[test]
    fn round_trip_with_weight_in_any_direction() {
        let (u_t, u_s) = spans(2.0);
        for w in [
            Vector::new(0.0, -30.0, 0.0),
            Vector::new(25.0, 10.0, 0.0),
            Vector::new(0.0, 0.0, -40.0),
            Vector::new(0.0, 200.0, 0.0),
        ] {
            for &slack in &[0.0, 1.0, 50.0, 1e4] {
                let t = tight_tension(slack, &u_t, &u_s, &w, 0.004, 0.03).unwrap();
                assert!(t >= slack);
                let pin = (t * u_t + slack * u_s + w).norm();
                assert!(((t - slack) * 0.03 - 0.004 * pin).abs() < 1e-12 * (1.0 + t));
                let back = slack_tension(t, &u_t, &u_s, &w, 0.004, 0.03).unwrap();
                assert!(
                    (back - slack).abs() < 1e-9 * (1.0 + slack),
                    "{w:?} {slack}: {back}"
                );
            }
        }
    }

    #[test]
    fn zero_tensions_and_degenerate_inputs() {
        let (u_t, u_s) = spans(PI);
        let zero = Vector::zeros();
        assert_eq!(tight_tension(0.0, &u_t, &u_s, &zero, 0.01, 0.05), Some(0.0));
        assert_eq!(slack_tension(0.0, &u_t, &u_s, &zero, 0.01, 0.05), Some(0.0));
        // Weight alone needs a tension difference even from zero slack.
        let w = Vector::new(0.0, -10.0, 0.0);
        let t = tight_tension(0.0, &u_t, &u_s, &w, 0.01, 0.05).unwrap();
        // Hand calculation: 0.05 T = 0.01 (T + 10) → T = 2.5.
        assert!((t - 2.5).abs() < 1e-12, "{t}");
        // A tight side too small to overcome the weight's friction has no slack answer.
        assert_eq!(slack_tension(2.0, &u_t, &u_s, &w, 0.01, 0.05), None);
        assert!(
            slack_tension(2.5, &u_t, &u_s, &w, 0.01, 0.05)
                .unwrap()
                .abs()
                < 1e-9
        );
        // Round trip from zero slack, weight in many directions, never fails.
        for i in 0..360 {
            let a = Real::from(i).to_radians();
            let w = Vector::new(7.3 * a.cos(), 7.3 * a.sin(), 1.1);
            let (u_t, u_s) = spans(1.0 + a / 3.0);
            let t = tight_tension(0.0, &u_t, &u_s, &w, 0.0031, 0.047).unwrap();
            let s = slack_tension(t, &u_t, &u_s, &w, 0.0031, 0.047);
            assert!(matches!(s, Some(s) if s.abs() < 1e-9), "angle {i}°: {s:?}");
        }
        // Cannot turn, bad numbers.
        assert_eq!(tight_tension(1.0, &u_t, &u_s, &zero, 0.05, 0.05), None);
        assert_eq!(
            tight_tension(Real::NAN, &u_t, &u_s, &zero, 0.01, 0.05),
            None
        );
        assert_eq!(tight_tension(-1.0, &u_t, &u_s, &zero, 0.01, 0.05), None);
        assert_eq!(tight_tension(1.0, &zero, &u_s, &zero, 0.01, 0.05), None);
        assert_eq!(tight_tension(1.0, &u_t, &u_s, &zero, 0.01, 0.0), None);
        assert_eq!(
            slack_tension(Real::INFINITY, &u_t, &u_s, &zero, 0.01, 0.05),
            None
        );
        // Frictionless: unchanged.
        assert_eq!(tight_tension(7.0, &u_t, &u_s, &w, 0.0, 0.05), Some(7.0));
    }

    #[test]
    fn rho_near_one_stays_finite_and_consistent() {
        let (u_t, u_s) = spans(PI);
        let r = 1.0;
        for &rho in &[0.99, 0.999_999] {
            let t = tight_tension(1.0, &u_t, &u_s, &Vector::zeros(), rho * r, r).unwrap();
            let k = sheave_ratio(rho, PI);
            assert!(
                t.is_finite() && (t - k).abs() < 1e-6 * k,
                "rho {rho}: {t} vs {k}"
            );
        }
    }

    #[test]
    fn pin_load_passing_through_zero() {
        // Weight exactly cancels the spans' pull at the solution's neighbourhood: the
        // kink in |F_pin| must not stall the solver.
        let (u_t, u_s) = spans(PI);
        let w = Vector::new(0.0, 20.0, 0.0); // upward: the spans pull down
        let t = tight_tension(10.0, &u_t, &u_s, &w, 0.002, 0.05).unwrap();
        let pin = (t * u_t + 10.0 * u_s + w).norm();
        assert!(((t - 10.0) * 0.05 - 0.002 * pin).abs() < 1e-12);
    }

    proptest::proptest! {
        /// The 3-D balance with a thrust face and a preload, any directions and axle:
        /// the solved tension satisfies `(T_t − T_s) R = r_f |P_r| + a_t (|P·n| + W_0)`
        /// and `slack_tension_3d` undoes it; with the spans in the plane and no thrust
        /// it is the planar answer.
        #[test]
        fn balance_3d_holds_and_inverts(
            a in -3.2f64..3.2, b in -1.5f64..1.5, c in -3.2f64..3.2, d in -1.5f64..1.5,
            e in -3.2f64..3.2, f in -1.5f64..1.5, slack in 0f64..2000.0,
            rho in 0f64..0.5, arm in 0f64..0.4, preload in 0f64..100.0,
        ) {
            let dir = |az: f64, el: f64| Vector::new(el.cos() * az.cos(), el.cos() * az.sin(), el.sin());
            let (u_t, u_s, n) = (dir(a, b), dir(c, d), dir(e, f));
            let r = 0.05;
            let friction = SheaveFriction {
                friction_radius: rho * r,
                pitch_radius: r,
                axle: Some(n),
                thrust_arm: arm * r,
                thrust_preload: preload,
            };
            let w = Vector::new(1.0, -2.0, 3.0);
            let t = tight_tension_3d(slack, &u_t, &u_s, &w, &friction).unwrap();
            let p = t * u_t + slack * u_s + w;
            let axial = p.dot(&n);
            let resist = rho * r * (p - axial * n).norm() + arm * r * (axial.abs() + preload);
            let scale = 1.0 + t + preload;
            proptest::prop_assert!(((t - slack) * r - resist).abs() <= 1e-11 * scale * r);
            let back = slack_tension_3d(t, &u_t, &u_s, &w, &friction).unwrap();
            proptest::prop_assert!((back - slack).abs() <= 1e-8 * scale, "{} vs {}", back, slack);
            // In the plane normal to the axle, without thrust: the planar balance.
            let flat = |u: Vector| (u - u.dot(&n) * n).normalize();
            let (p_t, p_s) = (flat(u_t), flat(u_s));
            let journal = SheaveFriction { thrust_arm: 0.0, thrust_preload: 0.0, ..friction };
            let t3 = tight_tension_3d(slack, &p_t, &p_s, &Vector::zeros(), &journal).unwrap();
            let t2 = tight_tension(slack, &p_t, &p_s, &Vector::zeros(), rho * r, r).unwrap();
            proptest::prop_assert!((t3 - t2).abs() <= 1e-9 * (1.0 + t2));
        }

        /// Any span directions, any constant pin force, any ρ < 1: the solved tension
        /// satisfies the moment balance, lies in its bracket, and slack_tension undoes
        /// it.
        #[test]
        fn moment_balance_holds_and_inverts(
            a in -3.2f64..3.2, b in -1.5f64..1.5, c in -3.2f64..3.2, d in -1.5f64..1.5,
            wx in -500f64..500.0, wy in -500f64..500.0, wz in -500f64..500.0,
            slack in proptest::prop_oneof![proptest::strategy::Just(0.0), 0f64..2000.0], rho in 0f64..0.95,
        ) {
            let dir = |az: f64, el: f64| Vector::new(el.cos() * az.cos(), el.cos() * az.sin(), el.sin());
            let (u_t, u_s, w) = (dir(a, b), dir(c, d), Vector::new(wx, wy, wz));
            let r = 0.05;
            let r_f = rho * r;
            let t = tight_tension(slack, &u_t, &u_s, &w, r_f, r).unwrap();
            let pin = (t * u_t + slack * u_s + w).norm();
            let scale = 1.0 + t + w.norm();
            proptest::prop_assert!(t >= slack);
            proptest::prop_assert!(((t - slack) * r - r_f * pin).abs() <= 1e-12 * scale * r);
            let back = slack_tension(t, &u_t, &u_s, &w, r_f, r).unwrap();
            proptest::prop_assert!((back - slack).abs() <= 1e-9 * scale, "{} vs {}", back, slack);
        }
    }
}

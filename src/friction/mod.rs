//! Friction models, one file each. Every function here is pure: SI in, SI out.
//!
//! The solver asks two things of a passage: its tension ratio `k = T_tight / T_slack`
//! when the ratio does not depend on load, and, for sheaves with their own weight or
//! drums with journals, the friction moment for a given pin load.
//!
//! - [`journal`]: plain bearings, friction circle `r_f = r sin(atan μ)`;
//! - [`rolling`]: rolling bearings, catalogue model `r_f = μ d / 2`;
//! - [`rated`]: a maker's per-sheave factor `K` turned into `ρ = r_f / R`;
//! - [`capstan`]: rope sliding over a fixed surface, `exp(μ' φ)`;
//! - [`thrust`]: pivot and collar bearings, `μ W r_eff / sin α`.
//!
//! This module joins them: [`bearing_resistance`] reduces any bearing to a friction
//! radius or ratio, [`sheave_ratio`] is the load-independent ratio of a weightless
//! sheave, and [`tight_tension`] / [`slack_tension`] solve the moment balance of a
//! sheave whose pin also carries a constant force (its own weight).
//!
//! # Sign conventions
//! Span directions `u` passed here point *away from* the sheave along each span, so
//! the rope pulls the sheave with `T u` and the pin load is `T_t u_t + T_s u_s + W`.
//! The wrap `φ` is the angle through which the rope's direction turns, so
//! `u_t · u_s = −cos φ` (parallel spans, `φ = 180°`, give `u_t = u_s`).
//!
//! Ranges are validated when a rig is loaded; functions returning a bare number
//! `debug_assert!` them and count NaN or out-of-range inputs as the nearest valid value
//! in release builds, so no NaN escapes. Functions returning `Option` answer `None`.

pub mod capstan;
pub mod journal;
pub mod rated;
pub mod rolling;
pub mod thrust;

use crate::math::{Real, Vector};
use crate::model::Bearing;

/// The largest tension ratio (tight over slack) that a rope can span: `10¹²`.
///
/// A rope's working tensions run from about a newton (a cord just taut) to about
/// `10⁷ N` (the largest wire ropes), seven orders of magnitude; a ratio beyond `10¹²`
/// across one passage, or along one line, cannot describe rope sliding or a sheave
/// turning: the rope would lock on the part, and the figures would mean nothing. The
/// solver refuses a passage above it and the checks fail a line above it (common
/// practice reasoning, not a published figure).
pub const PHYSICAL_RATIO_LIMIT: Real = 1e12;

/// A problem with a friction input that a caller may pass on to the user.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum FrictionError {
    /// A rated efficiency outside `(0, 1]`.
    #[error("sheave efficiency must be a number in (0, 1], got {efficiency}")]
    Efficiency {
        /// What was given.
        efficiency: Real,
    },
}

/// How a bearing resists turning, reduced to what the moment balance needs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum BearingResistance {
    /// No friction.
    Free,
    /// Friction moment = `radius × |pin load|` (friction-circle radius `r_f`, m).
    FrictionCircle {
        /// `r_f`, m.
        radius: Real,
    },
    /// A rating that fixes `rho = r_f / R` directly (rated sheaves); load-independent.
    Rated {
        /// `rho = (K − 1) / (K + 1)`.
        rho: Real,
    },
}

impl BearingResistance {
    /// The friction-circle radius `r_f`, m, on a sheave of pitch radius `R` (m):
    /// `0` when free, the bearing's own radius for a friction circle, `ρ R` when rated.
    ///
    /// ```
    /// use reeve::friction::BearingResistance;
    /// let rated = BearingResistance::Rated { rho: 0.05 };
    /// assert!((rated.friction_radius(0.04) - 0.002).abs() < 1e-15);
    /// ```
    pub fn friction_radius(&self, pitch_radius: Real) -> Real {
        match *self {
            BearingResistance::Free => 0.0,
            BearingResistance::FrictionCircle { radius } => radius,
            BearingResistance::Rated { rho } => rho * pitch_radius,
        }
    }

    /// The ratio `ρ = r_f / R` on a sheave of pitch radius `R` (m), `R > 0`; infinite
    /// when `R = 0` and the bearing has friction (a sheave of no size cannot turn).
    ///
    /// ```
    /// use reeve::friction::BearingResistance;
    /// let plain = BearingResistance::FrictionCircle { radius: 0.0006 };
    /// assert!((plain.rho(0.033) - 0.018_181_8).abs() < 1e-7);
    /// ```
    pub fn rho(&self, pitch_radius: Real) -> Real {
        match *self {
            BearingResistance::Free => 0.0,
            BearingResistance::Rated { rho } => rho,
            BearingResistance::FrictionCircle { radius } => {
                if radius <= 0.0 {
                    0.0
                } else if pitch_radius > 0.0 {
                    radius / pitch_radius
                } else {
                    Real::INFINITY
                }
            }
        }
    }

    /// Friction moment, N·m, for a pin load of magnitude `pin_load` (N) on a sheave of
    /// pitch radius `pitch_radius` (m): `M = r_f · |F_pin|`.
    ///
    /// ```
    /// use reeve::friction::BearingResistance;
    /// let plain = BearingResistance::FrictionCircle { radius: 0.0006 };
    /// assert!((plain.moment(1000.0, 0.033) - 0.6).abs() < 1e-12);
    /// ```
    pub fn moment(&self, pin_load: Real, pitch_radius: Real) -> Real {
        self.friction_radius(pitch_radius) * pin_load.abs()
    }
}

/// Reduces a bearing to its resistance. `use_static` picks `mu_static` where given
/// (breakaway case).
///
/// # Formula
/// - plain: friction circle `r_f = (d_pin/2) · sin(atan μ)` ([`journal`]), with
///   `μ = mu_static` when `use_static` and it is given, else `mu`;
/// - rolling: `r_f = μ_b · d_bore / 2` ([`rolling`]; catalogues give no separate static
///   coefficient, so `use_static` changes nothing);
/// - rated: `ρ = (K − 1)/(K + 1)` ([`rated`]);
/// - none: free.
///
/// # Arguments
/// - `bearing`: the resolved bearing (SI: diameters in m).
/// - `use_static`: use the static coefficient where one is given.
///
/// # Returns
/// The [`BearingResistance`].
///
/// # Example
/// A 10 mm pin with μ = 0.12 (μ_s = 0.18):
/// ```
/// use reeve::friction::{bearing_resistance, BearingResistance};
/// use reeve::model::Bearing;
/// let pin = Bearing::Plain { pin_diameter: 0.010, mu: 0.12, mu_static: Some(0.18) };
/// match bearing_resistance(&pin, false) {
///     // 5 mm × 0.12 / √1.0144 = 0.595 72 mm
///     BearingResistance::FrictionCircle { radius } => assert!((radius - 5.9572e-4).abs() < 1e-8),
///     other => panic!("{other:?}"),
/// }
/// match bearing_resistance(&pin, true) {
///     // 5 mm × 0.18 / √1.0324 = 0.885 77 mm
///     BearingResistance::FrictionCircle { radius } => assert!((radius - 8.8577e-4).abs() < 1e-8),
///     other => panic!("{other:?}"),
/// }
/// ```
///
/// # Source
/// DESIGN.md §1; the models' sources are given in their modules.
pub fn bearing_resistance(bearing: &Bearing, use_static: bool) -> BearingResistance {
    match *bearing {
        Bearing::None => BearingResistance::Free,
        Bearing::Plain {
            pin_diameter,
            mu,
            mu_static,
        } => {
            let mu = match (use_static, mu_static) {
                (true, Some(mu_static)) => mu_static,
                _ => mu,
            };
            BearingResistance::FrictionCircle {
                radius: journal::friction_circle_radius(pin_diameter / 2.0, mu),
            }
        }
        Bearing::Rolling { bore, mu } => BearingResistance::FrictionCircle {
            radius: rolling::friction_radius(bore, mu),
        },
        Bearing::Rated { factor } => BearingResistance::Rated {
            rho: rated::rho_from_factor(factor),
        },
    }
}

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
    let balance = Balance::new(u_tight, u_slack, weight, friction_radius, pitch_radius)?;
    if !(slack.is_finite() && slack >= 0.0) {
        return None;
    }
    if balance.r_f == 0.0 {
        return Some(slack);
    }
    let c = slack * balance.u_slack + balance.weight;
    let (r, r_f, u) = (balance.r, balance.r_f, balance.u_tight);
    // g(T) = (T − T_s) R − r_f |T u_t + c|, increasing and concave.
    let g = |t: Real| -> (Real, Real) {
        let pin = t * u + c;
        let norm = pin.norm();
        // Where the pin load passes through zero the derivative jumps; any value in
        // [R − r_f, R + r_f] is a valid slope for the safeguarded step.
        let slope = if norm > 0.0 {
            r - r_f * u.dot(&pin) / norm
        } else {
            r
        };
        ((t - slack) * r - r_f * norm, slope)
    };
    let upper = (slack * r + r_f * c.norm()) / (r - r_f);
    if !upper.is_finite() {
        return None;
    }
    let root = solve_increasing(g, slack, upper.max(slack))?;
    Some(root.max(slack))
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
    let balance = Balance::new(u_tight, u_slack, weight, friction_radius, pitch_radius)?;
    if !(tight.is_finite() && tight >= 0.0) {
        return None;
    }
    if balance.r_f == 0.0 {
        return Some(tight);
    }
    let c = tight * balance.u_tight + balance.weight;
    let (r, r_f, u) = (balance.r, balance.r_f, balance.u_slack);
    // −q(S) = r_f |c + S u_s| − (T_t − S) R is increasing in S (and convex); solve it
    // with the same increasing-function solver.
    let minus_q = |s: Real| -> (Real, Real) {
        let pin = s * u + c;
        let norm = pin.norm();
        let slope = if norm > 0.0 {
            r + r_f * u.dot(&pin) / norm
        } else {
            r
        };
        (r_f * norm - (tight - s) * r, slope)
    };
    let at_zero = minus_q(0.0).0;
    // Round-off allowance: a tight side computed by `tight_tension` from zero slack
    // must come back as zero, not as "no solution".
    let allowance = 8.0 * Real::EPSILON * (tight * r + r_f * c.norm());
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

/// Power dissipated at a passage, W: the tension drop times the rope's speed past the
/// part.
///
/// # Formula
/// `P = (T_t − T_s) · |s|`. For a turning sheave this equals the bearing's
/// `M ω = r_f |F_pin| · |s| / R` (the moment balance); for rope sliding over a fixed
/// surface it is the friction work along the contact.
///
/// # Arguments
/// - `tight`, `slack`: tensions either side, N (`tight ≥ slack` for a real loss).
/// - `rope_speed`: rope speed past the part, m/s (sign ignored).
///
/// # Returns
/// Dissipated power, W (negative only if `tight < slack`, which signals a sign error
/// upstream and is `debug_assert!`ed).
///
/// # Example
/// 110 N and 100 N either side of a sheave, rope running at 0.5 m/s: 5 W.
/// ```
/// use reeve::friction::passage_dissipation;
/// assert!((passage_dissipation(110.0, 100.0, -0.5) - 5.0).abs() < 1e-12);
/// ```
///
/// # Source
/// Work–energy balance of the part: the rope does `T_t s − T_s s` of work on it, and a
/// part in steady motion stores none.
pub fn passage_dissipation(tight: Real, slack: Real, rope_speed: Real) -> Real {
    debug_assert!(
        tight >= slack - 1e-9 * tight.abs().max(1.0),
        "tight {tight} < slack {slack}"
    );
    (tight - slack) * rope_speed.abs()
}

/// Power dissipated by a friction moment turning at an angular speed, W: `|M ω|`.
///
/// # Arguments
/// - `moment`: friction moment, N·m.
/// - `angular_speed`: rad/s.
///
/// # Returns
/// `|M ω|`, W.
///
/// # Example
/// A thrust bearing losing 34.641 N·m at 200 rpm (20.944 rad/s) dissipates 725.5 W.
/// ```
/// use reeve::friction::moment_dissipation;
/// let omega = 200.0 * std::f64::consts::TAU / 60.0;
/// assert!((moment_dissipation(34.641, omega) - 725.5).abs() < 0.1);
/// ```
///
/// # Source
/// Power of a couple, `P = M ω`.
pub fn moment_dissipation(moment: Real, angular_speed: Real) -> Real {
    (moment * angular_speed).abs()
}

/// Validated inputs of the sheave moment balance.
struct Balance {
    u_tight: Vector,
    u_slack: Vector,
    weight: Vector,
    r_f: Real,
    r: Real,
}

impl Balance {
    fn new(
        u_tight: &Vector,
        u_slack: &Vector,
        weight: &Vector,
        friction_radius: Real,
        pitch_radius: Real,
    ) -> Option<Balance> {
        let finite = |v: &Vector| v.iter().all(|x| x.is_finite());
        if !(finite(u_tight) && finite(u_slack) && finite(weight)) {
            return None;
        }
        if !(friction_radius.is_finite() && friction_radius >= 0.0) {
            return None;
        }
        if !(pitch_radius.is_finite() && pitch_radius > 0.0) || friction_radius >= pitch_radius {
            return None;
        }
        let u_tight = u_tight.try_normalize(0.0)?;
        let u_slack = u_slack.try_normalize(0.0)?;
        Some(Balance {
            u_tight,
            u_slack,
            weight: *weight,
            r_f: friction_radius,
            r: pitch_radius,
        })
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

    #[test]
    fn bearing_reductions() {
        assert_eq!(
            bearing_resistance(&Bearing::None, false),
            BearingResistance::Free
        );
        let rolling = Bearing::Rolling {
            bore: 0.01,
            mu: 0.0015,
        };
        assert_eq!(
            bearing_resistance(&rolling, true),
            BearingResistance::FrictionCircle {
                radius: 0.0015 * 0.01 / 2.0
            }
        );
        match bearing_resistance(&Bearing::Rated { factor: 1.09 }, false) {
            BearingResistance::Rated { rho } => assert!((rho - 0.09 / 2.09).abs() < 1e-15),
            other => panic!("{other:?}"),
        }
        // No static coefficient: breakaway uses the kinetic one.
        let plain = Bearing::Plain {
            pin_diameter: 0.01,
            mu: 0.1,
            mu_static: None,
        };
        assert_eq!(
            bearing_resistance(&plain, true),
            bearing_resistance(&plain, false)
        );
        assert_eq!(BearingResistance::Free.rho(0.05), 0.0);
        assert_eq!(
            BearingResistance::FrictionCircle { radius: 0.001 }.rho(0.0),
            Real::INFINITY
        );
    }

    proptest::proptest! {
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

    #[test]
    fn dissipation_matches_bearing_power() {
        // Sheave: (T_t − T_s) s = r_f |F| ω with ω = s / R.
        let (u_t, u_s) = spans(PI / 2.0);
        let (r_f, r, s) = (0.003, 0.04, 0.7);
        let t = tight_tension(80.0, &u_t, &u_s, &Vector::zeros(), r_f, r).unwrap();
        let pin = (t * u_t + 80.0 * u_s).norm();
        let by_rope = passage_dissipation(t, 80.0, s);
        let by_bearing = moment_dissipation(r_f * pin, s / r);
        assert!((by_rope - by_bearing).abs() < 1e-12 * by_rope);
    }
}

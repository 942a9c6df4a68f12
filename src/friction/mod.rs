//! Friction models, one file each. Every function here is a pure formula over plain
//! numbers: SI in, SI out; none knows the rig file or the resolved model (the solver
//! reduces its parts to these numbers, `solve::bearing`).
//!
//! The solver asks two things of a passage: its tension ratio `k = T_tight / T_slack`
//! when the ratio does not depend on load, and, for sheaves with their own weight or
//! drums with journals, the friction moment for a given pin load.
//!
//! - [`journal`]: plain bearings, friction circle `r_f = r sin(atan μ)`;
//! - [`rolling`]: rolling bearings, catalogue model `r_f = μ d / 2`;
//! - [`rated`]: a maker's per-sheave factor `K` turned into `ρ = r_f / R`;
//! - [`bending`]: the rope's own bending loss at a turning sheave, `T_s = (1 − β) T_b`;
//! - [`capstan`]: rope sliding over a fixed surface, `exp(μ' φ)`;
//! - [`thrust`]: pivot and collar bearings, `μ W r_eff / sin α`;
//! - [`sheave`]: the moment balance of a turning sheave, the closed-form ratio of a
//!   weightless one ([`sheave_ratio`]) and the root solve where its weight joins the
//!   pin load ([`tight_tension`] / [`slack_tension`]), and in 3-D with the pin load
//!   split by the axle and a thrust face ([`tight_tension_3d`] / [`slack_tension_3d`]).
//!
//! Here: [`BearingResistance`], what any bearing reduces to (a friction radius or a
//! load-independent ratio), the ratio limit, and the dissipation of a passage.
//!
//! Ranges are validated when a rig is loaded; functions returning a bare number
//! `debug_assert!` them and count NaN or out-of-range inputs as the nearest valid value
//! in release builds, so no NaN escapes. Functions returning `Option` answer `None`.

pub mod bending;
pub mod capstan;
pub mod journal;
pub mod rated;
pub mod rolling;
pub mod sheave;
pub mod thrust;

pub use sheave::{
    sheave_ratio, slack_tension, slack_tension_3d, tight_tension, tight_tension_3d, SheaveFriction,
};

use crate::math::Real;

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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::math::Vector;

    #[test]
    fn dissipation_matches_bearing_power() {
        // Sheave: (T_t − T_s) s = r_f |F| ω with ω = s / R.
        // Spans 90° apart: u_t · u_s = −cos φ = 0.
        let (u_t, u_s) = (Vector::new(0.0, -1.0, 0.0), Vector::new(1.0, 0.0, 0.0));
        let (r_f, r, s) = (0.003, 0.04, 0.7);
        let t = tight_tension(80.0, &u_t, &u_s, &Vector::zeros(), r_f, r).unwrap();
        let pin = (t * u_t + 80.0 * u_s).norm();
        let by_rope = passage_dissipation(t, 80.0, s);
        let by_bearing = moment_dissipation(r_f * pin, s / r);
        assert!((by_rope - by_bearing).abs() < 1e-12 * by_rope);
    }
}

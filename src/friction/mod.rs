//! Friction models, one file each. Every function here is pure: SI in, SI out.
//!
//! The solver asks two things of a passage: its tension ratio `k = T_tight / T_slack`
//! when the ratio does not depend on load, and, for sheaves with their own weight or
//! drums with journals, the friction moment for a given pin load.

pub mod capstan;
pub mod journal;
pub mod rated;
pub mod rolling;
pub mod thrust;

use crate::math::{Real, Vector};
use crate::rig::model::Bearing;

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

/// Reduces a bearing to its resistance. `use_static` picks `mu_static` where given
/// (breakaway case).
pub fn bearing_resistance(bearing: &Bearing, use_static: bool) -> BearingResistance {
    let _ = (bearing, use_static);
    unimplemented!("friction::bearing_resistance is being written")
}

/// Tension ratio `k = T_tight / T_slack ≥ 1` of a turning sheave with no own weight.
///
/// # Formula
/// `b = (1 − ρ² cos φ) / (1 − ρ²)`, `k = b + √(b² − 1)`; at φ = 180°, `(1 + ρ)/(1 − ρ)`.
/// Returns `f64::INFINITY` when `ρ ≥ 1` (the sheave cannot turn).
pub fn sheave_ratio(rho: Real, wrap: Real) -> Real {
    let _ = (rho, wrap);
    unimplemented!()
}

/// Tight-side tension of a turning sheave given its slack-side tension, with the
/// sheave's own weight (or any other constant force) in the pin load, by solving
/// `(T_t − T_s) R = r_f |T_t u_t + T_s u_s + W|` for `T_t ≥ T_s`.
///
/// `u_tight`, `u_slack`: unit directions of the two spans *away from* the sheave;
/// `weight`: the extra pin force, N; `friction_radius` r_f and `pitch_radius` R in m.
/// Returns None when no finite solution exists (the sheave cannot turn).
pub fn tight_tension(
    slack: Real,
    u_tight: &Vector,
    u_slack: &Vector,
    weight: &Vector,
    friction_radius: Real,
    pitch_radius: Real,
) -> Option<Real> {
    let _ = (slack, u_tight, u_slack, weight, friction_radius, pitch_radius);
    unimplemented!()
}

/// Slack-side tension given the tight side, the inverse of [`tight_tension`].
/// Returns None when no non-negative solution exists.
pub fn slack_tension(
    tight: Real,
    u_tight: &Vector,
    u_slack: &Vector,
    weight: &Vector,
    friction_radius: Real,
    pitch_radius: Real,
) -> Option<Real> {
    let _ = (tight, u_tight, u_slack, weight, friction_radius, pitch_radius);
    unimplemented!()
}

//! Plain (journal) bearings: the friction circle.
//!
//! A sheave or drum turning on a dry or boundary-lubricated pin rolls up the bore until
//! it slips; the pin's reaction then leans by the friction angle `atan(mu)` and its
//! line of action touches a circle of radius `r_f = r sin(atan mu)` about the pin's
//! centre. The friction moment is `r_f × |pin load|`, whatever the load's direction.
//! `solve::bearing::bearing_resistance` turns a plain bearing into this radius; the moment
//! balance of a sheave lives in [`super::sheave`].

use crate::math::Real;

/// Friction-circle radius of a plain journal: the lever arm of the pin reaction.
///
/// # Formula
/// `r_f = r · sin(atan μ) = r · μ / √(1 + μ²)` (≈ `μ r` for small `μ`).
///
/// # Arguments
/// - `pin_radius`: pin (journal) radius `r`, m, `r ≥ 0`.
/// - `mu`: coefficient of friction between pin and bore, `μ ≥ 0` (kinetic for running,
///   static for breakaway).
///
/// Callers validate ranges when the rig is loaded; here they are `debug_assert!`ed, and
/// in release builds a negative or NaN input counts as 0 so no NaN escapes.
///
/// # Returns
/// `r_f`, m, with `0 ≤ r_f < r`.
///
/// # Example
/// A 10 mm pin (r = 5 mm) in a bronze bush with μ = 0.12:
/// `r_f = 5 mm × 0.12 / √1.0144 = 0.595 72 mm`.
/// ```
/// use reeve::friction::journal::friction_circle_radius;
/// let r_f = friction_circle_radius(0.005, 0.12);
/// assert!((r_f - 0.000_595_72).abs() < 1e-8, "r_f = {r_f}");
/// ```
///
/// # Source
/// Beer & Johnston, *Vector Mechanics for Engineers: Statics*, §8.7 "Journal bearings;
/// axle friction"; Meriam & Kraige, *Engineering Mechanics: Statics*, §6/7 "Journal
/// bearings".
pub fn friction_circle_radius(pin_radius: Real, mu: Real) -> Real {
    debug_assert!(
        pin_radius >= 0.0,
        "pin radius must be ≥ 0, got {pin_radius}"
    );
    debug_assert!(mu >= 0.0, "coefficient of friction must be ≥ 0, got {mu}");
    // `max` maps NaN to 0 as well as clamping negatives.
    let pin_radius = pin_radius.max(0.0);
    let mu = mu.max(0.0);
    if mu.is_infinite() {
        // sin(atan ∞) = 1: the reaction can lean right over to the tangent.
        return pin_radius;
    }
    // sin(atan μ) = μ / √(1 + μ²), without the trigonometric round trip.
    pin_radius * mu / (1.0 + mu * mu).sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn matches_trigonometric_form() {
        for &(r, mu) in &[
            (0.005_f64, 0.12_f64),
            (0.0127, 0.2),
            (1.0, 1.0),
            (0.3, 0.05),
        ] {
            let expected = r * mu.atan().sin();
            let r_f = friction_circle_radius(r, mu);
            assert!(
                (r_f - expected).abs() < 1e-15,
                "r = {r}, mu = {mu}: {r_f} vs {expected}"
            );
        }
    }

    #[test]
    fn small_mu_approaches_mu_r() {
        // sin(atan μ) = μ (1 − μ²/2 + …): relative difference ≈ μ²/2.
        let r_f = friction_circle_radius(0.01, 0.001);
        assert!((r_f / (0.001 * 0.01) - 1.0).abs() < 1e-6);
    }

    #[test]
    fn limits() {
        assert_eq!(friction_circle_radius(0.01, 0.0), 0.0);
        assert_eq!(friction_circle_radius(0.0, 0.3), 0.0);
        assert_eq!(friction_circle_radius(0.01, Real::INFINITY), 0.01);
        assert!(friction_circle_radius(0.01, 1e6) < 0.01);
    }
}

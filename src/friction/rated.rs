//! Rated sheaves: a maker's or a standard's efficiency per sheave turned into the
//! friction-circle ratio the general sheave formula needs.
//!
//! Wire-rope handbooks rate a sheave by its *bearing factor* `K = 1/η`: the tension
//! ratio across it for a 180° wrap (common practice: about 1.09 for a plain bronze
//! bushing, about 1.04 for a rolling bearing). Matching `(1 + ρ)/(1 − ρ) = K`, the
//! friction-circle formula at 180°, gives `ρ = (K − 1)/(K + 1)`, and then
//! [`super::sheave_ratio`] extends the rating to any other wrap.

use crate::friction::FrictionError;
use crate::math::Real;

/// Friction-circle ratio `ρ = r_f / R` equivalent to a rated bearing factor.
///
/// # Formula
/// `ρ = (K − 1)/(K + 1)`, the inverse of `K = (1 + ρ)/(1 − ρ)`.
///
/// # Arguments
/// - `factor`: bearing factor `K = 1/η ≥ 1` at 180° wrap (dimensionless);
///   `K = ∞` gives `ρ = 1`, a sheave that cannot turn.
///
/// Loading validates `K`; here `K < 1` and NaN are `debug_assert!`ed and count as
/// `K = 1` (`ρ = 0`) in release builds.
///
/// # Returns
/// `ρ` in `[0, 1]`.
///
/// # Example
/// A bronze-bushed sheave rated `K = 1.09`: `ρ = 0.09 / 2.09 = 0.043 062`.
/// ```
/// use reeve::friction::rated::rho_from_factor;
/// let rho = rho_from_factor(1.09);
/// assert!((rho - 0.043_062_2).abs() < 1e-7, "rho = {rho}");
/// ```
///
/// # Source
/// The 180° friction-circle ratio `(1 + ρ)/(1 − ρ)` (DESIGN.md §1, from the friction
/// circle of Beer & Johnston, *Statics*, §8.7) solved for `ρ`; the bearing factor `K`
/// as used in wire-rope handbooks' reeving-efficiency tables (e.g. the *Wire Rope
/// Users Manual*, Wire Rope Technical Board; from memory).
pub fn rho_from_factor(factor: Real) -> Real {
    debug_assert!(factor >= 1.0, "bearing factor must be ≥ 1, got {factor}");
    // `max` maps NaN to 1 as well as clamping K < 1.
    let factor = factor.max(1.0);
    if factor.is_infinite() {
        return 1.0;
    }
    (factor - 1.0) / (factor + 1.0)
}

/// Bearing factor `K = 1/η` from a per-sheave efficiency rated at 180° wrap.
///
/// # Formula
/// `K = 1 / η`.
///
/// # Arguments
/// - `efficiency`: `η` in `(0, 1]` (dimensionless).
///
/// # Returns
/// `K ≥ 1`.
///
/// # Errors
/// [`FrictionError::Efficiency`] when `η` is not a finite number in `(0, 1]`.
///
/// # Example
/// A sheave rated 96 % efficient: `K = 1/0.96 = 1.041 667`.
/// ```
/// use reeve::friction::rated::factor_from_efficiency;
/// let k = factor_from_efficiency(0.96).unwrap();
/// assert!((k - 1.041_666_7).abs() < 1e-7);
/// assert!(factor_from_efficiency(1.2).is_err());
/// ```
///
/// # Source
/// Definition of the bearing factor in wire-rope handbooks' reeving-efficiency
/// formula `E = (K^N − 1)/(K^S N (K − 1))` (DESIGN.md §1).
pub fn factor_from_efficiency(efficiency: Real) -> Result<Real, FrictionError> {
    if efficiency.is_finite() && efficiency > 0.0 && efficiency <= 1.0 {
        Ok(1.0 / efficiency)
    } else {
        Err(FrictionError::Efficiency { efficiency })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn round_trip_through_180_degree_ratio() {
        for &k in &[1.0, 1.01, 1.04, 1.09, 1.5, 3.0, 100.0] {
            let rho = rho_from_factor(k);
            let back = (1.0 + rho) / (1.0 - rho);
            assert!((back - k).abs() < 1e-12 * k, "K = {k}: got {back}");
        }
    }

    #[test]
    fn limits() {
        assert_eq!(rho_from_factor(1.0), 0.0);
        assert_eq!(rho_from_factor(Real::INFINITY), 1.0);
        assert!(factor_from_efficiency(0.0).is_err());
        assert!(factor_from_efficiency(-0.5).is_err());
        assert!(factor_from_efficiency(Real::NAN).is_err());
        assert_eq!(factor_from_efficiency(1.0), Ok(1.0));
    }
}

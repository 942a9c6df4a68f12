//! Rope sliding over a surface that does not turn: the capstan (Euler–Eytelwein)
//! equation, with the wedge factor of a V-groove.
//!
//! Used for guides, pins, bollards, fairleads, carabiners, stalled sheaves and for the
//! no-slip check of a line around a drum. The ratio depends only on the coefficient
//! and the total angle the rope turns through, not on the surface's radius.

use crate::math::Real;

/// Effective coefficient of friction of a rope in a groove.
///
/// # Formula
/// V-groove of included angle `β`: `μ' = μ / sin(β/2)` (the groove's flanks wedge the
/// rope, raising the normal force by `1/sin(β/2)`); round groove or flat surface
/// (`None`): `μ' = μ`.
///
/// # Arguments
/// - `mu`: rope-on-surface coefficient `μ ≥ 0`.
/// - `groove_angle`: included angle `β` of a V-groove, radians, `0 < β ≤ π`
///   (`β = π` is a flat surface); `None` for a round groove.
///
/// Ranges are validated when the rig is loaded and `debug_assert!`ed here. In release
/// builds a NaN or negative `μ` counts as 0, and a `β` outside `(0, π]` or NaN counts
/// as no groove, so no NaN escapes.
///
/// # Returns
/// `μ' ≥ μ`.
///
/// # Example
/// A V-groove of 38° included angle with μ = 0.25:
/// `μ' = 0.25 / sin 19° = 0.25 / 0.325 568 = 0.767 888`.
/// ```
/// use reeve::friction::capstan::effective_mu;
/// let mu = effective_mu(0.25, Some(38f64.to_radians()));
/// assert!((mu - 0.767_888).abs() < 1e-6, "mu' = {mu}");
/// assert_eq!(effective_mu(0.25, None), 0.25);
/// ```
///
/// # Source
/// Shigley's *Mechanical Engineering Design*, §17 "Flexible mechanical elements",
/// V-belts: `f' = f / sin(φ/2)` (from memory); Beer & Johnston, *Statics*, §8.10
/// "Belt friction", V-belt remark and problems.
pub fn effective_mu(mu: Real, groove_angle: Option<Real>) -> Real {
    debug_assert!(mu >= 0.0, "coefficient of friction must be ≥ 0, got {mu}");
    let mu = mu.max(0.0);
    match groove_angle {
        Some(beta) => {
            debug_assert!(
                beta > 0.0 && beta <= std::f64::consts::PI,
                "groove angle must be in (0, π] radians, got {beta}"
            );
            if beta > 0.0 && beta <= std::f64::consts::PI {
                mu / (beta / 2.0).sin()
            } else {
                mu
            }
        }
        None => mu,
    }
}

/// Capstan (Euler–Eytelwein) tension ratio of a rope sliding over a fixed surface.
///
/// # Formula
/// `T_tight / T_slack = exp(μ' · φ)`, with `μ'` from [`effective_mu`] and `φ` the total
/// angle the rope turns through, including `2π` for each extra full turn (see
/// [`total_wrap`]).
///
/// # Arguments
/// - `mu`: rope-on-surface coefficient `μ ≥ 0`.
/// - `groove_angle`: V-groove included angle, radians, or `None` (see
///   [`effective_mu`]).
/// - `wrap`: total wrap angle `φ`, radians, `φ ≥ 0`.
///
/// Ranges are `debug_assert!`ed; in release builds a NaN or negative `φ` counts as 0.
///
/// # Returns
/// The ratio, `≥ 1`; `f64::INFINITY` when it overflows (rope that cannot slide).
///
/// # Example
/// Rope over a pipe, μ = 0.2, once over the top (180°) and then with one more full
/// turn (540°): ratios `e^(0.2π) = 1.874 45` and `e^(0.6π) = 6.586 06`.
/// ```
/// use reeve::friction::capstan::capstan_ratio;
/// use std::f64::consts::PI;
/// assert!((capstan_ratio(0.2, None, PI) - 1.874_45).abs() < 1e-5);
/// assert!((capstan_ratio(0.2, None, 3.0 * PI) - 6.586_06).abs() < 1e-5);
/// ```
///
/// # Source
/// Euler (1762) and Eytelwein (1808); Hibbeler, *Engineering Mechanics: Statics*,
/// §8.5 "Frictional forces on flat belts", eq. 8-6 `T₂ = T₁ e^(μβ)`; Beer & Johnston,
/// *Statics*, §8.10 "Belt friction".
pub fn capstan_ratio(mu: Real, groove_angle: Option<Real>, wrap: Real) -> Real {
    debug_assert!(wrap >= 0.0, "wrap angle must be ≥ 0, got {wrap}");
    // `max` maps NaN to 0 as well as clamping negatives.
    let wrap = wrap.max(0.0);
    let mu = effective_mu(mu, groove_angle);
    if mu == 0.0 || wrap == 0.0 {
        // Also keeps 0 × ∞ from making a NaN.
        return 1.0;
    }
    (mu * wrap).exp()
}

/// Total angle a rope turns through on a part: the wrap of the passage plus `2π` for
/// every extra full turn.
///
/// # Formula
/// `φ_total = φ + 2π n`.
///
/// # Arguments
/// - `wrap`: wrap angle of the passage, radians, `≥ 0`.
/// - `turns`: extra full turns `n`.
///
/// # Returns
/// `φ_total`, radians.
///
/// # Example
/// Half a turn plus two full turns is 2.5 turns, `5π`:
/// ```
/// use reeve::friction::capstan::total_wrap;
/// use std::f64::consts::PI;
/// assert!((total_wrap(PI, 2) - 5.0 * PI).abs() < 1e-12);
/// ```
///
/// # Source
/// Geometry (DESIGN.md §1: `exp(μ' (φ + 2π n))`).
pub fn total_wrap(wrap: Real, turns: u32) -> Real {
    wrap + std::f64::consts::TAU * Real::from(turns)
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::PI;

    #[test]
    fn flat_groove_is_no_groove() {
        // β = 180°: sin 90° = 1.
        assert!((effective_mu(0.3, Some(PI)) - 0.3).abs() < 1e-15);
    }

    #[test]
    fn ratio_is_multiplicative_in_wrap() {
        let a = capstan_ratio(0.25, None, 1.0);
        let b = capstan_ratio(0.25, None, 2.5);
        let ab = capstan_ratio(0.25, None, 3.5);
        assert!((a * b - ab).abs() < 1e-12 * ab);
    }

    #[test]
    fn degenerate_inputs_give_no_nan() {
        assert_eq!(capstan_ratio(0.0, None, Real::INFINITY), 1.0);
        assert_eq!(capstan_ratio(0.2, None, 0.0), 1.0);
        assert_eq!(capstan_ratio(0.2, None, Real::INFINITY), Real::INFINITY);
        assert_eq!(capstan_ratio(1.0, None, 1e6), Real::INFINITY);
    }

    #[test]
    fn wedge_in_groove_raises_ratio() {
        let plain = capstan_ratio(0.2, None, PI);
        let vee = capstan_ratio(0.2, Some(40f64.to_radians()), PI);
        // Hand calculation: μ' = 0.2 / sin 20° = 0.584 761; e^(0.584 761 π) = 6.278 2.
        assert!(vee > plain);
        assert!((vee - (0.2 / 20f64.to_radians().sin() * PI).exp()).abs() < 1e-12);
        assert!((vee - 6.2782).abs() < 1e-3, "{vee}");
    }
}

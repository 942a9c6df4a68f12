//! capstan friction model.

use crate::math::Real;

/// Effective coefficient in a V-groove of included angle `groove_angle` (radians):
/// `mu' = mu / sin(beta / 2)`; a round groove (None) leaves `mu` unchanged.
pub fn effective_mu(mu: Real, groove_angle: Option<Real>) -> Real {
    let _ = (mu, groove_angle);
    unimplemented!()
}

/// Capstan (Euler–Eytelwein) ratio `T_tight / T_slack = exp(mu' * wrap)`, `wrap` in
/// radians including any extra turns.
pub fn capstan_ratio(mu: Real, groove_angle: Option<Real>, wrap: Real) -> Real {
    let _ = (mu, groove_angle, wrap);
    unimplemented!()
}

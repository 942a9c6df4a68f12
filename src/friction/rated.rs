//! rated friction model.

use crate::math::Real;

/// `rho = (K − 1)/(K + 1)` for a sheave rated with bearing factor `K = 1/eta` at 180°.
pub fn rho_from_factor(factor: Real) -> Real {
    let _ = factor;
    unimplemented!()
}

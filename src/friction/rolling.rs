//! rolling friction model.

use crate::math::Real;

/// Friction radius of a rolling bearing, catalogue model `M = mu F d/2`: `r_f = mu bore / 2`.
pub fn friction_radius(bore: Real, mu: Real) -> Real {
    let _ = (bore, mu);
    unimplemented!()
}

//! journal friction model.

use crate::math::Real;

/// Friction-circle radius of a plain journal: `r_f = r sin(atan mu)`, `r` the pin radius.
pub fn friction_circle_radius(pin_radius: Real, mu: Real) -> Real {
    let _ = (pin_radius, mu);
    unimplemented!()
}

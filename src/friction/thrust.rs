//! thrust friction model.

use crate::math::Real;
use crate::rig::model::Thrust;

/// Effective friction radius of a thrust face (pivot or collar).
pub fn effective_radius(thrust: &Thrust) -> Real {
    let _ = thrust;
    unimplemented!()
}

/// Friction moment of a thrust bearing, N·m: `mu W r_eff` (÷ sin α for a cone).
pub fn moment(thrust: &Thrust) -> Real {
    let _ = thrust;
    unimplemented!()
}

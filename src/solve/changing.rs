//! The loads of DESIGN.md §7 that change with position: a drum's lever and spring, a
//! block's spring, evaluated where the rig stands ([`crate::model::changing`] keeps each
//! part's offset from the drawn position), plus the d'Alembert load `motion` may set.
//! The statics adds [`dof_load`] to each moving part's known load, so the loads pass
//! through the friction like any other.

use crate::math::Real;
use crate::model::changing::lever_torque;
use crate::model::{PartId, PartKind, Rig};

/// The extra generalized load on `part`'s degree of freedom (N along a block's `moves`,
/// N·m right-handed about a drum's axle) where the rig stands. `forward` is the part's
/// speed for the drive moving forward at unit speed (its sign says which way the part
/// moves forward).
///
/// # Formula
/// Block: `−(F₀ + k·s)` with `s` the travel along `moves` from the drawn position.
/// Drum: the lever's weight torque `((Rot(axle, θ)·arm) × m·g) · axle`, minus the
/// spring torque `sign·(M₀ + k·sign·θ)` against forward turning (`sign` the drum's
/// forward sense, `θ` its turn from the drawn position).
pub fn dof_load(rig: &Rig, part: PartId, forward: Real) -> Real {
    let c = rig.changing.of(part);
    let mut q = c.extra_load;
    match &rig.parts[part].kind {
        PartKind::Block(_) => {
            if let Some(s) = c.spring {
                q -= s.load(c.offset);
            }
        }
        PartKind::Drum(d) => {
            if let Some(lever) = c.lever {
                q += lever_torque(
                    &lever,
                    &d.axle.into_inner(),
                    &rig.gravity.into_inner(),
                    c.offset,
                );
            }
            if let Some(s) = c.spring {
                let sign = if forward < 0.0 { -1.0 } else { 1.0 };
                q -= sign * s.load(sign * c.offset);
            }
        }
        _ => {}
    }
    q
}

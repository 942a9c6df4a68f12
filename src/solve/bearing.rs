//! The resolved rig's bearings reduced to the plain numbers of the friction formulas
//! (`crate::friction` knows no model type): the one place where a `Bearing` or a
//! `Thrust` of the model meets its formula.

use crate::friction::{self, thrust::Pressure, BearingResistance};
use crate::math::Real;
use crate::model::{Bearing, Contact, Thrust};

/// Reduces a bearing to its resistance. `use_static` picks `mu_static` where given
/// (breakaway case).
///
/// # Formula
/// - plain: friction circle `r_f = (d_pin/2) · sin(atan μ)` ([`journal`](crate::friction::journal)), with
///   `μ = mu_static` when `use_static` and it is given, else `mu`;
/// - rolling: `r_f = μ_b · d_bore / 2` ([`rolling`](crate::friction::rolling); catalogues give no separate static
///   coefficient, so `use_static` changes nothing);
/// - rated: `ρ = (K − 1)/(K + 1)` ([`rated`](crate::friction::rated));
/// - none: free.
///
/// # Arguments
/// - `bearing`: the resolved bearing (SI: diameters in m).
/// - `use_static`: use the static coefficient where one is given.
///
/// # Returns
/// The [`BearingResistance`].
///
/// # Example
/// A 10 mm pin with μ = 0.12 (μ_s = 0.18):
/// ```
/// use reeve::friction::BearingResistance;
/// use reeve::solve::bearing::bearing_resistance;
/// use reeve::model::Bearing;
/// let pin = Bearing::Plain { pin_diameter: 0.010, mu: 0.12, mu_static: Some(0.18) };
/// match bearing_resistance(&pin, false) {
///     // 5 mm × 0.12 / √1.0144 = 0.595 72 mm
///     BearingResistance::FrictionCircle { radius } => assert!((radius - 5.9572e-4).abs() < 1e-8),
///     other => panic!("{other:?}"),
/// }
/// match bearing_resistance(&pin, true) {
///     // 5 mm × 0.18 / √1.0324 = 0.885 77 mm
///     BearingResistance::FrictionCircle { radius } => assert!((radius - 8.8577e-4).abs() < 1e-8),
///     other => panic!("{other:?}"),
/// }
/// ```
///
/// # Source
/// DESIGN.md §1; the models' sources are given in their modules.
pub fn bearing_resistance(bearing: &Bearing, use_static: bool) -> BearingResistance {
    match *bearing {
        Bearing::None => BearingResistance::Free,
        Bearing::Plain {
            pin_diameter,
            mu,
            mu_static,
        } => {
            let mu = match (use_static, mu_static) {
                (true, Some(mu_static)) => mu_static,
                _ => mu,
            };
            BearingResistance::FrictionCircle {
                radius: friction::journal::friction_circle_radius(pin_diameter / 2.0, mu),
            }
        }
        Bearing::Rolling { bore, mu } => BearingResistance::FrictionCircle {
            radius: friction::rolling::friction_radius(bore, mu),
        },
        Bearing::Rated { factor } => BearingResistance::Rated {
            rho: friction::rated::rho_from_factor(factor),
        },
    }
}

/// Friction moment of a drum shaft's thrust bearing, N·m: `μ W r_eff / sin α`
/// ([`friction::thrust::moment`], with `r_eff` from
/// [`friction::thrust::effective_radius`]; `new` contact is uniform pressure, `worn`
/// uniform wear).
///
/// # Example
/// Conical pivot of 150 mm, half-angle 60°, 20 kN, μ = 0.03, new: 34.641 N·m.
/// ```
/// use reeve::model::{Contact, Thrust};
/// use reeve::solve::bearing::thrust_moment;
/// let pivot = Thrust { load: 20e3, diameter: 0.150, inner_diameter: 0.0, mu: 0.03,
///                      contact: Contact::New, cone_angle: Some(60f64.to_radians()) };
/// assert!((thrust_moment(&pivot) - 34.641).abs() < 1e-3);
/// ```
///
/// # Source
/// As [`friction::thrust::moment`].
pub fn thrust_moment(thrust: &Thrust) -> Real {
    let pressure = match thrust.contact {
        Contact::New => Pressure::Uniform,
        Contact::Worn => Pressure::UniformWear,
    };
    let r_eff =
        friction::thrust::effective_radius(thrust.diameter, thrust.inner_diameter, pressure);
    friction::thrust::moment(thrust.load, thrust.mu, r_eff, thrust.cone_angle)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bearing_reductions() {
        assert_eq!(
            bearing_resistance(&Bearing::None, false),
            BearingResistance::Free
        );
        let rolling = Bearing::Rolling {
            bore: 0.01,
            mu: 0.0015,
        };
        assert_eq!(
            bearing_resistance(&rolling, true),
            BearingResistance::FrictionCircle {
                radius: 0.0015 * 0.01 / 2.0
            }
        );
        match bearing_resistance(&Bearing::Rated { factor: 1.09 }, false) {
            BearingResistance::Rated { rho } => assert!((rho - 0.09 / 2.09).abs() < 1e-15),
            other => panic!("{other:?}"),
        }
        // No static coefficient: breakaway uses the kinetic one.
        let plain = Bearing::Plain {
            pin_diameter: 0.01,
            mu: 0.1,
            mu_static: None,
        };
        assert_eq!(
            bearing_resistance(&plain, true),
            bearing_resistance(&plain, false)
        );
        assert_eq!(BearingResistance::Free.rho(0.05), 0.0);
        assert_eq!(
            BearingResistance::FrictionCircle { radius: 0.001 }.rho(0.0),
            Real::INFINITY
        );
    }
}

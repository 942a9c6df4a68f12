//! Thrust (pivot and collar) bearings: friction moment from an axial load.
//!
//! A drum's shaft that carries an axial load `W` on a flat collar, a flat pivot (solid
//! collar, inner radius 0) or a conical pivot loses `M = μ W r_eff / sin α` to
//! friction. The effective radius depends on how the pressure spreads over the face:
//! uniform pressure for new, well-fitting surfaces, uniform wear (pressure ∝ 1/r) once
//! they have run in. Radii are measured perpendicular to the shaft, also on a cone.

use crate::math::Real;
use crate::model::{Contact, Thrust};

/// Effective friction radius of a thrust face (pivot or collar).
///
/// # Formula
/// With outer radius `Ro` and inner radius `Ri` (`Ri = 0` for a solid pivot):
/// - uniform pressure ([`Contact::New`]):
///   `r_eff = (2/3)(Ro³ − Ri³)/(Ro² − Ri²) = (2/3)(Ro² + Ro Ri + Ri²)/(Ro + Ri)`
///   (`(2/3) Ro` for a solid pivot);
/// - uniform wear ([`Contact::Worn`]): `r_eff = (Ro + Ri)/2` (`Ro/2` for a solid
///   pivot).
///
/// The second form of the uniform-pressure radius has no `0/0` for a thin ring
/// (`Ri → Ro`, where `r_eff → Ro`).
///
/// # Arguments
/// - `thrust`: the bearing; `diameter` = `2 Ro` and `inner_diameter` = `2 Ri` in m,
///   `0 ≤ Ri ≤ Ro` (loading validates; here a swapped pair is put in order and a NaN
///   or negative diameter counts as 0).
///
/// # Returns
/// `r_eff`, m, with `Ri ≤ r_eff ≤ Ro`.
///
/// # Example
/// A collar of 200 mm outer and 150 mm inner diameter, new:
/// `r_eff = (2/3)(0.1³ − 0.075³)/(0.1² − 0.075²) = 0.088 095 m`.
/// ```
/// use reeve::friction::thrust::effective_radius;
/// use reeve::model::{Contact, Thrust};
/// let collar = Thrust { load: 5000.0, diameter: 0.200, inner_diameter: 0.150, mu: 0.3,
///                       contact: Contact::New, cone_angle: None };
/// assert!((effective_radius(&collar) - 0.088_095).abs() < 1e-6);
/// ```
///
/// # Source
/// Hibbeler, *Engineering Mechanics: Statics*, §8.6 "Frictional forces on collar
/// bearings, pivot bearings, and disks", eq. 8-7 (uniform pressure); Beer & Johnston,
/// *Statics*, §8.8 "Thrust bearings; disk friction" (uniform pressure) and problem 8.95
/// (worn collar, uniform wear).
pub fn effective_radius(thrust: &Thrust) -> Real {
    let (outer, inner) = radii(thrust);
    match thrust.contact {
        Contact::New => {
            let sum = outer + inner;
            if sum == 0.0 {
                return 0.0;
            }
            2.0 / 3.0 * (outer * outer + outer * inner + inner * inner) / sum
        }
        Contact::Worn => (outer + inner) / 2.0,
    }
}

/// Friction moment of a thrust bearing, N·m.
///
/// # Formula
/// `M = μ · W · r_eff / sin α`, with `r_eff` from [`effective_radius`] and `α` the
/// cone's half-angle (`sin α = 1` for a flat face).
///
/// # Arguments
/// - `thrust.load`: axial load `W`, N, `≥ 0`.
/// - `thrust.mu`: coefficient of friction, `≥ 0`.
/// - `thrust.cone_angle`: half-angle `α` of a conical pivot, radians, `0 < α ≤ π/2`
///   (`π/2` is flat); `None` for a flat face.
/// - diameters and contact as in [`effective_radius`].
///
/// Ranges are validated at load and `debug_assert!`ed here; in release builds a NaN or
/// negative load or `μ` counts as 0 and a cone angle outside `(0, π/2]` as flat.
///
/// # Returns
/// `M`, N·m, `≥ 0`.
///
/// # Example
/// Conical pivot of 150 mm diameter, included angle 120° (so `cone_angle`, the half-angle,
/// is `α = 60°`), 20 kN, μ = 0.03, new
/// (uniform pressure): `M = 0.03 × 20 000 × (2/3 × 0.075) / sin 60° = 34.641 N·m`.
/// ```
/// use reeve::friction::thrust::moment;
/// use reeve::model::{Contact, Thrust};
/// let pivot = Thrust { load: 20e3, diameter: 0.150, inner_diameter: 0.0, mu: 0.03,
///                      contact: Contact::New, cone_angle: Some(60f64.to_radians()) };
/// assert!((moment(&pivot) - 34.641).abs() < 1e-3);
/// ```
///
/// # Source
/// Hibbeler, *Statics*, §8.6, eq. 8-7; Beer & Johnston, *Statics*, §8.8 and problem
/// 8.96 (conical bearing, uniform pressure: `M = (2/3) μ P (R₂³ − R₁³)/((R₂² − R₁²)
/// sin θ)`).
pub fn moment(thrust: &Thrust) -> Real {
    debug_assert!(
        thrust.load >= 0.0,
        "thrust load must be ≥ 0, got {}",
        thrust.load
    );
    debug_assert!(
        thrust.mu >= 0.0,
        "coefficient of friction must be ≥ 0, got {}",
        thrust.mu
    );
    let load = thrust.load.max(0.0);
    let mu = thrust.mu.max(0.0);
    let sin_alpha = match thrust.cone_angle {
        Some(alpha) => {
            debug_assert!(
                alpha > 0.0 && alpha <= std::f64::consts::FRAC_PI_2,
                "cone half-angle must be in (0, π/2] radians, got {alpha}"
            );
            if alpha > 0.0 && alpha <= std::f64::consts::FRAC_PI_2 {
                alpha.sin()
            } else {
                1.0
            }
        }
        None => 1.0,
    };
    let moment = mu * load * effective_radius(thrust) / sin_alpha;
    // 0 × ∞ (an unloaded, infinitely large face) is the only way to a NaN here.
    if moment.is_nan() {
        0.0
    } else {
        moment
    }
}

/// Outer and inner contact radii, in order, NaN and negatives counted as 0.
fn radii(thrust: &Thrust) -> (Real, Real) {
    debug_assert!(
        thrust.inner_diameter >= 0.0 && thrust.inner_diameter <= thrust.diameter,
        "thrust diameters must satisfy 0 ≤ inner ≤ outer, got {} and {}",
        thrust.inner_diameter,
        thrust.diameter
    );
    let a = thrust.diameter.max(0.0) / 2.0;
    let b = thrust.inner_diameter.max(0.0) / 2.0;
    (a.max(b), a.min(b))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn face(diameter: Real, inner_diameter: Real, contact: Contact) -> Thrust {
        Thrust {
            load: 100.0,
            diameter,
            inner_diameter,
            mu: 0.1,
            contact,
            cone_angle: None,
        }
    }

    #[test]
    fn solid_pivot() {
        // Uniform pressure: (2/3) R; uniform wear: R/2.
        assert!((effective_radius(&face(0.06, 0.0, Contact::New)) - 0.02).abs() < 1e-15);
        assert!((effective_radius(&face(0.06, 0.0, Contact::Worn)) - 0.015).abs() < 1e-15);
    }

    #[test]
    fn thin_ring_tends_to_its_radius() {
        let r = effective_radius(&face(0.1, 0.1 - 1e-12, Contact::New));
        assert!((r - 0.05).abs() < 1e-12, "{r}");
        let r = effective_radius(&face(0.1, 0.1, Contact::New));
        assert!((r - 0.05).abs() < 1e-15, "{r}");
    }

    #[test]
    fn new_exceeds_worn_and_both_lie_between_radii() {
        for &(d, di) in &[(0.1, 0.0), (0.1, 0.05), (0.3, 0.2), (0.02, 0.019)] {
            let new = effective_radius(&face(d, di, Contact::New));
            let worn = effective_radius(&face(d, di, Contact::Worn));
            assert!(new >= worn - 1e-15, "{d} {di}: {new} < {worn}");
            assert!(worn >= di / 2.0 && new <= d / 2.0 + 1e-15);
        }
    }

    #[test]
    fn cone_divides_by_sine_of_half_angle() {
        let mut t = face(0.1, 0.0, Contact::Worn);
        let flat = moment(&t);
        t.cone_angle = Some(30f64.to_radians());
        assert!((moment(&t) - 2.0 * flat).abs() < 1e-12);
        t.cone_angle = Some(std::f64::consts::FRAC_PI_2);
        assert!((moment(&t) - flat).abs() < 1e-15);
    }
}

//! Numeric types shared by every stage: `Real` is `f64`, points are positions, vectors
//! are displacements and forces, and a [`Direction`] is unit length by type.

/// The scalar type used everywhere inside the library (SI units, radians).
pub type Real = f64;
/// A position in space, metres.
pub type Point = nalgebra::Point3<Real>;
/// A displacement, velocity or force.
pub type Vector = nalgebra::Vector3<Real>;
/// A unit vector; "is this normalized?" never comes up.
pub type Direction = nalgebra::Unit<Vector>;

/// Standard gravity, m/s² (CGPM 1901, 3rd General Conference on Weights and Measures).
pub const STANDARD_GRAVITY: Real = 9.806_65;

/// Degrees in one radian, for the report edges.
pub fn to_degrees(radians: Real) -> Real {
    radians.to_degrees()
}

/// Two unit vectors perpendicular to `normal` and to each other, forming a right-handed
/// frame `(e1, e2, normal)`.
pub fn plane_basis(normal: &Direction) -> (Direction, Direction) {
    let n = normal.into_inner();
    // Pick the world axis least aligned with the normal to start from.
    let seed = if n.x.abs() <= n.y.abs() && n.x.abs() <= n.z.abs() {
        Vector::x()
    } else if n.y.abs() <= n.z.abs() {
        Vector::y()
    } else {
        Vector::z()
    };
    let e1 = Direction::new_normalize(seed - n * n.dot(&seed));
    let e2 = Direction::new_normalize(n.cross(&e1));
    (e1, e2)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn plane_basis_is_orthonormal_and_right_handed() {
        for n in [Vector::z(), Vector::x(), Vector::new(1.0, 2.0, -3.0)] {
            let n = Direction::new_normalize(n);
            let (e1, e2) = plane_basis(&n);
            assert!(e1.dot(&e2).abs() < 1e-12);
            assert!(e1.dot(&n).abs() < 1e-12);
            assert!((e1.cross(&e2) - n.into_inner()).norm() < 1e-12);
        }
    }
}

//! Tangent lines between circles (and points) in 3-D.
//!
//! A span leaves one [`Circle`] and arrives at the next. It touches each circle at a
//! tangent point `t` where the span is perpendicular to the radius,
//! `(t_other − t) · (t − c) = 0`, on the side that makes the rope run the circle's way:
//! the rope's direction at `t`, `σ · a × (t − c) / R`, has a positive component along the
//! span. A point is a circle of radius zero.
//!
//! Three cases:
//! - a point and a circle, or two circles with parallel (or antiparallel) axles: closed
//!   form ([`tangent_closed_form`]). The tangency condition involves only the in-plane
//!   part of the centre-to-centre vector, so circles in parallel but offset planes are
//!   solved exactly too; the offset becomes a fleet angle.
//! - two circles with skew axles: alternate point-to-circle tangents until the tangent
//!   points stop moving ([`tangent_iterative`]).
//!
//! [`common_tangent`] picks the case.

use crate::math::{Direction, Point, Real, Vector};

/// Relative size below which a geometric quantity counts as zero (round-off).
pub const DEGENERATE: Real = 1e-12;

/// `value > threshold`, and false when either is NaN: guards written as
/// `if !exceeds(..) { error }` send NaN input to the error.
pub fn exceeds(value: Real, threshold: Real) -> bool {
    matches!(
        value.partial_cmp(&threshold),
        Some(std::cmp::Ordering::Greater)
    )
}

/// A round part's pitch circle as a span sees it, or a point (radius zero).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Circle {
    /// Centre, m.
    pub centre: Point,
    /// Axle; the circle lies in the plane normal to it (ignored for a point).
    pub axle: Direction,
    /// Pitch radius, m (0 for a point).
    pub radius: Real,
    /// Turning sense about the axle: +1 anticlockwise seen from the axle's tip, −1
    /// clockwise (ignored for a point).
    pub sense: Real,
}

impl Circle {
    /// A point part: a circle of radius zero at `at`.
    pub fn point(at: Point) -> Circle {
        Circle {
            centre: at,
            axle: Direction::new_unchecked(Vector::z()),
            radius: 0.0,
            sense: 1.0,
        }
    }

    /// Whether this is a point (radius zero).
    pub fn is_point(&self) -> bool {
        !exceeds(self.radius, 0.0)
    }

    /// The radius with the sign of the rope's side, measured against the reference axle
    /// `reference` (parallel or antiparallel to this circle's axle): `σ · R · sign(a · ref)`.
    /// Zero for a point.
    fn signed_radius(&self, reference: &Vector) -> Real {
        if self.is_point() {
            0.0
        } else if self.axle.dot(reference) < 0.0 {
            -self.sense * self.radius
        } else {
            self.sense * self.radius
        }
    }
}

/// Where a span touches its two end circles.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Tangent {
    /// Tangent point on the circle the span leaves (or that point), m.
    pub start: Point,
    /// Tangent point on the circle the span arrives at (or that point), m.
    pub end: Point,
}

/// Which end of a span.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum End {
    /// The circle the span leaves.
    Start,
    /// The circle the span arrives at.
    End,
}

/// Why no tangent exists.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum TangentError {
    /// The two centres are at the same place.
    Coincident,
    /// The other end lies inside (or on) this end's circle, seen in its plane, or the
    /// circles overlap so that no tangent of the asked kind exists.
    Inside(End),
    /// The skew-axle iteration did not settle.
    NotConverged {
        /// Iterations used.
        iterations: usize,
        /// Movement of the tangent points in the last iteration, m.
        residual: Real,
    },
}

/// Settings for [`common_tangent`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TangentOptions {
    /// Stop the skew-axle iteration when the tangent points move less than this, m.
    pub tolerance: Real,
    /// Give up after this many iterations.
    pub max_iterations: usize,
}

impl Default for TangentOptions {
    fn default() -> Self {
        TangentOptions {
            tolerance: 1e-12,
            max_iterations: 200,
        }
    }
}

/// The straight span that leaves circle `from` and arrives at circle `to`, each touched
/// on its rope's side.
///
/// # Formula
/// Parallel axles or a point: closed form ([`tangent_closed_form`]); skew axles:
/// alternating point-to-circle tangents ([`tangent_iterative`]).
///
/// # Arguments
/// - `from`, `to`: the circles (radius 0 for points), m.
/// - `options`: tolerance (m) and iteration cap for skew axles.
///
/// # Returns
/// The two tangent points.
///
/// # Errors
/// [`TangentError::Coincident`] when the centres coincide, [`TangentError::Inside`] when
/// one end lies inside the other's circle (no tangent), [`TangentError::NotConverged`].
///
/// # Example
/// Crossed tangent between two circles of radius 1 m, 4 m apart: its length is
/// `√(D² − (r₁ + r₂)²) = √(16 − 4) = √12` (hand calculation).
/// ```
/// use reeve::geometry::tangent::{common_tangent, Circle, TangentOptions};
/// use reeve::math::{Direction, Point, Vector};
/// let axle = Direction::new_normalize(Vector::z());
/// let a = Circle { centre: Point::origin(), axle, radius: 1.0, sense: 1.0 };
/// let b = Circle { centre: Point::new(4.0, 0.0, 0.0), axle, radius: 1.0, sense: -1.0 };
/// let t = common_tangent(&a, &b, &TangentOptions::default()).unwrap();
/// assert!(((t.end - t.start).norm() - 12f64.sqrt()).abs() < 1e-12);
/// ```
pub fn common_tangent(
    from: &Circle,
    to: &Circle,
    options: &TangentOptions,
) -> Result<Tangent, TangentError> {
    let offset = to.centre - from.centre;
    let scale = offset.norm() + from.radius.abs() + to.radius.abs();
    if !exceeds(offset.norm(), DEGENERATE * scale) {
        return Err(TangentError::Coincident);
    }
    match (from.is_point(), to.is_point()) {
        (true, true) => Ok(Tangent {
            start: from.centre,
            end: to.centre,
        }),
        (true, false) => tangent_closed_form(from, to, &to.axle),
        (false, true) => tangent_closed_form(from, to, &from.axle),
        (false, false) => {
            if from.axle.cross(&to.axle).norm() <= DEGENERATE {
                tangent_closed_form(from, to, &from.axle)
            } else {
                tangent_iterative(from, to, options).map(|(t, _)| t)
            }
        }
    }
}

/// Closed-form tangent for a point and a circle, or two circles with parallel
/// (or antiparallel) axles.
///
/// # Formula
/// With `ρᵢ = σᵢ Rᵢ sign(aᵢ · a)` (0 for a point), `Δ = ρ₁ − ρ₂` and the centre offset
/// `D = c₂ − c₁` projected into the plane normal to `a`, `D⊥` (length `|D⊥|`, unit
/// `e₁`, `e₂ = a × e₁`): both tangent points lie along one in-plane normal
/// `n = (Δ e₁ − √(|D⊥|² − Δ²) e₂) / |D⊥|`, at `tᵢ = cᵢ + ρᵢ n`. The span
/// `t₂ − t₁ = D − Δ n` is perpendicular to `n`; its length is `√(|D|² − Δ²)`, which
/// is `√(|D|² − (R₁ − R₂)²)` for an external tangent (same sense) and
/// `√(|D|² − (R₁ + R₂)²)` for a crossed one (opposite sense).
///
/// # Arguments
/// - `from`, `to`: the circles (radius 0 for a point), m; a circle's axle must be
///   parallel or antiparallel to `axle`.
/// - `axle`: the common axle direction.
///
/// # Returns
/// The two tangent points.
///
/// # Errors
/// [`TangentError::Inside`] when `|D⊥| ≤ |Δ|` (within round-off): a point inside a
/// circle, or circles nested (external) or overlapping (crossed). The larger circle is
/// named. NaN input also lands here.
///
/// # Example
/// An external tangent (same sense) between sheaves of pitch radius 50 mm and 30 mm,
/// 400 mm apart, axles along +Z. By hand: `Δ = 0.05 − 0.03 = 0.02` m, `e₁ = +X`,
/// `e₂ = Z × X = +Y`, `√(|D|² − Δ²) = √(0.16 − 0.0004) = √0.1596 ≈ 0.399 500` m (the span
/// length), `n = (0.02 X − √0.1596 Y) / 0.4 ≈ (0.05, −0.998 75, 0)`, so the rope leaves
/// the first sheave at `0.05 n ≈ (2.5 mm, −49.94 mm, 0)`.
/// ```
/// use reeve::geometry::tangent::{tangent_closed_form, Circle};
/// use reeve::math::{Direction, Point, Vector};
/// let axle = Direction::new_normalize(Vector::z());
/// let big = Circle { centre: Point::origin(), axle, radius: 0.05, sense: 1.0 };
/// let small = Circle { centre: Point::new(0.4, 0.0, 0.0), axle, radius: 0.03, sense: 1.0 };
/// let t = tangent_closed_form(&big, &small, &axle).unwrap();
/// assert!(((t.end - t.start).norm() - 0.1596f64.sqrt()).abs() < 1e-12);
/// let leave = t.start.coords;
/// assert!((leave.x - 0.0025).abs() < 1e-12);
/// assert!((leave.y + 0.05 * 0.1596f64.sqrt() / 0.4).abs() < 1e-12);
/// // The span is square to the radius at both tangent points.
/// assert!((t.end - t.start).dot(&leave).abs() < 1e-12);
/// ```
///
/// Source: hand derivation from the tangency conditions above (plane geometry of common
/// tangents).
pub fn tangent_closed_form(
    from: &Circle,
    to: &Circle,
    axle: &Direction,
) -> Result<Tangent, TangentError> {
    let axle = axle.into_inner();
    let rho_from = from.signed_radius(&axle);
    let rho_to = to.signed_radius(&axle);
    let offset = to.centre - from.centre;
    let in_plane = offset - axle * axle.dot(&offset);
    let distance = in_plane.norm();
    let delta = rho_from - rho_to;
    let scale = offset.norm() + from.radius.abs() + to.radius.abs();
    // Negated `exceeds` so that NaN lands in the error too.
    if !exceeds(distance - delta.abs(), DEGENERATE * scale) {
        let larger = if from.radius > to.radius {
            End::Start
        } else {
            End::End
        };
        return Err(TangentError::Inside(larger));
    }
    let e1 = in_plane / distance;
    let e2 = axle.cross(&e1);
    // √(|D⊥|² − Δ²) written as a product to keep precision when |Δ| ≈ |D⊥|.
    let leg = ((distance - delta.abs()) * (distance + delta.abs())).sqrt();
    let normal = (e1 * delta - e2 * leg) / distance;
    Ok(Tangent {
        start: from.centre + normal * rho_from,
        end: to.centre + normal * rho_to,
    })
}

/// Tangent between two circles with skew axles, by alternating point-to-circle
/// tangents: fix `t₂`, take `t₁` as the tangent point on circle 1 seen from `t₂`; then
/// `t₂` from `t₁`; repeat until the points move less than `options.tolerance`.
///
/// Works in coordinates relative to `from.centre`, so the result does not depend on
/// where the rig sits in space. Also valid (and tested against the closed form) for
/// parallel axles. The step contracts by roughly `R₁R₂ / |D|²`, so spans much longer
/// than the radii converge in a few iterations.
///
/// # Arguments
/// - `from`, `to`: the circles, m.
/// - `options`: tolerance, m (raised to the round-off floor `16 ε (|D| + R₁ + R₂)`), and
///   the iteration cap.
///
/// # Returns
/// The tangent points and the number of iterations used.
///
/// # Errors
/// [`TangentError::Inside`] when an intermediate point falls inside a circle (the
/// circles are too close for a tangent), [`TangentError::NotConverged`] at the cap.
/// When the centre line runs nearly along an axle (span leaving a groove at close to
/// 90°), a point of one circle can project inside the other and the iteration reports
/// `Inside` even where a tangent might exist; with the centre line more than about 32°
/// off both axles and the centres three summed radii apart this cannot happen (see the
/// property test).
///
/// # Example
/// The sheaves of [`tangent_closed_form`]'s example (radii 50 mm and 30 mm, 400 mm
/// apart, parallel axles): the iteration gives the closed form's span length
/// `√(0.4² − 0.02²) = √0.1596` m (hand calculation) to its tolerance, in a few steps,
/// since each step contracts by about `R₁R₂ / |D|² ≈ 0.01`. Then a lead sheave turned a
/// quarter turn (axle along +X, 1 m above and 0.4 m along): no closed form, but the span
/// found is square to the radius at both ends, the tangency it solves.
/// ```
/// use reeve::geometry::tangent::{tangent_iterative, Circle, TangentOptions};
/// use reeve::math::{Direction, Point, Vector};
/// let z = Direction::new_normalize(Vector::z());
/// let big = Circle { centre: Point::origin(), axle: z, radius: 0.05, sense: 1.0 };
/// let small = Circle { centre: Point::new(0.4, 0.0, 0.0), axle: z, radius: 0.03, sense: 1.0 };
/// let (t, steps) = tangent_iterative(&big, &small, &TangentOptions::default()).unwrap();
/// assert!(((t.end - t.start).norm() - 0.1596f64.sqrt()).abs() < 1e-10);
/// assert!(steps < 20, "{steps} steps");
///
/// let x = Direction::new_normalize(Vector::x());
/// let lead = Circle { centre: Point::new(0.4, 0.0, 1.0), axle: x, radius: 0.03, sense: 1.0 };
/// let (t, _) = tangent_iterative(&big, &lead, &TangentOptions::default()).unwrap();
/// let span = t.end - t.start;
/// assert!(span.dot(&(t.start - big.centre)).abs() < 1e-9);
/// assert!(span.dot(&(t.end - lead.centre)).abs() < 1e-9);
/// // Each tangent point lies on its own circle.
/// assert!(((t.start - big.centre).norm() - 0.05).abs() < 1e-9);
/// assert!(((t.end - lead.centre).norm() - 0.03).abs() < 1e-9);
/// ```
///
/// Source: hand derivation (block Gauss–Seidel on the two tangency conditions).
pub fn tangent_iterative(
    from: &Circle,
    to: &Circle,
    options: &TangentOptions,
) -> Result<(Tangent, usize), TangentError> {
    let origin = from.centre;
    let local_from = Circle {
        centre: Point::origin(),
        ..*from
    };
    let local_to = Circle {
        centre: to.centre - origin.coords,
        ..*to
    };
    let scale = local_to.centre.coords.norm() + from.radius.abs() + to.radius.abs();
    let tolerance = options.tolerance.max(16.0 * Real::EPSILON * scale);
    let mut start = local_from.centre;
    let mut end = local_to.centre;
    let mut residual = Real::INFINITY;
    for iteration in 1..=options.max_iterations {
        let new_start = tangent_closed_form(&local_from, &Circle::point(end), &from.axle)
            .map_err(|_| TangentError::Inside(End::Start))?
            .start;
        let new_end = tangent_closed_form(&Circle::point(new_start), &local_to, &to.axle)
            .map_err(|_| TangentError::Inside(End::End))?
            .end;
        residual = (new_start - start).norm() + (new_end - end).norm();
        start = new_start;
        end = new_end;
        if residual <= tolerance {
            return Ok((
                Tangent {
                    start: start + origin.coords,
                    end: end + origin.coords,
                },
                iteration,
            ));
        }
    }
    Err(TangentError::NotConverged {
        iterations: options.max_iterations,
        residual: if residual.is_finite() {
            residual
        } else {
            Real::MAX
        },
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn z() -> Direction {
        Direction::new_normalize(Vector::z())
    }

    fn circle(x: Real, y: Real, radius: Real, sense: Real) -> Circle {
        Circle {
            centre: Point::new(x, y, 0.0),
            axle: z(),
            radius,
            sense,
        }
    }

    fn options() -> TangentOptions {
        TangentOptions::default()
    }

    /// Checks both tangency conditions and the rope's running direction.
    fn assert_tangent(from: &Circle, to: &Circle, t: &Tangent) {
        let span = t.end - t.start;
        let u = span / span.norm();
        for (c, p) in [(from, t.start), (to, t.end)] {
            if c.is_point() {
                assert!((p - c.centre).norm() < 1e-12);
                continue;
            }
            let radial = p - c.centre;
            assert!((radial.norm() - c.radius).abs() < 1e-12 * c.radius.max(1.0));
            assert!(radial.dot(&c.axle).abs() < 1e-12);
            assert!(
                u.dot(&radial).abs() < 1e-12,
                "span not perpendicular to radius"
            );
            let rope = c.axle.cross(&radial) * c.sense / c.radius;
            assert!(u.dot(&rope) > 0.0, "rope runs against the sense");
        }
    }

    #[test]
    fn external_tangent_of_equal_circles_is_centre_distance() {
        // Hand calculation: equal radii, same sense → span parallel to the centre line,
        // length = D = 5; the tangent points sit one radius to the side.
        let a = circle(0.0, 0.0, 1.0, 1.0);
        let b = circle(5.0, 0.0, 1.0, 1.0);
        let t = common_tangent(&a, &b, &options()).unwrap();
        assert_tangent(&a, &b, &t);
        assert!(((t.end - t.start).norm() - 5.0).abs() < 1e-12);
        // Anticlockwise about +z while running towards +x: the rope is on the −y side.
        assert!((t.start - Point::new(0.0, -1.0, 0.0)).norm() < 1e-12);
        assert!((t.end - Point::new(5.0, -1.0, 0.0)).norm() < 1e-12);
    }

    #[test]
    fn external_tangent_of_unequal_circles() {
        // Hand calculation: √(D² − (r₁ − r₂)²) = √(10² − (3 − 1)²) = √96.
        for sense in [1.0, -1.0] {
            let a = circle(0.0, 0.0, 3.0, sense);
            let b = circle(6.0, 8.0, 1.0, sense);
            let t = common_tangent(&a, &b, &options()).unwrap();
            assert_tangent(&a, &b, &t);
            assert!(((t.end - t.start).norm() - 96f64.sqrt()).abs() < 1e-12);
        }
    }

    #[test]
    fn crossed_tangent_of_equal_and_unequal_circles() {
        // Hand calculation: √(D² − (r₁ + r₂)²): √(4² − 2²) = √12 and √(10² − 4²) = √84.
        let cases = [
            (
                circle(0.0, 0.0, 1.0, 1.0),
                circle(4.0, 0.0, 1.0, -1.0),
                12f64.sqrt(),
            ),
            (
                circle(0.0, 0.0, 3.0, -1.0),
                circle(6.0, 8.0, 1.0, 1.0),
                84f64.sqrt(),
            ),
        ];
        for (a, b, length) in cases {
            let t = common_tangent(&a, &b, &options()).unwrap();
            assert_tangent(&a, &b, &t);
            assert!(((t.end - t.start).norm() - length).abs() < 1e-12);
            // Crossed: the tangent points lie on opposite sides of the centre line.
            let line = b.centre - a.centre;
            let side_a = line.cross(&(t.start - a.centre)).z;
            let side_b = line.cross(&(t.end - b.centre)).z;
            assert!(side_a * side_b < 0.0);
        }
    }

    #[test]
    fn point_to_circle_both_ways() {
        // Hand calculation: from (5, 0) to a unit circle at the origin the tangent length
        // is √(25 − 1) = √24 and the tangent point is at x = R²/L = 0.2, |y| = √0.96.
        let p = Circle::point(Point::new(5.0, 0.0, 0.0));
        let c = circle(0.0, 0.0, 1.0, 1.0);
        let arrive = common_tangent(&p, &c, &options()).unwrap();
        assert_tangent(&p, &c, &arrive);
        assert!((arrive.end - Point::new(0.2, 0.96f64.sqrt(), 0.0)).norm() < 1e-12);
        let leave = common_tangent(&c, &p, &options()).unwrap();
        assert_tangent(&c, &p, &leave);
        assert!((leave.start - Point::new(0.2, -(0.96f64.sqrt()), 0.0)).norm() < 1e-12);
    }

    #[test]
    fn point_out_of_plane_uses_its_projection() {
        // The point 3 m above the plane projects to (5, 0): same tangent point as in the
        // plane; the span length is √(24 + 9) = √33 (hand calculation).
        let p = Circle::point(Point::new(5.0, 0.0, 3.0));
        let c = circle(0.0, 0.0, 1.0, 1.0);
        let t = common_tangent(&p, &c, &options()).unwrap();
        assert_tangent(&p, &c, &t);
        assert!((t.end - Point::new(0.2, 0.96f64.sqrt(), 0.0)).norm() < 1e-12);
        assert!(((t.end - t.start).norm() - 33f64.sqrt()).abs() < 1e-12);
    }

    #[test]
    fn antiparallel_axle_with_flipped_sense_is_the_same_circle() {
        let a = circle(0.0, 0.0, 1.0, 1.0);
        let b = circle(5.0, 2.0, 0.5, 1.0);
        let flipped = Circle {
            axle: -b.axle,
            sense: -b.sense,
            ..b
        };
        let t1 = common_tangent(&a, &b, &options()).unwrap();
        let t2 = common_tangent(&a, &flipped, &options()).unwrap();
        assert!((t1.start - t2.start).norm() < 1e-12);
        assert!((t1.end - t2.end).norm() < 1e-12);
    }

    #[test]
    fn iteration_agrees_with_closed_form_for_parallel_axles() {
        for (sa, sb) in [(1.0, 1.0), (1.0, -1.0), (-1.0, 1.0), (-1.0, -1.0)] {
            let a = circle(0.0, 0.0, 0.3, sa);
            let b = Circle {
                centre: Point::new(2.0, 1.0, 0.4),
                ..circle(0.0, 0.0, 0.2, sb)
            };
            let closed = tangent_closed_form(&a, &b, &a.axle).unwrap();
            let (iterated, iterations) = tangent_iterative(&a, &b, &options()).unwrap();
            assert!(iterations < 100);
            assert!((closed.start - iterated.start).norm() < 1e-11, "{sa} {sb}");
            assert!((closed.end - iterated.end).norm() < 1e-11, "{sa} {sb}");
        }
    }

    #[test]
    fn skew_axles_satisfy_both_tangency_conditions() {
        let a = circle(0.0, 0.0, 0.3, 1.0);
        let b = Circle {
            centre: Point::new(1.5, 0.5, 1.0),
            axle: Direction::new_normalize(Vector::new(1.0, 0.2, 0.3)),
            radius: 0.2,
            sense: -1.0,
        };
        let t = common_tangent(&a, &b, &options()).unwrap();
        assert_tangent(&a, &b, &t);
    }

    #[test]
    fn errors() {
        let c = circle(0.0, 0.0, 1.0, 1.0);
        let inside = Circle::point(Point::new(0.5, 0.0, 2.0));
        assert_eq!(
            common_tangent(&inside, &c, &options()),
            Err(TangentError::Inside(End::End))
        );
        let on = Circle::point(Point::new(1.0, 0.0, 0.0));
        assert_eq!(
            common_tangent(&c, &on, &options()),
            Err(TangentError::Inside(End::Start))
        );
        // Nested circles have no external tangent; overlapping ones no crossed one.
        let nested = circle(0.2, 0.0, 0.5, 1.0);
        assert!(matches!(
            common_tangent(&c, &nested, &options()),
            Err(TangentError::Inside(_))
        ));
        let overlapping = circle(1.5, 0.0, 1.0, -1.0);
        assert!(matches!(
            common_tangent(&c, &overlapping, &options()),
            Err(TangentError::Inside(_))
        ));
        assert_eq!(
            common_tangent(&c, &c, &options()),
            Err(TangentError::Coincident)
        );
        let nan = Circle::point(Point::new(Real::NAN, 0.0, 0.0));
        assert!(common_tangent(&nan, &c, &options()).is_err());
        let skew = Circle {
            axle: Direction::new_normalize(Vector::x()),
            centre: Point::new(5.0, 0.0, 1.0),
            ..circle(0.0, 0.0, 0.5, 1.0)
        };
        let tight = TangentOptions {
            tolerance: 0.0,
            max_iterations: 1,
        };
        assert!(matches!(
            common_tangent(&c, &skew, &tight),
            Err(TangentError::NotConverged { iterations: 1, .. })
        ));
    }

    proptest::proptest! {
        #![proptest_config(proptest::prelude::ProptestConfig::with_cases(512))]

        /// Skew pairs at least three summed radii apart always solve, tangent on the
        /// right sides, within the default iteration cap.
        #[test]
        fn skew_pairs_converge_to_true_tangents(
            a1 in (-1.0..1.0f64, -1.0..1.0f64, -1.0..1.0f64),
            a2 in (-1.0..1.0f64, -1.0..1.0f64, -1.0..1.0f64),
            towards in (-1.0..1.0f64, -1.0..1.0f64, -1.0..1.0f64),
            spacing in 3.0..20.0f64,
            r1 in 0.01..1.0f64,
            r2 in 0.01..1.0f64,
            s1 in proptest::bool::ANY,
            s2 in proptest::bool::ANY,
        ) {
            let v = |(x, y, z): (Real, Real, Real)| Vector::new(x, y, z);
            proptest::prop_assume!(v(a1).norm() > 0.1 && v(a2).norm() > 0.1 && v(towards).norm() > 0.1);
            // Keep the centre line at least ~32° off each axle: each centre then projects
            // at least 1.58 (R₁ + R₂) from the other centre in its plane, so every point
            // of one circle is outside the other's projection and a tangent exists (hand
            // argument). Closer to an axle the span may truly have none.
            let line = v(towards).normalize();
            proptest::prop_assume!(
                line.dot(&v(a1).normalize()).abs() < 0.85 && line.dot(&v(a2).normalize()).abs() < 0.85
            );
            let from = Circle {
                centre: Point::origin(),
                axle: Direction::new_normalize(v(a1)),
                radius: r1,
                sense: if s1 { 1.0 } else { -1.0 },
            };
            let to = Circle {
                centre: Point::from(v(towards).normalize() * spacing * (r1 + r2)),
                axle: Direction::new_normalize(v(a2)),
                radius: r2,
                sense: if s2 { 1.0 } else { -1.0 },
            };
            let (t, iterations) = tangent_iterative(&from, &to, &options()).unwrap();
            proptest::prop_assert!(iterations < 100, "{} iterations", iterations);
            assert_tangent(&from, &to, &t);
        }
    }
}

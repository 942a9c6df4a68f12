//! A skew (non-coplanar) pair of sheaves against an independent Newton solve.

use super::*;

// ---------------------------------------------------------------------------------------
// A skew (non-coplanar) pair against an independent Newton solve

/// A point on circle (c, a, R) at angle θ in the frame (e₁, e₂) of the plane.
fn on_circle(c: &Point, e1: &Vector, e2: &Vector, r: Real, theta: Real) -> Point {
    c + (e1 * theta.cos() + e2 * theta.sin()) * r
}

/// Independent solve: grid search over both angles for the two perpendicularity
/// conditions with the rope running each circle's way, then Newton with a
/// finite-difference Jacobian. Written without the library's tangent code.
/// Each circle is (centre, axle, pitch radius, sense).
fn skew_tangent_by_newton(
    (c1, a1, r1, s1): (Point, Vector, Real, Real),
    (c2, a2, r2, s2): (Point, Vector, Real, Real),
) -> (Point, Point) {
    let frame = |a: &Vector| {
        let seed = if a.x.abs() < 0.9 {
            Vector::x()
        } else {
            Vector::y()
        };
        let e1 = (seed - a * a.dot(&seed)).normalize();
        (e1, a.cross(&e1))
    };
    let (f1, g1) = frame(&a1);
    let (f2, g2) = frame(&a2);
    let residual = |x: Real, y: Real| {
        let t1 = on_circle(&c1, &f1, &g1, r1, x);
        let t2 = on_circle(&c2, &f2, &g2, r2, y);
        let span = t2 - t1;
        (span.dot(&(t1 - c1)), span.dot(&(t2 - c2)), t1, t2)
    };
    let running_right = |x: Real, y: Real| {
        let (_, _, t1, t2) = residual(x, y);
        let span = t2 - t1;
        span.dot(&(a1.cross(&(t1 - c1)) * s1)) > 0.0 && span.dot(&(a2.cross(&(t2 - c2)) * s2)) > 0.0
    };
    let steps = 720;
    let mut best = (Real::INFINITY, 0.0, 0.0);
    for i in 0..steps {
        for j in 0..steps {
            let (x, y) = (
                TAU * i as Real / steps as Real,
                TAU * j as Real / steps as Real,
            );
            let (p, q, _, _) = residual(x, y);
            let size = p.abs() + q.abs();
            if size < best.0 && running_right(x, y) {
                best = (size, x, y);
            }
        }
    }
    let (mut x, mut y) = (best.1, best.2);
    let h = 1e-7;
    for _ in 0..50 {
        let (p, q, _, _) = residual(x, y);
        let (px, qx, _, _) = residual(x + h, y);
        let (py, qy, _, _) = residual(x, y + h);
        let (j11, j12, j21, j22) = ((px - p) / h, (py - p) / h, (qx - q) / h, (qy - q) / h);
        let det = j11 * j22 - j12 * j21;
        x -= (j22 * p - j12 * q) / det;
        y -= (-j21 * p + j11 * q) / det;
    }
    assert!(running_right(x, y));
    let (p, q, t1, t2) = residual(x, y);
    assert!(p.abs() + q.abs() < 1e-13, "newton residual {p} {q}");
    (t1, t2)
}

#[test]
fn skew_pair_matches_an_independent_newton_solve() {
    // A head sheave with a horizontal axle leads to a guide whose axle is tilted out of
    // every coordinate plane, 1.6 m away and offset sideways: a non-coplanar pair.
    let axle_a = dir(0.0, 1.0, 0.0);
    let axle_b = dir(0.3, 1.0, 0.4);
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-0.05, 0.0, -1.5]),
            sheave("a", [0.0, 0.0, 0.0], axle_a, 0.094),
            guide("b", [1.2, 0.4, 1.0], axle_b, 0.054),
            weight("w", [1.5, -0.3, -0.2]),
        ],
        vec![vec![entry(0), entry(1), entry(2), entry(3)]],
    );
    let g = geometry(&r);
    let line = &g.lines[L0];
    let (sa, sb) = (
        line.entries[1].sense.unwrap(),
        line.entries[2].sense.unwrap(),
    );
    let (t1, t2) = skew_tangent_by_newton(
        (Point::origin(), axle_a.into_inner(), 0.05, sa),
        (Point::new(1.2, 0.4, 1.0), axle_b.into_inner(), 0.03, sb),
    );
    let span = &line.spans[1];
    assert!(
        (span.start - t1).norm() < 1e-9,
        "start {} vs {}",
        span.start,
        t1
    );
    assert!((span.end - t2).norm() < 1e-9, "end {} vs {}", span.end, t2);
    // Non-coplanar for real: the span leaves the guide's plane at an angle.
    assert!(line.entries[2].fleet_in.unwrap() > 0.05);
}

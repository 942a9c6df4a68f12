//! Rigs whose geometry is wrong: the errors they give.

use super::*;

// ---------------------------------------------------------------------------------------
// Errors

fn error_of(rig: &Rig) -> GeometryError {
    compute(rig, &GeometryOptions::default()).expect_err("should fail")
}

#[test]
fn point_inside_the_pitch_circle() {
    // The anchor sits 0.01 m from the centre in the sheave's plane projection (it is
    // 0.5 m along the axle, which does not help): inside R = 0.03.
    let r = straight(
        [[0.01, 0.5, 0.0], [0.0, 0.0, 0.0], [1.0, 0.0, 1.0]],
        0.054,
        None,
    );
    let e = error_of(&r);
    assert_eq!(
        e,
        GeometryError::InsideCircle {
            line: "line0".into(),
            part: "s".into(),
            point: "a".into()
        }
    );
    assert!(
        e.to_string().contains("inside the pitch circle of `s`"),
        "{e}"
    );
    // Exactly on the circle has no tangent either.
    let r = straight(
        [[-1.0, 0.0, 0.0], [0.0, 0.0, 0.0], [0.03, 0.0, 0.0]],
        0.054,
        None,
    );
    let r = rig(
        0.006,
        r.parts.into_vec(),
        vec![vec![entry(0), sided(1, Side::Left), entry(2)]],
    );
    assert!(
        matches!(error_of(&r), GeometryError::InsideCircle { part, point, .. }
        if part == "s" && point == "b")
    );
}

#[test]
fn overlapping_sheaves_have_no_crossed_tangent() {
    // Over `a` and under `b` with centres 0.06 m apart and R₁ + R₂ = 0.08: no crossed
    // tangent exists.
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-0.05, 0.0, -2.0]),
            sheave("a", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.094),
            sheave("b", [0.06, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.054),
            weight("w", [0.09, 0.0, 2.0]),
        ],
        vec![vec![
            entry(0),
            sided(1, Side::Right),
            sided(2, Side::Left),
            entry(3),
        ]],
    );
    assert!(matches!(error_of(&r), GeometryError::InsideCircle { .. }));
}

#[test]
fn coincident_entries() {
    let r = straight(
        [[0.0, 0.0, 0.0], [0.0, 0.0, 1.0], [0.0, 0.0, 1.0]],
        0.054,
        None,
    );
    assert_eq!(
        error_of(&r),
        GeometryError::Coincident {
            line: "line0".into(),
            a: "s".into(),
            b: "b".into()
        }
    );
    // Two point ends at one place.
    let r = rig(
        0.006,
        vec![anchor("a", [1.0, 2.0, 3.0]), haul("b", [1.0, 2.0, 3.0])],
        vec![vec![entry(0), entry(1)]],
    );
    assert!(matches!(error_of(&r), GeometryError::Coincident { .. }));
}

#[test]
fn straight_path_without_side_is_ambiguous() {
    let r = straight(
        [[-1.0, 0.0, 0.0], [0.0, 0.0, 0.0], [1.0, 0.0, 0.0]],
        0.054,
        None,
    );
    let e = error_of(&r);
    assert_eq!(
        e,
        GeometryError::AmbiguousSide {
            line: "line0".into(),
            part: "s".into()
        }
    );
    assert!(
        e.to_string().contains("add `side: left` or `side: right`"),
        "{e}"
    );
    // A turn in a plane that contains the axle does not tell the side either.
    let r = straight(
        [[-1.0, 0.0, 0.0], [0.0, 0.0, 0.0], [0.0, 1.0, 0.0]],
        0.054,
        None,
    );
    assert!(matches!(error_of(&r), GeometryError::AmbiguousSide { .. }));
    let r = straight(
        [[-1.0, 0.0, 0.0], [0.0, 0.0, 0.0], [1.0, 0.0, 0.0]],
        0.054,
        Some(Side::Left),
    );
    assert!(compute(&r, &GeometryOptions::default()).is_ok());
}

#[test]
fn skew_iteration_out_of_iterations() {
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-0.05, 0.0, -1.5]),
            sheave("a", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.094),
            guide("b", [1.2, 0.4, 1.0], dir(0.3, 1.0, 0.4), 0.054),
            weight("w", [1.5, -0.3, -0.2]),
        ],
        vec![vec![entry(0), entry(1), entry(2), entry(3)]],
    );
    let options = GeometryOptions {
        tolerance: 0.0,
        max_iterations: 2,
    };
    let e = compute(&r, &options).expect_err("two iterations cannot reach zero");
    match &e {
        GeometryError::NotConverged {
            a,
            b,
            iterations,
            residual,
            ..
        } => {
            assert_eq!((a.as_str(), b.as_str(), *iterations), ("a", "b", 2));
            assert!(residual.is_finite() && *residual > 0.0);
        }
        other => panic!("expected NotConverged, got {other:?}"),
    }
    assert!(e.to_string().contains("did not converge"), "{e}");
}

#[test]
fn nan_input_is_an_error_not_a_nan() {
    let r = straight(
        [[Real::NAN, 0.0, 0.0], [0.0, 0.0, 0.0], [1.0, 0.0, 1.0]],
        0.054,
        None,
    );
    assert!(compute(&r, &GeometryOptions::default()).is_err());
}

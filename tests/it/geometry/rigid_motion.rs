//! Invariance of the geometry under a rigid motion of the whole rig.

use super::*;

// ---------------------------------------------------------------------------------------
// Rigid motion changes nothing

/// A 3-D rig with every kind of entry: a drum end, a skew guide, a fixed sheave, a
/// sheave carried by a block, an anchor; and a second line with a haul and a weight.
fn showcase() -> Rig {
    rig(
        0.008,
        vec![
            drum("winch", [0.5, -0.3, 0.2], dir(1.0, 0.0, 0.0), 0.1),
            guide("lead", [0.4, 0.1, 2.0], dir(0.3, 1.0, 0.1), 0.04),
            sheave("head", [0.0, 0.0, 2.2], dir(0.0, 1.0, 0.0), 0.08),
            block("hook", [0.05, 0.0, 1.0]),
            carried_sheave(
                "hook.a",
                [0.05, 0.0, 0.95],
                dir(0.0, 1.0, 0.0),
                0.08,
                Some(PartId::new(3)),
            ),
            anchor("eye", [0.12, 0.02, 2.2]),
            haul("hand", [1.2, 0.3, 0.8]),
            sheave("top", [1.2, 0.0, 2.0], dir(1.0, 0.1, 0.0), 0.06),
            weight("w", [1.2, -0.4, 0.5]),
        ],
        vec![
            vec![turned(0, 2), turned(1, 1), entry(2), entry(4), entry(5)],
            vec![entry(6), entry(7), entry(8)],
        ],
    )
}

fn moved(rig: &Rig, rotation: &nalgebra::Rotation3<Real>, shift: &Vector) -> Rig {
    let turn = |d: &Direction| Direction::new_normalize(rotation * d.into_inner());
    let mut out = rig.clone();
    out.gravity = turn(&rig.gravity);
    for p in &mut out.parts {
        p.at = rotation * p.at + shift;
        match &mut p.kind {
            PartKind::Sheave(s) => s.axle = turn(&s.axle),
            PartKind::Guide(g) => g.axle = turn(&g.axle),
            PartKind::Drum(d) => d.axle = turn(&d.axle),
            PartKind::Block(b) => b.moves = turn(&b.moves),
            PartKind::Haul(h) => h.pull = h.pull.map(|d| turn(&d)),
            PartKind::Anchor | PartKind::Weight(_) => {}
        }
    }
    out
}

/// `a` and `b` agree to 1e-9 relative; angles near zero (fleet in a plane) are compared
/// against 1 rad.
fn same(what: &str, a: Real, b: Real) {
    assert!(
        relative_eq!(a, b, epsilon = 1e-9, max_relative = 1e-9),
        "{what}: {a} vs {b}"
    );
}

#[test]
fn showcase_rig_is_well_formed() {
    let g = geometry(&showcase());
    let first = &g.lines[L0];
    assert!(
        first.entries[1].fleet_in.unwrap() > 0.01,
        "the skew guide is really skew"
    );
    assert!(
        first.entries[1].wrap > TAU,
        "one extra turn on the lead guide"
    );
    assert_eq!(first.entries[0].wrap, 0.0);
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    #[test]
    fn rigid_motion_changes_no_length_wrap_or_fleet_angle(
        axis in (-1.0..1.0f64, -1.0..1.0f64, -1.0..1.0f64)
            .prop_filter("axis", |(x, y, z)| x * x + y * y + z * z > 1e-2),
        angle in -PI..PI,
        shift in (-50.0..50.0f64, -50.0..50.0f64, -50.0..50.0f64),
    ) {
        let rotation = nalgebra::Rotation3::from_axis_angle(
            &dir(axis.0, axis.1, axis.2),
            angle,
        );
        let shift = Vector::new(shift.0, shift.1, shift.2);
        let base = showcase();
        let before = geometry(&base);
        let after = geometry(&moved(&base, &rotation, &shift));
        prop_assert_eq!(before.lines.len(), after.lines.len());
        for (l0, l1) in before.lines.iter().zip(&after.lines) {
            prop_assert_eq!(l0.spans.len(), l1.spans.len());
            prop_assert_eq!(l0.entries.len(), l1.entries.len());
            for (s0, s1) in l0.spans.iter().zip(&l1.spans) {
                same("span length", s0.length, s1.length);
            }
            for (e0, e1) in l0.entries.iter().zip(&l1.entries) {
                same("wrap", e0.wrap, e1.wrap);
                prop_assert_eq!(e0.sense, e1.sense);
                for (f0, f1) in [(e0.fleet_in, e1.fleet_in), (e0.fleet_out, e1.fleet_out)] {
                    prop_assert_eq!(f0.is_some(), f1.is_some());
                    if let (Some(f0), Some(f1)) = (f0, f1) {
                        same("fleet angle", f0, f1);
                    }
                }
            }
        }
    }
}

/// Every number of a geometry is finite: span ends, lengths, directions, wraps, fleet
/// angles and bend ratios.
fn all_finite(g: &Geometry) -> bool {
    g.lines.iter().all(|line| {
        line.spans.iter().all(|s| {
            s.length.is_finite()
                && s.start.iter().chain(s.end.iter()).all(|x| x.is_finite())
                && s.direction.iter().all(|x| x.is_finite())
        }) && line.entries.iter().all(|e| {
            e.wrap.is_finite()
                && e.pitch_radius.is_finite()
                && e.fleet_in.map_or(true, Real::is_finite)
                && e.fleet_out.map_or(true, Real::is_finite)
                && e.bend_ratio.map_or(true, Real::is_finite)
        })
    })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 300, failure_persistence: None, .. ProptestConfig::default() })]

    /// Extreme inputs (coordinates up to 1e300 m or infinite, treads from 1e-300 m to
    /// infinite) give an error or a geometry that is finite throughout, never a NaN.
    #[test]
    fn extreme_inputs_give_an_error_or_finite_geometry(
        a in prop_oneof![Just(0.0), Just(1e300), Just(-1e300), Just(Real::INFINITY), -10.0..10.0f64],
        c in prop_oneof![Just(1e300), Just(Real::INFINITY), Just(1e-300), -10.0..10.0f64],
        tread in prop_oneof![Just(1e-300), Just(1e300), Just(Real::INFINITY), 0.001..10.0f64],
    ) {
        let r = straight([[a, 0.0, 0.0], [0.0, 0.0, 1.0], [c, 0.0, 0.0]], tread, Some(Side::Left));
        if let Ok(g) = compute(&r, &GeometryOptions::default()) {
            prop_assert!(all_finite(&g), "{a} {c} {tread}: {g:?}");
        }
    }
}

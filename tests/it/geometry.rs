//! Geometry of whole rigs built directly in Rust (no rig files): tangents, wraps, fleet
//! angles, bend ratios, errors, and invariance under a rigid motion of the whole rig.

use std::f64::consts::{FRAC_PI_2, PI, TAU};

use approx::relative_eq;
use proptest::prelude::*;
use reeve::geometry::{compute, Geometry, GeometryError, GeometryOptions, LineGeometry};
use reeve::math::{Direction, Point, Real, Vector};
use reeve::model::{
    Bearing, Block, BlockLoad, Drum, Guide, Haul, Limits, Line, LineId, Location, Part, PartId,
    PartKind, PathEntry, Rig, Rope, RopeId, RopeKind, Sheave, Side, Weight,
};
use reeve::units::UnitSystem;

use crate::support::assert_abs;

/// The first and the second line of a test rig.
const L0: LineId = LineId::new(0);
const L1: LineId = LineId::new(1);

// ---------------------------------------------------------------------------------------
// Building rigs

fn dir(x: Real, y: Real, z: Real) -> Direction {
    Direction::new_normalize(Vector::new(x, y, z))
}

fn part(name: &str, at: [Real; 3], kind: PartKind) -> Part {
    Part {
        name: name.to_string(),
        at: Point::new(at[0], at[1], at[2]),
        block: None,
        kind,
        location: Location::default(),
    }
}

fn anchor(name: &str, at: [Real; 3]) -> Part {
    part(name, at, PartKind::Anchor)
}

fn haul(name: &str, at: [Real; 3]) -> Part {
    part(
        name,
        at,
        PartKind::Haul(Haul {
            pull: None,
            force: None,
        }),
    )
}

fn weight(name: &str, at: [Real; 3]) -> Part {
    part(name, at, PartKind::Weight(Weight { mass: Some(1.0) }))
}

fn block(name: &str, at: [Real; 3]) -> Part {
    part(
        name,
        at,
        PartKind::Block(Block {
            moves: dir(0.0, 0.0, 1.0),
            load: BlockLoad::Mass(None),
            load_stated: true,
            mass: None,
        }),
    )
}

fn sheave(name: &str, at: [Real; 3], axle: Direction, tread: Real) -> Part {
    carried_sheave(name, at, axle, tread, None)
}

fn carried_sheave(
    name: &str,
    at: [Real; 3],
    axle: Direction,
    tread: Real,
    block: Option<PartId>,
) -> Part {
    let mut sheave = part(
        name,
        at,
        PartKind::Sheave(Sheave {
            axle,
            tread_diameter: tread,
            bearing: Bearing::None,
            mass: None,
            groove_angle: None,
            mu: None,
            thrust: None,
        }),
    );
    sheave.block = block;
    sheave
}

fn guide(name: &str, at: [Real; 3], axle: Direction, diameter: Real) -> Part {
    part(
        name,
        at,
        PartKind::Guide(Guide {
            axle,
            diameter,
            mu: None,
            groove_angle: None,
        }),
    )
}

fn drum(name: &str, at: [Real; 3], axle: Direction, diameter: Real) -> Part {
    part(
        name,
        at,
        PartKind::Drum(Drum {
            axle,
            diameter,
            shaft: None,
            torque: Some(0.0),
            drag: 0.0,
            mu: None,
            mass: None,
        }),
    )
}

/// One path entry: part index, extra turns, explicit side.
/// The path entry of part `part` (its position in the parts given to [`rig`]).
fn entry(part: usize) -> PathEntry {
    PathEntry {
        part: PartId::new(part),
        turns: 0,
        side: None,
        location: Location::default(),
    }
}

fn sided(part: usize, side: Side) -> PathEntry {
    PathEntry {
        side: Some(side),
        ..entry(part)
    }
}

fn turned(part: usize, turns: u32) -> PathEntry {
    PathEntry {
        turns,
        ..entry(part)
    }
}

/// A rig with one rope of diameter `rope_diameter` and the given parts and line paths.
fn rig(rope_diameter: Real, parts: Vec<Part>, paths: Vec<Vec<PathEntry>>) -> Rig {
    Rig {
        title: "test".to_string(),
        units: UnitSystem::default(),
        gravity: dir(0.0, 0.0, -1.0),
        limits: Limits::default(),
        ropes: vec![Rope {
            name: "rope".to_string(),
            kind: RopeKind::Fibre,
            diameter: rope_diameter,
            breaking_strength: None,
            mu: 0.2,
            min_bend_ratio: 8.0,
            stiffness: None,
            mass_per_length: None,
            bend_loss: 0.0,
            location: Location::default(),
        }]
        .into(),
        parts: parts.into(),
        lines: paths
            .into_iter()
            .enumerate()
            .map(|(i, path)| Line {
                name: format!("line{i}"),
                rope: RopeId::new(0),
                path,
                location: Location::default(),
            })
            .collect(),
        drive: PartId::new(0),
        solve_for: PartId::new(0),
        runs_back: false,
        changing: Default::default(),
    }
}

fn geometry(rig: &Rig) -> Geometry {
    let g = compute(rig, &GeometryOptions::default()).expect("geometry");
    for line in &g.lines {
        assert_consistent(rig, line);
    }
    g
}

/// Every span is tangent to its end circles, on the rope's side, and nothing is NaN.
fn assert_consistent(rig: &Rig, line: &LineGeometry) {
    for (i, span) in line.spans.iter().enumerate() {
        assert!(span.length > 0.0 && span.length.is_finite());
        assert!(((span.end - span.start).norm() - span.length).abs() < 1e-12);
        for (entry, point, arriving) in [
            (&line.entries[i], span.start, false),
            (&line.entries[i + 1], span.end, true),
        ] {
            let Some(round) = rig.parts[entry.part].kind.round() else {
                assert!((point - entry.centre).norm() < 1e-12);
                continue;
            };
            let radial = point - entry.centre;
            let r = entry.pitch_radius;
            assert!(
                (radial.norm() - r).abs() < 1e-9 * r,
                "tangent point off the circle"
            );
            assert!(
                radial.dot(&round.axle).abs() < 1e-9 * r,
                "tangent point off the plane"
            );
            assert!(
                span.direction.dot(&radial).abs() < 1e-9 * r,
                "span not perpendicular to the radius at `{}` ({})",
                rig.parts[entry.part].name,
                if arriving { "arriving" } else { "leaving" }
            );
            let sense = entry.sense.expect("round parts have a sense");
            let rope = round.axle.cross(&radial) * sense / r;
            assert!(
                span.direction.dot(&rope) > 0.0,
                "rope runs against its sense"
            );
        }
    }
    for e in &line.entries {
        assert!(e.wrap.is_finite() && e.wrap >= 0.0);
        assert!(e.wrap < TAU * (1.0 + Real::from(e.turns)));
    }
}

// ---------------------------------------------------------------------------------------
// Wraps, spans, fleet angles, bend ratios

#[test]
fn half_wrap_over_a_sheave_with_parallel_spans() {
    // Hand calculation: rope d = 6 mm on a 54 mm tread gives R = (54 + 6)/2 = 30 mm.
    // Both ends hang 1 m below the centre, one pitch radius either side: the spans are
    // vertical, 1 m long, and the rope wraps 180°. Bend ratio D/d = 54/6 = 9.
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-0.03, 0.0, 0.0]),
            sheave("head", [0.0, 0.0, 1.0], dir(0.0, 1.0, 0.0), 0.054),
            weight("w", [0.03, 0.0, 0.0]),
        ],
        vec![vec![entry(0), entry(1), entry(2)]],
    );
    let g = geometry(&r);
    let line = &g.lines[L0];
    let head = &line.entries[1];
    assert_abs("pitch radius", head.pitch_radius, 0.03, 1e-15);
    assert_abs("wrap", head.wrap, PI, 1e-12);
    assert_abs("rising span", line.spans[0].length, 1.0, 1e-12);
    assert_abs("falling span", line.spans[1].length, 1.0, 1e-12);
    assert_abs("fleet in", head.fleet_in.unwrap(), 0.0, 1e-12);
    assert_abs("fleet out", head.fleet_out.unwrap(), 0.0, 1e-12);
    assert_abs("bend ratio", head.bend_ratio.unwrap(), 9.0, 1e-12);
    assert!((line.spans[0].start - Point::new(-0.03, 0.0, 0.0)).norm() < 1e-12);
    assert!((line.spans[0].end - Point::new(-0.03, 0.0, 1.0)).norm() < 1e-12);
    // Point ends: no sense, no wrap, no fleet angle, no bend ratio.
    for end in [&line.entries[0], &line.entries[2]] {
        assert_eq!(
            (end.sense, end.wrap, end.fleet_in, end.bend_ratio),
            (None, 0.0, None, None)
        );
    }
}

#[test]
fn quarter_wrap_from_horizontal_to_vertical() {
    // Hand calculation: R = (0.054 + 0.006)/2 = 0.03. The rope runs level along the top
    // of the sheave (z = R) from x = −1, turns down and falls along x = +R to z = −1:
    // wrap 90°, spans 1 m each. The path's turn gives the sense:
    // ((c − p) × (n − c))·y = (1, 0, −R) × (R, 0, −1) · y = 1 − R² > 0 → +1, and indeed
    // the rope runs σ · y × z = +x over the top.
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-1.0, 0.0, 0.03]),
            sheave("head", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.054),
            weight("w", [0.03, 0.0, -1.0]),
        ],
        vec![vec![entry(0), entry(1), entry(2)]],
    );
    let g = geometry(&r);
    let line = &g.lines[L0];
    assert_abs("wrap", line.entries[1].wrap, FRAC_PI_2, 1e-12);
    assert_eq!(line.entries[1].sense, Some(1.0));
    assert_abs("level span", line.spans[0].length, 1.0, 1e-12);
    assert_abs("falling span", line.spans[1].length, 1.0, 1e-12);
}

#[test]
fn three_quarter_wrap_when_the_rope_crosses_itself() {
    // Hand calculation: R = 0.03. Arriving level along the bottom (z = −R) running +x,
    // round the far side and over the top, leaving down along x = −R: the rope turns
    // through 270° and its spans cross (in projection). Running +x at the bottom is
    // σ = −1 about +y (σ · y × (−z) = +x), i.e. `side: right`; the path's turn alone,
    // ((c − p) × (n − c))·y = 1 − R² > 0, would say left, so the side must be given.
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-1.0, 0.0, -0.03]),
            sheave("s", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.054),
            haul("hand", [-0.03, 0.0, -1.0]),
        ],
        vec![vec![entry(0), sided(1, Side::Right), entry(2)]],
    );
    let g = geometry(&r);
    assert_abs("wrap", g.lines[L0].entries[1].wrap, 1.5 * PI, 1e-12);
    assert_abs("level span", g.lines[L0].spans[0].length, 1.0, 1e-12);
    assert_abs("falling span", g.lines[L0].spans[1].length, 1.0, 1e-12);
}

#[test]
fn external_and_crossed_spans_between_two_sheaves() {
    // Two sheaves 1 m apart in the xz plane, axles along y, pitch radii 0.05 and 0.03
    // (treads 0.094 and 0.054 with 6 mm rope). The rope goes over both (same sense):
    // external tangent √(D² − (R₁ − R₂)²) = √(1 − 0.02²) (hand calculation).
    let parts = |far_end_z: Real| {
        vec![
            anchor("eye", [-0.05, 0.0, -2.0]),
            sheave("a", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.094),
            sheave("b", [1.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.054),
            weight("w", [1.03, 0.0, far_end_z]),
        ]
    };
    let over = rig(
        0.006,
        parts(-2.0),
        vec![vec![entry(0), entry(1), entry(2), entry(3)]],
    );
    let g = geometry(&over);
    assert_abs(
        "external",
        g.lines[L0].spans[1].length,
        (1.0 - 0.02f64.powi(2)).sqrt(),
        1e-12,
    );
    assert_eq!(g.lines[L0].entries[1].sense, g.lines[L0].entries[2].sense);
    // Over `a`, then under `b` and up: opposite senses, crossed tangent
    // √(D² − (R₁ + R₂)²) = √(1 − 0.08²) (hand calculation).
    let crossed = rig(
        0.006,
        parts(2.0),
        vec![vec![entry(0), entry(1), entry(2), entry(3)]],
    );
    let g = geometry(&crossed);
    assert_abs(
        "crossed",
        g.lines[L0].spans[1].length,
        (1.0 - 0.08f64.powi(2)).sqrt(),
        1e-12,
    );
    assert_eq!(
        g.lines[L0].entries[1].sense,
        Some(-g.lines[L0].entries[2].sense.unwrap())
    );
}

#[test]
fn fleet_angle_of_a_lead_offset_along_the_axle() {
    // Hand calculation: the anchor is 1 m from the sheave's top tangent point and
    // 0.05 m along the axle; the span makes atan(0.05 / 1) with the groove's plane.
    // The falling span lies in the plane: fleet 0.
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-1.0, 0.05, 0.03]),
            sheave("head", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.054),
            weight("w", [0.03, 0.0, -1.0]),
        ],
        vec![vec![entry(0), entry(1), entry(2)]],
    );
    let g = geometry(&r);
    let head = &g.lines[L0].entries[1];
    assert_abs("fleet in", head.fleet_in.unwrap(), 0.05f64.atan(), 1e-12);
    assert_abs("fleet out", head.fleet_out.unwrap(), 0.0, 1e-12);
    // The offset moves neither tangent point: the wrap stays 90° (hand calculation).
    assert_abs("wrap", head.wrap, FRAC_PI_2, 1e-12);
}

#[test]
fn drum_at_a_line_end_and_turns_on_a_guide() {
    // A drum at the start of the line: one neighbour, sense from `side` (default left),
    // wrap 0 (the rope is wound on), only a leaving fleet angle.
    let parts = vec![
        drum("winch", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.094),
        guide("bar", [1.0, 0.0, 1.0], dir(0.0, 1.0, 0.0), 0.054),
        weight("w", [1.03, 0.0, -1.0]),
    ];
    let left = rig(
        0.006,
        parts.clone(),
        vec![vec![turned(0, 3), turned(1, 2), entry(2)]],
    );
    let right = rig(
        0.006,
        parts,
        vec![vec![sided(0, Side::Right), turned(1, 2), entry(2)]],
    );
    let gl = geometry(&left);
    let gr = geometry(&right);
    let (winch_l, winch_r) = (&gl.lines[L0].entries[0], &gr.lines[L0].entries[0]);
    assert_eq!(winch_l.sense, Some(1.0));
    assert_eq!(winch_r.sense, Some(-1.0));
    assert_eq!(winch_l.wrap, 0.0);
    assert_eq!(winch_l.turns, 3);
    assert!(winch_l.fleet_in.is_none() && winch_l.fleet_out.is_some());
    assert_abs(
        "drum bend ratio",
        winch_l.bend_ratio.unwrap(),
        94.0 / 6.0,
        1e-12,
    );
    // Left and right leave from opposite sides of the drum: external vs crossed tangent
    // to the guide (R₁ = 0.05, R₂ = 0.03, D = √2; hand calculation).
    assert_abs(
        "left lead",
        gl.lines[L0].spans[0].length,
        (2.0 - 0.02f64.powi(2)).sqrt(),
        1e-12,
    );
    assert_abs(
        "right lead",
        gr.lines[L0].spans[0].length,
        (2.0 - 0.08f64.powi(2)).sqrt(),
        1e-12,
    );
    // Two extra turns on the guide add 4π to the wrap measured between tangent points.
    let bar = &gl.lines[L0].entries[1];
    assert_eq!(bar.turns, 2);
    assert!(bar.wrap > 2.0 * TAU && bar.wrap < 3.0 * TAU);
    let w = gl.lines[L0].entries[2].fleet_in;
    assert!(w.is_none());
}

#[test]
fn block_end_is_its_point_and_carried_sheave_its_own_centre() {
    // The moving block `hook` sits at z = 1.0; its sheave `hook.a` is centred 0.1 m lower,
    // at its own `at`. A second line ends on the block itself, at the block's point.
    let r = rig(
        0.006,
        vec![
            anchor("eye", [-0.03, 0.0, 2.0]),
            block("hook", [0.0, 0.0, 1.0]),
            carried_sheave(
                "hook.a",
                [0.0, 0.0, 0.9],
                dir(0.0, 1.0, 0.0),
                0.054,
                Some(PartId::new(1)),
            ),
            anchor("top", [0.03, 0.0, 2.0]),
            anchor("stay", [0.0, 0.0, 3.0]),
        ],
        vec![vec![entry(0), entry(2), entry(3)], vec![entry(1), entry(4)]],
    );
    let g = geometry(&r);
    assert_abs(
        "wrap under the carried sheave",
        g.lines[L0].entries[1].wrap,
        PI,
        1e-12,
    );
    assert_abs(
        "to the carried sheave",
        g.lines[L0].spans[0].length,
        1.1,
        1e-12,
    );
    assert!((g.lines[L1].spans[0].start - Point::new(0.0, 0.0, 1.0)).norm() < 1e-15);
    assert_abs("block to stay", g.lines[L1].spans[0].length, 2.0, 1e-15);
}

#[test]
fn explicit_side_settles_a_straight_path() {
    // Straight through: the rope passes the guide on the given side. The spans touch the
    // circle at asin(R / L) either side of the centre line, so the rope turns through
    // 2·asin(R / L) = 2·asin(0.03 / 1) (hand calculation).
    let r = rig(
        0.006,
        vec![
            anchor("a", [-1.0, 0.0, 0.0]),
            guide("g", [0.0, 0.0, 0.0], dir(0.0, 1.0, 0.0), 0.054),
            haul("b", [1.0, 0.0, 0.0]),
        ],
        vec![vec![entry(0), sided(1, Side::Right), entry(2)]],
    );
    let g = geometry(&r);
    let entry = &g.lines[L0].entries[1];
    assert_eq!(entry.sense, Some(-1.0));
    assert_abs("wrap", entry.wrap, 2.0 * 0.03f64.asin(), 1e-12);
    // Tangent length from a point 1 m off: √(1 − R²) (hand calculation).
    assert_abs(
        "lead",
        g.lines[L0].spans[0].length,
        (1.0 - 0.03f64.powi(2)).sqrt(),
        1e-12,
    );
}

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

// ---------------------------------------------------------------------------------------
// Errors

fn straight(positions: [[Real; 3]; 3], tread: Real, side: Option<Side>) -> Rig {
    rig(
        0.006,
        vec![
            anchor("a", positions[0]),
            sheave("s", positions[1], dir(0.0, 1.0, 0.0), tread),
            haul("b", positions[2]),
        ],
        vec![vec![entry(0), PathEntry { side, ..entry(1) }, entry(2)]],
    )
}

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

//! Wraps, spans, fleet angles and bend ratios of whole rigs.

use super::*;

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

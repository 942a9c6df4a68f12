//! Drums: journal and thrust friction in the drum's torque balance.

use super::*;

// ---------------------------------------------------------------------------------
// Drums: journal and thrust friction in the drum's torque balance.
// ---------------------------------------------------------------------------------

/// A winch drum (pitch radius 0.1 m) on axle +y, turning forward to lift `mass` on a
/// rope that leaves the drum at x = −R.
fn winch(shaft: &str, drum_mass: f64) -> String {
    format!(
        r#"
format: 1
title: winch drum
units: {{length: m, force: N, mass: kg, torque: N*m}}
ropes:
  r: {{diameter: 0.01, mu: 0.2}}
parts:
  drum: {{kind: drum, at: [0, 0, 0], axle: [0, 1, 0], diameter: 0.19, mass: {drum_mass}{shaft}}}
  load: {{kind: weight, at: [-0.1, 0, -2], mass: 50}}
lines:
  l: {{rope: r, path: [{{part: drum, side: right}}, load]}}
drive: drum
"#
    )
}

#[test]
fn drum_with_thrust_and_journal() {
    // Sources: thrust (disk) friction, Beer & Johnston, *Statics*, §8.9 "Thrust bearings.
    // Disk friction" (M = (2/3) μ P (R2³ − R1³)/(R2² − R1²) new; M = ½ μ P (R1 + R2)
    // worn; from memory); conical pivot M divided by sin α (Meriam & Kraige, *Statics*,
    // §6/8 "Disk friction", from memory); journal friction circle, Beer & Johnston §8.7.
    // Drum torque balance (DESIGN.md §1): forward torque = W R + M_journal + M_thrust,
    // back torque = W R − M_journal − M_thrust.
    let w = 50.0 * STANDARD_GRAVITY; // 490.3325 N
    let r = 0.1;
    let thrust_load = 2000.0;
    let cases: Vec<(&str, f64)> = vec![
        // Flat pivot, new: r_eff = (2/3)·0.03 = 0.02 m; M = 0.1·2000·0.02 = 4.0 N·m.
        (
            "{load: 2000, diameter: 0.06, mu: 0.1, contact: new}",
            0.1 * thrust_load * 0.02,
        ),
        // Flat pivot, worn: r_eff = 0.015 m; M = 3.0 N·m.
        (
            "{load: 2000, diameter: 0.06, mu: 0.1, contact: worn}",
            0.1 * thrust_load * 0.015,
        ),
        // Collar 60/30 mm, new: r_eff = (2/3)(0.03³ − 0.015³)/(0.03² − 0.015²)
        // = (2/3)(2.3625e-5/6.75e-4) = 0.023 333 m; M = 4.6667 N·m.
        (
            "{load: 2000, diameter: 0.06, inner_diameter: 0.03, mu: 0.1, contact: new}",
            0.1 * thrust_load * (2.0 / 3.0) * (0.03_f64.powi(3) - 0.015_f64.powi(3))
                / (0.03_f64.powi(2) - 0.015_f64.powi(2)),
        ),
        // Collar, worn: r_eff = 0.0225 m; M = 4.5 N·m.
        (
            "{load: 2000, diameter: 0.06, inner_diameter: 0.03, mu: 0.1, contact: worn}",
            4.5,
        ),
        // Conical pivot, half-angle 30°, new: M = 4.0/sin 30° = 8.0 N·m.
        (
            "{load: 2000, diameter: 0.06, mu: 0.1, contact: new, cone_angle: 30}",
            8.0,
        ),
    ];
    for (thrust, m_thrust) in cases {
        let shaft = format!(", shaft: {{bearing: {{kind: none}}, thrust: {thrust}}}");
        let (_, s) = solve_text(&winch(&shaft, 0.0));
        let m = s.main();
        assert_rel(
            &format!("{thrust}: ideal torque W R"),
            m.ideal.value,
            w * r,
            1e-12,
        );
        assert_rel(
            &format!("{thrust}: forward torque"),
            m.forward.value,
            w * r + m_thrust,
            1e-12,
        );
        assert_rel(
            &format!("{thrust}: back torque"),
            m.back.value,
            w * r - m_thrust,
            1e-12,
        );
        let drum = m.forward.drums[PartId::new(0)].expect("drum torques");
        assert_rel(
            &format!("{thrust}: thrust torque"),
            drum.thrust,
            m_thrust,
            1e-12,
        );
        audit_ok(&s);
    }
    // Journal: plain shaft bearing, 40 mm journal, μ = 0.15; drum of 20 kg. Radial load
    // (rope vertical) = (50 + 20)·g = 686.47 N; r_f = 0.02·0.15/√1.0225 = 0.002 966 9 m;
    // M_j = 2.036 7 N·m (hand calculation).
    let shaft = ", shaft: {bearing: {kind: plain, pin_diameter: 0.04, mu: 0.15}}";
    let (_, s) = solve_text(&winch(shaft, 20.0));
    let r_f = 0.02 * 0.15 / (1.0 + 0.15_f64 * 0.15).sqrt();
    let m_j = r_f * 70.0 * STANDARD_GRAVITY;
    let m = s.main();
    assert_rel(
        "journal: forward torque",
        m.forward.value,
        w * r + m_j,
        1e-9,
    );
    assert_rel("journal: back torque", m.back.value, w * r - m_j, 1e-9);
    let drum = m.forward.drums[PartId::new(0)].expect("drum torques");
    assert_rel("journal: journal torque", drum.journal, m_j, 1e-9);
    audit_ok(&s);
}

#[test]
fn drum_self_locking_by_thrust_friction() {
    // DESIGN.md §3: the rig is self-locking when `back` has the opposite sign to
    // `ideal`. Hand calculation: flat new pivot, r_eff = (2/3)·0.03 = 0.02 m, μ = 0.3,
    // 20 kN axial: M = 0.3·20000·0.02 = 120 N·m > W R = 49.033 N·m, so the back torque
    // is 49.033 − 120 = −70.967 N·m: the load cannot turn the drum back by itself.
    let shaft = ", shaft: {bearing: {kind: none}, thrust: {load: 20000, diameter: 0.06, mu: 0.3, contact: new}}";
    let (_, s) = solve_text(&winch(shaft, 0.0));
    let m = s.main();
    let wr = 50.0 * STANDARD_GRAVITY * 0.1;
    assert_rel("self-locking back torque", m.back.value, wr - 120.0, 1e-12);
    assert!(
        m.self_locking(),
        "back {} vs ideal {}: self-locking",
        m.back.value,
        m.ideal.value
    );
    audit_ok(&s);
}

#[test]
fn stalled_sheave_slides_at_the_capstan_ratio() {
    // DESIGN.md §1 "Stalled sheave": a sheave turns only while its bearing needs less
    // tension ratio than the groove can transmit. Hand calculation: pitch R = 0.05 m, pin
    // 80 mm with μ = 0.5: r_f = 0.04·0.5/√1.25 = 0.017 889 m, ρ = 0.357 77,
    // k(180°) = 1.357 77/0.642 23 = 2.1141; the rope (μ = 0.1) holds only
    // e^{0.1π} = 1.3691 on the groove: the sheave stands still and the rope slides,
    // so the pull is 1000·1.3691 N (capstan, Euler–Eytelwein).
    let text = r#"
format: 1
title: stalled sheave
units: {length: m, force: N}
ropes:
  r: {diameter: 0.01, mu: 0.1}
parts:
  load:   {kind: block, at: [-0.05, 0, -2], moves: [0, 0, 1], load: {force: 1000}}
  sheave: {kind: sheave, at: [0, 0, 0], axle: [0, 1, 0], diameter: 0.09,
           bearing: {kind: plain, pin_diameter: 0.08, mu: 0.5}}
  hand:   {kind: haul, at: [0.05, 0, -2]}
lines:
  l: {rope: r, path: [load, sheave, hand]}
"#;
    let (rig, s) = solve_text(text);
    let m = s.main();
    let capstan = (0.1 * PI).exp();
    assert_rel(
        "stalled: forward pull",
        m.forward.value,
        1000.0 * capstan,
        1e-9,
    );
    assert_rel("stalled: back pull", m.back.value, 1000.0 / capstan, 1e-9);
    assert!(!m.forward.stalled.is_empty(), "the stall is reported");
    let warnings = reeve::checks::run(&rig, &s);
    assert!(
        warnings.iter().any(|w| w.code == "stalled-sheave"),
        "stalled-sheave warning: {warnings:?}"
    );
    audit_ok(&s);
}

#[test]
fn tackle_with_the_load_unknown() {
    // DESIGN.md §3: with the load's quantity unknown, `forward` is the greatest load the
    // drive still moves and `back` the least load that drives it back. Wire-rope
    // handbook reeving formula (as above): with pull P, forward W = P·N·E(K) and
    // back W = P·N·E(1/K). Hand calculation, N = 4, K = 1.04, P = 2000 N:
    // 1.04⁴ = 1.169 859, E = 0.169 859/(1.169 859·0.16) = 0.907 473, W_forward = 7259.8 N.
    let (text, s_count) = tackle(4, Lead::Fixed { extra: 0 }, 1.04, 1.0);
    let text = text
        .replace("kind: haul,", "kind: haul, force: 2000,")
        .replace("drive: haul\n", "drive: haul\nsolve_for: hook\n");
    let (_, s) = solve_text(&text);
    let m = s.main();
    let e = reeving_efficiency(1.04, 4, s_count);
    let e_back = reeving_efficiency(1.0 / 1.04, 4, s_count);
    assert_rel(
        "greatest load moved",
        m.forward.value,
        2000.0 * 4.0 * e,
        1e-9,
    );
    assert_rel(
        "least load that runs back",
        m.back.value,
        2000.0 * 4.0 * e_back,
        1e-9,
    );
    assert_abs(
        "greatest load moved, N, vs the hand calculation",
        m.forward.value,
        7259.8,
        0.1,
    );
    assert_rel(
        "efficiency forward/ideal",
        m.forward_efficiency().unwrap(),
        e,
        1e-9,
    );
}

#[test]
fn drum_winding_the_hauling_part_of_a_tackle() {
    // A winch drum (pitch radius 0.1 m) winds the hauling part of the 4-part K = 1.04
    // tackle: drum torque = hauling-part pull × R (drum moment balance, DESIGN.md §1,
    // with the wire-rope handbook pull W/(N E)). Hand calculation: W = 10 kN,
    // E = 0.907 473, pull 10 000/(4·0.907 473) = 2754.9 N, torque 275.49 N·m.
    let (text, s_count) = tackle(4, Lead::Fixed { extra: 0 }, 1.04, 10_000.0);
    // The hauling part drops at x = 0.8 m from the top to z = 2; the drum sits beside it
    // so the rope meets the drum's side at x = 0.8 going down. Seen from the tip of the
    // axle (−y) the drum lies on the rope's left (`side: left`), and turning about −y its
    // surface there moves down, along the rope: it winds the rope in.
    let text = text
        .replace(
            "  haul: {kind: haul, at: [0.8, 0, 2]}",
            "  haul: {kind: drum, at: [0.9, 0, 2], axle: [0, -1, 0], diameter: 0.19}",
        )
        .replace(", haul]", ", {part: haul, side: left}]");
    assert!(text.contains("kind: drum"), "rig text rewritten: {text}");
    let (_, s) = solve_text(&text);
    let m = s.main();
    let pull = 10_000.0 / (4.0 * reeving_efficiency(1.04, 4, s_count));
    assert_rel(
        "drum ideal torque",
        m.ideal.value,
        10_000.0 / 4.0 * 0.1,
        1e-9,
    );
    assert_rel("drum forward torque", m.forward.value, pull * 0.1, 1e-9);
    audit_ok(&s);
}

#[test]
fn untied_drum_with_load_torque_and_journal() {
    // Drum moment balance (DESIGN.md §1) for a line passing round a drum it is not tied
    // to: a hand pulls down on the left (x = −0.1 m), the cord takes a turn and a half
    // over the drum and drops on the right to a 5 kg return weight. The drum (pitch
    // radius 0.1 m, 2 kg) carries a steady load torque of 4 N·m and a plain journal
    // (20 mm, μ = 0.2). Hand calculation, raising (forward):
    //   (P − W)·R = τ + r_f (P + W + m g),  r_f = 0.01·0.2/√1.04 = 0.001 961 2 m,
    //   W = 49.033 N, m g = 19.613 N:
    //   P = (W R + τ + r_f (W + m g))/(R − r_f) = (4.9033 + 4 + 0.13463)/0.098 039
    //     = 92.187 N.
    // Running back (load torque and weight drive the hand up), the journal's moment
    // changes sign: (P − W)·R = τ − r_f (P + W + m g) → P = (W R + τ − r_f (W + m g))/(R + r_f).
    // No slip: P/W = 1.88 < e^{0.3·3π} = 16.9 (capstan check, Euler–Eytelwein).
    let text = r#"
format: 1
title: untied drum
units: {length: m, force: N, mass: kg, torque: N*m}
ropes:
  cord: {diameter: 0.01, mu: 0.3}
parts:
  hand:   {kind: haul, at: [-0.1, 0, -1]}
  drum:   {kind: drum, at: [0, 0, 0], axle: [0, 1, 0], diameter: 0.19, mass: 2, torque: 4,
           shaft: {bearing: {kind: plain, pin_diameter: 0.02, mu: 0.2}}}
  return: {kind: weight, at: [0.1, 0, -1], mass: 5}
lines:
  cord: {rope: cord, path: [hand, {part: drum, turns: 1}, return]}
"#;
    let (rig, s) = solve_text(text);
    let m = s.main();
    let (w, mg, r, tau) = (5.0 * STANDARD_GRAVITY, 2.0 * STANDARD_GRAVITY, 0.1, 4.0);
    let r_f = 0.01 * 0.2 / 1.04_f64.sqrt();
    assert_rel("ideal pull", m.ideal.value, w + tau / r, 1e-12);
    assert_rel(
        "forward pull",
        m.forward.value,
        (w * r + tau + r_f * (w + mg)) / (r - r_f),
        1e-9,
    );
    assert_rel(
        "back pull",
        m.back.value,
        (w * r + tau - r_f * (w + mg)) / (r + r_f),
        1e-9,
    );
    assert_abs(
        "forward, N, vs the hand calculation",
        m.forward.value,
        92.187,
        1e-3,
    );
    let drum = m.forward.drums[PartId::new(1)].expect("drum torques");
    assert_rel(
        "rope torque balances load + journal",
        drum.rope,
        tau + drum.journal,
        1e-9,
    );
    assert!(
        m.forward.slipping.is_empty() && m.back.slipping.is_empty(),
        "no slip"
    );
    assert!(reeve::checks::run(&rig, &s)
        .iter()
        .all(|w| w.code != "drum-slip"));
    audit_ok(&s);
}

#[test]
fn drum_in_the_middle_of_a_line_with_turns() {
    // Guards the moment balance of a drum that a line passes over with turns: load torque
    // and drag, forward and back.
    // Hand calculation: moment balance of the drum (DESIGN.md §1),
    // (T_hand − T_load) R = M_load ± M_drag, R = 53 mm:
    // ideal 5 g + 3/0.053 = 105.637 N, forward 5 g + 4/0.053 = 124.506 N,
    // back 5 g + 2/0.053 = 86.769 N.
    let (_, s) = solve_test_rig("review/drum-middle.yaml");
    let main = s.main();
    assert_rel(
        "ideal",
        main.ideal.value,
        5.0 * STANDARD_GRAVITY + 3.0 / 0.053,
        1e-9,
    );
    assert_rel(
        "forward",
        main.forward.value,
        5.0 * STANDARD_GRAVITY + 4.0 / 0.053,
        1e-9,
    );
    assert_rel(
        "back",
        main.back.value,
        5.0 * STANDARD_GRAVITY + 2.0 / 0.053,
        1e-9,
    );
    assert!(main.forward.slipping.is_empty() && main.back.slipping.is_empty());
    audit_ok(&s);
}

#[test]
fn drive_drum_at_a_line_end_winds_in_or_pays_out_by_side() {
    // Guards the winding sense of a drive drum at a line end: `side` decides whether
    // turning forward winds the rope in or pays it out.
    // Hand calculation: 10 kg on R = 53 mm needs 10 g × 0.053 = 5.1975 N·m; drag 0.5 N·m.
    // `side: right` at the start of the path winds the rope in when the drum turns
    // forward (lifts): forward 5.6975, back 4.6975 N·m.
    let (_, s) = solve_test_rig("review/drum-end-right.yaml");
    let m = s.main();
    let lift = 10.0 * STANDARD_GRAVITY * 0.053;
    assert_rel("right ideal", m.ideal.value, lift, 1e-9);
    assert_rel("right forward", m.forward.value, lift + 0.5, 1e-9);
    assert_rel("right back", m.back.value, lift - 0.5, 1e-9);
    audit_ok(&s);
    // `side: left` at the start pays out when turning forward (lowers): the drive
    // absorbs power, every value is negative.
    let (_, s) = solve_test_rig("review/drum-end-left.yaml");
    let m = s.main();
    assert_rel("left ideal", m.ideal.value, -lift, 1e-9);
    assert_rel("left forward", m.forward.value, -lift + 0.5, 1e-9);
    assert_rel("left back", m.back.value, -lift - 0.5, 1e-9);
    audit_ok(&s);
}

#[test]
fn efficiency_never_exceeds_one_when_the_load_drives_forward() {
    // Guards the efficiency of a rig that the load drives forward: power out over power in,
    // never above one.
    // Efficiency is power out over power in (any machine-design text; DESIGN.md §3).
    // drum-end-left lowers the weight when it runs forward: the weight puts in
    // 5.1975 W per rad/s and the drum takes 4.6975 of it (0.5 to drag): forward
    // efficiency 4.6975/5.1975 = 90.38 %; running back the drum lifts the weight,
    // putting in 5.6975 for 5.1975: 91.22 %.
    let (_, s) = solve_test_rig("review/drum-end-left.yaml");
    let m = s.main();
    let lift = 10.0 * STANDARD_GRAVITY * 0.053;
    let fwd = m.forward_efficiency().unwrap();
    let back = m.back_efficiency().unwrap();
    assert_rel("forward efficiency", fwd, (lift - 0.5) / lift, 1e-9);
    assert_rel("back efficiency", back, lift / (lift + 0.5), 1e-9);
}

#[test]
fn capstan_head_drive_with_a_tailing_hand() {
    // Guards a capstan head as the drive: its torque, and the no-slip check with turns and
    // without.
    // Hand calculation: torque (98.0665 − 10) N × 0.053 m = 4.6675 N·m; the passage
    // holds 9.807 ≤ e^{0.2 × 7π} = 81.3 with 3 turns (capstan equation, Hibbeler §8.5)
    // and slips with none (limit e^{0.2π} = 1.874).
    let (_, s) = solve_test_rig("review/capstan-winch.yaml");
    let m = s.main();
    assert_rel(
        "ideal",
        m.ideal.value,
        (10.0 * STANDARD_GRAVITY - 10.0) * 0.053,
        1e-8,
    );
    assert!(m.forward.slipping.is_empty());
    let rig = edited_rig("review/capstan-winch.yaml", |text| {
        text.replace("turns: 3", "turns: 0")
    });
    let s = solve(&rig, &SolveOptions::default()).unwrap();
    let slip = s.main().forward.slipping.first().copied().unwrap();
    assert_rel("needed", slip.ratio, STANDARD_GRAVITY, 1e-8);
    assert_rel("limit", slip.limit, (0.2 * PI).exp(), 1e-8);
}

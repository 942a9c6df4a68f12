//! Capstan (Euler–Eytelwein) through the solver.

use super::*;

// ---------------------------------------------------------------------------------
// Capstan (Euler–Eytelwein) through the solver.
// ---------------------------------------------------------------------------------

/// A hawser from a ship along z = R over the top of a bollard, `turns` full turns, and
/// on along the same line to a dockworker: geometric wrap 0, total wrap 2π·turns.
fn bollard(mu: f64, turns: u32, ship_force: f64, groove: &str) -> String {
    format!(
        r#"
format: 1
title: hawser on a bollard
units: {{length: m, force: N}}
ropes:
  hawser: {{diameter: 0.04, mu: {mu}}}
parts:
  ship:    {{kind: block, at: [-20, 0, 0.15], moves: [1, 0, 0], load: {{force: {ship_force}}}}}
  bollard: {{kind: guide, at: [0, 0, 0], axle: [0, 1, 0], diameter: 0.26{groove}}}
  worker:  {{kind: haul, at: [20, 0, 0.15]}}
lines:
  hawser: {{rope: hawser, path: [ship, {{part: bollard, turns: {turns}, side: left}}, worker]}}
drive: worker
"#
    )
}

#[test]
fn hawser_on_a_bollard_beer_johnston() {
    // Source: Beer & Johnston, *Statics*, §8.10 "Belt friction", Sample Problem 8.8
    // (from memory): a hawser wrapped two full turns round a bollard; 7500 N in the
    // hawser is held by 150 N at the free end, so μ = ln(7500/150)/(4π) = 0.311; with
    // three turns the same 150 N holds 53.0 kN.
    // Through the solver: the ship pulls the hawser off (the load), the worker holds;
    // the holding force is the `back` value (the greatest pull at which it runs back).
    let mu = (7500.0_f64 / 150.0).ln() / (4.0 * PI);
    assert_abs("μ from the book's forces", mu, 0.311, 5e-4);
    let (_, s) = solve_text(&bollard(mu, 2, 7500.0, ""));
    let m = s.main();
    assert_rel("two turns: holding force, N", m.back.value, 150.0, 1e-9);
    // Forward: hauling the ship in needs 7500·50 N (hand calculation, capstan reversed).
    assert_rel(
        "two turns: hauling force, N",
        m.forward.value,
        7500.0 * 50.0,
        1e-9,
    );
    // Three turns: what 150 N holds. Hand calculation: 150·exp(0.311 29·6π) = 150·50^1.5
    // = 53 033 N.
    let (_, s) = solve_text(&bollard(mu, 3, 1.0, ""));
    let held = 150.0 / s.main().back.value;
    assert_rel(
        "three turns: tension held by 150 N",
        held,
        150.0 * 50.0_f64.powf(1.5),
        1e-9,
    );
    assert_abs("three turns, N, vs the book", held, 53_000.0, 50.0);
    audit_ok(&s);
}

#[test]
fn rope_over_a_pole_several_turns() {
    // Source: problem statement quoted from Pytel & Kiusalaas, *Engineering Mechanics:
    // Statics*, problem 6.14 (via a tutorsglobe.com question page): a machine lowered
    // into a pit on a rope making 1½ turns round an 8 in stationary pole, μs = 0.35,
    // a person pulling 50 lb. The answer here is a hand calculation, not the book's:
    // W_max = 50·exp(0.35·3π) = 50·27.076 = 1353.8 lb.
    // Build: the rope arrives along z = R over the pole and leaves along z = −R the way
    // it came (geometric wrap 180°), plus one full turn: 540° = 1½ turns.
    for (turns, total) in [(0u32, PI), (1, 3.0 * PI), (4, 9.0 * PI)] {
        let text = format!(
            r#"
format: 1
title: pole
units: {{length: in, force: lbf}}
ropes:
  rope: {{diameter: 0.5, mu: 0.35}}
parts:
  machine: {{kind: block, at: [-100, 0, 4.25], moves: [1, 0, 0], load: {{force: 1000}}}}
  pole:    {{kind: guide, at: [0, 0, 0], axle: [0, 1, 0], diameter: 8}}
  person:  {{kind: haul, at: [-100, 0, -4.25]}}
lines:
  rope: {{rope: rope, path: [machine, {{part: pole, turns: {turns}}}, person]}}
"#
        );
        let (_, s) = solve_text(&text);
        let m = s.main();
        let ratio = (0.35 * total).exp();
        // The person holds the machine: back value = 1000/ratio lb.
        assert_rel(
            &format!("{turns} extra turns: holding pull, lb"),
            m.back.value / LBF,
            1000.0 / ratio,
            1e-9,
        );
        assert_rel(
            &format!("{turns} extra turns: hauling pull, lb"),
            m.forward.value / LBF,
            1000.0 * ratio,
            1e-9,
        );
        if turns == 1 {
            let w_max = 50.0 * ratio;
            assert_abs(
                "1½ turns: W_max, lb, vs the hand calculation",
                w_max,
                1353.8,
                0.1,
            );
        }
    }
}

#[test]
fn v_groove_wedge_factor() {
    // Source: V-belt / grooved-sheave wedge factor μ' = μ/sin(β/2) (Shigley, *Mechanical
    // Engineering Design*, flexible elements; Beer & Johnston §8.10 V-belt remark; from
    // memory), with the capstan equation.
    // Hand calculation: β = 40°, μ = 0.2: μ' = 0.2/sin 20° = 0.584 761; two full turns:
    // ratio exp(0.584 761·4π) = exp(7.348 28) = 1553.9.
    let (_, s) = solve_text(&bollard(0.2, 2, 7500.0, ", groove: {angle: 40}"));
    let mu_eff = 0.2 / 20f64.to_radians().sin();
    let ratio = (mu_eff * 4.0 * PI).exp();
    assert_rel(
        "V-groove: holding force, N",
        s.main().back.value,
        7500.0 / ratio,
        1e-9,
    );
    assert_abs("V-groove ratio vs the hand calculation", ratio, 1553.9, 0.5);
}

#[test]
fn two_fixed_drums_hibbeler() {
    // Source: Hibbeler, *Engineering Mechanics: Statics*, §8.5 "Frictional forces on flat
    // belts", Example 8.8 (from memory): a cord that can carry at most 500 N passes over
    // two fixed drums B and C (μs = 0.25), turning 135° on each, and lifts a cylinder:
    // T2 = 500/e^{0.25·3π/4} = 277.4 N, T3 = 153.9 N, m = 15.7 kg (book, g = 9.81).
    // (The book's free pulley A only redirects the cord and is left out.)
    // Build: the cord rises vertically to drum C (over it, clockwise), runs down-right at
    // −45° to drum B (under it, anticlockwise) and leaves vertically up to the hauler.
    let r = 0.05; // pitch radius, m (tread 90 mm + rope 10 mm)
    let inv = 0.5_f64.sqrt();
    let (ux, uz) = (inv, -inv); // span direction C → B
    let (nx, nz) = (-uz, ux); // its left normal
    let span = 1.0;
    let (bx, bz) = (2.0 * r * nx + span * ux, 2.0 * r * nz + span * uz);
    let text = format!(
        r#"
format: 1
title: two fixed drums
units: {{length: m, force: N, mass: kg}}
ropes:
  cord: {{diameter: 0.01, mu: 0.25}}
parts:
  cylinder: {{kind: weight, at: [{cx}, 0, -3]}}
  c:        {{kind: guide, at: [0, 0, 0], axle: [0, 1, 0], diameter: 0.09}}
  b:        {{kind: guide, at: [{bx}, 0, {bz}], axle: [0, 1, 0], diameter: 0.09}}
  hand:     {{kind: haul, at: [{hx}, 0, 3], force: 500}}
lines:
  cord: {{rope: cord, path: [cylinder, c, b, hand]}}
drive: hand
solve_for: cylinder
"#,
        cx = -r,
        hx = bx + r,
    );
    let (_, s) = solve_text(&text);
    let m = s.main();
    let wraps: Vec<f64> = s.geometry.lines[LineId::new(0)].entries[1..3]
        .iter()
        .map(|e| e.wrap.to_degrees())
        .collect();
    for w in &wraps {
        assert_abs("wrap, °", *w, 135.0, 1e-9);
    }
    // The most the 500 N hauler lifts: forward value of the load unknown.
    let expected = 500.0 * (-0.25 * 1.5 * PI).exp() / STANDARD_GRAVITY;
    assert_rel(
        "largest mass, kg (hand calculation)",
        m.forward.value,
        expected,
        1e-9,
    );
    let book = 500.0 * (-0.25 * 1.5 * PI).exp() / 9.81;
    assert_abs("the book's figure, kg (g = 9.81)", book, 15.7, 0.05);
    assert_abs("largest mass, kg, vs the book", m.forward.value, 15.7, 0.05);
    let t2 = m.forward.tension[LineId::new(0)][1];
    assert_abs("T2, N, vs the book", t2, 277.4, 0.1);
    audit_ok(&s);
}

#[test]
fn load_unknown_over_a_capstan_bar() {
    // Guards forward and back for a load unknown (forward the greatest load moved, back the
    // least that runs back) and their efficiencies.
    // Capstan equation (Euler–Eytelwein; Hibbeler, Statics, §8.5): 100 N pull over a
    // bar with 180° wrap, μ = 0.25 (ends 1e6 mm away, so the wrap is π to 1e-9).
    // Forward = greatest mass lifted = 100/(g e^{0.25π}) = 4.6493 kg; back = least mass
    // that runs back = 100 e^{0.25π}/g = 22.365 kg; ideal 100/g = 10.197 kg.
    let (_, s) = solve_test_rig("review/load-unknown-capstan.yaml");
    let m = s.main();
    let e = (0.25 * PI).exp();
    assert_rel("ideal", m.ideal.value, 100.0 / STANDARD_GRAVITY, 1e-9);
    assert_rel(
        "forward",
        m.forward.value,
        100.0 / STANDARD_GRAVITY / e,
        1e-6,
    );
    assert_rel("back", m.back.value, 100.0 / STANDARD_GRAVITY * e, 1e-6);
    // Efficiencies (DESIGN.md §3 for a load unknown): forward/ideal and ideal/back.
    assert_rel(
        "forward eff",
        m.forward_efficiency().unwrap(),
        1.0 / e,
        1e-6,
    );
    assert_rel("back eff", m.back_efficiency().unwrap(), 1.0 / e, 1e-6);
    assert!(!m.self_locking());
    audit_ok(&s);
}

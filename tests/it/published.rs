//! Analytic checks of the whole solver (rig text → `load_str` → `solve`) against
//! published worked examples and handbook formulas. Every check names its source beside
//! it; values known only from memory say so, hand calculations show their arithmetic.
//! The small rigs of `tests/rigs/review/` (signs, stalls, drums, load unknowns,
//! sub-rigs) are checked here against hand calculations too.

use reeve::model::{LineId, PartId};
use std::f64::consts::PI;

use reeve::math::STANDARD_GRAVITY;
use reeve::solve::{solve, SolveOptions, Status, SubRigSolution};

use crate::support::{assert_abs, assert_rel, audit_ok, edited_rig, solve_test_rig, solve_text};

/// One pound-force in newtons (exact by definition: 0.453 592 37 kg × 9.806 65 m/s²).
const LBF: f64 = 4.448_221_615_260_5;

// ---------------------------------------------------------------------------------
// Axle friction: the friction circle through the whole solver.
// ---------------------------------------------------------------------------------

/// A pulley on a fixed shaft: load hanging on the left, pull on the right.
/// Pitch diameter 4 in (tread 3.75 in + rope 0.25 in), shaft 2 in.
fn journal_pulley(mu: f64, leave: &str) -> String {
    format!(
        r#"
format: 1
title: pulley on a fixed shaft
units: {{length: in, force: lbf, mass: lb}}
ropes:
  rope: {{diameter: 0.25, mu: 0.3}}
parts:
  load:   {{kind: block, at: [-2, 0, -60], moves: [0, 0, 1], load: {{force: 500}}}}
  pulley: {{kind: sheave, at: [0, 0, 0], axle: [0, 1, 0], diameter: 3.75,
           bearing: {{kind: plain, pin_diameter: 2, mu: {mu}}}}}
  hand:   {{kind: haul, at: {leave}}}
lines:
  rope: {{rope: rope, path: [load, pulley, hand]}}
drive: hand
"#
    )
}

#[test]
fn journal_bearing_raise_hold_lower_beer_johnston() {
    // Source: Beer & Johnston, *Vector Mechanics for Engineers: Statics*, §8.7 "Journal
    // bearings. Axle friction", Sample Problem 8.6 (reproduced from memory; the search
    // tool did not find the page): a pulley of 4 in diameter on a fixed 2 in shaft,
    // μs = 0.20, 500 lb load. The book takes r_f ≈ r μ = 0.20 in and finds
    // (a) P = 611 lb to start raising the load and (b) P = 409 lb to hold it.
    // Our model uses the exact r_f = r sin(atan μ); to reproduce the book's r_f = 0.20 in
    // we pass μ = tan(asin 0.2) = 0.2/√0.96 = 0.204 124.
    // Hand calculation: raising, (P − 500)·2 = 0.2·(P + 500) → P = 500·2.2/1.8 = 611.11 lb;
    // holding (= lowering at constant speed), (500 − P)·2 = 0.2·(P + 500) → P = 500·1.8/2.2
    // = 409.09 lb.
    let mu = 0.2 / 0.96_f64.sqrt();
    let (_, s) = solve_text(&journal_pulley(mu, "[2, 0, -60]"));
    let m = s.main();
    let (ideal, raise, hold) = (
        m.ideal.value / LBF,
        m.forward.value / LBF,
        m.back.value / LBF,
    );
    assert_rel("ideal pull, lb (500 lb, no friction)", ideal, 500.0, 1e-9);
    assert_rel(
        "raise, lb (hand calc 500·2.2/1.8)",
        raise,
        500.0 * 2.2 / 1.8,
        1e-9,
    );
    assert_rel(
        "hold/lower, lb (hand calc 500·1.8/2.2)",
        hold,
        500.0 * 1.8 / 2.2,
        1e-9,
    );
    // Published, to the book's three figures.
    assert_abs("raise, lb, vs the book", raise, 611.0, 0.5);
    assert_abs("hold, lb, vs the book", hold, 409.0, 0.5);
    // With the exact friction circle and μ = 0.20 itself: r_f = 1·0.2/√1.04 = 0.196 116 in,
    // P = 500 (2 + r_f)/(2 − r_f) = 608.74 lb (hand calculation): within 0.4 % of the book.
    let (_, s) = solve_text(&journal_pulley(0.2, "[2, 0, -60]"));
    let r_f = 0.2 / 1.04_f64.sqrt();
    let raise = s.main().forward.value / LBF;
    assert_rel(
        "raise with exact r_f, lb",
        raise,
        500.0 * (2.0 + r_f) / (2.0 - r_f),
        1e-9,
    );
    assert_abs(
        "exact model over the book's 611 lb",
        raise / 611.0,
        1.0,
        0.005,
    );
    audit_ok(&s);
}

#[test]
fn journal_bearing_horizontal_pull() {
    // The same pulley (Beer & Johnston Sample Problem 8.6 setting, from memory) with the
    // rope leaving the top of the pulley horizontally: wrap 90°.
    // Hand calculation: pin load |P x̂ − W ẑ| = √(P² + W²);
    // (P − W)·2 = 0.2·√(P² + W²). With P = W(1 + x): 10x = √(2 + 2x + x²),
    // 99x² − 2x − 2 = 0, x = (2 + √796)/198 = 0.152 594, P = 576.30 lb.
    let mu = 0.2 / 0.96_f64.sqrt();
    let (_, s) = solve_text(&journal_pulley(mu, "[60, 0, 2]"));
    let x = (2.0 + 796.0_f64.sqrt()) / 198.0;
    let raise = s.main().forward.value / LBF;
    assert_rel(
        "horizontal raise, lb (hand calc)",
        raise,
        500.0 * (1.0 + x),
        1e-9,
    );
    // The closed-form ratio at 90° for ρ = 0.1: b = 1/0.99, k = b + √(b² − 1).
    let b: f64 = 1.0 / 0.99;
    let k = b + (b * b - 1.0).sqrt();
    assert_rel("ratio at 90°", raise / 500.0, k, 1e-9);
    audit_ok(&s);
}

/// Pulley with its own weight: 1 ft diameter, 4 lb, 1 in axle, μ = 0.2, 20 lb block.
fn heavy_pulley(leave: &str) -> String {
    format!(
        r#"
format: 1
title: heavy pulley
units: {{length: in, force: lbf, mass: lb}}
ropes:
  rope: {{diameter: 0.5, mu: 0.3}}
parts:
  block:  {{kind: block, at: [-6, 0, -40], moves: [0, 0, 1], load: {{force: 20}}}}
  pulley: {{kind: sheave, at: [0, 0, 0], axle: [0, 1, 0], diameter: 11.5, mass: 4,
           bearing: {{kind: plain, pin_diameter: 1, mu: 0.2}}}}
  hand:   {{kind: haul, at: {leave}}}
lines:
  rope: {{rope: rope, path: [block, pulley, hand]}}
drive: hand
"#
    )
}

#[test]
fn sheave_weight_in_the_pin_load_parallel_spans() {
    // Source: Hibbeler, *Engineering Mechanics: Statics*, §8.7 "Frictional forces on
    // journal bearings", problem 8-120 (14th ed.; the setting as quoted in
    // src/friction/mod.rs, not re-checked against the book): 1 ft pulley weighing 4 lb
    // on a 1 in axle, μ = 0.20, lifting a 20 lb block.
    // Independent computation (hand calculation): r_f = 0.5·0.2/√1.04 = 0.098 058 in;
    // raising, (P − 20)·6 = r_f (P + 20 + 4) → P = (120 + 24 r_f)/(6 − r_f) = 20.731 lb;
    // lowering, (20 − P)·6 = r_f (20 + P + 4) → P = (120 − 24 r_f)/(6 + r_f) = 19.293 lb.
    let (_, s) = solve_text(&heavy_pulley("[6, 0, -40]"));
    let r_f = 0.5 * 0.2 / 1.04_f64.sqrt();
    let m = s.main();
    let raise = m.forward.value / LBF;
    let lower = m.back.value / LBF;
    assert_rel(
        "raise with weight, lb",
        raise,
        (120.0 + 24.0 * r_f) / (6.0 - r_f),
        1e-9,
    );
    assert_rel(
        "lower with weight, lb",
        lower,
        (120.0 - 24.0 * r_f) / (6.0 + r_f),
        1e-9,
    );
    assert_abs("raise with weight, lb, vs 20.731 lb", raise, 20.731, 1e-3);
    // Pin load, forward: P + 20 + 4 lb straight down.
    let pulley = PartId::new(1);
    let pin = m.forward.pin_load[pulley].expect("pin load") / LBF;
    assert_rel("pin load, lb", pin.norm(), raise + 24.0, 1e-9);
    assert!(pin.z < 0.0, "pin load points down: {pin:?}");
    audit_ok(&s);
}

/// Root of an increasing function by bisection (test-side, independent of the crate).
fn bisect(f: impl Fn(f64) -> f64, mut lo: f64, mut hi: f64) -> f64 {
    assert!(f(lo) < 0.0 && f(hi) > 0.0, "bad bracket");
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if f(mid) < 0.0 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

#[test]
fn sheave_weight_in_the_pin_load_right_angle() {
    // The heavy pulley of Hibbeler 8-120 (as above) with the rope leaving the top
    // horizontally (wrap 90°), so the weight no longer lines up with the spans.
    // Independent computation: solve (P − 20)·6 = r_f |P x̂ − 20 ẑ − 4 ẑ| by bisection,
    // i.e. the friction-circle moment balance about the axle (Beer & Johnston §8.7).
    let (_, s) = solve_text(&heavy_pulley("[40, 0, 6]"));
    let r_f = 0.5 * 0.2 / 1.04_f64.sqrt();
    let raise = bisect(
        |p| (p - 20.0) * 6.0 - r_f * (p * p + 24.0 * 24.0).sqrt(),
        20.0,
        40.0,
    );
    let lower = bisect(
        |p| -((20.0 - p) * 6.0 - r_f * (p * p + 24.0 * 24.0).sqrt()),
        10.0,
        20.0,
    );
    let m = s.main();
    assert_rel("raise, 90° wrap, lb", m.forward.value / LBF, raise, 1e-9);
    assert_rel("lower, 90° wrap, lb", m.back.value / LBF, lower, 1e-9);
    audit_ok(&s);
}

#[test]
fn rolling_bearing_sheave() {
    // Source: rolling-bearing catalogue friction model M = μ P d/2 (SKF general
    // catalogue, "Friction", constant-coefficient estimate, from memory; μ ≈ 0.0015 for
    // a deep-groove ball bearing), DESIGN.md §1.
    // Hand calculation: bore 20 mm, μ = 0.0015 → r_f = 0.0015·0.010 = 1.5e-5 m; pitch
    // R = (90 + 10)/2 mm = 0.05 m; ρ = 3e-4; k(180°) = (1 + ρ)/(1 − ρ) = 1.000 600 18;
    // 1000 N load: forward 1000.600 18 N, back 999.400 18 N.
    let text = r#"
format: 1
title: rolling sheave
units: {length: mm, force: N}
ropes:
  wire: {diameter: 10, mu: 0.1}
parts:
  load:   {kind: block, at: [-50, 0, -2000], moves: [0, 0, 1], load: {force: 1000}}
  sheave: {kind: sheave, at: [0, 0, 0], axle: [0, 1, 0], diameter: 90,
           bearing: {kind: rolling, bore: 20, mu: 0.0015}}
  hand:   {kind: haul, at: [50, 0, -2000]}
lines:
  fall: {rope: wire, path: [load, sheave, hand]}
"#;
    let (_, s) = solve_text(text);
    let rho: f64 = 0.0015 * 0.010 / 0.05;
    let k = (1.0 + rho) / (1.0 - rho);
    let m = s.main();
    assert_rel("rolling forward, N", m.forward.value, 1000.0 * k, 1e-12);
    assert_rel("rolling back, N", m.back.value, 1000.0 / k, 1e-12);
    assert_rel(
        "rolling forward efficiency",
        m.forward_efficiency().unwrap(),
        1.0 / k,
        1e-12,
    );
    audit_ok(&s);
}

/// Friction-circle radius `r sin(atan μ)` (Beer & Johnston, *Statics*, §8.7).
fn friction_circle(r: f64, mu: f64) -> f64 {
    r * mu / (1.0 + mu * mu).sqrt()
}

/// Asserts that forward and back settle and that no sheave stalls.
fn no_stall(sub: &SubRigSolution) {
    for case in [&sub.forward, &sub.back] {
        assert!(
            matches!(case.status, Status::Converged { iterations } if iterations < 100),
            "{}: {:?}",
            case.case.name(),
            case.status
        );
        assert!(
            case.stalled.is_empty(),
            "{}: stalled {:?}",
            case.case.name(),
            case.stalled
        );
    }
}

#[test]
fn moving_sheave_with_own_weight_forward_and_back() {
    // Guards the weight of a sheave on a moving block: it hangs on the falls, not on the
    // pin, forward and back.
    // Hand calculation, falls taken as vertical (the ends are 1e6 mm away, so the
    // tangent tilt is below 1e-9): the block (40 kg load + 2 kg sheave) hangs on
    // T1 + P = 42 g = 411.879 N; the pin carries the rope pulls up less the sheave's
    // own 2 g down, i.e. 40 g = 392.266 N; r_f = 5 mm × 0.2/√1.04 = 0.980 58 mm,
    // R = 33 mm, so |P − T1| = r_f × 40 g / R = 11.656 N.
    // Forward P = (411.879 + 11.656)/2 = 211.77 N, back (411.879 − 11.656)/2 = 200.11 N.
    let rig = edited_rig("review/moving-sheave-weight.yaml", |text| {
        text.replace("[-33, 0, 2000]", "[-33, 0, 1e6]")
            .replace("[33, 0, 2000]", "[33, 0, 1e6]")
    });
    let s = solve(&rig, &SolveOptions::default()).unwrap();
    let main = s.main();
    let rf = friction_circle(0.005, 0.2);
    let diff = rf * 40.0 * STANDARD_GRAVITY / 0.033;
    assert_rel("ideal", main.ideal.value, 21.0 * STANDARD_GRAVITY, 1e-8);
    assert_rel(
        "forward",
        main.forward.value,
        (42.0 * STANDARD_GRAVITY + diff) / 2.0,
        1e-8,
    );
    assert_rel(
        "back",
        main.back.value,
        (42.0 * STANDARD_GRAVITY - diff) / 2.0,
        1e-8,
    );
    no_stall(main);
    audit_ok(&s);
}

#[test]
fn sheave_weight_that_unloads_the_pin_does_not_stall_it() {
    // Guards the stall test of a heavy sheave: the pin load with the weight in it, not the
    // weightless ratio, decides whether it turns.
    // Hand calculation (rig header): r_f = 99 mm × 5/√26 = 97.077 mm, R = 103 mm (a pin
    // just inside the tread: a larger one is refused). The ropes carry the 10 kg sheave,
    // the pin only the 0.5 kg load:
    // (P − T1) R = r_f × 0.5 g, P + T1 = 10.5 g → P = 53.796 N, T1 = 49.174 N,
    // ratio 1.0940, below the groove's capstan ratio e^{0.2 π} = 1.874 (Euler–Eytelwein,
    // Hibbeler §8.5), so the sheave turns. The weightless ratio (1 + ρ)/(1 − ρ) = 33.8
    // alone would say it stalls.
    let (_, s) = solve_test_rig("review/sheave-weight-unloads-pin.yaml");
    let main = s.main();
    let rf = friction_circle(0.099, 5.0);
    let diff = rf * 0.5 * STANDARD_GRAVITY / 0.103;
    // The falls run to points 1 km up, so they are vertical to about (R/L)² = 1e-8.
    assert_rel(
        "forward",
        main.forward.value,
        (10.5 * STANDARD_GRAVITY + diff) / 2.0,
        1e-7,
    );
    assert_rel(
        "back",
        main.back.value,
        (10.5 * STANDARD_GRAVITY - diff) / 2.0,
        1e-7,
    );
    no_stall(main);
    audit_ok(&s);
}

#[test]
fn block_load_unknown_under_a_heavy_moving_sheave() {
    // Guards a mass asked for on a block under a heavy moving sheave: the sheave weighs on
    // the falls, not on the pin.
    // Hand calculation (rig header): r_f/R = 0.980 58 mm/33 mm = 0.029 715; falls carry
    // (m + 2) g, the pin m g; with P = 250 N:
    // forward m = (500 − 2 g)/(g (1 + r_f/R)) = 47.572 kg (greatest load lifted),
    // back m = (500 − 2 g)/(g (1 − r_f/R)) = 50.486 kg (least load that runs back).
    let (_, s) = solve_test_rig("review/block-unknown.yaml");
    let m = s.main();
    let q = friction_circle(0.005, 0.2) / 0.033;
    assert_rel("ideal", m.ideal.value, 500.0 / STANDARD_GRAVITY - 2.0, 1e-8);
    assert_rel(
        "forward",
        m.forward.value,
        (500.0 - 2.0 * STANDARD_GRAVITY) / (STANDARD_GRAVITY * (1.0 + q)),
        1e-8,
    );
    assert_rel(
        "back",
        m.back.value,
        (500.0 - 2.0 * STANDARD_GRAVITY) / (STANDARD_GRAVITY * (1.0 - q)),
        1e-8,
    );
    assert!(m.forward_efficiency().unwrap() < 1.0 && m.back_efficiency().unwrap() < 1.0);
    no_stall(m);
    audit_ok(&s);
}

// ---------------------------------------------------------------------------------
// Multi-part tackles against the wire-rope handbook reeving formula.
// ---------------------------------------------------------------------------------

/// Where the hauling part leaves.
#[derive(Clone, Copy, Debug)]
enum Lead {
    /// From the fixed block, then through `extra` lead sheaves.
    Fixed { extra: usize },
    /// From the moving block (the hauling part is itself one of the `N` parts).
    Moving,
}

/// A planar N-part tackle with parallel vertical falls, every sheave rated `K` and
/// turned 180°. Falls stand at x = j·a; fall `j` runs up when `N − 1 − j` is even, so
/// the last one always runs up. Between falls the rope turns over a fixed sheave at the
/// top or round a sheave of the hook block at the bottom. Sheaves lie side by side in
/// the plane of the rope, so every fleet angle is 0 and the velocity ratio is exact.
/// Returns the rig text and S, the number of sheaves from dead end to hauling part.
fn tackle(n: usize, lead: Lead, factor: f64, load_n: f64) -> (String, usize) {
    let a = 0.2; // fall spacing, m; pitch radius a/2 with a 10 mm rope: tread 190 mm
    let (top, bottom) = (5.0, 1.0);
    let up = |j: usize| (n - 1 - j) % 2 == 0;
    let sheave = |name: &str, x: f64, z: f64, block: bool| {
        format!(
            "  {name}: {{kind: sheave, at: [{x}, 0, {z}], axle: [0, 1, 0], diameter: 0.19, \
             bearing: {{kind: rated, factor: {factor}}}{}}}\n",
            if block { ", block: hook" } else { "" }
        )
    };
    let mut parts = format!(
        "  hook: {{kind: block, at: [0, 0, {bottom}], moves: [0, 0, 1], load: {{force: {load_n}}}}}\n"
    );
    let mut path = Vec::new();
    if up(0) {
        path.push("hook".to_string());
    } else {
        parts += &format!("  dead: {{kind: anchor, at: [0, 0, {top}]}}\n");
        path.push("dead".to_string());
    }
    let mut sheaves = 0;
    for j in 0..n - 1 {
        let name = format!("s{j}");
        let x = (j as f64 + 0.5) * a;
        if up(j) {
            parts += &sheave(&name, x, top, false);
        } else {
            parts += &sheave(&name, x, bottom, true);
        }
        path.push(name);
        sheaves += 1;
    }
    match lead {
        Lead::Moving => {
            let x = (n - 1) as f64 * a;
            parts += &format!("  haul: {{kind: haul, at: [{x}, 0, {}]}}\n", top + 1.0);
        }
        Lead::Fixed { extra } => {
            // Over the last fixed sheave, then down/up through the lead sheaves.
            let mut going_up = true;
            for i in 0..=extra {
                let name = format!("lead{i}");
                let x = (n as f64 - 0.5 + i as f64) * a;
                let z = if going_up { top } else { 0.5 };
                parts += &sheave(&name, x, z, false);
                path.push(name);
                sheaves += 1;
                going_up = !going_up;
            }
            let x = (n + extra) as f64 * a;
            // After the last turn the rope runs down if it went over a top sheave.
            let z = if going_up { 3.0 } else { 2.0 };
            parts += &format!("  haul: {{kind: haul, at: [{x}, 0, {z}]}}\n");
        }
    }
    path.push("haul".to_string());
    let text = format!(
        "format: 1\ntitle: {n}-part tackle\nunits: {{length: m, force: N}}\n\
         ropes:\n  wire: {{diameter: 0.01, mu: 0.1}}\nparts:\n{parts}\
         lines:\n  fall: {{rope: wire, path: [{}]}}\ndrive: haul\n",
        path.join(", ")
    );
    (text, sheaves)
}

/// Wire-rope handbook reeving efficiency `E = (K^N − 1)/(K^S N (K − 1))`.
fn reeving_efficiency(k: f64, n: usize, s: usize) -> f64 {
    (k.powi(n as i32) - 1.0) / (k.powi(s as i32) * n as f64 * (k - 1.0))
}

fn check_tackle(n: usize, lead: Lead, k: f64) {
    // Source: wire-rope handbook reeving formula (e.g. Wire Rope Users Manual, Wire Rope
    // Technical Board, "Efficiency of wire rope reeving"; from memory):
    // E = (K^N − 1)/(K^S·N·(K − 1)), hauling-part pull = W/(N·E), DESIGN.md §1.
    // Lowering (friction reversed) is the same formula with K → 1/K (hand derivation:
    // every passage ratio inverts).
    let w = 10_000.0;
    let (text, s_count) = tackle(n, lead, k, w);
    let expected_s = match lead {
        Lead::Fixed { extra } => n + extra,
        Lead::Moving => n - 1,
    };
    assert_eq!(
        s_count, expected_s,
        "tackle builder: S for N = {n}, {lead:?}"
    );
    let (_, sol) = solve_text(&text);
    let m = sol.main();
    let e = reeving_efficiency(k, n, s_count);
    let e_back = reeving_efficiency(1.0 / k, n, s_count);
    let what = format!("N = {n}, S = {s_count}, K = {k}, {lead:?}");
    assert_rel(
        &format!("{what}: ideal pull W/N"),
        m.ideal.value,
        w / n as f64,
        1e-9,
    );
    assert_rel(
        &format!("{what}: pull W/(N E)"),
        m.forward.value,
        w / (n as f64 * e),
        1e-9,
    );
    assert_rel(
        &format!("{what}: efficiency E"),
        m.forward_efficiency().unwrap(),
        e,
        1e-9,
    );
    assert_rel(
        &format!("{what}: lowering pull"),
        m.back.value,
        w / (n as f64 * e_back),
        1e-9,
    );
    assert_rel(
        &format!("{what}: velocity ratio"),
        m.velocity_ratio.unwrap(),
        n as f64,
        1e-9,
    );
    audit_ok(&sol);
}

#[test]
fn tackles_plain_bearings_k_1_09() {
    for n in 1..=8 {
        for extra in 0..=2 {
            check_tackle(n, Lead::Fixed { extra }, 1.09);
        }
    }
    for n in 2..=8 {
        check_tackle(n, Lead::Moving, 1.09);
    }
}

#[test]
fn tackles_roller_bearings_k_1_04() {
    for n in 1..=8 {
        for extra in 0..=2 {
            check_tackle(n, Lead::Fixed { extra }, 1.04);
        }
    }
    for n in 2..=8 {
        check_tackle(n, Lead::Moving, 1.04);
    }
}

#[test]
fn tackle_spot_values_by_hand() {
    // Hand calculation, N = 4, S = 4, K = 1.09: K⁴ = 1.411 582; E = 0.411 582/(1.411 582
    // · 4 · 0.09) = 0.809 94; pull = W/(4·0.809 94) = 0.308 66 W.
    let (text, _) = tackle(4, Lead::Fixed { extra: 0 }, 1.09, 1000.0);
    let (_, s) = solve_text(&text);
    assert_abs(
        "4-part K = 1.09, N, vs the hand calculation",
        s.main().forward.value,
        308.66,
        0.01,
    );
}

#[test]
fn oilfield_ten_line_fast_line_factor() {
    // Source: API RP 9B (wire rope: application, care and use), §2.3.3.4, fast-line
    // factor for block-and-tackle reeving (from memory): 10 lines strung,
    // roller-bearing sheaves K = 1.04, efficiency 0.811, fast-line factor 0.123 as
    // printed (its formula gives 0.123 29; fast-line tension = factor × hook load). The fast line leaves the crown (fixed)
    // block, the dead line is anchored: S = N = 10.
    // Hand calculation: 1.04¹⁰ = 1.480 244; E = 0.480 244/(1.480 244·10·0.04) = 0.811 09;
    // factor = 1/(10·0.811 09) = 0.123 29.
    let hook_load = 2.0e6; // N
    let (text, s_count) = tackle(10, Lead::Fixed { extra: 0 }, 1.04, hook_load);
    assert_eq!(s_count, 10);
    let (_, s) = solve_text(&text);
    let factor = s.main().forward.value / hook_load;
    assert_abs("fast-line factor vs the table", factor, 0.123, 5e-4);
    assert_rel(
        "fast-line factor vs hand calculation",
        factor,
        0.123_29,
        1e-4,
    );
    let e = s.main().forward_efficiency().unwrap();
    assert_abs("efficiency vs the table", e, 0.811, 5e-4);
}

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

// ---------------------------------------------------------------------------------
// Virtual work: slopes, oblique pulls, sub-rigs, no friction.
// ---------------------------------------------------------------------------------

#[test]
fn cart_on_a_slope_pulled_horizontally() {
    // Guards virtual work for a block whose travel is at an angle to its rope and to
    // gravity.
    // Hand calculation (virtual work): P cos 30° = m g sin 30°, P = 100 g tan 30° =
    // 566.19 N; the cart moves 1/cos 30° = 1.1547 m per metre of rope.
    let (_, s) = solve_test_rig("review/slope-cart.yaml");
    let m = s.main();
    assert_rel(
        "ideal",
        m.ideal.value,
        100.0 * STANDARD_GRAVITY * (PI / 6.0).tan(),
        1e-9,
    );
    assert_rel(
        "velocity ratio",
        m.velocity_ratio.unwrap(),
        (PI / 6.0).cos(),
        1e-9,
    );
    audit_ok(&s);
}

#[test]
fn haul_pulled_off_its_rope_reports_the_component_along_pull() {
    // Guards present behaviour (a design question left open): a haul pulled off its rope
    // reports the component along `pull`.
    // Present behaviour, left to the lead as a design question: a haul whose `pull` is
    // 60° off its rope moves along `pull`, so the effort is the rope tension's component
    // along it (virtual work, hand calculation): T = 10 g = 98.07 N, effort
    // T cos 60° = 49.03 N, and the "mechanical advantage" is 2 with no tackle at all.
    let (_, s) = solve_test_rig("review/haul-oblique.yaml");
    let m = s.main();
    assert_rel("effort", m.ideal.value, 10.0 * STANDARD_GRAVITY * 0.5, 1e-9);
    assert_rel(
        "tension",
        m.ideal.tension[LineId::new(0)][0],
        10.0 * STANDARD_GRAVITY,
        1e-9,
    );
    assert_rel("MA", m.mechanical_advantage().unwrap(), 2.0, 1e-9);
}

#[test]
fn two_independent_sub_rigs_both_solved() {
    // Guards independent sub-rigs: each is solved with its own drive.
    // Capstan equation (Hibbeler §8.5), 180° wrap: line b (the drive) forward
    // 20 g e^{0.1π} = 268.53 N; line a forward 10 g e^{0.25π} = 215.09 N.
    let (rig, s) = solve_test_rig("review/two-subrigs.yaml");
    assert_eq!(s.subrigs.len(), 2);
    let b = &s.subrigs[0];
    assert_eq!(rig.parts[b.drive].name, "hand.b");
    assert_rel(
        "b forward",
        b.forward.value,
        20.0 * STANDARD_GRAVITY * (0.1 * PI).exp(),
        1e-6,
    );
    let a = &s.subrigs[1];
    assert_eq!(rig.parts[a.drive].name, "hand.a");
    assert_rel(
        "a forward",
        a.forward.value,
        10.0 * STANDARD_GRAVITY * (0.25 * PI).exp(),
        1e-6,
    );
    audit_ok(&s);
}

#[test]
fn frictionless_equals_ideal_exactly_in_odd_units() {
    // Guards zero friction in units other than SI: forward and back are the ideal to the
    // last bit.
    // μ = 0 everywhere: forward and back are the ideal to the last bit (DESIGN.md §3:
    // friction reverses between forward and back, and there is none). Hand calculation
    // (virtual work): 2:1 on (40 + 2) kg, falls vertical to 1e-9: 21 g = 205.94 N.
    let (_, s) = solve_test_rig("review/frictionless.yaml");
    let m = s.main();
    assert_eq!(m.forward.value, m.ideal.value);
    assert_eq!(m.back.value, m.ideal.value);
    assert_rel("ideal", m.ideal.value, 21.0 * STANDARD_GRAVITY, 1e-6);
    audit_ok(&s);
}

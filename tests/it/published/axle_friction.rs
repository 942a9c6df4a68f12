//! Axle friction: the friction circle through the whole solver.

use super::*;

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

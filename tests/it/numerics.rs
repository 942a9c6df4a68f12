//! Numerical robustness of the statics: tension coefficients that span many orders of
//! magnitude (a long chain of friction passages) must not lose the small equations.

use reeve::model::LineId;
use reeve::rig::load_str;
use reeve::solve::{solve, SolveOptions};

use crate::support::generators::{cascade, chain, tackle, CASCADE_LOAD_KG, G};
use crate::support::{assert_abs, assert_rel, run::reeve_on};

#[test]
fn a_long_capstan_chain_keeps_the_capstan_product() {
    // Capstan equation (Euler–Eytelwein): over passages in series the ratios multiply,
    // so the forward pull is W·exp(μ·Σφ) and the back pull W·exp(−μ·Σφ), however many
    // orders of magnitude that spans.
    for (n, mu) in [(10, 0.1), (60, 0.1), (200, 0.1), (200, 0.0)] {
        let rig = load_str(&chain(n, mu), "chain.yaml").unwrap();
        let solution = solve(&rig, &SolveOptions::default()).unwrap();
        let total_wrap: f64 = solution.geometry.lines[LineId::new(0)]
            .entries
            .iter()
            .map(|e| e.wrap)
            .sum();
        let weight = 9.80665;
        let main = solution.main();
        let expected_forward = weight * (mu * total_wrap).exp();
        let expected_back = weight * (-mu * total_wrap).exp();
        assert_rel(
            &format!("{n} guides: forward vs the capstan product"),
            main.forward.value,
            expected_forward,
            1e-9,
        );
        // The back pull can be far below round-off of the load (1e-19 N against 10 N):
        // compare it to within round-off of the weight.
        assert_abs(
            &format!("{n} guides: back vs the capstan product"),
            main.back.value,
            expected_back,
            1e-9 * expected_back.max(weight * 1e-6),
        );
        assert!(
            main.forward.audit_residual < 1e-9,
            "{n}: audit {}",
            main.forward.audit_residual
        );
    }
}

#[test]
fn the_benchmark_tackles_match_the_handbook_reeving_formula() {
    // Wire-rope handbook reeving efficiency (DESIGN.md §1): E = (K^N − 1)/(K^S·N·(K − 1)),
    // pull = W/(N·E); K = 1.04 as the generator rates every sheave. With an even number
    // of sheaves the hauling part leaves the fixed block (S = N), with an odd number the
    // moving block (N = sheaves + 1, S = N − 1). This keeps the benchmark's rigs honest.
    let (k, weight) = (1.04_f64, 500.0 * 9.80665);
    for sheaves in 1..=16 {
        let rig = load_str(&tackle(sheaves), "tackle.yaml").unwrap();
        let solution = solve(&rig, &SolveOptions::default()).unwrap();
        let forward = solution.main().forward.value;
        let (n, s) = if sheaves % 2 == 0 {
            (sheaves, sheaves)
        } else {
            (sheaves + 1, sheaves)
        };
        let e = (k.powi(n as i32) - 1.0) / (k.powi(s as i32) * n as f64 * (k - 1.0));
        let expected = weight / (n as f64 * e);
        assert_rel(
            &format!("{sheaves} sheaves ({n} parts)"),
            forward,
            expected,
            1e-9,
        );
    }
}

/// Σφ over the middle passages of line 0 and the capstan product `exp(±μ Σφ)`.
fn total_wrap(solution: &reeve::solve::Solution) -> f64 {
    solution.geometry.lines[LineId::new(0)]
        .entries
        .iter()
        .map(|e| e.wrap)
        .sum()
}

#[test]
fn a_1000_guide_chain_gives_its_tiny_back_value_to_full_precision() {
    // Guards the walk of a determinate line: the back value of a long capstan chain is
    // W·exp(−μΣφ) (capstan equation, Euler–Eytelwein; Hibbeler, *Statics*, §8.5), many
    // orders of magnitude below the load, and must keep its relative precision, not be
    // lost in round-off of the load (it was 1.9e-6 off through the dense solve).
    let mu = 0.01;
    let rig = load_str(&chain(1000, mu), "chain.yaml").unwrap();
    let solution = solve(&rig, &SolveOptions::default()).unwrap();
    let weight = 9.80665;
    let wrap = total_wrap(&solution);
    let main = solution.main();
    assert_rel(
        "1000 guides: back vs W·exp(−μΣφ)",
        main.back.value,
        weight * (-mu * wrap).exp(),
        1e-12,
    );
    assert_rel(
        "1000 guides: forward vs W·exp(μΣφ)",
        main.forward.value,
        weight * (mu * wrap).exp(),
        1e-12,
    );
}

#[test]
fn a_300_pulley_cascade_gives_the_closed_form() {
    // Guards the exact walk of a determinate cascade (kinematics and statics): each
    // movable pulley halves the pull, so the frictionless effort is W/2^N and the
    // velocity ratio 2^N (generators.rs, `cascade`, derived there); through the dense
    // solve the effort was wrong from about 30 pulleys on and the audit failed at 100.
    let n = 300;
    let rig = load_str(&cascade(n, "{kind: none}"), "cascade.yaml").unwrap();
    let solution = solve(&rig, &SolveOptions::default()).unwrap();
    let weight = CASCADE_LOAD_KG * G;
    let main = solution.main();
    let expected = weight / 2f64.powi(n as i32);
    for case in [&main.ideal, &main.forward, &main.back] {
        assert_rel(
            &format!("{n} pulleys, {}: effort vs W/2^N", case.case.name()),
            case.value,
            expected,
            1e-12,
        );
    }
    assert_rel(
        "velocity ratio vs 2^N",
        main.velocity_ratio.unwrap(),
        2f64.powi(n as i32),
        1e-12,
    );
    crate::support::audit_ok(&solution);
}

#[test]
fn a_rated_300_pulley_cascade_keeps_friction_at_tiny_rope_speeds() {
    // Guards the rope-speed threshold: far from the haul the rope runs at 2^-N of the
    // haul's speed, still running, so its sheaves still cost friction. Closed form
    // (generators.rs, `cascade`): forward W·(K/(1 + K))^N, back W·(1/(1 + K))^N.
    let (n, k) = (300, 1.04_f64);
    let rig = load_str(&cascade(n, "{kind: rated, factor: 1.04}"), "cascade.yaml").unwrap();
    let solution = solve(&rig, &SolveOptions::default()).unwrap();
    let weight = CASCADE_LOAD_KG * G;
    let main = solution.main();
    assert_rel(
        "forward vs W·(K/(1 + K))^N",
        main.forward.value,
        weight * (k / (1.0 + k)).powi(n as i32),
        1e-11,
    );
    assert_rel(
        "back vs W·(1/(1 + K))^N",
        main.back.value,
        weight * (1.0 / (1.0 + k)).powi(n as i32),
        1e-11,
    );
    crate::support::audit_ok(&solution);
}

#[test]
fn a_cascade_beyond_double_precision_is_refused_not_answered() {
    // Guards "never a wrong answer with exit 0": 1,100 movable pulleys move the load at
    // 2^-1100 of the haul's speed, below the smallest number a double holds; the rig
    // is refused (exit 2) with a message that says so.
    let ran = reeve_on(&cascade(1100, "{kind: none}"), &["check"]).expect_code(2);
    let first = ran.stderr.lines().next().unwrap_or_default().to_string();
    assert!(
        first.starts_with("reeve: ")
            && first.contains(": parts.c")
            && first.contains("beyond what double precision holds"),
        "first line: {first}"
    );
}

#[test]
fn a_10000_guide_chain_is_right_and_fails_its_friction_lock_check() {
    // Guards "never a wrong answer with exit 0": friction over 10,000 guides multiplies
    // the tension about 1e89-fold. The walk still gives the capstan product (its back
    // value was off by 6e82 through the dense solve), and the friction-lock check,
    // which reads the solved ratios, fails the rig.
    let mu = 0.01;
    let rig = load_str(&chain(10_000, mu), "chain.yaml").unwrap();
    let solution = solve(&rig, &SolveOptions::default()).unwrap();
    let wrap = total_wrap(&solution);
    assert_rel(
        "10,000 guides: back vs W·exp(−μΣφ)",
        solution.main().back.value,
        9.80665 * (-mu * wrap).exp(),
        1e-11,
    );
    let warnings = reeve::checks::run(&rig, &solution);
    assert!(
        warnings
            .iter()
            .any(|w| w.code == "friction-lock" && w.fails),
        "{:?}",
        warnings.iter().map(|w| w.code).collect::<Vec<_>>()
    );
}

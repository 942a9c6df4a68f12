//! Numerical robustness of the statics: tension coefficients that span many orders of
//! magnitude (a long chain of friction passages) must not lose the small equations.

use reeve::rig::load_str;
use reeve::solve::{solve, SolveOptions};

use crate::support::generators::{chain, tackle};
use crate::support::{assert_abs, assert_rel};

#[test]
fn a_long_capstan_chain_keeps_the_capstan_product() {
    // Capstan equation (Euler–Eytelwein): over passages in series the ratios multiply,
    // so the forward pull is W·exp(μ·Σφ) and the back pull W·exp(−μ·Σφ), however many
    // orders of magnitude that spans.
    for (n, mu) in [(10, 0.1), (60, 0.1), (200, 0.1), (200, 0.0)] {
        let rig = load_str(&chain(n, mu), "chain.yaml").unwrap();
        let solution = solve(&rig, &SolveOptions::default()).unwrap();
        let total_wrap: f64 = solution.geometry.lines[0]
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

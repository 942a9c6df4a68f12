//! Numerical robustness of the statics: tension coefficients that span many orders of
//! magnitude (a long chain of friction passages) must not lose the small equations.

use std::fmt::Write as _;

use reeve::rig::load_str;
use reeve::solve::{solve, SolveOptions};

/// A weight lifted over a zig-zag of `n` fixed guides (capstan friction at each).
fn chain(n: usize, mu: f64) -> String {
    let mut yaml = format!(
        "format: 1\nropes:\n  c: {{diameter: 2, mu: {mu}}}\nparts:\n  hand: {{kind: haul, at: [0, 0, -200]}}\n"
    );
    let mut path = vec!["hand".to_string()];
    for i in 0..n {
        let z = if i % 2 == 0 { 0.0 } else { 100.0 };
        let _ = writeln!(
            yaml,
            "  g{i}: {{kind: guide, at: [{}, 0, {z}], axle: [0, 1, 0], diameter: 10}}",
            i as f64 * 60.0
        );
        path.push(format!("g{i}"));
    }
    let _ = writeln!(
        yaml,
        "  bob: {{kind: weight, at: [{}, 0, -300], mass: 1}}",
        (n - 1) as f64 * 60.0 + 6.0
    );
    path.push("bob".to_string());
    let _ = writeln!(
        yaml,
        "lines:\n  cord: {{rope: c, path: [{}]}}",
        path.join(", ")
    );
    yaml
}

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
        let rel = |a: f64, b: f64| ((a - b) / b).abs();
        assert!(
            rel(main.forward.value, expected_forward) < 1e-9,
            "{n} guides: forward {} vs capstan product {expected_forward}",
            main.forward.value
        );
        // The back pull can be far below round-off of the load (1e-19 N against 10 N):
        // compare it to within round-off of the weight.
        assert!(
            (main.back.value - expected_back).abs() < 1e-9 * expected_back.max(weight * 1e-6),
            "{n} guides: back {} vs capstan product {expected_back}",
            main.back.value
        );
        assert!(
            main.forward.audit_residual < 1e-9,
            "{n}: audit {}",
            main.forward.audit_residual
        );
    }
}

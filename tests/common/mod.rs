//! Rig generators shared by the tests and the benchmarks (`benches/solve.rs` includes
//! this file by path).
#![allow(dead_code)]

use std::fmt::Write as _;

use reeve::solve::Solution;

/// A planar tackle of `sheaves` rated sheaves (K = 1.04), alternately moving (on the hook
/// block, below) and fixed (above), dead end on the fixed block, falls vertical, hook
/// load 500 kg. With an even count the hauling part leaves the fixed block (N = S =
/// `sheaves` parts), with an odd count it leaves the moving block upward (N = `sheaves` +
/// 1 parts, S = `sheaves`).
pub fn tackle(sheaves: usize) -> String {
    let mut yaml = String::from(
        "format: 1\nropes:\n  w: {diameter: 8, mu: 0.12}\nparts:\n  hook: {kind: block, at: [0, 0, 0], load: {mass: 500}}\n",
    );
    let mut path = Vec::new();
    let r = 50.0;
    // Sheaves alternate: upper at z = 3000, lower on the hook at z = 0, stepping in x.
    let mut x = 0.0;
    let _ = writeln!(yaml, "  dead: {{kind: anchor, at: [{}, 0, 3000]}}", x - r);
    path.push("dead".to_string());
    for i in 0..sheaves {
        let (name, z, block) = if i % 2 == 0 {
            (format!("low{i}"), 0.0, ", block: hook")
        } else {
            (format!("up{i}"), 3000.0, "")
        };
        let _ = writeln!(
            yaml,
            "  {name}: {{kind: sheave, at: [{x}, 0, {z}], axle: [0, 1, 0], diameter: 92, bearing: {{kind: rated, factor: 1.04}}{block}}}"
        );
        path.push(format!(
            "{{part: {name}, side: {}}}",
            if i % 2 == 0 { "right" } else { "left" }
        ));
        x += 2.0 * r;
    }
    // The hauling part leaves the last sheave: down from an upper one, up from a lower.
    let z_end = if sheaves % 2 == 0 { -500.0 } else { 3500.0 };
    let _ = writeln!(
        yaml,
        "  hand: {{kind: haul, at: [{}, 0, {z_end}]}}",
        x - 2.0 * r + r
    );
    path.push("hand".to_string());
    let _ = writeln!(
        yaml,
        "lines:\n  fall: {{rope: w, path: [{}]}}",
        path.join(", ")
    );
    yaml
}

/// A weight lifted over a zig-zag of `n` fixed guides (capstan friction at each), the
/// hand end pulled along its span.
pub fn chain(n: usize, mu: f64) -> String {
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

/// Relative closeness with a message carrying both numbers.
pub fn assert_close(what: &str, measured: f64, expected: f64, rel_tol: f64) {
    let err = (measured - expected).abs() / expected.abs().max(1e-300);
    assert!(
        err <= rel_tol,
        "{what}: measured {measured}, expected {expected} (relative error {err:.3e} > {rel_tol:.1e})"
    );
}

/// Energy audit of every case of every sub-rig balances (DESIGN.md §3 step 5).
pub fn audit_ok(solution: &Solution) {
    for sub in &solution.subrigs {
        for case in [&sub.ideal, &sub.forward, &sub.back] {
            assert!(
                case.audit_residual < 1e-9,
                "{}: energy audit residual {}",
                case.case.name(),
                case.audit_residual
            );
        }
    }
}

//! Solver timing on generated rigs: an N-part rated tackle and a long chain of guides.
//! A bench binary (no framework, no timing assertions): `cargo bench --bench solve`.

use std::fmt::Write as _;
use std::hint::black_box;
use std::time::{Duration, Instant};

use reeve::rig::load_str;
use reeve::solve::{solve, SolveOptions};

/// A planar N-part tackle: fixed sheaves above, moving sheaves below, falls vertical.
/// The forward pull should be W/(N·E) with the handbook reeving efficiency (S = N).
fn tackle(parts: usize) -> String {
    let mut yaml = String::from(
        "format: 1\nropes:\n  w: {diameter: 8, mu: 0.12}\nparts:\n  hook: {kind: block, at: [0, 0, 0], load: {mass: 500}}\n",
    );
    let mut path = Vec::new();
    let r = 50.0;
    // Sheaves alternate: upper at z = 3000, lower on the hook at z = 0, stepping in x.
    let mut x = 0.0;
    let _ = writeln!(yaml, "  dead: {{kind: anchor, at: [{}, 0, 3000]}}", x - r);
    path.push("dead".to_string());
    for i in 0..parts {
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
    let z_end = if parts % 2 == 0 { -500.0 } else { 3500.0 };
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

/// A weight lifted over a zig-zag of fixed guides (capstan friction at each).
fn chain(guides: usize) -> String {
    let mut yaml = String::from(
        "format: 1\nropes:\n  c: {diameter: 2, mu: 0.1}\nparts:\n  hand: {kind: haul, at: [0, 0, -200], pull: [0, 0, -1]}\n",
    );
    let mut path = vec!["hand".to_string()];
    for i in 0..guides {
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
        (guides - 1) as f64 * 60.0 + 6.0
    );
    path.push("bob".to_string());
    let _ = writeln!(
        yaml,
        "lines:\n  cord: {{rope: c, path: [{}]}}",
        path.join(", ")
    );
    yaml
}

fn time(label: &str, yaml: &str) {
    let rig = match load_str(yaml, label) {
        Ok(rig) => rig,
        Err(e) => panic!("{label}: generated rig does not load:\n{e}\n{yaml}"),
    };
    let options = SolveOptions::default();
    let forward = match solve(&rig, &options) {
        Ok(s) => s.main().forward.value,
        Err(e) => panic!("{label}: {e}"),
    };
    let mut runs = 0u32;
    let start = Instant::now();
    while start.elapsed() < Duration::from_millis(500) || runs < 5 {
        black_box(solve(black_box(&rig), &options).ok());
        runs += 1;
    }
    let each = start.elapsed() / runs;
    println!(
        "{label:<28} {runs:>6} runs  {:>10.1} µs per solve   (forward {forward:.4e})",
        each.as_secs_f64() * 1e6
    );
}

fn main() {
    for n in [2, 4, 8, 16, 32] {
        time(&format!("tackle, {n} parts"), &tackle(n));
    }
    for n in [10, 50, 200] {
        time(&format!("guide chain, {n} guides"), &chain(n));
    }
}

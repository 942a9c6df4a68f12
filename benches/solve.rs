//! Solver timing on generated rigs: an N-part rated tackle and a long chain of guides.
//! A bench binary (no framework, no timing assertions): `cargo bench --bench solve`.

use std::hint::black_box;
use std::time::{Duration, Instant};

use reeve::rig::load_str;
use reeve::solve::{solve, SolveOptions};

#[path = "../tests/it/support/generators.rs"]
mod generators;
use generators::{chain, tackle};

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
        time(&format!("tackle, {n} sheaves"), &tackle(n));
    }
    for n in [10, 50, 200] {
        time(&format!("guide chain, {n} guides"), &chain(n, 0.1));
    }
}

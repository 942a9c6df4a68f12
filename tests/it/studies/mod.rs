//! Design studies through the real binary: overrides and variants, compare, sweep and
//! stroke, upgrade ranking and sensitivities, Monte Carlo spread. Golden tables live in
//! `tests/golden/`; rewrite them with `REEVE_BLESS=1 cargo test --test it golden`.

use serde_json::Value;

use crate::support::generators::tackle;
use crate::support::golden::golden;
use crate::support::{
    assert_abs, assert_rel, example_rig, json_of, reeve, reeve_in, stdout_of, test_rig, Scratch,
    ONE_SHEAVE,
};

fn num(v: &Value) -> f64 {
    v.as_f64().unwrap_or_else(|| panic!("not a number: {v}"))
}

fn check_forward(file: &str, sets: &[&str]) -> f64 {
    let path = test_rig(file);
    let mut args = vec!["check", path.as_str(), "--json"];
    for s in sets {
        args.push("--set");
        args.push(s);
    }
    let out = reeve(&args);
    assert_ne!(out.code, 2, "{}", out.stderr);
    num(&out.json()["forward"]["value"])
}

/// Wire-rope handbook reeving efficiency formula, DESIGN.md §1:
/// E = (K^N − 1)/(K^S·N·(K − 1)), pull = W/(N·E).
fn handbook_pull(w: f64, k: f64, n: i32, s: i32) -> f64 {
    let e = (k.powi(n) - 1.0) / (k.powi(s) * n as f64 * (k - 1.0));
    w / (n as f64 * e)
}

mod bounded;
mod compare_sweep;
mod failures;
mod overrides;
mod rank;
mod spread;

/// Runs a study that must fail a check: exit 1, stdout as text.
fn failing(args: &[&str]) -> String {
    reeve(args).expect_code(1).stdout
}

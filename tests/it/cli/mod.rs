//! The real binary on bad rigs that only the geometry or the solver can find wrong:
//! exit code 2, and a message that names the file, line, column and part; and what
//! `check` says: verdicts, margins, outcome wording, warnings, units.

use std::f64::consts::PI;

use reeve::math::STANDARD_GRAVITY;
use reeve::solve::{solve, SolveError, SolveOptions};

use crate::support::generators::chain;
use crate::support::run::reeve_on;
use crate::support::{
    assert_abs, assert_rel, edited_rig, example_rig, reeve, reeve_in, solve_test_rig, stdout_of,
    test_rig, Scratch, ONE_SHEAVE,
};

const HEAD: &str = "format: 1\nropes:\n  r: {diameter: 6, mu: 0.2}\nparts:\n";

mod commands;
mod errors;
mod verdicts;

/// `reeve check ARGS --json`, parsed, whatever the exit code.
fn check_json(args: &[&str]) -> serde_json::Value {
    reeve(&[&["check"], args, &["--json"]].concat()).json()
}

fn codes(json: &serde_json::Value) -> Vec<String> {
    json["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| w["code"].as_str().unwrap().to_string())
        .collect()
}

/// `reeve check ARGS`, its text, whatever the exit code.
fn check_text(args: &[&str]) -> String {
    reeve(&[&["check"], args].concat()).stdout
}

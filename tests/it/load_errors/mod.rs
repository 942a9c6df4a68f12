//! Every class of rig-file error names the file, line and the part or key, says what was
//! expected, and never panics. The base rig is the example of DESIGN.md section 4
//! ([`EXAMPLE`], `tests/rigs/design-example.yaml`).

use reeve::model::{PartId, RopeId};
use std::time::{Duration, Instant};

use proptest::prelude::*;
use reeve::rig::{load_file, load_str, load_str_with, LoadError};

use crate::support::{assert_abs, Scratch, EXAMPLE};

/// The example with one piece of text replaced (which must occur).
fn with(from: &str, to: &str) -> String {
    assert!(EXAMPLE.contains(from), "`{from}` not in the example");
    EXAMPLE.replacen(from, to, 1)
}

fn fails(text: &str) -> LoadError {
    match load_str(text, "rig.yaml") {
        Ok(_) => panic!("expected an error for:\n{text}"),
        Err(e) => e,
    }
}

/// Asserts that one problem is on `line` and its text contains every needle.
#[track_caller]
fn assert_problem(e: &LoadError, line: usize, needles: &[&str]) {
    let shown = e.to_string();
    let prefix = format!("rig.yaml:{line}:");
    let found = shown
        .lines()
        .any(|l| l.starts_with(&prefix) && needles.iter().all(|n| l.contains(n)));
    assert!(
        found,
        "no problem at {prefix} containing {needles:?} in:\n{shown}"
    );
}

mod fuzz;
mod overrides;
mod text;
mod values;

fn set(pairs: &[(&str, &str)]) -> Vec<(String, String)> {
    pairs
        .iter()
        .map(|(k, v)| (k.to_string(), v.to_string()))
        .collect()
}

//! Analytic checks of the whole solver (rig text → `load_str` → `solve`) against
//! published worked examples and handbook formulas. Every check names its source beside
//! it; values known only from memory say so, hand calculations show their arithmetic.
//! The small rigs of `tests/rigs/review/` (signs, stalls, drums, load unknowns,
//! sub-rigs) are checked here against hand calculations too.

use reeve::model::{LineId, PartId};
use std::f64::consts::PI;

use reeve::math::STANDARD_GRAVITY;
use reeve::solve::{solve, SolveOptions, Status, SubRigSolution};

use crate::support::{assert_abs, assert_rel, audit_ok, edited_rig, solve_test_rig, solve_text};

/// One pound-force in newtons (exact by definition: 0.453 592 37 kg × 9.806 65 m/s²).
const LBF: f64 = 4.448_221_615_260_5;

mod axle_friction;
mod capstan;
mod drums;
mod tackles;
mod virtual_work;

/// Where the hauling part leaves.
#[derive(Clone, Copy, Debug)]
enum Lead {
    /// From the fixed block, then through `extra` lead sheaves.
    Fixed { extra: usize },
    /// From the moving block (the hauling part is itself one of the `N` parts).
    Moving,
}

/// A planar N-part tackle with parallel vertical falls, every sheave rated `K` and
/// turned 180°. Falls stand at x = j·a; fall `j` runs up when `N − 1 − j` is even, so
/// the last one always runs up. Between falls the rope turns over a fixed sheave at the
/// top or round a sheave of the hook block at the bottom. Sheaves lie side by side in
/// the plane of the rope, so every fleet angle is 0 and the velocity ratio is exact.
/// Returns the rig text and S, the number of sheaves from dead end to hauling part.
fn tackle(n: usize, lead: Lead, factor: f64, load_n: f64) -> (String, usize) {
    let a = 0.2; // fall spacing, m; pitch radius a/2 with a 10 mm rope: tread 190 mm
    let (top, bottom) = (5.0, 1.0);
    let up = |j: usize| (n - 1 - j) % 2 == 0;
    let sheave = |name: &str, x: f64, z: f64, block: bool| {
        format!(
            "  {name}: {{kind: sheave, at: [{x}, 0, {z}], axle: [0, 1, 0], diameter: 0.19, \
             bearing: {{kind: rated, factor: {factor}}}{}}}\n",
            if block { ", block: hook" } else { "" }
        )
    };
    let mut parts = format!(
        "  hook: {{kind: block, at: [0, 0, {bottom}], moves: [0, 0, 1], load: {{force: {load_n}}}}}\n"
    );
    let mut path = Vec::new();
    if up(0) {
        path.push("hook".to_string());
    } else {
        parts += &format!("  dead: {{kind: anchor, at: [0, 0, {top}]}}\n");
        path.push("dead".to_string());
    }
    let mut sheaves = 0;
    for j in 0..n - 1 {
        let name = format!("s{j}");
        let x = (j as f64 + 0.5) * a;
        if up(j) {
            parts += &sheave(&name, x, top, false);
        } else {
            parts += &sheave(&name, x, bottom, true);
        }
        path.push(name);
        sheaves += 1;
    }
    match lead {
        Lead::Moving => {
            let x = (n - 1) as f64 * a;
            parts += &format!("  haul: {{kind: haul, at: [{x}, 0, {}]}}\n", top + 1.0);
        }
        Lead::Fixed { extra } => {
            // Over the last fixed sheave, then down/up through the lead sheaves.
            let mut going_up = true;
            for i in 0..=extra {
                let name = format!("lead{i}");
                let x = (n as f64 - 0.5 + i as f64) * a;
                let z = if going_up { top } else { 0.5 };
                parts += &sheave(&name, x, z, false);
                path.push(name);
                sheaves += 1;
                going_up = !going_up;
            }
            let x = (n + extra) as f64 * a;
            // After the last turn the rope runs down if it went over a top sheave.
            let z = if going_up { 3.0 } else { 2.0 };
            parts += &format!("  haul: {{kind: haul, at: [{x}, 0, {z}]}}\n");
        }
    }
    path.push("haul".to_string());
    let text = format!(
        "format: 1\ntitle: {n}-part tackle\nunits: {{length: m, force: N}}\n\
         ropes:\n  wire: {{diameter: 0.01, mu: 0.1}}\nparts:\n{parts}\
         lines:\n  fall: {{rope: wire, path: [{}]}}\ndrive: haul\n",
        path.join(", ")
    );
    (text, sheaves)
}

/// Wire-rope handbook reeving efficiency `E = (K^N − 1)/(K^S N (K − 1))`.
fn reeving_efficiency(k: f64, n: usize, s: usize) -> f64 {
    (k.powi(n as i32) - 1.0) / (k.powi(s as i32) * n as f64 * (k - 1.0))
}

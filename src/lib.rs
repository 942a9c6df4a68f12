//! `reeve`: a rigging and pulley-train friction analyzer.
//!
//! # The pipeline
//!
//! The data flows one way, one module per stage:
//!
//! ```text
//! rig file ─► rig (the file as written: located YAML, overrides, checks)
//!          ─► model::Rig (resolved, SI, ids) with model::network (graph, sub-rigs)
//!          ─► geometry (tangents, spans, wraps, fleet angles)
//!          ─► solve (kinematics, statics: ideal / forward / back, energy audit)
//!          ─► checks (warnings with stable codes)
//!          ─► report (one Report, then text, tables, JSON, SVG, HTML)
//! ```
//!
//! [`rig`] reads a file into a [`model::Rig`]; [`geometry`] and [`solve`] read only the
//! model; [`friction`] holds the published formulas the solver applies; [`checks`] and
//! [`report`] read the model and the solution; [`study`] re-runs the solver with
//! overrides. [`units`] converts at the edges, [`math`] names the types, and [`text`]
//! holds the one rule for characters that never pass through (refused at load, escaped
//! on output).
//!
//! # Example: load, solve, read a span tension
//!
//! A two-part hoist: a 10 kg block hangs in a bight of rope from an anchor, over a
//! sheave on the block and a fixed head sheave, to the hand. Every span is vertical, so
//! each sheave has 180° of wrap, and each is rated at `K = 1.05`.
//!
//! By hand: the load is `W = 10 × 9.806 65 = 98.0665` N. Ideal, the two parts share it:
//! the hand pulls `W / 2 = 49.033 25` N. Forward, each sheave multiplies the tension by
//! `K` toward the hand: the dead end carries `T₀`, the part between the sheaves `K T₀`,
//! and the block's balance `T₀ + K T₀ = W` gives `T₀ = W / 2.05 = 47.837 32` N, so the
//! span between the sheaves carries `1.05 T₀ = 50.229 18` N and the hand pulls
//! `1.05² T₀ = 52.740 64` N. This agrees with the handbook reeving efficiency
//! `E = (K^N − 1) / (K^S N (K − 1))` with `N = S = 2`: `W / (N E) = 52.740 64` N.
//!
//! ```
//! use reeve::rig::load_str;
//! use reeve::solve::{solve, SolveOptions};
//!
//! let text = "
//! format: 1
//! ropes: {braid: {diameter: 6, mu: 0.2}}
//! parts:
//!   eye:    {kind: anchor, at: [-30, 0, 2000]}
//!   hook:   {kind: block, at: [0, 0, 1000], load: {mass: 10}}
//!   hook.a: {kind: sheave, block: hook, at: [0, 0, 1000], axle: [0, 1, 0], diameter: 54,
//!            bearing: {kind: rated, factor: 1.05}}
//!   head:   {kind: sheave, at: [60, 0, 2000], axle: [0, 1, 0], diameter: 54,
//!            bearing: {kind: rated, factor: 1.05}}
//!   hand:   {kind: haul, at: [90, 0, 500]}
//! lines:
//!   fall: {rope: braid, path: [eye, hook.a, head, hand]}
//! ";
//! let rig = load_str(text, "hoist.yaml").unwrap();
//! let solution = solve(&rig, &SolveOptions::default()).unwrap();
//! let main = solution.main();
//! assert!((main.ideal.value - 49.033_25).abs() < 1e-9);
//! assert!((main.forward.value - 52.740_64).abs() < 1e-5);
//! // Line `fall`, span 1: from `hook.a` to `head`.
//! let fall = rig.lines.position(|l| l.name == "fall").unwrap();
//! let between = main.forward.tension[fall][1];
//! assert!((between - 50.229_18).abs() < 1e-5, "{between}");
//! ```
#![warn(missing_docs)]

pub mod checks;
pub mod friction;
pub mod geometry;
pub mod math;
pub mod model;
pub mod progress;
pub mod report;
pub mod rig;
pub mod solve;
pub mod study;
pub mod text;
pub mod units;

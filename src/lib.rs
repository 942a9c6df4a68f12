//! `reeve`: a rigging and pulley-train friction analyzer.
//!
//! The data flows one way:
//! rig file → [`rig::Rig`] (resolved, SI) → [`network`] (graph, components) and
//! [`geometry`] (spans, wraps, fleet angles) → [`solve`] (kinematics, statics, three
//! cases, energy audit) → [`report`] (one report, many writers). [`text`] holds the one
//! rule for characters that never pass through (refused at load, escaped on output).
#![warn(missing_docs)]

pub mod checks;
pub mod friction;
pub mod geometry;
pub mod math;
pub mod network;
pub mod report;
pub mod rig;
pub mod solve;
pub mod study;
pub mod text;
pub mod units;

//! `reeve`: a rigging and pulley-train friction analyzer.
//!
//! The data flows one way:
//! rig file → [`rig`] → [`model::Rig`] (resolved, SI; [`model::network`]: graph, components) and
//! [`geometry`] (spans, wraps, fleet angles) → [`solve`] (kinematics, statics, three
//! cases, energy audit) → [`report`] (one report, many writers). [`text`] holds the one
//! rule for characters that never pass through (refused at load, escaped on output).
#![warn(missing_docs)]

pub mod checks;
pub mod cli;
pub mod friction;
pub mod geometry;
pub mod math;
pub mod model;
pub mod report;
pub mod rig;
pub mod solve;
pub mod study;
pub mod text;
pub mod units;

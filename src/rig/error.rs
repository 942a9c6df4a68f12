//! Errors found while reading a rig file: every problem carries the file, line, column
//! and the part or key it concerns. The types are the model's ([`crate::model::source`]),
//! so that the stages after the file layer (a study loading a rig again) carry them
//! without importing `rig`.

pub use crate::model::source::{LoadError, Problem};

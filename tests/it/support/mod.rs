//! What the test modules share.

pub mod generators;

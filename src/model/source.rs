//! Where a rig came from, as every stage after the file layer sees it: the problems
//! found in its source, each located (file, line, column) and naming the part or key
//! ([`Problem`], [`LoadError`]), and [`RigFile`], what a study asks of the rig's file.
//!
//! `rig/` builds the model and reports what is wrong with a file in these types; a
//! study holds its rig file behind [`RigFile`] (implemented by `rig::source::RigText`)
//! and loads it again with its own overrides, without importing the file layer. The
//! arrow runs one way: `rig` → `model`, `study` → `model`.

use std::fmt;

use super::param::{Names, Resolved};
use super::vary::{Uncertain, Variant};
use super::{Location, Rig};

/// One problem in a rig file.
#[derive(Debug, Clone, PartialEq)]
pub struct Problem {
    /// Where, when known.
    pub location: Option<Location>,
    /// The part, line, rope or key concerned (`parts.head.diameter`, `head`).
    pub subject: String,
    /// What is wrong and what was expected, lowercase; may end with a suggestion.
    pub message: String,
}

/// Everything wrong with one rig file (all semantic problems are collected).
#[derive(Debug, Clone, PartialEq)]
pub struct LoadError {
    /// The file as the user named it.
    pub file: String,
    /// At least one problem.
    pub problems: Vec<Problem>,
}

impl fmt::Display for LoadError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, p) in self.problems.iter().enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            match p.location {
                Some(l) => write!(f, "{}:{}:{}: ", self.file, l.line, l.column)?,
                None => write!(f, "{}: ", self.file)?,
            }
            if p.subject.is_empty() || p.subject == self.file {
                write!(f, "{}", p.message)?;
            } else {
                write!(f, "{}: {}", p.subject, p.message)?;
            }
        }
        Ok(())
    }
}

impl std::error::Error for LoadError {}

/// A rig file as a study uses it: loaded again for every run with that run's
/// `KEY=VALUE` overrides (file keys such as `parts.head.bearing.mu`, applied in order
/// so that an overridden value gets exactly the checks a written one gets), its ranged
/// values and named variants read, and a file key resolved to the model value it
/// sets. Every error names the file, line and column ([`LoadError`]).
///
/// `overrides` are always the whole list a run applies: the file holds none of its own.
pub trait RigFile: fmt::Debug + Send + Sync {
    /// The file's name in messages (the path as given).
    fn name(&self) -> &str;

    /// The rig with `overrides` applied.
    ///
    /// # Errors
    /// A [`LoadError`] naming every problem found in the file and the overrides.
    fn load(&self, overrides: &[(String, String)]) -> Result<Rig, LoadError>;

    /// The values written as ranges, after `overrides` (an override that sets a ranged
    /// key to one number removes its range).
    ///
    /// # Errors
    /// A [`LoadError`] when the file cannot be parsed, a range is malformed or an
    /// override does not apply.
    fn ranges(&self, overrides: &[(String, String)]) -> Result<Vec<Uncertain>, LoadError>;

    /// The named variants, after `overrides` (one may change a variant or remove them
    /// all).
    ///
    /// # Errors
    /// A [`LoadError`] when the file cannot be parsed, the variants are malformed or
    /// an override does not apply.
    fn variants(&self, overrides: &[(String, String)]) -> Result<Vec<Variant>, LoadError>;

    /// Whether the mapping at `path` (exact key names, e.g. `["parts", "hook.a",
    /// "bearing"]`) holds `key` in the file as written with `overrides`: which of two
    /// spellings of one value (`factor` or `efficiency`) the file uses. False when the
    /// file or an override does not parse.
    fn has_key(&self, overrides: &[(String, String)], path: &[&str], key: &str) -> bool;

    /// The model value that the file key `key`, written with `unit` (empty for a bare
    /// number), sets on `rig` (a rig this file loaded), with the loader's unit
    /// conversion; None when the key is not a model parameter ([`super::param`]) or
    /// names nothing in `rig`: the caller then applies it as an override.
    fn resolve(&self, rig: &Rig, key: &str, unit: &str) -> Option<Resolved>;

    /// [`RigFile::resolve`] against the rig `names` index ([`Names::of`] a rig this
    /// file loaded): the same answer, each name found by a hash look-up, for a caller
    /// that resolves many keys (`rank`).
    fn resolve_in(&self, names: &Names, key: &str, unit: &str) -> Option<Resolved>;
}

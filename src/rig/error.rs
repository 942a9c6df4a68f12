//! Errors found while reading a rig file: every problem carries the file, line, column
//! and the part or key it concerns.

use std::fmt;

use crate::model::Location;

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

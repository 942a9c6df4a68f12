//! Rig files: the located YAML tree as written ([`file`](mod@file)), overrides ([`overrides`]),
//! loading and validation ([`load`]) into the resolved, SI [`crate::model`], with problems
//! reported as [`LoadError`] ([`error`]); [`RigText`] ([`source`]) is the file as a study
//! loads it again, behind the model's [`crate::model::RigFile`].

pub mod error;
pub mod file;
pub mod load;
pub mod overrides;
pub mod params;
pub mod source;
pub mod suggest;

pub use error::{LoadError, Problem};
pub use load::{load_file, load_str, load_str_with};
pub use source::RigText;

//! Rig files: the serde structs as written ([`file`]), loading and validation
//! ([`load`]) into the resolved, SI [`model`].

pub mod error;
pub mod file;
pub mod load;
pub mod model;

pub use error::{LoadError, Problem};
pub use load::{load_file, load_str};
pub use model::Rig;

//! `reeve schema [-o FILE]`: the JSON Schema of rig format 1, generated from the
//! loader's key definitions ([`reeve::rig::load::schema`]). The project ships it as
//! `schema/rig-1.json`, which the example rigs name in their editor modeline.

use std::path::{Path, PathBuf};

use clap::Args;

use super::destination::{emit, Destination};
use super::{Failure, EXIT_OK};

/// `reeve schema [-o FILE]`.
#[derive(Debug, Args)]
pub struct SchemaArgs {
    /// Write the schema here (atomically) instead of to stdout; `-` is stdout.
    #[arg(short = 'o', long = "output", value_name = "FILE")]
    pub output: Option<PathBuf>,
}

/// The schema's text: pretty JSON with a final newline.
pub fn schema_text() -> Result<String, Failure> {
    let text = serde_json::to_string_pretty(&reeve::rig::load::schema()).map_err(|source| {
        Failure::Encode {
            what: "schema",
            source,
        }
    })?;
    Ok(text + "\n")
}

/// Prints or writes the schema.
pub fn run_schema(args: SchemaArgs) -> Result<i32, Failure> {
    let text = schema_text()?;
    let destination = Destination::from_arg(args.output.as_deref(), Destination::Stdout);
    // No rig is read: an empty path matches no file.
    emit(&destination, Path::new(""), |w| {
        w.write_all(text.as_bytes())
    })?;
    Ok(EXIT_OK)
}

//! Where a command's output goes: stdout (`-o -`, or no `-o` for commands that print by
//! default) or a file written atomically ([`reeve::report::file::write_atomically`]);
//! a command never writes over the rig file it read, under any of its names.

use std::io::{self, Write};
use std::path::{Path, PathBuf};

use reeve::report::file::{is_same_file, write_atomically};

use super::{write_out, Failure};

/// Where to write.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Destination {
    /// Standard output.
    Stdout,
    /// A file, replaced atomically.
    File(PathBuf),
}

impl Destination {
    /// `-` is stdout; anything else a file; no `-o` at all takes `default`.
    pub fn from_arg(arg: Option<&Path>, default: Destination) -> Destination {
        match arg {
            None => default,
            Some(p) if p.as_os_str() == "-" => Destination::Stdout,
            Some(p) => Destination::File(p.to_path_buf()),
        }
    }
}

/// Writes a command's output to `destination`, refusing to overwrite `input` (exit 2).
/// A closed pipe on stdout is not an error.
///
/// # Errors
/// A [`Failure`] that names the file, with the I/O error as its cause.
pub fn emit(
    destination: &Destination,
    input: &Path,
    write: impl FnOnce(&mut dyn Write) -> io::Result<()>,
) -> Result<(), Failure> {
    match destination {
        Destination::Stdout => write_out(write),
        Destination::File(path) => {
            if is_same_file(path, input) {
                return Err(Failure::Input(format!(
                    "refusing to write over the input rig `{}`; choose another output file",
                    path.display()
                )));
            }
            // A command that read no rig (`schema`, `manual`) still never replaces a rig
            // file named by mistake: its output is never YAML.
            if input.as_os_str().is_empty() && is_rig_file(path) {
                return Err(Failure::Input(format!(
                    "refusing to write over `{}`: it is a rig file (.yaml); choose another output file",
                    path.display()
                )));
            }
            // Said plainly: renaming over a folder fails with the system's words, and
            // with a trailing slash those are "not a directory".
            if std::fs::metadata(path).is_ok_and(|m| m.is_dir()) {
                return Err(Failure::Input(format!(
                    "cannot write `{}`: it is a folder; give the output a file name",
                    path.display()
                )));
            }
            write_atomically(path, write).map_err(|source| Failure::File {
                path: path.clone(),
                source,
            })
        }
    }
}

/// An existing file named like a rig (`.yaml`, `.yml`).
fn is_rig_file(path: &Path) -> bool {
    let yaml = path
        .extension()
        .and_then(|e| e.to_str())
        .is_some_and(|e| e.eq_ignore_ascii_case("yaml") || e.eq_ignore_ascii_case("yml"));
    yaml && std::fs::metadata(path).is_ok_and(|m| m.is_file())
}

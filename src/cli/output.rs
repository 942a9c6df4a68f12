//! Where a command's output goes: stdout (`-o -`, or no `-o` for commands that print by
//! default) or a file written atomically. A file is written to a temporary file in the
//! same folder and renamed into place only once it is complete, so a failure never
//! leaves a half-written drawing or report; and a command never writes over the rig
//! file it read.

use std::fs;
use std::io::{self, BufWriter, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};

use super::{Failure, EXIT_BAD_INPUT};

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

/// The canonical form of a path that may not exist yet: its folder canonicalized, plus
/// its file name (a symlink at the path itself is followed when it exists).
fn canonical_target(path: &Path) -> Option<PathBuf> {
    if let Ok(p) = fs::canonicalize(path) {
        return Some(p);
    }
    let name = path.file_name()?;
    let parent = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p,
        _ => Path::new("."),
    };
    Some(fs::canonicalize(parent).ok()?.join(name))
}

/// Whether writing to `output` would overwrite `input` (compared as canonical paths).
pub fn is_same_file(output: &Path, input: &Path) -> bool {
    match (canonical_target(output), fs::canonicalize(input)) {
        (Some(o), Ok(i)) => o == i,
        _ => false,
    }
}

static TEMP_COUNTER: AtomicU64 = AtomicU64::new(0);

/// Writes `path` atomically: `write` fills a temporary file in the same folder, which
/// is flushed, synced and renamed over `path` only when `write` succeeded. On any error
/// the temporary file is removed and `path` is left as it was. An existing file's
/// permissions are kept. An existing special file (FIFO, device) is written into
/// directly, since it cannot be replaced.
///
/// # Errors
/// The first I/O error: creating the temporary file, writing, syncing or renaming.
pub fn write_atomically(
    path: &Path,
    write: impl FnOnce(&mut dyn Write) -> io::Result<()>,
) -> io::Result<()> {
    // A FIFO, a device or a terminal (`-o /dev/stdout`, `-o /dev/null`) cannot be
    // replaced: renaming over it would swap the special file for a regular one (as root,
    // `-o /dev/null` would destroy /dev/null). Write into it instead.
    if fs::metadata(path).is_ok_and(|m| !m.is_file() && !m.is_dir()) {
        let mut out = BufWriter::new(fs::OpenOptions::new().write(true).open(path)?);
        write(&mut out)?;
        return out.flush();
    }
    let folder = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = path
        .file_name()
        .ok_or_else(|| io::Error::new(io::ErrorKind::InvalidInput, "not a file name"))?;
    let temp = folder.join(format!(
        ".{}.{}-{}.tmp",
        name.to_string_lossy(),
        std::process::id(),
        TEMP_COUNTER.fetch_add(1, Ordering::Relaxed)
    ));
    let file = fs::OpenOptions::new()
        .write(true)
        .create_new(true)
        .open(&temp)?;
    let result = (|| {
        let mut out = BufWriter::new(file);
        write(&mut out)?;
        let file = out.into_inner().map_err(|e| e.into_error())?;
        if let Ok(meta) = fs::metadata(path) {
            file.set_permissions(meta.permissions())?;
        }
        file.sync_all()?;
        drop(file);
        fs::rename(&temp, path)
    })();
    if result.is_err() {
        // Best effort: the temporary file may not exist any more.
        let _ = fs::remove_file(&temp);
    }
    result
}

/// Writes a command's output to `destination`, refusing to overwrite `input` (exit 2).
/// A closed pipe on stdout is not an error.
///
/// # Errors
/// A [`Failure`] with exit code 2 that names the file and the cause.
pub fn emit(
    destination: &Destination,
    input: &Path,
    write: impl FnOnce(&mut dyn Write) -> io::Result<()>,
) -> Result<(), Failure> {
    match destination {
        Destination::Stdout => {
            let stdout = io::stdout();
            let mut lock = stdout.lock();
            match write(&mut lock).and_then(|_| lock.flush()) {
                Ok(()) => Ok(()),
                Err(e) if e.kind() == io::ErrorKind::BrokenPipe => Ok(()),
                Err(e) => Err(Failure {
                    message: format!("cannot write output: {e}"),
                    code: EXIT_BAD_INPUT,
                }),
            }
        }
        Destination::File(path) => {
            if is_same_file(path, input) {
                return Err(Failure {
                    message: format!(
                        "refusing to write over the input rig `{}`; choose another output file",
                        path.display()
                    ),
                    code: EXIT_BAD_INPUT,
                });
            }
            write_atomically(path, write).map_err(|e| Failure {
                message: format!("cannot write `{}`: {e}", path.display()),
                code: EXIT_BAD_INPUT,
            })
        }
    }
}

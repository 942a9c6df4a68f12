//! Writing an output file whole or not at all. A file is written to a temporary file in
//! the same folder and renamed into place only once it is complete, so a failure never
//! leaves a half-written drawing, table or report (nor, after SIGTERM, SIGINT or SIGHUP,
//! a temporary file); and [`is_same_file`] tells a writer that it is about to write over
//! its own input under another name.

use std::fs;
use std::io::{self, BufWriter, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};

/// Whether writing to `output` would overwrite `input`: the same file under any name
/// (a symlink, a hard link, `dir/../rig.yaml`), compared by device and inode on Unix and
/// by canonical path elsewhere. An output that does not exist yet is no file at all.
pub fn is_same_file(output: &Path, input: &Path) -> bool {
    match (fs::metadata(output), fs::metadata(input)) {
        #[cfg(unix)]
        (Ok(o), Ok(i)) => {
            use std::os::unix::fs::MetadataExt;
            (o.dev(), o.ino()) == (i.dev(), i.ino())
        }
        #[cfg(not(unix))]
        (Ok(_), Ok(_)) => matches!(
            (fs::canonicalize(output), fs::canonicalize(input)),
            (Ok(o), Ok(i)) if o == i
        ),
        _ => false,
    }
}

/// Where a path finally leads: symbolic links followed (at most 40), relative ones from
/// the link's folder, a dangling link's missing target included.
fn through_links(path: &Path) -> PathBuf {
    let mut here = path.to_path_buf();
    for _ in 0..40 {
        let is_link = fs::symlink_metadata(&here).is_ok_and(|m| m.file_type().is_symlink());
        let Some(target) = is_link.then(|| fs::read_link(&here).ok()).flatten() else {
            return here;
        };
        here = match here.parent() {
            Some(folder) if target.is_relative() => folder.join(target),
            _ => target,
        };
    }
    here
}

static TEMP_COUNTER: AtomicU64 = AtomicU64::new(0);

/// How many temporary names are tried before giving up (a name is taken only by a
/// leftover of an earlier process that had this PID).
const TEMP_ATTEMPTS: usize = 1000;

/// A temporary file of a process that is gone is removed once it is this old: younger,
/// it may be another machine's write in progress on a shared folder (its PIDs are not
/// ours).
const STALE_AGE: std::time::Duration = std::time::Duration::from_secs(60);

/// Removes the leftovers `.NAME.PID-N.tmp` of earlier writes to `name` in `folder` whose
/// process is no longer running (SIGKILL, a power cut) and that are older than
/// [`STALE_AGE`]. Best effort: every failure is ignored.
fn remove_stale_temps(folder: &Path, name: &str) {
    let prefix = format!(".{name}.");
    let Ok(entries) = fs::read_dir(folder) else {
        return;
    };
    for entry in entries.flatten() {
        let file_name = entry.file_name();
        let Some(rest) = file_name
            .to_str()
            .and_then(|s| s.strip_prefix(&prefix))
            .and_then(|s| s.strip_suffix(".tmp"))
        else {
            continue;
        };
        let Some((pid, n)) = rest.split_once('-') else {
            continue;
        };
        let Ok(pid) = pid.parse::<u32>() else {
            continue;
        };
        if n.is_empty() || !n.bytes().all(|b| b.is_ascii_digit()) {
            continue;
        }
        let old = entry
            .metadata()
            .ok()
            .filter(fs::Metadata::is_file)
            .and_then(|m| m.modified().ok())
            .and_then(|t| t.elapsed().ok())
            .is_some_and(|age| age > STALE_AGE);
        if old && pid != std::process::id() && !process_alive(pid) {
            let _ = fs::remove_file(entry.path());
        }
    }
}

/// Whether a process with this id runs (or may: anything but a clear "no such
/// process" counts as alive, so nothing is removed in doubt).
fn process_alive(pid: u32) -> bool {
    #[cfg(unix)]
    {
        let Ok(pid) = libc::pid_t::try_from(pid) else {
            return false;
        };
        // Signal 0 checks for existence without sending anything.
        // SAFETY: kill with signal 0 has no effect on the target.
        let status = unsafe { libc::kill(pid, 0) };
        status == 0 || io::Error::last_os_error().raw_os_error() != Some(libc::ESRCH)
    }
    #[cfg(not(unix))]
    {
        let _ = pid;
        true
    }
}

/// Writes `path` atomically: `write` fills a temporary file `.NAME.PID-N.tmp` in the same
/// folder, which is flushed, synced and renamed over `path` only when `write` succeeded.
/// On any error the temporary file is removed and `path` is left as it was; on SIGTERM,
/// SIGINT or SIGHUP (Unix) it is removed before the process ends by the signal. A
/// leftover of an earlier run never blocks the write (the next free name is taken), and
/// leftovers of processes that are gone are removed. An existing file's permissions are
/// kept. A symbolic link is written through: the file it points at is replaced and the
/// link kept, as a shell redirection would. An existing special file (FIFO, device) is
/// written into directly, since it cannot be replaced.
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
    let path = &through_links(path);
    write_through_temp(path, write, |temp, path| fs::rename(temp, path))
}

/// Writes a new file at `path` atomically, never over anything: as
/// [`write_atomically`], but the complete temporary file is hard-linked into place,
/// which fails with [`io::ErrorKind::AlreadyExists`] when anything is at `path` (a file,
/// a folder, a link, even a dangling one, or a file another process created meanwhile):
/// no check-then-rename window. Where the file system has no hard links the complete
/// text is copied into a file opened with `create_new`, which fails the same way.
///
/// # Errors
/// [`io::ErrorKind::AlreadyExists`] when `path` exists; else the first I/O error.
pub fn write_new(
    path: &Path,
    write: impl FnOnce(&mut dyn Write) -> io::Result<()>,
) -> io::Result<()> {
    write_through_temp(path, write, |temp, path| {
        let linked = match fs::hard_link(temp, path) {
            Err(e) if e.kind() != io::ErrorKind::AlreadyExists => {
                // No hard links here (some network or FAT file systems): copy.
                let mut out = fs::OpenOptions::new()
                    .write(true)
                    .create_new(true)
                    .open(path)?;
                let copied =
                    io::copy(&mut fs::File::open(temp)?, &mut out).and_then(|_| out.sync_all());
                if copied.is_err() {
                    let _ = fs::remove_file(path);
                }
                copied
            }
            other => other,
        };
        linked.and_then(|()| fs::remove_file(temp))
    })
}

/// Fills a temporary file beside `path` and hands it to `finish` (a rename or a link),
/// removing it on any error.
fn write_through_temp(
    path: &Path,
    write: impl FnOnce(&mut dyn Write) -> io::Result<()>,
    finish: impl FnOnce(&Path, &Path) -> io::Result<()>,
) -> io::Result<()> {
    let folder = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = path
        .file_name()
        .ok_or_else(|| io::Error::new(io::ErrorKind::InvalidInput, "not a file name"))?
        .to_string_lossy()
        .into_owned();
    remove_stale_temps(&folder, &name);
    let mut attempt = 0;
    let (temp, file, pending) = loop {
        let temp = folder.join(format!(
            ".{name}.{}-{}.tmp",
            std::process::id(),
            TEMP_COUNTER.fetch_add(1, Ordering::Relaxed)
        ));
        // Registered before it exists, so that no signal finds it unregistered.
        let pending = signals::Pending::new(&temp);
        match fs::OpenOptions::new()
            .write(true)
            .create_new(true)
            .open(&temp)
        {
            Ok(file) => break (temp, file, pending),
            Err(e) if e.kind() == io::ErrorKind::AlreadyExists && attempt < TEMP_ATTEMPTS => {
                // A leftover of an earlier process with this PID: not ours to remove.
                drop(pending);
                attempt += 1;
            }
            Err(e) => return Err(e),
        }
    };
    let result = (|| {
        let mut out = BufWriter::new(file);
        write(&mut out)?;
        let file = out.into_inner().map_err(|e| e.into_error())?;
        if let Ok(meta) = fs::metadata(path) {
            file.set_permissions(meta.permissions())?;
        }
        file.sync_all()?;
        drop(file);
        finish(&temp, path)
    })();
    if result.is_err() {
        // Best effort: the temporary file may not exist any more.
        let _ = fs::remove_file(&temp);
    }
    drop(pending);
    result
}

/// Removal of the temporary file being written when SIGTERM, SIGINT or SIGHUP ends the
/// process. The handler is installed on the first write, only for signals whose
/// disposition is still the default (a program embedding the library keeps its own
/// handlers, and `nohup` keeps SIGHUP ignored). It removes the file (`unlink` is
/// async-signal-safe), restores the default disposition and raises the signal again, so
/// the process ends as it would have. One write at a time is covered (the command line
/// writes its outputs one after another); with several at once, the latest.
#[cfg(unix)]
mod signals {
    use std::ffi::CString;
    use std::os::unix::ffi::OsStrExt;
    use std::path::Path;
    use std::ptr::null_mut;
    use std::sync::atomic::{AtomicPtr, Ordering};
    use std::sync::Once;

    /// The temporary file to remove, as a C string owned by its [`Pending`].
    static PENDING: AtomicPtr<libc::c_char> = AtomicPtr::new(null_mut());
    static INSTALL: Once = Once::new();

    extern "C" fn on_signal(signal: libc::c_int) {
        let path = PENDING.swap(null_mut(), Ordering::SeqCst);
        // SAFETY: `path` is null or a live NUL-terminated string (its owner frees it only
        // after taking it back out of PENDING); unlink, signal and raise are
        // async-signal-safe.
        unsafe {
            if !path.is_null() {
                libc::unlink(path);
            }
            libc::signal(signal, libc::SIG_DFL);
            libc::raise(signal);
        }
    }

    fn install() {
        INSTALL.call_once(|| {
            for signal in [libc::SIGTERM, libc::SIGINT, libc::SIGHUP] {
                // SAFETY: plain sigaction calls on zero-initialised structs; the handler
                // only does async-signal-safe work.
                unsafe {
                    let mut old: libc::sigaction = std::mem::zeroed();
                    if libc::sigaction(signal, std::ptr::null(), &mut old) != 0
                        || old.sa_sigaction != libc::SIG_DFL
                    {
                        continue;
                    }
                    let mut new: libc::sigaction = std::mem::zeroed();
                    new.sa_sigaction = on_signal as extern "C" fn(libc::c_int) as usize;
                    libc::sigemptyset(&mut new.sa_mask);
                    libc::sigaction(signal, &new, std::ptr::null_mut());
                }
            }
        });
    }

    /// A temporary file registered for removal on a signal, until dropped.
    pub struct Pending(*mut libc::c_char);

    impl Pending {
        pub fn new(path: &Path) -> Pending {
            install();
            let Ok(c) = CString::new(path.as_os_str().as_bytes()) else {
                return Pending(null_mut());
            };
            let own = c.into_raw();
            PENDING.store(own, Ordering::SeqCst);
            Pending(own)
        }
    }

    impl Drop for Pending {
        fn drop(&mut self) {
            if self.0.is_null() {
                return;
            }
            // Freed only when taken back here; if a signal handler or a later write
            // holds it, a few bytes leak instead.
            if PENDING
                .compare_exchange(self.0, null_mut(), Ordering::SeqCst, Ordering::SeqCst)
                .is_ok()
            {
                // SAFETY: made by `CString::into_raw` in `new`, and no one else holds it.
                drop(unsafe { CString::from_raw(self.0) });
            }
        }
    }
}

/// Without Unix signals there is nothing to register.
#[cfg(not(unix))]
mod signals {
    pub struct Pending;
    impl Pending {
        pub fn new(_: &std::path::Path) -> Pending {
            Pending
        }
    }
}

//! `reeve watch RIG [-o report.html]`: re-solves the rig on every save and prints the
//! summary (or the first problem), and rewrites the HTML report, which reloads itself in
//! the browser while the watch runs and is written once more without the reload when it
//! stops (Ctrl-C or SIGTERM).
//!
//! The rig's folder is watched, not the file: editors that save by writing a new file
//! and renaming it over the old one replace the file's inode, which a watch on the file
//! itself would lose. Events are gathered until the folder has been quiet for a moment
//! (an editor's save is several events), and a save that leaves the text as it was is
//! not solved again.

use std::path::{Path, PathBuf};
use std::sync::mpsc;
use std::time::{Duration, Instant};

use clap::Args;
use notify::{EventKind, RecursiveMode, Watcher};

use reeve::checks;
use reeve::report::svg::DrawOptions;
use reeve::report::{html, text, Report};
use reeve::rig::{self, LoadError};

use super::args::{OutputArg, RigArgs, UnitsArg, ViewArg};
use super::destination::{emit, Destination};
use super::outputs::today;
use super::{load_and_solve, write_out, Failure, EXIT_OK};

/// `reeve watch`.
#[derive(Debug, Args)]
#[command(mut_arg("output", |a| a.help(
    "Rewrite this HTML report on every save; it reloads itself in the browser while watching"
)))]
pub struct WatchArgs {
    /// The rig.
    #[command(flatten)]
    pub rig: RigArgs,
    /// The report.
    #[command(flatten)]
    pub output: OutputArg,
    /// Projection of the report's drawing.
    #[command(flatten)]
    pub view: ViewArg,
    /// Units of the check text and the report, as `report --units`.
    #[command(flatten)]
    pub units: UnitsArg,
}

/// How long the folder must be quiet after an event before the rig is read again.
const SETTLE: Duration = Duration::from_millis(150);
/// How often the loop looks for a stop request while nothing happens.
const TICK: Duration = Duration::from_millis(100);

/// The script the report carries while watching: reload every two seconds, keeping the
/// scroll position, and count the loads (`data-reeve-loads` on `<html>`, which the
/// browser test reads). Written once more without it when the watch stops.
pub const RELOAD_SCRIPT: &str = "<script id=\"reeve-watch\">/* reeve watch: reloads while watching */\n(function () {\n  var s = window.sessionStorage, n = Number(s.getItem('reeve-loads') || 0) + 1;\n  s.setItem('reeve-loads', n);\n  document.documentElement.setAttribute('data-reeve-loads', n);\n  var y = s.getItem('reeve-scroll');\n  if (y) { window.scrollTo(0, Number(y)); }\n  setTimeout(function () { s.setItem('reeve-scroll', window.scrollY); window.location.reload(); }, 2000);\n})();\n</script>\n";

/// Runs until stopped.
pub fn run_watch(args: WatchArgs) -> Result<i32, Failure> {
    stop::install();
    let rig_path = args.rig.rig.clone();
    let folder = match rig_path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let Some(file_name) = rig_path.file_name().map(|n| n.to_os_string()) else {
        return Err(Failure::Input(format!(
            "`{}` is not a file name; watch names a rig file",
            rig_path.display()
        )));
    };
    // A mistyped name or a folder is refused at once (exit 2) rather than watched
    // forever; a rig that goes missing later (an editor's rename) is waited for.
    match std::fs::metadata(&rig_path) {
        Ok(m) if m.is_file() => {}
        Ok(_) => {
            return Err(Failure::Input(format!(
                "`{}` is a folder; watch names a rig file",
                rig_path.display()
            )))
        }
        Err(e) => {
            return Err(Failure::Input(format!(
                "cannot watch `{}`: {}",
                rig_path.display(),
                if e.kind() == std::io::ErrorKind::NotFound {
                    "no such file".to_string()
                } else {
                    e.to_string()
                }
            )))
        }
    }
    let (tx, rx) = mpsc::channel();
    let mut watcher = notify::recommended_watcher(tx).map_err(|e| watch_failure(&folder, e))?;
    watcher
        .watch(&folder, RecursiveMode::NonRecursive)
        .map_err(|e| watch_failure(&folder, e))?;

    let destination = args
        .output
        .output
        .as_deref()
        .map(|p| Destination::from_arg(Some(p), Destination::Stdout));
    if destination == Some(Destination::Stdout) {
        return Err(Failure::Input(
            "watch rewrites the report as a file: give -o a file name, not `-`".to_string(),
        ));
    }
    let mut last_text: Option<String> = None;
    let mut last_report: Option<Vec<u8>> = None;
    round(
        &args,
        destination.as_ref(),
        &mut last_text,
        &mut last_report,
    )?;
    let mut pending: Option<Instant> = None;
    while !stop::requested() {
        match rx.recv_timeout(TICK) {
            Ok(Ok(event)) => {
                let ours = event
                    .paths
                    .iter()
                    .any(|p| p.file_name() == Some(file_name.as_os_str()));
                if ours && !matches!(event.kind, EventKind::Access(_)) {
                    pending = Some(Instant::now());
                }
            }
            Ok(Err(e)) => eprintln!("reeve: watching `{}`: {e}", folder.display()),
            Err(mpsc::RecvTimeoutError::Timeout) => {}
            Err(mpsc::RecvTimeoutError::Disconnected) => break,
        }
        if pending.is_some_and(|t| t.elapsed() >= SETTLE) {
            pending = None;
            round(
                &args,
                destination.as_ref(),
                &mut last_text,
                &mut last_report,
            )?;
        }
    }
    // The report stays, without the reload: the watch is over.
    if let (Some(destination), Some(page)) = (destination.as_ref(), last_report.as_ref()) {
        emit(destination, &rig_path, |w| w.write_all(page))?;
    }
    write_out(|w| writeln!(w, "stopped watching {}", rig_path.display()))?;
    Ok(EXIT_OK)
}

fn watch_failure(folder: &Path, e: notify::Error) -> Failure {
    Failure::Input(format!(
        "cannot watch `{}` for changes: {e}",
        folder.display()
    ))
}

/// One re-solve: read the rig, and when its text changed (or on the first round), solve
/// it and print the summary, or the first problem; rewrite the report.
fn round(
    args: &WatchArgs,
    destination: Option<&Destination>,
    last_text: &mut Option<String>,
    last_report: &mut Option<Vec<u8>>,
) -> Result<(), Failure> {
    let path = &args.rig.rig;
    let text = match rig::load::read_text(path) {
        Ok(t) => t,
        // Between an editor's rename and its new file the rig may be missing for a
        // moment; the next event brings it back.
        Err(_) if last_text.is_some() && !path.exists() => return Ok(()),
        Err(e) => {
            show_problem(&Failure::from(e));
            *last_text = Some(String::new());
            return done_line(path);
        }
    };
    if last_text.as_deref() == Some(text.as_str()) {
        return Ok(());
    }
    *last_text = Some(text);
    write_out(|w| {
        writeln!(
            w,
            "── {} · {} ──",
            path.display(),
            clock(std::time::SystemTime::now())
        )
    })?;
    match load_and_solve(&args.rig) {
        Ok((mut rig, solution)) => {
            // Every value is SI by now: only what the outputs show changes.
            rig.units = args.units.shown(rig.units);
            let report = Report::build(&rig, &solution, checks::run(&rig, &solution));
            let source = path.display().to_string();
            write_out(|w| text::write_check(w, &rig, &report, &source))?;
            if let Some(destination) = destination {
                let options = DrawOptions {
                    view: args.view.view,
                    date: today(),
                    standalone: false,
                };
                let mut page = Vec::new();
                html::write_html(&mut page, &rig, &solution, &report, &options, &source)
                    .map_err(Failure::Stdout)?;
                let live = with_reload(&page);
                emit(destination, path, |w| w.write_all(&live))?;
                *last_report = Some(page);
                if let Destination::File(out) = destination {
                    write_out(|w| writeln!(w, "report: {} rewritten", out.display()))?;
                }
            }
        }
        Err(failure) => show_problem(&failure),
    }
    done_line(path)
}

/// The line that ends every round.
fn done_line(path: &Path) -> Result<(), Failure> {
    write_out(|w| writeln!(w, "watching {} for changes (Ctrl-C stops)", path.display()))
}

/// The first problem of a failure on stderr, as the binary prints errors (with the
/// rig's line and a caret), and how many more there are.
fn show_problem(failure: &Failure) {
    let (message, more) = match failure {
        Failure::Load(e) if e.problems.len() > 1 => {
            let first = LoadError {
                file: e.file.clone(),
                problems: vec![e.problems[0].clone()],
            };
            (reeve::text::error_chain(&first), e.problems.len() - 1)
        }
        other => (other.chain(), 0),
    };
    let message = format!("reeve: {}", reeve::text::printable_lines(&message));
    eprintln!("{}", super::snippet::with_snippets(&message));
    if more > 0 {
        eprintln!(
            "(and {more} more problem{}; `reeve check` lists them all)",
            if more == 1 { "" } else { "s" }
        );
    }
}

/// The report with the reload script in its head.
pub fn with_reload(page: &[u8]) -> Vec<u8> {
    let text = String::from_utf8_lossy(page);
    match text.find("</head>") {
        Some(i) => format!("{}{RELOAD_SCRIPT}{}", &text[..i], &text[i..]).into_bytes(),
        None => page.to_vec(),
    }
}

/// `HH:MM:SS UTC`.
fn clock(now: std::time::SystemTime) -> String {
    let seconds = now
        .duration_since(std::time::UNIX_EPOCH)
        .map_or(0, |d| d.as_secs())
        % 86_400;
    format!(
        "{:02}:{:02}:{:02} UTC",
        seconds / 3600,
        seconds / 60 % 60,
        seconds % 60
    )
}

/// A stop request: SIGINT (Ctrl-C) or SIGTERM sets a flag the loop reads, so the watch
/// ends between rounds, never in the middle of writing the report. A second signal
/// ends the process at once (the default action), as a user who presses Ctrl-C twice
/// expects.
#[cfg(unix)]
mod stop {
    use std::sync::atomic::{AtomicBool, Ordering};

    static STOP: AtomicBool = AtomicBool::new(false);

    extern "C" fn on_signal(signal: libc::c_int) {
        if STOP.swap(true, Ordering::SeqCst) {
            // SAFETY: signal and raise are async-signal-safe.
            unsafe {
                libc::signal(signal, libc::SIG_DFL);
                libc::raise(signal);
            }
        }
    }

    pub fn install() {
        for signal in [libc::SIGINT, libc::SIGTERM] {
            // SAFETY: installs a handler that only touches an atomic (and, on a second
            // signal, restores the default and raises it).
            unsafe {
                libc::signal(
                    signal,
                    on_signal as extern "C" fn(libc::c_int) as libc::sighandler_t,
                );
            }
        }
    }

    pub fn requested() -> bool {
        STOP.load(Ordering::SeqCst)
    }
}

/// Without Unix signals, Ctrl-C ends the process by the system's default.
#[cfg(not(unix))]
mod stop {
    pub fn install() {}
    pub fn requested() -> bool {
        false
    }
}

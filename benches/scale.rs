//! Speed at scale, through the command line: each rig family of
//! `tests/it/support/generators.rs` at several sizes, written to a temporary directory
//! and run by a `reeve` binary as a child process (`check`, `spread`, `rank`, `sweep --stroke`). Going through the
//! binary keeps the bench valid while the library's internals change, and lets the same
//! bench measure an older binary side by side.
//!
//! ```sh
//! cargo bench --bench scale                              # target/release/reeve, just built
//! cargo bench --bench scale -- /work/bin/reeve-before    # or any other binary
//! REEVE_BIN=/path/to/reeve cargo bench --bench scale     # the same, by variable
//! cargo bench --bench scale -- --family cascade --family chain --timeout 20 --runs 3
//! cargo bench --bench scale -- --family rank --size 300 --timeout 600   # one row
//! cargo bench --bench scale -- --rigs /tmp/rigs --runs 1  # keep the generated rigs there
//! ```
//!
//! `--rigs DIR` writes each generated rig to `DIR/FAMILY-SIZE.yaml` and keeps it, to
//! profile one (`perf record -g reeve check DIR/line-sets-1215.yaml`) or to compare the
//! output of two binaries on it.
//!
//! For every measurement: the median of several runs (5 below 2 s, else 3; `--runs N`
//! sets the first, and caps the second) of wall time and of the child's user and system
//! CPU time, and its peak resident memory (the largest `ru_maxrss` from `wait4`). Each
//! run is started by a small launcher (this binary again, `--launch`), because Linux
//! counts the memory of the process that spawns a child in the child's `ru_maxrss` (the
//! bench itself holds large reports); the launcher's own 2.5 MB or so are the floor of
//! that figure. A run over the timeout (60 s; `--timeout S`) is killed and shown as
//! "> 60 s", and the family's larger sizes are not run. Time per passage divides the wall time by the rope passages solved (for
//! `spread` and `sweep`: the rig's passages times samples or steps). Growth is
//! t(10n)/t(n) against the family's row ten times smaller.
//! Where a family has a closed form, one extra `--json` run (not timed) gives the
//! relative error of the binary's value against it. No timing assertions: this prints.

use std::fmt::Write as _;
use std::fs::File;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::{mpsc, Arc};
use std::time::{Duration, Instant};

#[path = "../tests/it/support/generators.rs"]
mod generators;
use generators::{
    cascade, chain, line_set_passages, line_sets, max_line_sets, ranged_tackle, serpentine, tackle,
    tackles, CASCADE_LOAD_KG, CHAIN_LOAD_KG, G, LINE_SET_ARBOR_KG, LINE_SET_BATTEN_KG,
    RANGED_TACKLE_SHEAVES,
};

/// Capstan friction of the two chain families (the issue's 1,000-guide chain, whose tiny
/// back value is off by 2e-6, has this).
const CHAIN_MU: f64 = 0.01;
/// Sheaves of the tackle moved through its stroke.
const STROKE_SHEAVES: usize = 4;

/// What one child process cost.
#[derive(Debug, Clone, Copy)]
struct Run {
    wall: Duration,
    user: Duration,
    sys: Duration,
    peak_kib: i64,
    exit: i32,
}

fn duration(t: libc::timeval) -> Duration {
    Duration::new(t.tv_sec as u64, t.tv_usec as u32 * 1000)
}

/// Runs `binary args`, output discarded (stderr kept in `stderr_file`), killed after
/// `timeout`. `None` when it was killed.
fn run_once(binary: &Path, args: &[String], stderr_file: &Path, timeout: Duration) -> Option<Run> {
    let stderr = File::create(stderr_file).expect("stderr file");
    let start = Instant::now();
    let child = Command::new(binary)
        .args(args)
        .stdin(Stdio::null())
        .stdout(Stdio::null())
        .stderr(stderr)
        .spawn()
        .unwrap_or_else(|e| panic!("cannot run {}: {e}", binary.display()));
    let pid = child.id() as libc::pid_t;
    // A watchdog kills the child at the timeout. The child is reaped only after the
    // watchdog has stopped, so its pid cannot have been reused when it is killed.
    let killed = Arc::new(AtomicBool::new(false));
    let (done, wait) = mpsc::channel::<()>();
    let watchdog = {
        let killed = Arc::clone(&killed);
        std::thread::spawn(move || {
            if wait.recv_timeout(timeout).is_err() {
                killed.store(true, Ordering::SeqCst);
                // SAFETY: plain syscall on our own, not yet reaped, child.
                unsafe { libc::kill(pid, libc::SIGKILL) };
            }
        })
    };
    loop {
        // SAFETY: `info` is a valid out-pointer; WNOWAIT leaves the child unreaped.
        let mut info: libc::siginfo_t = unsafe { std::mem::zeroed() };
        let r = unsafe {
            libc::waitid(
                libc::P_PID,
                pid as libc::id_t,
                &mut info,
                libc::WEXITED | libc::WNOWAIT,
            )
        };
        if r == 0 || std::io::Error::last_os_error().raw_os_error() != Some(libc::EINTR) {
            break;
        }
    }
    let wall = start.elapsed();
    let _ = done.send(());
    watchdog.join().expect("watchdog");
    let mut status = 0;
    // SAFETY: valid out-pointers; reaps our own child.
    let mut usage: libc::rusage = unsafe { std::mem::zeroed() };
    let reaped = unsafe { libc::wait4(pid, &mut status, 0, &mut usage) };
    assert_eq!(reaped, pid, "wait4: {}", std::io::Error::last_os_error());
    std::mem::forget(child); // already reaped: dropping it must not wait again
    if killed.load(Ordering::SeqCst) {
        return None;
    }
    let exit = if libc::WIFEXITED(status) {
        libc::WEXITSTATUS(status)
    } else {
        -libc::WTERMSIG(status)
    };
    Some(Run {
        wall,
        user: duration(usage.ru_utime),
        sys: duration(usage.ru_stime),
        peak_kib: usage.ru_maxrss,
        exit,
    })
}

/// Launcher mode, `scale --launch TIMEOUT_S STDERR_FILE BINARY ARGS...`: one
/// [`run_once`] from a fresh, small process; prints its figures on one line
/// (nanoseconds, KiB, exit code) or `timeout`.
fn launch(args: &[String]) {
    let [timeout, stderr_file, binary, rest @ ..] = args else {
        panic!("--launch TIMEOUT_S STDERR_FILE BINARY ARGS...");
    };
    let timeout = Duration::from_secs_f64(timeout.parse().expect("--launch TIMEOUT_S"));
    match run_once(Path::new(binary), rest, Path::new(stderr_file), timeout) {
        Some(r) => println!(
            "{} {} {} {} {}",
            r.wall.as_nanos(),
            r.user.as_nanos(),
            r.sys.as_nanos(),
            r.peak_kib,
            r.exit
        ),
        None => println!("timeout"),
    }
}

/// [`run_once`] through the launcher (see [`launch`]).
fn run_launched(
    binary: &Path,
    args: &[String],
    stderr_file: &Path,
    timeout: Duration,
) -> Option<Run> {
    let launcher = std::env::current_exe().expect("the bench binary's own path");
    let out = Command::new(launcher)
        .arg("--launch")
        .arg(timeout.as_secs_f64().to_string())
        .arg(stderr_file)
        .arg(binary)
        .args(args)
        .stdin(Stdio::null())
        .output()
        .expect("run the launcher");
    let text = String::from_utf8_lossy(&out.stdout);
    if text.trim() == "timeout" {
        return None;
    }
    let fields: Vec<i64> = text
        .split_whitespace()
        .map(|f| f.parse().expect("launcher figure"))
        .collect();
    let [wall, user, sys, peak_kib, exit] = fields[..] else {
        panic!(
            "the launcher failed: {}{}",
            text,
            String::from_utf8_lossy(&out.stderr)
        );
    };
    let nanos = |n: i64| Duration::from_nanos(n as u64);
    Some(Run {
        wall: nanos(wall),
        user: nanos(user),
        sys: nanos(sys),
        peak_kib,
        exit: exit as i32,
    })
}

/// The median of each figure over `runs` runs (fewer for slow commands).
fn measure(binary: &Path, args: &[String], scratch: &Path, settings: &Settings) -> Measured {
    let stderr_file = scratch.join("stderr.txt");
    let Some(first) = run_launched(binary, args, &stderr_file, settings.timeout) else {
        return Measured::TimedOut;
    };
    let message = std::fs::read_to_string(&stderr_file)
        .unwrap_or_default()
        .lines()
        .next()
        .unwrap_or("")
        .to_string();
    let runs = if first.wall < Duration::from_secs(2) {
        settings.runs
    } else {
        settings.runs.min(3)
    };
    let mut all = vec![first];
    for _ in 1..runs {
        match run_launched(binary, args, &stderr_file, settings.timeout) {
            Some(r) => all.push(r),
            None => return Measured::TimedOut,
        }
    }
    let median = |f: &dyn Fn(&Run) -> Duration| {
        let mut v: Vec<Duration> = all.iter().map(f).collect();
        v.sort();
        v[v.len() / 2]
    };
    Measured::Done {
        wall: median(&|r| r.wall),
        user: median(&|r| r.user),
        sys: median(&|r| r.sys),
        peak_kib: all.iter().map(|r| r.peak_kib).max().unwrap_or(0),
        exit: first.exit,
        message,
        runs: all.len(),
    }
}

#[derive(Debug, Clone)]
enum Measured {
    TimedOut,
    Done {
        wall: Duration,
        user: Duration,
        sys: Duration,
        peak_kib: i64,
        exit: i32,
        message: String,
        runs: usize,
    },
}

/// One row of the table: a family at one size.
struct Case {
    family: &'static str,
    size: usize,
    /// Rope passages solved in one command: passages of the rig, times samples or steps.
    passages: usize,
    rig: String,
    /// Arguments after the rig file.
    args: Vec<String>,
    /// The command (before the rig file).
    command: &'static str,
    /// Closed form: the JSON case (`forward`, `back`) of `check --json` and its expected
    /// value, given the report (some closed forms use its reported wraps).
    closed_form: Option<(&'static str, Expected)>,
}

/// The expected value of a closed form, from the report where it needs reported data.
type Expected = Box<dyn Fn(&serde_json::Value) -> Option<f64>>;

/// Sum of the wraps of every guide in a `check --json` report, radians.
fn guide_wraps(report: &serde_json::Value) -> Option<f64> {
    report["parts"]
        .as_array()?
        .iter()
        .filter(|p| p["kind"] == "guide")
        .map(|p| p["wrap_deg"].as_f64().map(f64::to_radians))
        .sum()
}

/// A `check` of a rig.
fn check(
    family: &'static str,
    size: usize,
    passages: usize,
    rig: String,
    closed_form: Option<(&'static str, Expected)>,
) -> Case {
    Case {
        family,
        size,
        passages,
        rig,
        args: vec![],
        command: "check",
        closed_form,
    }
}

fn strings(args: &[&str]) -> Vec<String> {
    args.iter().map(|s| s.to_string()).collect()
}

fn cases(families: &[String]) -> Vec<Case> {
    let wanted = |f: &str| families.is_empty() || families.iter().any(|w| w == f);
    let mut cases = Vec::new();
    if wanted("line-sets") {
        let largest = max_line_sets();
        for n in [10, 100, 1000, largest] {
            // Derived in `line_sets` (virtual work): (180 − 170) kg · g.
            let ideal: Expected = Box::new(|_| Some((LINE_SET_BATTEN_KG - LINE_SET_ARBOR_KG) * G));
            let (passages, rig) = (line_set_passages(n), line_sets(n));
            cases.push(check("line-sets", n, passages, rig, Some(("ideal", ideal))));
        }
        // Reading and validating the largest file alone: the same text with a drive
        // that does not exist, refused (exit 2) only after the whole file is read.
        let rig = line_sets(largest).replace("drive: s0.operator", "drive: s0.nobody");
        let passages = line_set_passages(largest);
        cases.push(check("line-sets-load", largest, passages, rig, None));
    }
    if wanted("cascade") {
        for n in [10, 30, 100, 300, 1000] {
            // W/2^N (derived in `cascade`), frictionless: forward = ideal.
            let forward: Expected =
                Box::new(move |_| Some(CASCADE_LOAD_KG * G / 2f64.powi(n as i32)));
            let rig = cascade(n, "{kind: none}");
            cases.push(check("cascade", n, n, rig, Some(("forward", forward))));
        }
    }
    if wanted("chain") {
        // The zig-zag of `chain`: back = W·exp(−μΣφ) over the wraps the binary reports.
        for n in [10, 100, 1000, 10000] {
            // `chain` hangs 1 kg.
            let back: Expected = Box::new(|r| Some(G * (-CHAIN_MU * guide_wraps(r)?).exp()));
            cases.push(check(
                "chain",
                n,
                n,
                chain(n, CHAIN_MU),
                Some(("back", back)),
            ));
        }
    }
    if wanted("serpentine") {
        // Every wrap exactly π: back = W·exp(−μNπ), no geometry needed.
        for n in [10, 100, 1000, 10000] {
            let back: Expected = Box::new(move |_| {
                let turn = CHAIN_MU * n as f64 * std::f64::consts::PI;
                Some(CHAIN_LOAD_KG * G * (-turn).exp())
            });
            let rig = serpentine(n, CHAIN_MU);
            cases.push(check("serpentine", n, n, rig, Some(("back", back))));
        }
    }
    if wanted("spread") {
        for samples in [100, 1000, 10_000, 100_000] {
            cases.push(Case {
                family: "spread",
                size: samples,
                passages: RANGED_TACKLE_SHEAVES * samples,
                rig: ranged_tackle(),
                args: strings(&["--samples", &samples.to_string(), "--seed", "1"]),
                command: "spread",
                closed_form: None,
            });
        }
    }
    if wanted("rank") {
        for n in [10, 30, 100, 300, 1000] {
            cases.push(Case {
                family: "rank",
                size: n,
                passages: 2 * n,
                rig: tackles(n),
                args: vec![],
                command: "rank",
                closed_form: None,
            });
        }
    }
    if wanted("stroke") {
        for steps in [100, 1000, 10_000, 100_000] {
            cases.push(Case {
                family: "stroke",
                size: steps,
                passages: STROKE_SHEAVES * (steps + 1),
                rig: tackle(STROKE_SHEAVES),
                args: strings(&["--stroke", "1000 mm", "--steps", &steps.to_string()]),
                command: "sweep",
                closed_form: None,
            });
        }
    }
    cases
}

/// What one extra `check --json` run says: the relative error of the binary's value
/// against the closed form, if the family has one, and the codes of failing checks.
fn check_note(binary: &Path, rig: &Path, closed_form: Option<&(&str, Expected)>) -> String {
    let out = match Command::new(binary)
        .arg("check")
        .arg(rig)
        .arg("--json")
        .output()
    {
        Ok(out) => out,
        Err(e) => return format!("cannot run: {e}"),
    };
    let report = serde_json::from_slice::<serde_json::Value>(&out.stdout).unwrap_or_default();
    let mut notes = Vec::new();
    if let Some((field, expected)) = closed_form {
        notes.push(
            match (report[*field]["value"].as_f64(), expected(&report)) {
                (Some(v), Some(expected)) => format!(
                    "{field} rel. err {:.1e}",
                    (v - expected).abs() / expected.abs()
                ),
                _ => format!("no {field} value"),
            },
        );
    }
    let mut failing: Vec<&str> = report["warnings"]
        .as_array()
        .into_iter()
        .flatten()
        .filter(|w| w["fails"] == true)
        .filter_map(|w| w["code"].as_str())
        .collect();
    failing.dedup();
    if !failing.is_empty() {
        notes.push(format!("fails: {}", failing.join(", ")));
    }
    notes.join("; ")
}

struct Settings {
    binary: PathBuf,
    families: Vec<String>,
    /// Only these sizes (all when empty).
    sizes: Vec<usize>,
    timeout: Duration,
    runs: usize,
    /// Where to write the generated rigs and keep them (a scratch folder when None).
    rigs: Option<PathBuf>,
}

/// What `cargo bench --bench scale -- --help` prints.
const HELP: &str = "\
Speed at scale: every generated rig family at several sizes, run by a `reeve` binary.

Usage: cargo bench --bench scale -- [OPTIONS] [BINARY]

Arguments:
  [BINARY]        the `reeve` binary to time (default: $REEVE_BIN, else the one cargo
                  just built, target/release/reeve)

Options:
  --family F      only family F; may be repeated (line-sets, which includes the
                  line-sets-load row, cascade, chain, serpentine, spread, rank, stroke)
  --size N        only size N; may be repeated
  --timeout S     kill a run after S seconds and skip the family's larger sizes
                  (default 60)
  --runs N        runs per measurement: N below 2 s, at most 3 above (default 5)
  --rigs DIR      write the generated rigs to DIR/FAMILY-SIZE.yaml and keep them
  -h, --help      print this and exit

Prints a Markdown table: median wall and CPU time, time per passage, growth
t(10n)/t(n), peak memory, and the error against the closed form where there is one.
Figures and how they were taken: benches/BASELINE.md.
";

fn settings() -> Settings {
    let mut binary = std::env::var_os("REEVE_BIN").map(PathBuf::from);
    let mut families = Vec::new();
    let mut sizes = Vec::new();
    let mut timeout = Duration::from_secs(60);
    let mut runs = 5;
    let mut rigs = None;
    let mut args = std::env::args().skip(1);
    while let Some(a) = args.next() {
        let mut value = |name: &str| {
            args.next()
                .unwrap_or_else(|| panic!("{name} needs a value"))
        };
        match a.as_str() {
            "--family" => families.push(value("--family")),
            "--size" => sizes.push(value("--size").parse().expect("--size N")),
            "--timeout" => {
                timeout = Duration::from_secs_f64(value("--timeout").parse().expect("--timeout S"))
            }
            "--runs" => runs = value("--runs").parse().expect("--runs N"),
            "--rigs" => rigs = Some(PathBuf::from(value("--rigs"))),
            "--help" | "-h" => {
                print!("{HELP}");
                std::process::exit(0);
            }
            // `cargo bench` passes `--bench` to every bench binary.
            "--bench" => {}
            flag if flag.starts_with("--") => {
                panic!(
                    "unknown flag {flag}: expected --family F, --size N, --timeout S, --runs N, --rigs DIR, --help, or a binary"
                )
            }
            path => binary = Some(PathBuf::from(path)),
        }
    }
    Settings {
        binary: binary.unwrap_or_else(|| PathBuf::from(env!("CARGO_BIN_EXE_reeve"))),
        families,
        sizes,
        timeout,
        runs: runs.max(1),
        rigs,
    }
}

fn seconds(d: Duration) -> String {
    let s = d.as_secs_f64();
    if s < 1.0 {
        format!("{:.1} ms", s * 1e3)
    } else {
        format!("{s:.2} s")
    }
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if args.get(1).map(String::as_str) == Some("--launch") {
        launch(&args[2..]);
        return;
    }
    let settings = settings();
    let scratch = std::env::temp_dir().join(format!("reeve-bench-scale-{}", std::process::id()));
    std::fs::create_dir_all(&scratch).expect("scratch dir");
    println!("binary: {}", settings.binary.display());
    println!("load average before: {}", load_average());
    println!(
        "timeout {} s; medians of up to {} runs; growth = t(10n)/t(n)\n",
        settings.timeout.as_secs_f64(),
        settings.runs
    );
    println!(
        "| family | size | passages | wall | user | sys | wall/passage | growth (wall) | growth (user) | peak MB | exit | runs | closed form / message |"
    );
    println!("|---|--:|--:|--:|--:|--:|--:|--:|--:|--:|--:|--:|---|");
    let mut done: Vec<(&'static str, usize, Measured)> = Vec::new();
    let cases = cases(&settings.families)
        .into_iter()
        .filter(|c| settings.sizes.is_empty() || settings.sizes.contains(&c.size));
    if let Some(dir) = &settings.rigs {
        std::fs::create_dir_all(dir).expect("--rigs DIR");
    }
    for case in cases {
        let folder = settings.rigs.as_ref().unwrap_or(&scratch);
        let rig = folder.join(format!("{}-{}.yaml", case.family, case.size));
        std::fs::write(&rig, &case.rig).expect("write rig");
        let mut args = vec![case.command.to_string(), rig.display().to_string()];
        args.extend(case.args.iter().cloned());
        let mut row = format!("| {} | {} | {} |", case.family, case.size, case.passages);
        let over = format!("> {} s", settings.timeout.as_secs());
        // A larger size of a family that already ran over the timeout would too.
        let smaller_timed_out = done
            .iter()
            .find(|(f, n, m)| {
                *f == case.family && *n < case.size && matches!(m, Measured::TimedOut)
            })
            .map(|(_, n, _)| *n);
        if let Some(n) = smaller_timed_out {
            let _ = write!(
                row,
                " {over} | | | | | | | | | 0 | not run: size {n} ran over |"
            );
            println!("{row}");
            done.push((case.family, case.size, Measured::TimedOut));
            continue;
        }
        let measured = measure(&settings.binary, &args, &scratch, &settings);
        match &measured {
            Measured::TimedOut => {
                let _ = write!(row, " {over} | | | | | | | | killed | 1 | |");
            }
            Measured::Done {
                wall,
                user,
                sys,
                peak_kib,
                exit,
                message,
                runs,
            } => {
                let per = wall.as_secs_f64() / case.passages as f64;
                let earlier = done.iter().find_map(|(f, n, m)| match m {
                    Measured::Done { wall, user, .. }
                        if *f == case.family && n * 10 == case.size =>
                    {
                        Some((*wall, *user))
                    }
                    _ => None,
                });
                let growth = |now: Duration, then: Option<Duration>| match then {
                    Some(t) if t > Duration::ZERO => {
                        format!("{:.1}", now.as_secs_f64() / t.as_secs_f64())
                    }
                    _ => "—".to_string(),
                };
                let note = if *exit == 2 {
                    // The rig's temporary path says nothing: keep the file name.
                    message.replace(&format!("{}/", folder.display()), "")
                } else if case.command == "check" && (case.closed_form.is_some() || *exit != 0) {
                    check_note(&settings.binary, &rig, case.closed_form.as_ref())
                } else if *exit != 0 {
                    message.clone()
                } else {
                    String::new()
                };
                let _ = write!(
                    row,
                    " {} | {} | {} | {:.2} µs | {} | {} | {:.1} | {exit} | {runs} | {note} |",
                    seconds(*wall),
                    seconds(*user),
                    seconds(*sys),
                    per * 1e6,
                    growth(*wall, earlier.map(|e| e.0)),
                    growth(*user, earlier.map(|e| e.1)),
                    *peak_kib as f64 / 1024.0,
                );
            }
        }
        println!("{row}");
        done.push((case.family, case.size, measured));
        if settings.rigs.is_none() {
            let _ = std::fs::remove_file(&rig);
        }
    }
    let _ = std::fs::remove_dir_all(&scratch);
    println!("\nload average after: {}", load_average());
}

/// The 1, 5 and 15 minute load averages (other work on the machine skews the times).
fn load_average() -> String {
    std::fs::read_to_string("/proc/loadavg")
        .map(|l| l.split_whitespace().take(3).collect::<Vec<_>>().join(" "))
        .unwrap_or_else(|_| "unknown".to_string())
}

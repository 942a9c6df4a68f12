//! The drawing-set outputs, through the real `reeve` binary: golden text, Markdown and
//! CSV tables; CSV and JSON parsed back; the SVG parsed as XML and rendered to pixels;
//! the HTML report opened in headless Chromium; atomic writes and the refusal to write
//! over the input rig.
//!
//! Golden files live in `tests/golden/`; `REEVE_BLESS=1 cargo test --test it golden`
//! rewrites them. These are format tests, not physics tests: the numbers in the golden
//! files are whatever the solver computes, checked elsewhere against their sources.

use reeve::model::{LineId, PartId};
use std::collections::BTreeSet;
use std::fs;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

use serde::Deserialize;

use crate::support::golden::golden;
use crate::support::{
    assert_abs, example_rig, reeve, reeve_in, stdout_of, Scratch, ONE_SHEAVE, ROOT,
};

const GOLDEN_RIGS: [&str; 2] = ["workshop-hoist", "sash-window"];

mod drawings;
mod html;
mod tables;
mod text;
mod writes;

/// The headless browser, if one is installed.
fn browser() -> Option<PathBuf> {
    for name in [
        "chromium",
        "chromium-browser",
        "google-chrome",
        "google-chrome-stable",
    ] {
        if let Some(path) = std::env::var_os("PATH").and_then(|paths| {
            std::env::split_paths(&paths)
                .map(|d| d.join(name))
                .find(|p| p.is_file())
        }) {
            return Some(path);
        }
    }
    None
}

/// The headless browser; where none is installed, `None` (the caller skips its browser
/// checks, saying so), unless `REEVE_REQUIRE_BROWSER=1` demands one (CI).
pub(crate) fn browser_or_skip(skipped: &str) -> Option<PathBuf> {
    let found = browser();
    if found.is_none() {
        if std::env::var("REEVE_REQUIRE_BROWSER").as_deref() == Ok("1") {
            panic!("REEVE_REQUIRE_BROWSER=1 but no chromium was found on PATH");
        }
        eprintln!("skipped: no headless browser (chromium) on PATH{skipped}");
    }
    found
}

/// A headless browser command with its own profile and the flags that keep it from
/// reaching for the network (NOTES.md).
pub(crate) fn headless(browser: &Path, profile: &Path) -> Command {
    let mut cmd = Command::new(browser);
    cmd.args([
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
    ])
    .arg(format!("--user-data-dir={}", profile.display()));
    cmd
}

/// Runs a command with a deadline; returns its stdout.
pub(crate) fn run_with_deadline(mut cmd: Command, deadline: Duration) -> String {
    let mut child = cmd
        .stdout(Stdio::piped())
        .stderr(Stdio::null())
        .spawn()
        .expect("start the browser");
    let mut stdout = child.stdout.take().unwrap();
    let reader = std::thread::spawn(move || {
        let mut s = String::new();
        let _ = std::io::Read::read_to_string(&mut stdout, &mut s);
        s
    });
    let start = Instant::now();
    loop {
        if child.try_wait().unwrap().is_some() {
            break;
        }
        if start.elapsed() > deadline {
            let _ = child.kill();
            let _ = child.wait();
            panic!("the browser did not finish within {deadline:?}");
        }
        std::thread::sleep(Duration::from_millis(100));
    }
    reader.join().unwrap()
}

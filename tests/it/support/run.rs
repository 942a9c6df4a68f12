//! The real `reeve` executable, run as a user runs it: arguments, a working folder,
//! optionally a rig given as text (written to a fresh file whose path follows the
//! command). The binary reads no standard input, so a run gets none.

use std::ffi::OsString;
use std::path::{Path, PathBuf};
use std::process::Command;

use super::{Scratch, ROOT};

/// What one run of the binary gave: its exit code and both streams as text.
#[derive(Debug)]
pub struct Ran {
    /// The command line, for messages.
    pub args: Vec<String>,
    pub code: i32,
    pub stdout: String,
    pub stderr: String,
}

impl Ran {
    /// Asserts the exit code (showing the command and both streams where it differs)
    /// and hands the run on.
    #[track_caller]
    pub fn expect_code(self, code: i32) -> Ran {
        assert_eq!(
            self.code, code,
            "reeve {:?}: exit {} (expected {code})\nstderr: {}\nstdout: {}",
            self.args, self.code, self.stderr, self.stdout
        );
        self
    }

    /// (exit code, stdout, stderr), for `let (code, out, err) = reeve(…).parts();`.
    pub fn parts(self) -> (i32, String, String) {
        (self.code, self.stdout, self.stderr)
    }

    /// Standard output parsed as JSON, whatever the exit code.
    #[track_caller]
    pub fn json(&self) -> serde_json::Value {
        serde_json::from_str(&self.stdout).unwrap_or_else(|e| {
            panic!(
                "reeve {:?}: stdout is not JSON ({e})\nstderr: {}\nstdout: {}",
                self.args, self.stderr, self.stdout
            )
        })
    }
}

/// A run of the binary being set up.
pub struct Reeve {
    args: Vec<OsString>,
    dir: PathBuf,
    rig: Option<String>,
}

impl Reeve {
    /// `reeve ARGS`, run in the package's root folder (where `rigs/` and `tests/` are).
    pub fn new<S: AsRef<std::ffi::OsStr>>(args: impl IntoIterator<Item = S>) -> Reeve {
        Reeve {
            args: args.into_iter().map(|a| a.as_ref().to_owned()).collect(),
            dir: PathBuf::from(ROOT),
            rig: None,
        }
    }

    /// Runs in `dir` instead (relative paths in the arguments are then under it).
    pub fn in_dir(mut self, dir: &Path) -> Reeve {
        self.dir = dir.to_owned();
        self
    }

    /// Writes `text` to a fresh rig file and puts its path after the first argument
    /// (the command): `Reeve::new(["check", "--json"]).rig_text(t)` runs
    /// `reeve check RIG --json`.
    pub fn rig_text(mut self, text: &str) -> Reeve {
        self.rig = Some(text.to_owned());
        self
    }

    /// Runs it to the end. A run ended by a signal (a crash, an abort) fails the test:
    /// no exit code can stand for it.
    #[track_caller]
    pub fn run(self) -> Ran {
        let mut args = self.args;
        let scratch = self.rig.map(|text| {
            let scratch = Scratch::new("rig");
            let path = scratch.write("rig.yaml", &text);
            args.insert(args.len().min(1), path.into_os_string());
            scratch
        });
        let shown: Vec<String> = args.iter().map(|a| a.to_string_lossy().into()).collect();
        let out = Command::new(env!("CARGO_BIN_EXE_reeve"))
            .args(&args)
            .current_dir(&self.dir)
            // A fixed date (2026-01-01) in drawings and reports, for stable outputs.
            .env("SOURCE_DATE_EPOCH", "1767225600")
            .output()
            .unwrap_or_else(|e| panic!("reeve {shown:?} does not start: {e}"));
        drop(scratch);
        let stdout = String::from_utf8_lossy(&out.stdout).into_owned();
        let stderr = String::from_utf8_lossy(&out.stderr).into_owned();
        let Some(code) = out.status.code() else {
            panic!(
                "reeve {shown:?} was ended by a signal ({})\nstderr: {stderr}\nstdout: {stdout}",
                out.status
            );
        };
        Ran {
            args: shown,
            code,
            stdout,
            stderr,
        }
    }
}

/// `reeve ARGS` in the package's root folder.
#[track_caller]
pub fn reeve(args: &[&str]) -> Ran {
    Reeve::new(args).run()
}

/// Standard output of `reeve ARGS`, which must succeed (exit 0).
#[track_caller]
pub fn stdout_of(args: &[&str]) -> String {
    reeve(args).expect_code(0).stdout
}

/// Standard output of `reeve ARGS`, which must succeed (exit 0), parsed as JSON.
#[track_caller]
pub fn json_of(args: &[&str]) -> serde_json::Value {
    reeve(args).expect_code(0).json()
}

/// `reeve ARGS` on a rig given as text (see [`Reeve::rig_text`]).
#[track_caller]
pub fn reeve_on(text: &str, args: &[&str]) -> Ran {
    Reeve::new(args).rig_text(text).run()
}

/// `reeve ARGS` run in `dir` (relative paths in the arguments are under it).
#[track_caller]
pub fn reeve_in(dir: &std::path::Path, args: &[&str]) -> Ran {
    Reeve::new(args).in_dir(dir).run()
}

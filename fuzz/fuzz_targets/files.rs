//! Fuzz target, slow: the command line's file checks, through the real `reeve` binary
//! (they live in the binary's glue, and a separate process is the only way to see its
//! exit code and what it leaves on disk). Each input is a rig written to a scratch
//! folder and an output path laid out to trap a careless writer.
//!
//! The input is rig text; `#%` lines choose the layout and the command:
//!
//! ```text
//! #% out same|symlink|hardlink|dotdot|new|existing|dangling|folder
//! #% cmd table|draw|report|plot
//! ```
//!
//! `same`, `symlink`, `hardlink` and `dotdot` name the input rig itself (its path, a
//! symbolic link to it, a hard link to it, `sub/../rig.yaml`); `existing` is an output
//! file already there, beside a stale temporary file of a process that is gone;
//! `dangling` a symbolic link to a file not yet there; `folder` a directory.
//!
//! Oracles: the input rig is never changed; the exit code is 0, 1 or 2 (never a panic
//! or a signal) and stderr names no panic; exit 2 says why on stderr; an output that
//! names the input is refused with exit 2; a written output is whole (an SVG parses as
//! XML, an HTML report ends with `</html>`); no temporary file is left behind, the
//! stale one included; a symbolic link written through is kept.
//!
//! The binary is `$REEVE_BIN`, or the workspace's debug build (`cargo build` first).
//! Run (nightly): `cargo +nightly fuzz run files corpus/files -- -dict=rig.dict
//! -max_len=4096 -timeout=10`.
#![no_main]

use std::fs;
use std::path::PathBuf;
use std::process::Command;
use std::sync::OnceLock;
use std::time::{Duration, SystemTime};

use libfuzzer_sys::fuzz_target;

fn binary() -> &'static PathBuf {
    static BIN: OnceLock<PathBuf> = OnceLock::new();
    BIN.get_or_init(|| {
        let bin = std::env::var_os("REEVE_BIN").map_or_else(
            || {
                PathBuf::from(concat!(
                    env!("CARGO_MANIFEST_DIR"),
                    "/../target/debug/reeve"
                ))
            },
            PathBuf::from,
        );
        assert!(
            bin.exists(),
            "no reeve binary at {} (cargo build, or set REEVE_BIN)",
            bin.display()
        );
        bin
    })
}

fn scratch() -> PathBuf {
    std::env::temp_dir().join(format!("reeve-fuzz-files-{}", std::process::id()))
}

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let (mut out, mut cmd) = ("new", "draw");
    for line in text.lines() {
        if let Some(o) = line.strip_prefix("#% out ") {
            out = o.trim();
        } else if let Some(c) = line.strip_prefix("#% cmd ") {
            cmd = c.trim();
        }
    }
    let dir = scratch();
    let _ = fs::remove_dir_all(&dir);
    fs::create_dir_all(dir.join("sub")).unwrap();
    let rig = dir.join("rig.yaml");
    fs::write(&rig, data).unwrap();
    let ext = match cmd {
        "table" => "txt",
        "report" => "html",
        _ => "svg",
    };
    let file = |name: &str| dir.join(name);
    let stale = file(&format!(".out.{ext}.4000000000-0.tmp"));
    let (target, names_input) = match out {
        "same" => (rig.clone(), true),
        "symlink" => {
            std::os::unix::fs::symlink("rig.yaml", file("link.yaml")).unwrap();
            (file("link.yaml"), true)
        }
        "hardlink" => {
            fs::hard_link(&rig, file("hard.yaml")).unwrap();
            (file("hard.yaml"), true)
        }
        "dotdot" => (dir.join("sub/../rig.yaml"), true),
        "existing" => {
            fs::write(file(&format!("out.{ext}")), "old\n").unwrap();
            fs::write(&stale, "half a drawing").unwrap();
            let old = SystemTime::now() - Duration::from_secs(600);
            fs::File::options()
                .write(true)
                .open(&stale)
                .unwrap()
                .set_modified(old)
                .unwrap();
            (file(&format!("out.{ext}")), false)
        }
        "dangling" => {
            std::os::unix::fs::symlink(format!("sub/real.{ext}"), file("link.out")).unwrap();
            (file("link.out"), false)
        }
        "folder" => (file("sub"), false),
        _ => (file(&format!("out.{ext}")), false),
    };
    let mut command = Command::new(binary());
    command.current_dir(&dir).env("SOURCE_DATE_EPOCH", "0");
    match cmd {
        "table" => command.args(["table", "rig.yaml", "-o"]).arg(&target),
        "report" => command.args(["report", "rig.yaml", "-o"]).arg(&target),
        "plot" => command
            .args([
                "sweep", "rig.yaml", "--stroke", "10 mm", "--steps", "2", "--plot",
            ])
            .arg(&target),
        _ => command.args(["draw", "rig.yaml", "-o"]).arg(&target),
    };
    let run = command.output().expect("the reeve binary runs");
    let stderr = String::from_utf8_lossy(&run.stderr);
    let code = run.status.code();
    assert!(
        matches!(code, Some(0..=2)),
        "exit {:?} (a panic or a signal), stderr:\n{stderr}",
        run.status
    );
    assert!(!stderr.contains("panicked"), "a panic:\n{stderr}");
    assert_eq!(fs::read(&rig).unwrap(), data, "the input rig was changed");
    if code == Some(2) {
        assert!(!stderr.trim().is_empty(), "exit 2 without a word");
    }
    if names_input {
        assert_eq!(
            code,
            Some(2),
            "an output naming the input was accepted:\n{stderr}"
        );
    }
    let written = code != Some(2) && out != "folder";
    if written {
        let path = if out == "dangling" {
            assert!(
                fs::symlink_metadata(&target)
                    .unwrap()
                    .file_type()
                    .is_symlink(),
                "the link written through was replaced"
            );
            file(&format!("sub/real.{ext}"))
        } else {
            target.clone()
        };
        let body = fs::read_to_string(&path)
            .unwrap_or_else(|e| panic!("{} not written: {e}", path.display()));
        match ext {
            "svg" => {
                roxmltree::Document::parse(&body)
                    .unwrap_or_else(|e| panic!("the SVG does not parse: {e}"));
            }
            "html" => assert!(body.trim_end().ends_with("</html>"), "a cut HTML report"),
            _ => assert!(!body.trim().is_empty() && body != "old\n", "an empty table"),
        }
    }
    for folder in [dir.clone(), dir.join("sub")] {
        for entry in fs::read_dir(&folder).unwrap().flatten() {
            let name = entry.file_name().to_string_lossy().into_owned();
            // The stale leftover goes only when a write gets that far.
            let planted = entry.path() == stale && !written;
            assert!(
                planted || !name.ends_with(".tmp"),
                "a temporary file left behind: {name}"
            );
        }
    }
});

//! `motion`'s progress bar (issue 13 item 8): drawn on a terminal only, never in piped
//! or redirected output.

use crate::support::{example_rig, reeve, Scratch};

#[test]
fn piped_motion_shows_no_progress() {
    // Issue 13 item 8: the bar is drawn on a terminal only; piped (as here: the test
    // reads both streams) neither stream carries it, whatever the format.
    let rig = example_rig("ballast-panel");
    for format in ["text", "csv", "json"] {
        let ran = reeve(&["motion", &rig, "--format", format]);
        assert_eq!(ran.code, 0, "{}", ran.stderr);
        for (stream, text) in [("stdout", &ran.stdout), ("stderr", &ran.stderr)] {
            assert!(
                !text.contains('\r'),
                "{format}: carriage return on {stream}"
            );
            assert!(!text.contains("runs,"), "{format}: progress on {stream}");
            assert!(!text.contains("motion ["), "{format}: a bar on {stream}");
            assert!(
                !text.contains("\u{1b}["),
                "{format}: terminal codes on {stream}"
            );
        }
    }
}

/// On a terminal (a pseudo-terminal made by util-linux `script`, where installed) the
/// bar is drawn on stderr, and stdout redirected to a file still gets none of it.
#[test]
fn a_terminal_shows_the_motion_progress_bar() {
    let Some(script) = std::env::var_os("PATH").and_then(|paths| {
        std::env::split_paths(&paths)
            .map(|d| d.join("script"))
            .find(|p| p.is_file())
    }) else {
        eprintln!("skipped: no `script` on PATH to make a terminal");
        return;
    };
    let dir = Scratch::new("motion-progress");
    let out = dir.join("out.txt");
    let log = dir.join("tty.log");
    let command = format!(
        "'{}' motion '{}' > '{}'",
        env!("CARGO_BIN_EXE_reeve"),
        example_rig("ballast-panel"),
        out.display()
    );
    let status = std::process::Command::new(script)
        .args(["-q", "-e", "-c", &command])
        .arg(&log)
        .stdin(std::process::Stdio::null())
        .stdout(std::process::Stdio::null())
        .stderr(std::process::Stdio::null())
        .status()
        .unwrap();
    assert!(status.success(), "{status}");
    let terminal = std::fs::read_to_string(&log).unwrap_or_default();
    assert!(terminal.contains("motion ["), "no bar:\n{terminal:.400}");
    let printed = std::fs::read_to_string(&out).unwrap();
    assert!(
        !printed.contains("runs,") && !printed.contains('\r'),
        "{printed}"
    );
    assert!(printed.contains("Caution"), "{printed}");
}

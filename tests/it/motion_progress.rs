//! `motion`'s progress bar (issue 13 item 8): drawn on a terminal only, never in piped
//! or redirected output.

use crate::support::terminal::{assert_no_progress, on_terminal};
use crate::support::{example_rig, reeve};

#[test]
fn piped_motion_shows_no_progress() {
    // Issue 13 item 8: the bar is drawn on a terminal only; piped (as here: the test
    // reads both streams) neither stream carries it, whatever the format.
    let rig = example_rig("ballast-panel");
    for format in ["text", "csv", "json"] {
        let ran = reeve(&["motion", &rig, "--format", format]);
        assert_eq!(ran.code, 0, "{}", ran.stderr);
        for (stream, text) in [("stdout", &ran.stdout), ("stderr", &ran.stderr)] {
            assert_no_progress(format, stream, text);
            assert!(!text.contains("motion ["), "{format}: a bar on {stream}");
        }
    }
}

/// On a terminal (a pseudo-terminal made by util-linux `script`, where installed) the
/// bar is drawn on stderr, and stdout redirected to a file still gets none of it.
#[test]
fn a_terminal_shows_the_motion_progress_bar() {
    let rig = example_rig("ballast-panel");
    let Some((terminal, printed)) = on_terminal("motion-progress", &["motion", &rig]) else {
        eprintln!("skipped: no `script` on PATH to make a terminal");
        return;
    };
    assert!(terminal.contains("motion ["), "no bar:\n{terminal:.400}");
    assert_no_progress("motion", "the redirected stdout", &printed);
    assert!(printed.contains("Caution"), "{printed}");
}

//! Progress bars (issue 13 item 8): what piped output must not hold, and running the
//! binary on a pseudo-terminal (util-linux `script`) to see the bar drawn.

use super::Scratch;

/// Asserts that `text`, from `stream` of the run `what`, holds no progress bar: no
/// carriage return, no bar counter (`runs,`), no terminal codes.
pub fn assert_no_progress(what: &str, stream: &str, text: &str) {
    assert!(!text.contains('\r'), "{what}: carriage return on {stream}");
    assert!(
        !text.contains("runs,"),
        "{what}: progress on {stream}:\n{text}"
    );
    assert!(
        !text.contains("\u{1b}["),
        "{what}: terminal codes on {stream}"
    );
}

/// Runs `reeve ARGS` on a pseudo-terminal with stdout redirected to a file: the
/// terminal's text (where the bar goes, on stderr) and the file's. None where `script`
/// is not installed (the caller skips).
pub fn on_terminal(scratch: &str, args: &[&str]) -> Option<(String, String)> {
    let script = std::env::var_os("PATH").and_then(|paths| {
        std::env::split_paths(&paths)
            .map(|d| d.join("script"))
            .find(|p| p.is_file())
    })?;
    let dir = Scratch::new(scratch);
    let out = dir.join("out.txt");
    let log = dir.join("tty.log");
    let quoted: Vec<String> = args.iter().map(|a| format!("'{a}'")).collect();
    let command = format!(
        "'{}' {} > '{}'",
        env!("CARGO_BIN_EXE_reeve"),
        quoted.join(" "),
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
    let printed = std::fs::read_to_string(&out).unwrap();
    Some((terminal, printed))
}

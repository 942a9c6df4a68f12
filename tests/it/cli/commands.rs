//! What every command shares: flags, writes, reading files, the caret under an error.

use super::*;

#[test]
fn shared_flags_mean_the_same_on_every_command() {
    // Guards the one definition of --format and --json: `table --json` is
    // `table --format json`, `--json` wins over `--format` as on the studies, and the
    // hand-parsed spellings the studies always took (`txt`, `markdown`) still work,
    // on `table` too.
    let r = example_rig("sash-window");
    let json = stdout_of(&["table", &r, "--format", "json"]);
    assert_eq!(stdout_of(&["table", &r, "--json"]), json);
    assert_eq!(stdout_of(&["table", &r, "--format", "csv", "--json"]), json);
    let md = stdout_of(&["table", &r, "--format", "md"]);
    assert_eq!(stdout_of(&["table", &r, "--format", "markdown"]), md);
    let text = stdout_of(&["rank", &r]);
    assert_eq!(stdout_of(&["rank", &r, "--format", "txt"]), text);
    assert_eq!(
        stdout_of(&["rank", &r, "--format", "markdown"]),
        stdout_of(&["rank", &r, "--format", "md"])
    );
    let (code, _, err) = reeve(&["rank", &r, "--format", "yaml"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(err.contains("text, md, csv, json"), "{err}");
}

#[test]
fn a_failed_write_prints_the_cause_after_the_context() {
    // Guards the error chain: the binary prints the command's context and then the
    // library's or the system's error, once, as `context: cause`.
    let r = example_rig("sash-window");
    let (code, _, err) = reeve(&["draw", &r, "-o", "/no/such/folder/rig.svg"]).parts();
    assert_eq!(code, 2, "{err}");
    let line = err.lines().next().unwrap_or_default();
    assert!(
        line.starts_with("reeve: cannot write `/no/such/folder/rig.svg`: "),
        "{err}"
    );
    assert_eq!(err.matches("cannot write").count(), 1, "{err}");
}

/// Guards the one reader of rig files: every command, studies included, says the same
/// thing about a file it cannot read (the path named, a lowercase reason) and exits 2.
#[test]
fn every_command_reads_rig_files_alike() {
    let expected = "nothere.yaml: cannot read the rig file `nothere.yaml`: no such file";
    for command in ["check", "table", "compare", "rank", "spread"] {
        let (code, _, err) = reeve(&[command, "nothere.yaml"]).parts();
        assert_eq!(code, 2, "{command}: {err}");
        assert!(err.contains(expected), "{command}: {err}");
    }
}

#[test]
fn a_located_error_shows_the_line_with_a_caret_under_the_column() {
    // Guards the source line and caret under each located problem (issue 13 item 7),
    // and that the first line stays `reeve: FILE:LINE:COL: KEY: message` as before.
    let rig = "format: 1\nropes:\n  r: {diameter: -4, mu: 0.2}\nparts:\n  \
               h: {kind: haul, at: [0, 0, 0]}\n  w: {kind: weight, at: [0, 0, -100], mass: 5}\n\
               lines:\n  l: {rope: r, path: [h, w]}\n";
    let (code, _, err) = reeve_on(rig, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    let lines: Vec<&str> = err.lines().collect();
    assert!(
        lines[0].starts_with("reeve: ") && lines[0].contains(":3:17: ropes.r.diameter: "),
        "{err}"
    );
    assert_eq!(lines[1], " 3 |   r: {diameter: -4, mu: 0.2}", "{err}");
    assert_eq!(lines[2].find('^'), lines[1].find("-4"), "{err}");
    // An error with no line in the file shows no snippet.
    let (code, _, err) = reeve(&["check", "nothere.yaml"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(!err.contains('^') && !err.contains(" | "), "{err}");
}

/// Guards: a located error on a very long line (a long schedule written on one line)
/// shows a window of the line around the caret, not the whole line under each problem
/// (a 10 001-point schedule printed 190 KB of error).
#[test]
fn a_long_line_shows_a_window_around_the_caret() {
    let points: Vec<String> = (0..2000).map(|i| format!("[{i} s, 40 kg]")).collect();
    let rig = crate::support::EXAMPLE.replacen(
        "load: {mass: 40}}",
        &format!(
            "load: {{mass: {{schedule: [{}, [1 s, bad]]}}}}}}",
            points.join(", ")
        ),
        1,
    );
    assert_ne!(rig, crate::support::EXAMPLE, "the example has the load");
    let (code, _, err) = reeve_on(&rig, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    let lines: Vec<&str> = err.lines().collect();
    assert!(
        err.len() < 1500,
        "{} bytes of error:\n{}",
        err.len(),
        &err[..300]
    );
    let source = lines[1];
    let caret = lines[2].find('^').expect("a caret");
    assert!(source.contains('…') && source.contains("bad"), "{source}");
    // The caret still stands under the offending value (characters, as displayed).
    let before: String = source
        .chars()
        .take(lines[2][..caret].chars().count())
        .collect();
    assert!(
        source
            .chars()
            .skip(before.chars().count())
            .collect::<String>()
            .starts_with("bad"),
        "caret not under `bad`:\n{source}\n{}",
        lines[2]
    );
}

/// Guards a clean verdict on a rope of unknown strength: a 6 mm rope holding a
/// thousand tonnes read `Checks: no warnings.` and exited 0, because without a
/// `breaking_strength` the safety factor is never checked and nothing said so.
#[test]
fn a_rope_without_a_breaking_strength_says_its_safety_factor_is_not_checked() {
    let text = ONE_SHEAVE.replace("mass: 5}", "mass: 1000000}");
    let out = reeve_on(&text, &["check"]).expect_code(0);
    let (_, text_out, _) = out.parts();
    assert!(
        text_out.contains("[strength-unknown]")
            && text_out.contains("rope `r`")
            && text_out.contains("breaking_strength")
            && text_out.contains("not checked")
            && !text_out.contains("Checks: no warnings"),
        "{text_out}"
    );
    // The largest tension it must hold is named, so the figure can be checked by hand
    // (1000 t over the sheave: 10 089 514 N forward, in the file's newtons).
    assert!(
        text_out.contains("(largest tension 10089514 N)"),
        "{text_out}"
    );
    let json = reeve_on(&text, &["check", "--json"]).expect_code(0).json();
    let w: Vec<&serde_json::Value> = json["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|w| w["code"] == "strength-unknown")
        .collect();
    assert_eq!(w.len(), 1, "one per rope: {json}");
    // A rope that gives its strength has no such warning.
    let text = ONE_SHEAVE.replace(
        "{diameter: 6, mu: 0.2}",
        "{diameter: 6, mu: 0.2, breaking_strength: 7 kN}",
    );
    let json = reeve_on(&text, &["check", "--json"]).expect_code(0).json();
    assert!(json["warnings"].as_array().unwrap().is_empty(), "{json}");
}

/// Guards the wording of a slack rig's summary: with gravity pointing up the weight
/// pushes its rope slack, `check` fails it (slack-span), but the efficiency lines said
/// "please report this rig", as if the tool had erred, and the strength warning gave
/// the "largest tension" as 0 N.
#[test]
fn a_slack_rig_says_why_it_has_no_efficiency() {
    let (code, out, err) = reeve_on(ONE_SHEAVE, &["check", "--set", "gravity=[0, 0, 1]"]).parts();
    assert_eq!(code, 1, "{out}{err}");
    assert!(out.contains("[slack-span]"), "{out}");
    assert!(
        out.contains("No forward efficiency: the rope goes slack")
            && !out.contains("please report"),
        "{out}"
    );
    let strength = out
        .lines()
        .find(|l| l.contains("[strength-unknown]"))
        .unwrap_or_else(|| panic!("{out}"));
    assert!(!strength.contains("largest tension"), "{strength}");
}

/// Guards `--set parts=~` typed at a shell: the shell turns `~` after `=` into the home
/// folder, and the rig was told `parts` is `/home/...`, with an error about a mapping
/// "found `/home/rigger`" that never named the shell. The override is refused with the
/// fix: quote it.
#[test]
fn an_override_the_shell_turned_into_the_home_folder_says_to_quote_it() {
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_reeve"))
        .args([
            "check",
            &test_rig("one-sheave.yaml"),
            "--set",
            "parts.s.mass=/home/rigger",
        ])
        .env("HOME", "/home/rigger")
        .output()
        .unwrap();
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{err}");
    assert!(
        err.contains("home folder") && err.contains("--set 'parts.s.mass=~'"),
        "{err}"
    );
    // Another value is read as before.
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_reeve"))
        .args([
            "check",
            &test_rig("one-sheave.yaml"),
            "--set",
            "parts.s.mass=1",
        ])
        .env("HOME", "/home/rigger")
        .output()
        .unwrap();
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
}

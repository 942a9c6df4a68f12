//! The real binary on bad rigs that only the geometry or the solver can find wrong:
//! exit code 2, and a message that names the file, line, column and part.

use std::io::Write;
use std::process::Command;

fn run(text: &str) -> (i32, String, String) {
    let dir = std::env::temp_dir().join(format!("reeve-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join(format!(
        "rig-{:x}.yaml",
        text.len() * 7919 + text.bytes().map(usize::from).sum::<usize>()
    ));
    std::fs::File::create(&path)
        .unwrap()
        .write_all(text.as_bytes())
        .unwrap();
    let out = Command::new(env!("CARGO_BIN_EXE_reeve"))
        .arg("check")
        .arg(&path)
        .output()
        .unwrap();
    let _ = std::fs::remove_file(&path);
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

const HEAD: &str = "format: 1\nropes:\n  r: {diameter: 6, mu: 0.2}\nparts:\n";

#[test]
fn point_inside_a_sheave_is_located() {
    let rig = format!(
        "{HEAD}  a: {{kind: anchor, at: [0, 0, 0]}}\n  s: {{kind: sheave, at: [0, 0, 10], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  h: {{kind: haul, at: [500, 0, 0]}}\nlines:\n  l: {{rope: r, path: [a, s, h]}}\n"
    );
    let (code, _, err) = run(&rig);
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains(":9:")
            && err.contains("`a`")
            && err.contains("inside the pitch circle of `s`"),
        "{err}"
    );
    assert!(!err.contains("panicked"), "{err}");
}

#[test]
fn coincident_points_are_located() {
    let rig = format!(
        "{HEAD}  a: {{kind: anchor, at: [0, 0, 0]}}\n  w: {{kind: weight, at: [0, 0, 0], mass: 1}}\n  h: {{kind: haul, at: [0, 0, 500]}}\nlines:\n  l: {{rope: r, path: [a, w]}}\n  m: {{rope: r, path: [w, h]}}\n"
    );
    let (code, _, err) = run(&rig);
    assert_eq!(code, 2, "{err}");
    assert!(err.contains(":9:") && err.contains("same place"), "{err}");
}

#[test]
fn a_rig_that_cannot_move_names_its_parts() {
    // A line tied at both ends over a fixed sheave, and a haul on a separate line.
    let rig = format!(
        "{HEAD}  a: {{kind: anchor, at: [0, 0, 0]}}\n  s: {{kind: sheave, at: [100, 0, 1000], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  w: {{kind: weight, at: [200, 0, 0], mass: 1}}\n  b: {{kind: anchor, at: [100, 0, 2000]}}\n  h: {{kind: haul, at: [300, 0, 0]}}\nlines:\n  l: {{rope: r, path: [a, s, w]}}\n  m: {{rope: r, path: [w, b]}}\n  n: {{rope: r, path: [b, h]}}\ndrive: h\n"
    );
    let (code, _, err) = run(&rig);
    assert_eq!(code, 2, "{err}");
    assert!(err.contains("`w`"), "{err}");
}

#[test]
fn ambiguous_side_asks_for_side() {
    let rig = format!(
        "{HEAD}  a: {{kind: anchor, at: [0, 0, 2000]}}\n  s: {{kind: sheave, at: [0, 0, 1000], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  w: {{kind: weight, at: [0, 0, 0], mass: 1}}\nlines:\n  l: {{rope: r, path: [a, s, w]}}\ndrive: w\n"
    );
    let (code, _, err) = run(&rig);
    assert_eq!(code, 2, "{err}");
    assert!(err.contains(":9:") && err.contains("side: left"), "{err}");
}

#[test]
fn check_output_ends_with_the_caution() {
    let out = Command::new(env!("CARGO_BIN_EXE_reeve"))
        .args(["check", "rigs/workshop-hoist.yaml"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.trim_end().ends_with(reeve::report::CAUTION), "{text}");
}

#[test]
fn every_anchor_and_fixed_sheave_reports_its_pin_load() {
    for rig in ["rigs/workshop-hoist.yaml", "rigs/line-set.yaml"] {
        let out = Command::new(env!("CARGO_BIN_EXE_reeve"))
            .args(["check", rig, "--json"])
            .output()
            .unwrap();
        let json: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
        for part in json["parts"].as_array().unwrap() {
            if matches!(part["kind"].as_str(), Some("anchor" | "sheave")) {
                let load = part["pin_load_n"]["forward"].as_f64();
                assert!(load.is_some_and(|l| l > 0.0), "{rig}: {part}");
            }
        }
    }
}

/// `reeve check ARGS`, its stdout.
fn check_stdout(args: &[&str]) -> Vec<u8> {
    Command::new(env!("CARGO_BIN_EXE_reeve"))
        .arg("check")
        .args(args)
        .output()
        .unwrap()
        .stdout
}

fn check_json(args: &[&str]) -> serde_json::Value {
    serde_json::from_slice(&check_stdout(&[args, &["--json"]].concat())).unwrap()
}

fn codes(json: &serde_json::Value) -> Vec<String> {
    json["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| w["code"].as_str().unwrap().to_string())
        .collect()
}

#[test]
fn a_drum_paying_out_is_flagged_and_self_locks_when_drag_holds_it() {
    // tests/rigs/review/drum-end-left.yaml: 10 kg hangs from a drum (R = 53 mm) that pays
    // out when it turns forward. Hand calculation: load torque 10·9.80665·0.053 =
    // 5.1975 N·m. With 0.5 N·m drag the load still runs it (forward −4.6975 N·m): not
    // self-locking. With 6 N·m drag, zero torque holds it (band −11.1975 … +0.8025 N·m).
    let rig = "tests/rigs/review/drum-end-left.yaml";
    let free = check_json(&[rig]);
    assert!(
        codes(&free).contains(&"drive-reversed".to_string()),
        "{free}"
    );
    assert_eq!(free["self_locking"], false);
    let held = check_json(&[rig, "--set", "parts.winch.drag=6"]);
    let forward = held["forward"]["value"].as_f64().unwrap();
    let back = held["back"]["value"].as_f64().unwrap();
    assert!(
        (forward - 0.8025).abs() < 1e-3 && (back + 11.1975).abs() < 1e-3,
        "{held}"
    );
    assert_eq!(held["self_locking"], true, "{held}");
}

#[test]
fn a_haul_pulled_off_its_rope_says_what_the_rope_carries() {
    // tests/rigs/review/haul-oblique.yaml: 10 kg on one rope, the hand's `pull` 60° off
    // it, so the effort along `pull` is 98.0665·cos 60° = 49.03 N (hand calculation).
    let json = check_json(&["tests/rigs/review/haul-oblique.yaml"]);
    assert!(
        codes(&json).contains(&"pull-off-rope".to_string()),
        "{json}"
    );
    let plain = check_json(&["rigs/workshop-hoist.yaml"]);
    assert!(
        !codes(&plain).contains(&"pull-off-rope".to_string()),
        "{plain}"
    );
}

#[test]
fn a_block_cannot_drive_against_its_own_load() {
    // A block driving upward against its own mass load would do negative work; refuse
    // it with a located message instead of showing an efficiency above 100 %.
    let rig = format!(
        "{HEAD}  top: {{kind: sheave, at: [0, 0, 1000], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  b: {{kind: block, at: [-33, 0, 0], moves: [0, 0, 1], load: {{mass: 5}}}}\n  w: {{kind: weight, at: [33, 0, 0], mass: 4}}\nlines:\n  l: {{rope: r, path: [b, top, w]}}\ndrive: b\n"
    );
    let (code, _, err) = run(&rig);
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains(":6:") && err.contains("`b`") && err.contains("against its own travel"),
        "{err}"
    );
}

fn check_text(args: &[&str]) -> String {
    String::from_utf8(check_stdout(args)).unwrap()
}

#[test]
fn the_friction_at_the_drive_is_shown_beside_the_efficiency() {
    // Guards: on a balanced line set (efficiency says little) the friction at the drive,
    // forward − ideal and ideal − back in the asked unit, is in the JSON and the text.
    let v = check_json(&["rigs/line-set.yaml"]);
    let at = |k: &str, c: &str| v[k][c].as_f64().unwrap();
    let (ideal, forward, back) = (
        at("ideal", "value"),
        at("forward", "value"),
        at("back", "value"),
    );
    let ff = v["friction_forward"].as_f64().unwrap();
    let fb = v["friction_back"].as_f64().unwrap();
    assert!((ff - (forward - ideal)).abs() < 1e-9 && ff > 0.0, "{v}");
    assert!((fb - (ideal - back)).abs() < 1e-9 && fb > 0.0, "{v}");
    // 149.7 − 98.06 = 51.64 N and 98.06 − 49.49 = 48.57 N (figures of the summary).
    let text = check_text(&["rigs/line-set.yaml"]);
    let row = text
        .lines()
        .find(|l| l.trim_start().starts_with("friction"))
        .unwrap_or_else(|| panic!("no friction row: {text}"));
    assert!(row.contains("51.6") && row.contains("48.5"), "{row}");
    // A load unknown: the friction costs load (ideal − forward, back − ideal), in kg.
    let v = check_json(&["tests/rigs/review/block-unknown.yaml"]);
    let ideal = v["ideal"]["value"].as_f64().unwrap();
    let ff = v["friction_forward"].as_f64().unwrap();
    assert!(
        (ff - (ideal - v["forward"]["value"].as_f64().unwrap())).abs() < 1e-9 && ff > 0.0,
        "{v}"
    );
}

/// The outcome line of `check`: the line that gives the margin.
fn outcome_line(args: &[&str]) -> String {
    let text = check_text(args);
    text.lines()
        .find(|l| l.contains("(margin"))
        .unwrap_or_else(|| panic!("no outcome line: {text}"))
        .to_string()
}

#[test]
fn a_counterweight_outcome_is_worded_for_a_counterweight() {
    // Guards: a counterweight drive gets counterweight wording for each side of its
    // holding band (5.701 kg to 6.314 kg for rigs/sash-window.yaml), not hoist wording.
    let sash = "rigs/sash-window.yaml";
    let above = outcome_line(&[sash]);
    assert!(
        above.contains("counterweight")
            && above.contains("6.400 kg")
            && above.contains("6.314 kg")
            && above.contains("`sash` rises by itself"),
        "{above}"
    );
    assert!(!above.contains("the drive moves the rig"), "{above}");
    let inside = outcome_line(&[sash, "--set", "parts.counterweight.mass=6.0"]);
    assert!(
        inside.contains("holding band") && inside.contains("holds `sash` still"),
        "{inside}"
    );
    let below = outcome_line(&[sash, "--set", "parts.counterweight.mass=5.5"]);
    assert!(below.contains("`sash` drops back by itself"), "{below}");
}

#[test]
fn hauls_and_drums_get_their_own_outcome_words() {
    // Guards: a pull, a drum and a stated load are each worded for what they are.
    let pull = outcome_line(&["rigs/workshop-hoist.yaml"]);
    assert!(
        pull.contains("pull at `winch`") && pull.contains("`hook` rises"),
        "{pull}"
    );
    let short = outcome_line(&["rigs/automaton-cord.yaml"]);
    assert!(
        short.contains("pull at `follower`") && short.contains("CANNOT"),
        "{short}"
    );
    let drum = outcome_line(&["rigs/ramp-winch.yaml"]);
    assert!(
        drum.contains("drum `winch`") && drum.contains("turns"),
        "{drum}"
    );
    let load = outcome_line(&["tests/rigs/review/block-unknown.yaml"]);
    assert!(
        load.contains("stated mass") && load.contains("`hook` rises"),
        "{load}"
    );
}

#[test]
fn bend_ratio_warnings_on_the_same_rope_and_limit_read_as_one() {
    // Guards: three sheaves below the same D/d limit for the same rope are one line of
    // text listing them, while the JSON keeps one entry per part (outside checks key
    // on `part`).
    let rig = "tests/rigs/chain-plain.yaml";
    let text = check_text(&[rig]);
    let lines: Vec<&str> = text
        .lines()
        .filter(|l| l.contains("[bend-ratio]"))
        .collect();
    assert_eq!(lines.len(), 1, "{text}");
    assert!(
        lines[0].contains("`top.1` (7.3), `low.2` (7.3) and `top.3` (7.3)")
            && lines[0].contains("below 8.0 for rope `cord6`"),
        "{}",
        lines[0]
    );
    let v = check_json(&[rig]);
    let parts: Vec<&str> = v["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|w| w["code"] == "bend-ratio")
        .map(|w| w["part"].as_str().unwrap())
        .collect();
    assert_eq!(parts, ["top.1", "low.2", "top.3"]);
    // Siblings: a fleet angle at two parts of one line, a stall forward and back.
    let text = check_text(&["rigs/ramp-winch.yaml"]);
    assert_eq!(text.matches("[fleet-angle]").count(), 1, "{text}");
    let text = check_text(&["rigs/sash-window.yaml", "--set", "parts.pulley.mu=0.01"]);
    let stalled: Vec<&str> = text
        .lines()
        .filter(|l| l.contains("[stalled-sheave]"))
        .collect();
    assert_eq!(stalled.len(), 1, "{text}");
    assert!(stalled[0].contains("forward and back"), "{}", stalled[0]);
}

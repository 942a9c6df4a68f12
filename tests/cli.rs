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

fn check_json(args: &[&str]) -> serde_json::Value {
    let out = Command::new(env!("CARGO_BIN_EXE_reeve"))
        .arg("check")
        .args(args)
        .arg("--json")
        .output()
        .unwrap();
    serde_json::from_slice(&out.stdout).unwrap()
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

/// Guards the efficiency bound: a self-locking rig's back value has the opposite sign to
/// the ideal value, and `back/ideal` (−8.2 % here) was printed as an efficiency. No
/// output shows an efficiency outside 0–100 %; the text says why there is none.
#[test]
fn an_efficiency_outside_0_to_100_percent_is_never_printed() {
    let rig = concat!(env!("CARGO_MANIFEST_DIR"), "/rigs/line-set.yaml");
    let set = ["--set", "parts.loft.c.bearing.mu=1.5"];
    let json = check_json(&[rig, set[0], set[1]]);
    assert_eq!(json["self_locking"], true);
    assert!(json["back"]["value"].as_f64().unwrap() < 0.0);
    assert!(json["back"]["efficiency"].is_null(), "{}", json["back"]);
    let e = json["forward"]["efficiency"].as_f64().unwrap();
    assert!((0.0..=1.0).contains(&e), "{e}");
    let out = Command::new(env!("CARGO_BIN_EXE_reeve"))
        .args(["check", rig, set[0], set[1]])
        .output()
        .unwrap();
    let text = String::from_utf8_lossy(&out.stdout);
    let row = text
        .lines()
        .find(|l| l.trim_start().starts_with("efficiency"))
        .unwrap();
    assert!(!row.contains('-'), "{row}");
    assert!(text.contains("No back efficiency"), "{text}");
    let out = Command::new(env!("CARGO_BIN_EXE_reeve"))
        .args(["report", rig, set[0], set[1], "-o", "-"])
        .output()
        .unwrap();
    let html = String::from_utf8_lossy(&out.stdout);
    assert!(
        !html.contains("-8.2 %") && !html.contains("−8.2 %"),
        "html shows it"
    );
    assert!(html.contains("No back efficiency"));
}

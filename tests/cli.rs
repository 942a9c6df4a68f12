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

//! The real binary on bad rigs that only the geometry or the solver can find wrong:
//! exit code 2, and a message that names the file, line, column and part; and what
//! `check` says: verdicts, margins, outcome wording, warnings, units.

use std::f64::consts::PI;

use reeve::math::STANDARD_GRAVITY;
use reeve::solve::{solve, SolveError, SolveOptions};

use crate::support::generators::chain;
use crate::support::run::reeve_on;
use crate::support::{
    assert_abs, assert_rel, edited_rig, example_rig, reeve, reeve_in, solve_test_rig, stdout_of,
    test_rig, Scratch, ONE_SHEAVE,
};

const HEAD: &str = "format: 1\nropes:\n  r: {diameter: 6, mu: 0.2}\nparts:\n";

#[test]
fn point_inside_a_sheave_is_located() {
    let rig = format!(
        "{HEAD}  a: {{kind: anchor, at: [0, 0, 0]}}\n  s: {{kind: sheave, at: [0, 0, 10], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  h: {{kind: haul, at: [500, 0, 0]}}\nlines:\n  l: {{rope: r, path: [a, s, h]}}\n"
    );
    let (code, _, err) = reeve_on(&rig, &["check"]).parts();
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
    let (code, _, err) = reeve_on(&rig, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(err.contains(":9:") && err.contains("same place"), "{err}");
}

#[test]
fn a_rig_that_cannot_move_names_its_parts() {
    // A line tied at both ends over a fixed sheave, and a haul on a separate line.
    let rig = format!(
        "{HEAD}  a: {{kind: anchor, at: [0, 0, 0]}}\n  s: {{kind: sheave, at: [100, 0, 1000], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  w: {{kind: weight, at: [200, 0, 0], mass: 1}}\n  b: {{kind: anchor, at: [100, 0, 2000]}}\n  h: {{kind: haul, at: [300, 0, 0]}}\nlines:\n  l: {{rope: r, path: [a, s, w]}}\n  m: {{rope: r, path: [w, b]}}\n  n: {{rope: r, path: [b, h]}}\ndrive: h\n"
    );
    let (code, _, err) = reeve_on(&rig, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(err.contains("`w`"), "{err}");
}

#[test]
fn ambiguous_side_asks_for_side() {
    let rig = format!(
        "{HEAD}  a: {{kind: anchor, at: [0, 0, 2000]}}\n  s: {{kind: sheave, at: [0, 0, 1000], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  w: {{kind: weight, at: [0, 0, 0], mass: 1}}\nlines:\n  l: {{rope: r, path: [a, s, w]}}\ndrive: w\n"
    );
    let (code, _, err) = reeve_on(&rig, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(err.contains(":9:") && err.contains("side: left"), "{err}");
}

/// Guards the file check at the command line: a NUL in a comment ended the reading
/// there and the run went on with half a file (exit 0).
#[test]
fn a_control_character_in_the_rig_file_is_exit_2_with_line_and_column() {
    let dir = Scratch::new("nul-comment");
    let text = ONE_SHEAVE.replace(
        "lines:\n",
        "# a \u{0} here\nlimits: {design_factor: 50}\nlines:\n",
    );
    std::fs::write(dir.join("rig.yaml"), text).unwrap();
    let out = reeve_in(&dir, &["check", "rig.yaml"]);
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("rig.yaml:11:5:"), "{}", out.stderr);
    assert!(out.stderr.contains("U+0000 (NUL)"), "{}", out.stderr);
}

/// Guards the other ways text enters: `--set` values, `variants` (after YAML escapes)
/// and `rank --to` get the file's character check, and the message shows the character
/// escaped, never raw on the terminal.
#[test]
fn control_characters_in_set_variants_and_rank_to_are_refused() {
    let dir = Scratch::new("control-entries");
    let variants = ONE_SHEAVE.to_string() + "variants:\n  bad: [\"parts.s.bearing.mu=0.1\\0\"]\n";
    dir.write("rig.yaml", ONE_SHEAVE);
    std::fs::write(dir.join("variants.yaml"), &variants).unwrap();
    for args in [
        &[
            "check",
            "rig.yaml",
            "--set",
            "parts.s.bearing.mu=0.1\u{1b}[2J",
        ][..],
        &["check", "rig.yaml", "--set", "title=a \u{202e}title"],
        &["compare", "variants.yaml", "--variants"],
        &[
            "rank",
            "rig.yaml",
            "--to",
            "{kind: plain, pin_diameter: 8, mu: 0.08}\u{1b}[2J",
        ],
    ] {
        let out = reeve_in(&dir, args);
        let err = out.stderr;
        assert_eq!(out.code, 2, "{args:?}: {err}");
        assert!(err.contains("character U+"), "{args:?}: {err}");
        assert!(
            !err.contains(['\u{1b}', '\u{0}', '\u{202e}']),
            "{args:?}: raw in {err:?}"
        );
    }
}

#[test]
fn check_output_ends_with_the_caution() {
    let text = reeve(&["check", "rigs/workshop-hoist.yaml"])
        .expect_code(0)
        .stdout;
    assert!(text.trim_end().ends_with(reeve::report::CAUTION), "{text}");
}

#[test]
fn every_anchor_and_fixed_sheave_reports_its_pin_load() {
    for rig in ["rigs/workshop-hoist.yaml", "rigs/line-set.yaml"] {
        let json = reeve(&["check", rig, "--json"]).json();
        let mut checked = std::collections::BTreeSet::new();
        for part in json["parts"].as_array().unwrap() {
            if let Some(kind @ ("anchor" | "sheave")) = part["kind"].as_str() {
                let load = part["pin_load_n"]["forward"].as_f64();
                assert!(load.is_some_and(|l| l > 0.0), "{rig}: {part}");
                checked.insert(kind);
            }
        }
        // Both rigs have both kinds: the loop above checked something of each.
        assert_eq!(Vec::from_iter(checked), ["anchor", "sheave"], "{rig}");
    }
}

/// `reeve check ARGS --json`, parsed, whatever the exit code.
fn check_json(args: &[&str]) -> serde_json::Value {
    reeve(&[&["check"], args, &["--json"]].concat()).json()
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
    assert_abs("held by 6 N·m drag: forward, N·m", forward, 0.8025, 1e-3);
    assert_abs("held by 6 N·m drag: back, N·m", back, -11.1975, 1e-3);
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
fn a_haul_pulled_off_its_rope_in_another_sub_rig_names_its_own_rope_tension() {
    // Guards the tension `pull-off-rope` quotes: that of the haul's own line, found in
    // the sub-rig that owns it (it read 0 N from the main sub-rig before results were
    // kept per sub-rig). tests/rigs/review/two-subrigs.yaml, `hand.a` (not the drive)
    // pulled 30° off its rope: line a's first span carries 10 g e^{0.25π} = 215.09 N
    // forward (the file's own hand calculation), shown to four digits.
    let json = check_json(&[
        "tests/rigs/review/two-subrigs.yaml",
        "--set",
        "parts.hand.a.pull=[0.5, 0, -0.8660254]",
    ]);
    let message = json["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .find(|w| w["code"] == "pull-off-rope")
        .and_then(|w| w["message"].as_str())
        .unwrap_or_else(|| panic!("no pull-off-rope: {json}"))
        .to_string();
    assert!(message.contains("carries 215.1 N forward"), "{message}");
}

#[test]
fn a_block_cannot_drive_against_its_own_load() {
    // A block driving upward against its own mass load would do negative work; refuse
    // it with a located message instead of showing an efficiency above 100 %.
    let rig = format!(
        "{HEAD}  top: {{kind: sheave, at: [0, 0, 1000], axle: [0, 1, 0], diameter: 60, bearing: {{kind: none}}}}\n  b: {{kind: block, at: [-33, 0, 0], moves: [0, 0, 1], load: {{mass: 5}}}}\n  w: {{kind: weight, at: [33, 0, 0], mass: 4}}\nlines:\n  l: {{rope: r, path: [b, top, w]}}\ndrive: b\n"
    );
    let (code, _, err) = reeve_on(&rig, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains(":6:") && err.contains("`b`") && err.contains("against its own travel"),
        "{err}"
    );
}

/// The analysis commands that solve a rig, with the arguments each needs.
fn every_solving_command(rig: &str) -> Vec<Vec<String>> {
    let own = |args: &[&str]| args.iter().map(|a| a.to_string()).collect::<Vec<_>>();
    vec![
        own(&["check", rig]),
        own(&["check", rig, "--json"]),
        own(&["table", rig]),
        own(&["rank", rig]),
        own(&["spread", rig, "--samples", "3", "--seed", "1"]),
        own(&["compare", rig]),
        own(&["sweep", rig, "--stroke", "1"]),
    ]
}

#[test]
fn a_capstan_ratio_that_overflows_is_a_located_error_in_every_command() {
    // Guards against the SVD panic ("Singular value was NaN", exit 101): 1000 turns at
    // μ = 0.25 give e^(0.25·(π + 2000π)) = e^1571, beyond f64 (largest e^709).
    for args in every_solving_command("tests/rigs/guide-turns.yaml") {
        let args: Vec<&str> = args.iter().map(String::as_str).collect();
        let (code, _, err) = reeve(&args).parts();
        assert_eq!(code, 2, "{args:?}: {err}");
        assert!(!err.contains("panicked"), "{args:?}: {err}");
        assert!(
            err.contains("guide-turns.yaml:15:")
                && err.contains("`bar`")
                && err.contains("too large to be physical"),
            "{args:?}: {err}"
        );
    }
}

#[test]
fn a_rope_mu_of_hundreds_set_from_the_command_line_is_refused_not_a_panic() {
    // Guards the same overflow reached through `--set` and the studies: the carabiner of
    // rigs/rescue-haul.yaml at μ = 1000 over its wrap gives e^(1000·φ) = ∞.
    for mut args in every_solving_command("rigs/rescue-haul.yaml") {
        args.extend(["--set".to_string(), "parts.leg.biner.mu=1000".to_string()]);
        let args: Vec<&str> = args.iter().map(String::as_str).collect();
        let (code, _, err) = reeve(&args).parts();
        assert_eq!(code, 2, "{args:?}: {err}");
        assert!(!err.contains("panicked"), "{args:?}: {err}");
        assert!(
            err.contains("`leg.biner`") && err.contains("too large to be physical"),
            "{args:?}: {err}"
        );
    }
    // A rope `mu` of a few hundred on bare pins (rigs/automaton-cord.yaml, no `mu` of
    // their own): e^(300·φ) overflows too, and the message names the first pin.
    let (code, _, err) = reeve(&[
        "rank",
        "rigs/automaton-cord.yaml",
        "--set",
        "ropes.braid1.mu=300",
    ])
    .parts();
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains("`pin.1`") && err.contains("too large to be physical"),
        "{err}"
    );
    // The sweep that reaches it in a step: refused as well, never a panic.
    let (code, _, err) = reeve(&[
        "sweep",
        "rigs/rescue-haul.yaml",
        "--vary",
        "parts.leg.biner.mu=0.2..1000",
        "--steps",
        "3",
    ])
    .parts();
    assert!(!err.contains("panicked"), "{err}");
    assert_ne!(code, 101, "{err}");
}

#[test]
fn a_finite_but_unphysical_capstan_ratio_has_its_own_message() {
    // Guards the 1e56 N answers with exit 0: 100 turns at μ = 0.25 give
    // e^(0.25·(π + 200π)) = e^157.9 ≈ 4e68, finite but far above 1e12; the rope states
    // no breaking strength, so no safety-factor check caught it.
    let text = std::fs::read_to_string("tests/rigs/guide-turns.yaml")
        .unwrap()
        .replace("turns: 1000", "turns: 100");
    let (code, out, err) = reeve_on(&text, &["check"]).parts();
    assert_eq!(code, 2, "{out}{err}");
    assert!(
        err.contains("`bar`") && err.contains("too large to be physical"),
        "{err}"
    );
    // Five turns (e^(0.25·11π) = 5.7e3) are an ordinary capstan and still solve.
    let text = text.replace("turns: 100", "turns: 5");
    let (code, out, err) = reeve_on(&text, &["check"]).parts();
    assert_eq!(code, 0, "{out}{err}");
}

#[test]
fn friction_that_compounds_beyond_any_rope_fails_the_check() {
    // Guards huge figures with exit 0 where every passage is ordinary but they multiply:
    // 40 zig-zag pins at μ = 0.5, each wrapped about 2 rad (ratio e^1 ≈ 2.8, capstan
    // equation), multiply the pull about e^40 ≈ 1e17-fold, far above 1e12.
    let (code, out, err) = reeve_on(&chain(40, 0.5), &["check"]).parts();
    assert_eq!(code, 1, "{out}{err}");
    assert!(
        out.contains("FAIL [friction-lock]") && out.contains("line `cord`"),
        "{out}"
    );
    // Ten such pins (e^10 ≈ 2e4) are an ordinary, if lossy, rig.
    let (code, out, err) = reeve_on(&chain(10, 0.5), &["check"]).parts();
    assert!(!out.contains("friction-lock"), "{out}{err}");
    assert_eq!(code, 0, "{out}{err}");
}

#[test]
fn loads_square_to_the_motion_are_refused_with_the_likely_fix() {
    // Guards "0 N in every case, the drive moves the rig, exit 0": the hook rises along
    // +Y while gravity is the default −Z, so its 40 kg do no work (virtual work:
    // X = −(v·Q)/(v·x) = 0 for every friction).
    let (code, out, err) = reeve(&["check", "tests/rigs/y-up-hoist.yaml"]).parts();
    assert_eq!(code, 2, "{out}{err}");
    assert!(
        err.contains("y-up-hoist.yaml:12:")
            && err.contains("`hook`")
            && err.contains("do no work")
            && err.contains("gravity: [0, -1, 0]")
            && err.contains("`moves`"),
        "{err}"
    );
    // The same rig with gravity along −Y solves: 2:1, ideal 40 g / 2 = 196.13 N.
    let (code, out, err) = reeve(&[
        "check",
        "tests/rigs/y-up-hoist.yaml",
        "--json",
        "--set",
        "gravity=[0, -1, 0]",
    ])
    .parts();
    assert_eq!(code, 0, "{err}");
    let json: serde_json::Value = serde_json::from_str(&out).unwrap();
    let ideal = json["ideal"]["value"].as_f64().unwrap();
    assert_abs("ideal pull, N", ideal, 40.0 * 9.80665 / 2.0, 1e-6);
    // A block moving across gravity with a mass load, hauled for a force: refused too.
    let text = std::fs::read_to_string("tests/rigs/review/level-cart.yaml")
        .unwrap()
        .replace("moves: [1, 0, 0]}", "moves: [1, 0, 0], load: {mass: 100}}")
        .replace(", force: 300}", "}")
        .replace("solve_for: cart", "");
    let (code, out, err) = reeve_on(&text, &["check"]).parts();
    assert_eq!(code, 2, "{out}{err}");
    assert!(
        err.contains("`cart`") && err.contains("do no work"),
        "{err}"
    );
}

#[test]
fn a_block_with_no_load_moving_across_gravity_is_solved_for_a_force() {
    // Guards "no equilibrium" for an unknown block that states no load on a level
    // track: a mass there does no work, so the unknown is the force against `moves`.
    // Hand calculation (rig header, capstan equation, Hibbeler §8.5): ideal 300 N,
    // forward 300/e^(0.2·π/2) = 219.12 N, back 300·e^(0.2·π/2) = 410.73 N.
    let (_, s) = solve_test_rig("review/level-cart.yaml");
    let m = s.main();
    assert_eq!(m.quantity, reeve::solve::Quantity::Force);
    let k = (0.2 * PI / 2.0).exp();
    assert_rel("ideal", m.ideal.value, 300.0, 1e-9);
    assert_rel("forward", m.forward.value, 300.0 / k, 1e-9);
    assert_rel("back", m.back.value, 300.0 * k, 1e-9);
    // The output says why the figure is a force.
    let text = check_text(&[&test_rig("review/level-cart.yaml")]);
    assert!(
        text.contains("`cart` states no load") && text.contains("force against its `moves`"),
        "{text}"
    );
}

#[test]
fn a_block_with_no_load_moving_with_gravity_is_still_solved_for_a_mass() {
    // Guards the other side of the same choice: under a 2:1 hook the travel is along
    // gravity, so the unknown stays the mass (block-unknown.yaml without its load:
    // ideal (500 − 2 g)/g = 48.986 kg, hand calculation in the rig header).
    let rig = edited_rig("review/block-unknown.yaml", |t| {
        t.replace(", load: {mass: 45}", "")
    });
    let s = solve(&rig, &SolveOptions::default()).unwrap();
    assert_eq!(s.main().quantity, reeve::solve::Quantity::Mass);
    assert_rel(
        "ideal",
        s.main().ideal.value,
        500.0 / STANDARD_GRAVITY - 2.0,
        1e-8,
    );
    let report = reeve::report::Report::build(&rig, &s, Vec::new());
    let note = report.headline.solve_for.note.clone().unwrap_or_default();
    assert!(
        note.contains("states no load") && note.contains("mass"),
        "{note}"
    );
}

#[test]
fn no_equilibrium_names_its_real_cause() {
    // Guards the one hint "lines pulling only sideways" given for every inconsistent
    // system: a mass asked for on a block whose travel is square to gravity does no
    // work, and the message must say that, not blame the lines.
    let rig = edited_rig("review/level-cart.yaml", |t| {
        t.replace("moves: [1, 0, 0]}", "moves: [1, 0, 0], load: {mass: ~}}")
    });
    let e = solve(&rig, &SolveOptions::default()).unwrap_err();
    let message = e.to_string();
    assert!(!matches!(e, SolveError::NoEquilibrium { .. }), "{message}");
    assert!(
        message.contains("`cart`") && message.contains("square to gravity"),
        "{message}"
    );
    assert!(!message.contains("sideways"), "{message}");
    assert_eq!(e.subject().1, Some("cart"));
}

#[test]
fn solve_for_in_another_sub_rig_is_a_clear_error() {
    // Guards a solve_for that the drive cannot reach (another sub-rig): a clear error
    // naming both parts, not an inconsistent equilibrium.
    // The drive `hand.b` cannot move `load.a` (a separate line): the error must say so,
    // not report an inconsistent equilibrium.
    let rig = edited_rig("review/two-subrigs.yaml", |text| {
        text.replace("drive: hand.b", "drive: hand.b\nsolve_for: load.a")
            .replace(
                "hand.b: {kind: haul, at: [0, 500, -1e6]}",
                "hand.b: {kind: haul, at: [0, 500, -1e6], force: 300}",
            )
            .replace(", mass: 10}", "}")
    });
    match solve(&rig, &SolveOptions::default()) {
        Err(e) => {
            let message = e.to_string();
            assert!(
                message.contains("`load.a`") && message.contains("`hand.b`"),
                "{message}"
            );
            assert!(!matches!(e, SolveError::NoEquilibrium { .. }), "{message}");
        }
        Ok(_) => panic!("a load the drive cannot reach was solved"),
    }
}

#[test]
fn a_balanced_rig_whose_ideal_effort_is_zero_still_solves() {
    // Guards the refusal above from catching balanced rigs: two 5 kg weights over one
    // sheave do work that cancels (ideal 0 N by virtual work), and only the friction of
    // the bearing is left to overcome.
    let rig = format!(
        "{HEAD}  s: {{kind: sheave, at: [0, 0, 2000], axle: [0, 1, 0], diameter: 60, bearing: {{kind: plain, pin_diameter: 10, mu: 0.1}}}}\n  a: {{kind: weight, at: [-33, 0, 0], mass: 5}}\n  b: {{kind: weight, at: [33, 0, -500], mass: 5}}\n  h: {{kind: haul, at: [100, 0, 1000]}}\nlines:\n  l: {{rope: r, path: [a, s, b]}}\n  m: {{rope: r, path: [b, h]}}\ndrive: h\n"
    );
    let (code, out, err) = reeve_on(&rig, &["check"]).parts();
    assert!(!err.contains("do no work"), "{err}");
    assert_ne!(code, 2, "{out}{err}");
}

/// `check --json` of a rig with overrides: (exit code, JSON, text of the summary).
fn verdict(rig: &str, sets: &[&str]) -> (i32, serde_json::Value, String) {
    let mut args = vec!["check", rig];
    for s in sets {
        args.extend(["--set", s]);
    }
    let text = reeve(&args).stdout;
    args.push("--json");
    let ran = reeve(&args);
    (ran.code, ran.json(), text)
}

#[test]
fn a_reversed_winch_that_cannot_hold_its_load_fails() {
    // Guards "the drive moves the rig (margin −248.2 %)" with exit 0: the load runs the
    // rig forward by itself (forward −20.25 N·m) and the crank's +30 N·m pushes the same
    // way, so nothing holds the cart: it runs away. Margin (f − A)/|f| =
    // (−20.25 − 30)/20.25 = −248 % (hand arithmetic on the solved forward value).
    let rig = "tests/rigs/winch-reversed.yaml";
    let (code, json, text) = verdict(rig, &[]);
    assert_eq!(code, 1, "{text}");
    assert!(!text.contains("the drive moves the rig"), "{text}");
    assert!(
        text.contains("CANNOT HOLD THE RIG") && text.contains("runs away"),
        "{text}"
    );
    assert!(codes(&json).contains(&"runs-away".to_string()), "{json}");
    assert_eq!(json["moves"], false);
    assert!(json["margin"].as_f64().unwrap() < -2.0, "{json}");
    // A brake of −15 N·m holds back less than the 20.25 N·m needed: it runs away too,
    // margin (−20.25 + 15)/20.25 = −25.9 %.
    let (code, json, text) = verdict(rig, &["parts.winch.torque=-15"]);
    assert_eq!(code, 1, "{text}");
    assert!(text.contains("runs away"), "{text}");
    let f = json["forward"]["value"].as_f64().unwrap();
    let margin = json["margin"].as_f64().unwrap();
    assert_abs("margin (f + 15)/|f|", margin, (f + 15.0) / f.abs(), 1e-12);
    // A brake of −30 N·m holds it: exit 0, margin (−20.25 + 30)/20.25 = +48 %.
    let (code, json, text) = verdict(rig, &["parts.winch.torque=-30"]);
    assert_eq!(code, 0, "{text}");
    assert!(text.contains("the drive holds it back"), "{text}");
    assert_eq!(json["moves"], true);
    let f = json["forward"]["value"].as_f64().unwrap();
    let margin = json["margin"].as_f64().unwrap();
    assert_abs("margin (f + 30)/|f|", margin, (f + 30.0) / f.abs(), 1e-12);
    assert!(margin > 0.4, "{json}");
}

#[test]
fn a_drive_turning_backward_says_so_and_fails() {
    // Guards the other sign mistake: on the winch as built (ideal +21.31 N·m) a torque
    // of −30 N·m turns it backward, below the back value 20.21 N·m: the cart runs back.
    let (code, json, text) = verdict("rigs/ramp-winch.yaml", &["parts.winch.torque=-30"]);
    assert_eq!(code, 1, "{text}");
    assert_eq!(json["moves"], false);
    assert!(
        text.contains("THE DRIVE CANNOT MOVE THE RIG") && text.contains("acts backward"),
        "{text}"
    );
    assert!(text.contains("runs back"), "{text}");
}

#[test]
fn the_margin_of_a_negative_stated_load_has_the_sign_of_the_verdict() {
    // Guards margin = forward/stated − 1, which flips sign for a stated load below zero:
    // the level cart pushed along its travel by 50 N (`load: {force: -50}`) is moved
    // with room to spare (forward 219.12 N ≥ −50 N), margin (219.12 + 50)/50 = +538 %.
    let rig = edited_rig("review/level-cart.yaml", |t| {
        t.replace("moves: [1, 0, 0]}", "moves: [1, 0, 0], load: {force: -50}}")
    });
    let s = solve(&rig, &SolveOptions::default()).unwrap();
    let report = reeve::report::Report::build(&rig, &s, Vec::new());
    let h = &report.headline;
    let forward = 300.0 / (0.2 * PI / 2.0).exp();
    assert_eq!(h.moves, Some(true));
    assert_rel("margin", h.margin.unwrap(), (forward + 50.0) / 50.0, 1e-9);
}

#[test]
fn failure_messages_use_the_rigs_units_and_precision() {
    // Guards "2600.0000 N available, 2769.3525 N needed" beside a summary in kN: the
    // warnings use the summary's units and four significant figures.
    let (code, out, err) = reeve(&[
        "check",
        "rigs/workshop-hoist.yaml",
        "--set",
        "parts.hook.load.mass=1000 kg",
        "--set",
        "ropes.wire8.breaking_strength=10 kN",
    ])
    .parts();
    assert_eq!(code, 1, "{out}{err}");
    assert!(out.contains("2.600 kN available, 2.769 kN needed"), "{out}");
    let warnings: Vec<&str> = out.lines().filter(|l| l.contains("FAIL [")).collect();
    assert!(
        warnings.iter().any(|l| l.contains("[safety-factor]")),
        "{out}"
    );
    for line in &warnings {
        assert!(!line.contains(" N ") && !line.contains(".0000"), "{line}");
    }
}

#[test]
fn an_imperial_rig_shows_torque_in_imperial_units() {
    // Guards `torque N*m` on the unit line of a rig in inches and pounds: with no torque
    // unit stated its reports show lbf*in (force × length), while a bare torque is still
    // read in N*m, the format's default (DESIGN.md §4 is a contract).
    // Hand calculation in the rig header: load torque 3 lbf*in = 0.338958 N·m, ideal
    // pull 3/2.125 = 1.41176 lbf.
    let rig = "tests/rigs/hinge-imperial.yaml";
    let (code, text, err) = reeve(&["check", rig]).parts();
    assert_eq!(code, 0, "{err}");
    assert!(
        text.contains("3.000 lbf*in") && !text.contains("N*m"),
        "{text}"
    );
    assert!(text.contains("1.412 lbf"), "{text}");
    // The velocity ratio of a haul turning a drum is a length per radian: the pitch
    // radius, 2.125 in/rad, not 0.05397 m/rad.
    assert!(text.contains("Velocity ratio 2.125 in/rad"), "{text}");
    assert!(text.contains("mechanical advantage 2.125 in"), "{text}");
    let table = reeve(&["table", rig, "--format", "md"]).stdout;
    assert!(table.contains("torque lbf*in"), "{table}");
    let json = reeve(&["check", rig, "--json"]).json();
    let load = json["drums"][0]["load_torque_nm"].as_f64().unwrap();
    assert_abs(
        "3 lbf*in load torque, N·m",
        load,
        3.0 * 4.448_221_615_260_5 * 0.0254,
        1e-9,
    );
    let bare = std::fs::read_to_string(rig)
        .unwrap()
        .replace("torque: \"3 lbf*in\"", "torque: 3");
    let json = reeve_on(&bare, &["check", "--json"]).json();
    let load = json["drums"][0]["load_torque_nm"].as_f64().unwrap();
    assert_abs("a bare torque is N*m", load, 3.0, 1e-12);
}

#[test]
fn passage_columns_carry_their_degree_signs() {
    // Guards fleet columns without `°` beside `wrap °` in the check summary.
    let text = reeve(&["check", "rigs/ramp-winch.yaml"]).stdout;
    assert!(
        text.contains("wrap °") && text.contains("fleet in °") && text.contains("fleet out °"),
        "{text}"
    );
}

#[test]
fn a_running_mu_above_the_static_one_is_warned() {
    // Guards a breakaway figure below the running one, accepted silently: static
    // friction is at least the running friction (any statics text, e.g. Hibbeler §8.1),
    // so μ = 0.12 with μ_static = 0.05 is a slip of the pen.
    let sheave = "parts.head.bearing";
    let (code, json, text) = verdict(
        "tests/rigs/sheave-static.yaml",
        &[&format!("{sheave}.mu_static=0.05")],
    );
    assert_eq!(code, 0, "{text}");
    assert!(
        codes(&json).contains(&"mu-above-static".to_string()),
        "{json}"
    );
    assert!(
        text.contains("`head`") && text.contains("mu_static"),
        "{text}"
    );
    // The usual order (μ_static 0.18 above μ 0.12) is not warned.
    let (_, json, _) = verdict("tests/rigs/sheave-static.yaml", &[]);
    assert!(
        !codes(&json).contains(&"mu-above-static".to_string()),
        "{json}"
    );
}

#[test]
fn a_default_drum_side_that_leads_the_rope_across_the_drum_is_warned() {
    // Guards the default `side: left` at the start of a path routing the rope round the
    // wrong side in silence: the ramp winch written from the drum end ([winch, lead,
    // cart]) leaves the drum left of its vertical centre line and runs up to the right,
    // over the drum, to the lead sheave; the rig as drawn (rigs/ramp-winch.yaml) leaves
    // it on the lead sheave's side.
    let text = std::fs::read_to_string("rigs/ramp-winch.yaml").unwrap();
    let started = text.replace("path: [cart, lead, winch]", "path: [winch, lead, cart]");
    let (_, out, err) = reeve_on(&started, &["check"]).parts();
    assert!(
        out.contains("[drum-side]") && out.contains("`winch`") && out.contains("side: right"),
        "{out}{err}"
    );
    // Stating the side, either way, is the user's word: no warning.
    for side in ["left", "right"] {
        let stated = text.replace(
            "path: [cart, lead, winch]",
            &format!("path: [{{part: winch, side: {side}}}, lead, cart]"),
        );
        let (code, out, err) = reeve_on(&stated, &["check"]).parts();
        // It solves (a summary with its warnings, exit 0 or 1), without this warning.
        assert!(
            code != 2 && out.contains("Caution"),
            "{side}: exit {code}: {err}"
        );
        assert!(!out.contains("[drum-side]"), "{side}: {out}");
    }
    // The rig as drawn, drum at the end with the default side, runs open: no warning.
    let out = reeve(&["check", "rigs/ramp-winch.yaml"])
        .expect_code(0)
        .stdout;
    assert!(!out.contains("[drum-side]"), "{out}");
    // A weight hanging under the drum's far edge (tests/rigs/review/drum-end-right.yaml
    // without its `side: right`): the default side leads the rope across the drum's
    // vertical centre line to reach it.
    let hanging = std::fs::read_to_string("tests/rigs/review/drum-end-right.yaml")
        .unwrap()
        .replace("{part: winch, side: right}", "winch");
    let out = reeve_on(&hanging, &["check"]).stdout;
    assert!(out.contains("[drum-side]"), "{out}");
    let out = reeve(&["check", "tests/rigs/review/drum-end-left.yaml"])
        .expect_code(0)
        .stdout;
    assert!(!out.contains("[drum-side]"), "{out}");
}

#[test]
fn a_drum_at_a_line_end_shows_the_turns_wound_on_it() {
    // Guards wrap 0 in the drum row of a drum at a line end that has turns: three dead
    // turns wound on the ramp winch show as 3 × 360° = 1080°.
    let text = std::fs::read_to_string("rigs/ramp-winch.yaml")
        .unwrap()
        .replace(
            "path: [cart, lead, winch]",
            "path: [cart, lead, {part: winch, turns: 3}]",
        );
    let json = reeve_on(&text, &["check", "--json"]).json();
    let winch = json["parts"]
        .as_array()
        .unwrap()
        .iter()
        .find(|p| p["name"] == "winch")
        .unwrap();
    assert_eq!(
        winch["passages"][0]["wrap_deg"].as_f64(),
        Some(1080.0),
        "{winch}"
    );
    assert_eq!(winch["wrap_deg"].as_f64(), Some(1080.0), "{winch}");
}

/// `reeve check ARGS`, its text, whatever the exit code.
fn check_text(args: &[&str]) -> String {
    reeve(&[&["check"], args].concat()).stdout
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
    assert_abs(
        "friction forward = forward − ideal",
        ff,
        forward - ideal,
        1e-9,
    );
    assert_abs("friction back = ideal − back", fb, ideal - back, 1e-9);
    assert!(ff > 0.0 && fb > 0.0, "{v}");
    // 165.4 − 109.4 = 55.98 N and 109.4 − 56.79 = 52.65 N (figures of the summary; the
    // line set's ropes have stiffness and weight since issue 11).
    let text = check_text(&["rigs/line-set.yaml"]);
    let row = text
        .lines()
        .find(|l| l.trim_start().starts_with("friction"))
        .unwrap_or_else(|| panic!("no friction row: {text}"));
    assert!(row.contains("55.9") && row.contains("52.6"), "{row}");
    // A load unknown: the friction costs load (ideal − forward, back − ideal), in kg.
    let v = check_json(&["tests/rigs/review/block-unknown.yaml"]);
    let ideal = v["ideal"]["value"].as_f64().unwrap();
    let ff = v["friction_forward"].as_f64().unwrap();
    let forward = v["forward"]["value"].as_f64().unwrap();
    assert_abs(
        "friction forward = ideal − forward",
        ff,
        ideal - forward,
        1e-9,
    );
    assert!(ff > 0.0, "{v}");
}

#[test]
fn self_locking_words_point_the_right_way_for_a_load_unknown() {
    // Guards the self-locking sentence for a load unknown: it runs back above the back
    // value, not below.
    // For a load unknown `back` is the least load that drives the rig back (DESIGN.md
    // §3): the rig runs back above it (22.37 kg here, capstan equation as in
    // load_unknown_over_a_capstan_bar), not below.
    let text = check_text(&[&test_rig("review/load-unknown-capstan.yaml")]);
    assert!(!text.contains("below the back value"), "{text}");
    assert!(
        text.contains("a load above the back value runs it back"),
        "{text}"
    );
    // For a drive unknown it runs back when the effort falls below `back`.
    let text = check_text(&[&test_rig("review/drum-middle.yaml")]);
    assert!(text.contains("below the back value"), "{text}");
}

#[test]
fn loss_of_input_is_positive_when_the_load_drives_forward() {
    // Guards the loss share of a drive that absorbs power: measured against what the load
    // puts in, so positive.
    // drum-end-left runs forward by lowering the weight: the input is the weight's
    // 10 g × 0.053 = 5.1975 W per rad/s, of which the 0.5 N·m drag takes 0.5 W:
    // 9.62 % (hand calculation). The drive's own power (−4.6975 W) is an output here.
    let json = reeve(&["check", "--json", &test_rig("review/drum-end-left.yaml")]).json();
    let winch = json["parts"]
        .as_array()
        .unwrap()
        .iter()
        .find(|p| p["name"] == "winch")
        .unwrap();
    let share = winch["loss_of_input"].as_f64().unwrap();
    assert_rel(
        "loss of input",
        share,
        0.5 / (10.0 * STANDARD_GRAVITY * 0.053),
        1e-9,
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
    let text = reeve(&["check", rig, set[0], set[1]]).stdout;
    let row = text
        .lines()
        .find(|l| l.trim_start().starts_with("efficiency"))
        .unwrap();
    assert!(!row.contains('-'), "{row}");
    assert!(text.contains("No back efficiency"), "{text}");
    let html = reeve(&["report", rig, set[0], set[1], "-o", "-"]).stdout;
    assert!(
        !html.contains("-8.2 %") && !html.contains("−8.2 %"),
        "html shows it"
    );
    assert!(html.contains("No back efficiency"));
}

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

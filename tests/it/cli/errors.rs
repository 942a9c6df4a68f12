//! Bad rigs that only the geometry or the solver can find wrong: exit code 2 and a
//! located message; the caution and pin loads of `check`.

use super::*;

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

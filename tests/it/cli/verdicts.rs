//! What `check` says: verdicts, margins, outcome wording, warnings, units.

use super::*;

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

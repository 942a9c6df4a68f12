//! Studies fail like `check`.

use super::*;

// ------------------------------------------------- studies fail like `check`

/// The `--json` document of a study, whatever its exit code (not 2).
fn json_whatever_the_exit(args: &[&str]) -> Value {
    let out = reeve(&[args, &["--json"]].concat());
    assert_ne!(out.code, 2, "{}", out.stderr);
    out.json()
}

#[test]
fn compare_exits_1_and_shows_the_margin_when_a_column_fails_a_check() {
    // Guards: a compared rig that `check` fails (cannot move) fails the comparison, and
    // its margin and failing check are in the table.
    let args = [
        "compare",
        "tests/rigs/chain-plain.yaml",
        "rigs/automaton-cord.yaml",
    ];
    let text = failing(&args);
    let row = |label: &str| {
        text.lines()
            .find(|l| l.starts_with(label))
            .unwrap_or_else(|| panic!("no `{label}` row: {text}"))
            .to_string()
    };
    // chain-plain: 300 N available over 234.4 N forward; automaton: 1.2 N over 1.4706 N.
    assert!(
        row("margin").contains("28.0 %") && row("margin").contains("-18.4 %"),
        "{text}"
    );
    assert!(
        row("moves").contains("yes") && row("moves").contains("no"),
        "{text}"
    );
    assert!(row("checks").contains("FAIL cannot-move"), "{text}");
    let v = json_whatever_the_exit(&args);
    assert_eq!(v["columns"][0]["fails"], false);
    assert_eq!(v["columns"][1]["fails"], true);
    assert_eq!(v["columns"][1]["failing"][0], "cannot-move");
    assert_rel(
        "margin of the automaton, 1.2 N over 1.4706 N",
        num(&v["columns"][1]["margin"]),
        1.2 / 1.470_6 - 1.0,
        1e-3,
    );
    // A comparison where every rig passes still exits 0.
    stdout_of(&[
        "compare",
        "tests/rigs/chain-plain.yaml",
        "tests/rigs/tackle-rated.yaml",
    ]);
}

#[test]
fn sweep_exits_1_and_marks_the_step_that_cannot_move() {
    // Guards: a sweep step that `check` fails (30 kg needs 351.5 N, 300 N available)
    // fails the sweep, and the margin and checks columns show which step.
    let path = test_rig("chain-plain.yaml");
    let args = [
        "sweep",
        &path,
        "--vary",
        "parts.load.mass=10..30 kg",
        "--steps",
        "5",
    ];
    let text = failing(&args);
    let last = text
        .lines()
        .find(|l| l.starts_with("30.00"))
        .expect("30 kg row");
    // Hand check of the margin: 300 / 351.54 − 1 = −14.7 %.
    assert!(
        last.contains("-14.7 %") && last.contains("FAIL cannot-move"),
        "{text}"
    );
    let first = text.lines().find(|l| l.starts_with("10.00")).unwrap();
    assert!(first.contains(" ok"), "{text}");
    let v = json_whatever_the_exit(&args);
    let steps = v["steps"].as_array().unwrap();
    assert_eq!(steps[4]["fails"], true);
    assert_eq!(steps[0]["fails"], false);
    assert!(num(&steps[4]["margin"]) < 0.0 && num(&steps[0]["margin"]) > 0.0);
    // Every step passing: exit 0.
    stdout_of(&[
        "sweep",
        &path,
        "--vary",
        "parts.load.mass=10..20 kg",
        "--steps",
        "3",
    ]);
}

#[test]
fn a_sweep_marks_the_steps_where_a_sheave_stalls() {
    // Guards: past the point where the pulley stalls the values stop following its
    // bearing (the rope slides at the capstan ratio); those steps are marked.
    let args = [
        "sweep",
        "rigs/sash-window.yaml",
        "--set",
        "parts.pulley.mu=0.01",
        "--vary",
        "parts.pulley.bearing.mu=0.01..0.35",
        "--steps",
        "5",
    ];
    let text = stdout_of(&args);
    let marked: Vec<&str> = text.lines().filter(|l| l.contains("stalled")).collect();
    assert!(marked.iter().any(|l| l.starts_with("0.3500")), "{text}");
    assert!(!marked.iter().any(|l| l.starts_with("0.01000")), "{text}");
    let v = json_whatever_the_exit(&args);
    let steps = v["steps"].as_array().unwrap();
    assert_eq!(steps[4]["stalled"][0], "pulley");
    assert!(steps[0]["stalled"].as_array().unwrap().is_empty());
}

#[test]
fn a_stroke_of_a_rig_that_cannot_move_exits_1() {
    // Guards: the stroke fails like `check` where its steps fail a check.
    let text = failing(&[
        "sweep",
        "rigs/automaton-cord.yaml",
        "--stroke",
        "5 mm",
        "--steps",
        "2",
    ]);
    assert!(
        text.contains("FAIL cannot-move") && text.contains("-18.4 %"),
        "{text}"
    );
}

#[test]
fn rank_exits_1_where_the_rig_or_a_row_fails_a_check() {
    // Guards: rank fails like `check` on the rig as written, and where the alternative
    // bearing makes a row fail (240 N available, a worse bearing needs more).
    let text = failing(&["rank", "rigs/automaton-cord.yaml"]);
    assert!(text.contains("cannot-move"), "{text}");
    let path = test_rig("chain-plain.yaml");
    let args = [
        "rank",
        &path,
        "--set",
        "parts.hand.force=240 N",
        "--to",
        "{kind: plain, pin_diameter: 10, mu: 0.3}",
    ];
    let text = failing(&args);
    assert!(text.contains("FAIL cannot-move"), "{text}");
    let v = json_whatever_the_exit(&args);
    assert_eq!(v["verdict"]["fails"], false, "as written it moves");
    assert_eq!(v["parts"][0]["alternative_verdict"]["fails"], true);
    assert!(num(&v["parts"][0]["alternative_verdict"]["margin"]) < 0.0);
}

#[test]
fn spread_exits_1_when_samples_fail_a_check_and_shows_the_margin() {
    // Guards: a spread whose samples fail a check (the hand's 207 N is inside the
    // spread of forward values) exits 1, and the margin's percentiles show it.
    let path = test_rig("spread-hoist.yaml");
    let args = [
        "spread",
        &path,
        "--samples",
        "100",
        "--set",
        "parts.hand.force=207 N",
    ];
    let text = failing(&args);
    assert!(text.lines().any(|l| l.starts_with("margin")), "{text}");
    assert!(text.contains("cannot-move"), "{text}");
    let v = json_whatever_the_exit(&args);
    let share = num(&v["share_failing"]);
    assert!(share > 0.0 && share < 1.0, "{share}");
    assert!(num(&v["margin"]["p5"]) < 0.0 && num(&v["margin"]["p95"]) > 0.0);
    // Every sample moving: exit 0.
    stdout_of(&[
        "spread",
        &path,
        "--samples",
        "50",
        "--set",
        "parts.hand.force=400 N",
    ]);
}

#[test]
fn compare_groups_columns_by_the_asked_quantity_and_never_mixes_units_in_a_change() {
    // Guards: no percentage between a mass and a force (or between a drive's effort and
    // a load's greatest value): each asked quantity is its own group, and changes are
    // against the first column of the same group only.
    let args = [
        "compare",
        "rigs/sash-window.yaml",
        "rigs/workshop-hoist.yaml",
        "tests/rigs/review/block-unknown.yaml",
        "tests/rigs/chain-plain.yaml",
    ];
    let text = stdout_of(&args);
    // Three groups: counterweight mass (drive), force at a haul (drive), mass at a
    // block (load); chain-plain joins the workshop hoist's group.
    assert!(text.contains("3 groups"), "{text}");
    assert!(text.contains("mass at `counterweight`"), "{text}");
    assert!(text.contains("mass at `hook`"), "{text}");
    assert!(text.contains("force at `winch`, `hand`"), "{text}");
    let forward: Vec<&str> = text.lines().filter(|l| l.starts_with("forward")).collect();
    assert_eq!(forward.len(), 3, "{text}");
    assert!(
        !forward[0].contains('(') && !forward[2].contains('('),
        "{text}"
    );
    // Hand check within the force group: 234.4 N against 2229 N is −89.5 %.
    assert!(
        forward[1].contains("2229 N") && forward[1].contains("(-89.5 %)"),
        "{text}"
    );
    let v = json_of(&[&args[..], &["--json"]].concat());
    let groups = v["groups"].as_array().unwrap();
    assert_eq!(groups.len(), 3);
    assert_eq!(groups[1]["columns"], serde_json::json!([1, 3]));
    assert_eq!(groups[2]["solve_for"]["role"], "load");
    assert_eq!(
        num(&v["change_pct"][1]["forward"]),
        0.0,
        "its own group's reference"
    );
    let csv = stdout_of(&[&args[..], &["--format", "csv"]].concat());
    assert_eq!(
        csv.lines().filter(|l| l.starts_with("figure,unit")).count(),
        3,
        "{csv}"
    );
    // One group: one table, as before.
    let one = stdout_of(&[
        "compare",
        "rigs/workshop-hoist.yaml",
        "tests/rigs/chain-plain.yaml",
    ]);
    assert!(
        !one.contains("groups") && one.contains("(-89.5 %)"),
        "{one}"
    );
}

#[test]
fn spread_words_the_share_not_moving_for_a_counterweight() {
    // Guards: spread says what a counterweight does not do in its failing samples.
    let text = failing(&["spread", "rigs/sash-window.yaml", "--samples", "100"]);
    let line = text
        .lines()
        .find(|l| l.contains("% of the samples"))
        .unwrap_or_else(|| panic!("{text}"));
    assert!(
        line.contains("`counterweight` does not raise `sash` by itself"),
        "{line}"
    );
}

#[test]
fn spread_over_a_rig_with_no_ranges_is_refused() {
    // Guards: with nothing given as a range every sample is the same rig; say so
    // (exit 2) instead of printing identical percentiles.
    let out = reeve(&["spread", "rigs/workshop-hoist.yaml", "--samples", "10"]);
    assert_eq!(out.code, 2);
    let err = &out.stderr;
    assert!(
        err.contains("nothing to spread") && err.contains("{min:"),
        "{err}"
    );
}

#[test]
fn a_sweep_between_equal_ends_is_refused() {
    // Guards: `--vary KEY=A..A` over several steps would print identical rows.
    let path = test_rig("chain-plain.yaml");
    let out = reeve(&["sweep", &path, "--vary", "parts.top.1.bearing.mu=0.2..0.2"]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("nothing to sweep"));
    stdout_of(&[
        "sweep",
        &path,
        "--vary",
        "parts.top.1.bearing.mu=0.2..0.2",
        "--steps",
        "1",
    ]);
}

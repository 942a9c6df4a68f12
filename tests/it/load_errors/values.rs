//! Keys, part kinds, types and values of a rig file, and how many problems are shown.

use super::*;

#[test]
fn the_example_loads() {
    let rig = load_str(EXAMPLE, "rig.yaml").unwrap();
    assert_eq!(rig.parts.len(), 5);
}

#[test]
fn yaml_syntax() {
    let e = fails(&with("fall: {rope: braid6,", "fall: {rope: braid6,,"));
    assert_problem(&e, 17, &["invalid YAML"]);
    let e = fails("format: 1\nparts:\n  a: [1, 2\n");
    assert!(e.to_string().starts_with("rig.yaml:"), "{e}");
}

#[test]
fn misspelt_top_level_key() {
    let e = fails(&with("limits:", "limit:"));
    assert_problem(&e, 5, &["limit", "did you mean `limits`?"]);
}

#[test]
fn misspelt_part_key() {
    let e = fails(&with(
        "diameter: 60,\n           bearing: {kind: plain",
        "diamter: 60,\n           bearing: {kind: plain",
    ));
    assert_problem(&e, 10, &["parts.head.diamter", "did you mean `diameter`?"]);
    // The missing diameter is reported too.
    assert_problem(&e, 10, &["parts.head.diameter", "missing `diameter`"]);
}

#[test]
fn key_of_another_kind() {
    let e = fails(&with(
        "{kind: anchor, at: [0, 0, 2400]}",
        "{kind: anchor, at: [0, 0, 2400], bearing: {kind: none}}",
    ));
    assert_problem(&e, 9, &["parts.eye.bearing", "not a key of an anchor part"]);
}

#[test]
fn unknown_part_kind() {
    let e = fails(&with("{kind: anchor,", "{kind: ancor,"));
    assert_problem(&e, 9, &["parts.eye.kind", "did you mean `anchor`?"]);
}

#[test]
fn wrong_type() {
    let e = fails(&with(
        "axle: [0, 1, 0], diameter: 60,\n           bearing: {kind: plain",
        "axle: [0, 1, 0], diameter: [60],\n           bearing: {kind: plain",
    ));
    assert_problem(
        &e,
        10,
        &["parts.head.diameter", "expected a length", "found a list"],
    );
    let e = fails(&with("at: [0, 0, 2400]", "at: [0, 0]"));
    assert_problem(&e, 9, &["parts.eye.at", "three numbers", "a list of 2"]);
    let e = fails(&with(
        "bearing: {kind: rolling, bore: 10, mu: 0.0015}",
        "bearing: rolling",
    ));
    assert_problem(&e, 14, &["parts.hook.a.bearing", "expected a bearing"]);
}

#[test]
fn text_where_a_number_belongs() {
    let e = fails(&with("mu: 0.12", "mu: high"));
    assert_problem(
        &e,
        11,
        &["parts.head.bearing.mu", "friction coefficient", "`high`"],
    );
    let e = fails(&with("load: {mass: 40}", "load: {mass: heavy}"));
    assert_problem(
        &e,
        12,
        &[
            "parts.hook.load.mass",
            "expected a mass such as `40 kg`",
            "`heavy`",
        ],
    );
}

#[test]
fn unknown_unit() {
    let e = fails(&with(
        "breaking_strength: 7.5 kN",
        "breaking_strength: 7.5 kips",
    ));
    assert_problem(
        &e,
        7,
        &[
            "ropes.braid6.breaking_strength",
            "unknown unit `kips`",
            "kN",
        ],
    );
    let e = fails(&with(
        "breaking_strength: 7.5 kN",
        "breaking_strength: 7.5 kg",
    ));
    assert_problem(
        &e,
        7,
        &["ropes.braid6.breaking_strength", "mass unit", "force"],
    );
    let e = fails(&with("length: mm", "length: furlong"));
    assert_problem(&e, 3, &["units.length", "unknown unit `furlong`"]);
}

#[test]
fn non_finite_numbers() {
    let e = fails(&with("diameter: 6,", "diameter: .nan,"));
    assert_problem(&e, 7, &["ropes.braid6.diameter", "not a finite number"]);
    let e = fails(&with("mu: 0.2", "mu: .inf"));
    assert_problem(&e, 7, &["ropes.braid6.mu", "not a finite number"]);
    let e = fails(&with("at: [400, 0, 1000]", "at: [400, -.inf, 1000]"));
    assert_problem(&e, 15, &["parts.hand.at.1", "not a finite number"]);
    let e = fails(&with("diameter: 6,", "diameter: 1e400,"));
    assert_problem(&e, 7, &["ropes.braid6.diameter"]);
}

#[test]
fn negative_or_zero_sizes() {
    let e = fails(&with("diameter: 6,", "diameter: -6,"));
    assert_problem(
        &e,
        7,
        &[
            "ropes.braid6.diameter",
            "expected a positive length",
            "`-6`",
        ],
    );
    let e = fails(&with("pin_diameter: 10", "pin_diameter: 0"));
    assert_problem(
        &e,
        11,
        &["parts.head.bearing.pin_diameter", "positive length"],
    );
    let e = fails(&with(
        "breaking_strength: 7.5 kN",
        "breaking_strength: -7.5 kN",
    ));
    assert_problem(&e, 7, &["ropes.braid6.breaking_strength", "positive force"]);
    let e = fails(&with("load: {mass: 40}", "load: {mass: -40 kg}"));
    assert_problem(&e, 12, &["parts.hook.load.mass", "0 or more"]);
}

#[test]
fn out_of_range_coefficients() {
    let e = fails(&with("mu: 0.12", "mu: -0.12"));
    assert_problem(&e, 11, &["parts.head.bearing.mu", "0 or more"]);
    let e = fails(&with(
        "{kind: rolling, bore: 10, mu: 0.0015}",
        "{kind: rated, efficiency: 1.2}",
    ));
    assert_problem(&e, 14, &["parts.hook.a.bearing.efficiency", "at most 1"]);
    let e = fails(&with(
        "{kind: rolling, bore: 10, mu: 0.0015}",
        "{kind: rated, factor: 0.9}",
    ));
    assert_problem(&e, 14, &["parts.hook.a.bearing.factor", "1 or more"]);
    let e = fails(&with("fleet_angle: 1.5", "fleet_angle: 0"));
    assert_problem(&e, 5, &["limits.fleet_angle", "greater than 0"]);
}

#[test]
fn zero_vectors() {
    let e = fails(&with(
        "axle: [0, 1, 0], diameter: 60,\n           bearing: {kind: plain",
        "axle: [0, 0, 0], diameter: 60,\n           bearing: {kind: plain",
    ));
    assert_problem(&e, 10, &["parts.head.axle", "zero vector"]);
    let e = fails(&with("moves: [0, 0, 1]", "moves: [0, 0, 0]"));
    assert_problem(&e, 12, &["parts.hook.moves", "zero vector"]);
    let e = fails(&with("gravity: [0, 0, -1]", "gravity: [0, 0, 0]"));
    assert_problem(&e, 4, &["gravity", "zero vector"]);
    let e = fails(&with(
        "{kind: haul, at: [400, 0, 1000]}",
        "{kind: haul, at: [400, 0, 1000], pull: [0, 0, 0]}",
    ));
    assert_problem(&e, 15, &["parts.hand.pull", "zero vector"]);
    // Huge components are scaled, not overflowed.
    let ok = with("gravity: [0, 0, -1]", "gravity: [1e11, 1e11, -1e11]");
    assert!(load_str(&ok, "rig.yaml").is_ok());
}

#[test]
fn path_names_an_unknown_part() {
    let e = fails(&with(
        "path: [eye, hook.a, head, hand]",
        "path: [eye, hook.a, hed, hand]",
    ));
    assert_problem(
        &e,
        17,
        &[
            "lines.fall.path.2",
            "no part named `hed`",
            "did you mean `head`?",
        ],
    );
    let e = fails(&with("rope: braid6,", "rope: braid7,"));
    assert_problem(
        &e,
        17,
        &[
            "lines.fall.rope",
            "no rope named `braid7`",
            "did you mean `braid6`?",
        ],
    );
}

#[test]
fn line_ends_and_middles_of_the_wrong_kind() {
    let e = fails(&with(
        "path: [eye, hook.a, head, hand]",
        "path: [head, hook.a, eye, hand]",
    ));
    assert_problem(
        &e,
        17,
        &[
            "lines.fall.path.0",
            "`head` is a sheave",
            "cannot end a line",
        ],
    );
    assert_problem(
        &e,
        17,
        &["lines.fall.path.2", "`eye` is an anchor", "cannot pass"],
    );
    let e = fails(&with("path: [eye, hook.a, head, hand]", "path: [hand]"));
    assert_problem(&e, 17, &["lines.fall.path", "at least two"]);
    let e = fails(&with(
        "path: [eye, hook.a, head, hand]",
        "path: [eye, {part: hook.a, turns: 1}, head, hand]",
    ));
    assert_problem(
        &e,
        17,
        &["lines.fall.path.1.turns", "only to a guide or drum"],
    );
    let e = fails(&with(
        "path: [eye, hook.a, head, hand]",
        "path: [eye, {part: hook.a, side: up}, head, hand]",
    ));
    assert_problem(&e, 17, &["lines.fall.path.1.side", "left, right"]);
}

#[test]
fn duplicate_part_names() {
    let e = fails(&with(
        "  hand:   {kind: haul",
        "  head:   {kind: anchor, at: [0, 0, 0]}\n  hand:   {kind: haul",
    ));
    assert_problem(&e, 15, &["parts.head", "duplicate key `head`", "line 10"]);
}

#[test]
fn drive_or_solve_for_missing_or_wrong() {
    let e = fails(&with("drive: hand", "drive: hnd"));
    assert_problem(
        &e,
        18,
        &["drive", "no part named `hnd`", "did you mean `hand`?"],
    );
    let e = fails(&with("solve_for: hand", "solve_for: head"));
    assert_problem(&e, 19, &["solve_for", "`head` is a sheave"]);
    // Two hauls and no drive.
    let two = with("drive: hand", "")
        .replace("solve_for: hand ", "")
        .replace(
            "  hand:   {kind: haul",
            "  other: {kind: haul, at: [0, 0, 0], force: 5}\n  hand:   {kind: haul",
        );
    let e = load_str(&two, "rig.yaml").unwrap_err();
    assert!(
        e.to_string()
            .contains("missing `drive`; the rig has 2 hauls"),
        "{e}"
    );
    assert!(e.to_string().starts_with("rig.yaml:1:"), "{e}");
}

#[test]
fn natural_quantity_must_be_given() {
    let e = fails(&with("load: {mass: 40}", "mass: 3"));
    assert_problem(&e, 12, &["parts.hook.load", "missing `load`"]);
}

#[test]
fn empty_file() {
    for text in ["", "\n\n# only a comment\n", "~\n", "\u{feff}"] {
        let e = fails(text);
        assert!(e.to_string().contains("the file is empty"), "{e}");
    }
    let e = fails("- a\n- b\n");
    assert_problem(&e, 1, &["expected a mapping of rig keys"]);
}

#[test]
fn missing_file_names_the_path() {
    let path = std::path::Path::new("no/such/rig-file.yaml");
    let e = load_file(path).unwrap_err();
    let shown = e.to_string();
    assert!(
        shown.contains("no/such/rig-file.yaml") && shown.contains("no such file"),
        "{shown}"
    );
}

#[test]
fn leading_bom_is_stripped() {
    let rig = load_str(&format!("\u{feff}{EXAMPLE}"), "rig.yaml").unwrap();
    assert_eq!(rig.parts.len(), 5);
    // And a file on disk with a BOM loads too.
    let dir = Scratch::new("bom");
    let path = dir.write("bom.yaml", &format!("\u{feff}{EXAMPLE}"));
    assert!(load_file(&path).is_ok());
}

#[test]
fn alias_bombs_and_deep_nesting_are_refused_fast() {
    let mut bomb = String::from("format: 1\na0: &a0 [x, x, x, x, x, x, x, x, x, x]\n");
    for i in 1..20 {
        let p = i - 1;
        bomb.push_str(&format!(
            "a{i}: &a{i} [*a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}]\n"
        ));
    }
    let start = Instant::now();
    let e = fails(&bomb);
    assert!(e.to_string().contains("aliases expand"), "{e}");
    for deep in [
        "[".repeat(900_000),
        "{a: ".repeat(200_000),
        "- ".repeat(100_000),
    ] {
        let e = fails(&deep);
        assert!(e.to_string().contains("nesting deeper"), "{e}");
    }
    let big = "#".repeat(2 << 20);
    assert!(fails(&big).to_string().contains("bytes"));
    assert!(
        start.elapsed() < Duration::from_secs(20),
        "took {:?}",
        start.elapsed()
    );
}

#[test]
fn two_documents() {
    let e = fails(&format!("{EXAMPLE}---\nformat: 1\n"));
    assert_problem(&e, 20, &["second YAML document"]);
}

#[test]
fn all_problems_are_collected() {
    let text = with("diameter: 6,", "diameter: -6,")
        .replace("mu: 0.12", "mu: -1")
        .replace("load: {mass: 40}", "load: {mass: 40 N}")
        .replace("hook.a, head, hand]", "hook.a, hed, hand]");
    let e = fails(&text);
    assert!(e.problems.len() >= 4, "{e}");
    assert_problem(&e, 7, &["ropes.braid6.diameter"]);
    assert_problem(&e, 11, &["parts.head.bearing.mu"]);
    assert_problem(&e, 12, &["parts.hook.load.mass", "force unit"]);
    assert_problem(&e, 17, &["hed"]);
    // In file order.
    let lines: Vec<usize> = e
        .problems
        .iter()
        .filter_map(|p| p.location.map(|l| l.line))
        .collect();
    assert_eq!(lines.len(), e.problems.len(), "every problem is located");
    assert!(lines.windows(2).all(|w| w[0] <= w[1]), "{lines:?}");
}

#[test]
fn missing_format_and_wrong_format() {
    let e = fails(&with("format: 1\n", ""));
    assert!(e.to_string().contains("missing `format`"), "{e}");
    let e = fails(&with("format: 1", "format: 2"));
    assert_problem(&e, 1, &["format", "unsupported format `2`"]);
}

#[test]
fn problems_are_capped_with_a_count() {
    let text: String = (0..5000).map(|i| format!("k{i}: {i}\n")).collect();
    let e = fails(&text);
    assert!(e.problems.len() <= 202, "{}", e.problems.len());
    assert!(e.to_string().contains("more problems not listed"), "{e}");
}

/// Guards bearing sizes: a pin or bore as large as the part it carries (a 200 mm pin in
/// a 60 mm sheave, or a bare `8` read as metres) is refused at its key, for sheaves and
/// drum shafts, from the file and from `--set`.
#[test]
fn bearing_sizes_that_do_not_fit_the_part_are_refused() {
    let e = fails(&with("pin_diameter: 10,", "pin_diameter: 200,"));
    assert_problem(
        &e,
        11,
        &[
            "parts.head.bearing.pin_diameter",
            "200 mm",
            "60 mm",
            "smaller than",
        ],
    );
    let e = fails(&with("bore: 10,", "bore: 60,"));
    assert_problem(&e, 14, &["parts.hook.a.bearing.bore", "smaller than"]);
    // A drum's shaft journal.
    let drum = with(
        "  hand:   {kind: haul, at: [400, 0, 1000]}",
        "  hand:   {kind: drum, at: [400, 0, 1000], axle: [0, 1, 0], diameter: 40,\n           shaft: {bearing: {kind: plain, pin_diameter: 45, mu: 0.1}}}",
    );
    let e = fails(&drum);
    assert_problem(
        &e,
        16,
        &["parts.hand.shaft.bearing.pin_diameter", "45 mm", "40 mm"],
    );
    // An override in the wrong unit is refused, naming the override and the file's unit.
    let metres = EXAMPLE
        .replace("length: mm", "length: m")
        .replace("diameter: 6,", "diameter: 0.006,")
        .replace("diameter: 60,", "diameter: 0.06,")
        .replace("pin_diameter: 10,", "pin_diameter: 0.01,")
        .replace("bore: 10,", "bore: 0.01,");
    load_str(&metres, "rig.yaml").unwrap();
    let e = load_str_with(
        &metres,
        "rig.yaml",
        &set(&[("parts.head.bearing.pin_diameter", "8")]),
    )
    .unwrap_err();
    let shown = e.to_string();
    assert!(
        shown.contains("8 m") && shown.contains("bare numbers") && shown.contains("override"),
        "{shown}"
    );
    // Written with its unit, it fits.
    load_str_with(
        &metres,
        "rig.yaml",
        &set(&[("parts.head.bearing.pin_diameter", "8 mm")]),
    )
    .unwrap();
    // A size written with its unit gets no hint about bare numbers.
    let e = load_str_with(
        &metres,
        "rig.yaml",
        &set(&[("parts.head.bearing.pin_diameter", "80 mm")]),
    )
    .unwrap_err();
    let shown = e.to_string();
    assert!(
        shown.contains("smaller than") && !shown.contains("bare numbers"),
        "{shown}"
    );
}

/// Guards the wording of `cone_angle`: a pivot's included angle written where the
/// half-angle belongs (120°) is refused with a message that says which angle is meant.
#[test]
fn cone_angle_errors_say_it_is_the_half_angle() {
    let text = with(
        "  hand:   {kind: haul, at: [400, 0, 1000]}",
        "  hand:   {kind: drum, at: [400, 0, 1000], axle: [0, 1, 0], diameter: 40,\n           shaft: {thrust: {load: 10, diameter: 20, mu: 0.1, contact: new, cone_angle: 120}}}",
    );
    let e = fails(&text);
    assert_problem(&e, 16, &["cone_angle", "half-angle", "included angle"]);
}

#[test]
fn schedule_times_before_the_start_or_three_at_one_time_are_refused() {
    // Guards the schedule's times: a run starts at rest at 0 s, and every command but
    // `motion` takes the value at the first time, so a point before 0 s made `check` use
    // one value (the first point's) and `motion` another (interpolated at 0 s): it is
    // refused where it is written. Two points at one time are a step; a third there means
    // nothing (its value is never used) and is refused too.
    let e = fails(&with(
        "load: {mass: 40}}",
        "load: {mass: {schedule: [[-5 s, 40 kg], [5 s, 50 kg]]}}}",
    ));
    assert_problem(
        &e,
        12,
        &["parts.hook.load.mass.schedule.0.0", "0 s or later"],
    );
    let e = fails(&with(
        "load: {mass: 40}}",
        "load: {mass: {schedule: [[0 s, 40 kg], [5 s, 50 kg], [5 s, 45 kg], [5 s, 30 kg]]}}}",
    ));
    assert_problem(
        &e,
        12,
        &[
            "parts.hook.load.mass.schedule.3.0",
            "two points at one time",
        ],
    );
    // A step (two points at one time) still loads.
    let text = with(
        "load: {mass: 40}}",
        "load: {mass: {schedule: [[0 s, 40 kg], [5 s, 50 kg], [5 s, 45 kg]]}}}",
    );
    assert!(load_str(&text, "rig.yaml").is_ok());
    // The binary: exit 2, the file, line and column, and the key.
    let bad = with(
        "load: {mass: 40}}",
        "load: {mass: {schedule: [[-5 s, 40 kg], [5 s, 50 kg]]}}}",
    );
    let ran = crate::support::run::reeve_on(&bad, &["motion"]);
    assert_eq!(ran.code, 2, "{}", ran.stderr);
    assert!(
        ran.stderr.contains(".yaml:12:") && ran.stderr.contains("schedule.0.0"),
        "{}",
        ran.stderr
    );
}

#[test]
fn travel_and_time_keys_are_checked_where_they_are_written() {
    // DESIGN.md §7's keys: each bad value names its line, key and what was expected.
    let e = fails(&with(
        "load: {mass: 40}}",
        "load: {mass: {schedule: [[0 s, 40 kg], [1 kg, 50 kg]]}}}",
    ));
    assert_problem(&e, 12, &["parts.hook.load.mass.schedule.1.0", "time"]);
    let e = fails(&with(
        "load: {mass: 40}}",
        "load: {mass: {schedule: [[5 s, 40 kg], [1 s, 50 kg]]}}}",
    ));
    assert_problem(&e, 12, &["times must not decrease"]);
    let e = fails(&with(
        "load: {mass: 40}}",
        "load: {mass: 40}, spring: {rate: 2 kg}}",
    ));
    assert_problem(&e, 12, &["parts.hook.spring.rate", "spring rate"]);
    // A schedule only where a natural quantity is written; a lever only on a drum.
    let e = fails(&with(
        "diameter: 60,\n           bearing: {kind: plain",
        "diameter: {schedule: [[0, 60]]},\n           bearing: {kind: plain",
    ));
    assert_problem(&e, 10, &["parts.head.diameter", "length"]);
    let e = fails(&with(
        "load: {mass: 40}}",
        "load: {mass: 40}, lever: {mass: 2, arm: [1, 0, 0]}}",
    ));
    assert_problem(&e, 12, &["lever", "drum"]);
    let e = fails(&format!("{EXAMPLE}travel: {{back: -5, forward: 100}}\n"));
    assert_problem(&e, 20, &["travel.back", "0 or more"]);
    let e = fails(&with(
        "limits: {fleet_angle: 1.5, design_factor: 5}",
        "limits: {fleet_angle: 1.5, design_factor: 5, stop_speed: fast}",
    ));
    assert_problem(&e, 5, &["limits.stop_speed", "speed"]);
    // Guards: an angular stop speed on a drive that moves along (a haul here) is refused,
    // not read as m/s (`30 deg/s` became 0.52 m/s and `rad/s` passed as m/s).
    for speed in ["30 deg/s", "0.5 rad/s"] {
        let e = fails(&with(
            "limits: {fleet_angle: 1.5, design_factor: 5}",
            &format!("limits: {{fleet_angle: 1.5, design_factor: 5, stop_speed: {speed}}}"),
        ));
        assert_problem(&e, 5, &["limits.stop_speed", "m/s"]);
    }
    // And the good spellings load: units of time, spring rate, inertia; an angle travel.
    let rig = load_str(
        &format!(
            "{}travel: {{back: 0 mm, forward: 0.8 m}}\n",
            with(
                "load: {mass: 40}}",
                "load: {mass: {schedule: [[0 s, 40 kg], [2 min, 45 kg], [1 h, 50 kg]]}}, spring: {rate: 2 N/mm, force: 3 N}}",
            )
            .replace("diameter: 60,\n           bearing: {kind: plain", "diameter: 60, inertia: 0.001 kg*m^2,\n           bearing: {kind: plain")
        ),
        "rig.yaml",
    )
    .unwrap_or_else(|e| panic!("{e}"));
    let hook = rig.part_named("hook").unwrap();
    let c = rig.changing.of(hook);
    let s = c.schedule.as_ref().expect("schedule");
    assert_eq!(s.points, vec![(0.0, 40.0), (120.0, 45.0), (3600.0, 50.0)]);
    assert_eq!(c.spring.map(|s| (s.rate, s.preload)), Some((2000.0, 3.0)));
    let t = rig.changing.travel.expect("travel");
    assert_abs("travel forward, m", t.forward, 0.8, 1e-12);
    let head = rig.part_named("head").unwrap();
    assert_eq!(rig.changing.of(head).inertia, Some(0.001));
    // Every other command takes the schedule's first value.
    assert_eq!(reeve::solve::given_quantity(&rig, hook), Some(40.0));
}

/// Guards: a drum lever whose arm is zero or lies along the axle gives no torque and no
/// inertia; it is refused where written instead of silently weighing nothing.
#[test]
fn a_lever_arm_along_the_axle_is_refused() {
    let trapdoor =
        std::fs::read_to_string(crate::support::example_rig("cellar-trapdoor")).expect("rig");
    let line = trapdoor
        .lines()
        .position(|l| l.contains("arm: [450, 0, 0]"))
        .expect("lever line")
        + 1;
    for arm in ["[0, 0, 0]", "[0, 450, 0]", "[0, -2, 0]"] {
        let text = trapdoor.replacen("arm: [450, 0, 0]", &format!("arm: {arm}"), 1);
        let e = fails(&text);
        assert_problem(&e, line, &["parts.hinge.lever.arm", "axle"]);
    }
    // Out of the axle's line, even tilted along it, the lever stays fine.
    let text = trapdoor.replacen("arm: [450, 0, 0]", "arm: [450, 30, 0]", 1);
    load_str(&text, "rig.yaml").expect("a tilted arm loads");
}

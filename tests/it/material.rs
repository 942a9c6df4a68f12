//! The rope as a material (DESIGN.md §7, issue 11 items 1–3): stretch, the load split
//! by stiffness, the spring rate and lost travel at the drive, the rope's own weight
//! along a span and over a sheave, sag. Each check names its source; hand calculations
//! show their arithmetic. The rigs are in `tests/rigs/material/`.

use reeve::math::STANDARD_GRAVITY;
use reeve::model::{LineId, PartId};
use reeve::report::Report;
use reeve::solve::elastic::castigliano_lost_travel;

use crate::support::run::reeve_on;
use crate::support::{
    assert_rel, audit_ok, example_rig, json_of, solve_test_rig, solve_text, test_rig,
};

#[test]
fn two_lift_lines_share_a_translating_batten_as_one_over_length() {
    // Source: Gere & Goodno, *Mechanics of Materials*, §2.4 "Statically indeterminate
    // structures" (two bars of the same EA holding a rigid bar that translates share the
    // load in proportion to EA/L). Hand calculation: lines of 9 m and 8 m, 300 N:
    // T_9 = 300·(1/9)/(1/9 + 1/8) = 300·8/17 = 141.18 N, T_8 = 300·9/17 = 158.82 N.
    let (rig, s) = solve_test_rig("material/two-lift-lines.yaml");
    let m = s.main();
    let (a, b) = (
        rig.lines.position(|l| l.name == "a").unwrap(),
        rig.lines.position(|l| l.name == "b").unwrap(),
    );
    for case in [&m.ideal, &m.forward, &m.back] {
        assert_rel("9 m line", case.tension[a][0], 300.0 * 8.0 / 17.0, 1e-9);
        assert_rel("8 m line", case.tension[b][0], 300.0 * 9.0 / 17.0, 1e-9);
        assert!(
            case.indeterminate && case.split_by_stiffness,
            "{:?}",
            case.case
        );
    }
    assert_rel(
        "9 m line, to two decimals",
        m.ideal.tension[a][0],
        141.18,
        5e-5,
    );
    assert_rel(
        "8 m line, to two decimals",
        m.ideal.tension[b][0],
        158.82,
        5e-5,
    );
    audit_ok(&s);
    // The warning says the split follows the stiffness.
    let warnings = reeve::checks::run(&rig, &s);
    let w = warnings
        .iter()
        .find(|w| w.code == "indeterminate")
        .expect("indeterminate warning");
    assert!(w.message.contains("follows the stiffness"), "{}", w.message);
}

#[test]
fn without_stiffness_the_split_stays_least_squares() {
    // The same rig with its rope's stiffness removed: the old least-squares split
    // (equal shares for parallel lines) and the old warning, which names the key.
    let text = std::fs::read_to_string(test_rig("material/two-lift-lines.yaml")).unwrap();
    let (rig, s) = solve_text(&text.replace(", stiffness: 1 MN", ""));
    let m = s.main();
    assert_rel(
        "least squares",
        m.ideal.tension[LineId::new(0)][0],
        150.0,
        1e-9,
    );
    assert!(!m.ideal.split_by_stiffness);
    let warnings = reeve::checks::run(&rig, &s);
    let w = warnings.iter().find(|w| w.code == "indeterminate").unwrap();
    assert!(w.message.contains("least-squares") && w.message.contains("`stiffness`"));
    assert!(m.lost_travel.is_none() && m.drive_stiffness.is_none());
}

#[test]
fn vertical_rope_under_its_own_weight() {
    // Source: Meriam & Kraige, *Engineering Mechanics: Statics*, §5/9 "Flexible cables"
    // (T = T₀ + μ·y: the tension grows by the weight per length times the rise), and
    // Gere & Goodno, *Mechanics of Materials*, §2.3 (a bar hanging under its own weight
    // and an end load: δ = (P·L + w·L²/2)/EA). Issue 11's check values: 100 m, 1.0 kg/m,
    // 10 kN at the foot → T_top = 10 000 + 9.80665·100 = 10 980.665 N = 10.981 kN;
    // EA = 9.80665 MN → δ = (10 000·100 + 9.80665·100²/2)/9.80665e6 = 0.106 97 m.
    let (rig, s) = solve_test_rig("material/hanging-rope.yaml");
    let m = s.main();
    assert_rel("foot", m.ideal.tension[LineId::new(0)][0], 10_000.0, 1e-12);
    assert_rel(
        "head",
        m.ideal.tension_end[LineId::new(0)][0],
        10_980.665,
        1e-12,
    );
    assert_rel("haul force", m.forward.value, 10_980.665, 1e-12);
    let report = Report::build(&rig, &s, Vec::new());
    let stretch = report.spans[0].stretch_m.as_ref().unwrap().ideal.unwrap();
    let expected = (10_000.0 * 100.0 + STANDARD_GRAVITY * 100.0 * 100.0 / 2.0) / 9.80665e6;
    assert_rel("stretch", stretch, expected, 1e-12);
    assert_rel("stretch, to five figures", stretch, 0.10697, 5e-5);
    // Vertical: no sag.
    assert!(report.spans[0].sag_m.is_none());
    audit_ok(&s);
}

#[test]
fn heavy_rope_over_a_frictionless_head_sheave() {
    // Issue 11's check value, by statics (Meriam & Kraige §5/9, T = T₀ + μ·y, on each
    // vertical span; a frictionless sheave passes the tension on): 100 N weight 10 m
    // below the sheave, haul 2 m below it, 1 kg/m: at the sheave 100 + 10·9.80665 =
    // 198.07 N; at the haul 198.07 − 2·9.80665 = 100 + 8·9.80665 = 178.45 N.
    let (_, s) = solve_test_rig("material/head-sheave-weight.yaml");
    let m = s.main();
    let expected = 100.0 + 8.0 * STANDARD_GRAVITY;
    assert_rel("haul force", m.ideal.value, expected, 1e-9);
    assert_rel("haul force, to two decimals", m.ideal.value, 178.45, 3e-5);
    assert_rel("forward (frictionless)", m.forward.value, expected, 1e-9);
    // Energy, by hand: hauling 1 m moves 1 m of rope from 10 m below the sheave to 2 m
    // below it, raising it 8 m: the rope's potential energy grows at 8·9.80665 W per
    // m/s of haul, and the weight's at 100 W.
    assert_rel(
        "rope power",
        m.ideal.rope_power,
        8.0 * STANDARD_GRAVITY,
        1e-9,
    );
    audit_ok(&s);
}

#[test]
fn lost_travel_two_ways_on_a_four_part_tackle() {
    // The rated four-part tackle of tests/rigs/tackle-rated.yaml with EA = 1 MN: four
    // falls of 1 m and a hauling part of 1.5 m, 1000 N on the hook. Frictionless, every
    // span carries 250 N; with the hook held, the whole line (one length of rope over
    // frictionless sheaves) stretches as the drive pulls: k = EA/ΣL = 1e6/5.5 N/m, lost
    // travel 250·5.5/1e6 = 1.375 mm (Gere & Goodno §2.2, axial stiffness). Castigliano
    // over the frictionless tension coefficients (Gere & Goodno §9.9): Σ (T/F)·T·L/EA
    // with T/F = 1 on every span gives the same.
    let text = std::fs::read_to_string(test_rig("tackle-rated.yaml")).unwrap();
    let text = text.replace("min_bend_ratio: 8}", "min_bend_ratio: 8, stiffness: 1 MN}");
    let (rig, s) = solve_text(&text);
    let m = s.main();
    assert_rel("spring rate", m.drive_stiffness.unwrap(), 1e6 / 5.5, 1e-9);
    assert_rel(
        "lost travel",
        m.lost_travel.unwrap(),
        250.0 * 5.5 / 1e6,
        1e-9,
    );
    let lines: Vec<LineId> = rig.lines.ids().collect();
    let castigliano =
        castigliano_lost_travel(&rig, &s.geometry, &lines, &m.ideal.tension, m.ideal.value)
            .unwrap();
    assert_rel("Castigliano", castigliano, m.lost_travel.unwrap(), 1e-9);
}

#[test]
fn lost_travel_two_ways_where_lines_share_the_load() {
    // The two lift lines of 9 m and 8 m (EA = 1 MN) under a frame hauled on a 1 m line:
    // the frame carries no load, so it settles as the drive pulls and the two lines act
    // in parallel: k = 1/(1/EA + 1/(EA·(1/9 + 1/8))), δ = 300/k = 1.5706 mm. Castigliano
    // over the ideal tensions (one load held, all tensions in proportion to the drive):
    // (141.18²·9 + 158.82²·8 + 300²·1)/(300·1e6), the same.
    let (rig, s) = solve_test_rig("material/two-lift-lines.yaml");
    let m = s.main();
    let k = 1.0 / (1e-6 + 1.0 / (1e6 * (1.0 / 9.0 + 1.0 / 8.0)));
    assert_rel("spring rate", m.drive_stiffness.unwrap(), k, 1e-9);
    assert_rel("lost travel", m.lost_travel.unwrap(), 300.0 / k, 1e-9);
    let lines: Vec<LineId> = rig.lines.ids().collect();
    let castigliano =
        castigliano_lost_travel(&rig, &s.geometry, &lines, &m.ideal.tension, m.ideal.value)
            .unwrap();
    assert_rel("Castigliano", castigliano, m.lost_travel.unwrap(), 1e-9);
}

/// A cart on a level track pulled by a level rope 20 m long: the span is horizontal.
const LEVEL_SPAN: &str = r#"
format: 1
title: level span
units: {length: m, force: N, mass: kg}
ropes:
  cord: {diameter: 8 mm, mu: 0.2, mass_per_length: 200 g/m}
parts:
  cart: {kind: block, at: [0, 0, 0], moves: [1, 0, 0], load: {force: 500}}
  hand: {kind: haul, at: [20, 0, 0]}
lines:
  pull: {rope: cord, path: [cart, hand]}
drive: hand
"#;

#[test]
fn a_level_span_sags_like_the_parabola() {
    // Meriam & Kraige §5/9: the parabolic cable's sag h = μ·L²/(8T₀), approached by the
    // catenary for a shallow span. 0.2 kg/m, 20 m, 500 N: 0.2·9.80665·400/4000 =
    // 0.196 13 m; the catenary is within 0.1 % of it (sag/span ≈ 1 %).
    let (rig, s) = solve_text(LEVEL_SPAN);
    let report = Report::build(&rig, &s, Vec::new());
    let sag = report.spans[0]
        .sag_m
        .expect("a level span with weight sags");
    let parabola = 0.2 * STANDARD_GRAVITY * 400.0 / (8.0 * 500.0);
    assert_rel("sag", sag, parabola, 1e-3);
    // Level: both ends at one tension, so no `_end` figures; the pull is the load.
    assert!(report.spans[0].tension_n.forward_end.is_none());
    assert_rel("pull", s.main().forward.value, 500.0, 1e-12);
    // The weight hangs half on each end: the cart's pin load has 0.2·g·20/2 down.
    let pin = s.main().ideal.pin_load[PartId::new(0)].unwrap();
    assert_rel(
        "cart carries half the rope",
        -pin.z,
        0.2 * STANDARD_GRAVITY * 10.0,
        1e-9,
    );
}

#[test]
fn json_keys_of_the_contract() {
    // DESIGN.md §7: spans gain `stretch_m: {ideal, forward, back}`, `tension_n.{case}_end`
    // where the ends differ and `sag_m`; the top level `lost_travel`, `drive_stiffness`.
    let j = json_of(&["check", &test_rig("material/hanging-rope.yaml"), "--json"]);
    let span = &j["spans"][0];
    for case in ["ideal", "forward", "back"] {
        assert!(span["stretch_m"][case].as_f64().is_some(), "{span}");
        assert!(
            span["tension_n"][format!("{case}_end")].as_f64().is_some(),
            "{span}"
        );
    }
    assert!(j["lost_travel"].as_f64().is_some() && j["drive_stiffness"].as_f64().is_some());
    let j = json_of(&["check", &test_rig("one-sheave.yaml"), "--json"]);
    for key in ["lost_travel", "drive_stiffness"] {
        assert!(
            j.get(key).is_none(),
            "a rig without the keys gains no {key}"
        );
    }
    assert!(j["spans"][0].get("stretch_m").is_none() && j["spans"][0].get("sag_m").is_none());
    let out = reeve_on(LEVEL_SPAN, &["check", "--json"])
        .expect_code(0)
        .json();
    assert!(out["spans"][0]["sag_m"].as_f64().is_some());
}

#[test]
fn bad_material_values_are_located_errors() {
    for (value, says) in [
        ("stiffness: -1 kN", "positive axial stiffness"),
        ("stiffness: 3 kg", "force"),
        ("mass_per_length: 2 kg", "mass per length"),
        ("mass_per_length: -0.1", "zero or more"),
    ] {
        let text = LEVEL_SPAN.replace("mass_per_length: 200 g/m", value);
        let (code, _, err) = reeve_on(&text, &["check"]).parts();
        assert_eq!(code, 2, "{value}: {err}");
        assert!(err.contains(":6:") && err.contains(says), "{value}: {err}");
    }
}

#[test]
fn a_line_sets_balance_changes_with_trim_height() {
    // `sweep --stroke` re-solves with the rope's weight at each step: as the batten
    // flies out (forward), each lift line's rope moves from the batten side to the arbor
    // side. Hand calculation by potential energy (Beer & Johnston, *Statics*, ch. 10,
    // virtual work and potential energy): a vertical span from height z up to a fixed
    // block at H holds w·g·(H² − z²)/2; with the batten at z_b = 3 + x and the arbor at
    // z_a = 4 − x, each line's d²PE/dx² = −2·w·g, so the ideal drive force falls by
    // 6·w·g per metre for three lines: w = 0.26 lb/ft = 0.386 93 kg/m, 22.77 N/m, 45.53 N
    // over 2 m. Weightless lift lines keep it constant.
    let rig = crate::support::example_rig("line-set");
    let steps = |set: &str| {
        let j = json_of(&[
            "sweep", &rig, "--stroke", "2m", "--steps", "3", "--set", set, "--json",
        ]);
        let s = j["steps"].as_array().unwrap().clone();
        let ideal = |k: usize| s[k]["ideal"].as_f64().unwrap();
        assert_eq!(s.last().unwrap()["travel"].as_f64(), Some(2.0));
        (ideal(0), ideal(s.len() - 1))
    };
    let w = 0.26 * 0.453_592_37 / 0.3048;
    let (low, high) = steps("ropes.lift.stiffness=3.6 MN");
    assert_rel(
        "fall of the ideal force over 2 m",
        low - high,
        2.0 * 6.0 * w * STANDARD_GRAVITY,
        1e-3,
    );
    let (low, high) = steps("ropes.lift.mass_per_length=0");
    assert_rel("weightless: no change", high, low, 1e-4);
}

#[test]
fn the_tables_show_the_rope_as_a_material() {
    // Text: a table of its own after the spans; CSV (one table): further span columns;
    // a rig without the keys keeps today's tables (the goldens guard that).
    let rig = test_rig("material/hanging-rope.yaml");
    let text = crate::support::stdout_of(&["table", &rig]);
    assert!(
        text.contains("Rope as a material") && text.contains("stretch forward (m)"),
        "{text}"
    );
    let csv = crate::support::stdout_of(&["table", &rig, "--format", "csv"]);
    let lines: Vec<&str> = csv.lines().collect();
    assert_eq!(lines.len(), 2, "one table, one span: {csv}");
    assert!(lines[0].contains("stretch ideal (m)") && lines[0].contains("tension back at end (N)"));
    assert!(lines[1].contains("0.106972"), "{csv}");
    let html = crate::support::stdout_of(&["report", &rig, "-o", "-"]);
    assert!(html.contains("id=\"material\"") && html.contains("Lost travel at the drive"));
}

#[test]
fn the_split_by_stiffness_depends_on_stiffness_ratios_only() {
    // Scaling every EA leaves the split (compatibility: T_i·L_i/EA equal) and halves
    // every stretch when EA doubles (δ = T·L/EA, Gere & Goodno §2.3), where lines share a
    // block as where they do not. A very stiff rope is not the least-squares split: the
    // split follows EA/L however stiff (issue 11 item 2).
    let text = std::fs::read_to_string(test_rig("material/two-lift-lines.yaml")).unwrap();
    let run = |ea: &str| {
        let (rig, s) = solve_text(&text.replace("stiffness: 1 MN", &format!("stiffness: {ea}")));
        let report = Report::build(&rig, &s, Vec::new());
        let stretch: Vec<f64> = report
            .spans
            .iter()
            .map(|s| s.stretch_m.as_ref().unwrap().forward.unwrap())
            .collect();
        (s.main().forward.tension.clone(), stretch)
    };
    let (t1, d1) = run("1 MN");
    let (t2, d2) = run("2 MN");
    let (t3, _) = run("1e11 N");
    for (l, (a, b)) in t1.iter().zip(&t2).enumerate() {
        assert_rel(&format!("line {l}, EA doubled"), b[0], a[0], 1e-9);
        assert_rel(
            &format!("line {l}, EA 1e11 N"),
            t3[LineId::new(l)][0],
            a[0],
            1e-9,
        );
    }
    for (a, b) in d1.iter().zip(&d2) {
        assert_rel("stretch halves", *b, a / 2.0, 1e-9);
    }
}

#[test]
fn the_sag_shown_beside_the_forward_case_says_it_is_the_largest_over_the_cases() {
    // Guards a figure that contradicted its label: `sag_m` is the largest sag over the
    // cases (the slackest case, back on a line set: 0.1037 m on lift.sl's level span,
    // where the forward tension 569 N gives w·L²/(8H) = 3.795·11²/(8·569) = 0.1009 m),
    // but the text and HTML showed it under "forward" with no word of that.
    let rig = example_rig("line-set");
    let text = crate::support::stdout_of(&["check", &rig]);
    assert!(text.contains("largest sag"), "{text}");
    let html = crate::support::stdout_of(&["report", &rig, "-o", "-"]);
    assert!(html.contains("the largest over the cases"), "{html}");
    let table = crate::support::stdout_of(&["table", &rig, "--format", "csv"]);
    assert!(
        table.lines().next().unwrap().contains("largest sag (m)"),
        "{table}"
    );
}

#[test]
fn the_lost_travel_of_a_single_hanging_rope_is_its_stretch() {
    // Guards that the lost travel agrees with the stretch shown beside it. One vertical
    // rope, hauled from its head, loaded part held: the drive takes in exactly the
    // rope's elongation from just taut (weightless) to loaded, δ = (T_b·L + w·g·L²/2)/EA
    // = 0.10697 m (Gere & Goodno §2.3; the unit-load method δ = Σ n·∫T ds/EA with n = 1
    // in the one span). F_ideal/k gives (T_b + w·g·L)·L/EA = 0.11197 m: the rope's own
    // weight counted twice over (0.0100 m instead of 0.0050 m).
    let (_, s) = solve_test_rig("material/hanging-rope.yaml");
    let m = s.main();
    let g = STANDARD_GRAVITY;
    let stretch = (10_000.0 * 100.0 + 1.0 * g * 100.0 * 100.0 / 2.0) / 9.80665e6;
    assert_rel("lost travel", m.lost_travel.unwrap(), stretch, 1e-6);
}

#[test]
fn the_studies_largest_tension_counts_a_spans_tighter_end() {
    // Guards `largest tension` of compare, sweep and spread against the rope's weight:
    // the 100 m hanging rope is hauled at its head with 10 kN + 1 kg/m · g · 100 m =
    // 10 980.665 N (Meriam & Kraige §5/9, T = T₀ + μy), which is also the drive's force,
    // but the studies showed the foot's 10 000 N.
    let rig = test_rig("material/hanging-rope.yaml");
    let j = json_of(&["compare", &rig, "--json"]);
    let largest = j["columns"][0]["largest_tension_n"].as_f64().unwrap();
    assert_rel(
        "largest tension",
        largest,
        10_000.0 + STANDARD_GRAVITY * 100.0,
        1e-9,
    );
}

/// Guards the rope's weight on a sheave's wrap arc: it was left out of the pin load (and
/// so of the journal friction and of a running block's load), though the rope lying on
/// the arc bears on the sheave like any other load.
#[test]
fn the_rope_on_a_sheaves_arc_loads_its_pin() {
    // Derived (statics of the rope on the arc as a free body, Meriam & Kraige, *Statics*,
    // §5/9 "Flexible cables", and the friction circle of Beer & Johnston, *Statics*,
    // journal bearings): the rope lying on the arc is pulled by the two spans at the
    // tangent points, weighs `w·g·R·φ` (its length `R·φ`, along gravity) and is held by
    // the sheave; so the force on the pin is `T_a·u_a + T_b·u_b + w·g·R·φ·ĝ`. The rig of
    // `heavy_rope_over_a_frictionless_head_sheave`: both spans vertical, wrap π, pitch
    // radius R = (100 + 6)/2 mm = 0.053 m, 1 kg/m; both spans pull 198.0665 N down at
    // the tangent points (100 N + 10 m of rope on the weight's side; the haul's side is
    // that less 2 m of rope, by the head: a frictionless sheave passes the tension on and
    // the tangent points are level). Arc: 9.80665·0.053·π = 1.63285 N.
    let arc = STANDARD_GRAVITY * 0.053 * std::f64::consts::PI;
    assert_rel("arc weight, to five figures", arc, 1.63285, 5e-6);
    let at_head = 100.0 + 10.0 * STANDARD_GRAVITY;
    let (rig, s) = solve_test_rig("material/head-sheave-weight.yaml");
    let head = rig.parts.position(|p| p.name == "head").unwrap();
    let m = s.main();
    for case in [&m.ideal, &m.forward] {
        let pin = case.pin_load[head].expect("pin load");
        assert_rel("pin load, down", -pin.z, 2.0 * at_head + arc, 1e-9);
        assert!(pin.x.abs() < 1e-9 && pin.y.abs() < 1e-9, "{pin}");
    }
    // The arc's weight is carried by the pin, not by the spans: the haul is unchanged.
    assert_rel(
        "haul force",
        m.ideal.value,
        100.0 + 8.0 * STANDARD_GRAVITY,
        1e-9,
    );
    audit_ok(&s);

    // With a plain bearing the arc's weight is in the journal's load: with the weight's
    // side slack (it rises) at T_s = 198.0665 N and both spans down, the moment balance
    // `(T_t − T_s)·R = r_f·(T_t + T_s + W_arc)` gives
    // `T_t = (T_s·(R + r_f) + r_f·W_arc)/(R − r_f)`, r_f = 0.01 m·sin(atan 0.2).
    let text = std::fs::read_to_string(test_rig("material/head-sheave-weight.yaml"))
        .unwrap()
        .replace(
            "{kind: none}",
            "{kind: plain, pin_diameter: 20 mm, mu: 0.2}",
        );
    let (_, s) = solve_text(&text);
    let (r, r_f) = (0.053, 0.01 * 0.2_f64.atan().sin());
    let tight = (at_head * (r + r_f) + r_f * arc) / (r - r_f);
    let m = s.main();
    assert_rel(
        "forward haul force",
        m.forward.value,
        tight - 2.0 * STANDARD_GRAVITY,
        1e-9,
    );
    let pin = m.forward.pin_load[head].expect("pin load");
    assert_rel("forward pin load", -pin.z, tight + at_head + arc, 1e-9);
    audit_ok(&s);

    // A running block carries the rope on its sheave's arc too: two vertical falls of
    // 5 m from level ends, the lower half of the block's sheave wrapped; with a
    // frictionless sheave the block's equilibrium gives `2·T_low = M·g + W_arc` at the
    // tangent points, and the haul holds `T_low + 5 m·w·g`.
    let block = "format: 1
title: running block in a heavy rope
units: {length: m, force: N, mass: kg}
ropes:
  heavy: {diameter: 6 mm, mu: 0.2, mass_per_length: 1 kg/m}
parts:
  eye: {kind: anchor, at: [-0.053, 0, 0]}
  hook: {kind: block, at: [0, 0, -5], load: {mass: 20}}
  hook.s: {kind: sheave, block: hook, at: [0, 0, -5], axle: [0, 1, 0], diameter: 100 mm,
           bearing: {kind: none}}
  hand: {kind: haul, at: [0.053, 0, 0], pull: [0, 0, 1]}
lines:
  fall: {rope: heavy, path: [eye, hook.s, hand]}
";
    let (rig, s) = solve_text(block);
    let m = s.main();
    let low = (20.0 * STANDARD_GRAVITY + arc) / 2.0;
    assert_rel(
        "haul force",
        m.ideal.value,
        low + 5.0 * STANDARD_GRAVITY,
        1e-9,
    );
    let sheave = rig.parts.position(|p| p.name == "hook.s").unwrap();
    let pin = m.ideal.pin_load[sheave].expect("pin load");
    assert_rel("block sheave's pin load, up", pin.z, 2.0 * low - arc, 1e-9);
    audit_ok(&s);
}

/// Guards one name for one figure: `table --json` gave a span's end tension only as
/// `tension_end_n.{case}`, while DESIGN.md §7 names it `tension_n.{case}_end` (as
/// `check --json` writes it), so a script written against the contract found nothing
/// in the table. Both are there now, with the same numbers; `tension_end_n` stays.
#[test]
fn table_json_gives_the_end_tension_under_the_contracts_name_too() {
    let rig = test_rig("material/hanging-rope.yaml");
    let check = json_of(&["check", &rig, "--json"]);
    let table = json_of(&["table", &rig, "--json"]);
    let (c, t) = (&check["spans"][0], &table["spans"][0]);
    for case in ["ideal", "forward", "back"] {
        let end = format!("{case}_end");
        assert_eq!(t["tension_n"][&end], c["tension_n"][&end], "{t}");
        assert_eq!(t["tension_n"][&end], t["tension_end_n"][case], "{t}");
        assert!(t["tension_n"][&end].as_f64().is_some(), "{t}");
    }
    // The cases asked for, only.
    let table = json_of(&["table", &rig, "--json", "--case", "forward"]);
    let t = &table["spans"][0]["tension_n"];
    assert!(
        t["forward_end"].as_f64().is_some() && t.get("ideal_end").is_none(),
        "{t}"
    );
    // A weightless rope's ends are one: no `_end` keys.
    let table = json_of(&["table", &test_rig("one-sheave.yaml"), "--json"]);
    let t = &table["spans"][0]["tension_n"];
    assert!(
        t.get("forward_end").is_none() && t["forward"].as_f64().is_some(),
        "{t}"
    );
}

//! Guards that rope-as-material values which load fine but mean nothing (a stretch
//! longer than the span, a bend loss of half the tension, a rope denser or stiffer than
//! solid steel) are flagged by a warning instead of printed clean (issue 11, "never
//! silently wrong"), and that ordinary values stay quiet.

use reeve::checks::Warning;

use crate::support::solve_text;

/// A 10 kg weight on a 10 mm rope over one head sheave 10 m up (our own probe rig);
/// `ROPE_KEYS` is replaced by the rope's material keys under test.
const HOIST: &str = r#"format: 1
title: probe hoist
units: {length: m, force: N, mass: kg}
ropes:
  r: {diameter: "10 mm", breaking_strength: "20 kN", mu: 0.2, ROPE_KEYS}
parts:
  head: {kind: sheave, at: [0, 0, 10], axle: [0, 1, 0], diameter: "200 mm",
         bearing: {kind: plain, pin_diameter: "20 mm", mu: 0.1}}
  w: {kind: weight, at: [-0.1, 0, 0], mass: 10}
  hand: {kind: haul, at: [0.1, 0, 8]}
lines:
  fall: {rope: r, path: [w, head, hand]}
"#;

fn warnings(keys: &str) -> Vec<Warning> {
    let (rig, s) = solve_text(&HOIST.replace("ROPE_KEYS", keys));
    reeve::checks::run(&rig, &s)
}

fn codes(keys: &str) -> Vec<&'static str> {
    warnings(keys).iter().map(|w| w.code).collect()
}

#[test]
fn ordinary_material_values_give_no_warning() {
    // 10 mm fibre rope: EA 500 kN (strain 0.02 % at 100 N), 60 g/m, 3 % bend loss:
    // working figures of the kind the README gives (common practice).
    let c = codes("stiffness: 500 kN, mass_per_length: 60 g/m, bend_loss: 0.03");
    assert!(c.is_empty(), "{c:?}");
    // 10 mm steel wire rope: 0.4 kg/m, EA 3 MN (README: metallic area × 100 kN/mm²).
    let c = codes("stiffness: 3 MN, mass_per_length: 0.4 kg/m");
    assert!(c.is_empty(), "{c:?}");
}

#[test]
fn a_stretch_beyond_any_rope_is_flagged() {
    // Strain = T/EA with T about 100 N: EA 200 N is a strain of 50 %, EA 1 N a strain
    // of 100 (the stretch is 100 times the span). No rope stretches like that.
    for keys in ["stiffness: 1 N", "stiffness: 200 N"] {
        let w = warnings(keys);
        let s = w.iter().find(|w| w.code == "large-stretch");
        let s = s.unwrap_or_else(|| panic!("{keys}: {w:?}"));
        assert!(!s.fails, "a warning, the figures stand: {s:?}");
        assert!(
            s.message.contains("fall") && s.message.contains("stiffness"),
            "{s:?}"
        );
    }
    // 5 kN under about 100 N: 2 % strain, within a fibre rope's working range.
    assert!(!codes("stiffness: 5 kN").contains(&"large-stretch"));
}

#[test]
fn a_bend_loss_far_above_published_figures_is_flagged() {
    for keys in ["bend_loss: 0.5", "bend_loss: 0.3"] {
        let w = warnings(keys);
        let b = w.iter().find(|w| w.code == "bend-loss");
        let b = b.unwrap_or_else(|| panic!("{keys}: {w:?}"));
        assert!(b.message.contains("`r`"), "{b:?}");
    }
    assert!(!codes("bend_loss: 0.1").contains(&"bend-loss"));
}

#[test]
fn a_rope_heavier_or_stiffer_than_solid_steel_is_flagged() {
    // A solid steel bar of 10 mm: 7850 kg/m³ × π·(0.01 m)²/4 = 0.617 kg/m, and
    // EA = 210 GPa × 78.5 mm² = 16.5 MN (steel's density and modulus, handbook values
    // from memory). 100 kg/m and 1 GN are beyond any rope of that diameter.
    let w = warnings("mass_per_length: 100 kg/m");
    assert!(w.iter().any(|w| w.code == "rope-weight"), "{w:?}");
    let w = warnings("stiffness: 1000 MN");
    assert!(w.iter().any(|w| w.code == "rope-stiffness"), "{w:?}");
}

/// A 1 kg weight over a head sheave, hauled level across 10 m of rope weighing 1 kg/m
/// (our own probe rig): the level span weighs 98 N against a tension of about 21 N.
const HEAVY_LEVEL_SPAN: &str = r#"format: 1
title: level span heavier than its tension
units: {length: m, force: N, mass: kg}
ropes:
  r: {diameter: "20 mm", breaking_strength: "50 kN", mu: 0.2, mass_per_length: MASS}
parts:
  hand: {kind: haul, at: [0, 0, 0.1]}
  head: {kind: sheave, at: [10, 0, 0], axle: [0, 1, 0], diameter: "200 mm",
         bearing: {kind: plain, pin_diameter: "20 mm", mu: 0.1}}
  w: {kind: weight, at: [10.1, 0, -1], mass: 1}
lines:
  fall: {rope: r, path: [w, head, hand]}
"#;

#[test]
fn a_span_that_sags_far_off_its_chord_is_flagged() {
    // The statics keeps every span a straight chord. A span of run a and weight q per
    // length under tension T leaves its ends about q·a/(2T) (radians) off the chord (the
    // parabolic cable's end slope, Meriam & Kraige, *Engineering Mechanics: Statics*
    // §5/9; sag = q·a²/(8T), so this is 4·sag/a). Here q·a/(2T) = 9.807·10/(2·21) ≈ 2.3:
    // the tension shown cannot even carry half the span's weight (49 N), so the haul
    // force of 21 N means nothing.
    let (rig, s) = solve_text(&HEAVY_LEVEL_SPAN.replace("MASS", "1"));
    let w = reeve::checks::run(&rig, &s);
    let sag = w.iter().find(|w| w.code == "large-sag");
    let sag = sag.unwrap_or_else(|| panic!("{w:?}"));
    assert!(
        sag.message.contains("fall") && sag.message.contains("span 1"),
        "{sag:?}"
    );
    // 10 g/m: q·a/(2T) = 0.0981·10/(2·10) ≈ 0.05, about 3° off the chord: quiet.
    let (rig, s) = solve_text(&HEAVY_LEVEL_SPAN.replace("MASS", "0.01"));
    let w = reeve::checks::run(&rig, &s);
    assert!(!w.iter().any(|w| w.code == "large-sag"), "{w:?}");
}

#[test]
fn a_span_slack_at_its_lower_end_names_the_negative_tension() {
    // Guards the slack-span message where the rope's weight makes a span's ends differ:
    // it said "would need a negative tension (149.9 N)", the start's positive tension,
    // while the span's lower end needed −46 N. The haul hangs 30 m below the head with
    // 0.5 kg/m of rope, more rope weight than the 10 kg weight on the other side.
    let text = HOIST.replace("ROPE_KEYS", "mass_per_length: 0.5").replace(
        "hand: {kind: haul, at: [0.1, 0, 8]}",
        "hand: {kind: haul, at: [0.1, 0, -30], pull: [0, 0, -1]}",
    );
    let (rig, s) = solve_text(&text);
    let w = reeve::checks::run(&rig, &s);
    let slack: Vec<_> = w.iter().filter(|w| w.code == "slack-span").collect();
    assert!(!slack.is_empty(), "{w:?}");
    for s in slack {
        assert!(
            s.message.contains("(-"),
            "the negative tension is shown: {s:?}"
        );
    }
}

#[test]
fn the_safety_factor_check_counts_the_tension_at_a_spans_tighter_end() {
    // Guards the design-factor check against the rope's own weight: the 100 m vertical
    // rope of tests/rigs/material/hanging-rope.yaml carries 10 kN at its foot and
    // 10 kN + 1 kg/m · g · 100 m = 10.981 kN at its head (Meriam & Kraige §5/9,
    // T = T₀ + μy). With a breaking strength of 52 kN the factor is 52/10.981 = 4.74,
    // below the design factor 5 (the span table showed 4.74), but the check read only
    // the foot's 10 kN (5.2) and passed.
    let rig = crate::support::edited_rig("material/hanging-rope.yaml", |t| {
        t.replace(
            "long: {diameter: 16 mm,",
            "long: {diameter: 16 mm, breaking_strength: 52 kN,",
        )
    });
    let s = reeve::solve::solve(&rig, &reeve::solve::SolveOptions::default()).unwrap();
    let w = reeve::checks::run(&rig, &s);
    let sf = w.iter().find(|w| w.code == "safety-factor");
    let sf = sf.unwrap_or_else(|| panic!("{w:?}"));
    assert!(sf.fails && sf.message.contains("4.74"), "{sf:?}");
}

#[test]
fn a_table_of_a_rig_that_fails_its_checks_says_so() {
    // Guards `table` against printing a slack rig clean: the haul hanging 30 m below the
    // head on 0.5 kg/m of rope needs a negative tension in a span, which `check` fails
    // (`slack-span`), but the table printed the negative figure with no word of it. The
    // text and Markdown tables now name the failing checks before the caution; the CSV
    // (one table of data) cannot, and the JSON carries the warnings already.
    let text = HOIST.replace("ROPE_KEYS", "mass_per_length: 0.5").replace(
        "hand: {kind: haul, at: [0.1, 0, 8]}",
        "hand: {kind: haul, at: [0.1, 0, -30], pull: [0, 0, -1]}",
    );
    for format in ["text", "markdown"] {
        let ran = crate::support::run::reeve_on(&text, &["table", "--format", format]);
        assert_eq!(ran.code, 0, "{}", ran.stderr);
        assert!(
            ran.stdout
                .contains("Checks that fail on this rig: slack-span"),
            "{format}:\n{}",
            ran.stdout
        );
    }
    // A rig that passes its checks says nothing of them.
    let ok = HOIST.replace("ROPE_KEYS", "mass_per_length: 0.05");
    let ran = crate::support::run::reeve_on(&ok, &["table"]);
    assert!(!ran.stdout.contains("Checks that fail"), "{}", ran.stdout);
}

/// Guards a rope diameter written in the wrong unit: in a metre file `diameter: 6`
/// (meant as millimetres) is a rope 6 m thick, and every figure came out clean. No rope
/// is thicker than the largest mooring hawsers, about 0.2 m, nor thinner than the
/// finest monofilament line, about 0.05 mm (common practice); the warning says which.
#[test]
fn a_rope_diameter_no_rope_has_is_flagged() {
    let text = |d: &str| {
        HOIST
            .replace("diameter: \"10 mm\"", &format!("diameter: {d}"))
            .replace(", ROPE_KEYS", "")
            .replace("diameter: \"200 mm\"", "diameter: 20")
            .replace("pin_diameter: \"20 mm\"", "pin_diameter: 0.5")
            .replace("[-0.1, 0, 0]", "[-13, 0, 0]")
            .replace("[0.1, 0, 8]", "[13, 0, 8]")
    };
    let (rig, s) = solve_text(&text("6"));
    let w = reeve::checks::run(&rig, &s);
    let d = w.iter().find(|w| w.code == "rope-diameter");
    let d = d.unwrap_or_else(|| panic!("a 6 m rope: {w:?}"));
    assert!(!d.fails, "a warning, the figures stand: {d:?}");
    assert!(
        d.message.contains("rope `r`")
            && d.message.contains("6.000 m")
            && d.message.contains("unit"),
        "{d:?}"
    );
    // 0.01 mm (a metre value written in a millimetre file's way): too thin.
    let (rig, s) = solve_text(
        &HOIST
            .replace("diameter: \"10 mm\"", "diameter: \"0.01 mm\"")
            .replace(", ROPE_KEYS", ""),
    );
    let w = reeve::checks::run(&rig, &s);
    assert!(w.iter().any(|w| w.code == "rope-diameter"), "{w:?}");
    // A 10 mm rope, a 0.1 mm cord and a 150 mm hawser are ropes.
    for d in ["\"10 mm\"", "\"0.1 mm\"", "\"150 mm\""] {
        let (rig, s) = solve_text(&text(d));
        let w = reeve::checks::run(&rig, &s);
        assert!(w.iter().all(|w| w.code != "rope-diameter"), "{d}: {w:?}");
    }
}

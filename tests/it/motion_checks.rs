//! `motion` against `check` on rigs whose figures would mean nothing: a rope that would
//! have to push (slack), a rope so stiff that the integrator cannot follow it.

use crate::support::run::reeve_on;

/// A lid hauled up over one head sheave, a spring under it pushing up with `force`.
fn spring_lid(force: &str) -> String {
    format!(
        r#"format: 1
title: Lid block on a spring that pushes it up
units: {{length: mm, force: N, mass: kg}}
ropes:
  cord: {{kind: fibre, diameter: 6, breaking_strength: 5 kN, mu: 0.2}}
parts:
  head: {{kind: sheave, at: [0, 0, 2000], axle: [0, 1, 0], diameter: 100,
         bearing: {{kind: plain, pin_diameter: 10, mu: 0.3}}}}
  lid:  {{kind: block, at: [-53, 0, 1000], moves: [0, 0, 1], load: {{mass: 10}},
         spring: {{rate: 0 N/m, force: {force}}}}}
  hand: {{kind: haul, at: [53, 0, 800], pull: [0, 0, -1], force: 20 N}}
lines:
  fall: {{rope: cord, path: [lid, head, hand]}}
drive: hand
travel: {{back: 0 mm, forward: 300 mm}}
"#
    )
}

#[test]
fn a_spring_that_leaves_the_rope_to_push_is_refused_as_check_fails_it() {
    // Guards `motion` against a slack rope: a spring pushing the 10 kg lid up with 150 N
    // (more than its 98 N weight) leaves the rope in compression. The statics' figures
    // of a negative tension are those of a rope that pushes: the ratio multiplies a
    // negative tension, so the "friction" is negative and the band reversed (forward
    // -54.83 N below back -49.19 N). `motion` printed that band and ran it clean; `check`
    // fails it as `slack-span`. Both must say the rope goes slack.
    let text = spring_lid("-150 N");
    let check = reeve_on(&text, &["check"]);
    assert_eq!(check.code, 1, "{}", check.stdout);
    assert!(check.stdout.contains("slack-span"), "{}", check.stdout);
    let motion = reeve_on(&text, &["motion"]);
    assert_eq!(motion.code, 2, "{}\n{}", motion.stdout, motion.stderr);
    assert!(
        motion.stderr.contains("negative tension") && motion.stderr.contains("slack"),
        "{}",
        motion.stderr
    );
    assert!(motion.stdout.is_empty(), "{}", motion.stdout);
}

#[test]
fn a_negative_spring_force_that_keeps_the_rope_taut_gives_check_s_band_in_order() {
    // The same lid with the spring pushing up 50 N (less than its weight): the rope stays
    // taut, and `motion`'s band at the drawn position is `check`'s: back below forward,
    // the same figures (the ideal 48.07 N = 10 kg·g − 50 N, by hand).
    let text = spring_lid("-50 N");
    let check = reeve_on(&text, &["check", "--json"]);
    let c: serde_json::Value = serde_json::from_str(&check.stdout).expect("check JSON");
    let ideal = c["ideal"]["value"].as_f64().unwrap();
    assert!((ideal - (10.0 * 9.80665 - 50.0)).abs() < 1e-6, "{ideal}");
    let (forward, back) = (
        c["forward"]["value"].as_f64().unwrap(),
        c["back"]["value"].as_f64().unwrap(),
    );
    assert!(back < ideal && ideal < forward, "{back} {ideal} {forward}");
    let motion = reeve_on(&text, &["motion", "--format", "json"]);
    assert_eq!(motion.code, 0, "{}", motion.stderr);
    let m: serde_json::Value = serde_json::from_str(&motion.stdout).expect("motion JSON");
    let band = m["holding_band"].as_array().unwrap();
    let (lo, hi) = (band[0].as_f64().unwrap(), band[1].as_f64().unwrap());
    assert!((lo - back).abs() < 1e-9 * back.abs(), "{lo} vs {back}");
    assert!(
        (hi - forward).abs() < 1e-9 * forward.abs(),
        "{hi} vs {forward}"
    );
    // 20 N is below back, so the lid would run down, but it stands on its back stop
    // (`travel.back` 0): it stays.
    assert_eq!(m["events"].as_array().unwrap().len(), 0, "{}", m["events"]);
}

fn warning_codes(json: &serde_json::Value) -> Vec<&str> {
    json["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| w["code"].as_str().unwrap())
        .collect()
}

fn motion_json(text: &str, extra: &[&str]) -> serde_json::Value {
    let mut args = vec!["motion", "--format", "json"];
    args.extend(extra);
    let ran = reeve_on(text, &args);
    assert_eq!(ran.code, 0, "{}", ran.stderr);
    serde_json::from_str(&ran.stdout).expect("motion JSON")
}

#[test]
fn a_spring_of_1e12_n_per_m_gives_no_phantom_stick_slip() {
    // Guards the stick-slip count against jumps far below what a run resolves: the
    // oscillator of motion.rs (1 kg, μs 0.5, μk 0.3) on a spring of 10¹² N/m jumps
    // 2·(μs − μk)·m·g/k = 3.9e-12 m a cycle (the classic stick-slip oscillator). Those
    // "cycles" were reported as jerky motion with 3 stick-slip cycles; they are below
    // the run's resolution (`RESOLVED_MOTION`, 1 µm) and must not read as stick-slip.
    let mu = |m: f64| m / (1.0 - m * m).sqrt(); // tan(asin μ'), as in motion.rs
    let text = crate::motion::STICK_SLIP
        .replace("MUK", &format!("{}", mu(0.3)))
        .replace("MUS", &format!("{}", mu(0.5)))
        .replace("rate: 100 N/m", "rate: 1e12 N/m");
    let json = motion_json(&text, &["--duration", "20"]);
    let codes = warning_codes(&json);
    assert!(codes.contains(&"unresolved-motion"), "{codes:?}");
    assert!(!codes.contains(&"jerky-motion"), "{codes:?}");
    for e in json["events"].as_array().unwrap() {
        assert!(
            e["event"] != "sticks" && e["event"] != "slips",
            "{}",
            json["events"]
        );
    }
    for s in json["strokes"].as_array().unwrap() {
        assert_eq!(s["stick_slip_cycles"], 0, "{s}");
    }
    // The real oscillator (100 N/m) keeps its cycles: motion.rs checks their figures.
    let real = motion_json(
        &crate::motion::STICK_SLIP
            .replace("MUK", &format!("{}", mu(0.3)))
            .replace("MUS", &format!("{}", mu(0.5))),
        &["--duration", "20"],
    );
    assert!(!warning_codes(&real).contains(&"unresolved-motion"));
}

#[test]
fn a_rope_of_1e12_n_on_a_drive_weight_runs_as_inextensible_with_a_warning() {
    // Guards the two-degree run against a rope too stiff to follow: the cellar trapdoor's
    // box (24 kg) on a rope of EA 10¹² N swings with a period 2π·√(m/k) of about 48 µs
    // (k = 4.2e11 N/m at the drive). The run chattered at its end stop (6,555 strokes,
    // span tensions of 1.5 MN) and stopped at the step limit. A real rope damps those
    // swings: the run takes the rope as inextensible, says so, and gives the rigid run.
    let text =
        std::fs::read_to_string(crate::support::example_rig("cellar-trapdoor")).expect("rig");
    let stiff = text.replace("mu: 0.15}", "mu: 0.15, stiffness: 1e12 N}");
    assert_ne!(stiff, text);
    let rigid = motion_json(&text, &[]);
    let json = motion_json(&stiff, &[]);
    let codes = warning_codes(&json);
    assert!(codes.contains(&"stiff-rope"), "{codes:?}");
    assert!(!codes.contains(&"step-limit"), "{codes:?}");
    assert_eq!(json["degrees_of_freedom"], 1);
    assert_eq!(json["events"], rigid["events"]);
    assert_eq!(
        json["strokes"].as_array().unwrap().len(),
        rigid["strokes"].as_array().unwrap().len()
    );
}

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
    assert!((hi - forward).abs() < 1e-9 * forward.abs(), "{hi} vs {forward}");
    // 20 N is below back, so the lid would run down, but it stands on its back stop
    // (`travel.back` 0): it stays.
    assert_eq!(m["events"].as_array().unwrap().len(), 0, "{}", m["events"]);
}

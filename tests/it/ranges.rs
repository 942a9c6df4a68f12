//! Guards that a value written as a range (`{min, max}` uniform, `{mean, sd}` normal)
//! passes at both ends the checks a plain value of its key gets, so that `check` does
//! not run clean on a range half of which is nonsense; and that `spread` with samples
//! it could not solve says so and exits 1, as `sweep` does with unsolved steps.

use crate::support::example_rig;
use crate::support::run::Reeve;

/// The bundled sash window's text.
fn sash_window() -> String {
    std::fs::read_to_string(example_rig("sash-window")).expect("rigs/sash-window.yaml")
}

/// The bundled sash window with its pulley's ranged `mu` replaced by `mu`.
fn sash_with_pulley_mu(mu: &str) -> String {
    let text = sash_window();
    let written = "mu: {min: 0.15, max: 0.35}";
    assert!(
        text.contains(written),
        "the sash window's pulley range moved"
    );
    text.replace(written, &format!("mu: {mu}"))
}

#[test]
fn a_range_reaching_below_zero_friction_is_refused_where_it_is_written() {
    for (mu, end) in [
        ("{min: -0.1, max: 0.2}", "`min`"),
        ("{mean: -0.1, sd: 0.05}", "`mean`"),
    ] {
        let text = sash_with_pulley_mu(mu);
        for command in ["check", "spread"] {
            let out = Reeve::new([command]).rig_text(&text).run().expect_code(2);
            // Line 16, column 57: where the range starts in the file (the plain-value
            // error of `mu: -0.1` points at the same place).
            assert!(
                out.stderr
                    .contains("rig.yaml:16:57: parts.pulley.bearing.mu:"),
                "{command} {mu}: {}",
                out.stderr
            );
            assert!(
                out.stderr
                    .contains("expected a friction coefficient of 0 or more")
                    && out.stderr.contains(end),
                "{command} {mu}: {}",
                out.stderr
            );
            assert!(out.stdout.is_empty(), "{command} {mu}: printed a report");
        }
        // A study's runs (the parsed rig resolved again per step, the ends' verdict
        // kept between runs that leave the ranges alone) refuse it too.
        let out = Reeve::new([
            "sweep",
            "--vary",
            "parts.counterweight.mass=6..7 kg",
            "--steps",
            "2",
        ])
        .rig_text(&text)
        .run()
        .expect_code(2);
        assert!(
            out.stderr.contains("parts.pulley.bearing.mu") && out.stdout.is_empty(),
            "sweep {mu}: {}",
            out.stderr
        );
    }
}

#[test]
fn a_range_is_checked_at_both_ends_for_every_ranged_key() {
    let text = sash_window();
    // The high end too: a rated efficiency above 1 is refused as a plain 1.05 is.
    let rated = text.replace(
        "bearing: {kind: plain, pin_diameter: 6, mu: {min: 0.15, max: 0.35}}",
        "bearing: {kind: rated, efficiency: {min: 0.9, max: 1.05}}",
    );
    let out = Reeve::new(["check"]).rig_text(&rated).run().expect_code(2);
    assert!(
        out.stderr.contains("parts.pulley.bearing.efficiency") && out.stderr.contains("`max`"),
        "{}",
        out.stderr
    );
    // A load mass: the weight's mass must be positive at the low end.
    let weight = text.replace("mass: 6.4}", "mass: {min: 0, max: 10}}");
    let out = Reeve::new(["check"]).rig_text(&weight).run().expect_code(2);
    assert!(
        out.stderr.contains("rig.yaml:17:")
            && out
                .stderr
                .contains("parts.counterweight.mass: expected a positive mass"),
        "{}",
        out.stderr
    );
    // A range set with --set is checked the same way (and says which override).
    let out = Reeve::new([
        "check",
        "rigs/sash-window.yaml",
        "--set",
        "parts.pulley.bearing.mu={min: -0.1, max: 0.5}",
    ])
    .run()
    .expect_code(2);
    assert!(
        out.stderr.contains("parts.pulley.bearing.mu") && out.stderr.contains("set by override"),
        "{}",
        out.stderr
    );
    // A negative sd was already refused; ranges inside the domain still load.
    let out = Reeve::new(["check"])
        .rig_text(&sash_with_pulley_mu("{mean: 0.1, sd: -0.05}"))
        .run()
        .expect_code(2);
    assert!(
        out.stderr.contains("`sd` must be 0 or more"),
        "{}",
        out.stderr
    );
    Reeve::new(["check"])
        .rig_text(&sash_with_pulley_mu("{min: 0, max: 0.4}"))
        .run()
        .expect_code(0);
}

/// Rope round a post with ten extra turns (our own probe rig): where the rope's `mu`
/// times the wrap passes ln 1e12 ≈ 27.6 (above about μ = 0.44 here) the capstan ratio
/// is refused as unphysical, so part of a valid range cannot be solved. The weight is a
/// milligram and the rope absurdly strong so that no solved sample fails a check: the
/// exit code then tells only of the unsolved samples.
const POST: &str = r#"format: 1
title: probe post with many turns
units: {length: mm, force: N, mass: kg}
ropes:
  cord: {diameter: 6, breaking_strength: 50000 MN, mu: {min: 0.01, max: 0.8}}
parts:
  post: {kind: guide, at: [0, 0, 1000], axle: [0, 1, 0], diameter: 100}
  bag:  {kind: weight, at: [-50, 0, 0], mass: 1e-6}
  hand: {kind: haul, at: [50, 0, 0]}
lines:
  line: {rope: cord, path: [bag, {part: post, turns: 10}, hand]}
"#;

#[test]
fn a_spread_with_unsolved_samples_exits_1_and_says_how_many() {
    Reeve::new(["check"]).rig_text(POST).run().expect_code(0);
    let out = Reeve::new(["spread", "--samples", "20", "--seed", "1"])
        .rig_text(POST)
        .run()
        .expect_code(1);
    assert!(
        out.stdout
            .contains("9 of 20 samples could not be solved: the spread is incomplete"),
        "{}",
        out.stdout
    );
    let json = Reeve::new(["spread", "--samples", "20", "--seed", "1", "--json"])
        .rig_text(POST)
        .run()
        .expect_code(1)
        .json();
    assert_eq!(json["failed"], 9, "{json}");
    // Every sample solved: still 0, and no note.
    let out = Reeve::new(["spread", "--samples", "20", "--seed", "1"])
        .rig_text(&POST.replace("max: 0.8", "max: 0.3"))
        .run()
        .expect_code(0);
    assert!(
        !out.stdout.contains("samples could not be solved"),
        "{}",
        out.stdout
    );
}

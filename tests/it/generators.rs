//! The rig generators of `tests/it/support/generators.rs`, which `benches/scale.rs` times
//! at large sizes, checked at small sizes: each family loads, solves through the real binary, and
//! matches its closed form where it has one. The closed forms are derived in the
//! generators' docs (marked "derived") or are the published formulas named there.
//! Through the binary and its JSON (the contract of DESIGN.md §5), so these checks hold
//! while the library's internals change.

use serde_json::Value;

use crate::support::assert_rel;
use crate::support::generators::{
    cascade, chain, line_sets, max_line_sets, ranged_tackle, serpentine, tackle, tackles,
    CASCADE_LOAD_KG, CHAIN_LOAD_KG, G, LINE_SET_ARBOR_KG, LINE_SET_BATTEN_KG, MAX_RIG_BYTES,
    RANGED_TACKLE_SHEAVES,
};
use crate::support::run::reeve_on;

/// `reeve ARGS[0] RIG ARGS[1..] --json` on a generated rig, which must succeed (exit 0),
/// parsed.
fn json(text: &str, args: &[&str]) -> Value {
    reeve_on(text, &[args, &["--json"]].concat())
        .expect_code(0)
        .json()
}

fn value(v: &Value, case: &str) -> f64 {
    v[case]["value"]
        .as_f64()
        .unwrap_or_else(|| panic!("no {case} value in {v}"))
}

/// The headline (the main sub-rig) and every other sub-rig of a `check --json`.
fn all_subrigs(report: &Value) -> Vec<&Value> {
    let others = report["subrigs"].as_array().expect("subrigs");
    std::iter::once(report).chain(others.iter()).collect()
}

#[test]
fn line_sets_are_independent_sub_rigs_with_the_ideal_effort_of_one_set() {
    // Derived (virtual work): batten, arbor and operator move at one speed (1:1 purchase
    // over the floor block), so the ideal pull is the unbalanced weight (180 − 170) kg · g.
    let ideal = (LINE_SET_BATTEN_KG - LINE_SET_ARBOR_KG) * G;
    let report = json(&line_sets(4), &["check"]);
    let subrigs = all_subrigs(&report);
    assert_eq!(subrigs.len(), 4);
    let forward = value(subrigs[0], "forward");
    for (i, sub) in subrigs.iter().enumerate() {
        assert_eq!(sub["drive"], format!("s{i}.operator"));
        assert_rel(&format!("set {i} ideal"), value(sub, "ideal"), ideal, 1e-12);
        // The sets are identical: one forward value.
        assert_rel(
            &format!("set {i} forward"),
            value(sub, "forward"),
            forward,
            1e-12,
        );
    }
    assert!(
        forward > ideal,
        "friction costs effort: {forward} vs {ideal}"
    );
    assert!(report["energy_audit"]["forward"].as_f64().unwrap() < 1e-9);
}

#[test]
fn the_largest_line_set_file_is_the_largest_the_loader_reads() {
    let n = max_line_sets();
    assert!(n > 1000, "{n} line sets");
    assert!(line_sets(n).len() <= MAX_RIG_BYTES);
    // One set more is refused for its size: the mirrored cap is the loader's.
    let (code, _, err) = reeve_on(&line_sets(n + 1), &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(err.contains(&MAX_RIG_BYTES.to_string()), "{err}");
}

#[test]
fn frictionless_cascade_gives_the_weight_over_two_to_the_n() {
    // Closed form W/2^N (derived in `cascade`): each movable pulley halves the pull.
    // Small sizes only: today's dense solve loses digits on longer cascades (30 pulleys
    // are 4e-7 off); `benches/scale.rs` reports that error at every size.
    let w = CASCADE_LOAD_KG * G;
    for n in [1, 2, 5, 10] {
        let report = json(&cascade(n, "{kind: none}"), &["check"]);
        let expected = w / 2f64.powi(n as i32);
        for case in ["ideal", "forward", "back"] {
            assert_rel(
                &format!("{n} pulleys, {case}"),
                value(&report, case),
                expected,
                1e-9,
            );
        }
        assert_rel(
            &format!("{n} pulleys, velocity ratio"),
            report["velocity_ratio"].as_f64().unwrap(),
            2f64.powi(n as i32),
            1e-9,
        );
    }
}

#[test]
fn rated_cascade_matches_its_closed_form() {
    // Closed form (derived in `cascade`): forward W·(K/(1+K))^N, back W·(1/(1+K))^N.
    let (w, k) = (CASCADE_LOAD_KG * G, 1.04_f64);
    for n in [1, 3, 10] {
        let rig = cascade(n, &format!("{{kind: rated, factor: {k}}}"));
        let report = json(&rig, &["check"]);
        let n = n as i32;
        assert_rel(
            &format!("{n} rated pulleys, forward"),
            value(&report, "forward"),
            w * (k / (1.0 + k)).powi(n),
            1e-9,
        );
        assert_rel(
            &format!("{n} rated pulleys, back"),
            value(&report, "back"),
            w * (1.0 / (1.0 + k)).powi(n),
            1e-9,
        );
    }
}

#[test]
fn serpentine_matches_the_capstan_equation() {
    // Capstan equation (Euler–Eytelwein; Hibbeler, Engineering Mechanics: Statics, §8.5):
    // every wrap is exactly π, so forward W·exp(μNπ), back W·exp(−μNπ).
    let (w, mu) = (CHAIN_LOAD_KG * G, 0.1);
    for n in [1, 2, 3, 10, 50] {
        let report = json(&serpentine(n, mu), &["check"]);
        let turn = mu * n as f64 * std::f64::consts::PI;
        assert_rel(
            &format!("{n} guides, ideal"),
            value(&report, "ideal"),
            w,
            1e-9,
        );
        assert_capstan(&format!("{n} guides"), &report, w, turn, 1e-9);
    }
}

#[test]
fn zig_zag_chain_matches_the_capstan_equation_over_its_wraps() {
    // Capstan equation (Euler–Eytelwein; Hibbeler, Engineering Mechanics: Statics, §8.5)
    // over the wraps the binary reports: forward W·exp(μΣφ), back W·exp(−μΣφ). The wraps
    // of the guides away from the ends are checked against geometry (derived): the cord
    // passes under the lower guides and over the upper ones, so neighbours (centres 60 mm
    // across and 100 mm up, L = √(60² + 100²) apart, pitch radius R = 6 mm) are joined by
    // crossed tangents, each asin(2R/L) steeper than the line of centres, and the cord
    // turns by 2·(atan(100/60) + asin(2R/L)) at each. The end guides, which the cord from
    // the end points turns the other way round, meet their neighbours by external
    // tangents and are left out.
    let (w, mu) = (G, 0.01);
    let centres = (60f64).hypot(100.0);
    let interior = 2.0 * ((100f64 / 60.0).atan() + (12.0 / centres).asin());
    for n in [3, 10, 50] {
        let report = json(&chain(n, mu), &["check"]);
        let wraps: Vec<f64> = report["parts"]
            .as_array()
            .unwrap()
            .iter()
            .filter(|p| p["kind"] == "guide")
            .map(|p| p["wrap_deg"].as_f64().unwrap().to_radians())
            .collect();
        assert_eq!(wraps.len(), n);
        for (i, wrap) in wraps.iter().enumerate().take(n - 2).skip(2) {
            assert_rel(&format!("{n} guides, wrap of g{i}"), *wrap, interior, 1e-9);
        }
        let turn = mu * wraps.iter().sum::<f64>();
        assert_capstan(&format!("{n} guides"), &report, w, turn, 1e-12);
    }
}

/// Forward `weight·exp(turn)` and back `weight·exp(−turn)` (capstan equation, `turn` =
/// μ·Σφ), relative tolerance `tol`.
fn assert_capstan(what: &str, report: &Value, weight: f64, turn: f64, tol: f64) {
    let forward = value(report, "forward");
    assert_rel(
        &format!("{what}, forward"),
        forward,
        weight * turn.exp(),
        tol,
    );
    let back = value(report, "back");
    assert_rel(&format!("{what}, back"), back, weight * (-turn).exp(), tol);
}

/// Hauling-part pull of a tackle with rated sheaves, N = S parts (wire-rope handbook
/// reeving efficiency, DESIGN.md §1): `W / (N·E)`, `E = (K^N − 1)/(K^S·N·(K − 1))`.
fn handbook_pull(w: f64, k: f64, parts: i32) -> f64 {
    let e = (k.powi(parts) - 1.0) / (k.powi(parts) * parts as f64 * (k - 1.0));
    w / (parts as f64 * e)
}

#[test]
fn ranged_tackle_has_21_ranges_and_its_nominal_is_the_handbook_tackle() {
    let text = ranged_tackle();
    let report = json(&text, &["check"]);
    // Nominal: every factor 1.04 (middle of 1.02..1.06), the load its mean, 500 kg.
    let parts = RANGED_TACKLE_SHEAVES as i32;
    assert_rel(
        "nominal forward",
        value(&report, "forward"),
        handbook_pull(500.0 * G, 1.04, parts),
        1e-9,
    );
    let spread = json(&text, &["spread", "--samples", "20", "--seed", "1"]);
    let inputs = spread["inputs"].as_array().expect("inputs");
    assert_eq!(inputs.len(), RANGED_TACKLE_SHEAVES + 1, "{spread}");
}

#[test]
fn independent_tackles_match_the_plain_bearing_closed_form_and_rank() {
    // Derived in `tackles`: K = (1 + ρ)/(1 − ρ), ρ = r·sin(atan μ)/R with r = 5 mm,
    // μ = 0.1, R = (92 + 8)/2 = 50 mm; forward W·K²/(1 + K).
    let rho = 5.0 * 0.1f64.atan().sin() / 50.0;
    let k = (1.0 + rho) / (1.0 - rho);
    let w = 500.0 * G;
    let text = tackles(3);
    let report = json(&text, &["check"]);
    let subrigs = all_subrigs(&report);
    assert_eq!(subrigs.len(), 3);
    for (i, sub) in subrigs.iter().enumerate() {
        assert_rel(
            &format!("tackle {i} forward"),
            value(sub, "forward"),
            w * k * k / (1.0 + k),
            1e-9,
        );
    }
    // `rank` lists every sheave of every tackle.
    let (code, out, err) = reeve_on(&text, &["rank"]).parts();
    assert_eq!(code, 0, "{err}");
    for i in 0..3 {
        assert!(out.contains(&format!("t{i}.upper")), "{out}");
    }
}

#[test]
fn stroke_of_a_tackle_keeps_its_closed_form_at_every_step() {
    // The falls stay vertical as the hook rises and the hand goes down, so every step
    // of the stroke has the handbook pull of the 4-part tackle (N = S = 4, K = 1.04).
    let report = json(
        &tackle(4),
        &["sweep", "--stroke", "1000 mm", "--steps", "5"],
    );
    let steps = report["steps"].as_array().expect("steps");
    assert_eq!(steps.len(), 6, "both ends included");
    for step in steps {
        assert_rel(
            &format!("forward at travel {}", step["travel"]),
            step["forward"].as_f64().unwrap(),
            handbook_pull(500.0 * G, 1.04, 4),
            1e-9,
        );
    }
}

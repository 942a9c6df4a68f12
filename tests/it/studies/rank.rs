//! Upgrade ranking and sensitivities.

use super::*;

// ----------------------------------------------------------------------- rank

#[test]
fn in_a_tackle_the_sheave_nearest_the_hauling_part_ranks_first() {
    let r = json_of(&["rank", &test_rig("tackle-rated.yaml"), "--json"]);
    let parts = r["parts"].as_array().unwrap();
    let order: Vec<&str> = parts.iter().map(|p| p["part"].as_str().unwrap()).collect();
    // Hauling part ← upper.d ← lower.c ← upper.b ← lower.a ← dead end.
    assert_eq!(order, ["upper.d", "lower.c", "upper.b", "lower.a"]);
    // Hand calculation for the first: with upper.d frictionless the tensions from the
    // dead end are T0·(1, K, K², K³) carrying W, and the pull is T0·K³:
    // pull = W·K³/(1 + K + K² + K³).
    let k: f64 = 1.04;
    let expected = 1000.0 * k.powi(3) / (1.0 + k + k * k + k.powi(3));
    assert_rel(
        "pull with upper.d frictionless",
        num(&parts[0]["frictionless"]),
        expected,
        1e-9,
    );
}

#[test]
fn along_a_chain_of_identical_sheaves_every_sheave_saves_the_same() {
    // Multiplicative losses commute: with load-independent ratios k (friction circle,
    // no sheave weight; DESIGN.md §1) the pull is W·k³ and any one frictionless sheave
    // gives W·k², whichever it is, although the last sheave dissipates the most power.
    let r = json_of(&["rank", &test_rig("chain-plain.yaml"), "--json"]);
    let saved: Vec<f64> = r["parts"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| num(&p["frictionless_saved"]))
        .collect();
    assert_eq!(saved.len(), 3);
    for s in &saved {
        assert_rel(
            &format!("saving of each sheave {saved:?}"),
            *s,
            saved[0],
            1e-9,
        );
        assert!(*s > 0.0);
    }
    // ... and the frictionless value is the forward value of the rig written that way.
    for p in r["parts"].as_array().unwrap() {
        let name = p["part"].as_str().unwrap();
        let set = format!("parts.{name}.bearing={{kind: none}}");
        let f = check_forward("chain-plain.yaml", &[&set]);
        assert_eq!(num(&p["frictionless"]), f, "{name}");
    }
}

#[test]
fn ranking_with_an_alternative_bearing() {
    let r = json_of(&[
        "rank",
        &test_rig("chain-plain.yaml"),
        "--to",
        "rolling",
        "--json",
    ]);
    assert_eq!(
        r["parts"].as_array().unwrap().len(),
        3,
        "the chain's sheaves"
    );
    for p in r["parts"].as_array().unwrap() {
        let name = p["part"].as_str().unwrap();
        // Catalogue default: rolling bore = the plain pin diameter, mu 0.0015.
        let set = format!("parts.{name}.bearing={{kind: rolling, bore: 10 mm, mu: 0.0015}}");
        assert_rel(
            &format!("{name} with a rolling bearing"),
            num(&p["alternative"]),
            check_forward("chain-plain.yaml", &[&set]),
            1e-12,
        );
    }
    let yaml = json_of(&[
        "rank",
        &test_rig("chain-plain.yaml"),
        "--to",
        "{kind: plain, pin_diameter: 8, mu: 0.08}",
        "--json",
    ]);
    assert!(num(&yaml["parts"][0]["alternative_saved"]) > 0.0);
    let out = reeve(&[
        "rank",
        &test_rig("chain-plain.yaml"),
        "--to",
        "{kind: plane}",
    ]);
    assert_eq!(out.code, 2);
}

#[test]
fn sensitivity_matches_the_capstan_derivative() {
    // Capstan equation (Euler–Eytelwein), DESIGN.md §1: F = W·exp(mu·phi), phi = pi,
    // so dF/dmu = W·phi·exp(mu·phi). W = 10 kg × 9.80665 m/s², mu = 0.25.
    let r = json_of(&["rank", &test_rig("capstan-guide.yaml"), "--json"]);
    let w = 10.0 * 9.80665;
    let phi = std::f64::consts::PI;
    let s = r["sensitivities"]
        .as_array()
        .unwrap()
        .iter()
        .find(|s| s["key"] == "parts.bar.mu")
        .expect("guide mu");
    let expected = w * phi * (0.25 * phi).exp();
    assert_rel(
        &format!("dF/dmu of {s}"),
        num(&s["derivative"]),
        expected,
        1e-6,
    );
    // The rope's own mu does not act where the guide gives its own.
    let rope = r["sensitivities"]
        .as_array()
        .unwrap()
        .iter()
        .find(|s| s["key"] == "ropes.cord4.mu")
        .unwrap();
    assert!(num(&rope["derivative"]).abs() < 1e-6);
    // Frictionless guide: the ideal W.
    assert_rel(
        "frictionless guide: the ideal W",
        num(&r["parts"][0]["frictionless"]),
        w,
        1e-9,
    );
}

//! `compare`, `sweep` and `stroke`.

use super::*;

// ------------------------------------------------------------ compare and sweep

#[test]
fn compare_of_rated_tackles_reproduces_the_handbook_formula() {
    // Wire-rope handbook reeving efficiency formula, DESIGN.md §1, with N = S = 4
    // (hauling part leaves the fixed block), W = 1000 N, at each K of the variants.
    let c = json_of(&[
        "compare",
        &test_rig("tackle-rated.yaml"),
        "--variants",
        "--format",
        "json",
    ]);
    for (label, k) in [
        ("base", 1.04),
        ("K1.02", 1.02),
        ("K1.06", 1.06),
        ("K1.10", 1.10),
    ] {
        let col = c["columns"]
            .as_array()
            .and_then(|a| a.iter().find(|x| x["label"] == label))
            .expect("column");
        let expected = handbook_pull(1000.0, k, 4, 4);
        let got = num(&col["forward"]);
        assert_rel(&format!("K = {k}: forward"), got, expected, 1e-9);
        let e = num(&col["efficiency"]);
        let e_hb = (k.powi(4) - 1.0) / (k.powi(4) * 4.0 * (k - 1.0));
        assert_rel(&format!("K = {k}: efficiency"), e, e_hb, 1e-9);
    }
    // The change column is relative to the first.
    let ch = num(&c["change_pct"][1]["forward"]);
    let expected =
        (handbook_pull(1000.0, 1.02, 4, 4) / handbook_pull(1000.0, 1.04, 4, 4) - 1.0) * 100.0;
    assert_rel("change of K1.02 against base, %", ch, expected, 1e-9);
}

#[test]
fn sweep_of_the_load_reproduces_the_handbook_formula_at_every_step() {
    // Wire-rope handbook reeving efficiency formula, DESIGN.md §1 (K = 1.04, N = S = 4):
    // the pull is proportional to the load at every step.
    let s = json_of(&[
        "sweep",
        &test_rig("tackle-rated.yaml"),
        "--vary",
        "parts.hook.load.force=0.5 kN..2 kN",
        "--steps",
        "4",
        "--json",
    ]);
    let steps = s["steps"].as_array().expect("steps");
    assert_eq!(steps.len(), 4);
    for (st, w) in steps.iter().zip([500.0, 1000.0, 1500.0, 2000.0]) {
        let expected = handbook_pull(w, 1.04, 4, 4);
        assert_rel(
            &format!("W = {w}: {st}"),
            num(&st["forward"]),
            expected,
            1e-9,
        );
        assert_rel(
            &format!("W = {w}: ideal W/4"),
            num(&st["ideal"]),
            w / 4.0,
            1e-9,
        );
    }
}

#[test]
fn sweep_over_a_bearing_mu_is_monotonic() {
    let s = json_of(&[
        "sweep",
        &test_rig("chain-plain.yaml"),
        "--vary",
        "parts.low.2.bearing.mu=0..0.4",
        "--steps",
        "9",
        "--json",
    ]);
    let f: Vec<f64> = s["steps"]
        .as_array()
        .unwrap()
        .iter()
        .map(|x| num(&x["forward"]))
        .collect();
    let b: Vec<f64> = s["steps"]
        .as_array()
        .unwrap()
        .iter()
        .map(|x| num(&x["back"]))
        .collect();
    assert_eq!((f.len(), b.len()), (9, 9), "one value per step");
    assert!(f.windows(2).all(|w| w[1] > w[0]), "forward {f:?}");
    assert!(b.windows(2).all(|w| w[1] < w[0]), "back {b:?}");
}

#[test]
fn a_stroke_of_a_tackle_keeps_the_velocity_ratio() {
    let dir = Scratch::new("stroke");
    let svg = dir.join("stroke.svg");
    let s = json_of(&[
        "sweep",
        &test_rig("tackle-rated.yaml"),
        "--stroke",
        "800 mm",
        "--steps",
        "4",
        "--plot",
        svg.to_str().unwrap(),
        "--json",
    ]);
    let steps = s["steps"].as_array().unwrap();
    assert_eq!(steps.len(), 5);
    for st in steps {
        assert!(st["error"].is_null(), "{st}");
        assert_rel(
            &format!("velocity ratio at {st}"),
            num(&st["velocity_ratio"]),
            4.0,
            1e-9,
        );
        // Hand calculation: the travel does not change vertical spans, so the pull stays
        // at the handbook value (DESIGN.md §1).
        assert_rel(
            &format!("forward at {st}"),
            num(&st["forward"]),
            handbook_pull(1000.0, 1.04, 4, 4),
            1e-9,
        );
    }
    assert_rel(
        "travel of the last step, m",
        num(&steps[4]["travel"]),
        0.8,
        1e-12,
    );
    let chart = std::fs::read_to_string(&svg).unwrap();
    assert!(chart.contains("travel of hand (mm)") && chart.contains("force (N)"));
    assert!(chart.contains("Largest span tension"));
}

#[test]
fn a_stroke_that_lifts_the_block_into_the_head_reports_where_it_fails() {
    // The hook starts 1000 mm below the upper sheaves and rises 1 mm per 4 mm of pull:
    // 4400 mm of pull would lift it 1100 mm, into the upper block. The stroke is then
    // incomplete: exit 1.
    let s = reeve(&[
        "sweep",
        &test_rig("tackle-rated.yaml"),
        "--stroke",
        "4400 mm",
        "--steps",
        "11",
        "--json",
    ])
    .expect_code(1)
    .json();
    let steps = s["steps"].as_array().unwrap();
    let last = steps.last().unwrap();
    assert!(last["error"].is_string(), "{last}");
    assert!(steps.len() < 12, "the stroke stops at the failure");
}

#[test]
fn golden_compare_and_sweep_tables() {
    let text = stdout_of(&["compare", &test_rig("tackle-rated.yaml"), "--variants"]);
    assert!(text.trim_end().ends_with("licensed person."));
    golden("compare-tackle-variants.txt", &text);
    // The 30 kg step cannot move (351.5 N needed, 300 N available): exit 1.
    let md = failing(&[
        "sweep",
        &test_rig("chain-plain.yaml"),
        "--vary",
        "parts.load.mass=10..30 kg",
        "--steps",
        "5",
        "--format",
        "md",
    ]);
    assert!(md.contains("| --- |") || md.contains("| --- | ---:"));
    golden("sweep-chain-mass.md", &md);
    let csv = failing(&[
        "sweep",
        &test_rig("chain-plain.yaml"),
        "--vary",
        "parts.load.mass=10..30 kg",
        "--steps",
        "5",
        "--format",
        "csv",
    ]);
    assert!(csv.starts_with("parts.load.mass (kg),ideal_N,forward_N,back_N,efficiency,error"));
    assert_eq!(csv.lines().count(), 6);
}

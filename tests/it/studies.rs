//! Design studies through the real binary: overrides and variants, compare, sweep and
//! stroke, upgrade ranking and sensitivities, Monte Carlo spread. Golden tables live in
//! `tests/golden/`; rewrite them with `REEVE_BLESS=1 cargo test --test it golden`.

use serde_json::Value;

use crate::support::generators::tackle;
use crate::support::golden::golden;
use crate::support::{
    assert_abs, assert_rel, example_rig, json_of, reeve, reeve_in, stdout_of, test_rig, Scratch,
    ONE_SHEAVE,
};

fn num(v: &Value) -> f64 {
    v.as_f64().unwrap_or_else(|| panic!("not a number: {v}"))
}

fn check_forward(file: &str, sets: &[&str]) -> f64 {
    let path = test_rig(file);
    let mut args = vec!["check", path.as_str(), "--json"];
    for s in sets {
        args.push("--set");
        args.push(s);
    }
    let out = reeve(&args);
    assert_ne!(out.code, 2, "{}", out.stderr);
    num(&out.json()["forward"]["value"])
}

/// Wire-rope handbook reeving efficiency formula, DESIGN.md §1:
/// E = (K^N − 1)/(K^S·N·(K − 1)), pull = W/(N·E).
fn handbook_pull(w: f64, k: f64, n: i32, s: i32) -> f64 {
    let e = (k.powi(n) - 1.0) / (k.powi(s) * n as f64 * (k - 1.0));
    w / (n as f64 * e)
}

// ------------------------------------------------------------------ overrides

#[test]
fn overrides_of_every_kind_of_key() {
    let base = check_forward("tackle-rated.yaml", &[]);
    // A plain number (a bearing factor).
    let k = check_forward("tackle-rated.yaml", &["parts.upper.d.bearing.factor=1.1"]);
    assert!(k > base, "{k} vs {base}");
    // A quantity with a unit, in another unit than the file's: 1000 N = 0.1 kN·10.
    let kn = check_forward("tackle-rated.yaml", &["parts.hook.load.force=1 kN"]);
    assert_rel("load set as 1 kN vs the file's 1000 N", kn, base, 1e-12);
    // A mapping (a whole bearing) and a list (a point).
    let none = check_forward("tackle-rated.yaml", &["parts.upper.d.bearing={kind: none}"]);
    assert!(none < base);
    let moved = check_forward("tackle-rated.yaml", &["parts.hand.at=[400, 0, 400]"]);
    assert_rel("hand moved along its vertical fall", moved, base, 1e-9);
    // A mass instead of a force removes the force (exclusive pair): hand calculation,
    // 102 kg × 9.80665 m/s² = 1000.28 N, so the pull scales by 1.00028.
    let mass = check_forward("tackle-rated.yaml", &["parts.hook.load.mass=102 kg"]);
    assert_rel(
        "102 kg instead of 1000 N",
        mass,
        base * 102.0 * 9.80665 / 1000.0,
        1e-9,
    );
    // A rope key and `~` removing an optional key.
    let rope = check_forward("tackle-rated.yaml", &["ropes.r10.mu=0.3"]);
    assert_rel("rope mu where every sheave is rated", rope, base, 1e-12);
    let sheave_mu = check_forward("chain-plain.yaml", &["parts.top.1.bearing.mu_static=~"]);
    assert_rel(
        "mu_static removed",
        sheave_mu,
        check_forward("chain-plain.yaml", &[]),
        1e-12,
    );
}

#[test]
fn unknown_override_keys_are_errors_with_a_suggestion() {
    let path = test_rig("tackle-rated.yaml");
    for cmd in ["check", "rank", "spread"] {
        let out = reeve(&[cmd, &path, "--set", "parts.hnd.force=100 N"]);
        assert_eq!(out.code, 2, "{cmd}");
        let err = &out.stderr;
        assert!(err.contains("did you mean `hand`"), "{cmd}: {err}");
    }
    let out = reeve(&[
        "sweep",
        &path,
        "--set",
        "parts.upper.d.bearing.facor=1.1",
        "--vary",
        "parts.hook.load.force=900..1000",
    ]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("factor"));
    let out = reeve(&["compare", &path, "--set", "ropes.r11.mu=0.1"]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("did you mean `r10`"));
}

#[test]
fn a_variant_equals_the_same_set_list() {
    let path = test_rig("tackle-rated.yaml");
    let c = json_of(&["compare", &path, "--variants", "--json"]);
    let cols = c["columns"].as_array().expect("columns");
    assert_eq!(cols.len(), 5);
    let by = |label: &str| {
        cols.iter()
            .find(|c| c["label"] == label)
            .unwrap_or_else(|| panic!("column {label}"))
    };
    let sets_102: Vec<String> = ["upper.b", "upper.d", "lower.a", "lower.c"]
        .iter()
        .map(|p| format!("parts.{p}.bearing.factor=1.02"))
        .collect();
    let refs: Vec<&str> = sets_102.iter().map(String::as_str).collect();
    assert_eq!(
        num(&by("K1.02")["forward"]),
        check_forward("tackle-rated.yaml", &refs)
    );
    assert_eq!(
        num(&by("heavy")["forward"]),
        check_forward("tackle-rated.yaml", &["parts.hook.load={mass: 150 kg}"])
    );
    assert_eq!(
        num(&by("base")["forward"]),
        check_forward("tackle-rated.yaml", &[])
    );
}

#[test]
fn an_override_without_a_key_names_itself() {
    // `--set =VALUE` (an empty key, from the settings fuzz target) is refused with a
    // message that quotes the override, since it has no key or line to point at.
    let path = test_rig("tackle-rated.yaml");
    for cmd in ["check", "rank"] {
        let out = reeve(&[cmd, &path, "--set", "=[0, 0, -1]"]);
        assert_eq!(out.code, 2, "{cmd}: {}", out.stdout);
        assert!(
            out.stderr.contains("expected a key path") && out.stderr.contains("`=[0, 0, -1]`"),
            "{cmd}: {}",
            out.stderr
        );
    }
}

#[test]
fn set_on_variants_changes_the_variants_compared() {
    // `--set` on the `variants:` key itself is applied like any other override, not
    // silently ignored: removing them leaves nothing to compare, changing one changes
    // its column.
    let path = test_rig("tackle-rated.yaml");
    let out = reeve(&["compare", &path, "--variants", "--set", "variants=~"]);
    assert_eq!(out.code, 2, "{}", out.stdout);
    assert!(out.stderr.contains("no `variants:`"), "{}", out.stderr);
    let c = json_of(&[
        "compare",
        &path,
        "--variants",
        "--json",
        "--set",
        "variants.heavy=[\"parts.hook.load={mass: 200 kg}\"]",
    ]);
    let heavy = c["columns"]
        .as_array()
        .expect("columns")
        .iter()
        .find(|c| c["label"] == "heavy")
        .expect("column heavy");
    assert_eq!(
        num(&heavy["forward"]),
        check_forward("tackle-rated.yaml", &["parts.hook.load={mass: 200 kg}"])
    );
}

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

// --------------------------------------------------------------------- spread

#[test]
fn zero_width_ranges_reproduce_the_deterministic_values() {
    let sets = [
        "--set",
        "ropes.braid6.mu={min: 0.2, max: 0.2}",
        "--set",
        "parts.hook.load.mass={mean: 40, sd: 0}",
        "--set",
        "parts.hook.a.bearing.mu={min: 0.12, max: 0.12}",
    ];
    let path = test_rig("spread-hoist.yaml");
    let mut args = vec!["spread", path.as_str(), "--samples", "20", "--json"];
    args.extend_from_slice(&sets);
    let s = json_of(&args);
    let f = check_forward(
        "spread-hoist.yaml",
        &[
            "ropes.braid6.mu=0.2",
            "parts.hook.load.mass=40",
            "parts.hook.a.bearing.mu=0.12",
        ],
    );
    for p in ["p5", "p50", "p95"] {
        assert_eq!(num(&s["forward"][p]), f, "{p}");
    }
    assert_eq!(num(&s["nominal_forward"]), f);
    assert_eq!(s["inputs"].as_array().unwrap().len(), 3);
}

#[test]
fn deterministic_commands_use_the_middle_of_a_range() {
    // Uniform 0.15..0.25 → 0.2; uniform 0.10..0.14 → 0.12; normal mean 40.
    let a = check_forward("spread-hoist.yaml", &[]);
    let b = check_forward(
        "spread-hoist.yaml",
        &[
            "ropes.braid6.mu=0.2",
            "parts.hook.load.mass=40",
            "parts.hook.a.bearing.mu=0.12",
        ],
    );
    assert_rel("middle of the ranges vs the values set", a, b, 1e-12);
}

#[test]
fn median_of_a_narrow_symmetric_range_is_the_deterministic_value() {
    let path = test_rig("spread-hoist.yaml");
    let s = json_of(&[
        "spread",
        &path,
        "--samples",
        "400",
        "--seed",
        "11",
        "--json",
        "--set",
        "parts.hook.load.mass=40",
        "--set",
        "ropes.braid6.mu=0.2",
        "--set",
        "parts.hook.a.bearing.mu={min: 0.11, max: 0.13}",
    ]);
    let f = num(&s["nominal_forward"]);
    let p50 = num(&s["forward"]["p50"]);
    let (p5, p95) = (num(&s["forward"]["p5"]), num(&s["forward"]["p95"]));
    // The forward value is nearly linear in mu over this range, so its median sits at
    // the nominal value; sampling error of a median of 400 draws is about
    // 1.25·sigma/sqrt(400) with sigma ≈ (p95 − p5)/3.3 (uniform): well under 10 % of the
    // P5–P95 width.
    assert!(
        (p50 - f).abs() < 0.1 * (p95 - p5),
        "{p50} vs {f} ({p5}..{p95})"
    );
    assert!(p5 < f && f < p95);
}

#[test]
fn same_seed_same_numbers_and_threads_do_not_matter() {
    let path = test_rig("spread-hoist.yaml");
    let a = stdout_of(&["spread", &path, "--samples", "60", "--seed", "5"]);
    let b = stdout_of(&[
        "spread",
        &path,
        "--samples",
        "60",
        "--seed",
        "5",
        "--threads",
        "1",
    ]);
    let c = stdout_of(&[
        "spread",
        &path,
        "--samples",
        "60",
        "--seed",
        "5",
        "--threads",
        "2",
    ]);
    assert_eq!(a, b);
    assert_eq!(b, c);
    assert!(a.trim_end().ends_with("licensed person."));
    let d = stdout_of(&["spread", &path, "--samples", "60", "--seed", "6"]);
    assert_ne!(a, d);
}

#[test]
fn share_not_moving_is_zero_or_one_when_the_range_sits_on_one_side() {
    let path = test_rig("spread-hoist.yaml");
    // The share of samples that do not move, with the hand's available force set.
    let share_at = |force: &str, samples: &str| {
        let set = format!("parts.hand.force={force}");
        let args = [
            "spread",
            &path,
            "--samples",
            samples,
            "--json",
            "--set",
            &set,
        ];
        let out = reeve(&args);
        // Samples that cannot move fail the check: exit 1 (0 when all move).
        assert_ne!(out.code, 2, "{args:?}");
        let out = out.json();
        num(&out["share_not_moving"])
    };
    assert_eq!(share_at("400 N", "50"), 0.0);
    assert_eq!(share_at("100 N", "50"), 1.0);
    // In between, some samples move and some do not.
    let share = share_at("207 N", "200");
    assert!(share > 0.0 && share < 1.0, "{share}");
}

#[test]
fn malformed_ranges_and_variants_are_reported() {
    let path = test_rig("spread-hoist.yaml");
    let out = reeve(&[
        "check",
        &path,
        "--set",
        "ropes.braid6.mu={min: 0.3, max: 0.2}",
    ]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("larger than `max`"));
    let out = reeve(&[
        "check",
        &path,
        "--set",
        "ropes.braid6.mu={min: 0.3, mx: 0.2}",
    ]);
    assert_eq!(out.code, 2);
    let out = reeve(&["compare", &path, "--variants"]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("no `variants:`"));
}

#[test]
fn compare_of_tackles_over_the_number_of_parts_reproduces_the_handbook_formula() {
    // Wire-rope handbook reeving efficiency (DESIGN.md §1): pull = W/(N·E),
    // E = (K^N − 1)/(K^S·N·(K − 1)). One column per tackle of 1 to 8 sheaves (the shared
    // generator: even counts haul from the fixed block, S = N; odd counts from the moving
    // block, N = sheaves + 1, S = sheaves), compared in one `reeve compare` run.
    let dir = Scratch::new("compare-n");
    let files: Vec<String> = (1..=8)
        .map(|sheaves| {
            dir.write(&format!("tackle-{sheaves}.yaml"), &tackle(sheaves))
                .display()
                .to_string()
        })
        .collect();
    let mut args = vec!["compare"];
    args.extend(files.iter().map(String::as_str));
    args.push("--json");
    let out = json_of(&args);
    let columns = out["columns"].as_array().unwrap();
    assert_eq!(columns.len(), 8);
    for (i, column) in columns.iter().enumerate() {
        let sheaves = i + 1;
        let (n, s) = if sheaves % 2 == 0 {
            (sheaves, sheaves)
        } else {
            (sheaves + 1, sheaves)
        };
        let expected = handbook_pull(500.0 * 9.80665, 1.04, n as i32, s as i32);
        let forward = num(&column["forward"]);
        assert_rel(
            &format!("{sheaves} sheaves ({n} parts) vs handbook"),
            forward,
            expected,
            1e-9,
        );
    }
}

#[test]
fn a_drum_driven_stroke_moves_the_load_until_it_reaches_the_sheave() {
    // rigs/ramp-winch.yaml: the cord from the cart to the lead sheave is 2.972 m long and
    // runs along the ramp, so the drum (pitch radius 53 mm) closes it up after about
    // 2.972 / 0.053 rad ≈ 3213° (hand calculation). 3000° must stop short; 3400° must be
    // reported as the cart meeting the sheave, not silently carried through it.
    let short = json_of(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "3000 deg",
        "--steps",
        "3",
        "--json",
    ]);
    let steps = short["steps"].as_array().unwrap();
    assert_eq!(steps.len(), 4, "both ends and two steps between: {short}");
    assert!(steps.iter().all(|s| s["error"].is_null()), "{short}");
    let long = reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "3400 deg",
        "--steps",
        "4",
    ]);
    let text = &long.stdout;
    assert!(text.contains("closes up: `cart` and `lead` meet"), "{text}");
}

#[test]
fn rank_falls_back_to_the_frictionless_saving_where_the_alternative_does_not_apply() {
    // rigs/rescue-haul.yaml has only rated pulleys and a carabiner, so `--to rolling`
    // applies to none of them; the ranking must still be by effort saved, largest first.
    let out = json_of(&["rank", "rigs/rescue-haul.yaml", "--to", "rolling", "--json"]);
    let saved: Vec<f64> = out["parts"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| num(&p["frictionless_saved"]))
        .collect();
    assert_eq!(
        saved.len(),
        4,
        "three rated pulleys and a carabiner: {saved:?}"
    );
    assert!(saved.windows(2).all(|w| w[0] >= w[1]), "{saved:?}");
    assert_eq!(out["parts"][0]["part"], "leg.biner");
}

#[test]
fn a_zero_stroke_is_refused() {
    let out = reeve(&["sweep", "rigs/workshop-hoist.yaml", "--stroke", "0"]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("other than zero"));
}

#[test]
fn rank_calls_a_worse_alternative_worse_instead_of_a_negative_saving() {
    // Guards: a `--to` bearing worse than the current one is reported as worse, never
    // as a negative saving, and it ranks below every real saving.
    let worse = "{kind: plain, pin_diameter: 10, mu: 0.3}";
    let r = json_of(&[
        "rank",
        &test_rig("chain-plain.yaml"),
        "--to",
        worse,
        "--json",
    ]);
    assert_eq!(
        r["parts"].as_array().unwrap().len(),
        3,
        "the chain's sheaves"
    );
    for p in r["parts"].as_array().unwrap() {
        assert!(p["alternative_saved"].is_null(), "{p}");
        let name = p["part"].as_str().unwrap();
        let set = format!("parts.{name}.bearing={worse}");
        // Hand check: the extra effort is the worse rig's forward value minus the rig's.
        let extra = check_forward("chain-plain.yaml", &[&set]) - num(&r["forward"]);
        assert!(extra > 0.0);
        assert_rel(
            &format!("worse by, {p}"),
            num(&p["alternative_worse_by"]),
            extra,
            1e-9,
        );
    }
    let text = stdout_of(&["rank", &test_rig("chain-plain.yaml"), "--to", worse]);
    assert!(text.contains("worse by 13.43 N"), "{text}");
    assert!(!text.contains(" -1"), "{text}");
}

#[test]
fn rank_shows_round_off_savings_as_zero() {
    // Guards: a part that is already frictionless saves exactly zero (no "-0", no tiny
    // negative from round-off).
    let path = "tests/rigs/review/frictionless.yaml";
    let out = stdout_of(&["rank", path, "--to", "rolling", "--json"]);
    assert!(!out.contains("-0.0") && !out.contains("e-1"), "{out}");
    let r: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(r["parts"].as_array().unwrap().len(), 3, "{out}");
    for p in r["parts"].as_array().unwrap() {
        assert_eq!(num(&p["frictionless_saved"]), 0.0, "{p}");
        assert!(p["frictionless_worse_by"].is_null(), "{p}");
    }
}

#[test]
fn rank_to_takes_units_in_the_bearing() {
    // Guards: `--to` reads bare numbers in the rig's units and accepts written units.
    let bare = json_of(&[
        "rank",
        &test_rig("chain-plain.yaml"),
        "--to",
        "{kind: plain, pin_diameter: 8, mu: 0.08}",
        "--json",
    ]);
    let inches = json_of(&[
        "rank",
        &test_rig("chain-plain.yaml"),
        "--to",
        "{kind: plain, pin_diameter: 0.31496063 in, mu: 0.08}",
        "--json",
    ]);
    let a = num(&bare["parts"][0]["alternative"]);
    let b = num(&inches["parts"][0]["alternative"]);
    assert_rel("pin in inches vs in mm", a, b, 1e-7);
}

/// Guards `rank --to` units: a bare number in the bearing text is in the rig's length
/// unit (a bare `8` on a metre rig is an 8 m pin, refused as not fitting, with a hint),
/// and a unit may be written (`8 mm`) with the same result as the bare number on a
/// millimetre rig.
#[test]
fn rank_to_reads_bare_numbers_in_the_rigs_units_and_accepts_units() {
    let dir = Scratch::new("rank-to-units");
    dir.write("rig.yaml", ONE_SHEAVE);
    let metres = ONE_SHEAVE
        .replace("length: mm", "length: m")
        .replace("diameter: 6,", "diameter: 0.006,")
        .replace("[0, 0, 2000]", "[0, 0, 2]")
        .replace("diameter: 50,", "diameter: 0.05,")
        .replace("pin_diameter: 8,", "pin_diameter: 0.008,")
        .replace("[-25, 0, 1000]", "[-0.025, 0, 1]")
        .replace("[25, 0, 1000]", "[0.025, 0, 1]");
    std::fs::write(dir.join("metres.yaml"), metres).unwrap();
    let rank = |file: &str, to: &str| {
        let out = reeve_in(&dir, &["rank", file, "--to", to, "--format", "json"]);
        (out.code, out.stdout, out.stderr)
    };
    let (code, bare_mm, err) = rank("rig.yaml", "{kind: plain, pin_diameter: 8, mu: 0.08}");
    assert_eq!(code, 0, "{err}");
    let (code, with_unit, err) = rank("rig.yaml", "{kind: plain, pin_diameter: 8 mm, mu: 0.08}");
    assert_eq!(code, 0, "{err}");
    let alternative = |json: &str| {
        let v: serde_json::Value = serde_json::from_str(json).unwrap();
        v["parts"][0]["alternative"].as_f64().unwrap()
    };
    assert_eq!(alternative(&bare_mm), alternative(&with_unit));
    let (code, _, err) = rank("metres.yaml", "{kind: plain, pin_diameter: 8, mu: 0.08}");
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains("--to") && err.contains("8 m") && err.contains("bare numbers"),
        "{err}"
    );
    let (code, with_unit_m, err) =
        rank("metres.yaml", "{kind: plain, pin_diameter: 8 mm, mu: 0.08}");
    assert_eq!(code, 0, "{err}");
    let ratio = alternative(&with_unit_m) / alternative(&with_unit);
    assert_abs(
        "8 mm pin on a metre rig over the same on a mm rig",
        ratio,
        1.0,
        1e-9,
    );
}

#[test]
fn rank_sensitivities_measure_effort_saved_like_the_ranking_and_name_the_written_key() {
    // Guards: the sensitivity list measures what the ranking measures (effort saved, in
    // the asked unit), orders the same way, and names the key the file wrote
    // (`efficiency`, not `factor`).
    let rated = "parts.low.2.bearing={kind: rated, efficiency: 0.99}";
    let path = test_rig("chain-plain.yaml");
    let r = json_of(&["rank", &path, "--set", rated, "--json"]);
    let order: Vec<&str> = r["parts"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["part"].as_str().unwrap())
        .collect();
    assert_eq!(order.last(), Some(&"low.2"), "{order:?}");
    let sens = r["sensitivities"].as_array().unwrap();
    let keys: Vec<&str> = sens.iter().map(|s| s["key"].as_str().unwrap()).collect();
    assert!(keys.contains(&"parts.low.2.bearing.efficiency"), "{keys:?}");
    assert!(!keys.iter().any(|k| k.ends_with(".factor")), "{keys:?}");
    let at = |k: &str| keys.iter().position(|x| *x == k).unwrap();
    let low = at("parts.low.2.bearing.efficiency");
    assert!(at("parts.top.1.bearing.mu") < low && at("parts.top.3.bearing.mu") < low);
    assert_eq!(keys.last(), Some(&"ropes.cord6.mu"), "no effect: last");
    let f0 = num(&r["forward"]);
    // Hand check for the plain bearing: 10 % less friction is mu 0.135.
    let top = &sens[at("parts.top.1.bearing.mu")];
    assert_eq!(num(&top["value"]), 0.15);
    let f = check_forward("chain-plain.yaml", &[rated, "parts.top.1.bearing.mu=0.135"]);
    assert_rel(
        &format!("saved, {top}"),
        num(&top["saved_with_10pct_less_friction"]),
        f0 - f,
        1e-9,
    );
    // ... and for the rated one: K = 1/0.99, loss K − 1 cut by 10 %, η = 1/(1 + 0.9(K − 1)).
    let k = 1.0 / 0.99;
    let eta = 1.0 / (1.0 + 0.9 * (k - 1.0));
    let low2 = &sens[low];
    assert_eq!(num(&low2["value"]), 0.99);
    let set = format!("parts.low.2.bearing.efficiency={eta}");
    let f = check_forward("chain-plain.yaml", &[rated, &set]);
    assert_rel(
        &format!("saved, {low2}"),
        num(&low2["saved_with_10pct_less_friction"]),
        f0 - f,
        1e-9,
    );
    // The text lists the same measure, in the rig's unit, under the file's own key.
    let text = stdout_of(&["rank", &path, "--set", rated]);
    assert!(text.contains("parts.low.2.bearing.efficiency"), "{text}");
    assert!(text.contains("10 % less friction"), "{text}");
}

// ------------------------------------------------- studies fail like `check`

/// Runs a study that must fail a check: exit 1, stdout as text.
fn failing(args: &[&str]) -> String {
    reeve(args).expect_code(1).stdout
}

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

// ------------------------------------------ bounded work and located errors

#[test]
fn spread_with_an_absurd_sample_count_is_refused() {
    // Guards against unbounded work: a sample count near u64::MAX is refused, exit 2,
    // naming `--samples`, instead of aborting.
    let dir = Scratch::new("samples");
    dir.write("rig.yaml", ONE_SHEAVE);
    let out = reeve_in(
        &dir,
        &["spread", "rig.yaml", "--samples", "18446744073709551615"],
    );
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("--samples"), "{}", out.stderr);
}

#[test]
fn sweep_with_an_absurd_step_count_is_refused() {
    // Guards against unbounded work: 1e11 steps are refused, exit 2, naming `--steps`, for
    // a sweep of a key and for a stroke.
    let dir = Scratch::new("steps-huge");
    dir.write("rig.yaml", ONE_SHEAVE);
    for mode in [
        ["--vary", "parts.s.bearing.mu=0.05..0.2"],
        ["--stroke", "100"],
    ] {
        let out = reeve_in(
            &dir,
            &[
                "sweep",
                "rig.yaml",
                mode[0],
                mode[1],
                "--steps",
                "100000000000",
            ],
        );
        assert_eq!(out.code, 2, "{mode:?}: {}", out.stderr);
        assert!(out.stderr.contains("--steps"), "{}", out.stderr);
    }
}

#[test]
fn sweep_with_zero_steps_is_refused() {
    // Guards against an empty sweep: `--steps 0` is refused, exit 2, for a sweep of a key
    // and for a stroke.
    let dir = Scratch::new("steps-zero");
    dir.write("rig.yaml", ONE_SHEAVE);
    for mode in [
        ["--vary", "parts.s.bearing.mu=0.05..0.2"],
        ["--stroke", "100"],
    ] {
        let out = reeve_in(
            &dir,
            &["sweep", "rig.yaml", mode[0], mode[1], "--steps", "0"],
        );
        assert_eq!(out.code, 2, "{mode:?}: {}", out.stderr);
        assert!(out.stderr.contains("--steps"), "{}", out.stderr);
    }
}

#[test]
fn sweep_of_a_key_that_never_solves_is_bad_input() {
    // Guards the exit code of a sweep whose steps can never solve (a part that does not
    // exist, a value in the wrong unit): bad input, exit 2, naming the file, no table; a
    // range that solves in part still sweeps.
    let dir = Scratch::new("vary-bad");
    dir.write("rig.yaml", ONE_SHEAVE);
    // A part that does not exist, and a value with the wrong unit: no step can solve.
    for vary in ["parts.nope.mu=1..2", "parts.s.diameter=10kg..20kg"] {
        let out = reeve_in(&dir, &["sweep", "rig.yaml", "--vary", vary, "--steps", "3"]);
        assert_eq!(out.code, 2, "{vary}: {}", out.stderr);
        assert!(out.stderr.contains("rig.yaml"), "{}", out.stderr);
        assert!(out.stdout.is_empty(), "{vary}: a table was printed");
    }
    // A range that is valid only in part still sweeps, showing where it fails; the
    // study is incomplete, so it exits 1 (some runs fail), not 2 (it could not run).
    let out = reeve_in(
        &dir,
        &[
            "sweep",
            "rig.yaml",
            "--vary",
            "parts.s.bearing.mu=-0.1..0.2",
            "--steps",
            "3",
        ],
    );
    assert_eq!(out.code, 1, "{}", out.stderr);
    assert!(out.stdout.contains("could not be solved"), "{}", out.stdout);
}

#[test]
fn studies_locate_solve_errors_like_check() {
    // Guards located solve errors in the studies: rank, spread, compare and sweep name the
    // file, line and column of the part, as check does.
    let dir = Scratch::new("study-locate");
    // A line tied at both ends: it loads, but the solver finds that nothing can move.
    let rig = "format: 1\nropes:\n  r: {diameter: 6, mu: 0.2}\nparts:\n  a: {kind: anchor, at: [0, 0, 2000]}\n  h: {kind: haul, at: [0, 0, 0]}\nlines:\n  l: {rope: r, path: [a, h]}\n";
    std::fs::write(dir.join("rig.yaml"), rig).unwrap();
    let check = reeve_in(&dir, &["check", "rig.yaml"]);
    assert_eq!(check.code, 2);
    assert!(
        check.stderr.contains("rig.yaml:6:3: parts.h:"),
        "{}",
        check.stderr
    );
    for args in [
        &["rank", "rig.yaml"][..],
        &["spread", "rig.yaml", "--samples", "3"],
        &["compare", "rig.yaml"],
        &["sweep", "rig.yaml", "--stroke", "10"],
    ] {
        let out = reeve_in(&dir, args);
        assert_eq!(out.code, 2, "{args:?}");
        assert!(
            out.stderr.contains("rig.yaml:6:3: parts.h:"),
            "{args:?}: {}",
            out.stderr
        );
    }
}

/// Guards the spread's model path: every ranged key of the example rig is a model
/// parameter, and for many samples the rig with its draws set on the model is the rig
/// the file path loads with the same draws as overrides (compared whole).
#[test]
fn spread_samples_on_the_model_are_the_rigs_the_file_gives() {
    use reeve::rig::RigText;
    use reeve::study::spread::{draws_of, keys_of, settings_of};
    use reeve::study::RigSource;
    let path = test_rig("spread-hoist.yaml");
    let file = RigText::read(std::path::Path::new(&path)).unwrap();
    let source = RigSource::new(file, &[]);
    let ranges = source.ranges().unwrap();
    let rig = source.load(&[]).unwrap();
    let sampler = source
        .sampler(&rig, &keys_of(&ranges), &draws_of(&ranges, 3, 0))
        .expect("every ranged key of spread-hoist.yaml is a model parameter");
    for i in 0..50 {
        let fast = sampler.rig(&draws_of(&ranges, 3, i)).unwrap();
        let slow = source.load(&settings_of(&ranges, 3, i)).unwrap();
        assert_eq!(format!("{fast:?}"), format!("{slow:?}"), "sample {i}");
    }
    // A draw the loader refuses (a negative coefficient) is refused on the model too.
    let mut bad = draws_of(&ranges, 3, 0);
    bad.iter_mut().for_each(|v| *v = -1.0);
    assert!(sampler.rig(&bad).is_none());
}

/// Guards: a stroke far longer than the rig never jumps over a span that closes up. The
/// sash's span to its pulley closes after about 650 mm of travel; with a 1 km stroke the
/// midpoint of the first sub-step already lies past the pulley, whose reversed velocity
/// carried the sash back below it, so every row read "ok" at the drawn figures.
#[test]
fn a_huge_stroke_stops_where_a_span_closes_up() {
    let sash = crate::support::example_rig("sash-window");
    for distance in ["1e6 mm", "1e9 mm"] {
        // A stroke that stops short is incomplete: exit 1.
        let s = reeve(&["sweep", &sash, "--stroke", distance, "--json"])
            .expect_code(1)
            .json();
        let steps = s["steps"].as_array().unwrap();
        let stopped = steps.iter().find(|st| !st["error"].is_null());
        let Some(stopped) = stopped else {
            panic!("{distance}: no step stops, all rows are figures:\n{s}");
        };
        assert!(
            stopped["error"].as_str().unwrap().contains("closes up"),
            "{distance}: {stopped}"
        );
        assert!(
            steps.len() <= 2,
            "{distance}: figures past the closed span: {s}"
        );
    }
}

/// Guards the sweeps' exit code: a sweep or stroke where some steps cannot be solved
/// (a value the loader refuses, a stroke past where a span closes up) exited 0 like a
/// clean study, while a slack span exits 1. Such a study is incomplete: exit 1 (some
/// runs fail; 2 stays for a study that cannot run at all), with a note saying how many.
#[test]
fn a_sweep_with_unsolved_steps_exits_1_and_says_how_many() {
    let vary = reeve(&[
        "sweep",
        "rigs/workshop-hoist.yaml",
        "--vary",
        "parts.hook.load.mass=-400..800 kg",
        "--steps",
        "3",
    ]);
    assert_eq!(vary.code, 1, "{}\n{}", vary.stdout, vary.stderr);
    assert!(
        vary.stdout.contains("1 of 3 steps could not be solved"),
        "{}",
        vary.stdout
    );
    let stroke = reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "3400 deg",
        "--steps",
        "4",
    ]);
    assert_eq!(stroke.code, 1, "{}\n{}", stroke.stdout, stroke.stderr);
    assert!(
        stroke.stdout.contains("1 of 5 steps could not be solved"),
        "{}",
        stroke.stdout
    );
    // Every step solved and passing: still 0.
    let clean = reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "3000 deg",
        "--steps",
        "3",
    ]);
    assert_eq!(clean.code, 0, "{}\n{}", clean.stdout, clean.stderr);
    assert!(
        !clean.stdout.contains("could not be solved"),
        "{}",
        clean.stdout
    );
}

/// Guards the rope's bend loss among the sensitivities: `rank` listed every friction
/// coefficient but the rope's `bend_loss`, so on a rig whose losses are nearly all
/// bending (the gallery panel: 98.7 % of them) nothing in it pointed at the rope.
#[test]
fn rank_lists_a_ropes_bend_loss_with_the_friction_sensitivities() {
    let path = example_rig("gallery-panel");
    let r = json_of(&["rank", &path, "--json"]);
    let sens = r["sensitivities"].as_array().unwrap();
    let bend = sens
        .iter()
        .find(|s| s["key"] == "ropes.wire4.bend_loss")
        .unwrap_or_else(|| panic!("no bend-loss row: {sens:?}"));
    assert_eq!(num(&bend["value"]), 0.02);
    // It costs the most here: first in the list.
    assert_eq!(sens[0]["key"], "ropes.wire4.bend_loss", "{sens:?}");
    // 10 % less bend loss is 0.018. By hand (DESIGN.md §7, `T_slack = (1 − β)·T_b`): the
    // two sheaves' rolling bearings keep a ratio k whatever the load, so each passage
    // multiplies the tension by k/(1 − β) and the haul's force goes as 1/(1 − β)²:
    // saved = F·(1 − (0.98/0.982)²).
    let f0 = num(&r["forward"]);
    let saved = num(&bend["saved_with_10pct_less_friction"]);
    assert_rel(
        "saved, by hand",
        saved,
        f0 * (1.0 - (0.98_f64 / 0.982).powi(2)),
        1e-9,
    );
    let out = reeve(&[
        "check",
        &path,
        "--json",
        "--set",
        "ropes.wire4.bend_loss=0.018",
    ]);
    assert_rel(
        "saved, against check",
        saved,
        f0 - num(&out.json()["forward"]["value"]),
        1e-9,
    );
    // d F/dβ = 2·F/(1 − β).
    assert_rel(
        "derivative",
        num(&bend["derivative"]),
        2.0 * f0 / 0.98,
        1e-6,
    );
    // The text names it and says what its 10 % is.
    let text = stdout_of(&["rank", &path]);
    assert!(
        text.contains("ropes.wire4.bend_loss") && text.contains("bend loss β times 0.9"),
        "{text}"
    );
    // A rope without a bend loss has no such row (a 10 % cut of nothing saves nothing).
    let r = json_of(&["rank", &example_rig("workshop-hoist"), "--json"]);
    assert!(
        r["sensitivities"]
            .as_array()
            .unwrap()
            .iter()
            .all(|s| !s["key"].as_str().unwrap().ends_with(".bend_loss")),
        "{r}"
    );
}

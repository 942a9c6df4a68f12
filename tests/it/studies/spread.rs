//! Monte Carlo spread.

use super::*;

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

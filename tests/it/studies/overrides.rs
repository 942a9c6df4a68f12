//! Overrides (`--set`) and variants.

use super::*;

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

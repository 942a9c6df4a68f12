//! Errors of `--set` overrides, named by the file's own keys.

use super::*;

#[test]
fn overrides_apply_by_the_files_own_keys() {
    use reeve::model::{Bearing, BlockLoad, PartKind};
    let rig = load_str_with(
        EXAMPLE,
        "rig.yaml",
        &set(&[
            ("parts.head.bearing.mu", "0.08"),
            ("parts.hook.load.mass", "60 kg"),
            ("ropes.braid6.mu", "0.1"),
            ("limits.fleet_angle", "2"),
            ("parts.hook.a.diameter", "80"),
            ("parts.hand.force", "300 N"),
            ("gravity.2", "-2"),
        ]),
    )
    .unwrap();
    let PartKind::Sheave(head) = &rig.parts[PartId::new(1)].kind else {
        panic!()
    };
    assert!(matches!(head.bearing, Bearing::Plain { mu, .. } if mu == 0.08));
    let PartKind::Block(hook) = &rig.parts[PartId::new(2)].kind else {
        panic!()
    };
    assert_eq!(hook.load, BlockLoad::Mass(Some(60.0)));
    assert_eq!(rig.ropes[RopeId::new(0)].mu, 0.1);
    assert_abs(
        "fleet angle limit, rad",
        rig.limits.fleet_angle,
        2f64.to_radians(),
        1e-15,
    );
    let PartKind::Sheave(a) = &rig.parts[PartId::new(3)].kind else {
        panic!()
    };
    assert_abs("hook.a tread, m", a.tread_diameter, 0.08, 1e-15);
    let PartKind::Haul(h) = &rig.parts[PartId::new(4)].kind else {
        panic!()
    };
    assert_eq!(h.force, Some(300.0));
    // Setting a force load replaces the mass.
    let rig = load_str_with(
        EXAMPLE,
        "rig.yaml",
        &set(&[("parts.hook.load.force", "0.5 kN")]),
    )
    .unwrap();
    let PartKind::Block(hook) = &rig.parts[PartId::new(2)].kind else {
        panic!()
    };
    assert_eq!(
        (hook.load, hook.load.is_force()),
        (BlockLoad::Force(Some(500.0)), true)
    );
}

#[test]
fn override_errors_name_the_closest_key() {
    let e = load_str_with(
        EXAMPLE,
        "rig.yaml",
        &set(&[("parts.head.bearing.mux", "0.1")]),
    )
    .unwrap_err();
    let shown = e.to_string();
    assert!(
        shown.contains("parts.head.bearing.mux") && shown.contains("did you mean `mu`?"),
        "{shown}"
    );
    assert!(
        shown.contains("override `parts.head.bearing.mux=0.1`"),
        "{shown}"
    );
    let e = load_str_with(EXAMPLE, "rig.yaml", &set(&[("parts.hed.diameter", "50")])).unwrap_err();
    assert!(
        e.to_string().contains("no part named `hed`")
            && e.to_string().contains("did you mean `head`?"),
        "{e}"
    );
    let e = load_str_with(EXAMPLE, "rig.yaml", &set(&[("limit.fleet_angle", "2")])).unwrap_err();
    assert!(e.to_string().contains("did you mean `limits`?"), "{e}");
    let e = load_str_with(
        EXAMPLE,
        "rig.yaml",
        &set(&[("parts.head.bearing.mu", "-1")]),
    )
    .unwrap_err();
    assert!(
        e.to_string().contains("0 or more") && e.to_string().contains("override"),
        "{e}"
    );
    let e = load_str_with(EXAMPLE, "rig.yaml", &set(&[("gravity.3", "1")])).unwrap_err();
    assert!(e.to_string().contains("list of 3"), "{e}");
    let e =
        load_str_with(EXAMPLE, "rig.yaml", &set(&[("parts.head.diameter.x", "1")])).unwrap_err();
    assert!(e.to_string().contains("single value"), "{e}");
}

#[test]
fn overrides_may_add_a_missing_key_and_remove_an_optional_one() {
    use reeve::model::PartKind;
    let rig = load_str_with(
        EXAMPLE,
        "rig.yaml",
        &set(&[
            ("parts.head.mass", "2 kg"),
            ("ropes.braid6.breaking_strength", "~"),
        ]),
    )
    .unwrap();
    let PartKind::Sheave(head) = &rig.parts[PartId::new(1)].kind else {
        panic!()
    };
    assert_eq!(head.mass, Some(2.0));
    assert_eq!(rig.ropes[RopeId::new(0)].breaking_strength, None);
}

/// Guards the override note on removals: a required key removed by `--set KEY=~` (or a
/// whole section) was reported as missing at its line in the file, with no word that an
/// override removed it, so the user looked for a fault in a file that has none.
#[test]
fn a_required_key_removed_by_an_override_names_the_override() {
    for (key, subject) in [
        ("parts.head.bearing.mu", "parts.head.bearing.mu"),
        ("parts.head.bearing", "parts.head.bearing"),
        ("parts", "parts"),
        ("lines.fall.path", "lines.fall.path"),
    ] {
        let e = load_str_with(EXAMPLE, "rig.yaml", &set(&[(key, "~")])).unwrap_err();
        let p = e
            .problems
            .iter()
            .find(|p| p.subject == subject)
            .unwrap_or_else(|| panic!("`{key}=~`: no problem about `{subject}`: {e}"));
        assert!(
            p.message.contains(&format!("(set by override `{key}=~`)")),
            "`{key}=~`: {}",
            p.message
        );
    }
    // A problem the file has of its own, beside the override, carries no such note.
    let text = EXAMPLE.replace("mu: 0.12}", "mu: -0.12}");
    let e = load_str_with(&text, "rig.yaml", &set(&[("parts.hook.load.mass", "41")])).unwrap_err();
    assert!(
        e.problems.iter().all(|p| !p.message.contains("override")),
        "{e}"
    );
}

//! Every example rig in `rigs/` through the real binary: `reeve check --json RIG` loads
//! and solves, its JSON parses back into the DESIGN.md §5 contract, every number is
//! finite, and each rig shows exactly the warnings it was designed to show. Also the
//! exit codes: 0 clean, 1 when a check fails, 2 on a bad file.

use std::path::{Path, PathBuf};

use serde::Deserialize;

use crate::support::{assert_abs, reeve, Scratch, ROOT};

/// The warning codes (sorted, with repeats) and exit code each example rig is designed
/// to give, from its header comment. A rig without an entry fails the test.
const EXPECTED: &[(&str, &[&str], i32)] = &[
    // "built to fail that check": the follower's spring cannot lift the bird.
    ("automaton-cord.yaml", &["cannot-move"], 1),
    // "The tool warns that both sheaves are below the wire rope's usual D/d."
    ("gallery-panel.yaml", &["bend-ratio", "bend-ratio"], 0),
    // Must run back by itself (`runs_back: true`) and must not slip on the drums: clean.
    ("greenhouse-vents.yaml", &[], 0),
    // A 1:1 raise on a long static rope, rope stretch and weight given: clean.
    ("cliff-raise.yaml", &[], 0),
    // "Three lift lines share one batten, which statics alone cannot split: the ropes'
    // stiffness splits it" (the warning says so).
    ("line-set.yaml", &["indeterminate"], 0),
    // "the cord reaches the drum at a fleet angle above the usual limit (a warning this
    // scenario is meant to show)": the one span is out of plane at both its ends, the
    // lead sheave and the drum.
    ("ramp-winch.yaml", &["fleet-angle", "fleet-angle"], 0),
    // Not named in the header, but real: a 38 mm pulley (D/d 3.5) and a carabiner redirect
    // (D/d 0.9) under the kernmantle rope's D/d 4.
    ("rescue-haul.yaml", &["bend-ratio", "bend-ratio"], 0),
    // Balanced sash: clean.
    ("sash-window.yaml", &[], 0),
    // `check` takes the schedule's first value: the tank is empty, so the panel cannot
    // rise yet (it rises in `motion`, as the pump fills the tank).
    ("ballast-panel.yaml", &["cannot-move"], 1),
    // "shut, the door outweighs the box and stays shut": the box alone cannot open it.
    ("cellar-trapdoor.yaml", &["cannot-move"], 1),
    // Four-part hoist with a winch strong enough: clean.
    ("workshop-hoist.yaml", &[], 0),
];

/// `check --json` output, as DESIGN.md §5 promises it (more keys may exist).
#[derive(Debug, Deserialize)]
#[allow(dead_code)]
struct Asked {
    part: String,
    quantity: String,
    unit: String,
}

#[derive(Debug, Deserialize)]
struct Case {
    value: f64,
    #[serde(default)]
    efficiency: Option<f64>,
}

#[derive(Debug, Deserialize)]
struct PerCase {
    ideal: f64,
    forward: f64,
    back: f64,
}

#[derive(Debug, Deserialize)]
#[allow(dead_code)]
struct Span {
    line: String,
    index: usize,
    from: String,
    to: String,
    length_m: f64,
    tension_n: PerCase,
}

#[derive(Debug, Deserialize)]
#[allow(dead_code)]
struct ForwardBack {
    forward: Option<f64>,
    back: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[allow(dead_code)]
struct Part {
    name: String,
    kind: String,
    wrap_deg: Option<f64>,
    fleet_deg: Option<f64>,
    bend_ratio: Option<f64>,
    pin_load_n: ForwardBack,
    loss_share: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[allow(dead_code)]
struct Warning {
    code: String,
    part: Option<String>,
    message: String,
}

#[derive(Debug, Deserialize)]
struct CheckJson {
    format: u32,
    solve_for: Asked,
    ideal: Case,
    forward: Case,
    back: Case,
    self_locking: bool,
    velocity_ratio: Option<f64>,
    spans: Vec<Span>,
    parts: Vec<Part>,
    warnings: Vec<Warning>,
}

/// Every number anywhere in the document is finite (JSON cannot hold NaN, but a
/// writer could print a huge or odd value; serde_json parses those as f64).
fn all_finite(value: &serde_json::Value, at: &str) {
    match value {
        serde_json::Value::Number(n) => {
            let x = n.as_f64().unwrap_or(f64::NAN);
            assert!(x.is_finite(), "{at}: number {n} is not finite");
        }
        serde_json::Value::Array(items) => {
            for (i, v) in items.iter().enumerate() {
                all_finite(v, &format!("{at}[{i}]"));
            }
        }
        serde_json::Value::Object(map) => {
            for (k, v) in map {
                all_finite(v, &format!("{at}.{k}"));
            }
        }
        _ => {}
    }
}

fn example_rigs() -> Vec<PathBuf> {
    let mut rigs: Vec<PathBuf> = std::fs::read_dir(Path::new(ROOT).join("rigs"))
        .expect("rigs/ is readable")
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| p.extension().is_some_and(|x| x == "yaml" || x == "yml"))
        .collect();
    rigs.sort();
    rigs
}

/// What the checks of the example rigs exercised, so that the test can require each
/// check to have been made on some rig rather than skipped on all of them.
#[derive(Debug, Default)]
struct Exercised {
    /// Drums (not the drive) whose margin was checked against journal + thrust.
    drum_margins: usize,
    /// Rigs whose pin loads include a part's own weight.
    own_weights: usize,
}

/// The mass of the rope lying on the arcs round the rig's round parts, kg: `R·φ` of rope
/// (wrap with any extra turns) at each middle passage, which bears on the part's pin.
fn arc_rope_mass(rig: &reeve::model::Rig) -> f64 {
    let geometry = reeve::geometry::compute(rig, &Default::default()).expect("geometry");
    rig.lines
        .ids()
        .map(|l| {
            let w = rig.rope_of(l).mass_per_length.unwrap_or(0.0);
            let entries = &geometry.lines[l].entries;
            entries[1..entries.len() - 1]
                .iter()
                .map(|e| w * e.pitch_radius * e.wrap)
                .sum::<f64>()
        })
        .sum()
}

/// The pin loads of every part, in every case, sum to the weight of the parts that
/// report one. Each span pulls its two ends towards each other with its one tension,
/// so the forces the (massless) lines put on the parts cancel, whatever the friction;
/// a part's pin load is that force plus its own weight (sheaves and drums with a
/// `mass`). A rope with a `mass_per_length` hangs its spans' weight on the parts too
/// (DESIGN.md §7), and the weight of the rope on each part's arc, so that is added. Returns whether any such weight took part.
fn pin_loads_balance(rel: &str, path: &Path, value: &serde_json::Value) -> bool {
    use reeve::math::Vector;
    use reeve::model::PartKind;
    let rig = reeve::rig::load_file(path).unwrap_or_else(|e| panic!("{rel}: {e}"));
    let own_mass = |name: &str| {
        let part = rig.parts.iter().find(|p| p.name == name);
        match part.map(|p| &p.kind) {
            Some(PartKind::Sheave(s)) => s.mass.unwrap_or(0.0),
            Some(PartKind::Drum(d)) => d.mass.unwrap_or(0.0),
            Some(_) => 0.0,
            None => panic!("{rel}: the JSON names part `{name}`, which the rig lacks"),
        }
    };
    let gravity = rig.gravity.into_inner() * reeve::math::STANDARD_GRAVITY;
    let parts = value["parts"].as_array().expect("parts");
    let rope_mass: f64 = value["spans"]
        .as_array()
        .expect("spans")
        .iter()
        .map(|s| {
            let line = rig
                .lines
                .position(|l| Some(l.name.as_str()) == s["line"].as_str())
                .expect("span of a line");
            rig.rope_of(line).mass_per_length.unwrap_or(0.0) * s["length_m"].as_f64().unwrap()
        })
        .sum::<f64>()
        + arc_rope_mass(&rig);
    let mut weighed = rope_mass > 0.0;
    for (case, load, direction) in [
        (
            "ideal",
            &["pin_load_ideal_n"][..],
            &["pin_load_direction_ideal"][..],
        ),
        (
            "forward",
            &["pin_load_n", "forward"],
            &["pin_load_direction", "forward"],
        ),
        (
            "back",
            &["pin_load_n", "back"],
            &["pin_load_direction", "back"],
        ),
    ] {
        let at =
            |p: &serde_json::Value, keys: &[&str]| keys.iter().fold(p.clone(), |v, k| v[k].clone());
        let (mut sum, mut weight) = (Vector::zeros(), rope_mass * gravity);
        let (mut scale, mut count) = (0.0, 0);
        for p in parts {
            let name = p["name"].as_str().expect("part name");
            let (Some(f), Some(u)) = (at(p, load).as_f64(), at(p, direction).as_array().cloned())
            else {
                // A part no line touches (a block whose lines end on its sheaves).
                assert!(
                    at(p, load).is_null() && at(p, direction).is_null(),
                    "{rel}: {name}: {case} pin load {p}"
                );
                continue;
            };
            let u = Vector::from_iterator(u.iter().map(|x| x.as_f64().expect("direction")));
            assert_abs(
                &format!("{rel}: {name}: {case} pin load direction, length"),
                u.norm(),
                1.0,
                1e-9,
            );
            let m = own_mass(name);
            sum += f * u;
            weight += m * gravity;
            scale += f;
            count += 1;
            weighed |= m > 0.0;
        }
        assert!(count > 0, "{rel}: no part reports a {case} pin load");
        assert_abs(
            &format!("{rel}: {case} pin loads summed less the parts' and ropes' own weight, N"),
            (sum - weight).norm(),
            0.0,
            1e-9 * scale,
        );
    }
    weighed
}

fn check_rig(path: &Path, exercised: &mut Exercised) {
    let file = path.file_name().and_then(|f| f.to_str()).unwrap_or("?");
    let Some(&(_, codes, exit)) = EXPECTED.iter().find(|(name, _, _)| *name == file) else {
        panic!(
            "rigs/{file} has no entry in EXPECTED in tests/it/rigs.rs: read its header comment \
             and add the warning codes and exit code it is designed to give"
        );
    };
    let rel = format!("rigs/{file}");
    let value = reeve(&["check", "--json", &rel]).expect_code(exit).json();
    all_finite(&value, &rel);
    // The energy audit (an extra key beyond §5) balances to round-off in every case.
    for case in ["ideal", "forward", "back"] {
        let misfit = value["energy_audit"][case].as_f64();
        assert!(
            misfit.is_some_and(|m| m < 1e-9),
            "{rel}: energy audit {case} misfit {misfit:?}"
        );
    }
    // The audit's losses by kind (DESIGN.md §7: `loss.bearing`, `loss.bending`, ...)
    // add up to its total, which is the friction at the drive for unit drive speed.
    for case in ["forward", "back"] {
        let loss = &value["loss"];
        let kind = |k: &str| {
            loss[k][case]
                .as_f64()
                .unwrap_or_else(|| panic!("{rel}: loss.{k}"))
        };
        let sum = kind("bearing") + kind("bending") + kind("surface") + kind("drum");
        let total = kind("total");
        assert_abs(
            &format!("{rel}: losses by kind, {case}"),
            sum,
            total,
            1e-9 * (1.0 + total.abs()),
        );
    }
    // Drum torques, one entry per drum part. The margin of a drum that is not the
    // drive is "forward rope torque minus (load + drag): what journal and thrust take"
    // (src/report), which the drum's moment balance makes equal to journal + thrust;
    // the drive drum has none (its torque is the asked one).
    let drums = value["drums"]
        .as_array()
        .unwrap_or_else(|| panic!("{rel}: no `drums` list"));
    let drum_parts: Vec<&str> = value["parts"]
        .as_array()
        .expect("parts")
        .iter()
        .filter(|p| p["kind"] == "drum")
        .map(|p| p["name"].as_str().unwrap())
        .collect();
    let drum_names: Vec<&str> = drums.iter().map(|d| d["name"].as_str().unwrap()).collect();
    assert_eq!(drum_names, drum_parts, "{rel}: one `drums` entry per drum");
    for drum in drums {
        let name = drum["name"].as_str().unwrap();
        let margin = drum["margin_nm"].as_f64();
        if value["drive"] == name {
            assert!(
                margin.is_none(),
                "{rel}: the drive drum `{name}` has a margin"
            );
            continue;
        }
        let margin = margin.unwrap_or_else(|| panic!("{rel}: drum `{name}` has no margin"));
        let journal = drum["journal_nm"]["forward"]
            .as_f64()
            .expect("journal torque");
        let thrust = drum["thrust_nm"].as_f64().expect("thrust torque");
        assert_abs(
            &format!("{rel}: drum `{name}`: margin vs journal + thrust, N·m"),
            margin,
            journal + thrust,
            1e-9 * (1.0 + margin.abs()),
        );
        exercised.drum_margins += 1;
    }
    if pin_loads_balance(&rel, path, &value) {
        exercised.own_weights += 1;
    }
    let json: CheckJson = serde_json::from_value(value)
        .unwrap_or_else(|e| panic!("{rel}: JSON misses a DESIGN.md §5 key ({e})"));
    assert_eq!(json.format, 1, "{rel}: format");
    assert!(
        ["force", "mass", "torque"].contains(&json.solve_for.quantity.as_str()),
        "{rel}: quantity {}",
        json.solve_for.quantity
    );
    for case in [&json.ideal, &json.forward, &json.back] {
        assert!(case.value.is_finite(), "{rel}: case value {}", case.value);
    }
    let e = json.forward.efficiency.expect("forward efficiency");
    assert!(e > 0.0 && e <= 1.0 + 1e-12, "{rel}: forward efficiency {e}");
    assert!(json.back.efficiency.is_some(), "{rel}: back efficiency");
    assert!(
        json.velocity_ratio.is_some_and(|v| v > 0.0),
        "{rel}: velocity ratio"
    );
    assert!(
        !json.spans.is_empty() && !json.parts.is_empty(),
        "{rel}: spans and parts"
    );
    for span in &json.spans {
        assert!(span.length_m > 0.0, "{rel}: span {:?} length", span.line);
        let t = &span.tension_n;
        assert!(
            t.ideal >= 0.0 && t.forward >= 0.0 && t.back >= 0.0,
            "{rel}: line {} span {} tensions {:?}",
            span.line,
            span.index,
            (t.ideal, t.forward, t.back)
        );
    }
    // Loss shares: a rig that loses effort to friction (forward efficiency below 1)
    // shares its loss out in full; one that does not has no share anywhere.
    let shares: f64 = json.parts.iter().filter_map(|p| p.loss_share).sum();
    let has_loss = json
        .parts
        .iter()
        .any(|p| p.loss_share.is_some_and(|s| s > 0.0));
    assert_eq!(
        has_loss,
        e < 1.0,
        "{rel}: loss shares {shares} with a forward efficiency of {e}"
    );
    if has_loss {
        assert_abs(&format!("{rel}: loss shares summed"), shares, 1.0, 1e-9);
    }
    // Self-locking is what the values say (DESIGN.md §3).
    assert_eq!(
        json.self_locking,
        json.back.value * json.ideal.value < 0.0,
        "{rel}: self_locking vs ideal {} and back {}",
        json.ideal.value,
        json.back.value
    );
    let mut got: Vec<&str> = json.warnings.iter().map(|w| w.code.as_str()).collect();
    got.sort_unstable();
    let mut want = codes.to_vec();
    want.sort_unstable();
    assert_eq!(
        got,
        want,
        "{rel}: warning codes {got:?}, designed to show {want:?}; messages: {:#?}",
        json.warnings.iter().map(|w| &w.message).collect::<Vec<_>>()
    );
    // The text summary gives the same exit code.
    let text = reeve(&["check", &rel]);
    assert_eq!(text.code, exit, "{rel}: text mode exit code");
}

#[test]
fn every_example_rig_solves_with_its_designed_warnings() {
    let rigs = example_rigs();
    assert!(rigs.len() >= 3, "expected the example rigs in rigs/");
    let mut exercised = Exercised::default();
    for path in &rigs {
        check_rig(path, &mut exercised);
    }
    // Each conditional check above was made on some rig.
    assert!(
        exercised.drum_margins > 0 && exercised.own_weights > 0,
        "{exercised:?}"
    );
    // Every table entry names a rig that exists (catches renames).
    for (name, _, _) in EXPECTED {
        assert!(
            rigs.iter()
                .any(|p| p.file_name().and_then(|f| f.to_str()) == Some(name)),
            "tests/it/rigs.rs lists rigs/{name}, which does not exist"
        );
    }
}

#[test]
fn a_drive_too_weak_exits_1() {
    let out = reeve(&[
        "check",
        "--json",
        "rigs/workshop-hoist.yaml",
        "--set",
        "parts.winch.force=1 kN",
    ]);
    let out = out.expect_code(1);
    let json: CheckJson = serde_json::from_str(&out.stdout).expect("JSON");
    assert!(
        json.warnings.iter().any(|w| w.code == "cannot-move"),
        "warnings: {:?}",
        json.warnings
    );
}

#[test]
fn a_bad_file_exits_2() {
    let dir = Scratch::new("rigs");
    let bad = dir.write("bad.yaml", "format: 1\nparts: [this is not a rig\n");
    let bad = bad.to_string_lossy().to_string();
    for args in [
        vec!["check", bad.as_str()],
        vec!["check", "--json", bad.as_str()],
        vec!["check", "rigs/no-such-rig.yaml"],
    ] {
        let out = reeve(&args);
        assert_eq!(out.code, 2, "{args:?}: stderr {}", out.stderr);
        assert!(!out.stderr.is_empty(), "{args:?}: says why on stderr");
    }
}

#[test]
fn the_gallery_panel_loses_its_effort_to_the_wire_rope_bending() {
    // Guards what rigs/gallery-panel.yaml is for: on ball-bearing sheaves the rope's
    // bend_loss of 2 % per passage is nearly all the friction. Hand calculation:
    // 25 kg × 9.806 65 = 245.17 N, two passages at 1/0.98 each plus a little bearing:
    // 245.17 / 0.98² = 255.28 N, the solver 255.4 N.
    let value = reeve(&["check", "--json", "rigs/gallery-panel.yaml"])
        .expect_code(0)
        .json();
    let forward = value["forward"]["value"].as_f64().unwrap();
    assert!(
        forward > 245.166_25 / 0.98 / 0.98 && forward < 256.0,
        "{forward} N"
    );
    let loss = &value["loss"];
    let bending = loss["bending"]["forward"].as_f64().unwrap();
    let total = loss["total"]["forward"].as_f64().unwrap();
    assert!(bending / total > 0.95, "bending {bending} of {total}");
    // The corner sheave sits 60 mm off the head sheave's plane: equal and opposite
    // axial loads on the two sheaves (the crossing span's tension × sin 1.15°).
    let parts = value["parts"].as_array().unwrap();
    let axial = |name: &str| {
        parts.iter().find(|p| p["name"] == name).unwrap()["axial_load_n"]["forward"]
            .as_f64()
            .unwrap()
    };
    let span = value["spans"][1]["tension_n"]["forward"].as_f64().unwrap();
    let sin = (60.0f64 / 3000.0).atan().sin();
    assert_abs("axial load on head", axial("head"), span * sin, 0.01);
    assert_abs(
        "axial loads cancel",
        axial("head") + axial("corner"),
        0.0,
        1e-9,
    );
}

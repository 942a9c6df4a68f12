//! `motion` following the travel: where the rope geometry ends before the stops.

use crate::support::example_rig;
use crate::support::run::reeve_on;

#[test]
fn a_travel_longer_than_the_rig_is_refused_where_a_span_closes_up() {
    // Guards the travel profile of `motion` against long steps (review of issues 12 and
    // 13): on the sash with a travel of 100 m the profile's midpoint steps passed the
    // pulley, the reversed velocities carried the sash back, and the run reported a
    // clean `reaches-forward-stop 100000 mm at 26.78 m/s`. The sash meets its pulley
    // within a metre: the run must be refused there (exit 2), naming the span.
    let text = std::fs::read_to_string(example_rig("sash-window")).expect("rig");
    let (head, tail) = text.split_once("\ntravel:").expect("the sash has a travel");
    let rest = tail.split_once('\n').map_or("", |(_, r)| r);
    let long = format!("{head}\ntravel: {{back: 0, forward: 1e5 mm}}\n{rest}");
    let ran = reeve_on(&long, &["motion"]);
    assert_eq!(ran.code, 2, "{}\n{}", ran.stdout, ran.stderr);
    assert!(ran.stderr.contains("closes up"), "{}", ran.stderr);
    assert!(
        !ran.stdout.contains("reaches-forward-stop"),
        "{}",
        ran.stdout
    );
    // The sash's own travel still runs to its stop.
    let ran = reeve_on(&text, &["motion"]);
    assert_eq!(ran.code, 0, "{}", ran.stderr);
}

/// `motion --format json` of `text` (with `extra` arguments), exit 0.
fn motion_json(text: &str, extra: &[&str]) -> serde_json::Value {
    let mut args = vec!["motion", "--format", "json"];
    args.extend(extra);
    let ran = reeve_on(text, &args);
    assert_eq!(ran.code, 0, "{}", ran.stderr);
    serde_json::from_str(&ran.stdout).expect("motion JSON")
}

fn codes(json: &serde_json::Value) -> Vec<String> {
    json["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| w["code"].as_str().unwrap().to_string())
        .collect()
}

#[test]
fn a_rig_without_travel_stops_where_its_block_reaches_its_sheave() {
    // Guards a run without `travel` against running for ever: the ramp winch (30 N*m on
    // a drum of pitch radius 53 mm against a 120 kg cart on a 20° ramp) accelerated for
    // 60 s to 73,553 deg/s with only `no-travel`. The cart meets the lead sheave after
    // about 2.94 m of rope (its span's length at the drawn position): the run ends
    // there with a `stops` carrying the arrival speed and a `geometry-end` warning.
    let text = std::fs::read_to_string(example_rig("ramp-winch")).expect("rig");
    let json = motion_json(&text, &[]);
    let events = json["events"].as_array().unwrap();
    let last = events.last().unwrap();
    assert_eq!(last["event"], "stops", "{events:?}");
    let r = 0.053; // pitch radius, m: (100 mm + 6 mm) / 2
    let x = last["position"].as_f64().unwrap();
    assert!(
        x * r > 2.8 && x * r < 3.0,
        "rope wound at the end: {} m",
        x * r
    );
    // Constant net torque from rest (common practice: the running value changes little
    // over the ramp): v² ≈ 2·(T − T_forward)·x / I, within 10 %.
    let band = json["holding_band"].as_array().unwrap();
    let forward = band[1].as_f64().unwrap();
    let inertia = json["effective_mass"].as_f64().unwrap();
    let v = last["speed"].as_f64().unwrap();
    let expected = (2.0 * (30.0 - forward) * x / inertia).sqrt();
    assert!(
        (v / expected - 1.0).abs() < 0.1,
        "arrival speed {v} rad/s, expected about {expected}"
    );
    let samples = json["samples"].as_array().unwrap();
    let t_end = samples.last().unwrap()["t_s"].as_f64().unwrap();
    assert!(t_end < 3.0, "the run ends when the cart arrives: {t_end} s");
    assert!(
        codes(&json).contains(&"geometry-end".to_string()),
        "{:?}",
        json["warnings"]
    );
    assert!(!codes(&json).contains(&"step-limit".to_string()));
    // The energy still balances, the arrival's kinetic energy at the stop.
    let e = &json["energy"];
    let residual = e["residual_j"].as_f64().unwrap();
    assert!(
        residual.abs() < 1e-5 * e["drive_j"].as_f64().unwrap(),
        "{e}"
    );
}

#[test]
fn a_sash_without_travel_stops_at_its_pulley_however_long_the_run() {
    // Guards the same on a weight drive: without its travel the sash's counterweight ran
    // for 1e7 s to 658,627 m/s. The sash meets its pulley about 650 mm up.
    let text = std::fs::read_to_string(example_rig("sash-window")).expect("rig");
    let json = motion_json(&text, &["--set", "travel=~", "--duration", "1e7s"]);
    let last = json["events"].as_array().unwrap().last().unwrap().clone();
    assert_eq!(last["event"], "stops");
    let x = last["position"].as_f64().unwrap();
    assert!(x > 0.6 && x < 0.7, "{x} m");
    assert!(last["speed"].as_f64().unwrap() < 1.0, "{last}");
    assert!(codes(&json).contains(&"geometry-end".to_string()));
    for s in json["samples"].as_array().unwrap() {
        assert!(s["speed"].as_f64().unwrap().abs() < 1.0, "{s}");
    }
}

#[test]
fn where_the_geometry_sets_no_limit_the_run_ends_with_open_end() {
    // Guards the other side: with 10 N*m the winch runs back and the cart rolls down the
    // ramp, where nothing in the geometry stops it. The run ends once the cart has gone
    // as far as the rope drawn (3.81 m), with `open-end`, not at a figure of 60 s.
    let text = std::fs::read_to_string(example_rig("ramp-winch"))
        .expect("rig")
        .replace("torque: 30,", "torque: 10,");
    let json = motion_json(&text, &[]);
    let last = json["events"].as_array().unwrap().last().unwrap().clone();
    assert_eq!(last["event"], "stops");
    let x = last["position"].as_f64().unwrap();
    assert!(x < 0.0, "{x}");
    assert!(codes(&json).contains(&"open-end".to_string()));
    let text_out = reeve_on(&text, &["motion"]).stdout;
    assert!(text_out.contains("[open-end]"), "{text_out}");
}

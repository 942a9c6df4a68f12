//! Loads over the travel and motion in time (DESIGN.md §7): levers in the stroke, the
//! motion integrator against closed forms (Atwood machine, Coulomb-damped oscillator,
//! the stick-slip oscillator), the holding band of a scheduled drive against `check`,
//! the energy balance, step-size independence, and the `motion` command's outputs.

use reeve::math::STANDARD_GRAVITY as G;
use reeve::solve::motion::{motion, EventKind, Motion, MotionOptions};

use crate::support::run::reeve_on;
use crate::support::{assert_abs, assert_rel, example_rig, json_of, reeve, Scratch};

fn run(text: &str, options: &MotionOptions) -> Motion {
    let rig = reeve::rig::load_str(text, "test.yaml")
        .unwrap_or_else(|e| panic!("rig does not load: {e}\n{text}"));
    motion(&rig, options).unwrap_or_else(|e| panic!("no motion: {e}\n{text}"))
}

fn first(m: &Motion, kind: EventKind) -> reeve::solve::motion::Event {
    *m.run
        .events
        .iter()
        .find(|e| e.kind == kind)
        .unwrap_or_else(|| panic!("no {} event in {:?}", kind.name(), m.run.events))
}

/// An Atwood machine: 5 kg falls, 3 kg rises, over one frictionless sheave of pitch
/// radius 50 mm; `SHEAVE` is replaced by the sheave's mass keys.
const ATWOOD: &str = "format: 1
units: {length: mm, force: N, mass: kg, torque: N*m}
ropes: {cord: {diameter: 4, breaking_strength: 5 kN, mu: 0.1}}
parts:
  head: {kind: sheave, at: [0, 0, 2000], axle: [0, 1, 0], diameter: 96, bearing: {kind: none}SHEAVE}
  lift: {kind: block, at: [-50, 0, 1000], moves: [0, 0, 1], load: {mass: 3}}
  drop: {kind: weight, at: [50, 0, 1000], mass: 5}
lines: {l: {rope: cord, path: [lift, head, drop]}}
drive: drop
travel: {back: 0, forward: 500}
";

#[test]
fn constant_net_force_covers_its_distance_in_sqrt_2sm_over_f() {
    // Uniform acceleration from rest (Newton's second law; any mechanics text):
    // s = ½·(F/M)·t², t = √(2·s·M/F), M = 5 + 3 kg, F = (5 − 3)·g, s = 0.5 m.
    let m = run(&ATWOOD.replace("SHEAVE", ""), &MotionOptions::default());
    let hit = first(&m, EventKind::ReachesForwardStop);
    let expected = (2.0 * 0.5 * 8.0 / (2.0 * G)).sqrt();
    assert_rel("time over 0.5 m, s", hit.t, expected, 1e-7);
    assert_rel("impact speed, m/s", hit.speed, 2.0 * 0.5 / expected, 1e-7);
    assert_rel(
        "effective mass, kg",
        reeve::report::motion::json(&m).effective_mass,
        8.0,
        1e-9,
    );
}

#[test]
fn a_sheave_adds_its_inertia_over_its_radius_squared() {
    // The sheave turns at ω = v/R: its kinetic energy ½·I·(v/R)² adds I/R² to the mass
    // at the drive (Atwood machine with a massive pulley, any mechanics text). Given
    // I = 0.004 kg·m² at R = 0.05 m: 1.6 kg. Default for a 2 kg sheave: a uniform disc
    // at its pitch radius, ½·m·R²/R² = 1 kg (common practice).
    for (keys, extra) in [
        (", mass: 2, inertia: 0.004 kg*m^2", 1.6),
        (", mass: 2", 1.0),
    ] {
        let m = run(&ATWOOD.replace("SHEAVE", keys), &MotionOptions::default());
        let hit = first(&m, EventKind::ReachesForwardStop);
        let mass = 8.0 + extra;
        assert_rel(
            &format!("time over 0.5 m with `{keys}`, s"),
            hit.t,
            (2.0 * 0.5 * mass / (2.0 * G)).sqrt(),
            1e-7,
        );
        let json = reeve::report::motion::json(&m);
        assert_rel("effective mass, kg", json.effective_mass, mass, 1e-9);
    }
}

/// A 3 kg block lifted over one plain-bearing sheave by a hand whose pull follows a
/// schedule: up from 1 N to 60 N over a minute, held, then down to 1 N.
const RAMP: &str = "format: 1
units: {length: mm, force: N, mass: kg, torque: N*m}
ropes: {cord: {diameter: 6, breaking_strength: 5 kN, mu: 0.1}}
parts:
  head: {kind: sheave, at: [0, 0, 2000], axle: [0, 1, 0], diameter: 60,
         bearing: {kind: plain, pin_diameter: 20, mu: 0.2STATIC}}
  lift: {kind: block, at: [-33, 0, 1000], moves: [0, 0, 1], load: {mass: 3}}
  hand: {kind: haul, at: [33, 0, 800],
         force: {schedule: [[0 s, 1 N], [1 min, 60 N], [70 s, 60 N], [130 s, 1 N]]}}
lines: {l: {rope: cord, path: [lift, head, hand]}}
travel: {back: 0, forward: 300}
";

#[test]
fn a_scheduled_drive_starts_at_the_forward_value_and_runs_back_below_the_back_value() {
    // DESIGN.md §3: between back and forward friction holds the rig; `check` gives both
    // (with static coefficients, the breakaway value starts it). The schedule is
    // piecewise linear, so the crossing is found exactly.
    for (stat, start_key) in [("", "forward"), (", mu_static: 0.3", "breakaway")] {
        let text = RAMP.replace("STATIC", stat);
        let check = reeve_on(&text, &["check", "--json"]).json();
        let m = run(&text, &MotionOptions::default());
        let start = first(&m, EventKind::StartsForward);
        let forward = check[start_key]["value"]
            .as_f64()
            .unwrap_or_else(|| check["forward"]["breakaway"].as_f64().unwrap());
        // To the schedule's resolution: the crossing is nudged 1e-9 of its segment past.
        assert_rel(
            &format!("drive value at the start ({start_key}), N"),
            start.drive_value,
            forward,
            1e-8,
        );
        first(&m, EventKind::ReachesForwardStop);
        let back = first(&m, EventKind::StartsBack);
        // Vertical spans: the back value at the forward stop is the drawn position's.
        let back_value = if stat.is_empty() {
            check["back"]["value"].as_f64().unwrap()
        } else {
            m.profile.at(back.position).start_back
        };
        assert_rel(
            "drive value when it starts back, N",
            back.drive_value,
            back_value,
            1e-8,
        );
        assert!(back.drive_value < check["back"]["value"].as_f64().unwrap() + 1e-9);
    }
}

#[test]
fn the_same_rig_with_no_schedule_never_moves() {
    // The drive held at the schedule's first value (1 N, inside the band of a 3 kg
    // load: it would run back, but the back stop holds it), and the ballast panel with
    // its tank empty.
    let text = RAMP.replace("STATIC", "").replace(
        "force: {schedule: [[0 s, 1 N], [1 min, 60 N], [70 s, 60 N], [130 s, 1 N]]}",
        "force: 1 N",
    );
    let m = run(&text, &MotionOptions::default());
    assert!(m.run.events.is_empty(), "{:?}", m.run.events);
    let text = std::fs::read_to_string(example_rig("ballast-panel")).unwrap();
    let fixed: String = text
        .lines()
        .map(|l| {
            if l.contains("{schedule") {
                "           mass: 30 kg}"
            } else {
                l
            }
        })
        .collect::<Vec<_>>()
        .join("\n");
    let m = run(&fixed, &MotionOptions::default());
    assert!(m.run.events.is_empty(), "{:?}", m.run.events);
    assert!(m.run.points.iter().all(|p| p.x == 0.0 && p.v == 0.0));
}

/// A block on a level track held by a spring (100 N/m), pulled by a 5 kg weight over a
/// drum whose `drag` (0.05 N·m at 50 mm pitch radius: 1 N at the rope) is a constant
/// friction force opposing the motion: Coulomb damping.
const COULOMB: &str = "format: 1
units: {length: mm, force: N, mass: kg, torque: N*m}
ropes: {cord: {diameter: 4, breaking_strength: 5 kN, mu: 0.1}}
parts:
  sled: {kind: block, at: [2000, 0, 50], moves: [-1, 0, 0], mass: 2, load: {force: 0},
         spring: {rate: 100 N/m, force: 1 N}}
  drum: {kind: drum, at: [0, 0, 0], axle: [0, 1, 0], diameter: 96, drag: 0.05, mu: 1,
         inertia: 0}
  drop: {kind: weight, at: [-50, 0, -1500], mass: 5}
lines: {l: {rope: cord, path: [sled, drum, drop]}}
drive: drop
travel: {back: 500, forward: 1200}
";

#[test]
fn coulomb_friction_takes_4f_over_k_off_the_amplitude_each_cycle() {
    // Free vibration with Coulomb damping: the amplitude falls by 4·F/k per cycle, the
    // motion stopping where the spring force lies within ±F of the drive (S. S. Rao,
    // *Mechanical Vibrations*, section on Coulomb damping; from memory). F = 1 N,
    // k = 100 N/m: 0.04 m per cycle.
    let options = MotionOptions {
        duration: Some(30.0),
        ..MotionOptions::default()
    };
    let m = run(COULOMB, &options);
    let turns: Vec<f64> = m
        .run
        .events
        .iter()
        .filter(|e| matches!(e.kind, EventKind::StartsForward | EventKind::StartsBack))
        .map(|e| e.position)
        .collect();
    assert!(turns.len() >= 6, "turning points {turns:?}");
    for w in turns.windows(3) {
        assert_abs(
            "change of a turning point over one cycle, m",
            (w[2] - w[0]).abs(),
            0.04,
            1e-6,
        );
    }
    // It ends at rest inside the band: |spring − drive| ≤ F.
    let last = m.run.events.last().unwrap();
    assert_eq!(last.kind, EventKind::Stops, "{:?}", m.run.events);
    let spring = 1.0 + 100.0 * last.position;
    assert!(
        (spring - 5.0 * G).abs() <= 1.0 + 1e-9,
        "spring {spring} N at rest"
    );
}

/// The stick-slip oscillator from rig parts: a 1 kg sled on a spring (100 N/m) whose
/// far end the hand's pull moves at 0.01 m/s (the pull grows by k·v = 1 N/s: the spring
/// end's position is pull/k), with friction from a heavy drum's journal that the rope
/// turns: 10⁵ kg on a 0.01 mm pin at 0.5 m pitch radius gives a friction force
/// `μ'·m_d·g·r/R = μ'·(1 kg)·g` at the rope, with `μ' = sin(atan μ)` of the friction
/// circle (DESIGN.md §1); the bearing coefficients are chosen so that μ' is 0.5 at rest
/// and 0.3 running.
pub(crate) const STICK_SLIP: &str = "format: 1
units: {length: mm, force: N, mass: kg, torque: N*m}
ropes: {cord: {diameter: 4, breaking_strength: 5 kN, mu: 0.1}}
parts:
  sled: {kind: block, at: [3000, 0, 500], moves: [-1, 0, 0], mass: 1, load: {force: 0},
         spring: {rate: 100 N/m, force: 0.5 N}}
  drum: {kind: drum, at: [0, 0, 0], axle: [0, 1, 0], diameter: 996, mu: 1, mass: 100000,
         inertia: 0, shaft: {bearing: {kind: plain, pin_diameter: 0.01, mu: MUK, mu_static: MUS}}}
  hand: {kind: haul, at: [-500, 0, -3000], force: {schedule: [[0 s, 0.5 N], [100 s, 100.5 N]]}}
lines: {l: {rope: cord, path: [sled, drum, hand]}}
travel: {back: 0, forward: 1000}
";

#[test]
fn the_stick_slip_oscillator_jumps_2_mu_difference_mg_over_k_and_sticks_for_jump_over_v() {
    // A mass on a spring pulled at constant speed, static above kinetic friction: each
    // stick lasts Δx/v with Δx = 2·(μs − μk)·m·g/k, and in the limit of slow pulling
    // each slip jumps Δx (the classic stick-slip oscillator). m = 1 kg, k = 100 N/m,
    // μs = 0.5, μk = 0.3, v = 0.01 m/s: 0.03923 m, 3.923 s.
    // Derived (the exact jump at this speed): with y = x − v·t + μk·m·g/k the slip is
    // m·y'' = −k·y with y(0) = −d, y'(0) = −v, d = Δx/2, ω = √(k/m); it
    // ends when the mass stops (y' = −v) at ω·t = 2·(π − atan(d·ω/v)), with y = +d, so
    // the jump is 2·d + v·t_slip (the pull goes on during the slip) and the spring
    // force at the stop is 2·μk·m·g − μs·m·g, which makes the stick exactly 2·d/v.
    let mu = |m: f64| m / (1.0 - m * m).sqrt(); // tan(asin μ'): sin(atan μ) = μ'
    let text = STICK_SLIP
        .replace("MUK", &format!("{}", mu(0.3)))
        .replace("MUS", &format!("{}", mu(0.5)));
    stick_slip_figures(&text);
}

#[test]
fn the_stick_slip_oscillator_keeps_its_figures_through_a_stretchy_rope_on_a_haul() {
    // The same oscillator with a rope of EA = 200 kN between the hand and the sled: the
    // haul's end has no mass, so the stretch follows the pull (u = D/k) and the sled
    // moves as before; the rope's strain energy D²/(2k) joins the energy balance
    // (the hand's end moves x + D/k: its work is ∫D·dx + [D²/(2k)], derived).
    let mu = |m: f64| m / (1.0 - m * m).sqrt();
    let text = STICK_SLIP
        .replace("MUK", &format!("{}", mu(0.3)))
        .replace("MUS", &format!("{}", mu(0.5)))
        .replace("mu: 0.1}}", "mu: 0.1, stiffness: 200 kN}}");
    let m = stick_slip_figures(&text);
    let k = m.two_dof.expect("the rope's spring rate at the haul");
    assert!(k > 0.0 && k.is_finite(), "{k}");
    let e = m.run.energy;
    let (d0, d1) = (0.5, 0.5 + 20.0); // the hand's pull at 0 s and at 20 s, N
    assert_rel(
        "rope strain energy, J",
        e.spring,
        (d1 * d1 - d0 * d0) / (2.0 * k),
        1e-12,
    );
    assert!(
        e.residual().abs() <= 1e-6 * e.drive.abs(),
        "energy residual {} J of {} J: {e:?}",
        e.residual(),
        e.drive
    );
}

fn stick_slip_figures(text: &str) -> Motion {
    let options = MotionOptions {
        duration: Some(20.0),
        ..MotionOptions::default()
    };
    let m = run(text, &options);
    let starts: Vec<_> = m
        .run
        .events
        .iter()
        .filter(|e| matches!(e.kind, EventKind::StartsForward | EventKind::Slips))
        .collect();
    let stops: Vec<_> = m
        .run
        .events
        .iter()
        .filter(|e| matches!(e.kind, EventKind::Sticks | EventKind::Stops))
        .collect();
    assert!(starts.len() >= 4 && stops.len() >= 3, "{:?}", m.run.events);
    let (v, omega) = (0.01, 10.0);
    let jump = 2.0 * 0.2 * G / 100.0;
    assert_rel("the slow-pull jump, m", jump, 0.03923, 1e-4);
    assert_rel("the stick time, s", jump / v, 3.923, 1e-4);
    let d = jump / 2.0;
    let t_slip = 2.0 * (std::f64::consts::PI - (d * omega / v).atan()) / omega;
    for i in 0..3 {
        assert_rel(
            "slip jump (slow-pull jump + v·t_slip), m",
            stops[i].position - starts[i].position,
            jump + v * t_slip,
            2e-5, // the tensions add about 5e-6 of the drum's weight to its journal load
        );
        assert_rel("slip time, s", stops[i].t - starts[i].t, t_slip, 2e-5);
        assert_rel(
            "stick time, s",
            starts[i + 1].t - stops[i].t,
            jump / v,
            2e-5,
        );
    }
    assert_eq!(
        m.run.events[1].kind,
        EventKind::Sticks,
        "{:?}",
        m.run.events
    );
    assert_eq!(m.run.events[2].kind, EventKind::Slips, "{:?}", m.run.events);
    assert!(m.strokes[0].stick_slip_cycles >= 3, "{:?}", m.strokes);
    assert!(
        m.warnings.iter().any(|w| w.code == "jerky-motion"),
        "{:?}",
        m.warnings
    );
    m
}

/// A lid on a drum (axle −y, so that turning forward lifts it), its centre of mass
/// 400 mm out, level at the drawn position; the drum is the drive and its torque the
/// unknown; a 1 kg weight keeps the drum's one line taut.
const LID: &str = "format: 1
units: {length: mm, force: N, mass: kg, torque: N*m}
ropes: {cord: {diameter: 4, breaking_strength: 5 kN, mu: 0.1}}
parts:
  hinge: {kind: drum, at: [0, 0, 0], axle: [0, -1, 0], diameter: 96,
          lever: {mass: 8, arm: [400, 0, 0]}}
  tail: {kind: weight, at: [50, 0, -1000], mass: 1}
lines: {l: {rope: cord, path: [{part: hinge, side: right}, tail]}}
drive: hinge
travel: {back: 0, forward: 90 deg}
";

#[test]
fn a_lid_lever_torque_follows_m_g_arm_cos_angle_over_a_quarter_turn() {
    // Statics of a rigid body: a weight m·g at arm a about a horizontal axle gives
    // m·g·a·cos θ, θ the arm's angle above level. The tail weight adds a constant.
    let value = reeve_on(
        LID,
        &["sweep", "--stroke", "--steps", "6", "--format", "json"],
    )
    .json();
    let steps = value["steps"].as_array().expect("steps");
    assert_eq!(steps.len(), 7, "{value}");
    let ideal = |i: usize| steps[i]["ideal"].as_f64().expect("ideal");
    let tail = ideal(6); // at 90° the lid's torque is zero
    for (i, st) in steps.iter().enumerate() {
        let angle = st["travel"].as_f64().unwrap();
        assert_abs(
            "travel, rad",
            angle,
            i as f64 * std::f64::consts::FRAC_PI_2 / 6.0,
            1e-9,
        );
        assert_abs(
            &format!("lever torque at {:.1}°, N·m", angle.to_degrees()),
            ideal(i) - tail,
            8.0 * G * 0.4 * angle.cos(),
            1e-6,
        );
    }
}

#[test]
fn the_energy_balances_to_the_tolerance_and_steps_do_not_change_the_answer() {
    for name in ["ballast-panel", "cellar-trapdoor"] {
        let text = std::fs::read_to_string(example_rig(name)).unwrap();
        let coarse = run(&text, &MotionOptions::default());
        let e = coarse.run.energy;
        assert!(
            coarse.run.events.len() >= 2,
            "{name}: {:?}",
            coarse.run.events
        );
        assert!(
            e.residual().abs() <= 1e-6 * e.drive.abs().max(1.0),
            "{name}: energy residual {} J of {} J: {e:?}",
            e.residual(),
            e.drive
        );
        // Smaller steps and tolerances a hundred times tighter: the same events.
        let fine = run(
            &text,
            &MotionOptions {
                max_step: Some(0.05),
                tolerance_scale: 0.01,
                ..MotionOptions::default()
            },
        );
        assert_eq!(coarse.run.events.len(), fine.run.events.len(), "{name}");
        for (a, b) in coarse.run.events.iter().zip(&fine.run.events) {
            assert_eq!(a.kind, b.kind, "{name}");
            assert_abs(
                &format!("{name}: {} time, s", a.kind.name()),
                a.t,
                b.t,
                1e-5,
            );
            assert_abs(
                &format!("{name}: {} position", a.kind.name()),
                a.position,
                b.position,
                1e-6,
            );
        }
    }
}

#[test]
fn motion_writes_the_json_of_design_section_7_csv_text_and_a_chart() {
    let rig = example_rig("ballast-panel");
    let v = json_of(&["motion", &rig, "--format", "json"]);
    for key in [
        "format",
        "duration_s",
        "position_unit",
        "events",
        "strokes",
        "samples",
        "warnings",
        "caution",
    ] {
        assert!(v.get(key).is_some(), "missing `{key}`");
    }
    assert_eq!(v["position_unit"], "m");
    let e = &v["events"][0];
    for key in ["t_s", "event", "position", "drive_value"] {
        assert!(e.get(key).is_some(), "event lacks `{key}`: {e}");
    }
    assert_eq!(e["event"], "starts-forward");
    let s = &v["strokes"][0];
    for key in [
        "direction",
        "start_s",
        "end_s",
        "duration_s",
        "peak_speed",
        "peak_tension_n",
        "stick_slip_cycles",
    ] {
        assert!(s.get(key).is_some(), "stroke lacks `{key}`: {s}");
    }
    let sample = &v["samples"][0];
    for key in ["t_s", "position", "speed", "drive_value"] {
        assert!(sample.get(key).is_some(), "sample lacks `{key}`");
    }
    let text = reeve(&["motion", &rig]).expect_code(0).stdout;
    assert!(
        text.contains("Events:") && text.contains("starts-forward"),
        "{text}"
    );
    assert!(text.trim_end().ends_with(reeve::report::CAUTION), "{text}");
    let csv = reeve(&["motion", &rig, "--format", "csv", "--duration", "20 min"])
        .expect_code(0)
        .stdout;
    let mut reader = csv::Reader::from_reader(csv.as_bytes());
    assert_eq!(reader.headers().unwrap().get(0), Some("t_s"));
    assert!(reader.records().count() > 10);
    let scratch = Scratch::new("motion-plot");
    let plot = scratch.write("run.svg", "");
    reeve(&["motion", &rig, "--plot", plot.to_str().unwrap()]).expect_code(0);
    let svg = std::fs::read_to_string(&plot).unwrap();
    roxmltree::Document::parse(&svg).expect("the chart parses as XML");
    assert!(svg.contains("starts forward above") && svg.contains("drive value"));
    // Never over the input; a duration that is not a time is bad input.
    reeve(&["motion", &rig, "--plot", &rig]).expect_code(2);
    for bad in ["abc", "0 s", "5 kg", "-3 s"] {
        let ran = reeve(&["motion", &rig, "--duration", bad]).expect_code(2);
        assert!(ran.stderr.contains("--duration"), "{bad}: {}", ran.stderr);
    }
    // A drive without a value cannot be run.
    let ran = reeve(&["motion", &example_rig("line-set")]).expect_code(2);
    assert!(ran.stderr.contains("has no force"), "{}", ran.stderr);
}

#[test]
fn a_stroke_over_the_travel_marks_the_dead_spots() {
    let v = json_of_code(
        &[
            "sweep",
            &example_rig("cellar-trapdoor"),
            "--stroke",
            "--format",
            "json",
        ],
        1,
    );
    let steps = v["steps"].as_array().unwrap();
    assert_eq!(steps[0]["dead_spot"], "runs-back");
    assert!(
        steps.last().unwrap().get("dead_spot").is_none(),
        "{}",
        steps.last().unwrap()
    );
    assert_abs(
        "last travel, m",
        steps.last().unwrap()["travel"].as_f64().unwrap(),
        0.225,
        1e-9,
    );
    assert!(steps.iter().all(|s| s["available"].as_f64() == Some(24.0)));
}

fn json_of_code(args: &[&str], code: i32) -> serde_json::Value {
    reeve(args).expect_code(code).json()
}

#[test]
fn a_stretchy_rope_joins_the_drive_weight_to_the_rig_by_its_spring_rate() {
    // The ballast panel with a rope of EA = 40 kN: the rig's spring rate at the drive is
    // 10 N/mm (`check`). Drive side and rig side are two degrees of freedom; at rest the
    // tank hangs in equilibrium, so the rig breaks away when the one-degree run does, to
    // within the tank's swing on the rope as it fills (started at rest, the pull follows
    // the filling rate ṁ·g with a swing of ṁ·g/ω in force, ω = √(k/m): a few
    // hundredths of a second of the fill here); after the first jump the tank bounces on the rope and the panel creeps on in
    // jerks. The energy (now with the rope's strain energy) still balances.
    let text = std::fs::read_to_string(example_rig("ballast-panel")).unwrap();
    let stretchy = text.replace("mu: 0.15}", "mu: 0.15, stiffness: 40 kN}");
    assert_ne!(stretchy, text);
    let options = MotionOptions {
        duration: Some(600.0),
        ..MotionOptions::default()
    };
    let one = run(&text, &options);
    let two = run(&stretchy, &options);
    assert_eq!(one.two_dof, None);
    assert_rel(
        "spring rate, N/m",
        two.two_dof.expect("two degrees"),
        10_000.0,
        1e-9,
    );
    let (a, b) = (
        first(&one, EventKind::StartsForward),
        first(&two, EventKind::StartsForward),
    );
    assert_abs("breakaway time, s", b.t, a.t, 0.1);
    let e = two.run.energy;
    assert!(
        e.residual().abs() <= 1e-6 * e.drive.abs(),
        "energy residual {} J of {} J: {e:?}",
        e.residual(),
        e.drive
    );
    assert!(e.spring.abs() > 0.0);
    let cycles = |m: &Motion| m.strokes.iter().map(|s| s.stick_slip_cycles).sum::<usize>();
    assert!(
        cycles(&two) > cycles(&one),
        "{:?} vs {:?}",
        two.strokes,
        one.strokes
    );
    let json = reeve::report::motion::json(&two);
    assert_eq!(json.degrees_of_freedom, 2);
}

#[test]
fn a_scheduled_load_starts_the_rig_when_it_falls_below_what_the_drive_holds() {
    // The drive is a constant 25 N; the load drains from 3 kg to 1 kg over a minute.
    // The forward value is proportional to the load (friction of a plain bearing grows
    // with its pin load, which grows with the tensions: the statics is homogeneous in
    // the loads, DESIGN.md §3), so with `check`'s forward value `F₃` at 3 kg the rig
    // starts when `m = 3 kg · 25 N / F₃`, at `t = 60 s · (3 kg − m) / 2 kg` (derived).
    let text = RAMP.replace("STATIC", "").replace(
        "force: {schedule: [[0 s, 1 N], [1 min, 60 N], [70 s, 60 N], [130 s, 1 N]]}",
        "force: 25 N",
    );
    let held = text.replace(
        "load: {mass: 3}",
        "load: {mass: {schedule: [[0 s, 3 kg], [1 min, 1 kg]]}}",
    );
    let check = reeve_on(&text, &["check", "--json"]).json();
    let f3 = check["forward"]["value"].as_f64().unwrap();
    assert!(f3 > 25.0, "the 3 kg load must hold against 25 N: {f3}");
    let m_start = 3.0 * 25.0 / f3;
    let t_start = 60.0 * (3.0 - m_start) / 2.0;
    let m = run(&held, &MotionOptions::default());
    assert!(
        m.warnings.iter().all(|w| w.code != "schedule-held"),
        "{:?}",
        m.warnings
    );
    let start = first(&m, EventKind::StartsForward);
    assert_rel("start time of a draining load, s", start.t, t_start, 1e-7);
    assert_rel(
        "drive value at the start, N",
        start.drive_value,
        25.0,
        1e-12,
    );
    // The holding band moved with the load: at the start it is the drive's value.
    assert_rel(
        "forward value at the start, N",
        m.profile.at_t(start.t, 0.0).start_forward,
        25.0,
        1e-7,
    );
    first(&m, EventKind::ReachesForwardStop);
    // Energy balances with the load changing in time (the rig ran 0.3 m up).
    let e = m.run.energy;
    assert!(e.drive > 7.0, "{e:?}");
    assert!(e.residual().abs() < 1e-6 * e.drive.abs(), "{e:?}");
    // The same rig with the load held at 3 kg never moves.
    let m = run(&text, &MotionOptions::default());
    assert!(m.run.events.is_empty(), "{:?}", m.run.events);
}

/// A winch drum (0.02 kg·m²) lifting a 10 kg block at about 50 mm pitch radius with a
/// constant 8 N·m; `STIFF` is where the test gives the rope a stiffness.
const WINCH: &str = "format: 1
units: {length: mm, force: N, mass: kg, torque: N*m}
ropes: {cord: {diameter: 4, breaking_strength: 5 kN, mu: 0.1STIFF}}
parts:
  winch: {kind: drum, at: [0, 0, 0], axle: [0, -1, 0], diameter: 96, inertia: 0.02, torque: 8}
  lift: {kind: block, at: [50, 0, -1000], moves: [0, 0, 1], load: {mass: 10}}
lines: {l: {rope: cord, path: [{part: winch, side: right}, lift]}}
drive: winch
travel: {back: 0, forward: 360 deg}
";

#[test]
fn a_stretchy_rope_joins_a_drive_drum_to_the_rig_by_its_spring_rate() {
    // The drum's own inertia on the drive side, the block on the rig side, joined by
    // the rope's spring rate at the drum (N·m/rad). Without rope damping the block
    // bounces on the rope, but on average it keeps pace with the rigid run: the time to
    // the forward stop agrees to within a swing period 2π·√(I_d/k) or so (derived), and
    // the energy balances with the rope's strain energy.
    let options = MotionOptions {
        duration: Some(5.0),
        ..MotionOptions::default()
    };
    let one = run(&WINCH.replace("STIFF", ""), &options);
    let two = run(&WINCH.replace("STIFF", ", stiffness: 20 kN"), &options);
    assert_eq!(one.two_dof, None);
    let k = two.two_dof.expect("two degrees of freedom");
    let json = reeve::report::motion::json(&two);
    assert_eq!(json.degrees_of_freedom, 2);
    let (a, b) = (
        first(&one, EventKind::ReachesForwardStop),
        first(&two, EventKind::ReachesForwardStop),
    );
    let period = 2.0 * std::f64::consts::PI * (0.02 / k).sqrt();
    assert_abs("time to the forward stop, s", b.t, a.t, 2.0 * period);
    let e = two.run.energy;
    assert!(e.spring.abs() > 0.0, "{e:?}");
    assert!(
        e.residual().abs() <= 1e-6 * e.drive.abs(),
        "energy residual {} J of {} J: {e:?}",
        e.residual(),
        e.drive
    );
}

/// A 5 kg sled on a level track pulled by a rope up to a small sheave 1 m above the
/// track, held back by a constant 1 N: as it nears the foot of the sheave the rope pulls
/// ever more steeply, and the sled moves `1/cos θ` times the rope's speed. Frictionless
/// (bearing none), a constant 10 N haul, 0.5 m of rope hauled.
const SLANT: &str = "format: 1
units: {length: mm, force: N, mass: kg, torque: N*m}
ropes: {cord: {diameter: 2, breaking_strength: 5 kN, mu: 0.1}}
parts:
  sled: {kind: block, at: [-1500, 0, 0], moves: [1, 0, 0], mass: 5, load: {force: 1}}
  head: {kind: sheave, at: [0, 0, 1000], axle: [0, 1, 0], diameter: 8, bearing: {kind: none}}
  hand: {kind: haul, at: [5, 0, 2000], force: 10}
lines: {l: {rope: cord, path: [sled, head, hand]}}
drive: hand
travel: {back: 0, forward: 500}
";

#[test]
fn a_changing_velocity_ratio_keeps_the_work_energy_balance() {
    // Lagrange's equation for a mass M(x) along the drive, d/dt(M·v) − ½·(dM/dx)·v² = Q,
    // keeps the work–energy theorem: with no friction the kinetic energy at the forward
    // stop is the haul's work less the 1 N load's, ½·M(s)·v² = F·s − 1 N·d, and no
    // energy goes to "mass added in motion" (nothing changes in time). Without the
    // term the sled arrives with a different speed and the difference shows as that
    // added-mass energy. By hand (the sheave as a point at 1 m, its 5 mm pitch radius
    // neglected: 1e-2, 2e-2 for the steep m/cos²θ): the slanted rope L₀ = √(1.5² + 1²) m shortens to L₁ = L₀ − 0.5 m,
    // the sled is then x₁ = √(L₁² − 1) m from the foot, d = 1.5 m − x₁, cos θ = x₁/L₁, and
    // the effective mass m/cos²θ (sled speed v/cos θ).
    let m = run(SLANT, &MotionOptions::default());
    let stop = first(&m, EventKind::ReachesForwardStop);
    let e = m.run.energy;
    assert_rel("haul work F·s, J", e.drive, 5.0, 1e-9);
    assert_abs("friction, J", e.friction, 0.0, 1e-12);
    assert_abs(
        "energy given to mass added in motion, J",
        e.added_mass,
        0.0,
        1e-12,
    );
    // The profile's M(x) is sampled (200 intervals) and its slope smoothed between
    // samples: the balance closes to the square of the sample spacing (2e-6 here) and
    // four times better at twice the samples (second order).
    assert_rel(
        "kinetic energy at the stop = work − load's work, J",
        e.impacts,
        e.drive - e.loads,
        5e-6,
    );
    let finer = run(
        SLANT,
        &MotionOptions {
            intervals: 800,
            ..MotionOptions::default()
        },
    );
    let r = finer.run.energy.residual().abs();
    assert!(r * 10.0 < e.residual().abs(), "{r} vs {}", e.residual());
    let l1 = 1.5f64.hypot(1.0) - 0.5;
    let x1 = (l1 * l1 - 1.0).sqrt();
    assert_rel("load's work 1 N·d, J", e.loads, 1.5 - x1, 1e-2);
    let end = m.profile.at(stop.position);
    let big_m = end.inertia_ideal + end.own_inertia;
    let cos = x1 / l1;
    // m/cos²θ is steep in the sled's place: the neglected pitch radius costs 1.2e-2.
    assert_rel("effective mass m/cos²θ, kg", big_m, 5.0 / (cos * cos), 2e-2);
    assert_rel(
        "drive speed at the stop √(2·KE/M), m/s",
        stop.speed,
        (2.0 * e.impacts / big_m).sqrt(),
        1e-6,
    );
}

#[test]
fn a_long_load_schedule_is_solved_at_some_of_its_times_and_says_so() {
    // 250 times: each costs a whole profile, so at most 100 are solved (every third
    // and the last), with a warning; the run still starts as the load drains.
    let points: Vec<String> = (0..250)
        .map(|i| format!("[{} s, {} kg]", i, 3.0 - 2.0 * i as f64 / 249.0))
        .collect();
    let text = RAMP
        .replace("STATIC", "")
        .replace(
            "force: {schedule: [[0 s, 1 N], [1 min, 60 N], [70 s, 60 N], [130 s, 1 N]]}",
            "force: 25 N",
        )
        .replace(
            "load: {mass: 3}",
            &format!("load: {{mass: {{schedule: [{}]}}}}", points.join(", ")),
        );
    let options = MotionOptions {
        intervals: 4,
        ..MotionOptions::default()
    };
    let m = run(&text, &options);
    assert!(
        m.warnings.iter().any(|w| w.code == "schedule-thinned"),
        "{:?}",
        m.warnings
    );
    assert!(m.profile.later.len() <= reeve::solve::motion::MOST_SOLVED_TIMES + 1);
    first(&m, EventKind::StartsForward);
}

/// Guards: a step in a schedule (two points at one time, which the loader accepts) is
/// found where it is while the rig is held: the sash's counterweight drops from 7 kg to
/// 5 kg at 5 s, below the back value (about 5.7 kg), so it starts back at 5 s, not when
/// a straight line from the step's upper value to the end would cross the band (13 s).
/// (`DriveValue::leaves` took the value before a step as the next piece's start.)
#[test]
fn a_step_in_the_schedule_starts_the_rig_back_at_the_step() {
    let text = std::fs::read_to_string(example_rig("sash-window"))
        .expect("rig")
        .replacen(
            "mass: 6.4}",
            "mass: {schedule: [[0 s, 7 kg], [5 s, 7 kg], [5 s, 5 kg]]}}",
            1,
        );
    let m = run(&text, &MotionOptions::default());
    let back = first(&m, EventKind::StartsBack);
    assert_abs("starts back at the step, s", back.t, 5.0, 0.01);
}

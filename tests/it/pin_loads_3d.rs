//! Pin loads in 3-D (DESIGN.md §7, issue 11 item 5): where spans meet a sheave at fleet
//! angles, the journal takes only the pin load's part normal to the axle,
//! `(T_t − T_s) R = r_f |P − (P·n) n|`, and the axial part `P·n` is reported
//! (`axial_load_n`) and, with a `thrust` face, costs `μ r_eff |P·n|`. Checked against a
//! plain bisection written here on that formula, over the solver's own span
//! directions (the geometry has its own checks in `geometry.rs`).

use reeve::friction::sheave_ratio;
use reeve::math::Vector;
use reeve::model::LineId;

use crate::support::run::reeve_on;
use crate::support::{assert_rel, audit_ok, solve_text};

/// A skew-axle pair: a head sheave with a horizontal axle, and a second sheave whose
/// axle leans out of every coordinate plane, offset sideways, so the span between them
/// leaves both groove planes (fleet angles 0°, 9.1°, 17.1° and 2.8° at the four span
/// ends). `extra` is added to the second sheave's keys.
fn skew_pair(extra: &str) -> String {
    format!(
        "format: 1
title: skew pair (test)
units: {{length: m, force: N, mass: kg}}
ropes:
  r: {{diameter: 0.006, mu: 0.2}}
parts:
  w: {{kind: weight, at: [-0.05, 0, -1.5], mass: 20}}
  a: {{kind: sheave, at: [0, 0, 0], axle: [0, 1, 0], diameter: 0.094,
      bearing: {{kind: plain, pin_diameter: 0.012, mu: 0.15}}}}
  b: {{kind: sheave, at: [1.2, 0.25, 1.0], axle: [0.1, 1, 0.1], diameter: 0.054,
      bearing: {{kind: plain, pin_diameter: 0.010, mu: 0.15}}{extra}}}
  h: {{kind: haul, at: [1.3, 0.3, -0.2]}}
lines:
  l: {{rope: r, path: [w, a, b, h]}}
"
    )
}

/// Friction-circle radius `r sin(atan μ)` (DESIGN.md §1).
fn friction_circle(pin_diameter: f64, mu: f64) -> f64 {
    pin_diameter / 2.0 * mu.atan().sin()
}

/// The moment balance's misfit `(T_t − T_s) R − r_f |P_r| − a_t |P·n|` for the tight
/// side `tight` along `u_t` and slack side `slack` along `u_s` (both away from the
/// sheave), axle `n`.
fn misfit(
    (tight, u_t): (f64, Vector),
    (slack, u_s): (f64, Vector),
    n: Vector,
    (r, r_f, a_t): (f64, f64, f64),
) -> f64 {
    let p = tight * u_t + slack * u_s;
    let axial = p.dot(&n);
    (tight - slack) * r - r_f * (p - axial * n).norm() - a_t * axial.abs()
}

/// Plain bisection of an increasing function on `[lo, hi]`.
fn bisect(f: impl Fn(f64) -> f64, mut lo: f64, mut hi: f64) -> f64 {
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if f(mid) > 0.0 {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    0.5 * (lo + hi)
}

/// The haul force forward and back by walking the line from the weight with the
/// bisection above; `a_t` is the second sheave's thrust lever `μ_t r_eff`.
fn independent(text: &str, a_t: f64) -> (f64, f64) {
    let (rig, solution) = solve_text(text);
    let spans = &solution.geometry.lines[LineId::new(0)].spans;
    let u: Vec<Vector> = spans.iter().map(|s| s.direction.into_inner()).collect();
    let axle = |i: usize| match &rig.parts[rig.lines[LineId::new(0)].path[i].part].kind {
        reeve::model::PartKind::Sheave(s) => s.axle.into_inner(),
        _ => unreachable!(),
    };
    let rope = 0.006;
    let sheaves = [
        (1, (0.094 + rope) / 2.0, friction_circle(0.012, 0.15), 0.0),
        (2, (0.054 + rope) / 2.0, friction_circle(0.010, 0.15), a_t),
    ];
    let weight = 20.0 * 9.80665;
    // Forward: the haul pulls, the later span of each passage is tight.
    let mut forward = weight;
    for &(e, r, r_f, a_t) in &sheaves {
        let slack = forward;
        forward = bisect(
            |t| misfit((t, u[e]), (slack, -u[e - 1]), axle(e), (r, r_f, a_t)),
            slack,
            10.0 * slack,
        );
    }
    // Back: the weight runs the rope back, the earlier span is tight.
    let mut back = weight;
    for &(e, r, r_f, a_t) in &sheaves {
        let tight = back;
        back = bisect(
            |s| -misfit((tight, -u[e - 1]), (s, u[e]), axle(e), (r, r_f, a_t)),
            0.0,
            tight,
        );
    }
    (forward, back)
}

#[test]
fn skew_pair_matches_an_independent_solution_of_the_radial_journal_model() {
    let text = skew_pair("");
    let (rig, solution) = solve_text(&text);
    audit_ok(&solution);
    let main = solution.main();
    let (forward, back) = independent(&text, 0.0);
    assert_rel("haul forward", main.forward.value, forward, 1e-9);
    assert_rel("haul back", main.back.value, back, 1e-9);
    // The fleet angles are what the rig says (2° to 19° off the groove planes).
    let fleets: Vec<f64> = solution.geometry.lines[LineId::new(0)].entries[1..3]
        .iter()
        .flat_map(|e| [e.fleet_in.unwrap(), e.fleet_out.unwrap()])
        .map(f64::to_degrees)
        .collect();
    assert!(
        fleets[1] > 9.0 && fleets[2] > 17.0 && fleets[2] < 19.0 && fleets[3] > 2.0,
        "{fleets:?}"
    );
    // Today's planar model (the in-plane ratio of the wrap applied to the whole
    // tensions) asks about 0.1 % more: the journals carried the axial part too.
    let planar: f64 = [(1, 0.05, 0.012), (2, 0.03, 0.010)]
        .iter()
        .map(|&(e, r, pin)| {
            let wrap = solution.geometry.lines[LineId::new(0)].entries[e].wrap;
            sheave_ratio(friction_circle(pin, 0.15) / r, wrap)
        })
        .product::<f64>()
        * 20.0
        * 9.80665;
    let excess = planar / main.forward.value - 1.0;
    assert!(
        excess > 0.0008 && excess < 0.0015,
        "planar model asks {excess:e} more"
    );
    let _ = rig;
}

#[test]
fn axial_load_is_reported_and_a_thrust_face_costs_its_friction() {
    // No thrust face: the axial part is reported, signed along the axle, and equals
    // P·n from the span tensions (hand check: −T_ab u_ab·n + T_bh u_bh·n).
    let text = skew_pair("");
    let json = reeve_on(&text, &["check", "--json"]).expect_code(0).json();
    let b = &json["parts"].as_array().unwrap()[2];
    assert_eq!(b["name"], "b");
    let axial = b["axial_load_n"]["forward"].as_f64().unwrap();
    let (_, solution) = solve_text(&text);
    let g = &solution.geometry.lines[LineId::new(0)];
    let t = &solution.main().forward.tension[LineId::new(0)];
    let n = Vector::new(0.1, 1.0, 0.1).normalize();
    let expected = (-t[1] * g.spans[1].direction.into_inner()
        + t[2] * g.spans[2].direction.into_inner())
    .dot(&n);
    assert_rel("axial load on b", axial, expected, 1e-9);
    assert!(axial.abs() > 10.0, "{axial}");
    // A flat thrust collar of 20 mm, μ 0.1, new: a_t = 0.1 × (2/3) × 0.01 m.
    let thrust = skew_pair(", thrust: {diameter: 0.02, mu: 0.1, contact: new}");
    let (_, with) = solve_text(&thrust);
    audit_ok(&with);
    let a_t = 0.1 * 2.0 / 3.0 * 0.01;
    let (forward, back) = independent(&thrust, a_t);
    assert_rel(
        "haul forward with thrust",
        with.main().forward.value,
        forward,
        1e-9,
    );
    assert_rel("haul back with thrust", with.main().back.value, back, 1e-9);
    assert!(with.main().forward.value > solution.main().forward.value);
}

#[test]
fn a_planar_rig_reports_no_axial_load() {
    let (_, solution) = solve_text(crate::support::ONE_SHEAVE);
    audit_ok(&solution);
    let text = crate::support::ONE_SHEAVE;
    let json = reeve_on(text, &["check", "--json"]).expect_code(0).json();
    let s = &json["parts"].as_array().unwrap()[0];
    assert_eq!(s["name"], "s");
    assert_eq!(s["axial_load_n"]["forward"].as_f64(), Some(0.0));
    assert_eq!(json["loss"]["bending"]["forward"].as_f64(), Some(0.0));
}

#[test]
fn a_sheave_thrust_face_is_read_and_checked() {
    // A sheave's thrust face takes its axial load from the spans: no `load` needed, but
    // its `contact` is, as on a drum shaft; the error names the key and its line.
    let text = skew_pair(", thrust: {diameter: 0.02, mu: 0.1}");
    let (code, _, err) = reeve_on(&text, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains("parts.b.thrust") && err.contains("contact"),
        "{err}"
    );
    assert!(err.contains(":11:70:"), "located at the thrust face: {err}");
    // A preload is a force like a drum thrust's `load`.
    let text = skew_pair(", thrust: {diameter: 0.02, mu: 0.1, contact: worn, load: -5}");
    let (code, _, err) = reeve_on(&text, &["check"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(err.contains("parts.b.thrust.load"), "{err}");
}

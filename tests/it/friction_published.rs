//! Friction models checked against published worked examples and catalogue formulas.
//!
//! Each check names its source beside it. "From memory" marks a published value
//! recalled rather than looked up; "hand calculation" marks a value derived here, with
//! the arithmetic in a comment. Forces and lengths are used in the units of the
//! example where the relation is homogeneous (ratios, moment balances).

use std::f64::consts::PI;

use reeve::friction::capstan::{capstan_ratio, effective_mu, total_wrap};
use reeve::friction::journal::friction_circle_radius;
use reeve::friction::rated::{factor_from_efficiency, rho_from_factor};
use reeve::friction::rolling::{friction_moment, friction_radius};
use reeve::friction::thrust::{self, Pressure};
use reeve::friction::{
    moment_dissipation, sheave_ratio, slack_tension, tight_tension, BearingResistance,
};
use reeve::math::Vector;
use reeve::model::Bearing;
use reeve::solve::bearing::bearing_resistance;

use crate::support::assert_abs;

fn down() -> Vector {
    -Vector::y()
}

// ---------------------------------------------------------------------------------
// Friction circle: pulleys on fixed shafts
// ---------------------------------------------------------------------------------

/// Beer & Johnston, *Vector Mechanics for Engineers: Statics*, §8.7, Sample Problem 8.6
/// (from memory): a pulley of 4 in diameter turns on a fixed shaft of 2 in diameter,
/// μ_s = 0.20, load W = 500 lb. The book takes `r_f ≈ μ r = 0.20 in`. Answers recalled:
/// (a) vertical P to start raising 611 lb, (b) vertical P to hold 409 lb,
/// (c) horizontal P to start raising 576 lb.
#[test]
fn beer_johnston_sample_problem_pulley_on_fixed_shaft() {
    let (r_pitch, r_f, w) = (2.0, 0.20, 500.0);
    let zero = Vector::zeros();
    // (a) Both spans vertical, P the tight side.
    // Hand calculation: P (2 − 0.2) = 500 (2 + 0.2) → P = 611.11 lb.
    let p = tight_tension(w, &down(), &down(), &zero, r_f, r_pitch).unwrap();
    assert_abs("B&J SP 8.6(a) raise, vertical P", p, 611.0, 0.5);
    assert_abs("B&J SP 8.6(a) hand calculation", p, 500.0 * 2.2 / 1.8, 1e-9);
    // (b) Holding: the load's span is tight, P the slack side.
    // Hand calculation: P (2 + 0.2) = 500 (2 − 0.2) → P = 409.09 lb.
    let p = slack_tension(w, &down(), &down(), &zero, r_f, r_pitch).unwrap();
    assert_abs("B&J SP 8.6(b) hold, vertical P", p, 409.0, 0.5);
    assert_abs("B&J SP 8.6(b) hand calculation", p, 500.0 * 1.8 / 2.2, 1e-9);
    // (c) P horizontal, load hanging: the spans are 90° apart (wrap 90°).
    // Hand calculation (the book's construction): the resultant passes through the
    // spans' intersection at 2√2 in from the centre and touches the friction circle,
    // so its angle from the horizontal is 45° − asin(0.2/2√2) = 40.945°, and
    // P = W cot 40.945° = 576.30 lb.
    let horizontal = Vector::x();
    let p = tight_tension(w, &horizontal, &down(), &zero, r_f, r_pitch).unwrap();
    assert_abs("B&J SP 8.6(c) raise, horizontal P", p, 576.0, 0.5);
    let angle = PI / 4.0 - (0.2 / (2.0 * 2f64.sqrt())).asin();
    assert_abs("B&J SP 8.6(c) hand calculation", p, w / angle.tan(), 1e-9);
    // The exact friction circle r sin(atan μ) = 0.196 12 in differs from the book's
    // approximation by under 2 %, and lowers the raising force a little.
    let exact = friction_circle_radius(1.0, 0.20);
    assert_abs("r sin(atan 0.2)", exact, 0.196_116, 1e-6);
    let p_exact = tight_tension(w, &down(), &down(), &zero, exact, r_pitch).unwrap();
    assert!(
        p_exact < 611.2 && p_exact > 605.0,
        "exact-circle raise {p_exact}"
    );
}

/// Hibbeler, *Engineering Mechanics: Statics*, 14th ed., problem 8-120 (statement as
/// published, e.g. at studysoup.com): a 4 lb pulley of 1 ft diameter on a 1 in axle,
/// μ_k = 0.20, lifts a 20 lb block at constant velocity with a vertical P. The
/// pulley's weight is part of the pin load. Answer from memory: P = 20.7 lb.
#[test]
fn hibbeler_8_120_pulley_weight_in_the_pin_load() {
    let r_f = friction_circle_radius(0.5, 0.20); // in
    let weight = 4.0 * down();
    let p = tight_tension(20.0, &down(), &down(), &weight, r_f, 6.0).unwrap();
    assert_abs("Hibbeler 8-120 P", p, 20.7, 0.05);
    // Hand calculation: r_f = 0.5 × 0.2/√1.04 = 0.098 058 in;
    // (P − 20) 6 = r_f (P + 20 + 4) → P = (120 + 24 r_f)/(6 − r_f) = 20.7310 lb.
    assert_abs(
        "Hibbeler 8-120 hand calculation",
        p,
        (120.0 + 24.0 * r_f) / (6.0 - r_f),
        1e-9,
    );
    // Without its weight the pulley would need less: k(180°) × 20 lb.
    let light = tight_tension(20.0, &down(), &down(), &Vector::zeros(), r_f, 6.0).unwrap();
    assert_abs(
        "weightless pulley",
        light,
        20.0 * sheave_ratio(r_f / 6.0, PI),
        1e-9,
    );
    assert!(light < p);
}

/// A sheave with its own weight and spans that are neither parallel nor in line with
/// the weight, checked against two independent computations written out here: a
/// brute-force scan of the moment balance's residual and a contraction (fixed-point)
/// iteration. Hand-made case: R = 40 mm, r_f = 3 mm, wrap 120°, weight 15 N.
#[test]
fn sheave_weight_against_brute_force_scan() {
    let (r, r_f, slack) = (0.040, 0.003, 100.0);
    // Spans away from the sheave, 60° apart (wrap 120°), in the vertical x-y plane.
    let u_t = Vector::new(0.0, -1.0, 0.0);
    let u_s = Vector::new(60f64.to_radians().sin(), -60f64.to_radians().cos(), 0.0);
    let weight = Vector::new(0.0, -15.0, 0.0);
    let residual = |t: f64| (t - slack) * r - r_f * (t * u_t + slack * u_s + weight).norm();

    let solved = tight_tension(slack, &u_t, &u_s, &weight, r_f, r).unwrap();

    // Brute-force scan: step 1e-4 N from T_s upward, first sign change, then linear
    // interpolation inside that step.
    let step = 1e-4;
    let mut t = slack;
    let mut found = None;
    while t < 10.0 * slack {
        let (a, b) = (residual(t), residual(t + step));
        if a <= 0.0 && b > 0.0 {
            found = Some(t + step * (-a) / (b - a));
            break;
        }
        t += step;
    }
    let scanned = found.expect("the scan finds a sign change");
    assert_abs("tight tension vs brute-force scan", solved, scanned, 1e-6);

    // Fixed point T ← T_s + (r_f/R)|T u_t + c|: a contraction with factor r_f/R < 1.
    let mut t = slack;
    for _ in 0..200 {
        t = slack + r_f / r * (t * u_t + slack * u_s + weight).norm();
    }
    assert_abs("tight tension vs fixed-point iteration", solved, t, 1e-9);

    // The reverse case: the same sheave turning the other way.
    let back = slack_tension(solved, &u_t, &u_s, &weight, r_f, r).unwrap();
    assert_abs("slack tension inverts tight tension", back, slack, 1e-9);
}

// ---------------------------------------------------------------------------------
// Rated sheaves
// ---------------------------------------------------------------------------------

/// Bearing factor K = 1.09, the figure wire-rope handbooks give for plain bronze
/// bushings (common practice; e.g. the *Wire Rope Users Manual*, from memory).
#[test]
fn rated_sheave_k_1_09() {
    let rho = rho_from_factor(1.09);
    // Hand calculation: ρ = 0.09/2.09 = 0.043 062 2.
    assert_abs("rho from K = 1.09", rho, 0.043_062_2, 1e-7);
    // k(180°) gives back the rating: (1 + ρ)/(1 − ρ) = K (DESIGN.md §1).
    assert_abs("k(180°) = K", sheave_ratio(rho, PI), 1.09, 1e-12);
    assert_abs(
        "k(180°) closed form",
        sheave_ratio(rho, PI),
        (1.0 + rho) / (1.0 - rho),
        1e-12,
    );
    // Inverse symmetry: turning the other way divides by the same k at every wrap.
    for phi in [0.2, PI / 3.0, PI / 2.0, 2.0, PI, 4.5] {
        let k = sheave_ratio(rho, phi);
        let (u_t, u_s) = (
            Vector::new(0.0, -1.0, 0.0),
            Vector::new((PI - phi).sin(), -(PI - phi).cos(), 0.0),
        );
        let slack = slack_tension(1000.0, &u_t, &u_s, &Vector::zeros(), rho, 1.0).unwrap();
        assert_abs("k(φ) × (T_s/T_t) = 1", k * slack / 1000.0, 1.0, 1e-12);
        let tight = tight_tension(1000.0, &u_t, &u_s, &Vector::zeros(), rho, 1.0).unwrap();
        assert_abs("tight tension / slack = k(φ)", tight / 1000.0, k, 1e-12);
    }
    // Smaller wraps lose less: k rises monotonically with wrap up to 180°.
    assert!(sheave_ratio(rho, PI / 2.0) < sheave_ratio(rho, PI));
    // Efficiency 1/K: η = 0.917 431 → K = 1.09.
    assert_abs(
        "K from efficiency",
        factor_from_efficiency(1.0 / 1.09).unwrap(),
        1.09,
        1e-12,
    );
}

/// Wire-rope handbook reeving efficiency `E = (K^N − 1)/(K^S N (K − 1))` (DESIGN.md §1)
/// for N = 2 parts, S = 2 sheaves: chaining two rated sheaves at 180° must give the
/// same hauling pull `W/(N E)`.
#[test]
fn two_part_tackle_matches_reeving_efficiency() {
    let k = sheave_ratio(rho_from_factor(1.09), PI);
    // Dead end T0 on the fixed head, up through the block sheave (T1 = k T0) and over
    // the head sheave to the hauling part (P = k T1). Block: T0 + T1 = W.
    let w = 1000.0;
    let t0 = w / (1.0 + k);
    let pull = k * k * t0;
    let (n, s, kk) = (2.0_f64, 2.0_f64, 1.09_f64);
    let e = (kk.powf(n) - 1.0) / (kk.powf(s) * n * (kk - 1.0));
    // Hand calculation: E = (1.1881 − 1)/(1.1881 × 2 × 0.09) = 0.879 556;
    // W/(N E) = 568.469 N.
    assert_abs("reeving efficiency", e, 0.879_556, 1e-6);
    assert_abs("hauling pull vs handbook formula", pull, w / (n * e), 1e-9);
}

// ---------------------------------------------------------------------------------
// Capstan
// ---------------------------------------------------------------------------------

/// Hibbeler, *Engineering Mechanics: Statics*, §8.5, problem 8-83 (numbering varies by
/// edition; worked solution published at questionai.com): a 250 kg cylinder held by a
/// cord over a fixed pipe, μ_s = 0.2. Smallest F: (a) once over the pipe, β = 180°,
/// F = 1308.38 N; (b) β = 540°, F = 372.38 N (g = 9.81 m/s² as in the solution).
#[test]
fn hibbeler_cord_over_pipe() {
    let weight = 250.0 * 9.81;
    assert_abs(
        "Hibbeler 8-83(a)",
        weight / capstan_ratio(0.2, None, PI),
        1308.38,
        0.01,
    );
    let wrap = total_wrap(PI, 1);
    assert_abs(
        "Hibbeler 8-83(b)",
        weight / capstan_ratio(0.2, None, wrap),
        372.38,
        0.01,
    );
    // Largest F before the cylinder rises: hand calculation 2452.5 e^(0.2π) = 4597.10 N
    // and 2452.5 e^(0.6π) = 16 152.3 N.
    assert_abs(
        "largest F, 180°",
        weight * capstan_ratio(0.2, None, PI),
        4597.10,
        0.01,
    );
    assert_abs(
        "largest F, 540°",
        weight * capstan_ratio(0.2, None, wrap),
        16_152.3,
        0.1,
    );
}

/// Hibbeler, *Statics*, §8.5, problem 8-83 of a translated edition (worked solution
/// published at questionai.com): a 20 kg cylinder is just held by 25 N with the cord
/// 2.5 turns round a post; the solution finds μ = 0.131 and then, with the roles
/// swapped, P = 1535.91 N.
#[test]
fn hibbeler_two_and_a_half_turns() {
    let wrap = total_wrap(PI, 2);
    assert_abs("2.5 turns = 5π", wrap, 5.0 * PI, 1e-12);
    // μ = ln(196.2/25)/(5π) = 0.131 16.
    let mu = (20.0 * 9.81 / 25.0_f64).ln() / wrap;
    assert_abs("μ from holding force", mu, 0.131, 0.0005);
    // The solution carries the rounded μ = 0.131 into the second part.
    assert_abs(
        "P with μ = 0.131",
        20.0 * 9.81 * capstan_ratio(0.131, None, wrap),
        1535.91,
        0.01,
    );
}

/// pickedshares.com, *Engineering Mechanics 1*, exercise 27 "rope friction": 100 kg
/// lowered with the rope wrapped 3π/2 round a pole, μ = 0.2: F = 382.26 N
/// (g = 9.81 m/s²).
#[test]
fn pickedshares_rope_round_a_pole() {
    let f = 100.0 * 9.81 / capstan_ratio(0.2, None, 1.5 * PI);
    assert_abs("pickedshares ex. 27", f, 382.26, 0.01);
}

/// Beer & Johnston, *Statics*, problem 8.115 (brake drum; the published solution
/// manual's intermediate value): `e^(0.25 π) = 2.1933` for μ_k = 0.25 over 180°.
#[test]
fn beer_johnston_brake_band_ratio() {
    assert_abs(
        "B&J 8.115 ratio",
        capstan_ratio(0.25, None, PI),
        2.1933,
        1e-4,
    );
}

/// Several turns on a bollard: each extra turn multiplies the ratio by `e^(2π μ)`.
/// Hand calculation: μ = 0.35, 1.5 turns (3π): 50 lb × e^(1.05 π) = 1353.8 lb.
#[test]
fn turns_on_a_bollard() {
    let one_and_a_half = total_wrap(PI, 1);
    assert_abs(
        "1.5 turns, μ 0.35",
        50.0 * capstan_ratio(0.35, None, one_and_a_half),
        1353.83,
        0.01,
    );
    for turns in 0..5 {
        let with = capstan_ratio(0.35, None, total_wrap(PI, turns + 1));
        let without = capstan_ratio(0.35, None, total_wrap(PI, turns));
        assert_abs(
            "one more turn",
            with / without,
            (0.35 * 2.0 * PI).exp(),
            1e-9 * with,
        );
    }
}

/// V-groove wedge factor `μ' = μ / sin(β/2)`: Shigley's *Mechanical Engineering
/// Design*, V-belts (from memory), and the V-belt drive calculator at
/// tribology-abc.com ("effective friction coefficient μ' = μ/sin(β/2)").
#[test]
fn v_groove_wedge_factor() {
    // Hand calculation: a 60° groove doubles μ (sin 30° = 1/2).
    assert_abs(
        "60° groove",
        effective_mu(0.15, Some(60f64.to_radians())),
        0.30,
        1e-12,
    );
    // Hand calculation: 38° groove, μ = 0.25: 0.25/sin 19° = 0.767 888.
    let mu = effective_mu(0.25, Some(38f64.to_radians()));
    assert_abs("38° groove", mu, 0.767_888, 1e-6);
    // Over 180°: e^(0.767 888 π) = 11.170; a round groove gives e^(0.25π) = 2.193.
    let vee = capstan_ratio(0.25, Some(38f64.to_radians()), PI);
    assert_abs(
        "38° groove over 180°",
        vee,
        (0.767_888_371_7 * PI).exp(),
        1e-6,
    );
    assert!(vee > 5.0 * capstan_ratio(0.25, None, PI));
}

// ---------------------------------------------------------------------------------
// Thrust: collars, flat and conical pivots
// ---------------------------------------------------------------------------------

/// A thrust face: axial load, outer and inner diameter, μ, pressure, cone half-angle.
struct Face {
    load: f64,
    diameter: f64,
    inner_diameter: f64,
    mu: f64,
    pressure: Pressure,
    cone_angle: Option<f64>,
}

fn thrust(load: f64, d: f64, di: f64, mu: f64, pressure: Pressure, cone: Option<f64>) -> Face {
    Face {
        load,
        diameter: d,
        inner_diameter: di,
        mu,
        pressure,
        cone_angle: cone,
    }
}

fn effective_radius(face: &Face) -> f64 {
    thrust::effective_radius(face.diameter, face.inner_diameter, face.pressure)
}

fn moment(face: &Face) -> f64 {
    thrust::moment(face.load, face.mu, effective_radius(face), face.cone_angle)
}

/// Hibbeler, *Statics*, §8.6, eq. 8-7 `M = (2/3) μ P (R₂³ − R₁³)/(R₂² − R₁²)`; problem
/// worked at questionai.com (Hibbeler, chapter 8, exercise 107): collar of 150 mm and
/// 200 mm diameters, μ = 0.3, P = 5 kN: M = 132.14 N·m.
#[test]
fn hibbeler_collar_si() {
    let collar = thrust(5000.0, 0.200, 0.150, 0.3, Pressure::Uniform, None);
    assert_abs(
        "Hibbeler collar, uniform pressure",
        moment(&collar),
        132.14,
        0.01,
    );
}

/// Hibbeler, *Statics*, §8.6 (US edition, chapter 8, exercise 108, worked at
/// questionai.com): collar R₁ = 1 in, R₂ = 2 in, P = 800 lb, μ_s = 0.35. The posted
/// solution gives 435.5 and labels it lb·ft; with radii in inches it is lb·in (hand
/// calculation: (2/3)(0.35)(800)(7/3) = 435.56 lb·in).
#[test]
fn hibbeler_collar_us() {
    let collar = thrust(800.0, 4.0, 2.0, 0.35, Pressure::Uniform, None);
    assert_abs("Hibbeler collar, lb·in", moment(&collar), 435.5, 0.1);
}

/// Hibbeler, *Statics*, §8.6 (chapter 8, exercise 109, worked at questionai.com): an
/// 80 lb floor polisher on a 2 ft diameter disk, μ = 0.3, uniform pressure:
/// M = (2/3) μ P R = 16 lb·ft (the flat solid pivot, `Ri = 0`).
#[test]
fn hibbeler_floor_polisher_disk() {
    let disk = thrust(80.0, 2.0, 0.0, 0.3, Pressure::Uniform, None);
    assert_abs("disk friction moment", moment(&disk), 16.0, 1e-9);
    // Meriam & Kraige, *Statics*, disk friction (from memory): M = (2/3) μ P R.
    assert_abs(
        "solid pivot r_eff = 2R/3",
        effective_radius(&disk),
        2.0 / 3.0,
        1e-12,
    );
}

/// Conical pivot: *Theory of Machines*, Example 6.15 (statement as published at
/// mech.poriyaan.in; the page's numeric answers were not visible, so these are hand
/// calculations): pivot 150 mm diameter, cone angle 120° (α = 60°), W = 20 kN,
/// μ = 0.03, 200 rpm.
#[test]
fn conical_pivot_example() {
    let alpha = Some(60f64.to_radians());
    let omega = 200.0 * 2.0 * PI / 60.0; // 20.944 rad/s
                                         // Uniform pressure: T = (2/3) μ W R cosec α = (2/3)(0.03)(20 000)(0.075)/0.866 025
                                         // = 34.641 N·m; power = 34.641 × 20.944 = 725.52 W.
    let new = thrust(20e3, 0.150, 0.0, 0.03, Pressure::Uniform, alpha);
    assert_abs("cone, uniform pressure, torque", moment(&new), 34.641, 1e-3);
    assert_abs(
        "cone, uniform pressure, power",
        moment_dissipation(moment(&new), omega),
        725.52,
        0.01,
    );
    // Uniform wear: T = (1/2) μ W R cosec α = 25.981 N·m; power = 544.14 W.
    let worn = thrust(20e3, 0.150, 0.0, 0.03, Pressure::UniformWear, alpha);
    assert_abs("cone, uniform wear, torque", moment(&worn), 25.981, 1e-3);
    assert_abs(
        "cone, uniform wear, power",
        moment_dissipation(moment(&worn), omega),
        544.14,
        0.01,
    );
    // The same pivot made flat loses sin 60° less.
    let flat = thrust(20e3, 0.150, 0.0, 0.03, Pressure::Uniform, None);
    assert_abs(
        "flat vs cone",
        moment(&flat) / moment(&new),
        60f64.to_radians().sin(),
        1e-12,
    );
}

/// Multi-collar thrust bearing, *Theory of Machines* (Khurmi & Gupta), collar-bearing
/// example (statement as posted at justaaa.com; answer from memory: 7.5 kW): six
/// collars of 300 mm and 200 mm diameter, bearing pressure 0.4 N/mm², μ = 0.05,
/// 120 rpm, uniform pressure.
#[test]
fn helicopter_shaft_collars() {
    // Hand calculation: W = 6 × 0.4 × π/4 (300² − 200²) = 94 247.8 N;
    // r_eff = (2/3)(150³ − 100³)/(150² − 100²) = 126.667 mm;
    // T = 0.05 × 94 247.8 × 0.126 667 = 596.90 N·m; P = T × 4π = 7500.9 W.
    let load = 6.0 * 0.4e6 * PI / 4.0 * (0.300_f64.powi(2) - 0.200_f64.powi(2));
    let collars = thrust(load, 0.300, 0.200, 0.05, Pressure::Uniform, None);
    assert_abs("collar r_eff", effective_radius(&collars), 0.126_667, 1e-6);
    assert_abs("collar torque", moment(&collars), 596.90, 0.01);
    let power = moment_dissipation(moment(&collars), 120.0 * 2.0 * PI / 60.0);
    assert_abs("collar power, W", power, 7500.0, 10.0);
    // Uniform wear, same collars: r_eff = (150 + 100)/2 = 125 mm.
    let worn = thrust(load, 0.300, 0.200, 0.05, Pressure::UniformWear, None);
    assert_abs("worn collar r_eff", effective_radius(&worn), 0.125, 1e-12);
}

// ---------------------------------------------------------------------------------
// Rolling bearings
// ---------------------------------------------------------------------------------

/// SKF *Rolling bearings* catalogue, "Friction: estimating the frictional moment",
/// `M = 0.5 μ P d` with μ = 0.0015 for deep groove ball bearings (the catalogue's
/// table of constant coefficients; the Koyo catalogue gives 0.0010 – 0.0015).
#[test]
fn deep_groove_ball_bearing_catalogue_moment() {
    // Hand calculation: 0.5 × 0.0015 × 1000 N × 0.010 m = 0.0075 N·m.
    assert_abs(
        "M = 0.5 μ P d",
        friction_moment(0.010, 0.0015, 1000.0),
        0.0075,
        1e-15,
    );
    assert_abs(
        "r_f = μ d / 2",
        friction_radius(0.010, 0.0015),
        7.5e-6,
        1e-18,
    );
    // On the DESIGN.md example's block sheave (tread 60 mm, rope 6 mm → R = 33 mm):
    // ρ = 7.5e-6/0.033 = 2.2727e-4, k(180°) = (1 + ρ)/(1 − ρ) = 1.000 454 6.
    let bearing = Bearing::Rolling {
        bore: 0.010,
        mu: 0.0015,
    };
    let resistance = bearing_resistance(&bearing, false);
    assert_eq!(
        resistance,
        BearingResistance::FrictionCircle { radius: 7.5e-6 }
    );
    assert_abs(
        "rolling sheave k(180°)",
        sheave_ratio(resistance.rho(0.033), PI),
        1.000_454_6,
        1e-7,
    );
    // Its plain-bearing head sheave (10 mm pin, μ = 0.12): r_f = 0.595 73 mm,
    // ρ = 0.018 052, k(180°) = 1.036 768 (hand calculation).
    let plain = Bearing::Plain {
        pin_diameter: 0.010,
        mu: 0.12,
        mu_static: None,
    };
    let rho = bearing_resistance(&plain, false).rho(0.033);
    assert_abs(
        "plain sheave k(180°)",
        sheave_ratio(rho, PI),
        1.036_768,
        1e-6,
    );
}

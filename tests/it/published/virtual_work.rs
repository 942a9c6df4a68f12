//! Virtual work: slopes, oblique pulls, sub-rigs, no friction.

use super::*;

// ---------------------------------------------------------------------------------
// Virtual work: slopes, oblique pulls, sub-rigs, no friction.
// ---------------------------------------------------------------------------------

#[test]
fn cart_on_a_slope_pulled_horizontally() {
    // Guards virtual work for a block whose travel is at an angle to its rope and to
    // gravity.
    // Hand calculation (virtual work): P cos 30° = m g sin 30°, P = 100 g tan 30° =
    // 566.19 N; the cart moves 1/cos 30° = 1.1547 m per metre of rope.
    let (_, s) = solve_test_rig("review/slope-cart.yaml");
    let m = s.main();
    assert_rel(
        "ideal",
        m.ideal.value,
        100.0 * STANDARD_GRAVITY * (PI / 6.0).tan(),
        1e-9,
    );
    assert_rel(
        "velocity ratio",
        m.velocity_ratio.unwrap(),
        (PI / 6.0).cos(),
        1e-9,
    );
    audit_ok(&s);
}

#[test]
fn haul_pulled_off_its_rope_reports_the_component_along_pull() {
    // Guards present behaviour (a design question left open): a haul pulled off its rope
    // reports the component along `pull`.
    // Present behaviour, left to the lead as a design question: a haul whose `pull` is
    // 60° off its rope moves along `pull`, so the effort is the rope tension's component
    // along it (virtual work, hand calculation): T = 10 g = 98.07 N, effort
    // T cos 60° = 49.03 N, and the "mechanical advantage" is 2 with no tackle at all.
    let (_, s) = solve_test_rig("review/haul-oblique.yaml");
    let m = s.main();
    assert_rel("effort", m.ideal.value, 10.0 * STANDARD_GRAVITY * 0.5, 1e-9);
    assert_rel(
        "tension",
        m.ideal.tension[LineId::new(0)][0],
        10.0 * STANDARD_GRAVITY,
        1e-9,
    );
    assert_rel("MA", m.mechanical_advantage().unwrap(), 2.0, 1e-9);
}

#[test]
fn two_independent_sub_rigs_both_solved() {
    // Guards independent sub-rigs: each is solved with its own drive.
    // Capstan equation (Hibbeler §8.5), 180° wrap: line b (the drive) forward
    // 20 g e^{0.1π} = 268.53 N; line a forward 10 g e^{0.25π} = 215.09 N.
    let (rig, s) = solve_test_rig("review/two-subrigs.yaml");
    assert_eq!(s.subrigs.len(), 2);
    let b = &s.subrigs[0];
    assert_eq!(rig.parts[b.drive].name, "hand.b");
    assert_rel(
        "b forward",
        b.forward.value,
        20.0 * STANDARD_GRAVITY * (0.1 * PI).exp(),
        1e-6,
    );
    let a = &s.subrigs[1];
    assert_eq!(rig.parts[a.drive].name, "hand.a");
    assert_rel(
        "a forward",
        a.forward.value,
        10.0 * STANDARD_GRAVITY * (0.25 * PI).exp(),
        1e-6,
    );
    audit_ok(&s);
}

#[test]
fn frictionless_equals_ideal_exactly_in_odd_units() {
    // Guards zero friction in units other than SI: forward and back are the ideal to the
    // last bit.
    // μ = 0 everywhere: forward and back are the ideal to the last bit (DESIGN.md §3:
    // friction reverses between forward and back, and there is none). Hand calculation
    // (virtual work): 2:1 on (40 + 2) kg, falls vertical to 1e-9: 21 g = 205.94 N.
    let (_, s) = solve_test_rig("review/frictionless.yaml");
    let m = s.main();
    assert_eq!(m.forward.value, m.ideal.value);
    assert_eq!(m.back.value, m.ideal.value);
    assert_rel("ideal", m.ideal.value, 21.0 * STANDARD_GRAVITY, 1e-6);
    audit_ok(&s);
}

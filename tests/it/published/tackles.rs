//! Multi-part tackles against the wire-rope handbook reeving formula.

use super::*;

// ---------------------------------------------------------------------------------
// Multi-part tackles against the wire-rope handbook reeving formula.
// ---------------------------------------------------------------------------------

fn check_tackle(n: usize, lead: Lead, k: f64) {
    // Source: wire-rope handbook reeving formula (e.g. Wire Rope Users Manual, Wire Rope
    // Technical Board, "Efficiency of wire rope reeving"; from memory):
    // E = (K^N − 1)/(K^S·N·(K − 1)), hauling-part pull = W/(N·E), DESIGN.md §1.
    // Lowering (friction reversed) is the same formula with K → 1/K (hand derivation:
    // every passage ratio inverts).
    let w = 10_000.0;
    let (text, s_count) = tackle(n, lead, k, w);
    let expected_s = match lead {
        Lead::Fixed { extra } => n + extra,
        Lead::Moving => n - 1,
    };
    assert_eq!(
        s_count, expected_s,
        "tackle builder: S for N = {n}, {lead:?}"
    );
    let (_, sol) = solve_text(&text);
    let m = sol.main();
    let e = reeving_efficiency(k, n, s_count);
    let e_back = reeving_efficiency(1.0 / k, n, s_count);
    let what = format!("N = {n}, S = {s_count}, K = {k}, {lead:?}");
    assert_rel(
        &format!("{what}: ideal pull W/N"),
        m.ideal.value,
        w / n as f64,
        1e-9,
    );
    assert_rel(
        &format!("{what}: pull W/(N E)"),
        m.forward.value,
        w / (n as f64 * e),
        1e-9,
    );
    assert_rel(
        &format!("{what}: efficiency E"),
        m.forward_efficiency().unwrap(),
        e,
        1e-9,
    );
    assert_rel(
        &format!("{what}: lowering pull"),
        m.back.value,
        w / (n as f64 * e_back),
        1e-9,
    );
    assert_rel(
        &format!("{what}: velocity ratio"),
        m.velocity_ratio.unwrap(),
        n as f64,
        1e-9,
    );
    audit_ok(&sol);
}

#[test]
fn tackles_plain_bearings_k_1_09() {
    for n in 1..=8 {
        for extra in 0..=2 {
            check_tackle(n, Lead::Fixed { extra }, 1.09);
        }
    }
    for n in 2..=8 {
        check_tackle(n, Lead::Moving, 1.09);
    }
}

#[test]
fn tackles_roller_bearings_k_1_04() {
    for n in 1..=8 {
        for extra in 0..=2 {
            check_tackle(n, Lead::Fixed { extra }, 1.04);
        }
    }
    for n in 2..=8 {
        check_tackle(n, Lead::Moving, 1.04);
    }
}

#[test]
fn tackle_spot_values_by_hand() {
    // Hand calculation, N = 4, S = 4, K = 1.09: K⁴ = 1.411 582; E = 0.411 582/(1.411 582
    // · 4 · 0.09) = 0.809 94; pull = W/(4·0.809 94) = 0.308 66 W.
    let (text, _) = tackle(4, Lead::Fixed { extra: 0 }, 1.09, 1000.0);
    let (_, s) = solve_text(&text);
    assert_abs(
        "4-part K = 1.09, N, vs the hand calculation",
        s.main().forward.value,
        308.66,
        0.01,
    );
}

#[test]
fn oilfield_ten_line_fast_line_factor() {
    // Source: API RP 9B (wire rope: application, care and use), §2.3.3.4, fast-line
    // factor for block-and-tackle reeving (from memory): 10 lines strung,
    // roller-bearing sheaves K = 1.04, efficiency 0.811, fast-line factor 0.123 as
    // printed (its formula gives 0.123 29; fast-line tension = factor × hook load). The fast line leaves the crown (fixed)
    // block, the dead line is anchored: S = N = 10.
    // Hand calculation: 1.04¹⁰ = 1.480 244; E = 0.480 244/(1.480 244·10·0.04) = 0.811 09;
    // factor = 1/(10·0.811 09) = 0.123 29.
    let hook_load = 2.0e6; // N
    let (text, s_count) = tackle(10, Lead::Fixed { extra: 0 }, 1.04, hook_load);
    assert_eq!(s_count, 10);
    let (_, s) = solve_text(&text);
    let factor = s.main().forward.value / hook_load;
    assert_abs("fast-line factor vs the table", factor, 0.123, 5e-4);
    assert_rel(
        "fast-line factor vs hand calculation",
        factor,
        0.123_29,
        1e-4,
    );
    let e = s.main().forward_efficiency().unwrap();
    assert_abs("efficiency vs the table", e, 0.811, 5e-4);
}

//! Invariants of the rope as a material (DESIGN.md §7, issue 11 items 1–3) over the
//! random planar tackles of `properties.rs`: a very stiff, weightless rope gives
//! today's figures; with the rope's weight the energy audit balances, its potential
//! energy counted; stretch is never negative and halves when EA doubles. Sources: the
//! work–energy balance (Beer & Johnston, *Statics*, ch. 10) and Hooke's law for an
//! axial member (Gere & Goodno, *Mechanics of Materials*, §2.3).

use approx::relative_eq;
use proptest::prelude::*;
use reeve::solve::Case;

use crate::properties::{build, params_strategy};
use crate::support::solve_text;

/// The random rig's rope with the material keys added.
fn with_material(text: &str, keys: &str) -> String {
    let plain = "wire: {diameter: 0.01, mu: 0.15}";
    assert!(text.contains(plain), "the random rig's rope is `{plain}`");
    text.replace(
        plain,
        &format!("wire: {{diameter: 0.01, mu: 0.15, {keys}}}"),
    )
}

/// Every span's stretch per case, m, as the report gives it.
fn stretches(text: &str) -> Vec<[Option<f64>; 3]> {
    let (rig, s) = solve_text(text);
    let report = reeve::report::Report::build(&rig, &s, Vec::new());
    report
        .spans
        .iter()
        .map(|span| {
            let p = span
                .stretch_m
                .as_ref()
                .expect("a rope with stiffness has stretch");
            [p.ideal, p.forward, p.back]
        })
        .collect()
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, failure_persistence: None, .. ProptestConfig::default() })]

    /// With `stiffness` very large and `mass_per_length` zero every figure equals
    /// today's (DESIGN.md §7: a rig without them gives exactly today's figures). The
    /// random tackles are statically determinate, so the stiffness split does not
    /// apply; the lost travel goes to zero with 1/EA.
    #[test]
    fn stiff_weightless_rope_is_todays_rope(p in params_strategy(true), load_unknown in any::<bool>()) {
        let mut p = p;
        p.load_unknown = load_unknown;
        let text = build(&p).0.plain();
        let stiff = with_material(&text, "stiffness: 1e11 N, mass_per_length: 0");
        let (_, a) = solve_text(&text);
        let (_, b) = solve_text(&stiff);
        let close = |x: f64, y: f64| relative_eq!(x, y, epsilon = 1e-9, max_relative = 1e-12);
        for (sa, sb) in a.subrigs.iter().zip(&b.subrigs) {
            for case in [Case::Ideal, Case::Forward, Case::Back] {
                let (ca, cb) = (sa.case(case), sb.case(case));
                prop_assert!(close(ca.value, cb.value), "{}: {} vs {}\n{}", case.name(), ca.value, cb.value, stiff);
                for (ta, tb) in ca.tension.iter().flatten().zip(cb.tension.iter().flatten()) {
                    prop_assert!(close(*ta, *tb), "{}: tension {} vs {}", case.name(), ta, tb);
                }
                prop_assert_eq!(&cb.tension, &cb.tension_end);
                for (la, lb) in ca.loss.iter().zip(&cb.loss) {
                    prop_assert!(close(*la, *lb), "{}: loss {} vs {}", case.name(), la, lb);
                }
                for (pa, pb) in ca.pin_load.iter().zip(&cb.pin_load) {
                    if let (Some(pa), Some(pb)) = (pa, pb) {
                        prop_assert!((pa - pb).norm() <= 1e-9 * (1.0 + pa.norm()), "{}: pin {} vs {}", case.name(), pa, pb);
                    }
                }
                prop_assert_eq!(cb.rope_power, 0.0);
            }
            prop_assert!(sa.lost_travel.is_none() && sa.drive_stiffness.is_none());
            let travel = sb.lost_travel.unwrap_or(0.0);
            prop_assert!(travel < 1e-4, "lost travel {} at EA = 1e11 N", travel);
        }
    }

    /// The energy audit balances with the rope's weight, its potential energy counted:
    /// drive power = load power + losses + the rope's potential-energy rate (the
    /// work–energy balance, e.g. Beer & Johnston, *Statics*, ch. 10, potential energy).
    #[test]
    fn energy_audit_balances_with_rope_weight(p in params_strategy(true), w in 0.05..3.0f64) {
        let text = with_material(&build(&p).0.plain(), &format!("mass_per_length: {w:?} kg/m"));
        let (_, s) = solve_text(&text);
        // A rope heavy against its load can need a negative tension somewhere (a span
        // hanging slack): `check` fails that rig (`slack-span`) and its figures do not
        // hold, so the balance is asked of the rigs whose ropes stay taut.
        let taut = s.subrigs.iter().all(|sub| {
            [&sub.ideal, &sub.forward, &sub.back].iter().all(|c| {
                c.tension.iter().flatten().chain(c.tension_end.iter().flatten()).all(|t| *t >= 0.0)
            })
        });
        prop_assume!(taut);
        for sub in &s.subrigs {
            for case in [&sub.ideal, &sub.forward, &sub.back] {
                let loss: f64 = case.loss.iter().sum();
                let load: f64 = case.load_power.iter().sum();
                prop_assert!(case.audit_residual < 1e-9, "{}: audit residual {}\n{}", case.case.name(), case.audit_residual, text);
                prop_assert!(relative_eq!(case.drive_power, load + loss + case.rope_power, epsilon = 1e-12, max_relative = 1e-9),
                    "{}: drive {} vs load {} + loss {} + rope {}", case.case.name(), case.drive_power, load, loss, case.rope_power);
                for (part, l) in case.loss.iter().enumerate() {
                    prop_assert!(*l >= -1e-9 * case.drive_power.abs(), "{}: negative loss {} at part {}", case.case.name(), l, part);
                }
            }
        }
    }

    /// Stretch is never negative, and doubling EA halves every stretch (Hooke's law,
    /// δ = T·L/EA: Gere & Goodno, *Mechanics of Materials*, §2.3), with and without
    /// the rope's weight.
    #[test]
    fn stretch_is_positive_and_halves_with_double_stiffness(p in params_strategy(true), ea in 1e4..1e8f64, w in 0.0..2.0f64) {
        let text = build(&p).0.plain();
        let one = stretches(&with_material(&text, &format!("stiffness: {ea:?} N, mass_per_length: {w:?}")));
        let two = stretches(&with_material(&text, &format!("stiffness: {:?} N, mass_per_length: {w:?}", 2.0 * ea)));
        for (a, b) in one.iter().zip(&two) {
            for (x, y) in a.iter().zip(b) {
                let (x, y) = (x.expect("stretch"), y.expect("stretch"));
                prop_assert!(x >= 0.0 && y >= 0.0, "negative stretch {} {}", x, y);
                prop_assert!(relative_eq!(x, 2.0 * y, epsilon = 1e-15, max_relative = 1e-9), "EA {}: {} vs 2 × {}", ea, x, y);
            }
        }
    }
}

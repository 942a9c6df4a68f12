//! Invariants of the rope's bending loss and of the 3-D sheave model (DESIGN.md §7,
//! issue 11 items 4 and 5) over the random planar tackles of `properties.rs`:
//! `bend_loss: 0` changes no figure at all; with a bend loss the energy audit still
//! balances, its losses by kind add up part by part, and friction never helps the
//! drive; and the 3-D solve of a sheave (forced by a frictionless thrust face) gives
//! the planar closed form's figures on a planar rig. Source of the invariants: the
//! work–energy balance (Beer & Johnston, *Statics*, ch. 10) and DESIGN.md §§3, 7.

use approx::relative_eq;
use proptest::prelude::*;
use reeve::model::PartId;
use reeve::solve::{CaseResult, Status};

use crate::properties::{build, params_strategy};
use crate::support::solve_text;

/// The random rig's text with the rope's keys extended by `extra`.
fn with_rope(text: &str, extra: &str) -> String {
    let rope = "wire: {diameter: 0.01, mu: 0.15}";
    assert!(
        text.contains(rope),
        "the generator's rope line changed:\n{text}"
    );
    text.replace(rope, &format!("wire: {{diameter: 0.01, mu: 0.15{extra}}}"))
}

fn cases(s: &reeve::solve::Solution) -> Vec<&CaseResult> {
    s.subrigs
        .iter()
        .flat_map(|sub| [&sub.ideal, &sub.forward, &sub.back])
        .collect()
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 32, failure_persistence: None, .. ProptestConfig::default() })]

    /// `bend_loss: 0` written out gives every figure bit for bit as without the key.
    #[test]
    fn zero_bend_loss_changes_nothing(p in params_strategy(true)) {
        let text = build(&p).0.plain();
        let (_, plain) = solve_text(&text);
        let zero = with_rope(&text, ", bend_loss: 0");
        let (_, written) = solve_text(&zero);
        for (a, b) in cases(&plain).into_iter().zip(cases(&written)) {
            prop_assert_eq!(a.value.to_bits(), b.value.to_bits(), "{}\n{}", a.case.name(), text);
            prop_assert_eq!(&a.tension, &b.tension);
            prop_assert_eq!(&a.loss, &b.loss);
            prop_assert_eq!(&a.pin_load, &b.pin_load);
            prop_assert!(b.losses.bending.iter().all(|x| *x == 0.0));
        }
    }

    /// With a bend loss the audit balances, the fixed point settles, the losses by
    /// kind add up to each part's loss and none is negative, and friction never helps
    /// the drive (forward ≥ ideal ≥ back for a drive unknown, the reverse for a load).
    #[test]
    fn bending_keeps_the_audit_and_never_helps(
        p in params_strategy(true), beta in 0.0f64..0.3, load_unknown in any::<bool>(),
    ) {
        let mut p = p;
        p.load_unknown = load_unknown;
        let text = with_rope(&build(&p).0.plain(), &format!(", bend_loss: {beta:?}"));
        let (_, s) = solve_text(&text);
        for case in cases(&s) {
            prop_assert!(case.audit_residual < 1e-9, "{}: audit {}\n{}", case.case.name(), case.audit_residual, text);
            prop_assert!(matches!(case.status, Status::Converged { .. }), "{:?}\n{}", case.status, text);
            let k = &case.losses;
            let scale = 1e-9 * case.drive_power.abs().max(1e-300);
            for part in (0..case.loss.len()).map(PartId::new) {
                let sum = k.bearing[part] + k.bending[part] + k.surface[part] + k.drum[part];
                prop_assert!((sum - case.loss[part]).abs() <= scale, "part {}: {} vs {}\n{}", part.index(), sum, case.loss[part], text);
                prop_assert!(k.bending[part] >= 0.0 && k.bearing[part] >= -scale, "part {}\n{}", part.index(), text);
            }
        }
        let m = s.main();
        let (i, f, b) = (m.ideal.value, m.forward.value, m.back.value);
        let slack = 1e-12 * i.abs();
        if load_unknown {
            prop_assert!(f <= i + slack && i <= b + slack, "load unknown: {} {} {}\n{}", f, i, b, text);
        } else {
            prop_assert!(f >= i - slack && i >= b - slack, "drive unknown: {} {} {}\n{}", f, i, b, text);
        }
    }

    /// A frictionless thrust face sends every sheave through the 3-D balance (radial
    /// journal load about the axle); on these planar rigs that must give the planar
    /// closed form's figures.
    #[test]
    fn the_3d_balance_agrees_with_the_planar_one_on_planar_rigs(p in params_strategy(true)) {
        let text = build(&p).0.plain();
        prop_assume!(text.contains("kind: sheave"));
        let (_, planar) = solve_text(&text);
        let thrust = text.replace("kind: sheave,", "kind: sheave, thrust: {diameter: 0.01, mu: 0.0, contact: new},");
        let (_, three_d) = solve_text(&thrust);
        for (a, b) in cases(&planar).into_iter().zip(cases(&three_d)) {
            prop_assert!(relative_eq!(a.value, b.value, epsilon = 1e-12, max_relative = 1e-9),
                "{}: planar {} vs 3-D {}\n{}", a.case.name(), a.value, b.value, text);
        }
    }
}

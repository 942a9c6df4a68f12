//! Friction coefficients that load fine (0 or more) but are far above anything a
//! bearing, a groove or a rope on a guide shows, such as `mu: 50` where `0.5` was meant
//! or a percentage written for a fraction: every figure that follows reads clean, so
//! each is flagged by a warning (not a failure: the figures stand as computed).
//!
//! Limits and their basis:
//! - Sliding coefficients (a rope's `mu`, a sheave's, guide's or drum's `mu`, a plain
//!   bearing's `mu` and `mu_static`, a thrust face's `mu`) above [`SLIDING_MU_LIMIT`]
//!   (1): the friction tables of Marks' *Standard Handbook for Mechanical Engineers*
//!   (section 3.2, "Friction"; from memory) give dry metal on metal, fibre and wire rope
//!   on wood or steel, and dry bushings mostly between about 0.1 and 0.8; only a few
//!   clean, dry pairs (and rubber) reach about 1. Above 1 is common practice's sign of a
//!   mistyped value.
//! - A rolling bearing's `mu` above [`ROLLING_MU_LIMIT`] (0.05): ball and roller
//!   bearings run at about 0.001 to 0.005 referred to the bore (common practice); ten
//!   times the top of that is no rolling bearing.

use super::{warn, Warning};
use crate::math::Real;
use crate::model::{Bearing, PartKind, Rig, Thrust};
use crate::units::significant;

/// Sliding friction coefficient above which a value is flagged (see the module notes).
pub const SLIDING_MU_LIMIT: Real = 1.0;
/// Rolling-bearing friction coefficient above which a value is flagged.
pub const ROLLING_MU_LIMIT: Real = 0.05;

/// Friction coefficients far above what the part they describe shows.
pub fn friction_checks(rig: &Rig) -> Vec<Warning> {
    let mut out = Vec::new();
    let mut flag = |part: Option<&str>, key: String, mu: Real, limit: Real, what: &str| {
        if mu > limit {
            out.push(warn(
                "implausible-mu",
                part,
                false,
                format!(
                    "`{key}` {} is far above the friction coefficient of any {what} (at most about {limit}); check the value (0.5, not 50; a fraction, not a percentage)",
                    significant(mu, 3),
                ),
            ));
        }
    };
    for rope in &rig.ropes {
        let key = format!("ropes.{}.mu", rope.name);
        flag(None, key, rope.mu, SLIDING_MU_LIMIT, "rope on a surface");
    }
    for part in &rig.parts {
        let name = part.name.as_str();
        let at = |key: &str| format!("parts.{name}.{key}");
        if let Some(mu) = part.kind.round().and_then(|r| r.mu) {
            flag(
                Some(name),
                at("mu"),
                mu,
                SLIDING_MU_LIMIT,
                "rope on a surface",
            );
        }
        let (bearing, thrust, bearing_key, thrust_key) = match &part.kind {
            PartKind::Sheave(s) => (Some(&s.bearing), s.thrust.as_ref(), "bearing", "thrust"),
            PartKind::Drum(d) => (
                d.shaft.as_ref().map(|s| &s.bearing),
                d.shaft.as_ref().and_then(|s| s.thrust.as_ref()),
                "shaft.bearing",
                "shaft.thrust",
            ),
            _ => (None, None, "", ""),
        };
        match bearing {
            Some(&Bearing::Plain { mu, mu_static, .. }) => {
                let what = "plain bearing";
                flag(
                    Some(name),
                    at(&format!("{bearing_key}.mu")),
                    mu,
                    SLIDING_MU_LIMIT,
                    what,
                );
                if let Some(s) = mu_static {
                    let key = at(&format!("{bearing_key}.mu_static"));
                    flag(Some(name), key, s, SLIDING_MU_LIMIT, what);
                }
            }
            Some(&Bearing::Rolling { mu, .. }) => {
                let key = at(&format!("{bearing_key}.mu"));
                flag(Some(name), key, mu, ROLLING_MU_LIMIT, "rolling bearing");
            }
            _ => {}
        }
        if let Some(&Thrust { mu, .. }) = thrust {
            let key = at(&format!("{thrust_key}.mu"));
            flag(Some(name), key, mu, SLIDING_MU_LIMIT, "thrust face");
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn codes(bearing: &str, rope_mu: &str) -> Vec<String> {
        let text = format!(
            "format: 1\nunits: {{length: mm, force: N, mass: kg}}\nropes:\n  r: {{diameter: 6, mu: {rope_mu}}}\nparts:\n  head: {{kind: sheave, at: [100, 0, 1000], axle: [0, 1, 0], diameter: 60, bearing: {bearing}}}\n  w: {{kind: weight, at: [130, 0, 0], mass: 5}}\n  hand: {{kind: haul, at: [-30, 0, 0]}}\nlines:\n  l: {{rope: r, path: [hand, head, w]}}\n"
        );
        let rig = crate::rig::load_str(&text, "probe").unwrap_or_else(|e| panic!("{e}"));
        friction_checks(&rig)
            .into_iter()
            .map(|w| w.message)
            .collect()
    }

    #[test]
    fn only_coefficients_above_their_bound_are_flagged() {
        // At the bounds: quiet.
        assert!(codes("{kind: plain, pin_diameter: 10, mu: 1, mu_static: 1}", "1").is_empty());
        assert!(codes("{kind: rolling, bore: 10, mu: 0.05}", "0.2").is_empty());
        let plain = codes(
            "{kind: plain, pin_diameter: 10, mu: 50, mu_static: 60}",
            "12",
        );
        assert_eq!(plain.len(), 3, "{plain:?}");
        assert!(
            plain[0].starts_with("`ropes.r.mu` 12.0 is far above"),
            "{plain:?}"
        );
        assert!(
            plain[1].starts_with("`parts.head.bearing.mu` 50.0 "),
            "{plain:?}"
        );
        assert!(plain[2].contains("mu_static` 60.0 "), "{plain:?}");
        let rolling = codes("{kind: rolling, bore: 10, mu: 0.2}", "0.2");
        assert_eq!(rolling.len(), 1, "{rolling:?}");
        assert!(rolling[0].contains("rolling bearing"), "{rolling:?}");
    }
}

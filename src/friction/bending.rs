//! Bending loss: what the rope's own stiffness costs at each passage over a turning
//! sheave or drum, as a fraction of tension.
//!
//! A rope that runs onto a sheave is bent from straight to the sheave's curvature, and
//! straightened again where it runs off. Internal friction between its wires, strands
//! or fibres makes both changes of curvature cost work, and the rope arrives at the
//! slack side with less tension than the bearing alone would leave. The loss happens
//! where the curvature *changes*, once on and once off, so it does not depend on how
//! far the rope wraps (a constantly curved stretch dissipates no more than a straight
//! one).
//!
//! # Model
//! With the rope running from the tight side to the slack side (the bearing model
//! alone would leave `T_b` on the slack side):
//! `T_slack = (1 − β) T_b`, `β` = the rope's `bend_loss`, `0 ≤ β < 1`
//! (DESIGN.md §7). With a frictionless bearing the ratio is `1/(1 − β)` at every wrap.
//! Over a passage the rope loses `β T_b` of tension; per unit rope speed that is the
//! power `β T_b = β/(1 − β) · T_slack` ([`bending_power`]).
//!
//! # Source
//! - Wire rope: K. Feyrer, *Wire Ropes: Tension, Endurance, Reliability*, 2nd ed.,
//!   Springer 2015, on the efficiency of rope sheaves: the loss of rope force over a
//!   sheave has a part from bending the rope at the run-on and run-off points and a part
//!   from the bearing; handbooks take about 2 % per wire-rope sheave in all (from
//!   memory; the section number is not checked here).
//! - Rope rescue: T. Pöysti, "Line deviation and pulley efficiency" (2020, parts I and
//!   II, kiipeilytuomas.fi): one 180° deviation over a pulley against two 90°
//!   deviations over the same pulleys; the article argues that the rope's internal loss
//!   comes from the change of curvature at entry and exit, independent of the wrap.
//!   The check figures (84.2 % for one 180° deflection, 74.7 % for two 90°) are the
//!   ones given in the project's issue; the stored copy of the article does not show
//!   its table, so they are not confirmed from it.

use crate::math::Real;

/// The factor `1 − β` that the bending loss leaves of the slack-side tension.
///
/// # Formula
/// `T_slack = (1 − β) T_b` (module doc).
///
/// # Arguments
/// - `bend_loss`: `β`, `0 ≤ β < 1` (validated at load; NaN or out of range counts as
///   the nearest valid value in release builds, `debug_assert!`ed).
///
/// # Returns
/// `1 − β`, in `(0, 1]`.
///
/// # Example
/// `β = 0.05` over a frictionless sheave, at any wrap: `T_t/T_s = 1/0.95 = 1.052 63`.
/// ```
/// use reeve::friction::bending::slack_factor;
/// assert!((1.0 / slack_factor(0.05) - 1.052_63).abs() < 1e-5);
/// ```
///
/// # Source
/// As the module.
pub fn slack_factor(bend_loss: Real) -> Real {
    debug_assert!(
        (0.0..1.0).contains(&bend_loss),
        "bend_loss must be in [0, 1), got {bend_loss}"
    );
    let beta = if bend_loss.is_nan() {
        0.0
    } else {
        bend_loss.clamp(0.0, 1.0 - Real::EPSILON)
    };
    1.0 - beta
}

/// Power lost to bending over one passage per unit rope speed, W per m/s (= N).
///
/// # Formula
/// `β T_b = β/(1 − β) · T_slack`.
///
/// # Arguments
/// - `bend_loss`: `β`, as [`slack_factor`].
/// - `slack`: the slack-side tension, N (a negative one counts as 0).
///
/// # Returns
/// The lost power per unit rope speed, `≥ 0`.
///
/// # Example
/// `β = 0.05`, 95 N on the slack side: the bearing alone would have left 100 N, so 5 N.
/// ```
/// use reeve::friction::bending::bending_power;
/// assert!((bending_power(0.05, 95.0) - 5.0).abs() < 1e-12);
/// ```
///
/// # Source
/// As the module.
pub fn bending_power(bend_loss: Real, slack: Real) -> Real {
    let keep = slack_factor(bend_loss);
    (1.0 - keep) / keep * slack.max(0.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn no_bend_loss_changes_nothing() {
        assert_eq!(slack_factor(0.0), 1.0);
        assert_eq!(bending_power(0.0, 123.0), 0.0);
        assert_eq!(bending_power(0.1, -5.0), 0.0);
    }
}

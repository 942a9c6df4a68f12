//! Rolling-element bearings: the constant-coefficient catalogue model.
//!
//! Rolling-bearing makers' general catalogues give a quick estimate of the running friction moment for a bearing
//! under moderate load, good lubrication and normal speed: `M = μ · F · d / 2`, with
//! `d` the bore and `μ` a constant per bearing type. Seen from the sheave, that is a
//! friction circle of radius `μ d / 2`, used exactly like a plain bearing's.
//!
//! Typical coefficients for open (unsealed) bearings, as the makers' catalogues tabulate
//! them (their friction sections, constant coefficient of friction by bearing type) and
//! bearing-design texts reproduce them (Harnoy, *Bearing Design in Machinery*, chapter on
//! rolling-element bearings; from memory):
//!
//! | bearing type | μ |
//! |---|---|
//! | deep groove ball | 0.0010 – 0.0015 |
//! | angular contact ball, single row | 0.0012 – 0.0020 |
//! | self-aligning ball | 0.0008 – 0.0012 |
//! | cylindrical roller with cage | 0.0008 – 0.0012 |
//! | needle roller with cage | 0.0020 – 0.0030 |
//! | tapered roller | 0.0017 – 0.0025 |
//! | spherical roller | 0.0018 – 0.0025 |
//! | thrust ball | 0.0010 – 0.0015 |
//!
//! Contact seals, heavy grease and start-up add to these (catalogues quote start-up
//! friction up to about twice the running value); a plain bearing, for comparison,
//! runs at 0.01 – 0.02 when well lubricated (same tables).

use crate::math::Real;

/// Friction radius of a rolling bearing: the lever arm of the pin load in the
/// catalogue friction moment.
///
/// # Formula
/// `M = μ · F · d / 2`, so `r_f = μ · d / 2`.
///
/// # Arguments
/// - `bore`: bearing bore (shaft) diameter `d`, m, `d ≥ 0`.
/// - `mu`: the catalogue's constant coefficient of friction, `μ ≥ 0`
///   (typically 0.001 – 0.005, see the module table).
///
/// Ranges are checked when the rig is loaded and `debug_assert!`ed here; in release
/// builds a negative or NaN input counts as 0.
///
/// # Returns
/// `r_f`, m.
///
/// # Example
/// A deep-groove ball bearing of 10 mm bore with μ = 0.0015:
/// `r_f = 0.0015 × 10 mm / 2 = 0.0075 mm`.
/// ```
/// use reeve::friction::rolling::friction_radius;
/// let r_f = friction_radius(0.010, 0.0015);
/// assert!((r_f - 7.5e-6).abs() < 1e-15);
/// ```
///
/// # Source
/// Rolling-bearing makers' general catalogues, friction sections: `M = 0.5 μ P d` with a
/// constant coefficient per bearing type; as in Harnoy, *Bearing Design in Machinery*,
/// rolling-element bearings chapter (from memory). `tests/it/friction_published.rs` checks
/// the catalogue table it names.
pub fn friction_radius(bore: Real, mu: Real) -> Real {
    debug_assert!(bore >= 0.0, "bore must be ≥ 0, got {bore}");
    debug_assert!(mu >= 0.0, "coefficient of friction must be ≥ 0, got {mu}");
    mu.max(0.0) * bore.max(0.0) / 2.0
}

/// Friction moment of a rolling bearing under a radial load, N·m.
///
/// # Formula
/// `M = μ · F · d / 2`.
///
/// # Arguments
/// - `bore`: bore diameter `d`, m, `≥ 0`.
/// - `mu`: catalogue coefficient, `≥ 0`.
/// - `load`: magnitude of the bearing load `F`, N, `≥ 0`.
///
/// # Returns
/// `M`, N·m.
///
/// # Example
/// Deep-groove ball bearing, 10 mm bore, μ = 0.0015, 1 kN radial load:
/// `M = 0.0015 × 1000 N × 0.010 m / 2 = 0.0075 N·m`.
/// ```
/// use reeve::friction::rolling::friction_moment;
/// assert!((friction_moment(0.010, 0.0015, 1000.0) - 0.0075).abs() < 1e-15);
/// ```
///
/// # Source
/// As [`friction_radius`].
pub fn friction_moment(bore: Real, mu: Real, load: Real) -> Real {
    debug_assert!(load >= 0.0, "bearing load must be ≥ 0, got {load}");
    friction_radius(bore, mu) * load.max(0.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn catalogue_formula() {
        // Hand calculation: 0.002 × 2000 N × 0.025 m / 2 = 0.05 N·m.
        assert!((friction_moment(0.025, 0.002, 2000.0) - 0.05).abs() < 1e-15);
        assert_eq!(friction_radius(0.0, 0.0015), 0.0);
        assert_eq!(friction_radius(0.01, 0.0), 0.0);
    }
}

//! File keys to model-level parameters ([`crate::model::param`]): `parts.P.bearing.factor`,
//! `parts.P.bearing.mu`, `ropes.R.mu`, `parts.P.load.mass` and `parts.P.load.force`,
//! resolved once against a loaded rig, with the written value's unit converted to SI
//! exactly as the loader converts it. Any other key (or one whose part does not hold
//! that value) resolves to None: the study then applies it on the parsed file.

use crate::model::param::Param;
pub use crate::model::param::Resolved;
use crate::model::Rig;
use crate::units::Dimension;

/// Resolves `key` (written with `unit`, empty for a bare number) against `rig`.
pub fn resolve(rig: &Rig, key: &str, unit: &str) -> Option<Resolved> {
    let part = |suffix: &str| {
        let name = key.strip_prefix("parts.")?.strip_suffix(suffix)?;
        rig.part_named(name)
    };
    let (param, dimension) = if let Some(p) = part(".bearing.factor") {
        (Param::RatedFactor(p), None)
    } else if let Some(p) = part(".bearing.mu") {
        (Param::BearingMu(p), None)
    } else if let Some(p) = part(".load.mass") {
        (Param::LoadMass(p), Some(Dimension::Mass))
    } else if let Some(p) = part(".load.force") {
        (Param::LoadForce(p), Some(Dimension::Force))
    } else {
        let name = key.strip_prefix("ropes.")?.strip_suffix(".mu")?;
        let r = rig.ropes.position(|r| r.name == name)?;
        (Param::RopeMu(r), None)
    };
    Some(Resolved::new(param, dimension, unit))
}

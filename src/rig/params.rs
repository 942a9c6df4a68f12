//! File keys to model-level parameters ([`crate::model::param`]): `parts.P.bearing.factor`,
//! `parts.P.bearing.mu`, `ropes.R.mu`, `parts.P.load.mass` and `parts.P.load.force`,
//! resolved once against a loaded rig, with the written value's unit converted to SI
//! exactly as the loader converts it. Any other key (or one whose part does not hold
//! that value) resolves to None: the study then applies it on the parsed file.

use crate::math::Real;
use crate::model::param::Param;
use crate::model::Rig;
use crate::units::{parse_quantity, Dimension};

/// A file key resolved against a rig: the parameter and how a written value becomes SI.
#[derive(Debug, Clone, PartialEq)]
pub struct Resolved {
    /// The model value the key sets.
    pub param: Param,
    dimension: Option<Dimension>,
    unit: String,
}

impl Resolved {
    /// The SI value of `value` written in this key's unit (None when it does not read
    /// as the loader would read it: the caller takes the file path).
    pub fn si(&self, rig: &Rig, value: Real) -> Option<Real> {
        match self.dimension {
            None if self.unit.is_empty() => Some(value),
            None => None,
            Some(d) if self.unit.is_empty() => Some(value * rig.units.unit(d).si),
            Some(d) => parse_quantity(&format!("{value} {}", self.unit), d, rig.units.unit(d)).ok(),
        }
    }
}

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
    Some(Resolved {
        param,
        dimension,
        unit: unit.to_string(),
    })
}

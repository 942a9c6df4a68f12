//! File keys to model-level parameters ([`crate::model::param`]): `parts.P.bearing.factor`,
//! `parts.P.bearing.mu`, `ropes.R.mu`, `parts.P.load.mass` and `parts.P.load.force`,
//! resolved once against a loaded rig, with the written value's unit converted to SI
//! exactly as the loader converts it. Any other key (or one whose part does not hold
//! that value) resolves to None: the study then applies it on the parsed file.

use std::collections::HashMap;

use crate::math::Real;
use crate::model::param::Param;
use crate::model::{Rig, RopeId};
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
    resolve_by(
        key,
        unit,
        |name| rig.parts.iter().position(|p| p.name == name),
        |name| rig.ropes.iter().position(|r| r.name == name),
    )
}

/// The parts and ropes of a rig by name, for resolving many keys against it: one hash
/// look-up a key where [`resolve`] scans every part (a `rank` of many parts resolves
/// a key for each of their coefficients).
#[derive(Debug, Clone)]
pub struct Names<'a> {
    parts: HashMap<&'a str, usize>,
    ropes: HashMap<&'a str, usize>,
}

impl<'a> Names<'a> {
    /// The names of `rig`'s parts and ropes (the first of a name where two share one,
    /// as [`resolve`] finds it).
    pub fn of(rig: &'a Rig) -> Names<'a> {
        let index = |names: Vec<&'a str>| {
            let mut map = HashMap::with_capacity(names.len());
            for (i, name) in names.into_iter().enumerate() {
                map.entry(name).or_insert(i);
            }
            map
        };
        Names {
            parts: index(rig.parts.iter().map(|p| p.name.as_str()).collect()),
            ropes: index(rig.ropes.iter().map(|r| r.name.as_str()).collect()),
        }
    }

    /// [`resolve`] of `key` against the rig these names are of.
    pub fn resolve(&self, key: &str, unit: &str) -> Option<Resolved> {
        resolve_by(
            key,
            unit,
            |name| self.parts.get(name).copied(),
            |name| self.ropes.get(name).copied(),
        )
    }
}

/// [`resolve`] with the parts and ropes found by name through `part` and `rope`.
fn resolve_by(
    key: &str,
    unit: &str,
    part_named: impl Fn(&str) -> Option<usize>,
    rope_named: impl Fn(&str) -> Option<usize>,
) -> Option<Resolved> {
    let part = |suffix: &str| {
        let name = key.strip_prefix("parts.")?.strip_suffix(suffix)?;
        part_named(name)
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
        let r = rope_named(name)?;
        (Param::RopeMu(RopeId::new(r)), None)
    };
    Some(Resolved {
        param,
        dimension,
        unit: unit.to_string(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::rig::load_str;

    /// Guards the name index that `rank` resolves its keys through: for every part
    /// and rope of a rig, each key form (and keys naming nothing) resolves as the
    /// scanning [`resolve`] resolves it.
    #[test]
    fn names_resolve_as_the_scan_does() {
        let text = include_str!("../../rigs/line-set.yaml");
        let rig = load_str(text, "line-set.yaml").unwrap();
        let names = Names::of(&rig);
        let mut keys = vec![
            "ropes.nobody.mu".to_string(),
            "parts.nobody.bearing.mu".to_string(),
            "parts..bearing.mu".to_string(),
            "bearing.mu".to_string(),
        ];
        for p in &rig.parts {
            for suffix in [
                "bearing.factor",
                "bearing.mu",
                "load.mass",
                "load.force",
                "mu",
            ] {
                keys.push(format!("parts.{}.{suffix}", p.name));
            }
        }
        for r in &rig.ropes {
            keys.push(format!("ropes.{}.mu", r.name));
        }
        let mut found = 0;
        for key in &keys {
            for unit in ["", "kg"] {
                let scan = resolve(&rig, key, unit);
                found += usize::from(scan.is_some());
                assert_eq!(names.resolve(key, unit), scan, "{key} {unit}");
            }
        }
        // Every part gives four key forms and every rope one (the part's own `mu` is
        // not a model parameter): the check is not vacuous.
        assert_eq!(found, 2 * (4 * rig.parts.len() + rig.ropes.len()));
    }
}

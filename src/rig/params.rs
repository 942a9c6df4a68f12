//! File keys to model-level parameters ([`crate::model::param`]): `parts.P.bearing.factor`,
//! `parts.P.bearing.mu`, `ropes.R.mu`, `parts.P.load.mass` and `parts.P.load.force`,
//! resolved once against a loaded rig, with the written value's unit converted to SI
//! exactly as the loader converts it. Any other key (or one whose part does not hold
//! that value) resolves to None: the study then applies it on the parsed file.

pub use crate::model::param::Resolved;
use crate::model::param::{Names, Param};
use crate::model::{PartId, Rig, RopeId};
use crate::units::Dimension;

/// Resolves `key` (written with `unit`, empty for a bare number) against `rig`.
pub fn resolve(rig: &Rig, key: &str, unit: &str) -> Option<Resolved> {
    resolve_by(
        key,
        unit,
        |name| rig.part_named(name),
        |name| rig.ropes.position(|r| r.name == name),
    )
}

/// [`resolve`] against the rig `names` are of, each name found by a hash look-up.
pub fn resolve_in(names: &Names, key: &str, unit: &str) -> Option<Resolved> {
    resolve_by(key, unit, |name| names.part(name), |name| names.rope(name))
}

/// [`resolve`] with the parts and ropes found by name through `part_named` and
/// `rope_named`.
fn resolve_by(
    key: &str,
    unit: &str,
    part_named: impl Fn(&str) -> Option<PartId>,
    rope_named: impl Fn(&str) -> Option<RopeId>,
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
        (Param::RopeMu(rope_named(name)?), None)
    };
    Some(Resolved::new(param, dimension, unit))
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
                assert_eq!(resolve_in(&names, key, unit), scan, "{key} {unit}");
            }
        }
        // Every part gives four key forms and every rope one (the part's own `mu` is
        // not a model parameter): the check is not vacuous.
        assert_eq!(found, 2 * (4 * rig.parts.len() + rig.ropes.len()));
    }
}

//! Model-level parameters: one numeric value of a resolved [`Rig`], in SI, that a study
//! changes without re-reading the rig file (a spread sample's bearing factor, load or
//! friction coefficient). A file key is mapped to a [`Param`] once, by
//! `rig::params::resolve`; [`Param::set`] then writes a value into the model with the
//! same range check the loader gives that key, and refuses (None) where it does not
//! apply, so the caller falls back to the file path and its located error.
//!
//! A parameter never changes the rig's structure or geometry: which parts, lines and
//! positions there are stays as loaded.

use super::{Bearing, BlockLoad, PartId, PartKind, Rig, RopeId};
use crate::math::Real;

/// One numeric value of the model.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Param {
    /// A rated sheave's bearing factor K (1 or more): `parts.P.bearing.factor`.
    RatedFactor(PartId),
    /// A plain or rolling bearing's coefficient (0 or more): `parts.P.bearing.mu`.
    BearingMu(PartId),
    /// A rope's coefficient of friction on a tread (0 or more): `ropes.R.mu`.
    RopeMu(RopeId),
    /// A block's load mass, kg (0 or more): `parts.P.load.mass`.
    LoadMass(PartId),
    /// A block's load force, N: `parts.P.load.force`.
    LoadForce(PartId),
}

impl Param {
    /// Whether `value` (SI) passes the loader's range check for this key.
    pub fn accepts(self, value: Real) -> bool {
        value.is_finite()
            && match self {
                Param::RatedFactor(_) => value >= 1.0,
                Param::BearingMu(_) | Param::RopeMu(_) | Param::LoadMass(_) => value >= 0.0,
                Param::LoadForce(_) => true,
            }
    }

    /// Writes `value` (SI) into `rig`. None, leaving `rig` as it was, when the value
    /// fails the range check or the model has no such value (a bearing of another
    /// kind, a load that is the unknown): the caller then takes the file path.
    pub fn set(self, rig: &mut Rig, value: Real) -> Option<()> {
        if !self.accepts(value) {
            return None;
        }
        match self {
            Param::RatedFactor(p) => match bearing(rig, p)? {
                Bearing::Rated { factor } => *factor = value,
                _ => return None,
            },
            Param::BearingMu(p) => match bearing(rig, p)? {
                Bearing::Plain { mu, .. } | Bearing::Rolling { mu, .. } => *mu = value,
                _ => return None,
            },
            Param::RopeMu(r) => rig.ropes.get_mut(r)?.mu = value,
            Param::LoadMass(p) | Param::LoadForce(p) => {
                let PartKind::Block(block) = &mut rig.parts.get_mut(p)?.kind else {
                    return None;
                };
                match (&mut block.load, self) {
                    (BlockLoad::Mass(Some(v)), Param::LoadMass(_))
                    | (BlockLoad::Force(Some(v)), Param::LoadForce(_)) => *v = value,
                    _ => return None,
                }
            }
        }
        Some(())
    }
}

fn bearing(rig: &mut Rig, part: PartId) -> Option<&mut Bearing> {
    match &mut rig.parts.get_mut(part)?.kind {
        PartKind::Sheave(s) => Some(&mut s.bearing),
        _ => None,
    }
}

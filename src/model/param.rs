//! Model-level parameters: one numeric value of a resolved [`Rig`], in SI, that a study
//! changes without re-reading the rig file (a spread sample's bearing factor, load or
//! friction coefficient). A file key is mapped to a [`Param`] once, by
//! `rig::params::resolve` (a study asks through [`super::RigFile::resolve`]), as a
//! [`Resolved`] that also converts a written value to SI; [`Param::set`] then writes a
//! value into the model with the same range check the loader gives that key, and
//! refuses (None) where it does not apply, so the caller falls back to the file path
//! and its located error.
//!
//! A parameter never changes the rig's structure or geometry: which parts, lines and
//! positions there are stays as loaded.

use std::collections::HashMap;

use super::{Bearing, BlockLoad, PartId, PartKind, Rig, RopeId};
use crate::math::Real;
use crate::units::{parse_quantity, Dimension};

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

/// A file key resolved against a rig: the parameter and how a written value becomes SI.
#[derive(Debug, Clone, PartialEq)]
pub struct Resolved {
    /// The model value the key sets.
    pub param: Param,
    dimension: Option<Dimension>,
    unit: String,
}

impl Resolved {
    /// `param`, whose values are written with `unit` (empty for a bare number) and, when
    /// `dimension` is given, converted to SI as the loader converts that quantity (a bare
    /// number in the rig's own unit of it).
    pub fn new(param: Param, dimension: Option<Dimension>, unit: &str) -> Resolved {
        Resolved {
            param,
            dimension,
            unit: unit.to_string(),
        }
    }

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

/// A rig's parts and ropes by name, for resolving many file keys against it
/// ([`super::RigFile::resolve_in`]): one hash look-up a key where a scan reads every
/// part (a `rank` of many parts resolves a key for each of their coefficients).
#[derive(Debug, Clone)]
pub struct Names<'a> {
    parts: HashMap<&'a str, PartId>,
    ropes: HashMap<&'a str, RopeId>,
}

impl<'a> Names<'a> {
    /// The names of `rig`'s parts and ropes (the first of a name where two share one,
    /// as a scan in file order finds it).
    pub fn of(rig: &'a Rig) -> Names<'a> {
        let mut parts = HashMap::with_capacity(rig.parts.len());
        for (id, p) in rig.parts.enumerate() {
            parts.entry(p.name.as_str()).or_insert(id);
        }
        let mut ropes = HashMap::with_capacity(rig.ropes.len());
        for (id, r) in rig.ropes.enumerate() {
            ropes.entry(r.name.as_str()).or_insert(id);
        }
        Names { parts, ropes }
    }

    /// The part named `name`.
    pub fn part(&self, name: &str) -> Option<PartId> {
        self.parts.get(name).copied()
    }

    /// The rope named `name`.
    pub fn rope(&self, name: &str) -> Option<RopeId> {
        self.ropes.get(name).copied()
    }
}

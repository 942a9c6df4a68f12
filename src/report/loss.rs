//! The rope-as-material figures of the report (DESIGN.md §7): the energy audit's
//! losses by kind (`loss`: `bearing`, `bending`, `surface`, `drum`, `total`) for each
//! sub-rig, and per part the axial part of its pin load (`axial_load_n`) and the share
//! of all losses that the rope's bending takes there (`bend_loss_share`).

use serde::Serialize;

use super::{finite, ForwardBack, PerCase, Report};
use crate::math::{Real, Vector};
use crate::model::{PartId, PartKind, Rig};
use crate::solve::kinematics::Motion;
use crate::solve::statics::CaseResult;
use crate::solve::{Case, Solution, SubRigSolution};
use crate::units::{Dimension, UnitSystem};

/// The energy audit's losses by kind for one sub-rig, forward and back: power lost per
/// unit speed of the drive, which is a force at a linear drive (W per m/s = N) and a
/// torque at a drum (W per rad/s = N·m). Drive power = load power + `total`.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct LossReport {
    /// Unit of every figure here: `N` (per m/s of a linear drive) or `N*m` (per rad/s
    /// of a drum).
    pub unit: &'static str,
    /// Turning sheaves' bearings: journal and thrust face.
    pub bearing: ForwardBack<Option<Real>>,
    /// The rope's own bending over turning sheaves (its `bend_loss`).
    pub bending: ForwardBack<Option<Real>>,
    /// Rope sliding over fixed surfaces: guides and stalled sheaves.
    pub surface: ForwardBack<Option<Real>>,
    /// Drums: drag, journal and thrust.
    pub drum: ForwardBack<Option<Real>>,
    /// All of them.
    pub total: ForwardBack<Option<Real>>,
}

impl LossReport {
    /// The losses of a solved sub-rig.
    pub fn of(rig: &Rig, solution: &Solution, sub: &SubRigSolution) -> LossReport {
        let pick = |f: fn((Real, Real, Real, Real)) -> Real| ForwardBack {
            forward: finite(f(sub.forward.losses.totals())),
            back: finite(f(sub.back.losses.totals())),
        };
        let turns = solution.kinematics.dof_of_part[sub.drive]
            .is_some_and(|i| matches!(solution.kinematics.dofs[i].motion, Motion::Rotate(_)))
            || matches!(rig.parts[sub.drive].kind, PartKind::Drum(_));
        LossReport {
            unit: if turns { "N*m" } else { "N" },
            bearing: pick(|t| t.0),
            bending: pick(|t| t.1),
            surface: pick(|t| t.2),
            drum: pick(|t| t.3),
            total: ForwardBack {
                forward: finite(sub.forward.total_loss()),
                back: finite(sub.back.total_loss()),
            },
        }
    }

    /// Whether the rope's bending costs anything going forward.
    pub fn has_bending(&self) -> bool {
        self.bending.forward.is_some_and(|b| b > 0.0)
    }
}

/// A part's axial pin load and bending share, flattened into its
/// [`PartReport`](super::PartReport).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct PartLoads {
    /// The pin load's part along the axle `P·n`, N, signed along the axle as written
    /// (what a thrust face or the sheave's cheeks carry); `null` for parts without an
    /// axle. Zero for a part whose spans and weight lie in its plane.
    pub axial_load_n: PerCase,
    /// Share of all losses that the rope's bending takes at this part, forward case
    /// (0 to 1; part of `loss_share`).
    pub bend_loss_share: Option<Real>,
}

impl PartLoads {
    /// The figures of part `id`; `sub` is the sub-rig it belongs to and
    /// `forward_loss` that sub-rig's forward [`CaseResult::total_loss`], summed once per
    /// sub-rig by the caller (summing it here, once per part, made the report quadratic
    /// in the parts of a long chain).
    pub fn of(
        rig: &Rig,
        sub: Option<&SubRigSolution>,
        forward_loss: Real,
        id: PartId,
    ) -> PartLoads {
        let axle = match &rig.parts[id].kind {
            PartKind::Sheave(s) => Some(s.axle),
            PartKind::Guide(g) => Some(g.axle),
            PartKind::Drum(d) => Some(d.axle),
            _ => None,
        };
        let axial = |c: Case| -> Option<Real> {
            let n = axle?.into_inner();
            let pin: Vector = sub?.case(c).pin_load[id]?;
            let along = pin.dot(&n);
            // Round-off of spans that lie in the part's plane is not a load.
            finite(if along.abs() <= 1e-12 * pin.norm() {
                0.0
            } else {
                along
            })
        };
        let share = |case: &CaseResult| {
            let total = forward_loss;
            let here = case.losses.bending.get(id).copied().unwrap_or(0.0);
            if total > 0.0 {
                finite(here / total)
            } else {
                Some(0.0)
            }
        };
        PartLoads {
            axial_load_n: PerCase {
                ideal: axial(Case::Ideal),
                forward: axial(Case::Forward),
                back: axial(Case::Back),
            },
            bend_loss_share: sub.and_then(|s| share(&s.forward)),
        }
    }

    /// Whether the axial load is worth a column: above `1e-9` of the pin load in some
    /// case (spans leaving the part's plane, a weight along its axle).
    pub fn has_axial(&self, pin: &ForwardBack<Option<Real>>) -> bool {
        [
            (self.axial_load_n.forward, pin.forward),
            (self.axial_load_n.back, pin.back),
        ]
        .into_iter()
        .any(|(a, p)| matches!((a, p), (Some(a), Some(p)) if a.abs() > 1e-9 * p))
    }
}

impl LossReport {
    /// The losses by kind going forward, in words, where the rope's bending costs
    /// anything (else None, so a rig without `bend_loss` reads as it did):
    /// `bearings 4.21 N (44.4 %), rope bending 5.27 N (55.6 %)`. Figures at the drive,
    /// in the report's units.
    pub fn words(&self, units: &UnitSystem) -> Option<String> {
        if !self.has_bending() {
            return None;
        }
        let dimension = if self.unit == "N*m" {
            Dimension::Torque
        } else {
            Dimension::Force
        };
        let total = self.total.forward.filter(|t| *t > 0.0)?;
        let kinds = [
            ("bearings", self.bearing.forward),
            ("rope bending", self.bending.forward),
            ("sliding on fixed surfaces", self.surface.forward),
            ("drums", self.drum.forward),
        ];
        let parts: Vec<String> = kinds
            .iter()
            .filter_map(|&(name, x)| {
                let x = x.filter(|x| *x > 1e-12 * total)?;
                Some(format!(
                    "{name} {} ({:.1} %)",
                    units.show(x, dimension),
                    100.0 * x / total
                ))
            })
            .collect();
        Some(parts.join(", "))
    }
}

/// The axial pin loads going forward, in words, where any part has one worth showing
/// ([`PartLoads::has_axial`]): `b −101.0 N, a 36.97 N` (largest first; signed along
/// the axle as written). None for a planar rig.
pub fn axial_words(report: &Report, units: &UnitSystem) -> Option<String> {
    let mut loads: Vec<(&str, Real)> = report
        .parts
        .iter()
        .filter(|p| p.material.has_axial(&p.pin_load_n))
        .filter_map(|p| Some((p.name.as_str(), p.material.axial_load_n.forward?)))
        .collect();
    if loads.is_empty() {
        return None;
    }
    loads.sort_by(|a, b| b.1.abs().total_cmp(&a.1.abs()));
    let shown: Vec<String> = loads
        .iter()
        .take(8)
        .map(|(name, a)| format!("{name} {}", units.show(*a, Dimension::Force)))
        .collect();
    let more = loads.len().saturating_sub(8);
    Some(if more > 0 {
        format!("{} and {more} more (see `reeve table`)", shown.join(", "))
    } else {
        shown.join(", ")
    })
}

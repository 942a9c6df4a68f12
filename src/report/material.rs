//! The rope as a material in the report (DESIGN.md §7): a span's end tensions where the
//! rope's weight makes them differ, its stretch per case and its sag.

use serde::Serialize;

use crate::math::Real;
use crate::model::{LineId, Rig};
use crate::solve::{Case, Solution, SubRigSolution};

use super::{finite, PerCase};

/// A span's tension per case: at its start (`ideal`, `forward`, `back`) and, where the
/// rope's weight makes the two ends differ, at its end (`ideal_end`, ...; DESIGN.md §7).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct SpanTension {
    /// No friction, N.
    pub ideal: Option<Real>,
    /// Driving forward, N.
    pub forward: Option<Real>,
    /// Running back, N.
    pub back: Option<Real>,
    /// No friction, at the span's end, N.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ideal_end: Option<Real>,
    /// Driving forward, at the span's end, N.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub forward_end: Option<Real>,
    /// Running back, at the span's end, N.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub back_end: Option<Real>,
}

impl SpanTension {
    /// The start and end tensions of a case: (start, end), the end the start where
    /// they do not differ.
    pub fn ends(&self, case: Case) -> (Option<Real>, Option<Real>) {
        let (a, b) = match case {
            Case::Ideal => (self.ideal, self.ideal_end),
            Case::Forward => (self.forward, self.forward_end),
            Case::Back => (self.back, self.back_end),
        };
        (a, b.or(a))
    }
}

/// The rope-as-material figures of one span (DESIGN.md §7): end tensions where they
/// differ from the start, stretch per case, sag.
pub(super) struct SpanMaterial {
    pub(super) ends: PerCase,
    pub(super) stretch: Option<PerCase>,
    pub(super) sag: Option<Real>,
}

pub(super) fn span_material(
    rig: &Rig,
    solution: &Solution,
    sub: Option<&SubRigSolution>,
    line: LineId,
    span: usize,
) -> SpanMaterial {
    let rope = rig.rope_of(line);
    let geometry = &solution.geometry.lines[line].spans[span];
    let weighs = rope.mass_per_length.is_some_and(|w| w > 0.0);
    let ends = |c: Case| -> Option<(Real, Real)> {
        let case = sub?.case(c);
        Some((
            *case.tension[line].get(span)?,
            *case.tension_end[line].get(span)?,
        ))
    };
    let cases = [Case::Ideal, Case::Forward, Case::Back];
    let per_case = |f: &dyn Fn(Case) -> Option<Real>| PerCase {
        ideal: f(Case::Ideal),
        forward: f(Case::Forward),
        back: f(Case::Back),
    };
    let end = |c: Case| {
        let (a, b) = ends(c)?;
        (weighs && b != a).then_some(b).and_then(finite)
    };
    let stretch = rope.stiffness.map(|ea| {
        per_case(&|c| {
            let (a, b) = ends(c)?;
            finite(crate::solve::elastic::span_stretch(
                a,
                b,
                geometry.length,
                ea,
            ))
        })
    });
    let sag = if weighs {
        let up = -rig.gravity.into_inner();
        let chord = geometry.end - geometry.start;
        let rise = chord.dot(&up);
        let run = (chord - up * rise).norm();
        let q = rope.mass_per_length.unwrap_or(0.0) * crate::math::STANDARD_GRAVITY;
        cases
            .iter()
            .filter_map(|&c| {
                let (a, b) = ends(c)?;
                let horizontal = 0.5 * (a + b) * run / geometry.length;
                // Near-horizontal spans only (within 45° of level): on a steep span
                // the vertical distance from the chord says nothing useful.
                (run > 1e-6 * geometry.length && rise.abs() <= run)
                    .then(|| crate::geometry::catenary::sag(run, rise, horizontal, q))
                    .flatten()
            })
            .reduce(Real::max)
    } else {
        None
    };
    SpanMaterial {
        ends: per_case(&end),
        stretch,
        sag,
    }
}

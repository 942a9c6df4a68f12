//! The JSON document of `reeve table --format json`: the drawing-set tables in SI, one
//! object per row, each case's values present only for the cases asked for.

use serde::Serialize;

use crate::math::Real;

use super::super::Report;
use super::{CaseFilter, TableChoice};

/// Per-case values, present only for the cases asked for; a present `None` is `null`.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct CasesJson<T> {
    /// No friction.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ideal: Option<Option<T>>,
    /// Driving forward.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub forward: Option<Option<T>>,
    /// Running back.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub back: Option<Option<T>>,
}

impl<T> CasesJson<T> {
    fn new(cases: CaseFilter, ideal: Option<T>, forward: Option<T>, back: Option<T>) -> Self {
        CasesJson {
            ideal: cases.ideal().then_some(ideal),
            forward: cases.forward().then_some(forward),
            back: cases.back().then_some(back),
        }
    }
}

/// A span's tension per case (at its start), N, and, where the rope's weight makes its
/// ends differ, at its end as `{case}_end`: the name DESIGN.md §7 gives it, as in
/// `check --json`.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct TensionJson {
    /// At the span's start, per case asked for.
    #[serde(flatten)]
    pub start: CasesJson<Real>,
    /// At the span's end, no friction.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ideal_end: Option<Real>,
    /// At the span's end, driving forward.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub forward_end: Option<Real>,
    /// At the span's end, running back.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub back_end: Option<Real>,
}

/// A span row of the JSON table (SI).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct SpanJson {
    /// Line name.
    pub line: String,
    /// Span index along the line, from 0.
    pub span: usize,
    /// Part it leaves.
    pub from: String,
    /// Part it reaches.
    pub to: String,
    /// Length, m.
    pub length_m: Option<Real>,
    /// Tension per case, N (at the span's start where the rope's weight makes the ends
    /// differ, and then at its end as `{case}_end`, DESIGN.md §7).
    pub tension_n: TensionJson,
    /// Tension per case at the span's end, N, where the rope's weight makes the ends
    /// differ: the same figures as `tension_n.{case}_end` (this table's first name for
    /// them, kept).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub tension_end_n: Option<CasesJson<Real>>,
    /// Stretch per case, m, where the rope has a `stiffness`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub stretch_m: Option<CasesJson<Real>>,
    /// Sag, m, where the rope has a `mass_per_length` and the span is not vertical.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sag_m: Option<Real>,
    /// Breaking strength over the larger of the forward and back tensions.
    pub safety_factor: Option<Real>,
}

/// A part row of the JSON table (SI, angles in degrees).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct PartJson {
    /// Part name.
    pub part: String,
    /// Kind as written.
    pub kind: String,
    /// Line of this passage (absent for a part without passages).
    pub line: Option<String>,
    /// Wrap, degrees.
    pub wrap_deg: Option<Real>,
    /// Fleet angle of the arriving span, degrees.
    pub fleet_in_deg: Option<Real>,
    /// Fleet angle of the leaving span, degrees.
    pub fleet_out_deg: Option<Real>,
    /// Tread diameter over rope diameter.
    pub bend_ratio: Option<Real>,
    /// Tight over slack tension (forward and back only; 1 without friction).
    pub tension_ratio: CasesJson<Real>,
    /// Resultant load magnitude, N.
    pub pin_load_n: CasesJson<Real>,
    /// Unit direction of the resultant load.
    pub pin_load_direction: CasesJson<[Real; 3]>,
    /// Share of all losses at this part, forward case (0 to 1).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub loss_share: Option<Option<Real>>,
    /// Share of all losses that the rope's bending takes at this part, forward case.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub bend_loss_share: Option<Option<Real>>,
    /// The pin load's part along the axle, N (DESIGN.md §7).
    pub axial_load_n: CasesJson<Real>,
}

/// The JSON document of `reeve table --format json`.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct TablesJson {
    /// Format version of the rig file.
    pub format: u32,
    /// Rig title.
    pub title: String,
    /// Which cases the columns show.
    pub cases: &'static str,
    /// The span table (absent when only parts were asked for).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub spans: Option<Vec<SpanJson>>,
    /// The part table (absent when only spans were asked for).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub parts: Option<Vec<PartJson>>,
}

/// Builds the JSON tables (SI) from the report.
pub fn tables_json(report: &Report, cases: CaseFilter, choice: TableChoice) -> TablesJson {
    let spans = (choice != TableChoice::Parts).then(|| {
        report
            .spans
            .iter()
            .map(|s| SpanJson {
                line: s.line.clone(),
                span: s.index,
                from: s.from.clone(),
                to: s.to.clone(),
                length_m: s.length_m,
                tension_n: TensionJson {
                    start: CasesJson::new(
                        cases,
                        s.tension_n.ideal,
                        s.tension_n.forward,
                        s.tension_n.back,
                    ),
                    ideal_end: s.tension_n.ideal_end.filter(|_| cases.ideal()),
                    forward_end: s.tension_n.forward_end.filter(|_| cases.forward()),
                    back_end: s.tension_n.back_end.filter(|_| cases.back()),
                },
                tension_end_n: (s.tension_n.ideal_end.is_some()
                    || s.tension_n.forward_end.is_some()
                    || s.tension_n.back_end.is_some())
                .then(|| {
                    CasesJson::new(
                        cases,
                        s.tension_n.ideal_end,
                        s.tension_n.forward_end,
                        s.tension_n.back_end,
                    )
                }),
                stretch_m: s
                    .stretch_m
                    .as_ref()
                    .map(|p| CasesJson::new(cases, p.ideal, p.forward, p.back)),
                sag_m: s.sag_m,
                safety_factor: s.safety_factor,
            })
            .collect()
    });
    let parts = (choice != TableChoice::Spans).then(|| {
        let mut rows = Vec::new();
        for p in &report.parts {
            let pins = CasesJson::new(
                cases,
                p.pin_load_ideal_n,
                p.pin_load_n.forward,
                p.pin_load_n.back,
            );
            let dirs = CasesJson::new(
                cases,
                p.pin_load_direction_ideal,
                p.pin_load_direction.forward,
                p.pin_load_direction.back,
            );
            let loss = cases.forward().then_some(p.loss_share);
            let bend = cases.forward().then_some(p.material.bend_loss_share);
            let a = &p.material.axial_load_n;
            let axial = CasesJson::new(cases, a.ideal, a.forward, a.back);
            if p.passages.is_empty() {
                rows.push(PartJson {
                    part: p.name.clone(),
                    kind: p.kind.to_string(),
                    line: None,
                    wrap_deg: None,
                    fleet_in_deg: None,
                    fleet_out_deg: None,
                    bend_ratio: None,
                    tension_ratio: CasesJson::new(cases, None, None, None),
                    pin_load_n: pins.clone(),
                    pin_load_direction: dirs.clone(),
                    loss_share: loss,
                    bend_loss_share: bend,
                    axial_load_n: axial.clone(),
                });
            }
            for pass in &p.passages {
                rows.push(PartJson {
                    part: p.name.clone(),
                    kind: p.kind.to_string(),
                    line: Some(pass.line.clone()),
                    wrap_deg: pass.wrap_deg,
                    fleet_in_deg: pass.fleet_in_deg,
                    fleet_out_deg: pass.fleet_out_deg,
                    bend_ratio: pass.bend_ratio,
                    tension_ratio: CasesJson::new(
                        cases,
                        Some(1.0),
                        pass.tension_ratio.forward,
                        pass.tension_ratio.back,
                    ),
                    pin_load_n: pins.clone(),
                    pin_load_direction: dirs.clone(),
                    loss_share: loss,
                    bend_loss_share: bend,
                    axial_load_n: axial.clone(),
                });
            }
        }
        rows
    });
    TablesJson {
        format: report.format,
        title: report.title.clone(),
        cases: cases.name(),
        spans,
        parts,
    }
}

//! The warnings of a `motion` run (DESIGN.md §7): their codes, texts (SI) and the
//! figures a report shows in other units, and the checks that find them in a run:
//! jerky motion, stop speed, dynamic tension, the end of the geometry, a slack rope,
//! motion below the run's resolution.

use crate::math::Real;
use crate::model::Rig;

use super::integrate::{Event, EventKind, Run};
use super::profile::{Profile, SpanTension};
use super::Stroke;

/// The least movement between two stops (m or rad) that a run reports as motion: 10⁵
/// times the integrator's absolute tolerance ([`super::integrate::ATOL`]), and below anything a
/// rope rig can show. A stick-slip cycle that moves less (a rope or spring of 10¹² N/m
/// on a kilogram, whose true jump of picometres the steps cannot resolve) is numerical.
pub const RESOLVED_MOTION: Real = 1e-6;

/// A warning of the motion run.
#[derive(Debug, Clone, PartialEq)]
pub struct Warning {
    /// Stable code.
    pub code: &'static str,
    /// Text (SI units).
    pub message: String,
    /// The figures of the message, so that a report can show them in other units.
    pub figures: Option<WarningFigures>,
}

/// The figures of a warning that carries units.
#[derive(Debug, Clone, PartialEq)]
pub enum WarningFigures {
    /// `geometry-end` or `open-end`: the run ended where the geometry of a rig without
    /// `travel` ends.
    GeometryEnd {
        /// When, s.
        t: Real,
        /// The drive's position, m or rad.
        position: Real,
        /// The speed it arrived at, m/s or rad/s.
        speed: Real,
        /// What closes up there (or why the rig cannot be followed); None: the geometry
        /// sets no limit that way, and the run went as far as the rope drawn.
        reason: Option<String>,
        /// The rope drawn, m.
        rope_drawn: Real,
    },
    /// `stop-speed`: the stroke's start (s), its impact speed and the limit (m/s or rad/s).
    StopSpeed {
        /// Start of the stroke, s.
        start: Real,
        /// Impact speed.
        speed: Real,
        /// `limits.stop_speed`.
        limit: Real,
    },
    /// `slack-span`: where along the travel a span's tension goes negative.
    Slack {
        /// The drive's position, m or rad.
        position: Real,
        /// The tension, N (negative).
        tension: Real,
        /// The line.
        line: String,
        /// The span's index on the line.
        span: usize,
    },
    /// `stiff-rope`: the rope's spring rate at the drive and the drive's swing period on
    /// it, s, where the run took the rope as inextensible.
    StiffRope {
        /// N/m or N·m/rad.
        rate: Real,
        /// s.
        period: Real,
    },
    /// `unresolved-motion`: stops and restarts that moved less than [`RESOLVED_MOTION`].
    Unresolved {
        /// How many stick-slip pairs were left out.
        dropped: usize,
        /// The largest movement between stops, m or rad.
        largest: Real,
        /// [`RESOLVED_MOTION`].
        resolution: Real,
    },
    /// `dynamic-tension`: the peak in motion, the static check's largest and the
    /// allowed tension, N.
    DynamicTension {
        /// Peak span tension in motion, N.
        peak: Real,
        /// Largest static tension, N.
        static_peak: Real,
        /// Breaking strength over design factor, N.
        allowed: Real,
    },
}

pub(super) fn warnings(
    rig: &Rig,
    profile: &Profile,
    run: &Run,
    strokes: &[Stroke],
) -> Vec<Warning> {
    let mut out = Vec::new();
    let unit = if profile.rotates { "rad/s" } else { "m/s" };
    if let Some(s) = strokes.iter().find(|s| s.stick_slip_cycles > 0) {
        out.push(Warning {
            code: "jerky-motion",
            message: format!(
                "the stroke starting at {:.3} s stops and sets off again {} time(s): the motion is jerky (stick-slip)",
                s.start, s.stick_slip_cycles
            ),
                    figures: None,
});
    }
    if let Some(limit) = rig.changing.stop_speed {
        for s in strokes {
            if let Some(v) = s.stop_speed.filter(|v| *v > limit) {
                out.push(Warning {
                    code: "stop-speed",
                    message: format!(
                        "the stroke starting at {:.3} s hits its end stop at {v:.4} {unit}, faster than limits.stop_speed {limit:.4} {unit}",
                        s.start
                    ),
                    figures: Some(WarningFigures::StopSpeed {
                        start: s.start,
                        speed: v,
                        limit,
                    }),
                });
            }
        }
    }
    if let Some(allowed) = profile.allowed_tension {
        let peak = run.points.iter().map(|p| p.tension).fold(0.0, Real::max);
        let static_peak = profile
            .samples
            .iter()
            .map(|s| s.static_tension)
            .fold(0.0, Real::max);
        if peak > allowed {
            out.push(Warning {
                code: "dynamic-tension",
                message: format!(
                    "a span tension reaches {peak:.1} N in motion (the static check's largest is {static_peak:.1} N), beyond the breaking strength over the design factor ({allowed:.1} N)"
                ),
                figures: Some(WarningFigures::DynamicTension {
                    peak,
                    static_peak,
                    allowed,
                }),
            });
        }
    }
    out
}

/// The warning of a run that ended where the geometry of a rig without `travel` ends
/// (`run.at_geometry_end`): `geometry-end` where parts meet (or the rig cannot be
/// solved past there), `open-end` where the geometry sets no limit.
pub(super) fn geometry_end_warning(profile: &Profile, run: &Run) -> Warning {
    let last = run.events.last().copied();
    let (t, position, speed) = last.map_or((0.0, 0.0, 0.0), |e| (e.t, e.position, e.speed));
    let ends = profile.ends.as_ref();
    let end = ends.map(|e| if position < 0.0 { &e.back } else { &e.forward });
    let reason = end.and_then(|e| e.reason.clone());
    let rope_drawn = ends.map_or(0.0, |e| e.rope_drawn);
    let (pu, su) = if profile.rotates {
        ("rad", "rad/s")
    } else {
        ("m", "m/s")
    };
    let (code, message) = match &reason {
        Some(words) => (
            "geometry-end",
            format!(
                "at {t:.3} s the drive reaches {position:.4} {pu} from the drawn position, where the rig's geometry ends ({words}), at {:.4} {su}: the run ends there; give `travel` for the real end stops",
                speed.abs()
            ),
        ),
        None => (
            "open-end",
            format!(
                "at {t:.3} s the drive has moved {position:.4} {pu} and its geometry sets no limit that way: the run ends there, where its fastest part has moved as far as the rope drawn ({rope_drawn:.3} m), at {:.4} {su}; give `travel` for the real end stops",
                speed.abs()
            ),
        ),
    };
    Warning {
        code,
        message,
        figures: Some(WarningFigures::GeometryEnd {
            t,
            position,
            speed: speed.abs(),
            reason,
            rope_drawn,
        }),
    }
}

/// The first stroke that runs through a position where its way's figures need a rope
/// that pushes (a negative span tension, at that time's figures where other parts
/// follow a schedule): the position and `(tension, (line, span))`.
pub(super) fn slack_stroke(
    profile: &Profile,
    run: &Run,
    strokes: &[Stroke],
) -> Option<(Real, SpanTension)> {
    for s in strokes {
        let on = run.points.iter().filter(|p| p.t >= s.start && p.t <= s.end);
        let (lo, hi) = on.fold((Real::INFINITY, Real::NEG_INFINITY), |(lo, hi), p| {
            (lo.min(p.x), hi.max(p.x))
        });
        if lo > hi {
            continue;
        }
        let case = |t: Real, x: Real| {
            let at = profile.at_t(t, x);
            if s.direction > 0.0 {
                at.least_forward
            } else {
                at.least_back
            }
        };
        // The ends of the stroke and every sampled position in between, at its start
        // and its end time.
        let xs = profile
            .samples
            .iter()
            .map(|p| p.x)
            .filter(|&x| x > lo && x < hi)
            .chain([lo, hi]);
        for x in xs {
            for t in [s.start, s.end] {
                let least = case(t, x);
                if least.0 < 0.0 {
                    return Some((x, least));
                }
            }
        }
    }
    None
}

/// Leaves out each `sticks` / `slips` pair whose slip (from the start or slip before it)
/// moved less than [`RESOLVED_MOTION`]: numerical, not stick-slip. Returns how many.
pub(super) fn drop_unresolved_slips(events: &mut Vec<Event>) -> usize {
    let mut dropped = 0;
    let mut from: Option<Real> = None;
    let mut i = 0;
    while i < events.len() {
        match events[i].kind {
            EventKind::StartsForward | EventKind::StartsBack | EventKind::Slips => {
                from = Some(events[i].position);
            }
            EventKind::Sticks => {
                let small = from.is_some_and(|x| (events[i].position - x).abs() < RESOLVED_MOTION);
                if small
                    && events
                        .get(i + 1)
                        .is_some_and(|e| e.kind == EventKind::Slips)
                {
                    events.drain(i..i + 2);
                    dropped += 1;
                    continue;
                }
            }
            _ => {}
        }
        i += 1;
    }
    dropped
}

/// The figures of `unresolved-motion`, where pairs were dropped or every stroke moved
/// less than [`RESOLVED_MOTION`] in all.
pub(super) fn unresolved_motion(
    run: &Run,
    strokes: &[Stroke],
    dropped: usize,
) -> Option<WarningFigures> {
    let moved = |s: &Stroke| {
        let on = run.points.iter().filter(|p| p.t >= s.start && p.t <= s.end);
        let (lo, hi) = on.fold((Real::INFINITY, Real::NEG_INFINITY), |(lo, hi), p| {
            (lo.min(p.x), hi.max(p.x))
        });
        (hi - lo).max(0.0)
    };
    let largest = strokes.iter().map(moved).fold(0.0, Real::max);
    let tiny = !strokes.is_empty() && largest < RESOLVED_MOTION;
    (dropped > 0 || tiny).then_some(WarningFigures::Unresolved {
        dropped,
        largest,
        resolution: RESOLVED_MOTION,
    })
}

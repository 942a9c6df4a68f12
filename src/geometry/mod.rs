//! Rope geometry: where each span runs, how far the rope wraps each part, fleet angles
//! and bend ratios.
//!
//! # Frame and sign conventions (stated once, used everywhere)
//!
//! - World frame, metres, right-handed. Gravity is the rig's `gravity` direction.
//! - A round part (sheave, guide, drum) is a circle of *pitch radius*
//!   `R = (D + d) / 2` (tread diameter `D`, rope diameter `d`) centred on the part's `at`,
//!   in the plane normal to its axle `a`.
//! - The rope turns about a round part with a *sense* `σ = +1` when it runs
//!   anticlockwise seen from the tip of `a` (the part lies on the rope's left, looking
//!   along the path), `σ = −1` when clockwise. At a tangent point `t` the rope's
//!   direction of travel along the path is `σ · a × (t − c) / R`.
//! - The sense is inferred from the path's turn, `sign((c − p) × (n − c) · a)` with `p`,
//!   `n` the neighbouring parts' centres, unless the path entry gives `side`.
//!   A drum at a line end has one neighbour; its sense comes from `side` (default left).
//! - Spans run in path order: span `i` joins path entry `i` to entry `i + 1`.
//! - Point parts (anchor, block, weight, haul) are circles of radius zero. A block at a
//!   line end is its `at`; a sheave carried by a block is centred on its own `at`.
//! - Wrap is measured from the arriving to the leaving tangent point in the rope's sense,
//!   in `[0, 2π)`, plus `2π` per extra turn; line ends have wrap 0.
//! - Fleet angle of a span at a round part is `asin(|u · a|)`, `u` the span's direction.
//! - Two places closer than `1e-12 ×` [`rig_size`] are the same place.

pub mod catenary;
pub mod tangent;

use std::f64::consts::TAU;

use crate::math::{Direction, Point, Real};
use crate::model::{IdVec, LineId, PartId, Rig};
use tangent::{common_tangent, exceeds, Circle, End, TangentError, TangentOptions, DEGENERATE};

/// A straight length of rope between two parts of a line.
#[derive(Debug, Clone, PartialEq)]
pub struct SpanGeometry {
    /// Where the span leaves the earlier part (tangent point or end point).
    pub start: Point,
    /// Where it meets the later part.
    pub end: Point,
    /// `end − start`, m (> 0).
    pub length: Real,
    /// Unit direction from `start` to `end`.
    pub direction: Direction,
}

/// What one path entry looks like in space.
#[derive(Debug, Clone, PartialEq)]
pub struct EntryGeometry {
    /// The part.
    pub part: PartId,
    /// Centre of the part's circle, or the point of a point part.
    pub centre: Point,
    /// Pitch radius, m (0 for point parts).
    pub pitch_radius: Real,
    /// Turning sense about the axle, ±1 (round parts only).
    pub sense: Option<Real>,
    /// Angle through which the rope's direction turns on the part, radians, including
    /// extra full turns; 0 at a point part and at a line end (a drum at a line end has
    /// the rope wound on it: wrap 0 too).
    pub wrap: Real,
    /// Extra full turns included in `wrap` (as written; not included at a line end,
    /// where `wrap` is 0).
    pub turns: u32,
    /// Fleet angle of the arriving span at this part's groove, radians (round parts).
    pub fleet_in: Option<Real>,
    /// Fleet angle of the leaving span, radians (round parts).
    pub fleet_out: Option<Real>,
    /// Tread diameter over rope diameter (round parts).
    pub bend_ratio: Option<Real>,
}

/// The geometry of one line.
#[derive(Debug, Clone, PartialEq)]
pub struct LineGeometry {
    /// One per path entry, in path order.
    pub entries: Vec<EntryGeometry>,
    /// One per consecutive pair of entries: `spans[i]` joins `entries[i]` to `entries[i+1]`.
    pub spans: Vec<SpanGeometry>,
}

/// The geometry of a whole rig, one entry per line in file order.
#[derive(Debug, Clone, PartialEq)]
pub struct Geometry {
    /// Per line.
    pub lines: IdVec<LineId, LineGeometry>,
}

/// Options for the geometry solve.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct GeometryOptions {
    /// Convergence tolerance of the non-coplanar tangent iteration, m (default 1e-12 m
    /// relative to the rig's size, i.e. round-off). [`compute`] multiplies it by
    /// [`rig_size`]; the iteration never asks for less than its round-off floor.
    pub tolerance: Real,
    /// Iteration cap (default 200).
    pub max_iterations: usize,
}

impl Default for GeometryOptions {
    fn default() -> Self {
        GeometryOptions {
            tolerance: 1e-12,
            max_iterations: 200,
        }
    }
}

/// Why a rig's geometry cannot be built. Names are the rig file's.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum GeometryError {
    /// A neighbouring point lies inside (or on) a round part's pitch circle.
    #[error("line `{line}`: `{point}` lies inside the pitch circle of `{part}`; move it out or make the part smaller")]
    InsideCircle {
        /// Line name.
        line: String,
        /// The round part.
        part: String,
        /// The part whose point is inside.
        point: String,
    },
    /// Two consecutive path entries sit at the same place.
    #[error(
        "line `{line}`: `{a}` and `{b}` are at the same place; a span needs two distinct ends"
    )]
    Coincident {
        /// Line name.
        line: String,
        /// First part.
        a: String,
        /// Second part.
        b: String,
    },
    /// The path is straight through a round part and no `side` says where it lies.
    #[error("line `{line}`: the path runs straight through `{part}`, so the side the rope passes cannot be told; add `side: left` or `side: right` to that path entry")]
    AmbiguousSide {
        /// Line name.
        line: String,
        /// The round part.
        part: String,
    },
    /// The tangent iteration for a non-coplanar pair did not settle.
    #[error("line `{line}`: the span from `{a}` to `{b}` did not converge ({iterations} iterations, last change {residual:.3e} m)")]
    NotConverged {
        /// Line name.
        line: String,
        /// First part.
        a: String,
        /// Second part.
        b: String,
        /// Iterations used.
        iterations: usize,
        /// Last change.
        residual: Real,
    },
}

/// Builds the geometry of every line of `rig` from its parts' current positions.
///
/// Per line: checks that consecutive entries are at distinct places, settles each round
/// entry's sense (explicit `side`, else the path's turn, else left at a line end),
/// finds every span's tangent points ([`tangent::common_tangent`]; the skew-axle
/// iteration stops at `options.tolerance × `[`rig_size`]), then the wrap, fleet angles
/// and bend ratio of every entry.
///
/// # Errors
/// [`GeometryError`] when a point is inside a circle, two ends coincide, a side is
/// ambiguous, or a tangent iteration does not converge. The first problem found is
/// reported, lines in file order.
///
/// # Panics
/// Only if `rig` holds a part or rope index out of range, which a rig from the loader
/// never does (it resolves every name into an index of its own vectors).
pub fn compute(rig: &Rig, options: &GeometryOptions) -> Result<Geometry, GeometryError> {
    let size = rig_size(rig);
    let lines = rig
        .lines
        .ids()
        .map(|line| line_geometry(rig, line, options, size))
        .collect::<Result<IdVec<_, _>, _>>()?;
    Ok(Geometry { lines })
}

/// The geometry of one line of `rig` (what [`compute`] does for each line).
///
/// # Errors
/// As [`compute`].
///
/// # Panics
/// As [`compute`]; also if `line` is not an index of `rig.lines`.
pub fn compute_line(
    rig: &Rig,
    line: LineId,
    options: &GeometryOptions,
) -> Result<LineGeometry, GeometryError> {
    line_geometry(rig, line, options, rig_size(rig))
}

/// A length that stands for the rig's size, m: twice the largest distance of a part
/// from the parts' centroid, plus the largest tread and rope diameters. Unchanged by
/// a rigid motion of the rig. Non-finite values are skipped.
///
/// Tolerances are scaled by it: two places closer than `1e-12 × size` coincide, and the
/// skew-axle tangent iteration stops at `GeometryOptions::tolerance × size`.
pub fn rig_size(rig: &Rig) -> Real {
    let finite: Vec<Point> = rig
        .parts
        .iter()
        .map(|p| p.at)
        .filter(|p| p.coords.iter().all(|x| x.is_finite()))
        .collect();
    let count = finite.len().max(1) as Real;
    let centroid = finite
        .iter()
        .fold(Point::origin(), |acc, p| acc + p.coords / count);
    let reach = finite
        .iter()
        .map(|p| (p - centroid).norm())
        .fold(0.0, Real::max);
    let tread = rig
        .parts
        .iter()
        .filter_map(|p| p.kind.round())
        .map(|r| r.tread_diameter)
        .filter(|d| d.is_finite())
        .fold(0.0, Real::max);
    let rope = rig
        .ropes
        .iter()
        .map(|r| r.diameter)
        .filter(|d| d.is_finite())
        .fold(0.0, Real::max);
    2.0 * reach + tread + rope
}

/// Pitch radius of a round part: the lever arm of the rope's centre line.
///
/// # Formula
/// `R = (D + d) / 2`.
///
/// # Arguments
/// - `tread_diameter`: groove-bottom (tread) diameter `D`, m, > 0.
/// - `rope_diameter`: rope diameter `d`, m, > 0.
///
/// # Returns
/// `R`, m.
///
/// # Example
/// A 60 mm sheave with 6 mm rope: `R = (0.060 + 0.006) / 2 = 0.033 m` (hand calculation).
/// ```
/// let r = reeve::geometry::pitch_radius(0.060, 0.006);
/// assert!((r - 0.033).abs() < 1e-15);
/// ```
///
/// Source: DESIGN.md section 1 (pitch radius of the rope's centre line).
pub fn pitch_radius(tread_diameter: Real, rope_diameter: Real) -> Real {
    0.5 * (tread_diameter + rope_diameter)
}

/// The sense in which a path turns about a round part, from its neighbours' centres.
///
/// # Formula
/// `σ = sign((c − p) × (n − c) · a)`; `None` when `|(c − p) × (n − c) · a|` is at most
/// `1e-12 |c − p| |n − c|` (the path runs straight through, or turns in a plane that
/// contains the axle).
///
/// # Arguments
/// - `previous`, `centre`, `next`: the previous entry's point, this part's centre and
///   the next entry's point, m.
/// - `axle`: this part's axle.
///
/// # Returns
/// `Some(+1.0)` anticlockwise about the axle (part on the rope's left), `Some(-1.0)`
/// clockwise, `None` when the path does not tell.
///
/// # Example
/// ```
/// use reeve::geometry::infer_sense;
/// use reeve::math::{Direction, Point, Vector};
/// let up = Direction::new_normalize(Vector::z());
/// // Running +x, then turning to +y: an anticlockwise turn about +z.
/// let sense = infer_sense(
///     &Point::new(-1.0, 0.0, 0.0), &Point::origin(), &Point::new(0.0, 1.0, 0.0), &up);
/// assert_eq!(sense, Some(1.0));
/// ```
///
/// Source: DESIGN.md section 2 (sign convention of this module).
pub fn infer_sense(
    previous: &Point,
    centre: &Point,
    next: &Point,
    axle: &Direction,
) -> Option<Real> {
    let incoming = centre - previous;
    let outgoing = next - centre;
    let turn = incoming.cross(&outgoing).dot(axle);
    if turn.abs() > DEGENERATE * incoming.norm() * outgoing.norm() {
        Some(turn.signum())
    } else {
        None
    }
}

/// Wrap below `2π` by less than this (radians) is round-off of a zero wrap (a path that
/// runs straight past a part on a given side) and is reported as 0.
pub const WRAP_ROUND_OFF: Real = 1e-9;

/// Angle through which the rope wraps a round part between its arriving and leaving
/// tangent points, measured in the rope's sense (extra full turns not included).
///
/// # Formula
/// With `rᵢ = tᵢ − c`: `φ = atan2(σ a · (r_in × r_out), r_in · r_out)`, taken into
/// `[0, 2π)`; values within [`WRAP_ROUND_OFF`] of `2π` are reported as 0.
///
/// # Arguments
/// - `centre`, `axle`, `sense`: the part's circle and the rope's sense (±1).
/// - `arrive`, `leave`: the arriving and leaving tangent points, m.
///
/// # Returns
/// `φ` in radians, `0 ≤ φ < 2π` (0 for degenerate input, never NaN).
///
/// # Example
/// Arriving at the top of a unit circle and leaving at its left side, running
/// anticlockwise: a quarter turn (hand calculation).
/// ```
/// use reeve::geometry::wrap_angle;
/// use reeve::math::{Direction, Point, Vector};
/// let up = Direction::new_normalize(Vector::z());
/// let phi = wrap_angle(&Point::origin(), &up, 1.0,
///     &Point::new(0.0, 1.0, 0.0), &Point::new(-1.0, 0.0, 0.0));
/// assert!((phi - std::f64::consts::FRAC_PI_2).abs() < 1e-12);
/// ```
///
/// Source: DESIGN.md sections 1 and 2 (wrap angle `phi`).
pub fn wrap_angle(
    centre: &Point,
    axle: &Direction,
    sense: Real,
    arrive: &Point,
    leave: &Point,
) -> Real {
    let arrive_radius = arrive - centre;
    let leave_radius = leave - centre;
    let turn = sense * axle.dot(&arrive_radius.cross(&leave_radius));
    let angle = turn.atan2(arrive_radius.dot(&leave_radius));
    let angle = if angle < 0.0 { angle + TAU } else { angle };
    // Negated `exceeds` also catches NaN.
    if !exceeds(TAU - WRAP_ROUND_OFF, angle) {
        0.0
    } else {
        angle
    }
}

/// Fleet angle: the angle between a span and the plane of the groove it enters or
/// leaves.
///
/// # Formula
/// `β = asin(|u · a|)`, `u` the span's unit direction and `a` the axle.
///
/// # Arguments
/// - `direction`: the span's direction.
/// - `axle`: the part's axle.
///
/// # Returns
/// `β` in radians, `0 ≤ β ≤ π/2`.
///
/// # Example
/// A span 1 m long in the plane, 0.1 m along the axle: `β = atan(0.1 / 1)` (hand
/// calculation).
/// ```
/// use reeve::geometry::fleet_angle;
/// use reeve::math::{Direction, Vector};
/// let axle = Direction::new_normalize(Vector::y());
/// let span = Direction::new_normalize(Vector::new(1.0, 0.1, 0.0));
/// assert!((fleet_angle(&span, &axle) - 0.1f64.atan()).abs() < 1e-12);
/// ```
///
/// Source: DESIGN.md section 2 (fleet angle).
pub fn fleet_angle(direction: &Direction, axle: &Direction) -> Real {
    let sine = direction.dot(axle).abs();
    if sine.is_finite() {
        sine.min(1.0).asin()
    } else {
        0.0
    }
}

/// Geometry of line `line_id`, with tolerances scaled by the rig's `size`.
fn line_geometry(
    rig: &Rig,
    line_id: LineId,
    options: &GeometryOptions,
    size: Real,
) -> Result<LineGeometry, GeometryError> {
    // Indexing below relies on the rig's ids being valid (see `compute`).
    let line = &rig.lines[line_id];
    let rope_diameter = rig.ropes[line.rope].diameter;
    let path = &line.path;
    let count = path.len();
    let part = |i: usize| &rig.parts[path[i].part];
    let name = |i: usize| part(i).name.clone();

    // Two entries at one place leave no span between them.
    for i in 1..count {
        if !exceeds((part(i).at - part(i - 1).at).norm(), DEGENERATE * size) {
            return Err(GeometryError::Coincident {
                line: line.name.clone(),
                a: name(i - 1),
                b: name(i),
            });
        }
    }

    let mut circles = Vec::with_capacity(count);
    for (i, entry) in path.iter().enumerate() {
        let here = part(i);
        let circle = match here.kind.round() {
            None => Circle::point(here.at),
            Some(round) => {
                let sense = match entry.side {
                    Some(side) => side.sense(),
                    // A passage between two neighbours: the path's turn tells.
                    None if i > 0 && i + 1 < count => {
                        infer_sense(&part(i - 1).at, &here.at, &part(i + 1).at, &round.axle)
                            .ok_or_else(|| GeometryError::AmbiguousSide {
                                line: line.name.clone(),
                                part: name(i),
                            })?
                    }
                    // A round part at a line end (a drum the rope is wound on): left.
                    None => 1.0,
                };
                Circle {
                    centre: here.at,
                    axle: round.axle,
                    radius: pitch_radius(round.tread_diameter, rope_diameter),
                    sense,
                }
            }
        };
        circles.push(circle);
    }

    let tangent_options = TangentOptions {
        tolerance: options.tolerance * size,
        max_iterations: options.max_iterations,
    };
    let mut spans = Vec::with_capacity(count.saturating_sub(1));
    for i in 1..count {
        let tangent = common_tangent(&circles[i - 1], &circles[i], &tangent_options)
            .map_err(|error| span_error(error, &line.name, name(i - 1), name(i)))?;
        let offset = tangent.end - tangent.start;
        let length = offset.norm();
        if !exceeds(length, DEGENERATE * size) {
            return Err(GeometryError::Coincident {
                line: line.name.clone(),
                a: name(i - 1),
                b: name(i),
            });
        }
        spans.push(SpanGeometry {
            start: tangent.start,
            end: tangent.end,
            length,
            direction: Direction::new_unchecked(offset / length),
        });
    }

    let entries = path
        .iter()
        .enumerate()
        .map(|(i, entry)| {
            let circle = &circles[i];
            let round = part(i).kind.round();
            let arriving = if i > 0 { spans.get(i - 1) } else { None };
            let leaving = spans.get(i);
            let (sense, wrap, fleet_in, fleet_out, bend_ratio) = match round {
                None => (None, 0.0, None, None, None),
                Some(round) => {
                    // Only a passage wraps; at a line end the rope is tied or wound on.
                    let wrap = match (arriving, leaving) {
                        (Some(a), Some(l)) if !circle.is_point() => {
                            wrap_angle(&circle.centre, &circle.axle, circle.sense, &a.end, &l.start)
                                + TAU * Real::from(entry.turns)
                        }
                        _ => 0.0,
                    };
                    let bend_ratio = round.tread_diameter / rope_diameter;
                    (
                        Some(circle.sense),
                        wrap,
                        arriving.map(|s| fleet_angle(&s.direction, &round.axle)),
                        leaving.map(|s| fleet_angle(&s.direction, &round.axle)),
                        bend_ratio.is_finite().then_some(bend_ratio),
                    )
                }
            };
            EntryGeometry {
                part: entry.part,
                centre: circle.centre,
                pitch_radius: circle.radius.max(0.0),
                sense,
                wrap,
                turns: entry.turns,
                fleet_in,
                fleet_out,
                bend_ratio,
            }
        })
        .collect();

    Ok(LineGeometry { entries, spans })
}

/// Names a tangent failure with the rig's names.
fn span_error(error: TangentError, line: &str, a: String, b: String) -> GeometryError {
    match error {
        TangentError::Coincident => GeometryError::Coincident {
            line: line.to_string(),
            a,
            b,
        },
        TangentError::Inside(End::Start) => GeometryError::InsideCircle {
            line: line.to_string(),
            part: a,
            point: b,
        },
        TangentError::Inside(End::End) => GeometryError::InsideCircle {
            line: line.to_string(),
            part: b,
            point: a,
        },
        TangentError::NotConverged {
            iterations,
            residual,
        } => GeometryError::NotConverged {
            line: line.to_string(),
            a,
            b,
            iterations,
            residual,
        },
    }
}

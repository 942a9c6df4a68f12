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
//! - Point parts (anchor, block, weight, haul) are circles of radius zero.

pub mod tangent;

use crate::math::{Direction, Point, Real};
use crate::rig::model::{PartId, Rig};

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
    /// extra full turns; 0 at a point part.
    pub wrap: Real,
    /// Extra full turns included in `wrap`.
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
    pub lines: Vec<LineGeometry>,
}

/// Options for the geometry solve.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct GeometryOptions {
    /// Convergence tolerance of the non-coplanar tangent iteration, m (default 1e-12 m
    /// relative to the rig's size, i.e. round-off).
    pub tolerance: Real,
    /// Iteration cap (default 200).
    pub max_iterations: usize,
}

impl Default for GeometryOptions {
    fn default() -> Self {
        GeometryOptions { tolerance: 1e-12, max_iterations: 200 }
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
    #[error("line `{line}`: `{a}` and `{b}` are at the same place; a span needs two distinct ends")]
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
/// # Errors
/// [`GeometryError`] when a point is inside a circle, two ends coincide, a side is
/// ambiguous, or a tangent iteration does not converge.
pub fn compute(rig: &Rig, options: &GeometryOptions) -> Result<Geometry, GeometryError> {
    let _ = (rig, options);
    unimplemented!("geometry::compute is being written")
}

//! Which projection draws the rig, at which standard scale: the four views, the scale
//! of ISO 5455 that fits the drawing area, and the default view (the one that draws
//! the fewest parts and spans on top of each other).

use crate::math::{Point, Real, Vector};
use crate::model::{PartId, Rig};
use crate::solve::Solution;

use super::sheet::{pitch_radius_of, plane_basis};

/// A parallel projection of the rig onto the sheet.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum View {
    /// Looking along +y: x to the right, z up.
    Front,
    /// Looking along −x: y to the right, z up.
    Side,
    /// Looking down −z: x to the right, y up.
    Top,
    /// Isometric, seen from (+x, −y, +z): the three axes equally foreshortened.
    Iso,
}

impl View {
    /// Every view, in the order the help lists them.
    pub const ALL: [View; 4] = [View::Front, View::Side, View::Top, View::Iso];

    /// Lowercase name.
    pub fn name(self) -> &'static str {
        match self {
            View::Front => "front",
            View::Side => "side",
            View::Top => "top",
            View::Iso => "iso",
        }
    }

    /// What the view looks along, for the title block.
    pub fn description(self) -> &'static str {
        match self {
            View::Front => "front view, looking along +y (x right, z up)",
            View::Side => "side view, looking along −x (y right, z up)",
            View::Top => "top view, looking down −z (x right, y up)",
            View::Iso => "isometric view from (+x, −y, +z); dimensions are not true lengths",
        }
    }

    /// The sheet's right and up directions in the world frame (orthonormal).
    pub fn axes(self) -> (Vector, Vector) {
        match self {
            View::Front => (Vector::x(), Vector::z()),
            View::Side => (Vector::y(), Vector::z()),
            View::Top => (Vector::x(), Vector::y()),
            View::Iso => (
                Vector::new(1.0, 1.0, 0.0) / 2.0_f64.sqrt(),
                Vector::new(-1.0, 1.0, 2.0) / 6.0_f64.sqrt(),
            ),
        }
    }
}

/// Every point the drawing must show: part points, span ends, and four points on each
/// round part's pitch circle.
pub(super) fn key_points(rig: &Rig, solution: &Solution) -> Vec<Point> {
    let mut points: Vec<Point> = rig.parts.iter().map(|p| p.at).collect();
    for line in &solution.geometry.lines {
        for s in &line.spans {
            points.push(s.start);
            points.push(s.end);
        }
    }
    for (id, part) in rig.parts.enumerate() {
        if let Some(round) = part.kind.round() {
            let r = pitch_radius_of(rig, solution, id);
            let (u, v) = plane_basis(&round.axle);
            for k in 0..8 {
                let t = k as Real * std::f64::consts::FRAC_PI_4;
                points.push(part.at + (u * t.cos() + v * t.sin()) * r);
            }
        }
    }
    points.retain(|p| p.coords.iter().all(|x| x.is_finite()));
    points
}

/// Width and height of the projected points, m.
pub(super) fn extent(points: &[Point], view: View) -> (Real, Real, Real, Real) {
    let (right, up) = view.axes();
    let mut b = (
        Real::INFINITY,
        Real::NEG_INFINITY,
        Real::INFINITY,
        Real::NEG_INFINITY,
    );
    for p in points {
        let (x, y) = (p.coords.dot(&right), p.coords.dot(&up));
        b = (b.0.min(x), b.1.max(x), b.2.min(y), b.3.max(y));
    }
    if !b.0.is_finite() {
        return (0.0, 0.0, 0.0, 0.0);
    }
    b
}

/// A point on the sheet, px from its top left corner (y down).
pub(super) type SheetPoint = (Real, Real);

/// A straight segment on the sheet: its two ends.
pub(super) type SheetSegment = [SheetPoint; 2];

/// Screen and print resolution of the sheet: 96 px per inch (CSS and SVG user units).
pub(super) const PX_PER_MM: Real = 96.0 / 25.4;

/// The drawing area for the rig on the sheet, px (wide, tall).
pub(super) const AREA: (Real, Real) = (700.0, 740.0);

/// Parts or spans closer than this on the sheet, px, are drawn on top of each other.
pub(super) const COINCIDENT_PX: Real = 4.5;

/// A standard drawing scale (ISO 5455 series 1, 2, 5 × 10ⁿ): `paper : real`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) struct DrawingScale {
    /// Real length per length on paper (20 for 1:20, 0.5 for 2:1).
    pub(super) real_per_paper: Real,
}

impl DrawingScale {
    /// The largest standard scale at which `width` × `height` metres fit `area` px.
    pub(super) fn fitting(width: Real, height: Real, area: (Real, Real)) -> DrawingScale {
        let fit = (area.0 / width.max(1e-9)).min(area.1 / height.max(1e-9));
        // From 100:1 (a small mechanism) to 1:50 000 000.
        let series = (-2..=7).flat_map(|k| [1.0, 2.0, 5.0].map(|m| m * 10f64.powi(k)));
        let mut chosen = 5e7;
        for real_per_paper in series {
            if PX_PER_MM * 1000.0 / real_per_paper <= fit {
                chosen = real_per_paper;
                break;
            }
        }
        DrawingScale {
            real_per_paper: chosen,
        }
    }

    /// Sheet px per real metre.
    pub(super) fn px_per_m(self) -> Real {
        PX_PER_MM * 1000.0 / self.real_per_paper
    }

    /// `1:20`, `1:1`, `5:1`.
    pub(super) fn ratio(self) -> String {
        if self.real_per_paper >= 1.0 {
            format!("1:{}", self.real_per_paper.round())
        } else {
            format!("{}:1", (1.0 / self.real_per_paper).round())
        }
    }
}

/// The scale a view of the rig is drawn at.
pub(super) fn view_scale(points: &[Point], view: View) -> DrawingScale {
    let (x0, x1, y0, y1) = extent(points, view);
    DrawingScale::fitting(x1 - x0, y1 - y0, AREA)
}

/// Whether two sheet segments lie on top of each other: nearly parallel, overlapping
/// along their length by more than `gap`, and nowhere in the overlap more than `gap`
/// apart.
pub(super) fn segments_coincide(a: SheetSegment, b: SheetSegment, gap: Real) -> bool {
    let (dx, dy) = (a[1].0 - a[0].0, a[1].1 - a[0].1);
    let len = dx.hypot(dy);
    if len < gap {
        // A span seen end-on is a dot: it coincides with a segment through it.
        let (ex, ey) = (b[1].0 - b[0].0, b[1].1 - b[0].1);
        let m = ex.hypot(ey);
        return m >= gap && {
            let cross = ((a[0].0 - b[0].0) * ey - (a[0].1 - b[0].1) * ex).abs() / m;
            let t = ((a[0].0 - b[0].0) * ex + (a[0].1 - b[0].1) * ey) / (m * m);
            cross < gap && (0.0..=1.0).contains(&t)
        };
    }
    let (ux, uy) = (dx / len, dy / len);
    let along = |p: SheetPoint| (p.0 - a[0].0) * ux + (p.1 - a[0].1) * uy;
    let across = |p: SheetPoint| (p.1 - a[0].1) * ux - (p.0 - a[0].0) * uy;
    let (s0, s1) = (along(b[0]), along(b[1]));
    if (s1 - s0).abs() < 1e-9 {
        return false;
    }
    let (lo, hi) = (s0.min(s1).max(0.0), s0.max(s1).min(len));
    if hi - lo < gap {
        return false;
    }
    let offset = |s: Real| {
        let t = (s - s0) / (s1 - s0);
        across((
            b[0].0 + (b[1].0 - b[0].0) * t,
            b[0].1 + (b[1].1 - b[0].1) * t,
        ))
    };
    offset(lo).abs() < gap && offset(hi).abs() < gap
}

/// Sheet positions (px, at the view's scale) of every part's point and of every span's
/// ends.
pub(super) fn projected(
    rig: &Rig,
    solution: &Solution,
    view: View,
    px_per_m: Real,
) -> (Vec<SheetPoint>, Vec<SheetSegment>) {
    let (right, up) = view.axes();
    let at = |p: &Point| {
        (
            p.coords.dot(&right) * px_per_m,
            -p.coords.dot(&up) * px_per_m,
        )
    };
    let parts = rig.parts.iter().map(|p| at(&p.at)).collect();
    let spans = solution
        .geometry
        .lines
        .iter()
        .flat_map(|l| l.spans.iter().map(|s| [at(&s.start), at(&s.end)]))
        .collect();
    (parts, spans)
}

/// Groups of indices whose items `close` joins (transitively), in index order.
pub(super) fn groups(n: usize, close: impl Fn(usize, usize) -> bool) -> Vec<Vec<usize>> {
    let mut group: Vec<usize> = (0..n).collect();
    for i in 0..n {
        for j in i + 1..n {
            if close(i, j) {
                let (gi, gj) = (group[i], group[j]);
                for g in group.iter_mut().filter(|g| **g == gj) {
                    *g = gi;
                }
            }
        }
    }
    let mut out: Vec<Vec<usize>> = Vec::new();
    for i in 0..n {
        match out.iter_mut().find(|g| group[g[0]] == group[i]) {
            Some(g) => g.push(i),
            None => out.push(vec![i]),
        }
    }
    out
}

/// How many pairs of parts (other than a block and the parts it carries) and pairs of
/// spans a view draws on top of each other at its scale, and how many spans it shows
/// only end-on (as dots).
pub(super) fn overlaps(rig: &Rig, solution: &Solution, points: &[Point], view: View) -> usize {
    let (parts, spans) = projected(rig, solution, view, view_scale(points, view).px_per_m());
    let carried = |i: usize, j: usize| solution.network.carries(PartId::new(i), PartId::new(j));
    let mut n = 0;
    for i in 0..parts.len() {
        for j in i + 1..parts.len() {
            let d = (parts[i].0 - parts[j].0).hypot(parts[i].1 - parts[j].1);
            if d < COINCIDENT_PX && !carried(i, j) {
                n += 1;
            }
        }
    }
    for (i, span) in spans.iter().enumerate() {
        // A span seen end-on is a dot: the view does not show it.
        if (span[1].0 - span[0].0).hypot(span[1].1 - span[0].1) < COINCIDENT_PX {
            n += 1;
        }
        for j in i + 1..spans.len() {
            if segments_coincide(spans[i], spans[j], COINCIDENT_PX)
                || segments_coincide(spans[j], spans[i], COINCIDENT_PX)
            {
                n += 1;
            }
        }
    }
    n
}

/// A view whose projected area is below this share of the largest orthographic view's
/// is the rig seen (nearly) edge-on: it shows no layout, however well it separates the
/// parts.
pub(super) const EDGE_ON_AREA: Real = 0.01;

/// The view that separates the rig's parts and spans best: of front, side, top and
/// iso, leaving out views that see the rig edge-on (area under 1 % of the largest
/// orthographic view's), the one that draws the fewest pairs of parts or spans on top
/// of each other, and spans end-on, at its scale; among equals an orthographic view
/// (true lengths) before the isometric, then the largest projected area, then the
/// largest perimeter; ties go to front, then side, then top.
pub fn default_view(rig: &Rig, solution: &Solution) -> View {
    let points = key_points(rig, solution);
    let views = [View::Front, View::Side, View::Top, View::Iso];
    let size = |v: View| {
        let (x0, x1, y0, y1) = extent(&points, v);
        ((x1 - x0) * (y1 - y0), (x1 - x0) + (y1 - y0))
    };
    // Against the orthographic views only: a rig along one axis has no area in any of
    // them and some in the isometric, yet its front view shows it best.
    let largest = views[..3].iter().map(|&v| size(v).0).fold(0.0, Real::max);
    let mut best: Option<(View, (usize, bool, Real, Real))> = None;
    for v in views {
        let (area, perimeter) = size(v);
        if area < EDGE_ON_AREA * largest {
            continue;
        }
        let score = (
            overlaps(rig, solution, &points, v),
            v == View::Iso,
            area,
            perimeter,
        );
        let better = best.map_or(true, |(_, (bn, biso, ba, bp))| {
            (score.0, score.1) < (bn, biso)
                || ((score.0, score.1) == (bn, biso)
                    && (area > ba * (1.0 + 1e-9)
                        || (area >= ba * (1.0 - 1e-9) && perimeter > bp * (1.0 + 1e-9))))
        });
        if better {
            best = Some((v, score));
        }
    }
    best.map_or(View::Front, |(v, _)| v)
}

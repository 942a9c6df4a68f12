//! The rig drawing of `reeve draw`: a hand-written SVG, drawn to scale in one of four
//! parallel projections.
//!
//! Round parts are their pitch circles in their own planes, projected (ellipses in
//! general, drawn as closed paths); anchors, blocks, weights and haul ends are symbols at
//! their points; each span is a straight line between its true tangent points,
//! coloured by its forward tension on the legend's scale and labelled with it; the rope
//! lying on each round part is drawn as an arc. Parts named by a warning are ringed in
//! red. Overall dimensions, a legend, a title block and the caution complete the sheet.
//!
//! Every span is one element `class="span"` and every part one `<g class="part">`, each
//! with `data-` attributes naming it, so tests and scripts can find them.

use std::fmt::Write as _;
use std::io::{self, Write};

use crate::math::{Point, Real, Vector};
use crate::rig::model::{PartKind, Rig};
use crate::solve::Solution;
use crate::units::{Dimension, UnitSystem};

use super::escape::xml as esc;
use super::table::units_line;
use super::text::quantity;
use super::{Report, CAUTION};

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

/// Settings of the drawing.
#[derive(Debug, Clone, PartialEq)]
pub struct DrawOptions {
    /// The projection; `None` picks [`default_view`].
    pub view: Option<View>,
    /// The date shown in the title block (`YYYY-MM-DD`).
    pub date: String,
    /// A stand-alone SVG file (XML prolog, fixed size) rather than one inlined in HTML.
    pub standalone: bool,
}

/// The Gregorian date `YYYY-MM-DD` of a day counted from 1970-01-01 (day 0).
///
/// Civil-from-days algorithm of H. Hinnant, "chrono-Compatible Low-Level Date
/// Algorithms" (public domain), exact for every day in range.
pub fn civil_date(days: i64) -> String {
    let z = days + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z.rem_euclid(146_097);
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let day = doy - (153 * mp + 2) / 5 + 1;
    let month = if mp < 10 { mp + 3 } else { mp - 9 };
    let year = yoe + era * 400 + i64::from(month <= 2);
    format!("{year:04}-{month:02}-{day:02}")
}

/// Every point the drawing must show: part points, span ends, and four points on each
/// round part's pitch circle.
fn key_points(rig: &Rig, solution: &Solution) -> Vec<Point> {
    let mut points: Vec<Point> = rig.parts.iter().map(|p| p.at).collect();
    for line in &solution.geometry.lines {
        for s in &line.spans {
            points.push(s.start);
            points.push(s.end);
        }
    }
    for (id, part) in rig.parts.iter().enumerate() {
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
fn extent(points: &[Point], view: View) -> (Real, Real, Real, Real) {
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

/// The view that spreads the rig most: of front, side and top, the one whose projected
/// bounding box has the largest area (a flat rig seen edge-on has none), then the
/// largest perimeter; ties go to front, then side.
pub fn default_view(rig: &Rig, solution: &Solution) -> View {
    let points = key_points(rig, solution);
    let score = |v: View| {
        let (x0, x1, y0, y1) = extent(&points, v);
        ((x1 - x0) * (y1 - y0), (x1 - x0) + (y1 - y0))
    };
    let mut best = View::Front;
    for v in [View::Side, View::Top] {
        let (a, p) = score(v);
        let (ba, bp) = score(best);
        if a > ba * (1.0 + 1e-9) || (a >= ba * (1.0 - 1e-9) && p > bp * (1.0 + 1e-9)) {
            best = v;
        }
    }
    best
}

/// Two unit vectors spanning the plane normal to `axle`.
fn plane_basis(axle: &Vector) -> (Vector, Vector) {
    let a = axle.normalize();
    let helper = if a.x.abs() < 0.9 {
        Vector::x()
    } else {
        Vector::y()
    };
    let u = a.cross(&helper).normalize();
    let v = a.cross(&u);
    (u, v)
}

/// The pitch radius a part is drawn with: from the first line that passes it, else
/// half its tread.
fn pitch_radius_of(rig: &Rig, solution: &Solution, part: usize) -> Real {
    solution
        .geometry
        .lines
        .iter()
        .flat_map(|l| l.entries.iter())
        .find(|e| e.part == part)
        .map(|e| e.pitch_radius)
        .or_else(|| rig.parts[part].kind.round().map(|r| r.tread_diameter / 2.0))
        .unwrap_or(0.0)
}

/// Sheet coordinates from world points.
struct Sheet {
    right: Vector,
    up: Vector,
    x0: Real,
    y1: Real,
    scale: Real,
    left: Real,
    top: Real,
}

impl Sheet {
    fn at(&self, p: &Point) -> (Real, Real) {
        (
            self.left + (p.coords.dot(&self.right) - self.x0) * self.scale,
            self.top + (self.y1 - p.coords.dot(&self.up)) * self.scale,
        )
    }
    /// A world direction on the sheet (pixels per metre, y down).
    fn dir(&self, v: &Vector) -> (Real, Real) {
        (v.dot(&self.right), -v.dot(&self.up))
    }
}

/// Colour stops of the tension scale, low to high.
const RAMP: [(u8, u8, u8); 4] = [(31, 78, 156), (42, 157, 143), (233, 162, 59), (209, 73, 91)];

/// The colour of a fraction 0..1 of the tension scale.
fn ramp(t: Real) -> String {
    let t = if t.is_finite() {
        t.clamp(0.0, 1.0)
    } else {
        0.0
    };
    let x = t * (RAMP.len() - 1) as Real;
    let i = (x.floor() as usize).min(RAMP.len() - 2);
    let f = x - i as Real;
    let mix = |a: u8, b: u8| (a as Real + (b as Real - a as Real) * f).round() as u8;
    // In range: `i <= RAMP.len() - 2` by the `min` above.
    let (a, b) = (RAMP[i], RAMP[i + 1]);
    format!(
        "#{:02x}{:02x}{:02x}",
        mix(a.0, b.0),
        mix(a.1, b.1),
        mix(a.2, b.2)
    )
}

/// The colour `#rrggbb` mixed 40 % with black, for text that must stay legible.
fn darken(colour: &str) -> String {
    let channel = |i: usize| {
        colour
            .get(i..i + 2)
            .and_then(|h| u8::from_str_radix(h, 16).ok())
            .map_or(0, |c| (c as Real * 0.6).round() as u8)
    };
    format!("#{:02x}{:02x}{:02x}", channel(1), channel(3), channel(5))
}

/// Boxes already taken by labels, so later labels look for a free place.
#[derive(Default)]
struct Placer {
    taken: Vec<(Real, Real, Real, Real)>,
}

const FONT: Real = 11.0;

fn text_width(s: &str, size: Real) -> Real {
    s.chars().count() as Real * size * 0.58
}

impl Placer {
    fn free(&self, b: (Real, Real, Real, Real)) -> bool {
        self.taken
            .iter()
            .all(|t| b.2 <= t.0 || b.0 >= t.2 || b.3 <= t.1 || b.1 >= t.3)
    }
    /// Picks the first candidate anchor (left-aligned text baseline) whose box is free,
    /// else the first; records it.
    fn place(&mut self, candidates: &[(Real, Real)], label: &str) -> (Real, Real) {
        let w = text_width(label, FONT);
        let boxed = |(x, y): (Real, Real)| (x - 1.0, y - FONT, x + w + 1.0, y + 3.0);
        let chosen = candidates
            .iter()
            .copied()
            .find(|&c| self.free(boxed(c)))
            .or_else(|| candidates.first().copied())
            .unwrap_or((0.0, 0.0));
        self.taken.push(boxed(chosen));
        chosen
    }
    fn reserve(&mut self, x: Real, y: Real, r: Real) {
        self.taken.push((x - r, y - r, x + r, y + r));
    }
}

/// Breaks `text` into lines of at most `width` characters at spaces.
pub fn wrap_words(text: &str, width: usize) -> Vec<String> {
    let mut lines = Vec::new();
    let mut line = String::new();
    for word in text.split_whitespace() {
        if !line.is_empty() && line.chars().count() + 1 + word.chars().count() > width {
            lines.push(std::mem::take(&mut line));
        }
        if !line.is_empty() {
            line.push(' ');
        }
        line.push_str(word);
    }
    if !line.is_empty() {
        lines.push(line);
    }
    lines
}

/// A closed path along a circle of radius `r` about `centre` in the plane normal to
/// `axle`, projected onto the sheet.
fn circle_path(sheet: &Sheet, centre: &Point, axle: &Vector, r: Real) -> String {
    let (u, v) = plane_basis(axle);
    let mut d = String::new();
    const STEPS: usize = 72;
    for k in 0..STEPS {
        let t = k as Real * std::f64::consts::TAU / STEPS as Real;
        let (x, y) = sheet.at(&(centre + (u * t.cos() + v * t.sin()) * r));
        let _ = write!(d, "{}{x:.1},{y:.1} ", if k == 0 { "M" } else { "L" });
    }
    d.push('Z');
    d
}

/// Rodrigues rotation of `r` about unit `axis` by `angle`.
fn rotate(r: &Vector, axis: &Vector, angle: Real) -> Vector {
    let (s, c) = angle.sin_cos();
    r * c + axis.cross(r) * s + axis * axis.dot(r) * (1.0 - c)
}

/// Writes the drawing as SVG.
///
/// # Errors
/// Only those of `w`.
pub fn write_svg(
    w: &mut dyn Write,
    rig: &Rig,
    solution: &Solution,
    report: &Report,
    options: &DrawOptions,
) -> io::Result<()> {
    let svg = render(rig, solution, report, options);
    w.write_all(svg.as_bytes())
}

/// The drawing as an SVG string (see [`write_svg`]).
pub fn render(rig: &Rig, solution: &Solution, report: &Report, options: &DrawOptions) -> String {
    let units = &rig.units;
    let view = options.view.unwrap_or_else(|| default_view(rig, solution));
    let points = key_points(rig, solution);
    let (x0, x1, y0, y1) = extent(&points, view);
    let (right, up) = view.axes();

    // Sheet layout, px: drawing area on the left, legend on the right, title block and
    // caution below.
    const PAGE_W: Real = 1000.0;
    const AREA_W: Real = 700.0;
    const AREA_H: Real = 740.0;
    const LEFT: Real = 90.0;
    const TOP: Real = 50.0;
    let (span_w, span_h) = ((x1 - x0).max(1e-9), (y1 - y0).max(1e-9));
    let scale = (AREA_W / span_w).min(AREA_H / span_h);
    let scale = if scale.is_finite() && scale > 0.0 {
        scale
    } else {
        1.0
    };
    let (draw_w, draw_h) = ((x1 - x0) * scale, (y1 - y0) * scale);
    // Centre narrow drawings in the area.
    let left = LEFT + (AREA_W - draw_w).max(0.0) / 2.0;
    let sheet = Sheet {
        right,
        up,
        x0,
        y1,
        scale,
        left,
        top: TOP,
    };
    let caution_lines = wrap_words(CAUTION, 150);
    // Below the drawing and its dimensions, and below the legend and key on the right.
    let block_top = (TOP + draw_h + 80.0).max(TOP + 440.0);
    let page_h = block_top + 120.0 + caution_lines.len() as Real * 12.0 + 16.0;

    let mut s = String::new();
    let warned: Vec<&str> = report
        .warnings
        .iter()
        .filter_map(|w| w.part.as_deref())
        .collect();

    // Tension scale over forward tensions.
    let tensions: Vec<Real> = report
        .spans
        .iter()
        .filter_map(|sp| sp.tension_n.forward)
        .collect();
    let t_min = tensions.iter().copied().fold(Real::INFINITY, Real::min);
    let t_max = tensions.iter().copied().fold(Real::NEG_INFINITY, Real::max);
    let fraction = |t: Real| {
        if t_max - t_min > 1e-9 * t_max.abs().max(1e-300) {
            (t - t_min) / (t_max - t_min)
        } else {
            0.5
        }
    };

    if options.standalone {
        s.push_str("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        let _ = writeln!(
            s,
            "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{PAGE_W:.0}\" height=\"{page_h:.0}\" viewBox=\"0 0 {PAGE_W:.0} {page_h:.0}\" font-family=\"DejaVu Sans, Helvetica, Arial, sans-serif\" data-view=\"{}\">",
            view.name()
        );
    } else {
        let _ = writeln!(
            s,
            "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {PAGE_W:.0} {page_h:.0}\" class=\"drawing\" role=\"img\" aria-label=\"{} ({})\" font-family=\"DejaVu Sans, Helvetica, Arial, sans-serif\" data-view=\"{}\">",
            esc(&report.title),
            view.name(),
            view.name()
        );
    }
    let _ = writeln!(s, "<title>{}</title>", esc(&report.title));
    s.push_str(concat!(
        "<defs>\n",
        "<marker id=\"arrow\" viewBox=\"0 0 10 10\" refX=\"9\" refY=\"5\" markerWidth=\"7\" markerHeight=\"7\" orient=\"auto-start-reverse\"><path d=\"M0,0 L10,5 L0,10 z\" fill=\"context-stroke\"/></marker>\n",
        "<marker id=\"dim\" viewBox=\"0 0 10 10\" refX=\"10\" refY=\"5\" markerWidth=\"8\" markerHeight=\"8\" orient=\"auto-start-reverse\"><path d=\"M0,2 L10,5 L0,8 z\" fill=\"#555\"/></marker>\n",
        "<pattern id=\"hatch\" width=\"6\" height=\"6\" patternUnits=\"userSpaceOnUse\" patternTransform=\"rotate(45)\"><line x1=\"0\" y1=\"0\" x2=\"0\" y2=\"6\" stroke=\"#777\" stroke-width=\"1.2\"/></pattern>\n",
        "<linearGradient id=\"tension-scale\" x1=\"0\" y1=\"1\" x2=\"0\" y2=\"0\">\n",
    ));
    for (k, _) in RAMP.iter().enumerate() {
        let f = k as Real / (RAMP.len() - 1) as Real;
        let _ = writeln!(s, "<stop offset=\"{:.3}\" stop-color=\"{}\"/>", f, ramp(f));
    }
    s.push_str("</linearGradient>\n</defs>\n");
    let _ = writeln!(
        s,
        "<rect x=\"0\" y=\"0\" width=\"{PAGE_W:.0}\" height=\"{page_h:.0}\" fill=\"#ffffff\"/>"
    );
    let _ = writeln!(
        s,
        "<rect x=\"6\" y=\"6\" width=\"{:.0}\" height=\"{:.0}\" fill=\"none\" stroke=\"#333\" stroke-width=\"1\"/>",
        PAGE_W - 12.0,
        page_h - 12.0
    );

    let mut placer = Placer::default();

    // Overall dimensions (true lengths only in the orthographic views).
    if view != View::Iso {
        let len = |m: Real| quantity(Some(m), Dimension::Length, units);
        let (ax, bx) = (left, left + draw_w);
        let ybase = TOP + draw_h + 34.0;
        let _ = writeln!(
            s,
            "<g class=\"dimension\" stroke=\"#555\" stroke-width=\"0.8\" fill=\"none\">\
<line x1=\"{ax:.1}\" y1=\"{:.1}\" x2=\"{ax:.1}\" y2=\"{:.1}\"/>\
<line x1=\"{bx:.1}\" y1=\"{:.1}\" x2=\"{bx:.1}\" y2=\"{:.1}\"/>\
<line x1=\"{ax:.1}\" y1=\"{ybase:.1}\" x2=\"{bx:.1}\" y2=\"{ybase:.1}\" marker-start=\"url(#dim)\" marker-end=\"url(#dim)\"/></g>",
            TOP + draw_h + 8.0,
            ybase + 5.0,
            TOP + draw_h + 8.0,
            ybase + 5.0
        );
        let label = len(x1 - x0);
        let _ = writeln!(
            s,
            "<text class=\"dimension-label\" x=\"{:.1}\" y=\"{:.1}\" font-size=\"{FONT}\" text-anchor=\"middle\" fill=\"#333\" stroke=\"#fff\" stroke-width=\"3\" paint-order=\"stroke\">{}</text>",
            (ax + bx) / 2.0,
            ybase + 15.0,
            esc(&label)
        );
        let xbase = left - 40.0;
        let (ay, by) = (TOP, TOP + draw_h);
        let _ = writeln!(
            s,
            "<g class=\"dimension\" stroke=\"#555\" stroke-width=\"0.8\" fill=\"none\">\
<line x1=\"{:.1}\" y1=\"{ay:.1}\" x2=\"{:.1}\" y2=\"{ay:.1}\"/>\
<line x1=\"{:.1}\" y1=\"{by:.1}\" x2=\"{:.1}\" y2=\"{by:.1}\"/>\
<line x1=\"{xbase:.1}\" y1=\"{ay:.1}\" x2=\"{xbase:.1}\" y2=\"{by:.1}\" marker-start=\"url(#dim)\" marker-end=\"url(#dim)\"/></g>",
            xbase - 5.0,
            left - 8.0,
            xbase - 5.0,
            left - 8.0
        );
        let (tx, ty) = (xbase - 6.0, (ay + by) / 2.0);
        let half = text_width(&len(y1 - y0), FONT) / 2.0 + 4.0;
        placer
            .taken
            .push((tx - FONT - 2.0, ty - half, tx + 6.0, ty + half));
        let _ = writeln!(
            s,
            "<text class=\"dimension-label\" x=\"{tx:.1}\" y=\"{ty:.1}\" font-size=\"{FONT}\" text-anchor=\"middle\" fill=\"#333\" stroke=\"#fff\" stroke-width=\"3\" paint-order=\"stroke\" transform=\"rotate(-90 {tx:.1} {ty:.1})\">{}</text>",
            esc(&len(y1 - y0))
        );
    }

    // Rope lying on round parts (drawn first, under the parts' outlines).
    s.push_str("<g class=\"wraps\" fill=\"none\" stroke=\"#666\" stroke-width=\"2\">\n");
    for (l, line) in solution.geometry.lines.iter().enumerate() {
        for (e, entry) in line.entries.iter().enumerate() {
            let (Some(sense), Some(round)) = (entry.sense, rig.parts[entry.part].kind.round())
            else {
                continue;
            };
            if e == 0 || e + 1 >= line.entries.len() {
                continue;
            }
            // In range: 0 < e < entries.len() = spans.len() + 1 (checked above).
            let arrive = line.spans[e - 1].end;
            let turn = entry.wrap.rem_euclid(std::f64::consts::TAU);
            if turn <= 1e-6 {
                continue;
            }
            let axle = round.axle.into_inner();
            let r0 = arrive - entry.centre;
            let steps = ((turn / 0.05).ceil() as usize).clamp(2, 400);
            let mut d = String::new();
            for k in 0..=steps {
                let a = sense * turn * k as Real / steps as Real;
                let p = entry.centre + rotate(&r0, &axle, a);
                let (x, y) = sheet.at(&p);
                let _ = write!(d, "{}{x:.1},{y:.1} ", if k == 0 { "M" } else { "L" });
            }
            let _ = writeln!(
                s,
                "<path class=\"wrap\" data-line=\"{}\" data-entry=\"{e}\" d=\"{}\"/>",
                esc(&rig.lines[l].name),
                d.trim_end()
            );
        }
    }
    s.push_str("</g>\n");

    // Spans: one element each, coloured by forward tension.
    let mut span_labels = Vec::new();
    let mut k = 0;
    for (l, line) in solution.geometry.lines.iter().enumerate() {
        for (j, span) in line.spans.iter().enumerate() {
            let row = report
                .spans
                .iter()
                .find(|r| r.line == rig.lines[l].name && r.index == j);
            let forward = row.and_then(|r| r.tension_n.forward);
            let colour = forward.map_or("#999999".to_string(), |t| ramp(fraction(t)));
            let (ax, ay) = sheet.at(&span.start);
            let (bx, by) = sheet.at(&span.end);
            // In range: span j joins path entries j and j + 1 (geometry's convention).
            let (from, to) = (
                &rig.parts[rig.lines[l].path[j].part].name,
                &rig.parts[rig.lines[l].path[j + 1].part].name,
            );
            let _ = writeln!(
                s,
                "<line class=\"span\" data-line=\"{}\" data-span=\"{j}\" data-from=\"{}\" data-to=\"{}\" data-tension-forward-n=\"{}\" x1=\"{ax:.1}\" y1=\"{ay:.1}\" x2=\"{bx:.1}\" y2=\"{by:.1}\" stroke=\"{colour}\" stroke-width=\"3\" stroke-linecap=\"round\"><title>{} span {j}: {} → {}, forward {}</title></line>",
                esc(&rig.lines[l].name),
                esc(from),
                esc(to),
                forward.map_or("".to_string(), |t| format!("{t:.6e}")),
                esc(&rig.lines[l].name),
                esc(from),
                esc(to),
                esc(&quantity(forward, Dimension::Force, units))
            );
            span_labels.push((k, (ax, ay), (bx, by), forward, colour));
            k += 1;
        }
    }

    // Parts.
    let mut part_label_requests = Vec::new();
    for (id, part) in rig.parts.iter().enumerate() {
        let (cx, cy) = sheet.at(&part.at);
        let is_warned = warned.contains(&part.name.as_str());
        let _ = write!(
            s,
            "<g class=\"part\" data-part=\"{}\" data-kind=\"{}\"{}>",
            esc(&part.name),
            part.kind.name(),
            if is_warned {
                " data-warning=\"true\""
            } else {
                ""
            }
        );
        // Half-extents of the part's symbol on the sheet, px.
        let (half_w, half_h): (Real, Real) = match &part.kind {
            PartKind::Sheave(_) | PartKind::Guide(_) | PartKind::Drum(_) => {
                // Round parts always have a round shape; an axle along z stands in.
                let axle = part
                    .kind
                    .round()
                    .map_or(Vector::z(), |round| round.axle.into_inner());
                let r = pitch_radius_of(rig, solution, id);
                let (fill, stroke) = match part.kind {
                    PartKind::Guide(_) => ("url(#hatch)", "#333"),
                    PartKind::Drum(_) => ("#e8e2d4", "#333"),
                    _ => ("#f4f4f4", "#333"),
                };
                let _ = write!(
                    s,
                    "<path d=\"{}\" fill=\"{fill}\" fill-opacity=\"0.85\" stroke=\"{stroke}\" stroke-width=\"1.3\"/>",
                    circle_path(&sheet, &part.at, &axle, r)
                );
                if matches!(part.kind, PartKind::Drum(_)) {
                    let _ = write!(
                        s,
                        "<path d=\"{}\" fill=\"none\" stroke=\"#333\" stroke-width=\"0.8\"/>",
                        circle_path(&sheet, &part.at, &axle, r * 0.6)
                    );
                }
                let _ = write!(
                    s,
                    "<circle cx=\"{cx:.1}\" cy=\"{cy:.1}\" r=\"2.2\" fill=\"#333\"/>"
                );
                let (u, v) = plane_basis(&axle);
                let (a, b) = (sheet.dir(&u), sheet.dir(&v));
                (
                    (r * scale * a.0.hypot(b.0)).max(4.0) + 2.0,
                    (r * scale * a.1.hypot(b.1)).max(4.0) + 2.0,
                )
            }
            PartKind::Anchor => {
                let _ = write!(
                    s,
                    "<path d=\"M{cx:.1},{cy:.1} l-8,-12 h16 z\" fill=\"url(#hatch)\" stroke=\"#333\" stroke-width=\"1.2\"/><circle cx=\"{cx:.1}\" cy=\"{cy:.1}\" r=\"2.5\" fill=\"#333\"/>"
                );
                (10.0, 10.0)
            }
            PartKind::Block(block) => {
                let _ = write!(
                    s,
                    "<rect x=\"{:.1}\" y=\"{:.1}\" width=\"14\" height=\"14\" fill=\"#cfd8e3\" stroke=\"#333\" stroke-width=\"1.2\"/>",
                    cx - 7.0,
                    cy - 7.0
                );
                let (dx, dy) = sheet.dir(&block.moves.into_inner());
                let n = dx.hypot(dy);
                if n > 0.05 {
                    let _ = write!(
                        s,
                        "<line x1=\"{cx:.1}\" y1=\"{cy:.1}\" x2=\"{:.1}\" y2=\"{:.1}\" stroke=\"#1f6f3f\" stroke-width=\"1.5\" stroke-dasharray=\"4 2\" marker-end=\"url(#arrow)\"/>",
                        cx + dx / n * 28.0,
                        cy + dy / n * 28.0
                    );
                }
                (10.0, 10.0)
            }
            PartKind::Weight(_) => {
                let _ = write!(
                    s,
                    "<rect x=\"{:.1}\" y=\"{:.1}\" width=\"18\" height=\"22\" rx=\"2\" fill=\"#555\" stroke=\"#222\" stroke-width=\"1\"/>",
                    cx - 9.0,
                    cy
                );
                (12.0, 12.0)
            }
            PartKind::Haul(haul) => {
                let pull = haul.pull.map(|p| p.into_inner()).or_else(|| {
                    // Default pull: along the last span, away from the previous part.
                    solution
                        .geometry
                        .lines
                        .iter()
                        .enumerate()
                        .find_map(|(l, g)| {
                            let path = &rig.lines[l].path;
                            if path.last().map(|e| e.part) == Some(id) {
                                g.spans.last().map(|sp| sp.direction.into_inner())
                            } else if path.first().map(|e| e.part) == Some(id) {
                                g.spans.first().map(|sp| -sp.direction.into_inner())
                            } else {
                                None
                            }
                        })
                });
                let _ = write!(
                    s,
                    "<circle cx=\"{cx:.1}\" cy=\"{cy:.1}\" r=\"4\" fill=\"#fff\" stroke=\"#b3261e\" stroke-width=\"1.5\"/>"
                );
                if let Some(p) = pull {
                    let (dx, dy) = sheet.dir(&p);
                    let n = dx.hypot(dy);
                    if n > 0.05 {
                        let _ = write!(
                            s,
                            "<line class=\"pull\" x1=\"{cx:.1}\" y1=\"{cy:.1}\" x2=\"{:.1}\" y2=\"{:.1}\" stroke=\"#b3261e\" stroke-width=\"2.5\" marker-end=\"url(#arrow)\"/>",
                            cx + dx / n * 40.0,
                            cy + dy / n * 40.0
                        );
                    } else {
                        // Pull along the line of sight: a dot in a circle.
                        let _ = write!(
                            s,
                            "<circle cx=\"{cx:.1}\" cy=\"{cy:.1}\" r=\"8\" fill=\"none\" stroke=\"#b3261e\" stroke-width=\"1.5\"/>"
                        );
                    }
                }
                (10.0, 10.0)
            }
        };
        let reach = half_w.max(half_h);
        if is_warned {
            let _ = write!(
                s,
                "<circle class=\"warning-mark\" cx=\"{cx:.1}\" cy=\"{cy:.1}\" r=\"{:.1}\" fill=\"none\" stroke=\"#d00000\" stroke-width=\"2\" stroke-dasharray=\"5 3\"/>",
                reach + 5.0
            );
            let messages: Vec<String> = report
                .warnings
                .iter()
                .filter(|w| w.part.as_deref() == Some(part.name.as_str()))
                .map(|w| format!("[{}] {}", w.code, w.message))
                .collect();
            let _ = write!(s, "<title>{}</title>", esc(&messages.join("\n")));
        } else {
            let _ = write!(
                s,
                "<title>{} ({})</title>",
                esc(&part.name),
                part.kind.name()
            );
        }
        s.push_str("</g>\n");
        placer.reserve(cx, cy, reach.min(30.0));
        part_label_requests.push((id, cx, cy, half_w, half_h, is_warned));
    }

    // Part labels, then span labels, each in the first free place.
    s.push_str("<g class=\"labels\" font-size=\"11\">\n");
    for (id, cx, cy, half_w, half_h, is_warned) in part_label_requests {
        let name = &rig.parts[id].name;
        let label = if is_warned {
            format!("⚠ {name}")
        } else {
            name.clone()
        };
        let w = text_width(&label, FONT);
        // Around the symbol's outline: the diagonals first (at 70 % of the half-extents,
        // which hugs a circle and stays near the middle of an edge-on sheave), then
        // above, below, right and left.
        let (dx, dy) = (0.7 * half_w + 4.0, 0.7 * half_h + 4.0);
        let candidates = [
            (cx + dx, cy - dy),
            (cx + dx, cy + dy + FONT),
            (cx - dx - w, cy - dy),
            (cx - dx - w, cy + dy + FONT),
            (cx - w / 2.0, cy - half_h - 4.0),
            (cx - w / 2.0, cy + half_h + 4.0 + FONT),
            (cx + half_w + 4.0, cy + FONT / 2.0 - 2.0),
            (cx - half_w - 4.0 - w, cy + FONT / 2.0 - 2.0),
        ];
        let (x, y) = placer.place(&candidates, &label);
        let _ = writeln!(
            s,
            "<text class=\"part-label\" data-part=\"{}\" x=\"{x:.1}\" y=\"{y:.1}\" fill=\"{}\" font-weight=\"bold\" stroke=\"#fff\" stroke-width=\"3\" paint-order=\"stroke\">{}</text>",
            esc(name),
            if is_warned { "#b00000" } else { "#111" },
            esc(&label)
        );
    }
    for (k, (ax, ay), (bx, by), forward, colour) in span_labels {
        let label = quantity(forward, Dimension::Force, units);
        let w = text_width(&label, FONT);
        let mut candidates = Vec::new();
        let (dx, dy) = (bx - ax, by - ay);
        let n = dx.hypot(dy).max(1e-9);
        let (nx, ny) = (-dy / n, dx / n);
        // Stagger labels of neighbouring spans along their length.
        let first = [0.5, 0.35, 0.65, 0.25, 0.75, 0.15, 0.85];
        let start = k % first.len();
        for i in 0..first.len() {
            let f = first[(start + i) % first.len()];
            let (mx, my) = (ax + dx * f, ay + dy * f);
            for side in [1.0, -1.0] {
                let ox = mx + nx * 8.0 * side;
                let oy = my + ny * 8.0 * side;
                let x = if nx * side >= 0.0 { ox } else { ox - w };
                let y = if ny * side >= 0.0 { oy + FONT } else { oy };
                candidates.push((x, y));
            }
        }
        let (x, y) = placer.place(&candidates, &label);
        let colour = darken(&colour);
        let _ = writeln!(
            s,
            "<text class=\"span-label\" x=\"{x:.1}\" y=\"{y:.1}\" fill=\"{colour}\" stroke=\"#fff\" stroke-width=\"3\" paint-order=\"stroke\">{}</text>",
            esc(&label)
        );
    }
    s.push_str("</g>\n");

    // Legend: the tension scale.
    let (lx, ly, lh) = (PAGE_W - 120.0, TOP + 20.0, 200.0);
    let unit = units.force.symbol;
    let _ = writeln!(
        s,
        "<g class=\"legend\" font-size=\"11\"><text x=\"{:.1}\" y=\"{:.1}\" font-weight=\"bold\">forward tension</text><text x=\"{:.1}\" y=\"{:.1}\">({})</text>\
<rect x=\"{lx:.1}\" y=\"{ly:.1}\" width=\"16\" height=\"{lh:.1}\" fill=\"url(#tension-scale)\" stroke=\"#333\" stroke-width=\"0.8\"/>\
<text x=\"{:.1}\" y=\"{:.1}\">{}</text><text x=\"{:.1}\" y=\"{:.1}\">{}</text></g>",
        lx - 10.0,
        ly - 22.0,
        lx - 10.0,
        ly - 8.0,
        esc(unit),
        lx + 22.0,
        ly + 10.0,
        esc(&quantity(t_max.is_finite().then_some(t_max), Dimension::Force, units)),
        lx + 22.0,
        ly + lh,
        esc(&quantity(t_min.is_finite().then_some(t_min), Dimension::Force, units)),
    );
    // Key to the symbols, one row each: (symbol at (x, y) centre, text).
    let key_y = ly + lh + 30.0;
    let symbols: [(&str, &str); 8] = [
        ("<circle cx=\"{x}\" cy=\"{y}\" r=\"6\" fill=\"#f4f4f4\" stroke=\"#333\"/>", "sheave"),
        ("<circle cx=\"{x}\" cy=\"{y}\" r=\"6\" fill=\"url(#hatch)\" stroke=\"#333\"/>", "fixed guide"),
        ("<circle cx=\"{x}\" cy=\"{y}\" r=\"6\" fill=\"#e8e2d4\" stroke=\"#333\"/><circle cx=\"{x}\" cy=\"{y}\" r=\"3.5\" fill=\"none\" stroke=\"#333\" stroke-width=\"0.8\"/>", "drum"),
        ("<path d=\"M{x},{y} m0,5 l-6,-9 h12 z\" fill=\"url(#hatch)\" stroke=\"#333\"/>", "anchor"),
        ("<rect x=\"{x}\" y=\"{y}\" transform=\"translate(-6 -6)\" width=\"12\" height=\"12\" fill=\"#cfd8e3\" stroke=\"#333\"/>", "block (- - travel)"),
        ("<rect x=\"{x}\" y=\"{y}\" transform=\"translate(-6 -7)\" width=\"12\" height=\"14\" rx=\"2\" fill=\"#555\" stroke=\"#222\"/>", "weight"),
        ("<path d=\"M{x},{y} m-8,0 h12\" stroke=\"#b3261e\" stroke-width=\"2.5\" marker-end=\"url(#arrow)\"/>", "haul, pull"),
        ("<circle cx=\"{x}\" cy=\"{y}\" r=\"7\" fill=\"none\" stroke=\"#d00000\" stroke-width=\"2\" stroke-dasharray=\"5 3\"/>", "warning"),
    ];
    s.push_str("<g class=\"key\" font-size=\"10\" fill=\"#222\">");
    for (i, (symbol, text)) in symbols.iter().enumerate() {
        let (x, y) = (lx + 2.0, key_y + 20.0 * i as Real);
        s.push_str(
            &symbol
                .replace("{x}", &format!("{x:.1}"))
                .replace("{y}", &format!("{y:.1}")),
        );
        let _ = write!(
            s,
            "<text x=\"{:.1}\" y=\"{:.1}\">{}</text>",
            x + 12.0,
            y + 4.0,
            esc(text)
        );
    }
    s.push_str("</g>\n");

    // Title block.
    let h = &report.headline;
    let dim = match h.solve_for.quantity {
        "mass" => Dimension::Mass,
        "torque" => Dimension::Torque,
        _ => Dimension::Force,
    };
    let q = |x| quantity(x, dim, units);
    let (bx, bw) = (PAGE_W - 560.0, 544.0);
    let lines = [
        format!(
            "{} at {}: forward {} · back {} · ideal {}",
            h.solve_for.quantity,
            h.solve_for.part,
            q(h.forward.value),
            q(h.back.value),
            q(h.ideal.value)
        ),
        format!("Units: {}", units_line(units)),
        format!(
            "{} · scale {}",
            view.description(),
            scale_note(scale, units)
        ),
        format!(
            "Date {} · drawn by reeve {} · warnings: {}",
            options.date,
            env!("CARGO_PKG_VERSION"),
            report.warnings.len()
        ),
    ];
    let _ = writeln!(
        s,
        "<g class=\"title-block\"><rect x=\"{bx:.1}\" y=\"{block_top:.1}\" width=\"{bw:.1}\" height=\"104\" fill=\"#fafafa\" stroke=\"#333\" stroke-width=\"1.2\"/>\
<text x=\"{:.1}\" y=\"{:.1}\" font-size=\"14\" font-weight=\"bold\">{}</text>",
        bx + 10.0,
        block_top + 20.0,
        esc(&report.title)
    );
    for (i, text) in lines.iter().enumerate() {
        let _ = writeln!(
            s,
            "<text x=\"{:.1}\" y=\"{:.1}\" font-size=\"11\">{}</text>",
            bx + 10.0,
            block_top + 40.0 + 16.0 * i as Real,
            esc(text)
        );
    }
    s.push_str("</g>\n");
    let _ = write!(
        s,
        "<text class=\"caution\" x=\"20\" y=\"{:.1}\" font-size=\"10\" fill=\"#333\">",
        block_top + 124.0
    );
    for (i, text) in caution_lines.iter().enumerate() {
        let _ = write!(
            s,
            "<tspan x=\"20\" dy=\"{}\">{}</tspan>",
            if i == 0 { 0 } else { 12 },
            esc(text)
        );
    }
    s.push_str("</text>\n</svg>\n");
    s
}

/// The sheet scale in words: how many of the rig's length units one centimetre of a
/// 96-dpi screen (37.8 px) shows.
fn scale_note(px_per_m: Real, units: &UnitSystem) -> String {
    let metres_per_cm = 37.795_275_590_551_18 / px_per_m;
    format!(
        "1 cm ≙ {}",
        quantity(Some(metres_per_cm), Dimension::Length, units)
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn civil_dates() {
        // Hand-checked: day 0 is 1970-01-01; 2000-03-01 is day 11017 (30 years of
        // 365 days plus 7 leap days = 10957 to 2000-01-01, then 31 + 29).
        assert_eq!(civil_date(0), "1970-01-01");
        assert_eq!(civil_date(11_017), "2000-03-01");
        assert_eq!(civil_date(11_016), "2000-02-29");
        assert_eq!(civil_date(-1), "1969-12-31");
    }

    #[test]
    fn ramp_ends() {
        assert_eq!(ramp(0.0), "#1f4e9c");
        assert_eq!(ramp(1.0), "#d1495b");
        assert_eq!(ramp(Real::NAN), "#1f4e9c");
    }

    #[test]
    fn words_wrap() {
        assert_eq!(wrap_words("aa bb cc", 5), vec!["aa bb", "cc"]);
    }
}

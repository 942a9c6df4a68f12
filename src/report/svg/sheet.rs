//! Drawing on the sheet: world points to sheet coordinates, the tension colour ramp,
//! label placement clear of symbols and spans, and the projected outline of a round
//! part.

use std::fmt::Write as _;

use crate::math::{Point, Real, Vector};
use crate::model::{PartId, Rig};
use crate::solve::Solution;

use super::super::escape::xml as esc;
use super::view::{SheetPoint, SheetSegment, PX_PER_MM};

/// Two unit vectors spanning the plane normal to `axle`.
pub(super) fn plane_basis(axle: &Vector) -> (Vector, Vector) {
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
pub(super) fn pitch_radius_of(rig: &Rig, solution: &Solution, part: PartId) -> Real {
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
pub(super) struct Sheet {
    pub(super) right: Vector,
    pub(super) up: Vector,
    pub(super) x0: Real,
    pub(super) y1: Real,
    pub(super) scale: Real,
    pub(super) left: Real,
    pub(super) top: Real,
}

impl Sheet {
    pub(super) fn at(&self, p: &Point) -> SheetPoint {
        (
            self.left + (p.coords.dot(&self.right) - self.x0) * self.scale,
            self.top + (self.y1 - p.coords.dot(&self.up)) * self.scale,
        )
    }
    /// A world direction on the sheet (pixels per metre, y down).
    pub(super) fn dir(&self, v: &Vector) -> (Real, Real) {
        (v.dot(&self.right), -v.dot(&self.up))
    }
}

/// Colour stops of the tension scale, low to high.
pub(super) const RAMP: [(u8, u8, u8); 4] =
    [(31, 78, 156), (42, 157, 143), (233, 162, 59), (209, 73, 91)];

/// The colour of a fraction 0..1 of the tension scale.
pub(super) fn ramp(t: Real) -> String {
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
pub(super) fn darken(colour: &str) -> String {
    let channel = |i: usize| {
        colour
            .get(i..i + 2)
            .and_then(|h| u8::from_str_radix(h, 16).ok())
            .map_or(0, |c| (c as Real * 0.6).round() as u8)
    };
    format!("#{:02x}{:02x}{:02x}", channel(1), channel(3), channel(5))
}

/// Boxes already taken by labels and symbols, and the spans drawn on the sheet, so that
/// later labels look for a free place.
#[derive(Default)]
pub(super) struct Placer {
    pub(super) taken: Vec<(Real, Real, Real, Real)>,
    pub(super) spans: Vec<SheetSegment>,
}

/// Whether the segment `a`–`b` passes through the box `(x0, y0, x1, y1)` (Liang–Barsky
/// clipping).
pub(super) fn segment_crosses_box(
    a: SheetPoint,
    b: SheetPoint,
    bx: (Real, Real, Real, Real),
) -> bool {
    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
    let (mut t0, mut t1) = (0.0, 1.0);
    for (p, q) in [
        (-dx, a.0 - bx.0),
        (dx, bx.2 - a.0),
        (-dy, a.1 - bx.1),
        (dy, bx.3 - a.1),
    ] {
        if p == 0.0 {
            if q < 0.0 {
                return false;
            }
        } else {
            let t = q / p;
            if p < 0.0 {
                t0 = t.max(t0);
            } else {
                t1 = t.min(t1);
            }
            if t0 > t1 {
                return false;
            }
        }
    }
    true
}

pub(super) const FONT: Real = 11.0;

pub(super) fn text_width(s: &str, size: Real) -> Real {
    s.chars().count() as Real * size * 0.58
}

impl Placer {
    pub(super) fn free(&self, b: (Real, Real, Real, Real)) -> bool {
        self.taken
            .iter()
            .all(|t| b.2 <= t.0 || b.0 >= t.2 || b.3 <= t.1 || b.1 >= t.3)
    }
    /// Whether no span runs through `b`.
    pub(super) fn clear_of_spans(&self, b: (Real, Real, Real, Real)) -> bool {
        !self
            .spans
            .iter()
            .any(|s| segment_crosses_box(s[0], s[1], b))
    }
    /// Picks the first candidate anchor (left-aligned text baseline) whose box is free
    /// and crosses no span, else the first whose box is free, else the first; records it.
    pub(super) fn place(&mut self, candidates: &[SheetPoint], label: &str) -> SheetPoint {
        let w = text_width(label, FONT);
        let boxed = |(x, y): SheetPoint| (x - 1.0, y - FONT, x + w + 1.0, y + 3.0);
        let chosen = candidates
            .iter()
            .copied()
            .find(|&c| self.free(boxed(c)) && self.clear_of_spans(boxed(c)))
            .or_else(|| candidates.iter().copied().find(|&c| self.free(boxed(c))))
            .or_else(|| candidates.first().copied())
            .unwrap_or((0.0, 0.0));
        self.taken.push(boxed(chosen));
        chosen
    }
    /// Keeps labels off a symbol at `(x, y)` of these half-extents.
    pub(super) fn reserve(&mut self, x: Real, y: Real, half_w: Real, half_h: Real) {
        self.taken
            .push((x - half_w, y - half_h, x + half_w, y + half_h));
    }
}

/// A part's symbol on the sheet, to be labelled.
#[derive(Debug, Clone, Copy)]
pub(super) struct Symbol {
    /// The part.
    pub(super) part: PartId,
    /// Centre, px.
    pub(super) centre: SheetPoint,
    /// Half-width and half-height of the symbol, px.
    pub(super) half: (Real, Real),
    /// Whether a warning names the part.
    pub(super) warned: bool,
}

impl Symbol {
    pub(super) fn reach(&self) -> Real {
        self.half.0.max(self.half.1)
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

/// The least half-width of a round part's outline on the sheet, px: seen edge-on, a
/// sheave would vanish into a line under its spans.
pub(super) const MIN_HALF_WIDTH_PX: Real = 2.5;

/// A closed path along a circle of radius `r` about `centre` in the plane normal to
/// `axle`, projected onto the sheet: an ellipse, widened to [`MIN_HALF_WIDTH_PX`] across
/// its major axis where the circle is seen (nearly) edge-on.
pub(super) fn circle_path(sheet: &Sheet, centre: &Point, axle: &Vector, r: Real) -> String {
    let mut d = String::new();
    for (k, (x, y)) in circle_points(sheet, centre, axle, r)
        .into_iter()
        .enumerate()
    {
        let _ = write!(d, "{}{x:.1},{y:.1} ", if k == 0 { "M" } else { "L" });
    }
    d.push('Z');
    d
}

/// The points of [`circle_path`], px.
pub(super) fn circle_points(
    sheet: &Sheet,
    centre: &Point,
    axle: &Vector,
    r: Real,
) -> Vec<SheetPoint> {
    let (u, v) = plane_basis(axle);
    // The ellipse is M·(cos t, sin t) with M = [a b] the projected radii, px.
    let (a, b) = (sheet.dir(&u), sheet.dir(&v));
    let (a, b) = (
        (a.0 * r * sheet.scale, a.1 * r * sheet.scale),
        (b.0 * r * sheet.scale, b.1 * r * sheet.scale),
    );
    // Semi-axes from M·Mᵀ = [[p, c], [c, q]]: eigenvalues (p + q)/2 ± √(((p − q)/2)² + c²).
    let (p, q, c) = (
        a.0 * a.0 + b.0 * b.0,
        a.1 * a.1 + b.1 * b.1,
        a.0 * a.1 + b.0 * b.1,
    );
    let (mean, half) = ((p + q) / 2.0, ((p - q) / 2.0).hypot(c));
    let (major, minor) = ((mean + half).sqrt(), (mean - half).max(0.0).sqrt());
    let widen = minor < MIN_HALF_WIDTH_PX;
    let angle = 0.5 * (2.0 * c).atan2(p - q);
    let (cx, cy) = sheet.at(centre);
    let mut points = Vec::with_capacity(72);
    const STEPS: usize = 72;
    for k in 0..STEPS {
        let t = k as Real * std::f64::consts::TAU / STEPS as Real;
        let (x, y) = if widen {
            // Edge-on: an ellipse of the same length along the projected diameter (never
            // wider than long, for a part too small to show at this scale).
            let (e, f) = (major * t.cos(), MIN_HALF_WIDTH_PX.min(major) * t.sin());
            (
                cx + e * angle.cos() - f * angle.sin(),
                cy + e * angle.sin() + f * angle.cos(),
            )
        } else {
            sheet.at(&(centre + (u * t.cos() + v * t.sin()) * r))
        };
        points.push((x, y));
    }
    points
}

/// Rodrigues rotation of `r` about unit `axis` by `angle`.
pub(super) fn rotate(r: &Vector, axis: &Vector, angle: Real) -> Vector {
    let (s, c) = angle.sin_cos();
    r * c + axis.cross(r) * s + axis * axis.dot(r) * (1.0 - c)
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

/// The printed sheet's size: in millimetres, or in inches where the drawing shows US
/// customary lengths.
pub(super) fn sheet_size(
    width_px: Real,
    height_px: Real,
    units: &crate::units::UnitSystem,
) -> String {
    let (w, h) = (width_px / PX_PER_MM, height_px / PX_PER_MM);
    if matches!(units.length.symbol, "in" | "ft") {
        format!("{:.2} × {:.2} in", w / 25.4, h / 25.4)
    } else {
        format!("{w:.0} × {h:.0} mm")
    }
}

/// The key to the symbols, one row each, from `top` at `x` (px).
pub(super) fn write_key(s: &mut String, x: Real, top: Real) {
    // (symbol at (x, y) centre, text).
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
        let (x, y) = (x + 2.0, top + 20.0 * i as Real);
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
}

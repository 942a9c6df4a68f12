//! The rig drawing of `reeve draw`: a hand-written SVG in one of four parallel
//! projections, at a standard drawing scale (1, 2 or 5 × 10ⁿ, ISO 5455) that the title
//! block names; by default in the view that draws the fewest parts and spans on top of
//! each other ([`default_view`]).
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

use crate::math::{Real, Vector};
use crate::model::{PartKind, Rig};
use crate::solve::Solution;
use crate::units::Dimension;

use super::escape::xml as esc;
use super::table::units_line;
use super::text::quantity;
use super::{Report, CAUTION};

pub mod scene;
mod schedule;
mod sheet;
mod view;

use scene::{Anchor, Layer, Scene, Shape};
use sheet::*;
pub use sheet::{civil_date, wrap_words};
use view::*;
pub use view::{default_view, View};

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
    draw(rig, solution, report, options, &mut Scene::default())
}

/// The drawing as shapes on the sheet: the same sheet as the SVG (see [`scene::Scene`]).
pub fn scene(rig: &Rig, solution: &Solution, report: &Report, options: &DrawOptions) -> Scene {
    let mut scene = Scene::default();
    draw(rig, solution, report, options, &mut scene);
    scene
}

/// Writes the SVG and records every shape of it in `sc`.
fn draw(
    rig: &Rig,
    solution: &Solution,
    report: &Report,
    options: &DrawOptions,
    sc: &mut Scene,
) -> String {
    let units = &rig.units;
    let view = options.view.unwrap_or_else(|| default_view(rig, solution));
    let points = key_points(rig, solution);
    let (x0, x1, y0, y1) = extent(&points, view);
    let (right, up) = view.axes();

    // Sheet layout, px: drawing area on the left, legend on the right, title block and
    // caution below.
    const PAGE_W: Real = 1000.0;
    const AREA_W: Real = AREA.0;
    const LEFT: Real = 90.0;
    const TOP: Real = 50.0;
    // A standard scale, so that the printed sheet can be measured.
    let drawing_scale = view_scale(&points, view);
    let scale = drawing_scale.px_per_m();
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
    // A whole number of px, so that the sheet's size in mm states it exactly.
    const TITLE_BLOCK_H: Real = 120.0;
    // A stand-alone sheet carries the tension table under the caution.
    let schedule = options
        .standalone
        .then(|| schedule::Schedule::new(report, units, PAGE_W - 40.0));
    let table_top = block_top + TITLE_BLOCK_H + 16.0 + caution_lines.len() as Real * 12.0 + 8.0;
    let page_h = (table_top + 8.0 + schedule.as_ref().map_or(0.0, |t| t.height() + 8.0)).ceil();
    sc.page = (PAGE_W, page_h);
    sc.px_per_m = scale;
    sc.origin = (left - x0 * scale, TOP + y1 * scale);
    sc.real_per_paper = drawing_scale.real_per_paper;

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
            "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{:.2}mm\" height=\"{:.2}mm\" viewBox=\"0 0 {PAGE_W:.0} {page_h:.0}\" font-family=\"DejaVu Sans, Helvetica, Arial, sans-serif\" data-view=\"{}\" data-scale=\"{}\">",
            PAGE_W / PX_PER_MM,
            page_h / PX_PER_MM,
            view.name(),
            drawing_scale.ratio()
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
    sc.rect(Layer::Title, 6.0, 6.0, PAGE_W - 12.0, page_h - 12.0);

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
        for (a, b) in [
            ((ax, TOP + draw_h + 8.0), (ax, ybase + 5.0)),
            ((bx, TOP + draw_h + 8.0), (bx, ybase + 5.0)),
            ((ax, ybase), (bx, ybase)),
        ] {
            sc.push(Layer::Dimensions, Shape::Line(a, b));
        }
        sc.push(
            Layer::Dimensions,
            Shape::Text {
                at: ((ax + bx) / 2.0, ybase + 15.0),
                size: FONT,
                anchor: Anchor::Middle,
                angle: 0.0,
                text: label.clone(),
            },
        );
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
        for (a, b) in [
            ((xbase - 5.0, ay), (left - 8.0, ay)),
            ((xbase - 5.0, by), (left - 8.0, by)),
            ((xbase, ay), (xbase, by)),
        ] {
            sc.push(Layer::Dimensions, Shape::Line(a, b));
        }
        sc.push(
            Layer::Dimensions,
            Shape::Text {
                at: (tx, ty),
                size: FONT,
                anchor: Anchor::Middle,
                angle: 90.0,
                text: len(y1 - y0),
            },
        );
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
    for (l, line) in solution.geometry.lines.enumerate() {
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
            let mut points = Vec::with_capacity(steps + 1);
            for k in 0..=steps {
                let a = sense * turn * k as Real / steps as Real;
                let p = entry.centre + rotate(&r0, &axle, a);
                let (x, y) = sheet.at(&p);
                let _ = write!(d, "{}{x:.1},{y:.1} ", if k == 0 { "M" } else { "L" });
                points.push((x, y));
            }
            sc.push(Layer::Spans, Shape::Polyline(points, false));
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
    for (l, line) in solution.geometry.lines.enumerate() {
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
            sc.push(Layer::Spans, Shape::Line((ax, ay), (bx, by)));
            if let (Some(last), Some(t)) = (sc.items.last_mut(), forward) {
                last.tension = Some(fraction(t));
            }
            placer.spans.push([(ax, ay), (bx, by)]);
            span_labels.push((k, (ax, ay), (bx, by), forward, colour));
            k += 1;
        }
    }

    // Parts.
    let mut symbols: Vec<Symbol> = Vec::new();
    for (id, part) in rig.parts.enumerate() {
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
                let outline = |k: Real| circle_points(&sheet, &part.at, &axle, r * k);
                sc.push(Layer::Sheaves, Shape::Polyline(outline(1.0), true));
                if matches!(part.kind, PartKind::Drum(_)) {
                    let _ = write!(
                        s,
                        "<path d=\"{}\" fill=\"none\" stroke=\"#333\" stroke-width=\"0.8\"/>",
                        circle_path(&sheet, &part.at, &axle, r * 0.6)
                    );
                    sc.push(Layer::Sheaves, Shape::Polyline(outline(0.6), true));
                }
                let _ = write!(
                    s,
                    "<circle cx=\"{cx:.1}\" cy=\"{cy:.1}\" r=\"2.2\" fill=\"#333\"/>"
                );
                sc.push(Layer::Sheaves, Shape::Circle((cx, cy), 2.2));
                let (u, v) = plane_basis(&axle);
                let (a, b) = (sheet.dir(&u), sheet.dir(&v));
                (
                    (r * scale * a.0.hypot(b.0)).max(4.0) + 2.0,
                    (r * scale * a.1.hypot(b.1)).max(4.0) + 2.0,
                )
            }
            PartKind::Anchor => {
                let triangle = vec![(cx, cy), (cx - 8.0, cy - 12.0), (cx + 8.0, cy - 12.0)];
                sc.push(Layer::Parts, Shape::Polyline(triangle, true));
                sc.push(Layer::Parts, Shape::Circle((cx, cy), 2.5));
                let _ = write!(
                    s,
                    "<path d=\"M{cx:.1},{cy:.1} l-8,-12 h16 z\" fill=\"url(#hatch)\" stroke=\"#333\" stroke-width=\"1.2\"/><circle cx=\"{cx:.1}\" cy=\"{cy:.1}\" r=\"2.5\" fill=\"#333\"/>"
                );
                (10.0, 10.0)
            }
            PartKind::Block(block) => {
                sc.rect(Layer::Parts, cx - 7.0, cy - 7.0, 14.0, 14.0);
                let _ = write!(
                    s,
                    "<rect x=\"{:.1}\" y=\"{:.1}\" width=\"14\" height=\"14\" fill=\"#cfd8e3\" stroke=\"#333\" stroke-width=\"1.2\"/>",
                    cx - 7.0,
                    cy - 7.0
                );
                let (dx, dy) = sheet.dir(&block.moves.into_inner());
                let n = dx.hypot(dy);
                if n > 0.05 {
                    let tip = (cx + dx / n * 28.0, cy + dy / n * 28.0);
                    let _ = write!(
                        s,
                        "<line x1=\"{cx:.1}\" y1=\"{cy:.1}\" x2=\"{:.1}\" y2=\"{:.1}\" stroke=\"#1f6f3f\" stroke-width=\"1.5\" stroke-dasharray=\"4 2\" marker-end=\"url(#arrow)\"/>",
                        tip.0,
                        tip.1
                    );
                    sc.push(Layer::Parts, Shape::Line((cx, cy), tip));
                }
                (10.0, 10.0)
            }
            PartKind::Weight(_) => {
                sc.rect(Layer::Parts, cx - 9.0, cy, 18.0, 22.0);
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
                    solution.geometry.lines.enumerate().find_map(|(l, g)| {
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
                sc.push(Layer::Parts, Shape::Circle((cx, cy), 4.0));
                if let Some(p) = pull {
                    let (dx, dy) = sheet.dir(&p);
                    let n = dx.hypot(dy);
                    if n > 0.05 {
                        let tip = (cx + dx / n * 40.0, cy + dy / n * 40.0);
                        let _ = write!(
                            s,
                            "<line class=\"pull\" x1=\"{cx:.1}\" y1=\"{cy:.1}\" x2=\"{:.1}\" y2=\"{:.1}\" stroke=\"#b3261e\" stroke-width=\"2.5\" marker-end=\"url(#arrow)\"/>",
                            tip.0,
                            tip.1
                        );
                        sc.push(Layer::Parts, Shape::Line((cx, cy), tip));
                    } else {
                        sc.push(Layer::Parts, Shape::Circle((cx, cy), 8.0));
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
            sc.push(Layer::Parts, Shape::Circle((cx, cy), reach + 5.0));
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
        placer.reserve(cx, cy, half_w.min(30.0), half_h.min(30.0));
        symbols.push(Symbol {
            part: id,
            centre: (cx, cy),
            half: (half_w, half_h),
            warned: is_warned,
        });
    }

    // Part labels, then span labels, each in the first free place. Parts drawn on top of
    // each other (two sheaves on one pin seen along it, a block and its sheave), and
    // round parts each drawn mostly over the other (two sheaves on one pin seen at a
    // slant), share one label naming them all in the file's order.
    s.push_str("<g class=\"labels\" font-size=\"11\">\n");
    let part_groups = groups(symbols.len(), |i, j| {
        let (a, b) = (&symbols[i], &symbols[j]);
        let apart = (a.centre.0 - b.centre.0).hypot(a.centre.1 - b.centre.1);
        let round = |s: &Symbol| rig.parts[s.part].kind.round().is_some();
        apart < COINCIDENT_PX || (round(a) && round(b) && apart < 0.5 * a.reach().min(b.reach()))
    });
    for members in part_groups {
        // The group's symbols together: the box around them all.
        let members: Vec<Symbol> = members.iter().map(|&m| symbols[m]).collect();
        let fold = |f: fn(Real, Real) -> Real, pick: &dyn Fn(&Symbol) -> Real| {
            members.iter().map(pick).reduce(f).unwrap_or(0.0)
        };
        let (x_lo, x_hi) = (
            fold(Real::min, &|s| s.centre.0 - s.half.0),
            fold(Real::max, &|s| s.centre.0 + s.half.0),
        );
        let (y_lo, y_hi) = (
            fold(Real::min, &|s| s.centre.1 - s.half.1),
            fold(Real::max, &|s| s.centre.1 + s.half.1),
        );
        let (cx, cy) = ((x_lo + x_hi) / 2.0, (y_lo + y_hi) / 2.0);
        let (half_w, half_h) = ((x_hi - x_lo) / 2.0, (y_hi - y_lo) / 2.0);
        let is_warned = members.iter().any(|s| s.warned);
        let names: Vec<&str> = members
            .iter()
            .map(|s| rig.parts[s.part].name.as_str())
            .collect();
        let name = &rig.parts[members[0].part].name;
        let label = if is_warned {
            format!("⚠ {}", names.join(", "))
        } else {
            names.join(", ")
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
        sc.text(Layer::Labels, (x, y), FONT, &label);
        let _ = writeln!(
            s,
            "<text class=\"part-label\" data-part=\"{}\" x=\"{x:.1}\" y=\"{y:.1}\" fill=\"{}\" font-weight=\"bold\" stroke=\"#fff\" stroke-width=\"3\" paint-order=\"stroke\">{}</text>",
            esc(name),
            if is_warned { "#b00000" } else { "#111" },
            esc(&label)
        );
    }
    // Spans drawn on top of each other share one label with their tensions in path order.
    let span_groups = groups(span_labels.len(), |i, j| {
        let (a, b) = (&span_labels[i], &span_labels[j]);
        let (sa, sb) = ([a.1, a.2], [b.1, b.2]);
        segments_coincide(sa, sb, COINCIDENT_PX) || segments_coincide(sb, sa, COINCIDENT_PX)
    });
    for members in span_groups {
        // The longest span of the group carries the label.
        let longest = members
            .iter()
            .copied()
            .max_by(|&i, &j| {
                let len = |k: usize| {
                    let (_, a, b, _, _) = &span_labels[k];
                    (b.0 - a.0).hypot(b.1 - a.1)
                };
                len(i).total_cmp(&len(j))
            })
            .unwrap_or(members[0]);
        let (k, (ax, ay), (bx, by), _, colour) = span_labels[longest].clone();
        let tensions: Vec<String> = members
            .iter()
            .map(|&m| quantity(span_labels[m].3, Dimension::Force, units))
            .collect();
        let label = if tensions.iter().all(|t| *t == tensions[0]) && tensions.len() > 1 {
            format!("{} (×{})", tensions[0], tensions.len())
        } else {
            tensions.join(" / ")
        };
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
        sc.text(Layer::Labels, (x, y), FONT, &label);
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
    let t_max_text = quantity(t_max.is_finite().then_some(t_max), Dimension::Force, units);
    let t_min_text = quantity(t_min.is_finite().then_some(t_min), Dimension::Force, units);
    sc.text(
        Layer::Title,
        (lx - 10.0, ly - 22.0),
        FONT,
        "forward tension",
    );
    sc.text(
        Layer::Title,
        (lx - 10.0, ly - 8.0),
        FONT,
        &format!("({unit})"),
    );
    sc.rect(Layer::Title, lx, ly, 16.0, lh);
    sc.text(Layer::Title, (lx + 22.0, ly + 10.0), FONT, &t_max_text);
    sc.text(Layer::Title, (lx + 22.0, ly + lh), FONT, &t_min_text);
    write_key(&mut s, lx, ly + lh + 30.0);

    // Title block.
    let h = &report.headline;
    let dim = h.solve_for.quantity.dimension();
    let q = |x| quantity(x, dim, units);
    let (bx, bw) = (PAGE_W - 560.0, 544.0);
    let lines = [
        format!(
            "{} at {}: forward {} · back {} · ideal {}",
            h.solve_for.quantity.name(),
            h.solve_for.part,
            q(h.forward.value),
            q(h.back.value),
            q(h.ideal.value)
        ),
        format!("Units: {}", units_line(units)),
        view.description().to_string(),
        format!(
            "Scale {}{} on the sheet printed at {}",
            drawing_scale.ratio(),
            if view == View::Iso {
                " (lengths parallel to the sheet)"
            } else {
                ""
            },
            sheet_size(PAGE_W, page_h, units)
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
        "<g class=\"title-block\"><rect x=\"{bx:.1}\" y=\"{block_top:.1}\" width=\"{bw:.1}\" height=\"{TITLE_BLOCK_H:.0}\" fill=\"#fafafa\" stroke=\"#333\" stroke-width=\"1.2\"/>\
<text x=\"{:.1}\" y=\"{:.1}\" font-size=\"14\" font-weight=\"bold\">{}</text>",
        bx + 10.0,
        block_top + 20.0,
        esc(&report.title)
    );
    sc.rect(Layer::Title, bx, block_top, bw, TITLE_BLOCK_H);
    sc.text(
        Layer::Title,
        (bx + 10.0, block_top + 20.0),
        14.0,
        &report.title,
    );
    for (i, text) in lines.iter().enumerate() {
        sc.text(
            Layer::Title,
            (bx + 10.0, block_top + 40.0 + 16.0 * i as Real),
            FONT,
            text,
        );
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
        block_top + TITLE_BLOCK_H + 20.0
    );
    for (i, text) in caution_lines.iter().enumerate() {
        let at = (20.0, block_top + TITLE_BLOCK_H + 20.0 + 12.0 * i as Real);
        sc.text(Layer::Title, at, 10.0, text);
        let _ = write!(
            s,
            "<tspan x=\"20\" dy=\"{}\">{}</tspan>",
            if i == 0 { 0 } else { 12 },
            esc(text)
        );
    }
    s.push_str("</text>\n");
    if let Some(table) = &schedule {
        table.draw(&mut s, sc, 20.0, table_top);
    }
    s.push_str("</svg>\n");
    s
}

#[cfg(test)]
mod tests;

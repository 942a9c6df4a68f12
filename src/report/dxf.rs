//! The drawing of `reeve draw --format dxf`: the same sheet as the stand-alone SVG (the
//! shapes the SVG writer records in [`Scene`], the tension table under the caution
//! included) as an ASCII DXF of release 12 (`AC1009`), the version every CAD program
//! opens.
//!
//! Model space holds the sheet at full size in the shown length unit (`$INSUNITS`): the
//! rig's parts and spans at their true projected places (the world's projected origin at
//! 0, 0), and the title block, legend, labels and table enlarged by the drawing scale, so
//! that the drawing plotted at its scale (1:20 on the title block) gives the SVG's sheet.
//! Entities are `LINE`, `CIRCLE`, `TEXT` and `POLYLINE` (with its `VERTEX`es and
//! `SEQEND`, release 12's polyline), each on a layer by kind ([`Layer`]): `sheaves`,
//! `parts`, `spans`, `labels`, `dimensions`, `table`, `title`. Spans carry a colour of
//! the tension scale (ACI blue, cyan, orange, red, low to high); text is ASCII
//! ([`super::escape::dxf_text`]).
//!
//! Written by hand: the format is a list of group codes and values, and the one DXF
//! crate kept up to date reads and writes every version with dependencies far beyond
//! what this one writer needs; the tests read the file back with a small group-code
//! reader of their own.

use std::fmt::Write as _;
use std::io::{self, Write};

use crate::math::Real;
use crate::model::Rig;
use crate::solve::Solution;

use super::escape::dxf_text;
use super::svg::scene::{Anchor, Layer, Scene, Shape};
use super::svg::{self, DrawOptions};
use super::Report;

/// AutoCAD colour index of each layer: white (black on a light background) for the
/// outlines and text, green for the point parts, blue for the spans, grey for the
/// dimensions.
fn layer_colour(layer: Layer) -> u8 {
    match layer {
        Layer::Parts => 3,
        Layer::Spans => 5,
        Layer::Dimensions => 8,
        _ => 7,
    }
}

/// The colour index of a place on the tension scale: blue, cyan, orange, red (the SVG's
/// ramp, nearest colour of the standard palette).
fn tension_colour(fraction: Real) -> u8 {
    const STEPS: [u8; 4] = [5, 4, 30, 1];
    let f = if fraction.is_finite() {
        fraction.clamp(0.0, 1.0)
    } else {
        0.0
    };
    // In range: f in 0..=1, so the index is 0..=3.
    STEPS[(f * 3.0).round() as usize]
}

/// `$INSUNITS` of a length unit (AutoCAD's drawing-units codes); 0 (unitless) for one
/// without a code.
fn insunits(symbol: &str) -> u8 {
    match symbol {
        "in" => 1,
        "ft" => 2,
        "mm" => 4,
        "cm" => 5,
        "m" => 6,
        _ => 0,
    }
}

/// Writes the drawing as DXF (release 12, ASCII).
///
/// # Errors
/// Only those of `w`.
pub fn write_dxf(
    w: &mut dyn Write,
    rig: &Rig,
    solution: &Solution,
    report: &Report,
    options: &DrawOptions,
) -> io::Result<()> {
    // Always the stand-alone sheet: the one with the tension table.
    let options = DrawOptions {
        standalone: true,
        ..options.clone()
    };
    let scene = svg::scene(rig, solution, report, &options);
    w.write_all(dxf(&scene, rig.units.length).as_bytes())
}

/// One group: its code and value, each on a line of its own.
fn group(out: &mut String, code: u16, value: impl std::fmt::Display) {
    let _ = write!(out, "{code:>3}\n{value}\n");
}

/// A coordinate: six decimals of the drawing unit, 0 for what is not finite (the sheet
/// never holds such a point; a CAD program would refuse the file for one).
fn coordinate(x: Real) -> String {
    if x.is_finite() {
        let s = format!("{x:.6}");
        if s.trim_start_matches('-')
            .trim_matches(['0', '.'])
            .is_empty()
        {
            "0.0".to_string()
        } else {
            s
        }
    } else {
        "0.0".to_string()
    }
}

/// The scene as DXF text, in `unit` (a length unit) at full size.
fn dxf(scene: &Scene, unit: crate::units::Unit) -> String {
    let to_unit = 1.0 / unit.si;
    let at = |p: (Real, Real)| {
        let (x, y) = scene.world(p);
        (x * to_unit, y * to_unit)
    };
    let length = |px: Real| scene.world_length(px) * to_unit;
    let mut out = String::new();
    // The drawing's extent: every point of every shape (the sheet, the table under it).
    let (mut lo, mut hi) = (at((0.0, scene.page.1)), at((scene.page.0, 0.0)));
    for item in &scene.items {
        let points: Vec<(Real, Real)> = match &item.shape {
            Shape::Line(a, b) => vec![*a, *b],
            Shape::Polyline(points, _) => points.clone(),
            Shape::Circle(c, _) | Shape::Text { at: c, .. } => vec![*c],
        };
        for p in points {
            let (x, y) = at(p);
            lo = (lo.0.min(x), lo.1.min(y));
            hi = (hi.0.max(x), hi.1.max(y));
        }
    }

    group(&mut out, 0, "SECTION");
    group(&mut out, 2, "HEADER");
    group(&mut out, 9, "$ACADVER");
    group(&mut out, 1, "AC1009");
    group(&mut out, 9, "$INSUNITS");
    group(&mut out, 70, insunits(unit.symbol));
    group(&mut out, 9, "$EXTMIN");
    group(&mut out, 10, coordinate(lo.0));
    group(&mut out, 20, coordinate(lo.1));
    group(&mut out, 9, "$EXTMAX");
    group(&mut out, 10, coordinate(hi.0));
    group(&mut out, 20, coordinate(hi.1));
    group(&mut out, 0, "ENDSEC");

    group(&mut out, 0, "SECTION");
    group(&mut out, 2, "TABLES");
    group(&mut out, 0, "TABLE");
    group(&mut out, 2, "LTYPE");
    group(&mut out, 70, 1);
    group(&mut out, 0, "LTYPE");
    group(&mut out, 2, "CONTINUOUS");
    group(&mut out, 70, 0);
    group(&mut out, 3, "Solid line");
    group(&mut out, 72, 65);
    group(&mut out, 73, 0);
    group(&mut out, 40, "0.0");
    group(&mut out, 0, "ENDTAB");
    group(&mut out, 0, "TABLE");
    group(&mut out, 2, "LAYER");
    group(&mut out, 70, Layer::ALL.len() + 1);
    for (name, colour) in
        std::iter::once(("0", 7)).chain(Layer::ALL.into_iter().map(|l| (l.name(), layer_colour(l))))
    {
        group(&mut out, 0, "LAYER");
        group(&mut out, 2, name);
        group(&mut out, 70, 0);
        group(&mut out, 62, colour);
        group(&mut out, 6, "CONTINUOUS");
    }
    group(&mut out, 0, "ENDTAB");
    group(&mut out, 0, "TABLE");
    group(&mut out, 2, "STYLE");
    group(&mut out, 70, 1);
    group(&mut out, 0, "STYLE");
    group(&mut out, 2, "STANDARD");
    group(&mut out, 70, 0);
    group(&mut out, 40, "0.0");
    group(&mut out, 41, "1.0");
    group(&mut out, 50, "0.0");
    group(&mut out, 71, 0);
    group(&mut out, 42, "2.5");
    group(&mut out, 3, "txt");
    group(&mut out, 4, "");
    group(&mut out, 0, "ENDTAB");
    group(&mut out, 0, "ENDSEC");

    group(&mut out, 0, "SECTION");
    group(&mut out, 2, "ENTITIES");
    for item in &scene.items {
        let layer = item.layer.name();
        let point = |out: &mut String, base: u16, p: (Real, Real)| {
            let (x, y) = at(p);
            group(out, base, coordinate(x));
            group(out, base + 10, coordinate(y));
            group(out, base + 20, "0.0");
        };
        match &item.shape {
            Shape::Line(a, b) => {
                group(&mut out, 0, "LINE");
                group(&mut out, 8, layer);
                if let Some(t) = item.tension {
                    group(&mut out, 62, tension_colour(t));
                }
                point(&mut out, 10, *a);
                point(&mut out, 11, *b);
            }
            Shape::Circle(c, r) => {
                group(&mut out, 0, "CIRCLE");
                group(&mut out, 8, layer);
                point(&mut out, 10, *c);
                group(&mut out, 40, coordinate(length(*r)));
            }
            Shape::Polyline(points, closed) => {
                group(&mut out, 0, "POLYLINE");
                group(&mut out, 8, layer);
                group(&mut out, 66, 1);
                group(&mut out, 70, u8::from(*closed));
                group(&mut out, 10, "0.0");
                group(&mut out, 20, "0.0");
                group(&mut out, 30, "0.0");
                for p in points {
                    group(&mut out, 0, "VERTEX");
                    group(&mut out, 8, layer);
                    point(&mut out, 10, *p);
                }
                group(&mut out, 0, "SEQEND");
                group(&mut out, 8, layer);
            }
            Shape::Text {
                at: p,
                size,
                anchor,
                angle,
                text,
            } => {
                group(&mut out, 0, "TEXT");
                group(&mut out, 8, layer);
                point(&mut out, 10, *p);
                // The SVG's font size is the em; a CAD text height is that of a capital.
                group(&mut out, 40, coordinate(length(size * 0.7)));
                group(&mut out, 1, dxf_text(text));
                if *angle != 0.0 {
                    group(&mut out, 50, coordinate(*angle));
                }
                let horizontal = match anchor {
                    Anchor::Start => 0,
                    Anchor::Middle => 1,
                    Anchor::End => 2,
                };
                if horizontal != 0 {
                    group(&mut out, 72, horizontal);
                    point(&mut out, 11, *p);
                }
            }
        }
    }
    group(&mut out, 0, "ENDSEC");
    group(&mut out, 0, "EOF");
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn colours_and_units() {
        assert_eq!(tension_colour(0.0), 5);
        assert_eq!(tension_colour(1.0), 1);
        assert_eq!(tension_colour(Real::NAN), 5);
        assert_eq!(insunits("mm"), 4);
        assert_eq!(insunits("in"), 1);
        assert_eq!(coordinate(-0.0000001), "0.0");
        assert_eq!(coordinate(Real::INFINITY), "0.0");
        assert_eq!(coordinate(12.5), "12.500000");
    }
}

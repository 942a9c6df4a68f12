//! The tension table on the drawing sheet: the span table of `reeve table` (every case,
//! the unit in every header) as a ruled grid under the caution of a stand-alone sheet,
//! drawn in the SVG and recorded in the [`Scene`] for the DXF.

use std::fmt::Write as _;

use crate::math::Real;
use crate::units::UnitSystem;

use super::super::escape::xml as esc;
use super::super::table::{span_table, Align, CaseFilter, Style};
use super::super::Report;
use super::scene::{Anchor, Layer, Scene, Shape};
use super::sheet::text_width;

/// Row height per px of font.
const ROW_PER_FONT: Real = 1.6;
/// Room above the grid for its heading, px.
const HEADING: Real = 22.0;

/// The laid-out table: cells as text, column widths and alignments, font size.
pub(super) struct Schedule {
    title: String,
    cells: Vec<Vec<String>>,
    right: Vec<bool>,
    widths: Vec<Real>,
    font: Real,
}

impl Schedule {
    /// The span table of `report` in `units`, sized to fit `width` px (the font shrinks
    /// from 11 px down to 6 px for a wide table).
    pub(super) fn new(report: &Report, units: &UnitSystem, width: Real) -> Schedule {
        let table = span_table(report, units, CaseFilter::All, Style::Human);
        let header: Vec<String> = table.columns.iter().map(|c| c.header.clone()).collect();
        let cells: Vec<Vec<String>> = std::iter::once(header)
            .chain(
                table
                    .rows
                    .iter()
                    .map(|r| r.iter().map(|c| c.text()).collect()),
            )
            .collect();
        let right = table
            .columns
            .iter()
            .map(|c| c.align == Align::Right)
            .collect();
        let widths_at = |font: Real| -> Vec<Real> {
            (0..table.columns.len())
                .map(|i| {
                    cells
                        .iter()
                        .filter_map(|r| r.get(i))
                        .map(|t| text_width(t, font))
                        .fold(0.0, Real::max)
                        + font
                })
                .collect()
        };
        let natural: Real = widths_at(11.0).iter().sum();
        let font = (11.0 * (width / natural.max(1.0))).clamp(6.0, 11.0);
        Schedule {
            title: format!("Tension table: {}", report.title),
            widths: widths_at(font),
            cells,
            right,
            font,
        }
    }

    /// Height on the sheet, px, heading included.
    pub(super) fn height(&self) -> Real {
        HEADING + self.cells.len() as Real * self.font * ROW_PER_FONT
    }

    /// Writes the table with its top left corner at `(left, top)` into the SVG `s`, and
    /// records it on the `table` layer of `sc`.
    pub(super) fn draw(&self, s: &mut String, sc: &mut Scene, left: Real, top: Real) {
        let row = self.font * ROW_PER_FONT;
        let grid_top = top + HEADING;
        let total: Real = self.widths.iter().sum();
        let bottom = grid_top + row * self.cells.len() as Real;
        let _ = write!(
            s,
            "<g class=\"tension-table\" font-size=\"{:.1}\" fill=\"#222\"><text x=\"{left:.1}\" y=\"{:.1}\" font-size=\"12\" font-weight=\"bold\">{}</text>",
            self.font,
            top + 14.0,
            esc(&self.title)
        );
        sc.text(Layer::Table, (left, top + 14.0), 12.0, &self.title);
        let mut line = |s: &mut String, a: (Real, Real), b: (Real, Real)| {
            let _ = write!(
                s,
                "<line x1=\"{:.1}\" y1=\"{:.1}\" x2=\"{:.1}\" y2=\"{:.1}\" stroke=\"#555\" stroke-width=\"0.6\"/>",
                a.0, a.1, b.0, b.1
            );
            sc.push(Layer::Table, Shape::Line(a, b));
        };
        for r in 0..=self.cells.len() {
            let y = grid_top + row * r as Real;
            line(s, (left, y), (left + total, y));
        }
        let mut x = left;
        for w in &self.widths {
            line(s, (x, grid_top), (x, bottom));
            x += w;
        }
        line(s, (x, grid_top), (x, bottom));
        let mut x = left;
        for (i, w) in self.widths.iter().enumerate() {
            let right = self.right.get(i).copied().unwrap_or(false);
            for (r, cells) in self.cells.iter().enumerate() {
                let Some(text) = cells.get(i) else { continue };
                let y = grid_top + row * (r as Real + 1.0) - 0.45 * row;
                let (at, anchor) = if right && r > 0 {
                    ((x + w - self.font / 2.0, y), Anchor::End)
                } else {
                    ((x + self.font / 2.0, y), Anchor::Start)
                };
                let _ = write!(
                    s,
                    "<text x=\"{:.1}\" y=\"{:.1}\"{}>{}</text>",
                    at.0,
                    at.1 + self.font * 0.35,
                    if anchor == Anchor::End {
                        " text-anchor=\"end\""
                    } else {
                        ""
                    },
                    esc(text)
                );
                sc.push(
                    Layer::Table,
                    Shape::Text {
                        at: (at.0, at.1 + self.font * 0.35),
                        size: self.font,
                        anchor,
                        angle: 0.0,
                        text: text.clone(),
                    },
                );
            }
            x += w;
        }
        s.push_str("</g>\n");
    }
}

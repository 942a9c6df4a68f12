//! The drawing as plain shapes on the sheet, recorded while the SVG is written, so that
//! another format (the DXF of [`crate::report::dxf`]) draws the very same sheet: the
//! same outlines, spans, labels in the places the SVG chose, dimensions and title block.
//! Coordinates are the SVG's, px from the sheet's top left corner (y down); [`Scene`]
//! carries the map back to the world.

use crate::math::Real;

use super::view::{SheetPoint, PX_PER_MM};

/// What a shape shows, one layer each in a CAD drawing.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Layer {
    /// Round parts: sheaves, guides and drums (outlines and centres).
    Sheaves,
    /// The other parts' symbols: anchors, blocks, weights, haul ends, warning rings.
    Parts,
    /// Spans and the rope lying on round parts.
    Spans,
    /// Part and span labels.
    Labels,
    /// Overall dimensions.
    Dimensions,
    /// The tension table.
    Table,
    /// Border, legend, title block and caution.
    Title,
}

impl Layer {
    /// Every layer, in drawing order.
    pub const ALL: [Layer; 7] = [
        Layer::Sheaves,
        Layer::Parts,
        Layer::Spans,
        Layer::Labels,
        Layer::Dimensions,
        Layer::Table,
        Layer::Title,
    ];

    /// The layer's name (`sheaves`, `spans`, ...).
    pub fn name(self) -> &'static str {
        match self {
            Layer::Sheaves => "sheaves",
            Layer::Parts => "parts",
            Layer::Spans => "spans",
            Layer::Labels => "labels",
            Layer::Dimensions => "dimensions",
            Layer::Table => "table",
            Layer::Title => "title",
        }
    }
}

/// Where a text's anchor point sits along it.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Anchor {
    /// At its start (SVG's default).
    Start,
    /// At its middle (`text-anchor="middle"`).
    Middle,
    /// At its end (`text-anchor="end"`: right-aligned numbers).
    End,
}

/// One shape on the sheet, px.
#[derive(Debug, Clone, PartialEq)]
pub enum Shape {
    /// A straight line.
    Line(SheetPoint, SheetPoint),
    /// Connected straight lines, closed back to the first point or not.
    Polyline(Vec<SheetPoint>, bool),
    /// A circle: centre and radius.
    Circle(SheetPoint, Real),
    /// One line of text: the anchor on its baseline, its height (the SVG font size), the
    /// anchor's place, its angle (degrees anticlockwise as seen on the sheet) and text.
    Text {
        /// Anchor point on the baseline.
        at: SheetPoint,
        /// Font size, px.
        size: Real,
        /// Where `at` is along the text.
        anchor: Anchor,
        /// Degrees anticlockwise on the sheet.
        angle: Real,
        /// The text, unescaped.
        text: String,
    },
}

/// A shape, its layer, and where it has one its place on the tension scale (0 lowest,
/// 1 highest forward tension), which colours a span.
#[derive(Debug, Clone, PartialEq)]
pub struct Item {
    /// The layer.
    pub layer: Layer,
    /// The shape.
    pub shape: Shape,
    /// The span's place on the tension scale.
    pub tension: Option<Real>,
}

/// The drawing as shapes, with the sheet's size and the map back to the world.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Scene {
    /// Shapes in drawing order.
    pub items: Vec<Item>,
    /// Sheet width and height, px.
    pub page: (Real, Real),
    /// Sheet px per real metre (the drawing scale).
    pub px_per_m: Real,
    /// The sheet point of the world's projected origin, px.
    pub origin: SheetPoint,
    /// Real length per length on paper (20 for 1:20).
    pub real_per_paper: Real,
}

impl Scene {
    /// Records a shape on a layer.
    pub fn push(&mut self, layer: Layer, shape: Shape) {
        self.items.push(Item {
            layer,
            shape,
            tension: None,
        });
    }

    /// Records a line of text.
    pub fn text(&mut self, layer: Layer, at: SheetPoint, size: Real, text: &str) {
        self.push(
            layer,
            Shape::Text {
                at,
                size,
                anchor: Anchor::Start,
                angle: 0.0,
                text: text.to_string(),
            },
        );
    }

    /// Records a rectangle from its top left corner and size.
    pub fn rect(&mut self, layer: Layer, x: Real, y: Real, w: Real, h: Real) {
        self.push(
            layer,
            Shape::Polyline(vec![(x, y), (x + w, y), (x + w, y + h), (x, y + h)], true),
        );
    }

    /// A sheet point in world metres on the drawing's plane (x right, y up), the
    /// projected origin at 0: the sheet at full size.
    pub fn world(&self, p: SheetPoint) -> (Real, Real) {
        (
            (p.0 - self.origin.0) / self.px_per_m,
            (self.origin.1 - p.1) / self.px_per_m,
        )
    }

    /// A length on the sheet, px, in world metres.
    pub fn world_length(&self, px: Real) -> Real {
        px / self.px_per_m
    }

    /// Sheet px per millimetre of the printed sheet.
    pub fn px_per_mm() -> Real {
        PX_PER_MM
    }
}

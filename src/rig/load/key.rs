//! The vocabulary of the format's key definitions ([`super::keys`]): what a key's value
//! is ([`Shape`]), its range, and the [`Key`] record itself. The loader reads the key
//! names from the definitions; the schema ([`super::schema`]) reads all of it.

use crate::math::Real;
use crate::units::Dimension;

/// What a key's value is: enough for the loader's check of unknown keys and for the rig
/// schema (`reeve schema`, [`super::schema`]), which is generated from these definitions.
/// A new key needs only its [`Key`] here (and its reading in the loader): the schema
/// follows.
#[derive(Debug, Clone, Copy)]
pub enum Shape {
    /// Exactly this value (JSON text): `format: 1`.
    Exactly(&'static str),
    /// A quantity of a dimension: a bare number in the file's unit, or text with a unit
    /// (`"6 mm"`); the range applies to the value.
    Quantity(Dimension, Range),
    /// A quantity as [`Shape::Quantity`], or its values over time
    /// `{schedule: [[t, q], ...]}` (DESIGN.md §7).
    Scheduled(Dimension, Range),
    /// A positive speed: a bare number in m/s (rad/s for a drum), or text in `m/s`,
    /// `mm/s`, `rad/s` or `deg/s`.
    Speed,
    /// A travel of 0 or more: a length (a haul, weight or block) or an angle (a drum).
    Travel,
    /// A plain number: a ratio or a coefficient.
    Number(Range),
    /// A whole number.
    Whole(Range),
    /// An angle in degrees: a bare number, or text ending in `deg` or `°`.
    Angle(Range),
    /// One line of text.
    Text,
    /// `true` or `false`.
    Flag,
    /// One of these words.
    Word(&'static [&'static str]),
    /// A unit spelling of a dimension (`mm`, `lbf*ft`).
    Unit(Dimension),
    /// A point `[x, y, z]` in the file's length unit (each a length).
    Point,
    /// A direction `[x, y, z]`, not all zero (bare numbers).
    Direction,
    /// The name of a part of the rig.
    PartName,
    /// The name of a rope of the rig.
    RopeName,
    /// A mapping of these keys.
    Map(&'static Object),
    /// A mapping of names (chosen by the file) to values of one shape.
    Named(&'static Shape),
    /// A part: `kind` (one of [`super::keys::KINDS`]), `at`, and its kind's keys ([`super::keys::Kind::keys`]).
    Part,
    /// One of a few kinds of mapping told apart by their `kind` key.
    Tagged(&'static [Variant]),
    /// A line's path: at least two entries, each a part name or a mapping of
    /// [`super::keys::ENTRY_KEYS`].
    Path,
    /// Named variants: each a list of `KEY=VALUE` settings or a mapping `KEY: VALUE`.
    Variants,
}

/// A range of numbers: each bound `(value, inclusive)` or none.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Range {
    /// The least value.
    pub min: Option<(Real, bool)>,
    /// The greatest value.
    pub max: Option<(Real, bool)>,
}

impl Range {
    /// Any value.
    pub const ANY: Range = Range {
        min: None,
        max: None,
    };
    /// Greater than 0.
    pub const POSITIVE: Range = Range {
        min: Some((0.0, false)),
        max: None,
    };
    /// 0 or more.
    pub const NON_NEGATIVE: Range = Range {
        min: Some((0.0, true)),
        max: None,
    };
    /// `min` or more.
    pub const fn at_least(min: Real) -> Range {
        Range {
            min: Some((min, true)),
            max: None,
        }
    }
    /// Greater than `min` and less than `max`.
    pub const fn between(min: Real, max: Real) -> Range {
        Range {
            min: Some((min, false)),
            max: Some((max, false)),
        }
    }
    /// The same with `max` included.
    pub const fn up_to(self) -> Range {
        match self.max {
            Some((max, _)) => Range {
                max: Some((max, true)),
                ..self
            },
            None => self,
        }
    }
}

/// A mapping with fixed keys.
#[derive(Debug, Clone, Copy)]
pub struct Object {
    /// Its keys.
    pub keys: &'static [Key],
    /// Which of its optional keys go together.
    pub rule: Rule,
}

/// How the optional keys of a mapping go together.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rule {
    /// Any of them, or none.
    Free,
    /// Exactly one of these.
    OneOf(&'static [&'static str]),
    /// At least one of these.
    AnyOf(&'static [&'static str]),
}

/// One kind of a tagged mapping (`{kind: plain, ...}`).
#[derive(Debug, Clone, Copy)]
pub struct Variant {
    /// The word of its `kind`.
    pub name: &'static str,
    /// What it is.
    pub doc: &'static str,
    /// Its keys besides `kind`.
    pub object: Object,
}

/// One key of the format.
#[derive(Debug, Clone, Copy)]
pub struct Key {
    /// As written in the file.
    pub name: &'static str,
    /// Its value.
    pub shape: Shape,
    /// What it means (the schema's description).
    pub doc: &'static str,
    /// Whether the file must give it.
    pub required: bool,
    /// Whether it may be written empty (`~`) to say "unknown".
    pub nullable: bool,
    /// The value the loader takes when the key is absent, as JSON text.
    pub default: Option<&'static str>,
}

impl Key {
    /// An optional key without a default.
    pub const fn new(name: &'static str, shape: Shape, doc: &'static str) -> Key {
        Key {
            name,
            shape,
            doc,
            required: false,
            nullable: false,
            default: None,
        }
    }
    /// The file must give it.
    pub const fn required(self) -> Key {
        Key {
            required: true,
            ..self
        }
    }
    /// It may be left empty (`~`).
    pub const fn nullable(self) -> Key {
        Key {
            nullable: true,
            ..self
        }
    }
    /// The loader's value when it is absent (JSON text).
    pub const fn default(self, json: &'static str) -> Key {
        Key {
            default: Some(json),
            ..self
        }
    }
}

/// The names of `keys`, for the loader's check of unknown keys.
pub(super) fn key_names(keys: &[Key]) -> Vec<&'static str> {
    keys.iter().map(|k| k.name).collect()
}

/// The names of a tagged mapping's keys: `kind` and the variant's own.
pub(super) fn names_with_kind(keys: &[Key]) -> Vec<&'static str> {
    std::iter::once("kind")
        .chain(keys.iter().map(|k| k.name))
        .collect()
}

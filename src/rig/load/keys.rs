//! The format's key lists, part kinds and defaults: what a rig file may say.

use crate::math::Real;
use crate::model::RopeKind;
use crate::rig::file::{Entry, Node};

/// Default least tread-diameter / rope-diameter ratio for a rope kind.
///
/// - wire: 26, the least D/d of the wire-rope handbooks' table for 6x25 filler-wire
///   class rope (the *Wire Rope Users Manual*'s D/d table; from memory); other 6x19-class
///   constructions need 30–34 (6x21 filler wire 30, 6x19 Seale 34) and stiffer ones more:
///   give `min_bend_ratio` for your rope;
/// - fibre: 8 (common practice for braided and laid fibre rope on sheaves);
/// - kernmantle: 4 (common practice in rope rescue: pulley diameter at least four rope
///   diameters);
/// - cord: 4 (common practice for small cord and line).
pub fn default_min_bend_ratio(kind: RopeKind) -> Real {
    match kind {
        RopeKind::Wire => 26.0,
        RopeKind::Fibre => 8.0,
        RopeKind::Kernmantle | RopeKind::Cord => 4.0,
    }
}

pub(super) const TOP_KEYS: &[&str] = &[
    "format",
    "title",
    "units",
    "gravity",
    "limits",
    "ropes",
    "parts",
    "lines",
    "drive",
    "solve_for",
    "runs_back",
    "variants",
    "travel",
];
pub(super) const UNIT_KEYS: &[&str] = &["length", "force", "mass", "torque"];
pub(super) const LIMIT_KEYS: &[&str] = &["fleet_angle", "design_factor", "stop_speed"];
pub(super) const ROPE_KEYS: &[&str] = &[
    "diameter",
    "breaking_strength",
    "mu",
    "min_bend_ratio",
    "bend_loss",
    "kind",
    "stiffness",
    "mass_per_length",
];
pub(super) const ROPE_KINDS: &[&str] = &["wire", "fibre", "kernmantle", "cord"];
pub(super) const LINE_KEYS: &[&str] = &["rope", "path"];
pub(super) const ENTRY_KEYS: &[&str] = &["part", "turns", "side"];
pub(super) const BEARING_KINDS: &[&str] = &["plain", "rolling", "rated", "none"];
pub(super) const SHAFT_KEYS: &[&str] = &["bearing", "thrust"];
pub(super) const THRUST_KEYS: &[&str] = &[
    "load",
    "diameter",
    "inner_diameter",
    "mu",
    "contact",
    "cone_angle",
];
pub(super) const GROOVE_KEYS: &[&str] = &["angle"];
pub(super) const LOAD_KEYS: &[&str] = &["mass", "force"];
/// Largest magnitude accepted for any quantity, in SI.
pub(super) const LARGEST: Real = 1e12;
/// Most extra turns on one passage.
pub(super) const MOST_TURNS: Real = 1000.0;

/// The kinds of part, before their data is read.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(super) enum Kind {
    Anchor,
    Sheave,
    Guide,
    Block,
    Weight,
    Drum,
    Haul,
}

pub(super) const KINDS: &[(&str, Kind)] = &[
    ("anchor", Kind::Anchor),
    ("sheave", Kind::Sheave),
    ("guide", Kind::Guide),
    ("block", Kind::Block),
    ("weight", Kind::Weight),
    ("drum", Kind::Drum),
    ("haul", Kind::Haul),
];

impl Kind {
    pub(super) fn name(self) -> &'static str {
        KINDS
            .iter()
            .find(|(_, k)| *k == self)
            .map_or("part", |(n, _)| n)
    }

    /// The name with its article: "an anchor", "a sheave".
    pub(super) fn a(self) -> String {
        match self {
            Kind::Anchor => "an anchor".to_string(),
            other => format!("a {}", other.name()),
        }
    }

    /// Keys besides `kind` and `at`.
    pub(super) fn keys(self) -> &'static [&'static str] {
        match self {
            Kind::Anchor => &["block"],
            Kind::Sheave => &[
                "axle", "diameter", "bearing", "mass", "groove", "mu", "block", "thrust", "inertia",
            ],
            Kind::Guide => &["axle", "diameter", "mu", "groove"],
            Kind::Block => &["moves", "load", "mass", "spring"],
            Kind::Weight => &["mass"],
            Kind::Drum => &[
                "axle", "diameter", "shaft", "torque", "drag", "mu", "mass", "lever", "spring",
                "inertia",
            ],
            Kind::Haul => &["pull", "force"],
        }
    }

    /// Whether it has a natural quantity (can be the drive or the unknown).
    pub(super) fn has_quantity(self) -> bool {
        matches!(self, Kind::Block | Kind::Weight | Kind::Drum | Kind::Haul)
    }

    pub(super) fn can_end(self) -> bool {
        matches!(
            self,
            Kind::Anchor | Kind::Block | Kind::Weight | Kind::Drum | Kind::Haul
        )
    }

    pub(super) fn can_pass(self) -> bool {
        matches!(self, Kind::Sheave | Kind::Guide | Kind::Drum)
    }
}

/// The value of a non-null key.
pub(super) fn get<'n>(entries: &'n [Entry], key: &str) -> Option<&'n Node> {
    entries
        .iter()
        .find(|e| e.key == key)
        .map(|e| &e.value)
        .filter(|v| !v.is_null())
}

/// `parent.key`.
pub(super) fn join(parent: &str, key: &str) -> String {
    if parent.is_empty() {
        key.to_string()
    } else {
        format!("{parent}.{key}")
    }
}

//! The format's key lists, part kinds and defaults: what a rig file may say.

use crate::math::Real;
use crate::model::RopeKind;
use crate::rig::file::{Entry, Node};
use crate::units::Dimension;

pub(super) use super::key::{key_names, names_with_kind};
pub use super::key::{Key, Object, Range, Rule, Shape, Variant};

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

const FRICTION: Shape = Shape::Number(Range::NON_NEGATIVE);
const LENGTH: Shape = Shape::Quantity(Dimension::Length, Range::POSITIVE);
const OWN_MASS: Key = Key::new(
    "mass",
    Shape::Quantity(Dimension::Mass, Range::NON_NEGATIVE),
    "the part's own mass (its weight loads its pin and moves with it)",
);
const AXLE: Key = Key::new(
    "axle",
    Shape::Direction,
    "the axle's direction `[x, y, z]`; the part turns in the plane normal to it",
)
.required();
const GROOVE: Key = Key::new(
    "groove",
    Shape::Map(&GROOVE_OBJECT),
    "a V-groove `{angle}`; absent: a round groove",
);
const SURFACE_MU: Key = Key::new(
    "mu",
    FRICTION,
    "friction coefficient of the rope on this part's surface; default: the rope's `mu`",
);
pub(super) const LEVER_KEYS: &[Key] = &[
    Key::new(
        "mass",
        Shape::Quantity(Dimension::Mass, Range::NON_NEGATIVE),
        "the lever's mass (a lid, door or arm)",
    )
    .required(),
    Key::new(
        "arm",
        Shape::Point,
        "from the drum's centre to the lever's centre of mass at the drawn position; turns with the drum",
    )
    .required(),
];
const LEVER_OBJECT: Object = Object {
    keys: LEVER_KEYS,
    rule: Rule::Free,
};
pub(super) const BLOCK_SPRING_KEYS: &[Key] = &[
    Key::new(
        "rate",
        Shape::Quantity(Dimension::SpringRate, Range::NON_NEGATIVE),
        "the spring rate, growing the force per unit of forward travel",
    )
    .required(),
    Key::new(
        "force",
        Shape::Quantity(Dimension::Force, Range::ANY),
        "the force against `moves` at the drawn position",
    )
    .required(),
];
const BLOCK_SPRING_OBJECT: Object = Object {
    keys: BLOCK_SPRING_KEYS,
    rule: Rule::Free,
};
pub(super) const DRUM_SPRING_KEYS: &[Key] = &[
    Key::new(
        "rate",
        Shape::Quantity(Dimension::TorsionRate, Range::NON_NEGATIVE),
        "the torsion rate, growing the torque per unit of forward turning",
    )
    .required(),
    Key::new(
        "torque",
        Shape::Quantity(Dimension::Torque, Range::ANY),
        "the torque against forward turning at the drawn position",
    )
    .required(),
];
const DRUM_SPRING_OBJECT: Object = Object {
    keys: DRUM_SPRING_KEYS,
    rule: Rule::Free,
};
const CARRIED_BY: Key = Key::new(
    "block",
    Shape::PartName,
    "the moving block that carries this part (the key is not `on`, which YAML 1.1 reads as true)",
);

pub(super) const TOP_KEYS: &[Key] = &[
    Key::new("format", Shape::Exactly("1"), "the rig format version: 1").required(),
    Key::new(
        "title",
        Shape::Text,
        "one line that heads every report and drawing; default: the file's name",
    ),
    Key::new(
        "units",
        Shape::Map(&UNITS_OBJECT),
        "the units of bare numbers (text with a unit, such as `6 mm`, says its own)",
    ),
    Key::new(
        "gravity",
        Shape::Direction,
        "the direction of gravity (g = 9.80665 m/s²); only its direction counts",
    )
    .default("[0, 0, -1]"),
    Key::new(
        "limits",
        Shape::Map(&LIMITS_OBJECT),
        "the limits the checks hold the rig to",
    ),
    Key::new(
        "ropes",
        Shape::Named(&Shape::Map(&ROPE_OBJECT)),
        "the ropes, by name",
    )
    .required(),
    Key::new("parts", Shape::Named(&Shape::Part), "the parts, by name").required(),
    Key::new(
        "lines",
        Shape::Named(&Shape::Map(&LINE_OBJECT)),
        "the lines (a rope reeved along a path of parts), by name",
    )
    .required(),
    Key::new(
        "drive",
        Shape::PartName,
        "the part whose forward motion drives the rig (a haul, weight, block or drum); default: the only haul",
    ),
    Key::new(
        "solve_for",
        Shape::PartName,
        "the part whose natural quantity is unknown (haul force, weight mass, block load, drum torque); default: the drive",
    ),
    Key::new(
        "runs_back",
        Shape::Flag,
        "whether the rig must run back by itself (a lid or vent that closes when let go); a self-locking rig is then warned about",
    )
    .default("false"),
    Key::new(
        "variants",
        Shape::Variants,
        "named sets of changes for `reeve compare --variants`, each `KEY=VALUE` by the file's own keys",
    ),
    Key::new(
        "travel",
        Shape::Map(&TRAVEL_OBJECT),
        "how far the drive can move back and forward from the drawn position before an end stop (DESIGN.md §7); `sweep --stroke` without a distance runs over it",
    ),
];
pub(super) const TRAVEL_KEYS: &[Key] = &[
    Key::new(
        "back",
        Shape::Travel,
        "travel back from the drawn position to the back stop",
    ),
    Key::new(
        "forward",
        Shape::Travel,
        "travel forward from the drawn position to the forward stop",
    ),
];
const TRAVEL_OBJECT: Object = Object {
    keys: TRAVEL_KEYS,
    rule: Rule::Free,
};
pub(super) const UNIT_KEYS: &[Key] = &[
    Key::new(
        "length",
        Shape::Unit(Dimension::Length),
        "unit of bare lengths",
    )
    .default("\"mm\""),
    Key::new(
        "force",
        Shape::Unit(Dimension::Force),
        "unit of bare forces",
    )
    .default("\"N\""),
    Key::new("mass", Shape::Unit(Dimension::Mass), "unit of bare masses").default("\"kg\""),
    Key::new(
        "torque",
        Shape::Unit(Dimension::Torque),
        "unit of bare torques (bare torques stay N*m unless this says otherwise)",
    )
    .default("\"N*m\""),
];
const UNITS_OBJECT: Object = Object {
    keys: UNIT_KEYS,
    rule: Rule::Free,
};
pub(super) const LIMIT_KEYS: &[Key] = &[
    Key::new(
        "fleet_angle",
        Shape::Angle(Range::between(0.0, 90.0)),
        "the largest fleet angle, in degrees",
    )
    .default("1.5"),
    Key::new(
        "design_factor",
        Shape::Number(Range::at_least(1.0)),
        "the least ratio of the rope's breaking strength to its tension",
    )
    .default("5"),
    Key::new(
        "stop_speed",
        Shape::Speed,
        "the fastest a stroke may reach an end stop in `reeve motion` before a warning",
    ),
];
const LIMITS_OBJECT: Object = Object {
    keys: LIMIT_KEYS,
    rule: Rule::Free,
};
pub(super) const ROPE_KINDS: &[&str] = &["wire", "fibre", "kernmantle", "cord"];
pub(super) const ROPE_KEYS: &[Key] = &[
    Key::new("diameter", LENGTH, "the rope's diameter").required(),
    Key::new(
        "breaking_strength",
        Shape::Quantity(Dimension::Force, Range::POSITIVE),
        "the rope's minimum breaking strength, for the safety-factor check",
    ),
    Key::new(
        "mu",
        FRICTION,
        "friction coefficient of the rope on a non-turning surface (guides, drums, stalled sheaves)",
    )
    .required(),
    Key::new(
        "min_bend_ratio",
        Shape::Number(Range::POSITIVE),
        "the least tread diameter / rope diameter (D/d); default by kind: wire 26, fibre 8, kernmantle 4, cord 4",
    ),
    Key::new(
        "kind",
        Shape::Word(ROPE_KINDS),
        "what the rope is made of; sets the default `min_bend_ratio`",
    )
    .default("\"fibre\""),
    Key::new(
        "bend_loss",
        Shape::Number(Range {
            min: Some((0.0, true)),
            max: Some((1.0, false)),
        }),
        "fraction of tension lost to the rope's own bending at each passage over a turning sheave or drum, whatever the wrap",
    )
    .default("0"),
    Key::new(
        "stiffness",
        Shape::Quantity(Dimension::Force, Range::POSITIVE),
        "the rope's axial stiffness EA (a force: strain = T / EA); absent: inextensible",
    ),
    Key::new(
        "mass_per_length",
        Shape::Quantity(Dimension::MassPerLength, Range::NON_NEGATIVE),
        "the rope's own weight per length; bare numbers are kg/m",
    )
    .default("0"),
];
const ROPE_OBJECT: Object = Object {
    keys: ROPE_KEYS,
    rule: Rule::Free,
};
pub(super) const LINE_KEYS: &[Key] = &[
    Key::new("rope", Shape::RopeName, "the rope, by its name in `ropes`").required(),
    Key::new(
        "path",
        Shape::Path,
        "the parts the line passes, from one end to the other; the ends are anchors, blocks, weights, drums or hauls, the parts between sheaves, guides or drums",
    )
    .required(),
];
const LINE_OBJECT: Object = Object {
    keys: LINE_KEYS,
    rule: Rule::Free,
};
pub(super) const SIDES: &[&str] = &["left", "right"];
pub(super) const ENTRY_KEYS: &[Key] = &[
    Key::new("part", Shape::PartName, "the part passed").required(),
    Key::new(
        "turns",
        Shape::Whole(Range {
            min: Some((0.0, true)),
            max: Some((MOST_TURNS, true)),
        }),
        "extra full turns on a guide or drum",
    )
    .default("0"),
    Key::new(
        "side",
        Shape::Word(SIDES),
        "on which side of the rope the part lies, looking along the path from the tip of the axle, where the path alone does not tell",
    ),
];
pub(super) const ENTRY_OBJECT: Object = Object {
    keys: ENTRY_KEYS,
    rule: Rule::Free,
};
/// Keys every part has.
pub(super) const PART_KEYS: &[Key] = &[
    Key::new("kind", Shape::Word(&[]), "what the part is").required(),
    Key::new(
        "at",
        Shape::Point,
        "the part's centre or point `[x, y, z]`, in the file's length unit",
    )
    .required(),
];
pub(super) const BEARINGS: &[Variant] = &[
    Variant {
        name: "plain",
        doc: "a journal (plain) bearing: friction circle of the pin",
        object: Object {
            keys: &[
                Key::new("pin_diameter", LENGTH, "the pin's diameter").required(),
                Key::new(
                    "mu",
                    FRICTION,
                    "the running friction coefficient of pin in bore",
                )
                .required(),
                Key::new(
                    "mu_static",
                    FRICTION,
                    "the static coefficient, for breakaway",
                ),
            ],
            rule: Rule::Free,
        },
    },
    Variant {
        name: "rolling",
        doc: "a rolling bearing: constant-coefficient catalogue model at the bore",
        object: Object {
            keys: &[
                Key::new("bore", LENGTH, "the bearing's bore").required(),
                Key::new(
                    "mu",
                    FRICTION,
                    "the bearing's friction coefficient (catalogue value)",
                )
                .required(),
            ],
            rule: Rule::Free,
        },
    },
    Variant {
        name: "rated",
        doc: "a rated sheave: a per-sheave factor or efficiency at 180° wrap",
        object: Object {
            keys: &[
                Key::new(
                    "factor",
                    Shape::Number(Range::at_least(1.0)),
                    "the bearing factor K = 1 / efficiency",
                ),
                Key::new(
                    "efficiency",
                    Shape::Number(Range::between(0.0, 1.0).up_to()),
                    "the efficiency at 180° wrap",
                ),
            ],
            rule: Rule::OneOf(&["factor", "efficiency"]),
        },
    },
    Variant {
        name: "none",
        doc: "no bearing friction (an ideal sheave)",
        object: Object {
            keys: &[],
            rule: Rule::Free,
        },
    },
];
pub(super) const SHAFT_KEYS: &[Key] = &[
    Key::new(
        "bearing",
        Shape::Tagged(BEARINGS),
        "the journal bearing; absent: frictionless",
    ),
    Key::new(
        "thrust",
        Shape::Map(&THRUST_OBJECT),
        "a thrust (pivot or collar) bearing carrying an axial load",
    ),
];
const SHAFT_OBJECT: Object = Object {
    keys: SHAFT_KEYS,
    rule: Rule::AnyOf(&["bearing", "thrust"]),
};
pub(super) const CONTACTS: &[&str] = &["new", "worn"];
pub(super) const THRUST_KEYS: &[Key] = &[
    Key::new(
        "load",
        Shape::Quantity(Dimension::Force, Range::NON_NEGATIVE),
        "the axial load",
    )
    .required(),
    Key::new("diameter", LENGTH, "the outer diameter of the contact").required(),
    Key::new(
        "inner_diameter",
        Shape::Quantity(Dimension::Length, Range::NON_NEGATIVE),
        "the inner diameter of a collar",
    )
    .default("0"),
    Key::new(
        "mu",
        FRICTION,
        "the friction coefficient of the thrust face",
    )
    .required(),
    Key::new(
        "contact",
        Shape::Word(CONTACTS),
        "`new` (uniform pressure) or `worn` (uniform wear)",
    )
    .required(),
    Key::new(
        "cone_angle",
        Shape::Angle(Range::between(0.0, 90.0).up_to()),
        "a conical pivot's half-angle in degrees; absent: flat",
    ),
];
const THRUST_OBJECT: Object = Object {
    keys: THRUST_KEYS,
    rule: Rule::Free,
};
pub(super) const GROOVE_KEYS: &[Key] = &[Key::new(
    "angle",
    Shape::Angle(Range::between(0.0, 180.0)),
    "the V-groove's included angle in degrees",
)
.required()];
const GROOVE_OBJECT: Object = Object {
    keys: GROOVE_KEYS,
    rule: Rule::Free,
};
pub(super) const LOAD_KEYS: &[Key] = &[
    Key::new(
        "mass",
        Shape::Scheduled(Dimension::Mass, Range::NON_NEGATIVE),
        "a hanging weight's mass, acting along gravity; `~` when it is the unknown",
    )
    .nullable(),
    Key::new(
        "force",
        Shape::Scheduled(Dimension::Force, Range::ANY),
        "a force against `moves`; `~` when it is the unknown",
    )
    .nullable(),
];
const LOAD_OBJECT: Object = Object {
    keys: LOAD_KEYS,
    rule: Rule::OneOf(&["mass", "force"]),
};
/// Largest magnitude accepted for any quantity, in SI.
pub(super) const LARGEST: Real = 1e12;
/// Most extra turns on one passage.
pub(super) const MOST_TURNS: Real = 1000.0;

const ANCHOR_KEYS: &[Key] = &[CARRIED_BY];
const SHEAVE_KEYS: &[Key] = &[
    AXLE,
    Key::new("diameter", LENGTH, "the tread (groove-bottom) diameter").required(),
    Key::new(
        "bearing",
        Shape::Tagged(BEARINGS),
        "the sheave's bearing; `{kind: none}` for an ideal sheave",
    )
    .required(),
    OWN_MASS,
    GROOVE,
    SURFACE_MU,
    CARRIED_BY,
    Key::new(
        "thrust",
        Shape::Map(&SHEAVE_THRUST_OBJECT),
        "a thrust face carrying the axial part of the pin load (fleet angles); `load` is an optional preload",
    ),
    INERTIA,
];
pub(super) const SHEAVE_THRUST_KEYS: &[Key] = &[
    Key::new(
        "load",
        Shape::Quantity(Dimension::Force, Range::NON_NEGATIVE),
        "an axial preload beside the spans' axial pull",
    )
    .default("0"),
    THRUST_KEYS[1],
    THRUST_KEYS[2],
    THRUST_KEYS[3],
    THRUST_KEYS[4],
    THRUST_KEYS[5],
];
const SHEAVE_THRUST_OBJECT: Object = Object {
    keys: SHEAVE_THRUST_KEYS,
    rule: Rule::Free,
};
const INERTIA: Key = Key::new(
    "inertia",
    Shape::Quantity(Dimension::Inertia, Range::NON_NEGATIVE),
    "rotational inertia for `reeve motion`; default: a uniform disc of the part's mass at its pitch radius",
);
const GUIDE_KEYS: &[Key] = &[
    AXLE,
    Key::new("diameter", LENGTH, "the diameter of the round surface").required(),
    SURFACE_MU,
    GROOVE,
];
const BLOCK_KEYS: &[Key] = &[
                Key::new(
                    "moves",
                    Shape::Direction,
                    "the direction of forward travel; default: against gravity",
                ),
                Key::new(
                    "load",
                    Shape::Map(&LOAD_OBJECT),
                    "the block's load, `{mass}` (a weight) or `{force}` (against `moves`); needed unless the block is `solve_for`",
                ),
                OWN_MASS,
                Key::new(
                    "spring",
                    Shape::Map(&BLOCK_SPRING_OBJECT),
                    "a linear spring on the block `{rate, force}` (a counterbalance spring, a gas strut taken as linear)",
                ),
            ];
const WEIGHT_KEYS: &[Key] = &[Key::new(
    "mass",
    Shape::Scheduled(Dimension::Mass, Range::POSITIVE),
    "the hanging mass; needed unless the weight is `solve_for`",
)];
const DRUM_KEYS: &[Key] = &[
    AXLE,
    Key::new("diameter", LENGTH, "the drum's diameter").required(),
    Key::new(
        "shaft",
        Shape::Map(&SHAFT_OBJECT),
        "the shaft's bearings `{bearing, thrust}`; absent: frictionless",
    ),
    Key::new(
        "torque",
        Shape::Scheduled(Dimension::Torque, Range::ANY),
        "the steady load torque, opposing forward turning and driving back (a lid's weight)",
    )
    .default("0"),
    Key::new(
        "drag",
        Shape::Quantity(Dimension::Torque, Range::NON_NEGATIVE),
        "a torque that always opposes the motion",
    )
    .default("0"),
    Key::new(
        "mu",
        FRICTION,
        "friction coefficient of the rope on the drum, for the slip check; default: the rope's",
    ),
    OWN_MASS,
    Key::new(
        "lever",
        Shape::Map(&LEVER_OBJECT),
        "a lid, door, flap or arm turned by the drum `{mass, arm}`: its weight's torque about the axle follows the arm",
    ),
    Key::new(
        "spring",
        Shape::Map(&DRUM_SPRING_OBJECT),
        "a torsion spring on the drum `{rate, torque}`",
    ),
    INERTIA,
];
const HAUL_KEYS: &[Key] = &[
                Key::new(
                    "pull",
                    Shape::Direction,
                    "the direction of the pull; default: along the span, away from the previous part",
                ),
                Key::new(
                    "force",
                    Shape::Scheduled(Dimension::Force, Range::POSITIVE),
                    "the force applied (what is available, for the drive); needed unless the haul is `solve_for`",
                ),
            ];

/// The kinds of part, before their data is read.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    Anchor,
    Sheave,
    Guide,
    Block,
    Weight,
    Drum,
    Haul,
}

pub const KINDS: &[(&str, Kind)] = &[
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
    pub fn keys(self) -> &'static [Key] {
        match self {
            Kind::Anchor => ANCHOR_KEYS,
            Kind::Sheave => SHEAVE_KEYS,
            Kind::Guide => GUIDE_KEYS,
            Kind::Block => BLOCK_KEYS,
            Kind::Weight => WEIGHT_KEYS,
            Kind::Drum => DRUM_KEYS,
            Kind::Haul => HAUL_KEYS,
        }
    }

    /// What the kind is, for the schema.
    pub fn doc(self) -> &'static str {
        match self {
            Kind::Anchor => "a fixed tie point for a line end",
            Kind::Sheave => "a grooved wheel turning on a bearing",
            Kind::Guide => "a fixed round surface the rope slides over (pin, bar, fairlead)",
            Kind::Block => "a moving frame carrying sheaves and a load",
            Kind::Weight => "a hanging mass at a line end, moving along gravity",
            Kind::Drum => "turns on a shaft (a hinge drum, a winch barrel, a capstan head)",
            Kind::Haul => "a free line end where the effort is applied",
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

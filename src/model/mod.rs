//! The model: the rig as resolved, its own stage between the file layer ([`crate::rig`],
//! which builds it) and every later stage (geometry, friction, solve, checks, report,
//! studies), which read only this and never see YAML. Names are checked, references
//! turned into ids, every quantity is in SI and radians; [`network`] holds the
//! line-and-sheave graph and the independent sub-rigs. [`source`] names what is wrong
//! with a rig file ([`LoadError`], located) and what a study asks of the file
//! ([`RigFile`], implemented by `rig/`); [`vary`] holds what a study varies (named
//! variants, ranged values) and [`param`] the model values it sets.

pub mod changing;
pub mod id;
pub mod network;
pub mod param;
pub mod source;
pub mod vary;

pub use id::{Id, IdVec, LineId, PartId, RopeId};
pub use network::{Link, Network};
pub use source::{LoadError, Problem, RigFile};

use crate::math::{Direction, Point, Real};
use crate::units::UnitSystem;

/// Where something was written in the rig file (1-based line and column).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Location {
    /// 1-based line.
    pub line: usize,
    /// 1-based column.
    pub column: usize,
}

/// A whole rig, ready for geometry and solving.
#[derive(Debug, Clone)]
pub struct Rig {
    /// The rig's title (file name when the file has none).
    pub title: String,
    /// The units the file used for bare numbers; reports show these.
    pub units: UnitSystem,
    /// Direction in which gravity acts.
    pub gravity: Direction,
    /// Good-practice limits for the checks.
    pub limits: Limits,
    /// Rope kinds, file order.
    pub ropes: IdVec<RopeId, Rope>,
    /// Parts, file order.
    pub parts: IdVec<PartId, Part>,
    /// Lines, file order.
    pub lines: IdVec<LineId, Line>,
    /// The part whose forward motion drives the rig.
    pub drive: PartId,
    /// The part whose natural quantity is the unknown.
    pub solve_for: PartId,
    /// Whether the rig is meant to run back by itself (a lid that closes under its own
    /// weight); a self-locking result is then warned about. Key `runs_back`, default false.
    pub runs_back: bool,
    /// What changes over the travel and over time: levers, springs, end stops, inertia,
    /// schedules (DESIGN.md §7); empty for a rig without those keys.
    pub changing: changing::Changing,
}

/// Good-practice limits.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Limits {
    /// Largest fleet angle, radians (default 1.5°, common practice for grooved sheaves).
    pub fleet_angle: Real,
    /// Least ratio of breaking strength to span tension (default 5, common practice).
    pub design_factor: Real,
}

impl Default for Limits {
    fn default() -> Self {
        Limits {
            fleet_angle: 1.5_f64.to_radians(),
            design_factor: 5.0,
        }
    }
}

/// What a rope is made of; sets the default least bend ratio.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RopeKind {
    /// Stranded steel wire rope.
    Wire,
    /// Fibre rope or braid (the default).
    Fibre,
    /// Kernmantle life-safety rope.
    Kernmantle,
    /// Small cord, fishing line, instrument cable.
    Cord,
}

/// A rope or cord kind that lines are made of.
#[derive(Debug, Clone, PartialEq)]
pub struct Rope {
    /// Name as written.
    pub name: String,
    /// What it is made of.
    pub kind: RopeKind,
    /// Nominal diameter, m.
    pub diameter: Real,
    /// Minimum breaking strength, N, when known.
    pub breaking_strength: Option<Real>,
    /// Coefficient of friction of rope on a non-turning surface (capstan, groove).
    pub mu: Real,
    /// Least tread-diameter / rope-diameter ratio.
    pub min_bend_ratio: Real,
    /// Axial stiffness EA, N (strain = tension / EA), when given (key `stiffness`).
    /// None: inextensible, as before DESIGN.md §7.
    pub stiffness: Option<Real>,
    /// Mass per length, kg/m, when given (key `mass_per_length`). None or zero:
    /// weightless, as before DESIGN.md §7.
    pub mass_per_length: Option<Real>,
    /// Fraction of tension lost to the rope's own bending at each passage over a
    /// turning sheave or drum, `0 ≤ β < 1` (DESIGN.md §7; default 0):
    /// [`crate::friction::bending`].
    pub bend_loss: Real,
    /// Where the rope is defined in the file.
    pub location: Location,
}

/// A part of the rig.
#[derive(Debug, Clone, PartialEq)]
pub struct Part {
    /// Name as written (unique).
    pub name: String,
    /// Centre (round parts) or point (ends), m.
    pub at: Point,
    /// What it is.
    pub kind: PartKind,
    /// The moving block that carries it: a sheave in a moving block, or an anchor that is
    /// a pick point on a block (key `block`). None for fixed parts and for movers.
    pub block: Option<PartId>,
    /// Where the part is defined in the file.
    pub location: Location,
}

/// The kinds of part, with their own data.
#[derive(Debug, Clone, PartialEq)]
pub enum PartKind {
    /// A tie point: fixed, or a pick point on a moving block (`Part::block`).
    Anchor,
    /// A turning sheave, fixed or carried by a block.
    Sheave(Sheave),
    /// A fixed round surface the rope slides over.
    Guide(Guide),
    /// A moving frame that carries sheaves and a load.
    Block(Block),
    /// A hanging mass at a line end.
    Weight(Weight),
    /// A drum on a shaft.
    Drum(Drum),
    /// A free line end where effort is applied.
    Haul(Haul),
}

impl PartKind {
    /// The kind's name as written in rig files.
    pub fn name(&self) -> &'static str {
        match self {
            PartKind::Anchor => "anchor",
            PartKind::Sheave(_) => "sheave",
            PartKind::Guide(_) => "guide",
            PartKind::Block(_) => "block",
            PartKind::Weight(_) => "weight",
            PartKind::Drum(_) => "drum",
            PartKind::Haul(_) => "haul",
        }
    }

    /// The round part's axle, tread diameter and groove data, if it is round.
    pub fn round(&self) -> Option<Round> {
        match self {
            PartKind::Sheave(s) => Some(Round {
                axle: s.axle,
                tread_diameter: s.tread_diameter,
                groove_angle: s.groove_angle,
                mu: s.mu,
            }),
            PartKind::Guide(g) => Some(Round {
                axle: g.axle,
                tread_diameter: g.diameter,
                groove_angle: g.groove_angle,
                mu: g.mu,
            }),
            PartKind::Drum(d) => Some(Round {
                axle: d.axle,
                tread_diameter: d.diameter,
                groove_angle: None,
                mu: d.mu,
            }),
            _ => None,
        }
    }
}

/// What every round part (sheave, guide, drum) has in common.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Round {
    /// Axle direction; the part's plane is normal to it.
    pub axle: Direction,
    /// Tread (groove-bottom) diameter, m.
    pub tread_diameter: Real,
    /// V-groove included angle, radians (None = round groove).
    pub groove_angle: Option<Real>,
    /// Rope-on-surface friction coefficient, when the part overrides the rope's.
    pub mu: Option<Real>,
}

/// A turning sheave.
#[derive(Debug, Clone, PartialEq)]
pub struct Sheave {
    /// Axle direction.
    pub axle: Direction,
    /// Tread diameter, m.
    pub tread_diameter: Real,
    /// The bearing it turns on.
    pub bearing: Bearing,
    /// Own mass, kg (adds its weight to the pin load).
    pub mass: Option<Real>,
    /// V-groove included angle, radians.
    pub groove_angle: Option<Real>,
    /// Rope-on-groove friction (default: the rope's), for the stalled-sheave check.
    pub mu: Option<Real>,
    /// Thrust face carrying the pin load's axial part (DESIGN.md §7); its `load` is an
    /// axial preload added to that part (0 when not written).
    pub thrust: Option<Thrust>,
}

/// A fixed round surface.
#[derive(Debug, Clone, PartialEq)]
pub struct Guide {
    /// Axle direction.
    pub axle: Direction,
    /// Surface diameter, m.
    pub diameter: Real,
    /// Rope-on-guide friction (default: the rope's).
    pub mu: Option<Real>,
    /// V-groove included angle, radians.
    pub groove_angle: Option<Real>,
}

/// The load a block carries: which quantity it is, and its value (None when it is the
/// unknown).
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum BlockLoad {
    /// A hanging mass, kg, acting along gravity.
    Mass(Option<Real>),
    /// A force, N, acting against the block's forward travel.
    Force(Option<Real>),
}

impl BlockLoad {
    /// The value (kg or N), None when it is the unknown.
    pub fn value(self) -> Option<Real> {
        match self {
            BlockLoad::Mass(v) | BlockLoad::Force(v) => v,
        }
    }

    /// Whether the load is a force (else a mass); decides the unknown's quantity when
    /// the block is `solve_for`.
    pub fn is_force(self) -> bool {
        matches!(self, BlockLoad::Force(_))
    }
}

/// A moving frame.
#[derive(Debug, Clone, PartialEq)]
pub struct Block {
    /// Direction of forward travel.
    pub moves: Direction,
    /// The load: its quantity, and its value unless it is the unknown.
    pub load: BlockLoad,
    /// Whether the file says which quantity the load is (it has `load`). Only a
    /// `solve_for` block may leave `load` out; its quantity is then a mass where its
    /// travel has a component along gravity, else a force against `moves`
    /// ([`square_to_gravity`]).
    pub load_stated: bool,
    /// The frame's own mass, kg.
    pub mass: Option<Real>,
}

/// Directions closer than this to square (cosine of the angle between them) count as
/// square: a weight moving along one does no work.
pub const SQUARE: Real = 1e-9;

/// Whether a block travelling along `moves` is square to `gravity`, so that a mass on
/// it does no work as it moves (a cart on a level track, a rig drawn with Y up while
/// gravity is left at −Z).
///
/// ```
/// use reeve::math::{Direction, Vector};
/// use reeve::model::square_to_gravity;
/// let down = Direction::new_normalize(-Vector::z());
/// assert!(square_to_gravity(&Direction::new_normalize(Vector::x()), &down));
/// assert!(!square_to_gravity(&Direction::new_normalize(Vector::new(1.0, 0.0, 0.1)), &down));
/// ```
pub fn square_to_gravity(moves: &Direction, gravity: &Direction) -> bool {
    moves.dot(gravity).abs() <= SQUARE
}

/// A hanging mass at a line end.
#[derive(Debug, Clone, PartialEq)]
pub struct Weight {
    /// Mass, kg; None when it is the unknown.
    pub mass: Option<Real>,
}

/// Journal bearing and thrust of a drum shaft.
#[derive(Debug, Clone, PartialEq)]
pub struct Shaft {
    /// Radial bearing.
    pub bearing: Bearing,
    /// Axial (thrust) bearing.
    pub thrust: Option<Thrust>,
}

/// A drum on a shaft.
#[derive(Debug, Clone, PartialEq)]
pub struct Drum {
    /// Axle direction; forward turning of a driving drum is right-handed about it.
    pub axle: Direction,
    /// Barrel (tread) diameter, m.
    pub diameter: Real,
    /// Shaft bearings.
    pub shaft: Option<Shaft>,
    /// Steady load torque opposing forward turning, N·m; None when it is the unknown.
    pub torque: Option<Real>,
    /// Torque that always opposes motion, N·m.
    pub drag: Real,
    /// Rope-on-drum friction for the slip check (default: the rope's).
    pub mu: Option<Real>,
    /// Own mass, kg (adds to the journal load).
    pub mass: Option<Real>,
}

/// A free line end where effort is applied.
#[derive(Debug, Clone, PartialEq)]
pub struct Haul {
    /// Direction of pull; None = along the span away from the previous part.
    pub pull: Option<Direction>,
    /// Available force, N, when known.
    pub force: Option<Real>,
}

/// How a sheave or shaft turns on its pin.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Bearing {
    /// Frictionless.
    None,
    /// Plain journal bearing (bushing): friction circle.
    Plain {
        /// Pin diameter, m.
        pin_diameter: Real,
        /// Kinetic coefficient.
        mu: Real,
        /// Static coefficient for breakaway, when known.
        mu_static: Option<Real>,
    },
    /// Rolling-element bearing, constant-coefficient catalogue model.
    Rolling {
        /// Bore diameter, m.
        bore: Real,
        /// Catalogue friction coefficient.
        mu: Real,
    },
    /// A sheave rated by its maker: bearing factor K = 1/efficiency at 180° wrap.
    Rated {
        /// K ≥ 1.
        factor: Real,
    },
}

/// Pressure distribution on a thrust face.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Contact {
    /// Uniform pressure (new surfaces).
    New,
    /// Uniform wear (run-in surfaces).
    Worn,
}

/// A thrust (pivot or collar) bearing.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Thrust {
    /// Axial load, N.
    pub load: Real,
    /// Outer contact diameter, m.
    pub diameter: Real,
    /// Inner contact diameter, m (0 for a solid pivot).
    pub inner_diameter: Real,
    /// Coefficient of friction.
    pub mu: Real,
    /// New or worn.
    pub contact: Contact,
    /// Half-angle of a conical pivot, radians (None = flat).
    pub cone_angle: Option<Real>,
}

/// Which side of the rope a round part lies on, looking along the path from the tip of
/// the axle vector. Left means the rope turns anticlockwise about the axle.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Side {
    /// Part on the rope's left: anticlockwise about the axle.
    Left,
    /// Part on the rope's right: clockwise about the axle.
    Right,
}

impl Side {
    /// +1 for left (anticlockwise about the axle), −1 for right.
    pub fn sense(self) -> Real {
        match self {
            Side::Left => 1.0,
            Side::Right => -1.0,
        }
    }
}

/// One entry of a line's path.
#[derive(Debug, Clone, PartialEq)]
pub struct PathEntry {
    /// The part.
    pub part: PartId,
    /// Extra full turns (guides and drums).
    pub turns: u32,
    /// Explicit side, where the path alone does not tell.
    pub side: Option<Side>,
    /// Where the entry is written.
    pub location: Location,
}

/// A line: one length of rope reeved along a path.
#[derive(Debug, Clone, PartialEq)]
pub struct Line {
    /// Name as written.
    pub name: String,
    /// Its rope.
    pub rope: RopeId,
    /// From one end to the other.
    pub path: Vec<PathEntry>,
    /// Where the line is defined.
    pub location: Location,
}

impl Part {
    /// A tie point that does not move (an anchor not carried by a block).
    pub fn is_fixed_anchor(&self) -> bool {
        matches!(self.kind, PartKind::Anchor) && self.block.is_none()
    }
}

impl Rig {
    /// The part with this name.
    pub fn part_named(&self, name: &str) -> Option<PartId> {
        self.parts.position(|p| p.name == name)
    }

    /// The rope a line is made of.
    pub fn rope_of(&self, line: LineId) -> &Rope {
        &self.ropes[self.lines[line].rope]
    }
}

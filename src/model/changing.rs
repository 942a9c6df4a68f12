//! What changes over the travel and over time (DESIGN.md §7): drum levers, block and drum
//! springs, the end stops (`travel`), rotational inertia, and quantities given as a
//! schedule in time. A rig without these keys has an empty [`Changing`] and gives the
//! figures it gave before.
//!
//! Positions are kept per part as an offset from the drawn position along the part's own
//! motion ([`PartChanging::offset`]: metres for a translating part, radians of turn for a
//! drum, right-handed about its axle); `solve::travel` advances them as it moves the rig.

use crate::math::{Real, Vector, STANDARD_GRAVITY};
use crate::model::{IdVec, PartId};

/// The end stops: how far the drive may move back and forward from the drawn position
/// (m for a translating drive, rad for a drum). Both non-negative.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Travel {
    /// Travel back from the drawn position (≥ 0).
    pub back: Real,
    /// Travel forward from the drawn position (≥ 0).
    pub forward: Real,
}

/// A lid, door or arm turned by a drum: its weight acts at `arm` from the drum's centre,
/// and the arm turns with the drum.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Lever {
    /// Mass, kg.
    pub mass: Real,
    /// From the drum's centre to the lever's centre of mass at the drawn position, m.
    pub arm: Vector,
}

/// A linear spring: `preload` (N against a block's `moves`, or N·m against a drum's
/// forward turning) at the drawn position, growing by `rate` per unit of forward travel.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Spring {
    /// N/m (block) or N·m/rad (drum).
    pub rate: Real,
    /// N (block) or N·m (drum) at the drawn position.
    pub preload: Real,
}

impl Spring {
    /// The spring's force (or torque) against forward travel after `forward_travel`.
    pub fn load(&self, forward_travel: Real) -> Real {
        self.preload + self.rate * forward_travel
    }
}

/// A quantity over time: `(t, q)` points (s and SI), piecewise linear, held at the ends.
#[derive(Debug, Clone, PartialEq)]
pub struct Schedule {
    /// Points in increasing time (at least one).
    pub points: Vec<(Real, Real)>,
}

impl Schedule {
    /// The value at time `t`: linear between points, held before the first and after the
    /// last.
    ///
    /// ```
    /// use reeve::model::changing::Schedule;
    /// let s = Schedule { points: vec![(0.0, 1.0), (10.0, 3.0)] };
    /// assert_eq!(s.at(-1.0), 1.0);
    /// assert_eq!(s.at(5.0), 2.0);
    /// assert_eq!(s.at(99.0), 3.0);
    /// ```
    pub fn at(&self, t: Real) -> Real {
        let p = &self.points;
        let Some(first) = p.first() else { return 0.0 };
        if t <= first.0 {
            return first.1;
        }
        for w in p.windows(2) {
            let ((t0, q0), (t1, q1)) = (w[0], w[1]);
            if t <= t1 {
                if t1 == t0 {
                    return q1;
                }
                return q0 + (q1 - q0) * (t - t0) / (t1 - t0);
            }
        }
        p[p.len() - 1].1
    }

    /// The value at the first time: what every command but `motion` uses.
    pub fn first(&self) -> Real {
        self.points.first().map_or(0.0, |p| p.1)
    }

    /// The last time given, s.
    pub fn end(&self) -> Real {
        self.points.last().map_or(0.0, |p| p.0)
    }

    /// The times at which the slope changes (the points), for the integrator's steps.
    pub fn times(&self) -> impl Iterator<Item = Real> + '_ {
        self.points.iter().map(|p| p.0)
    }
}

/// What changes for one part.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct PartChanging {
    /// A drum's lever.
    pub lever: Option<Lever>,
    /// A block's or drum's spring.
    pub spring: Option<Spring>,
    /// A sheave's or drum's rotational inertia, kg·m² (key `inertia`); None: a uniform
    /// disc of its mass at its pitch radius (common practice).
    pub inertia: Option<Real>,
    /// The part's natural quantity over time (SI), when given as a schedule.
    pub schedule: Option<Schedule>,
    /// Offset from the drawn position along the part's motion: m, or rad for a drum.
    pub offset: Real,
    /// An extra generalized load on the part's motion (N along it, or N·m about a drum's
    /// axle), zero unless `motion` sets the d'Alembert inertia load here so that it
    /// passes through the same friction as the other loads.
    pub extra_load: Real,
}

/// Everything of DESIGN.md §7's travel and time keys for a rig.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Changing {
    /// The end stops (top-level `travel`).
    pub travel: Option<Travel>,
    /// The speed above which reaching an end stop is warned about (`limits.stop_speed`,
    /// m/s or rad/s).
    pub stop_speed: Option<Real>,
    /// Per part, file order (may be empty for a rig built in code: every part then has
    /// nothing that changes).
    pub parts: IdVec<PartId, PartChanging>,
}

impl Changing {
    /// The part's data, or the empty default.
    pub fn of(&self, part: PartId) -> &PartChanging {
        const NONE: PartChanging = PartChanging {
            lever: None,
            spring: None,
            inertia: None,
            schedule: None,
            offset: 0.0,
            extra_load: 0.0,
        };
        self.parts.get(part).unwrap_or(&NONE)
    }

    /// The part's data for changing it (grows the list as needed).
    pub fn of_mut(&mut self, part: PartId) -> &mut PartChanging {
        while self.parts.len() <= part.index() {
            self.parts.push(PartChanging::default());
        }
        &mut self.parts[part]
    }

    /// Whether any quantity is given as a schedule.
    pub fn has_schedule(&self) -> bool {
        self.parts.iter().any(|p| p.schedule.is_some())
    }

    /// Whether anything changes with position (a lever or a spring).
    pub fn changes_with_position(&self) -> bool {
        self.parts
            .iter()
            .any(|p| p.lever.is_some() || p.spring.is_some())
    }
}

/// The lever's torque about the drum's axle (right-handed about `axle`, N·m) after the
/// drum has turned by `turned` (rad, right-handed about `axle`) from the drawn position,
/// with gravity along `gravity` (unit).
///
/// # Formula
/// `τ = ((Rot(axle, θ)·arm) × m·g·ĝ) · axle`; for a horizontal axle and an arm level at
/// the drawn position, `|τ| = m·g·|arm|·cos θ` (statics of a rigid body).
///
/// ```
/// use reeve::math::Vector;
/// use reeve::model::changing::{lever_torque, Lever};
/// let lid = Lever { mass: 10.0, arm: Vector::new(0.5, 0.0, 0.0) };
/// let (axle, down) = (Vector::y(), -Vector::z());
/// let t0 = lever_torque(&lid, &axle, &down, 0.0);
/// // r × F = (0.5, 0, 0) × (0, 0, −98.0665) = (0, 49.03, 0): about +y.
/// assert!((t0 - 49.033).abs() < 1e-3);
/// let t60 = lever_torque(&lid, &axle, &down, -60f64.to_radians());
/// assert!((t60 - 49.033 * 0.5).abs() < 1e-3);
/// ```
pub fn lever_torque(lever: &Lever, axle: &Vector, gravity: &Vector, turned: Real) -> Real {
    let rotation =
        nalgebra::Rotation3::from_axis_angle(&nalgebra::Unit::new_normalize(*axle), turned);
    let arm = rotation * lever.arm;
    let weight = gravity.normalize() * (lever.mass * STANDARD_GRAVITY);
    arm.cross(&weight).dot(&axle.normalize())
}

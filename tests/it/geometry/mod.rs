//! Geometry of whole rigs built directly in Rust (no rig files): tangents, wraps, fleet
//! angles, bend ratios, errors, and invariance under a rigid motion of the whole rig.

use std::f64::consts::{FRAC_PI_2, PI, TAU};

use approx::relative_eq;
use proptest::prelude::*;
use reeve::geometry::{compute, Geometry, GeometryError, GeometryOptions, LineGeometry};
use reeve::math::{Direction, Point, Real, Vector};
use reeve::model::{
    Bearing, Block, BlockLoad, Drum, Guide, Haul, Limits, Line, LineId, Location, Part, PartId,
    PartKind, PathEntry, Rig, Rope, RopeId, RopeKind, Sheave, Side, Weight,
};
use reeve::units::UnitSystem;

use crate::support::assert_abs;

/// The first and the second line of a test rig.
const L0: LineId = LineId::new(0);
const L1: LineId = LineId::new(1);

// ---------------------------------------------------------------------------------------
// Building rigs

fn dir(x: Real, y: Real, z: Real) -> Direction {
    Direction::new_normalize(Vector::new(x, y, z))
}

fn part(name: &str, at: [Real; 3], kind: PartKind) -> Part {
    Part {
        name: name.to_string(),
        at: Point::new(at[0], at[1], at[2]),
        block: None,
        kind,
        location: Location::default(),
    }
}

fn anchor(name: &str, at: [Real; 3]) -> Part {
    part(name, at, PartKind::Anchor)
}

fn haul(name: &str, at: [Real; 3]) -> Part {
    part(
        name,
        at,
        PartKind::Haul(Haul {
            pull: None,
            force: None,
        }),
    )
}

fn weight(name: &str, at: [Real; 3]) -> Part {
    part(name, at, PartKind::Weight(Weight { mass: Some(1.0) }))
}

fn block(name: &str, at: [Real; 3]) -> Part {
    part(
        name,
        at,
        PartKind::Block(Block {
            moves: dir(0.0, 0.0, 1.0),
            load: BlockLoad::Mass(None),
            load_stated: true,
            mass: None,
        }),
    )
}

fn sheave(name: &str, at: [Real; 3], axle: Direction, tread: Real) -> Part {
    carried_sheave(name, at, axle, tread, None)
}

fn carried_sheave(
    name: &str,
    at: [Real; 3],
    axle: Direction,
    tread: Real,
    block: Option<PartId>,
) -> Part {
    let mut sheave = part(
        name,
        at,
        PartKind::Sheave(Sheave {
            axle,
            tread_diameter: tread,
            bearing: Bearing::None,
            mass: None,
            groove_angle: None,
            mu: None,
            thrust: None,
        }),
    );
    sheave.block = block;
    sheave
}

fn guide(name: &str, at: [Real; 3], axle: Direction, diameter: Real) -> Part {
    part(
        name,
        at,
        PartKind::Guide(Guide {
            axle,
            diameter,
            mu: None,
            groove_angle: None,
        }),
    )
}

fn drum(name: &str, at: [Real; 3], axle: Direction, diameter: Real) -> Part {
    part(
        name,
        at,
        PartKind::Drum(Drum {
            axle,
            diameter,
            shaft: None,
            torque: Some(0.0),
            drag: 0.0,
            mu: None,
            mass: None,
        }),
    )
}

/// One path entry: part index, extra turns, explicit side.
/// The path entry of part `part` (its position in the parts given to [`rig`]).
fn entry(part: usize) -> PathEntry {
    PathEntry {
        part: PartId::new(part),
        turns: 0,
        side: None,
        location: Location::default(),
    }
}

fn sided(part: usize, side: Side) -> PathEntry {
    PathEntry {
        side: Some(side),
        ..entry(part)
    }
}

fn turned(part: usize, turns: u32) -> PathEntry {
    PathEntry {
        turns,
        ..entry(part)
    }
}

/// A rig with one rope of diameter `rope_diameter` and the given parts and line paths.
fn rig(rope_diameter: Real, parts: Vec<Part>, paths: Vec<Vec<PathEntry>>) -> Rig {
    Rig {
        title: "test".to_string(),
        units: UnitSystem::default(),
        gravity: dir(0.0, 0.0, -1.0),
        limits: Limits::default(),
        ropes: vec![Rope {
            name: "rope".to_string(),
            kind: RopeKind::Fibre,
            diameter: rope_diameter,
            breaking_strength: None,
            mu: 0.2,
            min_bend_ratio: 8.0,
            stiffness: None,
            mass_per_length: None,
            bend_loss: 0.0,
            location: Location::default(),
        }]
        .into(),
        parts: parts.into(),
        lines: paths
            .into_iter()
            .enumerate()
            .map(|(i, path)| Line {
                name: format!("line{i}"),
                rope: RopeId::new(0),
                path,
                location: Location::default(),
            })
            .collect(),
        drive: PartId::new(0),
        solve_for: PartId::new(0),
        runs_back: false,
        changing: Default::default(),
    }
}

fn geometry(rig: &Rig) -> Geometry {
    let g = compute(rig, &GeometryOptions::default()).expect("geometry");
    for line in &g.lines {
        assert_consistent(rig, line);
    }
    g
}

/// Every span is tangent to its end circles, on the rope's side, and nothing is NaN.
fn assert_consistent(rig: &Rig, line: &LineGeometry) {
    for (i, span) in line.spans.iter().enumerate() {
        assert!(span.length > 0.0 && span.length.is_finite());
        assert!(((span.end - span.start).norm() - span.length).abs() < 1e-12);
        for (entry, point, arriving) in [
            (&line.entries[i], span.start, false),
            (&line.entries[i + 1], span.end, true),
        ] {
            let Some(round) = rig.parts[entry.part].kind.round() else {
                assert!((point - entry.centre).norm() < 1e-12);
                continue;
            };
            let radial = point - entry.centre;
            let r = entry.pitch_radius;
            assert!(
                (radial.norm() - r).abs() < 1e-9 * r,
                "tangent point off the circle"
            );
            assert!(
                radial.dot(&round.axle).abs() < 1e-9 * r,
                "tangent point off the plane"
            );
            assert!(
                span.direction.dot(&radial).abs() < 1e-9 * r,
                "span not perpendicular to the radius at `{}` ({})",
                rig.parts[entry.part].name,
                if arriving { "arriving" } else { "leaving" }
            );
            let sense = entry.sense.expect("round parts have a sense");
            let rope = round.axle.cross(&radial) * sense / r;
            assert!(
                span.direction.dot(&rope) > 0.0,
                "rope runs against its sense"
            );
        }
    }
    for e in &line.entries {
        assert!(e.wrap.is_finite() && e.wrap >= 0.0);
        assert!(e.wrap < TAU * (1.0 + Real::from(e.turns)));
    }
}

mod errors;
mod rigid_motion;
mod skew;
mod wraps;

fn straight(positions: [[Real; 3]; 3], tread: Real, side: Option<Side>) -> Rig {
    rig(
        0.006,
        vec![
            anchor("a", positions[0]),
            sheave("s", positions[1], dir(0.0, 1.0, 0.0), tread),
            haul("b", positions[2]),
        ],
        vec![vec![entry(0), PathEntry { side, ..entry(1) }, entry(2)]],
    )
}

//! Resolution of one part: its kind's keys, sizes, bearings, shaft and load.

use super::keys::{get, join, key_names, Kind, KINDS, LOAD_KEYS, PART_KEYS, SHAFT_KEYS};
use super::read::{Names, Resolver};
use crate::math::Point;
use crate::model::{
    square_to_gravity, Bearing, Block, BlockLoad, Drum, Guide, Haul, Location, Part, PartId,
    PartKind, Shaft, Sheave, Weight,
};
use crate::rig::file::{Entry, Node};
use crate::rig::suggest::did_you_mean;
use crate::units::{parse_unit_of, Dimension, UnitSystem};

pub(super) fn part(
    r: &mut Resolver,
    e: &Entry,
    kind: Option<Kind>,
    is_unknown: bool,
    names: &Names,
) -> Option<Part> {
    let path = join("parts", &e.key);
    let node = &e.value;
    let entries = r.mapping(node, &path, "a part `{kind, at, ...}`")?;
    let kind = kind?;
    let mut allowed = key_names(PART_KEYS);
    allowed.extend(key_names(kind.keys()));
    let context = format!("{} part", kind.a());
    for entry in entries
        .iter()
        .filter(|x| !allowed.contains(&x.key.as_str()))
    {
        // A key of another kind says so; otherwise suggest a close key.
        let owner = KINDS
            .iter()
            .find(|(_, k)| k.keys().iter().any(|key| key.name == entry.key));
        let hint = did_you_mean(&entry.key, allowed.iter().copied());
        let message = match (owner, hint.is_empty()) {
            (Some((owner, _)), true) => format!(
                "`{}` is not a key of {} part (it belongs to a {owner}); {} takes: {}",
                entry.key,
                kind.a(),
                kind.a(),
                allowed.join(", ")
            ),
            (_, false) => format!("unknown key `{}` in {context}{hint}", entry.key),
            (None, true) => format!(
                "unknown key `{}` in {context}; expected one of: {}",
                entry.key,
                allowed.join(", ")
            ),
        };
        r.report(entry.key_location, join(&path, &entry.key), message);
    }
    let at = node.location;
    let point = r
        .require(entries, "at", &path, at, "the part's position `[x, y, z]`")
        .and_then(|n| r.triple(n, &join(&path, "at"), Some(Dimension::Length)))
        .map(Point::from);
    let axle = |r: &mut Resolver| {
        r.require(entries, "axle", &path, at, "the axle direction `[x, y, z]`")
            .and_then(|n| r.direction(n, &join(&path, "axle")))
    };
    let own_mass = |r: &mut Resolver| r.opt_non_negative(entries, "mass", &path, Dimension::Mass);
    // Sheaves and anchors (pick points) may be carried by a moving block.
    let block = match get(entries, "block") {
        Some(n) => {
            let p = join(&path, "block");
            let b = r.part_ref(n, &p, names, "the block that carries this part")?;
            if let Some(k) = names.kinds[b].filter(|k| *k != Kind::Block) {
                r.report(
                    n.location,
                    p,
                    format!(
                        "`{}` is {}; `block` must name a block",
                        names.names[b],
                        k.a()
                    ),
                );
                return None;
            }
            Some(b)
        }
        None => None,
    };
    r.part_changing(entries, &path, kind, &e.key);
    // Only the natural quantity may be a `{schedule: ...}` (DESIGN.md §7).
    let natural = |r: &mut Resolver, n: &Node, p: &str, d: Dimension| {
        r.schedule_for = Some(e.key.clone());
        let v = r.quantity(n, p, d);
        r.schedule_for = None;
        v
    };
    let part_kind = match kind {
        Kind::Anchor => Some(PartKind::Anchor),
        Kind::Sheave => {
            let axle = axle(r);
            let tread_diameter = r.size(entries, "diameter", &path, at);
            let bearing = r
                .require(entries, "bearing", &path, at, "a bearing such as `{kind: plain, pin_diameter: 10, mu: 0.12}` or `{kind: none}`")
                .and_then(|n| r.bearing(n, &join(&path, "bearing")));
            r.bearing_fits(
                get(entries, "bearing"),
                bearing.as_ref(),
                &join(&path, "bearing"),
                tread_diameter,
                ("sheave", "tread diameter"),
            );
            let mass = own_mass(r);
            let groove_angle = r.groove(entries, &path);
            let mu = r.opt_mu(entries, "mu", &path);
            let thrust = match get(entries, "thrust") {
                Some(n) => Some(r.thrust(n, &join(&path, "thrust"), false)?),
                None => None,
            };
            Some(PartKind::Sheave(Sheave {
                axle: axle?,
                tread_diameter: tread_diameter?,
                bearing: bearing?,
                mass,
                groove_angle,
                mu,
                thrust,
            }))
        }
        Kind::Guide => {
            let axle = axle(r);
            let diameter = r.size(entries, "diameter", &path, at);
            let mu = r.opt_mu(entries, "mu", &path);
            let groove_angle = r.groove(entries, &path);
            Some(PartKind::Guide(Guide {
                axle: axle?,
                diameter: diameter?,
                mu,
                groove_angle,
            }))
        }
        Kind::Block => {
            let moves = match get(entries, "moves") {
                Some(n) => r.direction(n, &join(&path, "moves")),
                None => Some(-r.gravity),
            };
            let mass = own_mass(r);
            r.schedule_for = Some(e.key.clone());
            let (load, load_is_force) = block_load(r, entries, &path, at, is_unknown);
            r.schedule_for = None;
            let moves = moves?;
            let load_stated = get(entries, "load").is_some();
            // An unknown block that states no load: a mass where one would do work
            // along its travel, else the force against `moves`.
            let load_is_force =
                load_is_force || (!load_stated && square_to_gravity(&moves, &r.gravity));
            let load = match load? {
                Some(given) => given,
                None if load_is_force => BlockLoad::Force(None),
                None => BlockLoad::Mass(None),
            };
            Some(PartKind::Block(Block {
                moves,
                load,
                load_stated,
                mass,
            }))
        }
        Kind::Weight => {
            let mass = match get(entries, "mass") {
                Some(n) => {
                    let p = join(&path, "mass");
                    let v = natural(r, n, &p, Dimension::Mass);
                    r.check(v, n, &p, |v| v > 0.0, "a positive mass").map(Some)
                }
                None if is_unknown => Some(None),
                None => {
                    r.require(
                        entries,
                        "mass",
                        &path,
                        at,
                        "the hanging mass, such as `40 kg`",
                    );
                    None
                }
            };
            Some(PartKind::Weight(Weight { mass: mass? }))
        }
        Kind::Drum => {
            let axle = axle(r);
            let diameter = r.size(entries, "diameter", &path, at);
            // Each field is checked before any failure is acted on, so that every
            // problem in the part is reported.
            let shaft = get(entries, "shaft").map(|n| shaft(r, n, &join(&path, "shaft")));
            let torque = match get(entries, "torque") {
                Some(n) => natural(r, n, &join(&path, "torque"), Dimension::Torque).map(Some),
                None if is_unknown => Some(None),
                None => Some(Some(0.0)),
            };
            let drag = match get(entries, "drag") {
                Some(_) => r.opt_non_negative(entries, "drag", &path, Dimension::Torque),
                None => Some(0.0),
            };
            let mu = r.opt_mu(entries, "mu", &path);
            let mass = own_mass(r);
            let shaft = match shaft {
                Some(s) => Some(s?),
                None => None,
            };
            r.bearing_fits(
                get(entries, "shaft")
                    .and_then(Node::entries)
                    .and_then(|e| get(e, "bearing")),
                shaft.as_ref().map(|s| &s.bearing),
                &join(&path, "shaft.bearing"),
                diameter,
                ("drum", "diameter"),
            );
            Some(PartKind::Drum(Drum {
                axle: axle?,
                diameter: diameter?,
                shaft,
                torque: torque?,
                drag: drag?,
                mu,
                mass,
            }))
        }
        Kind::Haul => {
            let pull = get(entries, "pull").map(|n| r.direction(n, &join(&path, "pull")));
            let force = match get(entries, "force") {
                Some(n) => {
                    let p = join(&path, "force");
                    let v = natural(r, n, &p, Dimension::Force);
                    r.check(
                        v,
                        n,
                        &p,
                        |v| v > 0.0,
                        "a positive force (a rope can only pull)",
                    )
                    .map(Some)
                }
                None if is_unknown => Some(None),
                None => {
                    r.report(
                        at,
                        join(&path, "force"),
                        "missing `force`; a haul that is not `solve_for` needs the force applied to it, such as `200 N`",
                    );
                    None
                }
            };
            let pull = match pull {
                Some(d) => Some(d?),
                None => None,
            };
            Some(PartKind::Haul(Haul {
                pull,
                force: force?,
            }))
        }
    };
    Some(Part {
        name: e.key.clone(),
        at: point?,
        kind: part_kind?,
        block: block.map(PartId::new),
        location: e.key_location,
    })
}

/// The torque unit the reports of a file whose `units` state none show: `N*m`, except
/// that a file in pound-force shows `lbf*in` when its lengths are inches and `lbf*ft`
/// otherwise, so that an imperial rig is not reported in N·m. Its bare torques are still
/// read in N*m, the format's default.
pub(super) fn default_torque(units: &UnitSystem) -> crate::units::Unit {
    let symbol = match (units.force.symbol, units.length.symbol) {
        ("lbf", "in") => "lbf*in",
        ("lbf", _) => "lbf*ft",
        _ => "N*m",
    };
    parse_unit_of(symbol, Dimension::Torque).unwrap_or(units.torque)
}

/// A block's load: `(Some(load or None when unknown), load_is_force)`, or `(None, _)`
/// after a problem.
pub(super) fn block_load(
    r: &mut Resolver,
    entries: &[Entry],
    path: &str,
    at: Location,
    is_unknown: bool,
) -> (Option<Option<BlockLoad>>, bool) {
    let Some(node) = entries.iter().find(|x| x.key == "load").map(|x| &x.value) else {
        if is_unknown {
            return (Some(None), false);
        }
        r.report(at, join(path, "load"), "missing `load`; expected `{mass: 40 kg}` (a hanging weight) or `{force: 200 N}` (against `moves`)");
        return (None, false);
    };
    let p = join(path, "load");
    let Some(load) = r.mapping(node, &p, "a load `{mass: m}` or `{force: f}`") else {
        return (None, false);
    };
    r.keys(load, &p, &key_names(LOAD_KEYS), "a block load");
    let mass = load.iter().find(|x| x.key == "mass");
    let force = load.iter().find(|x| x.key == "force");
    let (key, entry, is_force) = match (mass, force) {
        (Some(m), None) => ("mass", m, false),
        (None, Some(f)) => ("force", f, true),
        (Some(_), Some(f)) => {
            r.report(
                f.key_location,
                join(&p, "force"),
                "give either `mass` or `force` for a block load, not both",
            );
            return (None, false);
        }
        (None, None) => {
            r.report(
                node.location,
                p,
                "expected `{mass: m}` (a hanging weight) or `{force: f}` (against `moves`)",
            );
            return (None, false);
        }
    };
    let kp = join(&p, key);
    if entry.value.is_null() {
        if is_unknown {
            return (Some(None), is_force);
        }
        r.report(
            entry.value.location,
            kp,
            format!("missing value; expected the load's {key}"),
        );
        return (None, is_force);
    }
    let value = if is_force {
        r.quantity(&entry.value, &kp, Dimension::Force)
    } else {
        let v = r.quantity(&entry.value, &kp, Dimension::Mass);
        r.check(v, &entry.value, &kp, |v| v >= 0.0, "a mass of 0 or more")
    };
    match value {
        Some(v) if is_force => (Some(Some(BlockLoad::Force(Some(v)))), true),
        Some(v) => (Some(Some(BlockLoad::Mass(Some(v)))), false),
        None => (None, is_force),
    }
}

pub(super) fn shaft(r: &mut Resolver, node: &Node, path: &str) -> Option<Shaft> {
    let entries = r.mapping(node, path, "a shaft `{bearing, thrust}`")?;
    r.keys(entries, path, &key_names(SHAFT_KEYS), "a shaft");
    if get(entries, "bearing").is_none() && get(entries, "thrust").is_none() {
        r.report(
            node.location,
            path,
            "expected `bearing`, `thrust` or both in a shaft",
        );
        return None;
    }
    let bearing = match get(entries, "bearing") {
        Some(n) => r.bearing(n, &join(path, "bearing")),
        None => Some(Bearing::None),
    };
    let thrust = match get(entries, "thrust") {
        Some(n) => Some(r.thrust(n, &join(path, "thrust"), true)?),
        None => None,
    };
    Some(Shaft {
        bearing: bearing?,
        thrust,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::math::Vector;
    use crate::math::STANDARD_GRAVITY;
    use crate::model::{Contact, Side};
    use crate::model::{LineId, RopeId};
    use crate::rig::load::load_str;

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * b.abs().max(1.0)
    }

    #[test]
    fn units_and_defaults() {
        let text = "\
format: 1
units: {length: in, force: lbf, mass: lb, torque: lbf*ft}
ropes:
  w: {diameter: 0.25, mu: 0.1, kind: wire}
parts:
  a: {kind: anchor, at: [0, 0, 0]}
  g: {kind: guide, at: [10, 0, 0], axle: [0, 0, 2], diameter: 2, groove: {angle: 40}}
  d: {kind: drum, at: [20, 0, 0], axle: [0, 1, 0], diameter: '150 mm', drag: 2,
      shaft: {bearing: {kind: rated, efficiency: 0.96},
              thrust: {load: 10, diameter: 1, inner_diameter: 0.5, mu: 0.1, contact: worn, cone_angle: 30}}}
  w1: {kind: weight, at: [0, 0, -10], mass: 20}
  h: {kind: haul, at: [30, 0, 0], pull: [1, 0, 0], force: 12}
lines:
  l: {rope: w, path: [w1, g, {part: d, turns: 2, side: left}, h]}
";
        let rig = load_str(text, "dir/u.yaml").unwrap();
        assert_eq!(rig.title, "u.yaml");
        // 0.25 in = 0.25 * 0.0254 m = 0.00635 m (1959 agreement, exact).
        assert!(close(rig.ropes[RopeId::new(0)].diameter, 0.00635));
        // Wire rope default D/d 26, the least for 6x25 filler-wire rope (wire-rope
        // handbook D/d table, from memory).
        assert_eq!(rig.ropes[RopeId::new(0)].min_bend_ratio, 26.0);
        let PartKind::Guide(g) = &rig.parts[PartId::new(1)].kind else {
            panic!()
        };
        assert!(close(g.groove_angle.unwrap(), 40f64.to_radians()));
        assert_eq!(g.axle.into_inner(), Vector::z());
        let PartKind::Drum(d) = &rig.parts[PartId::new(2)].kind else {
            panic!()
        };
        assert!(close(d.diameter, 0.15));
        // 2 lbf*ft = 2 * 4.4482216152605 N * 0.3048 m = 2.711637896663 N*m (hand calculation).
        assert!(close(d.drag, 2.0 * 4.448_221_615_260_5 * 0.3048));
        assert_eq!(d.torque, Some(0.0));
        let shaft = d.shaft.as_ref().unwrap();
        assert!(close(
            match shaft.bearing {
                Bearing::Rated { factor } => factor,
                _ => 0.0,
            },
            1.0 / 0.96
        ));
        let t = shaft.thrust.unwrap();
        assert!(close(t.load, 10.0 * 4.448_221_615_260_5));
        assert!(close(t.inner_diameter, 0.0127));
        assert_eq!(t.contact, Contact::Worn);
        assert!(close(t.cone_angle.unwrap(), 30f64.to_radians()));
        let PartKind::Weight(w) = &rig.parts[PartId::new(3)].kind else {
            panic!()
        };
        // 20 lb = 20 * 0.45359237 kg = 9.0718474 kg (exact).
        assert!(close(w.mass.unwrap(), 9.071_847_4));
        let PartKind::Haul(h) = &rig.parts[PartId::new(4)].kind else {
            panic!()
        };
        assert!(close(h.force.unwrap(), 12.0 * 4.448_221_615_260_5));
        let step = &rig.lines[LineId::new(0)].path[2];
        assert_eq!((step.turns, step.side), (2, Some(Side::Left)));
        assert_eq!(rig.gravity.into_inner(), Vector::new(0.0, 0.0, -1.0));
        let _ = STANDARD_GRAVITY;
    }

    #[test]
    fn block_unknown_and_default_moves() {
        let text = "\
format: 1
gravity: [0, -2, 0]
ropes: {c: {diameter: 2 mm, mu: 0.1, kind: cord}}
parts:
  top: {kind: anchor, at: [0, 0, 0]}
  b: {kind: block, at: [0, -100, 0], load: {force: ~}}
  s: {kind: sheave, block: b, at: [0, -100, 0], axle: [0, 0, 1], diameter: 20, bearing: {kind: none}}
  h: {kind: haul, at: [50, 0, 0], force: 30 N}
lines: {l: {rope: c, path: [top, s, h]}}
solve_for: b
";
        let rig = load_str(text, "b.yaml").unwrap();
        let PartKind::Block(b) = &rig.parts[PartId::new(1)].kind else {
            panic!()
        };
        assert_eq!((b.load.value(), b.load.is_force()), (None, true));
        // Default travel is against gravity: gravity -Y, so +Y.
        assert_eq!(b.moves.into_inner(), Vector::new(0.0, 1.0, 0.0));
        assert_eq!((rig.drive, rig.solve_for), (PartId::new(3), PartId::new(1)));
        assert_eq!(rig.ropes[RopeId::new(0)].min_bend_ratio, 4.0);
    }
}

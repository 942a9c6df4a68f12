//! Resolution of the top level: format, units, gravity, limits, ropes, and the names
//! of parts and lines, then each part and line in turn.

use std::collections::HashMap;
use std::path::Path;

use super::keys::{
    default_min_bend_ratio, get, join, key_names, Kind, KINDS, LIMIT_KEYS, ROPE_KEYS, ROPE_KINDS,
    TOP_KEYS, UNIT_KEYS,
};
use super::lines::line;
use super::parts::{default_torque, part};
use super::read::{Names, Resolver};
use crate::math::{Real, Vector};
use crate::model::{IdVec, Limits, PartId, Rig, Rope, RopeKind};
use crate::rig::error::Problem;
use crate::rig::file::{more_problems, Entry, Node};
use crate::rig::overrides::read_variants;
use crate::units::{parse_unit_of, Dimension, UnitSystem};

/// Resolves a parsed tree into a rig.
pub(super) fn resolve(root: &Node, source: &str) -> Result<Rig, Vec<Problem>> {
    let mut r = Resolver {
        units: UnitSystem::default(),
        gravity: -Vector::z_axis(),
        problems: Vec::new(),
        dropped: 0,
        schedule_for: None,
        changing: HashMap::new(),
    };
    let Some(top) = r.mapping(
        root,
        "document",
        "a mapping of rig keys (`format`, `ropes`, `parts`, `lines`)",
    ) else {
        return Err(r.problems);
    };
    r.keys(top, "", &key_names(TOP_KEYS), "a rig file");
    let here = root.location;
    if let Some(n) = get(top, "variants") {
        r.problems.extend(read_variants(n).1);
    }

    // format
    if let Some(n) = r.require(top, "format", "", here, "`format: 1`") {
        if let Some(v) = r.number(n, "format", "the format version `1`") {
            if v != 1.0 {
                r.report(
                    n.location,
                    "format",
                    format!(
                        "unsupported format {}; this version reads `format: 1`",
                        n.describe()
                    ),
                );
            }
        }
    }
    let title = match get(top, "title") {
        // A title heads every report and drawing: one line (a block scalar's closing
        // line break is dropped).
        Some(n) => match r.text(n, "title", "a title (text)").map(str::trim) {
            Some(t) if t.contains(['\t', '\n', '\r']) => {
                r.report(
                    n.location,
                    "title",
                    "a title is one line of text, without tabs or line breaks".to_string(),
                );
                None
            }
            t => t.map(str::to_string),
        },
        None => None,
    }
    .unwrap_or_else(|| {
        Path::new(source)
            .file_name()
            .map_or(source.to_string(), |f| f.to_string_lossy().into_owned())
    });

    // units
    let mut torque_stated = false;
    if let Some(n) = get(top, "units") {
        if let Some(entries) = r.mapping(n, "units", "a mapping `{length, force, mass, torque}`") {
            r.keys(entries, "units", &key_names(UNIT_KEYS), "units");
            for (key, dim) in [
                ("length", Dimension::Length),
                ("force", Dimension::Force),
                ("mass", Dimension::Mass),
                ("torque", Dimension::Torque),
            ] {
                let Some(u) = get(entries, key) else { continue };
                let p = join("units", key);
                let Some(text) = r.text(
                    u,
                    &p,
                    &format!("a {key} unit: {}", dim.spellings().join(", ")),
                ) else {
                    continue;
                };
                torque_stated |= dim == Dimension::Torque;
                match parse_unit_of(text, dim) {
                    Ok(unit) => match dim {
                        Dimension::Length => {
                            r.units.length = unit;
                            r.units.span_length = unit;
                        }
                        Dimension::Force => r.units.force = unit,
                        Dimension::Mass => r.units.mass = unit,
                        Dimension::Torque => r.units.torque = unit,
                        _ => {}
                    },
                    Err(e) => r.report(u.location, p, e.to_string()),
                }
            }
        }
    }
    // Bare torques keep the format's default unit (N*m) when `units` names none (the
    // rig format is a contract: DESIGN.md §4); only the reports of an imperial rig show
    // torques in an imperial unit.
    let shown_units = if torque_stated {
        r.units
    } else {
        UnitSystem {
            torque: default_torque(&r.units),
            ..r.units
        }
    };

    // gravity
    if let Some(n) = get(top, "gravity") {
        if let Some(g) = r.direction(n, "gravity") {
            r.gravity = g;
        }
    }

    // limits
    let mut limits = Limits::default();
    let mut stop_speed_node = None;
    if let Some(n) = get(top, "limits") {
        if let Some(entries) = r.mapping(n, "limits", "a mapping `{fleet_angle, design_factor}`") {
            r.keys(entries, "limits", &key_names(LIMIT_KEYS), "limits");
            if let Some(f) = get(entries, "fleet_angle") {
                let v = r.angle(f, "limits.fleet_angle");
                if let Some(v) = r.check(
                    v,
                    f,
                    "limits.fleet_angle",
                    |v| v > 0.0 && v < std::f64::consts::FRAC_PI_2,
                    "a fleet angle in degrees, greater than 0 and less than 90",
                ) {
                    limits.fleet_angle = v;
                }
            }
            // Read below, once the drive's kind tells a linear speed from a turning one.
            stop_speed_node = get(entries, "stop_speed");
            if let Some(d) = get(entries, "design_factor") {
                let v = r.number(d, "limits.design_factor", "a design factor (1 or more)");
                if let Some(v) = r.check(
                    v,
                    d,
                    "limits.design_factor",
                    |v| v >= 1.0,
                    "a design factor of 1 or more",
                ) {
                    limits.design_factor = v;
                }
            }
        }
    }

    // ropes
    let mut ropes = Vec::new();
    let mut rope_names: Vec<String> = Vec::new();
    if let Some(n) = r.require(top, "ropes", "", here, "a mapping of rope names to ropes") {
        if let Some(entries) = r.mapping(n, "ropes", "a mapping of rope names to ropes") {
            for e in entries {
                rope_names.push(e.key.clone());
                ropes.push(rope(&mut r, e));
            }
        }
    }

    // parts: names and kinds first, so that references may point forward
    let mut names = Names {
        names: Vec::new(),
        kinds: Vec::new(),
        index: HashMap::new(),
    };
    let parts_node = r.require(top, "parts", "", here, "a mapping of part names to parts");
    let part_entries: &[Entry] = match parts_node {
        Some(n) => r
            .mapping(n, "parts", "a mapping of part names to parts")
            .unwrap_or(&[]),
        None => &[],
    };
    for e in part_entries {
        let path = join("parts", &e.key);
        let kind = match e.value.entries() {
            Some(fields) => match get(fields, "kind") {
                Some(k) => {
                    let kinds: Vec<&str> = KINDS.iter().map(|(n, _)| *n).collect();
                    r.choice(k, &join(&path, "kind"), &kinds, "part kind")
                        .map(|i| KINDS[i].1)
                }
                None => {
                    r.report(e.value.location, join(&path, "kind"), "missing `kind`; expected one of anchor, sheave, guide, block, weight, drum, haul");
                    None
                }
            },
            None => None, // reported with the part's data below
        };
        if e.key.is_empty() {
            r.report(e.key_location, "parts", "a part needs a name");
        }
        names.index.insert(e.key.clone(), names.names.len());
        names.names.push(e.key.clone());
        names.kinds.push(kind);
    }

    // drive and solve_for
    let drive = match get(top, "drive") {
        Some(n) => role(&mut r, n, "drive", &names),
        None => {
            let hauls: Vec<usize> = (0..names.names.len())
                .filter(|&i| names.kinds[i] == Some(Kind::Haul))
                .collect();
            match hauls.as_slice() {
                [only] => Some(*only),
                [] => {
                    if names.kinds.iter().all(Option::is_some) && !names.names.is_empty() {
                        r.report(here, "drive", "missing `drive`; the rig has no haul, so name the part whose forward motion drives it (`drive: <part>`)");
                    }
                    None
                }
                many => {
                    let list: Vec<&str> = many.iter().map(|&i| names.names[i].as_str()).collect();
                    r.report(here, "drive", format!("missing `drive`; the rig has {} hauls ({}), so say which drives it (`drive: <part>`)", many.len(), list.join(", ")));
                    None
                }
            }
        }
    };
    let runs_back = match get(top, "runs_back") {
        Some(n) => r.choice(n, "runs_back", &["false", "true"], "`runs_back`") == Some(1),
        None => false,
    };
    let solve_for = match get(top, "solve_for") {
        Some(n) => role(&mut r, n, "solve_for", &names),
        None => drive,
    };

    // parts in full
    let mut parts = Vec::new();
    for (i, e) in part_entries.iter().enumerate() {
        parts.push(part(
            &mut r,
            e,
            names.kinds[i],
            solve_for == Some(i),
            &names,
        ));
    }

    // lines
    let mut lines = Vec::new();
    if let Some(n) = r.require(
        top,
        "lines",
        "",
        here,
        "a mapping of line names to lines `{rope, path}`",
    ) {
        if let Some(entries) = r.mapping(
            n,
            "lines",
            "a mapping of line names to lines `{rope, path}`",
        ) {
            for e in entries {
                lines.push(line(&mut r, e, &rope_names, &names));
            }
        }
    }

    // travel (DESIGN.md §7): an angle for a drum drive, else a length.
    let travel = get(top, "travel").and_then(|n| {
        let turns = drive.is_some_and(|d| names.kinds[d] == Some(Kind::Drum));
        r.travel(n, turns)
    });
    let stop_speed = stop_speed_node.and_then(|n| {
        let turns = drive.is_some_and(|d| names.kinds[d] == Some(Kind::Drum));
        r.stop_speed(n, turns)
    });
    let mut changing = crate::model::changing::Changing {
        travel,
        stop_speed,
        parts: IdVec::new(),
    };
    for (i, name) in names.names.iter().enumerate() {
        if let Some(data) = r.changing.remove(name) {
            *changing.of_mut(PartId::new(i)) = data;
        }
    }

    if r.dropped > 0 {
        r.problems.push(more_problems(r.dropped));
    }
    if !r.problems.is_empty() {
        return Err(r.problems);
    }
    let assembled = (|| {
        Some(Rig {
            title,
            units: shown_units,
            gravity: r.gravity,
            limits,
            ropes: ropes.into_iter().collect::<Option<IdVec<_, _>>>()?,
            parts: parts.into_iter().collect::<Option<IdVec<_, _>>>()?,
            lines: lines.into_iter().collect::<Option<IdVec<_, _>>>()?,
            drive: PartId::new(drive?),
            solve_for: PartId::new(solve_for?),
            runs_back,
            changing,
        })
    })();
    assembled.ok_or_else(|| {
        // Every None above comes with a reported problem; this is a safety net.
        vec![Problem {
            location: None,
            subject: "document".to_string(),
            message: "the rig could not be resolved".to_string(),
        }]
    })
}

/// `drive` or `solve_for`: a part with a natural quantity.
pub(super) fn role(r: &mut Resolver, node: &Node, key: &str, names: &Names) -> Option<usize> {
    let i = r.part_ref(node, key, names, &format!("the `{key}` part"))?;
    match names.kinds[i] {
        Some(k) if !k.has_quantity() => {
            r.report(
                node.location,
                key,
                format!(
                    "`{}` is {}; `{key}` must name a haul, weight, block or drum",
                    names.names[i],
                    k.a()
                ),
            );
            None
        }
        _ => Some(i),
    }
}

pub(super) fn rope(r: &mut Resolver, e: &Entry) -> Option<Rope> {
    let path = join("ropes", &e.key);
    let node = &e.value;
    let entries = r.mapping(
        node,
        &path,
        "a rope `{diameter, mu, breaking_strength?, min_bend_ratio?, bend_loss?, kind?, stiffness?, mass_per_length?}`",
    )?;
    r.keys(entries, &path, &key_names(ROPE_KEYS), "a rope");
    let at = node.location;
    let diameter = r.size(entries, "diameter", &path, at);
    let breaking_strength = match get(entries, "breaking_strength") {
        Some(n) => {
            let p = join(&path, "breaking_strength");
            let v = r.quantity(n, &p, Dimension::Force);
            Some(r.check(v, n, &p, |v| v > 0.0, "a positive force")?)
        }
        None => None,
    };
    let mu = r.mu(entries, "mu", &path, at);
    let kind = match get(entries, "kind") {
        Some(n) => match r.choice(n, &join(&path, "kind"), ROPE_KINDS, "rope kind")? {
            0 => RopeKind::Wire,
            1 => RopeKind::Fibre,
            2 => RopeKind::Kernmantle,
            _ => RopeKind::Cord,
        },
        None => RopeKind::Fibre,
    };
    let min_bend_ratio = match get(entries, "min_bend_ratio") {
        Some(n) => {
            let p = join(&path, "min_bend_ratio");
            let v = r.number(n, &p, "a ratio of tread diameter to rope diameter");
            r.check(v, n, &p, |v| v > 0.0, "a positive ratio")?
        }
        None => default_min_bend_ratio(kind),
    };
    let (stiffness, mass_per_length) = rope_material(r, entries, &path)?;
    let bend_loss = match get(entries, "bend_loss") {
        Some(n) => {
            let p = join(&path, "bend_loss");
            let v = r.number(
                n,
                &p,
                "a fraction of tension lost per passage, such as 0.02",
            );
            r.check(
                v,
                n,
                &p,
                |v| (0.0..1.0).contains(&v),
                "a fraction from 0 up to (not including) 1",
            )?
        }
        None => 0.0,
    };
    Some(Rope {
        name: e.key.clone(),
        kind,
        diameter: diameter?,
        breaking_strength,
        mu: mu?,
        min_bend_ratio,
        stiffness,
        mass_per_length,
        bend_loss,
        location: e.key_location,
    })
}

/// The rope as a material (DESIGN.md §7): `stiffness` (EA, a positive force) and
/// `mass_per_length` (zero or more; bare numbers in kg/m), both optional.
fn rope_material(
    r: &mut Resolver,
    entries: &[Entry],
    path: &str,
) -> Option<(Option<Real>, Option<Real>)> {
    let stiffness = match get(entries, "stiffness") {
        Some(n) => {
            let p = join(path, "stiffness");
            let v = r.quantity(n, &p, Dimension::Force);
            Some(r.check(
                v,
                n,
                &p,
                |v| v > 0.0,
                "a positive axial stiffness EA (a force)",
            )?)
        }
        None => None,
    };
    let mass_per_length = match get(entries, "mass_per_length") {
        Some(n) => {
            let p = join(path, "mass_per_length");
            let v = r.quantity(n, &p, Dimension::MassPerLength);
            Some(r.check(v, n, &p, |v| v >= 0.0, "a mass per length of zero or more")?)
        }
        None => None,
    };
    Some((stiffness, mass_per_length))
}

#[cfg(test)]
mod tests {
    use crate::math::Vector;
    use crate::model::{Bearing, BlockLoad, LineId, PartId, PartKind, RopeId, RopeKind};
    use crate::rig::load::load_str;

    /// The example of DESIGN.md section 4.
    const EXAMPLE: &str = include_str!("../../../tests/rigs/design-example.yaml");

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * b.abs().max(1.0)
    }

    #[test]
    fn design_example_resolves_to_si() {
        let rig = load_str(EXAMPLE, "hoist.yaml").unwrap();
        assert_eq!(rig.title, "Two-part hoist for a workshop hatch");
        assert_eq!(rig.gravity.into_inner(), Vector::new(0.0, 0.0, -1.0));
        // 1.5 degrees = 1.5 * pi / 180 = 0.026179938779914945 rad (hand calculation).
        assert!(close(rig.limits.fleet_angle, 0.026_179_938_779_914_945));
        assert_eq!(rig.limits.design_factor, 5.0);
        let rope = &rig.ropes[RopeId::new(0)];
        assert_eq!((rope.name.as_str(), rope.kind), ("braid6", RopeKind::Fibre));
        assert!(close(rope.diameter, 0.006)); // 6 mm
        assert_eq!(rope.breaking_strength, Some(7500.0)); // 7.5 kN
        assert_eq!((rope.mu, rope.min_bend_ratio), (0.2, 8.0));
        assert_eq!(rope.location.line, 7);
        let names: Vec<&str> = rig.parts.iter().map(|p| p.name.as_str()).collect();
        assert_eq!(names, ["eye", "head", "hook", "hook.a", "hand"]);
        assert!(close(rig.parts[PartId::new(0)].at.z, 2.4));
        let PartKind::Sheave(head) = &rig.parts[PartId::new(1)].kind else {
            panic!("head")
        };
        assert!(close(head.tread_diameter, 0.06));
        assert_eq!(head.axle.into_inner(), Vector::new(0.0, 1.0, 0.0));
        let Bearing::Plain {
            pin_diameter,
            mu,
            mu_static,
        } = head.bearing
        else {
            panic!()
        };
        assert!(close(pin_diameter, 0.010));
        assert_eq!((mu, mu_static), (0.12, None));
        assert_eq!(rig.parts[PartId::new(1)].block, None);
        let PartKind::Block(hook) = &rig.parts[PartId::new(2)].kind else {
            panic!("hook")
        };
        assert_eq!(hook.load, BlockLoad::Mass(Some(40.0)));
        assert!(!hook.load.is_force());
        assert_eq!(hook.moves.into_inner(), Vector::new(0.0, 0.0, 1.0));
        let PartKind::Sheave(a) = &rig.parts[PartId::new(3)].kind else {
            panic!("hook.a")
        };
        assert_eq!(rig.parts[PartId::new(3)].block, Some(PartId::new(2)));
        assert_eq!(
            a.bearing,
            Bearing::Rolling {
                bore: 0.010,
                mu: 0.0015
            }
        );
        let PartKind::Haul(hand) = &rig.parts[PartId::new(4)].kind else {
            panic!("hand")
        };
        assert_eq!((hand.pull, hand.force), (None, None));
        assert_eq!(rig.parts[PartId::new(4)].location.line, 15);
        let fall = &rig.lines[LineId::new(0)];
        let path: Vec<usize> = fall.path.iter().map(|s| s.part.index()).collect();
        assert_eq!(path, [0, 3, 1, 4]);
        assert_eq!((rig.drive, rig.solve_for), (PartId::new(4), PartId::new(4)));
    }
}

//! The loader's part of DESIGN.md §7's travel and time keys: a drum's `lever`, a block's
//! or drum's `spring`, a sheave's or drum's `inertia`, a natural quantity written as
//! `{schedule: [[t, q], ...]}`, the top-level `travel` and `limits.stop_speed`. Each
//! reader records located problems as the others do; the results go to
//! [`crate::model::changing`].

use super::keys::{
    get, join, key_names, Kind, BLOCK_SPRING_KEYS, DRUM_SPRING_KEYS, LEVER_KEYS, TRAVEL_KEYS,
};
use super::read::Resolver;
use crate::math::{Real, Vector};
use crate::model::changing::{Lever, PartChanging, Schedule, Spring, Travel};
use crate::rig::file::{Entry, Node, Value};
use crate::units::Dimension;

/// The most points a schedule may have.
const MOST_POINTS: usize = 10_000;

impl Resolver {
    /// `{schedule: [[t, q], ...]}` for the natural quantity of part `part` at `path`:
    /// records the schedule and returns its first value (what every command but
    /// `motion` uses).
    pub(super) fn schedule(
        &mut self,
        node: &Node,
        path: &str,
        dimension: Dimension,
        part: &str,
    ) -> Option<Real> {
        let expected = "a schedule `{schedule: [[0 s, 1 kg], [5 min, 3 kg]]}` (time, value pairs)";
        let entries = self.mapping(node, path, expected)?;
        self.keys(entries, path, &["schedule"], "a quantity over time");
        let sp = join(path, "schedule");
        let list = self.require(entries, "schedule", path, node.location, expected)?;
        let Value::Seq(items) = &list.value else {
            self.report(
                list.location,
                sp,
                format!(
                    "expected a list of `[time, value]` pairs, found {}",
                    list.describe()
                ),
            );
            return None;
        };
        if items.is_empty() || items.len() > MOST_POINTS {
            self.report(
                list.location,
                sp,
                format!(
                    "expected 1 to {MOST_POINTS} `[time, value]` pairs, found {}",
                    items.len()
                ),
            );
            return None;
        }
        let saved = self.schedule_for.take();
        let mut points: Vec<(Real, Real)> = Vec::with_capacity(items.len());
        let mut ok = true;
        for (i, item) in items.iter().enumerate() {
            let ip = format!("{sp}.{i}");
            let Value::Seq(pair) = &item.value else {
                self.report(
                    item.location,
                    ip,
                    format!("expected a pair `[time, value]`, found {}", item.describe()),
                );
                ok = false;
                continue;
            };
            if pair.len() != 2 {
                self.report(
                    item.location,
                    ip,
                    format!(
                        "expected a pair `[time, value]`, found {}",
                        item.describe_list()
                    ),
                );
                ok = false;
                continue;
            }
            let t = self.quantity(&pair[0], &format!("{ip}.0"), Dimension::Time);
            let q = self.quantity(&pair[1], &format!("{ip}.1"), dimension);
            let q = self.check(
                q,
                &pair[1],
                &format!("{ip}.1"),
                |v| !matches!(dimension, Dimension::Mass) || v >= 0.0,
                "a mass of 0 or more",
            );
            match (t, q) {
                (Some(t), Some(q)) => {
                    // A run starts at rest at 0 s, and the other commands take the first
                    // point's value: a point before 0 s would make them disagree.
                    if t < 0.0 {
                        self.report(
                            pair[0].location,
                            format!("{ip}.0"),
                            format!(
                                "expected a time of 0 s or later (a run starts at 0 s), found {}",
                                pair[0].describe()
                            ),
                        );
                        ok = false;
                    }
                    // Two points at one time are a step; a third's value is never used.
                    let n = points.len();
                    if n >= 2 && points[n - 1].0 == t && points[n - 2].0 == t {
                        self.report(
                            pair[0].location,
                            format!("{ip}.0"),
                            format!(
                                "at most two points at one time (a step), found a third at {}",
                                pair[0].describe()
                            ),
                        );
                        ok = false;
                    }
                    if let Some(&(before, _)) = points.last() {
                        if t < before {
                            self.report(
                                pair[0].location,
                                format!("{ip}.0"),
                                format!(
                                    "times must not decrease: {} comes after a later time",
                                    pair[0].describe()
                                ),
                            );
                            ok = false;
                        }
                    }
                    points.push((t, q));
                }
                _ => ok = false,
            }
        }
        self.schedule_for = saved;
        if !ok {
            return None;
        }
        let first = points[0].1;
        self.changing.entry(part.to_string()).or_default().schedule = Some(Schedule { points });
        Some(first)
    }

    /// The keys of DESIGN.md §7 on a part: `lever` (drum), `spring` (block, drum),
    /// `inertia` (sheave, drum).
    pub(super) fn part_changing(&mut self, entries: &[Entry], path: &str, kind: Kind, name: &str) {
        let mut data = PartChanging::default();
        if let Some(n) = get(entries, "lever") {
            data.lever = self.lever(n, &join(path, "lever"), get(entries, "axle"));
        }
        if let Some(n) = get(entries, "spring") {
            data.spring = self.spring(n, &join(path, "spring"), kind);
        }
        if get(entries, "inertia").is_some() {
            data.inertia = self.opt_non_negative(entries, "inertia", path, Dimension::Inertia);
        }
        if data != PartChanging::default() {
            let entry = self.changing.entry(name.to_string()).or_default();
            entry.lever = data.lever;
            entry.spring = data.spring;
            entry.inertia = data.inertia;
        }
    }

    /// A drum's lever; `axle` (the drum's, reported by the part's own reading) refuses an
    /// arm along it, whose weight would give no torque.
    fn lever(&mut self, node: &Node, path: &str, axle: Option<&Node>) -> Option<Lever> {
        let expected = "a lever `{mass: 12 kg, arm: [300, 0, 0]}`";
        let entries = self.mapping(node, path, expected)?;
        self.keys(entries, path, &key_names(LEVER_KEYS), "a lever");
        let mass = self
            .require(
                entries,
                "mass",
                path,
                node.location,
                "the lever's mass, such as `12 kg`",
            )
            .and_then(|_| self.opt_non_negative(entries, "mass", path, Dimension::Mass));
        let arm: Option<Vector> = self
            .require(
                entries,
                "arm",
                path,
                node.location,
                "the arm `[x, y, z]` from the drum's centre to the lever's centre of mass",
            )
            .and_then(|n| self.triple(n, &join(path, "arm"), Some(Dimension::Length)));
        let arm = arm?;
        if let Some(axle) = axle {
            // Read quietly: the part reports its own axle's problems once.
            let before = self.problems.len();
            let axis = self.direction(axle, path);
            self.problems.truncate(before);
            let off_axle = axis.map_or(arm.norm(), |n| (arm - n.into_inner() * arm.dot(&n)).norm());
            if off_axle <= 1e-9 * arm.norm() || arm.norm() == 0.0 {
                let arm_node = get(entries, "arm").unwrap_or(node);
                self.report(
                    arm_node.location,
                    join(path, "arm"),
                    "the arm is zero or lies along the drum's axle, so the lever's weight gives no torque; give the arm from the axle to the lever's centre of mass, across the axle",
                );
                return None;
            }
        }
        Some(Lever { mass: mass?, arm })
    }

    fn spring(&mut self, node: &Node, path: &str, kind: Kind) -> Option<Spring> {
        let (keys, load_key, load_dim, rate_dim, expected) = if kind == Kind::Drum {
            (
                DRUM_SPRING_KEYS,
                "torque",
                Dimension::Torque,
                Dimension::TorsionRate,
                "a torsion spring `{rate: 0.5 N*m/rad, torque: 2 N*m}`",
            )
        } else {
            (
                BLOCK_SPRING_KEYS,
                "force",
                Dimension::Force,
                Dimension::SpringRate,
                "a spring `{rate: 2 N/mm, force: 50 N}`",
            )
        };
        let entries = self.mapping(node, path, expected)?;
        self.keys(entries, path, &key_names(keys), "a spring");
        let rate = match get(entries, "rate") {
            Some(n) => {
                let p = join(path, "rate");
                let v = self.rate(n, &p, rate_dim);
                self.check(v, n, &p, |v| v >= 0.0, "a spring rate of 0 or more")
            }
            None => Some(0.0),
        };
        let preload = match get(entries, load_key) {
            Some(n) => self.quantity(n, &join(path, load_key), load_dim),
            None => Some(0.0),
        };
        if get(entries, "rate").is_none() && get(entries, load_key).is_none() {
            self.report(
                node.location,
                path,
                format!("expected {expected}: give `rate`, `{load_key}` or both"),
            );
            return None;
        }
        Some(Spring {
            rate: rate?,
            preload: preload?,
        })
    }

    /// A spring or torsion rate; a drum's bare rate is in N·m/rad, and `N*m/deg` is
    /// accepted.
    fn rate(&mut self, node: &Node, path: &str, dimension: Dimension) -> Option<Real> {
        self.quantity(node, path, dimension)
    }

    /// The top-level `travel: {back, forward}`: lengths, or angles (degrees when bare,
    /// or `rad`) when the drive is a drum.
    pub(super) fn travel(&mut self, node: &Node, drive_turns: bool) -> Option<Travel> {
        let expected = if drive_turns {
            "the drum drive's travel `{back: 0 deg, forward: 90 deg}`"
        } else {
            "the drive's travel `{back: 0 mm, forward: 800 mm}`"
        };
        let entries = self.mapping(node, "travel", expected)?;
        self.keys(entries, "travel", &key_names(TRAVEL_KEYS), "travel");
        let read = |r: &mut Resolver, key: &str| -> Option<Real> {
            let Some(n) = get(entries, key) else {
                return Some(0.0);
            };
            let p = join("travel", key);
            let v = if drive_turns {
                r.turn(n, &p)
            } else {
                r.quantity(n, &p, Dimension::Length)
            };
            r.check(
                v,
                n,
                &p,
                |v| v >= 0.0,
                if drive_turns {
                    "an angle of 0 or more"
                } else {
                    "a length of 0 or more"
                },
            )
        };
        let back = read(self, "back");
        let forward = read(self, "forward");
        let (back, forward) = (back?, forward?);
        if back + forward <= 0.0 {
            self.report(
                node.location,
                "travel",
                format!("expected {expected} with some travel"),
            );
            return None;
        }
        Some(Travel { back, forward })
    }

    /// An angle: degrees when bare or `deg`, or `rad`.
    fn turn(&mut self, node: &Node, path: &str) -> Option<Real> {
        if let Value::Scalar { text, .. } = &node.value {
            if let Some(stripped) = text.trim().strip_suffix("rad") {
                if let Some(v) = crate::rig::file::yaml_number(stripped.trim()) {
                    if v.is_finite() {
                        return Some(v);
                    }
                }
            }
        }
        self.angle(node, path)
    }

    /// `limits.stop_speed`: m/s (bare, `m/s`, `mm/s`, `in/s`, `ft/s`) for a drive that
    /// moves along, or rad/s (bare, `rad/s`, `deg/s`) for a drum drive; the other kind
    /// is refused rather than read as this one.
    pub(super) fn stop_speed(&mut self, node: &Node, drive_turns: bool) -> Option<Real> {
        let path = "limits.stop_speed";
        let text = node.scalar().unwrap_or("").trim().to_string();
        let split = text
            .find(|c: char| c.is_ascii_alphabetic())
            .unwrap_or(text.len());
        let (number, unit) = text.split_at(split);
        let scale = match (unit.trim(), drive_turns) {
            ("", _) | ("m/s", false) | ("rad/s", true) => Some(1.0),
            ("mm/s", false) => Some(1e-3),
            ("in/s", false) => Some(0.0254),
            ("ft/s", false) => Some(0.3048),
            ("deg/s", true) => Some(std::f64::consts::PI / 180.0),
            _ => None,
        };
        let value =
            crate::rig::file::yaml_number(number.trim()).filter(|v| v.is_finite() && *v > 0.0);
        match (value, scale) {
            (Some(v), Some(s)) => Some(v * s),
            _ => {
                let expected = if drive_turns {
                    "a positive turning speed of the drum drive such as `0.5 rad/s` or `30 deg/s`"
                } else {
                    "a positive speed of the drive such as `0.2 m/s`, `150 mm/s` or `6 in/s`"
                };
                self.report(
                    node.location,
                    path,
                    format!("expected {expected}, found {}", node.describe()),
                );
                None
            }
        }
    }
}

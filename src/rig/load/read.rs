//! The typed, located readers: each reads one value of the tree, checks its type, unit
//! and range, and records a located problem when it is wrong.

use std::collections::HashMap;

use super::keys::{
    get, join, key_names, names_with_kind, Kind, BEARINGS, CONTACTS, GROOVE_KEYS, LARGEST,
    THRUST_KEYS,
};
use crate::math::{Direction, Real, Vector};
use crate::model::{Bearing, Contact, Location, Thrust};
use crate::rig::error::Problem;
use crate::rig::file::{Entry, Node, Value, MAX_PROBLEMS};
use crate::rig::suggest::did_you_mean;
use crate::units::{parse_quantity, Dimension, UnitError, UnitSystem};

/// Part names and kinds, file order.
pub(super) struct Names {
    pub(super) names: Vec<String>,
    pub(super) kinds: Vec<Option<Kind>>,
    pub(super) index: HashMap<String, usize>,
}

/// Walks the tree, collecting problems.
pub(super) struct Resolver {
    pub(super) units: UnitSystem,
    pub(super) gravity: Direction,
    pub(super) problems: Vec<Problem>,
    pub(super) dropped: usize,
    /// The part whose natural quantity is being read: only there may a quantity be a
    /// `{schedule: ...}` (DESIGN.md §7).
    pub(super) schedule_for: Option<String>,
    /// DESIGN.md §7 data per part name (levers, springs, inertia, schedules).
    pub(super) changing: HashMap<String, crate::model::changing::PartChanging>,
}

impl Resolver {
    /// Whether enough problems are listed; later ones are only counted, and costly
    /// suggestions are skipped.
    pub(super) fn is_full(&self) -> bool {
        self.problems.len() >= MAX_PROBLEMS
    }

    pub(super) fn report(
        &mut self,
        at: Location,
        subject: impl Into<String>,
        message: impl Into<String>,
    ) {
        if self.is_full() {
            self.dropped += 1;
            return;
        }
        self.problems.push(Problem {
            location: (at.line > 0).then_some(at),
            subject: subject.into(),
            message: message.into(),
        });
    }

    /// The node as a mapping, or a problem.
    pub(super) fn mapping<'n>(
        &mut self,
        node: &'n Node,
        path: &str,
        expected: &str,
    ) -> Option<&'n [Entry]> {
        match node.entries() {
            Some(e) => Some(e),
            None => {
                self.report(
                    node.location,
                    path,
                    format!("expected {expected}, found {}", node.describe()),
                );
                None
            }
        }
    }

    /// Reports keys not in `allowed`.
    pub(super) fn keys(&mut self, entries: &[Entry], path: &str, allowed: &[&str], context: &str) {
        for e in entries {
            if self.is_full() {
                if !allowed.contains(&e.key.as_str()) {
                    self.dropped += 1;
                }
            } else if !allowed.contains(&e.key.as_str()) {
                let hint = did_you_mean(&e.key, allowed.iter().copied());
                let tail = if hint.is_empty() {
                    if allowed.is_empty() {
                        format!("; {context} takes no other keys")
                    } else {
                        format!("; expected one of: {}", allowed.join(", "))
                    }
                } else {
                    hint
                };
                self.report(
                    e.key_location,
                    join(path, &e.key),
                    format!("unknown key `{}` in {context}{tail}", e.key),
                );
            }
        }
    }

    /// A required key's node, or a problem at the parent.
    pub(super) fn require<'n>(
        &mut self,
        entries: &'n [Entry],
        key: &str,
        path: &str,
        parent: Location,
        expected: &str,
    ) -> Option<&'n Node> {
        let node = get(entries, key);
        if node.is_none() {
            let at = entries
                .iter()
                .find(|e| e.key == key)
                .map_or(parent, |e| e.key_location);
            self.report(
                at,
                join(path, key),
                format!("missing `{key}`; expected {expected}"),
            );
        }
        node
    }

    /// A quantity of `dimension`, bare number in the file's unit or text with a unit, in SI.
    pub(super) fn quantity(
        &mut self,
        node: &Node,
        path: &str,
        dimension: Dimension,
    ) -> Option<Real> {
        if node.entries().is_some() {
            if let Some(part) = self.schedule_for.clone() {
                return self.schedule(node, path, dimension, &part);
            }
        }
        let unit = self.units.unit(dimension);
        let example = example(dimension);
        let value = match (&node.value, node.plain_number()) {
            (_, Some(v)) if !v.is_finite() => {
                self.report(
                    node.location,
                    path,
                    format!(
                        "{} is not a finite number; expected a {}",
                        node.describe(),
                        dimension.name()
                    ),
                );
                return None;
            }
            (_, Some(v)) => v * unit.si,
            (Value::Scalar { text, .. }, None) if !node.is_null() => {
                match parse_quantity(text, dimension, unit) {
                    Ok(v) => v,
                    Err(e) => {
                        let message = match e {
                            UnitError::NotAQuantity { .. } => format!(
                                "expected a {} such as `{example}` or a bare number in {unit}, found {}",
                                dimension.name(),
                                node.describe()
                            ),
                            other => other.to_string(),
                        };
                        self.report(node.location, path, message);
                        return None;
                    }
                }
            }
            _ => {
                self.report(
                    node.location,
                    path,
                    format!(
                        "expected a {} such as `{example}` or a bare number in {unit}, found {}",
                        dimension.name(),
                        node.describe()
                    ),
                );
                return None;
            }
        };
        if !value.is_finite() || value.abs() > LARGEST {
            self.report(
                node.location,
                path,
                format!(
                    "{} is too large to be a {}",
                    node.describe(),
                    dimension.name()
                ),
            );
            return None;
        }
        Some(value)
    }

    /// A plain number (a ratio, a coefficient).
    pub(super) fn number(&mut self, node: &Node, path: &str, expected: &str) -> Option<Real> {
        let value = node.plain_number().or_else(|| match &node.value {
            Value::Scalar { text, plain: false } => crate::rig::file::yaml_number(text.trim()),
            _ => None,
        });
        match value {
            Some(v) if v.is_finite() && v.abs() <= LARGEST => Some(v),
            Some(v) if v.is_finite() => {
                self.report(
                    node.location,
                    path,
                    format!("{} is too large; expected {expected}", node.describe()),
                );
                None
            }
            Some(_) => {
                self.report(
                    node.location,
                    path,
                    format!(
                        "{} is not a finite number; expected {expected}",
                        node.describe()
                    ),
                );
                None
            }
            None => {
                self.report(
                    node.location,
                    path,
                    format!("expected {expected}, found {}", node.describe()),
                );
                None
            }
        }
    }

    /// An angle written in degrees (a bare number, or text ending in `deg` or `°`), in
    /// radians.
    pub(super) fn angle(&mut self, node: &Node, path: &str) -> Option<Real> {
        if let Value::Scalar { text, .. } = &node.value {
            let t = text.trim();
            if let Some(stripped) = t.strip_suffix("deg").or_else(|| t.strip_suffix('°')) {
                if let Some(v) = crate::rig::file::yaml_number(stripped.trim()) {
                    if v.is_finite() && v.abs() <= LARGEST {
                        return Some(v.to_radians());
                    }
                }
            }
        }
        self.number(node, path, "an angle in degrees")
            .map(Real::to_radians)
    }

    /// Text (any scalar).
    pub(super) fn text<'n>(
        &mut self,
        node: &'n Node,
        path: &str,
        expected: &str,
    ) -> Option<&'n str> {
        match &node.value {
            Value::Scalar { text, .. } if !node.is_null() => Some(text.as_str()),
            _ => {
                self.report(
                    node.location,
                    path,
                    format!("expected {expected}, found {}", node.describe()),
                );
                None
            }
        }
    }

    /// One of a few words.
    pub(super) fn choice(
        &mut self,
        node: &Node,
        path: &str,
        options: &[&str],
        what: &str,
    ) -> Option<usize> {
        let word = self.text(
            node,
            path,
            &format!("{what}: one of {}", options.join(", ")),
        )?;
        match options.iter().position(|o| *o == word) {
            Some(i) => Some(i),
            None => {
                let hint = did_you_mean(word, options.iter().copied());
                self.report(
                    node.location,
                    path,
                    format!(
                        "unknown {what} `{word}`; expected one of {}{hint}",
                        options.join(", ")
                    ),
                );
                None
            }
        }
    }

    /// Three numbers; lengths in SI when `dimension` is given.
    pub(super) fn triple(
        &mut self,
        node: &Node,
        path: &str,
        dimension: Option<Dimension>,
    ) -> Option<Vector> {
        let expected = match dimension {
            Some(_) => "a point `[x, y, z]`",
            None => "a direction `[x, y, z]`",
        };
        let items = match &node.value {
            Value::Seq(items) if items.len() == 3 => items,
            _ => {
                self.report(
                    node.location,
                    path,
                    format!(
                        "expected {expected} of three numbers, found {}",
                        node.describe_list()
                    ),
                );
                return None;
            }
        };
        let mut out = [0.0; 3];
        let mut ok = true;
        for (i, item) in items.iter().enumerate() {
            let p = format!("{path}.{i}");
            let v = match dimension {
                Some(d) => self.quantity(item, &p, d),
                None => self.number(item, &p, "a number"),
            };
            match v {
                Some(v) => out[i] = v,
                None => ok = false,
            }
        }
        ok.then(|| Vector::new(out[0], out[1], out[2]))
    }

    /// A direction: three numbers, not all zero.
    pub(super) fn direction(&mut self, node: &Node, path: &str) -> Option<Direction> {
        let v = self.triple(node, path, None)?;
        let largest = v.amax();
        // Scale first so that huge components cannot overflow the norm.
        let unit = (largest > 0.0)
            .then(|| v / largest)
            .and_then(|s| Direction::try_new(s, 1e-9));
        if unit.is_none() {
            self.report(
                node.location,
                path,
                "expected a direction `[x, y, z]` with at least one non-zero component, found a zero vector",
            );
        }
        unit
    }

    /// Checks a value against a range.
    pub(super) fn check(
        &mut self,
        value: Option<Real>,
        node: &Node,
        path: &str,
        ok: impl Fn(Real) -> bool,
        expected: &str,
    ) -> Option<Real> {
        match value {
            Some(v) if !ok(v) => {
                self.report(
                    node.location,
                    path,
                    format!("expected {expected}, found {}", node.describe()),
                );
                None
            }
            other => other,
        }
    }

    /// A required positive length.
    pub(super) fn size(
        &mut self,
        entries: &[Entry],
        key: &str,
        path: &str,
        parent: Location,
    ) -> Option<Real> {
        let p = join(path, key);
        let node = self.require(
            entries,
            key,
            path,
            parent,
            "a positive length such as `6 mm`",
        )?;
        let v = self.quantity(node, &p, Dimension::Length);
        self.check(v, node, &p, |v| v > 0.0, "a positive length")
    }

    /// An optional friction coefficient, 0 or more.
    pub(super) fn opt_mu(&mut self, entries: &[Entry], key: &str, path: &str) -> Option<Real> {
        let node = get(entries, key)?;
        let p = join(path, key);
        let v = self.number(node, &p, "a friction coefficient (a number, 0 or more)");
        self.check(
            v,
            node,
            &p,
            |v| v >= 0.0,
            "a friction coefficient of 0 or more",
        )
    }

    /// A required friction coefficient, 0 or more.
    pub(super) fn mu(
        &mut self,
        entries: &[Entry],
        key: &str,
        path: &str,
        parent: Location,
    ) -> Option<Real> {
        self.require(
            entries,
            key,
            path,
            parent,
            "a friction coefficient such as `0.15`",
        )?;
        self.opt_mu(entries, key, path)
    }

    /// An optional quantity that must not be negative.
    pub(super) fn opt_non_negative(
        &mut self,
        entries: &[Entry],
        key: &str,
        path: &str,
        dimension: Dimension,
    ) -> Option<Real> {
        let node = get(entries, key)?;
        let p = join(path, key);
        let v = self.quantity(node, &p, dimension);
        self.check(
            v,
            node,
            &p,
            |v| v >= 0.0,
            &format!("a {} of 0 or more", dimension.name()),
        )
    }

    pub(super) fn groove(&mut self, entries: &[Entry], path: &str) -> Option<Real> {
        let node = get(entries, "groove")?;
        let p = join(path, "groove");
        let g = self.mapping(node, &p, "a groove `{angle: degrees}`")?;
        self.keys(g, &p, &key_names(GROOVE_KEYS), "a groove");
        let a = self.require(
            g,
            "angle",
            &p,
            node.location,
            "the V-groove's included angle in degrees",
        )?;
        let pa = join(&p, "angle");
        let v = self.angle(a, &pa);
        self.check(
            v,
            a,
            &pa,
            |v| v > 0.0 && v < std::f64::consts::PI,
            "an included angle between 0 and 180 degrees",
        )
    }

    pub(super) fn bearing(&mut self, node: &Node, path: &str) -> Option<Bearing> {
        let expected =
            "a bearing such as `{kind: plain, pin_diameter: 10, mu: 0.12}` or `{kind: none}`";
        let entries = self.mapping(node, path, expected)?;
        let kind_node = self.require(
            entries,
            "kind",
            path,
            node.location,
            "a bearing kind: plain, rolling, rated or none",
        )?;
        let kinds: Vec<&str> = BEARINGS.iter().map(|b| b.name).collect();
        let kind = self.choice(kind_node, &join(path, "kind"), &kinds, "bearing kind")?;
        let bearing = &BEARINGS[kind];
        let allowed = names_with_kind(bearing.object.keys);
        let context = match bearing.name {
            "none" => "a bearing of kind none".to_string(),
            name => format!("a {name} bearing"),
        };
        match bearing.name {
            "plain" => {
                self.keys(entries, path, &allowed, &context);
                let pin_diameter = self.size(entries, "pin_diameter", path, node.location);
                let mu = self.mu(entries, "mu", path, node.location);
                let mu_static = self.opt_mu(entries, "mu_static", path);
                Some(Bearing::Plain {
                    pin_diameter: pin_diameter?,
                    mu: mu?,
                    mu_static,
                })
            }
            "rolling" => {
                self.keys(entries, path, &allowed, &context);
                let bore = self.size(entries, "bore", path, node.location);
                let mu = self.mu(entries, "mu", path, node.location);
                Some(Bearing::Rolling {
                    bore: bore?,
                    mu: mu?,
                })
            }
            "rated" => {
                self.keys(entries, path, &allowed, &context);
                match (get(entries, "factor"), get(entries, "efficiency")) {
                    (Some(f), None) => {
                        let p = join(path, "factor");
                        let v = self.number(f, &p, "a bearing factor K (1 or more)");
                        let factor =
                            self.check(v, f, &p, |v| v >= 1.0, "a bearing factor K of 1 or more")?;
                        Some(Bearing::Rated { factor })
                    }
                    (None, Some(e)) => {
                        let p = join(path, "efficiency");
                        let v = self.number(e, &p, "an efficiency between 0 and 1");
                        let eta = self.check(
                            v,
                            e,
                            &p,
                            |v| v > 0.0 && v <= 1.0,
                            "an efficiency greater than 0 and at most 1",
                        )?;
                        Some(Bearing::Rated { factor: 1.0 / eta })
                    }
                    (Some(_), Some(e)) => {
                        self.report(
                            e.location,
                            join(path, "efficiency"),
                            "give either `factor` or `efficiency` for a rated bearing, not both",
                        );
                        None
                    }
                    (None, None) => {
                        self.report(node.location, path, "a rated bearing needs `factor: K` (K ≥ 1) or `efficiency: eta` (0 < eta ≤ 1)");
                        None
                    }
                }
            }
            _ => {
                self.keys(entries, path, &allowed, &context);
                Some(Bearing::None)
            }
        }
    }

    /// A thrust face. `load_required`: a drum shaft's axial load is given (`load`); a
    /// sheave's comes from its spans, and `load` is an optional preload (default 0).
    pub(super) fn thrust(
        &mut self,
        node: &Node,
        path: &str,
        load_required: bool,
    ) -> Option<Thrust> {
        let entries = self.mapping(
            node,
            path,
            if load_required {
                "a thrust bearing `{load, diameter, mu, contact: new|worn}`"
            } else {
                "a thrust bearing `{diameter, mu, contact: new|worn, load?}`"
            },
        )?;
        self.keys(entries, path, &key_names(THRUST_KEYS), "a thrust bearing");
        let at = node.location;
        let load = if !load_required {
            Some(
                self.opt_non_negative(entries, "load", path, Dimension::Force)
                    .unwrap_or(0.0),
            )
        } else {
            match self.require(
                entries,
                "load",
                path,
                at,
                "the axial load, a force such as `200 N`",
            ) {
                Some(_) => self.opt_non_negative(entries, "load", path, Dimension::Force),
                None => None,
            }
        };
        let diameter = self.size(entries, "diameter", path, at);
        let inner = self.opt_non_negative(entries, "inner_diameter", path, Dimension::Length);
        if let (Some(i), Some(d), Some(n)) = (inner, diameter, get(entries, "inner_diameter")) {
            if i >= d {
                self.report(
                    n.location,
                    join(path, "inner_diameter"),
                    "expected an inner diameter smaller than `diameter`",
                );
            }
        }
        let mu = self.mu(entries, "mu", path, at);
        let contact = self
            .require(
                entries,
                "contact",
                path,
                at,
                "`new` (uniform pressure) or `worn` (uniform wear)",
            )
            .and_then(|n| self.choice(n, &join(path, "contact"), CONTACTS, "contact"))
            .map(|i| if i == 0 { Contact::New } else { Contact::Worn });
        let cone_angle = match get(entries, "cone_angle") {
            Some(n) => {
                let p = join(path, "cone_angle");
                let v = self.angle(n, &p);
                let v = self.check(
                    v,
                    n,
                    &p,
                    |v| v > 0.0 && v <= std::f64::consts::FRAC_PI_2,
                    "a half-angle (half the pivot's included angle) greater than 0 and at most 90 degrees",
                );
                Some(v?)
            }
            None => None,
        };
        Some(Thrust {
            load: load?,
            diameter: diameter?,
            inner_diameter: inner.unwrap_or(0.0),
            mu: mu?,
            contact: contact?,
            cone_angle,
        })
    }

    /// Refuses a pin or bore that is not smaller than the diameter of the part it
    /// carries (a sheave's tread, a drum): the bearing would be larger than its part, and
    /// the friction circle would reach the rope (ρ ≥ 1). Usually a unit slip: a bare
    /// number is read in the file's length unit. Located at the `pin_diameter` or `bore`.
    pub(super) fn bearing_fits(
        &mut self,
        bearing_node: Option<&Node>,
        bearing: Option<&Bearing>,
        bearing_path: &str,
        part_diameter: Option<Real>,
        (part, measure): (&str, &str),
    ) {
        let (Some(bearing), Some(part_diameter)) = (bearing, part_diameter) else {
            return;
        };
        let (key, size, what) = match *bearing {
            Bearing::Plain { pin_diameter, .. } => ("pin_diameter", pin_diameter, "pin"),
            Bearing::Rolling { bore, .. } => ("bore", bore, "bore"),
            Bearing::Rated { .. } | Bearing::None => return,
        };
        if size < part_diameter {
            return;
        }
        let node = bearing_node
            .and_then(Node::entries)
            .and_then(|e| get(e, key));
        let location = node.map_or(Location::default(), |n| n.location);
        // The likely slip is a bare number read in the file's unit (`8` on a rig in m).
        let bare = node.is_some_and(|n| n.plain_number().is_some());
        let unit = self.units.length;
        let shown = |v: Real| {
            let text = format!("{:.6}", v / unit.si);
            let text = text.trim_end_matches('0').trim_end_matches('.');
            format!("{text} {}", unit.symbol)
        };
        self.report(
            location,
            join(bearing_path, key),
            format!(
                "the {what} ({}) does not fit a {part} of {} {measure}; expected a {what} diameter smaller than the {part}'s {measure}{}",
                shown(size),
                shown(part_diameter),
                if bare {
                    format!(
                        " (bare numbers are in the file's length unit, {}; write a unit such as `8 mm` to say otherwise)",
                        unit.symbol
                    )
                } else {
                    String::new()
                }
            ),
        );
    }

    /// A reference to a part by name.
    pub(super) fn part_ref(
        &mut self,
        node: &Node,
        path: &str,
        names: &Names,
        role: &str,
    ) -> Option<usize> {
        let name = self.text(node, path, &format!("the name of a part ({role})"))?;
        match names.index.get(name) {
            Some(&i) => Some(i),
            None => {
                let hint = if self.is_full() {
                    String::new()
                } else {
                    hint_or_list(name, &names.names)
                };
                self.report(
                    node.location,
                    path,
                    format!("no part named `{name}` ({role}){hint}"),
                );
                None
            }
        }
    }
}

/// A "did you mean" for `name`, or the list of names when there are few and none is
/// close.
pub(super) fn hint_or_list(name: &str, names: &[String]) -> String {
    let hint = did_you_mean(name, names.iter().map(String::as_str));
    if !hint.is_empty() || names.is_empty() || names.len() > 8 {
        return hint;
    }
    let list: Vec<String> = names.iter().map(|n| format!("`{n}`")).collect();
    format!("; defined: {}", list.join(", "))
}

pub(super) fn example(dimension: Dimension) -> &'static str {
    match dimension {
        Dimension::Length => "6 mm",
        Dimension::Force => "7.5 kN",
        Dimension::Mass => "40 kg",
        Dimension::Torque => "1.2 N*m",
        Dimension::MassPerLength => "0.25 kg/m",
        Dimension::Time => "5 min",
        Dimension::SpringRate => "2 N/mm",
        Dimension::TorsionRate => "0.5 N*m/rad",
        Dimension::Inertia => "0.02 kg*m^2",
    }
}

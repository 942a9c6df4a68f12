//! Loading a rig file (format 1, DESIGN.md section 4): read the text into a located tree
//! ([`crate::rig::file`]), apply overrides ([`crate::rig::overrides`]), then check every
//! key and value and resolve names into indices and quantities into SI and radians.
//!
//! Every problem found is collected before stopping, each with the file, line, column
//! and the key path (`parts.head.diameter`), so a user fixes a file in one pass.
//!
//! Choices where the format leaves room (documented here once):
//! - `format` is required and must be `1`.
//! - A rope's `mu` (rope on a non-turning surface) is required: results on guides, drums
//!   and stalled sheaves depend on it strongly and no one value suits wire, fibre and
//!   cord. `kind` is one of `wire`, `fibre` (default), `kernmantle`, `cord`; it sets the
//!   default `min_bend_ratio` ([`default_min_bend_ratio`]).
//! - A sheave's `axle`, `diameter` and `bearing` are required (the design table lists
//!   them without "optional"); write `bearing: {kind: none}` for an ideal sheave. A drum
//!   without `shaft` turns on frictionless bearings; a `shaft` without `bearing` has a
//!   frictionless journal. A thrust's `contact` is required.
//! - The natural quantity (block `load`, weight `mass`, haul `force`) of every part that
//!   is not `solve_for` must be given. A drum that is not `solve_for` and has no `torque`
//!   has no load torque (0 N·m): a drum that only stores or leads rope. For the
//!   `solve_for` part the quantity may be given (what is available) or left out; a block
//!   that is the unknown may say which quantity with `load: {force: ~}` or
//!   `load: {mass: ~}`. Without `load` it is a mass where the block's travel has a
//!   component along gravity, and otherwise (a cart on a level track) the force against
//!   its `moves`, since a mass there would do no work; reports say which.
//! - Ranges: diameters, pin diameters, bores, rope diameter, breaking strength,
//!   `min_bend_ratio`, weight mass and haul force must be positive; own masses, block
//!   load masses, drag and thrust loads must not be negative; friction coefficients are
//!   0 or more; a rated factor is at least 1 and an efficiency in (0, 1]; groove angles
//!   lie in (0°, 180°), cone half-angles in (0°, 90°], the fleet-angle limit in
//!   (0°, 90°); the design factor is at least 1; extra `turns` a whole number from 0 to
//!   1000. Magnitudes above 1e12 in SI are refused as certainly mistaken. A plain
//!   bearing's pin or a rolling bearing's bore must be smaller than the sheave's tread
//!   diameter or the drum's diameter it carries.

use std::collections::HashMap;
use std::path::Path;

use crate::math::{Direction, Point, Real, Vector};
use crate::rig::error::{LoadError, Problem};
use crate::rig::file::{
    more_problems, parse_tree, Entry, Node, Value, MAX_INPUT_BYTES, MAX_PROBLEMS,
};
use crate::rig::model::{
    square_to_gravity, Bearing, Block, BlockLoad, Contact, Drum, Guide, Haul, Limits, Line,
    Location, Part, PartKind, PathEntry, Rig, Rope, RopeKind, Shaft, Sheave, Side, Thrust, Weight,
};
use crate::rig::overrides::{apply_overrides, read_variants, take_ranges, Uncertain, Variant};
use crate::rig::suggest::did_you_mean;
use crate::units::{parse_quantity, parse_unit_of, Dimension, UnitError, UnitSystem};

/// Reads and resolves the rig file at `path`.
///
/// # Errors
/// A [`LoadError`] naming every problem found, with line and column; a file that cannot
/// be read (missing, not UTF-8, larger than 1 MiB) is one problem naming the path.
pub fn load_file(path: &Path) -> Result<Rig, LoadError> {
    let text = read_text(path)?;
    load_str(&text, &path.display().to_string())
}

/// Reads a file's text, bounded in size.
fn read_text(path: &Path) -> Result<String, LoadError> {
    use std::io::Read;
    let file_name = path.display().to_string();
    let fail = |message: String| LoadError {
        file: file_name.clone(),
        problems: vec![Problem {
            location: None,
            subject: file_name.clone(),
            message,
        }],
    };
    let file = std::fs::File::open(path).map_err(|e| {
        fail(format!(
            "cannot read the rig file `{file_name}`: {}",
            io_reason(&e)
        ))
    })?;
    let mut bytes = Vec::new();
    file.take(MAX_INPUT_BYTES as u64 + 4)
        .read_to_end(&mut bytes)
        .map_err(|e| {
            fail(format!(
                "cannot read the rig file `{file_name}`: {}",
                io_reason(&e)
            ))
        })?;
    if bytes.len() > MAX_INPUT_BYTES + 3 {
        return Err(fail(format!(
            "the file is larger than the {MAX_INPUT_BYTES} bytes a rig file may have"
        )));
    }
    String::from_utf8(bytes).map_err(|e| {
        fail(format!(
            "the file is not UTF-8 text (invalid byte at offset {}); save it as UTF-8",
            e.utf8_error().valid_up_to()
        ))
    })
}

/// A lowercase reason for an I/O error.
fn io_reason(e: &std::io::Error) -> String {
    match e.kind() {
        std::io::ErrorKind::NotFound => "no such file".to_string(),
        std::io::ErrorKind::PermissionDenied => "permission denied".to_string(),
        _ => {
            let s = e.to_string();
            let mut c = s.chars();
            match c.next() {
                Some(f) => f.to_lowercase().chain(c).collect(),
                None => s,
            }
        }
    }
}

/// Parses and resolves rig text; `source` names it in messages.
///
/// # Errors
/// A [`LoadError`] naming every problem found, with line and column.
pub fn load_str(text: &str, source: &str) -> Result<Rig, LoadError> {
    load_str_with(text, source, &[])
}

/// Reads a rig file and applies `KEY=VALUE` overrides (see [`load_str_with`]).
///
/// # Errors
/// A [`LoadError`] naming every problem found, or an unknown override key.
pub fn load_file_with(path: &Path, overrides: &[(String, String)]) -> Result<Rig, LoadError> {
    let text = read_text(path)?;
    load_str_with(&text, &path.display().to_string(), overrides)
}

/// Parses rig text, applies `KEY=VALUE` overrides addressed by the file's own keys
/// (`parts.head.bearing.mu`, `parts.hook.load.mass` = `"60 kg"`, `ropes.braid6.mu`,
/// `limits.fleet_angle`; a list item by its index, `gravity.2`), then resolves.
///
/// Values are read as YAML (`0.2` is a number, `60 kg` a quantity, `[0, 0, 1]` a list,
/// `~` removes an optional key). An override may add a key the part does not have yet
/// (`parts.head.mass`), but not a new part, rope or line; unknown keys are errors naming
/// the closest existing key.
///
/// # Errors
/// A [`LoadError`] naming every problem found in the file and the overrides.
pub fn load_str_with(
    text: &str,
    source: &str,
    overrides: &[(String, String)],
) -> Result<Rig, LoadError> {
    let fail = |problems: Vec<Problem>| LoadError {
        file: source.to_string(),
        problems,
    };
    let (root, mut problems) = parse_tree(text).map_err(fail)?;
    let Some(mut root) = root else {
        return Err(fail(vec![Problem {
            location: None,
            subject: "document".to_string(),
            message: "the file is empty; expected a rig (`format: 1`, `ropes`, `parts`, `lines`)"
                .to_string(),
        }]));
    };
    problems.extend(apply_overrides(&mut root, overrides));
    // Ranges resolve to their nominal value here (see `overrides::take_ranges`).
    problems.extend(take_ranges(&mut root).1);
    match resolve(&root, source) {
        Ok(rig) if problems.is_empty() => Ok(rig),
        Ok(_) => Err(fail(sorted(problems))),
        Err(more) => {
            let mut more = more;
            mark_override_problems(&mut more, overrides);
            problems.extend(more);
            Err(fail(sorted(problems)))
        }
    }
}

/// The named variants of rig text (its `variants:` key), each a list of overrides.
///
/// # Errors
/// A [`LoadError`] when the text cannot be parsed or `variants` is malformed.
pub fn variants_str(text: &str, source: &str) -> Result<Vec<Variant>, LoadError> {
    let fail = |problems: Vec<Problem>| LoadError {
        file: source.to_string(),
        problems,
    };
    let (root, _) = parse_tree(text).map_err(fail)?;
    let node = root
        .as_ref()
        .and_then(Node::entries)
        .and_then(|top| get(top, "variants"));
    match node {
        None => Ok(Vec::new()),
        Some(n) => match read_variants(n) {
            (v, p) if p.is_empty() => Ok(v),
            (_, p) => Err(fail(p)),
        },
    }
}

/// The values written as ranges in rig text, after applying `overrides` (an override
/// that sets a ranged key to one number removes its range).
///
/// # Errors
/// A [`LoadError`] when the text cannot be parsed or a range is malformed.
pub fn ranges_str(
    text: &str,
    source: &str,
    overrides: &[(String, String)],
) -> Result<Vec<Uncertain>, LoadError> {
    let fail = |problems: Vec<Problem>| LoadError {
        file: source.to_string(),
        problems,
    };
    let (root, _) = parse_tree(text).map_err(fail)?;
    let Some(mut root) = root else {
        return Ok(Vec::new());
    };
    let mut problems = apply_overrides(&mut root, overrides);
    let (found, more) = take_ranges(&mut root);
    problems.extend(more);
    if problems.is_empty() {
        Ok(found)
    } else {
        Err(fail(problems))
    }
}

/// Notes on problems without a location (values set by an override) which override set
/// them.
fn mark_override_problems(problems: &mut [Problem], overrides: &[(String, String)]) {
    for p in problems.iter_mut().filter(|p| p.location.is_none()) {
        if let Some((k, v)) = overrides
            .iter()
            .filter(|(k, _)| {
                p.subject == *k
                    || p.subject.starts_with(&format!("{k}."))
                    || k.starts_with(&format!("{}.", p.subject))
            })
            .max_by_key(|(k, _)| k.len())
        {
            p.message.push_str(&format!(" (set by override `{k}={v}`)"));
        }
    }
}

/// Problems in file order; those without a location last.
fn sorted(mut problems: Vec<Problem>) -> Vec<Problem> {
    problems.sort_by_key(|p| match p.location {
        Some(l) => (0, l.line, l.column),
        None => (1, 0, 0),
    });
    problems
}

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

const TOP_KEYS: &[&str] = &[
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
];
const UNIT_KEYS: &[&str] = &["length", "force", "mass", "torque"];
const LIMIT_KEYS: &[&str] = &["fleet_angle", "design_factor"];
const ROPE_KEYS: &[&str] = &[
    "diameter",
    "breaking_strength",
    "mu",
    "min_bend_ratio",
    "kind",
];
const ROPE_KINDS: &[&str] = &["wire", "fibre", "kernmantle", "cord"];
const LINE_KEYS: &[&str] = &["rope", "path"];
const ENTRY_KEYS: &[&str] = &["part", "turns", "side"];
const BEARING_KINDS: &[&str] = &["plain", "rolling", "rated", "none"];
const SHAFT_KEYS: &[&str] = &["bearing", "thrust"];
const THRUST_KEYS: &[&str] = &[
    "load",
    "diameter",
    "inner_diameter",
    "mu",
    "contact",
    "cone_angle",
];
const GROOVE_KEYS: &[&str] = &["angle"];
const LOAD_KEYS: &[&str] = &["mass", "force"];
/// Largest magnitude accepted for any quantity, in SI.
const LARGEST: Real = 1e12;
/// Most extra turns on one passage.
const MOST_TURNS: Real = 1000.0;

/// The kinds of part, before their data is read.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Kind {
    Anchor,
    Sheave,
    Guide,
    Block,
    Weight,
    Drum,
    Haul,
}

const KINDS: &[(&str, Kind)] = &[
    ("anchor", Kind::Anchor),
    ("sheave", Kind::Sheave),
    ("guide", Kind::Guide),
    ("block", Kind::Block),
    ("weight", Kind::Weight),
    ("drum", Kind::Drum),
    ("haul", Kind::Haul),
];

impl Kind {
    fn name(self) -> &'static str {
        KINDS
            .iter()
            .find(|(_, k)| *k == self)
            .map_or("part", |(n, _)| n)
    }

    /// The name with its article: "an anchor", "a sheave".
    fn a(self) -> String {
        match self {
            Kind::Anchor => "an anchor".to_string(),
            other => format!("a {}", other.name()),
        }
    }

    /// Keys besides `kind` and `at`.
    fn keys(self) -> &'static [&'static str] {
        match self {
            Kind::Anchor => &["block"],
            Kind::Sheave => &[
                "axle", "diameter", "bearing", "mass", "groove", "mu", "block",
            ],
            Kind::Guide => &["axle", "diameter", "mu", "groove"],
            Kind::Block => &["moves", "load", "mass"],
            Kind::Weight => &["mass"],
            Kind::Drum => &["axle", "diameter", "shaft", "torque", "drag", "mu", "mass"],
            Kind::Haul => &["pull", "force"],
        }
    }

    /// Whether it has a natural quantity (can be the drive or the unknown).
    fn has_quantity(self) -> bool {
        matches!(self, Kind::Block | Kind::Weight | Kind::Drum | Kind::Haul)
    }

    fn can_end(self) -> bool {
        matches!(
            self,
            Kind::Anchor | Kind::Block | Kind::Weight | Kind::Drum | Kind::Haul
        )
    }

    fn can_pass(self) -> bool {
        matches!(self, Kind::Sheave | Kind::Guide | Kind::Drum)
    }
}

/// The value of a non-null key.
fn get<'n>(entries: &'n [Entry], key: &str) -> Option<&'n Node> {
    entries
        .iter()
        .find(|e| e.key == key)
        .map(|e| &e.value)
        .filter(|v| !v.is_null())
}

/// `parent.key`.
fn join(parent: &str, key: &str) -> String {
    if parent.is_empty() {
        key.to_string()
    } else {
        format!("{parent}.{key}")
    }
}

/// Part names and kinds, file order.
struct Names {
    names: Vec<String>,
    kinds: Vec<Option<Kind>>,
    index: HashMap<String, usize>,
}

/// Walks the tree, collecting problems.
struct Resolver {
    units: UnitSystem,
    gravity: Direction,
    problems: Vec<Problem>,
    dropped: usize,
}

impl Resolver {
    /// Whether enough problems are listed; later ones are only counted, and costly
    /// suggestions are skipped.
    fn is_full(&self) -> bool {
        self.problems.len() >= MAX_PROBLEMS
    }

    fn report(&mut self, at: Location, subject: impl Into<String>, message: impl Into<String>) {
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
    fn mapping<'n>(&mut self, node: &'n Node, path: &str, expected: &str) -> Option<&'n [Entry]> {
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
    fn keys(&mut self, entries: &[Entry], path: &str, allowed: &[&str], context: &str) {
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
    fn require<'n>(
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
    fn quantity(&mut self, node: &Node, path: &str, dimension: Dimension) -> Option<Real> {
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
    fn number(&mut self, node: &Node, path: &str, expected: &str) -> Option<Real> {
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
    fn angle(&mut self, node: &Node, path: &str) -> Option<Real> {
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
    fn text<'n>(&mut self, node: &'n Node, path: &str, expected: &str) -> Option<&'n str> {
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
    fn choice(&mut self, node: &Node, path: &str, options: &[&str], what: &str) -> Option<usize> {
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
    fn triple(&mut self, node: &Node, path: &str, dimension: Option<Dimension>) -> Option<Vector> {
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
    fn direction(&mut self, node: &Node, path: &str) -> Option<Direction> {
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
    fn check(
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
    fn size(&mut self, entries: &[Entry], key: &str, path: &str, parent: Location) -> Option<Real> {
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
    fn opt_mu(&mut self, entries: &[Entry], key: &str, path: &str) -> Option<Real> {
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
    fn mu(&mut self, entries: &[Entry], key: &str, path: &str, parent: Location) -> Option<Real> {
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
    fn opt_non_negative(
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

    fn groove(&mut self, entries: &[Entry], path: &str) -> Option<Real> {
        let node = get(entries, "groove")?;
        let p = join(path, "groove");
        let g = self.mapping(node, &p, "a groove `{angle: degrees}`")?;
        self.keys(g, &p, GROOVE_KEYS, "a groove");
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

    fn bearing(&mut self, node: &Node, path: &str) -> Option<Bearing> {
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
        let kind = self.choice(
            kind_node,
            &join(path, "kind"),
            BEARING_KINDS,
            "bearing kind",
        )?;
        match BEARING_KINDS[kind] {
            "plain" => {
                self.keys(
                    entries,
                    path,
                    &["kind", "pin_diameter", "mu", "mu_static"],
                    "a plain bearing",
                );
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
                self.keys(entries, path, &["kind", "bore", "mu"], "a rolling bearing");
                let bore = self.size(entries, "bore", path, node.location);
                let mu = self.mu(entries, "mu", path, node.location);
                Some(Bearing::Rolling {
                    bore: bore?,
                    mu: mu?,
                })
            }
            "rated" => {
                self.keys(
                    entries,
                    path,
                    &["kind", "factor", "efficiency"],
                    "a rated bearing",
                );
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
                self.keys(entries, path, &["kind"], "a bearing of kind none");
                Some(Bearing::None)
            }
        }
    }

    fn thrust(&mut self, node: &Node, path: &str) -> Option<Thrust> {
        let entries = self.mapping(
            node,
            path,
            "a thrust bearing `{load, diameter, mu, contact: new|worn}`",
        )?;
        self.keys(entries, path, THRUST_KEYS, "a thrust bearing");
        let at = node.location;
        let load = match self.require(
            entries,
            "load",
            path,
            at,
            "the axial load, a force such as `200 N`",
        ) {
            Some(_) => self.opt_non_negative(entries, "load", path, Dimension::Force),
            None => None,
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
            .and_then(|n| self.choice(n, &join(path, "contact"), &["new", "worn"], "contact"))
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
    fn bearing_fits(
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
    fn part_ref(&mut self, node: &Node, path: &str, names: &Names, role: &str) -> Option<usize> {
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
fn hint_or_list(name: &str, names: &[String]) -> String {
    let hint = did_you_mean(name, names.iter().map(String::as_str));
    if !hint.is_empty() || names.is_empty() || names.len() > 8 {
        return hint;
    }
    let list: Vec<String> = names.iter().map(|n| format!("`{n}`")).collect();
    format!("; defined: {}", list.join(", "))
}

fn example(dimension: Dimension) -> &'static str {
    match dimension {
        Dimension::Length => "6 mm",
        Dimension::Force => "7.5 kN",
        Dimension::Mass => "40 kg",
        Dimension::Torque => "1.2 N*m",
    }
}

/// Resolves a parsed tree into a rig.
fn resolve(root: &Node, source: &str) -> Result<Rig, Vec<Problem>> {
    let mut r = Resolver {
        units: UnitSystem::default(),
        gravity: -Vector::z_axis(),
        problems: Vec::new(),
        dropped: 0,
    };
    let Some(top) = r.mapping(
        root,
        "document",
        "a mapping of rig keys (`format`, `ropes`, `parts`, `lines`)",
    ) else {
        return Err(r.problems);
    };
    r.keys(top, "", TOP_KEYS, "a rig file");
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
            r.keys(entries, "units", UNIT_KEYS, "units");
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
                        Dimension::Length => r.units.length = unit,
                        Dimension::Force => r.units.force = unit,
                        Dimension::Mass => r.units.mass = unit,
                        Dimension::Torque => r.units.torque = unit,
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
    if let Some(n) = get(top, "limits") {
        if let Some(entries) = r.mapping(n, "limits", "a mapping `{fleet_angle, design_factor}`") {
            r.keys(entries, "limits", LIMIT_KEYS, "limits");
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
            ropes: ropes.into_iter().collect::<Option<Vec<_>>>()?,
            parts: parts.into_iter().collect::<Option<Vec<_>>>()?,
            lines: lines.into_iter().collect::<Option<Vec<_>>>()?,
            drive: drive?,
            solve_for: solve_for?,
            runs_back,
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
fn role(r: &mut Resolver, node: &Node, key: &str, names: &Names) -> Option<usize> {
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

fn rope(r: &mut Resolver, e: &Entry) -> Option<Rope> {
    let path = join("ropes", &e.key);
    let node = &e.value;
    let entries = r.mapping(
        node,
        &path,
        "a rope `{diameter, mu, breaking_strength?, min_bend_ratio?, kind?}`",
    )?;
    r.keys(entries, &path, ROPE_KEYS, "a rope");
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
    Some(Rope {
        name: e.key.clone(),
        kind,
        diameter: diameter?,
        breaking_strength,
        mu: mu?,
        min_bend_ratio,
        location: e.key_location,
    })
}

fn part(
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
    let mut allowed = vec!["kind", "at"];
    allowed.extend_from_slice(kind.keys());
    let context = format!("{} part", kind.a());
    for entry in entries
        .iter()
        .filter(|x| !allowed.contains(&x.key.as_str()))
    {
        // A key of another kind says so; otherwise suggest a close key.
        let owner = KINDS
            .iter()
            .find(|(_, k)| k.keys().contains(&entry.key.as_str()));
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
            Some(PartKind::Sheave(Sheave {
                axle: axle?,
                tread_diameter: tread_diameter?,
                bearing: bearing?,
                mass,
                groove_angle,
                mu,
                block,
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
            let (load, load_is_force) = block_load(r, entries, &path, at, is_unknown);
            let moves = moves?;
            let load_stated = get(entries, "load").is_some();
            // An unknown block that states no load: a mass where one would do work
            // along its travel, else the force against `moves`.
            let load_is_force =
                load_is_force || (!load_stated && square_to_gravity(&moves, &r.gravity));
            Some(PartKind::Block(Block {
                moves,
                load: load?,
                load_is_force,
                load_stated,
                mass,
            }))
        }
        Kind::Weight => {
            let mass = match get(entries, "mass") {
                Some(n) => {
                    let p = join(&path, "mass");
                    let v = r.quantity(n, &p, Dimension::Mass);
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
                Some(n) => r
                    .quantity(n, &join(&path, "torque"), Dimension::Torque)
                    .map(Some),
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
                    let v = r.quantity(n, &p, Dimension::Force);
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
        block,
        location: e.key_location,
    })
}

/// A block's load: `(Some(load or None when unknown), load_is_force)`, or `(None, _)`
/// after a problem.
/// The torque unit the reports of a file whose `units` state none show: `N*m`, except
/// that a file in pound-force shows `lbf*in` when its lengths are inches and `lbf*ft`
/// otherwise, so that an imperial rig is not reported in N·m. Its bare torques are still
/// read in N*m, the format's default.
fn default_torque(units: &UnitSystem) -> crate::units::Unit {
    let symbol = match (units.force.symbol, units.length.symbol) {
        ("lbf", "in") => "lbf*in",
        ("lbf", _) => "lbf*ft",
        _ => "N*m",
    };
    parse_unit_of(symbol, Dimension::Torque).unwrap_or(units.torque)
}

fn block_load(
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
    r.keys(load, &p, LOAD_KEYS, "a block load");
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
        Some(v) if is_force => (Some(Some(BlockLoad::Force(v))), true),
        Some(v) => (Some(Some(BlockLoad::Mass(v))), false),
        None => (None, is_force),
    }
}

fn shaft(r: &mut Resolver, node: &Node, path: &str) -> Option<Shaft> {
    let entries = r.mapping(node, path, "a shaft `{bearing, thrust}`")?;
    r.keys(entries, path, SHAFT_KEYS, "a shaft");
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
        Some(n) => Some(r.thrust(n, &join(path, "thrust"))?),
        None => None,
    };
    Some(Shaft {
        bearing: bearing?,
        thrust,
    })
}

fn line(r: &mut Resolver, e: &Entry, rope_names: &[String], names: &Names) -> Option<Line> {
    let path = join("lines", &e.key);
    let node = &e.value;
    let entries = r.mapping(node, &path, "a line `{rope, path: [...]}`")?;
    r.keys(entries, &path, LINE_KEYS, "a line");
    let rope = r
        .require(
            entries,
            "rope",
            &path,
            node.location,
            "the name of a rope from `ropes`",
        )
        .and_then(|n| {
            let p = join(&path, "rope");
            let name = r.text(n, &p, "the name of a rope from `ropes`")?;
            match rope_names.iter().position(|x| x == name) {
                Some(i) => Some(i),
                None => {
                    let hint = if r.is_full() {
                        String::new()
                    } else {
                        hint_or_list(name, rope_names)
                    };
                    r.report(
                        n.location,
                        p,
                        format!("no rope named `{name}` in `ropes`{hint}"),
                    );
                    None
                }
            }
        });
    let steps_node = r.require(
        entries,
        "path",
        &path,
        node.location,
        "the parts the line passes, from one end to the other",
    )?;
    let pp = join(&path, "path");
    let Value::Seq(items) = &steps_node.value else {
        r.report(
            steps_node.location,
            pp,
            format!(
                "expected a list of part names, found {}",
                steps_node.describe()
            ),
        );
        return None;
    };
    if items.len() < 2 {
        r.report(
            steps_node.location,
            pp,
            format!(
                "a line needs at least two path entries (its two ends), found {}",
                items.len()
            ),
        );
        return None;
    }
    let mut steps = Vec::new();
    let mut ok = true;
    for (i, item) in items.iter().enumerate() {
        let ip = format!("{pp}.{i}");
        let is_end = i == 0 || i + 1 == items.len();
        match path_entry(r, item, &ip, names, is_end) {
            Some(s) => steps.push(s),
            None => ok = false,
        }
    }
    Some(Line {
        name: e.key.clone(),
        rope: rope?,
        path: ok.then_some(steps)?,
        location: e.key_location,
    })
}

fn path_entry(
    r: &mut Resolver,
    item: &Node,
    path: &str,
    names: &Names,
    is_end: bool,
) -> Option<PathEntry> {
    let (name_node, fields) = match &item.value {
        Value::Map(fields) => {
            r.keys(fields, path, ENTRY_KEYS, "a path entry");
            (
                r.require(fields, "part", path, item.location, "the part's name")?,
                Some(fields.as_slice()),
            )
        }
        _ => (item, None),
    };
    let part = r.part_ref(name_node, path, names, "in this line's path")?;
    let name = &names.names[part];
    let kind = names.kinds[part]?;
    let mut ok = true;
    if is_end && !kind.can_end() {
        r.report(name_node.location, path, format!("`{name}` is {}, which cannot end a line; a line ends at an anchor, block, weight, drum or haul", kind.a()));
        ok = false;
    }
    if !is_end && !kind.can_pass() {
        r.report(name_node.location, path, format!("`{name}` is {}, which a line cannot pass through; between its ends a line passes sheaves, guides and drums", kind.a()));
        ok = false;
    }
    let mut turns = 0;
    let mut side = None;
    if let Some(fields) = fields {
        if let Some(t) = get(fields, "turns") {
            let tp = join(path, "turns");
            let v = r.number(t, &tp, "a whole number of extra turns");
            match r.check(
                v,
                t,
                &tp,
                |v| (0.0..=MOST_TURNS).contains(&v) && v.fract() == 0.0,
                "a whole number of extra turns from 0 to 1000",
            ) {
                Some(v) if matches!(kind, Kind::Guide | Kind::Drum) => turns = v as u32,
                Some(_) => {
                    r.report(
                        t.location,
                        tp,
                        format!(
                            "`turns` applies only to a guide or drum; `{name}` is {}",
                            kind.a()
                        ),
                    );
                    ok = false;
                }
                None => ok = false,
            }
        }
        if let Some(s) = get(fields, "side") {
            match r.choice(s, &join(path, "side"), &["left", "right"], "side") {
                Some(0) => side = Some(Side::Left),
                Some(_) => side = Some(Side::Right),
                None => ok = false,
            }
        }
    }
    ok.then_some(PathEntry {
        part,
        turns,
        side,
        location: item.location,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::math::STANDARD_GRAVITY;

    /// The example of DESIGN.md section 4.
    pub(crate) const EXAMPLE: &str = include_str!("../../tests/rigs/design-example.yaml");

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
        let rope = &rig.ropes[0];
        assert_eq!((rope.name.as_str(), rope.kind), ("braid6", RopeKind::Fibre));
        assert!(close(rope.diameter, 0.006)); // 6 mm
        assert_eq!(rope.breaking_strength, Some(7500.0)); // 7.5 kN
        assert_eq!((rope.mu, rope.min_bend_ratio), (0.2, 8.0));
        assert_eq!(rope.location.line, 7);
        let names: Vec<&str> = rig.parts.iter().map(|p| p.name.as_str()).collect();
        assert_eq!(names, ["eye", "head", "hook", "hook.a", "hand"]);
        assert!(close(rig.parts[0].at.z, 2.4));
        let PartKind::Sheave(head) = &rig.parts[1].kind else {
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
        assert_eq!(head.block, None);
        let PartKind::Block(hook) = &rig.parts[2].kind else {
            panic!("hook")
        };
        assert_eq!(hook.load, Some(BlockLoad::Mass(40.0)));
        assert!(!hook.load_is_force);
        assert_eq!(hook.moves.into_inner(), Vector::new(0.0, 0.0, 1.0));
        let PartKind::Sheave(a) = &rig.parts[3].kind else {
            panic!("hook.a")
        };
        assert_eq!(a.block, Some(2));
        assert_eq!(
            a.bearing,
            Bearing::Rolling {
                bore: 0.010,
                mu: 0.0015
            }
        );
        let PartKind::Haul(hand) = &rig.parts[4].kind else {
            panic!("hand")
        };
        assert_eq!((hand.pull, hand.force), (None, None));
        assert_eq!(rig.parts[4].location.line, 15);
        let fall = &rig.lines[0];
        let path: Vec<usize> = fall.path.iter().map(|s| s.part).collect();
        assert_eq!(path, [0, 3, 1, 4]);
        assert_eq!((rig.drive, rig.solve_for), (4, 4));
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
        assert!(close(rig.ropes[0].diameter, 0.00635));
        // Wire rope default D/d 26, the least for 6x25 filler-wire rope (wire-rope
        // handbook D/d table, from memory).
        assert_eq!(rig.ropes[0].min_bend_ratio, 26.0);
        let PartKind::Guide(g) = &rig.parts[1].kind else {
            panic!()
        };
        assert!(close(g.groove_angle.unwrap(), 40f64.to_radians()));
        assert_eq!(g.axle.into_inner(), Vector::z());
        let PartKind::Drum(d) = &rig.parts[2].kind else {
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
        let PartKind::Weight(w) = &rig.parts[3].kind else {
            panic!()
        };
        // 20 lb = 20 * 0.45359237 kg = 9.0718474 kg (exact).
        assert!(close(w.mass.unwrap(), 9.071_847_4));
        let PartKind::Haul(h) = &rig.parts[4].kind else {
            panic!()
        };
        assert!(close(h.force.unwrap(), 12.0 * 4.448_221_615_260_5));
        let step = &rig.lines[0].path[2];
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
        let PartKind::Block(b) = &rig.parts[1].kind else {
            panic!()
        };
        assert_eq!((b.load, b.load_is_force), (None, true));
        // Default travel is against gravity: gravity -Y, so +Y.
        assert_eq!(b.moves.into_inner(), Vector::new(0.0, 1.0, 0.0));
        assert_eq!((rig.drive, rig.solve_for), (3, 1));
        assert_eq!(rig.ropes[0].min_bend_ratio, 4.0);
    }
}

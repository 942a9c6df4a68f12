//! Overrides: `KEY=VALUE` settings addressed by the rig file's own keys
//! (`parts.head.bearing.mu=0.08`, `parts.hook.load.mass=60 kg`, `ropes.braid6.mu=0.1`,
//! `limits.fleet_angle=2`, `gravity.2=-1`), applied to the parsed tree before it is
//! checked, so an overridden value gets exactly the checks a written one gets.
//!
//! Part names may contain dots (`hook.a`): at each mapping the longest run of segments
//! that names an existing key is taken. A missing key inside a part, rope, line or
//! setting is added (the checks then refuse keys the format does not know, with a
//! suggestion); a missing part, rope or line name is an error naming the closest
//! existing one. Setting one of a pair that excludes the other (`mass`/`force` of a
//! block load, `factor`/`efficiency` of a rated bearing) removes the other.

/// The study inputs the file gives, read here; the types are the model's.
pub use crate::model::vary::{Distribution, Uncertain, Variant};
use crate::model::Location;
use crate::rig::error::Problem;
use crate::rig::file::{parse_value, Entry, Node, Value};
use crate::rig::suggest::did_you_mean;

/// Maps whose keys are names the user chose; overrides cannot add to them.
const NAME_MAPS: &[(&str, &str)] = &[("parts", "part"), ("ropes", "rope"), ("lines", "line")];

/// Applies every override to `root`, returning the problems (each names the override).
pub fn apply_overrides(root: &mut Node, overrides: &[(String, String)]) -> Vec<Problem> {
    let mut problems = Vec::new();
    for (key, value) in overrides {
        if let Err(message) = apply(root, key, value) {
            problems.push(Problem {
                location: None,
                subject: key.clone(),
                message: format!("{message} (override `{key}={value}`)"),
            });
        }
    }
    problems
}

/// Applies one override.
fn apply(root: &mut Node, key: &str, value: &str) -> Result<(), String> {
    let segments: Vec<&str> = key.trim().split('.').collect();
    if segments.iter().any(|s| s.is_empty()) {
        return Err("expected a key path such as `parts.head.bearing.mu`".to_string());
    }
    let new_value = parse_value(value).map_err(|e| format!("invalid value `{value}`: {e}"))?;
    let mut node = root;
    let mut rest: &[&str] = &segments;
    let mut walked: Vec<String> = Vec::new();
    while !rest.is_empty() {
        let here = if walked.is_empty() {
            "the rig file".to_string()
        } else {
            format!("`{}`", walked.join("."))
        };
        if node.is_null() && walked.len() >= 2 {
            node.value = Value::Map(Vec::new());
        }
        match &mut node.value {
            Value::Map(entries) => {
                let found = (1..=rest.len()).rev().find_map(|n| {
                    let candidate = rest[..n].join(".");
                    entries
                        .iter()
                        .position(|e| e.key == candidate)
                        .map(|i| (i, n))
                });
                let (_, used) = match found {
                    Some(found) => found,
                    None => {
                        if let [only] = walked.as_slice() {
                            if let Some((_, what)) = NAME_MAPS.iter().find(|(m, _)| m == only) {
                                let hint =
                                    did_you_mean(rest[0], entries.iter().map(|e| e.key.as_str()));
                                return Err(format!(
                                    "no {what} named `{}` in `{only}`{hint}",
                                    rest[0]
                                ));
                            }
                        }
                        entries.push(Entry {
                            key: rest[0].to_string(),
                            key_location: Location::default(),
                            value: Node {
                                value: Value::Map(Vec::new()),
                                location: Location::default(),
                            },
                        });
                        (entries.len() - 1, 1)
                    }
                };
                let name = rest[..used].join(".");
                rest = &rest[used..];
                if rest.is_empty() {
                    exclude_partner(entries, walked.last().map(String::as_str), &name);
                    let Some(entry) = entries.iter_mut().find(|e| e.key == name) else {
                        return Err(format!("`{name}` vanished from {here}"));
                    };
                    entry.value = new_value;
                    return Ok(());
                }
                walked.push(name.clone());
                let Some(entry) = entries.iter_mut().find(|e| e.key == name) else {
                    return Err(format!("`{name}` vanished from {here}"));
                };
                node = &mut entry.value;
            }
            Value::Seq(items) => {
                let len = items.len();
                let Some(index) = rest[0].parse::<usize>().ok().filter(|&i| i < len) else {
                    return Err(format!(
                        "{here} is a list of {len}; expected an index from 0 to {}, found `{}`",
                        len.saturating_sub(1),
                        rest[0]
                    ));
                };
                walked.push(rest[0].to_string());
                rest = &rest[1..];
                if rest.is_empty() {
                    items[index] = new_value;
                    return Ok(());
                }
                node = &mut items[index];
            }
            Value::Scalar { .. } => {
                return Err(format!(
                    "{here} is a single value, not a mapping; cannot set `{}` inside it",
                    rest.join(".")
                ));
            }
        }
    }
    // An empty path was refused above; replacing the whole document is not offered.
    Err("expected a key path such as `parts.head.bearing.mu`".to_string())
}

/// Removes the other key of an exclusive pair when one is set.
fn exclude_partner(entries: &mut Vec<Entry>, parent: Option<&str>, key: &str) {
    let partner = match (parent, key) {
        (Some("load"), "mass") => "force",
        (Some("load"), "force") => "mass",
        (Some("bearing"), "factor") => "efficiency",
        (Some("bearing"), "efficiency") => "factor",
        _ => return,
    };
    entries.retain(|e| e.key != partner);
}

// ---------------------------------------------------------------------------------------
// Named variants and uncertain values (ranges), read from the parsed tree (their types
// are the model's, `crate::model::vary`: a study runs them without the file layer).

/// Reads `variants:`: a mapping of variant name to either a list of `"KEY=VALUE"`
/// strings or a mapping `KEY: VALUE` (a value may be any YAML: a number, `"600 kg"`,
/// or a mapping such as `{kind: none}`).
pub fn read_variants(node: &Node) -> (Vec<Variant>, Vec<Problem>) {
    let mut variants = Vec::new();
    let mut problems = Vec::new();
    let mut problem = |location: Location, subject: String, message: String| {
        problems.push(Problem {
            location: (location.line > 0).then_some(location),
            subject,
            message,
        })
    };
    let Some(entries) = node.entries() else {
        problem(
            node.location,
            "variants".to_string(),
            format!(
                "expected a mapping of variant names to settings, found {}",
                node.describe()
            ),
        );
        return (variants, problems);
    };
    for e in entries {
        let subject = format!("variants.{}", e.key);
        let mut settings = Vec::new();
        match &e.value.value {
            Value::Seq(items) => {
                for item in items {
                    match item.scalar().and_then(|s| s.split_once('=')) {
                        Some((k, v)) if !k.trim().is_empty() => {
                            settings.push((k.trim().to_string(), v.trim().to_string()))
                        }
                        _ => problem(
                            item.location,
                            subject.clone(),
                            format!(
                                "expected a setting `KEY=VALUE` such as `parts.head.bearing.mu=0.08`, found {}",
                                item.describe()
                            ),
                        ),
                    }
                }
            }
            Value::Map(pairs) => {
                for p in pairs {
                    settings.push((p.key.trim().to_string(), flow_text(&p.value)));
                }
            }
            Value::Scalar { .. } => problem(
                e.value.location,
                subject.clone(),
                format!(
                    "expected a list of `KEY=VALUE` settings or a mapping `KEY: VALUE`, found {}",
                    e.value.describe()
                ),
            ),
        }
        variants.push(Variant {
            name: e.key.clone(),
            settings,
        });
    }
    (variants, problems)
}

/// Writes a node back as one line of YAML flow text, so that it can be read again by
/// [`parse_value`] as an override's value.
pub fn flow_text(node: &Node) -> String {
    match &node.value {
        Value::Scalar { text, plain: true } => text.clone(),
        Value::Scalar { text, .. } => {
            let escaped = text.replace('\\', "\\\\").replace('"', "\\\"");
            format!("\"{escaped}\"")
        }
        Value::Seq(items) => {
            let inner: Vec<String> = items.iter().map(flow_text).collect();
            format!("[{}]", inner.join(", "))
        }
        Value::Map(entries) => {
            let inner: Vec<String> = entries
                .iter()
                .map(|e| format!("{}: {}", e.key, flow_text(&e.value)))
                .collect();
            format!("{{{}}}", inner.join(", "))
        }
    }
}

/// Keys whose value may be a range: friction coefficients and loads.
pub const RANGE_KEYS: &[&str] = &[
    "mu",
    "mu_static",
    "factor",
    "efficiency",
    "mass",
    "force",
    "torque",
    "drag",
    "load",
];

/// Splits `"60 kg"` into 60 and `kg`; a bare number has an empty unit.
fn number_and_unit(node: &Node) -> Option<(f64, String)> {
    if let Some(v) = node.plain_number() {
        return v.is_finite().then(|| (v, String::new()));
    }
    let text = node.scalar()?.trim();
    let split = text
        .find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | 'e' | 'E' | '+' | '-')))
        .unwrap_or(text.len());
    let (number, unit) = text.split_at(split);
    let v: f64 = number.trim().parse().ok()?;
    v.is_finite().then(|| (v, unit.trim().to_string()))
}

/// Finds every range (`{min, max}` or `{mean, sd}` under a key of [`RANGE_KEYS`]),
/// records it, and replaces it in the tree by its nominal value, so that the rest of
/// loading sees one number. The `variants` subtree is left alone.
pub fn take_ranges(root: &mut Node) -> (Vec<Uncertain>, Vec<Problem>) {
    let mut found = Vec::new();
    let mut problems = Vec::new();
    if let Value::Map(entries) = &mut root.value {
        for e in entries.iter_mut().filter(|e| e.key != "variants") {
            let key = e.key.clone();
            walk_ranges(&mut e.value, &key, &mut found, &mut problems);
        }
    }
    (found, problems)
}

fn walk_ranges(
    node: &mut Node,
    path: &str,
    found: &mut Vec<Uncertain>,
    problems: &mut Vec<Problem>,
) {
    match &mut node.value {
        Value::Map(entries) => {
            for e in entries.iter_mut() {
                let p = format!("{path}.{}", e.key);
                if RANGE_KEYS.contains(&e.key.as_str()) {
                    if let Some(result) = range_of(&e.value) {
                        match result {
                            Ok(u) => {
                                let (_, text) = Uncertain {
                                    key: p.clone(),
                                    ..u.clone()
                                }
                                .setting(u.distribution.nominal());
                                let location = e.value.location;
                                e.value = Node {
                                    value: Value::Scalar { text, plain: true },
                                    location,
                                };
                                found.push(Uncertain { key: p, ..u });
                            }
                            Err(message) => problems.push(Problem {
                                location: (e.value.location.line > 0).then_some(e.value.location),
                                subject: p,
                                message,
                            }),
                        }
                        continue;
                    }
                }
                walk_ranges(&mut e.value, &p, found, problems);
            }
        }
        Value::Seq(items) => {
            for (i, item) in items.iter_mut().enumerate() {
                walk_ranges(item, &format!("{path}.{i}"), found, problems);
            }
        }
        Value::Scalar { .. } => {}
    }
}

/// The range written at `node`, if it is one (None: not a range at all).
fn range_of(node: &Node) -> Option<Result<Uncertain, String>> {
    let entries = node.entries()?;
    let keys: Vec<&str> = entries.iter().map(|e| e.key.as_str()).collect();
    let is = |a: &str, b: &str| keys.len() == 2 && keys.contains(&a) && keys.contains(&b);
    let pair = if is("min", "max") {
        ("min", "max")
    } else if is("mean", "sd") {
        ("mean", "sd")
    } else {
        if keys
            .iter()
            .any(|k| matches!(*k, "min" | "max" | "mean" | "sd"))
        {
            return Some(Err(format!(
                "expected a range `{{min: a, max: b}}` (uniform) or `{{mean: m, sd: s}}` (normal), found keys {}",
                keys.join(", ")
            )));
        }
        return None;
    };
    let value = |k: &str| entries.iter().find(|e| e.key == k).map(|e| &e.value);
    let read = |k: &str| -> Result<(f64, String), String> {
        let n = value(k).ok_or_else(|| format!("missing `{k}`"))?;
        number_and_unit(n).ok_or_else(|| {
            format!(
                "`{k}`: expected a number, with or without a unit, found {}",
                n.describe()
            )
        })
    };
    let result = (|| {
        let (a, ua) = read(pair.0)?;
        let (b, ub) = read(pair.1)?;
        let unit = match (ua.as_str(), ub.as_str()) {
            (x, y) if x == y => ua.clone(),
            ("", _) if pair.0 == "mean" => ub.clone(),
            (_, "") if pair.0 == "mean" => ua.clone(),
            _ => {
                return Err(format!(
                    "the bounds of a range must use the same unit, found `{ua}` and `{ub}`"
                ))
            }
        };
        let distribution = if pair.0 == "min" {
            if a > b {
                return Err(format!("`min` ({a}) is larger than `max` ({b})"));
            }
            Distribution::Uniform { min: a, max: b }
        } else {
            if b < 0.0 {
                return Err(format!("`sd` must be 0 or more, found {b}"));
            }
            Distribution::Normal { mean: a, sd: b }
        };
        Ok(Uncertain {
            key: String::new(),
            distribution,
            unit,
        })
    })();
    Some(result)
}

#[cfg(test)]
mod study_tests {
    use super::*;
    use crate::rig::file::parse_tree;

    fn tree(text: &str) -> Node {
        parse_tree(text).unwrap().0.unwrap()
    }

    #[test]
    fn variants_as_lists_and_mappings() {
        let root = tree(
            "variants:\n  a: [\"parts.x.mu=0.1\", \"parts.y.load.mass = 60 kg\"]\n  b: {parts.x.bearing: {kind: none}, parts.z.at: [1, 2, 3], title: \"a: b\"}\n",
        );
        let (v, p) = read_variants(&root.entries().unwrap()[0].value);
        assert!(p.is_empty(), "{p:?}");
        assert_eq!(
            v[0].settings[1],
            ("parts.y.load.mass".into(), "60 kg".into())
        );
        assert_eq!(v[1].settings[0].1, "{kind: none}");
        assert_eq!(v[1].settings[1].1, "[1, 2, 3]");
        assert_eq!(v[1].settings[2].1, "\"a: b\"");
        let (_, p) = read_variants(&tree("v: [a]\n").entries().unwrap()[0].value);
        assert_eq!(p.len(), 1);
    }

    #[test]
    fn ranges_are_found_and_replaced_by_nominal_values() {
        let mut root = tree(
            "ropes:\n  r: {mu: {min: 0.1, max: 0.3}}\nparts:\n  h.a: {load: {mass: {mean: 40 kg, sd: 2 kg}}}\n  g: {diameter: {min: 1, max: 2}}\n",
        );
        let (found, problems) = take_ranges(&mut root);
        assert!(problems.is_empty(), "{problems:?}");
        assert_eq!(found.len(), 2);
        assert_eq!(found[0].key, "ropes.r.mu");
        assert_eq!(found[0].distribution.nominal(), 0.2);
        assert_eq!(found[1].key, "parts.h.a.load.mass");
        assert_eq!(found[1].unit, "kg");
        assert_eq!(
            found[1].setting(41.5),
            ("parts.h.a.load.mass".into(), "41.5 kg".into())
        );
        let top = root.entries().unwrap();
        let rope = top[0].value.entries().unwrap()[0].value.entries().unwrap();
        assert_eq!(rope[0].value.scalar(), Some("0.2"));
        let mut bad = tree("ropes:\n  r: {mu: {min: 0.3, max: 0.1}}\n");
        assert_eq!(take_ranges(&mut bad).1.len(), 1);
        let mut bad = tree("ropes:\n  r: {mu: {min: 1 kg, max: 2 N}}\n");
        assert_eq!(take_ranges(&mut bad).1.len(), 1);
    }
}

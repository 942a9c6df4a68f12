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

use crate::rig::error::Problem;
use crate::rig::file::{parse_value, Entry, Node, Value};
use crate::rig::model::Location;
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

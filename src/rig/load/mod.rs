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
//!   frictionless journal. A thrust's `contact` is required; a drum shaft's thrust
//!   needs its `load`, while a sheave's `thrust` takes its axial load from the spans
//!   (DESIGN.md §7) and reads `load` as an optional preload (default 0).
//! - A rope's `bend_loss` (DESIGN.md §7) defaults to 0 and lies in `[0, 1)`.
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

use std::path::Path;

use crate::model::Rig;
use crate::rig::error::{LoadError, Problem};
use crate::rig::file::{parse_tree, Node, MAX_INPUT_BYTES};
use crate::rig::overrides::{apply_overrides, read_variants, take_ranges, Uncertain, Variant};

mod changing;
mod key;
mod keys;
mod lines;
mod parts;
mod read;
pub mod schema;
mod top;

pub use keys::default_min_bend_ratio;
use keys::get;
pub use schema::schema;
use top::resolve;

/// Reads and resolves the rig file at `path`.
///
/// # Errors
/// A [`LoadError`] naming every problem found, with line and column; a file that cannot
/// be read (missing, not UTF-8, larger than 1 MiB) is one problem naming the path.
pub fn load_file(path: &Path) -> Result<Rig, LoadError> {
    let text = read_text(path)?;
    load_str(&text, &path.display().to_string())
}

/// Reads a rig file's text, bounded in size: the one reader of rig files for every
/// command.
///
/// # Errors
/// A [`LoadError`] with one problem naming the path when the file cannot be read, is
/// larger than 1 MiB or is not UTF-8.
pub fn read_text(path: &Path) -> Result<String, LoadError> {
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
    load_parsed_with(&parse_tree(text), source, overrides)
}

/// Rig text parsed once into its tree, to be resolved many times with different
/// overrides (the studies: one resolve per sample, step or variation, no re-parse).
/// [`ParsedRig::load_with`] gives exactly what [`load_str_with`] gives for the same
/// text and overrides.
#[derive(Debug, Clone)]
pub struct ParsedRig {
    tree: Result<(Option<Node>, Vec<Problem>), Vec<Problem>>,
    source: String,
}

impl ParsedRig {
    /// Parses `text`; `source` names it in messages. Parse errors are kept and given
    /// by every [`ParsedRig::load_with`].
    pub fn parse(text: &str, source: &str) -> ParsedRig {
        ParsedRig {
            tree: parse_tree(text),
            source: source.to_string(),
        }
    }

    /// Applies `overrides` to a copy of the parsed tree and resolves it, as
    /// [`load_str_with`] does.
    ///
    /// # Errors
    /// A [`LoadError`] naming every problem found in the file and the overrides.
    pub fn load_with(&self, overrides: &[(String, String)]) -> Result<Rig, LoadError> {
        load_parsed_with(&self.tree, &self.source, overrides)
    }
}

/// [`load_str_with`] after the parse.
fn load_parsed_with(
    parsed: &Result<(Option<Node>, Vec<Problem>), Vec<Problem>>,
    source: &str,
    overrides: &[(String, String)],
) -> Result<Rig, LoadError> {
    let fail = |problems: Vec<Problem>| LoadError {
        file: source.to_string(),
        problems,
    };
    let (root, mut problems) = parsed.clone().map_err(fail)?;
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

/// Notes on problems which override caused them: those without a location (values an
/// override set carry none) that concern an overridden key, its parent or its children,
/// and located ones at or under an overridden key: a key an override removed (`KEY=~`)
/// is reported as missing where the file wrote it, which without the note sends the user
/// looking for a fault in the file.
fn mark_override_problems(problems: &mut [Problem], overrides: &[(String, String)]) {
    for p in problems.iter_mut() {
        let at_or_under = |k: &str| p.subject == k || p.subject.starts_with(&format!("{k}."));
        let located = p.location.is_some();
        if let Some((k, v)) = overrides
            .iter()
            .filter(|(k, _)| {
                at_or_under(k) || (!located && k.starts_with(&format!("{}.", p.subject)))
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

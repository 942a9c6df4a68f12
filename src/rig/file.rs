//! The rig file as written: a YAML tree in which every node and every key keeps the line
//! and column where it was written.
//!
//! Why not serde structs: serde stops at the first problem and values that parse carry
//! no location, while a rig file's semantic problems (an unknown part in a path, a
//! negative diameter) must each name a line and be collected in one pass. So the text is
//! read with yaml-rust2's event parser, whose events carry marks, into this small
//! [`Node`] tree; [`crate::rig::load`] then walks the tree, checks every key and value,
//! and converts to SI.
//!
//! Reading is bounded: input above [`MAX_INPUT_BYTES`], nesting deeper than
//! [`MAX_DEPTH`], and alias expansion beyond [`MAX_NODES`] nodes or
//! [`MAX_EXPANDED_BYTES`] bytes of text are refused with an error, so an alias bomb or a
//! deeply nested document costs little time and memory. Duplicate keys in any mapping
//! (including duplicate part names, which a plain map would silently collapse) are
//! reported, and the first definition is kept so that checking can go on.
//!
//! Text is checked before it is parsed: a control or formatting character refused by
//! [`crate::text::is_unsafe_in_file`] anywhere in the file (a comment included) is an
//! error with its line and column, since a NUL would end the YAML reader early and the
//! rest of the file would be silently ignored. A quoted scalar's escapes (`"\0"`,
//! `"\e"`) are checked after they are resolved, and a key (a part, rope or line name)
//! holds no tab or line break either.

use std::collections::HashMap;

use yaml_rust2::parser::{Event, Parser};
use yaml_rust2::scanner::{Marker, TScalarStyle};

use crate::model::Location;
use crate::rig::error::Problem;
use crate::text::{describe, is_unsafe, is_unsafe_in_file, printable, unsafe_in_file};

/// Largest rig file read, bytes (1 MiB; real rigs are a few kilobytes).
pub const MAX_INPUT_BYTES: usize = 1 << 20;
/// Deepest nesting of mappings and sequences accepted (a rig file needs about 6).
pub const MAX_DEPTH: usize = 64;
/// Most nodes in a document, counting every alias expansion.
pub const MAX_NODES: usize = 200_000;
/// Most bytes of scalar text copied by alias expansion.
pub const MAX_EXPANDED_BYTES: usize = 4 << 20;
/// Most problems listed from one stage; the rest are counted in a closing note.
pub const MAX_PROBLEMS: usize = 100;

/// The closing note for problems not listed.
pub fn more_problems(dropped: usize) -> Problem {
    Problem {
        location: None,
        subject: "document".to_string(),
        message: format!("{dropped} more problems not listed; fix the ones above first"),
    }
}

/// A value with the place it was written. Nodes made by an override have line 0.
#[derive(Debug, Clone, PartialEq)]
pub struct Node {
    /// The value.
    pub value: Value,
    /// Where it starts (line 0: not from the file).
    pub location: Location,
}

/// One key of a mapping with its value.
#[derive(Debug, Clone, PartialEq)]
pub struct Entry {
    /// The key's text.
    pub key: String,
    /// Where the key is written.
    pub key_location: Location,
    /// Its value.
    pub value: Node,
}

/// A YAML value, untyped: scalars keep their text and whether they were plain (unquoted),
/// so that `6` is a number but `"6 mm"` and `'6'` are text to be parsed as quantities.
#[derive(Debug, Clone, PartialEq)]
pub enum Value {
    /// A scalar.
    Scalar {
        /// The text as read (escapes resolved).
        text: String,
        /// Plain (unquoted, untagged, not a block scalar).
        plain: bool,
    },
    /// A sequence.
    Seq(Vec<Node>),
    /// A mapping, in file order, without duplicate keys.
    Map(Vec<Entry>),
}

impl Node {
    /// Whether this is a null (`~`, `null`, or nothing at all).
    pub fn is_null(&self) -> bool {
        matches!(&self.value, Value::Scalar { text, plain: true }
            if matches!(text.as_str(), "" | "~" | "null" | "Null" | "NULL"))
    }

    /// The mapping's entries, if it is one.
    pub fn entries(&self) -> Option<&[Entry]> {
        match &self.value {
            Value::Map(e) => Some(e),
            _ => None,
        }
    }

    /// The scalar's text, if it is one.
    pub fn scalar(&self) -> Option<&str> {
        match &self.value {
            Value::Scalar { text, .. } => Some(text),
            _ => None,
        }
    }

    /// The value of a plain scalar that reads as a YAML 1.2 number (`12`, `-0.5`, `1e3`,
    /// `.inf`, `.nan`), NaN and infinities included so that they can be refused with a
    /// message.
    pub fn plain_number(&self) -> Option<f64> {
        match &self.value {
            Value::Scalar { text, plain: true } => yaml_number(text),
            _ => None,
        }
    }

    /// What kind of value this is, for messages ("a mapping", "text `abc`").
    pub fn describe(&self) -> String {
        match &self.value {
            Value::Map(_) => "a mapping".to_string(),
            Value::Seq(_) => "a list".to_string(),
            Value::Scalar { .. } if self.is_null() => "nothing".to_string(),
            Value::Scalar { text, .. } => {
                let shown: String = text.chars().take(40).collect();
                let more = if text.chars().count() > 40 { "…" } else { "" };
                format!("`{shown}{more}`")
            }
        }
    }

    /// Like [`Node::describe`], naming a list's length.
    pub fn describe_list(&self) -> String {
        match &self.value {
            Value::Seq(items) => format!("a list of {}", items.len()),
            _ => self.describe(),
        }
    }

    fn count(&self) -> (usize, usize) {
        match &self.value {
            Value::Scalar { text, .. } => (1, text.len()),
            Value::Seq(items) => items.iter().fold((1, 0), |(n, b), i| {
                let (n2, b2) = i.count();
                (n + n2, b + b2)
            }),
            Value::Map(entries) => entries.iter().fold((1, 0), |(n, b), e| {
                let (n2, b2) = e.value.count();
                (n + n2 + 1, b + b2 + e.key.len())
            }),
        }
    }
}

/// Reads a YAML 1.2 core-schema number from a plain scalar's text.
pub fn yaml_number(text: &str) -> Option<f64> {
    match text {
        ".nan" | ".NaN" | ".NAN" => return Some(f64::NAN),
        ".inf" | ".Inf" | ".INF" | "+.inf" | "+.Inf" | "+.INF" => return Some(f64::INFINITY),
        "-.inf" | "-.Inf" | "-.INF" => return Some(f64::NEG_INFINITY),
        _ => {}
    }
    let digits = text.strip_prefix(['-', '+']).unwrap_or(text);
    let starts_numeric = digits.starts_with(|c: char| c.is_ascii_digit() || c == '.');
    let only_number_chars = digits
        .chars()
        .all(|c| c.is_ascii_digit() || matches!(c, '.' | 'e' | 'E' | '-' | '+'));
    if !starts_numeric || !only_number_chars || !digits.contains(|c: char| c.is_ascii_digit()) {
        return None;
    }
    text.parse::<f64>().ok()
}

/// Converts a yaml-rust2 marker (1-based line, 0-based column) to a location.
fn location(mark: &Marker) -> Location {
    Location {
        line: mark.line(),
        column: mark.col() + 1,
    }
}

/// A collection being built.
enum Frame {
    Seq {
        location: Location,
        anchor: usize,
        items: Vec<Node>,
    },
    Map {
        location: Location,
        anchor: usize,
        entries: Vec<Entry>,
        seen: HashMap<String, Location>,
        /// The key read, waiting for its value; `None` text for a refused complex key.
        key: Option<(Option<String>, Location)>,
    },
}

/// Builds the tree from parser events, counting nodes and expansion.
struct Builder {
    stack: Vec<Frame>,
    anchors: HashMap<usize, (Node, usize, usize)>,
    nodes: usize,
    expanded_bytes: usize,
    root: Option<Node>,
    documents: usize,
    problems: Vec<Problem>,
    dropped: usize,
}

/// Records a problem that does not stop reading, up to [`MAX_PROBLEMS`].
fn note(problems: &mut Vec<Problem>, dropped: &mut usize, problem: Problem) {
    if problems.len() < MAX_PROBLEMS {
        problems.push(problem);
    } else {
        *dropped += 1;
    }
}

/// Why reading stopped.
fn fatal(location: Location, subject: &str, message: impl Into<String>) -> Problem {
    Problem {
        location: Some(location),
        subject: subject.to_string(),
        message: message.into(),
    }
}

impl Builder {
    fn new() -> Self {
        Builder {
            stack: Vec::new(),
            anchors: HashMap::new(),
            nodes: 0,
            expanded_bytes: 0,
            root: None,
            documents: 0,
            problems: Vec::new(),
            dropped: 0,
        }
    }

    /// Path of keys down to the current frame, for messages.
    fn path(&self) -> String {
        let mut parts = Vec::new();
        for frame in &self.stack {
            match frame {
                Frame::Seq { items, .. } => parts.push(items.len().to_string()),
                Frame::Map {
                    key: Some((Some(k), _)),
                    ..
                } => parts.push(k.clone()),
                Frame::Map { .. } => {}
            }
        }
        if parts.is_empty() {
            "document".to_string()
        } else {
            parts.join(".")
        }
    }

    fn count_node(&mut self, at: Location) -> Result<(), Problem> {
        self.nodes += 1;
        if self.nodes > MAX_NODES {
            return Err(fatal(
                at,
                "document",
                format!("the document has more than {MAX_NODES} values; refused (a rig file needs far fewer)"),
            ));
        }
        Ok(())
    }

    /// Places a finished node in its parent (or as the root).
    fn place(&mut self, node: Node, anchor: usize) {
        if anchor > 0 {
            let (n, b) = node.count();
            self.anchors.insert(anchor, (node.clone(), n, b));
        }
        let path = self.path();
        let Builder {
            stack,
            root,
            problems,
            dropped,
            ..
        } = self;
        match stack.last_mut() {
            None => *root = Some(node),
            Some(Frame::Seq { items, .. }) => items.push(node),
            Some(Frame::Map {
                entries, seen, key, ..
            }) => match key.take() {
                None => match node.value {
                    Value::Scalar { text, .. } => *key = Some((Some(text), node.location)),
                    _ => {
                        note(
                            problems,
                            dropped,
                            fatal(
                                node.location,
                                &path,
                                "a mapping key must be a plain name, not a list or mapping",
                            ),
                        );
                        *key = Some((None, node.location));
                    }
                },
                Some((None, _)) => {}
                Some((Some(k), key_location)) => {
                    if let Some(first) = seen.get(&k) {
                        // `path` already ends with this key.
                        note(problems, dropped, fatal(
                            key_location,
                            &path,
                            format!(
                                "duplicate key `{k}` (first defined at line {}); each key may appear once, the first is kept",
                                first.line
                            ),
                        ));
                    } else {
                        seen.insert(k.clone(), key_location);
                        entries.push(Entry {
                            key: k,
                            key_location,
                            value: node,
                        });
                    }
                }
            },
        }
    }

    /// Notes a refused character in a scalar as read (escapes resolved): in a key (a
    /// name) no tab or line break either.
    fn check_scalar(&mut self, text: &str, at: Location) {
        let is_key = matches!(self.stack.last(), Some(Frame::Map { key: None, .. }));
        let refused = |c: char| {
            if is_key {
                is_unsafe(c)
            } else {
                is_unsafe_in_file(c)
            }
        };
        if let Some(c) = text.chars().find(|&c| refused(c)) {
            let what = if is_key {
                format!("the key `{}`", printable(text))
            } else {
                "this value".to_string()
            };
            let problem = fatal(
                at,
                &self.path(),
                format!(
                    "{} in {what}; {}",
                    describe(c),
                    if is_key {
                        "a name holds no control or formatting characters, tabs or line breaks"
                    } else {
                        ALLOWED
                    }
                ),
            );
            note(&mut self.problems, &mut self.dropped, problem);
        }
    }

    fn open(&mut self, frame: Frame, at: Location) -> Result<(), Problem> {
        self.count_node(at)?;
        if self.stack.len() >= MAX_DEPTH {
            return Err(fatal(
                at,
                &self.path(),
                format!(
                    "nesting deeper than {MAX_DEPTH} levels; refused (a rig file needs about 6)"
                ),
            ));
        }
        self.stack.push(frame);
        Ok(())
    }

    fn event(&mut self, event: Event, mark: &Marker) -> Result<bool, Problem> {
        let at = location(mark);
        match event {
            Event::StreamStart | Event::Nothing | Event::DocumentEnd => {}
            Event::StreamEnd => return Ok(false),
            Event::DocumentStart => {
                self.documents += 1;
                if self.documents > 1 {
                    return Err(fatal(
                        at,
                        "document",
                        "a second YAML document starts here; a rig file holds exactly one",
                    ));
                }
            }
            Event::Scalar(text, style, anchor, tag) => {
                self.count_node(at)?;
                self.check_scalar(&text, at);
                let tagged_str = tag.as_ref().is_some_and(|t| t.suffix == "str");
                let plain = style == TScalarStyle::Plain && !tagged_str;
                self.place(
                    Node {
                        value: Value::Scalar { text, plain },
                        location: at,
                    },
                    anchor,
                );
            }
            Event::SequenceStart(anchor, _) => {
                self.open(
                    Frame::Seq {
                        location: at,
                        anchor,
                        items: Vec::new(),
                    },
                    at,
                )?;
            }
            Event::MappingStart(anchor, _) => {
                let frame = Frame::Map {
                    location: at,
                    anchor,
                    entries: Vec::new(),
                    seen: HashMap::new(),
                    key: None,
                };
                self.open(frame, at)?;
            }
            Event::SequenceEnd | Event::MappingEnd => match self.stack.pop() {
                Some(Frame::Seq {
                    location,
                    anchor,
                    items,
                }) => {
                    self.place(
                        Node {
                            value: Value::Seq(items),
                            location,
                        },
                        anchor,
                    );
                }
                Some(Frame::Map {
                    location,
                    anchor,
                    entries,
                    ..
                }) => {
                    self.place(
                        Node {
                            value: Value::Map(entries),
                            location,
                        },
                        anchor,
                    );
                }
                None => {}
            },
            Event::Alias(id) => {
                let Some((node, n, b)) = self.anchors.get(&id) else {
                    return Err(fatal(
                        at,
                        &self.path(),
                        "alias to an anchor that is not complete here",
                    ));
                };
                self.nodes += n;
                self.expanded_bytes += b;
                if self.nodes > MAX_NODES || self.expanded_bytes > MAX_EXPANDED_BYTES {
                    return Err(fatal(
                        at,
                        &self.path(),
                        "aliases expand the document beyond what a rig file needs; refused",
                    ));
                }
                let node = node.clone();
                self.place(node, 0);
            }
        }
        Ok(true)
    }
}

/// What the file may hold, for messages.
const ALLOWED: &str =
    "among control and formatting characters a rig file may hold only tab, CR and LF; remove it";

/// Every refused character of the text, each located (at most [`MAX_PROBLEMS`]).
fn refused_characters(text: &str) -> Vec<Problem> {
    let (found, more) = unsafe_in_file(text, MAX_PROBLEMS);
    let mut problems: Vec<Problem> = found
        .into_iter()
        .map(|(line, column, c)| {
            fatal(
                Location { line, column },
                "document",
                format!("{} is not allowed here; {ALLOWED}", describe(c)),
            )
        })
        .collect();
    if more > 0 {
        problems.push(more_problems(more));
    }
    problems
}

/// Removes a leading byte-order mark.
pub fn strip_bom(text: &str) -> &str {
    text.strip_prefix('\u{feff}').unwrap_or(text)
}

/// Parses one YAML document into a located tree.
///
/// Returns the root (None for an empty document) and the non-fatal problems found
/// (duplicate keys, complex keys).
///
/// # Errors
/// The fatal problems: YAML syntax, size, nesting, alias expansion, a second document,
/// refused characters (every one, located).
pub fn parse_tree(text: &str) -> Result<(Option<Node>, Vec<Problem>), Vec<Problem>> {
    let text = strip_bom(text);
    if text.len() > MAX_INPUT_BYTES {
        return Err(vec![Problem {
            location: None,
            subject: "document".to_string(),
            message: format!(
                "the file is {} bytes, more than the {MAX_INPUT_BYTES} bytes a rig file may have",
                text.len()
            ),
        }]);
    }
    let refused = refused_characters(text);
    if !refused.is_empty() {
        return Err(refused);
    }
    // The parser is not expected to panic, but it reads untrusted text: turn a panic into
    // an error rather than taking the caller down.
    let outcome = std::panic::catch_unwind(|| {
        let mut parser = Parser::new_from_str(text);
        let mut builder = Builder::new();
        loop {
            match parser.next_token() {
                Err(e) => {
                    let at = location(e.marker());
                    let message = if e.info().contains("recursion limit") {
                        format!("nesting deeper than {MAX_DEPTH} levels; refused (a rig file needs about 6)")
                    } else {
                        format!("invalid YAML: {}", e.info())
                    };
                    return Err(vec![fatal(at, "yaml", message)]);
                }
                Ok((event, mark)) => match builder.event(event, &mark) {
                    Ok(true) => {}
                    Ok(false) => break,
                    Err(p) => return Err(vec![p]),
                },
            }
        }
        let root = builder.root.take().filter(|r| !r.is_null());
        let mut problems = builder.problems;
        if builder.dropped > 0 {
            problems.push(more_problems(builder.dropped));
        }
        Ok((root, problems))
    });
    match outcome {
        Ok(result) => result,
        Err(_) => Err(vec![Problem {
            location: None,
            subject: "yaml".to_string(),
            message: "the YAML reader failed on this input; check the file's syntax".to_string(),
        }]),
    }
}

/// Parses an override's value text as a YAML value (a bare `60 kg` is text, `0.2` a
/// number, `[0, 0, 1]` a list); every node gets line 0.
///
/// # Errors
/// A message when the text is not one YAML value.
pub fn parse_value(text: &str) -> Result<Node, String> {
    match parse_tree(text) {
        Ok((root, problems)) if problems.is_empty() => {
            let mut node = root.unwrap_or(Node {
                value: Value::Scalar {
                    text: String::new(),
                    plain: true,
                },
                location: Location::default(),
            });
            clear_locations(&mut node);
            Ok(node)
        }
        Ok((_, problems)) | Err(problems) => Err(problems
            .into_iter()
            .map(|p| match p.location {
                Some(l) if l.line == 1 => format!("{} (at column {})", p.message, l.column),
                Some(l) => format!("{} (at line {} column {})", p.message, l.line, l.column),
                None => p.message,
            })
            .collect::<Vec<_>>()
            .join("; ")),
    }
}

fn clear_locations(node: &mut Node) {
    node.location = Location::default();
    match &mut node.value {
        Value::Scalar { .. } => {}
        Value::Seq(items) => items.iter_mut().for_each(clear_locations),
        Value::Map(entries) => entries.iter_mut().for_each(|e| {
            e.key_location = Location::default();
            clear_locations(&mut e.value);
        }),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn tree(text: &str) -> Node {
        parse_tree(text).unwrap().0.unwrap()
    }

    #[test]
    fn locations_are_one_based() {
        let root = tree("a: 1\nb:\n  c: [x, 'y']\n");
        let e = root.entries().unwrap();
        assert_eq!(e[0].key_location, Location { line: 1, column: 1 });
        assert_eq!(e[0].value.location, Location { line: 1, column: 4 });
        let c = &e[1].value.entries().unwrap()[0];
        assert_eq!(c.key_location, Location { line: 3, column: 3 });
        let Value::Seq(items) = &c.value.value else {
            panic!()
        };
        assert_eq!(
            items[1].location,
            Location {
                line: 3,
                column: 10
            }
        );
        assert_eq!(items[0].plain_number(), None);
        assert!(matches!(
            &items[1].value,
            Value::Scalar { plain: false, .. }
        ));
    }

    #[test]
    fn numbers_follow_the_core_schema() {
        assert_eq!(yaml_number("12"), Some(12.0));
        assert_eq!(yaml_number("-0.5"), Some(-0.5));
        assert_eq!(yaml_number("1e3"), Some(1000.0));
        assert!(yaml_number(".nan").unwrap().is_nan());
        assert_eq!(yaml_number("-.inf"), Some(f64::NEG_INFINITY));
        assert_eq!(yaml_number("nan"), None);
        assert_eq!(yaml_number("inf"), None);
        assert_eq!(yaml_number("6 mm"), None);
        assert_eq!(yaml_number("."), None);
    }

    #[test]
    fn duplicates_are_reported_and_the_first_kept() {
        let (root, problems) = parse_tree("a: 1\na: 2\n").unwrap();
        assert_eq!(problems.len(), 1);
        assert!(problems[0].message.contains("duplicate key `a`"));
        assert_eq!(problems[0].location.unwrap().line, 2);
        assert_eq!(
            root.unwrap().entries().unwrap()[0].value.plain_number(),
            Some(1.0)
        );
    }

    #[test]
    fn aliases_expand_within_bounds() {
        let root = tree("b: &b {kind: none}\nc: *b\n");
        let e = root.entries().unwrap();
        assert_eq!(e[0].value, e[1].value);
        let mut bomb = String::from("a0: &a0 [x, x, x, x, x, x, x, x, x, x]\n");
        for i in 1..12 {
            let p = i - 1;
            bomb.push_str(&format!("a{i}: &a{i} [*a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}, *a{p}]\n"));
        }
        let e = parse_tree(&bomb).unwrap_err();
        assert!(e[0].message.contains("aliases expand"), "{e:?}");
    }

    #[test]
    fn deep_nesting_and_second_documents_are_refused() {
        for depth in [100, 10_000, 500_000] {
            let deep = "[".repeat(depth);
            let e = parse_tree(&deep).unwrap_err();
            assert!(e[0].message.contains("nesting deeper"), "{e:?}");
        }
        let e = parse_tree("a: 1\n---\nb: 2\n").unwrap_err();
        assert!(e[0].message.contains("second YAML document"), "{e:?}");
        assert_eq!(e[0].location.unwrap().line, 2);
    }

    #[test]
    fn empty_and_bom() {
        assert_eq!(parse_tree("").unwrap().0, None);
        assert_eq!(parse_tree("# nothing\n").unwrap().0, None);
        assert!(parse_tree("\u{feff}a: 1\n").unwrap().0.is_some());
    }
}

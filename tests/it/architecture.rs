//! The module graph of `src/`: the top-level modules each module's code names
//! (`crate::X` in the library, `reeve::X` in the binary, `src/main.rs` and `src/cli/`),
//! against the arrows the architecture allows (DEVELOPERS.md, "Module graph"). Comments
//! and strings are no dependency; code under `#[cfg(test)]` is listed apart (a unit test
//! may build its fixture with the file layer). Print the graph with
//! `cargo test --test it architecture:: -- --nocapture`.

use std::collections::{BTreeMap, BTreeSet};
use std::path::Path;

use crate::support::ROOT;

/// The arrows each library module may have (the binary may use every module). A new
/// arrow is a change of the architecture: add it here and to DEVELOPERS.md together.
const ALLOWED: &[(&str, &[&str])] = &[
    (
        "checks",
        &["friction", "geometry", "math", "model", "solve", "units"],
    ),
    ("friction", &["math"]),
    ("geometry", &["math", "model"]),
    ("math", &[]),
    ("model", &["math", "units"]),
    ("progress", &[]),
    (
        "report",
        &[
            "checks", "geometry", "math", "model", "solve", "study", "text", "units",
        ],
    ),
    ("rig", &["math", "model", "text", "units"]),
    (
        "solve",
        &["friction", "geometry", "math", "model", "progress", "units"],
    ),
    (
        "study",
        &[
            "checks", "math", "model", "progress", "report", "solve", "text", "units",
        ],
    ),
    ("text", &[]),
    ("units", &["math"]),
];

/// Arrows from each top-level module: in its code, and only in its tests.
#[derive(Default)]
struct Graph {
    code: BTreeMap<String, BTreeSet<String>>,
    tests: BTreeMap<String, BTreeSet<String>>,
}

/// `text` with comments removed and the contents of string and character literals
/// blanked (newlines kept), so that what is left is code.
fn code_only(text: &str) -> String {
    let c: Vec<char> = text.chars().collect();
    let mut out = String::with_capacity(text.len());
    let ident = |ch: char| ch.is_alphanumeric() || ch == '_';
    let mut i = 0;
    // Skips to `end` (exclusive of what follows), keeping the newlines on the way.
    let skip = |out: &mut String, from: usize, to: usize| {
        out.extend(c[from..to].iter().filter(|&&ch| ch == '\n'));
    };
    while i < c.len() {
        let prev = if i > 0 { c[i - 1] } else { ' ' };
        match c[i] {
            '/' if c.get(i + 1) == Some(&'/') => {
                while i < c.len() && c[i] != '\n' {
                    i += 1;
                }
            }
            '/' if c.get(i + 1) == Some(&'*') => {
                let (mut depth, start) = (0usize, i);
                while i < c.len() {
                    if c[i] == '/' && c.get(i + 1) == Some(&'*') {
                        depth += 1;
                        i += 2;
                    } else if c[i] == '*' && c.get(i + 1) == Some(&'/') {
                        depth -= 1;
                        i += 2;
                        if depth == 0 {
                            break;
                        }
                    } else {
                        i += 1;
                    }
                }
                skip(&mut out, start, i);
            }
            'r' if !ident(prev) || (prev == 'b' && (i < 2 || !ident(c[i - 2]))) => {
                let hashes = c[i + 1..].iter().take_while(|&&ch| ch == '#').count();
                if c.get(i + 1 + hashes) != Some(&'"') {
                    out.push('r');
                    i += 1;
                    continue;
                }
                let start = i;
                i += hashes + 2;
                while i < c.len()
                    && !(c[i] == '"' && c[i + 1..].iter().take(hashes).all(|&ch| ch == '#'))
                {
                    i += 1;
                }
                i = (i + 1 + hashes).min(c.len());
                skip(&mut out, start, i);
                out.push_str("\"\"");
            }
            '"' => {
                let start = i;
                i += 1;
                while i < c.len() && c[i] != '"' {
                    i += if c[i] == '\\' { 2 } else { 1 };
                }
                i = (i + 1).min(c.len());
                skip(&mut out, start, i);
                out.push_str("\"\"");
            }
            // A character literal (`'{'`, `'\''`); a lifetime (`'a`) stays.
            '\'' if c.get(i + 1) == Some(&'\\') => {
                i += 3;
                while i < c.len() && c[i] != '\'' {
                    i += 1;
                }
                i += 1;
                out.push_str("' '");
            }
            '\'' if c.get(i + 2) == Some(&'\'') => {
                i += 3;
                out.push_str("' '");
            }
            ch => {
                out.push(ch);
                i += 1;
            }
        }
    }
    out
}

/// The top-level modules named after `prefix` (`crate::`) in `line`.
fn named(line: &str, prefix: &str) -> Vec<String> {
    let mut found = Vec::new();
    let mut rest = line;
    while let Some(at) = rest.find(prefix) {
        let before = rest[..at].chars().next_back();
        rest = &rest[at + prefix.len()..];
        if before.is_some_and(|ch| ch.is_alphanumeric() || ch == '_') {
            continue;
        }
        let group = rest
            .strip_prefix('{')
            .map(|g| g.split('}').next().unwrap_or(g));
        let items: Vec<&str> = match group {
            Some(g) => g.split(',').collect(),
            None => vec![rest],
        };
        for item in items {
            let name: String = item
                .trim_start()
                .chars()
                .take_while(|ch| ch.is_alphanumeric() || *ch == '_')
                .collect();
            if !name.is_empty() && name != "self" {
                found.push(name);
            }
        }
    }
    found
}

/// Adds the arrows of one source file of top-level module `top`.
fn scan(graph: &mut Graph, top: &str, text: &str) {
    let prefix = if top == "bin" { "reeve::" } else { "crate::" };
    let mut depth = 0usize;
    let mut test_until: Option<usize> = None;
    let mut pending = false;
    for line in code_only(text).lines() {
        if line.trim() == "#[cfg(test)]" {
            pending = true;
            continue;
        }
        let in_test = pending || test_until.is_some();
        for target in named(line, prefix).into_iter().filter(|t| t != top) {
            let map = if in_test {
                &mut graph.tests
            } else {
                &mut graph.code
            };
            map.entry(top.to_string()).or_default().insert(target);
        }
        for ch in line.chars() {
            match ch {
                '{' => {
                    if pending {
                        test_until = Some(depth);
                        pending = false;
                    }
                    depth += 1;
                }
                '}' => {
                    depth = depth.saturating_sub(1);
                    if test_until == Some(depth) {
                        test_until = None;
                    }
                }
                _ => {}
            }
        }
        // A one-line test-only item (`use`, `mod x;`).
        if pending && line.trim_end().ends_with(';') {
            pending = false;
        }
    }
}

/// Walks `dir` and scans every `.rs` file under it, `top` naming each file's module.
fn walk(graph: &mut Graph, src: &Path, dir: &Path) {
    let mut entries: Vec<_> = std::fs::read_dir(dir)
        .expect("src/ is readable")
        .map(|e| e.expect("a folder entry").path())
        .collect();
    entries.sort();
    for path in entries {
        if path.is_dir() {
            walk(graph, src, &path);
            continue;
        }
        if path.extension().and_then(|e| e.to_str()) != Some("rs") {
            continue;
        }
        let rel = path.strip_prefix(src).expect("under src/");
        let first = rel.components().next().expect("a path");
        let first = first.as_os_str().to_str().expect("UTF-8 file names");
        let top = match first.strip_suffix(".rs").unwrap_or(first) {
            "main" | "cli" => "bin",
            "lib" => continue,
            other => other,
        };
        let text = std::fs::read_to_string(&path).expect("source is UTF-8");
        scan(graph, top, &text);
    }
}

fn graph() -> Graph {
    let src = Path::new(ROOT).join("src");
    let mut graph = Graph::default();
    walk(&mut graph, &src, &src);
    graph
}

/// Guards the layering: no module's code (tests aside) names a module that its row of
/// [`ALLOWED`] does not list, so no back-arrow (`study` → `rig`, `solve` → `study`)
/// comes in unseen. Prints the graph.
#[test]
fn the_module_graph_has_only_the_allowed_arrows() {
    let graph = graph();
    let mut wrong = Vec::new();
    for (top, targets) in &graph.code {
        let only_tests: Vec<&String> = graph
            .tests
            .get(top)
            .into_iter()
            .flatten()
            .filter(|t| !targets.contains(*t))
            .collect();
        let list = |v: Vec<&String>| v.iter().map(|s| s.as_str()).collect::<Vec<_>>().join(", ");
        println!(
            "{top} -> {}{}",
            list(targets.iter().collect()),
            if only_tests.is_empty() {
                String::new()
            } else {
                format!("   (tests: {})", list(only_tests))
            }
        );
        if top == "bin" {
            continue;
        }
        let allowed = ALLOWED
            .iter()
            .find(|(m, _)| m == top)
            .map_or(&[][..], |(_, a)| *a);
        wrong.extend(
            targets
                .iter()
                .filter(|t| !allowed.contains(&t.as_str()))
                .map(|t| format!("{top} -> {t}")),
        );
    }
    assert!(
        wrong.is_empty(),
        "arrows the architecture does not allow (DEVELOPERS.md, \"Module graph\"): {}",
        wrong.join("; ")
    );
}

/// The scanner that test relies on: a doc link, a string and a test module are no
/// arrow of the code; a test-only item in the middle of a file ends where its braces
/// close, and a character literal brace does not move that end.
#[test]
fn the_module_scan_skips_comments_strings_and_tests() {
    let text = r#"
//! See [`crate::rig`].
use crate::model::Rig;
const S: &str = "crate::report";
#[cfg(test)]
fn helper() { let _ = crate::rig::load_str; let _ = '{'; }
fn after() { crate::solve::solve(); }
#[cfg(test)]
mod tests {
    use crate::{rig, units::unit};
}
"#;
    let mut g = Graph::default();
    scan(&mut g, "study", text);
    let set = |v: &[&str]| v.iter().map(|s| s.to_string()).collect::<BTreeSet<_>>();
    assert_eq!(g.code["study"], set(&["model", "solve"]));
    assert_eq!(g.tests["study"], set(&["rig", "units"]));
}

//! The offending line of a rig under a located error, with a caret under its column.
//!
//! Written by hand rather than with a diagnostics crate: the messages are already
//! located and worded (`file:line:column: key: message`), and all that is added is the
//! source line and a caret, which costs a few dozen lines instead of a dependency tree
//! on a two-core build.

use std::fs;

/// At most this many snippets under one error (a file with many problems stays short).
const MAX_SNIPPETS: usize = 10;

/// Lines longer than this many characters show only this many around the column.
const WINDOW: usize = 120;

/// `message` (the error as printed, one problem a line) with, under every line that
/// starts with `file:line:column:` of a file that can be read, that line of the file and
/// a caret under the column. Lines are returned as they came; only lines are added.
pub fn with_snippets(message: &str) -> String {
    let mut out = String::with_capacity(message.len());
    let mut shown = 0;
    for (i, line) in message.split('\n').enumerate() {
        if i > 0 {
            out.push('\n');
        }
        out.push_str(line);
        if shown >= MAX_SNIPPETS {
            continue;
        }
        let Some((path, row, column)) = location(line) else {
            continue;
        };
        let Ok(text) = fs::read_to_string(path) else {
            continue;
        };
        if let Some(snippet) = snippet(&text, row, column) {
            out.push('\n');
            out.push_str(&snippet);
            shown += 1;
        }
    }
    out
}

/// The `file`, line and column that begin `line` (`reeve: ` may come first).
fn location(line: &str) -> Option<(&str, usize, usize)> {
    let line = line.strip_prefix("reeve: ").unwrap_or(line);
    // The first `:LINE:COLUMN:` in the line ends the path (a path may hold colons).
    let bytes = line.as_bytes();
    let mut start = 0;
    while let Some(offset) = line[start..].find(':') {
        let colon = start + offset;
        let rest = &line[colon + 1..];
        let mut parts = rest.splitn(3, ':');
        let (Some(row), Some(column), Some(_)) = (parts.next(), parts.next(), parts.next()) else {
            return None;
        };
        let digits = |s: &str| !s.is_empty() && s.bytes().all(|b| b.is_ascii_digit());
        if colon > 0 && digits(row) && digits(column) {
            let (row, column) = (row.parse().ok()?, column.parse().ok()?);
            return Some((&line[..colon], row, column));
        }
        start = colon + 1;
        if start >= bytes.len() {
            return None;
        }
    }
    None
}

/// Line `row` (1-based) of `text` with a caret under character `column` (1-based):
/// ```text
///    7 |   h: {kind: haul, at: [0, 0, 0], bogus: 1}
///      |                                  ^
/// ```
/// Tabs stay tabs in the caret line so the caret lines up however the terminal sets
/// them; a character that is escaped for the terminal takes as many spaces as its escape.
fn snippet(text: &str, row: usize, column: usize) -> Option<String> {
    if row == 0 || column == 0 {
        return None;
    }
    let source = text.split('\n').nth(row - 1)?.trim_end_matches('\r');
    // A long line (a schedule written on one line) shows a window around the column.
    let count = source.chars().count();
    let (first, last) = if count > WINDOW {
        let first = column.saturating_sub(1 + WINDOW / 2).min(count - WINDOW);
        (first, first + WINDOW)
    } else {
        (0, count)
    };
    let mut shown = String::new();
    let mut pad = String::new();
    if first > 0 {
        shown.push('…');
        pad.push(' ');
    }
    for (i, c) in source.chars().enumerate().take(last).skip(first) {
        let rendered: String = if c == '\t' {
            "\t".into()
        } else {
            reeve::text::printable(c.encode_utf8(&mut [0; 4])).into_owned()
        };
        if i + 1 < column {
            if c == '\t' {
                pad.push('\t');
            } else {
                pad.push_str(&" ".repeat(rendered.chars().count()));
            }
        }
        shown.push_str(&rendered);
    }
    if last < count {
        shown.push('…');
    }
    let number = row.to_string();
    let gutter = " ".repeat(number.len());
    Some(format!(" {number} | {shown}\n {gutter} | {pad}^"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_caret_stands_under_the_column() {
        let text = "format: 1\n  h: {kind: haul, bogus: 1}\n";
        assert_eq!(
            snippet(text, 2, 19).unwrap(),
            " 2 |   h: {kind: haul, bogus: 1}\n   |                   ^"
        );
    }

    #[test]
    fn tabs_and_multibyte_characters_before_the_column_keep_the_caret_in_place() {
        // `é` is two bytes and one character; the column counts characters.
        let text = "\tnamé: x\n";
        let s = snippet(text, 1, 8).unwrap();
        assert_eq!(s, " 1 | \tnamé: x\n   | \t      ^");
    }

    #[test]
    fn a_control_character_takes_the_width_of_its_escape() {
        let text = "# a \u{0} b\n";
        let s = snippet(text, 1, 7).unwrap();
        let lines: Vec<&str> = s.lines().collect();
        let caret = lines[1].find('^').unwrap();
        assert_eq!(&lines[0][caret..caret + 1], "b", "{s}");
    }

    #[test]
    fn a_location_is_read_from_the_front_of_a_line() {
        assert_eq!(
            location("reeve: rigs/a.yaml:5:17: ropes.r.diameter: expected"),
            Some(("rigs/a.yaml", 5, 17))
        );
        assert_eq!(
            location("c:/x/a.yaml:5:17: k: m"),
            Some(("c:/x/a.yaml", 5, 17))
        );
        assert_eq!(location("reeve: rigs/a.yaml: no such file"), None);
        assert_eq!(location("reeve: cannot write `x`: it is a folder"), None);
    }

    #[test]
    fn a_line_past_the_end_shows_nothing() {
        assert_eq!(snippet("a: 1\n", 9, 1), None);
        assert_eq!(
            with_snippets("nowhere.yaml:1:1: k: m"),
            "nowhere.yaml:1:1: k: m"
        );
    }
}

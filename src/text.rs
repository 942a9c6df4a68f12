//! Which characters never pass through `reeve`, in one place: the loader refuses them in
//! a rig file, its overrides and everything read from them, and every writer escapes
//! them again (defence in depth: a rig built in code, or a file name, never went
//! through the loader).
//!
//! Refused are the control characters (Unicode category Cc: the C0 set, DEL and the C1
//! set, U+0080 to U+009F, with NEL U+0085), the line and paragraph separators U+2028 and
//! U+2029, and the bidirectional embedding, override and isolate controls U+202A to
//! U+202E and U+2066 to U+2069. A NUL ends the YAML reader early, so the rest of a file
//! would be silently ignored; ESC sequences reach a terminal raw; C0 characters make an
//! SVG invalid XML; the separators break a line where none shows; and a bidi override
//! makes a name or a number read differently on screen from what is stored ("trojan
//! source"). A rig file may hold tab, CR and LF; a name or a title holds none of them.
//! The invisible marks (LRM, RLM, ALM, ZWJ, ZWNJ) are kept: right-to-left names need
//! them, and they do not reorder text beyond their neighbours.

use std::borrow::Cow;

/// Whether `c` is never passed through (see the module doc): a control character, a line
/// or paragraph separator, or a bidirectional embedding, override or isolate.
pub fn is_unsafe(c: char) -> bool {
    c.is_control()
        || matches!(c, '\u{2028}' | '\u{2029}' | '\u{202a}'..='\u{202e}' | '\u{2066}'..='\u{2069}')
}

/// Whether `c` may not appear in a rig file's text: [`is_unsafe`] except tab, CR and LF.
pub fn is_unsafe_in_file(c: char) -> bool {
    is_unsafe(c) && !matches!(c, '\t' | '\n' | '\r')
}

/// The character for a message: `control character U+0000 (NUL)`,
/// `formatting character U+202E (right-to-left override)`.
pub fn describe(c: char) -> String {
    let name = match c {
        '\0' => Some("NUL"),
        '\u{7}' => Some("BEL"),
        '\u{8}' => Some("backspace"),
        '\t' => Some("tab"),
        '\n' => Some("line feed"),
        '\r' => Some("carriage return"),
        '\u{c}' => Some("form feed"),
        '\u{1b}' => Some("ESC"),
        '\u{7f}' => Some("DEL"),
        '\u{85}' => Some("next line, NEL"),
        '\u{2028}' => Some("line separator"),
        '\u{2029}' => Some("paragraph separator"),
        '\u{202a}' => Some("left-to-right embedding"),
        '\u{202b}' => Some("right-to-left embedding"),
        '\u{202c}' => Some("pop directional formatting"),
        '\u{202d}' => Some("left-to-right override"),
        '\u{202e}' => Some("right-to-left override"),
        '\u{2066}' => Some("left-to-right isolate"),
        '\u{2067}' => Some("right-to-left isolate"),
        '\u{2068}' => Some("first strong isolate"),
        '\u{2069}' => Some("pop directional isolate"),
        _ => None,
    };
    let class = if c.is_control() {
        "control character"
    } else {
        "formatting character"
    };
    match name {
        Some(name) => format!("{class} U+{:04X} ({name})", c as u32),
        None => format!("{class} U+{:04X}", c as u32),
    }
}

/// `s` with every [`is_unsafe`] character written as a visible escape (`\u{1b}`), for
/// one-line text: names, titles, table cells.
///
/// # Example
/// ```
/// assert_eq!(reeve::text::printable("a\u{1b}[31mb"), "a\\u{1b}[31mb");
/// assert_eq!(reeve::text::printable("head"), "head");
/// ```
pub fn printable(s: &str) -> Cow<'_, str> {
    escape_where(s, is_unsafe)
}

/// Like [`printable`], but line feeds and tabs pass: for text of several lines (a
/// message, a report). A carriage return is escaped (on a terminal it overwrites the
/// line).
pub fn printable_lines(s: &str) -> Cow<'_, str> {
    escape_where(s, |c| is_unsafe(c) && !matches!(c, '\n' | '\t'))
}

fn escape_where(s: &str, unsafe_char: impl Fn(char) -> bool) -> Cow<'_, str> {
    if !s.chars().any(&unsafe_char) {
        return Cow::Borrowed(s);
    }
    let mut out = String::with_capacity(s.len() + 8);
    for c in s.chars() {
        if unsafe_char(c) {
            out.push_str(&format!("\\u{{{:x}}}", c as u32));
        } else {
            out.push(c);
        }
    }
    Cow::Owned(out)
}

/// The first [`is_unsafe_in_file`] characters of `text` with their 1-based line and
/// column (in characters; CRLF, LF and a lone CR each end a line), at most `limit`, and
/// how many more there are.
pub fn unsafe_in_file(text: &str, limit: usize) -> (Vec<(usize, usize, char)>, usize) {
    let mut found = Vec::new();
    let mut more = 0;
    let (mut line, mut column) = (1, 1);
    let mut chars = text.chars().peekable();
    while let Some(c) = chars.next() {
        if is_unsafe_in_file(c) {
            if found.len() < limit {
                found.push((line, column, c));
            } else {
                more += 1;
            }
        }
        let ends_line = c == '\n' || (c == '\r' && chars.peek() != Some(&'\n'));
        if ends_line {
            line += 1;
            column = 1;
        } else {
            column += 1;
        }
    }
    (found, more)
}

/// An error with its causes, `context: cause: cause`, as the binary prints it and as a
/// study writes it into a table note: each `source()` in turn, joined by `: `.
pub fn error_chain(error: &dyn std::error::Error) -> String {
    let mut message = error.to_string();
    let mut cause = error.source();
    while let Some(e) = cause {
        message.push_str(": ");
        message.push_str(&e.to_string());
        cause = e.source();
    }
    message
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_refused_set() {
        for c in [
            '\0', '\u{1b}', '\u{7f}', '\u{85}', '\u{9f}', '\u{2028}', '\u{202e}', '\u{2069}',
        ] {
            assert!(is_unsafe(c) && is_unsafe_in_file(c), "{c:?}");
        }
        for c in ['\t', '\n', '\r'] {
            assert!(is_unsafe(c) && !is_unsafe_in_file(c), "{c:?}");
        }
        for c in ['a', 'é', '°', '→', '\u{200e}', '\u{200d}', '\u{feff}', ' '] {
            assert!(!is_unsafe(c), "{c:?}");
        }
    }

    #[test]
    fn positions_count_characters_and_every_line_end() {
        let (found, more) = unsafe_in_file("a: é\u{0}\r\nb\r\u{1b}\n\u{7f}", 2);
        assert_eq!(found, vec![(1, 5, '\0'), (3, 1, '\u{1b}')]);
        assert_eq!(more, 1);
    }

    #[test]
    fn escapes_are_visible_and_keep_lines_where_asked() {
        assert_eq!(printable("a\nb\u{202e}"), "a\\u{a}b\\u{202e}");
        assert_eq!(printable_lines("a\nb\r\t"), "a\nb\\u{d}\t");
        assert_eq!(describe('\0'), "control character U+0000 (NUL)");
        assert_eq!(
            describe('\u{202e}'),
            "formatting character U+202E (right-to-left override)"
        );
    }
}

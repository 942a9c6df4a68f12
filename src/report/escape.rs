//! Escaping for every output format, in one place, one function per target: XML for
//! SVG, HTML and charts ([`xml`]), CSV ([`csv_field`]), Markdown ([`markdown_cell`]),
//! DXF text ([`dxf_text`]) and terminal text ([`text_line`] for a cell, [`write_printable`] for a document).
//! No writer escapes on its own. Each writer escapes what it writes, even though the
//! loader already refuses control characters in names and titles ([`crate::text`]): a
//! rig built in code, or a file name shown as the source or the title, never went
//! through the loader.

use std::borrow::Cow;
use std::io::{self, Write};

use crate::text::{printable, printable_lines};

/// Text for XML content and attribute values (SVG, HTML): markup characters as entities,
/// and the characters of [`crate::text::is_unsafe`] (which XML 1.0 does not allow even
/// as references) as visible escapes (`\u{1b}`); line feeds and tabs pass.
pub fn xml(s: &str) -> String {
    let s = printable_lines(s);
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}

/// Whether a spreadsheet would read a cell as a formula: it begins with `=` or `@`, or
/// with `+` or `-` and is not a plain number (`-1.5` stays a number, `-cmd` does not).
fn reads_as_formula(s: &str) -> bool {
    s.starts_with(['=', '@']) || (s.starts_with(['+', '-']) && s.parse::<f64>().is_err())
}

/// One line of terminal text (a table cell, header or title): the characters of
/// [`crate::text::is_unsafe`] and line breaks as visible escapes, so a cell stays one
/// line and its width can be measured.
pub fn text_line(s: &str) -> Cow<'_, str> {
    printable(s)
}

/// One CSV field: unsafe characters escaped (one line), a cell a spreadsheet would run
/// as a formula prefixed with `'` (as spreadsheet-safe CSV writers do; the OWASP advice
/// on CSV injection), and quoted where RFC 4180 needs it (comma, quote, line break, or a
/// leading or trailing space), inner quotes doubled.
pub fn csv_field(s: &str) -> String {
    let s = printable(s);
    let s = if reads_as_formula(&s) {
        Cow::Owned(format!("'{s}"))
    } else {
        s
    };
    if s.contains([',', '"', '\n', '\r']) || s.starts_with(' ') || s.ends_with(' ') {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.into_owned()
    }
}

/// One Markdown table cell or heading text: unsafe characters escaped (one line),
/// backslashes and pipes escaped.
pub fn markdown_cell(s: &str) -> String {
    printable(s).replace('\\', "\\\\").replace('|', "\\|")
}

/// One DXF `TEXT` string: unsafe characters escaped (one line), then plain ASCII only,
/// which every CAD program reads whatever its code page: each other character of the
/// Basic Multilingual Plane as `\U+XXXX` (the escape AutoCAD and the programs that read
/// its files decode), one beyond it as `?`; a backslash as `\U+005C` and a `%` that
/// starts `%%` as `%%%` (both would otherwise start a control code).
pub fn dxf_text(s: &str) -> String {
    let s = printable(s);
    let mut out = String::with_capacity(s.len());
    let mut chars = s.chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '%' if chars.peek() == Some(&'%') => out.push_str("%%%"),
            '\\' => out.push_str("\\U+005C"),
            ' '..='~' => out.push(c),
            c if (c as u32) <= 0xFFFF => out.push_str(&format!("\\U+{:04X}", c as u32)),
            _ => out.push('?'),
        }
    }
    out
}

/// Runs a text writer into a buffer and writes the result with the characters of
/// [`crate::text::is_unsafe`] escaped (line feeds and tabs pass), so that no name, title
/// or file name reaches a terminal raw.
///
/// # Errors
/// The writer's error, or the error writing to `w`.
pub fn write_printable(
    w: &mut dyn Write,
    write: impl FnOnce(&mut dyn Write) -> io::Result<()>,
) -> io::Result<()> {
    let mut buffer = Vec::new();
    write(&mut buffer)?;
    let text = String::from_utf8_lossy(&buffer);
    w.write_all(printable_lines(&text).as_bytes())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn xml_is_well_formed_for_any_name() {
        assert_eq!(xml("a<b & \"c\"'"), "a&lt;b &amp; &quot;c&quot;&#39;");
        assert_eq!(xml("x\u{0}\u{1b}y"), "x\\u{0}\\u{1b}y");
    }

    #[test]
    fn csv_quotes_only_where_needed_and_disarms_formulas() {
        assert_eq!(csv_field("fall"), "fall");
        assert_eq!(csv_field("a, b"), "\"a, b\"");
        assert_eq!(csv_field("say \"hi\""), "\"say \"\"hi\"\"\"");
        assert_eq!(csv_field(" lead"), "\" lead\"");
        assert_eq!(csv_field("=1+2"), "'=1+2");
        assert_eq!(csv_field("@SUM(A1)"), "'@SUM(A1)");
        assert_eq!(csv_field("-cmd"), "'-cmd");
        assert_eq!(csv_field("+a,b"), "\"'+a,b\"");
        assert_eq!(csv_field("-1.5"), "-1.5");
        assert_eq!(csv_field("+2e3"), "+2e3");
        assert_eq!(csv_field("a\u{1b}"), "a\\u{1b}");
    }

    #[test]
    fn dxf_text_is_ascii_without_control_codes() {
        assert_eq!(dxf_text("hand → lid"), "hand \\U+2192 lid");
        assert_eq!(dxf_text("50 %% off, 5 %"), "50 %%%% off, 5 %");
        assert_eq!(dxf_text("a\\b"), "a\\U+005Cb");
        assert_eq!(dxf_text("x\u{1b}"), "x\\U+005Cu{1b}");
        assert_eq!(dxf_text("🪢"), "?");
    }

    #[test]
    fn text_keeps_lines_and_escapes_the_rest() {
        let mut out = Vec::new();
        write_printable(&mut out, |w| w.write_all("a\u{1b}\nb\r".as_bytes())).unwrap();
        assert_eq!(String::from_utf8(out).unwrap(), "a\\u{1b}\nb\\u{d}");
    }
}

//! Control characters in the file and in overrides.

use super::*;

/// Guards the file check: a NUL in a comment once ended the YAML reader there and the
/// rest of the file (here its `limits`) was silently ignored.
#[test]
fn control_characters_in_the_file_are_refused_with_line_and_column() {
    let text = with(
        "solve_for: hand ",
        "# a comment with a \u{0} in it\nsolve_for: hand ",
    ) + "limits: {design_factor: 50}\n";
    let e = fails(&text);
    assert_problem(&e, 19, &["19:20", "U+0000", "NUL"]);
    // Every other control character but tab, CR and LF, the C1 controls and the Unicode
    // line separators and bidirectional overrides too, wherever they are written.
    for (c, line) in [
        ('\u{1b}', 2),
        ('\u{7f}', 9),
        ('\u{85}', 12),
        ('\u{2028}', 17),
        ('\u{202e}', 18),
        ('\u{2066}', 1),
    ] {
        let text = match line {
            2 => with("workshop hatch", &format!("workshop{c} hatch")),
            9 => with("eye:    {", &format!("eye:    {{  # {c}\n    ")),
            12 => with("hook:   {", &format!("hook{c}:   {{")),
            17 => with("fall: {rope", &format!("fall: {{rope{c}")),
            18 => with(
                "# the part whose forward",
                &format!("# the {c}part whose forward"),
            ),
            _ => format!("{c}{EXAMPLE}"),
        };
        let e = fails(&text);
        let code = format!("U+{:04X}", c as u32);
        assert_problem(&e, line, &[code.as_str(), "only tab"]);
    }
    // Tabs in comments and between values, and CRLF line ends, are fine.
    let tabbed = with(
        "# defaults for bare numbers",
        "#\tdefaults\tfor bare numbers",
    )
    .replace("mu: 0.2, min_bend_ratio", "mu: 0.2,\tmin_bend_ratio")
    .replace('\n', "\r\n");
    load_str(&tabbed, "rig.yaml").unwrap();
}

/// Guards escaped text: a control character written as a YAML escape (`"\e"`, `"\0"`)
/// in quoted text is refused like a raw one; a title or name is one line.
#[test]
fn control_characters_written_as_escapes_are_refused() {
    let e = fails(&with(
        "title: Two-part hoist for a workshop hatch",
        "title: \"Two-part \\e[31mhoist\"",
    ));
    assert_problem(&e, 2, &["title", "U+001B"]);
    let e = fails(&with(
        "hook:   {kind: block",
        "\"ho\\u202Eok\":   {kind: block",
    ));
    assert_problem(&e, 12, &["U+202E"]);
    let e = fails(&with(
        "braid6: {diameter: 6,",
        "braid6: {diameter: \"6\\0 mm\",",
    ));
    assert_problem(&e, 7, &["U+0000"]);
    let e = fails(&with(
        "title: Two-part hoist for a workshop hatch",
        "title: \"Two-part\\nhoist\"",
    ));
    assert_problem(&e, 2, &["title", "one line"]);
}

/// Guards the other ways text enters: `--set` values get the same check as the file.
#[test]
fn control_characters_in_overrides_are_refused() {
    for (key, value) in [
        ("parts.head.bearing.mu", "0.1\u{0}"),
        ("parts.hook.load.mass", "40\u{1b}[2J kg"),
        ("title", "new \u{202e}title"),
    ] {
        let e = load_str_with(EXAMPLE, "rig.yaml", &set(&[(key, value)])).unwrap_err();
        let shown = e.to_string();
        assert!(
            shown.contains("control character") || shown.contains("U+202E"),
            "{shown}"
        );
        assert!(shown.contains(key), "{shown}");
    }
}

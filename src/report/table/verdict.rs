//! The line a human-readable table ends with where `check` fails the rig.

use crate::report::Report;

/// `Checks that fail on this rig: slack-span (2), safety-factor; ...`, where any does:
/// a table must not read clean where `check` fails the rig (a slack span's negative
/// tension, a rope below its design factor). None where every check passes.
pub(super) fn failing_checks(report: &Report) -> Option<String> {
    let mut codes: Vec<(&str, usize)> = Vec::new();
    for w in report.warnings.iter().filter(|w| w.fails) {
        match codes.iter_mut().find(|(c, _)| *c == w.code) {
            Some((_, n)) => *n += 1,
            None => codes.push((w.code, 1)),
        }
    }
    if codes.is_empty() {
        return None;
    }
    let list: Vec<String> = codes
        .iter()
        .map(|&(c, n)| {
            if n > 1 {
                format!("{c} ({n})")
            } else {
                c.to_string()
            }
        })
        .collect();
    let slack = if codes.iter().any(|&(c, _)| c == "slack-span") {
        "; where a span would need a negative tension the rope goes slack and its figures do not hold"
    } else {
        ""
    };
    Some(format!(
        "Checks that fail on this rig: {}; `reeve check` gives the reasons{slack}.",
        list.join(", ")
    ))
}

//! Random edits of the example never panic.

use super::*;

/// One random edit of the example text.
fn mutate(text: &str, edits: &[(usize, u8, u8)]) -> String {
    let mut bytes = text.as_bytes().to_vec();
    const ALPHABET: &[u8] = b" \n\t:-,[]{}#&*!|>'\"?%@`0123456789.eE+~abcxyz\xef\xbb\xbf";
    for &(pos, op, ch) in edits {
        if bytes.is_empty() {
            break;
        }
        let at = pos % bytes.len();
        let c = ALPHABET[ch as usize % ALPHABET.len()];
        match op % 4 {
            0 => {
                bytes.remove(at);
            }
            1 => bytes.insert(at, c),
            2 => bytes[at] = c,
            _ => {
                // Duplicate a run of text (repeats keys and lines).
                let end = (at + ch as usize).min(bytes.len());
                let run = bytes[at..end].to_vec();
                bytes.splice(at..at, run);
            }
        }
    }
    String::from_utf8_lossy(&bytes).into_owned()
}

/// The example with some words (runs of letters, digits, dots and signs) replaced by
/// tokens that exercise the checks rather than the YAML syntax.
fn substitute(text: &str, edits: &[(usize, u8)]) -> String {
    const TOKENS: &[&str] = &[
        ".nan",
        "-.inf",
        "-1",
        "0",
        "1e400",
        "[]",
        "{}",
        "~",
        "[0, 0, 0]",
        "\"6 furlong\"",
        "hook",
        "head",
        "hook.a",
        "hand",
        "eye",
        "guide",
        "drum",
        "weight",
        "none",
        "rated",
        "\"12 lbf\"",
        "\"2.5 in\"",
        "{kind: none}",
        "{part: head, turns: 2, side: left}",
        "[1, 2, 3]",
        "yes",
        "on",
        "&a x",
        "*a",
        "!!str 5",
        "\"40 kg\"",
        "efficiency",
    ];
    let mut words: Vec<(usize, usize)> = Vec::new();
    let bytes = text.as_bytes();
    let mut i = 0;
    while i < bytes.len() {
        let is_word = |b: u8| b.is_ascii_alphanumeric() || matches!(b, b'.' | b'_' | b'-' | b'*');
        if is_word(bytes[i]) {
            let start = i;
            while i < bytes.len() && is_word(bytes[i]) {
                i += 1;
            }
            words.push((start, i));
        } else {
            i += 1;
        }
    }
    let mut chosen: Vec<(usize, usize, &str)> = edits
        .iter()
        .map(|&(w, t)| {
            let (a, b) = words[w % words.len()];
            (a, b, TOKENS[t as usize % TOKENS.len()])
        })
        .collect();
    chosen.sort_by_key(|c| std::cmp::Reverse(c.0));
    chosen.dedup_by_key(|c| c.0);
    let mut out = text.to_string();
    for (a, b, token) in chosen {
        out.replace_range(a..b, token);
    }
    out
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 600, ..ProptestConfig::default() })]

    /// Substituted values never panic, and a rig that loads holds only finite numbers.
    #[test]
    fn random_substitutions_never_panic(edits in prop::collection::vec((0usize..400, any::<u8>()), 1..6)) {
        let text = substitute(EXAMPLE, &edits);
        match load_str(&text, "rig.yaml") {
            Ok(rig) => {
                for p in &rig.parts {
                    prop_assert!(p.at.coords.iter().all(|c| c.is_finite()), "{text}");
                }
                prop_assert!(rig.ropes.iter().all(|r| r.diameter > 0.0 && r.mu.is_finite()));
            }
            Err(e) => prop_assert!(!e.problems.is_empty()),
        }
    }

    /// Loading never panics and never returns an error without a problem.
    #[test]
    fn random_mutations_never_panic(edits in prop::collection::vec((0usize..2000, any::<u8>(), any::<u8>()), 1..8)) {
        let text = mutate(EXAMPLE, &edits);
        match load_str(&text, "rig.yaml") {
            Ok(rig) => {
                for p in &rig.parts {
                    prop_assert!(p.at.coords.iter().all(|c| c.is_finite()));
                }
            }
            Err(e) => {
                prop_assert!(!e.problems.is_empty());
                for p in &e.problems {
                    prop_assert!(!p.message.is_empty());
                }
            }
        }
    }
}

//! Golden files (`tests/golden/`): an output compared with the file that holds what it
//! was when someone last read and accepted it. `REEVE_BLESS=1` (and only that) rewrites
//! the files instead; then read `git diff tests/golden` before committing.

use std::path::Path;

use super::ROOT;

/// Compares `actual` with `tests/golden/NAME`, or writes it there when `REEVE_BLESS=1`.
/// A mismatch fails with a line diff: `-` the golden line, `+` the new one, each with
/// its line numbers in the golden file and in the new output.
#[track_caller]
pub fn golden(name: &str, actual: &str) {
    let path = Path::new(ROOT).join("tests/golden").join(name);
    if std::env::var("REEVE_BLESS").as_deref() == Ok("1") {
        std::fs::create_dir_all(path.parent().unwrap()).unwrap();
        std::fs::write(&path, actual).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        return;
    }
    let expected = std::fs::read_to_string(&path).unwrap_or_else(|_| {
        panic!(
            "golden file {} is missing; run `REEVE_BLESS=1 cargo test --test it golden` to \
             write it, then read it",
            path.display()
        )
    });
    if expected != actual {
        let diff = diff(&expected, actual);
        let diff = if diff.is_empty() {
            "(the lines are the same: only line endings or the final newline differ)\n".into()
        } else {
            diff
        };
        panic!(
            "{name} differs from its golden file (- golden, + now; line numbers golden, \
             now); if the change is meant, rerun with REEVE_BLESS=1 and read the diff:\n{diff}"
        );
    }
}

/// A line diff (longest common subsequence) with two lines of context around each
/// change and `…` between separate changes; empty when the lines are equal.
pub fn diff(expected: &str, actual: &str) -> String {
    let a: Vec<&str> = expected.lines().collect();
    let b: Vec<&str> = actual.lines().collect();
    let (n, m) = (a.len(), b.len());
    let mut lcs = vec![vec![0usize; m + 1]; n + 1];
    for i in (0..n).rev() {
        for j in (0..m).rev() {
            lcs[i][j] = if a[i] == b[j] {
                lcs[i + 1][j + 1] + 1
            } else {
                lcs[i + 1][j].max(lcs[i][j + 1])
            };
        }
    }
    // (op, text, line in the golden file, line in the new output), 1-based.
    let mut ops: Vec<(char, &str, Option<usize>, Option<usize>)> = Vec::new();
    let (mut i, mut j) = (0, 0);
    while i < n || j < m {
        if i < n && j < m && a[i] == b[j] {
            ops.push((' ', a[i], Some(i + 1), Some(j + 1)));
            i += 1;
            j += 1;
        } else if i < n && (j == m || lcs[i + 1][j] >= lcs[i][j + 1]) {
            ops.push(('-', a[i], Some(i + 1), None));
            i += 1;
        } else {
            ops.push(('+', b[j], None, Some(j + 1)));
            j += 1;
        }
    }
    let changed: Vec<usize> = (0..ops.len()).filter(|&k| ops[k].0 != ' ').collect();
    let number = |l: Option<usize>| l.map_or(String::new(), |l| l.to_string());
    let mut out = String::new();
    let mut last_shown = None;
    for (k, (op, text, old, new)) in ops.iter().enumerate() {
        if changed.iter().any(|&c| c.abs_diff(k) <= 2) {
            if last_shown.is_some_and(|l| l + 1 < k) {
                out.push_str("…\n");
            }
            out.push_str(&format!(
                "{op} {:>4} {:>4} | {text}\n",
                number(*old),
                number(*new)
            ));
            last_shown = Some(k);
        }
    }
    out
}

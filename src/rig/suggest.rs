//! "Did you mean" suggestions for misspelt keys, kinds and names, by edit distance.

/// Optimal-string-alignment distance (Levenshtein plus adjacent transpositions), counted
/// in characters.
pub fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let width = b.len() + 1;
    let mut d = vec![0usize; (a.len() + 1) * width];
    for i in 0..=a.len() {
        d[i * width] = i;
    }
    for (j, cell) in d.iter_mut().enumerate().take(width) {
        *cell = j;
    }
    for i in 1..=a.len() {
        for j in 1..=b.len() {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut best = (d[(i - 1) * width + j] + 1)
                .min(d[i * width + j - 1] + 1)
                .min(d[(i - 1) * width + j - 1] + cost);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                best = best.min(d[(i - 2) * width + j - 2] + 1);
            }
            d[i * width + j] = best;
        }
    }
    d[a.len() * width + b.len()]
}

/// The candidate closest to `word`, when it is close enough to be a likely misspelling
/// (case differences are free; at most 1 edit for words up to 3 characters, 2 up to 6,
/// else 3). Long inputs are not compared (the cost is quadratic).
pub fn closest<'a, I>(word: &str, candidates: I) -> Option<&'a str>
where
    I: IntoIterator<Item = &'a str>,
{
    if word.len() > 200 {
        return None;
    }
    let lower = word.to_lowercase();
    let limit = match word.chars().count() {
        0..=3 => 1,
        4..=6 => 2,
        _ => 3,
    };
    let length = lower.chars().count();
    candidates
        .into_iter()
        .filter(|c| c.len() <= 200 && c.chars().count().abs_diff(length) <= limit)
        .map(|c| (edit_distance(&lower, &c.to_lowercase()), c))
        .filter(|&(d, _)| d <= limit)
        .min_by_key(|&(d, _)| d)
        .map(|(_, c)| c)
}

/// `"; did you mean `x`?"` when a close candidate exists, else an empty string.
pub fn did_you_mean<'a, I>(word: &str, candidates: I) -> String
where
    I: IntoIterator<Item = &'a str>,
{
    match closest(word, candidates) {
        Some(c) => format!("; did you mean `{c}`?"),
        None => String::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn distances() {
        assert_eq!(edit_distance("head", "head"), 0);
        assert_eq!(edit_distance("hed", "head"), 1);
        assert_eq!(edit_distance("lenght", "length"), 1);
        assert_eq!(edit_distance("", "abc"), 3);
    }

    #[test]
    fn suggestions() {
        let keys = ["diameter", "axle", "bearing", "mass"];
        assert_eq!(closest("diamter", keys), Some("diameter"));
        assert_eq!(closest("Axle", keys), Some("axle"));
        assert_eq!(closest("colour", keys), None);
        assert_eq!(did_you_mean("bearng", keys), "; did you mean `bearing`?");
    }
}

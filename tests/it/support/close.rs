//! Closeness of a measured number to an expected one, with the tolerance explicit and
//! both numbers in the message, on `approx`: relative checks are `relative_eq!` (the
//! difference against the larger magnitude, no absolute floor), absolute ones
//! `abs_diff_eq!`. One argument order everywhere: what, measured, expected, tolerance.

use approx::{abs_diff_eq, relative_eq};

/// Asserts `|measured − expected| ≤ max_relative · max(|measured|, |expected|)`.
#[track_caller]
pub fn assert_rel(what: &str, measured: f64, expected: f64, max_relative: f64) {
    let close = relative_eq!(
        measured,
        expected,
        epsilon = 0.0,
        max_relative = max_relative
    );
    let error = (measured - expected).abs() / measured.abs().max(expected.abs());
    assert!(
        close,
        "{what}: measured {measured}, expected {expected} \
         (relative error {error:.3e} > {max_relative:.1e})"
    );
}

/// Asserts `|measured − expected| ≤ epsilon`.
#[track_caller]
pub fn assert_abs(what: &str, measured: f64, expected: f64, epsilon: f64) {
    let close = abs_diff_eq!(measured, expected, epsilon = epsilon);
    assert!(
        close,
        "{what}: measured {measured}, expected {expected} ± {epsilon} \
         (off by {:.3e})",
        (measured - expected).abs()
    );
}

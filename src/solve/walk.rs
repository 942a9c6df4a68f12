//! Determinate systems solved by substitution, one unknown at a time, as a hand
//! calculation walks a rig: the weight's equation gives the tension of its line, the
//! block below gives the next line's, and so on to the drive.
//!
//! A line of passages in series, a cascade of movable pulleys, any rig whose equations
//! can be ordered so that each brings in exactly one new unknown, is triangular after
//! reordering. Substitution then gives every unknown with the relative precision of
//! its own equation, however many orders of magnitude the unknowns span (a capstan
//! chain's back value `W·e^(−μΣφ)`, a cascade's `W/2^N`), where a dense factorization
//! of the whole system loses everything below round-off of its largest entry. The
//! dense solve is kept for what is really coupled or indeterminate: a system that
//! substitution cannot order, with equations left over, or with a pivot too small to
//! trust ([`substitute`] answers `None`, and the caller falls back to it).

use nalgebra::DMatrix;

use crate::math::Real;

/// A quantity that substitution found to lie outside what an `f64` holds: its exact
/// value is not zero, but it is below the smallest normal double (`2.2e-308`, where
/// precision starts to go) or above the largest. No solver in double precision can
/// give it, so the rig is refused rather than answered wrongly.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct BeyondPrecision {
    /// The equation that gave it.
    pub row: usize,
    /// The unknown.
    pub col: usize,
}

/// Solves `a x = b` by substitution where the sparsity pattern of `a` allows it.
///
/// # Method
/// An equation with exactly one unknown not yet found (entries that are exactly zero
/// do not count: the pattern is the rig's topology) gives that unknown,
/// `x_p = (b_r − Σ_{j≠p} a_rj x_j) / a_rp`; every equation it appears in then has one
/// unknown fewer. With a queue of equations down to one unknown this costs one pass
/// over the nonzero entries. `known[j]` fixes unknowns beforehand (the drive's unit
/// speed); `significant(r, p)` decides whether `a_rp` may serve as a pivot (the caller
/// applies the rank threshold of the dense solve it replaces).
///
/// # Returns
/// - `Ok(Some(x))` when every unknown was found and every equation used (a square,
///   nonsingular, triangular system after reordering: its one solution);
/// - `Ok(None)` when the system is coupled (no equation with a single unknown left),
///   has equations left over, or a pivot is not significant: solve it densely;
/// - `Err(BeyondPrecision)` when a nonzero term or unknown underflows below the
///   smallest normal `f64` or overflows.
pub fn substitute(
    a: &DMatrix<Real>,
    b: &[Real],
    known: &[Option<Real>],
    significant: impl Fn(usize, usize) -> bool,
) -> Result<Option<Vec<Real>>, BeyondPrecision> {
    let (n, m) = a.shape();
    let rows: Vec<Vec<(usize, Real)>> = (0..n)
        .map(|r| {
            (0..m)
                .filter(|&j| a[(r, j)] != 0.0)
                .map(|j| (j, a[(r, j)]))
                .collect()
        })
        .collect();
    substitute_rows(&rows, m, b, known, significant)
}

/// [`substitute`] on a sparse matrix of `m` columns given by its rows: `rows[r]` holds
/// the nonzero entries `(column, value)` of equation `r`, in column order. The cost is
/// one pass over the nonzero entries, however large the system.
///
/// # Returns
/// As [`substitute`], to the bit.
///
/// # Errors
/// As [`substitute`].
pub fn substitute_rows(
    rows: &[Vec<(usize, Real)>],
    m: usize,
    b: &[Real],
    known: &[Option<Real>],
    significant: impl Fn(usize, usize) -> bool,
) -> Result<Option<Vec<Real>>, BeyondPrecision> {
    let n = rows.len();
    debug_assert_eq!(b.len(), n);
    debug_assert_eq!(known.len(), m);
    let mut x: Vec<Real> = known.iter().map(|k| k.unwrap_or(0.0)).collect();
    let mut found: Vec<bool> = known.iter().map(Option::is_some).collect();
    let open = found.iter().filter(|f| !**f).count();
    // Leftover equations mean redundancy (or an inconsistency) that the dense solve
    // decides; substitution answers only a square system.
    if open != n {
        return Ok(None);
    }
    let mut rows_of: Vec<Vec<usize>> = vec![Vec::new(); m];
    let mut unknowns = vec![0usize; n];
    for (r, row) in rows.iter().enumerate() {
        for &(j, v) in row {
            if v != 0.0 {
                rows_of[j].push(r);
                if !found[j] {
                    unknowns[r] += 1;
                }
            }
        }
    }
    let mut used = vec![false; n];
    let mut queue: Vec<usize> = (0..n).filter(|&r| unknowns[r] == 1).collect();
    let mut solved = 0;
    while let Some(r) = queue.pop() {
        if used[r] || unknowns[r] != 1 {
            continue;
        }
        let Some(&(p, pivot)) = rows[r].iter().find(|&&(j, v)| !found[j] && v != 0.0) else {
            continue;
        };
        if !significant(r, p) {
            return Ok(None);
        }
        let mut rest = b[r];
        for &(j, coef) in &rows[r] {
            let value = x[j];
            if j == p || coef == 0.0 || value == 0.0 {
                continue;
            }
            let term = coef * value;
            if !term.is_normal() {
                return Err(BeyondPrecision { row: r, col: j });
            }
            rest -= term;
        }
        let value = rest / pivot;
        if rest != 0.0 && !value.is_normal() {
            return Err(BeyondPrecision { row: r, col: p });
        }
        x[p] = value;
        found[p] = true;
        used[r] = true;
        solved += 1;
        for &q in &rows_of[p] {
            unknowns[q] -= 1;
            if unknowns[q] == 1 && !used[q] {
                queue.push(q);
            }
        }
    }
    Ok((solved == open).then_some(x))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// `n` equations x_i − 2 x_{i+1} = 0 over `n + 1` unknowns, x_0 = 1 known.
    fn halvings(n: usize) -> (DMatrix<Real>, Vec<Option<Real>>) {
        let mut a = DMatrix::zeros(n, n + 1);
        for i in 0..n {
            a[(i, i)] = 1.0;
            a[(i, i + 1)] = -2.0;
        }
        let mut known = vec![None; n + 1];
        known[0] = Some(1.0);
        (a, known)
    }

    #[test]
    fn a_chain_of_halvings_keeps_every_digit() {
        // x_0 = 1 known; x_i − 2 x_{i+1} = 0: x_i = 2^-i, exactly, to 2^-1000.
        let n = 1000;
        let (a, known) = halvings(n);
        let x = substitute(&a, &vec![0.0; n], &known, |_, _| true)
            .unwrap()
            .unwrap();
        assert_eq!(x[n], 2f64.powi(-(n as i32)));
    }

    #[test]
    fn below_the_smallest_double_is_refused() {
        let n = 1100;
        let (a, known) = halvings(n);
        let e = substitute(&a, &vec![0.0; n], &known, |_, _| true).unwrap_err();
        assert_eq!(e.col, 1022 + 1);
    }

    #[test]
    fn coupled_leftover_and_insignificant_systems_go_to_the_dense_solve() {
        let coupled = DMatrix::from_row_slice(2, 2, &[1.0, 1.0, 1.0, -1.0]);
        assert_eq!(
            substitute(&coupled, &[1.0, 0.0], &[None, None], |_, _| true),
            Ok(None)
        );
        let tall = DMatrix::from_row_slice(2, 1, &[1.0, 2.0]);
        assert_eq!(
            substitute(&tall, &[1.0, 2.0], &[None], |_, _| true),
            Ok(None)
        );
        let diag = DMatrix::from_row_slice(2, 2, &[1.0, 0.0, 0.0, 1e-20]);
        assert_eq!(
            substitute(&diag, &[1.0, 1.0], &[None, None], |r, _| r == 0),
            Ok(None)
        );
        // A zero right-hand side gives an exact zero, not an underflow.
        let zero = DMatrix::from_row_slice(1, 1, &[3.0]);
        assert_eq!(
            substitute(&zero, &[0.0], &[None], |_, _| true),
            Ok(Some(vec![0.0]))
        );
    }
}

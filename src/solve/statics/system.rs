//! The linear algebra of one case's system of equilibria: the column norms that
//! equilibrate it (to the bit as nalgebra computes them, from the sparse rows the walk
//! uses) and the dense SVD solve for what the walk cannot order.

use super::*;

/// The column norms of a sparse matrix of `n` rows and `m` columns given by its rows,
/// to the bit as nalgebra's `column(j).norm()` of the dense matrix: its dot product
/// keeps eight running sums over the rows in blocks of eight (row `r` in sum `r % 8`),
/// adds them in pairs (0 + 4, 1 + 5, 2 + 6, 3 + 7), then the rows past the last block
/// one by one; the zeros left out add nothing to sums of squares. A zero or
/// non-finite norm is 1 (the column is left unscaled).
pub(super) fn sparse_column_norms(rows: &[Vec<(usize, Real)>], n: usize, m: usize) -> Vec<Real> {
    let body = n - n % 8;
    let mut lanes = vec![[0.0; 8]; m];
    let mut tail: Vec<Vec<Real>> = vec![Vec::new(); m];
    for (r, row) in rows.iter().enumerate() {
        for &(j, v) in row {
            if r < body {
                lanes[j][r % 8] += v * v;
            } else {
                tail[j].push(v * v);
            }
        }
    }
    lanes
        .iter()
        .zip(&tail)
        .map(|(acc, tail)| {
            let mut dot = 0.0;
            dot += acc[0] + acc[4];
            dot += acc[1] + acc[5];
            dot += acc[2] + acc[6];
            dot += acc[3] + acc[7];
            for t in tail {
                dot += t;
            }
            let norm: Real = (0.0 + dot).sqrt();
            if norm > 0.0 && norm.is_finite() {
                norm
            } else {
                1.0
            }
        })
        .collect()
}

/// The column norms of a dense matrix, a zero or non-finite norm taken as 1.
pub(super) fn dense_column_norms(mat: &DMatrix<Real>) -> Vec<Real> {
    (0..mat.ncols())
        .map(|j| {
            let n = mat.column(j).norm();
            if n > 0.0 && n.is_finite() {
                n
            } else {
                1.0
            }
        })
        .collect()
}

impl Problem<'_> {
    /// The equilibrated least-squares solve of `mat x = rhs` by SVD, and the rank it
    /// finds: for systems the walk cannot order (lines sharing a block, coupled
    /// drums).
    pub(super) fn dense_solve(
        &self,
        mat: &DMatrix<Real>,
        rhs: &DVector<Real>,
        column_norms: &[Real],
        options: &SolveOptions,
    ) -> (DVector<Real>, usize) {
        let (n, m) = mat.shape();
        let mut scaled = mat.clone();
        for (j, n) in column_norms.iter().enumerate() {
            scaled.column_mut(j).unscale_mut(*n);
        }
        // Then the rows (equations), which leaves the solutions of a consistent
        // system unchanged.
        let mut scaled_rhs = rhs.clone();
        for i in 0..n {
            let r = scaled.row(i).amax();
            if r > 0.0 && r.is_finite() {
                scaled.row_mut(i).unscale_mut(r);
                scaled_rhs[i] /= r;
            }
        }
        let scale = scaled.amax().max(1e-300);
        let svd = scaled.svd(true, true);
        let rank = svd.rank(options.rank_tolerance * scale);
        let mut solution = svd
            .solve(&scaled_rhs, options.rank_tolerance * scale)
            .unwrap_or_else(|_| DVector::zeros(m));
        for (j, n) in column_norms.iter().enumerate() {
            solution[j] /= n;
        }
        (solution, rank)
    }
}

//! Eigenvalues of a symmetric tridiagonal matrix and the last component of each eigenvector, by
//! the implicit QL algorithm with Wilkinson-type shifts (Bowdler, Martin, Reinsch & Wilkinson,
//! "The QR and QL algorithms for symmetric matrices", Numer. Math. 11 (1968) 293–306), tracking
//! one row of the accumulated rotations only: `O(j²)` instead of `O(j³)`. This is what the
//! Lanczos convergence test needs (the residual of Ritz pair `i` is `|beta_j s_ji|`).

/// Eigenvalues of the tridiagonal matrix with diagonal `diag` and off-diagonal `off`
/// (`off[i]` joins `i` and `i + 1`), with the last component of each unit eigenvector; `None`
/// when the iteration does not settle (30 sweeps per eigenvalue).
pub(crate) fn eigen_last_row(diag: &[f64], off: &[f64]) -> Option<(Vec<f64>, Vec<f64>)> {
    let n = diag.len();
    let mut d = diag.to_vec();
    let mut e = vec![0.0; n];
    e[..n - 1].copy_from_slice(&off[..n - 1]);
    let mut z = vec![0.0; n];
    z[n - 1] = 1.0;
    for l in 0..n {
        let mut iterations = 0;
        loop {
            let mut m = l;
            while m + 1 < n {
                let dd = d[m].abs() + d[m + 1].abs();
                if e[m].abs() <= f64::EPSILON * dd {
                    break;
                }
                m += 1;
            }
            if m == l {
                break;
            }
            iterations += 1;
            if iterations > 30 {
                return None;
            }
            let mut g = (d[l + 1] - d[l]) / (2.0 * e[l]);
            let mut r = (g * g + 1.0).sqrt();
            g = d[m] - d[l] + e[l] / (g + r.copysign(g));
            let (mut s, mut c, mut p) = (1.0, 1.0, 0.0);
            let mut underflow = false;
            for i in (l..m).rev() {
                let f = s * e[i];
                let b = c * e[i];
                r = (f * f + g * g).sqrt();
                e[i + 1] = r;
                if r == 0.0 {
                    d[i + 1] -= p;
                    e[m] = 0.0;
                    underflow = true;
                    break;
                }
                s = f / r;
                c = g / r;
                g = d[i + 1] - p;
                r = (d[i] - g) * s + 2.0 * c * b;
                p = s * r;
                d[i + 1] = g + p;
                g = c * r - b;
                let zf = z[i + 1];
                z[i + 1] = s * z[i] + c * zf;
                z[i] = c * z[i] - s * zf;
            }
            if underflow {
                continue;
            }
            d[l] -= p;
            e[l] = g;
            e[m] = 0.0;
        }
    }
    Some((d, z))
}

#[cfg(test)]
mod tests {
    use super::*;
    use nalgebra::{DMatrix, SymmetricEigen};

    #[test]
    fn agrees_with_nalgebra_symmetric_eigen() {
        // Reference: nalgebra's dense SymmetricEigen of the same matrix, including a matrix
        // with a repeated eigenvalue (a zero off-diagonal splits it in two equal blocks).
        let cases: Vec<(Vec<f64>, Vec<f64>)> = vec![
            (
                (0..17).map(|i| 1.0 + (i as f64 * 0.7).sin()).collect(),
                (0..16).map(|i| 0.3 + 0.1 * (i % 4) as f64).collect(),
            ),
            (vec![2.0, 1.0, 2.0, 1.0], vec![0.5, 0.0, 0.5]),
            (vec![4.0], vec![]),
        ];
        for (diag, off) in cases {
            let n = diag.len();
            let (vals, last) = eigen_last_row(&diag, &off).unwrap();
            let t = DMatrix::from_fn(n, n, |r, c| match r.abs_diff(c) {
                0 => diag[r],
                1 => off[r.min(c)],
                _ => 0.0,
            });
            let eig = SymmetricEigen::new(t);
            let mut ours: Vec<(f64, f64)> =
                vals.iter().copied().zip(last.iter().map(|v| v.abs())).collect();
            let mut theirs: Vec<(f64, f64)> =
                (0..n).map(|i| (eig.eigenvalues[i], eig.eigenvectors[(n - 1, i)].abs())).collect();
            ours.sort_by(|a, b| a.0.total_cmp(&b.0));
            theirs.sort_by(|a, b| a.0.total_cmp(&b.0));
            for (a, b) in ours.iter().zip(&theirs) {
                assert!((a.0 - b.0).abs() < 1e-13, "{a:?} vs {b:?}");
            }
            // The last components are unique only for distinct eigenvalues: compare their sum
            // of squares (always 1) and, for the distinct case, each one.
            let total: f64 = last.iter().map(|v| v * v).sum();
            assert!((total - 1.0).abs() < 1e-13);
            if n == 17 {
                for (a, b) in ours.iter().zip(&theirs) {
                    assert!((a.1 - b.1).abs() < 1e-10, "{a:?} vs {b:?}");
                }
            }
        }
    }
}

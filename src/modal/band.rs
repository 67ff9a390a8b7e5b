//! Symmetric band matrices: storage, products, Cholesky and LDLᵀ factorisations in band form.
//!
//! A beam model numbered node by node couples each degree of freedom only with its neighbours
//! within one element, so its stiffness and mass matrices are banded: entry `(i, j)` is zero when
//! `|i - j| > b`, the half-bandwidth. Only the lower band is stored, row by row. Factorisations
//! keep the band (no fill outside it), costing `O(n b²)` instead of `O(n³)` (Golub & Van Loan,
//! *Matrix Computations*, 4th ed., 2013, §4.3, band Cholesky).

use nalgebra::DMatrix;
use nalgebra_sparse::{CooMatrix, CscMatrix};

/// A real symmetric matrix of dimension `n` with half-bandwidth `b`, lower band stored by rows.
#[derive(Debug, Clone, PartialEq)]
pub struct BandMatrix {
    n: usize,
    b: usize,
    /// Row `i` holds entries `(i, i - b) ..= (i, i)` at `i * (b + 1) + (j + b - i)`.
    data: Vec<f64>,
}

impl BandMatrix {
    /// A zero matrix of dimension `n` and half-bandwidth `b`.
    pub fn zeros(n: usize, b: usize) -> Self {
        BandMatrix { n, b, data: vec![0.0; n * (b + 1)] }
    }

    /// Dimension.
    pub fn dim(&self) -> usize {
        self.n
    }

    /// Half-bandwidth: entries with `|i - j| > b` are zero.
    pub fn half_bandwidth(&self) -> usize {
        self.b
    }

    #[inline]
    fn slot(&self, i: usize, j: usize) -> Option<usize> {
        let (i, j) = if i >= j { (i, j) } else { (j, i) };
        (i - j <= self.b).then(|| i * (self.b + 1) + (j + self.b - i))
    }

    /// Entry `(i, j)`; zero outside the band.
    #[track_caller]
    pub fn get(&self, i: usize, j: usize) -> f64 {
        assert!(i < self.n && j < self.n, "index ({i}, {j}) outside a {0}x{0} matrix", self.n);
        self.slot(i, j).map_or(0.0, |s| self.data[s])
    }

    /// Adds `value` to entries `(i, j)` and `(j, i)` (once when `i == j`).
    #[track_caller]
    pub fn add(&mut self, i: usize, j: usize, value: f64) {
        assert!(i < self.n && j < self.n, "index ({i}, {j}) outside a {0}x{0} matrix", self.n);
        let s = self.slot(i, j).unwrap_or_else(|| {
            panic!("entry ({i}, {j}) lies outside the half-bandwidth {}", self.b)
        });
        self.data[s] += value;
    }

    /// `self + factor * other`, both of the same dimension and bandwidth.
    #[track_caller]
    pub fn plus_scaled(&self, factor: f64, other: &BandMatrix) -> BandMatrix {
        assert!(self.n == other.n && self.b == other.b, "band matrices of different shapes");
        let data = self.data.iter().zip(&other.data).map(|(a, b)| a + factor * b).collect();
        BandMatrix { n: self.n, b: self.b, data }
    }

    /// `y = A x`.
    #[track_caller]
    pub fn mul_vec(&self, x: &[f64], y: &mut [f64]) {
        assert!(x.len() == self.n && y.len() == self.n, "vector length differs from dimension");
        let w = self.b + 1;
        y.iter_mut().for_each(|v| *v = 0.0);
        for i in 0..self.n {
            let j0 = i.saturating_sub(self.b);
            let row = &self.data[i * w..(i + 1) * w];
            let mut acc = 0.0;
            for j in j0..i {
                let a = row[j + self.b - i];
                acc += a * x[j];
                y[j] += a * x[i];
            }
            y[i] += acc + row[self.b] * x[i];
        }
    }

    /// The full matrix.
    pub fn to_dense(&self) -> DMatrix<f64> {
        DMatrix::from_fn(self.n, self.n, |i, j| self.get(i, j))
    }

    /// The full symmetric matrix in compressed sparse column form (both triangles stored).
    pub fn to_csc(&self) -> CscMatrix<f64> {
        let mut coo = CooMatrix::new(self.n, self.n);
        for (i, j, v) in self.lower_entries() {
            coo.push(i, j, v);
            if i != j {
                coo.push(j, i, v);
            }
        }
        CscMatrix::from(&coo)
    }

    /// The stored non-zero entries of the lower triangle `(i, j, value)` with `i >= j`, by rows.
    pub fn lower_entries(&self) -> impl Iterator<Item = (usize, usize, f64)> + '_ {
        (0..self.n).flat_map(move |i| {
            (i.saturating_sub(self.b)..=i).filter_map(move |j| {
                let v = self.data[i * (self.b + 1) + (j + self.b - i)];
                (v != 0.0).then_some((i, j, v))
            })
        })
    }
}

/// The Cholesky factor `L` of a symmetric positive definite band matrix, `A = L Lᵀ`.
#[derive(Debug, Clone)]
pub(crate) struct BandCholesky {
    l: BandMatrix,
}

/// Failure of a band factorisation: the pivot index and its value.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct NotPositive {
    pub index: usize,
    pub pivot: f64,
}

impl BandCholesky {
    /// Factors `a`; fails at the first pivot that is not positive (or not finite).
    pub fn factor(a: &BandMatrix) -> Result<Self, NotPositive> {
        let (n, b) = (a.n, a.b);
        let w = b + 1;
        let mut l = a.clone();
        for i in 0..n {
            let j0 = i.saturating_sub(b);
            for j in j0..=i {
                // l[i][j] = (a[i][j] - sum_k l[i][k] l[j][k]) / l[j][j], k from max(i,j)-b.. j-1
                let k0 = i.saturating_sub(b);
                let mut s = l.data[i * w + (j + b - i)];
                for k in k0..j {
                    s -= l.data[i * w + (k + b - i)] * l.data[j * w + (k + b - j)];
                }
                if j == i {
                    if !(s > 0.0 && s.is_finite()) {
                        return Err(NotPositive { index: i, pivot: s });
                    }
                    l.data[i * w + b] = s.sqrt();
                } else {
                    l.data[i * w + (j + b - i)] = s / l.data[j * w + b];
                }
            }
        }
        Ok(BandCholesky { l })
    }

    /// Solves `L y = x` in place.
    pub fn solve_lower(&self, x: &mut [f64]) {
        let (n, b) = (self.l.n, self.l.b);
        let w = b + 1;
        for i in 0..n {
            let row = &self.l.data[i * w..(i + 1) * w];
            let mut s = x[i];
            for j in i.saturating_sub(b)..i {
                s -= row[j + b - i] * x[j];
            }
            x[i] = s / row[b];
        }
    }

    /// Solves `Lᵀ y = x` in place.
    pub fn solve_upper(&self, x: &mut [f64]) {
        let (n, b) = (self.l.n, self.l.b);
        let w = b + 1;
        for i in (0..n).rev() {
            x[i] /= self.l.data[i * w + b];
            let xi = x[i];
            let row = &self.l.data[i * w..(i + 1) * w];
            for j in i.saturating_sub(b)..i {
                x[j] -= row[j + b - i] * xi;
            }
        }
    }
}

/// Number of negative pivots of the LDLᵀ factorisation (no pivoting) of a symmetric band matrix:
/// by Sylvester's law of inertia the number of its negative eigenvalues, and for `K - sigma M`
/// the number of eigenvalues of `K x = lambda M x` below `sigma` (the Sturm sequence check;
/// Bathe, *Finite Element Procedures*, 1996, §11.4.3, from memory). A zero pivot is perturbed
/// to a tiny value of the scale of the matrix.
pub(crate) fn count_negative_pivots(a: &BandMatrix) -> usize {
    let (n, b) = (a.n, a.b);
    let w = b + 1;
    let scale = (0..n).map(|i| a.data[i * w + b].abs()).fold(0.0, f64::max).max(f64::MIN_POSITIVE);
    // Row i of the unit lower factor in place of A's row; d separately.
    let mut l = a.data.clone();
    let mut d = vec![0.0; n];
    let mut negatives = 0;
    for i in 0..n {
        let k0 = i.saturating_sub(b);
        for j in k0..i {
            // u = a[i][j] - sum_k l[i][k] d[k] l[j][k]
            let mut s = l[i * w + (j + b - i)];
            for k in k0.max(j.saturating_sub(b))..j {
                s -= l[i * w + (k + b - i)] * d[k] * l[j * w + (k + b - j)];
            }
            l[i * w + (j + b - i)] = s / d[j];
        }
        let mut s = l[i * w + b];
        for k in k0..i {
            let lik = l[i * w + (k + b - i)];
            s -= lik * lik * d[k];
        }
        if s == 0.0 || !s.is_finite() {
            s = -f64::EPSILON * scale;
        }
        if s < 0.0 {
            negatives += 1;
        }
        d[i] = s;
    }
    negatives
}

#[cfg(test)]
mod tests {
    use super::*;

    fn sample(n: usize, b: usize, shift: f64) -> BandMatrix {
        let mut a = BandMatrix::zeros(n, b);
        for i in 0..n {
            a.add(i, i, 4.0 + shift + (i % 3) as f64);
            for k in 1..=b.min(i) {
                a.add(i, i - k, -1.0 / (k as f64 + 0.5) + 0.1 * ((i * 7 + k) % 5) as f64);
            }
        }
        a
    }

    #[test]
    fn band_product_and_cholesky_agree_with_dense_algebra() {
        // Reference: nalgebra's dense product and Cholesky of the same matrix.
        let a = sample(23, 4, 2.0);
        let dense = a.to_dense();
        let x: Vec<f64> = (0..23).map(|i| (i as f64 * 0.37).sin()).collect();
        let mut y = vec![0.0; 23];
        a.mul_vec(&x, &mut y);
        let yd = &dense * nalgebra::DVector::from_column_slice(&x);
        for i in 0..23 {
            assert!((y[i] - yd[i]).abs() < 1e-12 * (1.0 + yd[i].abs()));
        }
        let c = BandCholesky::factor(&a).unwrap();
        let mut z = y.clone();
        c.solve_lower(&mut z);
        c.solve_upper(&mut z);
        for i in 0..23 {
            assert!((z[i] - x[i]).abs() < 1e-11, "{i}: {} vs {}", z[i], x[i]);
        }
    }

    #[test]
    fn negative_pivots_count_the_negative_eigenvalues() {
        // Sylvester's law of inertia, against nalgebra's dense symmetric eigenvalues.
        for shift in [-9.0, -6.0, -4.5, -3.0, 0.0] {
            let a = sample(30, 3, shift);
            let eig = a.to_dense().symmetric_eigenvalues();
            let negative = eig.iter().filter(|&&v| v < 0.0).count();
            assert_eq!(count_negative_pivots(&a), negative, "shift {shift}");
        }
    }

    #[test]
    fn csc_holds_both_triangles() {
        let a = sample(9, 2, 0.0);
        let csc = a.to_csc();
        let dense = a.to_dense();
        for (i, j, v) in csc.triplet_iter() {
            assert_eq!(*v, dense[(i, j)]);
        }
        assert_eq!(csc.nnz(), dense.iter().filter(|v| **v != 0.0).count());
    }
}

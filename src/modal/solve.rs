//! The lowest eigenpairs of `K x = lambda M x` (`K` positive definite, `M` positive
//! semi-definite, both banded) by shift-invert Lanczos with full reorthogonalisation, checked by a
//! Sturm sequence count; and a dense reference solver.
//!
//! Method: with `K = L Lᵀ` (band Cholesky) the symmetric operator `C = L⁻¹ M L⁻ᵀ` has the
//! eigenvalues `mu = 1 / lambda`, so the lowest modes are the largest `mu`, which Lanczos finds
//! first (Ericsson & Ruhe, "The spectral transformation Lanczos method", Math. Comp. 35 (1980)
//! 1251–1268). Every new Lanczos vector is orthogonalised twice against all previous ones
//! (classical Gram–Schmidt twice; Parlett, *The Symmetric Eigenvalue Problem*, 1998, §6.9), so no
//! spurious copies appear. A Ritz pair is accepted when its residual `|beta_j s_ji|` is below
//! `tolerance * mu_i`. Single-vector Lanczos can miss one copy of a repeated eigenvalue; the LDLᵀ
//! inertia of `K - sigma M` just above the highest wanted eigenvalue counts the eigenvalues below
//! it, and when the count exceeds what was found, Lanczos runs again in the orthogonal complement
//! of the pairs already found (deflation) until the count agrees.

use nalgebra::{DMatrix, DVector, SymmetricEigen};

use super::band::{BandCholesky, BandMatrix, count_negative_pivots};
use super::tridiagonal::eigen_last_row;

/// Eigenpairs of `K x = lambda M x`, lowest first.
#[derive(Debug, Clone)]
pub struct EigenSolution {
    /// Eigenvalues `lambda = omega²`, rad²/s², ascending.
    pub eigenvalues: Vec<f64>,
    /// Eigenvectors as columns, in the same order, normalised so that `xᵀ M x = 1`.
    pub vectors: DMatrix<f64>,
    /// Lanczos steps taken (0 for the dense solver).
    pub steps: usize,
}

/// Tuning of the Lanczos solver.
#[derive(Debug, Clone, PartialEq)]
pub struct LanczosParams {
    /// Relative residual below which a Ritz pair is accepted.
    pub tolerance: f64,
    /// Most deflated restarts after a Sturm count finds missing eigenvalues.
    pub max_restarts: usize,
    /// Seed of the pseudo-random start vector (results are reproducible).
    pub seed: u64,
}

impl Default for LanczosParams {
    fn default() -> Self {
        LanczosParams { tolerance: 1e-10, max_restarts: 4, seed: 0x1a7_10f7 }
    }
}

/// Why an eigen solution failed.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum EigenError {
    /// `K` is not positive definite: the structure is unrestrained or statically unstable.
    #[error(
        "the stiffness matrix is not positive definite (pivot {pivot:e} at degree of freedom {index}): the blade is unrestrained or statically unstable at this speed"
    )]
    NotPositiveDefinite {
        /// Degree of freedom (0-based, constrained numbering) of the failing pivot.
        index: usize,
        /// Its value.
        pivot: f64,
    },
    /// Fewer finite eigenvalues exist than were asked for.
    #[error("{asked} modes asked for, but the model has only {available} with mass")]
    TooManyModes {
        /// Modes asked for.
        asked: usize,
        /// Finite eigenvalues available.
        available: usize,
    },
    /// Lanczos did not converge or the Sturm count stayed unmatched.
    #[error(
        "the eigen solver did not converge: {found} of {wanted} modes after {steps} Lanczos steps and {restarts} restarts"
    )]
    NotConverged {
        /// Modes wanted.
        wanted: usize,
        /// Modes found.
        found: usize,
        /// Lanczos steps taken in all.
        steps: usize,
        /// Deflated restarts taken.
        restarts: usize,
    },
}

/// The `count` lowest eigenpairs of `K x = lambda M x` for band matrices `k` (positive definite)
/// and `m` (positive semi-definite) by shift-invert Lanczos (see the module docs).
///
/// The start vector is pseudo-random (seeded): starting from the modes of a neighbouring speed
/// was measured to save no steps, since the last digits take as many steps as the first.
pub fn solve_lowest(
    k: &BandMatrix,
    m: &BandMatrix,
    count: usize,
    params: &LanczosParams,
) -> Result<EigenSolution, EigenError> {
    let n = k.dim();
    assert_eq!(m.dim(), n, "stiffness and mass of different dimension");
    if count > n {
        return Err(EigenError::TooManyModes { asked: count, available: n });
    }
    if count == 0 {
        return Ok(EigenSolution { eigenvalues: vec![], vectors: DMatrix::zeros(n, 0), steps: 0 });
    }
    let chol = BandCholesky::factor(k)
        .map_err(|e| EigenError::NotPositiveDefinite { index: e.index, pivot: e.pivot })?;
    let mut op = Operator { chol: &chol, m, scratch: vec![0.0; n] };
    let mut rng = XorShift(params.seed | 1);
    let mut found: Vec<(f64, Vec<f64>)> = Vec::new();
    let mut steps = 0;
    for restart in 0..=params.max_restarts {
        let basis: Vec<&[f64]> = found.iter().map(|(_, y)| y.as_slice()).collect();
        let run = lanczos(&mut op, &basis, count, params.tolerance, &mut rng);
        steps += run.steps;
        found.extend(run.pairs);
        found.sort_by(|a, b| b.0.total_cmp(&a.0));
        let mu_max = found.first().map_or(0.0, |p| p.0);
        let finite = found.iter().filter(|p| p.0 > 1e-13 * mu_max).count();
        if run.exhausted && finite < count {
            return Err(EigenError::TooManyModes { asked: count, available: finite });
        }
        if finite < count {
            continue;
        }
        let lambda_top = 1.0 / found[count - 1].0;
        let sigma = lambda_top * (1.0 + 1e-6);
        let below = found.iter().filter(|p| 1.0 / p.0 < sigma).count();
        let sturm = count_negative_pivots(&k.plus_scaled(-sigma, m));
        if sturm <= below {
            let mut solution = ritz_to_modes(&chol, &found[..count]);
            solution.steps = steps;
            return Ok(solution);
        }
        if restart == params.max_restarts {
            break;
        }
    }
    Err(EigenError::NotConverged {
        wanted: count,
        found: found.len().min(count),
        steps,
        restarts: params.max_restarts,
    })
}

/// `y = L⁻¹ M L⁻ᵀ x`.
struct Operator<'a> {
    chol: &'a BandCholesky,
    m: &'a BandMatrix,
    scratch: Vec<f64>,
}

impl Operator<'_> {
    fn apply(&mut self, x: &[f64], y: &mut [f64]) {
        self.scratch.copy_from_slice(x);
        self.chol.solve_upper(&mut self.scratch);
        self.m.mul_vec(&self.scratch, y);
        self.chol.solve_lower(y);
    }
}

struct LanczosRun {
    /// Converged Ritz pairs `(mu, y)` with `|y| = 1`.
    pairs: Vec<(f64, Vec<f64>)>,
    steps: usize,
    /// The whole space orthogonal to the locked vectors was spanned.
    exhausted: bool,
}

/// One Lanczos run in the orthogonal complement of `locked` (orthonormal), until the `want`
/// largest Ritz values converge or the space is exhausted.
fn lanczos(
    op: &mut Operator,
    locked: &[&[f64]],
    want: usize,
    tol: f64,
    rng: &mut XorShift,
) -> LanczosRun {
    let n = op.m.dim();
    let max_dim = n - locked.len();
    if max_dim == 0 {
        return LanczosRun { pairs: vec![], steps: 0, exhausted: true };
    }
    let want = want.min(max_dim);
    let mut q: Vec<Vec<f64>> = Vec::with_capacity(want * 3 + 10);
    let (mut alpha, mut beta): (Vec<f64>, Vec<f64>) = (Vec::new(), Vec::new());
    let Some(mut v) = fresh_direction(n, locked, &q, rng) else {
        return LanczosRun { pairs: vec![], steps: 0, exhausted: true };
    };
    let mut w = vec![0.0; n];
    let check_every = 4;
    // After a breakdown, a fresh random direction that the operator maps to nothing shows that
    // the rest of the space holds no finite eigenvalue (massless degrees of freedom only).
    let mut restarted = false;
    let mut scale = 0.0_f64;
    loop {
        op.apply(&v, &mut w);
        let a = dot(&v, &w);
        axpy(-a, &v, &mut w);
        if let (Some(prev), Some(&b)) = (q.last(), beta.last()) {
            axpy(-b, prev, &mut w);
        }
        q.push(std::mem::take(&mut v));
        alpha.push(a);
        scale = scale.max(a.abs());
        // Classical Gram–Schmidt, repeated when it removed much (Daniel, Gragg, Kaufman &
        // Stewart, Math. Comp. 30 (1976) 772–795: "twice is enough").
        let mut b = dot(&w, &w).sqrt();
        for _ in 0..2 {
            let before = b;
            for basis in locked.iter().copied().chain(q.iter().map(Vec::as_slice)) {
                let c = dot(basis, &w);
                axpy(-c, basis, &mut w);
            }
            b = dot(&w, &w).sqrt();
            if b > std::f64::consts::FRAC_1_SQRT_2 * before {
                break;
            }
        }
        let j = q.len();
        let breakdown = b <= 1e-13 * scale;
        let exhausted = j == max_dim || (restarted && breakdown && a.abs() <= 1e-13 * scale);
        restarted = false;
        if breakdown {
            b = 0.0;
        }
        beta.push(b);
        if exhausted || (j >= want && ((j - want) % check_every == 0 || breakdown)) {
            if let Some(pairs) = ritz_pairs(&alpha, &beta, &q, want, tol, exhausted) {
                return LanczosRun { pairs, steps: j, exhausted };
            }
        }
        v = if breakdown {
            restarted = true;
            match fresh_direction(n, locked, &q, rng) {
                Some(v) => v,
                None => {
                    let pairs = ritz_pairs(&alpha, &beta, &q, want, tol, true).unwrap_or_default();
                    return LanczosRun { pairs, steps: j, exhausted: true };
                }
            }
        } else {
            w.iter().map(|x| x / b).collect()
        };
    }
}

/// The converged Ritz pairs of the tridiagonal `T_j` once the `want` largest have converged (or
/// always when `finished`); `None` while they have not.
fn ritz_pairs(
    alpha: &[f64],
    beta: &[f64],
    q: &[Vec<f64>],
    want: usize,
    tol: f64,
    finished: bool,
) -> Option<Vec<(f64, Vec<f64>)>> {
    let j = alpha.len();
    let b_last = beta[j - 1];
    if !finished {
        // Cheap test first: eigenvalues and last eigenvector components only.
        if let Some((theta, last)) = eigen_last_row(alpha, beta) {
            let mut order: Vec<usize> = (0..j).collect();
            order.sort_by(|&a, &b| theta[b].total_cmp(&theta[a]));
            let top = theta[order[0]].abs();
            let converged = order
                .iter()
                .take(want)
                .all(|&i| (b_last * last[i]).abs() <= tol * theta[i].abs().max(1e-14 * top));
            if !converged {
                return None;
            }
        }
    }
    let t = DMatrix::from_fn(j, j, |r, c| match r.abs_diff(c) {
        0 => alpha[r],
        1 => beta[r.min(c)],
        _ => 0.0,
    });
    let eig = SymmetricEigen::new(t);
    let mut order: Vec<usize> = (0..j).collect();
    order.sort_by(|&a, &b| eig.eigenvalues[b].total_cmp(&eig.eigenvalues[a]));
    let top = eig.eigenvalues[order[0]].abs();
    let ok = |i: usize| {
        let mu = eig.eigenvalues[i];
        (b_last * eig.eigenvectors[(j - 1, i)]).abs() <= tol * mu.abs().max(1e-14 * top)
    };
    if !finished && !order.iter().take(want).all(|&i| ok(i)) {
        return None;
    }
    let n = q[0].len();
    let pairs = order
        .iter()
        .filter(|&&i| ok(i) && eig.eigenvalues[i] > 0.0)
        .map(|&i| {
            let mut y = vec![0.0; n];
            for (c, qc) in q.iter().enumerate() {
                axpy(eig.eigenvectors[(c, i)], qc, &mut y);
            }
            let norm = dot(&y, &y).sqrt();
            y.iter_mut().for_each(|v| *v /= norm);
            (eig.eigenvalues[i], y)
        })
        .collect();
    Some(pairs)
}

/// Back-transforms Ritz pairs `(mu, y)` to `lambda = 1 / mu`, `x = L⁻ᵀ y / sqrt(mu)`, ascending.
fn ritz_to_modes(chol: &BandCholesky, pairs: &[(f64, Vec<f64>)]) -> EigenSolution {
    let n = pairs.first().map_or(0, |p| p.1.len());
    let mut vectors = DMatrix::zeros(n, pairs.len());
    let mut eigenvalues = Vec::with_capacity(pairs.len());
    for (c, (mu, y)) in pairs.iter().enumerate() {
        let mut x = y.clone();
        chol.solve_upper(&mut x);
        let s = 1.0 / mu.sqrt();
        for (r, v) in x.iter().enumerate() {
            vectors[(r, c)] = v * s;
        }
        eigenvalues.push(1.0 / mu);
    }
    EigenSolution { eigenvalues, vectors, steps: 0 }
}

/// All finite eigenpairs of `K x = lambda M x` with dense matrices (`K` positive definite): the
/// Cholesky-reduced standard problem `L⁻¹ M L⁻ᵀ y = (1 / lambda) y` solved by nalgebra's
/// `SymmetricEigen`. The reference for [`solve_lowest`], and `O(n³)`.
pub fn solve_dense(k: &DMatrix<f64>, m: &DMatrix<f64>) -> Result<EigenSolution, EigenError> {
    let n = k.nrows();
    let chol = k.clone().cholesky().ok_or(EigenError::NotPositiveDefinite {
        index: (0..n).find(|&i| k[(i, i)] <= 0.0).unwrap_or(0),
        pivot: f64::NAN,
    })?;
    let l = chol.l();
    let lm = l.solve_lower_triangular(m).unwrap_or_else(|| DMatrix::zeros(n, n));
    let c = l.solve_lower_triangular(&lm.transpose()).unwrap_or_else(|| DMatrix::zeros(n, n));
    let c = (&c + c.transpose()) * 0.5;
    let eig = SymmetricEigen::new(c);
    let mu_max = eig.eigenvalues.iter().fold(0.0_f64, |a, &b| a.max(b));
    let mut order: Vec<usize> = (0..n).filter(|&i| eig.eigenvalues[i] > 1e-13 * mu_max).collect();
    order.sort_by(|&a, &b| eig.eigenvalues[b].total_cmp(&eig.eigenvalues[a]));
    let lt = l.transpose();
    let mut vectors = DMatrix::zeros(n, order.len());
    let mut eigenvalues = Vec::with_capacity(order.len());
    for (c, &i) in order.iter().enumerate() {
        let mu = eig.eigenvalues[i];
        let y = eig.eigenvectors.column(i).into_owned();
        let x = lt.solve_upper_triangular(&y).unwrap_or_else(|| DVector::zeros(n)) / mu.sqrt();
        vectors.set_column(c, &x);
        eigenvalues.push(1.0 / mu);
    }
    Ok(EigenSolution { eigenvalues, vectors, steps: 0 })
}

fn dot(a: &[f64], b: &[f64]) -> f64 {
    a.iter().zip(b).map(|(x, y)| x * y).sum()
}

fn axpy(a: f64, x: &[f64], y: &mut [f64]) {
    y.iter_mut().zip(x).for_each(|(yi, xi)| *yi += a * xi);
}

/// Orthogonalises `v` (twice) against `locked` and `q` and normalises it; false when nothing of
/// it is left.
fn orthonormalise(v: &mut [f64], locked: &[&[f64]], q: &[Vec<f64>]) -> bool {
    let norm0 = dot(v, v).sqrt();
    for _ in 0..2 {
        for basis in locked.iter().copied().chain(q.iter().map(Vec::as_slice)) {
            let c = dot(basis, v);
            axpy(-c, basis, v);
        }
    }
    let norm = dot(v, v).sqrt();
    if norm.is_nan() || norm <= 1e-10 * norm0 {
        return false;
    }
    v.iter_mut().for_each(|x| *x /= norm);
    true
}

/// A random unit vector orthogonal to `locked` and `q`; `None` when five tries leave nothing
/// (they span the space to round-off).
fn fresh_direction(
    n: usize,
    locked: &[&[f64]],
    q: &[Vec<f64>],
    rng: &mut XorShift,
) -> Option<Vec<f64>> {
    (0..5).find_map(|_| {
        let mut v: Vec<f64> = (0..n).map(|_| rng.next()).collect();
        orthonormalise(&mut v, locked, q).then_some(v)
    })
}

/// A small deterministic generator for start vectors (xorshift64, Marsaglia 2003).
struct XorShift(u64);

impl XorShift {
    /// Uniform in [-1, 1).
    fn next(&mut self) -> f64 {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        (self.0 >> 11) as f64 / (1u64 << 52) as f64 - 1.0
    }
}

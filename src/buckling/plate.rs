//! Long flat plates under uniform in-plane compression and shear: the critical load from the
//! plate's full bending stiffness `D` (with `D16`, `D26`) by a Rayleigh–Ritz solution across the
//! width and a wave along the length, minimised over the half-wavelength.
//!
//! Deflection `w = Re[f(y) exp(i alpha x)]`, `f(y) = sum c_k phi_k(y / b)` with complex `c`: the
//! complex amplitude lets the nodal lines skew, which is how `D16`, `D26` and shear load enter
//! (Whitney, *Structural Analysis of Laminated Anisotropic Plates*, 1987, ch. 5 treats the same
//! energy; the solution here is our own). Averaged over a wavelength the bending energy and the
//! work of the loads are Hermitian forms in `c`; their real 2n x 2n embedding gives a symmetric
//! generalised eigenproblem `K q = lambda G q` whose least positive `lambda` (over `alpha`) is the
//! buckling multiplier.
//!
//! Bases on `eta = y/b in [0, 1]`: simply supported `phi_k = sin(k pi eta)` (w = 0, the moment
//! condition is natural); clamped `phi_k = sin(pi eta) sin(k pi eta)` (w = w' = 0).

use std::sync::{Arc, OnceLock};

use nalgebra::{DMatrix, Matrix3, SMatrix};

/// How the long edges of a panel are held against rotation.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum EdgeSupport {
    /// Free to rotate (w = 0, no moment).
    SimplySupported,
    /// Held against rotation (w = 0, w' = 0).
    Clamped,
}

/// Number of Ritz functions across the width.
const TERMS: usize = 10;
/// Gauss–Legendre points for the integrals across the width.
const GAUSS: usize = 64;

/// A square matrix of the Ritz basis size, on the stack.
type Square = SMatrix<f64, TERMS, TERMS>;

/// Unit integrals `int_0^1 phi_i^(p) phi_j^(q) d eta` of one basis.
#[derive(Debug, Clone)]
struct UnitIntegrals {
    p00: DMatrix<f64>,
    p11: DMatrix<f64>,
    p22: DMatrix<f64>,
    p20: DMatrix<f64>,
    p10: DMatrix<f64>,
    p12: DMatrix<f64>,
    /// The integrals a plate without `D16`, `D26` needs, as fixed-size matrices: `p00`, `p11`,
    /// `p22`, the symmetric part of `p20` and the skew part of `p10`.
    fixed: [Square; 5],
}

/// Gauss–Legendre nodes and weights on [0, 1] (Newton on the Legendre recurrence).
fn gauss_legendre(n: usize) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(n);
    for i in 0..n {
        let mut x = (std::f64::consts::PI * (i as f64 + 0.75) / (n as f64 + 0.5)).cos();
        let mut dp = 1.0;
        for _ in 0..100 {
            let (mut p0, mut p1) = (1.0, x);
            for k in 2..=n {
                let p2 = ((2 * k - 1) as f64 * x * p1 - (k - 1) as f64 * p0) / k as f64;
                p0 = p1;
                p1 = p2;
            }
            dp = n as f64 * (x * p1 - p0) / (x * x - 1.0);
            let dx = p1 / dp;
            x -= dx;
            if dx.abs() < 1e-15 {
                break;
            }
        }
        let w = 2.0 / ((1.0 - x * x) * dp * dp);
        out.push((0.5 * (x + 1.0), 0.5 * w));
    }
    out
}

/// Value, first and second derivative of basis function `k` (1-based) at `eta`.
fn basis(support: EdgeSupport, k: usize, eta: f64) -> [f64; 3] {
    let pi = std::f64::consts::PI;
    let a = k as f64 * pi;
    match support {
        EdgeSupport::SimplySupported => {
            let (s, c) = (a * eta).sin_cos();
            [s, a * c, -a * a * s]
        }
        EdgeSupport::Clamped => {
            let (s1, c1) = (pi * eta).sin_cos();
            let (sk, ck) = (a * eta).sin_cos();
            [
                s1 * sk,
                pi * c1 * sk + a * s1 * ck,
                -(pi * pi + a * a) * s1 * sk + 2.0 * pi * a * c1 * ck,
            ]
        }
    }
}

impl UnitIntegrals {
    fn new(support: EdgeSupport) -> Self {
        let z = || DMatrix::zeros(TERMS, TERMS);
        let mut u = UnitIntegrals {
            p00: z(),
            p11: z(),
            p22: z(),
            p20: z(),
            p10: z(),
            p12: z(),
            fixed: [Square::zeros(); 5],
        };
        for (eta, w) in gauss_legendre(GAUSS) {
            let f: Vec<[f64; 3]> = (1..=TERMS).map(|k| basis(support, k, eta)).collect();
            for i in 0..TERMS {
                for j in 0..TERMS {
                    u.p00[(i, j)] += w * f[i][0] * f[j][0];
                    u.p11[(i, j)] += w * f[i][1] * f[j][1];
                    u.p22[(i, j)] += w * f[i][2] * f[j][2];
                    u.p20[(i, j)] += w * f[i][2] * f[j][0];
                    u.p10[(i, j)] += w * f[i][1] * f[j][0];
                    u.p12[(i, j)] += w * f[i][1] * f[j][2];
                }
            }
        }
        let fixed = |m: &DMatrix<f64>| Square::from_fn(|i, j| m[(i, j)]);
        u.fixed = [
            fixed(&u.p00),
            fixed(&u.p11),
            fixed(&u.p22),
            fixed(&sym(&u.p20)),
            fixed(&skew(&u.p10)),
        ];
        u
    }
}

fn sym(m: &DMatrix<f64>) -> DMatrix<f64> {
    (m + m.transpose()) * 0.5
}

fn skew(m: &DMatrix<f64>) -> DMatrix<f64> {
    (m - m.transpose()) * 0.5
}

/// Real symmetric embedding of the Hermitian form `S + iT` (S symmetric, T skew).
fn embed(s: &DMatrix<f64>, t: &DMatrix<f64>) -> DMatrix<f64> {
    let n = s.nrows();
    let mut m = DMatrix::zeros(2 * n, 2 * n);
    m.view_mut((0, 0), (n, n)).copy_from(s);
    m.view_mut((n, n), (n, n)).copy_from(s);
    m.view_mut((0, n), (n, n)).copy_from(&(-t));
    m.view_mut((n, 0), (n, n)).copy_from(t);
    m
}

/// Critical loads of one long plate strip, for a given edge support.
#[derive(Debug, Clone)]
pub struct LongPlate {
    support: EdgeSupport,
    /// Shared by every solver of the same support: computed once per process.
    unit: Arc<UnitIntegrals>,
}

/// The least critical loads of a long plate, N/m (infinite where no load of that kind buckles
/// it).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlateCritical {
    /// Uniform compression `-N_x` at buckling, N/m (positive).
    pub compression: f64,
    /// Positive shear flow `N_xs` at buckling, N/m.
    pub shear_positive: f64,
    /// Magnitude of the negative shear flow at buckling, N/m.
    pub shear_negative: f64,
}

/// Transverse shear stiffness of a sandwich wall for the buckling reduction, N/m; infinite for a
/// solid laminate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ShearFlexibility(pub f64);

/// A panel's curvature across its width for the shallow-shell (Donnell) membrane term: its
/// radius, m, and the wall's membrane compliance `A^-1` (m/N, `x` along the span, `s` across;
/// `a16`, `a26` not used).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Curvature {
    /// Radius of curvature, m.
    pub radius: f64,
    /// Membrane compliance `A^-1`, m/N.
    pub compliance: Matrix3<f64>,
}

impl LongPlate {
    /// The solver for one edge support.
    pub fn new(support: EdgeSupport) -> Self {
        static SS: OnceLock<Arc<UnitIntegrals>> = OnceLock::new();
        static CLAMPED: OnceLock<Arc<UnitIntegrals>> = OnceLock::new();
        let cell = match support {
            EdgeSupport::SimplySupported => &SS,
            EdgeSupport::Clamped => &CLAMPED,
        };
        LongPlate {
            support,
            unit: cell.get_or_init(|| Arc::new(UnitIntegrals::new(support))).clone(),
        }
    }

    /// The edge support this solver models.
    pub fn support(&self) -> EdgeSupport {
        self.support
    }

    /// Bending stiffness matrix `K` at wave number `alpha` (rad/m) for width `b` (m).
    fn stiffness(&self, d: &Matrix3<f64>, b: f64, alpha: f64) -> DMatrix<f64> {
        let u = &*self.unit;
        // Width integrals scale as b^(1 - p - q).
        let p00 = &u.p00 * b;
        let p11 = &u.p11 / b;
        let p22 = &u.p22 / (b * b * b);
        let p20 = &u.p20 / b;
        let p10 = u.p10.clone();
        let p12 = &u.p12 / (b * b);
        let (d11, d12, d22, d16, d26, d66) =
            (d[(0, 0)], d[(0, 1)], d[(1, 1)], d[(0, 2)], d[(1, 2)], d[(2, 2)]);
        let a2 = alpha * alpha;
        let s = &p00 * (d11 * a2 * a2) - sym(&p20) * (2.0 * d12 * a2)
            + &p22 * d22
            + &p11 * (4.0 * d66 * a2);
        let t = skew(&p10) * (4.0 * d16 * a2 * alpha) - skew(&p12) * (4.0 * d26 * alpha);
        embed(&s, &t)
    }

    /// Compression load matrix `Gc` (per unit `-N_x`) at wave number `alpha` for width `b`.
    fn compression_load(&self, b: f64, alpha: f64) -> DMatrix<f64> {
        let p00 = &self.unit.p00 * b;
        let zero = DMatrix::zeros(TERMS, TERMS);
        embed(&(&p00 * (alpha * alpha)), &zero)
    }

    /// Shear load matrix `Gs` (per unit `N_xs`) at wave number `alpha`.
    fn shear_load(&self, alpha: f64) -> DMatrix<f64> {
        let zero = DMatrix::zeros(TERMS, TERMS);
        embed(&zero, &(skew(&self.unit.p10) * (-2.0 * alpha)))
    }

    /// The largest and least eigenvalue `mu` of `G q = mu K q` (the inverse buckling
    /// multipliers of the two signs of the load).
    fn inverse_multipliers(k: &DMatrix<f64>, g: &DMatrix<f64>) -> Option<(f64, f64)> {
        let chol = k.clone().cholesky()?;
        let li = chol.l().try_inverse()?;
        let m = sym(&(&li * g * li.transpose()));
        let ev = m.symmetric_eigenvalues();
        let hi = ev.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let lo = ev.iter().copied().fold(f64::INFINITY, f64::min);
        Some((hi, lo))
    }

    /// Critical compression at wave number `alpha` with transverse shear flexibility `s`:
    /// `1/N = 1/N_b + 1/N_s`, `N_s = S (alpha² + beta²)/alpha²` with `beta²` the Rayleigh wave
    /// number of the bending mode across the width (Allen, *Analysis and Design of Structural
    /// Sandwich Panels*, 1969, ch. 4, thin faces, for the sine mode).
    fn compression_at(&self, d: &Matrix3<f64>, b: f64, alpha: f64, s: ShearFlexibility) -> f64 {
        let (k, gc) = (self.stiffness(d, b, alpha), self.compression_load(b, alpha));
        if !s.0.is_finite() {
            return match Self::inverse_multipliers(&k, &gc) {
                Some((mu, _)) if mu > 0.0 => 1.0 / mu,
                Some(_) => f64::INFINITY,
                None => f64::NAN,
            };
        }
        let Some(chol) = k.clone().cholesky() else { return f64::NAN };
        let l = chol.l();
        let Some(li) = l.clone().try_inverse() else { return f64::NAN };
        let m = sym(&(&li * &gc * li.transpose()));
        let eig = m.symmetric_eigen();
        let Some((at, &mu)) = eig.eigenvalues.iter().enumerate().max_by(|a, b| a.1.total_cmp(b.1))
        else {
            return f64::NAN;
        };
        if mu <= 0.0 {
            return f64::INFINITY;
        }
        let n_b = 1.0 / mu;
        // Mode q = L^-T v: its width wave number beta² = (q' P11 q)/(q' P00 q).
        let v = eig.eigenvectors.column(at);
        let q = li.transpose() * v;
        let n = TERMS;
        let quad = |p: &DMatrix<f64>| {
            let (a, c) = (q.rows(0, n), q.rows(n, n));
            a.dot(&(p * a)) + c.dot(&(p * c))
        };
        let beta2 = quad(&(&self.unit.p11 / b)) / quad(&(&self.unit.p00 * b));
        let n_s = s.0 * (alpha * alpha + beta2) / (alpha * alpha);
        1.0 / (1.0 / n_b + 1.0 / n_s)
    }

    /// Critical shear flows of both signs at wave number `alpha`, with the transverse shear
    /// flexibility taken as `1/N = 1/N_b + 1/S` (a lower bound: the shear-only buckling load of
    /// the thin-face sandwich is at least `S`).
    fn shear_at(&self, d: &Matrix3<f64>, b: f64, alpha: f64, s: ShearFlexibility) -> [f64; 2] {
        let (k, gs) = (self.stiffness(d, b, alpha), self.shear_load(alpha));
        let Some((hi, lo)) = Self::inverse_multipliers(&k, &gs) else {
            return [f64::NAN; 2];
        };
        let reduce = |mu: f64| {
            if mu <= 0.0 {
                return f64::INFINITY;
            }
            let n_b = 1.0 / mu;
            if s.0.is_finite() { 1.0 / (1.0 / n_b + 1.0 / s.0) } else { n_b }
        };
        [reduce(hi), reduce(-lo)]
    }

    /// Inverse shear multiplier at wave number `alpha` of a plate without `D16`, `D26`.
    ///
    /// The stiffness form is then real, `K = S`, and the shear form purely imaginary, `G = iA`
    /// with `A` real and skew. With `S = L L'` and `M = L^-1 A L^-T` (skew), the eigenvalues of
    /// `G c = mu K c` are those of the Hermitian `iM`, `±sigma_k(M)`: the largest inverse
    /// multiplier of either sign is the largest singular value of `M`, the root of the largest
    /// eigenvalue of `M'M`. This is the same eigenproblem as the real embedding of twice the size
    /// in [`LongPlate::shear_at`], solved at a tenth of the cost.
    fn orthotropic_shear_multiplier(
        &self,
        d: &Matrix3<f64>,
        b: f64,
        alpha: f64,
        membrane: Option<&[f64; TERMS]>,
    ) -> Option<f64> {
        let [p00, p11, p22, p20, p10] = &self.unit.fixed;
        let (d11, d12, d22, d66) = (d[(0, 0)], d[(0, 1)], d[(1, 1)], d[(2, 2)]);
        let a2 = alpha * alpha;
        // The same terms and width scaling as `stiffness`, without the D16, D26 part.
        let mut s = p00 * (b * d11 * a2 * a2) - p20 * (2.0 * d12 * a2 / b)
            + p22 * (d22 / (b * b * b))
            + p11 * (4.0 * d66 * a2 / b);
        if let Some(m) = membrane {
            for (i, v) in m.iter().enumerate() {
                s[(i, i)] += v;
            }
        }
        let a = p10 * (-2.0 * alpha);
        let li = s.cholesky()?.l().try_inverse()?;
        let m = li * a * li.transpose();
        let mtm = m.transpose() * m;
        let top = (0.5 * (mtm + mtm.transpose()))
            .symmetric_eigenvalues()
            .iter()
            .copied()
            .fold(f64::NEG_INFINITY, f64::max);
        Some(top.max(0.0).sqrt())
    }

    /// [`LongPlate::orthotropic_shear_multiplier`] for simply supported edges, by the sine
    /// basis's structure: every integral but `p10` is diagonal, so `S` is diagonal and
    /// `M = S^-1/2 A S^-1/2` needs no factorisation; and `p10` couples only sines of odd with
    /// sines of even order, so `M` is `[[0, B], [-Bᵀ, 0]]` in that order and its largest
    /// singular value is `B`'s, from the 5x5 `BᵀB`. The same number to round-off (unit test).
    fn ss_orthotropic_shear_multiplier(
        &self,
        d: &Matrix3<f64>,
        b: f64,
        alpha: f64,
        membrane: &[f64; TERMS],
    ) -> Option<f64> {
        const HALF: usize = TERMS / 2;
        let [p00, p11, p22, p20, p10] = &self.unit.fixed;
        let (d11, d12, d22, d66) = (d[(0, 0)], d[(0, 1)], d[(1, 1)], d[(2, 2)]);
        let a2 = alpha * alpha;
        let mut root = [0.0; TERMS];
        for (k, slot) in root.iter_mut().enumerate() {
            let s = p00[(k, k)] * (b * d11 * a2 * a2) - p20[(k, k)] * (2.0 * d12 * a2 / b)
                + p22[(k, k)] * (d22 / (b * b * b))
                + p11[(k, k)] * (4.0 * d66 * a2 / b)
                + membrane[k];
            if s.is_nan() || s <= 0.0 {
                return None;
            }
            *slot = s.sqrt();
        }
        // Odd orders are the even indices (k = 1, 3, ...), even orders the odd ones.
        let m = SMatrix::<f64, HALF, HALF>::from_fn(|i, j| {
            let (r, c) = (2 * i, 2 * j + 1);
            -2.0 * alpha * p10[(r, c)] / (root[r] * root[c])
        });
        let top = (m.transpose() * m)
            .symmetric_eigenvalues()
            .iter()
            .copied()
            .fold(f64::NEG_INFINITY, f64::max);
        Some(top.max(0.0).sqrt())
    }

    /// Critical shear flow (either sign) at wave number `alpha` of a plate without `D16`,
    /// `D26`, with the transverse shear flexibility taken as in [`LongPlate::shear_at`].
    fn orthotropic_shear_at(
        &self,
        d: &Matrix3<f64>,
        b: f64,
        alpha: f64,
        s: ShearFlexibility,
    ) -> f64 {
        match self.orthotropic_shear_multiplier(d, b, alpha, None) {
            None => f64::NAN,
            Some(mu) if mu <= 0.0 => f64::INFINITY,
            Some(mu) => {
                let n_b = 1.0 / mu;
                if s.0.is_finite() { 1.0 / (1.0 / n_b + 1.0 / s.0) } else { n_b }
            }
        }
    }

    /// The shallow-shell membrane stiffness of a panel curved across its width (see
    /// [`Curvature`]) at wave number `alpha`, one term per sine of the simply supported basis:
    /// `p00_kk b alpha⁴ / (R² a*(alpha, beta_k))`, `beta_k = k pi / b`. The compatibility
    /// operator of an orthotropic wall maps each sine mode onto itself, so the term is diagonal
    /// (as in Batdorf's Galerkin solution for curved panels, NACA TN 1341, 1947). `None` for
    /// clamped edges, whose basis is not made of sines.
    fn membrane_terms(&self, b: f64, alpha: f64, c: &Curvature) -> Option<[f64; TERMS]> {
        if self.support != EdgeSupport::SimplySupported {
            return None;
        }
        let a = &c.compliance;
        let a2 = alpha * alpha;
        let mut out = [0.0; TERMS];
        for (k, slot) in out.iter_mut().enumerate() {
            let beta2 = ((k + 1) as f64 * std::f64::consts::PI / b).powi(2);
            let am = a[(1, 1)] * a2 * a2
                + (2.0 * a[(0, 1)] + a[(2, 2)]) * a2 * beta2
                + a[(0, 0)] * beta2 * beta2;
            *slot = self.unit.p00[(k, k)] * b * a2 * a2 / (c.radius * c.radius * am);
        }
        Some(out)
    }

    /// Critical shear flows `[positive, negative magnitude]` (N/m) of a long simply supported
    /// panel of width `b` curved across its width, least over the half-wavelength: the flat
    /// plate's Ritz solution (see [`LongPlate::shear`], solid wall) with the curvature's membrane
    /// stiffness added to each sine term, `p00_kk b alpha⁴ / (R² a*(alpha, beta_k))` with
    /// `beta_k = k pi / b`. The classical value, without a knock-down; for a wall with `D16`,
    /// `D26` the lower of the two signs for both. `None` for clamped edges.
    pub fn curved_shear(&self, d: &Matrix3<f64>, b: f64, c: &Curvature) -> Option<[f64; 2]> {
        if self.support != EdgeSupport::SimplySupported {
            return None;
        }
        let aspect = (d[(0, 0)] / d[(1, 1)]).powf(0.25);
        let base = b * if aspect.is_finite() && aspect > 0.0 { aspect } else { 1.0 };
        let alpha = |l: f64| std::f64::consts::PI / (base * l);
        let at = |l: f64| -> [f64; 2] {
            let a = alpha(l);
            let Some(m) = self.membrane_terms(b, a, c) else { return [f64::NAN; 2] };
            let mut k = self.stiffness(d, b, a);
            for (i, v) in m.iter().enumerate() {
                k[(i, i)] += v;
                k[(TERMS + i, TERMS + i)] += v;
            }
            let Some((hi, lo)) = Self::inverse_multipliers(&k, &self.shear_load(a)) else {
                return [f64::NAN; 2];
            };
            let invert = |mu: f64| if mu <= 0.0 { f64::INFINITY } else { 1.0 / mu };
            [invert(hi), invert(-lo)]
        };
        let tol = 1e-12 * (d[(0, 0)] + d[(1, 1)]);
        if d[(0, 2)].abs() <= tol && d[(1, 2)].abs() <= tol {
            // Without D16, D26 both signs buckle alike (see `orthotropic_shear_multiplier`, to
            // which the membrane terms add on the diagonal).
            let both = minimise(|l| {
                let a = alpha(l);
                let Some(m) = self.membrane_terms(b, a, c) else { return f64::NAN };
                match self.ss_orthotropic_shear_multiplier(d, b, a, &m) {
                    None => f64::NAN,
                    Some(mu) if mu <= 0.0 => f64::INFINITY,
                    Some(mu) => 1.0 / mu,
                }
            });
            return Some([both, both]);
        }
        // With D16, D26 the two signs differ; the lower is taken for both (one search instead
        // of two, on the safe side: the curvature's gain is what the curved value adds).
        let both = minimise(|l| {
            let [p, n] = at(l);
            p.min(n)
        });
        Some([both, both])
    }

    /// The least critical compression `-N_x` (N/m) over the half-wavelength (see
    /// [`LongPlate::critical`]).
    pub fn compression(&self, d: &Matrix3<f64>, b: f64, s: ShearFlexibility) -> f64 {
        let aspect = (d[(0, 0)] / d[(1, 1)]).powf(0.25);
        let base = b * if aspect.is_finite() && aspect > 0.0 { aspect } else { 1.0 };
        minimise(|l| self.compression_at(d, b, std::f64::consts::PI / (base * l), s))
    }

    /// The least critical shear flows `[positive, negative magnitude]` (N/m) over the
    /// half-wavelength (see [`LongPlate::critical`]).
    pub fn shear(&self, d: &Matrix3<f64>, b: f64, s: ShearFlexibility) -> [f64; 2] {
        let aspect = (d[(0, 0)] / d[(1, 1)]).powf(0.25);
        let base = b * if aspect.is_finite() && aspect > 0.0 { aspect } else { 1.0 };
        let alpha = |l: f64| std::f64::consts::PI / (base * l);
        // Without D16 and D26 the plate is its own mirror image along the span, which turns the
        // shear over: both signs buckle alike, and the eigenproblem is real (see
        // `orthotropic_shear_multiplier`).
        let tol = 1e-12 * (d[(0, 0)] + d[(1, 1)]);
        if d[(0, 2)].abs() <= tol && d[(1, 2)].abs() <= tol {
            let both = minimise(|l| self.orthotropic_shear_at(d, b, alpha(l), s));
            return [both, both];
        }
        let positive = minimise(|l| self.shear_at(d, b, alpha(l), s)[0]);
        let negative = minimise(|l| self.shear_at(d, b, alpha(l), s)[1]);
        [positive, negative]
    }

    /// The least critical loads over the half-wavelength, for bending stiffness `d` (N·m) and
    /// width `b` (m). The half-wavelength `lambda = pi/alpha` is scanned from 0.05 to 20 times
    /// `b (D11/D22)^(1/4)` on a logarithmic grid and refined by golden section about the least
    /// value.
    pub fn critical(&self, d: &Matrix3<f64>, b: f64, s: ShearFlexibility) -> PlateCritical {
        let compression = self.compression(d, b, s);
        let [shear_positive, shear_negative] = self.shear(d, b, s);
        PlateCritical { compression, shear_positive, shear_negative }
    }
}

/// Least value of a positive function of the half-wavelength ratio `l` over [0.05, 20]: a
/// logarithmic scan of 25 points, then golden section on the bracket about the least one.
pub(crate) fn minimise(f: impl Fn(f64) -> f64) -> f64 {
    let (lo, hi) = (0.05f64.ln(), 20f64.ln());
    let n = 25;
    let xs: Vec<f64> = (0..n).map(|i| lo + (hi - lo) * i as f64 / (n - 1) as f64).collect();
    let ys: Vec<f64> = xs
        .iter()
        .map(|&x| f(x.exp()))
        .map(|y| if y.is_nan() { f64::INFINITY } else { y })
        .collect();
    let (imin, &ymin) =
        ys.iter().enumerate().min_by(|a, b| a.1.total_cmp(b.1)).unwrap_or((0, &f64::INFINITY));
    if !ymin.is_finite() {
        return ymin;
    }
    let (mut a, mut c) = (xs[imin.saturating_sub(1)], xs[(imin + 1).min(n - 1)]);
    let g = 0.5 * (5f64.sqrt() - 1.0);
    let eval = |x: f64| {
        let y = f(x.exp());
        if y.is_nan() { f64::INFINITY } else { y }
    };
    let mut x1 = c - g * (c - a);
    let mut x2 = a + g * (c - a);
    let (mut f1, mut f2) = (eval(x1), eval(x2));
    for _ in 0..30 {
        if f1 < f2 {
            c = x2;
            x2 = x1;
            f2 = f1;
            x1 = c - g * (c - a);
            f1 = eval(x1);
        } else {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + g * (c - a);
            f2 = eval(x2);
        }
        // The least value is flat: a bracket of 1e-3 in ln(l) leaves an error near 1e-7.
        if (c - a).abs() < 1e-3 {
            break;
        }
    }
    ymin.min(f1).min(f2)
}

/// Bending stiffness for buckling of a laminate with coupling: `D* = D - B A^-1 B`, the reduced
/// bending stiffness (membrane strains free to follow the bending), which never exceeds `D` and
/// equals it for a symmetric laminate. Used for unsymmetric walls as a conservative value (the
/// reduced-bending-stiffness approximation discussed by Whitney 1987, ch. 5; from memory).
pub fn reduced_bending_stiffness(abd: &crate::laminate::Abd) -> Option<Matrix3<f64>> {
    let ai = abd.a.try_inverse()?;
    Some(abd.d - abd.b * ai * abd.b)
}

/// Closed form of a long specially orthotropic plate with simply supported long edges under
/// compression: `N_cr = (2 pi² / b²) (sqrt(D11 D22) + D12 + 2 D66)` (Whitney 1987, ch. 5; from
/// memory). For checks: the general solver above is what the program uses.
pub fn orthotropic_long_plate_ss(d: &Matrix3<f64>, b: f64) -> f64 {
    let pi2 = std::f64::consts::PI.powi(2);
    2.0 * pi2 / (b * b) * ((d[(0, 0)] * d[(1, 1)]).sqrt() + d[(0, 1)] + 2.0 * d[(2, 2)])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_sine_structure_gives_the_full_shear_multiplier() {
        // An orthotropic wall (invented), curved and flat: the 5x5 route of
        // `ss_orthotropic_shear_multiplier` against the full factorisation.
        let plate = LongPlate::new(EdgeSupport::SimplySupported);
        let d = Matrix3::new(12.0, 3.1, 0.0, 3.1, 5.0, 0.0, 0.0, 0.0, 3.7);
        let a = Matrix3::new(9e7, 2e7, 0.0, 2e7, 4e7, 0.0, 0.0, 0.0, 1.5e7);
        let c = Curvature { radius: 0.3, compliance: a.try_inverse().unwrap() };
        for (b, alpha) in [(0.1, 20.0), (0.25, 7.0), (0.6, 40.0)] {
            let m = plate.membrane_terms(b, alpha, &c).unwrap();
            let fast = plate.ss_orthotropic_shear_multiplier(&d, b, alpha, &m).unwrap();
            let full = plate.orthotropic_shear_multiplier(&d, b, alpha, Some(&m)).unwrap();
            assert!((fast / full - 1.0).abs() < 1e-10, "{fast} vs {full}");
            let flat = plate.ss_orthotropic_shear_multiplier(&d, b, alpha, &[0.0; TERMS]).unwrap();
            let full = plate.orthotropic_shear_multiplier(&d, b, alpha, None).unwrap();
            assert!((flat / full - 1.0).abs() < 1e-10, "{flat} vs {full}");
        }
    }

    #[test]
    fn gauss_legendre_integrates_polynomials_exactly() {
        let q = gauss_legendre(8);
        let s: f64 = q.iter().map(|(x, w)| w * x.powi(9)).sum();
        assert!((s - 0.1).abs() < 1e-14);
        let total: f64 = q.iter().map(|(_, w)| w).sum();
        assert!((total - 1.0).abs() < 1e-14);
    }

    #[test]
    fn clamped_basis_has_zero_slope_at_the_edges() {
        for k in 1..=TERMS {
            for eta in [0.0, 1.0] {
                let [v, d, _] = basis(EdgeSupport::Clamped, k, eta);
                assert!(v.abs() < 1e-12 && d.abs() < 1e-9, "k {k} eta {eta}: {v} {d}");
            }
        }
    }

    /// The real singular-value route for a plate without D16, D26 against the complex problem
    /// in its real embedding (twice the size, all eigenvalues): the two are the same
    /// eigenproblem, so they agree to rounding, at every wave number and for both supports.
    #[test]
    fn orthotropic_shear_matches_the_embedded_complex_problem() {
        // An invented specially orthotropic D (N·m), strongly unequal, and an isotropic one.
        let ds = [
            Matrix3::new(40.0, 3.0, 0.0, 3.0, 6.0, 0.0, 0.0, 0.0, 4.5),
            Matrix3::new(1.0, 0.3, 0.0, 0.3, 1.0, 0.0, 0.0, 0.0, 0.35),
        ];
        for support in [EdgeSupport::SimplySupported, EdgeSupport::Clamped] {
            let plate = LongPlate::new(support);
            for d in &ds {
                for b in [0.03, 0.4] {
                    for l in [0.1, 0.7, 1.0, 2.5, 12.0] {
                        let alpha = std::f64::consts::PI / (b * l);
                        let k = plate.stiffness(d, b, alpha);
                        let g = plate.shear_load(alpha);
                        let (hi, lo) = LongPlate::inverse_multipliers(&k, &g).expect("solvable");
                        let mu = plate
                            .orthotropic_shear_multiplier(d, b, alpha, None)
                            .expect("solvable");
                        assert!(
                            (mu - hi).abs() <= 1e-10 * hi,
                            "{support:?} b {b} l {l}: {mu} {hi}"
                        );
                        assert!(
                            (mu + lo).abs() <= 1e-10 * hi,
                            "{support:?} b {b} l {l}: {mu} {lo}"
                        );
                    }
                }
                // And the least over the half-wavelength, through the same minimiser.
                let b = 0.2;
                let rigid = ShearFlexibility(f64::INFINITY);
                let base = b * (d[(0, 0)] / d[(1, 1)]).powf(0.25);
                let general =
                    minimise(|l| plate.shear_at(d, b, std::f64::consts::PI / (base * l), rigid)[0]);
                let [pos, neg] = plate.shear(d, b, rigid);
                assert!((pos - general).abs() <= 1e-9 * general, "{support:?}: {pos} {general}");
                assert_eq!(pos, neg);
            }
        }
    }

    #[test]
    fn second_derivative_matches_a_finite_difference() {
        let h = 1e-4;
        for k in [1, 3, 7] {
            let eta = 0.37;
            let [_, d1m, _] = basis(EdgeSupport::Clamped, k, eta - h);
            let [_, d1p, _] = basis(EdgeSupport::Clamped, k, eta + h);
            let [_, _, d2] = basis(EdgeSupport::Clamped, k, eta);
            assert!(((d1p - d1m) / (2.0 * h) - d2).abs() < 1e-4 * d2.abs().max(1.0));
        }
    }
}

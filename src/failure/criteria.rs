//! The four criteria, each solved exactly for the load multiplier R along the load path
//! `sigma(R) = fixed + R * load`.

use nalgebra::Vector3;

use super::{CriteriaRatios, FailureMode, MaterialState, StrengthRatio};
use crate::material::{Lamina, LaminaKind, StrainLimits, Strengths};

/// A quadratic `a R² + b R + c` in the load multiplier; failure where it reaches zero.
#[derive(Debug, Clone, Copy)]
struct Quadratic {
    a: f64,
    b: f64,
    c: f64,
}

impl Quadratic {
    #[inline]
    fn at(&self, r: f64) -> f64 {
        (self.a * r + self.b) * r + self.c
    }

    /// The first R in `[lo, hi]` where the quadratic is at or above zero, approaching from `lo`.
    #[inline]
    fn first_failure(&self, lo: f64, hi: f64) -> Option<f64> {
        if self.at(lo) >= 0.0 {
            return Some(lo);
        }
        let Quadratic { a, b, c } = *self;
        if lo == 0.0 && a > 0.0 && c < 0.0 {
            // The roots have opposite signs (their product c/a is negative), and the sign of
            // the stable pair below tells which one is positive: c/q when q <= 0, q/a when
            // q >= 0. The other would be filtered out, so only the positive one is divided
            // out: the same root, bit for bit, with one division fewer.
            let disc = b * b - 4.0 * a * c;
            let q = -0.5 * (b + b.signum() * disc.sqrt());
            let r = if b.signum() > 0.0 { c / q } else { q / a };
            return (r.is_finite() && r > lo && r <= hi).then_some(r);
        }
        let mut roots = [f64::NAN; 2];
        if a == 0.0 {
            if b != 0.0 {
                roots[0] = -c / b;
            }
        } else {
            let disc = b * b - 4.0 * a * c;
            if disc >= 0.0 {
                // Numerically stable pair (Press et al., Numerical Recipes, 3rd ed., §5.6).
                let q = -0.5 * (b + b.signum() * disc.sqrt());
                if q != 0.0 {
                    roots[0] = q / a;
                    roots[1] = c / q;
                } else {
                    roots[0] = 0.0;
                }
            }
        }
        roots.into_iter().filter(|r| r.is_finite() && *r > lo && *r <= hi).reduce(f64::min)
    }
}

/// Splits `[0, inf)` where the linear path `p + R q` changes sign.
fn sign_change(p: f64, q: f64) -> Option<f64> {
    let r0 = -p / q;
    (q != 0.0 && r0 > 0.0 && r0.is_finite()).then_some(r0)
}

fn mode_for(isotropic: bool, m: FailureMode) -> FailureMode {
    if isotropic {
        match m {
            FailureMode::FibreTension | FailureMode::MatrixTension => FailureMode::Tension,
            FailureMode::FibreCompression | FailureMode::MatrixCompression => {
                FailureMode::Compression
            }
            other => other,
        }
    } else {
        m
    }
}

#[inline]
fn ratio(isotropic: bool, r: Option<f64>, mode: FailureMode) -> StrengthRatio {
    match r {
        Some(r) => StrengthRatio { ratio: r.max(0.0), mode: mode_for(isotropic, mode) },
        None => StrengthRatio::NEVER,
    }
}

/// The component that is nearest its own strength, as the mode of an interactive criterion.
fn dominant_mode(s: &Strengths, sigma: &Vector3<f64>) -> FailureMode {
    let f1 = if sigma.x >= 0.0 { sigma.x / s.xt } else { -sigma.x / s.xc };
    let f2 = if sigma.y >= 0.0 { sigma.y / s.yt } else { -sigma.y / s.yc };
    let f6 = sigma.z.abs() / s.s12;
    if f1 >= f2 && f1 >= f6 {
        if sigma.x >= 0.0 { FailureMode::FibreTension } else { FailureMode::FibreCompression }
    } else if f2 >= f6 {
        if sigma.y >= 0.0 { FailureMode::MatrixTension } else { FailureMode::MatrixCompression }
    } else {
        FailureMode::Shear
    }
}

/// The strength constants of one lamina that every criterion needs, computed once per material
/// ([`StrengthConstants::new`]) instead of at every ply face: the Tsai–Wu coefficients, the
/// strain limits (given or derived), Hashin's squared strengths and matrix-compression terms.
/// Each constant is the same expression as the criterion's own, so a ratio computed through the
/// constants is bit for bit the ratio of [`tsai_wu`], [`max_stress`], [`max_strain`] and
/// [`hashin`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StrengthConstants {
    isotropic: bool,
    strength: Option<Strengths>,
    strain: Option<StrainLimits>,
    /// Tsai–Wu F1, F2, F11, F22, F66, F12.
    tsai_wu: [f64; 6],
    hashin: Option<HashinConstants>,
}

#[derive(Debug, Clone, Copy, PartialEq)]
struct HashinConstants {
    xt2: f64,
    xc2: f64,
    yt2: f64,
    /// 1 / S12².
    shear: f64,
    /// 1 / (4 S23²).
    m2: f64,
    /// (Yc / 2 S23)² - 1.
    k: f64,
    yc: f64,
}

impl StrengthConstants {
    /// The constants of `lamina`.
    pub fn new(lamina: &Lamina) -> Self {
        let isotropic = lamina.kind == LaminaKind::Isotropic;
        let tsai_wu = lamina.strength.map_or([0.0; 6], |s| {
            let f11 = 1.0 / (s.xt * s.xc);
            let f22 = 1.0 / (s.yt * s.yc);
            [
                1.0 / s.xt - 1.0 / s.xc,
                1.0 / s.yt - 1.0 / s.yc,
                f11,
                f22,
                1.0 / (s.s12 * s.s12),
                lamina.f12_star * (f11 * f22).sqrt(),
            ]
        });
        let hashin = match lamina.strength {
            Some(s) if !isotropic => {
                let st = lamina.s23.unwrap_or(s.yc / 2.0);
                Some(HashinConstants {
                    xt2: s.xt * s.xt,
                    xc2: s.xc * s.xc,
                    yt2: s.yt * s.yt,
                    shear: 1.0 / (s.s12 * s.s12),
                    m2: 1.0 / (4.0 * st * st),
                    k: (s.yc / (2.0 * st)).powi(2) - 1.0,
                    yc: s.yc,
                })
            }
            _ => None,
        };
        StrengthConstants {
            isotropic,
            strength: lamina.strength,
            strain: lamina.effective_strain_limits(),
            tsai_wu,
            hashin,
        }
    }

    /// Tsai–Wu strength ratio; see [`tsai_wu`].
    #[inline]
    pub fn tsai_wu(&self, load: &Vector3<f64>, fixed: &Vector3<f64>) -> Option<StrengthRatio> {
        let s = self.strength?;
        let [f1, f2, f11, f22, f66, f12] = self.tsai_wu;
        let (p, q) = (fixed, load);
        let quad = Quadratic {
            a: f11 * q.x * q.x + f22 * q.y * q.y + f66 * q.z * q.z + 2.0 * f12 * q.x * q.y,
            b: f1 * q.x
                + f2 * q.y
                + 2.0 * (f11 * p.x * q.x + f22 * p.y * q.y + f66 * p.z * q.z)
                + 2.0 * f12 * (p.x * q.y + p.y * q.x),
            c: f1 * p.x
                + f2 * p.y
                + f11 * p.x * p.x
                + f22 * p.y * p.y
                + f66 * p.z * p.z
                + 2.0 * f12 * p.x * p.y
                - 1.0,
        };
        let r = quad.first_failure(0.0, f64::INFINITY);
        let mode = match r {
            Some(r) => dominant_mode(&s, &(p + q * r)),
            None => FailureMode::None,
        };
        Some(ratio(self.isotropic, r, mode))
    }

    /// Maximum-stress strength ratio; see [`max_stress`].
    #[inline]
    pub fn max_stress(&self, load: &Vector3<f64>, fixed: &Vector3<f64>) -> Option<StrengthRatio> {
        let s = self.strength?;
        Some(componentwise(self.isotropic, load, fixed, [s.xt, s.xc, s.yt, s.yc, s.s12]))
    }

    /// Maximum-strain strength ratio on mechanical strains; see [`max_strain`].
    #[inline]
    pub fn max_strain(&self, load: &Vector3<f64>, fixed: &Vector3<f64>) -> Option<StrengthRatio> {
        let e = self.strain?;
        Some(componentwise(self.isotropic, load, fixed, [e.e1t, e.e1c, e.e2t, e.e2c, e.g12]))
    }

    /// Hashin's plane-stress strength ratio; see [`hashin`]. Only the forms the load path
    /// reaches are built.
    #[inline]
    pub fn hashin(&self, load: &Vector3<f64>, fixed: &Vector3<f64>) -> Option<StrengthRatio> {
        let h = self.hashin?;
        let (p, q) = (fixed, load);
        let k = h.shear;
        let (sa, sb, sc) = (q.z * q.z * k, 2.0 * p.z * q.z * k, p.z * p.z * k);
        let (rf, ft) = signed_family(p.x, q.x, |tensile| {
            if tensile {
                Quadratic {
                    a: q.x * q.x / h.xt2 + sa,
                    b: 2.0 * p.x * q.x / h.xt2 + sb,
                    c: p.x * p.x / h.xt2 + sc - 1.0,
                }
            } else {
                Quadratic {
                    a: q.x * q.x / h.xc2,
                    b: 2.0 * p.x * q.x / h.xc2,
                    c: p.x * p.x / h.xc2 - 1.0,
                }
            }
        });
        let (rm, mt) = signed_family(p.y, q.y, |tensile| {
            if tensile {
                Quadratic {
                    a: q.y * q.y / h.yt2 + sa,
                    b: 2.0 * p.y * q.y / h.yt2 + sb,
                    c: p.y * p.y / h.yt2 + sc - 1.0,
                }
            } else {
                Quadratic {
                    a: q.y * q.y * h.m2 + sa,
                    b: 2.0 * p.y * q.y * h.m2 + h.k * q.y / h.yc + sb,
                    c: p.y * p.y * h.m2 + h.k * p.y / h.yc + sc - 1.0,
                }
            }
        });
        let fibre = ratio(
            self.isotropic,
            rf,
            if ft { FailureMode::FibreTension } else { FailureMode::FibreCompression },
        );
        let matrix = ratio(
            self.isotropic,
            rm,
            if mt { FailureMode::MatrixTension } else { FailureMode::MatrixCompression },
        );
        Some(if matrix.ratio < fibre.ratio { matrix } else { fibre })
    }

    /// Strength ratios by every criterion for a ply point with load part `load` and fixed part
    /// `fixed`; see [`super::evaluate_all`].
    #[inline]
    pub fn evaluate_all(&self, load: &MaterialState, fixed: &MaterialState) -> CriteriaRatios {
        CriteriaRatios {
            tsai_wu: self.tsai_wu(&load.stress, &fixed.stress),
            max_stress: self.max_stress(&load.stress, &fixed.stress),
            max_strain: self.max_strain(&load.strain, &fixed.strain),
            hashin: self.hashin(&load.stress, &fixed.stress),
        }
    }
}

/// Tsai–Wu strength ratio (Tsai & Wu 1971; strength ratio as in Kaw 2006, Example 2.19).
/// `None` when the lamina has no strengths.
pub fn tsai_wu(
    lamina: &Lamina,
    load: &Vector3<f64>,
    fixed: &Vector3<f64>,
) -> Option<StrengthRatio> {
    StrengthConstants::new(lamina).tsai_wu(load, fixed)
}

/// The multiplier at which `p + R q` first reaches `upper` or `-lower`.
#[inline]
fn linear_limit(p: f64, q: f64, upper: f64, lower: f64) -> (Option<f64>, bool) {
    if p >= upper {
        return (Some(0.0), true);
    }
    if p <= -lower {
        return (Some(0.0), false);
    }
    if q > 0.0 {
        (Some((upper - p) / q), true)
    } else if q < 0.0 {
        (Some((-lower - p) / q), false)
    } else {
        (None, true)
    }
}

#[inline]
fn componentwise(
    isotropic: bool,
    load: &Vector3<f64>,
    fixed: &Vector3<f64>,
    limits: [f64; 5],
) -> StrengthRatio {
    let [l1t, l1c, l2t, l2c, l6] = limits;
    let (r1, t1) = linear_limit(fixed.x, load.x, l1t, l1c);
    let (r2, t2) = linear_limit(fixed.y, load.y, l2t, l2c);
    let (r6, _) = linear_limit(fixed.z, load.z, l6, l6);
    let mode1 = if t1 { FailureMode::FibreTension } else { FailureMode::FibreCompression };
    let mode2 = if t2 { FailureMode::MatrixTension } else { FailureMode::MatrixCompression };
    // The least in the total order of f64, the first on a tie (as `min_by`).
    let mut best: Option<StrengthRatio> = None;
    for (r, m) in [(r1, mode1), (r2, mode2), (r6, FailureMode::Shear)] {
        if let Some(r) = r {
            let v = ratio(isotropic, Some(r), m);
            match best {
                Some(b) if v.ratio.total_cmp(&b.ratio) != std::cmp::Ordering::Less => {}
                _ => best = Some(v),
            }
        }
    }
    best.unwrap_or(StrengthRatio::NEVER)
}

/// Maximum-stress strength ratio (Kaw 2006, §2.8.1 and Example 2.16).
pub fn max_stress(
    lamina: &Lamina,
    load: &Vector3<f64>,
    fixed: &Vector3<f64>,
) -> Option<StrengthRatio> {
    StrengthConstants::new(lamina).max_stress(load, fixed)
}

/// Maximum-strain strength ratio on mechanical strains in material axes (Kaw 2006, §2.8.2),
/// with the strain limits given or derived from strengths over moduli.
pub fn max_strain(
    lamina: &Lamina,
    load: &Vector3<f64>,
    fixed: &Vector3<f64>,
) -> Option<StrengthRatio> {
    StrengthConstants::new(lamina).max_strain(load, fixed)
}

/// First failure along the path for a mode family whose form depends on the sign of one
/// component: the form `quad(true)` applies where that component is >= 0, `quad(false)` where
/// it is < 0; only the forms on the path are built.
#[inline]
fn signed_family(p: f64, q: f64, quad: impl Fn(bool) -> Quadratic) -> (Option<f64>, bool) {
    // The sign on the first stretch is that of p (of q when p = 0); it flips at the sign
    // change. Deciding it from p + R q at the boundary would let round-off pick the wrong form.
    let first_tensile = if p != 0.0 { p > 0.0 } else { q >= 0.0 };
    match sign_change(p, q) {
        Some(r0) => {
            if let Some(r) = quad(first_tensile).first_failure(0.0, r0) {
                return (Some(r), first_tensile);
            }
            if let Some(r) = quad(!first_tensile).first_failure(r0, f64::INFINITY) {
                return (Some(r), !first_tensile);
            }
            (None, true)
        }
        None => match quad(first_tensile).first_failure(0.0, f64::INFINITY) {
            Some(r) => (Some(r), first_tensile),
            None => (None, true),
        },
    }
}

/// Hashin's plane-stress criteria (Hashin 1980, Eq. 23–26 with sigma3 = tau13 = tau23 = 0):
/// fibre tension (sigma1/Xt)² + (tau12/S12)² = 1; fibre compression |sigma1| = Xc; matrix
/// tension (sigma2/Yt)² + (tau12/S12)² = 1; matrix compression
/// (sigma2/2S23)² + [(Yc/2S23)² - 1] sigma2/Yc + (tau12/S12)² = 1. `None` for isotropic layers
/// and laminae without strengths.
pub fn hashin(lamina: &Lamina, load: &Vector3<f64>, fixed: &Vector3<f64>) -> Option<StrengthRatio> {
    StrengthConstants::new(lamina).hashin(load, fixed)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn t300() -> Lamina {
        // T300/5208 (Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1).
        Lamina::builder("t300")
            .elastic(181e9, 10.3e9, 7.17e9, 0.28)
            .ply_thickness(0.125e-3)
            .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
            .build()
            .unwrap()
    }

    #[test]
    fn hashin_follows_a_path_from_residual_compression_into_tension() {
        // Residual sigma1 = -54.6 MPa, load part +188.9 MPa per unit multiplier: the fibre
        // stress passes through zero at R = 0.289 and then fails in tension at sigma1 = Xt,
        // R = (1500 + 54.6)/188.9 = 8.230 (by hand). With Xc = 1200 MPa the compressive form,
        // wrongly applied past the sign change, would give (1200 + 54.6)/188.9 = 6.642.
        let l = Lamina {
            strength: Some(Strengths { xc: 1200e6, ..t300().strength.unwrap() }),
            ..t300()
        };
        let fixed = Vector3::new(-54.6e6, 0.0, 0.0);
        let load = Vector3::new(188.9e6, 0.0, 0.0);
        let r = hashin(&l, &load, &fixed).unwrap();
        assert!((r.ratio - (1500.0 + 54.6) / 188.9).abs() < 1e-9, "{r:?}");
        assert_eq!(r.mode, FailureMode::FibreTension);
        // The same for the matrix family: residual sigma2 = -20 MPa, load +30 MPa: tension
        // failure at sigma2 = Yt, R = (40 + 20)/30 = 2.
        let r = hashin(&l, &Vector3::new(0.0, 30e6, 0.0), &Vector3::new(0.0, -20e6, 0.0)).unwrap();
        assert!((r.ratio - 2.0).abs() < 1e-9, "{r:?}");
        assert_eq!(r.mode, FailureMode::MatrixTension);
    }

    /// The root of the stable pair (Press et al., Numerical Recipes, 3rd ed., §5.6) as written
    /// before the one-division path: both roots divided out, the least in range kept.
    fn both_roots(q: &Quadratic, lo: f64, hi: f64) -> Option<f64> {
        if q.at(lo) >= 0.0 {
            return Some(lo);
        }
        let Quadratic { a, b, c } = *q;
        let mut roots = [f64::NAN; 2];
        let disc = b * b - 4.0 * a * c;
        if a != 0.0 && disc >= 0.0 {
            let s = -0.5 * (b + b.signum() * disc.sqrt());
            if s != 0.0 {
                roots = [s / a, c / s];
            } else {
                roots[0] = 0.0;
            }
        } else if a == 0.0 && b != 0.0 {
            roots[0] = -c / b;
        }
        roots.into_iter().filter(|r| r.is_finite() && *r > lo && *r <= hi).reduce(f64::min)
    }

    #[test]
    fn one_division_root_is_the_pair_root_bit_for_bit() {
        // A deterministic spread of quadratics with a > 0, c < 0 (opposite-signed roots) over
        // many decades and both signs of b, including b = +0 and -0 and huge values.
        let mut state = 0x2545_f491_4f6c_dd1d_u64;
        let mut next = || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            state
        };
        let value = |n: u64| {
            let m = (n >> 11) as f64 / (1u64 << 53) as f64;
            let e = ((n & 0x7ff) % 80) as i32 - 40;
            m * 10f64.powi(e)
        };
        let specials = [0.0, -0.0, 1e300, -1e300, f64::MIN_POSITIVE];
        for i in 0..200_000 {
            let a = value(next());
            let c = -value(next());
            let b = if i % 97 == 0 {
                specials[i % specials.len()]
            } else if next() % 2 == 0 {
                value(next())
            } else {
                -value(next())
            };
            let hi = if i % 3 == 0 { f64::INFINITY } else { value(next()) };
            let q = Quadratic { a, b, c };
            let fast = q.first_failure(0.0, hi);
            let slow = both_roots(&q, 0.0, hi);
            assert_eq!(fast.map(f64::to_bits), slow.map(f64::to_bits), "{a} {b} {c} {hi}");
        }
    }

    #[test]
    fn quadratic_first_failure_finds_the_positive_root() {
        // 4 R² - 1 = 0 -> R = 0.5.
        let q = Quadratic { a: 4.0, b: 0.0, c: -1.0 };
        assert!((q.first_failure(0.0, f64::INFINITY).unwrap() - 0.5).abs() < 1e-15);
        // Already failed at R = 0.
        let q = Quadratic { a: 1.0, b: 0.0, c: 0.5 };
        assert_eq!(q.first_failure(0.0, f64::INFINITY), Some(0.0));
        // Never fails: no real root.
        let q = Quadratic { a: 0.0, b: -1.0, c: -1.0 };
        assert_eq!(q.first_failure(0.0, f64::INFINITY), None);
    }
}

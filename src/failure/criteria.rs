//! The four criteria, each solved exactly for the load multiplier R along the load path
//! `sigma(R) = fixed + R * load`.

use nalgebra::Vector3;

use super::{FailureMode, StrengthRatio};
use crate::material::{Lamina, LaminaKind, Strengths};

/// A quadratic `a R² + b R + c` in the load multiplier; failure where it reaches zero.
#[derive(Debug, Clone, Copy)]
struct Quadratic {
    a: f64,
    b: f64,
    c: f64,
}

impl Quadratic {
    fn at(&self, r: f64) -> f64 {
        (self.a * r + self.b) * r + self.c
    }

    /// The first R in `[lo, hi]` where the quadratic is at or above zero, approaching from `lo`.
    fn first_failure(&self, lo: f64, hi: f64) -> Option<f64> {
        if self.at(lo) >= 0.0 {
            return Some(lo);
        }
        let Quadratic { a, b, c } = *self;
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

fn mode_for(lamina: &Lamina, m: FailureMode) -> FailureMode {
    if lamina.kind == LaminaKind::Isotropic {
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

fn ratio(lamina: &Lamina, r: Option<f64>, mode: FailureMode) -> StrengthRatio {
    match r {
        Some(r) => StrengthRatio { ratio: r.max(0.0), mode: mode_for(lamina, mode) },
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

/// Tsai–Wu strength ratio (Tsai & Wu 1971; strength ratio as in Kaw 2006, Example 2.19).
/// `None` when the lamina has no strengths.
pub fn tsai_wu(
    lamina: &Lamina,
    load: &Vector3<f64>,
    fixed: &Vector3<f64>,
) -> Option<StrengthRatio> {
    let s = lamina.strength?;
    let f1 = 1.0 / s.xt - 1.0 / s.xc;
    let f2 = 1.0 / s.yt - 1.0 / s.yc;
    let f11 = 1.0 / (s.xt * s.xc);
    let f22 = 1.0 / (s.yt * s.yc);
    let f66 = 1.0 / (s.s12 * s.s12);
    let f12 = lamina.f12_star * (f11 * f22).sqrt();
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
    Some(ratio(lamina, r, mode))
}

/// The multiplier at which `p + R q` first reaches `upper` or `-lower`.
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

fn componentwise(
    lamina: &Lamina,
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
    [(r1, mode1), (r2, mode2), (r6, FailureMode::Shear)]
        .into_iter()
        .filter_map(|(r, m)| r.map(|r| ratio(lamina, Some(r), m)))
        .min_by(|a, b| a.ratio.total_cmp(&b.ratio))
        .unwrap_or(StrengthRatio::NEVER)
}

/// Maximum-stress strength ratio (Kaw 2006, §2.8.1 and Example 2.16).
pub fn max_stress(
    lamina: &Lamina,
    load: &Vector3<f64>,
    fixed: &Vector3<f64>,
) -> Option<StrengthRatio> {
    let s = lamina.strength?;
    Some(componentwise(lamina, load, fixed, [s.xt, s.xc, s.yt, s.yc, s.s12]))
}

/// Maximum-strain strength ratio on mechanical strains in material axes (Kaw 2006, §2.8.2),
/// with the strain limits given or derived from strengths over moduli.
pub fn max_strain(
    lamina: &Lamina,
    load: &Vector3<f64>,
    fixed: &Vector3<f64>,
) -> Option<StrengthRatio> {
    let e = lamina.effective_strain_limits()?;
    Some(componentwise(lamina, load, fixed, [e.e1t, e.e1c, e.e2t, e.e2c, e.g12]))
}

/// First failure along the path for a mode family whose form depends on the sign of one
/// component: `tension` applies where that component is >= 0, `compression` where it is < 0.
fn signed_family(
    p: f64,
    q: f64,
    tension: Quadratic,
    compression: Quadratic,
) -> (Option<f64>, bool) {
    // The sign on the first stretch is that of p (of q when p = 0); it flips at the sign
    // change. Deciding it from p + R q at the boundary would let round-off pick the wrong form.
    let first_tensile = if p != 0.0 { p > 0.0 } else { q >= 0.0 };
    let none = (f64::NAN, f64::NAN, true);
    let windows = match sign_change(p, q) {
        Some(r0) => [(0.0, r0, first_tensile), (r0, f64::INFINITY, !first_tensile)],
        None => [(0.0, f64::INFINITY, first_tensile), none],
    };
    for (lo, hi, tensile) in windows.into_iter().filter(|w| !w.0.is_nan()) {
        let quad = if tensile { tension } else { compression };
        if let Some(r) = quad.first_failure(lo, hi) {
            return (Some(r), tensile);
        }
    }
    (None, true)
}

/// Hashin's plane-stress criteria (Hashin 1980, Eq. 23–26 with sigma3 = tau13 = tau23 = 0):
/// fibre tension (sigma1/Xt)² + (tau12/S12)² = 1; fibre compression |sigma1| = Xc; matrix
/// tension (sigma2/Yt)² + (tau12/S12)² = 1; matrix compression
/// (sigma2/2S23)² + [(Yc/2S23)² - 1] sigma2/Yc + (tau12/S12)² = 1. `None` for isotropic layers
/// and laminae without strengths.
pub fn hashin(lamina: &Lamina, load: &Vector3<f64>, fixed: &Vector3<f64>) -> Option<StrengthRatio> {
    if lamina.kind == LaminaKind::Isotropic {
        return None;
    }
    let s = lamina.strength?;
    let st = lamina.s23.unwrap_or(s.yc / 2.0);
    let (p, q) = (fixed, load);
    let shear = |k: f64| (q.z * q.z * k, 2.0 * p.z * q.z * k, p.z * p.z * k);
    let (sa, sb, sc) = shear(1.0 / (s.s12 * s.s12));
    let fibre_t = Quadratic {
        a: q.x * q.x / (s.xt * s.xt) + sa,
        b: 2.0 * p.x * q.x / (s.xt * s.xt) + sb,
        c: p.x * p.x / (s.xt * s.xt) + sc - 1.0,
    };
    let fibre_c = Quadratic {
        a: q.x * q.x / (s.xc * s.xc),
        b: 2.0 * p.x * q.x / (s.xc * s.xc),
        c: p.x * p.x / (s.xc * s.xc) - 1.0,
    };
    let matrix_t = Quadratic {
        a: q.y * q.y / (s.yt * s.yt) + sa,
        b: 2.0 * p.y * q.y / (s.yt * s.yt) + sb,
        c: p.y * p.y / (s.yt * s.yt) + sc - 1.0,
    };
    let k = (s.yc / (2.0 * st)).powi(2) - 1.0;
    let m2 = 1.0 / (4.0 * st * st);
    let matrix_c = Quadratic {
        a: q.y * q.y * m2 + sa,
        b: 2.0 * p.y * q.y * m2 + k * q.y / s.yc + sb,
        c: p.y * p.y * m2 + k * p.y / s.yc + sc - 1.0,
    };
    let (rf, ft) = signed_family(p.x, q.x, fibre_t, fibre_c);
    let (rm, mt) = signed_family(p.y, q.y, matrix_t, matrix_c);
    let fibre = ratio(
        lamina,
        rf,
        if ft { FailureMode::FibreTension } else { FailureMode::FibreCompression },
    );
    let matrix = ratio(
        lamina,
        rm,
        if mt { FailureMode::MatrixTension } else { FailureMode::MatrixCompression },
    );
    Some(if matrix.ratio < fibre.ratio { matrix } else { fibre })
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

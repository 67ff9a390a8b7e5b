//! Laws of classical laminate theory and of the strength ratios, as property tests over random
//! materials, stacks and loads (proptest, fixed seed, modest case counts).
//!
//! Tolerances: every law is exact in exact arithmetic; the sums and the 6x6 inverse lose a few
//! digits to the spread of the matrix entries, so relative tolerances of 1e-9 (1e-7 through an
//! inverse) leave a wide margin above round-off while still catching any real error, which
//! would show at the percent level.

use layloft::failure::{Criterion, LaminateStrength};
use layloft::laminate::{
    self, Laminate, LaminateLoad, LaminateResponse, Ply, Resultants, strain_to_material,
};
use layloft::material::Lamina;
use layloft::units::Angle;
use nalgebra::{Matrix3, Vector3};
use proptest::prelude::*;
use proptest::test_runner::{Config, RngSeed};
use std::sync::Arc;

fn config(cases: u32) -> Config {
    Config {
        cases,
        rng_seed: RngSeed::Fixed(0x01a7_10f7),
        failure_persistence: None,
        ..Config::default()
    }
}

/// A plausible fibre lamina: E1 20–250 GPa, E2 3–25 GPa, G12 2–10 GPa, nu12 0.15–0.4.
fn lamina() -> impl Strategy<Value = Lamina> {
    (20e9..250e9f64, 3e9..25e9f64, 2e9..10e9f64, 0.15..0.4f64, 0.05e-3..0.5e-3f64).prop_map(
        |(e1, e2, g12, nu12, t)| {
            Lamina::builder("random")
                .elastic(e1.max(e2), e2, g12, nu12)
                .ply_thickness(t)
                .strengths(1500e6, 1000e6, 45e6, 180e6, 70e6)
                .s23(60e6)
                .build()
                .expect("valid by construction")
        },
    )
}

fn angles(max: usize) -> impl Strategy<Value = Vec<f64>> {
    prop::collection::vec(-90.0..90.0f64, 1..=max)
}

fn stack(m: &Lamina, angles: &[f64]) -> Laminate {
    let m = Arc::new(m.clone());
    Laminate::new(angles.iter().map(|&a| Ply::new(m.clone(), Angle::from_deg(a))).collect())
}

fn assert_close(a: &Matrix3<f64>, b: &Matrix3<f64>, rel: f64, what: &str) {
    let scale = a.amax().max(b.amax()).max(f64::MIN_POSITIVE);
    assert!((a - b).amax() <= rel * scale, "{what}: {a} vs {b}");
}

fn respond(lam: &Laminate, n: [f64; 3], m: [f64; 3]) -> LaminateResponse {
    let load = Resultants { n: Vector3::from(n), m: Vector3::from(m) };
    lam.response(&LaminateLoad::Resultants(load), 0.0).expect("a stack of fibre plies is stiff")
}

proptest! {
    #![proptest_config(config(64))]

    /// A stack mirrored about its midplane has B = 0 (Jones 1999, §4.3.1).
    #[test]
    fn symmetric_layups_have_no_coupling(m in lamina(), half in angles(8)) {
        let mut all = half.clone();
        all.extend(half.iter().rev());
        let lam = stack(&m, &all);
        let abd = lam.abd();
        let scale = abd.a.amax() * lam.thickness();
        prop_assert!(abd.b.amax() <= 1e-12 * scale, "B = {}", abd.b);
    }

    /// A pi/n laminate (n >= 3 equally spaced angles) is quasi-isotropic: rotating the whole
    /// stack leaves Ex unchanged (Jones 1999, §4.5; Tsai & Pagano 1968).
    #[test]
    fn quasi_isotropic_layups_have_one_in_plane_modulus(
        m in lamina(), n in 3usize..7, start in -90.0..90.0f64, turn in -180.0..180.0f64,
    ) {
        let base: Vec<f64> = (0..n).map(|k| start + 180.0 * k as f64 / n as f64).collect();
        let mut sym = base.clone();
        sym.extend(base.iter().rev());
        let ex = stack(&m, &sym).membrane_constants().unwrap().ex;
        let turned: Vec<f64> = sym.iter().map(|a| a + turn).collect();
        let ex_turned = stack(&m, &turned).membrane_constants().unwrap().ex;
        prop_assert!((ex - ex_turned).abs() <= 1e-9 * ex, "{ex} vs {ex_turned}");
    }

    /// Turning every ply by psi turns A, B and D as second-order tensors:
    /// A(theta + psi) = T(psi)^T A(theta) T(psi) with T the engineering-strain rotation, since
    /// Q-bar(theta + psi) = T(psi)^T Q-bar(theta) T(psi) (Kaw 2006, Eq. 2.104).
    #[test]
    fn turning_a_layup_turns_its_stiffness(
        m in lamina(), a in angles(10), psi in -180.0..180.0f64,
    ) {
        let lam = stack(&m, &a);
        let turned: Vec<f64> = a.iter().map(|x| x + psi).collect();
        let t = strain_to_material(Angle::from_deg(psi));
        let (abd, abd_t) = (lam.abd(), stack(&m, &turned).abd());
        assert_close(&abd_t.a, &(t.transpose() * abd.a * t), 1e-9, "A");
        assert_close(&abd_t.b, &(t.transpose() * abd.b * t), 1e-9, "B");
        assert_close(&abd_t.d, &(t.transpose() * abd.d * t), 1e-9, "D");
    }

    /// Without residual stresses every strength ratio scales as 1/k when the load is scaled
    /// by k > 0 (Kaw 2006, §2.8: the ratio multiplies the applied stress).
    #[test]
    fn strength_ratios_scale_inversely_with_the_load(
        m in lamina(), a in angles(8), n in prop::array::uniform3(-1e5..1e5f64),
        mm in prop::array::uniform3(-20.0..20.0f64), k in 0.01..100.0f64,
    ) {
        let lam = stack(&m, &a);
        let base = LaminateStrength::evaluate(&lam, &respond(&lam, n, mm));
        let scaled_n = n.map(|x| x * k);
        let scaled_m = mm.map(|x| x * k);
        let scaled = LaminateStrength::evaluate(&lam, &respond(&lam, scaled_n, scaled_m));
        for (p, q) in base.plies.iter().zip(&scaled.plies) {
            for (r, s) in [(p.top, q.top), (p.bottom, q.bottom)] {
                for c in Criterion::ALL {
                    let (r, s) = (r.by(c).unwrap(), s.by(c).unwrap());
                    if r.ratio.is_finite() {
                        prop_assert!((s.ratio * k - r.ratio).abs() <= 1e-9 * r.ratio,
                            "{c}: {} at k = {k} vs {}", s.ratio, r.ratio);
                        prop_assert_eq!(r.mode, s.mode);
                    } else {
                        prop_assert!(s.ratio.is_infinite());
                    }
                }
            }
        }
    }

    /// [A B; B D] is symmetric, and so is its inverse, which inverts it (Jones 1999, §4.2).
    #[test]
    fn abd_is_symmetric_and_its_compliance_inverts_it(m in lamina(), a in angles(12)) {
        let lam = stack(&m, &a);
        let k = lam.abd().matrix();
        let c = lam.abd().compliance().unwrap();
        prop_assert!((k - k.transpose()).amax() <= 1e-12 * k.amax());
        prop_assert!((c - c.transpose()).amax() <= 1e-9 * c.amax());
        // Scaled identity check: D^-1/2 K C D^1/2 = I with D the diagonal of K.
        let s = k.diagonal().map(|v| v.sqrt());
        let id = nalgebra::Matrix6::from_fn(|i, j| (k * c)[(i, j)] * s[j] / s[i]);
        prop_assert!((id - nalgebra::Matrix6::identity()).amax() <= 1e-7, "{id}");
    }

    /// Q-bar is unchanged by turning a ply through 180° (a ply has no fibre direction sense).
    #[test]
    fn q_bar_is_invariant_under_a_half_turn(m in lamina(), theta in -180.0..180.0f64) {
        let q = laminate::transformed_stiffness(&m, Angle::from_deg(theta));
        let q_turned = laminate::transformed_stiffness(&m, Angle::from_deg(theta + 180.0));
        assert_close(&q, &q_turned, 1e-12, "Q-bar");
    }

    /// The ply stresses integrate back to the applied resultants: N = sum of the ply mean
    /// stress times thickness, M = sum of the exact integral of a linear stress times z
    /// (equilibrium through the thickness, Kaw 2006, Eq. 4.24–4.25).
    #[test]
    fn ply_stresses_integrate_to_the_applied_resultants(
        m in lamina(), a in angles(10), n in prop::array::uniform3(-1e5..1e5f64),
        mm in prop::array::uniform3(-20.0..20.0f64),
    ) {
        let lam = stack(&m, &a);
        let resp = respond(&lam, n, mm);
        let (mut nn, mut mo) = (Vector3::zeros(), Vector3::zeros());
        for (p, (zt, zb)) in resp.plies.iter().zip(lam.ply_bounds()) {
            let (st, sb) = (p.top.stress_xy, p.bottom.stress_xy);
            nn += (st + sb) * (zt - zb) / 2.0;
            // Exact for a linear stress: Simpson's rule on sigma(z) z, a quadratic.
            let mid = (st + sb) / 2.0 * ((zt + zb) / 2.0);
            mo += (st * zt + mid * 4.0 + sb * zb) * (zt - zb) / 6.0;
        }
        let h = lam.thickness();
        let scale = Vector3::from(n).amax().max(Vector3::from(mm).amax() / h).max(1.0);
        prop_assert!((nn - Vector3::from(n)).amax() <= 1e-8 * scale, "N {nn}");
        prop_assert!((mo - Vector3::from(mm)).amax() <= 1e-8 * scale * h, "M {mo}");
    }
}

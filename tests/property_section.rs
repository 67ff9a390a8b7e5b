//! Laws the section solver must obey for any layout: a symmetric positive definite stiffness,
//! the parallel-axis transformation under a move of the reference point, the mirror symmetry of
//! a section reflected about the chord with mirrored ply angles, and equilibrium of the
//! transverse shear flow.

use crate::common::*;
use layloft::section::{SectionLayout, SectionParams, SolvedSection};
use nalgebra::{Matrix4, SymmetricEigen, Vector4};
use proptest::prelude::*;

/// An elliptical outline (semi-axes a, b), a skin of the given ply angles, a thicker cap on the
/// upper and lower middle third, and a web at `web` of the chord.
fn ellipse(a: f64, b: f64, angles: &[f64], web: f64) -> SectionLayout {
    let m = as4_chandra();
    let skin = plies(&m, angles);
    let cap_angles: Vec<f64> = angles.iter().chain(angles).copied().collect();
    let cap = plies(&m, &cap_angles);
    let n = 160;
    let outer: Vec<[f64; 2]> = (0..n)
        .map(|i| {
            let t = std::f64::consts::PI - 2.0 * std::f64::consts::PI * i as f64 / n as f64;
            [a * t.cos(), b * t.sin()]
        })
        .collect();
    let seg = (0..n)
        .map(|i| {
            let y = 0.5 * (outer[i][0] + outer[(i + 1) % n][0]);
            usize::from(y.abs() < a / 3.0)
        })
        .collect();
    let mut l = tube(a, n, skin);
    l.outer = outer;
    l.segment_laminate = seg;
    l.laminates.push(cap);
    l.chord = 2.0 * a;
    with_web(l, "web", a * (2.0 * web - 1.0), 0)
}

fn solve(l: &SectionLayout) -> SolvedSection {
    SolvedSection::solve(l, &SectionParams::default()).expect("section solves")
}

/// Relative difference of two stiffness matrices, scaled by their diagonals.
fn scaled_diff(a: &Matrix4<f64>, b: &Matrix4<f64>) -> f64 {
    let d = a.diagonal().map(|v| 1.0 / v.abs().sqrt());
    let s = Matrix4::from_diagonal(&d);
    (s * (a - b) * s).abs().max()
}

fn angles() -> impl Strategy<Value = Vec<f64>> {
    prop::collection::vec(-90.0..90.0f64, 2..5)
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, .. ProptestConfig::default() })]

    #[test]
    fn stiffness_is_symmetric_positive_definite(
        a in 0.05..0.2f64, ratio in 0.15..0.6f64, angles in angles(), web in 0.2..0.6f64,
    ) {
        let s = solve(&ellipse(a, a * ratio, &angles, web));
        let k = s.properties.stiffness;
        prop_assert!(scaled_diff(&k, &k.transpose()) < 1e-10);
        let d = Matrix4::from_diagonal(&k.diagonal().map(|v| 1.0 / v.sqrt()));
        let eig = SymmetricEigen::new(d * k * d).eigenvalues;
        prop_assert!(eig.iter().all(|&v| v > 1e-9), "{eig:?}");
    }

    #[test]
    fn moving_the_section_transforms_the_stiffness_by_parallel_axes(
        a in 0.05..0.2f64, ratio in 0.15..0.6f64, angles in angles(),
        dy in -0.1..0.1f64, dz in -0.05..0.05f64,
    ) {
        let l = ellipse(a, a * ratio, &angles, 0.4);
        let mut moved = l.clone();
        for p in &mut moved.outer {
            p[0] += dy;
            p[1] += dz;
        }
        for w in &mut moved.webs {
            w.y += dy;
        }
        let (s, m) = (solve(&l).properties, solve(&moved).properties);
        // About the elastic centre nothing changes; the centres move with the section.
        prop_assert!(scaled_diff(&s.stiffness, &m.stiffness) < 1e-8);
        prop_assert!((m.elastic_centre[0] - s.elastic_centre[0] - dy).abs() < 1e-9);
        prop_assert!((m.shear_centre[1] - s.shear_centre[1] - dz).abs() < 1e-9);
        // About the pitch axis: S_O = T⁻ᵀ S_ec T⁻¹ with e_O = T e_ec, T shifting by the centre.
        for p in [&s, &m] {
            let mut t = Matrix4::identity();
            t[(0, 2)] = -p.elastic_centre[1];
            t[(0, 3)] = -p.elastic_centre[0];
            let ti = t.try_inverse().expect("unit triangular");
            let back = ti.transpose() * p.stiffness * ti;
            prop_assert!(scaled_diff(&back, &p.stiffness_pitch_axis) < 1e-9);
        }
    }

    #[test]
    fn mirroring_about_the_chord_flips_the_odd_terms(
        a in 0.05..0.2f64, ratio in 0.15..0.6f64, angles in angles(), web in 0.2..0.6f64,
    ) {
        let l = ellipse(a, a * ratio, &angles, web);
        // z → −z reverses the contour: the new upper surface is the old lower one; each wall
        // keeps its outer face, and its fibres, seen in the reversed wall axes, turn to −θ.
        let n = l.outer.len();
        let mut mirrored = l.clone();
        mirrored.outer = (0..n).map(|i| {
            let p = l.outer[(n - i) % n];
            [p[0], -p[1]]
        }).collect();
        mirrored.segment_laminate = (0..n).map(|i| l.segment_laminate[(2 * n - i - 1) % n]).collect();
        let m = as4_chandra();
        let neg: Vec<f64> = angles.iter().map(|x| -x).collect();
        let neg_cap: Vec<f64> = neg.iter().chain(&neg).copied().collect();
        mirrored.laminates = vec![plies(&m, &neg), plies(&m, &neg_cap)];
        let (s, r) = (solve(&l).properties, solve(&mirrored).properties);
        // Reflection: eps, kappa_e even; kappa_t (a pseudo-scalar) and kappa_f odd.
        let p = Matrix4::from_diagonal(&Vector4::new(1.0, -1.0, -1.0, 1.0));
        prop_assert!(scaled_diff(&(p * s.stiffness * p), &r.stiffness) < 1e-8);
        prop_assert!((s.ea / r.ea - 1.0).abs() < 1e-9 && (s.gj / r.gj - 1.0).abs() < 1e-8);
        prop_assert!((s.shear_centre[1] + r.shear_centre[1]).abs() < 1e-9 * a);
        prop_assert!((s.mass_centre[1] + r.mass_centre[1]).abs() < 1e-9 * a);
    }

    #[test]
    fn transverse_shear_flow_balances_the_shear_force(
        a in 0.05..0.2f64, ratio in 0.15..0.6f64, angles in angles(), web in 0.2..0.6f64,
        vf in -1e3..1e3f64, ve in -1e3..1e3f64,
    ) {
        let s = solve(&ellipse(a, a * ratio, &angles, web));
        // Resultant of the shear flow over the walls, by the midpoint rule on each element
        // (the flow is quadratic along an element, so this is approximate to O(L²)).
        let q = s.shear_flows([vf, ve]);
        let (mut fy, mut fz) = (0.0, 0.0);
        for (e, q) in s.elements().iter().zip(&q) {
            let t = e.tangent();
            fy += t[0] * q * e.length();
            fz += t[1] * q * e.length();
        }
        let scale = vf.abs() + ve.abs() + 1.0;
        prop_assert!((fz - vf).abs() < 2e-2 * scale, "{fz} vs {vf}");
        prop_assert!((fy - ve).abs() < 2e-2 * scale, "{fy} vs {ve}");
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 64, .. ProptestConfig::default() })]

    /// Any outline, however rough or thick-walled, gives a result with finite numbers or an
    /// error, never a panic.
    #[test]
    fn rough_outlines_never_panic(
        radii in prop::collection::vec(0.2..1.0f64, 8..40),
        t in 1e-4..0.3f64,
        web in -0.5..1.5f64,
    ) {
        let n = radii.len();
        let outer: Vec<[f64; 2]> = radii.iter().enumerate().map(|(i, r)| {
            let a = std::f64::consts::PI - 2.0 * std::f64::consts::PI * i as f64 / n as f64;
            [r * a.cos(), 0.3 * r * a.sin()]
        }).collect();
        let mut l = tube(1.0, n, single(&isotropic("x", 50e9, 0.3, t, 1800.0)));
        l.outer = outer;
        let l = with_web(l, "w", web, 0);
        if let Ok(p) = layloft::section::solve_section(&l, &SectionParams::default()) {
            prop_assert!(p.stiffness.iter().all(|v| v.is_finite()));
            prop_assert!(p.ea > 0.0 && p.gj > 0.0 && p.mass_per_length > 0.0);
        }
    }
}

//! The beam-wall reduction against derivations from classical laminate theory: unsymmetric walls
//! of long tubes and of a box, a symmetric-wall property, and resultants recovered from the wall
//! states of a coupled multi-cell section.
//!
//! The references are derived here, in the test, from the laminate's `[A B; B D]` (classical
//! laminate theory, Kaw, Mechanics of Composite Materials, 2nd ed., 2006, ch. 4), with the state
//! a long laminated cylinder or a box beam takes far from its ends. Every source is named beside
//! its check.

use crate::common;

use std::f64::consts::PI;

use layloft::laminate::{Deformation, Laminate, LaminateLoad};
use layloft::loads::BeamResultants;
use layloft::material::Lamina;
use layloft::section::{
    SectionLayout, SectionParams, SolvedSection, WallCurvature, WallPart, WallStiffness,
};
use layloft::stress::recover_at;
use nalgebra::{Matrix2, Matrix3, Vector3, Vector4, Vector6};

/// T300/5208, Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1 (elastic
/// constants and strengths), ply 0.125 mm.
fn t300() -> Lamina {
    Lamina::builder("T300/5208")
        .elastic(181e9, 10.3e9, 7.17e9, 0.28)
        .ply_thickness(0.125e-3)
        .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
        .density(1600.0)
        .build()
        .expect("valid lamina")
}

fn params(mode: WallCurvature) -> SectionParams {
    SectionParams { wall_curvature: mode, ..SectionParams::default() }
}

fn solve(l: &SectionLayout, mode: WallCurvature) -> SolvedSection {
    SolvedSection::solve(l, &params(mode)).expect("section solves")
}

const MODES: [WallCurvature; 2] = [WallCurvature::Held, WallCurvature::Beam];

/// Twisting curvature per unit twist rate of the wall in each mode (the model's kinematics,
/// stated in its module documentation: `kappa_xs = -2 kappa_t` when the walls follow the beam).
fn twist_factor(mode: WallCurvature) -> f64 {
    match mode {
        WallCurvature::Held => 0.0,
        WallCurvature::Beam => -2.0,
    }
}

fn stacked(d: &Deformation) -> Vector6<f64> {
    Vector6::new(d.strain.x, d.strain.y, d.strain.z, d.curvature.x, d.curvature.y, d.curvature.z)
}

/// The reduction used before: hoop force and all wall moments free, from the compliance
/// `[A B; B D]⁻¹` keep the `(N_x, N_xs)` block. Returns the axial stiffness at zero shear flow.
fn free_curl_axial(l: &Laminate) -> f64 {
    let c = l.abd().compliance().expect("regular laminate");
    let k =
        Matrix2::new(c[(0, 0)], c[(0, 2)], c[(2, 0)], c[(2, 2)]).try_inverse().expect("regular");
    k[(0, 0)] - k[(0, 1)].powi(2) / k[(1, 1)]
}

/// A long laminated cylinder of midline radius `r` with a circumferentially uniform wall, far
/// from its ends, under axial force and torque with its twist free (derived here from CLT):
/// the state is axisymmetric, the generators stay straight (`kappa_x = 0`), the hoop force is
/// zero, the hoop curvature does not change (Timoshenko & Woinowsky-Krieger, Theory of Plates
/// and Shells, 1959, §114, axisymmetric cylinder, from memory), there is no warping, and a twist
/// rate `theta` turns each section rigidly: with the contour running clockwise seen from the
/// tip, `gamma_xs = -r theta` and `kappa_xs = c theta`. With the unknowns
/// `v = (eps, eps_s, theta)`, the deformation is `P v` and by virtual work the generalised
/// forces per unit circumference are `Pᵀ [A B; B D] P v = (N_x, N_s, -r N_xs + c M_xs)`; times
/// `2 pi r` they are the axial force, zero, and the torque.
struct Cylinder {
    /// `2 pi r Pᵀ [A B; B D] P`.
    k: Matrix3<f64>,
    p: nalgebra::Matrix6x3<f64>,
}

impl Cylinder {
    fn new(l: &Laminate, r: f64, c: f64) -> Self {
        let mut p = nalgebra::Matrix6x3::zeros();
        p[(0, 0)] = 1.0;
        p[(1, 1)] = 1.0;
        p[(2, 2)] = -r;
        p[(5, 2)] = c;
        let k = p.transpose() * l.abd().matrix() * p * (2.0 * PI * r);
        Cylinder { k, p }
    }

    /// `(eps, eps_s, theta)` under axial force `f` with zero torque.
    fn under_force(&self, f: f64) -> Vector3<f64> {
        self.k.try_inverse().expect("regular") * Vector3::new(f, 0.0, 0.0)
    }

    fn deformation(&self, v: &Vector3<f64>) -> Deformation {
        let d = self.p * v;
        Deformation {
            strain: Vector3::new(d[0], d[1], d[2]),
            curvature: Vector3::new(d[3], d[4], d[5]),
        }
    }
}

/// Every ply face's material-axis stress of `l` under deformation `d`.
fn ply_stresses(l: &Laminate, d: &Deformation) -> Vec<Vector3<f64>> {
    let r = l.response(&LaminateLoad::Deformation(*d), 0.0).expect("response");
    r.plies.iter().flat_map(|p| [p.top.stress_12, p.bottom.stress_12]).collect()
}

/// Compares two sets of ply stresses component by component: each within `rel` of the larger
/// of itself and 1 % of the largest stress of that component type.
fn assert_stresses_close(got: &[Vector3<f64>], want: &[Vector3<f64>], rel: f64, what: &str) {
    assert_eq!(got.len(), want.len());
    for c in 0..3 {
        let peak = want.iter().map(|s| s[c].abs()).fold(0.0, f64::max);
        for (k, (g, w)) in got.iter().zip(want).enumerate() {
            let tol = rel * w[c].abs().max(0.01 * peak).max(1e-6);
            assert!(
                (g[c] - w[c]).abs() <= tol,
                "{what}: face {k} component {c}: {} vs {} Pa",
                g[c],
                w[c]
            );
        }
    }
}

/// (1) Long thin tube, unsymmetric cross-ply wall [0/0/0/90/90/90] (0° outside), midline radius
/// 100 mm, wall 0.75 mm, under axial force, against the axisymmetric state of a long laminated
/// cylinder (`Cylinder` above; no coupling, so no twist). The 720-gon differs from the circle by
/// (pi/720)²/6 = 3e-6; asked: 1 % in axial stiffness and ply stresses, met to 1e-4. The
/// reduction with wall moments free gave about half the axial stiffness.
#[test]
fn cross_ply_tube_matches_the_axisymmetric_cylinder() {
    let wall = common::plies(&t300(), &[0.0, 0.0, 0.0, 90.0, 90.0, 90.0]);
    let t = wall.thickness();
    let r = 0.100;
    let layout = common::tube(r + t / 2.0, 720, wall.clone());
    let f = 1.0e4;
    for mode in MODES {
        let s = solve(&layout, mode);
        let cyl = Cylinder::new(&wall, r, twist_factor(mode));
        let v = cyl.under_force(f);
        let ea_ref = f / v[0];
        let strains = s.strains(&Vector4::new(f, 0.0, 0.0, 0.0));
        let ea = f / strains[0];
        assert!((ea / ea_ref - 1.0).abs() < 1e-4, "{mode:?}: EA {ea} vs {ea_ref}");
        assert!(v[2].abs() < 1e-12, "a cross-ply tube does not twist");
        assert!(strains[1].abs() < 1e-9 * strains[0], "{mode:?}: twist {}", strains[1]);
        let want = ply_stresses(&wall, &cyl.deformation(&v));
        for st in s.wall_states(&strains, [0.0, 0.0]) {
            let got = ply_stresses(&wall, &st.deformation);
            assert_stresses_close(&got, &want, 1e-4, &format!("{mode:?} element {}", st.element));
            // The recovered wall resultants: N_x = F / (2 pi r), no hoop force.
            assert!((st.n_x * 2.0 * PI * r / f - 1.0).abs() < 1e-4);
            assert!(st.resultants().n.y == 0.0 && st.n_xs.abs() < 1e-6 * st.n_x);
        }
        // The stress module reports the same stresses (at the worse face of each ply; in this
        // state both faces of a ply carry the same stress).
        let points = recover_at(&layout, &s, &BeamResultants { n: f, ..Default::default() }, 0.0)
            .expect("recovery");
        for p in points.iter().step_by(37) {
            let got: Vec<_> = p.plies.iter().flat_map(|q| [q.stress_12, q.stress_12]).collect();
            assert_stresses_close(&got, &want, 1e-4, &format!("{mode:?} stress point"));
        }
        // The free-curl reduction: about half the stiffness (issue 10), and the transverse
        // stress of the 90° plies several times too high.
        let old = 2.0 * PI * r * free_curl_axial(&wall);
        assert!(old / ea_ref < 0.7, "free curl {old} vs {ea_ref}");
    }
}

/// (2) Long thin tube with unsymmetric angle-ply walls and extension–twist coupling under axial
/// force, free to twist, against the cylinder derived above: axial stiffness `F/eps` and twist
/// per unit force `theta/F` within 1 % (met to 1e-4), and ply stresses. Walls (0.5 to 0.75 mm,
/// midline radius 100 mm): [30/30/30/−30] (unbalanced: coupling through A16 and B) and
/// [30/30/30/−30/−30/−30] (antisymmetric, balanced: A16 = 0, coupling through B16 and B26 only).
/// The reference uses the model's wall kinematics `kappa_xs = c theta`; the through-thickness
/// gradient of a circular tube's shear strain in torsion is `theta` (`gamma = r theta` of
/// elasticity), half the flat-wall value the model takes; for the unbalanced wall the test
/// also shows that this changes the twist per unit force by less than 1 % at r/t = 200.
#[test]
fn angle_ply_tubes_match_the_twisting_cylinder() {
    let r = 0.100;
    for angles in [&[30.0, 30.0, 30.0, -30.0][..], &[30.0, 30.0, 30.0, -30.0, -30.0, -30.0]] {
        let wall = common::plies(&t300(), angles);
        let t = wall.thickness();
        let layout = common::tube(r + t / 2.0, 720, wall.clone());
        let f = 1.0e4;
        for mode in MODES {
            let s = solve(&layout, mode);
            let cyl = Cylinder::new(&wall, r, twist_factor(mode));
            let v = cyl.under_force(f);
            let strains = s.strains(&Vector4::new(f, 0.0, 0.0, 0.0));
            let what = format!("{angles:?} {mode:?}");
            let (ea, ea_ref) = (f / strains[0], f / v[0]);
            assert!((ea / ea_ref - 1.0).abs() < 1e-4, "{what}: EA {ea} vs {ea_ref}");
            let (twist, twist_ref) = (strains[1] / f, v[2] / f);
            let scale = twist_ref.abs().max(1e-6 * (v[0] / f) / r);
            assert!(
                (twist - twist_ref).abs() < 1e-4 * scale,
                "{what}: twist per force {twist} vs {twist_ref} rad/m/N"
            );
            let want = ply_stresses(&wall, &cyl.deformation(&v));
            for st in s.wall_states(&strains, [0.0, 0.0]).iter().step_by(29) {
                let got = ply_stresses(&wall, &st.deformation);
                assert_stresses_close(&got, &want, 1e-3, &what);
            }
            if angles.len() == 4 {
                assert!(twist_ref.abs() > 1e-3 * (v[0] / f) / r, "{what}: coupled");
                if mode == WallCurvature::Beam {
                    let half = Cylinder::new(&wall, r, -1.0).under_force(f);
                    assert!((half[2] / v[2] - 1.0).abs() < 0.01, "flat-wall twist factor");
                }
            }
            // The free-curl reduction is far softer for both walls.
            let old = 2.0 * PI * r * free_curl_axial(&wall);
            assert!(old < 0.9 * ea_ref, "{what}: free curl {old} vs {ea_ref}");
        }
    }
}

/// The beam-wall law derived by hand from `[A B; B D]` (indices 0..6 = eps_x, eps_s, gamma_xs,
/// kappa_x, kappa_s, kappa_xs): hoop curvature held (drop index 4), hoop force free (condense
/// index 1), then the shear flow taken as given (mixed form on gamma_xs). Returns `(Ā, c, f)`
/// over `(eps_x, kappa_x, kappa_xs)`.
fn hand_wall_law(l: &Laminate) -> (Matrix3<f64>, Vector3<f64>, f64) {
    let m = l.abd().matrix();
    let keep = [0usize, 2, 3, 5];
    let k = |i: usize, j: usize| {
        let (a, b) = (keep[i], keep[j]);
        m[(a, b)] - m[(a, 1)] * m[(1, b)] / m[(1, 1)]
    };
    let kin = [0usize, 2, 3];
    let kqq = k(1, 1);
    let a = Matrix3::from_fn(|i, j| k(kin[i], kin[j]) - k(kin[i], 1) * k(1, kin[j]) / kqq);
    let c = Vector3::from_fn(|i, _| k(kin[i], 1) / kqq);
    (a, c, 1.0 / kqq)
}

/// (3) A single-cell box whose top and bottom walls are the skin-over-cap laminate
/// [45/−45/0/0/0/0] (unsymmetric; 0.75 mm) and whose side walls are [45/−45]s (0.5 mm), outer
/// 100 × 40 mm, against a hand derivation on the midline (b × h = 99.5 × 39.25 mm): by symmetry
/// (the box maps onto itself turned half a turn about x) an axial force does not bend it and
/// neither skin coupling drives a cell flow under bending, so
///
/// EA = 2 b Ā11s + 2 h Ā11w,  S_et = −2 · 2 b Ā13s (kappa_xs = −2 kappa_t, skins only; the
/// side walls are symmetric), EI_flap = 2 b (Ā11s h²/4 + Ā12s h + Ā22s) + 2 Ā11w h³/12,
/// EI_edge = 2 Ā11s b³/12 + 2 h (Ā11w b²/4 + Ā22w),
/// GJ = 4 (2 b Ā33s + 2 h Ā33w) + (2 A + 2 (2 b c3s + 2 h c3w))² / (2 b fs + 2 h fw)
///
/// (single-cell closed-section theory of Berdichevsky, Armanios & Badir 1992 with the wall terms
/// of `kappa_x`, `kappa_xs`; with the walls held flat the wall terms drop: Ā12 = Ā22 = Ā13 =
/// Ā33 = c3 = 0 in these formulas). Straight walls are exact in the solver: 1e-9. The skins
/// reduced with their moments free gave about a quarter less axial stiffness (issue 10).
#[test]
fn skin_over_cap_box_matches_a_hand_derivation() {
    let m = t300();
    let skin = common::plies(&m, &[45.0, -45.0, 0.0, 0.0, 0.0, 0.0]);
    let side = common::plies(&m, &[45.0, -45.0, -45.0, 45.0]);
    let (ts, tw) = (skin.thickness(), side.thickness());
    let (wo, ho) = (0.100, 0.040);
    let layout = common::rect(wo, ho, 4, [0, 1, 0, 1], vec![skin.clone(), side.clone()]);
    let (b, h) = (wo - tw, ho - ts);
    let area = b * h;
    for mode in MODES {
        let s = solve(&layout, mode);
        let p = &s.properties;
        let (mut a_s, c_s, f_s) = hand_wall_law(&skin);
        let (mut a_w, c_w, f_w) = hand_wall_law(&side);
        let (mut c3s, mut c3w) = (c_s[2], c_w[2]);
        assert!(c_s[0].abs() < 1e-12 && c_w[0].abs() < 1e-12, "balanced walls: no A16");
        if mode == WallCurvature::Held {
            for a in [&mut a_s, &mut a_w] {
                let a11 = a[(0, 0)];
                *a = Matrix3::zeros();
                a[(0, 0)] = a11;
            }
            (c3s, c3w) = (0.0, 0.0);
        }
        let ea = 2.0 * b * a_s[(0, 0)] + 2.0 * h * a_w[(0, 0)];
        let et = -4.0 * b * a_s[(0, 2)];
        let eif = 2.0 * b * (a_s[(0, 0)] * h * h / 4.0 + a_s[(0, 1)] * h + a_s[(1, 1)])
            + 2.0 * a_w[(0, 0)] * h.powi(3) / 12.0;
        let eie = 2.0 * a_s[(0, 0)] * b.powi(3) / 12.0
            + 2.0 * h * (a_w[(0, 0)] * b * b / 4.0 + a_w[(1, 1)]);
        let gj = 4.0 * (2.0 * b * a_s[(2, 2)] + 2.0 * h * a_w[(2, 2)])
            + (2.0 * area + 2.0 * (2.0 * b * c3s + 2.0 * h * c3w)).powi(2)
                / (2.0 * b * f_s + 2.0 * h * f_w);
        for (got, want, name) in [
            (p.ea, ea, "EA"),
            (p.ei_flap, eif, "EI_flap"),
            (p.ei_edge, eie, "EI_edge"),
            (p.gj, gj, "GJ"),
        ] {
            assert!((got / want - 1.0).abs() < 1e-9, "{mode:?} {name}: {got} vs {want}");
        }
        let et_scale = (ea * gj).sqrt();
        assert!((p.extension_twist - et).abs() < 1e-9 * et_scale, "{mode:?}: S_et");
        assert!(p.flap_twist.abs() < 1e-9 * (gj * eif).sqrt());
        assert!(p.elastic_centre[1].abs() < 1e-12 && (p.elastic_centre[0] - wo / 2.0).abs() < 1e-9);
        if mode == WallCurvature::Beam {
            assert!(et.abs() > 1e-4 * et_scale, "the skins' B16 couples extension and twist");
        }
        let old = 2.0 * b * free_curl_axial(&skin) + 2.0 * h * free_curl_axial(&side);
        assert!(old / ea < 0.85, "{mode:?}: free curl EA {old} vs {ea}");
    }
}

/// (4) Symmetric walls: the beam-wall reduction and the reduction with every wall moment free
/// agree exactly in the membrane terms (both are `A` with `N_s = 0`: the Schur complement of
/// `A_22` in `A` equals the inverse of the `(x, xs)` block of `A⁻¹`, block-inverse identity).
/// Symmetric, unbalanced and balanced laminates; 1e-12.
#[test]
fn symmetric_walls_keep_their_membrane_law() {
    let m = t300();
    for angles in [
        &[30.0, -60.0, 15.0, 15.0, -60.0, 30.0][..],
        &[45.0, -45.0, 0.0, 0.0, -45.0, 45.0],
        &[20.0, 20.0],
        &[0.0, 90.0, 90.0, 0.0],
    ] {
        let l = common::plies(&m, angles);
        let w = WallStiffness::from_laminate(&l).expect("wall");
        let c = l.abd().compliance().expect("regular");
        let old = Matrix2::new(c[(0, 0)], c[(0, 2)], c[(2, 0)], c[(2, 2)])
            .try_inverse()
            .expect("regular");
        let scale = old.norm();
        assert!((w.membrane - old).norm() < 1e-12 * scale, "{angles:?}");
        let ab = old[(0, 0)] - old[(0, 1)].powi(2) / old[(1, 1)];
        assert!((w.axial() / ab - 1.0).abs() < 1e-12);
        assert!((w.shear_compliance() * old[(1, 1)] - 1.0).abs() < 1e-12);
        assert!((w.coupling() - old[(0, 1)] / old[(1, 1)]).abs() < 1e-12);
        // No membrane–bending coupling in a symmetric wall.
        let a = w.mixed_stiffness();
        assert!(a[(0, 1)].abs() < 1e-12 * a[(0, 0)] && a[(0, 2)].abs() < 1e-12 * a[(0, 0)]);
    }
}

/// Symmetric isotropic tube with the walls following the beam: EA unchanged, and the wall's
/// own bending adds exactly `∮ D11 n_z² ds = pi R D11` to EI (`D11 = E t³/(12 (1 − nu²))`,
/// hoop curvature held) and the open-section torsion `4 ∮ D66 ds = 2 pi R G t³/3` to GJ
/// (Saint-Venant torsion of a thin strip, Timoshenko & Goodier, Theory of Elasticity, §109):
/// the (t/h)² terms. A 720-gon: 1e-4 of the change.
#[test]
fn wall_bending_terms_of_a_symmetric_tube() {
    let (r, t, e, nu) = (0.05, 2e-3, 70e9, 0.33);
    let g = e / (2.0 * (1.0 + nu));
    let layout =
        common::tube(r + t / 2.0, 720, common::single(&common::isotropic("al", e, nu, t, 2700.0)));
    let held = solve(&layout, WallCurvature::Held).properties;
    let beam = solve(&layout, WallCurvature::Beam).properties;
    assert!((beam.ea / held.ea - 1.0).abs() < 1e-12);
    let d11 = e * t.powi(3) / (12.0 * (1.0 - nu * nu));
    let d_ei = PI * r * d11;
    assert!(((beam.ei_flap - held.ei_flap) / d_ei - 1.0).abs() < 1e-4);
    assert!(((beam.ei_edge - held.ei_edge) / d_ei - 1.0).abs() < 1e-4);
    let d_gj = 2.0 * PI * r * g * t.powi(3) / 3.0;
    assert!(((beam.gj - held.gj) / d_gj - 1.0).abs() < 1e-4);
}

/// Integrates the recovered wall states of every element (Simpson's rule, exact for the linear
/// `N_x` and constant flows of a straight element) into beam resultants about the elastic centre:
/// `N = ∮ N_x`, `M_f = ∮ (N_x z + M_x n_z)`, `M_e = ∮ (N_x y + M_x n_y)`,
/// `T = ∮ N_xs (y t_z − z t_y) − 2 ∮ M_xs` (the last term only with walls following the beam).
fn integrate(s: &SolvedSection, strains: &Vector4<f64>) -> Vector4<f64> {
    let ec = s.properties.elastic_centre;
    let beam = s.wall_curvature() == WallCurvature::Beam;
    let mut out = Vector4::zeros();
    for (k, e) in s.elements().iter().enumerate() {
        let (tn, nn, l) = (e.tangent(), e.normal(), e.length());
        for (frac, wgt) in [(0.0, 1.0), (0.5, 4.0), (1.0, 1.0)] {
            let st = s.wall_state(k, frac, strains, [0.0, 0.0]).expect("element");
            let (y, z) = (st.position[0] - ec[0], st.position[1] - ec[1]);
            let w = wgt * l / 6.0;
            let (mx, mxs) = (st.moments[0], st.moments[2]);
            out[0] += w * st.n_x;
            out[1] += w * (st.n_xs * (y * tn[1] - z * tn[0]) - if beam { 2.0 * mxs } else { 0.0 });
            out[2] += w * (st.n_x * z + if beam { mx * nn[1] } else { 0.0 });
            out[3] += w * (st.n_x * y + if beam { mx * nn[0] } else { 0.0 });
        }
    }
    out
}

/// The two-cell NACA 0015 section of the recovery tests, chord 0.3 m (invented test geometry):
/// unsymmetric skin-over-cap walls [45/−45/0/0/0/0] between x/c = 0.15 and 0.45, unsymmetric
/// skins [45/−45/0] elsewhere, a web [45/−45]s at x/c = 0.30.
fn two_cell_coupled_section() -> layloft::section::SectionLayout {
    let m = t300();
    let lams = vec![
        common::plies(&m, &[45.0, -45.0, 0.0]),
        common::plies(&m, &[45.0, -45.0, 0.0, 0.0, 0.0, 0.0]),
        common::plies(&m, &[45.0, -45.0, -45.0, 45.0]),
    ];
    let chord = 0.3;
    let base = common::naca00(0.15, chord, 160, &[0.15, 0.45], lams, |x, _| {
        if (0.15..0.45).contains(&x) { 1 } else { 0 }
    });
    common::with_web(base, "spar", (0.30 - 0.25) * chord, 2)
}

/// Recovered wall resultants reproduce the beam resultants (virtual work; the section stiffness
/// and the recovery use one wall law): a two-cell NACA 0015 section, chord 0.3 m, with
/// unsymmetric skin-over-cap walls [45/−45/0/0/0/0] between x/c = 0.15 and 0.45, unsymmetric
/// skins [45/−45/0] elsewhere, a web [45/−45]s at x/c = 0.30 (invented test geometry; its thin
/// trailing edge closes the cell ahead of the edge, leaving open solid branches), under
/// each unit beam resultant. Exact integration: 1e-9 of the largest term.
#[test]
fn recovered_wall_resultants_reproduce_beam_resultants() {
    let layout = two_cell_coupled_section();
    for mode in MODES {
        let s = solve(&layout, mode);
        assert_eq!(s.cells(), 2);
        let tail = s.elements().iter().filter(|e| matches!(e.part, WallPart::TrailingEdge { .. }));
        assert!(tail.count() > 0, "the walls meet ahead of the trailing edge: open branches");
        let scale = [1.0, 0.05, 0.05, 0.05];
        for i in 0..4 {
            let mut res = Vector4::zeros();
            res[i] = 1.0 / scale[i];
            let strains = s.strains(&res);
            let back = integrate(&s, &strains);
            for j in 0..4 {
                assert!(
                    (back[j] - res[j]).abs() * scale[j] < 1e-9,
                    "{mode:?}: resultant {i}: component {j}: {} vs {}",
                    back[j],
                    res[j]
                );
            }
        }
    }
}

/// The wall states of the same section under a unit flapwise moment: the hoop force vanishes
/// through the full `[A B; B D]`, the wall curvature is the beam's curvature on the wall normal
/// (Euler–Bernoulli kinematics through the thickness) when the walls follow the beam and zero
/// otherwise, and `(N_x, N_xs)` and the moments are those of the full ABD on the deformation.
#[test]
fn wall_states_carry_the_beam_curvature() {
    let m = t300();
    let wall = common::plies(&m, &[45.0, -45.0, 0.0, 0.0, 0.0, 0.0]);
    let layout = common::rect(0.1, 0.04, 3, [0; 4], vec![wall.clone()]);
    for mode in MODES {
        let s = solve(&layout, mode);
        let strains = s.strains(&Vector4::new(0.0, 20.0, 100.0, -50.0));
        for st in s.wall_states(&strains, [0.0, 0.0]) {
            let e = &s.elements()[st.element];
            let n = e.normal();
            let kx = n[1] * strains[2] + n[0] * strains[3];
            let (want_kx, want_kxs) = match mode {
                WallCurvature::Held => (0.0, 0.0),
                WallCurvature::Beam => (kx, -2.0 * strains[1]),
            };
            assert!((st.deformation.curvature.x - want_kx).abs() <= 1e-12 * kx.abs().max(1e-9));
            assert!((st.deformation.curvature.z - want_kxs).abs() <= 1e-12 * strains[1].abs());
            assert_eq!(st.deformation.curvature.y, 0.0);
            let nm = wall.abd().matrix() * stacked(&st.deformation);
            let big = st.n_x.abs() + st.n_xs.abs();
            assert!(nm[1].abs() < 1e-9 * big, "hoop force {}", nm[1]);
            assert!((nm[0] - st.n_x).abs() < 1e-9 * big && (nm[2] - st.n_xs).abs() < 1e-9 * big);
            assert!((Vector3::new(nm[3], nm[4], nm[5]) - st.moments).norm() < 1e-9 * big * 1e-3);
        }
    }
}

/// Residual thermal stresses of an unsymmetric wall held flat by the closed beam: with its
/// curvatures held, the stacking order no longer matters, so the cross-ply [0_3/90_3] wall of a
/// tube under a uniform temperature change and no load carries, ply by ply, the residual
/// stresses of the symmetric laminate [0_3/90_3]s free in every direction (CLT thermal
/// resultants, Kaw 2006, §4.6; T300/5208 expansion coefficients 0.02 and 22.5 µstrain/K, Kaw
/// Table 2.1, from memory). Same CLT, exact: 1e-9. The free-curling unsymmetric plate would
/// instead relieve part of them by curling.
#[test]
fn held_wall_carries_the_residual_stresses_of_its_symmetric_counterpart() {
    let m = Lamina { cte: Some([0.02e-6, 22.5e-6]), ..t300() };
    let wall = common::plies(&m, &[0.0, 0.0, 0.0, 90.0, 90.0, 90.0]);
    let sym =
        common::plies(&m, &[0.0, 0.0, 0.0, 90.0, 90.0, 90.0, 90.0, 90.0, 90.0, 0.0, 0.0, 0.0]);
    let dt = -120.0;
    let free_sym = sym.response(&LaminateLoad::Resultants(Default::default()), dt).expect("sym");
    let free_t = wall.response(&LaminateLoad::Resultants(Default::default()), dt).expect("T");
    let r = 0.1;
    let layout = common::tube(r + wall.thickness() / 2.0, 360, wall.clone());
    for mode in MODES {
        let s = solve(&layout, mode);
        let points = recover_at(&layout, &s, &BeamResultants::default(), dt).expect("recovery");
        for p in points.iter().step_by(41) {
            for (k, q) in p.plies.iter().enumerate() {
                let want = free_sym.plies[k].top_thermal.stress_12;
                assert!((q.stress_12 - want).norm() < 1e-9 * want.norm(), "{mode:?} ply {k}");
            }
        }
    }
    // The free unsymmetric plate curls: its outer 0° ply face differs by more than 10 %.
    let (a, b) = (free_t.plies[0].top_thermal.stress_12, free_sym.plies[0].top_thermal.stress_12);
    assert!((a - b).norm() > 0.1 * b.norm());
}

/// The project key `[sections] wall_bending` reaches the section solve: the mine-fan demo as
/// given (no key: the walls follow the beam) and copied with `wall_bending = false` (the walls
/// held) gives every station's section solved in that mode, equal to solving its layout
/// directly in that mode; the two differ (the demo's skins are unsymmetric).
#[test]
fn project_key_selects_the_wall_model() {
    use layloft::analysis::BladeModel;
    use layloft::input::read_project;
    let src = std::path::Path::new("layups/mine-fan");
    let dir = std::env::temp_dir().join(format!("layloft-wall-key-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp folder");
    for entry in std::fs::read_dir(src).expect("demo folder") {
        let path = entry.expect("entry").path();
        if path.is_file() {
            std::fs::copy(&path, dir.join(path.file_name().expect("name"))).expect("copy");
        }
    }
    let toml = std::fs::read_to_string(dir.join("blade.toml")).expect("blade.toml");
    assert!(!toml.contains("wall_bending"));
    let held_toml = toml.replacen("[sections]", "[sections]\nwall_bending = false", 1);
    std::fs::write(dir.join("blade.toml"), held_toml).expect("write");
    let held =
        BladeModel::build(read_project(&dir.join("blade.toml")).expect("read")).expect("held");
    let beam =
        BladeModel::build(read_project(&src.join("blade.toml")).expect("read")).expect("beam");
    std::fs::remove_dir_all(&dir).ok();
    assert!(!held.project.sections.wall_bending && beam.project.sections.wall_bending);
    for (h, b) in held.stations.iter().zip(&beam.stations) {
        assert_eq!(h.section.wall_curvature(), WallCurvature::Held);
        assert_eq!(b.section.wall_curvature(), WallCurvature::Beam);
        let direct = solve(&h.layout, WallCurvature::Held).properties;
        assert_eq!(direct.stiffness, h.section.properties.stiffness);
        let direct = solve(&b.layout, WallCurvature::Beam).properties;
        assert_eq!(direct.stiffness, b.section.properties.stiffness);
        assert!((h.section.properties.ei_flap / b.section.properties.ei_flap - 1.0).abs() > 1e-4);
    }
}

/// The same two-cell coupled section under shear forces through the shear centre together with
/// the four resultants: integrated round the section (Simpson's rule as above), the recovered
/// walls give back the applied `N`, `M_f`, `M_e`, the torque about the elastic centre (the
/// applied torque about the shear centre plus the moment of the shear forces acting there) and
/// the shear forces (statics: the wall resultants of a cut equilibrate the beam's). With the
/// walls following the beam, the part of the shear force their own moments carry is not in the
/// membrane flow (the module documentation of the shear flow, order `(t/h)²`), so there the
/// torque and the shear forces are not compared; `N`, `M_f`, `M_e` are. Before, the
/// axial force that the coupled walls (`c = A16/A66` of `[45/−45/0]` and the cap) make of the
/// transverse shear flow was left out of the beam strains, and the walls carried a resultant
/// that was not applied.
#[test]
fn recovered_wall_resultants_hold_shear_forces_on_coupled_walls() {
    let layout = two_cell_coupled_section();
    let applied = Vector4::new(2.0e4, 30.0, 150.0, -80.0);
    for mode in MODES {
        let s = solve(&layout, mode);
        let ec = s.properties.elastic_centre;
        let sc = s.properties.shear_centre;
        for shear in [[500.0, 0.0], [0.0, 300.0], [-400.0, 250.0]] {
            let strains = s.strains_under_shear(&applied, shear);
            let beam = mode == WallCurvature::Beam;
            let (mut back, mut force) = (Vector4::<f64>::zeros(), [0.0, 0.0]);
            for (k, e) in s.elements().iter().enumerate() {
                let (tn, nn, l) = (e.tangent(), e.normal(), e.length());
                for (frac, wgt) in [(0.0, 1.0), (0.5, 4.0), (1.0, 1.0)] {
                    let st = s.wall_state(k, frac, &strains, shear).expect("element");
                    let (y, z) = (st.position[0] - ec[0], st.position[1] - ec[1]);
                    let w = wgt * l / 6.0;
                    let (mx, mxs) = (st.moments[0], st.moments[2]);
                    back[0] += w * st.n_x;
                    back[1] += w
                        * (st.n_xs * (y * tn[1] - z * tn[0]) - if beam { 2.0 * mxs } else { 0.0 });
                    back[2] += w * (st.n_x * z + if beam { mx * nn[1] } else { 0.0 });
                    back[3] += w * (st.n_x * y + if beam { mx * nn[0] } else { 0.0 });
                    force[0] += w * st.n_xs * tn[1];
                    force[1] += w * st.n_xs * tn[0];
                }
            }
            let mut want = applied;
            want[1] += (sc[0] - ec[0]) * shear[0] - (sc[1] - ec[1]) * shear[1];
            let scale = [2.0e4, 150.0, 150.0, 150.0];
            let compared: &[usize] = if beam { &[0, 2, 3] } else { &[0, 1, 2, 3] };
            for &j in compared {
                assert!(
                    (back[j] - want[j]).abs() < 1e-6 * scale[j],
                    "{mode:?} {shear:?}: component {j}: {} vs {}",
                    back[j],
                    want[j]
                );
            }
            for (got, v) in force.iter().zip(shear).filter(|_| !beam) {
                assert!((got - v).abs() < 1e-6 * 500.0, "{mode:?}: shear {got} vs {v}");
            }
        }
    }
}

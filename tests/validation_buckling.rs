//! Local buckling of wall panels and the sandwich modes against published closed forms and
//! hand calculations. Each check names its source beside it.

use std::f64::consts::PI;
use std::sync::Arc;

use layloft::buckling::{
    Curvature, EdgeSupport, LongPlate, PanelSolver, SandwichWall, ShearFlexibility,
    cylinder_classical, cylinder_torsion, interaction_factor, knock_down,
    orthotropic_long_plate_ss,
};
use layloft::input::read_materials_str;
use layloft::laminate::{Laminate, LayupCode, Ply};
use layloft::material::Lamina;
use layloft::units::Angle;
use nalgebra::Matrix3;

const NONE: ShearFlexibility = ShearFlexibility(f64::INFINITY);

/// Bending stiffness of an isotropic plate, D = E t³ / (12 (1 - nu²)), as a D matrix.
fn isotropic_d(e: f64, nu: f64, t: f64) -> (f64, Matrix3<f64>) {
    let d = e * t.powi(3) / (12.0 * (1.0 - nu * nu));
    (d, Matrix3::new(d, nu * d, 0.0, nu * d, d, 0.0, 0.0, 0.0, 0.5 * (1.0 - nu) * d))
}

/// k in N_cr = k pi² D / b².
fn k_of(n: f64, d: f64, b: f64) -> f64 {
    n * b * b / (PI * PI * d)
}

#[test]
fn isotropic_long_plates_in_compression_and_shear() {
    // Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961: long plates,
    // sigma_cr = k pi² E / (12 (1 - nu²)) (t/b)²; compression k = 4.0 (simply supported,
    // §9.2) and 6.97 (clamped, §9.5); shear k = 5.35 (simply supported) and 8.98 (clamped)
    // (§9.7). The coefficients are printed to three figures: tolerance 0.5 %.
    let (d0, d) = isotropic_d(70e9, 0.3, 2e-3);
    let b = 0.12;
    let ss = LongPlate::new(EdgeSupport::SimplySupported).critical(&d, b, NONE);
    let cl = LongPlate::new(EdgeSupport::Clamped).critical(&d, b, NONE);
    let near = |got: f64, want: f64| (got / want - 1.0).abs() < 5e-3;
    let k = k_of(ss.compression, d0, b);
    assert!(near(k, 4.0), "compression, simply supported: k = {k}");
    let k = k_of(cl.compression, d0, b);
    assert!(near(k, 6.97), "compression, clamped: k = {k}");
    let k = k_of(ss.shear_positive, d0, b);
    assert!(near(k, 5.35), "shear, simply supported: k = {k}");
    let k = k_of(cl.shear_positive, d0, b);
    assert!(near(k, 8.98), "shear, clamped: k = {k}");
    // An isotropic plate buckles alike under shear of either sign (symmetry).
    assert!((ss.shear_negative / ss.shear_positive - 1.0).abs() < 1e-6);
}

fn t300() -> Lamina {
    // Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1 (T300/5208).
    Lamina::builder("T300/5208")
        .elastic(181e9, 10.3e9, 7.17e9, 0.28)
        .ply_thickness(0.125e-3)
        .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
        .build()
        .unwrap()
}

fn laminate(code: &str) -> Laminate {
    Laminate::from_code(&code.parse::<LayupCode>().unwrap(), &t300())
}

#[test]
fn orthotropic_long_plate_matches_whitney_closed_form() {
    // Whitney, Structural Analysis of Laminated Anisotropic Plates, 1987, ch. 5 (from memory):
    // a long specially orthotropic plate with simply supported long edges buckles at
    // N_cr = (2 pi² / b²) (sqrt(D11 D22) + D12 + 2 D66). Cross-ply laminates have D16 = D26 = 0.
    let solver = LongPlate::new(EdgeSupport::SimplySupported);
    for code in ["[0/90]2s", "[0/90/0]s", "[90/0/90]s", "[0]8"] {
        let d = laminate(code).abd().d;
        assert!(d[(0, 2)].abs() < 1e-12 * d[(0, 0)]);
        let b = 0.08;
        let got = solver.critical(&d, b, NONE).compression;
        // The half-wavelength is b (D11/D22)^(1/4); the minimum is flat, so the closed form holds
        // to the accuracy of the search (1e-4).
        let want = orthotropic_long_plate_ss(&d, b);
        assert!((got / want - 1.0).abs() < 1e-4, "{code}: {got} against {want}");
        // Written out for one case: the formula by hand from the D matrix.
        let hand = 2.0 * PI * PI / (b * b)
            * ((d[(0, 0)] * d[(1, 1)]).sqrt() + d[(0, 1)] + 2.0 * d[(2, 2)]);
        assert!((hand / want - 1.0).abs() < 1e-12);
    }
}

/// Exact critical compression of a long specially orthotropic plate with clamped long edges, by
/// our own solution of the plate equation (not the program's Ritz solver):
/// `D11 w_xxxx + 2 H w_xxyy + D22 w_yyyy + N w_xx = 0`, `H = D12 + 2 D66`, with
/// `w = f(y) sin(alpha x)` on `-b/2 <= y <= b/2`. The roots of
/// `D22 r⁴ - 2 H alpha² r² + (D11 alpha⁴ - N alpha²) = 0` are `±p` and `±i q` once
/// `N > D11 alpha²`, and the symmetric mode `f = A cosh(p y) + B cos(q y)` with `f = f' = 0` at
/// the edges buckles where `q tan(q b/2) + p tanh(p b/2) = 0` (the characteristic equation of
/// Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961, §9.5, for the clamped edges,
/// written for an orthotropic plate as in Lekhnitskii, Anisotropic Plates, 1968; from memory).
/// The least root in `N` by bisection, then the least over the half-wavelength.
fn clamped_long_plate_exact(d: &Matrix3<f64>, b: f64) -> f64 {
    let (d11, d22, h) = (d[(0, 0)], d[(1, 1)], d[(0, 1)] + 2.0 * d[(2, 2)]);
    let at = |alpha: f64| {
        let a2 = alpha * alpha;
        // The determinant divided by cosh(p b/2): continuous in N.
        let f = |n: f64| {
            let disc = (h * a2).powi(2) - d22 * (d11 * a2 * a2 - n * a2);
            let root = disc.sqrt();
            let p = ((h * a2 + root) / d22).sqrt();
            let q = ((root - h * a2) / d22).sqrt();
            q * (0.5 * q * b).sin() + p * (0.5 * p * b).tanh() * (0.5 * q * b).cos()
        };
        let n0 = d11 * a2;
        let step = 0.01 * n0.max(h * PI * PI / (b * b));
        let (mut lo, mut hi) = (n0 * (1.0 + 1e-12), n0 * (1.0 + 1e-12) + step);
        while f(hi) > 0.0 {
            lo = hi;
            hi += step;
        }
        for _ in 0..200 {
            let mid = 0.5 * (lo + hi);
            if f(mid) > 0.0 { lo = mid } else { hi = mid }
        }
        0.5 * (lo + hi)
    };
    // Least over the half-wavelength lambda = pi/alpha: a fine logarithmic scan, then golden
    // section about the least point.
    let base = b * (d11 / d22).powf(0.25);
    let n_of = |l: f64| at(PI / (base * l.exp()));
    let grid: Vec<f64> =
        (0..=200).map(|i| (0.1f64).ln() + (30.0f64).ln() * i as f64 / 200.0).collect();
    let i = (0..grid.len()).min_by(|&a, &c| n_of(grid[a]).total_cmp(&n_of(grid[c]))).unwrap();
    let (mut a, mut c) = (grid[i.saturating_sub(1)], grid[(i + 1).min(grid.len() - 1)]);
    let g = 0.5 * (5f64.sqrt() - 1.0);
    for _ in 0..80 {
        let (x1, x2) = (c - g * (c - a), a + g * (c - a));
        if n_of(x1) < n_of(x2) { c = x2 } else { a = x1 }
    }
    n_of(0.5 * (a + c))
}

#[test]
fn clamped_long_orthotropic_plate_in_compression_matches_the_exact_solution() {
    // The independent solution above in its isotropic limit: k = 6.97 (Timoshenko & Gere 1961,
    // §9.5, printed to three figures).
    let (d0, d_iso) = isotropic_d(70e9, 0.3, 2e-3);
    let b = 0.12;
    let k = k_of(clamped_long_plate_exact(&d_iso, b), d0, b);
    assert!((k / 6.97 - 1.0).abs() < 1e-3, "isotropic clamped: k = {k}");
    // The program's clamped Ritz solution against it for specially orthotropic laminates of
    // very different D11/D22 (T300/5208, Kaw 2006, Table 2.1), and for the isotropic plate.
    let solver = LongPlate::new(EdgeSupport::Clamped);
    let mut cases: Vec<(&str, Matrix3<f64>)> =
        ["[0/90]2s", "[0/90/0]s", "[90/0/90]s", "[0]8", "[90]8"]
            .into_iter()
            .map(|code| (code, laminate(code).abd().d))
            .collect();
    cases.push(("isotropic", d_iso));
    for (code, d) in cases {
        assert!(d[(0, 2)].abs() < 1e-12 * d[(0, 0)]);
        let b = 0.08;
        let got = solver.critical(&d, b, NONE).compression;
        let want = clamped_long_plate_exact(&d, b);
        // A Ritz solution is an upper bound; ten terms leave it within 0.2 % here.
        assert!(got >= want * (1.0 - 1e-6), "{code}: {got} below the exact {want}");
        assert!(got / want - 1.0 < 2e-3, "{code}: {got} against the exact {want}");
        eprintln!("{code}: Ritz/exact - 1 = {:.2e}", got / want - 1.0);
    }
}

#[test]
fn bending_twisting_coupling_lowers_the_load_and_turns_with_the_sign_of_shear() {
    // Laws (Whitney 1987, ch. 5, from memory: D16 and D26 lower the compressive buckling load
    // of a long plate below the value with them left out, and a plate with D16, D26 buckles at
    // different shear loads of the two signs; turning every ply angle over swaps the two).
    let solver = LongPlate::new(EdgeSupport::SimplySupported);
    let b = 0.1;
    let d = laminate("[45/-45]s").abd().d;
    let mut special = d;
    for (i, j) in [(0, 2), (2, 0), (1, 2), (2, 1)] {
        special[(i, j)] = 0.0;
    }
    let full = solver.critical(&d, b, NONE);
    let bound = solver.critical(&special, b, NONE);
    assert!(full.compression < 0.995 * bound.compression, "{full:?} {bound:?}");
    assert!((full.shear_positive / full.shear_negative - 1.0).abs() > 0.05, "{full:?}");
    let mirrored = solver.critical(&laminate("[-45/45]s").abd().d, b, NONE);
    assert!((mirrored.shear_positive / full.shear_negative - 1.0).abs() < 1e-4);
    assert!((mirrored.compression / full.compression - 1.0).abs() < 1e-4);
}

#[test]
fn cylinders_in_axial_compression_with_the_sp8007_knock_down() {
    // Classical value of a long isotropic cylinder, N_cl = E t² / (R sqrt(3 (1 - nu²)))
    // (Timoshenko & Gere 1961, §11.4). Tolerance 0.1 % (a numerical minimum over two wave
    // numbers).
    let (e, nu, t, r) = (70e9, 0.3, 1e-3, 0.2);
    let (_, d) = isotropic_d(e, nu, t);
    let a = Matrix3::new(1.0, nu, 0.0, nu, 1.0, 0.0, 0.0, 0.0, 0.5 * (1.0 - nu))
        * (e * t / (1.0 - nu * nu));
    let compliance = a.try_inverse().unwrap();
    let n_cl = cylinder_classical(&d, &compliance, r);
    let want = e * t * t / (r * (3.0 * (1.0 - nu * nu)).sqrt());
    assert!((n_cl / want - 1.0).abs() < 1e-3, "{n_cl} against {want}");
    // NASA SP-8007, Buckling of Thin-Walled Circular Cylinders, 1968 (from memory): isotropic
    // knock-down gamma = 1 - 0.901 (1 - exp(-phi)), phi = sqrt(R/t)/16. The orthotropic form the
    // program uses reduces to it for an isotropic wall.
    let phi = (r / t).sqrt() / 16.0;
    let gamma = 1.0 - 0.901 * (1.0 - (-phi).exp());
    assert!((knock_down(r, &a, &d) - gamma).abs() < 2e-3, "{} {gamma}", knock_down(r, &a, &d));

    // A laminated cylinder, [0/90/0]s T300/5208, R = 0.15 m: the classical (Donnell) load of a
    // specially orthotropic cylinder, by an independent search over whole numbers of axial half
    // waves m on a length L = 2 m and circumferential waves n (Jones, Mechanics of Composite
    // Materials, 2nd ed., 1999, §6.5 gives the same equation; from memory):
    // N = [D11 a⁴ + 2 (D12 + 2 D66) a² b² + D22 b⁴ + a⁴ / (R² (c22 a⁴ + (2 c12 + c66) a² b²
    // + c11 b⁴))] / a², a = m pi / L, b = n / R, c = A^-1.
    let lam = laminate("[0/90/0]s");
    let abd = lam.abd();
    let c = abd.a.try_inverse().unwrap();
    let r = 0.15;
    let n_cl = cylinder_classical(&abd.d, &c, r);
    let (dd, l) = (abd.d, 2.0);
    let mut best = f64::INFINITY;
    for m in 1..4000 {
        let al = m as f64 * PI / l;
        for n in 0..80 {
            let be = n as f64 / r;
            let (a2, b2) = (al * al, be * be);
            let bend = dd[(0, 0)] * a2 * a2
                + 2.0 * (dd[(0, 1)] + 2.0 * dd[(2, 2)]) * a2 * b2
                + dd[(1, 1)] * b2 * b2;
            let am =
                c[(1, 1)] * a2 * a2 + (2.0 * c[(0, 1)] + c[(2, 2)]) * a2 * b2 + c[(0, 0)] * b2 * b2;
            best = best.min((bend + a2 * a2 / (r * r * am)) / a2);
        }
    }
    // Whole wave numbers on a finite length can only lie above the continuous minimum, and for
    // R/t = 150 they lie within 0.5 % of it.
    assert!(n_cl <= best * (1.0 + 1e-6) && n_cl > 0.995 * best, "{n_cl} against {best}");
    // With the knock-down: gamma by SP-8007 for an orthotropic wall,
    // phi = sqrt(R / t_e) / 29.8, t_e = (D11 D22 / (A11 A22))^(1/4).
    let te = (dd[(0, 0)] * dd[(1, 1)] / (abd.a[(0, 0)] * abd.a[(1, 1)])).powf(0.25);
    let gamma = 1.0 - 0.901 * (1.0 - (-(r / te).sqrt() / 29.8).exp());
    assert!((knock_down(r, &abd.a, &dd) - gamma).abs() < 1e-12);
    assert!(gamma > 0.3 && gamma < 0.7, "gamma {gamma}");
}

/// An invented sandwich: aluminium-like faces 0.5 mm, a foam core 10 mm, the same Poisson's
/// ratio in every layer so that a uniaxial load gives uniaxial stress in each.
const SANDWICH: &str = r#"
[isotropic.face]
E_GPa = 70
nu = 0.3
density_kg_m3 = 2700
ply_thickness_mm = 0.5

[isotropic.foam]
E_GPa = 0.085
nu = 0.3
density_kg_m3 = 80
ply_thickness_mm = 10
core = true
core_shear_modulus_MPa = 30
core_shear_strength_MPa = 1.1
"#;

fn sandwich() -> (Laminate, layloft::material::MaterialLibrary) {
    let lib = read_materials_str(SANDWICH, "sandwich.toml").unwrap();
    let face = Arc::new(lib.ply_material("face").unwrap());
    let foam = Arc::new(lib.ply_material("foam").unwrap());
    let zero = Angle::from_deg(0.0);
    let lam = Laminate::new(vec![
        Ply::new(face.clone(), zero),
        Ply::new(foam, zero),
        Ply::new(face, zero),
    ]);
    (lam, lib)
}

#[test]
fn sandwich_panel_buckling_with_and_without_core_shear() {
    // Allen, Analysis and Design of Structural Sandwich Panels, 1969, ch. 4 (thin faces,
    // isotropic, simply supported; from memory): N = (pi² D / b²) (phi + 1/phi)² /
    // (1 + rho (phi² + 1)), phi = m b / a, rho = pi² D / (b² S), S = G_c d² / t_c (ch. 2);
    // a long plate takes the least over phi. Without core shear (S infinite) it is k = 4.
    let (lam, lib) = sandwich();
    let sw = SandwichWall::of(&lam, &lib).expect("a sandwich");
    let (t_f, t_c, g_c) = (0.5e-3, 10e-3, 30e6);
    let d_faces = t_c + t_f;
    let s_hand = g_c * d_faces * d_faces / t_c;
    assert!((sw.shear_stiffness / s_hand - 1.0).abs() < 1e-12, "{}", sw.shear_stiffness);
    let abd = lam.abd();
    let d = abd.d[(0, 0)];
    let b = 0.3;
    let rho = PI * PI * d / (b * b * s_hand);
    let allen = (1..=200000)
        .map(|i| {
            let phi = i as f64 * 1e-4;
            PI * PI * d / (b * b) * (phi + 1.0 / phi).powi(2) / (1.0 + rho * (phi * phi + 1.0))
        })
        .fold(f64::INFINITY, f64::min);
    let solver = PanelSolver::new(0.0);
    let (with_core, ..) = solver.panel_critical(&abd, b, f64::INFINITY, false, Some(&sw));
    assert!(
        (with_core.compression / allen - 1.0).abs() < 1e-4,
        "{} against {allen}",
        with_core.compression
    );
    // The Ritz solution with the core's flexibility through its mode agrees too.
    let ritz = LongPlate::new(EdgeSupport::SimplySupported)
        .critical(&abd.d, b, ShearFlexibility(s_hand))
        .compression;
    assert!((ritz / allen - 1.0).abs() < 1e-4, "{ritz} against {allen}");
    let (rigid, ..) = solver.panel_critical(&abd, b, f64::INFINITY, false, None);
    let k = k_of(rigid.compression, d, b);
    assert!((k - 4.0).abs() < 1e-3, "k = {k}");
    // The core's shear flexibility lowers the load, here by a few per cent (rho about 0.04).
    assert!(with_core.compression < 0.99 * rigid.compression);
    // A narrow panel on a thick core: as rho grows the load tends to S, the shear crimping load
    // (Allen 1969, ch. 4).
    let narrow = solver.panel_critical(&abd, 0.01, f64::INFINITY, false, Some(&sw)).0.compression;
    assert!((narrow / s_hand - 1.0).abs() < 0.01, "{narrow} {s_hand}");
}

#[test]
fn sandwich_wrinkling_crimping_and_core_shear() {
    let (lam, lib) = sandwich();
    let sw = SandwichWall::of(&lam, &lib).expect("a sandwich");
    let (e_f, e_c, g_c, t_f, t_c): (f64, f64, f64, f64, f64) = (70e9, 85e6, 30e6, 0.5e-3, 10e-3);
    // Face wrinkling: sigma_wr = 0.5 (E_f E_c G_c)^(1/3) (Hoff & Mautner 1945, as given by
    // Zenkert, An Introduction to Sandwich Construction, 1995, ch. 9; from memory).
    let wr = 0.5 * (e_f * e_c * g_c).cbrt();
    assert!((sw.wrinkling_stress[0] / wr - 1.0).abs() < 1e-9, "{:?} {wr}", sw.wrinkling_stress);
    assert!((wr / 1e6 - 281.5).abs() < 0.1, "{wr}");
    // Under N_x = -50 kN/m every layer strains alike, sigma_f = E_f N_x / (sum E t).
    let n_x = -50e3;
    let sigma_f = e_f * n_x / (2.0 * e_f * t_f + e_c * t_c);
    let f = sw.factors(n_x, 0.0);
    assert!((f.wrinkling / (wr / -sigma_f) - 1.0).abs() < 1e-9, "{f:?}");
    // Shear crimping: N = S = G_c d² / t_c (Allen 1969, ch. 8; Zenkert 1995, ch. 9).
    let s = g_c * (t_c + t_f).powi(2) / t_c;
    assert!((f.crimping / (s / -n_x) - 1.0).abs() < 1e-9, "{f:?}");
    assert_eq!(f.core_shear, f64::INFINITY);
    // Core shear under a shear flow: gamma = N_xs / (sum G t), tau_c = G_c gamma against the
    // core shear strength (Zenkert 1995, ch. 9).
    let n_xs = 20e3;
    let g = |e: f64| e / (2.0 * 1.3);
    let gamma = n_xs / (2.0 * g(e_f) * t_f + g(e_c) * t_c);
    let f = sw.factors(0.0, n_xs);
    assert!((f.core_shear / (1.1e6 / (g_c * gamma)) - 1.0).abs() < 1e-9, "{f:?}");
    // Pure shear drives crimping and wrinkling through the principal compression |N_xs|.
    assert!((f.crimping / (s / n_xs) - 1.0).abs() < 1e-9);
    // Tension alone drives none of the modes.
    let f = sw.factors(50e3, 0.0);
    assert_eq!((f.wrinkling, f.crimping), (f64::INFINITY, f64::INFINITY));
}

#[test]
fn a_core_needs_positive_shear_values_and_core_keys_need_core_true() {
    let bad = SANDWICH.replace("core_shear_modulus_MPa = 30", "core_shear_modulus_MPa = -30");
    let e = read_materials_str(&bad, "m.toml").unwrap_err().to_string();
    assert_eq!(
        e,
        "m.toml line 14, isotropic.foam.core_shear_modulus_MPa: core shear modulus (MPa) must be a positive number, found -30"
    );
    let bad = SANDWICH.replace("core = true\n", "");
    let e = read_materials_str(&bad, "m.toml").unwrap_err().to_string();
    assert!(e.contains("core_shear_modulus_MPa") && e.contains("core = true"), "{e}");
    let bad = SANDWICH.replace("core_shear_strength_MPa = 1.1\n", "");
    let e = read_materials_str(&bad, "m.toml").unwrap_err().to_string();
    assert!(e.contains("missing key 'core_shear_strength_MPa'"), "{e}");
}

#[test]
fn interaction_of_compression_and_shear() {
    // R_c + R_s² = 1 for flat plates under compression and shear (Bruhn, Analysis and Design of
    // Flight Vehicle Structures, 1973, §C5; from memory): at R_c = 0.5 alone the factor is 2;
    // with R_s = 0.5 as well, lambda (0.5) + lambda² (0.25) = 1 gives lambda = sqrt(5) - 1.
    assert!((interaction_factor(0.5, 0.0) - 2.0).abs() < 1e-12);
    assert!((interaction_factor(0.5, 0.5) - (5f64.sqrt() - 1.0)).abs() < 1e-12);
}

#[test]
fn demo_compression_skin_against_a_hand_calculation() {
    use layloft::analysis::BladeModel;
    use layloft::buckling::PanelPart;
    use layloft::input::read_project;
    use layloft::stress::analyse_cases;

    let model =
        BladeModel::build(read_project("layups/mine-fan/blade.toml".as_ref()).unwrap()).unwrap();
    let cases = analyse_cases(&model, None).unwrap();
    // The panel of the lowest buckling reserve factor over every case.
    let (case, i, j) = cases
        .iter()
        .filter_map(|c| c.least_buckling().map(|(i, j)| (c, i, j)))
        .min_by(|a, b| {
            let rf = |x: &(&layloft::stress::CaseStress, usize, usize)| {
                x.0.buckling[x.1].panels[x.2].check.reserve_factor
            };
            rf(a).total_cmp(&rf(b))
        })
        .unwrap();
    let st = &model.stations[i];
    let p = &case.buckling[i].panels[j];
    let panel = &p.panel;
    assert_eq!(panel.part, PanelPart::Skin);
    assert!(p.check.n_x < 0.0, "a compressed panel: {:?}", p.check);

    // Step 1: the width is the panel's midline length, at least its chordwise extent.
    let elements = st.section.elements();
    let b: f64 = panel.elements.iter().map(|&k| elements[k].length()).sum();
    assert!((b / panel.width - 1.0).abs() < 1e-12);
    let extent = match (&p.from, &p.to) {
        (
            layloft::stress::WallLocation::Surface { x_c: a, .. },
            layloft::stress::WallLocation::Surface { x_c: c, .. },
        ) => (a - c).abs() * st.layout.chord,
        _ => unreachable!(),
    };
    assert!(b > extent && b < 1.3 * extent, "width {b} against chordwise extent {extent}");

    // Step 2: the wall's stiffness by CLT; the demo's fabrics are balanced, so D16 = D26 = 0,
    // and the reduced bending stiffness D* = D - B A^-1 B is taken for the unsymmetric wall.
    let abd = st.layout.laminates[panel.laminate].abd();
    let d = abd.d - abd.b * abd.a.try_inverse().unwrap() * abd.b;
    assert!(d[(0, 2)].abs() < 1e-9 * d[(0, 0)] && d[(1, 2)].abs() < 1e-9 * d[(0, 0)]);

    // Step 3: flat, simply supported (the demo's default): Whitney's long-plate formula,
    // N_flat = 2 pi² / b² (sqrt(D11 D22) + D12 + 2 D66).
    let n_flat =
        2.0 * PI * PI / (b * b) * ((d[(0, 0)] * d[(1, 1)]).sqrt() + d[(0, 1)] + 2.0 * d[(2, 2)]);

    // Step 4: the curvature gain of the panel's radius R (the model's geometry) by the
    // shallow-shell formula with the SP-8007 knock-down gamma on the curvature term:
    // N(a) = [D11 a⁴ + 2 (D12 + 2 D66) a² k² + D22 k⁴ + gamma² a⁴ / (R² (c22 a⁴ + (2 c12 + c66)
    // a² k² + c11 k⁴))] / a², k = pi / b, c = A^-1, least over the half-wavelength pi/a
    // (a fine scan).
    let r = panel.radius;
    let c = abd.a.try_inverse().unwrap();
    let te = (d[(0, 0)] * d[(1, 1)] / (abd.a[(0, 0)] * abd.a[(1, 1)])).powf(0.25);
    let gamma = 1.0 - 0.901 * (1.0 - (-(r / te).sqrt() / 29.8).exp());
    assert!((panel.knock_down - gamma).abs() < 1e-12);
    let k2 = (PI / b).powi(2);
    let curved = |with: f64| {
        (1..=40000)
            .map(|n| {
                let a = PI / (b * 0.01 * 1.0003f64.powi(n));
                let a2 = a * a;
                let bend = d[(0, 0)] * a2 * a2
                    + 2.0 * (d[(0, 1)] + 2.0 * d[(2, 2)]) * a2 * k2
                    + d[(1, 1)] * k2 * k2;
                let am = c[(1, 1)] * a2 * a2
                    + (2.0 * c[(0, 1)] + c[(2, 2)]) * a2 * k2
                    + c[(0, 0)] * k2 * k2;
                (bend + with * gamma * gamma * a2 * a2 / (r * r * am)) / a2
            })
            .fold(f64::INFINITY, f64::min)
    };
    let gain = if r.is_finite() { curved(1.0) - curved(0.0) } else { 0.0 };
    assert!((curved(0.0) / n_flat - 1.0).abs() < 1e-6);

    // Step 5: the critical compression and the model's value agree to the search tolerance.
    let n_cr = n_flat + gain;
    assert!(
        (panel.critical.compression / n_cr - 1.0).abs() < 1e-3,
        "model {} against hand {n_cr} (flat {n_flat}, gain {gain})",
        panel.critical.compression
    );

    // Step 6: the load is the most compressive N_x of the panel's points, each taken at its
    // strain in the panel's laminate (N_x times the panel laminate's axial stiffness 1/a11 over
    // the point's own: the panel here runs over the thin edge of the spar cap), and the largest
    // shear flow; the reserve factor solves lambda R_c + lambda² R_s² = 1.
    let pts = &case.stations[i].points;
    let axial = |lam: usize| 1.0 / st.layout.laminates[lam].abd().a.try_inverse().unwrap()[(0, 0)];
    let laminates: std::collections::BTreeSet<usize> =
        panel.elements.iter().map(|&k| elements[k].laminate).collect();
    assert!(laminates.len() >= 2, "the panel spans a ply drop: {laminates:?}");
    let n_x = panel
        .elements
        .iter()
        .map(|&k| {
            let q = pts.iter().find(|q| q.element == k).unwrap();
            q.n_x * axial(panel.laminate) / axial(elements[k].laminate)
        })
        .fold(f64::INFINITY, f64::min);
    assert!((p.check.n_x / n_x - 1.0).abs() < 1e-12);
    let r_c = -n_x / n_cr;
    let r_s = p.check.r_s;
    let lambda = (-r_c + (r_c * r_c + 4.0 * r_s * r_s).sqrt()) / (2.0 * r_s * r_s);
    assert!(
        (p.check.buckling / lambda - 1.0).abs() < 2e-3,
        "{} against {lambda}",
        p.check.buckling
    );

    // The demo's web is a sandwich, glass-biax 0.5 mm / PVC foam 5 mm / glass-biax 0.5 mm:
    // S = G_c d² / t_c = 27 MPa (5.5 mm)² / 5 mm = 163.35 kN/m (Allen 1969, ch. 2).
    let web = case.buckling[i]
        .panels
        .iter()
        .find(|q| matches!(q.panel.part, PanelPart::Web { .. }))
        .expect("a web panel");
    let sw = web.panel.sandwich.as_ref().expect("the web is a sandwich");
    assert!((sw.shear_stiffness / 163.35e3 - 1.0).abs() < 1e-9, "{}", sw.shear_stiffness);
}

/// A tube spun at 1000 rpm with no other load: its walls are in pure tension, carry no shear
/// (statics: the centrifugal force acts along the pitch axis through the section's centre) and
/// cannot buckle. Every panel's reserve factor is infinite (shown as none, `null` in JSON),
/// whatever round-off of the section solve leaves in the shear flow; before, a shear flow of
/// some 1e-13 N/m gave reserve factors like 2e9 at a place the round-off picked. The same tube
/// under a flap load (compression on one side) buckles at a finite factor.
#[test]
fn walls_in_pure_tension_have_no_buckling_factor() {
    let dir = tempfile::tempdir().unwrap();
    let plies = "p1,al,0,0.20,1.20,both,0,1\np2,al,0,0.20,1.20,both,0,1\n";
    let extra = "[[load_case]]\nname = \"spin\"\nrpm = 1000\n\
                 [[load_case]]\nname = \"flap\"\nrpm = 0\ndistributed = \"flap.csv\"\n";
    let project = crate::common::tube_project(dir.path(), plies, extra);
    std::fs::write(
        dir.path().join("flap.csv"),
        "r_m,f_flap_N_m,f_edge_N_m,m_pitch_Nm_m\n0.20,2000,0,0\n1.20,2000,0,0\n",
    )
    .unwrap();
    let model =
        layloft::analysis::BladeModel::build(layloft::input::read_project(&project).unwrap())
            .unwrap();
    let cases = layloft::stress::analyse_cases(&model, None).unwrap();
    let panels = |k: usize| cases[k].buckling.iter().flat_map(|s| s.panels.iter());
    assert!(panels(0).count() > 0);
    for p in panels(0) {
        assert_eq!(p.check.n_x, 0.0, "tension is no compression");
        assert_eq!(p.check.reserve_factor, f64::INFINITY, "{:?}", p.check);
    }
    assert!(panels(1).any(|p| p.check.reserve_factor.is_finite() && p.check.r_c > 0.0));
}

/// Membrane stiffness `A` of an isotropic wall.
fn isotropic_a(e: f64, nu: f64, t: f64) -> Matrix3<f64> {
    Matrix3::new(1.0, nu, 0.0, nu, 1.0, 0.0, 0.0, 0.0, 0.5 * (1.0 - nu)) * (e * t / (1.0 - nu * nu))
}

#[test]
fn long_tubes_in_torsion_give_the_classical_long_tube_value() {
    // Timoshenko & Gere, Theory of Elastic Stability, 1961, §11.12, long thin tube in torsion
    // (from memory): tau_cr = E (t/R)^(3/2) / (3 sqrt(2) (1 - nu²)^(3/4)). The asymptote holds
    // when the axial wave is long against the circumference (alpha R of order sqrt(t/R)): at
    // R/t = 500 and 2000 to 0.5 %.
    let (e, nu, t) = (70e9, 0.3, 1e-3);
    let (_, d) = isotropic_d(e, nu, t);
    let c = isotropic_a(e, nu, t).try_inverse().unwrap();
    for r in [0.5, 2.0] {
        let tau = cylinder_torsion(&d, &c, r) / t;
        let want = e * (t / r).powf(1.5) / (3.0 * 2f64.sqrt() * (1.0 - nu * nu).powf(0.75));
        assert!((tau / want - 1.0).abs() < 5e-3, "R/t {}: {tau} against {want} Pa", r / t);
    }
}

#[test]
fn curved_panels_in_shear_gain_with_curvature_and_are_flat_plates_when_flat() {
    // A simply supported aluminium panel 100 mm wide, 1 mm thick. Flat: k_s = 5.35 (Timoshenko
    // & Gere 1961, §9.7, long plate; from memory) from the flat solver. Curved with a radius a
    // million widths: the same to 1e-6. Tighter curvature raises the load (the membrane term
    // is positive), by a factor that grows with Batdorf's Z = b² sqrt(1 - nu²) / (R t).
    let (e, nu, t, b) = (70e9, 0.3, 1e-3, 0.1);
    let (d0, d) = isotropic_d(e, nu, t);
    let c = isotropic_a(e, nu, t).try_inverse().unwrap();
    let plate = LongPlate::new(EdgeSupport::SimplySupported);
    let flat = plate.shear(&d, b, NONE);
    let curved =
        |r: f64| plate.curved_shear(&d, b, &Curvature { radius: r, compliance: c }).unwrap();
    let far = curved(1e6 * b);
    for k in 0..2 {
        assert!((far[k] / flat[k] - 1.0).abs() < 1e-6, "{far:?} against {flat:?}");
    }
    assert!((k_of(flat[0], d0, b) / 5.35 - 1.0).abs() < 5e-3, "{flat:?}");
    let mut last = flat[0];
    let mut k_at = Vec::new();
    for r in [2.0, 1.0, 0.5, 0.2, 0.1] {
        let n = curved(r)[0];
        let z = b * b * (1.0 - nu * nu).sqrt() / (r * t);
        assert!(n > last, "R {r} m (Z {z:.1}): {n} not above {last}");
        last = n;
        k_at.push((z, k_of(n, d0, b)));
    }
    // Strongly curved, a long panel buckles as a strip of a long tube, helically across its
    // width: tau ~ E t^(3/2) / (b R^(1/2)) as the long tube's E (t/R)^(3/2) with b ~ R, so k_s
    // grows as Z^(1/2) (dimensional argument from the long-tube value above).
    let ((z1, k1), (z2, k2)) = (k_at[3], k_at[4]);
    let growth = (k2 / k1).ln() / (z2 / z1).ln();
    assert!((growth - 0.5).abs() < 0.1, "k_s grows as Z^{growth:.3} ({k_at:?})");
    // Clamped edges have no sine basis: no curved solution is offered.
    assert!(
        LongPlate::new(EdgeSupport::Clamped)
            .curved_shear(&d, b, &Curvature { radius: 0.2, compliance: c })
            .is_none()
    );
}

#[test]
fn a_round_wall_is_one_closed_panel_that_buckles_in_shear_as_a_tube() {
    // A round section of aluminium, R 50 mm, wall 1 mm, no webs: its skin is one panel that
    // closes on itself. Its critical shear flow is the flat strip's (b = 2 pi R, k_s = 5.35,
    // about 3.4 kN/m) plus the knock-down 0.67 (NASA SP-8007 for torsion, from memory) of the
    // curvature's gain up to the long tube's classical value (Timoshenko & Gere 1961, §11.12,
    // from memory: tau = E (t/R)^(3/2) / (3 sqrt(2) (1 - nu²)^(3/4)), about 50 kN/m here). So it
    // lies between 0.67 and 1 times the tube's value (before the curvature counted it was the
    // flat strip's, 0.07 of it).
    use layloft::section::{SectionParams, SolvedSection};
    let (e, nu, t, ro) = (70e9, 0.3, 1e-3, 0.0505);
    let wall = crate::common::single(&crate::common::isotropic("al", e, nu, t, 2700.0));
    let layout = crate::common::tube(ro, 240, wall);
    let section = SolvedSection::solve(&layout, &SectionParams::default()).unwrap();
    let library = read_materials_str(
        "[isotropic.al]\nE_GPa = 70\nnu = 0.3\ndensity_kg_m3 = 2700\nply_thickness_mm = 1.0\n",
        "al.toml",
    )
    .unwrap();
    let panels =
        layloft::buckling::find_panels(&layout, &section, &library, &PanelSolver::new(0.0));
    assert_eq!(panels.len(), 1, "{panels:?}");
    let p = &panels[0];
    assert!(p.closed);
    // The midline's radius; the panel's is its flattest third's, length over turn, and an open
    // run of the closed loop counts one joint fewer than it has elements (1.3 % here).
    let r = 0.05;
    assert!((p.radius / r - 1.0).abs() < 0.02, "radius {}", p.radius);
    let tube = t * e * (t / r).powf(1.5) / (3.0 * 2f64.sqrt() * (1.0 - nu * nu).powf(0.75));
    // The same wall as an open panel held at one line (the leading edge's rule for open skins)
    // buckles above the tube, whose helical buckles that line would stop: the tube governs.
    let (_, d) = isotropic_d(e, nu, t);
    let c = isotropic_a(e, nu, t).try_inverse().unwrap();
    let held = LongPlate::new(EdgeSupport::SimplySupported)
        .curved_shear(&d, p.width, &Curvature { radius: p.radius, compliance: c })
        .unwrap();
    assert!(held[0] > tube, "{held:?} against the tube's {tube} N/m");
    for n in [p.critical.shear_positive, p.critical.shear_negative] {
        assert!(n > 0.67 * tube && n < tube, "{n} N/m against the tube's {tube} N/m");
    }
}

/// The panels either side of the leading edge: a flat front (a box's) is one panel across the
/// leading edge, held at the box's corners, and buckles as a long simply supported plate of the
/// face's whole width, N_cr = 4 π² D / b² (Timoshenko & Gere, Theory of Elastic Stability,
/// §9.2, k = 4 for a long plate, from memory); the leading edge cut it into two halves of four
/// times that (unconservative). A round tube's front arc between two webs is likewise one panel.
/// An airfoil's nose, curved far more than the skins either side, still holds them (the usual
/// rule for blade skins).
#[test]
fn the_nose_holds_the_skins_only_where_it_is_curved_far_more_than_they() {
    use layloft::section::{SectionParams, SolvedSection};
    let (e, nu, t) = (70e9, 0.3, 1e-3);
    let library = read_materials_str(
        "[isotropic.al]\nE_GPa = 70\nnu = 0.3\ndensity_kg_m3 = 2700\nply_thickness_mm = 1.0\n",
        "al.toml",
    )
    .unwrap();
    let wall = || crate::common::single(&crate::common::isotropic("al", e, nu, t, 2700.0));
    let panels = |layout: &layloft::section::SectionLayout| {
        let section = SolvedSection::solve(layout, &SectionParams::default()).unwrap();
        let skin = section
            .elements()
            .iter()
            .filter(|e| matches!(e.part, layloft::section::WallPart::Skin { .. }))
            .count();
        let panels =
            layloft::buckling::find_panels(layout, &section, &library, &PanelSolver::new(0.0));
        (panels, skin)
    };
    // Box 300 x 90 mm (outer), 1 mm wall: four faces, the front one across the leading edge.
    let (w, h) = (0.3, 0.09);
    let (box_panels, skin) = panels(&crate::common::rect(w, h, 24, [0; 4], vec![wall()]));
    assert_eq!(box_panels.len(), 4, "{box_panels:?}");
    let front = box_panels
        .iter()
        .find(|p| p.elements.contains(&0) && p.elements.contains(&(skin - 1)))
        .expect("one panel across the leading edge");
    let b = h - t;
    assert!((front.width / b - 1.0).abs() < 1e-9, "width {} against {b}", front.width);
    let (d, _) = isotropic_d(e, nu, t);
    let n_cr = 4.0 * PI * PI * d / (b * b);
    assert!((front.critical.compression / n_cr - 1.0).abs() < 1e-3, "{:?}", front.critical);
    // A round tube (R 50 mm midline) with webs at ±30 mm from its centre: the front arc from
    // web to web, 2 R acos(0.6) long, is one panel across the leading edge.
    let ro = 0.0505;
    let tube = crate::common::tube(ro, 240, wall());
    let tube =
        crate::common::with_web(crate::common::with_web(tube, "front", -0.03, 0), "aft", 0.03, 0);
    let (tube_panels, skin) = panels(&tube);
    let arc = tube_panels
        .iter()
        .find(|p| p.elements.contains(&0) && p.elements.contains(&(skin - 1)))
        .expect("one panel across the leading edge");
    let expected = 2.0 * 0.05 * (0.03_f64 / 0.05).acos();
    assert!((arc.width / expected - 1.0).abs() < 0.02, "{} against {expected}", arc.width);
    // NACA 0012, chord 0.3 m, a web at 30 % of the chord: the nose holds the skins either side,
    // so no panel runs across the leading edge.
    let foil = crate::common::naca00(0.12, 0.3, 200, &[], vec![wall()], |_, _| 0);
    // The leading edge lies at y = -0.25 c: the web at 30 % of the chord at y = 0.05 c.
    let foil = crate::common::with_web(foil, "spar", 0.05 * 0.3, 0);
    let (foil_panels, skin) = panels(&foil);
    assert!(
        foil_panels.iter().all(|p| !(p.elements.contains(&0) && p.elements.contains(&(skin - 1)))),
        "{foil_panels:?}"
    );
}

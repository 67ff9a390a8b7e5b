//! The 4x4 section stiffness: axial, bending and wall-curvature integrals of the wall elements
//! plus the closed cell shear flows with equal twist rate in every cell.
//!
//! With generalised strains `e = (eps, kappa_t, kappa_f, kappa_e)` about the pitch axis, the
//! kinematic wall quantities are `k = (eps_x, kappa_x, kappa_xs) = G e` with
//!
//! ```text
//!     | 1   0   z    y  |        eps_x    = eps + z kappa_f + y kappa_e
//! G = | 0   0   n_z  n_y|        kappa_x  = the beam curvature along the wall normal n
//!     | 0  -2   0    0  |        kappa_xs = -2 kappa_t
//! ```
//!
//! (the last two rows are zero with [`WallCurvature::Held`]). Each cell `j` carries a constant
//! shear flow `q_j` (counter-clockwise positive); an element's shear flow is `N_xs = Σ σ_ej q_j`.
//! The wall law in mixed form (`wall.rs`) reads `(N_x, M_x, M_xs) = Ā k + c N_xs`,
//! `gamma_xs = f N_xs - c·k`. Compatibility of warping round every cell,
//! `∮ gamma_xs ds = 2 A_j kappa_t`, gives `F q = D e` with
//!
//! ```text
//! F_jk = Σ_e σ_ej σ_ek f_e L_e,     D_j = Σ_e σ_ej ∫ Gᵀ c ds + 2 A_j (in the kappa_t column)
//! ```
//!
//! and the stiffness `S = H + Dᵀ F⁻¹ D`, `H = Σ_e ∫ Gᵀ Ā G ds`, by virtual work:
//! `S e · δe = ∮ (N_x δeps_x + M_x δkappa_x + M_xs δkappa_xs + N_xs δgamma_xs) ds`. The torque is
//! `T = Σ 2 A_j q_j - 2 ∮ M_xs ds`. This is the closed-section theory of Berdichevsky, Armanios
//! & Badir (Composites Engineering 2 (1992) 411–432), generalised to several cells by equal
//! twist rate, with the wall bending terms of Rehfield (1985) when the walls follow the beam's
//! curvature; for isotropic walls held flat it is Bredt–Batho with `GJ = 4A²/∮ds/(Gt)`.

use nalgebra::{DMatrix, DVector, Matrix3x4, Matrix4, Vector4};

use super::contour::Contour;
use super::wall::{WallCurvature, WallStiffness};

/// The assembled section stiffness about the pitch axis and the closed-cell flow kernel.
#[derive(Debug, Clone)]
pub(crate) struct Assembly {
    /// 4x4 stiffness about the pitch axis.
    pub stiffness: Matrix4<f64>,
    /// Closed-cell shear flows per unit generalised strain about the pitch axis (cells × 4).
    pub cell_flow: DMatrix<f64>,
    /// Cell flexibility F (cells × cells), m/N.
    pub flexibility: DMatrix<f64>,
}

/// `g = (1, 0, z, y)` at a point.
pub(crate) fn axial_shape(p: [f64; 2]) -> Vector4<f64> {
    Vector4::new(1.0, 0.0, p[1], p[0])
}

/// The kinematic map `G` from generalised strains about the origin to `(eps_x, kappa_x,
/// kappa_xs)` at point `p` of a wall with outward normal `normal`.
pub(crate) fn kinematics(p: [f64; 2], normal: [f64; 2], mode: WallCurvature) -> Matrix3x4<f64> {
    let mut g = Matrix3x4::zeros();
    g.set_row(0, &axial_shape(p).transpose());
    if mode == WallCurvature::Beam {
        g[(1, 2)] = normal[1];
        g[(1, 3)] = normal[0];
        g[(2, 1)] = -2.0;
    }
    g
}

pub(crate) fn assemble(
    contour: &Contour,
    walls: &[WallStiffness],
    mode: WallCurvature,
) -> Option<Assembly> {
    let nc = contour.cell_areas.len();
    let mut h = Matrix4::zeros();
    let mut d = DMatrix::zeros(nc, 4);
    let mut f = DMatrix::zeros(nc, nc);
    for e in &contour.elements {
        let w = &walls[e.laminate];
        let l = e.length();
        let gm = kinematics(e.midpoint(), e.normal(), mode);
        let dg = axial_shape(e.end) - axial_shape(e.start);
        let dg = Vector4::new(0.0, 0.0, dg[2], dg[3]);
        // G is linear along the element in its first row only.
        h += (gm.transpose() * w.mixed_stiffness() * gm) * l
            + dg * dg.transpose() * (w.axial() * l / 12.0);
        let c = gm.transpose() * w.mixed_coupling() * l;
        let fl = w.shear_compliance() * l;
        for (j, sj) in e.cells() {
            for col in 0..4 {
                d[(j, col)] += sj * c[col];
            }
            for (k, sk) in e.cells() {
                f[(j, k)] += sj * sk * fl;
            }
        }
    }
    for (j, a) in contour.cell_areas.iter().enumerate() {
        d[(j, 1)] += 2.0 * a;
    }
    let chol = f.clone().cholesky()?;
    let cell_flow = chol.solve(&d);
    let s = DMatrix::from_fn(4, 4, |i, j| h[(i, j)]) + d.transpose() * &cell_flow;
    let stiffness = Matrix4::from_fn(|i, j| s[(i, j)]);
    Some(Assembly { stiffness, cell_flow, flexibility: f })
}

/// The transformation `e_origin = T e_point` of generalised strains from a reference point at
/// `p` to the origin; stiffness about `p` is `Tᵀ S T`.
pub(crate) fn shift(p: [f64; 2]) -> Matrix4<f64> {
    let mut t = Matrix4::identity();
    t[(0, 2)] = -p[1];
    t[(0, 3)] = -p[0];
    t
}

/// The elastic (tension) centre: the point where an axial force causes no bending curvature,
/// from the compliance about the origin.
pub(crate) fn elastic_centre(compliance: &Matrix4<f64>) -> Option<[f64; 2]> {
    let c = compliance;
    let det = c[(2, 2)] * c[(3, 3)] - c[(2, 3)] * c[(3, 2)];
    if !det.is_finite() || det == 0.0 {
        return None;
    }
    // [c22 c23; c32 c33] [z; y] = -[c20; c30]
    let z = (-c[(2, 0)] * c[(3, 3)] + c[(3, 0)] * c[(2, 3)]) / det;
    let y = (-c[(3, 0)] * c[(2, 2)] + c[(2, 0)] * c[(3, 2)]) / det;
    Some([y, z])
}

/// Principal bending stiffnesses (greater, lesser) and the angle from the y axis to the axis of
/// the lesser one, rad: `tan 2α = 2 EI_cross / (EI_edge - EI_flap)`.
pub(crate) fn principal(ei_flap: f64, ei_edge: f64, ei_cross: f64) -> ([f64; 2], f64) {
    let mean = 0.5 * (ei_flap + ei_edge);
    let radius = (0.25 * (ei_edge - ei_flap).powi(2) + ei_cross * ei_cross).sqrt();
    let angle = 0.5 * (2.0 * ei_cross).atan2(ei_edge - ei_flap);
    ([mean + radius, mean - radius], angle)
}

/// Solves `F x = b` with the cell flexibility.
pub(crate) fn solve_cells(f: &DMatrix<f64>, b: &DVector<f64>) -> Option<DVector<f64>> {
    f.clone().cholesky().map(|c| c.solve(b))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn principal_axes_of_a_rotated_section() {
        // Bending stiffness about an axis at angle α: EI(α) = EIf cos²α − 2 EIc sinα cosα
        // + EIe sin²α (Mohr's circle for second moments; any strength of materials text).
        let (ef, ee, ec) = (3.0, 7.0, 1.5);
        let (p, a) = principal(ef, ee, ec);
        let ei =
            |t: f64| ef * t.cos().powi(2) - 2.0 * ec * t.sin() * t.cos() + ee * t.sin().powi(2);
        assert!((ei(a) - p[1]).abs() < 1e-12);
        assert!((ei(a + std::f64::consts::FRAC_PI_2) - p[0]).abs() < 1e-12);
        for k in 0..90 {
            assert!(ei(k as f64 * 0.035) >= p[1] - 1e-12);
        }
    }

    #[test]
    fn shifting_the_reference_moves_the_axial_force() {
        // A force N at (y0, z0) has moments M_f = N z0, M_e = N y0 about the origin.
        let t = shift([0.3, -0.2]);
        let s = Matrix4::from_diagonal(&Vector4::new(2.0, 1.0, 1.0, 1.0));
        let sp = t.transpose() * s * t;
        assert!((sp[(0, 2)] - 0.4).abs() < 1e-15 && (sp[(0, 3)] + 0.6).abs() < 1e-15);
    }
}

//! The rotating beam element: shape functions, the section densities of strain, kinetic and
//! centrifugal energy, and the 14x14 element matrices by Gauss–Legendre quadrature.
//!
//! Element degrees of freedom, in this order: node a `(u, v, w, theta, v', w')`, the interior
//! node `(u_m, theta_m)` at mid-length, node b `(u, v, w, theta, v', w')`. Bending `v` (in the
//! plane of rotation) and `w` (out of it) are Hermite cubics; axial `u` and torsion `theta` are
//! quadratic Lagrange polynomials (nodes at both ends and mid-length), so that every field
//! converges at the same rate (frequency errors of order h⁴).
//!
//! At a point the displacement "state" is `q = (u, v, w, theta, v', w', u', theta', v'', w'')`;
//! each energy density is `½ qᵀ D q`.
//!
//! **Reference line.** `u, v, w` are the displacements of the section's shear centre and the
//! section turns by `theta` about it, so the curvatures `v''`, `w''` are those of the shear-centre
//! line: a section twisting about its shear centre does not bend, wherever the pitch axis lies.
//! (Taken on the pitch axis instead, a twist varying along the span bent the pitch-axis line by
//! `e theta''` and stored bending energy that is not there, `e` the shear centre's offset; the
//! frequencies then depended on where the pitch axis was put.) Every section quantity is referred
//! to the shear centre (`SpanSection::about_shear_centre`); only the centrifugal field sees the
//! section where it is, from the rotor axis, and the root's bearing holds the pitch axis
//! (`assemble.rs`). The shear centre's offset is taken as varying slowly along the span: terms in
//! its rate are left out, as those of the mass and elastic centres' offsets are.

#![allow(non_snake_case)]

use nalgebra::SMatrix;

use super::span::{Span, SpanSection};

/// Element degrees of freedom.
pub(crate) const NE: usize = 14;
/// Components of the point state `q`.
pub(crate) const NQ: usize = 10;

pub(crate) type Dens = SMatrix<f64, NQ, NQ>;
type Interp = SMatrix<f64, NQ, NE>;
/// An element matrix.
pub(crate) type ElementMatrix = SMatrix<f64, NE, NE>;

/// State indices.
pub(crate) const U: usize = 0;
pub(crate) const V: usize = 1;
pub(crate) const W: usize = 2;
pub(crate) const TH: usize = 3;
pub(crate) const DV: usize = 4;
pub(crate) const DW: usize = 5;
const DU: usize = 6;
const DTH: usize = 7;
const D2V: usize = 8;
const D2W: usize = 9;

/// Four-point Gauss–Legendre rule on [0, 1]: exact for polynomials of degree 7, which covers
/// every product in a uniform or linearly tapered element.
const GAUSS: [(f64, f64); 4] = [
    (0.069_431_844_202_973_71, 0.173_927_422_568_726_93),
    (0.330_009_478_207_571_87, 0.326_072_577_431_273_07),
    (0.669_990_521_792_428_1, 0.326_072_577_431_273_07),
    (0.930_568_155_797_026_3, 0.173_927_422_568_726_93),
];

/// The three element matrices: elastic stiffness, mass, and the stiffness per unit Omega²
/// (centrifugal stiffening, spin softening, propeller moment).
pub(crate) struct ElementMatrices {
    pub elastic: ElementMatrix,
    pub mass: ElementMatrix,
    pub spin: ElementMatrix,
}

/// Element matrices for the element from `ra` to `rb` (radii, m): the sections, the fluid's
/// added mass, and the point bodies whose centre lies in `[ra, rb)` (in `[ra, rb]` when `last`).
/// The quadrature is split at every point body inside the element, where the tension jumps.
pub(crate) fn element_matrices(span: &Span, ra: f64, rb: f64, last: bool) -> ElementMatrices {
    let h = rb - ra;
    let mut out = ElementMatrices {
        elastic: ElementMatrix::zeros(),
        mass: ElementMatrix::zeros(),
        spin: ElementMatrix::zeros(),
    };
    let inside = |r: f64| r >= ra && (r < rb || (last && r <= rb));
    let mut cuts = vec![0.0];
    cuts.extend(span.bodies().iter().filter(|b| b.r > ra && b.r < rb).map(|b| (b.r - ra) / h));
    cuts.push(1.0);
    cuts.sort_by(f64::total_cmp);
    for w in cuts.windows(2) {
        let (x0, x1) = (w[0], w[1]);
        for (g, weight) in GAUSS {
            let xi = x0 + g * (x1 - x0);
            let r = ra + xi * h;
            let s = span.at(r);
            let n_hat = span.tension_per_omega2(r);
            let phi = interpolation(xi, h);
            let wt = weight * h * (x1 - x0);
            let (de, mut dm, ds) = densities(&s, n_hat);
            if let Some((added, centre)) = span.added_mass_at(r) {
                dm += super::attached::added_mass_density(added, centre, &s);
            }
            out.elastic += phi.transpose() * de * phi * wt;
            out.mass += phi.transpose() * dm * phi * wt;
            out.spin += phi.transpose() * ds * phi * wt;
        }
    }
    for body in span.bodies().iter().filter(|b| inside(b.r)) {
        let xi = (body.r - ra) / h;
        let phi = interpolation(xi, h);
        let (dm, ds) = super::attached::point_body_densities(body, &span.at(body.r));
        out.mass += phi.transpose() * dm * phi;
        out.spin += phi.transpose() * ds * phi;
    }
    out
}

/// The interpolation `q = Phi d` at `xi` in [0, 1] on an element of length `h`.
fn interpolation(xi: f64, h: f64) -> Interp {
    let mut p = Interp::zeros();
    let x2 = xi * xi;
    let x3 = x2 * xi;
    // Hermite cubics and their x-derivatives.
    let hv =
        [1.0 - 3.0 * x2 + 2.0 * x3, h * (xi - 2.0 * x2 + x3), 3.0 * x2 - 2.0 * x3, h * (x3 - x2)];
    let hd = [
        (6.0 * x2 - 6.0 * xi) / h,
        1.0 - 4.0 * xi + 3.0 * x2,
        (6.0 * xi - 6.0 * x2) / h,
        3.0 * x2 - 2.0 * xi,
    ];
    let hdd = [
        (12.0 * xi - 6.0) / (h * h),
        (6.0 * xi - 4.0) / h,
        (6.0 - 12.0 * xi) / (h * h),
        (6.0 * xi - 2.0) / h,
    ];
    // Quadratic Lagrange (nodes a, mid, b) and derivatives.
    let lv = [1.0 - 3.0 * xi + 2.0 * x2, 4.0 * xi - 4.0 * x2, 2.0 * x2 - xi];
    let ld = [(4.0 * xi - 3.0) / h, (4.0 - 8.0 * xi) / h, (4.0 * xi - 1.0) / h];
    // Columns: v -> (1, 4, 9, 12), w -> (2, 5, 10, 13), u -> (0, 6, 8), theta -> (3, 7, 11).
    for (k, &c) in [1, 4, 9, 12].iter().enumerate() {
        p[(V, c)] = hv[k];
        p[(DV, c)] = hd[k];
        p[(D2V, c)] = hdd[k];
    }
    for (k, &c) in [2, 5, 10, 13].iter().enumerate() {
        p[(W, c)] = hv[k];
        p[(DW, c)] = hd[k];
        p[(D2W, c)] = hdd[k];
    }
    for (k, &c) in [0, 6, 8].iter().enumerate() {
        p[(U, c)] = lv[k];
        p[(DU, c)] = ld[k];
    }
    for (k, &c) in [3, 7, 11].iter().enumerate() {
        p[(TH, c)] = lv[k];
        p[(DTH, c)] = ld[k];
    }
    p
}

/// Energy densities at a section: elastic, kinetic (mass) and the Omega² stiffness.
///
/// Rotor frame `(x, y, z)`: a point `(eta, zeta)` of the section (rotor frame, from the shear
/// centre) moves by `U = u - eta v' - zeta w'`, `V = v - zeta theta`, `W = w + eta theta`. The
/// chord frame is the rotor frame turned about `x` by `phi`: `eta = y cos phi - z sin phi`,
/// `zeta = y sin phi + z cos phi`.
pub(crate) fn densities(section: &SpanSection, n_hat: f64) -> (Dens, Dens, Dens) {
    let s = &section.about_shear_centre();
    let (sn, cs) = s.phi.sin_cos();
    // Elastic: strains e = (u', theta', kappa_f, kappa_e) from the rotor-frame curvatures.
    let mut E = SMatrix::<f64, 4, NQ>::zeros();
    E[(0, DU)] = 1.0;
    E[(1, DTH)] = 1.0;
    E[(2, D2V)] = sn;
    E[(2, D2W)] = -cs;
    E[(3, D2V)] = -cs;
    E[(3, D2W)] = -sn;
    let De = E.transpose() * s.stiffness * E;

    // Mass: first and second moments about the pitch axis, rotor frame.
    let m = s.mass;
    let [ym, zm] = s.mass_centre;
    let (s_eta, s_zeta) = (m * (ym * cs - zm * sn), m * (ym * sn + zm * cs));
    let [jyy, jzz, jyz] = s.second_moments;
    let j_ee = cs * cs * jyy - 2.0 * cs * sn * jyz + sn * sn * jzz;
    let j_zz = sn * sn * jyy + 2.0 * cs * sn * jyz + cs * cs * jzz;
    let j_ez = cs * sn * (jyy - jzz) + (cs * cs - sn * sn) * jyz;
    let mut Dm = Dens::zeros();
    let set = |d: &mut Dens, i: usize, j: usize, v: f64| {
        d[(i, j)] += v;
        if i != j {
            d[(j, i)] += v;
        }
    };
    set(&mut Dm, U, U, m);
    set(&mut Dm, U, DV, -s_eta);
    set(&mut Dm, U, DW, -s_zeta);
    set(&mut Dm, DV, DV, j_ee);
    set(&mut Dm, DV, DW, j_ez);
    set(&mut Dm, DW, DW, j_zz);
    set(&mut Dm, V, V, m);
    set(&mut Dm, V, TH, -s_zeta);
    set(&mut Dm, W, W, m);
    set(&mut Dm, W, TH, s_eta);
    set(&mut Dm, TH, TH, j_ee + j_zz);

    // Omega² stiffness.
    let mut Ds = Dens::zeros();
    // Centrifugal tension N = Omega² n_hat acting at the elastic centre with uniform strain:
    // ½ ∫ sigma (V'² + W'²) dA = ½ N [v'² + w'² + 2 theta' (eta_c w' - zeta_c v') + k² theta'²].
    let k = &s.stiffness;
    let (yc, zc) = (k[(0, 3)] / k[(0, 0)], k[(0, 2)] / k[(0, 0)]);
    let (eta_c, zeta_c) = (yc * cs - zc * sn, yc * sn + zc * cs);
    let k2 = (k[(2, 2)] + k[(3, 3)]) / k[(0, 0)];
    set(&mut Ds, DV, DV, n_hat);
    set(&mut Ds, DW, DW, n_hat);
    set(&mut Ds, DTH, DW, n_hat * eta_c);
    set(&mut Ds, DTH, DV, -n_hat * zeta_c);
    set(&mut Ds, DTH, DTH, n_hat * k2);
    // Spin softening: -½ ∫ rho (U² + V²) dA (motion in the plane of rotation and radial).
    set(&mut Ds, U, U, -m);
    set(&mut Ds, U, DV, s_eta);
    set(&mut Ds, U, DW, s_zeta);
    set(&mut Ds, DV, DV, -j_ee);
    set(&mut Ds, DV, DW, -j_ez);
    set(&mut Ds, DW, DW, -j_zz);
    set(&mut Ds, V, V, -m);
    set(&mut Ds, V, TH, s_zeta);
    set(&mut Ds, TH, TH, -j_zz);
    // Second-order rotation of the section in the centrifugal field (rotation vector
    // (theta, -w', v')): -Omega² ∫ rho (r X2 + eta Y2) dA, with
    // X2 = ½ theta (zeta v' - eta w'), Y2 = -½ (zeta v' w' + eta theta² + eta v'²).
    // With the spin-softening theta² term this is the propeller moment Omega² (J_ee - J_zz).
    set(&mut Ds, TH, TH, j_ee);
    set(&mut Ds, DV, DV, j_ee);
    set(&mut Ds, DV, DW, 0.5 * j_ez);
    set(&mut Ds, TH, DV, -0.5 * s.r * s_zeta);
    set(&mut Ds, TH, DW, 0.5 * s.r * s_eta);
    // The in-plane centrifugal force at a point is Omega² times its distance from the rotor's
    // radial line through the pitch axis, `eta_s + eta`: the part `eta_s` of the shear centre's
    // own offset, on the same second-order displacement Y2.
    let [eta_s, _] = section.shear_centre_rotor();
    set(&mut Ds, TH, TH, eta_s * s_eta);
    set(&mut Ds, DV, DV, eta_s * s_eta);
    set(&mut Ds, DV, DW, 0.5 * eta_s * s_zeta);
    (De, Dm, Ds)
}

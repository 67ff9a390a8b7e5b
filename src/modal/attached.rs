//! What the blade carries besides its own sections: point masses (rigid bodies with offsets and
//! rotary inertia) and the fluid that moves with a submerged blade (added mass and added inertia).
//!
//! # Point masses
//!
//! A point mass at radius `r` is a rigid body fixed to the section there: its centre lies at
//! `d = (0, eta, zeta)` from the pitch axis (rotor frame, from the chord-frame offsets turned by
//! the local chord angle) and it has its own moments of inertia about axes parallel to the chord
//! frame. A point `d` of the body moves by `t + psi × d`, with `t = (u, v, w)` and the rotation
//! vector `psi = (theta, -w', v')` of the section. With the body's first moment `s = m d` and its
//! second moments about the axis point `P = ∫ρ d dᵀ` (the centre's `m d dᵀ` plus its own, from
//! the moments of inertia), the energies are integrated over the body exactly:
//!
//! - kinetic: `½ ∫ρ |t + psi × d|²`, giving `m`, the offset coupling `−[s]×` and the inertia
//!   tensor `tr(P) 1 − P` on `psi`;
//! - centrifugal (per unit `Omega²`): `−½ ∫ρ (U² + V²)` of the first-order motion, and
//!   `−∫ρ (X₀ X₂ + Y₀ Y₂)`, the work of the steady centrifugal force on the second-order
//!   displacement of the rotation `½ psi × (psi × d)`, which gives the propeller moment of the
//!   body and its twist–slope coupling; with the body shrunk to a thin lamina these are exactly
//!   the section densities of `element.rs` (checked in the tests below);
//! - its centrifugal force `Omega² m r` adds to the tension of the beam inboard of it (in
//!   `span.rs`).
//!
//! # Added mass of the fluid
//!
//! Strip theory with the two-dimensional potential-flow added mass of an ellipse of semi-axes
//! `a` (half the chord) and `b` (half the thickness) in a fluid of density `rho`, about its centre
//! (Newman, *Marine Hydrodynamics*, MIT Press 1977, §4.13, table of added-mass coefficients:
//! `m₁₁ = rho π b²` along the major axis, `m₂₂ = rho π a²` normal to it,
//! `m₆₆ = rho π (a² − b²)² / 8` in rotation; from memory): flapwise (normal to the chord)
//! `rho π (c/2)²`, edgewise `rho π (t/2)²`, in torsion `rho π (a² − b²)² / 8`. Each section's
//! ellipse is the box of its outer mould line (chord extent and greatest thickness normal to the
//! chord), centred in that box; the added mass acts at the ellipse's centre, so it couples
//! twist with flap through the distance from the pitch axis to mid-chord. The fluid adds kinetic
//! energy only: it has no centrifugal load of its own. Three-dimensional flow round the tip
//! and free-surface effects are neglected (strip theory overestimates the added mass of a short
//! blade).

#![allow(non_snake_case)]

use nalgebra::{Matrix3, SMatrix, Vector3};

use super::element::{DV, DW, Dens, NQ, TH, U, V, W};
use super::span::SpanSection;

/// What the blade carries besides its sections, for [`crate::modal::BeamModel::with_attachments`].
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Attachments {
    /// Point bodies (balance weights, fittings), anywhere on the span.
    pub bodies: Vec<PointBody>,
    /// The fluid round the blade: its density (kg/m³) and the ellipse of each section, root to
    /// tip; `None` in air (its added mass is neglected).
    pub fluid: Option<(f64, Vec<FluidSection>)>,
}

impl Attachments {
    /// The point masses of a project, without a fluid.
    pub fn of_point_masses(masses: &[crate::project::PointMass]) -> Self {
        Attachments { bodies: masses.iter().map(PointBody::from_point_mass).collect(), fluid: None }
    }

    /// The same without the fluid (the dry blade).
    pub fn dry(&self) -> Self {
        Attachments { bodies: self.bodies.clone(), fluid: None }
    }
}

/// A rigid body fixed to the blade, as the modal model takes it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PointBody {
    /// Radius of its centre from the rotor axis, m.
    pub r: f64,
    /// Mass, kg.
    pub mass: f64,
    /// Offset of its centre from the pitch axis, chord frame `(y, z)`, m.
    pub offset: [f64; 2],
    /// Moments of inertia about its centre, axes parallel to the chord frame `(x, y, z)`, kg·m².
    pub inertia: [f64; 3],
}

impl PointBody {
    /// The body of a project's point mass.
    pub fn from_point_mass(p: &crate::project::PointMass) -> Self {
        PointBody { r: p.r, mass: p.mass, offset: [p.y, p.z], inertia: p.inertia }
    }
}

/// The fluid section at one radius: the ellipse that stands for the outer mould line.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FluidSection {
    /// Radius, m.
    pub r: f64,
    /// Extent along the chord (the ellipse's major axis 2a), m.
    pub chord: f64,
    /// Greatest thickness normal to the chord (the minor axis 2b), m.
    pub thickness: f64,
    /// Centre of the ellipse from the pitch axis, chord frame `(y, z)`, m.
    pub centre: [f64; 2],
}

impl FluidSection {
    /// The ellipse of a closed outline (chord frame points, m) at radius `r`: its box along the
    /// chord and normal to it (the greatest distance between the upper and lower surface, found
    /// on 200 chordwise cuts).
    pub fn of_outline(r: f64, outline: &[[f64; 2]]) -> Option<FluidSection> {
        if outline.len() < 3 || outline.iter().any(|p| !(p[0].is_finite() && p[1].is_finite())) {
            return None;
        }
        let (y0, y1) =
            outline.iter().fold((f64::MAX, f64::MIN), |a, p| (a.0.min(p[0]), a.1.max(p[0])));
        let (z0, z1) =
            outline.iter().fold((f64::MAX, f64::MIN), |a, p| (a.0.min(p[1]), a.1.max(p[1])));
        if y1 <= y0 {
            return None;
        }
        let mut thickness: f64 = 0.0;
        let cuts = 200;
        for k in 1..cuts {
            let y = y0 + (y1 - y0) * k as f64 / cuts as f64;
            let (mut lo, mut hi) = (f64::MAX, f64::MIN);
            for i in 0..outline.len() {
                let (a, b) = (outline[i], outline[(i + 1) % outline.len()]);
                if (a[0] - y) * (b[0] - y) <= 0.0 && a[0] != b[0] {
                    let z = a[1] + (b[1] - a[1]) * (y - a[0]) / (b[0] - a[0]);
                    lo = lo.min(z);
                    hi = hi.max(z);
                }
            }
            if hi > lo {
                thickness = thickness.max(hi - lo);
            }
        }
        Some(FluidSection {
            r,
            chord: y1 - y0,
            thickness,
            centre: [0.5 * (y0 + y1), 0.5 * (z0 + z1)],
        })
    }
}

/// Potential-flow added mass per unit length of an ellipse of semi-axes `a` (along the chord)
/// and `b` (normal to it) in a fluid of density `rho` (Newman 1977, §4.13; see the module
/// docs): `[normal to the chord (flap), along the chord (edge), rotation (torsion)]` in kg/m,
/// kg/m and kg·m²/m.
pub fn ellipse_added_mass(rho: f64, a: f64, b: f64) -> [f64; 3] {
    let pi = std::f64::consts::PI;
    [rho * pi * a * a, rho * pi * b * b, rho * pi * (a * a - b * b).powi(2) / 8.0]
}

/// The skew matrix `[a]×` with `[a]× x = a × x`.
fn skew(a: Vector3<f64>) -> Matrix3<f64> {
    Matrix3::new(0.0, -a.z, a.y, a.z, 0.0, -a.x, -a.y, a.x, 0.0)
}

/// Translation `(u, v, w)` and rotation `(theta, -w', v')` from the point state.
fn maps() -> (SMatrix<f64, 3, NQ>, SMatrix<f64, 3, NQ>) {
    let mut t = SMatrix::<f64, 3, NQ>::zeros();
    t[(0, U)] = 1.0;
    t[(1, V)] = 1.0;
    t[(2, W)] = 1.0;
    let mut psi = SMatrix::<f64, 3, NQ>::zeros();
    psi[(0, TH)] = 1.0;
    psi[(1, DW)] = -1.0;
    psi[(2, DV)] = 1.0;
    (t, psi)
}

/// Kinetic and centrifugal (per unit Omega²) densities of a rigid body with mass `m`, first
/// moment `s` and second moments `p` about the reference point of the section (the shear
/// centre, see `element.rs`; rotor frame), as matrices on the point state. The reference point
/// lies at radius `r` and `eta_s` from the rotor's radial line through the pitch axis, in the
/// plane of rotation (the centrifugal field sees the body where it is).
pub(crate) fn rigid_body_densities(
    m: f64,
    s: Vector3<f64>,
    p: Matrix3<f64>,
    [r, eta_s]: [f64; 2],
) -> (Dens, Dens) {
    let (T, Psi) = maps();
    let S = skew(s);
    let J = Matrix3::identity() * p.trace() - p;
    let cross = T.transpose() * S * Psi;
    let dm = T.transpose() * T * m - cross - cross.transpose() + Psi.transpose() * J * Psi;
    // ∫ρ [d]×ᵀ Q [d]× with Q = diag(1, 1, 0): the first two rows of [d]×.
    let jq = Matrix3::new(
        p[(2, 2)],
        0.0,
        -p[(0, 2)],
        0.0,
        p[(2, 2)],
        -p[(1, 2)],
        -p[(0, 2)],
        -p[(1, 2)],
        p[(0, 0)] + p[(1, 1)],
    );
    let q = Matrix3::from_diagonal(&Vector3::new(1.0, 1.0, 0.0));
    let qcross = T.transpose() * q * S * Psi;
    let aqa = T.transpose() * q * T * m - qcross - qcross.transpose() + Psi.transpose() * jq * Psi;
    let at = Vector3::new(r, eta_s, 0.0);
    let b = s * at.transpose() + p * q;
    let second = (b + b.transpose()) * 0.5
        - Matrix3::identity() * (r * s.x + eta_s * s.y + p[(0, 0)] + p[(1, 1)]);
    let ds = -aqa - Psi.transpose() * second * Psi;
    (dm, ds)
}

/// The densities of a point body on `section` (its chord angle and shear centre, the point the
/// body's offset is measured from in the element; see `element.rs`).
pub(crate) fn point_body_densities(body: &PointBody, section: &SpanSection) -> (Dens, Dens) {
    let (sn, cs) = section.phi.sin_cos();
    let [y, z] = section.offset_from_shear_centre(body.offset);
    let d = Vector3::new(0.0, y * cs - z * sn, y * sn + z * cs);
    let [ix, iy, iz] = body.inertia;
    // Own second moments from the moments of inertia, chord frame, then turned about x.
    let own = Matrix3::from_diagonal(&Vector3::new(
        0.5 * (iy + iz - ix),
        0.5 * (ix + iz - iy),
        0.5 * (ix + iy - iz),
    ));
    let rot = Matrix3::new(1.0, 0.0, 0.0, 0.0, cs, -sn, 0.0, sn, cs);
    let p = d * d.transpose() * body.mass + rot * own * rot.transpose();
    rigid_body_densities(body.mass, d * body.mass, p, [body.r, section.shear_centre_rotor()[0]])
}

/// The added-mass density of the fluid at `section` (its chord angle and shear centre): added
/// masses `[flap, edge, torsion]` (per length) acting at `centre` (chord frame from the pitch
/// axis, m).
pub(crate) fn added_mass_density(added: [f64; 3], centre: [f64; 2], section: &SpanSection) -> Dens {
    let (sn, cs) = section.phi.sin_cos();
    let [yc, zc] = section.offset_from_shear_centre(centre);
    let (eta, zeta) = (yc * cs - zc * sn, yc * sn + zc * cs);
    // Velocities of the centre along the chord and normal to it, and the twist rate.
    let mut a = SMatrix::<f64, 3, NQ>::zeros();
    // Rotor frame: V_c = v - zeta theta, W_c = w + eta theta.
    let vc = [(V, 1.0), (TH, -zeta)];
    let wc = [(W, 1.0), (TH, eta)];
    for (i, c) in vc {
        a[(0, i)] += cs * c;
        a[(1, i)] += -sn * c;
    }
    for (i, c) in wc {
        a[(0, i)] += sn * c;
        a[(1, i)] += cs * c;
    }
    a[(2, TH)] = 1.0;
    let [flap, edge, torsion] = added;
    let m = Matrix3::from_diagonal(&Vector3::new(edge, flap, torsion));
    a.transpose() * m * a
}

#[cfg(test)]
mod tests {
    use super::*;
    use nalgebra::Matrix4;

    /// A thin section given as a lamina of mass `m` with centre and second moments: the body
    /// formulas must give exactly the section densities of the element, with the shear centre
    /// on the pitch axis and off it (both refer the section to its shear centre, by different
    /// routes: the section shifts its moments and adds the in-plane centrifugal term of the
    /// offset; the body takes its offset from the shear centre and its place in the field).
    #[test]
    fn a_thin_lamina_gives_the_section_densities() {
        let (m, ym, zm) = (1.3, 0.02, -0.004);
        let second = [0.004, 0.0007, 0.0003];
        let phi: f64 = 0.4;
        let r = 0.7;
        for shear_centre in [[0.0, 0.0], [0.031, -0.006]] {
            let section = SpanSection {
                r,
                chord: 0.1,
                phi,
                stiffness: Matrix4::identity(),
                mass: m,
                mass_centre: [ym, zm],
                second_moments: second,
                shear_centre,
            };
            let (_, dm_s, ds_s) = crate::modal::element::densities(&section, 0.0);
            let (sn, cs) = phi.sin_cos();
            let turn = |y: f64, z: f64| Vector3::new(0.0, y * cs - z * sn, y * sn + z * cs);
            let [ys, zs] = shear_centre;
            let d = turn(ym - ys, zm - zs);
            // Chord-frame second moments about the shear centre turned into the rotor frame.
            let pc = Matrix3::new(
                0.0,
                0.0,
                0.0,
                0.0,
                second[0] - 2.0 * ys * m * ym + m * ys * ys,
                second[2] - ys * m * zm - zs * m * ym + m * ys * zs,
                0.0,
                second[2] - ys * m * zm - zs * m * ym + m * ys * zs,
                second[1] - 2.0 * zs * m * zm + m * zs * zs,
            );
            let rot = Matrix3::new(1.0, 0.0, 0.0, 0.0, cs, -sn, 0.0, sn, cs);
            let p = rot * pc * rot.transpose();
            let eta_s = turn(ys, zs).y;
            let (dm_b, ds_b) = rigid_body_densities(m, d * m, p, [r, eta_s]);
            assert!((dm_b - dm_s).abs().max() < 1e-14, "{dm_b} {dm_s}");
            assert!((ds_b - ds_s).abs().max() < 1e-14, "{ds_b} {ds_s}");
        }
    }
}

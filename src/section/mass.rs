//! Mass per length, mass centre and mass moments of inertia of the section walls.
//!
//! Each straight wall element of length `L` is a strip of laminate: its mass is the areal mass
//! times `L`; through the thickness the first and second moments of density (`∫ rho ζ dζ`,
//! `∫ rho ζ² dζ`, ζ along the outward normal) place plies of different density exactly; along the
//! element the strip's own `L²/12` term is kept. At a corner of the closed wall a ply at height ζ
//! above the midline is longer by `2 ζ tan(θ/2)` (θ the turn of the wall), which adds
//! `2 tan(θ/2) ∫ rho ζ dζ` there; with it a rectangular or polygonal tube of any ply stack has the
//! mass of its ply areas exactly.

use nalgebra::Matrix2;

use super::contour::Contour;
use super::outline::sub;
use super::properties::MassInertia;
use super::wall::WallStiffness;

/// Mass per length (kg/m), mass centre (m) and inertia about it (kg·m).
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct MassProperties {
    pub mass: f64,
    pub centre: [f64; 2],
    pub inertia: MassInertia,
}

pub(crate) fn mass_properties(contour: &Contour, walls: &[WallStiffness]) -> MassProperties {
    let mut mass = 0.0;
    let mut first = [0.0; 2];
    // Second moments about the origin: [∫y², ∫yz; ∫yz, ∫z²].
    let mut second = Matrix2::zeros();
    let outer =
        |a: [f64; 2], b: [f64; 2]| Matrix2::new(a[0] * b[0], a[0] * b[1], a[1] * b[0], a[1] * b[1]);
    for e in &contour.elements {
        let w = &walls[e.laminate];
        let l = e.length();
        let (p, n) = (e.midpoint(), e.normal());
        let d = sub(e.end, e.start);
        mass += w.areal_mass * l;
        for k in 0..2 {
            first[k] += (w.areal_mass * p[k] + w.mass_moment1 * n[k]) * l;
        }
        second += (outer(p, p) + outer(d, d) / 12.0) * (w.areal_mass * l)
            + (outer(p, n) + outer(n, p)) * (w.mass_moment1 * l)
            + outer(n, n) * (w.mass_moment2 * l);
    }
    for &(p, factor, a, b) in &contour.corners {
        let m = factor * 0.5 * (walls[a].mass_moment1 + walls[b].mass_moment1);
        mass += m;
        first[0] += m * p[0];
        first[1] += m * p[1];
        second += outer(p, p) * m;
    }
    if mass.is_nan() || mass <= 0.0 {
        return MassProperties {
            mass: mass.max(0.0),
            centre: [0.0; 2],
            inertia: MassInertia::default(),
        };
    }
    let c = [first[0] / mass, first[1] / mass];
    let about = second - outer(c, c) * mass;
    let (edge, flap, product) = (about[(0, 0)], about[(1, 1)], about[(0, 1)]);
    MassProperties {
        mass,
        centre: c,
        inertia: MassInertia { flap, edge, polar: flap + edge, product },
    }
}

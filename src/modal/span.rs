//! Section properties along the span: checked once, interpolated linearly in radius between
//! stations, and the centrifugal tension integral.
//!
//! Everything here is in the chord frame of each station and referred to the pitch axis (the
//! origin of the chord frame); the element turns it into the rotor frame with the local chord
//! angle. Linear interpolation of the 4x4 stiffness keeps it positive definite between stations
//! (a convex combination of positive definite matrices).

use nalgebra::Matrix4;

use super::ModalError;
use super::attached::{FluidSection, PointBody, ellipse_added_mass};
use crate::section::SectionProperties;

/// Section properties at one radius, chord frame, about the pitch axis.
#[derive(Debug, Clone, Copy)]
pub(crate) struct SpanSection {
    /// Radius, m.
    pub r: f64,
    /// Chord, m.
    pub chord: f64,
    /// Chord angle from the plane of rotation (twist + pitch), rad.
    pub phi: f64,
    /// Stiffness about the pitch axis, `(eps, kappa_t, kappa_f, kappa_e)` order.
    pub stiffness: Matrix4<f64>,
    /// Mass per length, kg/m.
    pub mass: f64,
    /// Mass centre (y, z) from the pitch axis, m.
    pub mass_centre: [f64; 2],
    /// Second moments of mass per length about the pitch axis, kg·m: `∫ρ y²`, `∫ρ z²`, `∫ρ yz`.
    pub second_moments: [f64; 3],
    /// Shear centre (y, z) from the pitch axis, m: the line whose bending the beam's curvatures
    /// are (see `element.rs`).
    pub shear_centre: [f64; 2],
}

impl SpanSection {
    fn lerp(a: &SpanSection, b: &SpanSection, t: f64, r: f64) -> SpanSection {
        let mix = |x: f64, y: f64| x + t * (y - x);
        SpanSection {
            r,
            chord: mix(a.chord, b.chord),
            phi: mix(a.phi, b.phi),
            stiffness: a.stiffness + (b.stiffness - a.stiffness) * t,
            mass: mix(a.mass, b.mass),
            mass_centre: [
                mix(a.mass_centre[0], b.mass_centre[0]),
                mix(a.mass_centre[1], b.mass_centre[1]),
            ],
            second_moments: [
                mix(a.second_moments[0], b.second_moments[0]),
                mix(a.second_moments[1], b.second_moments[1]),
                mix(a.second_moments[2], b.second_moments[2]),
            ],
            shear_centre: [
                mix(a.shear_centre[0], b.shear_centre[0]),
                mix(a.shear_centre[1], b.shear_centre[1]),
            ],
        }
    }

    /// The section referred to its shear centre instead of the pitch axis: stiffness for the
    /// axial strain at the shear centre (`eps_p = eps_s - z_s kappa_f - y_s kappa_e`, so
    /// `K_s = Aᵀ K_p A`), mass centre and second moments of mass from the shear centre. The
    /// chord angle, mass and radius are the section's own; `shear_centre` becomes `[0, 0]`.
    pub(crate) fn about_shear_centre(&self) -> SpanSection {
        let [ys, zs] = self.shear_centre;
        let mut a = Matrix4::identity();
        a[(0, 2)] = -zs;
        a[(0, 3)] = -ys;
        let m = self.mass;
        let [ym, zm] = self.mass_centre;
        let [jyy, jzz, jyz] = self.second_moments;
        SpanSection {
            stiffness: a.transpose() * self.stiffness * a,
            mass_centre: self.offset_from_shear_centre([ym, zm]),
            second_moments: [
                jyy - 2.0 * ys * m * ym + m * ys * ys,
                jzz - 2.0 * zs * m * zm + m * zs * zs,
                jyz - ys * m * zm - zs * m * ym + m * ys * zs,
            ],
            shear_centre: [0.0, 0.0],
            ..*self
        }
    }

    /// A point given in the chord frame from the pitch axis, taken from the shear centre
    /// instead (chord frame, m): how the element places masses and the water (see
    /// `element.rs`).
    pub(crate) fn offset_from_shear_centre(&self, [y, z]: [f64; 2]) -> [f64; 2] {
        [y - self.shear_centre[0], z - self.shear_centre[1]]
    }

    /// The shear centre in the rotor frame `(eta, zeta)` from the pitch axis, m.
    pub(crate) fn shear_centre_rotor(&self) -> [f64; 2] {
        let (sn, cs) = self.phi.sin_cos();
        let [ys, zs] = self.shear_centre;
        [ys * cs - zs * sn, ys * sn + zs * cs]
    }
}

/// The checked stations and the tension integral at each.
#[derive(Debug, Clone)]
pub(crate) struct Span {
    stations: Vec<SpanSection>,
    /// `∫_{r_i}^{tip} m rho drho` at each station, kg·m (times Omega² gives the tension, N).
    tension: Vec<f64>,
    /// Point bodies, root to tip.
    bodies: Vec<PointBody>,
    /// Added mass of the fluid at radii, root to tip: `(r, [flap, edge, torsion], centre)`.
    added: Vec<(f64, [f64; 3], [f64; 2])>,
}

impl Span {
    /// Checks and converts the sections; `pitch` (rad) is added to every station twist.
    pub fn new(sections: &[SectionProperties], pitch: f64) -> Result<Span, ModalError> {
        if sections.len() < 2 {
            return Err(ModalError::TooFewSections { found: sections.len() });
        }
        if !pitch.is_finite() {
            return Err(ModalError::NotFinite { r: sections[0].r, field: "pitch" });
        }
        let mut stations = Vec::with_capacity(sections.len());
        for (i, s) in sections.iter().enumerate() {
            let station = check_section(s, pitch)?;
            if i == 0 && s.r < 0.0 {
                return Err(ModalError::NegativeRadius { r: s.r });
            }
            if let Some(prev) = stations.last().map(|p: &SpanSection| p.r)
                && s.r <= prev
            {
                return Err(ModalError::RadiusOrder { index: i, r: s.r, previous: prev });
            }
            stations.push(station);
        }
        let mut tension = vec![0.0; stations.len()];
        for i in (0..stations.len() - 1).rev() {
            let (a, b) = (&stations[i], &stations[i + 1]);
            tension[i] = tension[i + 1] + moment_of_mass(a, b, a.r);
        }
        Ok(Span { stations, tension, bodies: Vec::new(), added: Vec::new() })
    }

    /// Adds point bodies (checked: on the span, finite, positive mass, possible inertia).
    pub fn with_bodies(mut self, bodies: &[PointBody]) -> Result<Span, ModalError> {
        let (root, tip) = (self.root(), self.tip());
        for b in bodies {
            let values =
                [b.r, b.mass, b.offset[0], b.offset[1], b.inertia[0], b.inertia[1], b.inertia[2]];
            if values.iter().any(|v| !v.is_finite()) {
                return Err(ModalError::PointBody {
                    r: b.r,
                    reason: "a value is not a finite number",
                });
            }
            if b.r < root - 1e-9 * tip.abs().max(1.0) || b.r > tip + 1e-9 * tip.abs().max(1.0) {
                return Err(ModalError::PointBody {
                    r: b.r,
                    reason: "it lies off the blade's span",
                });
            }
            if b.mass <= 0.0 {
                return Err(ModalError::PointBody { r: b.r, reason: "its mass must be positive" });
            }
            let [x, y, z] = b.inertia;
            let tol = 1e-9 * (x + y + z);
            if x < 0.0
                || y < 0.0
                || z < 0.0
                || x > y + z + tol
                || y > x + z + tol
                || z > x + y + tol
            {
                return Err(ModalError::PointBody {
                    r: b.r,
                    reason: "its moments of inertia are not those of a body (each must be at least 0 and at most the sum of the other two)",
                });
            }
            self.bodies.push(PointBody { r: b.r.clamp(root, tip), ..*b });
        }
        self.bodies.sort_by(|a, b| a.r.total_cmp(&b.r));
        Ok(self)
    }

    /// Adds the fluid's added mass from the ellipse of each fluid section (`density` in kg/m³).
    pub fn with_fluid(
        mut self,
        density: f64,
        sections: &[FluidSection],
    ) -> Result<Span, ModalError> {
        if !(density.is_finite() && density > 0.0) {
            return Err(ModalError::FluidDensity { value: density });
        }
        let mut added = Vec::with_capacity(sections.len());
        for f in sections {
            let values = [f.r, f.chord, f.thickness, f.centre[0], f.centre[1]];
            if values.iter().any(|v| !v.is_finite()) || f.chord <= 0.0 || f.thickness < 0.0 {
                return Err(ModalError::NotFinite {
                    r: f.r,
                    field: "fluid section (chord, thickness, centre)",
                });
            }
            let a = 0.5 * f.chord;
            let b = (0.5 * f.thickness).min(a);
            added.push((f.r, ellipse_added_mass(density, a, b), f.centre));
        }
        added.sort_by(|x, y| x.0.total_cmp(&y.0));
        self.added = added;
        Ok(self)
    }

    /// The point bodies, root to tip.
    pub fn bodies(&self) -> &[PointBody] {
        &self.bodies
    }

    /// Added masses `[flap, edge, torsion]` and their centre at `r`, interpolated linearly (held
    /// beyond the first and last fluid section); `None` without a fluid.
    pub fn added_mass_at(&self, r: f64) -> Option<([f64; 3], [f64; 2])> {
        let first = self.added.first()?;
        let last = self.added.last()?;
        if r <= first.0 || self.added.len() == 1 {
            return Some((first.1, first.2));
        }
        if r >= last.0 {
            return Some((last.1, last.2));
        }
        let i = self.added.partition_point(|a| a.0 <= r).clamp(1, self.added.len() - 1);
        let (a, b) = (&self.added[i - 1], &self.added[i]);
        let t = (r - a.0) / (b.0 - a.0);
        let mix = |x: f64, y: f64| x + t * (y - x);
        Some((
            [mix(a.1[0], b.1[0]), mix(a.1[1], b.1[1]), mix(a.1[2], b.1[2])],
            [mix(a.2[0], b.2[0]), mix(a.2[1], b.2[1])],
        ))
    }

    /// Radius of the root (first) station, m.
    pub fn root(&self) -> f64 {
        self.stations[0].r
    }

    /// Radius of the tip (last) station, m.
    pub fn tip(&self) -> f64 {
        self.stations[self.stations.len() - 1].r
    }

    /// Index `i` of the interval `[r_i, r_i+1]` holding `r` (clamped to the span).
    fn interval(&self, r: f64) -> usize {
        let last = self.stations.len() - 2;
        self.stations[1..=last].partition_point(|s| s.r <= r).min(last)
    }

    /// Properties at radius `r` by linear interpolation.
    pub fn at(&self, r: f64) -> SpanSection {
        let i = self.interval(r);
        let (a, b) = (&self.stations[i], &self.stations[i + 1]);
        let t = ((r - a.r) / (b.r - a.r)).clamp(0.0, 1.0);
        SpanSection::lerp(a, b, t, r)
    }

    /// `∫_r^{tip} m rho drho`, kg·m: the centrifugal tension at `r` per unit Omega².
    pub fn tension_per_omega2(&self, r: f64) -> f64 {
        let i = self.interval(r);
        let (a, b) = (&self.stations[i], &self.stations[i + 1]);
        let bodies: f64 = self.bodies.iter().filter(|p| p.r > r).map(|p| p.mass * p.r).sum();
        self.tension[i + 1] + moment_of_mass(a, b, r.clamp(a.r, b.r)) + bodies
    }
}

/// `∫_x^{b.r} m(rho) rho drho` with `m` linear between `a` and `b`: Simpson's rule, exact for
/// the quadratic integrand.
fn moment_of_mass(a: &SpanSection, b: &SpanSection, x: f64) -> f64 {
    let m = |r: f64| a.mass + (b.mass - a.mass) * (r - a.r) / (b.r - a.r);
    let f = |r: f64| m(r) * r;
    let mid = 0.5 * (x + b.r);
    (b.r - x) / 6.0 * (f(x) + 4.0 * f(mid) + f(b.r))
}

/// Checks one section and converts it; errors name the station radius.
fn check_section(s: &SectionProperties, pitch: f64) -> Result<SpanSection, ModalError> {
    let r = s.r;
    let finite = |field: &'static str, v: f64| {
        if v.is_finite() { Ok(v) } else { Err(ModalError::NotFinite { r, field }) }
    };
    finite("r", r)?;
    finite("chord", s.chord)?;
    finite("twist", s.twist.rad())?;
    if s.stiffness_pitch_axis.iter().any(|v| !v.is_finite()) {
        return Err(ModalError::NotFinite { r, field: "stiffness_pitch_axis" });
    }
    let k = s.stiffness_pitch_axis;
    let names = ["EA", "GJ", "EI_flap", "EI_edge"];
    for (i, name) in names.iter().enumerate() {
        if k[(i, i)] <= 0.0 {
            return Err(ModalError::ZeroStiffness { r, term: name, value: k[(i, i)] });
        }
    }
    for i in 0..4 {
        for j in 0..i {
            let scale = 1e-9 * (k[(i, i)] * k[(j, j)]).sqrt();
            if (k[(i, j)] - k[(j, i)]).abs() > scale {
                return Err(ModalError::AsymmetricStiffness { r, row: i, col: j });
            }
        }
    }
    // Positive definite after scaling to a unit diagonal (units differ by entry).
    let d = k.diagonal().map(|v| 1.0 / v.sqrt());
    let scaled = Matrix4::from_fn(|i, j| k[(i, j)] * d[i] * d[j]);
    if scaled.cholesky().is_none() {
        return Err(ModalError::IndefiniteStiffness { r });
    }
    let m = finite("mass_per_length", s.mass_per_length)?;
    if m <= 0.0 {
        return Err(ModalError::ZeroMass { r, value: m });
    }
    let [ym, zm] = s.mass_centre;
    finite("mass_centre", ym)?;
    finite("mass_centre", zm)?;
    let [ys, zs] = s.shear_centre;
    finite("shear_centre", ys)?;
    finite("shear_centre", zs)?;
    let inertia = s.inertia;
    for (field, v) in [("inertia.flap", inertia.flap), ("inertia.edge", inertia.edge)] {
        if finite(field, v)? < 0.0 {
            return Err(ModalError::NegativeInertia { r, field, value: v });
        }
    }
    finite("inertia.product", inertia.product)?;
    if inertia.product * inertia.product > inertia.flap * inertia.edge * (1.0 + 1e-9) + 1e-300 {
        return Err(ModalError::NegativeInertia {
            r,
            field: "inertia.product",
            value: inertia.product,
        });
    }
    Ok(SpanSection {
        r,
        chord: s.chord,
        phi: s.twist.rad() + pitch,
        stiffness: (k + k.transpose()) * 0.5,
        mass: m,
        mass_centre: [ym, zm],
        second_moments: [
            inertia.edge + m * ym * ym,
            inertia.flap + m * zm * zm,
            inertia.product + m * ym * zm,
        ],
        shear_centre: [ys, zs],
    })
}

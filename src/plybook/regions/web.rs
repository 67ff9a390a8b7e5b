//! A web's ply plane: the web's mid-plane between the inner skins.

use super::super::drape::DrapeSurface;
use super::SkinLevel;
use crate::blade::{Blade, Surface};
use crate::interp::CubicSpline;

/// A web's mid-plane between the inner skins as a surface. Parameters `(r, η)`: radius (m) and
/// `η` from 0 at the lower inner skin to 1 at the upper; continued linearly beyond.
pub(crate) struct WebPlane<'a> {
    blade: &'a Blade,
    chord_frac: f64,
    lower: CubicSpline,
    upper: CubicSpline,
    span: [f64; 2],
}

impl<'a> WebPlane<'a> {
    pub(crate) fn new(blade: &'a Blade, web: usize) -> Self {
        let w = &blade.webs()[web];
        let s = blade.surfaces();
        let (a, b) = (w.r_start.max(blade.root_radius()), w.r_end.min(blade.tip_radius()));
        let n = 120;
        let radii: Vec<f64> = (0..=n).map(|i| a + (b - a) * i as f64 / n as f64).collect();
        let z_at = |side: Surface, r: f64| {
            let level = SkinLevel::outer_mould_line(blade, side, [a, b]);
            let u = level.sign() * level.b_at(r, w.chord_frac);
            s.inner(r, side, u)[1]
        };
        let lower: Vec<f64> = radii.iter().map(|&r| z_at(Surface::Lower, r)).collect();
        let upper: Vec<f64> = radii.iter().map(|&r| z_at(Surface::Upper, r)).collect();
        WebPlane {
            blade,
            chord_frac: w.chord_frac,
            lower: CubicSpline::natural(&radii, &lower),
            upper: CubicSpline::natural(&radii, &upper),
            span: [a, b],
        }
    }

    /// The web's span, m.
    pub(crate) fn span(&self) -> [f64; 2] {
        self.span
    }
}

impl DrapeSurface for WebPlane<'_> {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let r = p[0];
        let rc = r.clamp(self.span[0], self.span[1]);
        let (zl, zu) = (
            self.lower.eval(rc) + self.lower.derivative(rc) * (r - rc),
            self.upper.eval(rc) + self.upper.derivative(rc) * (r - rc),
        );
        let y = (self.chord_frac - self.blade.pitch_axis_frac(rc)) * self.blade.chord(rc);
        let z = zl + p[1] * (zu - zl);
        self.blade.to_rotor_frame(r, [y, z], self.blade.rotor().pitch)
    }
}

//! A web's ply plane: the web's mid-plane between the inner skins.

use super::super::drape::DrapeSurface;
use super::SkinLevel;
use crate::blade::{Blade, Surface};
use crate::interp::CubicSpline;
use std::cell::Cell;

/// A web's mid-plane between the inner skins as a surface. Parameters `(r, η)`: radius (m) and
/// `η` from 0 at the lower inner skin to 1 at the upper; continued linearly beyond.
pub(crate) struct WebPlane<'a> {
    blade: &'a Blade,
    chord_frac: f64,
    lower: CubicSpline,
    upper: CubicSpline,
    span: [f64; 2],
    /// The last radius asked for (the drape asks for several heights at one radius in a row).
    last: Cell<Option<AtRadius>>,
}

/// What the points of the plane at one radius share: the radius's bits, the heights of the
/// lower and upper inner skins, the chordwise place and the sine and cosine of the twist.
#[derive(Debug, Clone, Copy)]
struct AtRadius {
    r: u64,
    lower: f64,
    upper: f64,
    y: f64,
    sin_cos: (f64, f64),
}

impl<'a> WebPlane<'a> {
    pub(crate) fn new(blade: &'a Blade, web: usize) -> Self {
        let w = &blade.webs()[web];
        let s = blade.surfaces();
        let (a, b) = (w.r_start.max(blade.root_radius()), w.r_end.min(blade.tip_radius()));
        let n = 120;
        let radii: Vec<f64> = (0..=n).map(|i| a + (b - a) * i as f64 / n as f64).collect();
        let z_at = |side: Surface| {
            let level = SkinLevel::outer_mould_line(blade, side, [a, b]);
            radii
                .iter()
                .map(|&r| s.inner(r, side, level.sign() * level.b_at(r, w.chord_frac))[1])
                .collect::<Vec<f64>>()
        };
        let (lower, upper) = (z_at(Surface::Lower), z_at(Surface::Upper));
        WebPlane {
            blade,
            chord_frac: w.chord_frac,
            lower: CubicSpline::natural(&radii, &lower),
            upper: CubicSpline::natural(&radii, &upper),
            span: [a, b],
            last: Cell::new(None),
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
        let at = match self.last.get() {
            Some(at) if at.r == r.to_bits() => at,
            _ => {
                let rc = r.clamp(self.span[0], self.span[1]);
                let at = AtRadius {
                    r: r.to_bits(),
                    lower: self.lower.eval(rc) + self.lower.derivative(rc) * (r - rc),
                    upper: self.upper.eval(rc) + self.upper.derivative(rc) * (r - rc),
                    y: (self.chord_frac - self.blade.pitch_axis_frac(rc)) * self.blade.chord(rc),
                    // As `Blade::to_rotor_frame`.
                    sin_cos: (self.blade.twist(r) + self.blade.rotor().pitch).rad().sin_cos(),
                };
                self.last.set(Some(at));
                at
            }
        };
        let z = at.lower + p[1] * (at.upper - at.lower);
        let (s, c) = at.sin_cos;
        [r, at.y * c - z * s, at.y * s + z * c]
    }
}

//! A web's ply plane: the web's mid-plane between the inner skins.

use super::super::drape::{DrapeSurface, central_frame};
use super::super::vec3::{cross, unit};
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
/// lower and upper inner skins and their rates along the span, the chordwise place and the sine
/// and cosine of the twist.
#[derive(Debug, Clone, Copy)]
struct AtRadius {
    r: u64,
    lower: f64,
    upper: f64,
    lower_r: f64,
    upper_r: f64,
    y: f64,
    sin_cos: (f64, f64),
}

/// Radii within this of the web's ends (beyond which the plane is continued along its tangent)
/// take the frame by central differences, as the drape's default: a few times the difference
/// step.
const END_GUARD: f64 = 4e-6;

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

impl WebPlane<'_> {
    /// The quantities of radius `r` (worked out again only when `r` is not the last radius).
    fn at(&self, r: f64) -> AtRadius {
        match self.last.get() {
            Some(at) if at.r == r.to_bits() => at,
            _ => {
                let rc = r.clamp(self.span[0], self.span[1]);
                let (lower_r, upper_r) = (self.lower.derivative(rc), self.upper.derivative(rc));
                let at = AtRadius {
                    r: r.to_bits(),
                    lower: self.lower.eval(rc) + lower_r * (r - rc),
                    upper: self.upper.eval(rc) + upper_r * (r - rc),
                    lower_r,
                    upper_r,
                    y: (self.chord_frac - self.blade.pitch_axis_frac(rc)) * self.blade.chord(rc),
                    // As `Blade::to_rotor_frame`.
                    sin_cos: (self.blade.twist(r) + self.blade.rotor().pitch).rad().sin_cos(),
                };
                self.last.set(Some(at));
                at
            }
        }
    }
}

impl DrapeSurface for WebPlane<'_> {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let r = p[0];
        let at = self.at(r);
        let z = at.lower + p[1] * (at.upper - at.lower);
        let (s, c) = at.sin_cos;
        [r, at.y * c - z * s, at.y * s + z * c]
    }

    /// The frame from the plane's own derivatives inside the web's span: the inner skins'
    /// heights are splines along the radius, the chordwise place `(x_w − a) c` and the twist
    /// have the rates of the blade's span interpolants (continuous across the stations, which
    /// are blended by monotone cubics), so one radius's quantities give the point and both
    /// tangents; the point is [`DrapeSurface::point`]'s, bit for bit. Near and beyond the ends
    /// (the linear continuation), central differences.
    fn frame(&self, p: [f64; 2]) -> ([f64; 3], [f64; 3], [[f64; 3]; 2]) {
        let r = p[0];
        if !(r > self.span[0] + END_GUARD && r < self.span[1] - END_GUARD) {
            return central_frame(self, p);
        }
        let x = self.point(p);
        let at = self.at(r);
        let [chord_r, twist_r, pitch_axis_r] = self.blade.span_rates(r);
        let chord = self.blade.chord(r);
        let y_r =
            -pitch_axis_r * chord + (self.chord_frac - self.blade.pitch_axis_frac(r)) * chord_r;
        let z = at.lower + p[1] * (at.upper - at.lower);
        let z_r = at.lower_r + p[1] * (at.upper_r - at.lower_r);
        let z_eta = at.upper - at.lower;
        let (s, c) = at.sin_cos;
        // d/dr of (y c − z s, y s + z c) with the twist turning at `twist_r`.
        let along_r = [
            1.0,
            y_r * c - z_r * s - twist_r * (at.y * s + z * c),
            y_r * s + z_r * c + twist_r * (at.y * c - z * s),
        ];
        let along_eta = [0.0, -z_eta * s, z_eta * c];
        (x, unit(cross(along_r, along_eta)), [along_r, along_eta])
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::read_project;

    /// The web plane's frame from its derivatives against the central differences of its own
    /// points (the drape's default frame; central differences err by O(h²) plus round-off of
    /// order eps/h, Burden & Faires, *Numerical Analysis*, §4.1, from memory), on every web of
    /// three demo blades, over the span and beyond both skins: tangents within 1e-6 of their
    /// scale, the normal within 1e-6, and the point the plane's own, bit for bit.
    #[test]
    fn the_web_frame_from_rates_is_the_central_difference_frame() {
        let root = env!("CARGO_MANIFEST_DIR");
        let mut checked = 0;
        for demo in ["small-wind", "mine-fan", "round-root"] {
            let project = read_project(format!("{root}/layups/{demo}/blade.toml").as_ref())
                .unwrap_or_else(|e| panic!("{demo}: {e}"));
            let blade = Blade::from_project(&project).unwrap_or_else(|e| panic!("{demo}: {e}"));
            for w in 0..blade.webs().len() {
                let plane = WebPlane::new(&blade, w);
                let [a, b] = plane.span();
                for k in 0..41 {
                    let r = a + (b - a) * (0.003 + 0.994 * ((k * 13 % 41) as f64 / 40.0));
                    let eta = -0.3 + 1.6 * (k as f64 / 40.0);
                    let p = [r, eta];
                    let (x, n, t) = plane.frame(p);
                    let (xc, nc, tc) = central_frame(&plane, p);
                    let what = format!("{demo} web {w} at {p:?}");
                    assert_eq!(x.map(f64::to_bits), plane.point(p).map(f64::to_bits), "{what}");
                    assert_eq!(x.map(f64::to_bits), xc.map(f64::to_bits), "{what}");
                    for (u, v) in t.iter().zip(&tc) {
                        let scale = v.iter().map(|c| c.abs()).fold(0.0, f64::max);
                        for m in 0..3 {
                            assert!((u[m] - v[m]).abs() < 1e-6 * scale, "{what}: {u:?} {v:?}");
                        }
                    }
                    for m in 0..3 {
                        assert!((n[m] - nc[m]).abs() < 1e-6, "{what}: {n:?} {nc:?}");
                    }
                    checked += 1;
                }
            }
        }
        assert!(checked >= 80, "{checked}");
    }
}

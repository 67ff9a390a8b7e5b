//! The ply regions of a blade as surfaces to drape: a surface ply on one skin (upper or lower),
//! on its own level (the outer mould line moved inward by the plies laid before it), or a web
//! ply on the web's plane between the inner skins.

use super::drape::DrapeSurface;
use crate::blade::{AtRadius, Blade, BladeSurfaces, PLY_DROP_TAPER, Surface, smooth_step};
use crate::interp::CubicSpline;
use crate::project::Region;
use std::cell::RefCell;

/// A ply laid before the one draped, with its edges ramped as the blade's inner surface ramps
/// them (1:20 over the ply's thickness for a fibre ply, edges at the trailing edge, at a
/// leading edge the ply wraps and at the blade's ends not ramped).
#[derive(Debug, Clone)]
struct Beneath {
    thickness: f64,
    span: [f64; 2],
    span_edge: [bool; 2],
    chord: [f64; 2],
    chord_edge: [bool; 2],
}

impl Beneath {
    /// The fraction of the ply present at radius `r` by its span ramps: `None` where the ply is
    /// absent (off an end that is not ramped).
    fn span_factor(&self, r: f64) -> Option<f64> {
        let h = (0.5 * PLY_DROP_TAPER * self.thickness).min(0.25 * (self.span[1] - self.span[0]));
        let mut f = 1.0;
        if self.span_edge[0] {
            f *= smooth_step((r - self.span[0]) / h);
        } else if r < self.span[0] - 1e-9 {
            return None;
        }
        if self.span_edge[1] {
            f *= smooth_step((self.span[1] - r) / h);
        } else if r > self.span[1] + 1e-9 {
            return None;
        }
        Some(f)
    }

    /// Half the chordwise ramp on a section of chord `chord`, chord fractions.
    fn chord_ramp(&self, chord: f64) -> f64 {
        (0.5 * PLY_DROP_TAPER * self.thickness / chord).min(0.25 * (self.chord[1] - self.chord[0]))
    }

    /// The fraction of the ply present at chord fraction `x`, its span part `f` and the half
    /// ramp `hx` given.
    fn chord_factor(&self, mut f: f64, x: f64, hx: f64) -> f64 {
        if self.chord_edge[0] {
            f *= smooth_step((x - self.chord[0]) / hx);
        }
        if self.chord_edge[1] {
            f *= smooth_step((self.chord[1] - x) / hx);
        }
        f
    }
}

/// What the points of a level at one radius share: the surfaces' quantities there, the rotation
/// into the rotor frame, and each ply beneath's span factor and chordwise half ramp. The drape
/// asks for several points at one radius in a row (the point and its chordwise differences, the
/// Newton steps' frames), so the last radius is kept.
#[derive(Debug, Clone)]
struct RadiusCache {
    at: AtRadius,
    sin_cos: (f64, f64),
    beneath: Vec<(Option<f64>, f64)>,
}

/// One skin's ply level as a surface. Parameters `(r, b)`: radius (m) and `b = u` on the upper
/// surface, `b = −u` on the lower (`u` the normalised arc length from the leading edge), so that
/// `S_r × S_b` points outward. Below `u = 0` the surface runs on round the leading edge over the
/// other skin; beyond the blade's ends and beyond the trailing edge it is continued along its
/// tangent.
pub(crate) struct SkinLevel<'a> {
    surfaces: BladeSurfaces<'a>,
    blade: &'a Blade,
    side: Surface,
    beneath: Vec<Beneath>,
    span: [f64; 2],
    cache: RefCell<Option<RadiusCache>>,
}

impl<'a> SkinLevel<'a> {
    /// The level of ply `index` (in schedule order) on `side`.
    pub(crate) fn new(blade: &'a Blade, side: Surface, index: usize) -> Self {
        let (root, tip) = (blade.root_radius(), blade.tip_radius());
        let beneath = (0..index)
            .filter_map(|k| {
                let p = blade.ply(k)?;
                let on = matches!(
                    (&p.region, side),
                    (Region::Both, _)
                        | (Region::Upper, Surface::Upper)
                        | (Region::Lower, Surface::Lower)
                );
                on.then(|| Beneath {
                    thickness: blade.ply_material(k).map_or(0.0, |m| m.ply_thickness),
                    span: [p.r_start, p.r_end],
                    span_edge: [p.r_start > root + 1e-9, p.r_end < tip - 1e-9],
                    chord: [p.from, p.to],
                    chord_edge: [p.from > 1e-9, p.to < 1.0 - 1e-9],
                })
            })
            .collect();
        SkinLevel {
            surfaces: blade.surfaces(),
            blade,
            side,
            beneath,
            span: [root, tip],
            cache: RefCell::new(None),
        }
    }

    fn sign(&self) -> f64 {
        match self.side {
            Surface::Upper => 1.0,
            Surface::Lower => -1.0,
        }
    }

    /// Runs `f` with the quantities of radius `r` (worked out again only when `r` is not the
    /// radius of the last call).
    fn with_radius<T>(&self, r: f64, f: impl FnOnce(&RadiusCache) -> T) -> T {
        let mut cache = self.cache.borrow_mut();
        let c = match cache.take() {
            Some(c) if c.at.r.to_bits() == r.to_bits() => c,
            old => {
                let at = self.surfaces.at_radius(r);
                let phi = (self.blade.twist(r) + self.blade.rotor().pitch).rad();
                let mut beneath = old.map(|c| c.beneath).unwrap_or_default();
                beneath.clear();
                beneath.extend(
                    self.beneath.iter().map(|p| (p.span_factor(r), p.chord_ramp(at.chord))),
                );
                RadiusCache { at, sin_cos: phi.sin_cos(), beneath }
            }
        };
        let out = f(&c);
        *cache = Some(c);
        out
    }

    /// The offset of this level below the outer mould line at chord fraction `x`, m.
    fn offset(&self, c: &RadiusCache, x: f64) -> f64 {
        self.beneath
            .iter()
            .zip(&c.beneath)
            .map(|(p, &(f, hx))| p.thickness * f.map_or(0.0, |f| p.chord_factor(f, x, hx)))
            .sum()
    }

    /// The point inside the blade's ends and `u ∈ [-1, 1]` (a negative `u` is round the leading
    /// edge on the other surface, where the cloth wraps), and the chord fraction there.
    fn inside_point(&self, r: f64, u: f64) -> ([f64; 3], f64) {
        let (side, u) = if u < 0.0 {
            (
                match self.side {
                    Surface::Upper => Surface::Lower,
                    Surface::Lower => Surface::Upper,
                },
                -u,
            )
        } else {
            (self.side, u)
        };
        self.with_radius(r, |c| {
            let (p, n, x) = self.surfaces.outer_with_normal_at(&c.at, side, u);
            let t = self.offset(c, x);
            let yz = [p[0] - t * n[0], p[1] - t * n[1]];
            // As `Blade::to_rotor_frame`.
            let (s, cs) = c.sin_cos;
            ([r, yz[0] * cs - yz[1] * s, yz[0] * s + yz[1] * cs], x)
        })
    }

    /// The chord fraction at `(r, u)`.
    pub(crate) fn chord_fraction(&self, r: f64, u: f64) -> f64 {
        self.with_radius(r, |c| self.surfaces.outer_with_normal_at(&c.at, self.side, u).2)
    }

    /// The parameter `b` where the chord fraction is `x` at radius `r` (bisection on `u`).
    pub(crate) fn b_at(&self, r: f64, x: f64) -> f64 {
        let u = if x <= 0.0 {
            0.0
        } else if x >= 1.0 {
            1.0
        } else {
            let (mut lo, mut hi) = (0.0, 1.0);
            for _ in 0..60 {
                let mid = 0.5 * (lo + hi);
                if self.chord_fraction(r, mid) < x {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            0.5 * (lo + hi)
        };
        self.sign() * u
    }

    /// The `b` range `[lo, hi]` of chord fractions `from..to` at radius `r`.
    pub(crate) fn b_range(&self, r: f64, from: f64, to: f64) -> [f64; 2] {
        let (a, b) = (self.b_at(r, from), self.b_at(r, to));
        [a.min(b), a.max(b)]
    }
}

impl DrapeSurface for SkinLevel<'_> {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let (r, u) = (p[0], self.sign() * p[1]);
        let rc = r.clamp(self.span[0], self.span[1]);
        let uc = u.clamp(-1.0, 1.0);
        let (x, _) = self.inside_point(rc, uc);
        if rc == r && uc == u {
            return x;
        }
        // Continued along the tangents at the nearest inside point, each taken by a one-sided
        // second-order difference over a millimetre-scale step: a step near round-off would put
        // noise of order eps/h into the continuation, which the drape's own differences of the
        // continued surface then magnify until Newton's method cannot settle beyond the edge.
        let mut out = x;
        if rc != r {
            let h = 1e-3_f64.min(0.25 * (self.span[1] - self.span[0]));
            let s = if rc > self.span[0] + 2.0 * h { -h } else { h };
            let (y1, _) = self.inside_point(rc + s, uc);
            let (y2, _) = self.inside_point(rc + 2.0 * s, uc);
            for k in 0..3 {
                let slope = (-3.0 * x[k] + 4.0 * y1[k] - y2[k]) / (2.0 * s);
                out[k] += slope * (r - rc);
            }
        }
        if uc != u {
            let h = 1e-3;
            let s = if uc > -1.0 + 2.0 * h { -h } else { h };
            let (y1, _) = self.inside_point(rc, uc + s);
            let (y2, _) = self.inside_point(rc, uc + 2.0 * s);
            for k in 0..3 {
                let slope = (-3.0 * x[k] + 4.0 * y1[k] - y2[k]) / (2.0 * s);
                out[k] += slope * (u - uc);
            }
        }
        out
    }
}

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
            let level = SkinLevel {
                surfaces: s.clone(),
                blade,
                side,
                beneath: Vec::new(),
                span: [a, b],
                cache: RefCell::new(None),
            };
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

//! A skin's ply level as a surface to drape: the outer mould line moved inward by the plies laid
//! before the one draped, their edges ramped as the blade's inner surface ramps them.

use super::super::drape::DrapeSurface;
use crate::blade::{AtRadius, Blade, BladeSurfaces, PLY_DROP_TAPER, Surface, smooth_step};
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
    edges: RefCell<Vec<Edge>>,
}

/// The surface's continuation beyond its edges at one clamped point `(r, u)`: the point and the
/// tangent slopes along `r` and `u` there, each worked out when first asked for. A drape's
/// finite differences ask for several points continued from one clamped point in a row.
#[derive(Debug, Clone, Copy)]
struct Edge {
    key: [u64; 2],
    x: [f64; 3],
    along_r: Option<[f64; 3]>,
    along_u: Option<[f64; 3]>,
}

/// Clamped points whose continuation is kept.
const EDGES_KEPT: usize = 4;

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
            edges: RefCell::new(Vec::new()),
        }
    }

    /// The outer mould line itself (no plies beneath) on `side` over `span`.
    pub(super) fn outer_mould_line(blade: &'a Blade, side: Surface, span: [f64; 2]) -> Self {
        SkinLevel {
            surfaces: blade.surfaces(),
            blade,
            side,
            beneath: Vec::new(),
            span,
            cache: RefCell::new(None),
            edges: RefCell::new(Vec::new()),
        }
    }

    pub(super) fn sign(&self) -> f64 {
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
        if rc == r && uc == u {
            return self.inside_point(rc, uc).0;
        }
        // Continued along the tangents at the nearest inside point, each taken by a one-sided
        // second-order difference over a millimetre-scale step: a step near round-off would put
        // noise of order eps/h into the continuation, which the drape's own differences of the
        // continued surface then magnify until Newton's method cannot settle beyond the edge.
        let key = [rc.to_bits(), uc.to_bits()];
        let kept = self.edges.borrow().iter().rev().find(|e| e.key == key).copied();
        let mut e = kept.unwrap_or_else(|| Edge {
            key,
            x: self.inside_point(rc, uc).0,
            along_r: None,
            along_u: None,
        });
        let x = e.x;
        if rc != r && e.along_r.is_none() {
            let h = 1e-3_f64.min(0.25 * (self.span[1] - self.span[0]));
            let s = if rc > self.span[0] + 2.0 * h { -h } else { h };
            let (y1, _) = self.inside_point(rc + s, uc);
            let (y2, _) = self.inside_point(rc + 2.0 * s, uc);
            e.along_r = Some([0, 1, 2].map(|k| (-3.0 * x[k] + 4.0 * y1[k] - y2[k]) / (2.0 * s)));
        }
        if uc != u && e.along_u.is_none() {
            let h = 1e-3;
            let s = if uc > -1.0 + 2.0 * h { -h } else { h };
            let (y1, _) = self.inside_point(rc, uc + s);
            let (y2, _) = self.inside_point(rc, uc + 2.0 * s);
            e.along_u = Some([0, 1, 2].map(|k| (-3.0 * x[k] + 4.0 * y1[k] - y2[k]) / (2.0 * s)));
        }
        {
            let mut edges = self.edges.borrow_mut();
            edges.retain(|k| k.key != key);
            if edges.len() >= EDGES_KEPT {
                edges.remove(0);
            }
            edges.push(e);
        }
        let mut out = x;
        if let (true, Some(slope)) = (rc != r, e.along_r) {
            for k in 0..3 {
                out[k] += slope[k] * (r - rc);
            }
        }
        if let (true, Some(slope)) = (uc != u, e.along_u) {
            for k in 0..3 {
                out[k] += slope[k] * (u - uc);
            }
        }
        out
    }
}

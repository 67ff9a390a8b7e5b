//! A skin's ply level as a surface to drape: the outer mould line moved inward by the plies laid
//! before the one draped, their edges ramped as the blade's inner surface ramps them.

use super::super::drape::{DrapeSurface, central_frame};
use super::super::vec3::{cross, unit};
use crate::blade::{
    AtRadius, Blade, BladeSurfaces, OuterJet, PLY_DROP_TAPER, RadiusRates, Surface, smooth_step,
};
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

    /// The rate of [`Beneath::span_factor`] along the radius (where the ply is present).
    fn span_rate(&self, r: f64) -> f64 {
        let h = (0.5 * PLY_DROP_TAPER * self.thickness).min(0.25 * (self.span[1] - self.span[0]));
        let (lo, hi) = ((r - self.span[0]) / h, (self.span[1] - r) / h);
        let (f_lo, f_hi) = (
            if self.span_edge[0] { smooth_step(lo) } else { 1.0 },
            if self.span_edge[1] { smooth_step(hi) } else { 1.0 },
        );
        let d_lo = if self.span_edge[0] { smooth_step_rate(lo) / h } else { 0.0 };
        let d_hi = if self.span_edge[1] { -smooth_step_rate(hi) / h } else { 0.0 };
        d_lo * f_hi + f_lo * d_hi
    }

    /// The rate of [`Beneath::chord_ramp`] along the radius, the chord's rate `chord_r` given.
    fn chord_ramp_rate(&self, chord: f64, chord_r: f64) -> f64 {
        let ramp = 0.5 * PLY_DROP_TAPER * self.thickness / chord;
        if ramp < 0.25 * (self.chord[1] - self.chord[0]) { -ramp / chord * chord_r } else { 0.0 }
    }

    /// [`Beneath::chord_factor`] with span part `f` and with span part 1, and the former's
    /// rates along `x` and along the half ramp `hx`, from one evaluation of each ramp (the
    /// factors are those of [`Beneath::chord_factor`], bit for bit).
    fn chord_factor_rates(&self, f: f64, x: f64, hx: f64) -> [f64; 4] {
        let (lo, hi) = ((x - self.chord[0]) / hx, (self.chord[1] - x) / hx);
        let (g_lo, g_hi) = (
            if self.chord_edge[0] { smooth_step(lo) } else { 1.0 },
            if self.chord_edge[1] { smooth_step(hi) } else { 1.0 },
        );
        let (s_lo, s_hi) = (
            if self.chord_edge[0] { smooth_step_rate(lo) } else { 0.0 },
            if self.chord_edge[1] { smooth_step_rate(hi) } else { 0.0 },
        );
        // As `chord_factor`: the ramps multiplied in one after the other.
        let (mut factor, mut g) = (f, 1.0);
        if self.chord_edge[0] {
            factor *= g_lo;
            g *= g_lo;
        }
        if self.chord_edge[1] {
            factor *= g_hi;
            g *= g_hi;
        }
        // d/dx of g(±(x - e)/hx) is ±g'/hx; d/dhx of g(ξ) is -g' ξ/hx.
        let along_x = f * (s_lo * g_hi - g_lo * s_hi) / hx;
        let along_h = -f * (s_lo * lo * g_hi + g_lo * s_hi * hi) / hx;
        [factor, g, along_x, along_h]
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

/// The rate of [`smooth_step`] in its argument: `3s(1 − s)` with `s = (ξ + 1) / 2` inside the
/// ramp, zero outside.
fn smooth_step_rate(xi: f64) -> f64 {
    if xi <= -1.0 || xi >= 1.0 {
        0.0
    } else {
        let s = 0.5 * (xi + 1.0);
        3.0 * s * (1.0 - s)
    }
}

/// A surface point, its unit normal and its tangents along the two parameters.
type Frame = ([f64; 3], [f64; 3], [[f64; 3]; 2]);

/// Radii and chordwise parameters within this of a kink of the surface (a station, where the
/// stations' linear blend turns; the leading edge, where the arc-length parameter's speed
/// jumps; the level's edges, beyond which it is continued) take the frame by central
/// differences, as the drape's default: a few times the difference step.
const KINK_GUARD: f64 = 4e-6;

/// What the points of a level at one radius share: the surfaces' quantities there, the rotation
/// into the rotor frame, and each ply beneath's span factor and chordwise half ramp. The drape
/// asks for several points at one radius in a row (the point and its chordwise differences, the
/// Newton steps' frames), and beyond the blade's ends for points of three radii in turn, so the
/// last few radii are kept (see [`RADII_KEPT`]).
#[derive(Debug, Clone)]
struct RadiusCache {
    at: AtRadius,
    sin_cos: (f64, f64),
    beneath: Vec<(Option<f64>, f64)>,
    /// The span rates there, when first asked for (`None` inside: near a station).
    rates: Option<Option<Rates>>,
    /// The plies' rates of an earlier radius, a buffer to reuse.
    spare: Vec<[f64; 2]>,
}

/// The quantities of the last [`RADII_KEPT`] radii worked out, and which to replace next.
#[derive(Debug, Default)]
struct RadiusCaches {
    kept: Vec<RadiusCache>,
    next: usize,
}

/// The span rates of a radius: the surfaces', and each ply beneath's span factor and half ramp.
#[derive(Debug, Clone)]
struct Rates {
    surface: RadiusRates,
    beneath: Vec<[f64; 2]>,
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
    /// The radii worked out last (see [`RADII_KEPT`]).
    cache: RefCell<RadiusCaches>,
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

/// Radii whose quantities a level keeps: a point continued beyond the blade's ends takes its
/// slope along the span from three radii inside (see [`DrapeSurface::point`]), and its
/// neighbours' points, which the drape asks for next, take theirs from the same three.
const RADII_KEPT: usize = 4;

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
            cache: RefCell::new(RadiusCaches::default()),
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
            cache: RefCell::new(RadiusCaches::default()),
            edges: RefCell::new(Vec::new()),
        }
    }

    pub(super) fn sign(&self) -> f64 {
        match self.side {
            Surface::Upper => 1.0,
            Surface::Lower => -1.0,
        }
    }

    /// Runs `f` with the quantities of radius `r` (worked out again only when `r` is none of
    /// the last [`RADII_KEPT`] radii worked out).
    fn with_radius<T>(&self, r: f64, f: impl FnOnce(&mut RadiusCache) -> T) -> T {
        let mut cache = self.cache.borrow_mut();
        let RadiusCaches { kept, next } = &mut *cache;
        let k = match kept.iter().position(|c| c.at.r.to_bits() == r.to_bits()) {
            Some(k) => k,
            None => {
                // The radius worked out longest ago makes room, lending its buffers.
                let k = *next;
                *next = (k + 1) % RADII_KEPT;
                let at = self.surfaces.at_radius(r);
                let phi = (self.blade.twist(r) + self.blade.rotor().pitch).rad();
                let (mut beneath, spare) = match kept.get_mut(k) {
                    Some(c) => {
                        let spare = match c.rates.take() {
                            Some(Some(rates)) => rates.beneath,
                            _ => std::mem::take(&mut c.spare),
                        };
                        (std::mem::take(&mut c.beneath), spare)
                    }
                    None => Default::default(),
                };
                beneath.clear();
                beneath.extend(
                    self.beneath.iter().map(|p| (p.span_factor(r), p.chord_ramp(at.chord))),
                );
                let c = RadiusCache { at, sin_cos: phi.sin_cos(), beneath, rates: None, spare };
                if k < kept.len() {
                    kept[k] = c;
                } else {
                    kept.push(c);
                }
                k
            }
        };
        f(&mut kept[k])
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

    /// The frame (point, unit normal, tangents along `r` and `b`) from the surfaces'
    /// derivatives, or `None` near a kink (see [`KINK_GUARD`]). The point is
    /// [`SkinLevel::inside_point`]'s, bit for bit.
    fn frame_from_rates(&self, p: [f64; 2]) -> Option<Frame> {
        let u = self.sign() * p[1];
        let g = KINK_GUARD;
        if !(u.abs() > g && u.abs() < 1.0 - g) {
            return None;
        }
        self.jet_frame(p[0], u)
    }

    /// [`SkinLevel::frame_from_rates`] at radius `r` and `u ∈ [-1, 1]` (the level's edges
    /// included, as one-sided rates), or `None` near a station or the blade's ends.
    fn jet_frame(&self, r: f64, u: f64) -> Option<Frame> {
        let g = KINK_GUARD;
        if !(r > self.span[0] + g && r < self.span[1] - g) {
            return None;
        }
        let (side, ua, turn) = if u < 0.0 {
            let other = match self.side {
                Surface::Upper => Surface::Lower,
                Surface::Lower => Surface::Upper,
            };
            (other, -u, -1.0)
        } else {
            (self.side, u, 1.0)
        };
        self.with_radius(r, |c| {
            if c.rates.is_none() {
                let surface = self.surfaces.radius_rates(&c.at, g);
                let mut beneath = std::mem::take(&mut c.spare);
                c.rates = Some(surface.map(|surface| {
                    beneath.clear();
                    beneath.extend(self.ply_rates(r, c.at.chord, surface.chord));
                    Rates { beneath, surface }
                }));
            }
            let rates = c.rates.as_ref()?.as_ref()?;
            let jet = self.surfaces.outer_jet(&c.at, &rates.surface, side, ua);
            let (t, t_x, t_r) = self.offset_rates(c, rates, jet.x);
            Some(self.assemble(c, &rates.surface, &jet, [t, t_x, t_r], self.sign() * turn))
        })
    }

    /// Each ply beneath's rates along the radius at `r`: of its span factor and of its half
    /// ramp, the chord and its rate given.
    fn ply_rates(&self, r: f64, chord: f64, chord_r: f64) -> impl Iterator<Item = [f64; 2]> + '_ {
        self.beneath.iter().map(move |p| [p.span_rate(r), p.chord_ramp_rate(chord, chord_r)])
    }

    /// The offset of [`SkinLevel::offset`] and its rates along `x` and `r`.
    /// The offset is [`SkinLevel::offset`]'s, bit for bit: the same terms added in the same
    /// order from the same start.
    fn offset_rates(&self, c: &RadiusCache, rates: &Rates, x: f64) -> (f64, f64, f64) {
        let mut t: f64 = std::iter::empty::<f64>().sum();
        let (mut t_x, mut t_r) = (0.0, 0.0);
        for ((p, &(f, hx)), &[f_r, hx_r]) in self.beneath.iter().zip(&c.beneath).zip(&rates.beneath)
        {
            let Some(f) = f else {
                t += p.thickness * 0.0;
                continue;
            };
            if p.chord_edge == [false, false] {
                // No chordwise ramp: `chord_factor_rates` would give `[f, 1, ±0, ±0]` (the ramp
                // positive), and a signed zero adds nothing to `t_x` or `t_r` (sums from +0 never
                // reach -0): the same bits without the ramp's divisions.
                t += p.thickness * f;
                t_r += p.thickness * f_r;
                continue;
            }
            let [factor, g, along_x, along_h] = p.chord_factor_rates(f, x, hx);
            t += p.thickness * factor;
            t_x += p.thickness * along_x;
            // The span factor enters the chord factor as a factor.
            t_r += p.thickness * (f_r * g + along_h * hx_r);
        }
        (t, t_x, t_r)
    }

    /// The point of the level and its tangents from the outer mould line's jet and the offset
    /// `[t, t_x, t_r]`, turned into the rotor frame; `sign_b` is `db/du` of the curve's `u`.
    fn assemble(
        &self,
        c: &RadiusCache,
        rates: &RadiusRates,
        jet: &OuterJet,
        [t, t_x, t_r]: [f64; 3],
        sign_b: f64,
    ) -> ([f64; 3], [f64; 3], [[f64; 3]; 2]) {
        let r = c.at.r;
        let (p, n) = (jet.p, jet.n);
        // As `inside_point`.
        let yz = [p[0] - t * n[0], p[1] - t * n[1]];
        let (s, cs) = c.sin_cos;
        let x = [r, yz[0] * cs - yz[1] * s, yz[0] * s + yz[1] * cs];
        let q_u = [0, 1].map(|k| jet.p_u[k] - t_x * jet.x_u * n[k] - t * jet.n_u[k]);
        let q_r = [0, 1].map(|k| jet.p_r[k] - (t_r + t_x * jet.x_r) * n[k] - t * jet.n_r[k]);
        let rot = |v: [f64; 2]| [v[0] * cs - v[1] * s, v[0] * s + v[1] * cs];
        let (tu, tr, turned) = (rot(q_u), rot(q_r), rot([-yz[1], yz[0]]));
        let phi_r = rates.twist;
        let along_r = [1.0, tr[0] + phi_r * turned[0], tr[1] + phi_r * turned[1]];
        let along_b = [0.0, sign_b * tu[0], sign_b * tu[1]];
        (x, unit(cross(along_r, along_b)), [along_r, along_b])
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

impl SkinLevel<'_> {
    /// The frame beyond the trailing edges (`|u| > 1`, within the blade's ends) from the
    /// derivatives of the continuation: there the level is continued along its chordwise slope
    /// at the edge, a one-sided difference of three points at one radius (see
    /// [`DrapeSurface::point`]), so its rate along the span is the same difference of the three
    /// points' rates along the span, and its rate along `u` is that slope. The point is the
    /// continuation's, bit for bit. `None` elsewhere, or near a station.
    fn continued_frame(&self, p: [f64; 2]) -> Option<Frame> {
        let (r, u) = (p[0], self.sign() * p[1]);
        let uc = u.clamp(-1.0, 1.0);
        if uc == u {
            return None;
        }
        let h = EDGE_STEP;
        let s = if uc > -1.0 + 2.0 * h { -h } else { h };
        let (x, _, [x_r, _]) = self.jet_frame(r, uc)?;
        let (y1, _, [y1_r, _]) = self.jet_frame(r, uc + s)?;
        let (y2, _, [y2_r, _]) = self.jet_frame(r, uc + 2.0 * s)?;
        let slope = [0, 1, 2].map(|k| (-3.0 * x[k] + 4.0 * y1[k] - y2[k]) / (2.0 * s));
        let slope_r = [0, 1, 2].map(|k| (-3.0 * x_r[k] + 4.0 * y1_r[k] - y2_r[k]) / (2.0 * s));
        let mut out = x;
        for k in 0..3 {
            out[k] += slope[k] * (u - uc);
        }
        let along_r = [0, 1, 2].map(|k| x_r[k] + slope_r[k] * (u - uc));
        let along_b = slope.map(|v| self.sign() * v);
        Some((out, unit(cross(along_r, along_b)), [along_r, along_b]))
    }
}

/// The chordwise step of the one-sided slope the level is continued along beyond its trailing
/// edges (a millimetre-scale step: see [`DrapeSurface::point`]).
const EDGE_STEP: f64 = 1e-3;

impl DrapeSurface for SkinLevel<'_> {
    fn frame(&self, p: [f64; 2]) -> ([f64; 3], [f64; 3], [[f64; 3]; 2]) {
        self.frame_from_rates(p)
            .or_else(|| self.continued_frame(p))
            .unwrap_or_else(|| central_frame(self, p))
    }

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
            let h = EDGE_STEP;
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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::read_project;

    /// Calls `check` on every ply level of both skins of three demo blades (a blunt trailing
    /// edge, drop-offs, a round root), with the blade's root and tip radii.
    fn each_demo_level(mut check: impl FnMut(&str, usize, Surface, &SkinLevel, f64, f64)) {
        let root = env!("CARGO_MANIFEST_DIR");
        for demo in ["small-wind", "mine-fan", "round-root"] {
            let project = read_project(format!("{root}/layups/{demo}/blade.toml").as_ref())
                .unwrap_or_else(|e| panic!("{demo}: {e}"));
            let blade = Blade::from_project(&project).unwrap_or_else(|e| panic!("{demo}: {e}"));
            let (r0, r1) = (blade.root_radius(), blade.tip_radius());
            for index in 0..blade.ply_count() {
                for side in [Surface::Upper, Surface::Lower] {
                    check(demo, index, side, &SkinLevel::new(&blade, side, index), r0, r1);
                }
            }
        }
    }

    /// The frame `(x, n, t)` at `p` against the central differences of the level's points there:
    /// the point the level's own, bit for bit; tangents within 1e-6 of their scale and the normal
    /// within 1e-6.
    fn agrees_with_central(level: &SkinLevel, p: [f64; 2], frame: Frame, what: &str) {
        let (x, n, t) = frame;
        let (_, nc, tc) = central_frame(level, p);
        assert_eq!(x.map(f64::to_bits), level.point(p).map(f64::to_bits), "{what} at {p:?}");
        for (a, c) in t.iter().zip(&tc) {
            let scale = c.iter().map(|v| v.abs()).fold(0.0, f64::max);
            for m in 0..3 {
                let err = (a[m] - c[m]).abs() / scale;
                assert!(err < 1e-6, "{what} at {p:?}: {err}");
            }
        }
        for m in 0..3 {
            assert!((n[m] - nc[m]).abs() < 1e-6, "{what} at {p:?}");
        }
    }

    /// The frame from the surfaces' derivatives against the central differences of the level's
    /// own points (the drape's default frame; central differences err by O(h²) plus round-off
    /// of order eps/h, Burden & Faires, *Numerical Analysis*, §4.1, from memory), on every ply
    /// level of both skins of three demo blades, at points off the kinks; and the point is the
    /// level's own, bit for bit.
    #[test]
    fn the_frame_from_rates_is_the_central_difference_frame() {
        let mut checked = 0;
        each_demo_level(|demo, index, side, level, r0, r1| {
            for k in 0..37 {
                // Spread over the span and round both skins (b < 0 wraps the nose).
                let r = r0 + (r1 - r0) * (0.013 + 0.974 * ((k * 17 % 37) as f64 / 36.0));
                let b = -0.4 + 1.33 * (k as f64 / 36.0);
                let p = [r, b.min(0.987)];
                let Some(frame) = level.frame_from_rates(p) else { continue };
                let xc = central_frame(level, p).0;
                assert_eq!(frame.0.map(f64::to_bits), xc.map(f64::to_bits));
                agrees_with_central(level, p, frame, &format!("{demo} ply {index} {side:?}"));
                checked += 1;
            }
        });
        assert!(checked > 500, "{checked}");
    }

    /// Frames and points asked for radius after radius, back and forth over more radii than the
    /// level keeps, and beyond the blade's ends (where a point takes three radii inside), are
    /// those of a level that keeps no radius (each asked with its memory cleared), to the bit.
    #[test]
    fn a_level_keeping_several_radii_gives_what_each_point_alone_gives() {
        let mut compared = 0;
        each_demo_level(|demo, index, side, level, r0, r1| {
            if index % 3 != 0 {
                return;
            }
            // Pairs of radii 20 µm apart (a Newton step's size), spread over the span and past
            // both ends.
            let radii: Vec<f64> = (0..=RADII_KEPT + 2)
                .map(|k| r0 - 0.01 + (r1 - r0 + 0.02) * k as f64 / (RADII_KEPT + 2) as f64)
                .flat_map(|r| [r, r + 2e-5])
                .collect();
            // Up the span, down again, then in strides that pass over the kept radii.
            let n = radii.len();
            let order: Vec<usize> =
                (0..n).chain((0..n).rev()).chain((0..n).map(|k| k * 5 % n)).collect();
            for (j, &k) in order.iter().enumerate() {
                let p = [radii[k], -0.3 + 0.31 * (j % 5) as f64];
                let kept = (level.frame(p), level.point(p));
                *level.cache.borrow_mut() = RadiusCaches::default();
                level.edges.borrow_mut().clear();
                let alone = (level.frame(p), level.point(p));
                let bits = |((x, n, [a, b]), q): (Frame, [f64; 3])| {
                    [x, n, a, b, q].map(|v| v.map(f64::to_bits))
                };
                assert_eq!(bits(kept), bits(alone), "{demo} ply {index} {side:?} at {p:?}");
                compared += 1;
            }
        });
        assert!(compared > 200, "{compared}");
    }

    /// `offset_rates` as first written, every ply's factor and rates from its ramps (the
    /// reference for the plies without a chordwise ramp, which it adds up without them).
    fn offset_rates_by_ramps(
        level: &SkinLevel,
        c: &RadiusCache,
        rates: &Rates,
        x: f64,
    ) -> [f64; 3] {
        let mut t: f64 = std::iter::empty::<f64>().sum();
        let (mut t_x, mut t_r) = (0.0, 0.0);
        for ((p, &(f, hx)), &[f_r, hx_r]) in
            level.beneath.iter().zip(&c.beneath).zip(&rates.beneath)
        {
            let Some(f) = f else {
                t += p.thickness * 0.0;
                continue;
            };
            let [factor, g, along_x, along_h] = p.chord_factor_rates(f, x, hx);
            t += p.thickness * factor;
            t_x += p.thickness * along_x;
            t_r += p.thickness * (f_r * g + along_h * hx_r);
        }
        [t, t_x, t_r]
    }

    /// The offset and its rates, bit for bit those of every ply's ramps, on every ply level of
    /// both skins of three demo blades, over the span (span ramps included) and the chord.
    #[test]
    fn plies_without_a_chordwise_ramp_add_the_same_bits() {
        let (mut plain, mut ramped, mut points) = (0, 0, 0);
        each_demo_level(|demo, index, side, level, r0, r1| {
            plain += level.beneath.iter().filter(|p| p.chord_edge == [false, false]).count();
            ramped += level.beneath.iter().filter(|p| p.chord_edge != [false, false]).count();
            for k in 0..41 {
                let r = r0 + (r1 - r0) * (0.01 + 0.98 * ((k * 13 % 41) as f64 / 40.0));
                level.with_radius(r, |c| {
                    let Some(surface) = level.surfaces.radius_rates(&c.at, KINK_GUARD) else {
                        return;
                    };
                    let beneath = level.ply_rates(r, c.at.chord, surface.chord).collect();
                    let rates = Rates { beneath, surface };
                    for j in 0..=50 {
                        let x = j as f64 / 50.0;
                        let (t, t_x, t_r) = level.offset_rates(c, &rates, x);
                        let want = offset_rates_by_ramps(level, c, &rates, x);
                        assert_eq!(
                            [t, t_x, t_r].map(f64::to_bits),
                            want.map(f64::to_bits),
                            "{demo} ply {index} {side:?} at r = {r}, x = {x}"
                        );
                        points += 1;
                    }
                });
            }
        });
        assert!(plain > 0 && ramped > 0 && points > 10_000, "{plain} {ramped} {points}");
    }

    /// The continuation's frame beyond the trailing edges from derivatives against the central
    /// differences of the continued points (as above), on every ply level of both skins of the
    /// three demo blades, beyond both trailing edges; and the point is the continuation's own,
    /// bit for bit.
    #[test]
    fn the_continued_frame_is_the_central_difference_frame() {
        let mut checked = 0;
        each_demo_level(|demo, index, side, level, r0, r1| {
            for k in 0..23 {
                let r = r0 + (r1 - r0) * (0.011 + 0.977 * ((k * 7 % 23) as f64 / 22.0));
                // Beyond the draped skin's trailing edge, and beyond the other's.
                let beyond = 1.0 + 0.003 + 0.2 * (k as f64 / 22.0);
                for b in [beyond, -beyond] {
                    let p = [r, b];
                    let Some(frame) = level.continued_frame(p) else { continue };
                    agrees_with_central(level, p, frame, &format!("{demo} ply {index} {side:?}"));
                    checked += 1;
                }
            }
        });
        assert!(checked > 500, "{checked}");
    }
}

//! The blade's surfaces as loft input: the outer mould line, the inner laminate surface, and the
//! core cells cut from the inner surface by the webs' faces and, at the leading and trailing
//! edges, where the inner surfaces come within the least core thickness.
//!
//! A core cell's chains are the inner chains between two cut positions `y(x)` (chord frame). The
//! parameter where a chain crosses a cut is solved at sample radii (every millimetre or so, by
//! the Illinois regula falsi of [`super::cells`]) and interpolated along the span by the monotone
//! cubic of Fritsch & Carlson (1980), so evaluating a cell costs one evaluation of the inner
//! surface; the cut ends are then continuous in `x` and lie on the inner surface exactly, within
//! the interpolation error of their chordwise position.

use super::cells::crossing;
use super::surface::{ChainEnds, EndKind, SpanSurface};
use crate::blade::{BladeSurfaces, Surface};
use crate::interp::Pchip;
use crate::mesh::MeshError;
use crate::units::Angle;

/// Which of the blade's two surfaces a [`BladeSurface`] is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Side {
    /// The outer mould line.
    Outer,
    /// The inner laminate surface.
    Inner,
}

/// The outer or the inner surface of the blade at a pitch setting.
pub(crate) struct BladeSurface<'a> {
    pub surfaces: &'a BladeSurfaces<'a>,
    pub side: Side,
    pub pitch: Angle,
    pub span: [f64; 2],
    pub back: EndKind,
}

impl BladeSurface<'_> {
    fn point(&self, x: f64, surface: Surface, u: f64) -> [f64; 2] {
        match self.side {
            Side::Outer => self.surfaces.outer(x, surface, u),
            Side::Inner => self.surfaces.inner(x, surface, u),
        }
    }
}

impl SpanSurface for BladeSurface<'_> {
    fn span(&self) -> [f64; 2] {
        self.span
    }
    fn upper(&self, x: f64, u: f64) -> [f64; 2] {
        self.point(x, Surface::Upper, u)
    }
    fn lower(&self, x: f64, u: f64) -> [f64; 2] {
        self.point(x, Surface::Lower, u)
    }
    fn chord_angle(&self, x: f64) -> Angle {
        self.surfaces.blade().twist(x) + self.pitch
    }
    fn ends(&self) -> ChainEnds {
        ChainEnds { front: EndKind::Point, back: self.back }
    }
    fn sample_radii(&self) -> Vec<f64> {
        self.surfaces.blade().station_radii()
    }
}

/// The parameter of a chain's most forward point (least `y`): the least of 121 samples, refined
/// by golden-section search between its neighbours.
pub(crate) fn forward_parameter(chain: &dyn Fn(f64) -> [f64; 2]) -> f64 {
    const N: usize = 120;
    let i = (0..=N)
        .min_by(|&a, &b| chain(a as f64 / N as f64)[0].total_cmp(&chain(b as f64 / N as f64)[0]))
        .unwrap_or(0);
    let (mut a, mut b) =
        (i.saturating_sub(1) as f64 / N as f64, ((i + 1).min(N)) as f64 / N as f64);
    let g = 0.5 * (5f64.sqrt() - 1.0);
    for _ in 0..40 {
        let (c, d) = (b - g * (b - a), a + g * (b - a));
        if chain(c)[0] <= chain(d)[0] {
            b = d;
        } else {
            a = c;
        }
    }
    let m = 0.5 * (a + b);
    // The ends themselves when the least lies there.
    [0.0, m, 1.0].into_iter().min_by(|&p, &q| chain(p)[0].total_cmp(&chain(q)[0])).unwrap_or(m)
}

/// Sample radii spread over `span`, about one per millimetre (at least 64, at most 1200).
pub(crate) fn span_samples(span: [f64; 2]) -> Vec<f64> {
    let n = ((span[1] - span[0]) / 1e-3).ceil().clamp(64.0, 1200.0) as usize;
    (0..=n).map(|i| span[0] + (span[1] - span[0]) * i as f64 / n as f64).collect()
}

/// Where the two chains of a surface cross a cut `y(x)`, as functions of `x`.
pub(crate) struct CutBound {
    upper: Pchip,
    lower: Pchip,
}

impl CutBound {
    /// Solves the crossings of `cut` on `surface` at `radii` (ascending).
    pub(crate) fn new(
        surface: &dyn SpanSurface,
        radii: &[f64],
        cut: impl Fn(f64) -> f64,
    ) -> Result<Self, MeshError> {
        Self::with_fallback(surface, radii, cut, None)
    }

    /// [`CutBound::new`], with the cut solved afresh by `exact` at a radius where `cut` (an
    /// interpolation of exact cuts) falls outside a chain: near a station where the section's
    /// shape changes fast along the span (a round root blending into an airfoil), the
    /// interpolation may pass a chain's end by more than the guard the exact cut keeps from it.
    pub(crate) fn with_fallback(
        surface: &dyn SpanSurface,
        radii: &[f64],
        cut: impl Fn(f64) -> f64,
        exact: Option<&dyn Fn(f64) -> Result<f64, MeshError>>,
    ) -> Result<Self, MeshError> {
        let mut up = Vec::with_capacity(radii.len());
        let mut lo = Vec::with_capacity(radii.len());
        for &x in radii {
            let mut y = cut(x);
            let mut chains = Self::chains_at(surface, x, y);
            if let (Some(exact), Err(_)) = (exact, &chains) {
                y = exact(x)?;
                chains = Self::chains_at(surface, x, y);
            }
            for (chain, (u0, out)) in chains?.into_iter().zip([&mut up, &mut lo]).enumerate() {
                let at =
                    |u: f64| if chain == 0 { surface.upper(x, u) } else { surface.lower(x, u) };
                out.push(crossing(|v: f64| at(u0 + (1.0 - u0) * v), y) * (1.0 - u0) + u0);
            }
        }
        Ok(CutBound { upper: Pchip::new(radii, &up), lower: Pchip::new(radii, &lo) })
    }

    fn at(&self, x: f64, upper: bool) -> f64 {
        if upper { self.upper.eval(x) } else { self.lower.eval(x) }
    }

    /// Where each chain of `surface` at `x` (upper, lower) is searched for the cut `y`: from
    /// its start when the cut lies aft of it (a nose loop lies ahead of the start), else from
    /// its most forward point; an error when `y` lies outside a chain.
    fn chains_at(surface: &dyn SpanSurface, x: f64, y: f64) -> Result<[f64; 2], MeshError> {
        let mut from = [0.0; 2];
        for (chain, u) in from.iter_mut().enumerate() {
            let at = |u: f64| if chain == 0 { surface.upper(x, u) } else { surface.lower(x, u) };
            let u0 = if at(0.0)[0] < y { 0.0 } else { forward_parameter(&at) };
            let (front, back) = (at(u0)[0], at(1.0)[0]);
            if !(y > front && y < back) {
                return Err(MeshError::Geometry(format!(
                    "a core boundary at r = {x:.4} m (chord-frame y = {:.2} mm) lies outside \
                     the {} inner surface ({:.2} to {:.2} mm)",
                    y * 1e3,
                    if chain == 0 { "upper" } else { "lower" },
                    front * 1e3,
                    back * 1e3
                )));
            }
            *u = u0;
        }
        Ok(from)
    }
}

/// One core: the inner surface between a front bound and a back bound.
pub(crate) struct CoreCell<'a> {
    pub inner: &'a BladeSurface<'a>,
    pub front: CutBound,
    pub back: CutBound,
}

impl CoreCell<'_> {
    fn range(&self, x: f64, upper: bool) -> (f64, f64) {
        (self.front.at(x, upper), self.back.at(x, upper))
    }
}

impl SpanSurface for CoreCell<'_> {
    fn span(&self) -> [f64; 2] {
        self.inner.span
    }
    fn upper(&self, x: f64, v: f64) -> [f64; 2] {
        let (a, b) = self.range(x, true);
        self.inner.upper(x, a + (b - a) * v)
    }
    fn lower(&self, x: f64, v: f64) -> [f64; 2] {
        let (a, b) = self.range(x, false);
        self.inner.lower(x, a + (b - a) * v)
    }
    fn chord_angle(&self, x: f64) -> Angle {
        self.inner.chord_angle(x)
    }
    fn ends(&self) -> ChainEnds {
        ChainEnds { front: EndKind::Segment, back: EndKind::Segment }
    }
    fn sample_radii(&self) -> Vec<f64> {
        self.inner.sample_radii()
    }
}

/// Where the core ends at the thin trailing edge of one section.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CoreEnd {
    /// Radius, m.
    pub r: f64,
    /// Chord-frame `y` of the core's closing face, m.
    pub y: f64,
    /// Its chord fraction from the leading edge.
    pub chord_fraction: f64,
    /// Length of chord behind it that is solid laminate, m.
    pub solid_chord: f64,
}

/// Where the cores close at the leading and at the trailing edge of the section at radius `x`:
/// going from the section's greatest inner depth towards each edge, the first chord-frame `y` where
/// the depth between the inner surfaces (normal to the chord) falls to `min_depth`; never closer
/// than a tenth of `min_depth` to where the two inner chains stop facing each other (each chain is
/// taken from its most forward point on, which drops the loop an inner surface makes at a nose
/// sharper than the laminate is thick, and the bulge of a cambered nose ahead of where the chains
/// join). The depth is bracketed on 481 positions by linear interpolation of 241-point polylines of
/// the chains and solved on the chains themselves, so the cut moves smoothly with the radius. Where
/// the inner surfaces never come that close at the back, the core ends `base_laminate` short of the
/// inner trailing edge.
pub(crate) fn core_cuts(
    inner: &dyn SpanSurface,
    x: f64,
    min_depth: f64,
    base_laminate: f64,
) -> Result<[f64; 2], MeshError> {
    const N: usize = 240;
    let u_up = forward_parameter(&|u| inner.upper(x, u));
    let u_lo = forward_parameter(&|u| inner.lower(x, u));
    let sample = |upper: bool, u0: f64| -> Vec<[f64; 2]> {
        (0..=N)
            .map(|i| {
                let u = u0 + (1.0 - u0) * i as f64 / N as f64;
                if upper { inner.upper(x, u) } else { inner.lower(x, u) }
            })
            .collect()
    };
    let (up, lo) = (sample(true, u_up), sample(false, u_lo));
    // z of a chain at ascending positions, by linear interpolation walking along it.
    let z_along = |chain: &[[f64; 2]], ys: &[f64]| -> Vec<Option<f64>> {
        let mut k = 0;
        ys.iter()
            .map(|&y| {
                while k + 1 < chain.len() && chain[k + 1][0] < y {
                    k += 1;
                }
                let (a, b) = (chain[k], *chain.get(k + 1)?);
                if !(a[0] <= y && y <= b[0]) {
                    return None;
                }
                let t = if b[0] > a[0] { (y - a[0]) / (b[0] - a[0]) } else { 0.0 };
                Some(a[1] + t * (b[1] - a[1]))
            })
            .collect()
    };
    let (y0, y1) = (up[0][0].max(lo[0][0]), up[N][0].min(lo[N][0]));
    let m = 2 * N;
    let ys: Vec<f64> = (0..=m).map(|k| y0 + (y1 - y0) * k as f64 / m as f64).collect();
    let depth: Vec<f64> = z_along(&up, &ys)
        .into_iter()
        .zip(z_along(&lo, &ys))
        .map(|pair| match pair {
            (Some(a), Some(b)) => a - b,
            _ => f64::NEG_INFINITY,
        })
        .collect();
    let (deepest, d_max) = depth
        .iter()
        .copied()
        .enumerate()
        .max_by(|a, b| a.1.total_cmp(&b.1))
        .unwrap_or((0, f64::NEG_INFINITY));
    if !(y1 > y0 && d_max >= min_depth) {
        return Err(MeshError::Settings(format!(
            "at r = {x:.4} m the inner surfaces are at most {:.2} mm apart: no room for a core of \
             at least {:.2} mm (min_core_thickness_mm in [tooling], or the laminate in the plies \
             file)",
            d_max.max(0.0) * 1e3,
            min_depth * 1e3
        )));
    }
    // The exact depth at y, from the chains themselves.
    let z_exact = |upper: bool, y: f64| {
        let u0 = if upper { u_up } else { u_lo };
        let at = |v: f64| {
            let u = u0 + (1.0 - u0) * v;
            if upper { inner.upper(x, u) } else { inner.lower(x, u) }
        };
        at(crossing(at, y))[1]
    };
    let excess = |y: f64| z_exact(true, y) - z_exact(false, y) - min_depth;
    let found = |steps: Vec<(usize, usize)>| {
        steps.into_iter().find(|&(_, j)| depth[j] < min_depth).map(|(i, j)| {
            if depth[j].is_finite() {
                solve_between(excess, ys[i], ys[j], depth[i] - min_depth, depth[j] - min_depth)
            } else {
                ys[i]
            }
        })
    };
    let guard = 0.1 * min_depth;
    let front =
        found((1..=deepest).rev().map(|i| (i, i - 1)).collect()).unwrap_or(y0).max(y0 + guard);
    let back = found((deepest..m).map(|i| (i, i + 1)).collect())
        .unwrap_or(y1 - base_laminate)
        .min(y1 - guard);
    Ok([front, back])
}

/// The root of `f` between `a` and `b` where `f(a) = fa ≥ 0 > f(b) = fb`, by the Illinois
/// regula falsi (Dowell & Jarratt 1971), to 1e-12 of the bracket.
fn solve_between(f: impl Fn(f64) -> f64, a: f64, b: f64, fa: f64, fb: f64) -> f64 {
    let (mut a, mut b, mut fa, mut fb) = (a, b, fa, fb);
    let tol = 1e-12 * (b - a).abs();
    let mut side = 0;
    for _ in 0..60 {
        let y = (a * fb - b * fa) / (fb - fa);
        let fy = f(y);
        if fy == 0.0 || (b - a).abs() <= tol {
            return y;
        }
        if (fy > 0.0) == (fa > 0.0) {
            a = y;
            fa = fy;
            if side == -1 {
                fb *= 0.5;
            }
            side = -1;
        } else {
            b = y;
            fb = fy;
            if side == 1 {
                fa *= 0.5;
            }
            side = 1;
        }
    }
    0.5 * (a + b)
}

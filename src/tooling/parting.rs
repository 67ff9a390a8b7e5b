//! The outer surface split where a two-part mould parts it: at each section's silhouette along
//! the pull, not at its leading and trailing edges.
//!
//! A mould half pulled along `d` leaves a facet with outward normal `n` only when `n · d ≥ 0`
//! (see [`super::evaluate_draft`]). A section turned by twist relative to the pull has its
//! extreme points across the pull (the points a line normal to the pull touches) away from its
//! leading and trailing edges: parted at the edges, the facets between the edge and that extreme
//! point face the wrong way (an undercut of about the turn angle). Parted at the extremes, a
//! section whose contour is a graph on each side of the chord between them (every convex
//! section, and a cambered one whose concave side still faces one pull) draws on both halves
//! whatever its twist (common practice: the parting line of a moulding lies on its silhouette).
//!
//! [`SilhouetteSurface`] re-splits a [`SpanSurface`]'s closed contour at radius x into an upper
//! chain from the front extreme to the back extreme (round by the upper surface) and a lower
//! chain (round by the lower surface), both meeting in points there; the loft then puts its
//! parting lines (`u = 0` and `u = 1`) on the silhouette. The extremes are found at sample radii
//! (every 4 mm or so, at least 48) as the least and greatest of `e · p` over the contour, `e` the
//! direction across the pull in the section plane: 96 samples round the contour, refined by
//! golden-section search between the neighbours of the best; along the span they are
//! interpolated by the monotone cubic of Fritsch and Carlson (1980). A blunt trailing edge's base
//! is part of the contour (a short straight piece), so the back extreme moves along it where the
//! base turns through the pull.

use super::surface::{ChainEnds, EndKind, SpanSurface};
use crate::interp::Pchip;
use crate::units::Angle;

/// Parameter length of a blunt base on the closed contour (each chain has length 1).
const BASE_LENGTH: f64 = 0.02;

/// A surface re-split at its silhouette along a pull (see the module docs).
pub struct SilhouetteSurface<'a> {
    base: &'a dyn SpanSurface,
    /// Contour parameter of the front and back extremes along the span.
    front: Pchip,
    back: Pchip,
    /// Period of the closed contour parameter.
    period: f64,
}

impl<'a> SilhouetteSurface<'a> {
    /// `base` parted for a mould whose upper half is pulled along `(0, −sin ψ, cos ψ)` (rotor
    /// frame): normal to a chord turned by `pull_angle` ψ, so that ψ equal to the chord angle of
    /// a section parts it at its leading and trailing edges.
    pub fn new(base: &'a dyn SpanSurface, pull_angle: Angle) -> Self {
        let period = 2.0 + if base.ends().back == EndKind::Segment { BASE_LENGTH } else { 0.0 };
        let span = base.span();
        let n = ((span[1] - span[0]) / 4e-3).ceil().clamp(48.0, 600.0) as usize;
        let radii: Vec<f64> =
            (0..=n).map(|i| span[0] + (span[1] - span[0]) * i as f64 / n as f64).collect();
        let mut front = Vec::with_capacity(radii.len());
        let mut back = Vec::with_capacity(radii.len());
        for &x in &radii {
            let turn = (pull_angle - base.chord_angle(x)).rad();
            let e = [turn.cos(), turn.sin()];
            let along = |t: f64| {
                let p = contour(base, period, x, t);
                p[0] * e[0] + p[1] * e[1]
            };
            // The front extreme within half a period of the leading edge, the back one within
            // half a period of the trailing edge; each continuous along the span.
            front.push(extreme(&along, -0.5 * period, false));
            back.push(extreme(&along, 1.0 + 0.5 * BASE_LENGTH - 0.5 * period, true));
        }
        SilhouetteSurface {
            base,
            front: Pchip::new(&radii, &front),
            back: Pchip::new(&radii, &back),
            period,
        }
    }

    /// Contour parameters of the front and back ends of the upper chain at radius `x` (0 the
    /// leading edge, 1 the upper chain's back end, negative on the lower chain).
    pub fn extremes(&self, x: f64) -> [f64; 2] {
        [self.front.eval(x), self.back.eval(x)]
    }
}

/// A point of the closed contour at parameter `t` (period `period`): `[0, 1]` the upper chain
/// front to back, then the blunt base (if any), then the lower chain back to front.
fn contour(s: &dyn SpanSurface, period: f64, x: f64, t: f64) -> [f64; 2] {
    let t = t.rem_euclid(period);
    let base = period - 2.0;
    if t <= 1.0 {
        s.upper(x, t)
    } else if t < 1.0 + base {
        let (a, b) = (s.upper(x, 1.0), s.lower(x, 1.0));
        let f = (t - 1.0) / base;
        [a[0] + f * (b[0] - a[0]), a[1] + f * (b[1] - a[1])]
    } else {
        s.lower(x, (period - t).clamp(0.0, 1.0))
    }
}

/// The parameter in `[from, from + 2]` (one chain's length either way of the middle) where
/// `f` is least (or greatest when `greatest`): the best of 96 samples refined by golden-section
/// search between its neighbours.
fn extreme(f: &dyn Fn(f64) -> f64, from: f64, greatest: bool) -> f64 {
    const N: usize = 96;
    let width = 2.0;
    let g = |t: f64| if greatest { -f(t) } else { f(t) };
    let at = |i: usize| from + width * i as f64 / N as f64;
    let i = (0..=N).min_by(|&a, &b| g(at(a)).total_cmp(&g(at(b)))).unwrap_or(N / 2);
    let (mut a, mut b) = (at(i.saturating_sub(1)), at((i + 1).min(N)));
    let phi = 0.5 * (5f64.sqrt() - 1.0);
    for _ in 0..48 {
        let (c, d) = (b - phi * (b - a), a + phi * (b - a));
        if g(c) <= g(d) {
            b = d;
        } else {
            a = c;
        }
    }
    0.5 * (a + b)
}

impl SpanSurface for SilhouetteSurface<'_> {
    fn span(&self) -> [f64; 2] {
        self.base.span()
    }
    fn upper(&self, x: f64, u: f64) -> [f64; 2] {
        let [f, b] = self.extremes(x);
        contour(self.base, self.period, x, f + u * (b - f))
    }
    fn lower(&self, x: f64, u: f64) -> [f64; 2] {
        let [f, b] = self.extremes(x);
        contour(self.base, self.period, x, f - u * (self.period - (b - f)))
    }
    fn chord_angle(&self, x: f64) -> Angle {
        self.base.chord_angle(x)
    }
    fn ends(&self) -> ChainEnds {
        ChainEnds { front: EndKind::Point, back: EndKind::Point }
    }
    fn sample_radii(&self) -> Vec<f64> {
        self.base.sample_radii()
    }
}

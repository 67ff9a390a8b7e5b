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
//! interpolated by the monotone cubic of Fritsch and Carlson (1980). The samples' points do not
//! depend on the pull, so the pulls tried for one surface share them ([`ContourSamples`]). A
//! blunt trailing edge's base is part of the contour (a short straight piece), so the back
//! extreme moves along it where the base turns through the pull. Where the base closes up along
//! the span (a trailing edge that changes kind), its share of the contour parameter shrinks with
//! it (see `SilhouetteSurface::period_at`), so no stretch of a chain stands still at a sharp
//! station.

use super::surface::{ChainEnds, EndKind, SpanSurface};
use crate::interp::Pchip;
use crate::mesh::vec3;
use crate::units::Angle;

/// Parameter length of a blunt base on the closed contour (each chain has length 1).
const BASE_LENGTH: f64 = 0.02;

/// A surface re-split at its silhouette along a pull (see the module docs).
pub struct SilhouetteSurface<'a> {
    base: &'a dyn SpanSurface,
    /// Contour parameter of the front and back extremes along the span.
    front: Pchip,
    back: Pchip,
    /// Period of the closed contour parameter (where the base keeps its parameter length).
    period: f64,
    /// Whether the base closes up somewhere along the span: its parameter length then follows
    /// its length (see [`SilhouetteSurface::period_at`]).
    closing: bool,
}

impl<'a> SilhouetteSurface<'a> {
    /// `base` parted for a mould whose upper half is pulled along `(0, −sin ψ, cos ψ)` (rotor
    /// frame): normal to a chord turned by `pull_angle` ψ, so that ψ equal to the chord angle of
    /// a section parts it at its leading and trailing edges.
    pub fn new(base: &'a dyn SpanSurface, pull_angle: Angle) -> Self {
        Self::over(base, pull_angle, base.span())
    }

    /// As [`SilhouetteSurface::new`], the extremes sampled over the radii `span` only (a module
    /// of a mould split along the span: beyond it the sections may not draw along this pull and
    /// their extremes may jump).
    pub fn over(base: &'a dyn SpanSurface, pull_angle: Angle, span: [f64; 2]) -> Self {
        Self::from_samples(base, &ContourSamples::over(base, span), pull_angle)
    }

    /// `base` parted for the pull of `pull_angle` (as [`SilhouetteSurface::over`] over the
    /// samples' span), `samples` being `base`'s: several pulls tried for one surface share the
    /// contour's samples, and each searches only between them.
    pub(crate) fn from_samples(
        base: &'a dyn SpanSurface,
        samples: &ContourSamples,
        pull_angle: Angle,
    ) -> Self {
        let ContourSamples { period, closing, .. } = *samples;
        let (mut front, mut back) = (Vec::new(), Vec::new());
        for (k, &x) in samples.radii.iter().enumerate() {
            let turn = (pull_angle - base.chord_angle(x)).rad();
            let e = [turn.cos(), turn.sin()];
            let p = samples.periods[k];
            let across = |q: [f64; 2]| q[0] * e[0] + q[1] * e[1];
            let along = |t: f64| across(contour(base, p, x, t));
            let [f, b] = samples.froms[k];
            let dots =
                |points: &[[f64; 2]]| -> Vec<f64> { points.iter().map(|&q| across(q)).collect() };
            // The front extreme within half a period of the leading edge, the back one within
            // half a period of the trailing edge; each continuous along the span.
            front.push(extreme(&along, &dots(samples.front(k)), f, false));
            back.push(extreme(&along, &dots(samples.back(k)), b, true));
        }
        SilhouetteSurface {
            base,
            front: Pchip::new(&samples.radii, &front),
            back: Pchip::new(&samples.radii, &back),
            period,
            closing,
        }
    }

    /// Period of the contour parameter at radius `x`: 2 and the base's parameter length, which
    /// is [`BASE_LENGTH`] unless the base closes up along the span; then it shrinks with the
    /// base below a thousandth of the chord and is nothing where the base has no length, so no
    /// stretch of either chain stands still at a sharp station (its points would coincide).
    fn period_at(&self, x: f64) -> f64 {
        if self.closing { 2.0 + BASE_LENGTH * base_share(self.base, x) } else { self.period }
    }

    /// Contour parameters of the front and back ends of the upper chain at radius `x` (0 the
    /// leading edge, 1 the upper chain's back end, negative on the lower chain).
    pub fn extremes(&self, x: f64) -> [f64; 2] {
        [self.front.eval(x), self.back.eval(x)]
    }
}

/// The contour points of a surface where [`SilhouetteSurface`] searches for the extremes
/// before refining them, which no pull changes: at each sample radius, the samples round the
/// contour from the front search's start and from the back search's (see [`extreme`]).
pub(crate) struct ContourSamples {
    period: f64,
    closing: bool,
    radii: Vec<f64>,
    /// The contour's period at each radius.
    periods: Vec<f64>,
    /// Where the front and the back search start at each radius.
    froms: Vec<[f64; 2]>,
    /// `SAMPLES + 1` points for the front search, then as many for the back, at each radius.
    points: Vec<[f64; 2]>,
}

impl ContourSamples {
    /// The samples of `base` at radii spread over `span` (every 4 mm or so, 48 to 600 steps).
    pub(crate) fn over(base: &dyn SpanSurface, span: [f64; 2]) -> Self {
        let blunt = base.ends().back == EndKind::Segment;
        let period = 2.0 + if blunt { BASE_LENGTH } else { 0.0 };
        let n = ((span[1] - span[0]) / 4e-3).ceil().clamp(48.0, 600.0) as usize;
        let radii: Vec<f64> =
            (0..=n).map(|i| span[0] + (span[1] - span[0]) * i as f64 / n as f64).collect();
        let closing = blunt && radii.iter().any(|&x| base_share(base, x) < 1.0);
        let (mut periods, mut froms) = (Vec::new(), Vec::new());
        let mut points = Vec::with_capacity(radii.len() * 2 * (SAMPLES + 1));
        for &x in &radii {
            let p = if closing { 2.0 + BASE_LENGTH * base_share(base, x) } else { period };
            let back = if closing {
                1.0 + 0.5 * (p - 2.0) - 0.5 * p
            } else {
                1.0 + 0.5 * BASE_LENGTH - 0.5 * p
            };
            for from in [-0.5 * p, back] {
                points.extend((0..=SAMPLES).map(|i| contour(base, p, x, sample_at(from, i))));
            }
            periods.push(p);
            froms.push([-0.5 * p, back]);
        }
        ContourSamples { period, closing, radii, periods, froms, points }
    }

    fn front(&self, k: usize) -> &[[f64; 2]] {
        let m = SAMPLES + 1;
        &self.points[2 * k * m..(2 * k + 1) * m]
    }

    fn back(&self, k: usize) -> &[[f64; 2]] {
        let m = SAMPLES + 1;
        &self.points[(2 * k + 1) * m..(2 * k + 2) * m]
    }
}

/// The samples of [`extreme`]'s search: this many steps over one chain's length either way.
const SAMPLES: usize = 96;

/// The parameter of sample `i` of a search from `from`.
fn sample_at(from: f64, i: usize) -> f64 {
    from + 2.0 * i as f64 / SAMPLES as f64
}

/// The share of [`BASE_LENGTH`] the base takes at radius `x`: its length over a thousandth of
/// the chord, at most 1.
fn base_share(s: &dyn SpanSurface, x: f64) -> f64 {
    let (a, b) = (s.upper(x, 1.0), s.lower(x, 1.0));
    let chord = vec3::dist_2d(s.upper(x, 0.0), a).max(f64::MIN_POSITIVE);
    (vec3::dist_2d(a, b) / (1e-3 * chord)).min(1.0)
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
/// `f` is least (or greatest when `greatest`): the best of the 96 steps' samples (`samples`, `f`
/// at [`sample_at`], as [`ContourSamples`] keeps them) refined by golden-section search between
/// its neighbours. A golden-section point that falls on the bits of one evaluated before takes
/// its value (the search's points are worked out afresh each step, as they always were, so the
/// result is the same to the bit).
fn extreme(f: &dyn Fn(f64) -> f64, samples: &[f64], from: f64, greatest: bool) -> f64 {
    const N: usize = SAMPLES;
    let g = |t: f64| if greatest { -f(t) } else { f(t) };
    let at = |i: usize| sample_at(from, i);
    let sample = |i: usize| if greatest { -samples[i] } else { samples[i] };
    let i = (0..=N).min_by(|&a, &b| sample(a).total_cmp(&sample(b))).unwrap_or(N / 2);
    let (mut a, mut b) = (at(i.saturating_sub(1)), at((i + 1).min(N)));
    let phi = 0.5 * (5f64.sqrt() - 1.0);
    // The last two points evaluated, with their values.
    let mut seen = [(f64::NAN, 0.0); 2];
    let mut value = |t: f64| {
        if let Some(&(_, v)) = seen.iter().find(|(s, _)| s.to_bits() == t.to_bits()) {
            return v;
        }
        let v = g(t);
        seen = [seen[1], (t, v)];
        v
    };
    for _ in 0..48 {
        let (c, d) = (b - phi * (b - a), a + phi * (b - a));
        let (gc, gd) = (value(c), value(d));
        if gc <= gd {
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
        contour(self.base, self.period_at(x), x, f + u * (b - f))
    }
    fn lower(&self, x: f64, u: f64) -> [f64; 2] {
        let [f, b] = self.extremes(x);
        let period = self.period_at(x);
        contour(self.base, period, x, f - u * (period - (b - f)))
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

/// Steps of the pull angle tried by [`span_modules`] over half a turn (0.5° apart).
const PULL_STEPS: usize = 360;

/// A stretch of the span moulded by one two-part module pulled along one direction: radii
/// `x_range` (m), the pull's chord angle ψ (see [`SilhouetteSurface::new`]) and the width of
/// the window of pulls that draw every sampled section of the stretch.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SpanModule {
    /// Radii where the module starts and ends, m.
    pub x_range: [f64; 2],
    /// The pull's chord angle ψ.
    pub pull_angle: Angle,
    /// Width of the window of pull angles that draw every sampled section of the module.
    pub window: Angle,
}

/// Which pull angles ψ (index `i` for ψ = −90° + 0.5° i, half a turn: ψ and ψ + 180° are the
/// same pair of pulls) part the section at radius `x` into two chains that draw, each on its own
/// half: the contour (`samples` points) must be monotone across the pull, so that the product of
/// the direction across the pull with the contour points has exactly one least and one greatest
/// value round the contour (a closed polygon whose projection on a line folds nowhere).
fn drawable_pulls(s: &dyn SpanSurface, x: f64, samples: usize) -> Vec<bool> {
    // Cosine spacing gathers points at the edges, where the contour turns fastest.
    let u: Vec<f64> = (0..=samples)
        .map(|i| 0.5 * (1.0 - (std::f64::consts::PI * i as f64 / samples as f64).cos()))
        .collect();
    let poly = super::surface::contour_polygon(s, x, &u);
    let scale = poly.iter().map(|p| p[0].abs().max(p[1].abs())).fold(0.0, f64::max);
    let flat = 1e-12 * scale.max(f64::MIN_POSITIVE);
    let phi = s.chord_angle(x).rad();
    (0..PULL_STEPS)
        .map(|i| {
            let psi = (-90.0 + 180.0 * i as f64 / PULL_STEPS as f64).to_radians();
            let e = [(psi - phi).cos(), (psi - phi).sin()];
            let along: Vec<f64> = poly.iter().map(|p| p[0] * e[0] + p[1] * e[1]).collect();
            let n = along.len();
            let mut turns = 0;
            let mut last = 0.0f64;
            // Twice round: the sign of the first non-flat step is known on the second lap.
            for k in 0..2 * n {
                let d = along[(k + 1) % n] - along[k % n];
                if d.abs() <= flat {
                    continue;
                }
                if last != 0.0 && d.signum() != last.signum() && k >= n {
                    turns += 1;
                }
                last = d;
            }
            turns <= 2
        })
        .collect()
}

/// The centre of the longest run of `true` in a cyclic mask, and the run's length.
fn widest_run(mask: &[bool]) -> Option<(usize, usize)> {
    let n = mask.len();
    if mask.iter().all(|&m| m) {
        return Some((n / 2, n));
    }
    let start = mask.iter().position(|&m| !m)?;
    let (mut best, mut run, mut from) = (None::<(usize, usize)>, 0, 0);
    for k in 1..=n {
        let i = (start + k) % n;
        if mask[i] {
            if run == 0 {
                from = i;
            }
            run += 1;
            if best.is_none_or(|b| run > b.1) {
                best = Some(((from + run / 2) % n, run));
            }
        } else {
            run = 0;
        }
    }
    best
}

/// The fewest span-wise modules of a mould whose halves are pulled normal to the pitch axis
/// (each parted at its own silhouette, [`SilhouetteSurface`]) for which every section of the
/// surface draws.
///
/// The search: at `samples + 1` radii evenly over the span, the set of pull angles ψ (0.5°
/// apart over half a turn) at which the section is monotone across the pull is found
/// (`drawable_pulls`); a section is then undercut-free on both halves, since a facet's normal
/// seen in the section plane is the contour's normal (the span-wise slope only adds a part along
/// the pitch axis, normal to every such pull). Walking from the root, a module grows while the
/// intersection of its sections' sets is not empty and ends, halfway to the next sample, where
/// it would become empty; a greedy cover of an interval by runs of this kind uses the fewest runs
/// (an exchange argument: any cover's k-th run ends no further than the greedy k-th). Each
/// module takes the middle of the widest window left in its intersection; with the fewest
/// modules known, the search is repeated with every section's set shrunk by one more step either
/// side while the count stays the same, so the module ends move to where each module keeps the
/// most draft to spare on its worst section. `prefer`, when it draws every section of one module spanning the whole span,
/// is kept (one module: the mould of two halves chosen elsewhere). A section that no pull draws
/// (a contour folded across every direction) cannot be helped by span-wise splits: an error
/// names its radius.
pub fn span_modules(
    s: &dyn SpanSurface,
    span: [f64; 2],
    samples: usize,
    prefer: Option<Angle>,
) -> Result<Vec<SpanModule>, crate::mesh::MeshError> {
    let samples = samples.max(2);
    let at = |i: usize| span[0] + (span[1] - span[0]) * i as f64 / samples as f64;
    let sets: Vec<Vec<bool>> = (0..=samples).map(|i| drawable_pulls(s, at(i), 400)).collect();
    if let Some(i) = sets.iter().position(|m| !m.contains(&true)) {
        return Err(crate::mesh::MeshError::Geometry(format!(
            "the section at radius {:.1} mm folds across every pull normal to the pitch axis: \
             no split of the mould along the span lets it draw",
            at(i) * 1e3
        )));
    }
    let step = 180.0 / PULL_STEPS as f64;
    let index_of =
        |a: Angle| ((a.deg() + 90.0).rem_euclid(180.0) / step).round() as usize % PULL_STEPS;
    // The fewest modules with no draft to spare, then the same count with each section's set
    // shrunk by as many steps either side as it allows: the pulls move off the windows' edges,
    // where a section's extreme across the pull is ill-defined.
    let fewest = cover(&sets, &at, 0, s);
    let mut modules = fewest.clone();
    for spare in 1..=PULL_STEPS / 8 {
        match cover(&sets, &at, spare, s) {
            Some(m) if fewest.as_ref().is_some_and(|f| m.len() == f.len()) => modules = Some(m),
            _ => break,
        }
    }
    let mut modules = modules.ok_or_else(|| {
        crate::mesh::MeshError::Geometry("no pull draws the sections of the span".into())
    })?;
    if let (Some(p), [only]) = (prefer, modules.as_mut_slice()) {
        let all = sets.iter().fold(vec![true; PULL_STEPS], |acc, m| {
            acc.iter().zip(m).map(|(&a, &b)| a && b).collect()
        });
        if all[index_of(p)] {
            only.pull_angle = p;
        }
    }
    Ok(modules)
}

/// `mask` (cyclic) less `spare` steps at either edge of each run.
fn erode(mask: &[bool], spare: usize) -> Vec<bool> {
    let n = mask.len();
    (0..n).map(|i| (0..=2 * spare).all(|k| mask[(i + n + k - spare) % n])).collect()
}

/// The greedy cover of the sampled span (see [`span_modules`]) with each section's set of
/// drawing pulls shrunk by `spare` steps; `None` when a shrunk set is empty.
fn cover(
    sets: &[Vec<bool>],
    at: &dyn Fn(usize) -> f64,
    spare: usize,
    s: &dyn SpanSurface,
) -> Option<Vec<SpanModule>> {
    let step = 180.0 / PULL_STEPS as f64;
    let sets: Vec<Vec<bool>> = sets.iter().map(|m| erode(m, spare)).collect();
    if sets.iter().any(|m| !m.contains(&true)) {
        return None;
    }
    let finish = |cur: &[bool], from: f64, to: f64, modules: &mut Vec<SpanModule>| {
        let (centre, run) = widest_run(cur).unwrap_or((0, 0));
        modules.push(SpanModule {
            x_range: [from, to],
            pull_angle: Angle::from_deg(-90.0 + step * centre as f64),
            window: Angle::from_deg(step * (run + 2 * spare) as f64),
        });
    };
    let mut modules = Vec::new();
    let mut cur = sets[0].clone();
    let mut from = at(0);
    for (i, set) in sets.iter().enumerate().skip(1) {
        let next: Vec<bool> = cur.iter().zip(set).map(|(&a, &b)| a && b).collect();
        if next.contains(&true) {
            cur = next;
            continue;
        }
        let to = 0.5 * (at(i - 1) + at(i));
        finish(&cur, from, to, &mut modules);
        from = to;
        let mid = erode(&drawable_pulls(s, to, 400), spare);
        let both: Vec<bool> = mid.iter().zip(set).map(|(&a, &b)| a && b).collect();
        cur = if both.contains(&true) { both } else { set.clone() };
    }
    finish(&cur, from, at(sets.len() - 1), &mut modules);
    Some(modules)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::tooling::FnSurface;
    use crate::tooling::surface::ChainEnds;

    /// The extremes as first written: every sample evaluated by the pull's own search.
    fn extreme_evaluated(f: &dyn Fn(f64) -> f64, from: f64, greatest: bool) -> f64 {
        let samples: Vec<f64> = (0..=SAMPLES).map(|i| f(sample_at(from, i))).collect();
        extreme(f, &samples, from, greatest)
    }

    /// The front and back extremes at each sample radius, each pull searching its own samples.
    fn extremes_evaluated(base: &dyn SpanSurface, pull: Angle) -> Vec<[f64; 2]> {
        let s = ContourSamples::over(base, base.span());
        (0..s.radii.len())
            .map(|k| {
                let (x, p) = (s.radii[k], s.periods[k]);
                let turn = (pull - base.chord_angle(x)).rad();
                let e = [turn.cos(), turn.sin()];
                let along = |t: f64| {
                    let q = contour(base, p, x, t);
                    q[0] * e[0] + q[1] * e[1]
                };
                let [f, b] = s.froms[k];
                [extreme_evaluated(&along, f, false), extreme_evaluated(&along, b, true)]
            })
            .collect()
    }

    #[test]
    fn pulls_that_share_the_contours_samples_find_the_extremes_to_the_bit() {
        // A twisted NACA 0012-like section (Abbott & von Doenhoff §6.4 thickness form, from
        // memory), its trailing edge blunt at the root and closing to a point towards the tip
        // (so the base's share of the contour shrinks), and a sharp-edged one.
        let yt = |x: f64| {
            0.6 * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
                - 0.1036 * x.powi(4))
        };
        let base = |r: f64| 0.004 * (1.0 - r).max(0.0);
        let blunt = FnSurface {
            span: [0.2, 1.0],
            upper: move |r: f64, u: f64| [u - 0.25, yt(u) + base(r) * u],
            lower: move |r: f64, u: f64| [u - 0.25, -yt(u) - base(r) * u],
            chord_angle: |r: f64| Angle::from_deg(40.0 - 30.0 * r),
            ends: ChainEnds { front: EndKind::Point, back: EndKind::Segment },
        };
        let sharp = FnSurface {
            span: [0.1, 0.5],
            upper: move |_r: f64, u: f64| [u - 0.25, yt(u) * (1.0 - u)],
            lower: move |_r: f64, u: f64| [u - 0.25, -0.5 * yt(u) * (1.0 - u)],
            chord_angle: |r: f64| Angle::from_deg(25.0 - 20.0 * r),
            ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
        };
        let mut compared = 0;
        for surface in [&blunt as &dyn SpanSurface, &sharp] {
            let samples = ContourSamples::over(surface, surface.span());
            assert!(surface.ends().back == EndKind::Point || samples.closing);
            for pull in [-20.0, 0.0, 17.5, 33.0, 85.0] {
                let pull = Angle::from_deg(pull);
                let shared = SilhouetteSurface::from_samples(surface, &samples, pull);
                for (k, want) in extremes_evaluated(surface, pull).iter().enumerate() {
                    let got = shared.extremes(samples.radii[k]);
                    assert_eq!(got.map(f64::to_bits), want.map(f64::to_bits), "{pull:?} {k}");
                    compared += 1;
                }
            }
        }
        assert!(compared > 1000, "{compared}");
    }
}

//! The blade's surfaces as continuous functions of radius and a chordwise parameter, for the
//! tooling: the outer mould line and the inner laminate surface.
//!
//! **Outer mould line.** The section solver's interpolation made continuous: each station's
//! outline is the natural cubic spline in arc length that [`Outline::resample`] uses; the point of
//! a surface at parameter `u ∈ [0, 1]` is the point at normalised arc length `u` from the leading
//! edge along that surface, blended linearly in radius between the neighbouring stations, scaled
//! by the chord and moved to the pitch axis (chord, twist and pitch axis by the monotone cubic of
//! the span interpolation). [`Blade::outline`] at `r` is this surface sampled at the clustered
//! stations, so geometry and stiffness describe one blade. Beyond the first and the last station
//! the end section is held (a prism): the spherical end trims need the surface a little past the
//! stations, since a sphere about the rotor centre meets the trailing edge inboard of the pitch
//! axis.
//!
//! **Inner surface.** The outer point moved inward along the unit normal of the section contour
//! (in the section plane, as the section solver offsets its walls) by the local laminate
//! thickness from the ply schedule. A ply edge is a step in thickness; here each edge is ramped
//! by a smooth step (`3s² − 2s³`) centred on the edge, along the chord at chordwise edges and
//! along the span at spanwise ones, so the surface is continuous and the laminate volume is kept
//! (the ramp is antisymmetric about the edge). A ramp is [`PLY_DROP_TAPER`] times the ply's
//! thickness long for a fibre ply and [`CORE_EDGE_TAPER`] times for an isotropic layer (a foam or
//! metal sheet, whose edge is chamfered), and never longer than half the ply's own extent, so the
//! two ramps of a narrow ply do not overlap. Chordwise positions are wrapped round the leading
//! edge (`w = +x/c` on the upper surface, `−x/c` on the lower), so a ply that covers both surfaces
//! from the leading edge has no edge there. Radii outside the stations take the end station's
//! laminate.
//!
//! Chord frame as everywhere: `y` along the chord from the leading edge towards the trailing
//! edge, `z` towards the upper surface, origin on the pitch axis, metres.

use super::coverage::Surface;
use super::{Blade, ResolvedPly};
use crate::interp::{CubicSpline, KnotIndex, OnSegment};
use crate::project::Region;
use std::cell::RefCell;
use std::sync::Arc;
use std::sync::atomic::{AtomicU64, Ordering};

/// Ply drops are ramped over this many ply thicknesses (a 1:20 taper, common practice for
/// dropped plies in moulded laminates).
pub const PLY_DROP_TAPER: f64 = 20.0;

/// The edge of an isotropic layer (foam or metal sheet) is ramped over this many thicknesses
/// (a chamfer of about 18°, our choice).
pub const CORE_EDGE_TAPER: f64 = 3.0;

/// One station's outline as a spline in arc length.
#[derive(Debug, Clone)]
pub(crate) struct StationCurve {
    x: CubicSpline,
    y: CubicSpline,
    /// The table of the two splines' knots (one arc length), to find a point's segment.
    knots: KnotIndex,
    s_le: f64,
    s_end: f64,
    blunt: bool,
}

impl StationCurve {
    fn new(outline: &crate::airfoil::Outline) -> Self {
        // As `Outline::resample`: one curve from the upper trailing edge over the leading edge to
        // the lower trailing edge.
        let mut pts: Vec<[f64; 2]> = outline.upper.iter().rev().copied().collect();
        pts.extend(outline.lower.iter().skip(1).copied());
        let mut s = vec![0.0];
        for w in pts.windows(2) {
            let last = s[s.len() - 1];
            s.push(last + (w[0][0] - w[1][0]).hypot(w[0][1] - w[1][1]));
        }
        StationCurve {
            knots: KnotIndex::new(&s),
            x: CubicSpline::natural(&s, &pts.iter().map(|p| p[0]).collect::<Vec<_>>()),
            y: CubicSpline::natural(&s, &pts.iter().map(|p| p[1]).collect::<Vec<_>>()),
            s_le: s[outline.upper.len() - 1],
            s_end: s[s.len() - 1],
            blunt: outline.blunt_te(),
        }
    }

    /// Arc length at `u` on `surface` and its rate `ds/du`.
    fn arc(&self, surface: Surface, u: f64) -> (f64, f64) {
        match surface {
            Surface::Upper => (self.s_le * (1.0 - u), -self.s_le),
            Surface::Lower => (self.s_le + (self.s_end - self.s_le) * u, self.s_end - self.s_le),
        }
    }

    /// Where the point at `u` on `surface` falls on the splines' segments, and `ds/du`.
    fn place(&self, surface: Surface, u: f64) -> (OnSegment, f64) {
        let (s, ds) = self.arc(surface, u);
        (self.x.on_segment(self.x.segment_in(&self.knots, s), s), ds)
    }

    /// Point (chord fractions) and its derivative in `u`. The two coordinates share their knots
    /// (both splines are built on one arc length), so the segment, and the point's place on it,
    /// are found once for all four values.
    fn point(&self, surface: Surface, u: f64) -> ([f64; 2], [f64; 2]) {
        let (at, ds) = self.place(surface, u);
        let ([x, x_s], [y, y_s]) = (self.x.value_slope_at(&at), self.y.value_slope_at(&at));
        ([x, y], [x_s * ds, y_s * ds])
    }

    /// [`StationCurve::point`] with the second derivative in `u`.
    fn point2(&self, surface: Surface, u: f64) -> ([f64; 2], [f64; 2], [f64; 2]) {
        let (at, ds) = self.place(surface, u);
        let ([x, x_s, x_ss], [y, y_s, y_ss]) = (self.x.jet_at(&at), self.y.jet_at(&at));
        let dd = ds * ds;
        ([x, y], [x_s * ds, y_s * ds], [x_ss * dd, y_ss * dd])
    }
}

/// A smooth step from 0 (at `xi ≤ -1`) to 1 (at `xi ≥ 1`): `3s² − 2s³` with `s = (xi + 1) / 2`.
pub(crate) fn smooth_step(xi: f64) -> f64 {
    if xi <= -1.0 {
        0.0
    } else if xi >= 1.0 {
        1.0
    } else {
        let s = 0.5 * (xi + 1.0);
        s * s * (3.0 - 2.0 * s)
    }
}

/// A ply's coverage with ramped edges.
#[derive(Debug, Clone)]
struct SmoothPly {
    thickness: f64,
    /// Ramp length over thickness.
    taper: f64,
    /// Intervals of the wrapped chordwise coordinate; an end at ±1 (a trailing edge) or a joined
    /// leading edge has no ramp (`None`).
    wrap: Vec<[Option<f64>; 2]>,
    /// Span range; `None` at an end of the blade (no ramp there).
    span: [Option<f64>; 2],
    /// The span range covered, m.
    covered: [f64; 2],
    /// The web of a web ply.
    web: Option<String>,
}

const EDGE_EPS: f64 = 1e-9;

impl SmoothPly {
    fn new(p: &ResolvedPly, span: [f64; 2]) -> Self {
        let s = &p.spec;
        let edge = |v: f64, end: f64| ((v - end).abs() > EDGE_EPS).then_some(v);
        let upper = [edge(s.from, 0.0).or(Some(0.0)), edge(s.to, 1.0)];
        let lower = [edge(-s.to, -1.0), edge(-s.from, 0.0).or(Some(0.0))];
        let wrap = match &s.region {
            Region::Upper => vec![upper],
            Region::Lower => vec![lower],
            Region::Both if s.from <= EDGE_EPS => vec![[lower[0], upper[1]]],
            Region::Both => vec![lower, upper],
            Region::Web(_) => Vec::new(),
        };
        let web = match &s.region {
            Region::Web(w) => Some(w.clone()),
            _ => None,
        };
        let taper = match p.material.kind {
            crate::material::LaminaKind::Orthotropic => PLY_DROP_TAPER,
            crate::material::LaminaKind::Isotropic => CORE_EDGE_TAPER,
        };
        SmoothPly {
            thickness: p.material.ply_thickness,
            taper,
            wrap,
            span: [edge(s.r_start, span[0]), edge(s.r_end, span[1])],
            covered: [s.r_start, s.r_end],
            web,
        }
    }

    /// Half the length of a ramp, capped at a quarter of the extent `[a, b]` it ramps.
    fn half_ramp(&self, length: f64, extent: f64) -> f64 {
        (0.5 * self.taper * self.thickness / length).min(0.25 * extent)
    }

    /// Fraction of the ply present at radius `r` (its span ramps), the span covered being
    /// `[r_start, r_end]` (ends of the blade included, where nothing is ramped).
    fn span_factor(&self, r: f64, covered: [f64; 2]) -> f64 {
        let h = self.half_ramp(1.0, covered[1] - covered[0]);
        let lo = self.span[0].map_or(1.0, |a| smooth_step((r - a) / h));
        let hi = self.span[1].map_or(1.0, |b| smooth_step((b - r) / h));
        lo * hi
    }

    /// The half ramps of the chordwise intervals on a section of chord `chord`, in order.
    fn chord_half_ramps(&self, chord: f64) -> impl Iterator<Item = f64> + '_ {
        self.wrap.iter().map(move |[a, b]| {
            let extent = b.unwrap_or(1.0) - a.unwrap_or(-1.0);
            self.half_ramp(chord, extent)
        })
    }

    /// Fraction of the ply present at wrapped coordinate `w`, the intervals' half ramps `h`
    /// being those of [`SmoothPly::chord_half_ramps`] at the section's chord.
    fn chord_factor(&self, w: f64, h: &[f64]) -> f64 {
        self.wrap
            .iter()
            .zip(h)
            .map(|([a, b], &h)| {
                let lo = a.map_or(1.0, |a| smooth_step((w - a) / h));
                let hi = b.map_or(1.0, |b| smooth_step((b - w) / h));
                lo * hi
            })
            .sum()
    }
}

/// The quantities of one radius shared by every point of the surfaces there (see
/// [`BladeSurfaces::at_radius`]).
#[derive(Debug, Clone, Copy)]
pub(crate) struct AtRadius {
    /// Radius, m.
    pub(crate) r: f64,
    bracket: (usize, usize, f64),
    /// Chord, m.
    pub(crate) chord: f64,
    pitch_axis: f64,
}

/// The rates along the span of the quantities of [`AtRadius`] (see
/// [`BladeSurfaces::radius_rates`]).
#[derive(Debug, Clone, Copy)]
pub(crate) struct RadiusRates {
    /// Chord, m/m.
    pub(crate) chord: f64,
    /// Twist, rad/m.
    pub(crate) twist: f64,
    pitch_axis: f64,
    /// Rate of the stations' blending weight, 1/m.
    blend: f64,
}

/// The outer mould line's point in the section plane with its first derivatives (see
/// [`BladeSurfaces::outer_jet`]): `p`, `n` and `x` as [`BladeSurfaces::outer_with_normal_at`]
/// gives them, and their rates along the chordwise parameter `u` (`_u`) and the radius (`_r`).
#[derive(Debug, Clone, Copy)]
pub(crate) struct OuterJet {
    pub(crate) p: [f64; 2],
    pub(crate) n: [f64; 2],
    pub(crate) x: f64,
    pub(crate) p_u: [f64; 2],
    pub(crate) p_r: [f64; 2],
    pub(crate) n_u: [f64; 2],
    pub(crate) n_r: [f64; 2],
    pub(crate) x_u: f64,
    pub(crate) x_r: f64,
}

/// The blade's outer mould line and inner laminate surface, continuous in radius and chordwise
/// parameter (see the module docs).
#[derive(Debug, Clone)]
pub struct BladeSurfaces<'a> {
    blade: &'a Blade,
    curves: Arc<[StationCurve]>,
    surface_plies: Vec<SmoothPly>,
    web_plies: Vec<SmoothPly>,
    /// Names these surfaces in the memo of the last radius (see [`RadiusMemo`]); a clone
    /// shares it, having the same numbers.
    id: u64,
}

/// Numbers the surfaces for [`RadiusMemo`].
static NEXT_ID: AtomicU64 = AtomicU64::new(1);

/// What every point of the surfaces at one radius shares, kept for the last radius asked on
/// each thread: the loft and the core cells ask for whole rings of points at one radius, each
/// point of which would otherwise interpolate chord, pitch axis and every ply's span ramps along
/// the span again. The numbers are those worked out per point, bit for bit (the same
/// expressions, only done once).
struct RadiusMemo {
    /// The surfaces' `id` (0: empty) and the radius's bits.
    key: (u64, u64),
    at: AtRadius,
    /// The radius clamped to the stations and the chord there (the laminate's radius).
    clamped: f64,
    chord_clamped: f64,
    /// Each surface ply's thickness times its span factor at the clamped radius.
    present: Vec<f64>,
    /// Each surface ply's chordwise half ramps at the chord there, one per interval, in order.
    half_ramps: Vec<f64>,
}

thread_local! {
    static MEMO: RefCell<RadiusMemo> = const {
        RefCell::new(RadiusMemo {
            key: (0, 0),
            at: AtRadius { r: 0.0, bracket: (0, 0, 0.0), chord: 0.0, pitch_axis: 0.0 },
            clamped: 0.0,
            chord_clamped: 0.0,
            present: Vec::new(),
            half_ramps: Vec::new(),
        })
    };
}

impl Blade {
    /// The blade's surfaces for lofting tooling (see [`BladeSurfaces`]).
    pub fn surfaces(&self) -> BladeSurfaces<'_> {
        let span = [self.root_radius(), self.tip_radius()];
        let plies: Vec<SmoothPly> = self.plies.iter().map(|p| SmoothPly::new(p, span)).collect();
        let (web_plies, surface_plies) = plies.into_iter().partition(|p| p.web.is_some());
        let curves = self
            .station_curves
            .get_or_init(|| self.stations.iter().map(|s| StationCurve::new(&s.outline)).collect());
        BladeSurfaces {
            blade: self,
            curves: Arc::clone(curves),
            surface_plies,
            web_plies,
            id: NEXT_ID.fetch_add(1, Ordering::Relaxed),
        }
    }
}

impl BladeSurfaces<'_> {
    /// The blade.
    pub fn blade(&self) -> &Blade {
        self.blade
    }

    /// Whether each station's trailing edge is blunt (a base of more than 1e-6 chord), root first.
    pub fn blunt_trailing_edges(&self) -> Vec<bool> {
        self.curves.iter().map(|c| c.blunt).collect()
    }

    fn bracket(&self, r: f64) -> (usize, usize, f64) {
        let st = &self.blade.stations;
        let n = st.len();
        if n == 1 {
            return (0, 0, 0.0);
        }
        let i = st.partition_point(|s| s.r <= r).clamp(1, n - 1);
        let (a, b) = (st[i - 1].r, st[i].r);
        (i - 1, i, ((r - a) / (b - a)).clamp(0.0, 1.0))
    }

    /// What a point at radius `r` needs that does not depend on the chordwise parameter: the
    /// stations blended and the chord and pitch axis there. Worked out once, it serves every
    /// point of that radius (see [`BladeSurfaces::outer_with_normal_at`]).
    pub(crate) fn at_radius(&self, r: f64) -> AtRadius {
        AtRadius {
            r,
            bracket: self.bracket(r),
            chord: self.blade.chord(r),
            pitch_axis: self.blade.pitch_axis_frac(r),
        }
    }

    /// The span rates at the radius of `at`. Radii within `guard` of a station are `None`: the
    /// stations are blended linearly, so the surface's slope along the span jumps there.
    pub(crate) fn radius_rates(&self, at: &AtRadius, guard: f64) -> Option<RadiusRates> {
        let st = &self.blade.stations;
        let k = st.partition_point(|s| s.r < at.r);
        let near = |i: usize| st.get(i).is_some_and(|s| (s.r - at.r).abs() <= guard);
        if near(k) || (k > 0 && near(k - 1)) {
            return None;
        }
        let (i, j, w) = at.bracket;
        let blend = if i != j && w > 0.0 && w < 1.0 { 1.0 / (st[j].r - st[i].r) } else { 0.0 };
        let [chord, twist, pitch_axis] = self.blade.loft.rates(at.r);
        Some(RadiusRates { chord, twist, pitch_axis, blend })
    }

    /// [`BladeSurfaces::outer_with_normal_at`] (the same numbers, bit for bit) with the first
    /// derivatives of the point, the normal and the chord fraction along `u` and the radius
    /// (the curves' splines differentiated; the normal's rate is the tangent's rate less its
    /// part along the tangent, turned a quarter turn, over the tangent's length).
    pub(crate) fn outer_jet(
        &self,
        at: &AtRadius,
        rates: &RadiusRates,
        surface: Surface,
        u: f64,
    ) -> OuterJet {
        let (i, j, w) = at.bracket;
        let (pa, da, sa) = self.curves[i].point2(surface, u);
        let (pb, db, sb) = self.curves[j].point2(surface, u);
        let mix = |a: [f64; 2], b: [f64; 2]| [a[0] + w * (b[0] - a[0]), a[1] + w * (b[1] - a[1])];
        let rate =
            |a: [f64; 2], b: [f64; 2]| [rates.blend * (b[0] - a[0]), rates.blend * (b[1] - a[1])];
        let (p, d, dd) =
            if w == 0.0 { (pa, da, sa) } else { (mix(pa, pb), mix(da, db), mix(sa, sb)) };
        let (p_r, d_r) = (rate(pa, pb), rate(da, db));
        let len = d[0].hypot(d[1]);
        let turn = |v: [f64; 2]| match surface {
            Surface::Upper => [-v[1], v[0]],
            Surface::Lower => [v[1], -v[0]],
        };
        let (n, n_u, n_r) = if len > 0.0 {
            let n = match surface {
                Surface::Upper => [-d[1] / len, d[0] / len],
                Surface::Lower => [d[1] / len, -d[0] / len],
            };
            let rate_of = |v: [f64; 2]| {
                let t = turn(v);
                let along = (d[0] * v[0] + d[1] * v[1]) / (len * len);
                [t[0] / len - along * n[0], t[1] / len - along * n[1]]
            };
            (n, rate_of(dd), rate_of(d_r))
        } else {
            ([-1.0, 0.0], [0.0; 2], [0.0; 2])
        };
        let c = at.chord;
        let (c_r, pa_r) = (rates.chord, rates.pitch_axis);
        OuterJet {
            p: [(p[0] - at.pitch_axis) * c, p[1] * c],
            n,
            x: p[0],
            p_u: [d[0] * c, d[1] * c],
            p_r: [(p_r[0] - pa_r) * c + (p[0] - at.pitch_axis) * c_r, p_r[1] * c + p[1] * c_r],
            n_u,
            n_r,
            x_u: d[0],
            x_r: p_r[0],
        }
    }

    /// Where the outer mould line leans most from the span direction, as `(r, factor)`:
    /// `factor` is the surface's area over that of the strips the section sees at radius `r`
    /// (strips cut square to the span, `dr` by `ds`), the mean round the contour by arc length
    /// of `√(1 + s²)`, where `s` is the rate at which the surface moves along its normal per
    /// unit radius: twist turns it by `φ' (n·Jp)` (`J` a quarter turn) and the stations'
    /// blending, chord and pitch axis move it by `n·∂p/∂r`. With `∂P/∂r = e_x + a t + s n`
    /// and the unit tangent `t`, `|∂P/∂r × t| = √(1 + s²)` (the area element of a surface
    /// swept along the span; do Carmo, *Differential Geometry of Curves and Surfaces*, §2-8,
    /// from memory). For a laminate of even thickness it is the ratio of its mass to the
    /// section's. Sampled at nine radii between each pair of stations (the blending is linear,
    /// so its rate jumps at a station) and 200 arcs of each surface.
    pub(crate) fn greatest_lean(&self) -> Option<(f64, f64)> {
        const N: usize = 200;
        let st = &self.blade.stations;
        let mut best: Option<(f64, f64)> = None;
        for pair in st.windows(2) {
            let (a, b) = (pair[0].r, pair[1].r);
            for k in 1..10 {
                let r = a + (b - a) * k as f64 / 10.0;
                let at = self.at_radius(r);
                let Some(rates) = self.radius_rates(&at, 1e-9 * (b - a)) else { continue };
                let (mut area, mut length) = (0.0, 0.0);
                for surface in [Surface::Upper, Surface::Lower] {
                    for i in 0..N {
                        // The middle of each arc, weighted by its length.
                        let u = (i as f64 + 0.5) / N as f64;
                        let jet = self.outer_jet(&at, &rates, surface, u);
                        let (p, n) = (jet.p, jet.n);
                        let turned = n[0] * -p[1] + n[1] * p[0];
                        let s = n[0] * jet.p_r[0] + n[1] * jet.p_r[1] + rates.twist * turned;
                        let ds = jet.p_u[0].hypot(jet.p_u[1]) / N as f64;
                        area += (1.0 + s * s).sqrt() * ds;
                        length += ds;
                    }
                }
                let factor = area / length;
                if factor.is_finite() && best.is_none_or(|(_, f)| factor > f) {
                    best = Some((r, factor));
                }
            }
        }
        best
    }

    /// The outer point in chord fractions and its derivative in `u`, between the stations
    /// `(i, j)` blended by `w`.
    fn outer_fractions_in(
        &self,
        (i, j, w): (usize, usize, f64),
        surface: Surface,
        u: f64,
    ) -> ([f64; 2], [f64; 2]) {
        let (pa, da) = self.curves[i].point(surface, u);
        if w == 0.0 {
            return (pa, da);
        }
        let (pb, db) = self.curves[j].point(surface, u);
        let mix = |a: [f64; 2], b: [f64; 2]| [a[0] + w * (b[0] - a[0]), a[1] + w * (b[1] - a[1])];
        (mix(pa, pb), mix(da, db))
    }

    /// A point of the outer mould line at radius `r` on `surface` at parameter `u` (normalised
    /// arc length from the leading edge), chord frame, m.
    pub fn outer(&self, r: f64, surface: Surface, u: f64) -> [f64; 2] {
        let at = self.with_radius(r, |m| m.at);
        let (p, _) = self.outer_fractions_in(at.bracket, surface, u);
        [(p[0] - at.pitch_axis) * at.chord, p[1] * at.chord]
    }

    /// `f` of the memo of radius `r` on this thread, filled first when it holds another radius
    /// or other surfaces.
    fn with_radius<R>(&self, r: f64, f: impl FnOnce(&RadiusMemo) -> R) -> R {
        MEMO.with(|memo| {
            let mut m = memo.borrow_mut();
            if m.key != (self.id, r.to_bits()) {
                m.key = (self.id, r.to_bits());
                m.at = self.at_radius(r);
                m.clamped = self.clamp_r(r);
                m.chord_clamped = self.blade.chord(m.clamped);
                let (rc, chord) = (m.clamped, m.chord_clamped);
                let RadiusMemo { present, half_ramps, .. } = &mut *m;
                present.clear();
                half_ramps.clear();
                for p in &self.surface_plies {
                    let here = p.thickness * p.span_factor(rc, p.covered);
                    present.push(here);
                    // An absent ply's ramps are not read (see `thickness`); their places kept.
                    if here == 0.0 {
                        half_ramps.extend(p.wrap.iter().map(|_| 0.0));
                    } else {
                        half_ramps.extend(p.chord_half_ramps(chord));
                    }
                }
            }
            f(&m)
        })
    }

    /// The outer point, its outward unit normal in the section plane and its chord fraction.
    pub fn outer_with_normal(&self, r: f64, surface: Surface, u: f64) -> ([f64; 2], [f64; 2], f64) {
        self.outer_with_normal_at(&self.with_radius(r, |m| m.at), surface, u)
    }

    /// [`BladeSurfaces::outer_with_normal`] at the radius of `at` (the same numbers, without
    /// working out the radius's quantities again).
    pub(crate) fn outer_with_normal_at(
        &self,
        at: &AtRadius,
        surface: Surface,
        u: f64,
    ) -> ([f64; 2], [f64; 2], f64) {
        let (p, d) = self.outer_fractions_in(at.bracket, surface, u);
        let len = d[0].hypot(d[1]);
        // The contour runs clockwise (upper surface towards the trailing edge, lower surface
        // back): the outward normal is the tangent turned a quarter turn to the left on the
        // upper surface and to the right on the lower, each parametrised from the leading edge.
        let n = if len > 0.0 {
            match surface {
                Surface::Upper => [-d[1] / len, d[0] / len],
                Surface::Lower => [d[1] / len, -d[0] / len],
            }
        } else {
            [-1.0, 0.0]
        };
        let c = at.chord;
        ([(p[0] - at.pitch_axis) * c, p[1] * c], n, p[0])
    }

    /// A point of the inner laminate surface: the outer point moved inward along its normal by
    /// the (ramped) laminate thickness, chord frame, m.
    pub fn inner(&self, r: f64, surface: Surface, u: f64) -> [f64; 2] {
        let (p, n, x) = self.outer_with_normal(r, surface, u);
        let t = self.thickness(r, surface, x);
        [p[0] - t * n[0], p[1] - t * n[1]]
    }

    fn clamp_r(&self, r: f64) -> f64 {
        r.clamp(self.blade.root_radius(), self.blade.tip_radius())
    }

    /// The laminate thickness of a surface at radius `r` and chord fraction `x`, with ply edges
    /// ramped (see the module docs), m. Away from the ramps it is
    /// [`Blade::surface_thickness`].
    pub fn thickness(&self, r: f64, surface: Surface, x: f64) -> f64 {
        let x = x.clamp(0.0, 1.0);
        let w = match surface {
            Surface::Upper => x,
            Surface::Lower => -x,
        };
        // Each ply: thickness × span factor × chord factor, the first two from the memo.
        self.with_radius(r, |m| {
            let mut h = m.half_ramps.as_slice();
            self.surface_plies
                .iter()
                .zip(&m.present)
                .map(|(p, &present)| {
                    let (own, rest) = h.split_at(p.wrap.len());
                    h = rest;
                    // A ply absent at this radius adds +0, as `+0 × chord factor` would (the
                    // chord factor is finite and not negative: its ramps have length).
                    if present == 0.0 { 0.0 } else { present * p.chord_factor(w, own) }
                })
                .sum()
        })
    }

    /// The least skin thickness round the section at radius `r` (sampled at 400 chord fractions
    /// on each surface), m: the laminate that closes the blade's ends.
    pub fn least_skin_thickness(&self, r: f64) -> f64 {
        (0..=400)
            .flat_map(|i| {
                let x = i as f64 / 400.0;
                [self.thickness(r, Surface::Upper, x), self.thickness(r, Surface::Lower, x)]
            })
            .fold(f64::INFINITY, f64::min)
    }

    /// The laminate thickness of the web with index `web` (in [`Blade::webs`]) at radius `r`,
    /// with ply edges inside the web's span ramped, m; zero outside the web's span.
    pub fn web_thickness(&self, r: f64, web: usize) -> f64 {
        let w = &self.blade.webs[web];
        if r < w.r_start - EDGE_EPS || r > w.r_end + EDGE_EPS {
            return 0.0;
        }
        let r = self.clamp_r(r);
        self.web_plies
            .iter()
            .filter(|p| p.web.as_deref() == Some(w.name.as_str()))
            .map(|p| {
                let inside = |e: Option<f64>| {
                    e.filter(|&v| v > w.r_start + EDGE_EPS && v < w.r_end - EDGE_EPS)
                };
                let ply = SmoothPly { span: [inside(p.span[0]), inside(p.span[1])], ..p.clone() };
                let present = match (p.span[0], p.span[1]) {
                    (Some(a), _) if a >= w.r_end - EDGE_EPS => 0.0,
                    (_, Some(b)) if b <= w.r_start + EDGE_EPS => 0.0,
                    _ => 1.0,
                };
                p.thickness * present * ply.span_factor(r, p.covered)
            })
            .sum()
    }

    /// Chord-frame `y` of the midplane of the web with index `web` at radius `r`, m.
    pub fn web_y(&self, r: f64, web: usize) -> f64 {
        let w = &self.blade.webs[web];
        (w.chord_frac - self.blade.pitch_axis_frac(r)) * self.blade.chord(r)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_smooth_step_keeps_the_area_of_the_step() {
        // The ramp is antisymmetric about its centre: ∫_{-1}^{1} H = 1, the step's integral
        // (Simpson's rule is exact for the cubic).
        let n = 200;
        let h = 2.0 / n as f64;
        let sum: f64 = (0..=n)
            .map(|i| {
                let x = -1.0 + h * i as f64;
                let w = if i == 0 || i == n {
                    1.0
                } else if i % 2 == 1 {
                    4.0
                } else {
                    2.0
                };
                w * smooth_step(x)
            })
            .sum::<f64>()
            * h
            / 3.0;
        assert!((sum - 1.0).abs() < 1e-12, "{sum}");
        assert_eq!(smooth_step(-2.0), 0.0);
        assert_eq!(smooth_step(3.0), 1.0);
        assert_eq!(smooth_step(0.0), 0.5);
    }

    /// Every surfaces value of a blade (and of its clones) reads one set of station curves, made
    /// once, whose points are those of curves made afresh from the outlines.
    #[test]
    fn the_station_curves_are_made_once_per_blade() {
        let root = env!("CARGO_MANIFEST_DIR");
        let path = format!("{root}/layups/round-root/blade.toml");
        let project = crate::input::read_project(path.as_ref()).expect("demo");
        let blade = Blade::from_project(&project).expect("demo blade");
        let (a, b) = (blade.surfaces(), blade.surfaces());
        let copy = blade.clone();
        assert!(
            Arc::ptr_eq(&a.curves, &b.curves) && Arc::ptr_eq(&a.curves, &copy.surfaces().curves)
        );
        for (curve, station) in a.curves.iter().zip(&blade.stations) {
            let fresh = StationCurve::new(&station.outline);
            for k in 0..=20 {
                let u = k as f64 / 20.0;
                for side in [Surface::Upper, Surface::Lower] {
                    let bits = |(p, d): ([f64; 2], [f64; 2])| [p, d].map(|v| v.map(f64::to_bits));
                    assert_eq!(bits(curve.point(side, u)), bits(fresh.point(side, u)));
                }
            }
        }
    }

    /// The laminate thickness with the plies absent at a radius left out equals, to the bit,
    /// the sum over every ply of its thickness × span factor × chord factor, on the three demo
    /// blades (ply drops along the span, a round root, a blunt trailing edge), at radii over and
    /// past the span and chord fractions round both surfaces.
    #[test]
    fn absent_plies_leave_the_thickness_to_the_bit() {
        let root = env!("CARGO_MANIFEST_DIR");
        let (mut absent, mut points) = (0, 0);
        for demo in ["small-wind", "mine-fan", "round-root"] {
            let path = format!("{root}/layups/{demo}/blade.toml");
            let project = crate::input::read_project(path.as_ref()).expect("demo");
            let blade = Blade::from_project(&project).expect("demo blade");
            let s = blade.surfaces();
            let (r0, r1) = (blade.root_radius(), blade.tip_radius());
            for k in 0..=60 {
                let r = r0 - 0.02 + (r1 - r0 + 0.04) * k as f64 / 60.0;
                let rc = s.clamp_r(r);
                let chord = s.blade.chord(rc);
                for surface in [Surface::Upper, Surface::Lower] {
                    for j in 0..=40 {
                        let x = j as f64 / 40.0;
                        let w = if surface == Surface::Upper { x } else { -x };
                        let every: f64 = s
                            .surface_plies
                            .iter()
                            .map(|p| {
                                let h: Vec<f64> = p.chord_half_ramps(chord).collect();
                                p.thickness * p.span_factor(rc, p.covered) * p.chord_factor(w, &h)
                            })
                            .sum();
                        assert_eq!(s.thickness(r, surface, x).to_bits(), every.to_bits());
                        points += 1;
                    }
                }
                absent +=
                    s.surface_plies.iter().filter(|p| p.span_factor(rc, p.covered) == 0.0).count();
            }
        }
        assert!(absent > 100 && points > 10_000, "{absent} {points}");
    }
}

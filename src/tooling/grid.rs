//! The loft's grid: chordwise parameters shared by both chains, closing-segment subdivisions,
//! the ring order of the lines, each line's trimmed ends, and the spanwise stations.
//!
//! Refinement is by interval halving against the chordal tolerance: an interval is kept when the
//! surface at its quarter points lies within half the tolerance of the straight chord (and the
//! chord is no longer than the longest edge allowed); the other half of the tolerance is left to
//! the other direction, so a facet stays within about the tolerance of the surface.

use super::surface::{ChainEnds, EndKind, SpanSurface, to_rotor};
use super::trim::{Trims, solve_end};
use crate::mesh::LengthUnit;
use crate::mesh::WordMap;
use crate::mesh::quad_centre_ok;
use crate::mesh::vec3;
use crate::mesh::{End, MeshError, Place};

/// How finely a surface is meshed.
#[derive(Debug, Clone, PartialEq)]
pub struct LoftParams {
    /// Chordal tolerance, m: the greatest distance allowed between a facet and the surface.
    pub tolerance: f64,
    /// Longest edge allowed, m (`f64::INFINITY`: no limit beyond the tolerance).
    pub max_edge: f64,
    /// Radii (evenly spread between the trims) at which the chordwise grid is tested, besides
    /// the surface's own [`SpanSurface::sample_radii`].
    pub radius_samples: usize,
}

impl Default for LoftParams {
    fn default() -> Self {
        LoftParams { tolerance: 0.05e-3, max_edge: f64::INFINITY, radius_samples: 9 }
    }
}

impl LoftParams {
    pub(crate) fn validate(&self) -> Result<(), MeshError> {
        let bad = |name: &str, value: f64, expected| {
            Err(MeshError::Parameter { name: name.into(), value, expected })
        };
        if !(self.tolerance.is_finite() && self.tolerance > 0.0) {
            return bad("chordal tolerance (m)", self.tolerance, "a positive length");
        }
        if self.max_edge.is_nan() || self.max_edge <= 0.0 {
            return bad("longest edge (m)", self.max_edge, "a positive length");
        }
        if self.radius_samples < 2 {
            return bad("radius samples", self.radius_samples as f64, "at least 2");
        }
        Ok(())
    }
}

/// One line of the loft, running from root to tip at a constant parameter.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Line {
    /// The upper chain at `u`.
    Upper(f64),
    /// The lower chain at `u`.
    Lower(f64),
    /// The front closing segment at `τ` (0 at the upper chain, 1 at the lower).
    Front(f64),
    /// The back closing segment at `τ` (0 at the upper chain, 1 at the lower).
    Back(f64),
}

impl Line {
    pub(crate) fn eval(self, s: &dyn SpanSurface, x: f64) -> [f64; 2] {
        let mix =
            |a: [f64; 2], b: [f64; 2], t: f64| [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t];
        match self {
            Line::Upper(u) => s.upper(x, u),
            Line::Lower(u) => s.lower(x, u),
            Line::Front(t) => mix(s.upper(x, 0.0), s.lower(x, 0.0), t),
            Line::Back(t) => mix(s.upper(x, 1.0), s.lower(x, 1.0), t),
        }
    }

    pub(crate) fn rotor_point(self, s: &dyn SpanSurface, x: f64) -> [f64; 3] {
        to_rotor(x, self.eval(s, x), s.chord_angle(x))
    }

    fn name(self) -> String {
        match self {
            Line::Upper(u) => format!("upper u = {u:.4}"),
            Line::Lower(u) => format!("lower u = {u:.4}"),
            Line::Front(t) => format!("front closure t = {t:.4}"),
            Line::Back(t) => format!("back closure t = {t:.4}"),
        }
    }
}

/// The lines in ring order and where each kind sits in it.
#[derive(Debug, Clone)]
pub(crate) struct Grid {
    pub ends: ChainEnds,
    /// Chordwise parameters, ascending from 0 to 1.
    pub u: Vec<f64>,
    /// Lines in ring order: upper front → back, back closure, lower back → front, front closure.
    pub lines: Vec<Line>,
    /// Ring position of the upper line at `u[k]`.
    pub upper: Vec<usize>,
    /// Ring position of the lower line at `u[k]` (shared with the upper where the chains meet).
    pub lower: Vec<usize>,
    /// Ring positions of the front closure's inner points, from the upper chain down.
    pub front: Vec<usize>,
    /// Ring positions of the back closure's inner points, from the upper chain down.
    pub back: Vec<usize>,
}

/// The lines of one surface with their trimmed ends.
pub(crate) struct TrimmedLines<'a> {
    pub surface: &'a dyn SpanSurface,
    pub x_root: Vec<f64>,
    pub x_tip: Vec<f64>,
}

impl TrimmedLines<'_> {
    /// Radius of line `i` at spanwise station `t ∈ [0, 1]` (exactly the trim at 0 and 1).
    pub fn x(&self, i: usize, t: f64) -> f64 {
        if t >= 1.0 { self.x_tip[i] } else { self.x_root[i] + (self.x_tip[i] - self.x_root[i]) * t }
    }
}

fn place(p: [f64; 3]) -> Place {
    Place { point: p, unit: LengthUnit::Metre }
}

/// Chooses the chordwise grid and closure subdivisions shared by `surfaces`.
pub(crate) fn build_grid(
    surfaces: &[&dyn SpanSurface],
    trims: &Trims,
    params: &LoftParams,
) -> Result<Grid, MeshError> {
    let ends = surfaces[0].ends();
    if surfaces.iter().any(|s| s.ends() != ends) {
        return Err(MeshError::Geometry(
            "the outer and inner surfaces must join their chains the same way at both ends".into(),
        ));
    }
    let tol = 0.5 * params.tolerance;
    // Radii to test the chordwise grid at: between the least root and greatest tip trim of a
    // few probe lines, plus the surfaces' stations.
    let mut samples: Vec<(usize, f64)> = Vec::new();
    for (si, s) in surfaces.iter().enumerate() {
        let probes = [
            Line::Upper(0.0),
            Line::Upper(0.5),
            Line::Upper(1.0),
            Line::Lower(0.5),
            Line::Lower(1.0),
        ];
        let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
        for line in probes {
            let (r, t) = trim_line(*s, line, trims)?;
            lo = lo.min(r);
            hi = hi.max(t);
        }
        let n = params.radius_samples;
        samples.extend((0..n).map(|i| (si, lo + (hi - lo) * i as f64 / (n - 1) as f64)));
        samples.extend(
            s.sample_radii().into_iter().filter(|x| (lo..=hi).contains(x)).map(|x| (si, x)),
        );
    }
    let chains = |si: usize, x: f64, u: f64| [surfaces[si].upper(x, u), surfaces[si].lower(x, u)];
    let interval_ok = |a: f64, b: f64| {
        samples.iter().all(|&(si, x)| {
            let (pa, pb) = (chains(si, x, a), chains(si, x, b));
            (0..2).all(|c| {
                vec3::dist_2d(pa[c], pb[c]) <= params.max_edge
                    && [0.25, 0.5, 0.75].iter().all(|q| {
                        let pm = chains(si, x, a + (b - a) * q)[c];
                        vec3::dist_to_segment_2d(pm, pa[c], pb[c]) <= tol
                    })
            })
        })
    };
    let u = refine(8, interval_ok).map_err(|u| MeshError::Refinement {
        direction: "chordwise",
        at: place(to_rotor(
            samples[0].1,
            surfaces[0].upper(samples[0].1, u),
            surfaces[0].chord_angle(samples[0].1),
        )),
    })?;
    // Closing segments: subdivided so the cap's facets keep within the tolerance of the trim
    // surface and are not much longer than the neighbouring chordwise spacing, into an even
    // number of pieces so that a parting line can run along the middle of the segment.
    let cap_chord = trims.root.chord_for_sag(tol).min(trims.tip.chord_for_sag(tol));
    let k = u.len() - 1;
    let closure = |at_back: bool| -> usize {
        let (ue, un) = if at_back { (u[k], u[k - 1]) } else { (u[0], u[1]) };
        samples
            .iter()
            .map(|&(si, x)| {
                let s = surfaces[si];
                let len = vec3::dist_2d(s.upper(x, ue), s.lower(x, ue));
                let spacing = vec3::dist_2d(s.upper(x, ue), s.upper(x, un));
                let h = cap_chord.min(params.max_edge).min(spacing.max(len * 1e-3));
                ((len / h).ceil() as usize).clamp(1, 10_000)
            })
            .max()
            .map_or(2, |n| n + n % 2)
    };
    let n_front = if ends.front == EndKind::Segment { closure(false) } else { 0 };
    let n_back = if ends.back == EndKind::Segment { closure(true) } else { 0 };
    Ok(order_lines(ends, u, n_front, n_back))
}

fn order_lines(ends: ChainEnds, u: Vec<f64>, n_front: usize, n_back: usize) -> Grid {
    let k = u.len() - 1;
    let mut lines: Vec<Line> = u.iter().map(|&u| Line::Upper(u)).collect();
    let upper: Vec<usize> = (0..=k).collect();
    let back: Vec<usize> = (1..n_back)
        .map(|i| {
            lines.push(Line::Back(i as f64 / n_back as f64));
            lines.len() - 1
        })
        .collect();
    let mut lower = vec![0; k + 1];
    for j in (0..=k).rev() {
        let meets =
            (j == k && ends.back == EndKind::Point) || (j == 0 && ends.front == EndKind::Point);
        lower[j] = if meets {
            upper[j]
        } else {
            lines.push(Line::Lower(u[j]));
            lines.len() - 1
        };
    }
    let mut front = vec![0; n_front.saturating_sub(1)];
    for i in (1..n_front).rev() {
        lines.push(Line::Front(i as f64 / n_front as f64));
        front[i - 1] = lines.len() - 1;
    }
    Grid { ends, u, lines, upper, lower, front, back }
}

/// Interval halving on [0, 1] from `start` equal intervals; returns the accepted breakpoints or
/// the parameter where refinement had to stop.
pub(crate) fn refine(start: usize, ok: impl Fn(f64, f64) -> bool) -> Result<Vec<f64>, f64> {
    let mut stack: Vec<(f64, f64, u32)> = (0..start)
        .rev()
        .map(|i| (i as f64 / start as f64, (i + 1) as f64 / start as f64, 0))
        .collect();
    let mut points = Vec::new();
    while let Some((a, b, depth)) = stack.pop() {
        if ok(a, b) {
            points.push(a);
            continue;
        }
        if depth >= 48 {
            return Err(a);
        }
        let m = 0.5 * (a + b);
        stack.push((m, b, depth + 1));
        stack.push((a, m, depth + 1));
    }
    points.push(1.0);
    Ok(points)
}

fn trim_line(s: &dyn SpanSurface, line: Line, trims: &Trims) -> Result<(f64, f64), MeshError> {
    let c = |x: f64| line.eval(s, x);
    let name = line.name();
    let r = solve_end(&c, s.span(), trims.root, End::Root, &name)?;
    let t = solve_end(&c, s.span(), trims.tip, End::Tip, &name)?;
    if r >= t {
        return Err(MeshError::Trim {
            end: End::Root,
            trim: trims.root.describe(),
            reason: format!(
                "lies beyond the tip trim ({}) on the {name} line (x = {r:.6} m against {t:.6} m)",
                trims.tip.describe()
            ),
        });
    }
    Ok((r, t))
}

/// Trims every line of `grid` on `surface`.
pub(crate) fn trim_lines<'a>(
    surface: &'a dyn SpanSurface,
    grid: &Grid,
    trims: &Trims,
) -> Result<TrimmedLines<'a>, MeshError> {
    let mut x_root = Vec::with_capacity(grid.lines.len());
    let mut x_tip = Vec::with_capacity(grid.lines.len());
    for &line in &grid.lines {
        let (r, t) = trim_line(surface, line, trims)?;
        x_root.push(r);
        x_tip.push(t);
    }
    Ok(TrimmedLines { surface, x_root, x_tip })
}

/// The spanwise stations and the rotor-frame points of every line there.
pub(crate) struct Stations {
    /// Fractions `t ∈ [0, 1]` of each line's trimmed length, ascending.
    pub t: Vec<f64>,
    /// `points[tube][station][line]`, rotor frame, m.
    pub points: Vec<Vec<Vec<[f64; 3]>>>,
}

/// Chooses the spanwise stations shared by all lines of all surfaces, by interval halving from
/// four intervals. Each interval is tested at its quarter points and, for every pair of
/// neighbouring lines, at the middle of the quad they span (which bounds the error of facets on
/// a twisting surface). Rings are evaluated once: those inside an accepted interval are dropped,
/// those at its ends are kept for the vertices.
pub(crate) fn build_stations(
    grid: &Grid,
    tubes: &[TrimmedLines<'_>],
    params: &LoftParams,
) -> Result<Stations, MeshError> {
    let tol = 0.5 * params.tolerance;
    let n = grid.lines.len();
    let ring = |tube: &TrimmedLines<'_>, t: f64| -> Vec<[f64; 3]> {
        (0..n).map(|i| grid.lines[i].rotor_point(tube.surface, tube.x(i, t))).collect()
    };
    let mut cache: WordMap<u64, Vec<Vec<[f64; 3]>>> = WordMap::default();
    let fetch = |cache: &mut WordMap<u64, Vec<Vec<[f64; 3]>>>, t: f64| {
        cache
            .entry(t.to_bits())
            .or_insert_with(|| tubes.iter().map(|tube| ring(tube, t)).collect());
    };
    let ok = |cache: &WordMap<u64, Vec<Vec<[f64; 3]>>>, a: f64, b: f64| {
        let at = |t: f64, k: usize| &cache[&t.to_bits()][k];
        let q = |f: f64| a + (b - a) * f;
        (0..tubes.len()).all(|k| {
            let (ra, rb) = (at(a, k), at(b, k));
            let (r1, rm, r3) = (at(q(0.25), k), at(q(0.5), k), at(q(0.75), k));
            (0..n).all(|i| {
                let j = (i + 1) % n;
                let (pa, pb) = (ra[i], rb[i]);
                vec3::dist(pa, pb) <= params.max_edge
                    && vec3::dist_to_segment(r1[i], pa, pb) <= tol
                    && vec3::dist_to_segment(rm[i], pa, pb) <= tol
                    && vec3::dist_to_segment(r3[i], pa, pb) <= tol
                    && quad_centre_ok(vec3::lerp(rm[i], rm[j], 0.5), [pa, pb, ra[j], rb[j]], tol)
            })
        })
    };
    let start = 4;
    let mut stack: Vec<(f64, f64, u32)> = (0..start)
        .rev()
        .map(|i| (i as f64 / start as f64, (i + 1) as f64 / start as f64, 0))
        .collect();
    let mut t = Vec::new();
    while let Some((a, b, depth)) = stack.pop() {
        let q = |f: f64| a + (b - a) * f;
        for x in [a, b, q(0.25), q(0.5), q(0.75)] {
            fetch(&mut cache, x);
        }
        if ok(&cache, a, b) {
            t.push(a);
            for x in [q(0.25), q(0.5), q(0.75)] {
                cache.remove(&x.to_bits());
            }
            continue;
        }
        if depth >= 48 {
            let p = cache[&a.to_bits()][0][0];
            return Err(MeshError::Refinement { direction: "spanwise", at: place(p) });
        }
        stack.push((q(0.5), b, depth + 1));
        stack.push((a, q(0.5), depth + 1));
    }
    t.push(1.0);
    let mut points: Vec<Vec<Vec<[f64; 3]>>> = vec![Vec::with_capacity(t.len()); tubes.len()];
    for &x in &t {
        let rings = cache
            .remove(&x.to_bits())
            .unwrap_or_else(|| tubes.iter().map(|tube| ring(tube, x)).collect());
        for (k, r) in rings.into_iter().enumerate() {
            points[k].push(r);
        }
    }
    Ok(Stations { t, points })
}

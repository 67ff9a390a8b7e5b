//! An airfoil outline in chord fractions, its resampling at normalised arc length, and blending.

use super::AirfoilError;
use super::plane::{straight_through, turn};
use crate::interp::CubicSpline;

/// An airfoil outline in chord fractions: leading edge at (0, 0), trailing edge near (1, 0).
/// Both surfaces run from the leading edge to the trailing edge and share the leading-edge point.
/// A blunt trailing edge has distinct last points; it is closed by a straight base.
#[derive(Debug, Clone, PartialEq)]
pub struct Outline {
    /// Upper surface, leading edge to trailing edge.
    pub upper: Vec<[f64; 2]>,
    /// Lower surface, leading edge to trailing edge.
    pub lower: Vec<[f64; 2]>,
}

/// Normalised arc-length stations from the leading edge (0) to the trailing edge (1), clustered
/// at both ends by cosine spacing: `t_i = (1 − cos(pi i / n)) / 2`, `i = 0..=n`.
pub fn clustered_stations(n: usize) -> Vec<f64> {
    let n = n.max(2);
    (0..=n).map(|i| 0.5 * (1.0 - (std::f64::consts::PI * i as f64 / n as f64).cos())).collect()
}

impl Outline {
    /// Builds an outline from a closed point sequence in the usual file order (trailing edge,
    /// upper surface, leading edge, lower surface, trailing edge; the other way round is reversed),
    /// normalised so the leading edge (the point at (0, 0) of points already on their chord line;
    /// otherwise the point farthest from the trailing-edge midpoint, or the middle of a flat front
    /// face) is at (0, 0) and the trailing-edge midpoint at (1, 0). `lines`
    /// gives the file line of each point for messages. Consecutive repeated points are removed.
    pub fn from_file_order(points: &[[f64; 2]], lines: &[usize]) -> Result<Self, AirfoilError> {
        const MIN_POINTS: usize = 10;
        if points.len() < MIN_POINTS || lines.len() != points.len() {
            return Err(AirfoilError::TooFewPoints { found: points.len(), needed: MIN_POINTS });
        }
        let extent = points.iter().fold(0.0f64, |m, p| m.max(p[0].abs()).max(p[1].abs()));
        let mut pts: Vec<[f64; 2]> = Vec::with_capacity(points.len());
        let mut kept: Vec<usize> = Vec::with_capacity(points.len());
        for (p, &l) in points.iter().zip(lines) {
            if pts.last().is_some_and(|&q| dist(*p, q) <= 1e-12 * extent) {
                continue;
            }
            pts.push(*p);
            kept.push(l);
        }
        let closed = pts.len() > 2 && dist(pts[0], pts[pts.len() - 1]) <= 1e-12 * extent;
        if closed {
            pts.pop();
            kept.pop();
        }
        let lp = super::normalise::Loop { pts, lines: kept, closed };
        super::normalise::outline_from_loop(lp, &mut Vec::new())
    }

    /// Whether the trailing edge is blunt (a base of more than 1e-6 chord).
    pub fn blunt_te(&self) -> bool {
        let (u, l) = (self.upper[self.upper.len() - 1], self.lower[self.lower.len() - 1]);
        dist(u, l) > 1e-6
    }

    /// The outline resampled at the given normalised arc-length stations of each surface (both
    /// surfaces at the same stations), by a natural cubic spline through the whole outline in arc
    /// length, so that the leading edge stays smooth. Corners (the ends of straight faces, and
    /// turns sharper than 45° between neighbouring points) split the spline and stay corners: the
    /// station nearest each corner is moved onto it, so straight faces stay straight and the
    /// number of points does not change.
    pub fn resample(&self, stations: &[f64]) -> Outline {
        // One curve from the upper trailing edge over the leading edge to the lower trailing edge.
        let mut pts: Vec<[f64; 2]> = self.upper.iter().rev().copied().collect();
        pts.extend(self.lower.iter().skip(1).copied());
        let mut s = vec![0.0];
        for w in pts.windows(2) {
            let last = s[s.len() - 1];
            s.push(last + dist(w[0], w[1]));
        }
        let corners = corner_indices(&pts);
        let mut breaks = vec![0];
        breaks.extend(corners.iter().copied());
        breaks.push(pts.len() - 1);
        let pieces: Vec<(f64, CubicSpline, CubicSpline)> = breaks
            .windows(2)
            .map(|w| {
                let (a, b) = (w[0], w[1]);
                let ss = &s[a..=b];
                let sx =
                    CubicSpline::natural(ss, &pts[a..=b].iter().map(|p| p[0]).collect::<Vec<_>>());
                let sy =
                    CubicSpline::natural(ss, &pts[a..=b].iter().map(|p| p[1]).collect::<Vec<_>>());
                (s[b], sx, sy)
            })
            .collect();
        let at = |v: f64| {
            let k = pieces.partition_point(|p| p.0 < v).min(pieces.len() - 1);
            [pieces[k].1.eval(v), pieces[k].2.eval(v)]
        };
        let s_le = s[self.upper.len() - 1];
        let s_end = s[s.len() - 1];
        // Arc positions of the stations on each surface, with the nearest moved onto each corner.
        let mut s_upper: Vec<f64> = stations.iter().map(|&t| s_le * (1.0 - t)).collect();
        let mut s_lower: Vec<f64> = stations.iter().map(|&t| s_le + (s_end - s_le) * t).collect();
        for &c in &corners {
            let sc = s[c];
            let list = if sc < s_le { &mut s_upper } else { &mut s_lower };
            snap(list, sc);
        }
        Outline {
            upper: s_upper.iter().map(|&v| at(v)).collect(),
            lower: s_lower.iter().map(|&v| at(v)).collect(),
        }
    }

    /// The corners of the outline in chord fractions: where a straight face ends or the outline
    /// turns by more than 45° (the trailing-edge points are not listed).
    pub fn corners(&self) -> Vec<[f64; 2]> {
        let mut pts: Vec<[f64; 2]> = self.upper.iter().rev().copied().collect();
        pts.extend(self.lower.iter().skip(1).copied());
        corner_indices(&pts).into_iter().map(|k| pts[k]).collect()
    }

    /// `(1 − w) self + w other`, point by point; both must be resampled at the same stations.
    pub fn blend(&self, other: &Outline, w: f64) -> Outline {
        assert_eq!(self.upper.len(), other.upper.len(), "blend needs equal resampling");
        assert_eq!(self.lower.len(), other.lower.len(), "blend needs equal resampling");
        let mix = |a: &[[f64; 2]], b: &[[f64; 2]]| {
            a.iter()
                .zip(b)
                .map(|(p, q)| [p[0] + w * (q[0] - p[0]), p[1] + w * (q[1] - p[1])])
                .collect()
        };
        Outline { upper: mix(&self.upper, &other.upper), lower: mix(&self.lower, &other.lower) }
    }

    /// Area enclosed, in chord² (shoelace formula over the closed outline).
    pub fn area(&self) -> f64 {
        let poly = self.closed_polygon();
        let n = poly.len();
        0.5 * (0..n)
            .map(|i| {
                let (p, q) = (poly[i], poly[(i + 1) % n]);
                p[0] * q[1] - q[0] * p[1]
            })
            .sum::<f64>()
            .abs()
    }

    /// Perimeter without the trailing-edge base, in chords.
    pub fn perimeter_without_base(&self) -> f64 {
        let len = |v: &[[f64; 2]]| v.windows(2).map(|w| dist(w[0], w[1])).sum::<f64>();
        len(&self.upper) + len(&self.lower)
    }

    /// The closed polygon from the leading edge over the upper surface to the trailing edge and
    /// back along the lower surface (the last point joins the first; a blunt base appears as
    /// the segment between the two trailing-edge points).
    pub fn closed_polygon(&self) -> Vec<[f64; 2]> {
        let mut poly = self.upper.clone();
        let lower_te = self.lower.len() - 1;
        let skip_te = if self.blunt_te() { 0 } else { 1 };
        poly.extend(self.lower[1..=lower_te - skip_te].iter().rev().copied());
        poly
    }

    /// Upper minus lower surface height at chord fraction `x` (normal to the chord), by linear
    /// interpolation; zero outside 0..1.
    pub fn depth_at(&self, x: f64) -> f64 {
        interpolate_y(&self.upper, x) - interpolate_y(&self.lower, x)
    }

    /// The chord fraction of greatest depth and that depth.
    pub fn max_depth(&self) -> (f64, f64) {
        (1..200)
            .map(|i| {
                let x = i as f64 / 200.0;
                (x, self.depth_at(x))
            })
            .max_by(|a, b| a.1.total_cmp(&b.1))
            .unwrap_or((0.3, 0.0))
    }
}

/// Interior indices of `pts` (an open curve) where the curve has a corner: the end of a straight
/// run of two or more segments (where the next point leaves its line), or a turn of more than 45°
/// between neighbouring segments (a finely sampled round edge turns a few degrees; the leading
/// edge of a coarse 80-point airfoil file about 30°).
fn corner_indices(pts: &[[f64; 2]]) -> Vec<usize> {
    let n = pts.len();
    if n < 3 {
        return Vec::new();
    }
    let straight: Vec<bool> =
        (1..n - 1).map(|k| straight_through(pts[k - 1], pts[k], pts[k + 1])).collect();
    let is_straight = |k: usize| k >= 1 && k + 1 < n && straight[k - 1];
    (1..n - 1)
        .filter(|&k| {
            let sharp = turn(pts[k - 1], pts[k], pts[k + 1]) > SHARP_TURN;
            let run_end = !is_straight(k) && (is_straight(k - 1) || is_straight(k + 1));
            sharp || run_end
        })
        .collect()
}

/// A turn between neighbouring segments sharper than this is a corner.
const SHARP_TURN: f64 = 45.0 * std::f64::consts::PI / 180.0;

/// Moves the entry of `list` (monotone arc positions) nearest `sc` onto it, unless it is an end
/// entry or already sits on another corner.
fn snap(list: &mut [f64], sc: f64) {
    let n = list.len();
    if n < 3 {
        return;
    }
    let k = (1..n - 1)
        .min_by(|&a, &b| (list[a] - sc).abs().total_cmp(&(list[b] - sc).abs()))
        .unwrap_or(1);
    // Stay between the neighbours so the order is kept.
    let (lo, hi) = (list[k - 1].min(list[k + 1]), list[k - 1].max(list[k + 1]));
    if sc > lo && sc < hi {
        list[k] = sc;
    }
}

fn interpolate_y(surface: &[[f64; 2]], x: f64) -> f64 {
    if surface.is_empty() || x < surface[0][0] || x > surface[surface.len() - 1][0] {
        return 0.0;
    }
    let i = surface.partition_point(|p| p[0] < x).clamp(1, surface.len() - 1);
    let (p, q) = (surface[i - 1], surface[i]);
    let w = if q[0] > p[0] { (x - p[0]) / (q[0] - p[0]) } else { 0.0 };
    p[1] + w * (q[1] - p[1])
}

fn dist(a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - b[0]).hypot(a[1] - b[1])
}

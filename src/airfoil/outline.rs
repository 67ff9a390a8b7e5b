//! An airfoil outline in chord fractions, its resampling at normalised arc length, and blending.

use super::AirfoilError;
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
    /// upper surface, leading edge, lower surface, trailing edge), normalised so the leading edge
    /// (the point farthest from the trailing-edge midpoint) is at (0, 0) and the trailing-edge
    /// midpoint at (1, 0). `lines` gives the file line of each point for messages.
    pub fn from_file_order(points: &[[f64; 2]], lines: &[usize]) -> Result<Self, AirfoilError> {
        const MIN_POINTS: usize = 10;
        if points.len() < MIN_POINTS {
            return Err(AirfoilError::TooFewPoints { found: points.len(), needed: MIN_POINTS });
        }
        for w in points.windows(2).enumerate() {
            let (i, p) = w;
            if dist(p[0], p[1]) < 1e-9 {
                return Err(AirfoilError::Repeated { line: lines[i + 1] });
            }
        }
        let last = points.len() - 1;
        let te = [(points[0][0] + points[last][0]) / 2.0, (points[0][1] + points[last][1]) / 2.0];
        let ile = (0..points.len())
            .max_by(|&a, &b| dist(points[a], te).total_cmp(&dist(points[b], te)))
            .unwrap_or(0);
        if ile == 0 || ile == last {
            return Err(AirfoilError::NoLeadingEdge);
        }
        let le = points[ile];
        let chord = dist(le, te);
        let (s, c) = ((te[1] - le[1]) / chord, (te[0] - le[0]) / chord);
        let norm = |p: [f64; 2]| {
            let (dx, dy) = (p[0] - le[0], p[1] - le[1]);
            [(dx * c + dy * s) / chord, (-dx * s + dy * c) / chord]
        };
        let all: Vec<[f64; 2]> = points.iter().map(|&p| norm(p)).collect();
        let upper: Vec<[f64; 2]> = all[..=ile].iter().rev().copied().collect();
        let lower: Vec<[f64; 2]> = all[ile..].to_vec();
        let upper_lines: Vec<usize> = lines[..=ile].iter().rev().copied().collect();
        let lower_lines: Vec<usize> = lines[ile..].to_vec();
        check_monotone(&upper, &upper_lines, "upper")?;
        check_monotone(&lower, &lower_lines, "lower")?;
        let mean = |v: &[[f64; 2]]| v.iter().map(|p| p[1]).sum::<f64>() / v.len() as f64;
        if mean(&upper) < mean(&lower) {
            return Err(AirfoilError::LowerFirst);
        }
        let outline = Outline { upper, lower };
        outline.check_no_crossing(&all, lines)?;
        Ok(outline)
    }

    /// Whether the trailing edge is blunt (a base of more than 1e-6 chord).
    pub fn blunt_te(&self) -> bool {
        let (u, l) = (self.upper[self.upper.len() - 1], self.lower[self.lower.len() - 1]);
        dist(u, l) > 1e-6
    }

    /// The outline resampled at the given normalised arc-length stations of each surface (both
    /// surfaces at the same stations), by a natural cubic spline through the whole outline in arc
    /// length, so that the leading edge stays smooth.
    pub fn resample(&self, stations: &[f64]) -> Outline {
        // One curve from the upper trailing edge over the leading edge to the lower trailing edge.
        let mut pts: Vec<[f64; 2]> = self.upper.iter().rev().copied().collect();
        pts.extend(self.lower.iter().skip(1).copied());
        let mut s = vec![0.0];
        for w in pts.windows(2) {
            let last = s[s.len() - 1];
            s.push(last + dist(w[0], w[1]));
        }
        let sx = CubicSpline::natural(&s, &pts.iter().map(|p| p[0]).collect::<Vec<_>>());
        let sy = CubicSpline::natural(&s, &pts.iter().map(|p| p[1]).collect::<Vec<_>>());
        let s_le = s[self.upper.len() - 1];
        let s_end = s[s.len() - 1];
        let at = |v: f64| [sx.eval(v), sy.eval(v)];
        let upper = stations.iter().map(|&t| at(s_le * (1.0 - t))).collect();
        let lower = stations.iter().map(|&t| at(s_le + (s_end - s_le) * t)).collect();
        Outline { upper, lower }
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

    fn check_no_crossing(&self, all: &[[f64; 2]], lines: &[usize]) -> Result<(), AirfoilError> {
        let n = all.len();
        // Segments of the file's polyline plus the closing base (last -> first).
        let seg = |i: usize| (all[i], all[(i + 1) % n]);
        for i in 0..n {
            for j in (i + 2)..n {
                if i == 0 && j == n - 1 {
                    continue;
                }
                let (a, b) = seg(i);
                let (c, d) = seg(j);
                if segments_cross(a, b, c, d) {
                    return Err(AirfoilError::Crossing { line_a: lines[i], line_b: lines[j] });
                }
            }
        }
        Ok(())
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

fn check_monotone(surface: &[[f64; 2]], lines: &[usize], name: &str) -> Result<(), AirfoilError> {
    for (i, w) in surface.windows(2).enumerate() {
        if w[1][0] <= w[0][0] {
            return Err(AirfoilError::DoublesBack {
                surface: name.to_string(),
                line: lines[i + 1],
            });
        }
    }
    Ok(())
}

fn dist(a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - b[0]).hypot(a[1] - b[1])
}

fn cross(o: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
}

/// Whether segments ab and cd properly cross (touching at an end counts).
fn segments_cross(a: [f64; 2], b: [f64; 2], c: [f64; 2], d: [f64; 2]) -> bool {
    let d1 = cross(c, d, a);
    let d2 = cross(c, d, b);
    let d3 = cross(a, b, c);
    let d4 = cross(a, b, d);
    (d1 * d2 <= 0.0 && d3 * d4 <= 0.0)
        && !(d1 == 0.0 && d2 == 0.0 && d3 == 0.0 && d4 == 0.0 && !overlap_collinear(a, b, c, d))
}

fn overlap_collinear(a: [f64; 2], b: [f64; 2], c: [f64; 2], d: [f64; 2]) -> bool {
    let within = |p: [f64; 2], q: [f64; 2], r: [f64; 2]| {
        r[0] >= p[0].min(q[0])
            && r[0] <= p[0].max(q[0])
            && r[1] >= p[1].min(q[1])
            && r[1] <= p[1].max(q[1])
    };
    within(a, b, c) || within(a, b, d) || within(c, d, a) || within(c, d, b)
}

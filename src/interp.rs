//! One-dimensional interpolation kernels shared by the airfoil and blade stages: a natural cubic
//! spline (smooth outlines) and a monotone piecewise cubic Hermite interpolant (chord, twist and
//! pitch axis along the span, which must not overshoot between stations).

/// Natural cubic spline through `(x_i, y_i)` with strictly increasing `x` (de Boor, *A Practical
/// Guide to Splines*, 1978, ch. IV; second derivatives from the tridiagonal system, zero at the
/// ends).
#[derive(Debug, Clone)]
pub(crate) struct CubicSpline {
    x: Vec<f64>,
    y: Vec<f64>,
    m: Vec<f64>,
}

impl CubicSpline {
    /// The spline through the points; `x` strictly increasing, at least two points.
    #[track_caller]
    pub(crate) fn natural(x: &[f64], y: &[f64]) -> Self {
        assert!(x.len() == y.len() && x.len() >= 2, "spline needs matching points, >= 2");
        let n = x.len();
        let mut m = vec![0.0; n];
        if n > 2 {
            // Thomas algorithm on the interior equations.
            let mut c = vec![0.0; n];
            let mut d = vec![0.0; n];
            for i in 1..n - 1 {
                let h0 = x[i] - x[i - 1];
                let h1 = x[i + 1] - x[i];
                let a = h0 / 6.0;
                let b = (h0 + h1) / 3.0;
                let cc = h1 / 6.0;
                let rhs = (y[i + 1] - y[i]) / h1 - (y[i] - y[i - 1]) / h0;
                let denom = b - a * c[i - 1];
                c[i] = cc / denom;
                d[i] = (rhs - a * d[i - 1]) / denom;
            }
            for i in (1..n - 1).rev() {
                m[i] = d[i] - c[i] * m[i + 1];
            }
        }
        CubicSpline { x: x.to_vec(), y: y.to_vec(), m }
    }

    /// The value at `t`, extrapolating linearly beyond the ends.
    pub(crate) fn eval(&self, t: f64) -> f64 {
        self.value_at(&self.on_segment(self.segment(t), t))
    }

    /// The first derivative at `t`, held at its end value beyond the ends.
    pub(crate) fn derivative(&self, t: f64) -> f64 {
        self.slope_at(&self.on_segment(self.segment(t), t))
    }

    /// The segment `[x_{i-1}, x_i]` that `eval` and `derivative` use at `t`, as its index `i`:
    /// found once, it serves every spline on the same knots (the two coordinates of a curve).
    pub(crate) fn segment(&self, t: f64) -> usize {
        let n = self.x.len();
        self.x.partition_point(|&v| v <= t).clamp(1, n - 1)
    }

    /// [`CubicSpline::segment`] from a table of this spline's knots (see [`KnotIndex`]): the
    /// same index.
    pub(crate) fn segment_in(&self, index: &KnotIndex, t: f64) -> usize {
        index.partition_point(&self.x, t).clamp(1, self.x.len() - 1)
    }

    /// Where `t` falls on segment `i` (from [`CubicSpline::segment`] or
    /// [`CubicSpline::segment_in`]), shared by every spline on the same knots.
    pub(crate) fn on_segment(&self, i: usize, t: f64) -> OnSegment {
        let (x0, x1) = (self.x[i - 1], self.x[i]);
        let h = x1 - x0;
        OnSegment { i, h, a: (x1 - t) / h, b: (t - x0) / h }
    }

    /// The value at `at` (from [`CubicSpline::on_segment`] of a spline with the same knots):
    /// the cubic between the knots (de Boor, ch. IV), a straight line beyond the ends.
    fn value_at(&self, at: &OnSegment) -> f64 {
        let OnSegment { i, h, a, b } = *at;
        let (y0, y1, m0, m1) = (self.y[i - 1], self.y[i], self.m[i - 1], self.m[i]);
        a * y0 + b * y1 + ((a * a * a - a) * m0 + (b * b * b - b) * m1) * h * h / 6.0
    }

    /// The first derivative at `at`, held at its end value beyond the ends.
    fn slope_at(&self, at: &OnSegment) -> f64 {
        let OnSegment { i, h, a, b } = *at;
        let (y0, y1, m0, m1) = (self.y[i - 1], self.y[i], self.m[i - 1], self.m[i]);
        let (a, b) = (a.clamp(0.0, 1.0), b.clamp(0.0, 1.0));
        (y1 - y0) / h + ((3.0 * b * b - 1.0) * m1 - (3.0 * a * a - 1.0) * m0) * h / 6.0
    }

    /// The value and the first derivative at `at`.
    pub(crate) fn value_slope_at(&self, at: &OnSegment) -> [f64; 2] {
        [self.value_at(at), self.slope_at(at)]
    }

    /// The value, the first and the second derivative at `at`; the second is linear between the
    /// knots' second derivatives (de Boor, ch. IV), held at the segment's ends beyond them.
    pub(crate) fn jet_at(&self, at: &OnSegment) -> [f64; 3] {
        let [value, slope] = self.value_slope_at(at);
        let b = at.b.clamp(0.0, 1.0);
        [value, slope, (1.0 - b) * self.m[at.i - 1] + b * self.m[at.i]]
    }

    // The formulas as first written, one quantity at a time: the references the shared
    // evaluation must match bit for bit (see the tests).

    /// [`CubicSpline::eval`] on segment `i` (from [`CubicSpline::segment`] of a spline with the
    /// same knots).
    #[cfg(test)]
    pub(crate) fn eval_on(&self, i: usize, t: f64) -> f64 {
        let (x0, x1) = (self.x[i - 1], self.x[i]);
        let h = x1 - x0;
        let a = (x1 - t) / h;
        let b = (t - x0) / h;
        a * self.y[i - 1]
            + b * self.y[i]
            + ((a * a * a - a) * self.m[i - 1] + (b * b * b - b) * self.m[i]) * h * h / 6.0
    }

    /// The second derivative on segment `i` (see [`CubicSpline::eval_on`]): linear between the
    /// knots' second derivatives (de Boor, ch. IV), held at the segment's ends beyond them.
    #[cfg(test)]
    pub(crate) fn second_on(&self, i: usize, t: f64) -> f64 {
        let (x0, x1) = (self.x[i - 1], self.x[i]);
        let h = x1 - x0;
        let b = ((t - x0) / h).clamp(0.0, 1.0);
        (1.0 - b) * self.m[i - 1] + b * self.m[i]
    }

    /// [`CubicSpline::derivative`] on segment `i` (see [`CubicSpline::eval_on`]).
    #[cfg(test)]
    pub(crate) fn derivative_on(&self, i: usize, t: f64) -> f64 {
        let (x0, x1) = (self.x[i - 1], self.x[i]);
        let h = x1 - x0;
        let a = ((x1 - t) / h).clamp(0.0, 1.0);
        let b = ((t - x0) / h).clamp(0.0, 1.0);
        (self.y[i] - self.y[i - 1]) / h
            + ((3.0 * b * b - 1.0) * self.m[i] - (3.0 * a * a - 1.0) * self.m[i - 1]) * h / 6.0
    }
}

/// A table over ascending knots that finds `x.partition_point(|&v| v <= t)` in a few
/// comparisons: the knots are counted into buckets of equal width between the ends, and a point
/// is looked for only among the knots of its own bucket. The bucket of a value is a monotone
/// function of it, so every knot of an earlier bucket lies below the point and every knot of a
/// later one above it: the answer is the same index as the bisection's, however the knots are
/// spread (they need not be even).
#[derive(Debug, Clone)]
pub(crate) struct KnotIndex {
    lo: f64,
    scale: f64,
    /// `first[k]`: how many knots lie in buckets before bucket `k` (one entry past the last).
    first: Vec<u32>,
}

impl KnotIndex {
    /// The table of knots `x` (ascending, finite, at least one), two buckets per knot.
    pub(crate) fn new(x: &[f64]) -> Self {
        let n = 2 * x.len();
        let (lo, hi) = (x[0], x[x.len() - 1]);
        let scale = if hi > lo { n as f64 / (hi - lo) } else { 0.0 };
        let mut index = KnotIndex { lo, scale, first: vec![0; n + 1] };
        // Counted, then summed: `first[k + 1]` is the count of knots in buckets up to `k`.
        for &v in x {
            let k = index.bucket(v);
            index.first[k + 1] += 1;
        }
        for k in 0..n {
            index.first[k + 1] += index.first[k];
        }
        index
    }

    /// The bucket of `t`: monotone in `t` (a difference, a product by a positive number, a
    /// conversion that truncates towards zero, and a clamp, each monotone).
    fn bucket(&self, t: f64) -> usize {
        (((t - self.lo) * self.scale).max(0.0) as usize).min(self.first.len() - 2)
    }

    /// `x.partition_point(|&v| v <= t)` for the knots `x` the table was made of.
    pub(crate) fn partition_point(&self, x: &[f64], t: f64) -> usize {
        if t.is_nan() {
            return x.partition_point(|&v| v <= t);
        }
        let k = self.bucket(t);
        let (from, to) = (self.first[k] as usize, self.first[k + 1] as usize);
        from + x[from..to].iter().take_while(|&&v| v <= t).count()
    }
}

/// A point's place on a segment of a [`CubicSpline`]: the segment's index `i` and length `h`, and
/// the point's distances from the segment's ends over its length, `a` from the right, `b` from
/// the left (neither clamped: beyond the ends they pass 0 and 1).
#[derive(Debug, Clone, Copy)]
pub(crate) struct OnSegment {
    i: usize,
    h: f64,
    a: f64,
    b: f64,
}

/// `x.partition_point(|&v| v <= t)` for ascending `x`: the first index whose knot lies above
/// `t`. Knots spread evenly (the span samples of the tooling, a thousand or so) are found from
/// where `t` falls between the ends, a step or two from the guess; a guess more than four knots
/// off finishes by bisection of the rest. The index is the same as the bisection's.
fn locate(x: &[f64], t: f64) -> usize {
    const WALK: usize = 4;
    let n = x.len();
    let (a, b) = (x[0], x[n - 1]);
    // Ends, a NaN, or a single knot: the bisection's own answer.
    if !(t > a && t < b) {
        return x.partition_point(|&v| v <= t);
    }
    // a < t < b, so the index lies in 1..n-1 and both walks stop inside the knots.
    let g = ((((t - a) / (b - a)) * (n - 1) as f64) as usize).min(n - 1);
    if x[g] <= t {
        let mut k = g + 1;
        for _ in 0..WALK {
            if x[k] > t {
                return k;
            }
            k += 1;
        }
        k + x[k..].partition_point(|&v| v <= t)
    } else {
        let mut k = g;
        for _ in 0..WALK {
            if x[k - 1] <= t {
                return k;
            }
            k -= 1;
        }
        x[..k].partition_point(|&v| v <= t)
    }
}

/// Monotone piecewise cubic Hermite interpolant (Fritsch & Carlson, SIAM J. Numer. Anal. 17
/// (1980) 238–246, with the harmonic-mean slopes of Fritsch & Butland 1984): it never overshoots
/// the data between stations, which keeps chord and twist physical.
#[derive(Debug, Clone)]
pub(crate) struct Pchip {
    x: Vec<f64>,
    y: Vec<f64>,
    d: Vec<f64>,
}

impl Pchip {
    /// The interpolant through the points; `x` strictly increasing, at least one point.
    #[track_caller]
    pub(crate) fn new(x: &[f64], y: &[f64]) -> Self {
        assert!(x.len() == y.len() && !x.is_empty(), "pchip needs matching points");
        let n = x.len();
        let mut d = vec![0.0; n];
        if n >= 2 {
            let h: Vec<f64> = x.windows(2).map(|w| w[1] - w[0]).collect();
            let delta: Vec<f64> = (0..n - 1).map(|i| (y[i + 1] - y[i]) / h[i]).collect();
            for i in 1..n - 1 {
                if delta[i - 1] * delta[i] > 0.0 {
                    let w1 = 2.0 * h[i] + h[i - 1];
                    let w2 = h[i] + 2.0 * h[i - 1];
                    d[i] = (w1 + w2) / (w1 / delta[i - 1] + w2 / delta[i]);
                }
            }
            let end = |h0: f64, h1: f64, d0: f64, d1: f64| {
                let s = ((2.0 * h0 + h1) * d0 - h0 * d1) / (h0 + h1);
                if s * d0 <= 0.0 {
                    0.0
                } else if d0 * d1 <= 0.0 && s.abs() > 3.0 * d0.abs() {
                    3.0 * d0
                } else {
                    s
                }
            };
            if n == 2 {
                d[0] = delta[0];
                d[1] = delta[0];
            } else {
                d[0] = end(h[0], h[1], delta[0], delta[1]);
                d[n - 1] = end(h[n - 2], h[n - 3], delta[n - 2], delta[n - 3]);
            }
        }
        Pchip { x: x.to_vec(), y: y.to_vec(), d }
    }

    /// The value at `t`, held constant beyond the ends.
    pub(crate) fn eval(&self, t: f64) -> f64 {
        let n = self.x.len();
        if n == 1 || t <= self.x[0] {
            return self.y[0];
        }
        if t >= self.x[n - 1] {
            return self.y[n - 1];
        }
        let i = locate(&self.x, t).clamp(1, n - 1);
        let (x0, x1) = (self.x[i - 1], self.x[i]);
        let h = x1 - x0;
        let s = (t - x0) / h;
        let h00 = (1.0 + 2.0 * s) * (1.0 - s) * (1.0 - s);
        let h10 = s * (1.0 - s) * (1.0 - s);
        let h01 = s * s * (3.0 - 2.0 * s);
        let h11 = s * s * (s - 1.0);
        h00 * self.y[i - 1] + h10 * h * self.d[i - 1] + h01 * self.y[i] + h11 * h * self.d[i]
    }

    /// The first derivative at `t`: zero beyond the ends (where [`Pchip::eval`] holds the end
    /// value); at a knot, that of the segment to its right.
    pub(crate) fn derivative(&self, t: f64) -> f64 {
        let n = self.x.len();
        if n == 1 || t < self.x[0] || t >= self.x[n - 1] {
            return 0.0;
        }
        // The bisection's index, found from where `t` falls between the ends (see `locate`).
        let i = locate(&self.x, t).clamp(1, n - 1);
        let (x0, x1) = (self.x[i - 1], self.x[i]);
        let h = x1 - x0;
        let s = (t - x0) / h;
        // The Hermite basis differentiated in `s`, over `h`.
        let d00 = 6.0 * s * (s - 1.0);
        let d10 = (1.0 - s) * (1.0 - 3.0 * s);
        let d01 = -d00;
        let d11 = s * (3.0 * s - 2.0);
        (d00 * self.y[i - 1] + d01 * self.y[i]) / h + d10 * self.d[i - 1] + d11 * self.d[i]
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn natural_spline_reproduces_a_straight_line_and_interpolates() {
        let x = [0.0, 1.0, 2.5, 4.0];
        let y: Vec<f64> = x.iter().map(|v| 3.0 * v - 1.0).collect();
        let s = CubicSpline::natural(&x, &y);
        for t in [0.3, 1.7, 3.9] {
            assert!((s.eval(t) - (3.0 * t - 1.0)).abs() < 1e-12);
        }
        // A natural spline through samples of sin converges at fourth order in the interior
        // (de Boor 1978, ch. IV).
        let xs: Vec<f64> = (0..=40).map(|i| i as f64 * 0.1).collect();
        let ys: Vec<f64> = xs.iter().map(|v| v.sin()).collect();
        let s = CubicSpline::natural(&xs, &ys);
        assert!((s.eval(2.05) - 2.05f64.sin()).abs() < 1e-5);
        // Its derivative converges at third order to cos (de Boor 1978, ch. IV).
        assert!((s.derivative(2.05) - 2.05f64.cos()).abs() < 1e-4);
        // The derivative is the limit of the spline's own difference quotient.
        let h = 1e-6;
        let fd = (s.eval(1.234 + h) - s.eval(1.234 - h)) / (2.0 * h);
        assert!((s.derivative(1.234) - fd).abs() < 1e-8);
    }

    #[test]
    fn the_shared_segment_gives_the_separate_evaluations_bit_for_bit() {
        // The fused evaluation must not change a single bit of the outlines the tooling and
        // the ply book are built from: points inside, on and beyond the knots of an uneven
        // grid, against `eval_on`, `derivative_on` and `second_on` one by one.
        let x: Vec<f64> = (0..=80).map(|i| 1.0 - (i as f64 * 0.019).cos()).collect();
        let y: Vec<f64> = x.iter().map(|v| (7.0 * v).sin() + 0.3 * v * v).collect();
        let s = CubicSpline::natural(&x, &y);
        let mut rng = crate::mesh::test_rng::uniform(17);
        let (lo, hi) = (x[0] - 0.1, x[80] + 0.1);
        let points: Vec<f64> =
            x.iter().copied().chain((0..2000).map(|_| lo + (hi - lo) * rng())).collect();
        for t in points {
            let i = s.segment(t);
            let at = s.on_segment(i, t);
            let want = [s.eval_on(i, t), s.derivative_on(i, t), s.second_on(i, t)];
            assert_eq!(s.jet_at(&at).map(f64::to_bits), want.map(f64::to_bits), "at {t}");
            assert_eq!(
                s.value_slope_at(&at).map(f64::to_bits),
                [want[0], want[1]].map(f64::to_bits)
            );
        }
    }

    #[test]
    fn the_knot_table_finds_the_bisections_index() {
        // Knots clustered at both ends (cosine spacing, as airfoil outlines are), with long and
        // empty buckets; knots repeated; a single knot. Points at, between and beyond the knots,
        // a hair either side of them, infinities and NaN.
        let cosine: Vec<f64> = (0..=400)
            .map(|i| 0.5 * (1.0 - (std::f64::consts::PI * i as f64 / 400.0).cos()))
            .collect();
        let clustered: Vec<f64> = (0..=50).map(|i| 3.0 + (i as f64 / 50.0).powi(6)).collect();
        let repeated = vec![0.0, 1.0, 1.0, 1.0, 2.0, 5.0, 5.0];
        let single = vec![2.5];
        let mut rng = crate::mesh::test_rng::uniform(5);
        for x in [cosine, clustered, repeated, single] {
            let index = KnotIndex::new(&x);
            let (lo, hi) = (x[0], x[x.len() - 1]);
            let mut points: Vec<f64> = x
                .iter()
                .flat_map(|&v| {
                    [
                        v,
                        f64::from_bits(v.to_bits() + 1),
                        f64::from_bits(v.to_bits().wrapping_sub(1)),
                    ]
                })
                .collect();
            points.extend((0..3000).map(|_| lo - 0.2 + (hi - lo + 0.4) * rng()));
            points.extend([f64::INFINITY, f64::NEG_INFINITY, f64::NAN, -0.0, lo - 1e300]);
            for t in points {
                assert_eq!(index.partition_point(&x, t), x.partition_point(|&v| v <= t), "{t}");
            }
        }
    }

    #[test]
    fn the_knot_search_is_the_bisection() {
        // Even, uneven (clustered at one end, as a cosine spacing) and two-knot grids, with
        // points at, between, beyond and on the knots.
        let even: Vec<f64> = (0..=1200).map(|i| 0.4 + 0.5 * i as f64 / 1200.0).collect();
        let uneven: Vec<f64> = (0..=60).map(|i| 1.0 - (i as f64 * 0.026).cos()).collect();
        for x in [even, uneven, vec![0.0, 1.0]] {
            let (a, b) = (x[0], x[x.len() - 1]);
            let mut ts: Vec<f64> =
                (0..=5000).map(|i| a - 0.1 + (b - a + 0.2) * i as f64 / 5000.0).collect();
            ts.extend(x.iter().copied());
            ts.extend([f64::NAN, f64::INFINITY, -f64::INFINITY]);
            for t in ts {
                assert_eq!(locate(&x, t), x.partition_point(|&v| v <= t), "{t}");
            }
        }
    }

    #[test]
    fn pchip_does_not_overshoot_monotone_data() {
        // Fritsch & Carlson 1980: monotone data give a monotone interpolant.
        let x = [0.0, 1.0, 2.0, 3.0, 4.0];
        let y = [0.0, 0.0, 1.0, 1.0, 1.0];
        let p = Pchip::new(&x, &y);
        let mut last = -1.0;
        for i in 0..=400 {
            let v = p.eval(i as f64 * 0.01);
            assert!(v >= last - 1e-15 && (-1e-15..=1.0 + 1e-15).contains(&v));
            last = v;
        }
        assert_eq!(p.eval(2.0), 1.0);
    }

    #[test]
    fn the_derivatives_are_those_of_the_interpolants() {
        // Fritsch & Carlson 1980: data on a straight line get the line's slope at every knot,
        // so the interpolant is the line and its derivative the slope (zero beyond the ends,
        // where it is held).
        let x = [0.0, 0.7, 2.0, 3.1];
        let y: Vec<f64> = x.iter().map(|v| 2.5 * v + 1.0).collect();
        let p = Pchip::new(&x, &y);
        for t in [0.1, 0.7, 1.3, 3.0] {
            assert!((p.derivative(t) - 2.5).abs() < 1e-12, "{t}");
        }
        assert_eq!(p.derivative(-0.5), 0.0);
        assert_eq!(p.derivative(3.5), 0.0);
        // On curved data, against the interpolant's own central difference quotient (error
        // O(h²), Burden & Faires, Numerical Analysis, §4.1, from memory).
        let y = [0.0, 0.3, 1.4, 1.5];
        let p = Pchip::new(&x, &y);
        let h = 1e-6;
        for t in [0.2, 1.0, 2.6] {
            let fd = (p.eval(t + h) - p.eval(t - h)) / (2.0 * h);
            assert!((p.derivative(t) - fd).abs() < 1e-7, "{t}");
        }
        // A natural spline's second derivative, against the difference quotient of its first
        // derivative; sin'' = -sin at fourth-order-accurate samples (de Boor 1978, ch. IV).
        let xs: Vec<f64> = (0..=40).map(|i| i as f64 * 0.1).collect();
        let ys: Vec<f64> = xs.iter().map(|v| v.sin()).collect();
        let s = CubicSpline::natural(&xs, &ys);
        for t in [1.234, 2.05, 3.3] {
            let i = s.segment(t);
            let fd = (s.derivative(t + h) - s.derivative(t - h)) / (2.0 * h);
            assert!((s.second_on(i, t) - fd).abs() < 1e-6, "{t}");
            assert!((s.second_on(i, t) + t.sin()).abs() < 2e-3, "{t}");
        }
    }
}

//! Interpolation along the span: chord, twist and pitch axis by a monotone cubic, outlines by
//! linear blending at equal normalised arc length.

use super::ResolvedStation;
use crate::airfoil::{Outline, clustered_stations};
use crate::input::Station;
use crate::interp::Pchip;
use crate::units::Angle;

#[derive(Debug, Clone)]
pub(super) struct SpanInterpolation {
    chord: Pchip,
    twist_rad: Pchip,
    pitch_axis: Pchip,
    radii: Vec<f64>,
}

impl SpanInterpolation {
    pub(super) fn new(stations: &[Station]) -> Self {
        let r: Vec<f64> = stations.iter().map(|s| s.r).collect();
        let col = |f: &dyn Fn(&Station) -> f64| stations.iter().map(f).collect::<Vec<f64>>();
        SpanInterpolation {
            chord: Pchip::new(&r, &col(&|s| s.chord)),
            twist_rad: Pchip::new(&r, &col(&|s| s.twist.rad())),
            pitch_axis: Pchip::new(&r, &col(&|s| s.pitch_axis_frac)),
            radii: r,
        }
    }

    pub(super) fn chord(&self, r: f64) -> f64 {
        self.chord.eval(r)
    }

    pub(super) fn twist(&self, r: f64) -> Angle {
        Angle::from_rad(self.twist_rad.eval(r))
    }

    pub(super) fn pitch_axis_frac(&self, r: f64) -> f64 {
        self.pitch_axis.eval(r)
    }

    /// The neighbouring stations of `r` and the blending weight of the outer one.
    fn bracket(&self, r: f64) -> (usize, usize, f64) {
        let n = self.radii.len();
        let i = self.radii.partition_point(|&v| v <= r).clamp(1, n - 1);
        let (a, b) = (self.radii[i - 1], self.radii[i]);
        let w = ((r - a) / (b - a)).clamp(0.0, 1.0);
        (i - 1, i, w)
    }

    pub(super) fn outline(&self, stations: &[ResolvedStation], r: f64, n: usize) -> Outline {
        let t = clustered_stations(n);
        let (i, j, w) = self.bracket(r);
        let a = stations[i].outline.resample(&t);
        if w == 0.0 {
            return a;
        }
        let b = stations[j].outline.resample(&t);
        if w == 1.0 { b } else { a.blend(&b, w) }
    }
}

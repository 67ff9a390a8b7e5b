//! Interpolation along the span: chord, twist and pitch axis by a monotone cubic, outlines by
//! linear blending at equal normalised arc length.

use std::sync::{Arc, Mutex};

use super::ResolvedStation;
use crate::airfoil::{Outline, clustered_stations};
use crate::interp::Pchip;
use crate::project::Station;
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

    /// The rates of chord (m/m), twist (rad/m) and pitch axis (chord fraction per m) along the
    /// span at `r` (zero beyond the stations; at a station, those of the span beyond it).
    pub(super) fn rates(&self, r: f64) -> [f64; 3] {
        [self.chord.derivative(r), self.twist_rad.derivative(r), self.pitch_axis.derivative(r)]
    }

    /// The neighbouring stations of `r` and the blending weight of the outer one.
    fn bracket(&self, r: f64) -> (usize, usize, f64) {
        let n = self.radii.len();
        let i = self.radii.partition_point(|&v| v <= r).clamp(1, n - 1);
        let (a, b) = (self.radii[i - 1], self.radii[i]);
        let w = ((r - a) / (b - a)).clamp(0.0, 1.0);
        (i - 1, i, w)
    }

    /// The outline at `r` blended from the stations' outlines resampled at one count (see
    /// [`ResampledOutlines`]).
    pub(super) fn outline(&self, resampled: &[Outline], r: f64) -> Outline {
        let (i, j, w) = self.bracket(r);
        let a = &resampled[i];
        if w == 0.0 {
            return a.clone();
        }
        let b = &resampled[j];
        if w == 1.0 { b.clone() } else { a.blend(b, w) }
    }
}

/// Every station's outline resampled at the clustered stations of a count of intervals per
/// surface, computed once per count and kept: the resampling (a spline through the station's
/// full outline) does not depend on the radius, only the blend between two stations does, so
/// the section layouts and the span-wise integrations share one resampling per station.
#[derive(Default)]
pub(super) struct ResampledOutlines {
    by_count: Mutex<Vec<(usize, Arc<[Outline]>)>>,
}

/// At most this many counts are kept; further counts are resampled on each call.
const KEPT_COUNTS: usize = 8;

impl ResampledOutlines {
    /// The stations' outlines resampled with `n` intervals per surface.
    pub(super) fn get(&self, stations: &[ResolvedStation], n: usize) -> Arc<[Outline]> {
        let mut kept = self.by_count.lock().unwrap_or_else(|e| e.into_inner());
        if let Some((_, o)) = kept.iter().find(|(k, _)| *k == n) {
            return o.clone();
        }
        let t = clustered_stations(n);
        let o: Arc<[Outline]> = stations.iter().map(|s| s.outline.resample(&t)).collect();
        if kept.len() < KEPT_COUNTS {
            kept.push((n, o.clone()));
        }
        o
    }
}

impl Clone for ResampledOutlines {
    fn clone(&self) -> Self {
        let kept = self.by_count.lock().unwrap_or_else(|e| e.into_inner());
        ResampledOutlines { by_count: Mutex::new(kept.clone()) }
    }
}

impl std::fmt::Debug for ResampledOutlines {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        let kept = self.by_count.lock().unwrap_or_else(|e| e.into_inner());
        let counts: Vec<usize> = kept.iter().map(|(k, _)| *k).collect();
        f.debug_struct("ResampledOutlines").field("counts", &counts).finish()
    }
}

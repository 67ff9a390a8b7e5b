//! Resultants along the span, integrated from the tip inward.

use super::distribution::{LineLoad, LoadDistribution};
use crate::units::Angle;

/// Force and moment at a cut, rotor frame, moments about the pitch axis at the cut.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Resultant {
    /// Force (X radial, Y in plane, Z along the rotor axis), N.
    pub force: [f64; 3],
    /// Moment (X about the pitch axis, Y flapwise, Z edgewise), N·m.
    pub moment: [f64; 3],
}

/// Beam resultants at a cut in the section's chord frame about the pitch axis, in the sign
/// convention of [`crate::section`].
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct BeamResultants {
    /// Axial force N, N (tension positive).
    pub n: f64,
    /// Torque about the pitch axis T, N·m.
    pub t: f64,
    /// Flapwise moment M_f = ∫ sigma z dA, N·m.
    pub m_flap: f64,
    /// Edgewise moment M_e = ∫ sigma y dA, N·m.
    pub m_edge: f64,
    /// Shear force normal to the chord (chord frame z), N.
    pub v_flap: f64,
    /// Shear force along the chord (chord frame y), N.
    pub v_edge: f64,
}

/// Resultants of one load case along the span.
#[derive(Debug, Clone, PartialEq)]
pub struct SpanLoads {
    /// The case's name.
    pub case: String,
    /// Rotor speed, rad/s.
    pub omega: f64,
    /// Pitch setting.
    pub pitch: Angle,
    /// Radii, root to tip, m.
    pub r: Vec<f64>,
    /// Chord angle at each radius, rad.
    pub chord_angle: Vec<f64>,
    /// Resultants in the rotor frame at each radius.
    pub rotor: Vec<Resultant>,
    /// Beam resultants in the chord frame at each radius.
    pub chord: Vec<BeamResultants>,
}

impl SpanLoads {
    /// The root reaction (resultant at the first radius): what the attachment must carry.
    pub fn root(&self) -> Resultant {
        self.rotor[0]
    }

    /// Beam resultants at `r`, interpolated linearly between grid radii.
    pub fn chord_at(&self, r: f64) -> BeamResultants {
        let n = self.r.len();
        let i = self.r.partition_point(|&v| v <= r).clamp(1, n - 1);
        let w = ((r - self.r[i - 1]) / (self.r[i] - self.r[i - 1])).clamp(0.0, 1.0);
        let (a, b) = (&self.chord[i - 1], &self.chord[i]);
        let l = |p: f64, q: f64| p + w * (q - p);
        BeamResultants {
            n: l(a.n, b.n),
            t: l(a.t, b.t),
            m_flap: l(a.m_flap, b.m_flap),
            m_edge: l(a.m_edge, b.m_edge),
            v_flap: l(a.v_flap, b.v_flap),
            v_edge: l(a.v_edge, b.v_edge),
        }
    }
}

/// Sub-intervals of Simpson's rule in each grid interval.
const SUB: usize = 4;

fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}

fn add(a: &mut [f64; 3], b: [f64; 3], k: f64) {
    for i in 0..3 {
        a[i] += k * b[i];
    }
}

/// Moment density about the pitch-axis point at radius `a` of a line load at radius `rho`.
fn moment_density(l: &LineLoad, rho: f64, a: f64) -> [f64; 3] {
    let mut m = cross([rho - a, l.at[0], l.at[1]], l.f);
    m[0] += l.mx;
    m
}

/// Integrates the distribution from the tip inward: at each grid radius the force and moment of
/// everything outboard (Simpson's rule on each interval, point loads added where they sit).
pub fn span_loads(dist: &LoadDistribution<'_>) -> SpanLoads {
    let grid = dist.grid().to_vec();
    let n = grid.len();
    let mut rotor = vec![Resultant::default(); n];
    let mut acc = Resultant::default();
    for i in (0..n).rev() {
        if i + 1 < n {
            let (a, b) = (grid[i], grid[i + 1]);
            // Carry the outboard resultant from b to a: M_a = M_b + (p_b - p_a) x F_b.
            let arm = cross([b - a, 0.0, 0.0], acc.force);
            add(&mut acc.moment, arm, 1.0);
            // Composite Simpson on SUB parts: exact for the polynomial parts, and keeps the
            // error of the trigonometric lever arms of a twisted blade below 1e-7.
            let h = (b - a) / SUB as f64;
            for j in 0..SUB {
                let lo = a + h * j as f64;
                for (rho, w) in [(lo, 1.0), (lo + 0.5 * h, 4.0), (lo + h, 1.0)] {
                    let l = dist.line_load(rho, [a, b]);
                    add(&mut acc.force, l.f, w * h / 6.0);
                    add(&mut acc.moment, moment_density(&l, rho, a), w * h / 6.0);
                }
            }
        }
        for p in dist.points.iter().filter(|p| (p.r - grid[i]).abs() < 1e-12) {
            add(&mut acc.force, p.f, 1.0);
            add(&mut acc.moment, cross([0.0, p.at[0], p.at[1]], p.f), 1.0);
        }
        rotor[i] = acc;
    }
    let chord_angle: Vec<f64> = grid.iter().map(|&r| dist.chord_angle(r)).collect();
    let chord = rotor
        .iter()
        .zip(&chord_angle)
        .map(|(res, &phi)| {
            let (s, c) = phi.sin_cos();
            // Rotor to chord frame: turn by -phi about X.
            let to_chord = |v: [f64; 3]| [v[0], v[1] * c + v[2] * s, -v[1] * s + v[2] * c];
            let f = to_chord(res.force);
            let m = to_chord(res.moment);
            BeamResultants {
                n: f[0],
                t: m[0],
                m_flap: m[1],
                m_edge: -m[2],
                v_flap: f[2],
                v_edge: f[1],
            }
        })
        .collect();
    SpanLoads {
        case: dist.case().name.clone(),
        omega: dist.case().omega,
        pitch: dist.pitch(),
        r: grid,
        chord_angle,
        rotor,
        chord,
    }
}

//! Deflection of the blade under a load case: curvatures from the section compliance, integrated
//! twice from the clamped root (small deflections; the stiffening of the centrifugal tension on
//! the deflected shape is not counted, which overestimates deflection under spin).

use nalgebra::Vector4;

use super::LoadsError;
use super::integrate::SpanLoads;
use crate::section::SectionProperties;

/// Deflection at the tip, rotor frame.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TipDeflection {
    /// In-plane deflection (Y), m.
    pub in_plane: f64,
    /// Out-of-plane deflection (Z), m.
    pub out_of_plane: f64,
    /// Magnitude of the transverse deflection, m.
    pub total: f64,
    /// Elastic twist at the tip about the pitch axis, rad.
    pub twist: f64,
}

/// Tip deflection of `loads`, using the sections' stiffness about the pitch axis (compliance
/// interpolated linearly between sections) and trapezoidal integration on the loads' grid; for
/// accuracy give loads on a fine grid (see [`super::LoadDistribution::refine`]).
pub fn tip_deflection(
    sections: &[SectionProperties],
    loads: &SpanLoads,
) -> Result<TipDeflection, LoadsError> {
    tip_deflection_carrying(sections, &[], loads)
}

/// [`tip_deflection`] with, per section, the resultants about the pitch axis that its walls'
/// membrane–shear coupling carries per unit shear force `[flap, edge]`
/// ([`crate::section::SolvedSection::shear_carried`], interpolated as the compliance): the
/// curvatures are those of the resultants less what the shear forces make the walls carry, as
/// in the stress recovery. Empty `carried`: none (walls without coupling).
pub fn tip_deflection_carrying(
    sections: &[SectionProperties],
    carried: &[[Vector4<f64>; 2]],
    loads: &SpanLoads,
) -> Result<TipDeflection, LoadsError> {
    let compliances = sections
        .iter()
        .map(|s| s.stiffness_pitch_axis.try_inverse().ok_or(LoadsError::SingularSection { r: s.r }))
        .collect::<Result<Vec<_>, _>>()?;
    let n = loads.r.len();
    let mut curv = Vec::with_capacity(n);
    for (k, &r) in loads.r.iter().enumerate() {
        let i = sections.partition_point(|s| s.r <= r).clamp(1, sections.len() - 1);
        let w = ((r - sections[i - 1].r) / (sections[i].r - sections[i - 1].r)).clamp(0.0, 1.0);
        let c = compliances[i - 1] * (1.0 - w) + compliances[i] * w;
        let b = &loads.chord[k];
        let mut applied = Vector4::new(b.n, b.t, b.m_flap, b.m_edge);
        if let (Some(ka), Some(kb)) = (carried.get(i - 1), carried.get(i)) {
            for (s, v) in [b.v_flap, b.v_edge].into_iter().enumerate() {
                applied -= (ka[s] * (1.0 - w) + kb[s] * w) * v;
            }
        }
        let e = c * applied;
        // Chord-frame deflection curvatures: w'' = -kappa_f, v'' = -kappa_e; to the rotor frame.
        let (s, co) = loads.chord_angle[k].sin_cos();
        let (v2, w2) = (-e[3], -e[2]);
        curv.push((v2 * co - w2 * s, v2 * s + w2 * co, e[1]));
    }
    let (mut slope_y, mut slope_z, mut y, mut z, mut twist) = (0.0, 0.0, 0.0, 0.0, 0.0);
    for k in 1..n {
        let h = loads.r[k] - loads.r[k - 1];
        let (a, b) = (curv[k - 1], curv[k]);
        let (sy0, sz0) = (slope_y, slope_z);
        slope_y += 0.5 * h * (a.0 + b.0);
        slope_z += 0.5 * h * (a.1 + b.1);
        y += 0.5 * h * (sy0 + slope_y);
        z += 0.5 * h * (sz0 + slope_z);
        twist += 0.5 * h * (a.2 + b.2);
    }
    Ok(TipDeflection { in_plane: y, out_of_plane: z, total: y.hypot(z), twist })
}

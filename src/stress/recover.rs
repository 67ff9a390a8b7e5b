//! Stress recovery at one section: beam resultants → generalised strains → wall states (the
//! full midplane deformation of every wall) → ply stresses → strength ratios by every criterion.

use nalgebra::Vector4;

use super::unit::UnitResponse;
use super::{PointStress, WallLocation};
use crate::loads::BeamResultants;
use crate::section::{SectionLayout, SolvedSection, WallPart};

/// Beam resultants about the pitch axis (chord frame) to the solver's frame: `(N, T, M_f, M_e)`
/// about the elastic centre with the torque about the shear centre, and the shear forces.
pub(crate) fn section_resultants(
    section: &SolvedSection,
    b: &BeamResultants,
) -> (Vector4<f64>, [f64; 2]) {
    let p = &section.properties;
    let [ye, ze] = p.elastic_centre;
    let [ys, zs] = p.shear_centre;
    // Moving the reference from the pitch axis to a point c: M_c = M_pa - c x F, so
    // M_f(c) = M_f - z_c N, M_e(c) = M_e - y_c N and T(c) = T - (y_c V_z - z_c V_y).
    let t_sc = b.t - (ys * b.v_flap - zs * b.v_edge);
    (Vector4::new(b.n, t_sc, b.m_flap - ze * b.n, b.m_edge - ye * b.n), [b.v_flap, b.v_edge])
}

/// Where wall elements lie on one section, in words a designer uses: the section's upper-surface
/// end (the outline point furthest aft) found once, so that naming a point costs O(1).
#[derive(Debug, Clone, Copy)]
pub(crate) struct Locator<'a> {
    layout: &'a SectionLayout,
    upper_end: usize,
}

impl<'a> Locator<'a> {
    pub(crate) fn new(layout: &'a SectionLayout) -> Self {
        let upper_end = layout
            .outer
            .iter()
            .enumerate()
            .fold(0, |b, (i, p)| if p[0] > layout.outer[b][0] { i } else { b });
        Locator { layout, upper_end }
    }

    /// Where the wall element of `part` with midpoint `midpoint` lies.
    pub(crate) fn locate(&self, part: &WallPart, midpoint: [f64; 2]) -> WallLocation {
        let layout = self.layout;
        let x = midpoint[0] / layout.chord + layout.pitch_axis_frac;
        match part {
            WallPart::Skin { segment } | WallPart::TrailingEdge { segment } => {
                let upper = *segment < self.upper_end;
                WallLocation::Surface {
                    upper,
                    x_c: x.clamp(0.0, 1.0),
                    solid: matches!(part, WallPart::TrailingEdge { .. }),
                }
            }
            WallPart::Web { web } => {
                let name = layout.webs.get(*web).map(|w| w.name.clone()).unwrap_or_default();
                WallLocation::Web { name, z: midpoint[1] }
            }
        }
    }

    /// Where wall element `k` of `section` lies.
    pub(crate) fn element(&self, section: &SolvedSection, k: usize) -> Option<WallLocation> {
        section.elements().get(k).map(|e| self.locate(&e.part, e.midpoint()))
    }
}

/// The wall states of a section under beam resultants about the pitch axis.
pub(crate) fn section_states(
    section: &SolvedSection,
    resultants: &BeamResultants,
) -> Vec<crate::section::WallState> {
    let (res, shear) = section_resultants(section, resultants);
    let strains = section.strains_under_shear(&res, shear);
    section.wall_states(&strains, shear)
}

/// Ply strength ratios at the midpoint of every wall element of a section under beam resultants.
pub(crate) fn recover_section(
    layout: &SectionLayout,
    section: &SolvedSection,
    units: &[UnitResponse],
    resultants: &BeamResultants,
) -> Vec<PointStress> {
    let elements = section.elements();
    let locator = Locator::new(layout);
    section_states(section, resultants)
        .into_iter()
        .map(|state| {
            let e = &elements[state.element];
            let laminate = &layout.laminates[e.laminate];
            let plies = units[e.laminate].ratios(laminate, &state.deformation);
            PointStress {
                element: state.element,
                laminate: e.laminate,
                position: state.position,
                location: locator.locate(&e.part, e.midpoint()),
                n_x: state.n_x,
                n_xs: state.n_xs,
                deformation: state.deformation,
                plies,
            }
        })
        .collect()
}

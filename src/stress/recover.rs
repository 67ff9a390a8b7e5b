//! Stress recovery at one section: beam resultants → generalised strains → wall states (the
//! full midplane deformation of every wall) → ply stresses → strength ratios by every criterion.

use nalgebra::{Vector3, Vector4};

use super::{PlyPoint, PointStress, StressError, WallLocation};
use crate::failure::{self, CriteriaRatios, MaterialState};
use crate::laminate::{Deformation, Laminate, LaminateLoad, PlyState};
use crate::loads::BeamResultants;
use crate::section::{SectionLayout, SolvedSection, WallPart};

/// The per-ply-face material-axis state of a laminate for each unit component of the midplane
/// deformation `(eps_x, eps_s, gamma_xs, kappa_x, kappa_s, kappa_xs)` and for the temperature
/// change alone, so that any wall deformation costs six multiply-adds per face.
#[derive(Debug, Clone)]
pub(crate) struct UnitResponse {
    /// Per deformation component, per ply: [top, bottom] states for a unit value.
    unit: [Vec<[MaterialState; 2]>; 6],
    /// Per ply: [top, bottom] residual states from the temperature change.
    thermal: Vec<[MaterialState; 2]>,
}

fn faces(p: &PlyState) -> [MaterialState; 2] {
    [
        MaterialState { stress: p.top.stress_12, strain: p.top.strain_12 },
        MaterialState { stress: p.bottom.stress_12, strain: p.bottom.strain_12 },
    ]
}

/// The whole residual state of a face: the restraint part (the load part of a response to a
/// given total deformation) plus the free-expansion part.
fn residual_faces(p: &PlyState) -> [MaterialState; 2] {
    let sum = |a: &crate::laminate::PointState, b: &crate::laminate::PointState| MaterialState {
        stress: a.stress_12 + b.stress_12,
        strain: a.strain_12 + b.strain_12,
    };
    [sum(&p.top, &p.top_thermal), sum(&p.bottom, &p.bottom_thermal)]
}

impl UnitResponse {
    /// Responses of `laminate` as a beam wall. The residual thermal state is that of a wall
    /// free in its membrane (`N_x = N_s = N_xs = 0`) with its curvatures held at zero, as the
    /// closed beam holds them: an unsymmetric wall cannot curl as a free plate would.
    pub(crate) fn new(laminate: &Laminate, delta_t: f64) -> Result<Self, StressError> {
        let basis = |i: usize| {
            let mut d = Deformation::default();
            if i < 3 {
                d.strain[i] = 1.0;
            } else {
                d.curvature[i - 3] = 1.0;
            }
            laminate
                .response(&LaminateLoad::Deformation(d), 0.0)
                .map(|r| r.plies.iter().map(faces).collect::<Vec<_>>())
        };
        let unit = [basis(0)?, basis(1)?, basis(2)?, basis(3)?, basis(4)?, basis(5)?];
        let (nt, _) = laminate.thermal_resultants(delta_t);
        let a = laminate.abd().a;
        let strain = if nt.norm() > 0.0 {
            a.try_inverse().ok_or(crate::laminate::LaminateError::Singular)? * nt
        } else {
            Vector3::zeros()
        };
        let held = Deformation { strain, curvature: Vector3::zeros() };
        let th = laminate.response(&LaminateLoad::Deformation(held), delta_t)?;
        Ok(UnitResponse { unit, thermal: th.plies.iter().map(residual_faces).collect() })
    }

    /// Strength ratios of every ply (worst of its two faces) under the wall deformation `d`.
    pub(crate) fn ratios(&self, laminate: &Laminate, d: &Deformation) -> Vec<PlyPoint> {
        let v = [d.strain.x, d.strain.y, d.strain.z, d.curvature.x, d.curvature.y, d.curvature.z];
        laminate
            .plies()
            .iter()
            .enumerate()
            .map(|(k, ply)| {
                let mut worst: Option<CriteriaRatios> = None;
                let mut stress_at_worst = Vector3::zeros();
                for f in 0..2 {
                    let mut load =
                        MaterialState { stress: Vector3::zeros(), strain: Vector3::zeros() };
                    for (unit, x) in self.unit.iter().zip(v) {
                        load.stress += unit[k][f].stress * x;
                        load.strain += unit[k][f].strain * x;
                    }
                    let fixed = &self.thermal[k][f];
                    let r = failure::evaluate_all(&ply.material, &load, fixed);
                    let lower = match &worst {
                        None => true,
                        Some(w) => governing_ratio(&r) < governing_ratio(w),
                    };
                    worst = Some(match worst {
                        Some(w) => w.worst(&r),
                        None => r,
                    });
                    if lower {
                        stress_at_worst = load.stress + fixed.stress;
                    }
                }
                let ratios = worst.unwrap_or(CriteriaRatios {
                    tsai_wu: None,
                    max_stress: None,
                    max_strain: None,
                    hashin: None,
                });
                PlyPoint { ply_in_laminate: k, ratios, stress_12: stress_at_worst }
            })
            .collect()
    }
}

fn governing_ratio(r: &CriteriaRatios) -> f64 {
    r.governing().map(|(_, s)| s.ratio).unwrap_or(f64::INFINITY)
}

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

/// Where a wall element lies, in words a designer uses.
pub(crate) fn locate(layout: &SectionLayout, part: &WallPart, midpoint: [f64; 2]) -> WallLocation {
    let x = midpoint[0] / layout.chord + layout.pitch_axis_frac;
    let upper_end = layout
        .outer
        .iter()
        .enumerate()
        .fold(0, |b, (i, p)| if p[0] > layout.outer[b][0] { i } else { b });
    match part {
        WallPart::Skin { segment } | WallPart::TrailingEdge { segment } => {
            let upper = *segment < upper_end;
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

/// Ply strength ratios at the midpoint of every wall element of a section under beam resultants.
pub(crate) fn recover_section(
    layout: &SectionLayout,
    section: &SolvedSection,
    units: &[UnitResponse],
    resultants: &BeamResultants,
) -> Vec<PointStress> {
    let (res, shear) = section_resultants(section, resultants);
    let strains = section.strains(&res);
    let elements = section.elements();
    section
        .wall_states(&strains, shear)
        .into_iter()
        .map(|state| {
            let e = &elements[state.element];
            let laminate = &layout.laminates[e.laminate];
            let plies = units[e.laminate].ratios(laminate, &state.deformation);
            PointStress {
                element: state.element,
                laminate: e.laminate,
                position: state.position,
                location: locate(layout, &e.part, e.midpoint()),
                n_x: state.n_x,
                n_xs: state.n_xs,
                deformation: state.deformation,
                plies,
            }
        })
        .collect()
}

//! Stress recovery at one section: beam resultants → generalised strains → wall resultants →
//! ply stresses → strength ratios by every criterion.

use nalgebra::{Vector3, Vector4};

use super::{PlyPoint, PointStress, StressError, WallLocation};
use crate::failure::{self, CriteriaRatios, MaterialState};
use crate::laminate::{Laminate, LaminateLoad, PlyState, Resultants};
use crate::loads::BeamResultants;
use crate::section::{SectionLayout, SolvedSection, WallPart};

/// The per-ply-face material-axis state of a laminate for unit wall resultants and for the
/// temperature change alone, so that any `(N_x, N_xs)` costs two multiply-adds per face.
#[derive(Debug, Clone)]
pub(crate) struct UnitResponse {
    /// Per ply: [top, bottom] states for unit N_x.
    nx: Vec<[MaterialState; 2]>,
    /// Per ply: [top, bottom] states for unit N_xs.
    nxs: Vec<[MaterialState; 2]>,
    /// Per ply: [top, bottom] residual states from the temperature change.
    thermal: Vec<[MaterialState; 2]>,
}

fn faces(p: &PlyState) -> [MaterialState; 2] {
    [
        MaterialState { stress: p.top.stress_12, strain: p.top.strain_12 },
        MaterialState { stress: p.bottom.stress_12, strain: p.bottom.strain_12 },
    ]
}

fn thermal_faces(p: &PlyState) -> [MaterialState; 2] {
    [
        MaterialState { stress: p.top_thermal.stress_12, strain: p.top_thermal.strain_12 },
        MaterialState { stress: p.bottom_thermal.stress_12, strain: p.bottom_thermal.strain_12 },
    ]
}

impl UnitResponse {
    /// Responses of `laminate` as a beam wall (hoop force and wall moments free).
    pub(crate) fn new(laminate: &Laminate, delta_t: f64) -> Result<Self, StressError> {
        let unit = |n: Vector3<f64>| {
            laminate.response(&LaminateLoad::Resultants(Resultants { n, m: Vector3::zeros() }), 0.0)
        };
        let nx = unit(Vector3::new(1.0, 0.0, 0.0))?;
        let nxs = unit(Vector3::new(0.0, 0.0, 1.0))?;
        let th = laminate.response(&LaminateLoad::Resultants(Resultants::default()), delta_t)?;
        Ok(UnitResponse {
            nx: nx.plies.iter().map(faces).collect(),
            nxs: nxs.plies.iter().map(faces).collect(),
            thermal: th.plies.iter().map(thermal_faces).collect(),
        })
    }

    /// Strength ratios of every ply (worst of its two faces) under wall resultants `n_x`, `n_xs`.
    pub(crate) fn ratios(&self, laminate: &Laminate, n_x: f64, n_xs: f64) -> Vec<PlyPoint> {
        laminate
            .plies()
            .iter()
            .enumerate()
            .map(|(k, ply)| {
                let mut worst: Option<CriteriaRatios> = None;
                let mut stress_at_worst = Vector3::zeros();
                for f in 0..2 {
                    let (a, b) = (&self.nx[k][f], &self.nxs[k][f]);
                    let load = MaterialState {
                        stress: a.stress * n_x + b.stress * n_xs,
                        strain: a.strain * n_x + b.strain * n_xs,
                    };
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
            let plies = units[e.laminate].ratios(laminate, state.n_x, state.n_xs);
            PointStress {
                element: state.element,
                laminate: e.laminate,
                position: state.position,
                location: locate(layout, &e.part, e.midpoint()),
                n_x: state.n_x,
                n_xs: state.n_xs,
                plies,
            }
        })
        .collect()
}

//! Stress recovery at one section: beam resultants → generalised strains → wall states (the
//! full midplane deformation of every wall) → ply stresses → strength ratios by every criterion.

use nalgebra::{Vector3, Vector4};

use super::{PlyPoint, PointStress, StressError, WallLocation};
use crate::failure::{CriteriaRatios, Criterion, MaterialState, StrengthConstants, StrengthRatio};
use crate::laminate::{Deformation, Laminate, LaminateLoad, PlyState};
use crate::loads::BeamResultants;
use crate::section::{SectionLayout, SolvedSection, WallPart};

/// The material-axis state of one ply face for each unit component of the midplane deformation
/// `(eps_x, eps_s, gamma_xs, kappa_x, kappa_s, kappa_xs)`, and its residual state from the
/// temperature change: one contiguous record, so that a face under any wall deformation costs
/// six multiply-adds per component read from one place.
#[derive(Debug, Clone)]
struct FaceUnit {
    /// Stress per unit of each deformation component, Pa.
    stress: [Vector3<f64>; 6],
    /// Mechanical strain per unit of each deformation component.
    strain: [Vector3<f64>; 6],
    /// The residual state (restraint plus free-expansion part).
    fixed: MaterialState,
}

/// The per-ply-face responses of a laminate as a beam wall, flat: faces `2 k` (top) and
/// `2 k + 1` (bottom) of ply `k`.
#[derive(Debug, Clone)]
pub(crate) struct UnitResponse {
    faces: Vec<FaceUnit>,
    /// The strength constants of each ply's material, computed once per material of the
    /// laminate (plies of one material share them).
    strength: Vec<StrengthConstants>,
    /// Per face: whether it is bit for bit the face before it with the same strength constants
    /// (the top of a ply on the bottom of a ply of the same material and angle, as in a stack
    /// of unidirectional cap plies), so that its ratios are those of the face before and are
    /// not evaluated again.
    repeats: Vec<bool>,
}

impl FaceUnit {
    /// Whether two faces hold the same numbers, bit for bit.
    fn same_bits(&self, other: &FaceUnit) -> bool {
        let bits = |f: &FaceUnit| {
            let mut out = [0u64; 42];
            let vectors =
                f.stress.iter().chain(&f.strain).chain([&f.fixed.stress, &f.fixed.strain]);
            for (chunk, v) in out.chunks_exact_mut(3).zip(vectors) {
                for (o, x) in chunk.iter_mut().zip(v.iter()) {
                    *o = x.to_bits();
                }
            }
            out
        };
        bits(self) == bits(other)
    }
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
        let basis = [0, 1, 2, 3, 4, 5].map(|i| {
            let mut d = Deformation::default();
            if i < 3 {
                d.strain[i] = 1.0;
            } else {
                d.curvature[i - 3] = 1.0;
            }
            LaminateLoad::Deformation(d)
        });
        let unit: Vec<Vec<[MaterialState; 2]>> = laminate
            .responses(&basis, 0.0)?
            .iter()
            .map(|r| r.plies.iter().map(faces).collect())
            .collect();
        let (nt, _) = laminate.thermal_resultants(delta_t);
        let a = laminate.abd().a;
        let strain = if nt.norm() > 0.0 {
            a.try_inverse().ok_or(crate::laminate::LaminateError::Singular)? * nt
        } else {
            Vector3::zeros()
        };
        let held = Deformation { strain, curvature: Vector3::zeros() };
        let th = laminate.response(&LaminateLoad::Deformation(held), delta_t)?;
        let thermal: Vec<[MaterialState; 2]> = th.plies.iter().map(residual_faces).collect();
        let mut out = Vec::with_capacity(2 * thermal.len());
        for (k, fixed) in thermal.iter().enumerate() {
            for (f, fixed) in fixed.iter().enumerate() {
                out.push(FaceUnit {
                    stress: [0, 1, 2, 3, 4, 5].map(|i| unit[i][k][f].stress),
                    strain: [0, 1, 2, 3, 4, 5].map(|i| unit[i][k][f].strain),
                    fixed: *fixed,
                });
            }
        }
        let mut known: Vec<(*const crate::material::Lamina, StrengthConstants)> = Vec::new();
        let strength: Vec<StrengthConstants> = laminate
            .plies()
            .iter()
            .map(|p| {
                let key = std::sync::Arc::as_ptr(&p.material);
                match known.iter().find(|(k, _)| *k == key) {
                    Some((_, c)) => *c,
                    None => {
                        let c = StrengthConstants::new(&p.material);
                        known.push((key, c));
                        c
                    }
                }
            })
            .collect();
        let repeats = (0..out.len())
            .map(|f| {
                f > 0
                    && strength.get(f / 2) == strength.get((f - 1) / 2)
                    && out[f].same_bits(&out[f - 1])
            })
            .collect();
        Ok(UnitResponse { faces: out, strength, repeats })
    }

    /// Strength ratios of every ply (worst of its two faces) under the wall deformation `d`.
    pub(crate) fn ratios(&self, laminate: &Laminate, d: &Deformation) -> Vec<PlyPoint> {
        let mut out = Vec::with_capacity(laminate.plies().len());
        self.ratios_into(laminate, d, &mut out);
        out
    }

    /// As [`UnitResponse::ratios`], into `out` (cleared first), so that a caller that keeps no
    /// points reuses one buffer for the whole blade.
    pub(crate) fn ratios_into(
        &self,
        laminate: &Laminate,
        d: &Deformation,
        out: &mut Vec<PlyPoint>,
    ) {
        out.clear();
        let v = [d.strain.x, d.strain.y, d.strain.z, d.curvature.x, d.curvature.y, d.curvature.z];
        let n = laminate.plies().len().min(self.strength.len());
        // The ratios and stresses of the face before, for a face that repeats it.
        let mut before: Option<(CriteriaRatios, Vector3<f64>)> = None;
        for (k, ((pair, repeats), strength)) in self
            .faces
            .chunks_exact(2)
            .zip(self.repeats.chunks_exact(2))
            .zip(&self.strength)
            .take(n)
            .enumerate()
        {
            let mut face_ratios = |face: &FaceUnit, repeats: bool| {
                if let (true, Some(b)) = (repeats, before) {
                    return b;
                }
                let mut load = MaterialState { stress: Vector3::zeros(), strain: Vector3::zeros() };
                for ((s, e), x) in face.stress.iter().zip(&face.strain).zip(v) {
                    load.stress += s * x;
                    load.strain += e * x;
                }
                let r =
                    (strength.evaluate_all(&load, &face.fixed), load.stress + face.fixed.stress);
                before = Some(r);
                r
            };
            let top = face_ratios(&pair[0], repeats[0]);
            let bottom = face_ratios(&pair[1], repeats[1]);
            // The face with the strictly lower governing ratio gives the stresses (the top face
            // on a tie); each criterion takes the worse of the two faces.
            let lower = governing_ratio(&bottom.0) < governing_ratio(&top.0);
            let ratios = top.0.worst(&bottom.0);
            out.push(PlyPoint {
                ply_in_laminate: k,
                schedule_ply: laminate.plies().get(k).and_then(|p| p.schedule_ply),
                governing: governing(&ratios),
                ratios,
                stress_12: if lower { bottom.1 } else { top.1 },
            });
        }
    }
}

/// [`CriteriaRatios::governing`] written out for the inner loop: the least ratio in the total
/// order of `f64`, the first criterion in [`Criterion::ALL`] order on a tie (as `min_by`).
#[inline]
fn governing(r: &CriteriaRatios) -> Option<(Criterion, StrengthRatio)> {
    let mut best: Option<(Criterion, StrengthRatio)> = None;
    for (c, v) in [
        (Criterion::TsaiWu, r.tsai_wu),
        (Criterion::MaxStress, r.max_stress),
        (Criterion::MaxStrain, r.max_strain),
        (Criterion::Hashin, r.hashin),
    ] {
        if let Some(v) = v {
            match best {
                Some((_, b)) if v.ratio.total_cmp(&b.ratio) != std::cmp::Ordering::Less => {}
                _ => best = Some((c, v)),
            }
        }
    }
    best
}

#[inline]
fn governing_ratio(r: &CriteriaRatios) -> f64 {
    governing(r).map_or(f64::INFINITY, |(_, s)| s.ratio)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::failure::{FailureMode, StrengthRatio};

    #[test]
    fn repeated_faces_give_the_ratios_of_every_face_evaluated() {
        use crate::failure::evaluate_all;
        use crate::laminate::{Deformation, Laminate, LayupCode};
        use crate::material::Lamina;
        // T300/5208 (Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1), with
        // CTEs (0.02 and 22.5 µstrain/K, Kaw Table 2.1, from memory) so that the residual part
        // is not zero.
        let tape = Lamina::builder("t300")
            .elastic(181e9, 10.3e9, 7.17e9, 0.28)
            .ply_thickness(0.125e-3)
            .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
            .cte(0.02e-6, 22.5e-6)
            .build()
            .unwrap();
        // An unsymmetric wall with a stack of like plies (the faces inside it repeat) between
        // unlike ones.
        let code: LayupCode = "[45/0/0/0/0/-45/90/90]".parse().unwrap();
        let laminate = Laminate::from_code(&code, &tape);
        let unit = UnitResponse::new(&laminate, -100.0).unwrap();
        assert!(unit.repeats.iter().filter(|&&r| r).count() >= 3, "{:?}", unit.repeats);
        let d = Deformation {
            strain: Vector3::new(2e-3, -4e-4, 1.5e-3),
            curvature: Vector3::new(3.0, 0.0, -1.2),
        };
        let got = unit.ratios(&laminate, &d);
        let v = [d.strain.x, d.strain.y, d.strain.z, d.curvature.x, d.curvature.y, d.curvature.z];
        for (k, ply) in laminate.plies().iter().enumerate() {
            let face = |f: &FaceUnit| {
                let mut load = MaterialState { stress: Vector3::zeros(), strain: Vector3::zeros() };
                for ((s, e), x) in f.stress.iter().zip(&f.strain).zip(v) {
                    load.stress += s * x;
                    load.strain += e * x;
                }
                evaluate_all(&ply.material, &load, &f.fixed)
            };
            let want = face(&unit.faces[2 * k]).worst(&face(&unit.faces[2 * k + 1]));
            assert_eq!(got[k].ratios, want, "ply {k}");
            assert_eq!(got[k].governing, want.governing(), "ply {k}");
        }
    }

    #[test]
    fn written_out_governing_agrees_with_the_library_on_ties_and_gaps() {
        let r = |x: f64| Some(StrengthRatio { ratio: x, mode: FailureMode::Shear });
        let values = [None, r(0.0), r(-0.0), r(1.0), r(2.0), r(f64::INFINITY), r(f64::NAN)];
        for a in values {
            for b in values {
                for c in values {
                    for d in values {
                        let set =
                            CriteriaRatios { tsai_wu: a, max_stress: b, max_strain: c, hashin: d };
                        let (x, y) = (governing(&set), set.governing());
                        assert_eq!(x.map(|g| g.0), y.map(|g| g.0));
                        assert_eq!(x.map(|g| g.1.ratio.to_bits()), y.map(|g| g.1.ratio.to_bits()));
                    }
                }
            }
        }
    }
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
    let strains = section.strains(&res);
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

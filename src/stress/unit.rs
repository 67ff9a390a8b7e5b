//! The unit responses of a wall laminate (the material-axis state of every ply face per unit of
//! each midplane deformation component, and its residual thermal state), and the strength
//! ratios of its plies under any wall deformation from them.
//!
//! The responses are the numbers [`Laminate::responses`] gives for the six unit deformations
//! and [`Laminate::response`] for the held thermal state, to the bit: the same operations in the
//! same order, with the laminate's stiffness, compliance and thermal resultants formed once per
//! laminate and each ply's stiffness and transformations once per ply.

use std::sync::Arc;

use nalgebra::{Matrix3, Vector3, Vector6};

use super::{PlyPoint, StressError};
use crate::failure::{CriteriaRatios, Criterion, MaterialState, StrengthConstants, StrengthRatio};
use crate::laminate::{
    Abd, Deformation, Laminate, LaminateError, Ply, strain_to_material, stress_to_material,
    thermal_expansion, transformed_stiffness,
};
use crate::material::Lamina;

/// The material-axis state of one ply face for each unit component of the midplane deformation
/// `(eps_x, eps_s, gamma_xs, kappa_x, kappa_s, kappa_xs)`, and its residual state from the
/// temperature change: one contiguous record, each component's stress and strain side by side,
/// so that a face under any wall deformation costs six multiply-adds per component, done two at
/// a time.
#[derive(Debug, Clone)]
pub(super) struct FaceUnit {
    /// Per deformation component: stress (sigma1, sigma2, tau12; Pa) then mechanical strain
    /// (eps1, eps2, gamma12) per unit of it.
    unit: [[f64; 6]; 6],
    /// The residual state (restraint plus free-expansion part).
    pub(super) fixed: MaterialState,
}

impl FaceUnit {
    pub(super) fn new(
        stress: [Vector3<f64>; 6],
        strain: [Vector3<f64>; 6],
        fixed: MaterialState,
    ) -> Self {
        let unit = [0, 1, 2, 3, 4, 5].map(|i| {
            let (s, e) = (stress[i], strain[i]);
            [s.x, s.y, s.z, e.x, e.y, e.z]
        });
        FaceUnit { unit, fixed }
    }

    /// Stress per unit of deformation component `i`, Pa.
    #[cfg(test)]
    pub(super) fn stress(&self, i: usize) -> Vector3<f64> {
        let u = &self.unit[i];
        Vector3::new(u[0], u[1], u[2])
    }

    /// Mechanical strain per unit of deformation component `i`.
    #[cfg(test)]
    pub(super) fn strain(&self, i: usize) -> Vector3<f64> {
        let u = &self.unit[i];
        Vector3::new(u[3], u[4], u[5])
    }

    /// Whether two faces hold the same numbers, bit for bit.
    fn same_bits(&self, other: &FaceUnit) -> bool {
        let same = |a: &[f64], b: &[f64]| a.iter().zip(b).all(|(x, y)| x.to_bits() == y.to_bits());
        self.unit.iter().zip(&other.unit).all(|(a, b)| same(a, b))
            && same(self.fixed.stress.as_slice(), other.fixed.stress.as_slice())
            && same(self.fixed.strain.as_slice(), other.fixed.strain.as_slice())
    }

    /// The face's load part under the deformation components `v`: each of the six sums taken
    /// in component order from zero, as `Vector3` sums of `unit * v_i` would.
    #[inline(always)]
    fn load(&self, v: &[f64; 6]) -> MaterialState {
        let mut acc = [0.0; 6];
        for (u, x) in self.unit.iter().zip(v) {
            for (a, c) in acc.iter_mut().zip(u) {
                *a += c * x;
            }
        }
        MaterialState {
            stress: Vector3::new(acc[0], acc[1], acc[2]),
            strain: Vector3::new(acc[3], acc[4], acc[5]),
        }
    }
}

/// What a ply's material and angle alone fix: its stiffness Q-bar, its stress and strain
/// transformations and its free thermal strain per kelvin, each from the laminate module's own
/// function (so the same numbers to the bit).
#[derive(Debug, Clone, Copy)]
struct PlyMatrices {
    qb: Matrix3<f64>,
    ts: Matrix3<f64>,
    te: Matrix3<f64>,
    alpha: Vector3<f64>,
    /// The material-axis state per unit membrane strain `eps_x`, `eps_s`, `gamma_xs`: the same
    /// at every height in the ply (the unit membrane deformations carry zero curvatures, whose
    /// product with any finite height is a signed zero that leaves the strains as they are).
    membrane: [MaterialState; 3],
}

/// The strength constants and ply matrices met so far, by material (the `Arc` a ply holds) and
/// angle, so that the laminates of a section, which share a few materials and angles, work them
/// out once rather than at every ply of every laminate (Q-bar four times a ply before).
#[derive(Debug, Default)]
pub(crate) struct MaterialCache {
    strength: Vec<(*const Lamina, StrengthConstants)>,
    plies: Vec<(*const Lamina, u64, PlyMatrices)>,
}

/// Entries kept of ply matrices; beyond, the cache starts again (a blade whose fibre angles
/// vary ply by ply would otherwise make the search grow without end).
const MAX_PLY_ENTRIES: usize = 64;

impl MaterialCache {
    fn strength(&mut self, material: &Arc<Lamina>) -> StrengthConstants {
        let key = Arc::as_ptr(material);
        match self.strength.iter().find(|(k, _)| *k == key) {
            Some((_, c)) => *c,
            None => {
                let c = StrengthConstants::new(material);
                self.strength.push((key, c));
                c
            }
        }
    }

    fn ply(&mut self, ply: &Ply) -> PlyMatrices {
        let key = (Arc::as_ptr(&ply.material), ply.angle.rad().to_bits());
        if let Some((_, _, m)) = self.plies.iter().find(|(k, a, _)| (*k, *a) == key) {
            return *m;
        }
        let (qb, ts, te) = (
            transformed_stiffness(&ply.material, ply.angle),
            stress_to_material(ply.angle),
            strain_to_material(ply.angle),
        );
        let membrane = [0, 1, 2].map(|i| {
            let d = unit_deformation(i);
            unit_point(&qb, &ts, &te, &d, 0.0, Vector3::zeros())
        });
        let m = PlyMatrices {
            qb,
            ts,
            te,
            alpha: thermal_expansion(&ply.material, ply.angle),
            membrane,
        };
        if self.plies.len() >= MAX_PLY_ENTRIES {
            self.plies.clear();
        }
        self.plies.push((key.0, key.1, m));
        m
    }
}

/// Unit deformation component `i` of `(eps_x, eps_s, gamma_xs, kappa_x, kappa_s, kappa_xs)`.
fn unit_deformation(i: usize) -> Deformation {
    let mut d = Deformation::default();
    if i < 3 {
        d.strain[i] = 1.0;
    } else {
        d.curvature[i - 3] = 1.0;
    }
    d
}

/// The material-axis state at height `z` of a ply (stiffness `qb`, transformations `ts` and
/// `te`) under the midplane deformation `d` less the free strain `free`, as
/// `Laminate::response` works it out.
#[inline]
fn unit_point(
    qb: &Matrix3<f64>,
    ts: &Matrix3<f64>,
    te: &Matrix3<f64>,
    d: &Deformation,
    z: f64,
    free: Vector3<f64>,
) -> MaterialState {
    let strain_xy = d.strain + d.curvature * z;
    let mech = strain_xy - free;
    let stress_xy = qb * mech;
    MaterialState { stress: ts * stress_xy, strain: te * mech }
}

/// The per-ply-face responses of a laminate as a beam wall, flat: faces `2 k` (top) and
/// `2 k + 1` (bottom) of ply `k`.
#[derive(Debug, Clone)]
pub(crate) struct UnitResponse {
    pub(super) faces: Vec<FaceUnit>,
    /// The strength constants of each ply's material.
    strength: Vec<StrengthConstants>,
    /// Per face: whether it is bit for bit the face before it with the same strength constants
    /// (the top of a ply on the bottom of a ply of the same material and angle, as in a stack
    /// of unidirectional cap plies), so that its ratios are those of the face before and are
    /// not evaluated again.
    pub(super) repeats: Vec<bool>,
}

/// The ratios of one face and the stresses there (residual part included).
#[derive(Debug, Clone, Copy)]
struct FaceRatios {
    ratios: CriteriaRatios,
    stress: Vector3<f64>,
}

impl UnitResponse {
    /// Responses of `laminate` as a beam wall. The residual thermal state is that of a wall
    /// free in its membrane (`N_x = N_s = N_xs = 0`) with its curvatures held at zero, as the
    /// closed beam holds them: an unsymmetric wall cannot curl as a free plate would.
    pub(crate) fn new(laminate: &Laminate, delta_t: f64) -> Result<Self, StressError> {
        Self::with_cache(laminate, delta_t, &mut MaterialCache::default())
    }

    /// As [`UnitResponse::new`], taking the strength constants from `cache`.
    pub(crate) fn with_cache(
        laminate: &Laminate,
        delta_t: f64,
        cache: &mut MaterialCache,
    ) -> Result<Self, StressError> {
        let plies = laminate.plies();
        let bounds = laminate.ply_bounds();
        let matrices: Vec<PlyMatrices> = plies.iter().map(|p| cache.ply(p)).collect();
        // `Laminate::abd` and `Laminate::thermal_resultants`, the same sums in the same order.
        let (mut a, mut b, mut d) = (Matrix3::zeros(), Matrix3::zeros(), Matrix3::zeros());
        let (mut nt, mut mt) = (Vector3::zeros(), Vector3::zeros());
        for (m, &(zt, zb)) in matrices.iter().zip(&bounds) {
            a += m.qb * (zt - zb);
            b += m.qb * ((zt * zt - zb * zb) / 2.0);
            d += m.qb * ((zt * zt * zt - zb * zb * zb) / 3.0);
        }
        for (m, &(zt, zb)) in matrices.iter().zip(&bounds) {
            let qa = m.qb * m.alpha * delta_t;
            nt += qa * (zt - zb);
            mt += qa * ((zt * zt - zb * zb) / 2.0);
        }
        let abd = Abd { a, b, d };
        let c = abd.compliance().ok_or(LaminateError::Singular)?;
        let strain = if nt.norm() > 0.0 {
            abd.a.try_inverse().ok_or(LaminateError::Singular)? * nt
        } else {
            Vector3::zeros()
        };
        // The held state as `Laminate::response` takes a given total deformation: the load
        // part is the given deformation less the free laminate's thermal one.
        let thermal = c * Vector6::new(nt.x, nt.y, nt.z, mt.x, mt.y, mt.z);
        let held = Vector6::new(strain.x, strain.y, strain.z, 0.0, 0.0, 0.0) - thermal;
        let split = |v: Vector6<f64>| Deformation {
            strain: Vector3::new(v[0], v[1], v[2]),
            curvature: Vector3::new(v[3], v[4], v[5]),
        };
        let (thermal, held) = (split(thermal), split(held));
        // The unit deformations, as `Laminate::responses` at no temperature change takes them
        // (less a free thermal deformation of signed zeros, which leaves them as they are).
        let bending = [3, 4, 5].map(unit_deformation);
        let mut faces = Vec::with_capacity(2 * plies.len());
        let mut strength = Vec::with_capacity(plies.len());
        for ((p, m), &(zt, zb)) in plies.iter().zip(&matrices).zip(&bounds) {
            let alpha = m.alpha * delta_t;
            let point = |d: &Deformation, z: f64, free: Vector3<f64>| {
                unit_point(&m.qb, &m.ts, &m.te, d, z, free)
            };
            for z in [zt, zb] {
                let [k0, k1, k2] = bending.map(|d| point(&d, z, Vector3::zeros()));
                let [e0, e1, e2] = m.membrane;
                let unit = [e0, e1, e2, k0, k1, k2];
                let load = point(&held, z, Vector3::zeros());
                let free = point(&thermal, z, alpha);
                faces.push(FaceUnit::new(
                    unit.map(|u| u.stress),
                    unit.map(|u| u.strain),
                    MaterialState {
                        stress: load.stress + free.stress,
                        strain: load.strain + free.strain,
                    },
                ));
            }
            strength.push(cache.strength(&p.material));
        }
        let repeats = (0..faces.len())
            .map(|f| {
                f > 0
                    && strength.get(f / 2) == strength.get((f - 1) / 2)
                    && faces[f].same_bits(&faces[f - 1])
            })
            .collect();
        Ok(UnitResponse { faces, strength, repeats })
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
        let plies = laminate.plies();
        let n = plies.len().min(self.strength.len()).min(self.faces.len() / 2);
        out.reserve(n);
        // The ratios and stresses of the bottom face of the ply before, for a top face that
        // repeats it.
        let mut before: Option<FaceRatios> = None;
        for (k, (ply, strength)) in plies.iter().zip(&self.strength).take(n).enumerate() {
            let top = match before {
                Some(b) if self.repeats[2 * k] => b,
                _ => self.face(2 * k, strength, &v),
            };
            let bottom =
                if self.repeats[2 * k + 1] { top } else { self.face(2 * k + 1, strength, &v) };
            before = Some(bottom);
            // The face with the strictly lower governing ratio gives the stresses (the top face
            // on a tie); each criterion takes the worse of the two faces.
            let lower = governing_ratio(&bottom.ratios) < governing_ratio(&top.ratios);
            let ratios = top.ratios.worst(&bottom.ratios);
            out.push(PlyPoint {
                ply_in_laminate: k,
                schedule_ply: ply.schedule_ply,
                governing: governing(&ratios),
                ratios,
                stress_12: if lower { bottom.stress } else { top.stress },
            });
        }
    }

    /// The ratios of face `f` under the deformation components `v` (inlined into the ply loop).
    #[inline(always)]
    fn face(&self, f: usize, strength: &StrengthConstants, v: &[f64; 6]) -> FaceRatios {
        let unit = &self.faces[f];
        let load = unit.load(v);
        FaceRatios {
            ratios: strength.evaluate_all(&load, &unit.fixed),
            stress: load.stress + unit.fixed.stress,
        }
    }
}

/// [`CriteriaRatios::governing`] written out for the inner loop: the least ratio in the total
/// order of `f64`, the first criterion in [`Criterion::ALL`] order on a tie (as `min_by`).
#[inline]
pub(super) fn governing(r: &CriteriaRatios) -> Option<(Criterion, StrengthRatio)> {
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

    /// The unit responses as [`Laminate::responses`] and [`Laminate::response`] give them: the
    /// laminate module's general path, which the direct construction must match to the bit.
    fn through_laminate_responses(laminate: &Laminate, delta_t: f64) -> Vec<FaceUnit> {
        use crate::laminate::{LaminateLoad, PlyState, PointState};
        let basis = [0, 1, 2, 3, 4, 5].map(|i| {
            let mut d = Deformation::default();
            if i < 3 {
                d.strain[i] = 1.0;
            } else {
                d.curvature[i - 3] = 1.0;
            }
            LaminateLoad::Deformation(d)
        });
        let unit = laminate.responses(&basis, 0.0).unwrap();
        let (nt, _) = laminate.thermal_resultants(delta_t);
        let strain = if nt.norm() > 0.0 {
            laminate.abd().a.try_inverse().unwrap() * nt
        } else {
            Vector3::zeros()
        };
        let held = Deformation { strain, curvature: Vector3::zeros() };
        let th = laminate.response(&LaminateLoad::Deformation(held), delta_t).unwrap();
        let face = |p: &PlyState, top: bool| if top { p.top } else { p.bottom };
        let sum = |a: &PointState, b: &PointState| MaterialState {
            stress: a.stress_12 + b.stress_12,
            strain: a.strain_12 + b.strain_12,
        };
        let mut out = Vec::new();
        for (k, p) in th.plies.iter().enumerate() {
            for top in [true, false] {
                out.push(FaceUnit::new(
                    [0, 1, 2, 3, 4, 5].map(|i| face(&unit[i].plies[k], top).stress_12),
                    [0, 1, 2, 3, 4, 5].map(|i| face(&unit[i].plies[k], top).strain_12),
                    if top {
                        sum(&p.top, &p.top_thermal)
                    } else {
                        sum(&p.bottom, &p.bottom_thermal)
                    },
                ));
            }
        }
        out
    }

    #[test]
    fn direct_unit_responses_are_those_of_the_laminate_to_the_bit() {
        use crate::units::Angle;
        // T300/5208 and an E-glass/epoxy (`material::kaw`, a published table), and a foam-like
        // isotropic layer without CTEs (invented values).
        let carbon = Arc::new(crate::material::kaw::t300().build().unwrap());
        let glass = Arc::new(crate::material::kaw::e_glass().build().unwrap());
        let foam = Arc::new(
            Lamina::builder("foam")
                .elastic(0.1e9, 0.1e9, 0.04e9, 0.25)
                .ply_thickness(5e-3)
                .build()
                .unwrap(),
        );
        let ply = |m: &Arc<Lamina>, deg: f64| Ply::new(m.clone(), Angle::from_deg(deg));
        // An unsymmetric, coupled wall of two materials; a sandwich with an isotropic core;
        // and a single off-axis ply.
        let walls = [
            Laminate::new(vec![
                ply(&carbon, 0.0),
                ply(&glass, 30.0),
                ply(&carbon, -45.0),
                ply(&carbon, -45.0),
                ply(&glass, 90.0),
            ]),
            Laminate::new(vec![ply(&glass, 45.0), ply(&foam, 0.0), ply(&glass, -45.0)]),
            Laminate::new(vec![ply(&carbon, 17.0)]),
        ];
        // One cache across the walls and temperatures, as a section's recovery shares it.
        let mut cache = MaterialCache::default();
        for (w, lam) in walls.iter().enumerate() {
            let with_cte = lam.plies().iter().all(|p| p.material.cte.is_some());
            let temps: &[f64] = if with_cte { &[0.0, -100.0, 35.5] } else { &[0.0] };
            for &delta_t in temps {
                let got = UnitResponse::with_cache(lam, delta_t, &mut cache).unwrap();
                let want = through_laminate_responses(lam, delta_t);
                assert_eq!(got.faces.len(), want.len());
                for (f, (a, b)) in got.faces.iter().zip(&want).enumerate() {
                    assert!(a.same_bits(b), "wall {w}, delta_T {delta_t}, face {f}: {a:?} {b:?}");
                }
            }
        }
    }

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
                for (i, x) in v.iter().enumerate() {
                    load.stress += f.stress(i) * *x;
                    load.strain += f.strain(i) * *x;
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

//! First-ply failure of a laminate: strength ratios at both faces of every ply by every
//! criterion, and the ply, face, criterion and mode with the lowest load multiplier.
//!
//! Stresses vary linearly through each ply and every criterion here is convex in stress, so the
//! lowest ratio of a ply lies at its top or bottom face; checking the two faces is enough
//! (Kaw, *Mechanics of Composite Materials*, 2nd ed., 2006, §4.4, checks the same points).

use super::{CriteriaRatios, Criterion, MaterialState, StrengthRatio, evaluate_all};
use crate::laminate::{Laminate, LaminateResponse, PointState};

/// A face of a ply.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Face {
    /// The outer face (larger `z`).
    Top,
    /// The inner face (smaller `z`).
    Bottom,
}

impl Face {
    /// The key used in JSON (`top`, `bottom`).
    pub fn key(self) -> &'static str {
        match self {
            Face::Top => "top",
            Face::Bottom => "bottom",
        }
    }

    /// Human name (`outer face`, `inner face`).
    pub fn label(self) -> &'static str {
        match self {
            Face::Top => "outer face",
            Face::Bottom => "inner face",
        }
    }
}

/// Strength ratios of one ply at its two faces.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlyRatios {
    /// Outer face.
    pub top: CriteriaRatios,
    /// Inner face.
    pub bottom: CriteriaRatios,
}

impl PlyRatios {
    /// The ratios at one face.
    pub fn face(&self, face: Face) -> &CriteriaRatios {
        match face {
            Face::Top => &self.top,
            Face::Bottom => &self.bottom,
        }
    }

    /// The worse face by each criterion.
    pub fn worst(&self) -> CriteriaRatios {
        self.top.worst(&self.bottom)
    }
}

/// Where and how a laminate fails first under a growing load.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FirstPlyFailure {
    /// Index of the ply, 0 for the outer face ply (reports count from 1).
    pub ply: usize,
    /// The face of that ply where the criterion is reached first.
    pub face: Face,
    /// The criterion that gives the lowest multiplier.
    pub criterion: Criterion,
    /// The load multiplier (finite) and the mode.
    pub strength: StrengthRatio,
}

/// Strength ratios of every ply of a laminate under one response.
#[derive(Debug, Clone, PartialEq)]
pub struct LaminateStrength {
    /// Per ply, outer face first.
    pub plies: Vec<PlyRatios>,
}

fn state(p: &PointState) -> MaterialState {
    MaterialState { stress: p.stress_12, strain: p.strain_12 }
}

impl LaminateStrength {
    /// Evaluates every criterion at both faces of every ply; the load part of the response is
    /// multiplied, the residual thermal part held fixed.
    ///
    /// # Panics
    /// When `response` does not belong to `laminate` (a different number of plies): a bug in
    /// the caller, not bad input.
    #[track_caller]
    pub fn evaluate(laminate: &Laminate, response: &LaminateResponse) -> Self {
        assert_eq!(laminate.plies().len(), response.plies.len(), "response of another laminate");
        let plies = laminate
            .plies()
            .iter()
            .zip(&response.plies)
            .map(|(ply, s)| {
                let m = &ply.material;
                PlyRatios {
                    top: evaluate_all(m, &state(&s.top), &state(&s.top_thermal)),
                    bottom: evaluate_all(m, &state(&s.bottom), &state(&s.bottom_thermal)),
                }
            })
            .collect();
        LaminateStrength { plies }
    }

    /// The first failure by one criterion: the lowest finite ratio over all plies and faces
    /// (ties go to the outer ply, then the outer face). `None` when the criterion applies to no
    /// ply or no multiple of the load reaches it.
    pub fn first_ply_failure_by(&self, criterion: Criterion) -> Option<FirstPlyFailure> {
        let mut best: Option<FirstPlyFailure> = None;
        for (i, p) in self.plies.iter().enumerate() {
            for face in [Face::Top, Face::Bottom] {
                let Some(r) = p.face(face).by(criterion) else { continue };
                if !r.ratio.is_finite() {
                    continue;
                }
                if best.is_none_or(|b| r.ratio < b.strength.ratio) {
                    best = Some(FirstPlyFailure { ply: i, face, criterion, strength: r });
                }
            }
        }
        best
    }

    /// The first failure by any criterion: the lowest of [`Self::first_ply_failure_by`] over
    /// [`Criterion::ALL`] (ties go to the criterion listed first).
    pub fn first_ply_failure(&self) -> Option<FirstPlyFailure> {
        Criterion::ALL.iter().filter_map(|&c| self.first_ply_failure_by(c)).fold(None, |b, f| {
            match b {
                Some(b) if b.strength.ratio <= f.strength.ratio => Some(b),
                _ => Some(f),
            }
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::laminate::{LaminateLoad, LayupCode, Resultants};
    use crate::material::Lamina;
    use nalgebra::Vector3;

    fn laminate(code: &str) -> Laminate {
        // T300/5208 (Kaw 2006, Table 2.1).
        let tape = Lamina::builder("t300")
            .elastic(181e9, 10.3e9, 7.17e9, 0.28)
            .ply_thickness(0.125e-3)
            .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
            .build()
            .unwrap();
        Laminate::from_code(&code.parse::<LayupCode>().unwrap(), &tape)
    }

    #[test]
    fn cross_ply_in_tension_fails_first_in_the_90_plies_by_matrix_tension() {
        // Common practice: transverse cracking of the 90° plies is the first failure of a
        // cross-ply laminate pulled along its 0° fibres.
        let lam = laminate("[0/90]s");
        let load = LaminateLoad::Resultants(Resultants {
            n: Vector3::new(100e3, 0.0, 0.0),
            m: Vector3::zeros(),
        });
        let strength = LaminateStrength::evaluate(&lam, &lam.response(&load, 0.0).unwrap());
        let first = strength.first_ply_failure().unwrap();
        assert!(first.ply == 1 || first.ply == 2, "{first:?}");
        assert_eq!(first.strength.mode, crate::failure::FailureMode::MatrixTension);
    }

    #[test]
    fn no_load_gives_no_first_failure() {
        let lam = laminate("[0/90]s");
        let load = LaminateLoad::Resultants(Resultants::default());
        let strength = LaminateStrength::evaluate(&lam, &lam.response(&load, 0.0).unwrap());
        assert!(strength.first_ply_failure().is_none());
    }
}

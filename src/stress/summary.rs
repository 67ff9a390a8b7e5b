//! The governing values of a case: its lowest reserve factor and where, and the worst value of
//! every schedule ply at every station.

use nalgebra::Vector3;

use super::{StationStress, WallLocation};
use crate::analysis::BladeModel;
use crate::failure::{Criterion, FailureMode};

/// The lowest reserve factor of a load case and where it occurs.
#[derive(Debug, Clone, PartialEq)]
pub struct Critical {
    /// The reserve factor (strength ratio of the governing criterion at the factored load).
    pub reserve_factor: f64,
    /// Radius of the station, m.
    pub r: f64,
    /// Index of the analysis station.
    pub station: usize,
    /// Index of the wall point at that station.
    pub point: usize,
    /// Where on the section.
    pub location: WallLocation,
    /// Index of the ply in the schedule.
    pub ply: usize,
    /// The ply's label in `plies.csv`.
    pub ply_id: String,
    /// Its material.
    pub material: String,
    /// Its angle, degrees.
    pub angle_deg: f64,
    /// The governing criterion.
    pub criterion: Criterion,
    /// Its failure mode.
    pub mode: FailureMode,
    /// Ply stresses (sigma1, sigma2, tau12) there, Pa.
    pub stress_12: Vector3<f64>,
}

/// The worst value of one schedule ply at one station.
#[derive(Debug, Clone, PartialEq)]
pub struct PlyWorst {
    /// Radius, m.
    pub r: f64,
    /// Index of the ply in the schedule.
    pub ply: usize,
    /// Its label.
    pub ply_id: String,
    /// Lowest reserve factor of the ply over the section's points; infinite when it cannot fail.
    pub reserve_factor: f64,
    /// Governing criterion.
    pub criterion: Option<Criterion>,
    /// Failure mode.
    pub mode: FailureMode,
    /// Where.
    pub location: WallLocation,
    /// Lowest ratio of the ply by each criterion (Tsai–Wu, max stress, max strain, Hashin),
    /// infinite where none applies.
    pub by_criterion: [f64; 4],
}

pub(super) fn critical(model: &BladeModel, stations: &[StationStress]) -> Option<Critical> {
    let mut best: Option<Critical> = None;
    for (si, st) in stations.iter().enumerate() {
        let plies_of = &model.stations[si].plies;
        for (pi, p) in st.points.iter().enumerate() {
            for ply in &p.plies {
                let Some((criterion, ratio)) = ply.ratios.governing() else { continue };
                if !ratio.ratio.is_finite() {
                    continue;
                }
                if best.as_ref().is_some_and(|b| b.reserve_factor <= ratio.ratio) {
                    continue;
                }
                let index = plies_of[p.laminate][ply.ply_in_laminate];
                let spec = model.blade.ply(index);
                best = Some(Critical {
                    reserve_factor: ratio.ratio,
                    r: st.r,
                    station: si,
                    point: pi,
                    location: p.location.clone(),
                    ply: index,
                    ply_id: spec.map(|s| s.id.clone()).unwrap_or_default(),
                    material: spec.map(|s| s.material.clone()).unwrap_or_default(),
                    angle_deg: spec.map(|s| s.angle.deg()).unwrap_or(0.0),
                    criterion,
                    mode: ratio.mode,
                    stress_12: ply.stress_12,
                });
            }
        }
    }
    best
}

pub(super) fn ply_worst(model: &BladeModel, stations: &[StationStress]) -> Vec<PlyWorst> {
    let mut out = Vec::new();
    for (si, st) in stations.iter().enumerate() {
        let plies_of = &model.stations[si].plies;
        let mut rows: Vec<PlyWorst> = Vec::new();
        for p in &st.points {
            for ply in &p.plies {
                let index = plies_of[p.laminate][ply.ply_in_laminate];
                let by = Criterion::ALL
                    .map(|c| ply.ratios.by(c).map(|r| r.ratio).unwrap_or(f64::INFINITY));
                let governing = ply.ratios.governing();
                let rf = governing.map(|(_, r)| r.ratio).unwrap_or(f64::INFINITY);
                match rows.iter_mut().find(|w| w.ply == index) {
                    Some(w) => {
                        for (worst, v) in w.by_criterion.iter_mut().zip(by) {
                            *worst = worst.min(v);
                        }
                        if rf < w.reserve_factor {
                            w.reserve_factor = rf;
                            w.criterion = governing.map(|g| g.0);
                            w.mode = governing.map(|g| g.1.mode).unwrap_or(FailureMode::None);
                            w.location = p.location.clone();
                        }
                    }
                    None => rows.push(PlyWorst {
                        r: st.r,
                        ply: index,
                        ply_id: model.blade.ply(index).map(|s| s.id.clone()).unwrap_or_default(),
                        reserve_factor: rf,
                        criterion: governing.map(|g| g.0),
                        mode: governing.map(|g| g.1.mode).unwrap_or(FailureMode::None),
                        location: p.location.clone(),
                        by_criterion: by,
                    }),
                }
            }
        }
        rows.sort_by_key(|w| w.ply);
        out.extend(rows);
    }
    out
}

//! The governing values of a case: its lowest reserve factor and where, and the worst value of
//! every schedule ply at every station.

use nalgebra::Vector3;

use super::recover::Locator;
use super::{PlyPoint, WallLocation};
use crate::analysis::BladeModel;
use crate::failure::{Criterion, FailureMode};
use crate::units::Angle;

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
    /// Its fibre angle in the ply's frame.
    pub angle: Angle,
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

/// The summaries of one case folded into the recovery loop: the lowest reserve factor with
/// where it occurs, and per station the worst value of every schedule ply. Memory is
/// independent of the number of wall points: a dense slot per schedule ply (no search) and one
/// row per ply of the current station. Where a value is kept, the wall element is noted and the
/// place named once at the end.
pub(super) struct Summary {
    best: Option<Best>,
    /// Per schedule ply: its row in `rows` at the current station, `usize::MAX` when none.
    slot: Vec<usize>,
    rows: Vec<Row>,
    /// Finished rows of the stations done, in station order, plies ascending.
    out: Vec<PlyWorst>,
}

#[derive(Debug, Clone, Copy)]
struct Best {
    reserve_factor: f64,
    station: usize,
    point: usize,
    element: usize,
    ply: usize,
    criterion: Criterion,
    mode: FailureMode,
    stress_12: Vector3<f64>,
}

#[derive(Debug, Clone, Copy)]
struct Row {
    ply: usize,
    reserve_factor: f64,
    criterion: Option<Criterion>,
    mode: FailureMode,
    element: usize,
    by_criterion: [f64; 4],
}

impl Summary {
    pub(super) fn new(model: &BladeModel) -> Self {
        Summary {
            best: None,
            slot: vec![usize::MAX; model.blade.ply_count()],
            rows: Vec::new(),
            out: Vec::new(),
        }
    }

    /// Folds in the plies of wall point `point` (element `element`) of station `station`, in the
    /// order of the points and plies.
    pub(super) fn add(&mut self, station: usize, point: usize, element: usize, plies: &[PlyPoint]) {
        for p in plies {
            // Every laminate of a blade model is built from its schedule, so every ply knows its
            // place in it; a ply without one has no schedule row to be summed into.
            let Some(index) = p.schedule_ply else { continue };
            let governing = p.governing;
            if let Some((criterion, ratio)) = governing {
                let beats = self.best.as_ref().is_none_or(|b| b.reserve_factor > ratio.ratio);
                if ratio.ratio.is_finite() && beats {
                    self.best = Some(Best {
                        reserve_factor: ratio.ratio,
                        station,
                        point,
                        element,
                        ply: index,
                        criterion,
                        mode: ratio.mode,
                        stress_12: p.stress_12,
                    });
                }
            }
            let by =
                Criterion::ALL.map(|c| p.ratios.by(c).map(|r| r.ratio).unwrap_or(f64::INFINITY));
            let rf = governing.map(|(_, r)| r.ratio).unwrap_or(f64::INFINITY);
            if index >= self.slot.len() {
                self.slot.resize(index + 1, usize::MAX);
            }
            match self.rows.get_mut(self.slot[index]) {
                Some(w) => {
                    for (worst, v) in w.by_criterion.iter_mut().zip(by) {
                        *worst = worst.min(v);
                    }
                    if rf < w.reserve_factor {
                        w.reserve_factor = rf;
                        w.criterion = governing.map(|g| g.0);
                        w.mode = governing.map(|g| g.1.mode).unwrap_or(FailureMode::None);
                        w.element = element;
                    }
                }
                None => {
                    self.slot[index] = self.rows.len();
                    self.rows.push(Row {
                        ply: index,
                        reserve_factor: rf,
                        criterion: governing.map(|g| g.0),
                        mode: governing.map(|g| g.1.mode).unwrap_or(FailureMode::None),
                        element,
                        by_criterion: by,
                    });
                }
            }
        }
    }

    /// Closes station `station` (radius `r`): its ply rows, plies ascending.
    pub(super) fn end_station(&mut self, model: &BladeModel, station: usize, r: f64) {
        let st = &model.stations[station];
        let locator = Locator::new(&st.layout);
        self.rows.sort_unstable_by_key(|w| w.ply);
        for w in self.rows.drain(..) {
            self.slot[w.ply] = usize::MAX;
            self.out.push(PlyWorst {
                r,
                ply: w.ply,
                ply_id: model.blade.ply(w.ply).map(|s| s.id.clone()).unwrap_or_default(),
                reserve_factor: w.reserve_factor,
                criterion: w.criterion,
                mode: w.mode,
                location: locator.element(&st.section, w.element).unwrap_or(UNKNOWN),
                by_criterion: w.by_criterion,
            });
        }
    }

    /// Joins the summary of the stations that follow this one's (folded on its own, from
    /// [`Summary::new`]): the same as folding those stations' points into this summary, to the
    /// bit. The lowest reserve factor replaces this one's only when strictly lower, as in
    /// [`Summary::add`], so that on a tie the earlier station keeps it; the finished rows are
    /// appended in station order.
    pub(super) fn join(&mut self, later: Summary) {
        if let Some(b) = later.best {
            if self.best.as_ref().is_none_or(|a| a.reserve_factor > b.reserve_factor) {
                self.best = Some(b);
            }
        }
        self.out.extend(later.out);
    }

    /// The lowest reserve factor and where, and the worst value of every ply at every station.
    pub(super) fn finish(
        self,
        model: &BladeModel,
        radii: &[f64],
    ) -> (Option<Critical>, Vec<PlyWorst>) {
        let critical = self.best.map(|b| {
            let st = &model.stations[b.station];
            let spec = model.blade.ply(b.ply);
            Critical {
                reserve_factor: b.reserve_factor,
                r: radii[b.station],
                station: b.station,
                point: b.point,
                location: Locator::new(&st.layout)
                    .element(&st.section, b.element)
                    .unwrap_or(UNKNOWN),
                ply: b.ply,
                ply_id: spec.map(|s| s.id.clone()).unwrap_or_default(),
                material: spec.map(|s| s.material.clone()).unwrap_or_default(),
                angle: spec.map_or(Angle::ZERO, |s| s.angle),
                criterion: b.criterion,
                mode: b.mode,
                stress_12: b.stress_12,
            }
        });
        (critical, self.out)
    }
}

/// A place that cannot be named (an element index outside the section: does not happen).
const UNKNOWN: WallLocation = WallLocation::Surface { upper: true, x_c: 0.0, solid: false };

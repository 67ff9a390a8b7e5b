//! The speed sweep (Campbell data), the excitation orders, crossings and frequency margins.
//!
//! Excitations are the rotor orders `nP` (`n · rpm / 60` Hz) for `n = 1 ..= harmonics`, and the
//! blade-passing orders `k · B` for `k = 1 ..= blade_passing_multiples`; every multiple of `B`
//! is marked as blade passing. A crossing is where a track's frequency equals an order's
//! frequency, found by linear interpolation of their difference between neighbouring sweep
//! speeds. The margin of a mode at a speed is `|f - f_h| / f_h` in percent, `f_h` being the
//! nearest excitation frequency in that sense (the separation as a share of the excitation, the
//! way `frequency_margin_pct` is defined in `[criteria]`).

use serde::Serialize;

use super::ModalError;
use super::assemble::BeamModel;
use super::modes::{ModeKind, ModeSet};
use super::track::{continue_tracks, start_tracks};
use crate::input::Rotor;

/// Progress of a sweep: called with (speeds done, speeds in all) after each speed, so that a
/// caller can show a progress bar.
pub type SweepProgress<'a> = &'a mut dyn FnMut(usize, usize);

/// Most speeds a sweep may hold.
pub const MAX_SPEEDS: usize = 100_000;

/// Speeds from `from_rpm` to `to_rpm` in steps of `step_rpm`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SpeedRange {
    /// First speed, rpm.
    pub from_rpm: f64,
    /// Last speed, rpm.
    pub to_rpm: f64,
    /// Step, rpm.
    pub step_rpm: f64,
}

impl SpeedRange {
    /// A checked range: `0 <= from < to`, `0 < step <= to - from`, all finite.
    pub fn new(from_rpm: f64, to_rpm: f64, step_rpm: f64) -> Result<Self, ModalError> {
        let bad = |reason: &'static str| ModalError::SpeedRange {
            from: from_rpm,
            to: to_rpm,
            step: step_rpm,
            reason,
        };
        if !(from_rpm.is_finite() && to_rpm.is_finite() && step_rpm.is_finite()) {
            return Err(bad("every value must be a finite number"));
        }
        if from_rpm < 0.0 || to_rpm < 0.0 {
            return Err(bad("speeds must not be negative"));
        }
        if to_rpm <= from_rpm {
            return Err(bad("the range is empty: the last speed must exceed the first"));
        }
        if step_rpm <= 0.0 {
            return Err(bad("the step must be positive"));
        }
        if step_rpm > to_rpm - from_rpm {
            return Err(bad("the step is larger than the range"));
        }
        if (to_rpm - from_rpm) / step_rpm > MAX_SPEEDS as f64 {
            return Err(bad("the step is so small that the sweep would exceed 100000 speeds"));
        }
        Ok(SpeedRange { from_rpm, to_rpm, step_rpm })
    }

    /// The rotor's sweep: 0 to `rpm_max` in `step_rpm`, or in 60 steps when not given.
    pub fn for_rotor(rotor: &Rotor, step_rpm: Option<f64>) -> Result<Self, ModalError> {
        SpeedRange::new(0.0, rotor.rpm_max, step_rpm.unwrap_or(rotor.rpm_max / 60.0))
    }

    /// The speeds, ascending: the steps from `from_rpm`, `to_rpm` itself, and every speed of
    /// `include` inside the range (the nominal and maximum speeds, so that margins are evaluated
    /// at solved speeds).
    pub fn speeds(&self, include: &[f64]) -> Vec<f64> {
        let span = self.to_rpm - self.from_rpm;
        let steps = (span / self.step_rpm * (1.0 + 1e-12)).floor() as usize;
        let mut v: Vec<f64> =
            (0..=steps).map(|i| self.from_rpm + i as f64 * self.step_rpm).collect();
        v.push(self.to_rpm);
        v.extend(include.iter().copied().filter(|r| (self.from_rpm..=self.to_rpm).contains(r)));
        v.sort_by(f64::total_cmp);
        let tol = 1e-9 * self.to_rpm.max(1.0);
        v.dedup_by(|a, b| (*a - *b).abs() <= tol);
        v
    }
}

/// One curve of the Campbell diagram: one mode followed across the speeds.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Track {
    /// Track number, 0 for the lowest mode at the first speed.
    pub id: usize,
    /// Label such as `flap 1`, `edge 1`, `torsion 1` (kind and order within the kind).
    pub label: String,
    /// The kind the mode has at most speeds.
    pub kind: ModeKind,
}

/// Modes over a speed sweep, every mode tagged with its track.
#[derive(Debug, Clone)]
pub struct Campbell {
    /// The modes at each speed, ascending speed.
    pub speeds: Vec<ModeSet>,
    /// The tracks, by id.
    pub tracks: Vec<Track>,
}

/// An excitation order.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct Excitation {
    /// Multiple of the rotor speed.
    pub order: u32,
    /// A multiple of the blade count.
    pub blade_passing: bool,
}

impl Excitation {
    /// Excitation frequency at `rpm`, Hz.
    pub fn frequency_hz(&self, rpm: f64) -> f64 {
        self.order as f64 * rpm / 60.0
    }

    /// `3P`, or `15P (blade passing)`.
    pub fn label(&self) -> String {
        if self.blade_passing {
            format!("{}P (blade passing)", self.order)
        } else {
            format!("{}P", self.order)
        }
    }
}

/// The orders `1 ..= harmonics` and `k B` for `k = 1 ..= blade_passing_multiples`, ascending,
/// each once; multiples of `blades` are marked as blade passing.
pub fn excitation_orders(
    harmonics: u32,
    blades: u32,
    blade_passing_multiples: u32,
) -> Vec<Excitation> {
    let mut orders: Vec<u32> = (1..=harmonics).collect();
    if blades > 0 {
        orders.extend((1..=blade_passing_multiples).map(|k| k * blades));
    }
    orders.sort_unstable();
    orders.dedup();
    orders
        .into_iter()
        .map(|order| Excitation { order, blade_passing: blades > 0 && order % blades == 0 })
        .collect()
}

/// Where a track meets an excitation line.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Crossing {
    /// Track id.
    pub track: usize,
    /// Excitation order.
    pub order: u32,
    /// Whether the order is blade passing.
    pub blade_passing: bool,
    /// Speed of the crossing, rpm.
    pub rpm: f64,
    /// Frequency of the crossing, Hz.
    pub frequency_hz: f64,
}

/// The margin of one mode at one speed.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ModeMargin {
    /// Track id.
    pub track: usize,
    /// Mode frequency, Hz.
    pub frequency_hz: f64,
    /// The nearest excitation.
    pub excitation: Excitation,
    /// Its frequency, Hz.
    pub excitation_hz: f64,
    /// `|f - f_h| / f_h`, percent.
    pub margin_pct: f64,
    /// Against the required margin; `None` when none is required.
    pub pass: Option<bool>,
}

/// The margins of all modes at one speed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MarginCheck {
    /// What the speed is (`nominal`, `maximum`).
    pub name: String,
    /// Speed, rpm.
    pub rpm: f64,
    /// Required margin, percent, when one is required.
    pub required_pct: Option<f64>,
    /// One per mode, by increasing frequency.
    pub modes: Vec<ModeMargin>,
    /// All modes pass; `None` when no margin is required.
    pub pass: Option<bool>,
}

impl BeamModel {
    /// The `count` lowest modes at every speed of `rpms` (ascending, not negative), tracked by
    /// MAC. `progress(done, total)` is called after each speed.
    pub fn campbell(
        &self,
        rpms: &[f64],
        count: usize,
        progress: SweepProgress,
    ) -> Result<Campbell, ModalError> {
        if rpms.is_empty() {
            return Err(ModalError::NoSpeeds);
        }
        if let Some(w) =
            rpms.windows(2).find(|w| w[1].partial_cmp(&w[0]) != Some(std::cmp::Ordering::Greater))
        {
            return Err(ModalError::SpeedOrder { rpm: w[1], previous: w[0] });
        }
        // A few modes above those asked for keep tracks continuous where modes cross the top.
        let solved = (count + 2).min(self.dof_count()).max(count);
        let mut speeds: Vec<ModeSet> = Vec::with_capacity(rpms.len());
        let mut next_track = 0;
        for (i, &rpm) in rpms.iter().enumerate() {
            let mut set = self.modes(rpm, solved)?;
            match speeds.last() {
                Some(prev) => {
                    continue_tracks(self.mass(), &prev.modes, &mut set.modes, &mut next_track)
                }
                None => start_tracks(&mut set.modes, &mut next_track),
            }
            speeds.push(set);
            progress(i + 1, rpms.len());
        }
        for set in &mut speeds {
            set.modes.truncate(count);
        }
        let tracks = name_tracks(&mut speeds, next_track);
        Ok(Campbell { speeds, tracks })
    }
}

/// Renumbers the tracks that appear among the modes kept (in order of first appearance) and
/// labels them by their most frequent kind and their order within it.
fn name_tracks(speeds: &mut [ModeSet], raw_count: usize) -> Vec<Track> {
    let mut new_id = vec![usize::MAX; raw_count];
    let mut kinds: Vec<Vec<ModeKind>> = Vec::new();
    for set in speeds.iter_mut() {
        for mode in &mut set.modes {
            let raw = mode.track.unwrap_or(0);
            if new_id[raw] == usize::MAX {
                new_id[raw] = kinds.len();
                kinds.push(Vec::new());
            }
            mode.track = Some(new_id[raw]);
            kinds[new_id[raw]].push(mode.kind);
        }
    }
    let mut ordinal = std::collections::HashMap::new();
    kinds
        .iter()
        .enumerate()
        .map(|(id, ks)| {
            let kind = most_frequent(ks);
            let n = ordinal.entry(kind).or_insert(0);
            *n += 1;
            Track { id, label: format!("{} {}", kind.name(), n), kind }
        })
        .collect()
}

fn most_frequent(kinds: &[ModeKind]) -> ModeKind {
    let mut best = (0, ModeKind::Mixed);
    for &k in kinds {
        let c = kinds.iter().filter(|&&x| x == k).count();
        if c > best.0 {
            best = (c, k);
        }
    }
    best.1
}

impl Campbell {
    /// The points `(rpm, frequency_hz)` of track `id` at the speeds where it is among the modes.
    pub fn track_points(&self, id: usize) -> Vec<(f64, f64)> {
        self.track_runs(id).into_iter().flatten().collect()
    }

    /// The points of track `id` in runs of consecutive speeds (a track can leave the lowest modes
    /// and come back).
    pub fn track_runs(&self, id: usize) -> Vec<Vec<(f64, f64)>> {
        let mut runs: Vec<Vec<(f64, f64)>> = Vec::new();
        let mut open = false;
        for set in &self.speeds {
            match set.modes.iter().find(|m| m.track == Some(id)) {
                Some(m) => {
                    if !open {
                        runs.push(Vec::new());
                        open = true;
                    }
                    if let Some(run) = runs.last_mut() {
                        run.push((set.rpm, m.frequency_hz));
                    }
                }
                None => open = false,
            }
        }
        runs
    }

    /// Every crossing of every track with every excitation inside the sweep, by track then speed.
    pub fn crossings(&self, excitations: &[Excitation]) -> Vec<Crossing> {
        let mut out = Vec::new();
        for track in &self.tracks {
            for run in self.track_runs(track.id) {
                for w in run.windows(2) {
                    let ((ra, fa), (rb, fb)) = (w[0], w[1]);
                    for e in excitations {
                        let (ga, gb) = (fa - e.frequency_hz(ra), fb - e.frequency_hz(rb));
                        if (ga > 0.0) != (gb > 0.0) {
                            let t = ga / (ga - gb);
                            let rpm = ra + t * (rb - ra);
                            out.push(Crossing {
                                track: track.id,
                                order: e.order,
                                blade_passing: e.blade_passing,
                                rpm,
                                frequency_hz: e.frequency_hz(rpm),
                            });
                        }
                    }
                }
            }
        }
        out
    }

    /// The margin of every mode at `rpm` to its nearest excitation, and pass or fail against
    /// `required_pct`. Frequencies between sweep speeds are interpolated linearly along tracks.
    pub fn margins(
        &self,
        excitations: &[Excitation],
        name: &str,
        rpm: f64,
        required_pct: Option<f64>,
    ) -> Result<MarginCheck, ModalError> {
        let (first, last) = match (self.speeds.first(), self.speeds.last()) {
            (Some(a), Some(b)) => (a.rpm, b.rpm),
            _ => return Err(ModalError::NoSpeeds),
        };
        let tol = 1e-9 * last.max(1.0);
        if !(rpm >= first - tol && rpm <= last + tol) {
            return Err(ModalError::MarginSpeed { rpm, from: first, to: last });
        }
        let mut modes: Vec<ModeMargin> = self
            .frequencies_at(rpm, tol)
            .into_iter()
            .filter_map(|(track, f)| nearest(excitations, rpm, f, track))
            .collect();
        modes.sort_by(|a, b| a.frequency_hz.total_cmp(&b.frequency_hz));
        for m in &mut modes {
            m.pass = required_pct.map(|req| m.margin_pct >= req);
        }
        let pass = required_pct.map(|_| modes.iter().all(|m| m.pass == Some(true)));
        Ok(MarginCheck { name: name.to_string(), rpm, required_pct, modes, pass })
    }

    /// The margins at the rotor's nominal and maximum speeds.
    pub fn rotor_margins(
        &self,
        rotor: &Rotor,
        excitations: &[Excitation],
        required_pct: Option<f64>,
    ) -> Result<Vec<MarginCheck>, ModalError> {
        Ok(vec![
            self.margins(excitations, "nominal", rotor.rpm_nominal, required_pct)?,
            self.margins(excitations, "maximum", rotor.rpm_max, required_pct)?,
        ])
    }

    /// `(track, frequency_hz)` at `rpm`: the solved modes when `rpm` is a sweep speed, else the
    /// tracks present at both neighbouring speeds, interpolated.
    fn frequencies_at(&self, rpm: f64, tol: f64) -> Vec<(usize, f64)> {
        if let Some(set) = self.speeds.iter().find(|s| (s.rpm - rpm).abs() <= tol) {
            return set.modes.iter().filter_map(|m| Some((m.track?, m.frequency_hz))).collect();
        }
        if self.speeds.len() < 2 {
            return Vec::new();
        }
        let i = self.speeds.partition_point(|s| s.rpm < rpm).clamp(1, self.speeds.len() - 1);
        let (a, b) = (&self.speeds[i - 1], &self.speeds[i]);
        let t = (rpm - a.rpm) / (b.rpm - a.rpm);
        a.modes
            .iter()
            .filter_map(|ma| {
                let mb = b.modes.iter().find(|mb| mb.track == ma.track)?;
                Some((ma.track?, ma.frequency_hz + t * (mb.frequency_hz - ma.frequency_hz)))
            })
            .collect()
    }
}

/// The excitation nearest to `f` at `rpm` by relative separation.
fn nearest(excitations: &[Excitation], rpm: f64, f: f64, track: usize) -> Option<ModeMargin> {
    excitations
        .iter()
        .filter(|e| e.frequency_hz(rpm) > 0.0)
        .map(|e| {
            let fh = e.frequency_hz(rpm);
            ModeMargin {
                track,
                frequency_hz: f,
                excitation: *e,
                excitation_hz: fh,
                margin_pct: (f - fh).abs() / fh * 100.0,
                pass: None,
            }
        })
        .min_by(|a, b| a.margin_pct.total_cmp(&b.margin_pct))
}

//! The speed sweep (Campbell data), the excitation orders, crossings and frequency margins.
//!
//! Excitations are the rotor orders `nP` (`n · Ω / 2π` Hz) for `n = 1 ..= harmonics`, the
//! blade-passing orders `k · B` for `k = 1 ..= blade_passing_multiples` (every multiple of `B`
//! is marked as blade passing), the vane-passing orders `k · V` of each count `V` of stationary
//! vanes or struts the blades pass (a blade meets `V` wakes per turn), further listed orders, and
//! fixed frequencies or bands (a gearbox mesh, a wave period range). Orders given by several
//! sources are one excitation naming them all. A crossing is where a track's frequency equals
//! an excitation's frequency, found by linear interpolation of their difference between
//! neighbouring sweep speeds (a band has a line at each edge). The margin of a mode at a speed
//! is `|f - f_h| / f_h` (a fraction; percent at the edges), `f_h` being the nearest excitation
//! frequency in that sense, the separation as a share of the excitation, the way
//! `frequency_margin_pct` is defined in `[criteria]` (0 for a mode inside a fixed band).

use serde::Serialize;

use super::ModalError;
use super::assemble::BeamModel;
use super::modes::{EnergyShares, ModeKind, ModeSet};
use super::track::{continue_tracks, start_tracks};
use crate::project::{ExcitationSpec, Rotor};
use crate::units::RotorSpeed;

/// Progress of a sweep: called with (speeds done, speeds in all) after each speed, so that a
/// caller can show a progress bar.
pub type SweepProgress<'a> = &'a mut dyn FnMut(usize, usize);

/// Most speeds a sweep may hold.
pub const MAX_SPEEDS: usize = 100_000;

/// Speeds from `from` to `to` in steps of `step`.
///
/// The grid's arithmetic is that of [`RotorSpeed`], on the scale a speed was given in, so the
/// speeds of a grid given in rpm (`--rpm FROM:TO:STEP`, `rpm_step`) read back in rpm as the
/// round numbers they are.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SpeedRange {
    /// First speed.
    pub from: RotorSpeed,
    /// Last speed.
    pub to: RotorSpeed,
    /// Step.
    pub step: RotorSpeed,
}

impl SpeedRange {
    /// A checked range: `0 <= from < to`, `0 < step <= to - from`, all finite.
    pub fn new(from: RotorSpeed, to: RotorSpeed, step: RotorSpeed) -> Result<Self, ModalError> {
        let bad = |reason: &'static str| ModalError::SpeedRange { from, to, step, reason };
        if !(from.is_finite() && to.is_finite() && step.is_finite()) {
            return Err(bad("every value must be a finite number"));
        }
        if from < RotorSpeed::ZERO || to < RotorSpeed::ZERO {
            return Err(bad("speeds must not be negative"));
        }
        if to <= from {
            return Err(bad("the range is empty: the last speed must exceed the first"));
        }
        if step <= RotorSpeed::ZERO {
            return Err(bad("the step must be positive"));
        }
        if step > to - from {
            return Err(bad("the step is larger than the range"));
        }
        if (to - from) / step > MAX_SPEEDS as f64 {
            return Err(bad("the step is so small that the sweep would exceed 100000 speeds"));
        }
        Ok(SpeedRange { from, to, step })
    }

    /// The rotor's sweep: 0 to its greatest speed in `step`, or in 60 steps when not given.
    pub fn for_rotor(rotor: &Rotor, step: Option<RotorSpeed>) -> Result<Self, ModalError> {
        let max = RotorSpeed::from_rad_s(rotor.omega_max);
        SpeedRange::new(RotorSpeed::ZERO, max, step.unwrap_or(max / 60.0))
    }

    /// The speeds, ascending: the steps from `from`, `to` itself, and every speed of `include`
    /// inside the range (the nominal and maximum speeds, so that margins are evaluated at solved
    /// speeds).
    pub fn speeds(&self, include: &[RotorSpeed]) -> Vec<RotorSpeed> {
        let span = self.to - self.from;
        let steps = (span / self.step * (1.0 + 1e-12)).floor() as usize;
        let mut v: Vec<RotorSpeed> =
            (0..=steps).map(|i| self.from + self.step * i as f64).collect();
        v.push(self.to);
        v.extend(include.iter().copied().filter(|r| (self.from..=self.to).contains(r)));
        v.sort_by(RotorSpeed::total_cmp);
        let tol = self.to.tolerance(1e-9);
        v.dedup_by(|a, b| a.within(*b, tol));
        v
    }
}

/// The least mean share of a second family for a track's label to name it.
pub const SECOND_SHARE_SHOWN: f64 = 0.1;

/// One curve of the Campbell diagram: one mode followed across the speeds.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Track {
    /// Track index, 0 for the lowest mode at the first speed.
    pub id: usize,
    /// Track number for a reader, from 1 (`id + 1`).
    pub number: usize,
    /// Label such as `flap 1`, `torsion 1`, `edge 1 (flap 20 %)`: the family with the largest
    /// mean energy share, the order within that family, and a second family's share when it
    /// reaches [`SECOND_SHARE_SHOWN`].
    pub label: String,
    /// The kind the mode has at most speeds (`mixed` when no family reaches
    /// [`super::DOMINANT_SHARE`] there).
    pub kind: ModeKind,
    /// The family with the largest mean energy share over the track.
    pub family: ModeKind,
    /// The mean kinetic energy shares over the speeds of the track.
    pub shares: EnergyShares,
}

/// Modes over a speed sweep, every mode tagged with its track.
#[derive(Debug, Clone)]
pub struct Campbell {
    /// The modes at each speed, ascending speed.
    pub speeds: Vec<ModeSet>,
    /// The tracks, by id.
    pub tracks: Vec<Track>,
}

/// A fixed excitation frequency or band, independent of the rotor speed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct FixedBand {
    /// Name (a gearbox mesh, a wave period range).
    pub name: String,
    /// Lowest frequency, Hz.
    pub from_hz: f64,
    /// Highest frequency, Hz (equal to `from_hz` for one frequency).
    pub to_hz: f64,
}

/// An excitation: a rotor order (with every source that gives it) or a fixed frequency band.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Excitation {
    /// Multiple of the rotor speed; 0 for a fixed frequency.
    pub order: u32,
    /// A multiple of the blade count.
    pub blade_passing: bool,
    /// Counts `V` of stationary vanes or struts whose passing orders `k V` give this order.
    pub vanes: Vec<u32>,
    /// The fixed frequency or band, for an excitation that does not follow the rotor speed.
    pub fixed: Option<FixedBand>,
}

impl Excitation {
    /// The rotor order `order` from the rotor harmonics alone.
    pub fn rotor_order(order: u32, blade_passing: bool) -> Self {
        Excitation { order, blade_passing, vanes: Vec::new(), fixed: None }
    }

    /// Excitation frequency at `speed`, Hz (the lower edge of a fixed band).
    pub fn frequency_hz(&self, speed: RotorSpeed) -> f64 {
        match &self.fixed {
            Some(f) => f.from_hz,
            None => speed.order_hz(self.order as f64),
        }
    }

    /// The lowest and highest frequency at `speed`, Hz (the same for a rotor order).
    pub fn range_hz(&self, speed: RotorSpeed) -> (f64, f64) {
        match &self.fixed {
            Some(f) => (f.from_hz, f.to_hz),
            None => {
                let f = self.frequency_hz(speed);
                (f, f)
            }
        }
    }

    /// The frequencies whose lines a track can cross at `speed`: one, or both edges of a band.
    pub fn lines_hz(&self, speed: RotorSpeed) -> Vec<f64> {
        let (lo, hi) = self.range_hz(speed);
        if hi > lo { vec![lo, hi] } else { vec![lo] }
    }

    /// `3P`, `15P (blade passing)`, `11P (11 vanes)`, `99P (blade passing, 11 vanes)`,
    /// `gear mesh 312 Hz`, `waves 0.05–0.2 Hz`.
    pub fn label(&self) -> String {
        if let Some(f) = &self.fixed {
            return if f.to_hz > f.from_hz {
                format!("{} {}–{} Hz", f.name, f.from_hz, f.to_hz)
            } else {
                format!("{} {} Hz", f.name, f.from_hz)
            };
        }
        let mut parts = Vec::new();
        if self.blade_passing {
            parts.push("blade passing".to_string());
        }
        for v in &self.vanes {
            parts.push(format!("{v} vanes"));
        }
        if parts.is_empty() {
            format!("{}P", self.order)
        } else {
            format!("{}P ({})", self.order, parts.join(", "))
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
    machine_excitations(harmonics, blades, blade_passing_multiples, &ExcitationSpec::default())
}

/// Every excitation of the machine: the rotor orders `1 ..= harmonics`, blade passing `k B`
/// (`k = 1 ..= blade_passing_multiples`), the vane-passing orders `k V` of each vane count
/// (`k = 1 ..= vane_multiples`), the further orders listed, then the fixed frequencies. An order
/// given by several sources appears once, with every source named (an order is marked blade
/// passing when it is a multiple of `B`, and with a vane count when it is one of that count's
/// orders).
pub fn machine_excitations(
    harmonics: u32,
    blades: u32,
    blade_passing_multiples: u32,
    spec: &ExcitationSpec,
) -> Vec<Excitation> {
    let mut orders: Vec<u32> = (1..=harmonics).collect();
    if blades > 0 {
        orders.extend((1..=blade_passing_multiples).map(|k| k * blades));
    }
    let vane_orders = |v: u32| (1..=spec.vane_multiples).map(move |k| k * v);
    for &v in &spec.vanes {
        orders.extend(vane_orders(v));
    }
    orders.extend(spec.orders.iter().copied().filter(|&o| o > 0));
    orders.sort_unstable();
    orders.dedup();
    let mut out: Vec<Excitation> = orders
        .into_iter()
        .map(|order| {
            let mut vanes: Vec<u32> = spec
                .vanes
                .iter()
                .copied()
                .filter(|&v| vane_orders(v).any(|o| o == order))
                .collect();
            vanes.sort_unstable();
            vanes.dedup();
            Excitation {
                order,
                blade_passing: blades > 0 && order % blades == 0,
                vanes,
                fixed: None,
            }
        })
        .collect();
    for f in &spec.fixed {
        out.push(Excitation {
            order: 0,
            blade_passing: false,
            vanes: Vec::new(),
            fixed: Some(FixedBand { name: f.name.clone(), from_hz: f.from_hz, to_hz: f.to_hz }),
        });
    }
    out
}

/// Where a track meets an excitation line.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Crossing {
    /// Track id.
    pub track: usize,
    /// Index of the excitation in the list the crossings were found for.
    pub excitation: usize,
    /// Excitation order (0 for a fixed frequency).
    pub order: u32,
    /// Whether the order is blade passing.
    pub blade_passing: bool,
    /// Speed of the crossing.
    pub speed: RotorSpeed,
    /// Frequency of the crossing, Hz.
    pub frequency_hz: f64,
}

/// The margin of one mode at one speed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModeMargin {
    /// Track id.
    pub track: usize,
    /// Mode frequency, Hz.
    pub frequency_hz: f64,
    /// The nearest excitation.
    pub excitation: Excitation,
    /// Its frequency, Hz.
    pub excitation_hz: f64,
    /// `|f - f_h| / f_h`, a fraction (0 inside a fixed band).
    pub margin: f64,
    /// Against the required margin; `None` when none is required.
    pub pass: Option<bool>,
}

/// The margins of all modes at one speed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MarginCheck {
    /// What the speed is (`nominal`, `maximum`).
    pub name: String,
    /// The speed.
    pub speed: RotorSpeed,
    /// Required margin, a fraction, when one is required.
    pub required: Option<f64>,
    /// One per mode, by increasing frequency.
    pub modes: Vec<ModeMargin>,
    /// All modes pass; `None` when no margin is required.
    pub pass: Option<bool>,
}

impl BeamModel {
    /// The `count` lowest modes at every speed of `grid` (ascending, not negative), tracked by
    /// MAC. `progress(done, total)` is called after each speed.
    pub fn campbell(
        &self,
        grid: &[RotorSpeed],
        count: usize,
        progress: SweepProgress,
    ) -> Result<Campbell, ModalError> {
        if grid.is_empty() {
            return Err(ModalError::NoSpeeds);
        }
        if let Some(w) =
            grid.windows(2).find(|w| w[1].partial_cmp(&w[0]) != Some(std::cmp::Ordering::Greater))
        {
            return Err(ModalError::SpeedOrder { speed: w[1], previous: w[0] });
        }
        // A few modes above those asked for keep tracks continuous where modes cross the top.
        let solved = (count + 2).min(self.dof_count()).max(count);
        let mut speeds: Vec<ModeSet> = Vec::with_capacity(grid.len());
        let mut next_track = 0;
        for (i, &speed) in grid.iter().enumerate() {
            let mut set = self.modes(speed, solved)?;
            match speeds.last() {
                Some(prev) => {
                    continue_tracks(self.mass(), &prev.modes, &mut set.modes, &mut next_track)
                }
                None => start_tracks(&mut set.modes, &mut next_track),
            }
            speeds.push(set);
            progress(i + 1, grid.len());
        }
        for set in &mut speeds {
            set.modes.truncate(count);
        }
        let tracks = name_tracks(&mut speeds, next_track);
        Ok(Campbell { speeds, tracks })
    }
}

/// Renumbers the tracks that appear among the modes kept (in order of first appearance) and
/// names them for a reader: the family with the largest mean kinetic energy share over the
/// track, its order within that family, and the next family's share when it reaches
/// [`SECOND_SHARE_SHOWN`] (`edge 1 (flap 20 %)`).
fn name_tracks(speeds: &mut [ModeSet], raw_count: usize) -> Vec<Track> {
    let mut new_id = vec![usize::MAX; raw_count];
    let mut kinds: Vec<Vec<ModeKind>> = Vec::new();
    let mut sums: Vec<([f64; 4], usize)> = Vec::new();
    for set in speeds.iter_mut() {
        for mode in &mut set.modes {
            let raw = mode.track.unwrap_or(0);
            if new_id[raw] == usize::MAX {
                new_id[raw] = kinds.len();
                kinds.push(Vec::new());
                sums.push(([0.0; 4], 0));
            }
            let id = new_id[raw];
            mode.track = Some(id);
            kinds[id].push(mode.kind);
            let sh = &mode.shares;
            for (acc, v) in sums[id].0.iter_mut().zip([sh.flap, sh.edge, sh.torsion, sh.axial]) {
                *acc += v;
            }
            sums[id].1 += 1;
        }
    }
    let families = [ModeKind::Flap, ModeKind::Edge, ModeKind::Torsion, ModeKind::Axial];
    let mut ordinal = std::collections::HashMap::new();
    kinds
        .iter()
        .zip(&sums)
        .enumerate()
        .map(|(id, (ks, (sum, count)))| {
            let n = (*count).max(1) as f64;
            let mean = sum.map(|v| v / n);
            let mut order: Vec<usize> = (0..4).collect();
            order.sort_by(|&a, &b| mean[b].total_cmp(&mean[a]));
            let family = families[order[0]];
            let k = ordinal.entry(family).or_insert(0);
            *k += 1;
            let mut label = format!("{} {}", family.name(), k);
            if mean[order[1]] >= SECOND_SHARE_SHOWN {
                label.push_str(&format!(
                    " ({} {:.0} %)",
                    families[order[1]].name(),
                    100.0 * mean[order[1]]
                ));
            }
            Track {
                id,
                number: id + 1,
                label,
                kind: most_frequent(ks),
                family,
                shares: EnergyShares {
                    flap: mean[0],
                    edge: mean[1],
                    torsion: mean[2],
                    axial: mean[3],
                },
            }
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
    /// The points `(speed, frequency_hz)` of track `id` at the speeds where it is among the
    /// modes.
    pub fn track_points(&self, id: usize) -> Vec<(RotorSpeed, f64)> {
        self.track_runs(id).into_iter().flatten().collect()
    }

    /// The points of track `id` in runs of consecutive speeds (a track can leave the lowest modes
    /// and come back).
    pub fn track_runs(&self, id: usize) -> Vec<Vec<(RotorSpeed, f64)>> {
        let mut runs: Vec<Vec<(RotorSpeed, f64)>> = Vec::new();
        let mut open = false;
        for set in &self.speeds {
            match set.modes.iter().find(|m| m.track == Some(id)) {
                Some(m) => {
                    if !open {
                        runs.push(Vec::new());
                        open = true;
                    }
                    if let Some(run) = runs.last_mut() {
                        run.push((set.speed, m.frequency_hz));
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
                    for (k, e) in excitations.iter().enumerate() {
                        let (la, lb) = (e.lines_hz(ra), e.lines_hz(rb));
                        for (ea, eb) in la.into_iter().zip(lb) {
                            let (ga, gb) = (fa - ea, fb - eb);
                            if (ga > 0.0) != (gb > 0.0) {
                                let t = ga / (ga - gb);
                                out.push(Crossing {
                                    track: track.id,
                                    excitation: k,
                                    order: e.order,
                                    blade_passing: e.blade_passing,
                                    speed: ra.lerp(rb, t),
                                    frequency_hz: ea + t * (eb - ea),
                                });
                            }
                        }
                    }
                }
            }
        }
        out
    }

    /// The margin of every mode at `speed` to its nearest excitation, and pass or fail against
    /// `required` (a fraction). Frequencies between sweep speeds are interpolated linearly along
    /// tracks.
    pub fn margins(
        &self,
        excitations: &[Excitation],
        name: &str,
        speed: RotorSpeed,
        required: Option<f64>,
    ) -> Result<MarginCheck, ModalError> {
        let (first, last) = match (self.speeds.first(), self.speeds.last()) {
            (Some(a), Some(b)) => (a.speed, b.speed),
            _ => return Err(ModalError::NoSpeeds),
        };
        let tol = last.tolerance(1e-9);
        if !(speed >= first - tol && speed <= last + tol) {
            return Err(ModalError::MarginSpeed { speed, from: first, to: last });
        }
        let mut modes: Vec<ModeMargin> = self
            .frequencies_at(speed, tol)
            .into_iter()
            .filter_map(|(track, f)| nearest(excitations, speed, f, track))
            .collect();
        modes.sort_by(|a, b| a.frequency_hz.total_cmp(&b.frequency_hz));
        for m in &mut modes {
            m.pass = required.map(|req| m.margin >= req);
        }
        let pass = required.map(|_| modes.iter().all(|m| m.pass == Some(true)));
        Ok(MarginCheck { name: name.to_string(), speed, required, modes, pass })
    }

    /// The margins at the rotor's design speeds ([`Rotor::design_speeds`]: the least operating
    /// speed when it lies below the nominal, the nominal and the maximum).
    pub fn rotor_margins(
        &self,
        rotor: &Rotor,
        excitations: &[Excitation],
        required: Option<f64>,
    ) -> Result<Vec<MarginCheck>, ModalError> {
        rotor
            .design_speeds()
            .into_iter()
            .map(|(name, w)| self.margins(excitations, name, RotorSpeed::from_rad_s(w), required))
            .collect()
    }

    /// `(track, frequency_hz)` at `speed`: the solved modes when `speed` is a sweep speed, else
    /// the tracks present at both neighbouring speeds, interpolated.
    fn frequencies_at(&self, speed: RotorSpeed, tol: RotorSpeed) -> Vec<(usize, f64)> {
        if let Some(set) = self.speeds.iter().find(|s| s.speed.within(speed, tol)) {
            return set.modes.iter().filter_map(|m| Some((m.track?, m.frequency_hz))).collect();
        }
        if self.speeds.len() < 2 {
            return Vec::new();
        }
        let i = self.speeds.partition_point(|s| s.speed < speed).clamp(1, self.speeds.len() - 1);
        let (a, b) = (&self.speeds[i - 1], &self.speeds[i]);
        let t = (speed - a.speed) / (b.speed - a.speed);
        a.modes
            .iter()
            .filter_map(|ma| {
                let mb = b.modes.iter().find(|mb| mb.track == ma.track)?;
                Some((ma.track?, ma.frequency_hz + t * (mb.frequency_hz - ma.frequency_hz)))
            })
            .collect()
    }
}

/// The excitation nearest to `f` at `speed` by relative separation.
fn nearest(
    excitations: &[Excitation],
    speed: RotorSpeed,
    f: f64,
    track: usize,
) -> Option<ModeMargin> {
    excitations
        .iter()
        .filter(|e| e.frequency_hz(speed) > 0.0)
        .map(|e| {
            let (lo, hi) = e.range_hz(speed);
            // The nearest frequency of the band (the frequency itself inside it).
            let fh = f.clamp(lo, hi);
            ModeMargin {
                track,
                frequency_hz: f,
                excitation: e.clone(),
                excitation_hz: fh,
                margin: (f - fh).abs() / fh,
                pass: None,
            }
        })
        .min_by(|a, b| a.margin.total_cmp(&b.margin))
}

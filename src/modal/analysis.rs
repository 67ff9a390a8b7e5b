//! The whole modal stage in one call, for the `modes` and `check` commands: model, sweep,
//! excitations, crossings and margins.

use super::ModalError;
use super::assemble::BeamModel;
use super::attached::Attachments;
use super::campbell::{
    Campbell, Crossing, Excitation, MarginCheck, SpeedRange, SweepProgress, machine_excitations,
};
use super::modes::ModeSet;
use super::track::mac_table;
use crate::project::{Criteria, ExcitationSpec, ModalSpec, Rotor};
use crate::section::SectionProperties;
use crate::units::RotorSpeed;

/// Everything the modal stage reads, for [`ModalAnalysis::run_inputs`].
#[derive(Debug, Clone, Copy)]
pub struct ModalInputs<'a> {
    /// Sections root to tip.
    pub sections: &'a [SectionProperties],
    /// The rotor.
    pub rotor: &'a Rotor,
    /// Modal settings.
    pub spec: &'a ModalSpec,
    /// The criteria (`harmonics`, `frequency_margin_pct`).
    pub criteria: &'a Criteria,
    /// Point bodies and the fluid.
    pub attachments: &'a Attachments,
    /// The machine's own excitations.
    pub excitation: &'a ExcitationSpec,
}

/// The dry frequencies of the modes at one speed, beside the wet ones, for a blade in a fluid.
#[derive(Debug, Clone, PartialEq)]
pub struct DryComparison {
    /// The speed.
    pub speed: RotorSpeed,
    /// Per wet mode at that speed: `(track, wet frequency Hz, dry frequency Hz, MAC)`, the dry
    /// mode being the one of the blade without the fluid whose shape matches best by the
    /// mass-weighted MAC (the fluid changes shapes, so a low MAC says the pair is loose).
    pub modes: Vec<(usize, f64, f64, f64)>,
}

/// Blade-passing multiples checked besides the rotor orders: the blade-passing frequency and
/// its second harmonic (common practice for axial fans).
pub const BLADE_PASSING_MULTIPLES: u32 = 2;

/// Results of the modal stage.
#[derive(Debug, Clone)]
pub struct ModalAnalysis {
    /// The beam model.
    pub model: BeamModel,
    /// The speed range swept.
    pub range: SpeedRange,
    /// Modes over the sweep, tracked.
    pub campbell: Campbell,
    /// The excitation orders checked.
    pub excitations: Vec<Excitation>,
    /// Every crossing inside the sweep.
    pub crossings: Vec<Crossing>,
    /// Margins at the nominal and maximum speeds (those inside the sweep), and at the speed
    /// between them with a smaller least margin than both, if any ([`RUNNING`]).
    pub margins: Vec<MarginCheck>,
    /// With a fluid: the dry frequencies at the first sweep speed and the checked speeds (the
    /// sweep, crossings and margins are wet). Empty without a fluid.
    pub dry: Vec<DryComparison>,
    /// How many modes were asked for and solved, against the highest excitation to cover.
    pub coverage: ModeCoverage,
}

/// The modes solved against the excitations they must cover: every mode below the highest
/// excitation frequency times `1 + margin` must be checked, since it may lie within the margin
/// of that excitation; a mode above it clears every excitation by the margin. So the count
/// asked for is raised until the highest mode solved lies above that frequency at every speed
/// checked, up to what the beam elements resolve.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ModeCoverage {
    /// Modes asked for (`[modal] modes`, or `--modes`).
    pub asked: usize,
    /// Modes solved at every speed of the sweep (at least `asked`).
    pub solved: usize,
    /// The highest excitation frequency times `1 + margin`, Hz, at the speed where the highest
    /// mode solved stands lowest against it.
    pub needed_hz: f64,
    /// The highest mode solved at that speed, Hz.
    pub highest_hz: f64,
    /// That speed.
    pub speed: RotorSpeed,
}

impl ModeCoverage {
    /// Whether the highest mode solved lies above [`ModeCoverage::needed_hz`] (every mode that
    /// may lie within the margin of an excitation is checked).
    pub fn covered(&self) -> bool {
        self.highest_hz > self.needed_hz
    }
}

/// The fewest modes, at least `asked` and at most `cap`, whose highest frequency lies above the
/// highest excitation times `1 + margin` at each of `speeds` (see [`ModeCoverage`]): the count
/// is doubled until it does. A model with fewer modes with mass than asked stops the raise at
/// the last count it could solve.
fn modes_covering(
    model: &BeamModel,
    excitations: &[Excitation],
    speeds: &[RotorSpeed],
    margin: f64,
    asked: usize,
    cap: usize,
) -> Result<ModeCoverage, ModalError> {
    let needed = |speed: RotorSpeed| {
        excitations.iter().map(|e| e.range_hz(speed).1).fold(0.0, f64::max) * (1.0 + margin)
    };
    let worst = |count: usize| -> Result<ModeCoverage, ModalError> {
        let mut worst: Option<ModeCoverage> = None;
        for &speed in speeds {
            let set = model.modes(speed, count)?;
            let highest_hz = set.modes.last().map_or(0.0, |m| m.frequency_hz);
            let here =
                ModeCoverage { asked, solved: count, needed_hz: needed(speed), highest_hz, speed };
            let slack = |c: &ModeCoverage| c.highest_hz - c.needed_hz;
            if worst.as_ref().is_none_or(|w| slack(&here) < slack(w)) {
                worst = Some(here);
            }
        }
        Ok(worst.unwrap_or(ModeCoverage {
            asked,
            solved: count,
            needed_hz: 0.0,
            highest_hz: f64::INFINITY,
            speed: RotorSpeed::ZERO,
        }))
    };
    let mut best = worst(asked)?;
    while !best.covered() && best.solved < cap {
        let more = (2 * best.solved).min(cap);
        match worst(more) {
            Ok(c) => best = c,
            Err(e) if e.is_input() => break,
            Err(e) => return Err(e),
        }
    }
    Ok(best)
}

/// The least margin strictly between the least and the greatest design speed, where the rotor
/// runs on its way from one to the other (a margin is demanded at the maximum speed, so the
/// rotor is taken to run there and at every speed below it down to the nominal, or down to the
/// least operating speed when one is given): the margins at every sweep speed inside the band
/// and at every crossing inside it (a mode on an excitation line, margin 0), the speed with the
/// least margin named `running`. `None` when the band holds no such speed or none has a margin
/// below the least at the design speeds (then these govern, as the margins of a mode that draws
/// away from or towards its excitation over the band do).
fn running_margins(
    campbell: &Campbell,
    excitations: &[Excitation],
    crossings: &[Crossing],
    [low, max]: [RotorSpeed; 2],
    required: Option<f64>,
    ends: &[MarginCheck],
) -> Result<Option<MarginCheck>, ModalError> {
    let least = |m: &MarginCheck| m.modes.iter().map(|mm| mm.margin).fold(f64::INFINITY, f64::min);
    let tol = max.tolerance(1e-9);
    let inside = |s: RotorSpeed| s > low + tol && s < max - tol;
    let speeds = campbell
        .speeds
        .iter()
        .map(|set| set.speed)
        .chain(crossings.iter().map(|c| c.speed))
        .filter(|&s| inside(s));
    let mut worst: Option<(f64, MarginCheck)> = None;
    for speed in speeds {
        let check = campbell.margins(excitations, RUNNING, speed, required)?;
        let m = least(&check);
        if worst.as_ref().is_none_or(|(w, _)| m < *w) {
            worst = Some((m, check));
        }
    }
    let at_ends = ends.iter().map(least).fold(f64::INFINITY, f64::min);
    Ok(worst.filter(|(m, _)| *m < at_ends).map(|(_, check)| check))
}

/// The name of the margin check between the design speeds.
pub const RUNNING: &str = "running";

impl ModalAnalysis {
    /// Builds the model, sweeps `range` (the rotor's 0..omega_max in `spec.omega_step` when `None`)
    /// for `modes` modes (`spec.modes` when `None`), and checks crossings and margins against
    /// `criteria` (`harmonics`, `frequency_margin_pct`). `progress(done, total)` after each speed.
    pub fn run(
        sections: &[SectionProperties],
        rotor: &Rotor,
        spec: &ModalSpec,
        criteria: &Criteria,
        range: Option<SpeedRange>,
        modes: Option<usize>,
        progress: SweepProgress,
    ) -> Result<ModalAnalysis, ModalError> {
        let inputs = ModalInputs {
            sections,
            rotor,
            spec,
            criteria,
            attachments: &Attachments::default(),
            excitation: &ExcitationSpec::default(),
        };
        Self::run_inputs(&inputs, range, modes, progress)
    }

    /// [`ModalAnalysis::run`] with point bodies, a fluid and the machine's own excitations.
    pub fn run_inputs(
        inputs: &ModalInputs<'_>,
        range: Option<SpeedRange>,
        modes: Option<usize>,
        progress: SweepProgress,
    ) -> Result<ModalAnalysis, ModalError> {
        let ModalInputs { sections, rotor, spec, criteria, attachments, excitation } = *inputs;
        let model = BeamModel::with_attachments(sections, rotor, spec, attachments)?;
        let range = match range {
            Some(r) => r,
            None => SpeedRange::for_rotor(rotor, spec.omega_step.map(RotorSpeed::from_rad_s))?,
        };
        // The rotor's speeds join the grid as the numbers the input gave (see `RotorSpeed`).
        let design: Vec<(&str, RotorSpeed)> = rotor
            .design_speeds()
            .into_iter()
            .map(|(name, w)| (name, RotorSpeed::from_rad_s(w)))
            .collect();
        let design_grid: Vec<RotorSpeed> = design.iter().map(|&(_, s)| s).collect();
        let speeds = range.speeds(&design_grid);
        let excitations = machine_excitations(
            criteria.harmonics,
            rotor.blades,
            BLADE_PASSING_MULTIPLES,
            excitation,
        );
        // The design speeds inside the sweep, and the middles between them: the excitations
        // rise along straight lines, a mode's frequency (about `sqrt(f0² + k Ω²)`) along a
        // convex curve, which may pass below a line it clears at both ends.
        let inside: Vec<RotorSpeed> =
            design_grid.iter().copied().filter(|&s| s >= range.from && s <= range.to).collect();
        // The sweep's first speed leads, so that a blade the model cannot hold fails there, as
        // the sweep would (at standstill a failure is the root's, not the spin's).
        let mut checked = vec![range.from];
        checked.extend(inside.iter().copied());
        checked.extend(inside.windows(2).map(|w| w[0] + (w[1] - w[0]) * 0.5));
        let asked = modes.unwrap_or(spec.modes);
        let cap = spec.elements.min(model.dof_count()).max(asked);
        let coverage = modes_covering(
            &model,
            &excitations,
            &checked,
            criteria.frequency_margin.unwrap_or(0.0),
            asked,
            cap,
        )?;
        let count = coverage.solved;
        let campbell = model.campbell(&speeds, count, progress)?;
        let crossings = campbell.crossings(&excitations);
        let mut margins = Vec::new();
        for &(name, speed) in &design {
            if speed >= range.from && speed <= range.to {
                margins.push(campbell.margins(
                    &excitations,
                    name,
                    speed,
                    criteria.frequency_margin,
                )?);
            }
        }
        if margins.len() == design.len()
            && let Some(running) = running_margins(
                &campbell,
                &excitations,
                &crossings,
                [design_grid[0], design_grid[design_grid.len() - 1]],
                criteria.frequency_margin,
                &margins,
            )?
        {
            margins.push(running);
        }
        let mut dry = Vec::new();
        if attachments.fluid.is_some() {
            let dry_model = BeamModel::with_attachments(sections, rotor, spec, &attachments.dry())?;
            let mut checked: Vec<RotorSpeed> =
                campbell.speeds.first().map(|s| s.speed).into_iter().collect();
            checked.extend(margins.iter().map(|m| m.speed));
            checked.dedup_by(|a, b| a.within(*b, a.tolerance(1e-9)));
            for speed in checked {
                let Some(wet) =
                    campbell.speeds.iter().find(|s| s.speed.within(speed, speed.tolerance(1e-9)))
                else {
                    continue;
                };
                let set = dry_model.modes(speed, (count + 2).min(dry_model.dof_count()))?;
                let wet_vectors: Vec<_> = wet.modes.iter().map(|w| &w.vector).collect();
                let dry_vectors: Vec<_> = set.modes.iter().map(|d| &d.vector).collect();
                let table = mac_table(dry_model.mass(), &wet_vectors, &dry_vectors);
                let modes = wet
                    .modes
                    .iter()
                    .zip(&table)
                    .filter_map(|(w, row)| {
                        let (value, best) = row
                            .iter()
                            .copied()
                            .zip(&set.modes)
                            .max_by(|a, b| a.0.total_cmp(&b.0))?;
                        Some((w.track?, w.frequency_hz, best.frequency_hz, value))
                    })
                    .collect();
                dry.push(DryComparison { speed, modes });
            }
        }
        Ok(ModalAnalysis { model, range, campbell, excitations, crossings, margins, dry, coverage })
    }

    /// The modes of the sweep at `speed`, when the sweep holds that speed (the nominal and
    /// maximum speeds always are).
    pub fn at_speed(&self, speed: RotorSpeed) -> Option<&ModeSet> {
        self.campbell.speeds.iter().find(|s| s.speed.within(speed, speed.tolerance(1e-9)))
    }

    /// Whether every margin check passes; `None` when no margin is required or none was checked.
    pub fn pass(&self) -> Option<bool> {
        let verdicts: Vec<bool> = self.margins.iter().filter_map(|m| m.pass).collect();
        (!verdicts.is_empty()).then(|| verdicts.iter().all(|&p| p))
    }
}

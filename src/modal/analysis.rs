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
    /// Margins at the nominal and maximum speeds (those inside the sweep).
    pub margins: Vec<MarginCheck>,
    /// With a fluid: the dry frequencies at the first sweep speed and the checked speeds (the
    /// sweep, crossings and margins are wet). Empty without a fluid.
    pub dry: Vec<DryComparison>,
}

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
        let nominal = RotorSpeed::from_rad_s(rotor.omega_nominal);
        let max = RotorSpeed::from_rad_s(rotor.omega_max);
        let speeds = range.speeds(&[nominal, max]);
        let count = modes.unwrap_or(spec.modes);
        let campbell = model.campbell(&speeds, count, progress)?;
        let excitations = machine_excitations(
            criteria.harmonics,
            rotor.blades,
            BLADE_PASSING_MULTIPLES,
            excitation,
        );
        let crossings = campbell.crossings(&excitations);
        let mut margins = Vec::new();
        for (name, speed) in [("nominal", nominal), ("maximum", max)] {
            if speed >= range.from && speed <= range.to {
                margins.push(campbell.margins(
                    &excitations,
                    name,
                    speed,
                    criteria.frequency_margin,
                )?);
            }
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
        Ok(ModalAnalysis { model, range, campbell, excitations, crossings, margins, dry })
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

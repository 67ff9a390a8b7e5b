//! The whole modal stage in one call, for the `modes` and `check` commands: model, sweep,
//! excitations, crossings and margins.

use super::ModalError;
use super::assemble::BeamModel;
use super::campbell::{
    Campbell, Crossing, Excitation, MarginCheck, SpeedRange, SweepProgress, excitation_orders,
};
use super::modes::ModeSet;
use crate::input::{Criteria, ModalSpec, Rotor};
use crate::section::SectionProperties;

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
}

impl ModalAnalysis {
    /// Builds the model, sweeps `range` (the rotor's 0..rpm_max in `spec.rpm_step` when `None`)
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
        let model = BeamModel::new(sections, rotor, spec)?;
        let range = match range {
            Some(r) => r,
            None => SpeedRange::for_rotor(rotor, spec.rpm_step)?,
        };
        let speeds = range.speeds(&[rotor.rpm_nominal, rotor.rpm_max]);
        let campbell = model.campbell(&speeds, modes.unwrap_or(spec.modes), progress)?;
        let excitations =
            excitation_orders(criteria.harmonics, rotor.blades, BLADE_PASSING_MULTIPLES);
        let crossings = campbell.crossings(&excitations);
        let mut margins = Vec::new();
        for (name, rpm) in [("nominal", rotor.rpm_nominal), ("maximum", rotor.rpm_max)] {
            if rpm >= range.from_rpm && rpm <= range.to_rpm {
                margins.push(campbell.margins(
                    &excitations,
                    name,
                    rpm,
                    criteria.frequency_margin_pct,
                )?);
            }
        }
        Ok(ModalAnalysis { model, range, campbell, excitations, crossings, margins })
    }

    /// The modes of the sweep at `rpm`, when the sweep holds that speed (the nominal and
    /// maximum speeds always are).
    pub fn at_speed(&self, rpm: f64) -> Option<&ModeSet> {
        self.campbell.speeds.iter().find(|s| (s.rpm - rpm).abs() <= 1e-9 * rpm.abs().max(1.0))
    }

    /// Whether every margin check passes; `None` when no margin is required or none was checked.
    pub fn pass(&self) -> Option<bool> {
        let verdicts: Vec<bool> = self.margins.iter().filter_map(|m| m.pass).collect();
        (!verdicts.is_empty()).then(|| verdicts.iter().all(|&p| p))
    }
}

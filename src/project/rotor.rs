//! The rotor the blade belongs to: blade count, radii, speeds, pitch and clearances.

use crate::units::Angle;

/// The rotor the blade belongs to (`[rotor]`).
#[derive(Debug, Clone, PartialEq)]
pub struct Rotor {
    /// Number of blades `B`.
    pub blades: u32,
    /// Rotor axis to the root end, along the pitch axis, m.
    pub hub_radius: f64,
    /// Rotor axis to the blade tip, m.
    pub tip_radius: f64,
    /// Nominal speed, rad/s (`rpm_nominal` in the input).
    pub omega_nominal: f64,
    /// Greatest operating speed, rad/s (`rpm_max` in the input); the Campbell sweep covers
    /// 0..omega_max.
    pub omega_max: f64,
    /// Least operating speed, rad/s (`rpm_min` in the input; the nominal speed when not given):
    /// a rotor on a variable-speed drive, or a turbine that runs from its cut-in speed up, runs
    /// at every speed from here to `omega_max`, and the frequency margin is demanded over all of
    /// them (see [`Rotor::design_speeds`]).
    pub omega_min: f64,
    /// Pitch setting added to the station twist.
    pub pitch: Angle,
    /// Pitch range (least, greatest) for variable pitch.
    pub pitch_range: (Angle, Angle),
    /// Gap to the spherical hub band, m.
    pub root_clearance: f64,
    /// Gap to the spherical duct band, m.
    pub tip_clearance: f64,
}

impl Rotor {
    /// The speeds at which the frequency margin is checked, with their names, rad/s: the least
    /// operating speed (`"minimum"`) when it lies below the nominal, the nominal and the maximum
    /// speed. The rotor runs at every speed from the first to the last.
    pub fn design_speeds(&self) -> Vec<(&'static str, f64)> {
        let mut speeds = Vec::with_capacity(3);
        if self.omega_min < self.omega_nominal {
            speeds.push(("minimum", self.omega_min));
        }
        speeds.push(("nominal", self.omega_nominal));
        speeds.push(("maximum", self.omega_max));
        speeds
    }
}

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
    /// Pitch setting added to the station twist.
    pub pitch: Angle,
    /// Pitch range (least, greatest) for variable pitch.
    pub pitch_range: (Angle, Angle),
    /// Gap to the spherical hub band, m.
    pub root_clearance: f64,
    /// Gap to the spherical duct band, m.
    pub tip_clearance: f64,
}

//! Unit conversions at the edges of the program, and an angle type that cannot be mixed up.
//!
//! Everything inside layloft is SI: m, kg, s, N, Pa, K (temperature differences), rad. Inputs
//! carry their unit in their name (`E1_GPa`, `chord_m`, `twist_deg`) and are converted once, with
//! the constants below, where they are read; outputs are converted once where they are written.

use serde::{Deserialize, Serialize};

/// Pascals in one gigapascal.
pub const GPA: f64 = 1e9;
/// Pascals in one megapascal.
pub const MPA: f64 = 1e6;
/// Metres in one millimetre.
pub const MM: f64 = 1e-3;
/// One microstrain (1e-6 m/m).
pub const MICROSTRAIN: f64 = 1e-6;
/// Radians per second in one revolution per minute.
pub const RPM: f64 = std::f64::consts::PI / 30.0;

/// A plane angle. Stored in radians; built and read in either unit by name, so that degrees and
/// radians are never confused.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default, Serialize, Deserialize)]
pub struct Angle(f64);

impl Angle {
    /// The zero angle.
    pub const ZERO: Angle = Angle(0.0);

    /// An angle of `deg` degrees.
    pub fn from_deg(deg: f64) -> Self {
        Angle(deg.to_radians())
    }

    /// An angle of `rad` radians.
    pub fn from_rad(rad: f64) -> Self {
        Angle(rad)
    }

    /// The angle in radians.
    pub fn rad(self) -> f64 {
        self.0
    }

    /// The angle in degrees.
    pub fn deg(self) -> f64 {
        self.0.to_degrees()
    }
}

impl std::ops::Neg for Angle {
    type Output = Angle;
    fn neg(self) -> Angle {
        Angle(-self.0)
    }
}

impl std::ops::Add for Angle {
    type Output = Angle;
    fn add(self, other: Angle) -> Angle {
        Angle(self.0 + other.0)
    }
}

impl std::ops::Sub for Angle {
    type Output = Angle;
    fn sub(self, other: Angle) -> Angle {
        Angle(self.0 - other.0)
    }
}

/// Rotor speed in rad/s from revolutions per minute.
pub fn rpm_to_rad_s(rpm: f64) -> f64 {
    rpm * RPM
}

/// Revolutions per minute from a rotor speed in rad/s.
pub fn rad_s_to_rpm(omega: f64) -> f64 {
    omega / RPM
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn degrees_and_radians_round_trip() {
        let a = Angle::from_deg(30.0);
        assert!((a.rad() - std::f64::consts::FRAC_PI_6).abs() < 1e-15);
        assert!((Angle::from_rad(a.rad()).deg() - 30.0).abs() < 1e-12);
    }

    #[test]
    fn rpm_conversion() {
        // 60 rpm is one revolution per second: 2 pi rad/s (definition of the units).
        assert!((rpm_to_rad_s(60.0) - 2.0 * std::f64::consts::PI).abs() < 1e-12);
        assert!((rad_s_to_rpm(rpm_to_rad_s(1500.0)) - 1500.0).abs() < 1e-9);
    }
}

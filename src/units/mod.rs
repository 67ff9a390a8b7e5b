//! Unit conversions at the edges of the program, and types for the quantities whose units are
//! easily mixed up: [`Angle`], [`Temperature`] and [`RotorSpeed`].
//!
//! Everything inside layloft is SI: m, kg, s, N, Pa, K (temperature differences), rad, rad/s.
//! Inputs carry their unit in their name (`E1_GPa`, `chord_m`, `twist_deg`, `rpm_max`) and are
//! converted once, with the constants and types below, where they are read; outputs are converted
//! once where they are written.

use serde::{Deserialize, Serialize};

mod speed;

pub use speed::RotorSpeed;

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

/// Revolutions per minute from a rotor speed in rad/s, exactly as computed (no rounding).
pub fn rad_s_to_rpm(omega: f64) -> f64 {
    omega / RPM
}

/// Revolutions per minute from a rotor speed in rad/s, for the output edge: the nearest value
/// with at most 12 significant digits. A speed read in rpm, stored in rad/s by
/// [`rpm_to_rad_s`] and shown again through this function gives back the very number the user
/// wrote (when it had at most 12 significant digits), so echoed speeds print as they were given;
/// the rounding is far below any meaningful speed difference (at most 5e-12 relative).
pub fn rpm_of(omega: f64) -> f64 {
    significant(rad_s_to_rpm(omega), 12)
}

/// The kelvin temperature of 0 °C (definition of the Celsius scale).
pub const ZERO_CELSIUS_K: f64 = 273.15;

/// A thermodynamic temperature, built and read in kelvin or degrees Celsius by name, so that
/// the two scales are never confused (temperature differences stay plain `f64` in K).
///
/// The value is held on the Celsius scale, the scale every input and output uses: the offset of
/// 273.15 K is not a power of two, and a temperature taken to kelvin and back would lose its last
/// digits (0.001 °C comes back as 0.00099999999997635), so a temperature read in °C prints back
/// exactly as it was given while [`Temperature::kelvin`] serves the physics.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Serialize, Deserialize)]
pub struct Temperature(f64);

impl Temperature {
    /// A temperature of `celsius` degrees Celsius.
    pub fn from_celsius(celsius: f64) -> Self {
        Temperature(celsius)
    }

    /// A temperature of `kelvin` kelvin.
    pub fn from_kelvin(kelvin: f64) -> Self {
        Temperature(kelvin - ZERO_CELSIUS_K)
    }

    /// The temperature in degrees Celsius.
    pub fn celsius(self) -> f64 {
        self.0
    }

    /// The temperature in kelvin.
    pub fn kelvin(self) -> f64 {
        self.0 + ZERO_CELSIUS_K
    }
}

/// A fraction from a percentage (`pct / 100`).
pub fn fraction_of_pct(pct: f64) -> f64 {
    pct / 100.0
}

/// A percentage from a fraction, for the output edge: the nearest value with at most 12
/// significant digits, so that a percentage read and shown again prints as it was given.
pub fn pct_of(fraction: f64) -> f64 {
    significant(fraction * 100.0, 12)
}

/// `x` rounded to `digits` significant decimal digits (the nearest `f64` to that decimal);
/// non-finite values and zero pass unchanged.
pub fn significant(x: f64, digits: usize) -> f64 {
    if !x.is_finite() || x == 0.0 || digits == 0 {
        return x;
    }
    // Scientific notation with `digits - 1` decimals is exactly the rounding to `digits`
    // significant digits, and parsing it back gives the nearest double to that decimal.
    format!("{:.*e}", digits - 1, x).parse().unwrap_or(x)
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

    #[test]
    fn every_integer_speed_round_trips_exactly() {
        // rpm -> rad/s -> rpm at the output edge gives back the very number read, so echoed
        // speeds print unchanged with `{}` (exact equality, not a tolerance).
        for n in 0..=100_000u32 {
            let rpm = f64::from(n);
            assert_eq!(rpm_of(rpm_to_rad_s(rpm)), rpm, "{n} rpm");
        }
    }

    #[test]
    fn typical_decimal_speeds_round_trip_exactly() {
        let mut checked = 0;
        // Every speed with up to three decimals below 2000 rpm, as the reader would parse it.
        for n in 0..2_000_000u32 {
            let rpm: f64 = format!("{}.{:03}", n / 1000, n % 1000).parse().unwrap();
            assert_eq!(rpm_of(rpm_to_rad_s(rpm)), rpm, "{rpm} rpm");
            checked += 1;
        }
        for text in
            ["0.5", "1e-3", "2.5e-7", "33.333", "1234.5678", "99999.99", "12345678.9", "7427.1"]
        {
            let rpm: f64 = text.parse().unwrap();
            assert_eq!(rpm_of(rpm_to_rad_s(rpm)), rpm, "{text} rpm");
            assert_eq!(format!("{}", rpm_of(rpm_to_rad_s(rpm))), format!("{rpm}"));
        }
        assert_eq!(checked, 2_000_000);
    }

    #[test]
    fn temperatures_and_percentages_round_trip_exactly() {
        for n in -20_000..=200_000i32 {
            let x = f64::from(n) / 100.0;
            assert_eq!(Temperature::from_celsius(x).celsius(), x, "{x} C");
            assert_eq!(pct_of(fraction_of_pct(x)), x, "{x} %");
        }
        for text in ["0.001", "1e-6", "0.15", "12.5", "3.333333", "0.0625"] {
            let pct: f64 = text.parse().unwrap();
            assert_eq!(pct_of(fraction_of_pct(pct)), pct, "{text} %");
        }
        // 0 °C is 273.15 K and -273.15 °C is absolute zero (definition of the Celsius scale).
        assert_eq!(Temperature::from_celsius(0.0).kelvin(), 273.15);
        assert_eq!(Temperature::from_kelvin(0.0).celsius(), -273.15);
        assert!((Temperature::from_celsius(120.0).kelvin() - 393.15).abs() < 1e-12);
        assert_eq!(significant(123.456_789, 4), 123.5);
        assert_eq!(significant(-0.000_123_456, 3), -0.000_123);
        assert!(significant(f64::NAN, 3).is_nan());
    }
}

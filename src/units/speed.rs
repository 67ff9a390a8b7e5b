//! A rotor speed that speaks rad/s and keeps the number a user gave in rpm.

use serde::{Serialize, Serializer};

use super::{RPM, rpm_of};

/// A rotor speed. Built and read in rad/s ([`RotorSpeed::from_rad_s`], [`RotorSpeed::rad_s`])
/// for the physics, in revolutions per minute ([`RotorSpeed::from_rpm`], [`RotorSpeed::rpm`])
/// only at the edges, where speeds are read and written.
///
/// The value is held on the rpm scale, the scale every input and output uses. The factor
/// π/30 between the scales is not a power of two: a speed taken from rpm to rad/s and back is
/// not always the same double, and the sweep speeds and crossings a report prints at full
/// precision would change in their last digit. Held in rpm, a speed built from rpm gives back
/// the very double it was built from, and the arithmetic of a sweep grid (steps from the first
/// speed, a crossing interpolated between two grid speeds) is done on that scale by the methods
/// below, so a grid gives the same doubles whichever scale it is later read in.
///
/// Serialized, a speed is its value in rad/s.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default)]
pub struct RotorSpeed(f64);

impl RotorSpeed {
    /// The rotor at rest.
    pub const ZERO: RotorSpeed = RotorSpeed(0.0);

    /// A speed of `omega` rad/s.
    ///
    /// Snapped on the rpm scale to 12 significant digits (as [`rpm_of`]): a speed read in rpm
    /// and carried in rad/s (`Rotor::omega_max`) comes back as the number the user wrote, so it
    /// falls on the grid points the user meant. The change is at most 5e-12 of the speed (half a
    /// unit in the twelfth digit).
    pub fn from_rad_s(omega: f64) -> Self {
        RotorSpeed(rpm_of(omega))
    }

    /// A speed of `rpm` revolutions per minute, held exactly (for the input edge).
    pub fn from_rpm(rpm: f64) -> Self {
        RotorSpeed(rpm)
    }

    /// The speed in rad/s.
    pub fn rad_s(self) -> f64 {
        self.0 * RPM
    }

    /// The speed in revolutions per minute (for the output edge): exactly the double a speed
    /// built with [`RotorSpeed::from_rpm`] was built from.
    pub fn rpm(self) -> f64 {
        self.0
    }

    /// Whether the speed is a finite number.
    pub fn is_finite(self) -> bool {
        self.0.is_finite()
    }

    /// The frequency of rotor order `order` (`order` excitations per turn), Hz:
    /// `order · Ω / 2π`, computed as `order · rpm / 60`.
    pub fn order_hz(self, order: f64) -> f64 {
        order * self.0 / 60.0
    }

    /// The speed a fraction `t` of the way from `self` to `to` (linear interpolation).
    pub fn lerp(self, to: RotorSpeed, t: f64) -> RotorSpeed {
        RotorSpeed(self.0 + t * (to.0 - self.0))
    }

    /// A tolerance for telling two speeds of a grid apart: `rel` of this speed, but not less
    /// than `rel` of 1 rpm (so that it holds at rest).
    pub fn tolerance(self, rel: f64) -> RotorSpeed {
        RotorSpeed(rel * self.0.abs().max(1.0))
    }

    /// Whether `self` and `other` differ by at most `tol`.
    pub fn within(self, other: RotorSpeed, tol: RotorSpeed) -> bool {
        (self.0 - other.0).abs() <= tol.0
    }

    /// A total order (as [`f64::total_cmp`]), for sorting speeds.
    pub fn total_cmp(&self, other: &RotorSpeed) -> std::cmp::Ordering {
        self.0.total_cmp(&other.0)
    }
}

impl std::ops::Add for RotorSpeed {
    type Output = RotorSpeed;
    fn add(self, other: RotorSpeed) -> RotorSpeed {
        RotorSpeed(self.0 + other.0)
    }
}

impl std::ops::Sub for RotorSpeed {
    type Output = RotorSpeed;
    fn sub(self, other: RotorSpeed) -> RotorSpeed {
        RotorSpeed(self.0 - other.0)
    }
}

impl std::ops::Mul<f64> for RotorSpeed {
    type Output = RotorSpeed;
    fn mul(self, k: f64) -> RotorSpeed {
        RotorSpeed(self.0 * k)
    }
}

impl std::ops::Div<f64> for RotorSpeed {
    type Output = RotorSpeed;
    fn div(self, k: f64) -> RotorSpeed {
        RotorSpeed(self.0 / k)
    }
}

/// The ratio of two speeds.
impl std::ops::Div for RotorSpeed {
    type Output = f64;
    fn div(self, other: RotorSpeed) -> f64 {
        self.0 / other.0
    }
}

impl Serialize for RotorSpeed {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.serialize_f64(self.rad_s())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::PI;

    #[test]
    fn a_speed_built_in_rpm_reads_back_the_same_double() {
        // Integers, decimals with up to three places and awkward values: exact equality.
        for n in 0..=200_000u32 {
            let rpm = f64::from(n) * 0.125 + f64::from(n % 7) * 1e-3;
            assert_eq!(RotorSpeed::from_rpm(rpm).rpm(), rpm, "{rpm} rpm");
        }
        for rpm in [1e-9, 0.1, 1.0 / 3.0, 2.0_f64.sqrt() * 1000.0, 7427.1, 12_345_678.9] {
            assert_eq!(RotorSpeed::from_rpm(rpm).rpm(), rpm, "{rpm} rpm");
        }
    }

    #[test]
    fn rad_s_is_rpm_times_two_pi_over_sixty() {
        // 1 rpm is one turn of 2π rad per 60 s (from memory: definition of the rpm).
        for n in 0..=100_000u32 {
            let rpm = f64::from(n) * 0.37;
            let expected = rpm * 2.0 * PI / 60.0;
            let got = RotorSpeed::from_rpm(rpm).rad_s();
            assert!((got - expected).abs() <= 4.0 * f64::EPSILON * expected, "{rpm} rpm");
        }
        assert!((RotorSpeed::from_rpm(60.0).rad_s() - 2.0 * PI).abs() <= 2.0 * f64::EPSILON * PI);
        assert!((RotorSpeed::from_rad_s(2.0 * PI).rpm() - 60.0).abs() < 1e-12);
    }

    #[test]
    fn a_speed_read_in_rpm_and_carried_in_rad_s_falls_back_on_its_number() {
        // The reader stores rpm_nominal as rad/s; the sweep takes it back as the given number.
        for n in 0..=100_000u32 {
            let rpm = f64::from(n) / 8.0;
            assert_eq!(RotorSpeed::from_rad_s(super::super::rpm_to_rad_s(rpm)).rpm(), rpm);
        }
        // Any other speed moves by at most half a unit in its twelfth digit.
        for n in 1..=100_000u32 {
            let w = f64::from(n) * 0.123_456_789_012_345;
            assert!((RotorSpeed::from_rad_s(w).rad_s() / w - 1.0).abs() <= 5.1e-12, "{w} rad/s");
        }
    }

    #[test]
    fn grid_arithmetic_is_done_on_the_rpm_scale() {
        // The same doubles as the grid written in rpm: steps, interpolation, ratios.
        let (from, step) = (RotorSpeed::from_rpm(0.0), RotorSpeed::from_rpm(2980.0 / 60.0));
        for i in 0..=60u32 {
            let k = f64::from(i);
            assert_eq!((from + step * k).rpm(), 0.0 + k * (2980.0 / 60.0));
        }
        let (a, b) = (RotorSpeed::from_rpm(1234.5), RotorSpeed::from_rpm(1284.1));
        let t = 0.293_847_561_2;
        assert_eq!(a.lerp(b, t).rpm(), 1234.5 + t * (1284.1 - 1234.5));
        assert_eq!((b - a) / RotorSpeed::from_rpm(3.1), (1284.1 - 1234.5) / 3.1);
        assert_eq!((b / 60.0).rpm(), 1284.1 / 60.0);
        // A rotor order: 3 excitations per turn at 1500 rpm are 75 Hz (definition of an order).
        assert_eq!(RotorSpeed::from_rpm(1500.0).order_hz(3.0), 75.0);
        assert!(a < b && a.within(a + RotorSpeed::from_rpm(1e-10), a.tolerance(1e-9)));
        assert!(!a.within(b, a.tolerance(1e-9)));
        assert_eq!(RotorSpeed::ZERO.tolerance(1e-9).rpm(), 1e-9);
        let half_turn = RotorSpeed::from_rpm(30.0);
        assert!((half_turn.rad_s() - PI).abs() <= 2.0 * f64::EPSILON * PI);
        assert_eq!(serde_json::to_value(half_turn).ok(), Some(half_turn.rad_s().into()));
    }
}

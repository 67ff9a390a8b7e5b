//! Lamina failure criteria as strength ratios: the multiplier of the applied load at which the
//! criterion reaches failure, and the mode it predicts.
//!
//! Criteria: Tsai–Wu (Tsai & Wu, J. Compos. Mater. 5 (1971) 58–80, with the interaction term
//! F12 = F12* sqrt(F11 F22), F12* = -1/2 unless the material gives another value), maximum stress,
//! maximum strain, and Hashin's plane-stress fibre and matrix modes (Hashin, J. Appl. Mech. 47
//! (1980) 329–334). The strength ratio follows Kaw, *Mechanics of Composite Materials*, 2nd ed.,
//! 2006, §2.8: the applied stress is multiplied by R until the criterion reaches 1.
//!
//! Each ply state has a part that scales with the load (`load`) and a fixed residual part
//! (`fixed`, e.g. cure stresses); only the first is multiplied, so that
//! `sigma(R) = fixed + R * load`. Without a fixed part every ratio scales as 1/k when the load is
//! scaled by k. A ratio of infinity means no multiple of the load fails the ply; a ratio of zero
//! means the fixed part alone already fails it.
//!
//! [`LaminateStrength`] applies every criterion at the top and bottom face of every ply of a
//! laminate response and finds the first-ply failure: which ply, which face, which criterion,
//! which mode, and the load multiplier.
//!
//! ```
//! use layloft::failure::{Criterion, LaminateStrength};
//! use layloft::laminate::{Laminate, LaminateLoad, LayupCode, Resultants};
//! use layloft::material::Lamina;
//! use nalgebra::Vector3;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! // T300/5208 (Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1).
//! let tape = Lamina::builder("T300/5208")
//!     .elastic(181e9, 10.3e9, 7.17e9, 0.28)
//!     .ply_thickness(0.125e-3)
//!     .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
//!     .build()?;
//! let laminate = Laminate::from_code(&"[0/90]s".parse::<LayupCode>()?, &tape).checked()?;
//! let pull = Resultants { n: Vector3::new(50e3, 0.0, 0.0), m: Vector3::zeros() };
//! let response = laminate.response(&LaminateLoad::Resultants(pull), 0.0)?;
//! let strength = LaminateStrength::evaluate(&laminate, &response);
//! let first = strength.first_ply_failure().expect("a tensile load fails some ply");
//! // The 90° plies crack first.
//! assert_eq!(laminate.plies()[first.ply].angle.deg().round(), 90.0);
//! assert!(strength.first_ply_failure_by(Criterion::MaxStress).is_some());
//! # Ok(())
//! # }
//! ```

mod criteria;
mod first_ply;

pub use criteria::{StrengthConstants, hashin, max_strain, max_stress, tsai_wu};
pub use first_ply::{Face, FirstPlyFailure, LaminateStrength, PlyRatios};

use std::fmt;

use nalgebra::Vector3;

use crate::material::Lamina;

/// A failure criterion.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Criterion {
    /// Tsai–Wu quadratic interaction.
    TsaiWu,
    /// Maximum stress, component by component.
    MaxStress,
    /// Maximum strain, component by component.
    MaxStrain,
    /// Hashin fibre and matrix modes.
    Hashin,
}

impl Criterion {
    /// Every criterion, in report order.
    pub const ALL: [Criterion; 4] =
        [Criterion::TsaiWu, Criterion::MaxStress, Criterion::MaxStrain, Criterion::Hashin];

    /// The key used in JSON and CSV (`tsai_wu`, `max_stress`, `max_strain`, `hashin`).
    pub fn key(self) -> &'static str {
        match self {
            Criterion::TsaiWu => "tsai_wu",
            Criterion::MaxStress => "max_stress",
            Criterion::MaxStrain => "max_strain",
            Criterion::Hashin => "hashin",
        }
    }

    /// Human name.
    pub fn label(self) -> &'static str {
        match self {
            Criterion::TsaiWu => "Tsai-Wu",
            Criterion::MaxStress => "maximum stress",
            Criterion::MaxStrain => "maximum strain",
            Criterion::Hashin => "Hashin",
        }
    }
}

impl fmt::Display for Criterion {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.label())
    }
}

/// The way a ply fails.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum FailureMode {
    /// Fibre (direction 1) tension.
    FibreTension,
    /// Fibre (direction 1) compression.
    FibreCompression,
    /// Matrix (direction 2) tension.
    MatrixTension,
    /// Matrix (direction 2) compression.
    MatrixCompression,
    /// In-plane shear.
    Shear,
    /// Tension in an isotropic layer.
    Tension,
    /// Compression in an isotropic layer.
    Compression,
    /// No multiple of the load fails the ply.
    None,
}

impl FailureMode {
    /// The key used in JSON and CSV, e.g. `fibre_tension`.
    pub fn key(self) -> &'static str {
        match self {
            FailureMode::FibreTension => "fibre_tension",
            FailureMode::FibreCompression => "fibre_compression",
            FailureMode::MatrixTension => "matrix_tension",
            FailureMode::MatrixCompression => "matrix_compression",
            FailureMode::Shear => "shear",
            FailureMode::Tension => "tension",
            FailureMode::Compression => "compression",
            FailureMode::None => "none",
        }
    }

    /// Human name.
    pub fn label(self) -> &'static str {
        match self {
            FailureMode::FibreTension => "fibre tension",
            FailureMode::FibreCompression => "fibre compression",
            FailureMode::MatrixTension => "matrix tension",
            FailureMode::MatrixCompression => "matrix compression",
            FailureMode::Shear => "in-plane shear",
            FailureMode::Tension => "tension",
            FailureMode::Compression => "compression",
            FailureMode::None => "none",
        }
    }
}

impl fmt::Display for FailureMode {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.label())
    }
}

/// A strength ratio and the mode it predicts.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StrengthRatio {
    /// Load multiplier at failure: 1 means the load just fails the ply, 2 means twice the load
    /// would; infinite when no multiple fails it.
    pub ratio: f64,
    /// The predicted failure mode.
    pub mode: FailureMode,
}

impl StrengthRatio {
    /// The ratio of a ply no multiple of the load can fail.
    pub const NEVER: StrengthRatio =
        StrengthRatio { ratio: f64::INFINITY, mode: FailureMode::None };

    /// The ratio as a finite number, or `None` when infinite (written `null` in JSON).
    pub fn finite(&self) -> Option<f64> {
        self.ratio.is_finite().then_some(self.ratio)
    }
}

/// Stress and mechanical strain of a ply point in material axes (sigma1, sigma2, tau12 in Pa;
/// eps1, eps2, gamma12).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct MaterialState {
    /// sigma1, sigma2, tau12, Pa.
    pub stress: Vector3<f64>,
    /// eps1, eps2, gamma12 (mechanical: total less free thermal strain).
    pub strain: Vector3<f64>,
}

/// Strength ratios of one ply point by every criterion; `None` where a criterion does not apply
/// (no strengths, or Hashin on an isotropic layer).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CriteriaRatios {
    /// Tsai–Wu.
    pub tsai_wu: Option<StrengthRatio>,
    /// Maximum stress.
    pub max_stress: Option<StrengthRatio>,
    /// Maximum strain.
    pub max_strain: Option<StrengthRatio>,
    /// Hashin.
    pub hashin: Option<StrengthRatio>,
}

impl CriteriaRatios {
    /// The ratio by one criterion.
    pub fn by(&self, c: Criterion) -> Option<StrengthRatio> {
        match c {
            Criterion::TsaiWu => self.tsai_wu,
            Criterion::MaxStress => self.max_stress,
            Criterion::MaxStrain => self.max_strain,
            Criterion::Hashin => self.hashin,
        }
    }

    /// The lowest ratio over all criteria, with its criterion.
    pub fn governing(&self) -> Option<(Criterion, StrengthRatio)> {
        Criterion::ALL
            .iter()
            .filter_map(|&c| self.by(c).map(|r| (c, r)))
            .min_by(|a, b| a.1.ratio.total_cmp(&b.1.ratio))
    }

    /// Point-wise minimum of two sets (the worse face of a ply, the worse of two points).
    pub fn worst(&self, other: &CriteriaRatios) -> CriteriaRatios {
        fn lower(a: Option<StrengthRatio>, b: Option<StrengthRatio>) -> Option<StrengthRatio> {
            match (a, b) {
                (Some(x), Some(y)) => Some(if y.ratio < x.ratio { y } else { x }),
                (x, None) => x,
                (None, y) => y,
            }
        }
        CriteriaRatios {
            tsai_wu: lower(self.tsai_wu, other.tsai_wu),
            max_stress: lower(self.max_stress, other.max_stress),
            max_strain: lower(self.max_strain, other.max_strain),
            hashin: lower(self.hashin, other.hashin),
        }
    }
}

/// Strength ratios by every criterion for a ply point of `lamina` with load part `load` and
/// fixed part `fixed`.
pub fn evaluate_all(
    lamina: &Lamina,
    load: &MaterialState,
    fixed: &MaterialState,
) -> CriteriaRatios {
    StrengthConstants::new(lamina).evaluate_all(load, fixed)
}

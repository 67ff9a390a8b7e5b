//! The laminate report: stiffness (A, B, D, their inverse, membrane and flexural engineering
//! constants), ply strains and stresses at the faces of every ply, strength ratios by every
//! criterion and the first-ply failure, as one JSON object ([`LaminateReport::to_json`]) or a
//! readable engineering summary ([`LaminateReport::to_text`]).
//!
//! Method: classical laminate theory ([`crate::laminate`]) and the strength ratios of
//! [`crate::failure`]. Ply 1 is the outer face; `z` runs along the outward normal from the
//! midplane. Reported ply stresses are the total ones (load plus residual thermal part); the load
//! multiplier scales the mechanical load only, with the residual part held fixed.
//!
//! JSON keys carry SI units (`A_N_m`, `z_top_m`, `sigma1_Pa`); strains and Poisson's ratios are
//! dimensionless and carry none. An infinite strength ratio is `null`.
//!
//! ```
//! use layloft::laminate::{Laminate, LaminateLoad, LayupCode, Resultants};
//! use layloft::material::Lamina;
//! use layloft::report::LaminateReport;
//! use nalgebra::Vector3;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let tape = Lamina::builder("T300/5208")
//!     .elastic(181e9, 10.3e9, 7.17e9, 0.28)
//!     .ply_thickness(0.125e-3)
//!     .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
//!     .build()?;
//! let code: LayupCode = "[0/±45/90]s".parse()?;
//! let laminate = Laminate::from_code(&code, &tape).checked()?;
//! let load = LaminateLoad::Resultants(Resultants {
//!     n: Vector3::new(100e3, 0.0, 0.0),
//!     m: Vector3::zeros(),
//! });
//! let report = LaminateReport::new(code.as_str(), laminate, Some(load), 0.0)?;
//! let json = report.to_json();
//! assert_eq!(json["plies"].as_array().map(Vec::len), Some(8));
//! assert!(json["first_ply_failure"]["load_multiplier"].as_f64().is_some());
//! assert!(report.to_text().contains("First-ply failure"));
//! # Ok(())
//! # }
//! ```

mod json;
mod text;

use nalgebra::{Matrix3, Matrix6, Vector3};

use crate::failure::{FirstPlyFailure, LaminateStrength};
use crate::laminate::{
    Abd, Deformation, EngineeringConstants, Laminate, LaminateError, LaminateLoad,
    LaminateResponse, PointState, Resultants,
};

/// Everything the `laminate` command reports about one laminate under one load.
#[derive(Debug, Clone)]
pub struct LaminateReport {
    /// The laminate code as the user wrote it.
    pub code: String,
    /// The laminate, outer face first.
    pub laminate: Laminate,
    /// A (N/m), B (N), D (N·m).
    pub abd: Abd,
    /// `[A B; B D]^-1`: upper-left block in m/N, off-diagonal blocks in 1/N, lower-right block
    /// in 1/(N·m).
    pub compliance: Matrix6<f64>,
    /// Membrane engineering constants (curvatures free), Pa.
    pub membrane: EngineeringConstants,
    /// Flexural engineering constants, Pa.
    pub flexural: EngineeringConstants,
    /// Uniform temperature change, K (service less stress-free temperature).
    pub delta_t: f64,
    /// The mechanical load as given, if any.
    pub load: Option<LaminateLoad>,
    /// Ply strains and stresses; present when a load or a temperature change is given.
    pub response: Option<LaminateResponse>,
    /// Strength ratios of every ply; present with the response.
    pub strength: Option<LaminateStrength>,
}

impl LaminateReport {
    /// Computes the report. Without a load and without a temperature change only stiffness is
    /// computed; with a temperature change alone, the residual stresses (and a strength check
    /// of them: a ratio of zero where they alone fail a ply).
    pub fn new(
        code: &str,
        laminate: Laminate,
        load: Option<LaminateLoad>,
        delta_t: f64,
    ) -> Result<Self, LaminateError> {
        let laminate = laminate.checked()?;
        let abd = laminate.abd();
        let compliance = abd.compliance().ok_or(LaminateError::Singular)?;
        let membrane = laminate.membrane_constants()?;
        let flexural = laminate.flexural_constants()?;
        let applied = match load {
            Some(l) => Some(l),
            None if delta_t != 0.0 => Some(LaminateLoad::Resultants(Resultants::default())),
            None => None,
        };
        let response = applied.map(|l| laminate.response(&l, delta_t)).transpose()?;
        let strength = response.as_ref().map(|r| LaminateStrength::evaluate(&laminate, r));
        Ok(LaminateReport {
            code: code.to_string(),
            laminate,
            abd,
            compliance,
            membrane,
            flexural,
            delta_t,
            load,
            response,
            strength,
        })
    }

    /// The first-ply failure by any criterion, when there is a finite one.
    pub fn first_ply_failure(&self) -> Option<FirstPlyFailure> {
        self.strength.as_ref().and_then(LaminateStrength::first_ply_failure)
    }

    /// The report as one JSON object; see the module documentation for the keys.
    pub fn to_json(&self) -> serde_json::Value {
        json::report(self)
    }

    /// The report as a readable engineering summary for a terminal.
    pub fn to_text(&self) -> String {
        text::report(self)
    }

    /// Total midplane deformation (mechanical plus thermal), round-off cleaned, when there is a
    /// response.
    pub fn midplane(&self) -> Option<Deformation> {
        self.response.as_ref().map(|r| {
            self.clean_deformation(&Deformation {
                strain: r.mechanical.strain + r.thermal.strain,
                curvature: r.mechanical.curvature + r.thermal.curvature,
            })
        })
    }

    /// A deformation with components below 1e-12 of its largest strain (curvatures taken at
    /// the outer face, times h/2) set to zero: round-off where symmetry makes them vanish.
    fn clean_deformation(&self, d: &Deformation) -> Deformation {
        let half = self.laminate.thickness() / 2.0;
        let scale = d.strain.amax().max(d.curvature.amax() * half);
        let clean = |v: f64, s: f64| if v.abs() < 1e-12 * s { 0.0 } else { v };
        Deformation {
            strain: d.strain.map(|v| clean(v, scale)),
            curvature: d.curvature.map(|v| clean(v, scale / half.max(f64::MIN_POSITIVE))),
        }
    }

    /// The blocks a (m/N), b (1/N, upper right; the lower left is its transpose) and d
    /// (1/(N·m)) of `[A B; B D]^-1`, round-off below 1e-12 of each block's scale set to zero.
    fn clean_compliance(&self) -> [Matrix3<f64>; 3] {
        let h = self.laminate.thickness().max(f64::MIN_POSITIVE);
        let c = &self.compliance;
        let a = c.fixed_view::<3, 3>(0, 0).into_owned();
        let b = c.fixed_view::<3, 3>(0, 3).into_owned();
        let d = c.fixed_view::<3, 3>(3, 3).into_owned();
        let scale = a.amax().max(f64::MIN_POSITIVE);
        let clean = |m: &Matrix3<f64>, s: f64| m.map(|v| if v.abs() < 1e-12 * s { 0.0 } else { v });
        [clean(&a, scale), clean(&b, scale / h), clean(&d, scale / (h * h))]
    }

    /// A, B, D with round-off below 1e-12 of the block's scale set to zero (B of a symmetric
    /// laminate comes out at about 1e-16 of A·h instead of exactly zero).
    fn clean_abd(&self) -> [Matrix3<f64>; 3] {
        let h = self.laminate.thickness();
        let scale = self.abd.a.amax().max(f64::MIN_POSITIVE);
        let clean = |m: &Matrix3<f64>, s: f64| m.map(|v| if v.abs() < 1e-12 * s { 0.0 } else { v });
        [
            clean(&self.abd.a, scale),
            clean(&self.abd.b, scale * h),
            clean(&self.abd.d, scale * h * h),
        ]
    }
}

/// Total state of one ply face (load part plus residual part at a load multiplier of one).
#[derive(Debug, Clone, Copy)]
struct FaceState {
    total: PointState,
    residual: PointState,
}

fn face_state(load: &PointState, residual: &PointState) -> FaceState {
    let add = |a: Vector3<f64>, b: Vector3<f64>| a + b;
    FaceState {
        total: PointState {
            z: load.z,
            strain_xy: add(load.strain_xy, residual.strain_xy),
            stress_xy: add(load.stress_xy, residual.stress_xy),
            strain_12: add(load.strain_12, residual.strain_12),
            stress_12: add(load.stress_12, residual.stress_12),
        },
        residual: *residual,
    }
}

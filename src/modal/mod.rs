//! Rotating-blade modal analysis: beam finite elements along the pitch axis, the lowest modes by
//! shift-invert Lanczos, mode kinds by energy shares, tracking over a speed sweep by the modal
//! assurance criterion, Campbell data, excitation crossings and frequency margins.
//!
//! # Frames and degrees of freedom
//!
//! Rotor frame: `x` radial along the pitch axis from root to tip, `y` in the plane of rotation,
//! `z` along the rotor axis (flapwise = out of the plane of rotation). The rotor turns about `z`
//! at `Omega`. A section's chord frame is the rotor frame turned about `x` by the chord angle
//! `phi = twist + pitch` (right-handed, from the plane of rotation), so at `phi = 0` the chord
//! lies in the plane of rotation with the trailing edge towards `+y`. The beam's reference line is
//! the pitch axis; its first station is the clamp (its radius may be zero) and radii are
//! measured from the rotor axis. Each node carries `u` (radial), `v` (in-plane), `w`
//! (out-of-plane), `theta` (twist about `+x`), `v'` and `w'`, all in the rotor frame.
//!
//! # Element
//!
//! Hermite cubic bending in both planes, quadratic axial and torsion (an interior node per
//! element), 4-point Gauss quadrature; section properties interpolated linearly in radius
//! between stations (see [`BeamSection`] for beam data given directly). The nodes' `u, v, w` are
//! the displacements of the section's shear centre, about which it twists, so the curvatures
//! are the shear-centre line's and a twist varying along the span bends nothing (at a root on
//! springs the root node's are the pitch axis's, where the bearing holds it; mode shapes are
//! given at the pitch axis). Strain energy uses the full 4x4 section stiffness
//! (`stiffness_pitch_axis`, coupling terms included) referred to the shear centre, with the
//! curvatures of the rotor-frame displacements resolved into the local chord frame, so pretwist
//! turns the stiffness along the span. The kinetic energy is that of rigid sections with the
//! mass centre offset and the section's second moments of mass about the shear centre
//! (consistent mass with rotary inertia). Classical (Euler–Bernoulli, Saint-Venant torsion)
//! theory: no transverse shear, no restrained warping; the shear centre's rate along the span is
//! left out, as the mass and elastic centres' are.
//!
//! # Rotating terms (all proportional to `Omega²`)
//!
//! - Centrifugal stiffening: the tension `N(r) = Omega² ∫_r^tip m rho drho` acts at the elastic
//!   centre as a uniform strain, giving
//!   `½ N [v'² + w'² + 2 theta' (eta_c w' - zeta_c v') + k_A² theta'²]`, where
//!   `k_A² = (S_22 + S_33) / S_00` of the stiffness about the shear centre is the
//!   modulus-weighted polar radius of gyration about it (offsets `eta_c`, `zeta_c` from it too) (the `T k_A²` torsion term of Hodges & Dowell, NASA TN D-7818, 1974,
//!   from memory).
//! - Spin softening: `-½ Omega² ∫ rho (U² + V²) dA`, the centrifugal potential of radial and
//!   in-plane motion (`omega_lag² = omega_flap² - Omega²` for a uniform beam).
//! - Propeller moment: the second-order part of the section's rotation in the centrifugal field
//!   gives, with the spin-softening twist term, `½ Omega² (J_yy - J_zz) theta²` in rotor axes,
//!   `(I_edge - I_flap) cos 2 phi` and product terms in chord axes (the "tennis racket" moment
//!   that turns a blade towards flat pitch; Bielawa, *Rotary Wing Structural Dynamics and
//!   Aeroelasticity*, 2nd ed., 2006, ch. 4, from memory). The same expansion, with the rotation
//!   vector `(theta, -w', v')`, couples twist with the bending slopes through the mass-centre
//!   offset (`½ Omega² r (m eta_m w' - m zeta_m v') theta`).
//!
//! Neglected: Coriolis (gyroscopic) coupling, common practice for Campbell diagrams of blades;
//! the geometric stiffness of the steady bending and twist that offsets produce (the model is
//! linearised about the undeformed blade under its centrifugal tension); aerodynamic stiffness and
//! damping. Point masses and the fluid round a submerged blade are in `attached.rs`.
//!
//! # Eigen solution, kinds and tracks
//!
//! `K(Omega) = K_e + Omega² K_spin`, `M` fixed; shift-invert Lanczos with full
//! reorthogonalisation on the band matrices, a Sturm count for missed modes
//! ([`solve_lowest`]), and a dense reference ([`solve_dense`]). Kinds by kinetic energy shares
//! in the rotor frame (see [`EnergyShares`]), tracks by the mass-weighted MAC ([`mac`]).
//!
//! ```
//! use layloft::project::{ModalSpec, Rotor};
//! use layloft::modal::{BeamModel, BeamSection};
//! use layloft::units::{Angle, RotorSpeed, rpm_to_rad_s};
//!
//! # fn main() -> Result<(), layloft::Error> {
//! // A uniform steel strip, 1 m long, clamped on the rotor axis (invented example).
//! let strip = BeamSection::uniform(0.0, 2.1e8, 600.0, 17.5, 7000.0, 7.85);
//! let sections = [strip.to_section(), strip.at(1.0).to_section()];
//! let rotor = Rotor {
//!     blades: 2,
//!     hub_radius: 0.0,
//!     tip_radius: 1.0,
//!     omega_nominal: rpm_to_rad_s(300.0),
//!     omega_max: rpm_to_rad_s(360.0),
//!     omega_min: rpm_to_rad_s(300.0),
//!     pitch: Angle::ZERO,
//!     pitch_range: (Angle::ZERO, Angle::ZERO),
//!     root_clearance: 0.0,
//!     tip_clearance: 0.0,
//! };
//! let model = BeamModel::new(&sections, &rotor, &ModalSpec::default())?;
//! let still = model.modes(RotorSpeed::ZERO, 3)?;
//! // Clamped–free beam: omega_1 = 1.8751² sqrt(EI / (m L⁴)) (Blevins, Formulas for Natural
//! // Frequency and Mode Shape, 1979, table 8-1).
//! let f1 = 1.875104_f64.powi(2) * (17.5_f64 / 7.85).sqrt() / (2.0 * std::f64::consts::PI);
//! assert!((still.modes[0].frequency_hz / f1 - 1.0).abs() < 1e-5);
//! // Spinning stiffens the flap mode.
//! let spinning = model.modes(RotorSpeed::from_rpm(300.0), 1)?;
//! assert!(spinning.modes[0].frequency_hz > still.modes[0].frequency_hz);
//! # Ok(())
//! # }
//! ```

mod analysis;
mod assemble;
mod attached;
mod band;
mod beam_section;
mod campbell;
mod element;
mod export;
mod modes;
mod solve;
mod span;
mod track;
mod tridiagonal;

pub use analysis::{
    BLADE_PASSING_MULTIPLES, DryComparison, ModalAnalysis, ModalInputs, ModeCoverage, RUNNING,
};
pub use assemble::{BeamModel, Dof, DofKind, MAX_ELEMENTS, SystemMatrices};
pub use attached::{Attachments, FluidSection, PointBody, ellipse_added_mass};
pub use band::BandMatrix;
pub use beam_section::BeamSection;
pub use campbell::{
    Campbell, Crossing, Excitation, FixedBand, MAX_SPEEDS, MarginCheck, ModeMargin,
    SECOND_SHARE_SHOWN, SpeedRange, SweepProgress, Track, excitation_orders, machine_excitations,
};
pub use export::{matrix_market_files, write_matrix_market};
pub use modes::{DOMINANT_SHARE, EnergyShares, Mode, ModeKind, ModeSet, ModeShape};
pub use solve::{EigenError, EigenSolution, LanczosParams, solve_dense, solve_lowest};
pub use track::{MIN_TRACK_MAC, mac};

use crate::units::RotorSpeed;

/// What can go wrong in the modal analysis. Input errors name the station radius, the field or
/// the value; [`ModalError::is_input`] tells them from computation failures.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ModalError {
    /// Fewer than two sections.
    #[error("the modal model needs at least two sections along the span, found {found}")]
    TooFewSections {
        /// Sections given.
        found: usize,
    },
    /// A value that is not a finite number.
    #[error("section at r = {r} m: {field} is not a finite number")]
    NotFinite {
        /// Station radius, m.
        r: f64,
        /// The field.
        field: &'static str,
    },
    /// A root below the rotor axis.
    #[error(
        "the first section lies at r = {r} m: radii are measured from the rotor axis and cannot be negative"
    )]
    NegativeRadius {
        /// Its radius, m.
        r: f64,
    },
    /// Radii not strictly increasing.
    #[error(
        "section {index} at r = {r} m does not lie beyond the previous one at r = {previous} m: sections must run from root to tip with increasing radius"
    )]
    RadiusOrder {
        /// Index of the section.
        index: usize,
        /// Its radius, m.
        r: f64,
        /// Previous radius, m.
        previous: f64,
    },
    /// A diagonal stiffness term that is zero or negative.
    #[error("section at r = {r} m has no stiffness: {term} = {value} (expected a positive value)")]
    ZeroStiffness {
        /// Station radius, m.
        r: f64,
        /// `EA`, `GJ`, `EI_flap` or `EI_edge`.
        term: &'static str,
        /// The value (N or N·m²).
        value: f64,
    },
    /// A stiffness matrix that is not symmetric.
    #[error(
        "section at r = {r} m: the stiffness matrix is not symmetric (entries ({row}, {col}) and ({col}, {row}) differ)"
    )]
    AsymmetricStiffness {
        /// Station radius, m.
        r: f64,
        /// Row.
        row: usize,
        /// Column.
        col: usize,
    },
    /// Coupling terms too large for the diagonal terms.
    #[error(
        "section at r = {r} m: the stiffness matrix is not positive definite (coupling terms too large for EA, GJ and EI)"
    )]
    IndefiniteStiffness {
        /// Station radius, m.
        r: f64,
    },
    /// Mass per length zero or negative.
    #[error("section at r = {r} m has mass per length {value} kg/m (expected a positive value)")]
    ZeroMass {
        /// Station radius, m.
        r: f64,
        /// The value, kg/m.
        value: f64,
    },
    /// A mass moment of inertia that is negative (or a product too large).
    #[error(
        "section at r = {r} m: {field} = {value} kg·m is not a possible mass moment of inertia"
    )]
    NegativeInertia {
        /// Station radius, m.
        r: f64,
        /// The field.
        field: &'static str,
        /// The value, kg·m.
        value: f64,
    },
    /// Element count out of range.
    #[error("modal elements = {elements}: expected 1 to 10000 elements along the span")]
    ElementCount {
        /// Elements asked for.
        elements: usize,
    },
    /// A root spring that is not positive.
    #[error(
        "root spring {field} = {value}: expected a positive stiffness (leave the springs out for a clamped root)"
    )]
    RootSpring {
        /// `axial`, `flap`, `edge` or `torsion`.
        field: &'static str,
        /// The value.
        value: f64,
    },
    /// A point body the model cannot take.
    #[error("point mass at r = {r} m: {reason}")]
    PointBody {
        /// Its radius, m.
        r: f64,
        /// What is wrong.
        reason: &'static str,
    },
    /// A fluid density that is not positive.
    #[error("fluid density {value} kg/m3: expected a positive density")]
    FluidDensity {
        /// The value, kg/m³.
        value: f64,
    },
    /// A rotor speed that is negative or not finite.
    #[error("rotor speed {} rpm: expected a finite speed of 0 rpm or more", .speed.rpm())]
    Speed {
        /// The speed.
        speed: RotorSpeed,
    },
    /// A speed range that is empty, negative or badly stepped.
    #[error("speed range {}:{}:{} rpm: {reason}", .from.rpm(), .to.rpm(), .step.rpm())]
    SpeedRange {
        /// First speed.
        from: RotorSpeed,
        /// Last speed.
        to: RotorSpeed,
        /// Step.
        step: RotorSpeed,
        /// What is wrong.
        reason: &'static str,
    },
    /// A sweep with no speeds.
    #[error("the speed sweep holds no speeds")]
    NoSpeeds,
    /// Sweep speeds not increasing.
    #[error(
        "sweep speed {} rpm follows {} rpm: speeds must increase",
        .speed.rpm(),
        .previous.rpm()
    )]
    SpeedOrder {
        /// The speed.
        speed: RotorSpeed,
        /// The one before.
        previous: RotorSpeed,
    },
    /// More modes than degrees of freedom, or none.
    #[error("{asked} modes asked for: expected 1 to {dofs} (the model's degrees of freedom)")]
    TooManyModes {
        /// Modes asked for.
        asked: usize,
        /// Unconstrained degrees of freedom.
        dofs: usize,
    },
    /// A margin asked at a speed outside the sweep.
    #[error(
        "margin at {} rpm asked for, outside the sweep from {} to {} rpm",
        .speed.rpm(),
        .from.rpm(),
        .to.rpm()
    )]
    MarginSpeed {
        /// The speed.
        speed: RotorSpeed,
        /// First sweep speed.
        from: RotorSpeed,
        /// Last sweep speed.
        to: RotorSpeed,
    },
    /// The eigen solution failed at a speed.
    #[error("modes at {} rpm: {source}", .speed.rpm())]
    Eigen {
        /// The speed.
        speed: RotorSpeed,
        /// Why.
        #[source]
        source: EigenError,
    },
}

impl ModalError {
    /// True for bad input (exit status 2), false for a computation that failed (exit status 3).
    pub fn is_input(&self) -> bool {
        match self {
            ModalError::Eigen { source, .. } => matches!(source, EigenError::TooManyModes { .. }),
            _ => true,
        }
    }
}

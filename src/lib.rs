//! layloft: composite blades for rotating machines.
//!
//! From a blade definition (airfoil stations along the span) and a ply schedule, layloft builds
//! a thin-walled beam model with classical laminate theory and answers the three questions a
//! blade designer must answer before cutting cloth:
//!
//! 1. is the ply schedule strong and stiff enough ([`laminate`], [`failure`], [`section`],
//!    [`loads`], [`stress`]);
//! 2. do the natural frequencies of the spinning blade stay clear of the rotor harmonics
//!    ([`modal`]);
//! 3. what tooling must be made ([`tooling`], on the triangle-mesh kit [`mesh`]).
//!
//! Data flows one way: inputs → geometry → laminates → sections → beam → results → outputs.
//! Every quantity inside the library is SI (m, kg, s, N, Pa, rad); units are converted only
//! where data enter ([`input`]) and leave ([`report`]; files are written only by [`output`]).
//!
//! # Caution
//!
//! Rotating blades store enough energy to kill when they fail. Results are a design aid only:
//! confirm them by static, spin and modal tests, apply the safety factors of the governing code,
//! and have the design reviewed by a qualified engineer. Some fusible core alloys contain lead or
//! cadmium: follow the supplier's safety data and local regulations.
//!
//! # Example: a blade from Rust code
//!
//! The invented mine-fan demo of `layups/`: read and check the project, solve its sections, run
//! every load case, sweep the rotor speeds for the Campbell diagram, and apply the design check.
//!
//! ```
//! use layloft::analysis::BladeModel;
//! use layloft::input::read_project;
//! use layloft::modal::ModalAnalysis;
//! use layloft::stress::analyse_cases;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let model = BladeModel::build(read_project("layups/mine-fan/blade.toml".as_ref())?)?;
//! let root = &model.properties()[0];
//! println!("root: EI flap {:.0} N·m², GJ {:.0} N·m²", root.ei_flap, root.gj);
//!
//! let cases = analyse_cases(&model, None)?;
//! for case in &cases {
//!     let worst = case.critical.as_ref().expect("a ply can fail");
//!     println!("{}: reserve factor {:.2} at r = {:.3} m", case.name, worst.reserve_factor, worst.r);
//! }
//!
//! let p = &model.project;
//! let sections = model.properties();
//! let modes =
//!     ModalAnalysis::run(&sections, &p.rotor, &p.modal, &p.criteria, None, None, &mut |_, _| {})?;
//! let check = layloft::check::evaluate(&model, &cases, Some(&modes));
//! assert!(check.passed());
//! # Ok(())
//! # }
//! ```
//!
//! # Example: one laminate
//!
//! The laminate engine on its own: a quasi-isotropic carbon laminate.
//!
//! ```
//! use layloft::laminate::{Laminate, LayupCode};
//! use layloft::material::Lamina;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! // T300/5208 graphite/epoxy (Kaw, Mechanics of Composite Materials, 2nd ed., Table 2.1).
//! let tape = Lamina::builder("T300/5208")
//!     .elastic(181e9, 10.3e9, 7.17e9, 0.28)
//!     .ply_thickness(0.125e-3)
//!     .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
//!     .build()?;
//! let code: LayupCode = "[0/±45/90]s".parse()?;
//! let laminate = Laminate::from_code(&code, &tape);
//! let constants = laminate.membrane_constants()?;
//! assert!((constants.ex / 1e9 - 69.68).abs() < 0.05);
//! # Ok(())
//! # }
//! ```
#![warn(missing_docs)]

pub mod airfoil;
pub mod analysis;
pub mod blade;
pub mod buckling;
pub mod check;
mod error;
pub mod failure;
pub mod input;
mod interp;
pub mod laminate;
pub mod layout;
pub mod loads;
pub mod material;
pub mod mesh;
pub mod modal;
pub mod output;
mod parallel;
pub mod plybook;
pub mod project;
pub mod report;
pub mod section;
pub mod stress;
pub mod text;
pub mod tooling;
pub mod units;

pub use error::Error;
pub use parallel::set_threads;

/// The cautions every report and the README carry, one sentence per line.
pub const CAUTIONS: &[&str] = &[
    "Design aid only: rotating blades store enough energy to kill when they fail.",
    "Confirm every result by static, spin and modal tests before a blade runs.",
    "Apply the safety factors of the governing code and have the design reviewed by a \
     qualified, licensed engineer; local codes and licensed practice take precedence.",
    "Some fusible core alloys contain lead or cadmium: follow the supplier's safety data and \
     local regulations when casting, melting out and disposing of them.",
];

//! The blade project: the domain model every stage reads, as plain records in SI units.
//!
//! A [`Project`] holds the rotor ([`Rotor`]), the outline along the span ([`Station`],
//! [`AirfoilSpec`]), what the blade is built of ([`PlySpec`], [`Region`], [`WebSpec`],
//! [`PointMass`]), the load cases ([`LoadCaseSpec`]) and the settings of each stage
//! ([`Criteria`], [`ModalSpec`], [`ToolingSpec`], ...). The records are filled and checked by
//! the reader in [`crate::input`] (`read_project`), which is the only place that knows the file
//! formats; the stages downstream read the records and never the files. The records hold no
//! file positions: where each station and ply was written, and the input's warnings, are kept
//! by the reader apart ([`crate::input::Sources`]), for the command line to name the file and
//! line of an error raised here by index or radius.
//!
//! Radii `r` are measured from the rotor axis along the pitch axis. The blade runs from the first
//! station (the structural root, where the beam is clamped) to the last.
//!
//! In the module flow the project comes after the airfoils and materials its records hold and
//! before the reader that fills it: `units, interp, parallel, text → material → laminate →
//! failure → airfoil → project → input → blade → ...`.

mod loads;
mod outline;
mod rotor;
mod schedule;
mod settings;

use crate::material::MaterialLibrary;

pub use loads::{Buoyancy, BuoyantSection, DistributedLoadRow, LoadCaseSpec};
pub use outline::{AirfoilSpec, Station};
pub use rotor::Rotor;
pub use schedule::{PlySpec, PointMass, Region, WebSpec};
pub use settings::{
    BucklingSpec, Criteria, ExcitationSpec, FixedExcitation, FluidSpec, ModalSpec, RootSprings,
    SectionSpec, ToolingSpec,
};

/// A whole blade project.
#[derive(Debug, Clone)]
pub struct Project {
    /// Name of the project.
    pub name: String,
    /// Rotor data.
    pub rotor: Rotor,
    /// Stations, root to tip, strictly increasing in `r`.
    pub stations: Vec<Station>,
    /// Plies, outermost first.
    pub plies: Vec<PlySpec>,
    /// Shear webs, leading edge first.
    pub webs: Vec<WebSpec>,
    /// Point masses fixed to the blade (balance weights, root fittings), in every load case and
    /// in the modal model.
    pub point_masses: Vec<PointMass>,
    /// Load cases.
    pub load_cases: Vec<LoadCaseSpec>,
    /// What the design check demands.
    pub criteria: Criteria,
    /// Tooling settings, when the project has a `[tooling]` table.
    pub tooling: Option<ToolingSpec>,
    /// Modal analysis settings (`[modal]`, optional; defaults otherwise).
    pub modal: ModalSpec,
    /// The fluid the blade runs in, when it is dense enough to count (`[fluid]`; none by
    /// default: air is neglected).
    pub fluid: Option<FluidSpec>,
    /// The machine's own excitations besides the rotor orders (`[excitation]`).
    pub excitation: ExcitationSpec,
    /// Section discretisation settings (`[sections]`, optional; defaults otherwise).
    pub sections: SectionSpec,
    /// Local buckling settings (`[buckling]`, optional; defaults otherwise).
    pub buckling: BucklingSpec,
    /// The materials file.
    pub materials: MaterialLibrary,
}

//! The settings records of a project: the design criteria and the options of each stage
//! (buckling, tooling, modal, fluid, excitation, sections).

use crate::units::{Angle, Temperature};

/// What the design check demands (`[criteria]`); each is checked only when given.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Criteria {
    /// Least reserve factor at the factored load.
    pub min_reserve_factor: Option<f64>,
    /// Least separation of every mode from every harmonic, a fraction of the harmonic
    /// (`frequency_margin_pct` in the input: 5 % is 0.05).
    pub frequency_margin: Option<f64>,
    /// Number of rotor harmonics nP to check (12 unless given).
    pub harmonics: u32,
    /// Greatest blade mass, kg.
    pub max_mass_kg: Option<f64>,
    /// Greatest tip deflection, m.
    pub max_tip_deflection_m: Option<f64>,
    /// Least buckling reserve factor (local buckling of the walls and the sandwich modes); the
    /// check uses `min_reserve_factor` when this is not given.
    pub min_buckling_factor: Option<f64>,
}

/// Local buckling settings (`[buckling]`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BucklingSpec {
    /// Rotational fixity of the long edges of every wall panel: 0 simply supported, 1 clamped,
    /// between the two a linear blend of the two critical loads. 0 unless given.
    pub edge_fixity: f64,
}

impl Default for BucklingSpec {
    fn default() -> Self {
        BucklingSpec { edge_fixity: 0.0 }
    }
}

/// Tooling settings (`[tooling]`).
#[derive(Debug, Clone, PartialEq)]
pub struct ToolingSpec {
    /// Core alloy, a record of the materials file with density and melting range.
    pub core_alloy: Option<String>,
    /// Mould material, an `[isotropic.NAME]` record whose density gives the mould parts' masses.
    pub mould_material: Option<String>,
    /// Resin injection temperature (`injection_temperature_C` in the input).
    pub injection_temperature: Option<Temperature>,
    /// Resin gel temperature (`gel_temperature_C` in the input).
    pub gel_temperature: Option<Temperature>,
    /// Cure temperature (`cure_temperature_C` in the input).
    pub cure_temperature: Option<Temperature>,
    /// Block margin around the cavity, m.
    pub mould_margin: f64,
    /// Unit of the STL files ("mm" or "m").
    pub stl_unit: String,
    /// Chordal tolerance of the surface meshes, m.
    pub tolerance: f64,
    /// Scale factor applied to the mould cavity for thermal expansion (1 = none).
    pub mould_expansion_factor: f64,
    /// Scale factor applied to the cast core for shrinkage (1 = none).
    pub core_shrink_factor: f64,
    /// Least acceptable draft angle of the mould halves.
    pub min_draft: Angle,
    /// Least core thickness normal to the chord, where a core ends at a thin trailing edge, m.
    pub min_core_thickness: f64,
    /// A core print's section as a fraction of the core's end section, linear (0.5, the
    /// default, common practice; 0: no prints).
    pub core_print_fraction: f64,
    /// How far a core print stands out beyond the shell's end, m.
    pub core_print_length: f64,
    /// Linear shrinkage of the core alloy from its solidus to room temperature (a fraction),
    /// for the core casting moulds: the alloy record's `shrinkage_pct`, else its
    /// `cte_ustrain_K` times the fall from `solidus_C` to 20 °C, else 0.2 %.
    pub core_alloy_shrinkage: f64,
}

impl Default for ToolingSpec {
    fn default() -> Self {
        ToolingSpec {
            core_alloy: None,
            mould_material: None,
            injection_temperature: None,
            gel_temperature: None,
            cure_temperature: None,
            mould_margin: 0.03,
            stl_unit: "mm".to_string(),
            tolerance: 0.1e-3,
            mould_expansion_factor: 1.0,
            core_shrink_factor: 1.0,
            min_draft: Angle::from_deg(1.0),
            min_core_thickness: 2.0e-3,
            core_print_fraction: 0.5,
            core_print_length: 0.015,
            core_alloy_shrinkage: 0.002,
        }
    }
}

/// Modal analysis settings (`[modal]`).
#[derive(Debug, Clone, PartialEq)]
pub struct ModalSpec {
    /// Beam elements along the span.
    pub elements: usize,
    /// Modes to find at each speed.
    pub modes: usize,
    /// Speed step of the Campbell sweep, rad/s (`rpm_step` in the input).
    pub omega_step: Option<f64>,
    /// Root spring stiffnesses (flap, edge, torsion, N·m/rad; axial N/m); clamped when absent.
    pub root_springs: Option<RootSprings>,
}

impl Default for ModalSpec {
    fn default() -> Self {
        ModalSpec { elements: 40, modes: 8, omega_step: None, root_springs: None }
    }
}

/// The fluid round a submerged blade (`[fluid]`): its added mass enters the modal model and its
/// buoyancy the gravity load.
#[derive(Debug, Clone, PartialEq)]
pub struct FluidSpec {
    /// Density, kg/m³.
    pub density: f64,
}

/// Excitations of the machine besides the rotor orders and blade passing (`[excitation]`).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct ExcitationSpec {
    /// Counts `V` of stationary vanes, struts or guide vanes the blades pass: orders `k V`.
    pub vanes: Vec<u32>,
    /// Multiples `k = 1 ..= vane_multiples` of each vane count (2 unless given).
    pub vane_multiples: u32,
    /// Further rotor orders to check.
    pub orders: Vec<u32>,
    /// Fixed frequencies or bands, independent of the rotor speed.
    pub fixed: Vec<FixedExcitation>,
}

/// A fixed excitation frequency (a gearbox mesh) or band (a wave period range).
#[derive(Debug, Clone, PartialEq)]
pub struct FixedExcitation {
    /// Name shown on the plot and in the margins.
    pub name: String,
    /// Lowest frequency, Hz.
    pub from_hz: f64,
    /// Highest frequency, Hz (equal to `from_hz` for a single frequency).
    pub to_hz: f64,
}

/// Root spring set for a flexible hub or pitch bearing.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RootSprings {
    /// Axial, N/m.
    pub axial: f64,
    /// Flapwise rotation, N·m/rad.
    pub flap: f64,
    /// Edgewise rotation, N·m/rad.
    pub edge: f64,
    /// Torsion, N·m/rad.
    pub torsion: f64,
}

/// Section discretisation (`[sections]`).
#[derive(Debug, Clone, PartialEq)]
pub struct SectionSpec {
    /// Points on the outer contour of each section.
    pub contour_points: usize,
    /// Analysis stations along the span (the project's own stations when empty).
    pub analysis_stations: usize,
    /// Whether the walls bend and twist with the beam (`wall_bending`, true by default:
    /// [`WallCurvature::Beam`](crate::section::WallCurvature)); false holds the wall curvatures
    /// at zero (the membrane theory, [`WallCurvature::Held`](crate::section::WallCurvature)).
    pub wall_bending: bool,
}

impl Default for SectionSpec {
    fn default() -> Self {
        SectionSpec { contour_points: 240, analysis_stations: 0, wall_bending: true }
    }
}

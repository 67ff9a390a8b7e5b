//! The blade project as read from `blade.toml` and the files it names, converted to SI. These
//! are plain records: the reader that fills them and checks every value lives in
//! `input/project_reader.rs` (and the files beside it); the stages downstream read them.
//!
//! Radii `r` are measured from the rotor axis along the pitch axis. The blade runs from the first
//! station (the structural root, where the beam is clamped) to the last.

use std::path::PathBuf;

use crate::material::MaterialLibrary;
use crate::units::Angle;

/// A whole blade project.
#[derive(Debug, Clone)]
pub struct Project {
    /// Name of the project.
    pub name: String,
    /// Folder of `blade.toml`; the files it names are relative to it.
    pub dir: PathBuf,
    /// Display name of `blade.toml` for messages.
    pub file: String,
    /// Display names of the files the project names, for messages.
    pub files: ProjectFiles,
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
    /// Values that are legal but unusual, each naming its file and key or line: printed with
    /// the other warnings and repeated with the design check's verdict.
    pub input_warnings: Vec<String>,
}

/// Display names (paths as joined to the project folder) of a project's files.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct ProjectFiles {
    /// The stations file.
    pub stations: String,
    /// The plies file.
    pub plies: String,
    /// The materials file.
    pub materials: String,
}

/// The rotor the blade belongs to (`[rotor]`).
#[derive(Debug, Clone, PartialEq)]
pub struct Rotor {
    /// Number of blades `B`.
    pub blades: u32,
    /// Rotor axis to the root end, along the pitch axis, m.
    pub hub_radius: f64,
    /// Rotor axis to the blade tip, m.
    pub tip_radius: f64,
    /// Nominal speed, rpm.
    pub rpm_nominal: f64,
    /// Maximum (overspeed) speed, rpm; the Campbell sweep covers 0..rpm_max.
    pub rpm_max: f64,
    /// Pitch setting added to the station twist.
    pub pitch: Angle,
    /// Pitch range (least, greatest) for variable pitch.
    pub pitch_range: (Angle, Angle),
    /// Gap to the spherical hub band, m.
    pub root_clearance: f64,
    /// Gap to the spherical duct band, m.
    pub tip_clearance: f64,
}

/// How a station's airfoil is given.
#[derive(Debug, Clone, PartialEq)]
pub enum AirfoilSpec {
    /// A NACA 4-digit code such as `0012` or `4415`; `closed_te` closes the trailing edge
    /// (the coefficient -0.1036 instead of -0.1015).
    Naca4 {
        /// The four digits.
        code: String,
        /// Closed trailing edge.
        closed_te: bool,
    },
    /// A coordinate file, relative to the project folder.
    File(PathBuf),
    /// A built-in shape: `circle` or `ellipse:T`.
    Shape(crate::airfoil::Shape),
}

/// One row of `stations.csv`.
#[derive(Debug, Clone, PartialEq)]
pub struct Station {
    /// Radius, m.
    pub r: f64,
    /// Chord, m.
    pub chord: f64,
    /// Twist (chord angle to the plane of rotation before the pitch setting).
    pub twist: Angle,
    /// Pitch axis position as a fraction of chord from the leading edge.
    pub pitch_axis_frac: f64,
    /// The airfoil.
    pub airfoil: AirfoilSpec,
    /// Line in `stations.csv`, for messages.
    pub line: usize,
}

/// Where on the section a ply lies.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Region {
    /// Upper surface, between `from` and `to` (chord fractions from the leading edge).
    Upper,
    /// Lower surface, between `from` and `to`.
    Lower,
    /// Both surfaces, between `from` and `to`.
    Both,
    /// The whole depth of the named web.
    Web(String),
}

/// One row of `plies.csv`.
#[derive(Debug, Clone, PartialEq)]
pub struct PlySpec {
    /// The ply's label from the `ply` column.
    pub id: String,
    /// Material name (a record of the materials file).
    pub material: String,
    /// Fibre angle from the blade axis in the wall frame (see docs/conventions.md).
    pub angle: Angle,
    /// Span range covered, m (radius).
    pub r_start: f64,
    /// End of the span range covered, m (radius).
    pub r_end: f64,
    /// Surface or web.
    pub region: Region,
    /// Chord fraction from the leading edge where the ply starts (surface plies).
    pub from: f64,
    /// Chord fraction from the leading edge where the ply ends (surface plies).
    pub to: f64,
    /// Line in `plies.csv`, for messages.
    pub line: usize,
}

/// A shear web (`[[web]]`), normal to the chord.
#[derive(Debug, Clone, PartialEq)]
pub struct WebSpec {
    /// Name, referred to by `web:NAME` plies.
    pub name: String,
    /// Chord fraction from the leading edge.
    pub chord_frac: f64,
    /// Span range of the web, m; the whole blade when not given.
    pub r_start: f64,
    /// End of the span range of the web, m.
    pub r_end: f64,
}

/// One row of a distributed load file: loads per unit span at a radius.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DistributedLoadRow {
    /// Radius, m.
    pub r: f64,
    /// Flapwise (out of the plane of rotation) force per length, N/m.
    pub f_flap: f64,
    /// Edgewise (in the plane of rotation) force per length, N/m.
    pub f_edge: f64,
    /// Pitching moment per length about the pitch axis, N·m/m.
    pub m_pitch: f64,
}

/// A point mass fixed to the blade (balance weight, root fitting).
#[derive(Debug, Clone, PartialEq)]
pub struct PointMass {
    /// Label.
    pub name: String,
    /// Radius, m.
    pub r: f64,
    /// Mass, kg.
    pub mass: f64,
    /// Chordwise offset from the pitch axis (chord frame y), m.
    pub y: f64,
    /// Offset normal to the chord (chord frame z), m.
    pub z: f64,
    /// Mass moments of inertia about the mass's own centre, kg·m², about axes parallel to the
    /// chord frame: `[x` (the pitch axis), `y` (the chord), `z` (normal to the chord)`]`. Zero
    /// for a point mass without rotary inertia.
    pub inertia: [f64; 3],
}

/// A load case (`[[load_case]]`).
#[derive(Debug, Clone, PartialEq)]
pub struct LoadCaseSpec {
    /// Name, unique in the project.
    pub name: String,
    /// Rotor speed, rpm.
    pub rpm: f64,
    /// Pitch setting for this case (the rotor's pitch when not given).
    pub pitch: Option<Angle>,
    /// Distributed external loads, when the case names a file.
    pub distributed: Vec<DistributedLoadRow>,
    /// The file the distributed loads came from, for messages.
    pub distributed_file: Option<String>,
    /// Gravity vector in the rotor frame, m/s² (see docs/conventions.md: x radial along the pitch
    /// axis, y in the plane of rotation, z along the rotor axis downstream), when gravity is
    /// included.
    pub gravity: Option<[f64; 3]>,
    /// Factor on all loads of the case (1 unless given).
    pub load_factor: f64,
    /// Uniform temperature change from the stress-free state, K (0 unless given).
    pub delta_t: f64,
    /// Buoyancy of the blade in a `[fluid]`, taken off the gravity load. Not read from
    /// `blade.toml`: filled from the lofted outer mould line (`None` in air, or when not filled).
    pub buoyancy: Option<Buoyancy>,
}

/// The fluid displaced by the blade, for the buoyancy on a load case with gravity.
#[derive(Debug, Clone, PartialEq)]
pub struct Buoyancy {
    /// Fluid density, kg/m³.
    pub density: f64,
    /// Displaced area along the span, root to tip.
    pub sections: Vec<BuoyantSection>,
}

/// The area inside the outer mould line at one radius.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BuoyantSection {
    /// Radius, m.
    pub r: f64,
    /// Area inside the outer mould line, m².
    pub area: f64,
    /// Its centroid, chord frame `(y, z)` from the pitch axis, m.
    pub centroid: [f64; 2],
}

impl BuoyantSection {
    /// The area and centroid of a closed outline (chord frame points, m) by the shoelace
    /// formula; `None` for a degenerate outline.
    pub fn of_outline(r: f64, outline: &[[f64; 2]]) -> Option<Self> {
        let n = outline.len();
        let (mut a2, mut cy, mut cz) = (0.0, 0.0, 0.0);
        for i in 0..n {
            let (p, q) = (outline[i], outline[(i + 1) % n]);
            let cross = p[0] * q[1] - q[0] * p[1];
            a2 += cross;
            cy += (p[0] + q[0]) * cross;
            cz += (p[1] + q[1]) * cross;
        }
        if !(a2.is_finite() && a2.abs() > 0.0) {
            return None;
        }
        Some(BuoyantSection {
            r,
            area: 0.5 * a2.abs(),
            centroid: [cy / (3.0 * a2), cz / (3.0 * a2)],
        })
    }
}

/// What the design check demands (`[criteria]`); each is checked only when given.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Criteria {
    /// Least reserve factor at the factored load.
    pub min_reserve_factor: Option<f64>,
    /// Least separation of every mode from every harmonic, percent of the harmonic.
    pub frequency_margin_pct: Option<f64>,
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
    /// Resin injection temperature, °C.
    pub injection_temperature_c: Option<f64>,
    /// Resin gel temperature, °C.
    pub gel_temperature_c: Option<f64>,
    /// Cure temperature, °C.
    pub cure_temperature_c: Option<f64>,
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
    /// A core print's section as a fraction of the core's end section (0: no prints).
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
            injection_temperature_c: None,
            gel_temperature_c: None,
            cure_temperature_c: None,
            mould_margin: 0.03,
            stl_unit: "mm".to_string(),
            tolerance: 0.1e-3,
            mould_expansion_factor: 1.0,
            core_shrink_factor: 1.0,
            min_draft: Angle::from_deg(1.0),
            min_core_thickness: 2.0e-3,
            core_print_fraction: 0.0,
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
    /// Speed step of the Campbell sweep, rpm.
    pub rpm_step: Option<f64>,
    /// Root spring stiffnesses (flap, edge, torsion, N·m/rad; axial N/m); clamped when absent.
    pub root_springs: Option<RootSprings>,
}

impl Default for ModalSpec {
    fn default() -> Self {
        ModalSpec { elements: 40, modes: 8, rpm_step: None, root_springs: None }
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

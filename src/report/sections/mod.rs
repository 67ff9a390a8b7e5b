//! The sections report: the stiffness, centres and mass properties of the blade's sections at
//! every analysis station (or at radii asked for), with the blade's mass and the places where
//! the thin-wall idealisation is strained, as one JSON object ([`SectionsReport::to_json`]), one
//! CSV row per station ([`SectionsReport::write_csv`]) or a terminal summary
//! ([`SectionsReport::to_text`]).
//!
//! Method: the thin-walled section solver of [`crate::section`] (closed-section membrane theory
//! after Berdichevsky, Armanios & Badir 1992, several cells with one twist rate) on the wall
//! layouts of [`crate::blade`]; the blade mass is [`BladeModel::mass`].
//!
//! Conventions: the chord frame of docs/conventions.md (`y` along the chord from the leading edge towards
//! the trailing edge, `z` towards the upper surface, origin on the pitch axis, metres). The 4x4
//! stiffness relates the generalised strains `(eps, kappa_t, kappa_f, kappa_e)` to the resultants
//! `(N, T, M_f, M_e)` about the elastic centre ([`crate::section::SectionProperties`]); its entry
//! `[0][0]` is in N, the rest of row and column 0 in N·m, the others in N·m². Keys and columns
//! carry their SI unit (`EA_N`, `EI_flap_Nm2`, `mass_kg_m`); mass moments of inertia per length
//! are in kg·m²/m, written `kg_m`. In the terminal summary centres are chord fractions from the
//! leading edge (`y/c`).
//!
//! ```
//! use layloft::analysis::BladeModel;
//! use layloft::input::read_project;
//! use layloft::report::SectionsReport;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! # let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR"));
//! let model = BladeModel::build(read_project(&dir.join("layups/mine-fan/blade.toml"))?)?;
//! let report = SectionsReport::new(&model);
//! let json = report.to_json();
//! let stations = json["stations"].as_array().map_or(0, Vec::len);
//! assert_eq!(stations, model.stations.len());
//! assert!(json["stations"][0]["EI_flap_Nm2"].as_f64().is_some_and(|ei| ei > 0.0));
//! assert!(report.to_text().contains("EI flap"));
//! # Ok(())
//! # }
//! ```

mod drawing;
mod json;
mod rows;
mod text;

pub use drawing::{section_svg, section_svg_names, section_svg_screen};

use nalgebra::Matrix4;

use crate::analysis::{AnalysisStation, BladeMass, BladeModel, GroupedWarning};
use crate::blade::Blade;
use crate::section::SectionProperties;

/// Everything the `sections` command reports about a blade model.
#[derive(Debug, Clone)]
pub struct SectionsReport<'a> {
    /// The model: project, blade and the stations reported.
    pub model: &'a BladeModel,
    /// Mass of the whole blade ([`BladeModel::mass`]).
    pub mass: BladeMass,
    /// Warnings of the blade and its stations, alike ones grouped.
    pub warnings: Vec<GroupedWarning>,
}

impl<'a> SectionsReport<'a> {
    /// The report of the model's stations.
    pub fn new(model: &'a BladeModel) -> Self {
        SectionsReport { model, mass: model.mass(), warnings: model.warnings() }
    }

    /// The report as one JSON object; see the module documentation for the keys.
    pub fn to_json(&self) -> serde_json::Value {
        json::report(self)
    }

    /// The report as a terminal summary.
    pub fn to_text(&self) -> String {
        text::report(self)
    }

    /// Writes one CSV row per station (the scalar keys of the JSON stations, SI units in every
    /// column name) to `w`.
    pub fn write_csv(&self, w: &mut dyn std::io::Write) -> std::io::Result<()> {
        rows::write(self, w)
    }
}

/// The name of laminate `index` of a station: its plies' ids from the outer face inward,
/// joined by '/', and its thickness, as "skin-out/skin-biax/cap-1/skin-in, 1.35 mm".
pub fn laminate_label(blade: &Blade, station: &AnalysisStation, index: usize) -> String {
    let ids: Vec<&str> = station
        .schedule_plies(index)
        .into_iter()
        .filter_map(|i| blade.ply(i))
        .map(|s| s.id.as_str())
        .collect();
    let t = station.layout.laminates.get(index).map_or(0.0, |l| l.thickness());
    let name = if ids.is_empty() { format!("laminate {}", index + 1) } else { ids.join("/") };
    format!("{name}, {} mm", super::sig4(t * 1e3))
}

/// A 4x4 section stiffness made exactly symmetric (it is in theory; the shift to the elastic
/// centre leaves round-off of about 1e-15 between the two triangles) with entries below 1e-12 of
/// `sqrt(K_ii K_jj)` set to zero: round-off where the layup makes a coupling vanish (a balanced
/// fabric at ±45° gives about 1e-16 of that scale instead of zero). The scale makes N, N·m and
/// N·m² entries compare alike.
pub(crate) fn clean_stiffness(k: &Matrix4<f64>) -> Matrix4<f64> {
    let k = (k + k.transpose()) * 0.5;
    let d: Vec<f64> = (0..4).map(|i| k[(i, i)].abs().sqrt()).collect();
    Matrix4::from_fn(|i, j| if k[(i, j)].abs() < 1e-12 * d[i] * d[j] { 0.0 } else { k[(i, j)] })
}

/// Keys (with units) of the scalar results of one station, in the order of the CSV columns and
/// of [`scalar_values`].
pub(crate) const SCALAR_KEYS: [&str; 29] = [
    "r_m",
    "chord_m",
    "twist_deg",
    "pitch_axis_frac",
    "EA_N",
    "EI_flap_Nm2",
    "EI_edge_Nm2",
    "EI_cross_Nm2",
    "GJ_Nm2",
    "extension_twist_Nm",
    "flap_twist_Nm2",
    "edge_twist_Nm2",
    "EI_principal_max_Nm2",
    "EI_principal_min_Nm2",
    "principal_angle_deg",
    "elastic_centre_y_m",
    "elastic_centre_z_m",
    "shear_centre_y_m",
    "shear_centre_z_m",
    "mass_centre_y_m",
    "mass_centre_z_m",
    "mass_kg_m",
    "inertia_flap_kg_m",
    "inertia_edge_kg_m",
    "inertia_polar_kg_m",
    "inertia_product_kg_m",
    "wall_thickness_min_m",
    "wall_thickness_max_m",
    "enclosed_area_m2",
];

/// The scalar results of one station in SI, in the order of [`SCALAR_KEYS`]. `pitch_axis_frac`
/// is a fraction of chord from the leading edge.
/// Stiffness entries come from [`clean_stiffness`].
pub(crate) fn scalar_values(p: &SectionProperties, pitch_axis_frac: f64) -> [f64; 29] {
    let k = clean_stiffness(&p.stiffness);
    [
        p.r,
        p.chord,
        p.twist.deg(),
        pitch_axis_frac,
        k[(0, 0)],
        k[(2, 2)],
        k[(3, 3)],
        k[(2, 3)],
        k[(1, 1)],
        k[(0, 1)],
        k[(1, 2)],
        k[(1, 3)],
        p.ei_principal[0],
        p.ei_principal[1],
        p.principal_angle.deg(),
        p.elastic_centre[0],
        p.elastic_centre[1],
        p.shear_centre[0],
        p.shear_centre[1],
        p.mass_centre[0],
        p.mass_centre[1],
        p.mass_per_length,
        p.inertia.flap,
        p.inertia.edge,
        p.inertia.polar,
        p.inertia.product,
        p.wall_thickness[0],
        p.wall_thickness[1],
        p.enclosed_area,
    ]
}

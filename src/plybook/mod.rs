//! The ply book: every ply of the schedule as a flat pattern for the cutting table, the fabric's
//! drape over the mould checked, the patterns nested on each material's roll, and the kit.
//!
//! **Draping** is kinematic: the cloth is a pin-jointed net of inextensible threads that may
//! shear freely at their crossings (Mack & Taylor, "The fitting of woven cloth to surfaces",
//! J. Textile Inst. 47 (1956) T477–T488). From a seed point two generator threads run along
//! the warp and the weft, each without turning in the surface (discrete geodesics: every link
//! lies in the plane of the surface normal and the incoming link), and every further node is
//! placed one link `d` from its two known neighbours, on the far side from their common
//! neighbour. Links are measured along the surface: the chord is corrected to the circular-arc
//! length by the normal curvature estimated from the normals at its ends, so a developable
//! surface drapes to its exact development. The shear angle at a node is 90° less the angle
//! between the threads; the flat pattern is the region carried through the net to the unsheared
//! cloth, where node `(i, j)` sits at `(i d, j d)` (see `flatten.rs`). The default seed is the
//! region's centroid and the start direction the ply's fibre direction: the blade axis projected
//! onto the surface and turned by the ply angle about the outward normal (the wall laminate
//! frame of the section solver).
//!
//! **Regions.** A surface ply (`upper`, `lower`, `both`) gives one pattern per skin (a `both`
//! ply is cut in two at the leading and trailing edges, where the mould halves part), bounded
//! by its span and chord-fraction limits and lying on its own level: the outer mould line moved
//! inward by the plies laid before it, their edges ramped 1:20 as the blade's inner surface ramps
//! them. A web ply lies on the web's plane between the inner skins.
//!
//! **Checks.** A woven or stitched fabric (a balanced lamina, `E2 ≥ 0.8 E1`) is flagged where
//! its shear passes the material's `locking_angle_deg` (default 40°, common practice); a
//! unidirectional ply reports its fibre-path deviation, the angle between the draped warp and
//! the intended fibre direction. Isotropic sheets (foam, metal) are flattened without a check.
//!
//! ```no_run
//! use layloft::input::read_project;
//! use layloft::blade::Blade;
//! use layloft::plybook::{PlyBookParams, build_ply_book};
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let project = read_project("layups/small-wind/blade.toml".as_ref())?;
//! let blade = Blade::from_project(&project)?;
//! let book = build_ply_book(&blade, &project, &PlyBookParams::default())?;
//! assert!(book.patterns.iter().all(|p| p.area_m2 > 0.0));
//! # Ok(())
//! # }
//! ```

// Negated comparisons are meant: they refuse NaN. DXF records are built field by field.
#![allow(
    clippy::neg_cmp_op_on_partial_ord,
    clippy::field_reassign_with_default,
    clippy::write_with_newline
)]

mod book;
mod drape;
mod flatten;
mod nest;
mod output;
mod pattern;
mod regions;
mod vec3;

pub use book::{
    FabricKind, MaterialNesting, PatternEntry, PatternPlace, PlyBook, PlyBookParams, PlyRegion,
    build_ply_book, ply_regions,
};
pub use drape::{DrapeSpec, DrapeSurface, DrapedNet, NetNode, Prune, drape};
pub use nest::{NestItem, Nesting, Placement, TooWide, nest};
pub use output::{
    nesting_svg, pattern_dxf, pattern_svg, plybook_csv, plybook_files, plybook_json, write_files,
};
pub use pattern::{DrapeFailure, FlatPattern, RegionSpec, drape_region};
pub use vec3::{point_in_polygon, polygon_area};

/// What can go wrong when making the ply book.
#[derive(Debug, Clone, thiserror::Error)]
pub enum PlyBookError {
    /// A ply region with no area.
    #[error("{file} line {line}, ply '{ply}': the region has no area ({key}: {found})")]
    ZeroArea {
        /// The plies file.
        file: String,
        /// Line of the ply.
        line: usize,
        /// The ply's id.
        ply: String,
        /// The keys at fault.
        key: String,
        /// What was found.
        found: String,
    },
    /// A pattern wider than its roll in every rotation allowed.
    #[error(
        "ply '{ply}' ({pattern}): the pattern is {least_mm:.0} mm wide at its narrowest allowed turn, wider than the roll of '{material}' (roll_width_mm = {roll_mm:.0} in {file}); give a wider roll or split the ply"
    )]
    RollTooNarrow {
        /// The ply's id.
        ply: String,
        /// The pattern.
        pattern: String,
        /// The material.
        material: String,
        /// The materials file.
        file: String,
        /// The pattern's least width, mm.
        least_mm: f64,
        /// The roll width, mm.
        roll_mm: f64,
    },
    /// A region the net could not cover.
    #[error(
        "{file} line {line}, ply '{ply}' ({pattern}): the cloth cannot be draped over the region: {what}"
    )]
    Drape {
        /// The plies file.
        file: String,
        /// Line of the ply.
        line: usize,
        /// The ply's id.
        ply: String,
        /// The pattern.
        pattern: String,
        /// What failed, with the place.
        what: String,
    },
}

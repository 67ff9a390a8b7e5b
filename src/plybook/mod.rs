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

//! The stages, a file or folder each: `regions` (the ply regions and the surfaces they lie
//! on), `drape` (the net), `flatten` (net to flat cloth), `pattern` (one region draped and
//! flattened), `pieces` and `splice` (a region that will not drape whole, cut in pieces), `kit`
//! (the book built, checked and nested), `nest` (the patterns on the roll), `output` (the files
//! as bytes: the ply book writes nothing itself). `book` holds the book's types, `error` its
//! error, `warning` its warnings as values (worded by the report).

// Negated comparisons are meant: they refuse NaN. DXF records are built field by field.
#![allow(
    clippy::neg_cmp_op_on_partial_ord,
    clippy::field_reassign_with_default,
    clippy::write_with_newline
)]

mod book;
mod drape;
mod error;
mod flatten;
mod kit;
mod nest;
mod output;
mod pattern;
mod pieces;
mod regions;
mod splice;
mod vec3;
mod warning;

pub use book::{FabricKind, MaterialNesting, PatternEntry, PatternPlace, PlyBook, PlyBookParams};
pub use drape::{DrapeSpec, DrapeSurface, DrapedNet, NetNode, Prune, drape};
pub use error::PlyBookError;
pub use kit::build_ply_book;
pub use nest::{NestItem, Nesting, Placement, TooWide, nest};
pub use output::{nesting_svg, pattern_dxf, pattern_svg, plybook_csv, plybook_files, plybook_json};
pub use pattern::{DrapeFailure, FlatPattern, RegionSpec, drape_region};
pub use regions::{PlyRegion, ply_regions};
pub use vec3::{point_in_polygon, polygon_area};
pub use warning::{PlyBookIssue, PlyBookWarning};

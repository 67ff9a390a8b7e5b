//! Tooling geometry: closed, outward-facing triangle meshes of the parts a blade is made with
//! (cores, the laminate shell, mould halves), their checks, and STL output.
//!
//! The kernel lofts a span-wise family of closed contours ([`SpanSurface`]: an upper and a lower
//! chain in the chord frame, turned by the chord angle about the pitch axis) into a tube whose
//! spacing follows a chordal tolerance in both directions, trims each end by a sphere about the
//! rotor centre (or a plane) with every end vertex exactly on it, and closes the ends with caps
//! lifted onto the trim surfaces ([`loft_solid`], [`loft_annulus`], [`loft_hollow`]). Webs cut a
//! family into cells ([`split_cells`]). The parts are meshes of the general kit
//! ([`crate::mesh`]), which checks them ([`crate::mesh::check_solid`]) and encodes them as STL;
//! tooling never writes a file (the output edge, `crate::output`, does).
//!
//! A blade's tooling ([`build_tooling`]): the outer mould line lofted from the blade's own
//! interpolation, the inner surface offset by the laminate, one core per cell between the webs
//! (closed where the inner surfaces come within the least core thickness at the edges), the
//! laminate shell, and a mould of two halves parted along the blade's silhouette across the pull
//! ([`SilhouetteSurface`], the pull chosen so that no cavity facet undercuts) with end pieces
//! where a spherical end needs them ([`build_mould_parts`]: ruled parting surface, locating pins
//! of our own, draft and undercut regions per part); [`summarise`] gives the masses and the core alloy's melting check.
//!
//! Frames: the rotor frame has its origin on the rotor axis where the pitch axis meets it, x along
//! the pitch axis from root to tip; the section plane at radius x is (y, z). Pitching turns the
//! blade about x through the origin, so `|p|` is unchanged and a spherical end keeps its clearance
//! to the hub or the duct at every pitch angle (common practice). Lengths are metres inside and
//! scaled to the output unit only when written.
//!
//! ```
//! use layloft::mesh::{CheckParams, check_solid};
//! use layloft::tooling::{ChainEnds, EndKind, FnSurface, LoftParams, Trims, loft_solid};
//! use layloft::units::Angle;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! // An invented lens-shaped section, 60 mm chord, twisted 10 degrees over the span.
//! let lens = |sign: f64| move |_x: f64, u: f64| [0.06 * u - 0.02, sign * 0.024 * u * (1.0 - u)];
//! let surface = FnSurface {
//!     span: [0.15, 0.6],
//!     upper: lens(1.0),
//!     lower: lens(-1.0),
//!     chord_angle: |x: f64| Angle::from_deg(20.0 * x),
//!     ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
//! };
//! let solid = loft_solid(&surface, &Trims::spheres(0.2, 0.55), &LoftParams::default())?;
//! let summary = check_solid(&solid.mesh, "core", &CheckParams::default())?;
//! assert!(summary.volume > 0.0 && summary.shells == 1);
//! # Ok(())
//! # }
//! ```

mod blade_parts;
mod blade_surface;
mod cap;
mod casting;
mod cells;
mod collapse;
mod draft;
mod grid;
mod loft;
mod machining;
mod manifest;
mod melt_note;
mod mould;
mod parting;
mod prints;
mod prism;
mod summary;
mod surface;
mod trim;

pub use blade_parts::{
    BladeTooling, CastingNote, DroppedPrint, EndShape, EndSpheres, MachinedPart, MouldModules,
    Part, PartKind, ToolingParams, build_tooling, trailing_edge_kind,
};
pub use blade_surface::CoreEnd;
pub use casting::{CastPart, CastingMould, CastingParams, Channel};
pub use cells::{Cell, WebPosition, split_cells};
pub use draft::{DraftReport, evaluate_draft};
pub use grid::LoftParams;
pub use loft::{FacetRanges, LoftedSolid, PartingLines, loft_annulus, loft_hollow, loft_solid};
pub use machining::{MachiningFrame, to_machining_frame};
pub use manifest::{MANIFEST_FILE, Manifest, ManifestEntry, StaleFiles};
pub use mould::{
    ModularMould, ModuleKey, MouldHalf, MouldParams, MouldParts, Undercut, build_modular_mould,
    build_mould_parts, build_moulds, loft_modules,
};
pub use parting::{SilhouetteSurface, SpanModule, span_modules};
pub use prints::CorePrint;
pub use prism::loft_polygons;
pub use summary::{
    DrainStand, MeltCheck, MeltFinding, MeltNote, PartMass, ProcessStage, ScheduleContent,
    ToolingSummary, drain_plan, melt_check, schedule_content, summarise,
};
pub use surface::{ChainEnds, EndKind, FnSurface, SpanSurface, contour_polygon};
pub use trim::{EndTrim, Trims};

pub(crate) use manifest::plain_file_name;

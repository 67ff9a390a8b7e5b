//! Two-part moulds: the halves of a block round a lofted part, split on a parting surface through
//! the part's front and back lines, with locating features of our own design, and the draft of
//! each half's cavity along its pull.
//!
//! **Parting.** The loop of [`PartingLines`] (front line root → tip, across the tip cap along the
//! middle of its columns, back line tip → root, across the root cap) separates the part's facets
//! into the upper side (reached from the upper chain without crossing the loop) and the lower.
//! The parting surface continues outward from the loop to the block's sides: along each
//! section's own chord line from the front and back lines, along ±X from the caps, with planar
//! patches in the block's corners (see [`block`]); it twists with the part, so it
//! never folds back over it.
//!
//! **Blocks.** A box in the mould frame (X along the pitch axis, Z along the upper half's pull,
//! Y = Z × X), the margin beyond the part and the parting surface on every side; the parting
//! surface divides it into the two halves.
//!
//! **Locating features (ours).** Conical pins of 10° half-angle, axis along the pull, flat
//! topped, stand on the lower half's parting surface in three of its four corner patches (root
//! and leading edge, root and trailing edge, tip and trailing edge), each half the margin from the
//! part's corner along X and Y, so the halves register only one way round; the upper half has
//! matching sockets, the pin grown by 0.1 mm radially and on top. With the margin `m`: base
//! radius `m/6` where the axis meets the patch, height `m/3`. An end piece carries a wedge key
//! into each half on its bore wall, seated in a socket of the half (see [`keys`]).
//!
//! **Draft.** Per half, [`evaluate_draft`] over its cavity facets along its pull (the upper half
//! along +Z, the lower along −Z); undercut facets are grouped into connected regions, each
//! reported with its area, its worst draft and where it is.
//!
//! **End pieces** ([`build_mould_parts`]). The search for the fewest parts starts from the two
//! halves and adds a piece only where a half cannot leave the part: an end cap that has a facet
//! turned away from either half's pull (a concave spherical root end always has; a square end,
//! parallel to the pull, has not; a convex tip end has when the twist turns it). Such a cap goes
//! to an end piece pulled along the span (−X at the root, +X at the tip): a plug bounded by the
//! cap, the end ring carried along X to the block's end face, and that face. A point of the plug
//! moved along −X (root) stays inside the trim sphere, and the part lies outside it, so the plug
//! leaves the cap freely (for the tip likewise outward); its cap draws at `asin(x/|p|)`. The
//! halves keep the rest: their share of the ring replaces the cap's middle line as a side of the
//! parting loop, the rulings there become the bore wall along X, and the block's end face is
//! triangulated round the bore. The end pieces come off first, then the halves. The plug's
//! outline is the blade's end section, which seats it one way round when the section is
//! cambered. Facets that still undercut on the halves' side surfaces are reported; a part parted
//! at its silhouette along the pull (see [`super::SilhouetteSurface`]) leaves none where its
//! sections are graphs across the pull, which is how [`super::build_tooling`] lofts a blade.
//!
//! **Seats** (`seats`). Where core prints leave an end, the end piece there (made even where the
//! end would not need one) is pocketed for each print: the part's end cap is replaced by the cap
//! holed by the seats, each hole carried to its floor, and the end piece is built round that.
//!
//! **Span-wise modules** ([`build_modular_mould`]). Where no single pull draws every section
//! (a strongly cambered section turned through more twist than its window of drawing pulls,
//! see [`super::span_modules`]), the mould is made of modules along the span, each a mould of
//! two halves with its own pull and its own silhouette parting, all in one block (the frame of
//! the mean pull, one extent across the span); neighbouring modules meet flush on a plane
//! `x = const`, which every pull normal to the pitch axis slides along. Only the outer modules
//! have end pieces and corner patches for pins; the pins lean along their module's pull. Across
//! each flush face the root-side module's halves carry a wedge key running out through the
//! block's top (bottom) edge and the tip-side module's halves its socket, placed off the middle
//! so the module fits one way only (see [`flush`]).
//!
//! [`PartingLines`]: super::PartingLines

use super::draft::{DraftReport, evaluate_draft};
use super::grid::LoftParams;
use super::loft::loft_solid;
use super::loft::{FacetRanges, LoftedSolid};
mod block;
mod flush;
use super::parting::{SilhouetteSurface, SpanModule};
use super::surface::SpanSurface;
use super::trim::{EndTrim, Trims};
use crate::mesh::LengthUnit;
use crate::mesh::Mesh;
use crate::mesh::orient::{compact, neighbours, orient_outward};
use crate::mesh::vec3::{self, P3};
use crate::mesh::{MeshError, Place};
use crate::units::Angle;
use block::{Frame, Layout, Locator, build_half};

mod halves;
mod keys;
mod layout;
mod modules;
mod seats;
mod split;
pub use flush::ModuleKey;
use flush::flush_key;
use halves::{Block, build_mould_set};
use keys::{KEY_WINDOWS, WallKey, wall_key};
use layout::layout;
pub use modules::{ModularMould, build_modular_mould, loft_modules};
pub(crate) use seats::{
    Seat, SeatedEnd, build_seated_mould_parts, reseat, seat_mould_parts, seated_solid,
};
use split::{parting_loop, split_faces, undercut_regions};

/// `n · d` below this is an undercut (as the draft evaluator counts it).
const DRAFT_ROUND_OFF: f64 = 1e-9;
/// Half-angle of the locating cones.
const CONE_HALF_ANGLE_DEG: f64 = 10.0;
/// Radial (and end) clearance of a socket round its pin, m.
const LOCATOR_CLEARANCE: f64 = 0.1e-3;
/// Vertices of a half closer than this are one (the flush ends of span-wise modules), m.
const WELD: f64 = 1e-9;

/// How the mould is made.
#[derive(Debug, Clone, PartialEq)]
pub struct MouldParams {
    /// Pull direction of the upper half, rotor frame (normal to the pitch axis; the lower half
    /// is pulled the other way).
    pub pull: [f64; 3],
    /// Block margin beyond the part on every side, m.
    pub margin: f64,
    /// Chordal tolerance (for the locating features' circles), m.
    pub tolerance: f64,
    /// Least acceptable draft.
    pub min_draft: Angle,
    /// Unit in which places are named.
    pub unit: LengthUnit,
}

impl MouldParams {
    /// A mould whose upper half is pulled at `angle` from +Z towards −Y about the pitch axis
    /// (`pull = (0, −sin a, cos a)`), normal to the pitch axis as every half's pull is.
    pub fn pulled_at(
        angle: Angle,
        margin: f64,
        tolerance: f64,
        min_draft: Angle,
        unit: LengthUnit,
    ) -> MouldParams {
        let (s, c) = angle.rad().sin_cos();
        MouldParams { pull: [0.0, -s, c], margin, tolerance, min_draft, unit }
    }
}

/// A connected region of undercut cavity facets.
#[derive(Debug, Clone, PartialEq)]
pub struct Undercut {
    /// Area, m².
    pub area: f64,
    /// The least draft in it (negative).
    pub worst: Angle,
    /// Centroid of its worst facet.
    pub at: Place,
    /// Range of radius x it covers, m.
    pub x_range: [f64; 2],
    /// Where on the part: `"surface"`, `"root end"`, `"tip end"` or a mix joined by `" and "`.
    pub region: String,
}

/// One mould half: pull, draft and undercuts of its cavity, and its block.
#[derive(Debug, Clone, PartialEq)]
pub struct MouldHalf {
    /// `"upper"` or `"lower"`.
    pub side: &'static str,
    /// Unit pull direction, rotor frame.
    pub pull: [f64; 3],
    /// Draft over the cavity facets.
    pub draft: DraftReport,
    /// Area of the cavity wall, m².
    pub cavity_area: f64,
    /// Undercut regions, largest first.
    pub undercuts: Vec<Undercut>,
    /// Size of the whole block (both halves together) along the mould frame's X (pitch axis), Y
    /// and Z (pull), m.
    pub block_size: [f64; 3],
    /// Where the axes of the locating pins (lower half) or sockets (upper half) meet the parting
    /// surface; for an end piece, the middle of each key's base edge on the block's end face
    /// (upper half's key first). Rotor frame, m.
    pub locators: Vec<[f64; 3]>,
}

/// Builds the upper and lower halves round `part` (see the module docs): their meshes
/// (closed, outward, rotor frame) and what each is. The caps stay in the halves (no end pieces;
/// see [`build_mould_parts`]).
pub fn build_moulds(
    part: &LoftedSolid,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
) -> Result<([Mesh; 2], [MouldHalf; 2]), MeshError> {
    let set = build_mould_set(part, chord_angle, params, Some([false; 2]), None)?;
    Ok((set.half_meshes, set.halves))
}

/// A mould of two halves and the end pieces the part's ends need.
#[derive(Debug, Clone)]
pub struct MouldParts {
    /// The upper and the lower half, closed and outward, rotor frame, m.
    pub half_meshes: [Mesh; 2],
    /// What each half is.
    pub halves: [MouldHalf; 2],
    /// The end pieces (root first), each with what it is (`side` "root end" or "tip end").
    pub end_pieces: Vec<(Mesh, MouldHalf)>,
    /// The keys of each end piece into the halves, in the order of `end_pieces` (an end piece
    /// rebuilt round a seated end keeps them, so the halves' sockets stay filled).
    pub(crate) end_keys: Vec<Vec<keys::WallKey>>,
    /// The mould frame the parts were built in (a module's block may set it); the keys' points
    /// are in it.
    pub(crate) frame: Frame,
    /// The keys and sockets across the flush faces of a span-wise module (none for a mould of
    /// one block), see `flush`.
    pub module_keys: Vec<ModuleKey>,
}

/// Builds the halves round `part` and, at a cap that undercuts either half's pull, an end piece
/// pulled along the span (see the module docs): the fewest parts for which no cavity facet
/// undercuts at the caps.
pub fn build_mould_parts(
    part: &LoftedSolid,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
) -> Result<MouldParts, MeshError> {
    build_mould_set(part, chord_angle, params, None, None)
}

/// The unit pull normal to the pitch axis from `params.pull`.
fn unit_pull(params: &MouldParams) -> Result<P3, MeshError> {
    let ex = [1.0, 0.0, 0.0];
    let d = vec3::sub(params.pull, vec3::scale(ex, params.pull[0]));
    let len = vec3::norm(d);
    if !(len.is_finite() && len > 1e-9 * vec3::norm(params.pull)) {
        return Err(MeshError::Parameter {
            name: "pull direction length normal to the pitch axis".into(),
            value: len,
            expected: "a finite, non-zero vector",
        });
    }
    Ok(vec3::scale(d, 1.0 / len))
}

/// The frame of a mould pulled along the unit `ez` (normal to the pitch axis).
fn frame_of(ez: P3) -> Frame {
    let ex = [1.0, 0.0, 0.0];
    Frame { ex, ey: vec3::cross(ez, ex), ez }
}

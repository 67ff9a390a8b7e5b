//! Core casting moulds: for each core, a block of two halves (and the end pieces its ends need)
//! round the core's cavity, with a pour sprue and a vent, in which the fusible core is cast.
//!
//! - **Cavity.** The core lofted again, parted at its silhouette along the casting mould's pull
//!   ([`super::SilhouetteSurface`]), and scaled by `1 + s` about the rotor centre, `s` the
//!   alloy's linear shrinkage (the casting shrinks back to the core's size as it cools), so the
//!   cavity's volume is the core's times `(1 + s)³`. A printed core is cast with its print:
//!   the print (scaled alike) is a seat in the end piece at its end (made there if the end
//!   would not need one), and the metal is the cavity with that seat, so the cavity's volume
//!   is the core's and the print's times `(1 + s)³`.
//! - **Parting and pull.** The block and its parts are those of the blade's own mould
//!   ([`super::build_mould_parts`]: two halves parted on a ruled surface from the silhouette,
//!   end pieces pulled along the span where a spherical end undercuts the halves, locating pins
//!   of our own). The pull's angle about the pitch axis is tried in the order the blade mould
//!   tries it: the blade mould's own pull first, then just beyond the greatest and the least
//!   chord angle of the core by the least draft and half a degree; the first whose parts have no
//!   cavity facet below the least draft is kept, else the one with the least undercut area, then
//!   the least area below the least draft (a web face is parallel to a pull normal to its
//!   chord, so a core bounded by a web drafts only with the pull turned off its chord angles).
//!   A pull whose parted surface cannot be lofted within the tolerance is passed over; the
//!   core goes without a casting mould only when no pull can be lofted (with the first one's
//!   reason).
//! - **Pouring position.** The block lies on the lower half's back face, the upper half's pull
//!   pointing up. The **vent** rises from the cavity's highest point in that position (the
//!   highest vertex of the cavity's mesh; where the hole would reach an end cap or a facet that
//!   does not face up, from the next highest vertex that allows it); the **sprue** from the
//!   highest point of the upper surface in the half of the core's span away from the vent
//!   (poured at one end, vented at the other: common practice). Both run along the pull up
//!   through the upper half to its top face, round, narrowing upwards at the least draft plus
//!   1° (so the upper half lifts off the metal in them): the set diameter at the top face, a
//!   foot wider by the rise (a channel widening upwards would lock the upper half on).
//! - **Holes in the surfaces.** Seen along the pull, the upper cavity surface is a graph (its
//!   facets face up), so each hole is cut in the plane normal to the pull: the cavity facets
//!   within 1.2 radii of the axis are replaced by a constrained Delaunay triangulation (the
//!   `spade` crate) of their outline, their corners outside the hole and the hole's circle (24
//!   sides, each corner lifted onto the facet below it); the half's top face likewise round the
//!   circles at the top. The cavity (the metal: core, sprue and vent) and the upper half share
//!   these facets, turned, so the parts and the metal fill the block exactly.

use crate::mesh::{WordMap, WordSet};

use spade::{ConstrainedDelaunayTriangulation, Point2, Triangulation};

use super::grid::LoftParams;
use super::loft::{LoftedSolid, loft_solid};
use super::machining::to_machining_frame;
use super::mould::{
    MouldHalf, MouldParams, MouldParts, SeatedEnd, build_mould_parts, build_seated_mould_parts,
    seated_solid,
};
use super::parting::{ContourSamples, SilhouetteSurface};
use super::prints::{CorePrint, casting_seat, scaled_trim};
use super::surface::SpanSurface;
use super::trim::Trims;
use super::{MachinedPart, MachiningFrame};
use crate::mesh::LengthUnit;
use crate::mesh::Mesh;
use crate::mesh::MeshError;
use crate::mesh::orient::{compact, neighbours};
use crate::mesh::vec3::{self, P3};
use crate::units::Angle;

mod build;
mod faces;
mod patch;
pub(crate) use build::casting_mould;
use faces::{channel_volume, holed_face, kept_faces, key, matching_facets, position_ids, settle};
use patch::{Patch, Plan, PlanIndex, circle, cross2, fill_patch, patch, taken, tri2};

/// Sides of the polygon of a sprue's or a vent's circle.
const CIRCLE_SIDES: usize = 24;
/// The cavity facets replaced round a hole reach this many radii from its axis.
const PATCH_REACH: f64 = 1.2;
/// A facet that faces up at least this much (the cosine of its normal to the pull) may be
/// holed; a hole is not cut near the silhouette.
const FACING_UP: f64 = 0.2;
/// Vertices tried, highest first, for each hole.
const TRIES: usize = 400;

/// How the core casting moulds are made.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CastingParams {
    /// Linear shrinkage of the alloy from its solidus to room temperature (a fraction).
    pub shrinkage: f64,
    /// Diameter of the sprue at the top face (its narrowest), m.
    pub sprue_diameter: f64,
    /// Diameter of the vent at the top face (its narrowest), m.
    pub vent_diameter: f64,
}

impl Default for CastingParams {
    fn default() -> Self {
        // 0.2 %: the thermal contraction of a bismuth-tin alloy from its solidus (138 °C) to
        // 20 °C at about 15e-6 /K (from memory); sprue 8 mm, vent 3 mm (common practice).
        CastingParams { shrinkage: 0.002, sprue_diameter: 8e-3, vent_diameter: 3e-3 }
    }
}

/// A sprue or a vent: a round hole along the pull from the cavity to the block's top face.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Channel {
    /// Where its axis meets the cavity surface, rotor frame, m.
    pub entry: P3,
    /// Where its axis leaves the top face of the upper half, rotor frame, m.
    pub outlet: P3,
    /// Diameter at the cavity (the circle's corners), m.
    pub entry_diameter: f64,
    /// Diameter at the top face, m.
    pub outlet_diameter: f64,
    /// Volume of the metal in it above the cavity surface, m³.
    pub volume: f64,
}

/// A part of a core's casting mould.
#[derive(Debug, Clone)]
pub struct CastPart {
    /// Its name, also its file name (`core-1-cast-upper`, ...).
    pub name: String,
    /// The mesh, rotor frame, m (closed, outward).
    pub mesh: Mesh,
    /// Its pull, the unit direction in which it leaves the casting, rotor frame.
    pub pull: P3,
}

/// One core's casting mould (see the module docs).
#[derive(Debug, Clone)]
pub struct CastingMould {
    /// The core's name (`core-1`, ...).
    pub core: String,
    /// The chord angle ψ the pull is normal to: the upper half is pulled along
    /// `(0, −sin ψ, cos ψ)`.
    pub pull_angle: Angle,
    /// Up in the pouring position (the upper half's pull), rotor frame.
    pub up: P3,
    /// The alloy's linear shrinkage used (a fraction).
    pub shrinkage: f64,
    /// Volume of the core as lofted for this mould (nominal), m³.
    pub core_volume: f64,
    /// Volume of the cavity (the core scaled by `1 + shrinkage`), m³.
    pub cavity_volume: f64,
    /// Volume of alloy to melt: the cavity, the sprue and the vent, m³.
    pub metal_volume: f64,
    /// The highest point of the cavity in the pouring position, rotor frame, m.
    pub highest: P3,
    /// How far the highest point lies above where the vent's axis meets the cavity, m (zero
    /// when the vent stands on it; more where the highest point lies on an end's edge, which
    /// the vent's foot cannot take whole).
    pub vent_shortfall: f64,
    /// The pour sprue.
    pub sprue: Channel,
    /// The vent.
    pub vent: Channel,
    /// The upper and the lower half's pull, draft and undercuts (as for the blade's mould).
    pub halves: [MouldHalf; 2],
    /// The end pieces' (root first).
    pub end_pieces: Vec<MouldHalf>,
    /// Volume of the whole block (all parts and the metal), m³.
    pub block_volume: f64,
    /// The parts: upper half, lower half, end pieces.
    pub parts: Vec<CastPart>,
    /// The metal (cavity, sprue and vent) as one closed solid, rotor frame, m.
    pub metal: Mesh,
    /// Each part again in its machining frame, in the order of `parts`.
    pub machining: Vec<MachinedPart>,
}

/// What the casting mould of one core needs of the blade's tooling.
pub(crate) struct CastingInput<'a> {
    pub name: &'a str,
    pub cell: &'a dyn SpanSurface,
    pub trims: &'a Trims,
    pub loft: &'a LoftParams,
    /// The blade mould's pull angle, tried first.
    pub first: Angle,
    /// The core's print, cast with it (none: the core is cast alone).
    pub print: Option<&'a CorePrint>,
    pub margin: f64,
    pub tolerance: f64,
    pub min_draft: Angle,
    pub unit: LengthUnit,
}

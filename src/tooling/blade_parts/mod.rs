//! The tooling of one blade: its cores, the laminate shell and the two mould halves, lofted from
//! the blade's surfaces (see [`crate::blade::BladeSurfaces`]).
//!
//! - **Ends.** The outer mould line is trimmed by spheres about the rotor centre of radius
//!   `R_hub + root_clearance` and `R_tip − tip_clearance`; the cores by those spheres moved in by
//!   the end laminate, the least skin thickness of the end station (the plies that run all round
//!   the section are taken to close the end).
//! - **Cores.** One per cell: from the leading edge (or the back face of a web, `y_web + t_web/2`)
//!   to the front face of the next web, or to the thin trailing edge, where the last core closes
//!   at the first chordwise position aft of the section's greatest depth where the inner surfaces
//!   come within the least core thickness; behind that the shell is solid laminate. A web that
//!   starts or ends inside the span closes the cells it bounds (the two either side of it) with a
//!   bulkhead of its own laminate thickness, normal to the pitch axis; a cell bounded by other
//!   webs or the edges runs on through that radius as one core. The cores are numbered by the
//!   span segment they start in, root first, front to back within a segment.
//! - **Mould.** The outer mould line is lofted parted at its silhouette along the mould's pull
//!   (see [`super::SilhouetteSurface`]); the pull's angle about the pitch axis is chosen among
//!   a few candidates, the first whose halves have no undercut facet (see `choose_pull`), and
//!   end pieces are added where a spherical end undercuts the halves (see
//!   [`super::build_mould_parts`]). The same lofted surface bounds the shell.
//! - **Machining frames.** Each mould part is also given in its own frame (see
//!   [`super::to_machining_frame`]): the cavity opens along +Z, the back face lies on z = 0.
//! - **Shell.** The outer solid with every core as a cavity.
//! - **Allowances.** The cast cores are written scaled by the shrink factor and the mould cavity
//!   by the thermal-expansion factor, both about the rotor centre (so spherical ends stay spheres
//!   about it); volumes and masses are those of the nominal parts.

use super::blade_surface::span_samples;
use super::blade_surface::{BladeSurface, CoreCell, CoreEnd, CutBound, Side, core_cuts};
use super::casting::{CastingInput, CastingMould, CastingParams, casting_mould};
use super::grid::LoftParams;
use super::loft::{LoftedSolid, loft_solid};
use super::machining::{MachiningFrame, to_machining_frame};
use super::mould::{
    ModularMould, MouldHalf, MouldParams, MouldParts, build_modular_mould, build_mould_parts,
    loft_modules,
};
use super::parting::{ContourSamples, SilhouetteSurface, SpanModule, span_modules};
use super::prints::{CorePrint, PrintSetting, print_or_fall, print_taper, shell_with_ports};
use super::surface::{EndKind, SpanSurface};
use super::trim::{EndTrim, Trims};
use crate::blade::{Blade, BladeSurfaces, Surface};
use crate::interp::Pchip;
use crate::mesh::LengthUnit;
use crate::mesh::Mesh;
use crate::mesh::vec3;
use crate::mesh::{End, MeshError};
use crate::project::ToolingSpec;
use crate::units::Angle;

mod build;
mod mould_choice;
mod seating;
pub use build::{build_tooling, trailing_edge_kind};
use mould_choice::{
    Mould, casting_moulds, choose_mould, choose_pull, push_modular_parts, push_mould_parts,
};
use seating::seat_prints;

/// Settings of a blade's tooling.
#[derive(Debug, Clone, PartialEq)]
pub struct ToolingParams {
    /// Chordal tolerance of every surface, m.
    pub tolerance: f64,
    /// Least core thickness normal to the chord, where a core ends at a thin trailing edge, m.
    pub min_core_thickness: f64,
    /// Block margin beyond the part on every side of a mould half, m.
    pub mould_margin: f64,
    /// Pitch setting the parts are placed at (the rotor's setting when `None`).
    pub pitch: Option<Angle>,
    /// Scale of the mould cavity about the rotor centre (thermal-expansion allowance; 1: none).
    pub mould_expansion_factor: f64,
    /// Scale of the cast cores about the rotor centre (shrink allowance; 1: none).
    pub core_shrink_factor: f64,
    /// Least acceptable draft of a mould half along its pull.
    pub min_draft: Angle,
    /// Unit in which places are named in messages and reports.
    pub unit: LengthUnit,
    /// How the blade's ends are trimmed.
    pub ends: EndShape,
    /// A core print's section as a fraction of the core's end section, chordwise and in depth
    /// (0.5 by default; 0: no prints; see [`super::CorePrint`]).
    pub print_fraction: f64,
    /// How far a core print stands out beyond the shell's outer end surface, m (at most the
    /// mould margin).
    pub print_length: f64,
    /// How each core's casting mould is made (`None`: no casting moulds).
    pub casting: Option<CastingParams>,
}

/// How the blade's ends are trimmed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum EndShape {
    /// Spheres about the rotor centre, `R_hub + root_clearance` and `R_tip − tip_clearance`
    /// (the default: the clearances hold at every pitch angle).
    #[default]
    Spheres,
    /// Planes normal to the pitch axis through the first and the last station (a blade without
    /// a hub band or a duct; the rotor's clearances are not used).
    Planes,
}

impl Default for ToolingParams {
    fn default() -> Self {
        ToolingParams {
            tolerance: 0.1e-3,
            min_core_thickness: 2.0e-3,
            mould_margin: 0.03,
            pitch: None,
            mould_expansion_factor: 1.0,
            core_shrink_factor: 1.0,
            min_draft: Angle::from_deg(1.0),
            unit: LengthUnit::Millimetre,
            ends: EndShape::Spheres,
            // Half the end section's width and depth, standing 15 mm out of the shell into its
            // seat in the end piece (common practice; see docs/decisions.md).
            print_fraction: 0.5,
            print_length: 0.015,
            casting: Some(CastingParams::default()),
        }
    }
}

impl ToolingParams {
    /// The settings of a project's `[tooling]` table.
    pub fn from_spec(spec: &ToolingSpec) -> Result<Self, MeshError> {
        Ok(ToolingParams {
            tolerance: spec.tolerance,
            min_core_thickness: spec.min_core_thickness,
            mould_margin: spec.mould_margin,
            pitch: None,
            mould_expansion_factor: spec.mould_expansion_factor,
            core_shrink_factor: spec.core_shrink_factor,
            min_draft: spec.min_draft,
            unit: spec.stl_unit.parse()?,
            ends: EndShape::Spheres,
            print_fraction: spec.core_print_fraction,
            print_length: spec.core_print_length,
            casting: Some(CastingParams {
                shrinkage: spec.core_alloy_shrinkage,
                ..CastingParams::default()
            }),
        })
    }

    fn validate(&self) -> Result<(), MeshError> {
        let positive = |name: &str, v: f64| {
            if v.is_finite() && v > 0.0 {
                Ok(())
            } else {
                Err(MeshError::Parameter {
                    name: name.into(),
                    value: v,
                    expected: "a positive length",
                })
            }
        };
        positive("chordal tolerance (m)", self.tolerance)?;
        positive("least core thickness (m)", self.min_core_thickness)?;
        positive("mould margin (m)", self.mould_margin)?;
        let draft = self.min_draft.deg();
        if !(0.0..=30.0).contains(&draft) {
            return Err(MeshError::Parameter {
                name: "least draft (degrees)".into(),
                value: draft,
                expected: "a draft of 0 to 30 degrees",
            });
        }
        if !(0.0..=0.9).contains(&self.print_fraction) {
            return Err(MeshError::Parameter {
                name: "core print fraction".into(),
                value: self.print_fraction,
                expected: "a fraction of the core's end section from 0 (no prints) to 0.9",
            });
        }
        if self.print_fraction > 0.0 {
            positive("core print length (m)", self.print_length)?;
            if self.print_length > self.mould_margin {
                return Err(MeshError::Parameter {
                    name: "core print length (m)".into(),
                    value: self.print_length,
                    expected: "a print no longer than the mould margin (it seats in the block)",
                });
            }
        }
        for (name, f) in [
            ("mould expansion factor", self.mould_expansion_factor),
            ("core shrink factor", self.core_shrink_factor),
        ] {
            if !(f > 0.5 && f < 2.0) {
                return Err(MeshError::Parameter {
                    name: name.into(),
                    value: f,
                    expected: "a scale factor near 1 (0.5..2)",
                });
            }
        }
        Ok(())
    }
}

/// What a part is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PartKind {
    /// A core, cast in the core alloy.
    Core,
    /// The laminate shell.
    Shell,
    /// The upper mould half (pulled along +pull).
    MouldUpper,
    /// The lower mould half (pulled along −pull).
    MouldLower,
    /// An end piece of the mould, pulled along the span.
    MouldEnd,
}

impl PartKind {
    /// A part of the mould (machined, not cast or laid up).
    pub fn is_mould(self) -> bool {
        matches!(self, PartKind::MouldUpper | PartKind::MouldLower | PartKind::MouldEnd)
    }
}

/// One part of the tooling.
#[derive(Debug, Clone)]
pub struct Part {
    /// Its name, which is also its file name (`core-1`, `shell`, `mould-upper`, ...).
    pub name: String,
    /// What it is.
    pub kind: PartKind,
    /// The mesh as it is written (allowance factors applied), rotor frame, m.
    pub mesh: Mesh,
    /// Volume of the nominal part (a core or the shell before its allowance factor; a mould
    /// half as written), m³.
    pub nominal_volume: f64,
}

/// The end spheres and end laminates.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EndSpheres {
    /// Radius of the root sphere of the outer surface, `R_hub + root_clearance`, m.
    pub root: f64,
    /// Radius of the tip sphere of the outer surface, `R_tip − tip_clearance`, m.
    pub tip: f64,
    /// Laminate closing the root end (the cores' root sphere is `root` plus this), m.
    pub root_laminate: f64,
    /// Laminate closing the tip end (the cores' tip sphere is `tip` less this), m.
    pub tip_laminate: f64,
}

/// A note on the cores' casting moulds (the report words it).
#[derive(Debug, Clone, PartialEq)]
pub enum CastingNote {
    /// A core whose casting mould could not be made, with the reason; the rest of the tooling
    /// stands.
    NoMould {
        /// The core's part name (`core-N`).
        core: String,
        /// Why its mould could not be made.
        reason: MeshError,
    },
}

/// A core made without its print, and why (the report words it).
#[derive(Debug, Clone, PartialEq)]
pub struct DroppedPrint {
    /// The core's part name (`core-N`).
    pub core: String,
    /// The end its print would have left through.
    pub end: End,
    /// Why the print could not be made.
    pub reason: MeshError,
}

/// The whole tooling of a blade.
#[derive(Debug, Clone)]
pub struct BladeTooling {
    /// Cores (root segment first, front to back), the shell, the upper and the lower mould half.
    pub parts: Vec<Part>,
    /// Where the last core ends at the thin trailing edge, at the blade's stations.
    pub core_ends: Vec<CoreEnd>,
    /// The end spheres.
    pub ends: EndSpheres,
    /// How far the root section is carried inboard of the first station to meet the root sphere,
    /// at its farthest, m (along the pitch axis).
    pub root_extension: f64,
    /// How far the tip section is carried beyond the last station to meet the tip sphere on the
    /// pitch axis, m (zero when the sphere cuts inside the last station).
    pub tip_extension: f64,
    /// The two mould halves' pulls, drafts and undercuts, upper first.
    pub moulds: [MouldHalf; 2],
    /// The pitch setting the parts are placed at.
    pub pitch: Angle,
    /// The settings used.
    pub params: ToolingParams,
    /// The end pieces of the mould (root first), where a spherical end undercuts the halves:
    /// pulled along the span, `side` "root end" or "tip end".
    pub end_pieces: Vec<MouldHalf>,
    /// Each mould part again in its own machining frame (see [`MachinedPart`]).
    pub machining: Vec<MachinedPart>,
    /// The chord angle ψ the mould's pull is normal to: the upper half is pulled along
    /// `(0, −sin ψ, cos ψ)`, rotor frame (see [`build_tooling`]'s choice of the pull).
    pub mould_pull_angle: Angle,
    /// The cores' prints and the shell's ports, in core order (see [`super::CorePrint`]).
    pub prints: Vec<CorePrint>,
    /// Cores without a print: closed by bulkheads at both ends, their cells reach no end of
    /// the blade (none when prints are off).
    pub unprinted: Vec<String>,
    /// Cores whose print could not be made (a cell too thin for it, or a printed core that
    /// failed its solid check): each is made as with prints off, sealed in the shell, and the
    /// summary says so.
    pub print_dropped: Vec<DroppedPrint>,
    /// Each core's casting mould, in core order (see [`super::CastingMould`]).
    pub casting: Vec<CastingMould>,
    /// Cores without a casting mould, each with the reason, and what the casting moulds leave
    /// out (worded by the report).
    pub casting_notes: Vec<CastingNote>,
    /// The mould split along the span, when no single pull draws every section (see
    /// [`build_tooling`]); `None` for a mould of two halves.
    pub modular: Option<MouldModules>,
    /// Meshes already found free of self-intersection while the tooling was built (each
    /// printed core, by the check that decides whether it keeps its print), as they were
    /// checked: see [`BladeTooling::known_clear`].
    pub(crate) clear: Vec<Mesh>,
}

/// A mould split along the span into modules, each two halves with its own pull.
#[derive(Debug, Clone)]
pub struct MouldModules {
    /// The modules, root first (radii, pull angle, window of drawing pulls).
    pub modules: Vec<SpanModule>,
    /// Every module's halves in the order of the parts (`mould-1-upper`, `mould-1-lower`,
    /// `mould-2-upper`, ...); [`BladeTooling::moulds`] holds the first module's.
    pub halves: Vec<MouldHalf>,
    /// Size of the whole block (all modules together) along the pitch axis, across it and along
    /// the mean pull, m.
    pub block_size: [f64; 3],
}

impl BladeTooling {
    /// Whether the self-intersection test of `mesh` is already done and passed: it is, to the
    /// bit, a mesh that passed it while the tooling was built. The check before writing need not
    /// repeat that test (its outcome depends on the mesh alone); every other check it repeats.
    pub fn known_clear(&self, mesh: &Mesh) -> bool {
        self.clear.iter().any(|m| m.same_bits(mesh))
    }

    /// What each mould part is, in the order of the mould parts in [`BladeTooling::parts`]:
    /// the halves (of every module when the mould is split along the span), then the end pieces.
    pub fn mould_halves(&self) -> Vec<&MouldHalf> {
        let halves: Vec<&MouldHalf> = match &self.modular {
            Some(m) => m.halves.iter().collect(),
            None => self.moulds.iter().collect(),
        };
        halves.into_iter().chain(&self.end_pieces).collect()
    }
}

/// A mould part in its machining frame: the casting leaves the cavity along +Z, the back face
/// lies on z = 0, the part in the positive octant.
#[derive(Debug, Clone)]
pub struct MachinedPart {
    /// The part's name in the rotor frame (`mould-upper`, ...).
    pub part: String,
    /// Its name in the machining frame, also its file name (`mould-upper-machining`).
    pub name: String,
    /// The mesh in the machining frame, m.
    pub mesh: Mesh,
    /// The motion back to the rotor frame.
    pub frame: MachiningFrame,
}

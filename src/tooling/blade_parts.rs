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
use super::error::{End, MeshError};
use super::grid::LoftParams;
use super::loft::{LoftedSolid, loft_solid};
use super::machining::{MachiningFrame, to_machining_frame};
use super::mesh::Mesh;
use super::mould::{
    ModularMould, MouldHalf, MouldParams, MouldParts, build_modular_mould, build_mould_parts,
    loft_modules,
};
use super::parting::{SilhouetteSurface, SpanModule, span_modules};
use super::prints::{CorePrint, PrintSetting, print_core, shell_with_ports};
use super::stl::LengthUnit;
use super::surface::{EndKind, SpanSurface};
use super::trim::{EndTrim, Trims};
use super::vec3;
use crate::blade::{Blade, BladeSurfaces, Surface};
use crate::interp::Pchip;
use crate::project::ToolingSpec;
use crate::units::Angle;

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
    /// (0: no prints; see [`super::CorePrint`]).
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
            // Off until the mould parts carry seats for the prints (see docs/decisions.md).
            print_fraction: 0.0,
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
    /// Each core's casting mould, in core order (see [`super::CastingMould`]).
    pub casting: Vec<CastingMould>,
    /// Cores without a casting mould, each with the reason.
    pub casting_notes: Vec<String>,
    /// The mould split along the span, when no single pull draws every section (see
    /// [`build_tooling`]); `None` for a mould of two halves.
    pub modular: Option<MouldModules>,
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

/// A core cell through consecutive span segments: bounded in front by the leading-edge cut
/// (`None`) or web `k`'s back face, behind by web `k`'s front face or the trailing-edge cut.
#[derive(Debug, Clone, Copy)]
struct CellSpan {
    front: Option<usize>,
    back: Option<usize>,
    first: usize,
    last: usize,
}

/// A web that starts or ends inside the span: a bulkhead across the cells it bounds.
#[derive(Debug, Clone, Copy)]
struct Bulkhead {
    r: f64,
    thickness: f64,
}

/// The one kind of trailing edge the blade has at every station: a closing segment (blunt) or
/// a point (sharp). A blade whose trailing edge changes kind along the span (a closed round root
/// blending into blunt sections) cannot be lofted yet: [`MeshError::StationShape`] at the first
/// station whose kind differs from the root's. A caller may ask this before building, to go on
/// without tooling.
pub fn trailing_edge_kind(blade: &Blade) -> Result<EndKind, MeshError> {
    let blunt = blade.surfaces().blunt_trailing_edges();
    if blunt.iter().all(|&b| b) {
        Ok(EndKind::Segment)
    } else if blunt.iter().all(|&b| !b) {
        Ok(EndKind::Point)
    } else {
        let kind = |b: bool| if b { "blunt" } else { "sharp" };
        let radii = blade.station_radii();
        let list: Vec<String> =
            radii.iter().zip(&blunt).map(|(r, &b)| format!("r = {r} m {}", kind(b))).collect();
        // The first station whose kind differs from the root's is where the shape changes.
        let at = blunt.iter().position(|&b| b != blunt[0]).unwrap_or(0);
        Err(MeshError::StationShape {
            r: radii.get(at).copied().unwrap_or(0.0),
            text: format!(
                "the tooling needs one kind of trailing edge at every station, blunt (open) or \
                 sharp (closed), and cannot yet blend one into the other along the span; the \
                 root is {} but this station is {}: give every station the same kind of \
                 trailing edge to make tooling (a NACA code takes `-closed` for a sharp one); found {}",
                kind(blunt[0]),
                kind(!blunt[0]),
                list.join(", ")
            ),
        })
    }
}

/// Builds the tooling of `blade` (see the module docs). `progress(done, total, stage)` is called
/// as each part is lofted.
///
/// ```
/// use layloft::blade::Blade;
/// use layloft::input::read_project;
/// use layloft::tooling::{CheckParams, ToolingParams, build_tooling, check_solid};
///
/// # fn main() -> Result<(), layloft::Error> {
/// let project = read_project("layups/mine-fan/blade.toml".as_ref())?;
/// let blade = Blade::from_project(&project)?;
/// let params = ToolingParams { tolerance: 0.5e-3, ..ToolingParams::default() };
/// let tooling = build_tooling(&blade, &params, &mut |_, _, _| {})?;
/// let names: Vec<&str> = tooling.parts.iter().map(|p| p.name.as_str()).collect();
/// let parts = ["core-1", "core-2", "shell", "mould-upper", "mould-lower"];
/// // The spherical ends undercut the halves' pull: an end piece at each end.
/// assert_eq!(names, [&parts[..], &["mould-root-end", "mould-tip-end"]].concat());
/// // The least clearance to the duct is the rotor's tip clearance.
/// let shell = &tooling.parts[2].mesh;
/// let reach = shell.vertices.iter().map(|p| p.iter().map(|c| c * c).sum::<f64>().sqrt());
/// let gap = project.rotor.tip_radius - reach.fold(0.0, f64::max);
/// assert!((gap - project.rotor.tip_clearance).abs() < 1e-9);
/// check_solid(shell, "shell", &CheckParams::default())?;
/// # Ok(())
/// # }
/// ```
pub fn build_tooling(
    blade: &Blade,
    params: &ToolingParams,
    progress: &mut dyn FnMut(usize, usize, &str),
) -> Result<BladeTooling, MeshError> {
    params.validate()?;
    let surfaces = blade.surfaces();
    let rotor = blade.rotor();
    let back = trailing_edge_kind(blade)?;
    let (r0, r1) = (blade.root_radius(), blade.tip_radius());
    let root_sphere = rotor.hub_radius + rotor.root_clearance;
    let tip_sphere = rotor.tip_radius - rotor.tip_clearance;
    let reach = section_reach(&surfaces, r0);
    if root_sphere <= reach {
        return Err(MeshError::Settings(format!(
            "the root sphere (hub_radius_m + root_clearance_m = {root_sphere:.4} m) does not reach \
             past the root section, which extends {reach:.4} m from the pitch axis: the sphere \
             cannot end the blade"
        )));
    }
    let x_lo = ((root_sphere * root_sphere - reach * reach).sqrt() - 0.05 * reach - 1e-3).max(0.0);
    let span = [x_lo, tip_sphere.max(r1) + 1e-3];
    let ends = EndSpheres {
        root: root_sphere,
        tip: tip_sphere,
        root_laminate: surfaces.least_skin_thickness(r0),
        tip_laminate: surfaces.least_skin_thickness(r1),
    };
    let pitch = params.pitch.unwrap_or(rotor.pitch);
    let outer = BladeSurface { surfaces: &surfaces, side: Side::Outer, pitch, span, back };
    let inner = BladeSurface { surfaces: &surfaces, side: Side::Inner, pitch, span, back };
    let loft = LoftParams { tolerance: params.tolerance, ..LoftParams::default() };

    // Where the cores close at the leading and trailing edges, solved every 4 mm or so along the
    // span and interpolated (each cut keeps a tenth of the least core thickness clear of where the
    // inner chains stop facing each other, far more than the interpolation moves it).
    let radii = span_samples(span);
    let cut_radii: Vec<f64> = {
        let n = ((span[1] - span[0]) / 4e-3).ceil().clamp(48.0, 600.0) as usize;
        (0..=n).map(|i| span[0] + (span[1] - span[0]) * i as f64 / n as f64).collect()
    };
    let base = |x: f64| surfaces.thickness(x, Surface::Upper, 1.0);
    let (mut le_y, mut te_y) = (Vec::with_capacity(cut_radii.len()), Vec::new());
    for &x in &cut_radii {
        let [front, back] = core_cuts(&inner, x, params.min_core_thickness, base(x))?;
        le_y.push(front);
        te_y.push(back);
    }
    let le_cut = Pchip::new(&cut_radii, &le_y);
    let te_cut = Pchip::new(&cut_radii, &te_y);
    let core_ends = blade
        .station_radii()
        .iter()
        .map(|&r| {
            let y = te_cut.eval(r);
            let (c, pa) = (blade.chord(r), blade.pitch_axis_frac(r));
            CoreEnd { r, y, chord_fraction: y / c + pa, solid_chord: (1.0 - pa) * c - y }
        })
        .collect();

    // Spanwise segments between web ends, and the cells of each.
    let bulkheads = bulkheads(&surfaces);
    let (outer_trims, inner_trims) = match params.ends {
        EndShape::Spheres => (
            Trims::spheres(root_sphere, tip_sphere),
            Trims::spheres(root_sphere + ends.root_laminate, tip_sphere - ends.tip_laminate),
        ),
        EndShape::Planes => {
            (Trims::planes(r0, r1), Trims::planes(r0 + ends.root_laminate, r1 - ends.tip_laminate))
        }
    };
    // Each cell is bounded by the leading-edge cut or a web's back face in front, and a web's
    // front face or the trailing-edge cut behind; it runs through every segment where that pair
    // bounds a cell, so a bulkhead closes only the cells that end at it.
    let segments: Vec<(Option<Bulkhead>, Option<Bulkhead>)> = (0..=bulkheads.len())
        .map(|seg| (seg.checked_sub(1).map(|i| bulkheads[i]), bulkheads.get(seg).copied()))
        .collect();
    let mut spans: Vec<CellSpan> = Vec::new();
    for (seg, &(lo, hi)) in segments.iter().enumerate() {
        let mid = match (lo, hi) {
            (Some(a), Some(b)) => 0.5 * (a.r + b.r),
            (Some(a), None) => 0.5 * (a.r + r1),
            (None, Some(b)) => 0.5 * (r0 + b.r),
            (None, None) => 0.5 * (r0 + r1),
        };
        let active: Vec<usize> = (0..blade.webs().len())
            .filter(|&k| {
                let w = &blade.webs()[k];
                mid >= w.r_start - 1e-9 && mid <= w.r_end + 1e-9
            })
            .collect();
        let mut bounds = vec![None];
        bounds.extend(active.iter().map(|&k| Some(k)));
        bounds.push(None);
        for pair in bounds.windows(2) {
            let (front, back) = (pair[0], pair[1]);
            match spans.iter_mut().find(|c| c.front == front && c.back == back && c.last + 1 == seg)
            {
                Some(c) => c.last = seg,
                None => spans.push(CellSpan { front, back, first: seg, last: seg }),
            }
        }
    }
    let mut cells: Vec<(CoreCell<'_>, Trims)> = Vec::with_capacity(spans.len());
    for c in &spans {
        let trims = Trims {
            root: segments[c.first]
                .0
                .map_or(inner_trims.root, |b| EndTrim::Plane { x: b.r + 0.5 * b.thickness }),
            tip: segments[c.last]
                .1
                .map_or(inner_trims.tip, |b| EndTrim::Plane { x: b.r - 0.5 * b.thickness }),
        };
        let face = |k: usize, sign: f64| {
            let w = blade.webs()[k].clone();
            let s = &surfaces;
            move |x: f64| {
                let xr = x.clamp(w.r_start, w.r_end);
                s.web_y(x, k) + sign * 0.5 * s.web_thickness(xr, k)
            }
        };
        let front = match c.front {
            None => CutBound::new(&inner, &radii, |x| le_cut.eval(x))?,
            Some(k) => CutBound::new(&inner, &radii, face(k, 1.0))?,
        };
        let back = match c.back {
            None => CutBound::new(&inner, &radii, |x| te_cut.eval(x))?,
            Some(k) => CutBound::new(&inner, &radii, face(k, -1.0))?,
        };
        cells.push((CoreCell { inner: &inner, front, back }, trims));
    }

    let total = cells.len() + 3;
    let mut done = 0;
    let mut step = |label: &str, progress: &mut dyn FnMut(usize, usize, &str)| {
        done += 1;
        progress(done, total, label);
    };
    // The outer mould line is parted at its silhouette along the mould's pull, which is chosen
    // here (see `choose_pull`).
    let chosen = choose_pull(blade, &outer, &outer_trims, &loft, params, pitch, span);
    let (outer_solid, mould_pull_angle, mould) =
        choose_mould(chosen, &outer, &outer_trims, &loft, params, span)?;
    step("outer mould line", progress);
    let mut parts = Vec::with_capacity(total);
    let printing = params.print_fraction > 0.0;
    let side = |trim: EndTrim| trim.chord_for_sag(0.5 * params.tolerance).min(loft.max_edge);
    let (mut printed, mut sealed, mut unprinted) = (Vec::new(), Vec::new(), Vec::new());
    for (i, ((cell, trims), span)) in cells.iter().zip(&spans).enumerate() {
        let name = format!("core-{}", i + 1);
        let solid = loft_solid(cell, trims, &loft)
            .map_err(|e| MeshError::Geometry(format!("{name}: {e}")))?;
        // The print leaves through the root when the cell reaches it, else through the tip.
        let end = if !printing {
            None
        } else if segments[span.first].0.is_none() {
            Some(End::Root)
        } else if segments[span.last].1.is_none() {
            Some(End::Tip)
        } else {
            unprinted.push(name.clone());
            None
        };
        let mesh = match end {
            Some(end) => {
                let set = PrintSetting {
                    fraction: params.print_fraction,
                    length: params.print_length,
                    core_trim: trims.at(end),
                    outer_trim: outer_trims.at(end),
                    max_side: side(trims.at(end)),
                    inset: 0.25 * params.min_core_thickness,
                };
                let p = print_core(&name, &solid, end, cell, &set)
                    .map_err(|e| MeshError::Geometry(format!("{name}: {e}")))?;
                let mesh = p.mesh.clone();
                printed.push(p);
                mesh
            }
            None => {
                sealed.push(solid.mesh.clone());
                solid.mesh
            }
        };
        let nominal_volume = mesh.signed_volume();
        let mut mesh = mesh;
        if params.core_shrink_factor != 1.0 {
            mesh.scale(params.core_shrink_factor);
        }
        parts.push(Part { name, kind: PartKind::Core, mesh, nominal_volume });
        step(&format!("core {}", i + 1), progress);
    }
    let shell = if printed.is_empty() {
        let mut shell = outer_solid.mesh.clone();
        for core in &sealed {
            let mut cavity = core.clone();
            cavity.flip();
            shell.merge(&cavity);
        }
        shell
    } else {
        shell_with_ports(
            &outer_solid,
            &printed.iter().collect::<Vec<_>>(),
            &sealed.iter().collect::<Vec<_>>(),
            [outer_trims.root, outer_trims.tip],
            side(outer_trims.root).min(side(outer_trims.tip)),
        )
        .map_err(|e| MeshError::Geometry(format!("shell: {e}")))?
    };
    let shell_volume = shell.signed_volume();
    parts.push(Part {
        name: "shell".into(),
        kind: PartKind::Shell,
        mesh: shell,
        nominal_volume: shell_volume,
    });
    step("shell", progress);
    let (moulds, end_pieces, modular) = match mould {
        Mould::Whole(set) => {
            let (moulds, end_pieces) = push_mould_parts(*set, &mut parts);
            (moulds, end_pieces, None)
        }
        Mould::Modular(m) => {
            let (moulds, end_pieces, modular) = push_modular_parts(m, &mut parts)?;
            (moulds, end_pieces, Some(modular))
        }
    };
    step("mould halves", progress);
    let root_extension = r0 - root_trim_x(&outer_solid);
    let mut machining = Vec::new();
    let descriptions: Vec<&MouldHalf> = match &modular {
        Some(m) => m.halves.iter().collect(),
        None => moulds.iter().collect(),
    };
    for (p, half) in
        parts.iter().filter(|p| p.kind.is_mould()).zip(descriptions.into_iter().chain(&end_pieces))
    {
        // The casting leaves a half's cavity against the half's own pull.
        let (mesh, frame) = to_machining_frame(&p.mesh, vec3::scale(half.pull, -1.0))?;
        let name = format!("{}-machining", p.name);
        machining.push(MachinedPart { part: p.name.clone(), name, mesh, frame });
    }
    let (casting, casting_notes) = match &params.casting {
        Some(c) => casting_moulds(&cells, &loft, params, c, mould_pull_angle, printing),
        None => (Vec::new(), Vec::new()),
    };
    Ok(BladeTooling {
        parts,
        core_ends,
        ends,
        root_extension: root_extension.max(0.0),
        tip_extension: (tip_sphere - r1).max(0.0),
        moulds,
        pitch,
        params: params.clone(),
        machining,
        end_pieces,
        mould_pull_angle,
        prints: printed.into_iter().map(|p| p.print).collect(),
        unprinted,
        casting,
        casting_notes,
        modular,
    })
}

/// The mould chosen by [`build_tooling`]: two halves (and end pieces), or span-wise modules.
enum Mould {
    Whole(Box<MouldParts>),
    Modular(ModularMould),
}

/// The outer solid the shell is made from, the pull angle reported and the mould.
///
/// When the best single pull (`chosen`, see `choose_pull`) still leaves undercut facets on the
/// mould parts, or none lofts, [`span_modules`] finds the fewest stretches of the span each
/// drawn by one pull normal to the pitch axis (sampled every 4 mm or so, at least 48 and at most
/// 240 radii; the chosen pull kept where it draws a whole module):
///
/// - one stretch: the whole span draws along the pull it found, which the few candidates of
///   `choose_pull` missed; the mould of two halves along that pull is kept if it leaves less
///   undercut;
/// - several: [`loft_modules`] lofts each parted at its own silhouette and
///   [`build_modular_mould`] builds their halves in one block, end pieces at the outer ends;
///   kept if it leaves less undercut than the single pull. The shell is then lofted from the
///   outer surface parted at its edges (no one pull's silhouette parts every section), and the
///   reported pull angle is the first module's.
fn choose_mould(
    chosen: Result<(LoftedSolid, Angle, MouldParts), MeshError>,
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    span: [f64; 2],
) -> Result<(LoftedSolid, Angle, Mould), MeshError> {
    let undercut = |set: &MouldParts| -> f64 {
        let ends = set.end_pieces.iter().map(|e| &e.1);
        set.halves.iter().chain(ends).map(|h| h.draft.undercut_area).sum()
    };
    let mut best = match chosen {
        Ok((solid, angle, set)) if undercut(&set) == 0.0 => {
            return Ok((solid, angle, Mould::Whole(Box::new(set))));
        }
        Ok((solid, angle, set)) => {
            Some((undercut(&set), solid, angle, Mould::Whole(Box::new(set))))
        }
        Err(e) => {
            let prefer = None;
            return match split_mould(outer, trims, loft, params, span, prefer) {
                Ok(Split::Many(m)) => {
                    let angle = m.modules[0].pull_angle;
                    Ok((loft_edges(outer, trims, loft)?, angle, Mould::Modular(m)))
                }
                Ok(Split::One(angle)) => {
                    let (solid, set) = single_mould(outer, trims, loft, params, angle)?;
                    Ok((solid, angle, Mould::Whole(Box::new(set))))
                }
                Err(_) => Err(e),
            };
        }
    };
    let prefer = best.as_ref().map(|b| b.2);
    // A failed split leaves the single pull's mould, its undercuts reported.
    let candidate = match split_mould(outer, trims, loft, params, span, prefer) {
        Ok(Split::Many(m)) => {
            let left: f64 = m.parts.iter().map(undercut).sum();
            let angle = m.modules[0].pull_angle;
            loft_edges(outer, trims, loft).ok().map(|s| (left, s, angle, Mould::Modular(m)))
        }
        Ok(Split::One(angle)) if Some(angle) == prefer => None,
        Ok(Split::One(angle)) => single_mould(outer, trims, loft, params, angle)
            .ok()
            .map(|(solid, set)| (undercut(&set), solid, angle, Mould::Whole(Box::new(set)))),
        Err(_) => None,
    };
    if let Some(c) = candidate {
        if best.as_ref().is_none_or(|b| c.0 < b.0) {
            best = Some(c);
        }
    }
    let (_, solid, angle, mould) =
        best.ok_or_else(|| MeshError::Geometry("no mould to choose".into()))?;
    Ok((solid, angle, mould))
}

/// The outer surface lofted parted at its edges (the shell of a mould split along the span).
fn loft_edges(
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
) -> Result<LoftedSolid, MeshError> {
    loft_solid(outer, trims, loft)
        .map_err(|e| MeshError::Geometry(format!("the outer mould line: {e}")))
}

/// The outer surface parted at its silhouette along the pull of chord angle `angle`, and the
/// mould of two halves round it.
fn single_mould(
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    angle: Angle,
) -> Result<(LoftedSolid, MouldParts), MeshError> {
    let solid = loft_solid(&SilhouetteSurface::new(outer, angle), trims, loft)
        .map_err(|e| MeshError::Geometry(format!("the outer mould line: {e}")))?;
    let set = mould_parts(&solid, params, angle)?;
    Ok((solid, set))
}

/// What [`span_modules`] found: one pull for the whole span, or a mould of several modules.
enum Split {
    One(Angle),
    Many(ModularMould),
}

/// The mould split along the span (see [`choose_mould`]).
fn split_mould(
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    span: [f64; 2],
    prefer: Option<Angle>,
) -> Result<Split, MeshError> {
    let samples = (((span[1] - span[0]) / 4e-3).ceil() as usize).clamp(48, 240);
    let modules = span_modules(outer, span, samples, prefer)?;
    if let [only] = modules.as_slice() {
        return Ok(Split::One(only.pull_angle));
    }
    let mut solids = loft_modules(outer, trims, loft, &modules)?;
    if params.mould_expansion_factor != 1.0 {
        for s in &mut solids {
            s.mesh.scale(params.mould_expansion_factor);
        }
    }
    let mould = MouldParams {
        pull: [0.0, 0.0, 1.0],
        margin: params.mould_margin,
        tolerance: params.tolerance,
        min_draft: params.min_draft,
        unit: params.unit,
    };
    build_modular_mould(&solids, &modules, &mould).map(Split::Many)
}

/// Adds the parts of a mould split along the span to `parts`: `mould-<k>-upper` and
/// `mould-<k>-lower` for module k (root first), then the end pieces; the first module's halves,
/// the end pieces and the split.
fn push_modular_parts(
    mould: ModularMould,
    parts: &mut Vec<Part>,
) -> Result<([MouldHalf; 2], Vec<MouldHalf>, MouldModules), MeshError> {
    let (mut named, mut end_named) = (Vec::new(), Vec::new());
    let (mut halves, mut ends) = (Vec::new(), Vec::new());
    for (k, set) in mould.parts.into_iter().enumerate() {
        let [upper, lower] = set.half_meshes;
        named.push((format!("mould-{}-upper", k + 1), PartKind::MouldUpper, upper));
        named.push((format!("mould-{}-lower", k + 1), PartKind::MouldLower, lower));
        halves.extend(set.halves);
        for (mesh, piece) in set.end_pieces {
            end_named.push((
                format!("mould-{}", piece.side.replace(' ', "-")),
                PartKind::MouldEnd,
                mesh,
            ));
            ends.push(piece);
        }
    }
    for (name, kind, mesh) in named.into_iter().chain(end_named) {
        let nominal_volume = mesh.signed_volume();
        parts.push(Part { name, kind, mesh, nominal_volume });
    }
    let first: [MouldHalf; 2] = match halves.get(..2) {
        Some([a, b]) => [a.clone(), b.clone()],
        _ => return Err(MeshError::Geometry("a mould module without two halves".into())),
    };
    let split = MouldModules { modules: mould.modules, halves, block_size: mould.block_size };
    Ok((first, ends, split))
}

/// The casting mould of every core (see [`super::CastingMould`]); a core whose mould cannot be
/// made is named with the reason instead, and the rest of the tooling stands.
fn casting_moulds(
    cells: &[(CoreCell<'_>, Trims)],
    loft: &LoftParams,
    params: &ToolingParams,
    casting: &CastingParams,
    first: Angle,
    printing: bool,
) -> (Vec<CastingMould>, Vec<String>) {
    let (mut moulds, mut notes) = (Vec::new(), Vec::new());
    for (i, (cell, trims)) in cells.iter().enumerate() {
        let name = format!("core-{}", i + 1);
        let input = CastingInput {
            name: &name,
            cell,
            trims,
            loft,
            first,
            margin: params.mould_margin,
            tolerance: params.tolerance,
            min_draft: params.min_draft,
            unit: params.unit,
        };
        match casting_mould(&input, casting) {
            Ok(m) => moulds.push(m),
            Err(e) => notes.push(format!("{name}: no casting mould ({e})")),
        }
    }
    if printing && !moulds.is_empty() {
        notes.push(
            "the casting moulds cast the cores without their prints: the prints are not in them \
             yet"
            .into(),
        );
    }
    (moulds, notes)
}

/// Chooses the mould's pull and lofts the outer mould line parted for it; the pull's chord
/// angle ψ (the upper half is pulled along `(0, −sin ψ, cos ψ)`) and the mould parts. The
/// parting always follows the silhouette along the pull ([`super::parting`]), so a section whose
/// sides are graphs across the pull draws whatever its twist; what is left to choose is the
/// pull's angle about the pitch axis, tried in this order until the halves have no undercut
/// facet (the draft evaluator over their cavity facets, after the end pieces):
///
/// 1. normal to the chord at the middle station, for a sharp trailing edge (a section is then
///    turned against the pull by at most about half the twist);
/// 2. just beyond the greatest chord angle over the span (by 0.5°), then
/// 3. just beyond the least.
///
/// A blunt trailing edge skips the first: its flat base turns through the pull where a
/// section's chord angle equals the pull's, and no grid of rings parts a flat face exactly
/// there (the facets across that radius draw at a few hundredths of a degree either way).
/// With the pull beyond the range of chord angles, one corner of the base is the extreme
/// across the pull at every radius (for turns below 90° less the surface's slope at the
/// corner) and the base goes whole to one half. When no candidate removes every undercut, the
/// one with the least undercut area is kept and its undercuts are reported.
fn choose_pull(
    blade: &Blade,
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    pitch: Angle,
    span: [f64; 2],
) -> Result<(LoftedSolid, Angle, MouldParts), MeshError> {
    let n = 200;
    let (lo, hi) = (0..=n)
        .map(|i| outer.chord_angle(span[0] + (span[1] - span[0]) * i as f64 / n as f64).deg())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| (a.min(v), b.max(v)));
    let mut candidates = Vec::with_capacity(3);
    if outer.back == EndKind::Point {
        candidates.push(pull_angle(blade, pitch));
    }
    candidates.extend([Angle::from_deg(hi + 0.5), Angle::from_deg(lo - 0.5)]);
    let mut best: Option<(LoftedSolid, Angle, MouldParts, f64)> = None;
    let mut failed = None;
    for angle in candidates {
        // A pull that does not draw every section may part the surface where it folds: the
        // loft or the mould can fail there, and the next candidate (or the split along the
        // span, see `choose_mould`) is tried.
        let tried = loft_solid(&SilhouetteSurface::new(outer, angle), trims, loft)
            .map_err(|e| MeshError::Geometry(format!("the outer mould line: {e}")))
            .and_then(|solid| Ok((mould_parts(&solid, params, angle)?, solid)));
        let (set, solid) = match tried {
            Ok(t) => t,
            Err(e) => {
                failed.get_or_insert(e);
                continue;
            }
        };
        let undercut: f64 = set.halves.iter().map(|h| h.draft.undercut_area).sum();
        if best.as_ref().is_none_or(|b| undercut < b.3) {
            best = Some((solid, angle, set, undercut));
        }
        if undercut == 0.0 {
            break;
        }
    }
    let (solid, angle, set, _) = match (best, failed) {
        (Some(b), _) => b,
        (None, Some(e)) => return Err(e),
        (None, None) => return Err(MeshError::Geometry("no pull direction to try".into())),
    };
    Ok((solid, angle, set))
}

/// The mould parts of the outer solid: cavity scaled by the expansion factor, the upper half
/// pulled normal to a chord at `angle`.
fn mould_parts(
    outer: &LoftedSolid,
    params: &ToolingParams,
    angle: Angle,
) -> Result<MouldParts, MeshError> {
    let mut part = outer.clone();
    if params.mould_expansion_factor != 1.0 {
        part.mesh.scale(params.mould_expansion_factor);
    }
    let (s, c) = angle.rad().sin_cos();
    let mould = MouldParams {
        pull: [0.0, -s, c],
        margin: params.mould_margin,
        tolerance: params.tolerance,
        min_draft: params.min_draft,
        unit: params.unit,
    };
    // The parting lines are the outer surface's silhouette along the pull: the parting surface
    // runs on from them across the pull.
    build_mould_parts(&part, &|_x: f64| angle, &mould)
}

/// Adds the mould parts to `parts`; the halves' and the end pieces' descriptions.
fn push_mould_parts(set: MouldParts, parts: &mut Vec<Part>) -> ([MouldHalf; 2], Vec<MouldHalf>) {
    let [upper, lower] = set.half_meshes;
    let mut named = vec![
        ("mould-upper".to_string(), PartKind::MouldUpper, upper),
        ("mould-lower".to_string(), PartKind::MouldLower, lower),
    ];
    let mut ends = Vec::with_capacity(set.end_pieces.len());
    for (mesh, piece) in set.end_pieces {
        let name = format!("mould-{}", piece.side.replace(' ', "-"));
        named.push((name, PartKind::MouldEnd, mesh));
        ends.push(piece);
    }
    for (name, kind, mesh) in named {
        // A mould part is made as it is drawn: its volume is the part as written.
        let nominal_volume = mesh.signed_volume();
        parts.push(Part { name, kind, mesh, nominal_volume });
    }
    (set.halves, ends)
}

/// The chord angle the mould's pull is normal to: the chord's at the middle station.
fn pull_angle(blade: &Blade, pitch: Angle) -> Angle {
    let r_mid = 0.5 * (blade.root_radius() + blade.tip_radius());
    blade.twist(r_mid) + pitch
}

/// The least x of the root ring: where the root sphere meets the farthest line.
fn root_trim_x(solid: &LoftedSolid) -> f64 {
    solid
        .root_ring
        .iter()
        .map(|&v| solid.mesh.vertices[v as usize][0])
        .fold(f64::INFINITY, f64::min)
}

/// The greatest distance of the outer contour at `r` from the pitch axis, m (400 points a
/// surface, plus 1 %).
fn section_reach(surfaces: &BladeSurfaces<'_>, r: f64) -> f64 {
    let far = (0..=400)
        .flat_map(|i| {
            let u = i as f64 / 400.0;
            [surfaces.outer(r, Surface::Upper, u), surfaces.outer(r, Surface::Lower, u)]
        })
        .map(|p| p[0].hypot(p[1]))
        .fold(0.0, f64::max);
    1.01 * far
}

/// Web ends strictly inside the span, with the web laminate there, root first.
fn bulkheads(surfaces: &BladeSurfaces<'_>) -> Vec<Bulkhead> {
    let blade = surfaces.blade();
    let (r0, r1) = (blade.root_radius(), blade.tip_radius());
    let mut out: Vec<Bulkhead> = Vec::new();
    for (k, w) in blade.webs().iter().enumerate() {
        for r in [w.r_start, w.r_end] {
            if r > r0 + 1e-9 && r < r1 - 1e-9 {
                let thickness = surfaces.web_thickness(r, k);
                match out.iter_mut().find(|b| (b.r - r).abs() < 1e-9) {
                    Some(b) => b.thickness = b.thickness.max(thickness),
                    None => out.push(Bulkhead { r, thickness }),
                }
            }
        }
    }
    out.sort_by(|a, b| a.r.total_cmp(&b.r));
    out
}

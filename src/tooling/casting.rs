//! Core casting moulds: for each core, a block of two halves (and the end pieces its ends need)
//! round the core's cavity, with a pour sprue and a vent, in which the fusible core is cast.
//!
//! - **Cavity.** The core lofted again, parted at its silhouette along the casting mould's pull
//!   ([`super::SilhouetteSurface`]), and scaled by `1 + s` about the rotor centre, `s` the
//!   alloy's linear shrinkage (the casting shrinks back to the core's size as it cools), so the
//!   cavity's volume is the core's times `(1 + s)³`.
//! - **Parting and pull.** The block and its parts are those of the blade's own mould
//!   ([`super::build_mould_parts`]: two halves parted on a ruled surface from the silhouette,
//!   end pieces pulled along the span where a spherical end undercuts the halves, locating pins
//!   of our own). The pull's angle about the pitch axis is tried in the order the blade mould
//!   tries it: the blade mould's own pull first, then just beyond the greatest and the least
//!   chord angle of the core by the least draft and half a degree; the first whose parts have no
//!   cavity facet below the least draft is kept, else the one with the least undercut area, then
//!   the least area below the least draft (a web face is parallel to a pull normal to its
//!   chord, so a core bounded by a web drafts only with the pull turned off its chord angles).
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

use std::collections::HashMap;

use spade::{ConstrainedDelaunayTriangulation, Point2, Triangulation};

use super::grid::LoftParams;
use super::loft::{LoftedSolid, loft_solid};
use super::machining::to_machining_frame;
use super::mould::{MouldHalf, MouldParams, MouldParts, build_mould_parts};
use super::parting::SilhouetteSurface;
use super::surface::SpanSurface;
use super::trim::Trims;
use super::{MachinedPart, MachiningFrame};
use crate::mesh::LengthUnit;
use crate::mesh::Mesh;
use crate::mesh::MeshError;
use crate::mesh::orient::{compact, neighbours};
use crate::mesh::vec3::{self, P3};
use crate::units::Angle;

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
    pub margin: f64,
    pub tolerance: f64,
    pub min_draft: Angle,
    pub unit: LengthUnit,
}

/// Builds the casting mould of one core (see the module docs).
pub(crate) fn casting_mould(
    input: &CastingInput<'_>,
    params: &CastingParams,
) -> Result<CastingMould, MeshError> {
    let s = params.shrinkage;
    if !(-0.01..=0.06).contains(&s) {
        return Err(MeshError::Parameter {
            name: "core alloy shrinkage".into(),
            value: s,
            expected: "a linear shrinkage of -1 % to 6 %",
        });
    }
    let span = input.cell.span();
    let (lo, hi) = (0..=200)
        .map(|i| input.cell.chord_angle(span[0] + (span[1] - span[0]) * i as f64 / 200.0).deg())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| (a.min(v), b.max(v)));
    let turn = input.min_draft.deg() + 0.5;
    let candidates = [input.first, Angle::from_deg(hi + turn), Angle::from_deg(lo - turn)];
    let mut best: Option<(LoftedSolid, f64, Angle, MouldParts, [f64; 2])> = None;
    for angle in candidates {
        let solid =
            loft_solid(&SilhouetteSurface::new(input.cell, angle), input.trims, input.loft)?;
        let nominal = solid.mesh.signed_volume();
        let mut cavity = solid;
        cavity.mesh.scale(1.0 + s);
        let (sn, cs) = angle.rad().sin_cos();
        let mould = MouldParams {
            pull: [0.0, -sn, cs],
            margin: input.margin,
            tolerance: input.tolerance,
            min_draft: input.min_draft,
            unit: input.unit,
        };
        let set = build_mould_parts(&cavity, &|_x: f64| angle, &mould)?;
        let drafts =
            set.halves.iter().map(|h| &h.draft).chain(set.end_pieces.iter().map(|e| &e.1.draft));
        let score =
            drafts.fold([0.0, 0.0], |a, d| [a[0] + d.undercut_area, a[1] + d.below_min_area]);
        if best.as_ref().is_none_or(|b| score < b.4) {
            best = Some((cavity, nominal, angle, set, score));
        }
        if score == [0.0, 0.0] {
            break;
        }
    }
    let (cavity, core_volume, pull_angle, set, _) =
        best.ok_or_else(|| MeshError::Geometry("no pull to try".into()))?;
    let up = set.halves[0].pull;
    let cavity_volume = cavity.mesh.signed_volume();
    let MouldParts { half_meshes: [upper, lower], halves, end_pieces } = set;

    // The pouring position's frame: (a, b) across the pull, h along it.
    let e1 = {
        let x = [1.0, 0.0, 0.0];
        let v = vec3::sub(x, vec3::scale(up, vec3::dot(x, up)));
        vec3::scale(v, 1.0 / vec3::norm(v))
    };
    let e2 = vec3::cross(up, e1);
    let frame = Plan { e1, e2, up };

    let mesh = &cavity.mesh;
    let highest = mesh
        .triangles
        .iter()
        .flatten()
        .map(|&v| mesh.vertices[v as usize])
        .max_by(|p, q| vec3::dot(*p, up).total_cmp(&vec3::dot(*q, up)))
        .ok_or_else(|| MeshError::Empty { part: input.name.into() })?;
    let side = cavity.facets.side.clone();
    let eligible: Vec<bool> = (0..mesh.len())
        .map(|t| side.contains(&t) && vec3::dot(mesh.triangle_normal(t), up) >= FACING_UP)
        .collect();
    let adj = neighbours(mesh);
    let mut tops: Vec<u32> =
        (0..mesh.len()).filter(|&t| eligible[t]).flat_map(|t| mesh.triangles[t]).collect();
    tops.sort_unstable();
    tops.dedup();
    tops.sort_by(|&a, &b| {
        let h = |v: u32| vec3::dot(mesh.vertices[v as usize], up);
        h(b).total_cmp(&h(a))
    });
    // The channels narrow upwards at the least draft plus 1° (the upper half lifts off the
    // metal in them): the top has the set diameter, the foot is wider by the rise.
    let taper = (input.min_draft.deg() + 1.0).to_radians().tan();
    let z_top = upper.vertices.iter().map(|&p| vec3::dot(p, up)).fold(f64::NEG_INFINITY, f64::max);
    let place = |d: f64, avoid: &[usize], order: &[u32]| -> Result<Patch, MeshError> {
        for r in [0.5 * d, 0.25 * d, 0.125 * d] {
            for &v in order.iter().take(TRIES) {
                let p = mesh.vertices[v as usize];
                let c = frame.plan(p);
                let foot = r + (z_top - frame.height(p)) * taper;
                let Some(mut hole) = patch(mesh, &eligible, &adj, &frame, c, foot) else {
                    continue;
                };
                if hole.facets.iter().any(|t| avoid.contains(t)) {
                    continue;
                }
                // The wall keeps the taper down to the circle's lowest corner.
                let low =
                    hole.circle.iter().map(|&q| frame.height(q)).fold(f64::INFINITY, f64::min);
                hole.top_radius = foot - (z_top - low) * taper;
                if hole.top_radius >= 0.5 * r {
                    return Ok(hole);
                }
            }
        }
        Err(MeshError::Geometry(format!(
            "{}: no place on the upper surface of the cavity takes a hole of {:.1} mm or less",
            input.name,
            d * 1e3
        )))
    };
    let vent = place(params.vent_diameter, &[], &tops)?;
    // The sprue: highest in the half of the span away from the vent.
    let xs = mesh.vertices.iter().map(|p| p[0]);
    let (x0, x1) = xs.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), x| (a.min(x), b.max(x)));
    let x_vent = vent.entry[0];
    let far_root = x_vent - x0 > x1 - x_vent;
    let mid = 0.5 * (x0 + x1);
    let mut order: Vec<u32> = tops
        .iter()
        .copied()
        .filter(|&v| {
            let x = mesh.vertices[v as usize][0];
            if far_root { x <= mid } else { x >= mid }
        })
        .collect();
    let rest: Vec<u32> = tops.iter().copied().filter(|v| !order.contains(v)).collect();
    order.extend(rest);
    let sprue = place(params.sprue_diameter, &vent.facets, &order)?;

    // The holes cut into the metal and the upper half.
    let mut metal = mesh.clone();
    let mut half = upper;
    let mut channels = Vec::with_capacity(2);
    let mut outlets = Vec::with_capacity(2);
    let removed: Vec<usize> = vent.facets.iter().chain(&sprue.facets).copied().collect();
    let half_removed = matching_facets(&half, mesh, &removed)?;
    let mut half_new: Vec<[u32; 3]> = Vec::new();
    let mut metal_new: Vec<[u32; 3]> = Vec::new();
    let mut half_ids = position_ids(&half);
    for hole in [&sprue, &vent] {
        let (ring, annulus) = fill_patch(&mut metal, hole, &frame)?;
        metal_new.extend(annulus.iter().copied());
        let r_top = hole.top_radius;
        let top: Vec<P3> =
            circle(hole.centre, r_top).iter().map(|&q| frame.lift(q, z_top)).collect();
        let top_ids: Vec<u32> = top.iter().map(|&p| metal.push_vertex(p)).collect();
        // Wall (outward from the metal) and the cap at the top.
        let n = ring.len();
        for i in 0..n {
            let j = (i + 1) % n;
            metal_new.push([ring[i], ring[j], top_ids[j]]);
            metal_new.push([ring[i], top_ids[j], top_ids[i]]);
        }
        for i in 1..n - 1 {
            metal_new.push([top_ids[0], top_ids[i], top_ids[i + 1]]);
        }
        // The same facets, turned, for the half (its vertices found by position).
        // (The metal's top is open in the half: its facets are left out.)
        let first_new = metal_new.len() - annulus.len() - 2 * n - (n - 2);
        for tri in &metal_new[first_new..metal_new.len() - (n - 2)] {
            let ids = tri.map(|v| {
                let p = metal.vertices[v as usize];
                *half_ids.entry(key(p)).or_insert_with(|| half.push_vertex(p))
            });
            half_new.push([ids[0], ids[2], ids[1]]);
        }
        let entry = frame.lift(hole.centre, hole.entry_height);
        let outlet = frame.lift(hole.centre, z_top);
        let volume = channel_volume(&hole.circle, &top);
        channels.push((entry, outlet, 2.0 * hole.radius, 2.0 * r_top, volume));
        outlets.push(top);
    }
    metal.triangles = metal
        .triangles
        .iter()
        .enumerate()
        .filter(|(t, _)| !removed.contains(t))
        .map(|(_, t)| *t)
        .collect();
    metal.triangles.extend(metal_new);
    compact(&mut metal);
    // The top face of the upper half, holed by both outlets.
    let top_faces: Vec<usize> = (0..half.len())
        .filter(|&t| {
            half.triangles[t].iter().all(|&v| {
                (vec3::dot(half.vertices[v as usize], up) - z_top).abs()
                    <= 1e-9 * (1.0 + z_top.abs())
            })
        })
        .collect();
    let top_new = holed_face(&mut half, &top_faces, &outlets, &frame, &mut half_ids)?;
    half.triangles = half
        .triangles
        .iter()
        .enumerate()
        .filter(|(t, _)| !half_removed.contains(t) && !top_faces.contains(t))
        .map(|(_, t)| *t)
        .collect();
    half.triangles.extend(half_new);
    half.triangles.extend(top_new);
    compact(&mut half);

    let metal_volume = metal.signed_volume();
    let channel = |c: (P3, P3, f64, f64, f64)| Channel {
        entry: c.0,
        outlet: c.1,
        entry_diameter: c.2,
        outlet_diameter: c.3,
        volume: c.4,
    };
    let (sprue, vent) = (channel(channels[0]), channel(channels[1]));

    let b = halves[0].block_size;
    let block_volume = b[0] * b[1] * b[2];
    let mut parts = vec![
        CastPart { name: format!("{}-cast-upper", input.name), mesh: half, pull: halves[0].pull },
        CastPart { name: format!("{}-cast-lower", input.name), mesh: lower, pull: halves[1].pull },
    ];
    let mut ends = Vec::with_capacity(end_pieces.len());
    for (m, piece) in end_pieces {
        let name = format!("{}-cast-{}", input.name, piece.side.replace(' ', "-"));
        parts.push(CastPart { name, mesh: m, pull: piece.pull });
        ends.push(piece);
    }
    let mut machining = Vec::with_capacity(parts.len());
    for p in &parts {
        let (mesh, frame): (Mesh, MachiningFrame) =
            to_machining_frame(&p.mesh, vec3::scale(p.pull, -1.0))?;
        machining.push(MachinedPart {
            part: p.name.clone(),
            name: format!("{}-machining", p.name),
            mesh,
            frame,
        });
    }
    Ok(CastingMould {
        core: input.name.into(),
        pull_angle,
        up,
        shrinkage: s,
        core_volume,
        cavity_volume,
        metal_volume,
        highest,
        vent_shortfall: (vec3::dot(highest, up) - vec3::dot(vent.entry, up)).max(0.0),
        sprue,
        vent,
        halves,
        end_pieces: ends,
        block_volume,
        parts,
        metal,
        machining,
    })
}

/// The plane normal to the pull: `(a, b)` along `e1`, `e2`, height `h` along `up`.
struct Plan {
    e1: P3,
    e2: P3,
    up: P3,
}

impl Plan {
    fn plan(&self, p: P3) -> [f64; 2] {
        [vec3::dot(p, self.e1), vec3::dot(p, self.e2)]
    }
    fn height(&self, p: P3) -> f64 {
        vec3::dot(p, self.up)
    }
    fn lift(&self, q: [f64; 2], h: f64) -> P3 {
        vec3::add(
            vec3::add(vec3::scale(self.e1, q[0]), vec3::scale(self.e2, q[1])),
            vec3::scale(self.up, h),
        )
    }
}

/// A hole's place: its axis, radius, the cavity facets it replaces and the circle's corners
/// lifted onto them.
struct Patch {
    centre: [f64; 2],
    radius: f64,
    facets: Vec<usize>,
    circle: Vec<P3>,
    entry_height: f64,
    entry: P3,
    /// Radius at the top face (set once the circle is known).
    top_radius: f64,
}

fn circle(c: [f64; 2], r: f64) -> Vec<[f64; 2]> {
    (0..CIRCLE_SIDES)
        .map(|i| {
            let a = std::f64::consts::TAU * i as f64 / CIRCLE_SIDES as f64;
            [c[0] + r * a.cos(), c[1] + r * a.sin()]
        })
        .collect()
}

fn tri2(mesh: &Mesh, frame: &Plan, t: usize) -> [[f64; 2]; 3] {
    mesh.triangles[t].map(|v| frame.plan(mesh.vertices[v as usize]))
}

fn cross2(o: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
}

/// Barycentric coordinates of `p` in the plan triangle `t`, when inside (to round-off).
fn barycentric(t: [[f64; 2]; 3], p: [f64; 2]) -> Option<[f64; 3]> {
    let area = cross2(t[0], t[1], t[2]);
    if area.abs() < f64::MIN_POSITIVE {
        return None;
    }
    let w =
        [cross2(p, t[1], t[2]) / area, cross2(t[0], p, t[2]) / area, cross2(t[0], t[1], p) / area];
    w.iter().all(|&x| x >= -1e-12).then_some(w)
}

/// Whether the facet of a triangulation with corners `pts` and middle `mid` lies in the region
/// covered by the plan triangles `polys`: its middle strictly inside one, or, unless it is a
/// sliver (which round-off may put outside an outline by a hair), on one's edge.
fn taken(polys: &[[[f64; 2]; 3]], pts: [[f64; 2]; 3], mid: [f64; 2]) -> bool {
    let longest = (0..3).map(|k| vec3::dist_2d(pts[k], pts[(k + 1) % 3])).fold(0.0, f64::max);
    let sliver = cross2(pts[0], pts[1], pts[2]).abs() <= 1e-9 * longest * longest;
    polys.iter().any(|t| strictly_inside(*t, mid))
        || (!sliver && polys.iter().any(|t| barycentric(*t, mid).is_some()))
}

/// Whether `p` lies strictly inside the plan triangle `t` (a sliver's middle outside an outline
/// by round-off is not taken in).
fn strictly_inside(t: [[f64; 2]; 3], p: [f64; 2]) -> bool {
    let s = cross2(t[0], t[1], t[2]).signum();
    s != 0.0 && (0..3).all(|k| s * cross2(t[k], t[(k + 1) % 3], p) > 0.0)
}

/// Distance in plan from `p` to the triangle `t`.
fn dist_to_triangle(t: [[f64; 2]; 3], p: [f64; 2]) -> f64 {
    if barycentric(t, p).is_some() {
        return 0.0;
    }
    (0..3).map(|k| vec3::dist_to_segment_2d(p, t[k], t[(k + 1) % 3])).fold(f64::INFINITY, f64::min)
}

/// The patch of cavity facets round a hole of radius `r` about the plan point `c`, or `None`
/// where it would reach a facet that may not be holed.
fn patch(
    mesh: &Mesh,
    eligible: &[bool],
    adj: &[[(u32, bool); 3]],
    frame: &Plan,
    c: [f64; 2],
    r: f64,
) -> Option<Patch> {
    // The facet under the axis (the highest one there).
    let seed = (0..mesh.len())
        .filter(|&t| eligible[t] && barycentric(tri2(mesh, frame, t), c).is_some())
        .max_by(|&a, &b| {
            frame
                .height(mesh.triangle_centroid(a))
                .total_cmp(&frame.height(mesh.triangle_centroid(b)))
        })?;
    let mut inside = vec![false; mesh.len()];
    inside[seed] = true;
    let mut stack = vec![seed];
    let mut facets = vec![seed];
    while let Some(t) = stack.pop() {
        for &(nb, _) in &adj[t] {
            if nb == u32::MAX {
                return None;
            }
            let nb = nb as usize;
            if inside[nb] || dist_to_triangle(tri2(mesh, frame, nb), c) >= PATCH_REACH * r {
                continue;
            }
            if !eligible[nb] {
                return None;
            }
            inside[nb] = true;
            facets.push(nb);
            stack.push(nb);
        }
    }
    let height_at = |q: [f64; 2]| -> Option<f64> {
        facets.iter().find_map(|&t| {
            let w = barycentric(tri2(mesh, frame, t), q)?;
            let h = mesh.triangles[t].map(|v| frame.height(mesh.vertices[v as usize]));
            Some(w[0] * h[0] + w[1] * h[1] + w[2] * h[2])
        })
    };
    let mut ring = Vec::with_capacity(CIRCLE_SIDES);
    for q in circle(c, r) {
        ring.push(frame.lift(q, height_at(q)?));
    }
    let entry_height = height_at(c)?;
    Some(Patch {
        centre: c,
        radius: r,
        facets,
        circle: ring,
        entry_height,
        entry: frame.lift(c, entry_height),
        top_radius: r,
    })
}

/// Adds to `mesh` the circle's vertices and returns them with the facets (facing up) that
/// fill the hole's patch outside the circle.
fn fill_patch(
    mesh: &mut Mesh,
    hole: &Patch,
    frame: &Plan,
) -> Result<(Vec<u32>, Vec<[u32; 3]>), MeshError> {
    let fail = |what: &str| MeshError::Geometry(format!("a sprue or vent hole: {what}"));
    let mut cdt = ConstrainedDelaunayTriangulation::<Point2<f64>>::new();
    let mut ids: HashMap<usize, u32> = HashMap::new();
    let mut add = |cdt: &mut ConstrainedDelaunayTriangulation<Point2<f64>>, q: [f64; 2], v: u32| {
        let h = cdt.insert(Point2::new(q[0], q[1])).map_err(|e| fail(&format!("{e:?}")))?;
        if ids.insert(h.index(), v).is_some_and(|old| old != v) {
            return Err(fail("two points coincide in plan"));
        }
        Ok(h)
    };
    let mut corners: Vec<u32> = hole.facets.iter().flat_map(|&t| mesh.triangles[t]).collect();
    corners.sort_unstable();
    corners.dedup();
    // The outline: edges of the patch whose other facet is not in it.
    let mut edges: HashMap<(u32, u32), usize> = HashMap::new();
    for &t in &hole.facets {
        let tri = mesh.triangles[t];
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            *edges.entry((a.min(b), a.max(b))).or_insert(0) += 1;
        }
    }
    let outline: Vec<(u32, u32)> = edges.iter().filter(|e| *e.1 == 1).map(|e| *e.0).collect();
    let on_outline: std::collections::HashSet<u32> =
        outline.iter().flat_map(|&(a, b)| [a, b]).collect();
    let mut handle = HashMap::new();
    for &v in &corners {
        let q = frame.plan(mesh.vertices[v as usize]);
        let d = vec3::dist_2d(q, hole.centre);
        if on_outline.contains(&v) || d > 1.08 * hole.radius {
            handle.insert(v, add(&mut cdt, q, v)?);
        }
    }
    let ring: Vec<u32> = hole.circle.iter().map(|&p| mesh.push_vertex(p)).collect();
    let mut ring_h = Vec::with_capacity(ring.len());
    for &v in &ring {
        ring_h.push(add(&mut cdt, frame.plan(mesh.vertices[v as usize]), v)?);
    }
    let mut constrain = |a, b| {
        if a == b || !cdt.can_add_constraint(a, b) {
            return Err(fail("its outline crosses itself in plan"));
        }
        cdt.add_constraint(a, b);
        Ok(())
    };
    for &(a, b) in &outline {
        constrain(handle[&a], handle[&b])?;
    }
    for i in 0..ring_h.len() {
        constrain(ring_h[i], ring_h[(i + 1) % ring_h.len()])?;
    }
    let polys: Vec<[[f64; 2]; 3]> = hole.facets.iter().map(|&t| tri2(mesh, frame, t)).collect();
    let circle2: Vec<[f64; 2]> = hole.circle.iter().map(|&p| frame.plan(p)).collect();
    let mut tris = kept_faces(&cdt, &ids, &polys, std::slice::from_ref(&circle2))
        .ok_or_else(|| fail("a point was added"))?;
    settle(mesh, &mut tris, frame);
    Ok((ring, tris))
}

/// The facets of a constrained triangulation of a face (in plan) that lie on the face's own
/// facets `polys` and outside every hole, as mesh vertex triples through `ids`; `None` when the
/// triangulation added a point of its own.
fn kept_faces(
    cdt: &ConstrainedDelaunayTriangulation<Point2<f64>>,
    ids: &HashMap<usize, u32>,
    polys: &[[[f64; 2]; 3]],
    holes: &[Vec<[f64; 2]>],
) -> Option<Vec<[u32; 3]>> {
    let mut tris = Vec::new();
    for face in cdt.inner_faces() {
        let vs = face.vertices();
        let pts = vs.map(|v| [v.position().x, v.position().y]);
        let mid =
            [(pts[0][0] + pts[1][0] + pts[2][0]) / 3.0, (pts[0][1] + pts[1][1] + pts[2][1]) / 3.0];
        if !taken(polys, pts, mid) || holes.iter().any(|h| super::prints::inside(h, mid)) {
            continue;
        }
        let mut tri = [0u32; 3];
        for (k, v) in vs.iter().enumerate() {
            tri[k] = *ids.get(&v.fix().index())?;
        }
        tris.push(tri);
    }
    Some(tris)
}

/// Turns the slivers of a triangulation (a corner on the line of the other two, as round-off
/// leaves the collinear corners of a block face) over with their neighbour across the long
/// edge, or drops one with no neighbour there (it lies outside the outline by a hair); then
/// turns every facet to face up (counter-clockwise in plan). As the ports' caps do.
fn settle(mesh: &Mesh, tris: &mut Vec<[u32; 3]>, frame: &Plan) {
    let p = |v: u32| mesh.vertices[v as usize];
    // A turn may leave a sliver where more corners lie on one line: again, a few times.
    for _ in 0..16 {
        if !super::prints::unslither(mesh, tris) {
            break;
        }
    }
    for tri in tris.iter_mut() {
        let q = tri.map(|v| frame.plan(p(v)));
        if cross2(q[0], q[1], q[2]) < 0.0 {
            tri.swap(1, 2);
        }
    }
}

/// The facets of `face` (a plane face normal to the pull, facing up) retriangulated round the
/// `holes` (loops of points on it); new vertices are added to `mesh` and `ids`.
fn holed_face(
    mesh: &mut Mesh,
    face: &[usize],
    holes: &[Vec<P3>],
    frame: &Plan,
    ids_by_pos: &mut HashMap<[u64; 3], u32>,
) -> Result<Vec<[u32; 3]>, MeshError> {
    let fail =
        |what: &str| MeshError::Geometry(format!("the top face round a sprue or vent: {what}"));
    if face.is_empty() {
        return Err(fail("the upper half has no top face"));
    }
    let mut cdt = ConstrainedDelaunayTriangulation::<Point2<f64>>::new();
    let mut ids: HashMap<usize, u32> = HashMap::new();
    let mut edges: HashMap<(u32, u32), usize> = HashMap::new();
    for &t in face {
        let tri = mesh.triangles[t];
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            *edges.entry((a.min(b), a.max(b))).or_insert(0) += 1;
        }
    }
    let mut corners: Vec<u32> = face.iter().flat_map(|&t| mesh.triangles[t]).collect();
    corners.sort_unstable();
    corners.dedup();
    let mut handle = HashMap::new();
    for &v in &corners {
        let q = frame.plan(mesh.vertices[v as usize]);
        let h = cdt.insert(Point2::new(q[0], q[1])).map_err(|e| fail(&format!("{e:?}")))?;
        if ids.insert(h.index(), v).is_some_and(|o| o != v) {
            return Err(fail("two corners coincide"));
        }
        handle.insert(v, h);
    }
    for (&(a, b), &n) in &edges {
        if n == 1 {
            if !cdt.can_add_constraint(handle[&a], handle[&b]) {
                return Err(fail("its outline crosses itself"));
            }
            cdt.add_constraint(handle[&a], handle[&b]);
        }
    }
    let mut loops2 = Vec::with_capacity(holes.len());
    for hole in holes {
        let mut hs = Vec::with_capacity(hole.len());
        for &p in hole {
            let v = *ids_by_pos.entry(key(p)).or_insert_with(|| mesh.push_vertex(p));
            let q = frame.plan(p);
            let h = cdt.insert(Point2::new(q[0], q[1])).map_err(|e| fail(&format!("{e:?}")))?;
            if ids.insert(h.index(), v).is_some_and(|o| o != v) {
                return Err(fail("a hole meets a corner of the face"));
            }
            hs.push(h);
        }
        for i in 0..hs.len() {
            let (a, b) = (hs[i], hs[(i + 1) % hs.len()]);
            if !cdt.can_add_constraint(a, b) {
                return Err(fail("a hole crosses the face's outline or another hole"));
            }
            cdt.add_constraint(a, b);
        }
        loops2.push(hole.iter().map(|&p| frame.plan(p)).collect::<Vec<_>>());
    }
    let polys: Vec<[[f64; 2]; 3]> = face.iter().map(|&t| tri2(mesh, frame, t)).collect();
    let mut tris =
        kept_faces(&cdt, &ids, &polys, &loops2).ok_or_else(|| fail("a point was added"))?;
    settle(mesh, &mut tris, frame);
    Ok(tris)
}

/// Exact key of a point (the half keeps the cavity's coordinates bit for bit).
fn key(p: P3) -> [u64; 3] {
    p.map(f64::to_bits)
}

fn position_ids(mesh: &Mesh) -> HashMap<[u64; 3], u32> {
    let mut m = HashMap::with_capacity(mesh.vertices.len());
    for (i, &p) in mesh.vertices.iter().enumerate() {
        m.entry(key(p)).or_insert(i as u32);
    }
    m
}

/// The facets of `half` that are the facets `of` of `cavity` (same corners by position).
fn matching_facets(half: &Mesh, cavity: &Mesh, of: &[usize]) -> Result<Vec<usize>, MeshError> {
    let ids = position_ids(half);
    let mut by_corners: HashMap<[u32; 3], usize> = HashMap::with_capacity(half.len());
    for (t, tri) in half.triangles.iter().enumerate() {
        let mut s = *tri;
        s.sort_unstable();
        by_corners.insert(s, t);
    }
    of.iter()
        .map(|&t| {
            let mut s = [0u32; 3];
            for (k, &v) in cavity.triangles[t].iter().enumerate() {
                s[k] = *ids.get(&key(cavity.vertices[v as usize])).ok_or_else(|| {
                    MeshError::Geometry(
                        "a cavity facet under a hole is not in the upper half".into(),
                    )
                })?;
            }
            s.sort_unstable();
            by_corners.get(&s).copied().ok_or_else(|| {
                MeshError::Geometry("a cavity facet under a hole is not in the upper half".into())
            })
        })
        .collect()
}

/// Volume of a channel above the cavity surface: the closed solid of its wall, its top and the
/// circle's corners on the cavity fanned from the first (the cavity surface under the circle is
/// flat to within the tolerance's order).
fn channel_volume(ring: &[P3], top: &[P3]) -> f64 {
    let n = ring.len();
    let mut tris: Vec<[P3; 3]> = Vec::with_capacity(4 * n);
    for i in 0..n {
        let j = (i + 1) % n;
        tris.push([ring[i], ring[j], top[j]]);
        tris.push([ring[i], top[j], top[i]]);
    }
    for i in 1..n - 1 {
        tris.push([top[0], top[i], top[i + 1]]);
        tris.push([ring[0], ring[i + 1], ring[i]]);
    }
    tris.iter().map(|[a, b, c]| vec3::dot(*a, vec3::cross(*b, *c)) / 6.0).sum()
}

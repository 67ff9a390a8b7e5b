//! Two-part moulds: the halves of a block round a lofted part, split on a parting surface through
//! the part's front and back lines, with locating features of our own design, and the draft of
//! each half's cavity along its pull.
//!
//! **Parting.** The loop of [`PartingLines`] (front line root → tip, across the tip cap along the
//! middle of its columns, back line tip → root, across the root cap) separates the part's facets
//! into the upper side (reached from the upper chain without crossing the loop) and the lower.
//! The parting surface continues outward from the loop to the block's sides: along each
//! section's own chord line from the front and back lines, along ±X from the caps, with planar
//! patches in the block's corners (see [`super::mould_block`]); it twists with the part, so it
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
//! radius `m/6` where the axis meets the patch, height `m/3`.
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
//! **Span-wise modules** ([`build_modular_mould`]). Where no single pull draws every section
//! (a strongly cambered section turned through more twist than its window of drawing pulls,
//! see [`super::span_modules`]), the mould is made of modules along the span, each a mould of
//! two halves with its own pull and its own silhouette parting, all in one block (the frame of
//! the mean pull, one extent across the span); neighbouring modules meet flush on a plane
//! `x = const`, which every pull normal to the pitch axis slides along. Only the outer modules
//! have end pieces and corner patches for pins; the pins lean along their module's pull.
//!
//! [`PartingLines`]: super::PartingLines

use super::draft::{DraftReport, evaluate_draft};
use super::grid::LoftParams;
use super::loft::LoftedSolid;
use super::loft::loft_solid;
use super::mould_block::{Frame, Layout, Locator, build_half};
use super::parting::{SilhouetteSurface, SpanModule};
use super::surface::SpanSurface;
use super::trim::{EndTrim, Trims};
use crate::mesh::LengthUnit;
use crate::mesh::Mesh;
use crate::mesh::orient::{compact, neighbours, orient_outward};
use crate::mesh::vec3::{self, P3};
use crate::mesh::{MeshError, Place};
use crate::units::Angle;

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
    /// surface, rotor frame, m.
    pub locators: Vec<[f64; 3]>,
}

/// The parting loop's four sides (front root → tip, tip cap front → back, back tip → root,
/// root cap back → front), each with both end vertices, and the loop as one closed list.
fn parting_loop(part: &LoftedSolid) -> Result<([Vec<u32>; 4], Vec<u32>), MeshError> {
    let p = &part.parting;
    let sides = [
        p.front.clone(),
        p.tip.clone(),
        p.back.iter().rev().copied().collect::<Vec<u32>>(),
        p.root.iter().rev().copied().collect::<Vec<u32>>(),
    ];
    for k in 0..4 {
        let next = &sides[(k + 1) % 4];
        if sides[k].len() < 2 || sides[k].last() != next.first() {
            return Err(MeshError::Geometry(
                "the part has no closed parting loop (front, tip, back and root lines)".into(),
            ));
        }
    }
    let loop0 = sides.iter().flat_map(|s| s[..s.len() - 1].iter().copied()).collect();
    Ok((sides, loop0))
}

/// The facets on the upper side of the loop and those on the lower.
fn split_faces(mesh: &Mesh, loop0: &[u32], seed: u32) -> Result<[Vec<usize>; 2], MeshError> {
    let n = loop0.len();
    let mut barrier = std::collections::HashSet::with_capacity(n);
    for i in 0..n {
        let (a, b) = (loop0[i], loop0[(i + 1) % n]);
        barrier.insert((a.min(b), a.max(b)));
    }
    let adj = neighbours(mesh);
    let start = mesh
        .triangles
        .iter()
        .position(|t| t.contains(&seed))
        .ok_or_else(|| MeshError::Geometry("the upper line has no facet".into()))?;
    let mut upper = vec![false; mesh.len()];
    upper[start] = true;
    let mut stack = vec![start];
    while let Some(t) = stack.pop() {
        let tri = mesh.triangles[t];
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            let nb = adj[t][k].0;
            if nb == u32::MAX || barrier.contains(&(a.min(b), a.max(b))) || upper[nb as usize] {
                continue;
            }
            upper[nb as usize] = true;
            stack.push(nb as usize);
        }
    }
    // Every loop edge must have one facet on each side.
    for (t, tri) in mesh.triangles.iter().enumerate() {
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            let nb = adj[t][k].0;
            if nb != u32::MAX
                && barrier.contains(&(a.min(b), a.max(b)))
                && upper[t] == upper[nb as usize]
            {
                return Err(MeshError::Geometry(
                    "the parting loop does not divide the part into an upper and a lower side"
                        .into(),
                ));
            }
        }
    }
    let pick = |side: bool| (0..mesh.len()).filter(|&t| upper[t] == side).collect::<Vec<_>>();
    Ok([pick(true), pick(false)])
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

/// What the span-wise modules of one mould share: the block's frame, its extent across the
/// span (`[Y_a, Y_b, Z_bottom, Z_top]`, mould frame) and, per end (root, tip), the radius where
/// the module meets its neighbour (its block ends there, flush, and the part runs on through).
#[derive(Debug, Clone, Copy)]
struct Block {
    frame: Frame,
    yz: Option<[f64; 4]>,
    flush: [Option<f64>; 2],
}

fn build_mould_set(
    part: &LoftedSolid,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
    force: Option<[bool; 2]>,
    block: Option<&Block>,
) -> Result<MouldParts, MeshError> {
    let ez = unit_pull(params)?;
    let frame = block.map_or_else(|| frame_of(ez), |b| b.frame);
    let flush = block.map_or([None; 2], |b| b.flush);
    let (sides, loop0) = parting_loop(part)?;
    let seed = part.parting.upper[part.parting.upper.len() / 2];
    let faces = split_faces(&part.mesh, &loop0, seed)?;
    let pulls = [ez, vec3::scale(ez, -1.0)];
    // An end piece where a cap undercuts either half's pull (a facet turned away from it); a
    // flush end is open to the next module.
    let caps = [part.facets.root_cap.clone(), part.facets.tip_cap.clone()];
    let bored = force.unwrap_or_else(|| {
        [0, 1].map(|e| {
            (0..2).any(|k| {
                faces[k]
                    .iter()
                    .filter(|t| caps[e].contains(t))
                    .any(|&t| vec3::dot(part.mesh.triangle_normal(t), pulls[k]) < -DRAFT_ROUND_OFF)
            })
        })
    });
    let bored = [0, 1].map(|e| bored[e] || flush[e].is_some());
    let layout = layout(part, sides, &frame, chord_angle, params, block, bored, ez)?;
    let mut meshes = [Mesh::new(), Mesh::new()];
    let mut halves = Vec::with_capacity(2);
    for (k, upper) in [true, false].into_iter().enumerate() {
        let cavity: Vec<usize> = faces[k]
            .iter()
            .copied()
            .filter(|t| !(0..2).any(|e| bored[e] && caps[e].contains(t)))
            .collect();
        let mut lay = layout.clone();
        lay.bored = bored;
        for e in (0..2).filter(|&e| bored[e]) {
            // The half's share of the end ring replaces the cap's middle line: side 3 runs
            // back → front at the root, side 1 front → back at the tip.
            let s = if e == 0 { 3 } else { 1 };
            let ring = if e == 0 { &part.root_ring } else { &part.tip_ring };
            let (from, to) = (lay.sides[s][0], lay.sides[s][lay.sides[s].len() - 1]);
            let arc = ring_arc(&part.mesh, ring, from, to, &faces[k])?;
            let x_end = lay.ends[s][0][0];
            lay.ends[s] = arc
                .iter()
                .map(|&v| {
                    let q = frame.to_mould(part.mesh.vertices[v as usize]);
                    [x_end, q[1], q[2]]
                })
                .collect();
            lay.sides[s] = arc;
        }
        let mut mesh = build_half(&part.mesh, &cavity, &lay, &frame, upper);
        if flush.iter().any(Option::is_some) {
            // A flush end's rulings have no length and its corner patches no area: their
            // vertices are merged into the ring's and the collapsed facets dropped.
            mesh.weld(WELD)?;
        }
        orient_outward(&mut mesh);
        compact(&mut mesh);
        meshes[k] = mesh;
        let pull = pulls[k];
        let draft = evaluate_draft(&part.mesh, Some(&cavity), pull, params.min_draft, params.unit)?;
        let undercuts = undercut_regions(part, &draft, pull, params.unit);
        let cavity_area = cavity.iter().map(|&t| part.mesh.triangle_area(t)).sum();
        let c = &layout.corners;
        halves.push(MouldHalf {
            side: if upper { "upper" } else { "lower" },
            pull,
            draft,
            cavity_area,
            undercuts,
            block_size: [c[0][0] - c[3][0], c[1][1] - c[0][1], layout.z_top - layout.z_bottom],
            locators: layout.locators.iter().map(|l| frame.to_rotor(l.centre)).collect(),
        });
    }
    let [upper, lower]: [MouldHalf; 2] =
        halves.try_into().map_err(|_| MeshError::Geometry("two mould halves expected".into()))?;
    let mut end_pieces = Vec::new();
    for e in (0..2).filter(|&e| bored[e] && flush[e].is_none()) {
        let s = if e == 0 { 3 } else { 1 };
        let ring = if e == 0 { &part.root_ring } else { &part.tip_ring };
        let x_end = layout.ends[s][0][0];
        let cap: Vec<usize> = caps[e].clone().collect();
        let mesh = end_piece(&part.mesh, &cap, ring, x_end, &frame)?;
        let pull = if e == 0 { vec3::scale(frame.ex, -1.0) } else { frame.ex };
        let draft = evaluate_draft(&part.mesh, Some(&cap), pull, params.min_draft, params.unit)?;
        let undercuts = undercut_regions(part, &draft, pull, params.unit);
        let cavity_area = cap.iter().map(|&t| part.mesh.triangle_area(t)).sum();
        let b = mesh.bounding_box().map(|b| b.extent()).unwrap_or_default();
        end_pieces.push((
            mesh,
            MouldHalf {
                side: if e == 0 { "root end" } else { "tip end" },
                pull,
                draft,
                cavity_area,
                undercuts,
                block_size: [b[0], b[1], b[2]],
                locators: Vec::new(),
            },
        ));
    }
    Ok(MouldParts { half_meshes: meshes, halves: [upper, lower], end_pieces })
}

/// The vertices of the closed `ring` from `from` to `to` along the arc whose first edge borders
/// one of `faces` (the half's side facets).
fn ring_arc(
    mesh: &Mesh,
    ring: &[u32],
    from: u32,
    to: u32,
    faces: &[usize],
) -> Result<Vec<u32>, MeshError> {
    let n = ring.len();
    let missing = || MeshError::Geometry("the parting line does not meet the end ring".into());
    let i0 = ring.iter().position(|&v| v == from).ok_or_else(missing)?;
    ring.iter().position(|&v| v == to).ok_or_else(missing)?;
    let walk = |step: usize| -> Vec<u32> {
        let mut out = vec![from];
        let mut i = i0;
        loop {
            i = (i + step) % n;
            out.push(ring[i]);
            if ring[i] == to || out.len() > n {
                break;
            }
        }
        out
    };
    let borders = |a: u32, b: u32| {
        faces.iter().any(|&t| {
            let tri = mesh.triangles[t];
            (0..3).any(|k| {
                let (p, q) = (tri[k], tri[(k + 1) % 3]);
                (p == a && q == b) || (p == b && q == a)
            })
        })
    };
    let forward = walk(1);
    if borders(forward[0], forward[1]) {
        return Ok(forward);
    }
    let backward = walk(n - 1);
    if borders(backward[0], backward[1]) {
        return Ok(backward);
    }
    Err(MeshError::Geometry("no side of the end ring borders the mould half".into()))
}

/// An end piece: the cap's facets, the end ring carried along X to the block's end face `x_end`
/// (mould frame), and that face, closed and outward.
fn end_piece(
    part: &Mesh,
    cap: &[usize],
    ring: &[u32],
    x_end: f64,
    frame: &Frame,
) -> Result<Mesh, MeshError> {
    let mut mesh = Mesh { vertices: part.vertices.clone(), triangles: Vec::new() };
    mesh.triangles.extend(cap.iter().map(|&t| part.triangles[t]));
    let far: Vec<u32> = ring
        .iter()
        .map(|&v| {
            let q = frame.to_mould(part.vertices[v as usize]);
            mesh.push_vertex(frame.to_rotor([x_end, q[1], q[2]]))
        })
        .collect();
    let n = ring.len();
    let p = |m: &Mesh, v: u32| m.vertices[v as usize];
    for i in 0..n {
        let j = (i + 1) % n;
        let [a, b, c, d] = [ring[i], ring[j], far[j], far[i]];
        if vec3::dist(p(&mesh, a), p(&mesh, c)) <= vec3::dist(p(&mesh, b), p(&mesh, d)) {
            mesh.triangles.extend([[a, b, c], [a, c, d]]);
        } else {
            mesh.triangles.extend([[a, b, d], [b, c, d]]);
        }
    }
    let pts: Vec<[f64; 2]> = far
        .iter()
        .map(|&v| {
            let q = frame.to_mould(mesh.vertices[v as usize]);
            [q[1], q[2]]
        })
        .collect();
    let tris = crate::mesh::triangulate_polygon(&pts)?;
    mesh.triangles.extend(tris.iter().map(|t| t.map(|i| far[i])));
    orient_outward(&mut mesh);
    compact(&mut mesh);
    Ok(mesh)
}

/// Where everything lies (see [`Layout`]); `chord_angle(x)` turns the section at radius x.
#[allow(clippy::too_many_arguments)]
fn layout(
    part: &LoftedSolid,
    sides: [Vec<u32>; 4],
    frame: &Frame,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
    block: Option<&Block>,
    bored: [bool; 2],
    pull: P3,
) -> Result<Layout, MeshError> {
    let flush = block.map_or([None; 2], |b| b.flush);
    let q: Vec<P3> = part.mesh.vertices.iter().map(|&p| frame.to_mould(p)).collect();
    let (mut lo, mut hi) = ([f64::INFINITY; 3], [f64::NEG_INFINITY; 3]);
    for t in &part.mesh.triangles {
        for &v in t {
            for k in 0..3 {
                lo[k] = lo[k].min(q[v as usize][k]);
                hi[k] = hi[k].max(q[v as usize][k]);
            }
        }
    }
    let m = params.margin;
    let [mut xa, mut xb, mut ya, mut yb] = [lo[0] - m, hi[0] + m, lo[1] - m, hi[1] + m];
    if let Some(x) = flush[0] {
        xa = x;
    }
    if let Some(x) = flush[1] {
        xb = x;
    }
    if let Some([a, b, _, _]) = block.and_then(|b| b.yz) {
        (ya, yb) = (a, b);
    }
    let place = |v: u32| Place { point: part.mesh.vertices[v as usize], unit: params.unit };
    // Each side's vertices must advance steadily along it (X along the edges, Y across the caps).
    // (A bored end's side is replaced by the end ring.)
    for (s, line) in sides.iter().enumerate() {
        if (s == 3 && bored[0]) || (s == 1 && bored[1]) {
            continue;
        }
        let (axis, sign) = [(0, 1.0), (1, 1.0), (0, -1.0), (1, -1.0)][s];
        if let Some(w) = line
            .windows(2)
            .find(|w| (q[w[1] as usize][axis] - q[w[0] as usize][axis]) * sign <= 0.0)
        {
            return Err(MeshError::Geometry(format!(
                "the parting line doubles back near {}: the {} does not advance steadily",
                place(w[1]),
                ["front line", "tip cap's middle", "back line", "root cap's middle"][s]
            )));
        }
    }
    // Rulings: along the section's chord line from the front and back lines, along X from the
    // caps.
    let chord_ruling = |v: u32, aft: bool, y_face: f64| -> Result<P3, MeshError> {
        let p = part.mesh.vertices[v as usize];
        let (s, c) = chord_angle(p[0]).rad().sin_cos();
        let dir = vec3::scale([0.0, c, s], if aft { 1.0 } else { -1.0 });
        let d = [0.0, vec3::dot(dir, frame.ey), vec3::dot(dir, frame.ez)];
        let along = (y_face - q[v as usize][1]) / d[1];
        if !(d[1].abs() > 0.1 && along.is_finite() && along >= 0.0) {
            return Err(MeshError::Settings(format!(
                "the chord at {} is turned {:.1}° from the mould's parting direction: a two-part \
                 mould pulled normal to the middle chord cannot part there",
                place(v),
                d[2].atan2(d[1].abs()).to_degrees()
            )));
        }
        Ok(vec3::add(q[v as usize], vec3::scale(d, along)))
    };
    let ends: [Vec<P3>; 4] = [
        sides[0].iter().map(|&v| chord_ruling(v, false, ya)).collect::<Result<_, _>>()?,
        sides[1].iter().map(|&v| [xb, q[v as usize][1], q[v as usize][2]]).collect(),
        sides[2].iter().map(|&v| chord_ruling(v, true, yb)).collect::<Result<_, _>>()?,
        sides[3].iter().map(|&v| [xa, q[v as usize][1], q[v as usize][2]]).collect(),
    ];
    let last = |s: usize| ends[s][ends[s].len() - 1];
    let corners = [
        [xb, ya, last(0)[2]],
        [xb, yb, ends[2][0][2]],
        [xa, yb, last(2)[2]],
        [xa, ya, ends[0][0][2]],
    ];
    let parting_z = ends.iter().flatten().chain(corners.iter()).map(|p| p[2]);
    let mut z_top = parting_z.clone().fold(hi[2], f64::max) + m;
    let mut z_bottom = parting_z.fold(lo[2], f64::min) - m;
    if let Some([_, _, b, t]) = block.and_then(|b| b.yz) {
        (z_bottom, z_top) = (z_bottom.min(b), z_top.max(t));
    }
    // Pins lean along the pull where it is not the frame's Z (span-wise modules): `tan` of the
    // pull's angle from Z in the (Y, Z) plane.
    let lean = match block {
        Some(_) => vec3::dot(pull, frame.ey) / vec3::dot(pull, frame.ez),
        None => 0.0,
    };
    // Locating features at half the margin from the part's corner, on three corner patches.
    let (base, height) = (m / 6.0, m / 3.0);
    let taper = CONE_HALF_ANGLE_DEG.to_radians().tan();
    let segments = {
        let r = base + LOCATOR_CLEARANCE;
        let step = 2.0 * (1.0 - (params.tolerance / r).min(0.5)).acos();
        let n = (std::f64::consts::TAU / step).ceil().max(16.0) as usize;
        n.div_ceil(4) * 4
    };
    let mut locators = Vec::with_capacity(3);
    // A corner next to a flush end has no patch.
    let open = |c: usize| match c {
        0 | 1 => flush[1].is_none(),
        _ => flush[0].is_none(),
    };
    for corner in [3, 2, 1].into_iter().filter(|&c| open(c)) {
        let p = q[sides[corner][sides[corner].len() - 1] as usize];
        let k = corners[corner];
        let slope = (k[2] - p[2]) / (k[1] - p[1]);
        let (cx, cy) =
            (p[0] + 0.5 * m * (k[0] - p[0]).signum(), p[1] + 0.5 * m * (k[1] - p[1]).signum());
        let cz = p[2] + slope * (cy - p[1]);
        // The pin's axis along the pull: an affine lean that keeps the patch in place, by
        // `shear` per unit height above it along the patch's own Y direction (0, 1, slope).
        let shear = lean / (1.0 - slope * lean);
        let rise = (height + LOCATOR_CLEARANCE) * (1.0 + (slope * shear).max(0.0));
        if shear.is_nan() || shear.abs() >= 1.0 {
            return Err(MeshError::Settings(format!(
                "a module of the mould is pulled {:.1}° from its block's frame: its locating \
                 pins would lean too far",
                lean.atan().to_degrees()
            )));
        }
        if base - height * taper <= 0.0 || cz + rise >= z_top {
            return Err(MeshError::Settings(format!(
                "a mould margin of {:.1} mm leaves no room for the locating pins",
                m * 1e3
            )));
        }
        locators.push(Locator {
            corner,
            centre: [cx, cy, cz],
            slope,
            base,
            height,
            taper,
            clearance: LOCATOR_CLEARANCE,
            segments,
            shear,
        });
    }
    Ok(Layout { sides, ends, corners, z_top, z_bottom, margin: m, locators, bored: [false; 2] })
}

/// Connected regions of the undercut facets, largest first.
fn undercut_regions(
    part: &LoftedSolid,
    draft: &DraftReport,
    pull: P3,
    unit: LengthUnit,
) -> Vec<Undercut> {
    let mesh = &part.mesh;
    let mut under = vec![false; mesh.len()];
    for &t in &draft.undercuts {
        under[t] = true;
    }
    let adj = neighbours(mesh);
    let mut seen = vec![false; mesh.len()];
    let mut out = Vec::new();
    for &seed in &draft.undercuts {
        if seen[seed] {
            continue;
        }
        seen[seed] = true;
        let mut stack = vec![seed];
        let (mut area, mut worst, mut worst_t) = (0.0, f64::INFINITY, seed);
        let mut x_range = [f64::INFINITY, f64::NEG_INFINITY];
        let mut kinds = [false; 3];
        while let Some(t) = stack.pop() {
            area += mesh.triangle_area(t);
            let s = vec3::dot(mesh.triangle_normal(t), pull);
            if s < worst {
                worst = s;
                worst_t = t;
            }
            for p in mesh.corners(t) {
                x_range = [x_range[0].min(p[0]), x_range[1].max(p[0])];
            }
            let f = &part.facets;
            kinds[if f.root_cap.contains(&t) {
                1
            } else if f.tip_cap.contains(&t) {
                2
            } else {
                0
            }] = true;
            for &(nb, _) in &adj[t] {
                if nb != u32::MAX && under[nb as usize] && !seen[nb as usize] {
                    seen[nb as usize] = true;
                    stack.push(nb as usize);
                }
            }
        }
        let region = ["surface", "root end", "tip end"]
            .iter()
            .zip(kinds)
            .filter(|(_, k)| *k)
            .map(|(n, _)| *n)
            .collect::<Vec<_>>()
            .join(" and ");
        out.push(Undercut {
            area,
            worst: Angle::from_rad(worst.clamp(-1.0, 1.0).asin()),
            at: Place { point: mesh.triangle_centroid(worst_t), unit },
            x_range,
            region,
        });
    }
    out.sort_by(|a, b| b.area.total_cmp(&a.area));
    out
}

/// A mould of span-wise modules, each a mould of two halves pulled along its own direction
/// normal to the pitch axis (see [`super::span_modules`] for how the modules are found).
#[derive(Debug, Clone)]
pub struct ModularMould {
    /// The modules, root first.
    pub modules: Vec<SpanModule>,
    /// Each module's part: the surface parted at its own silhouette, ended by the blade's trim
    /// at the outer ends and by the plane `x = const` where it meets its neighbour.
    pub solids: Vec<LoftedSolid>,
    /// Each module's halves and end pieces (only the first module can have a root end piece and
    /// only the last a tip end piece).
    pub parts: Vec<MouldParts>,
    /// Size of the whole block (all modules together) along the common frame's X, Y and Z, m.
    pub block_size: [f64; 3],
}

/// Lofts each module of `surface` parted at its silhouette along its own pull (its extremes
/// sampled over the module's radii, the outer modules out to the surface's ends): the blade's
/// `trims` at the outer ends, planes at the radii where modules meet. The modules should cover
/// the surface's whole span (see [`super::span_modules`]).
pub fn loft_modules(
    surface: &dyn SpanSurface,
    trims: &Trims,
    loft: &LoftParams,
    modules: &[SpanModule],
) -> Result<Vec<LoftedSolid>, MeshError> {
    let last = modules.len().saturating_sub(1);
    modules
        .iter()
        .enumerate()
        .map(|(j, m)| {
            let t = Trims {
                root: if j == 0 { trims.root } else { EndTrim::Plane { x: m.x_range[0] } },
                tip: if j == last { trims.tip } else { EndTrim::Plane { x: m.x_range[1] } },
            };
            let span = surface.span();
            let range = [
                if j == 0 { span[0] } else { m.x_range[0] },
                if j == last { span[1] } else { m.x_range[1] },
            ];
            loft_solid(&SilhouetteSurface::over(surface, m.pull_angle, range), &t, loft)
                .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))
        })
        .collect()
}

/// The pull of a module of chord angle ψ: `(0, −sin ψ, cos ψ)`.
fn module_pull(psi: Angle) -> P3 {
    let (s, c) = psi.rad().sin_cos();
    [0.0, -s, c]
}

/// Builds a mould of span-wise modules round the module parts `solids` (from [`loft_modules`],
/// scaled as the cavity is to be): every module is a mould of two halves pulled along its own
/// pull and parted at its own silhouette, the modules in one block whose frame is pulled along
/// the mean of the modules' pulls, with one extent across the span; a module's block ends flush
/// at the plane where it meets its neighbour (that face is normal to the pitch axis, parallel to
/// every pull, so the modules slide apart along it). `params.pull` is not used. The locating pins
/// of a module lean along its pull; a module between two others has no corner patch for them
/// and so no pins (keys across the flush faces between modules are not made yet).
pub fn build_modular_mould(
    solids: &[LoftedSolid],
    modules: &[SpanModule],
    params: &MouldParams,
) -> Result<ModularMould, MeshError> {
    if solids.len() != modules.len() || modules.is_empty() {
        return Err(MeshError::Geometry(format!(
            "{} module parts for {} mould modules",
            solids.len(),
            modules.len()
        )));
    }
    // The block's frame: the mean pull angle (the modules' angles unwrapped from the first).
    let first = modules[0].pull_angle.deg();
    let mean = modules
        .iter()
        .map(|m| first + (m.pull_angle.deg() - first + 90.0).rem_euclid(180.0) - 90.0)
        .sum::<f64>()
        / modules.len() as f64;
    let frame = frame_of(module_pull(Angle::from_deg(mean)));
    let last = modules.len() - 1;
    let block_of = |j: usize, yz: Option<[f64; 4]>| Block {
        frame,
        yz,
        flush: [
            (j > 0).then_some(modules[j].x_range[0]),
            (j < last).then_some(modules[j].x_range[1]),
        ],
    };
    // First each module's own extent across the span, then all built in their union.
    let mut yz = [f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY];
    let mut x = [f64::INFINITY, f64::NEG_INFINITY];
    for (j, (part, m)) in solids.iter().zip(modules).enumerate() {
        let module = MouldParams { pull: module_pull(m.pull_angle), ..params.clone() };
        let psi = m.pull_angle;
        let (sides, _) = parting_loop(part)?;
        let b = block_of(j, None);
        // (Extents only: the caps' middles are not checked here.)
        let l = layout(part, sides, &frame, &|_x| psi, &module, Some(&b), [true; 2], module.pull)
            .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))?;
        yz = [
            yz[0].min(l.ends[0].iter().map(|p| p[1]).fold(f64::INFINITY, f64::min)),
            yz[1].max(l.ends[2].iter().map(|p| p[1]).fold(f64::NEG_INFINITY, f64::max)),
            yz[2].min(l.z_bottom),
            yz[3].max(l.z_top),
        ];
        x = [x[0].min(l.corners[3][0]), x[1].max(l.corners[0][0])];
    }
    // Then their heights with the parting surfaces carried out to the common faces Y_a, Y_b:
    // a ruling along a module's chord line climbs (or falls) the further it runs when the
    // module's pull is turned from the block's, so each module's top and bottom are found
    // again with those faces, and the block takes the highest top and the lowest bottom.
    let across = yz;
    for (j, (part, m)) in solids.iter().zip(modules).enumerate() {
        let module = MouldParams { pull: module_pull(m.pull_angle), ..params.clone() };
        let psi = m.pull_angle;
        let (sides, _) = parting_loop(part)?;
        let b = block_of(j, Some(across));
        let l = layout(part, sides, &frame, &|_x| psi, &module, Some(&b), [true; 2], module.pull)
            .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))?;
        yz = [yz[0], yz[1], yz[2].min(l.z_bottom), yz[3].max(l.z_top)];
    }
    let mut parts = Vec::with_capacity(modules.len());
    for (j, (part, m)) in solids.iter().zip(modules).enumerate() {
        let module = MouldParams { pull: module_pull(m.pull_angle), ..params.clone() };
        let psi = m.pull_angle;
        let set = build_mould_set(part, &|_x| psi, &module, None, Some(&block_of(j, Some(yz))))
            .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))?;
        parts.push(set);
    }
    Ok(ModularMould {
        modules: modules.to_vec(),
        solids: solids.to_vec(),
        parts,
        block_size: [x[1] - x[0], yz[1] - yz[0], yz[3] - yz[2]],
    })
}

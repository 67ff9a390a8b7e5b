//! The geometry of one mould half, in the mould frame (X along the pitch axis, Z along the upper
//! half's pull, Y = Z × X).
//!
//! The parting surface is ruled from the part's parting loop (four sides: front line root → tip,
//! tip cap, back line tip → root, root cap) out to the block's sides: from each front or back
//! vertex a straight ruling along its own section's chord line (forward at the front, aft at the
//! back) to the block face `Y = Y_a` or `Y = Y_b`; from each cap vertex a ruling along ±X to the
//! block's end face. Between neighbouring sides a planar corner patch (the end section's chord
//! line carried along X) fills the corner of the block. None of it can cut the part: a chord
//! ruling leaves its section in the section's own plane, and a cap ruling leaves the trim sphere
//! outward at the tip and inward at the root.
//!
//! A half is one closed surface: the part's facets on its side (the cavity wall), the parting
//! surface, the four block faces (each fanned from a row of vertices along its top edge, a
//! quarter of the margin apart) and the top (or bottom) face, a fan about its centre. Three corner patches carry the locating features
//! (see [`Locator`]). Facets are wound afterwards by `crate::mesh::orient::orient_outward`.

use super::flush::FlushKey;
use super::keys::WallKey;
use crate::mesh::vec3::{self, P3};
use crate::mesh::{Mesh, MeshError};

/// The orthonormal mould frame in the rotor frame.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Frame {
    pub ex: P3,
    pub ey: P3,
    pub ez: P3,
}

impl Frame {
    /// Mould coordinates of a rotor-frame point.
    pub fn to_mould(self, p: P3) -> P3 {
        [vec3::dot(p, self.ex), vec3::dot(p, self.ey), vec3::dot(p, self.ez)]
    }

    /// The rotor-frame point of mould coordinates `q`.
    pub fn to_rotor(self, q: P3) -> P3 {
        vec3::add(
            vec3::add(vec3::scale(self.ex, q[0]), vec3::scale(self.ey, q[1])),
            vec3::scale(self.ez, q[2]),
        )
    }
}

/// A locating feature on the corner patch after side `corner`: a conical pin on the lower half
/// with its axis along the pull, and a socket in the upper half, the pin grown by `clearance`
/// radially and on top. Lengths in m.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Locator {
    pub corner: usize,
    /// Axis position (X, Y) and the patch's height there.
    pub centre: P3,
    /// `dZ/dY` of the patch (it is level along X).
    pub slope: f64,
    /// Pin radius where the axis meets the patch.
    pub base: f64,
    /// Pin height above that point (its flat top).
    pub height: f64,
    /// `tan` of the half-angle.
    pub taper: f64,
    pub clearance: f64,
    /// Regular points on each circle (the four towards the patch's corners come besides).
    pub segments: usize,
    /// The pin's lean: a point at height `h` above the patch moves by `h · shear` along the
    /// patch's Y direction `(0, 1, slope)`, so its axis runs along the pull of a span-wise module
    /// pulled off the frame's Z (0 for a mould of two halves).
    pub shear: f64,
}

impl Locator {
    /// `q` leant along the pin's axis (see `shear`).
    fn lean(&self, q: P3) -> P3 {
        if self.shear == 0.0 {
            return q;
        }
        let h = q[2] - self.centre[2] - self.slope * (q[1] - self.centre[1]);
        [q[0], q[1] + h * self.shear, q[2] + self.slope * h * self.shear]
    }
}

/// Where everything of a half lies, mould frame.
#[derive(Debug, Clone)]
pub(crate) struct Layout {
    /// The parting loop's four sides as part vertices, each with both its end vertices.
    pub sides: [Vec<u32>; 4],
    /// The outer end of the ruling from every vertex of each side.
    pub ends: [Vec<P3>; 4],
    /// The block's corner on the parting surface after each side.
    pub corners: [P3; 4],
    /// Top of the upper block and bottom of the lower block.
    pub z_top: f64,
    pub z_bottom: f64,
    /// The block margin.
    pub margin: f64,
    /// Whether the root (`[0]`, side 3) and tip (`[1]`, side 1) ends have an end piece: the side
    /// is then the half's share of the end ring, its rulings the bore wall along X.
    pub bored: [bool; 2],
    pub locators: Vec<Locator>,
    /// The sockets of the end pieces' keys in a bored side (3 or 1), see `super::keys`.
    pub keys: Vec<(usize, WallKey)>,
    /// The keys or sockets across a flush side (3 or 1), see `super::flush`.
    pub flush_keys: Vec<(usize, FlushKey)>,
}

struct Half<'a> {
    mesh: Mesh,
    frame: &'a Frame,
}

impl Half<'_> {
    fn add(&mut self, q: P3) -> u32 {
        let p = self.frame.to_rotor(q);
        self.mesh.push_vertex(p)
    }

    fn mould(&self, v: u32) -> P3 {
        self.frame.to_mould(self.mesh.vertices[v as usize])
    }

    fn quad(&mut self, [a, b, c, d]: [u32; 4]) {
        // Split along the shorter diagonal.
        let p = |v: u32| self.mesh.vertices[v as usize];
        if vec3::dist(p(a), p(c)) <= vec3::dist(p(b), p(d)) {
            self.mesh.triangles.push([a, b, c]);
            self.mesh.triangles.push([a, c, d]);
        } else {
            self.mesh.triangles.push([a, b, d]);
            self.mesh.triangles.push([b, c, d]);
        }
    }
}

/// Builds one half: the part's `cavity` facets and the rest as in the module docs; `upper`
/// chooses the half above the parting surface (with sockets) or below it (with pins).
pub(crate) fn build_half(
    part: &Mesh,
    cavity: &[usize],
    layout: &Layout,
    frame: &Frame,
    upper: bool,
) -> Result<Mesh, MeshError> {
    let mut h =
        Half { mesh: Mesh { vertices: part.vertices.clone(), triangles: Vec::new() }, frame };
    h.mesh.triangles.extend(cavity.iter().map(|&t| part.triangles[t]));
    // The rulings of each side.
    let ends: Vec<Vec<u32>> =
        layout.ends.iter().map(|side| side.iter().map(|&q| h.add(q)).collect()).collect();
    // Sockets of the end pieces' keys: per side, the ruling they replace and the corners to
    // splice into the end face after that ruling's first end.
    let mut splices: Vec<(usize, usize, [u32; 4])> = Vec::new();
    for (s, (line, end)) in layout.sides.iter().zip(&ends).enumerate() {
        for j in 0..line.len() - 1 {
            let key =
                layout.keys.iter().find(|(ks, k)| *ks == s && k.edge == [line[j], line[j + 1]]);
            match key {
                Some((_, k)) => {
                    let ids = k.add(
                        &mut h.mesh,
                        frame,
                        [line[j], line[j + 1], end[j + 1], end[j]],
                        true,
                    )?;
                    splices.push((s, j, ids));
                }
                None => h.quad([line[j], line[j + 1], end[j + 1], end[j]]),
            }
        }
    }
    let corners: Vec<u32> = layout.corners.iter().map(|&q| h.add(q)).collect();
    // Corner patches, three with a locating feature.
    for s in 0..4 {
        let next = (s + 1) % 4;
        let patch = [
            layout.sides[s][layout.sides[s].len() - 1],
            ends[s][ends[s].len() - 1],
            corners[s],
            ends[next][0],
        ];
        match layout.locators.iter().find(|l| l.corner == s) {
            Some(loc) => locator(&mut h, patch, loc, upper),
            None => h.quad(patch),
        }
    }
    // Block faces: each side fanned from a row of top (or bottom) vertices a quarter of the
    // margin apart, each over the edge vertices nearest it, so no fan line runs far across the
    // parting surface's edge; the top (or bottom) face fanned from its centre.
    let zf = if upper { layout.z_top } else { layout.z_bottom };
    let far_corners: Vec<u32> = layout.corners.iter().map(|c| h.add([c[0], c[1], zf])).collect();
    let mut rim_far: Vec<u32> = Vec::new();
    for (s, side_ends) in ends.iter().enumerate() {
        let bored = match s {
            3 => layout.bored[0],
            1 => layout.bored[1],
            _ => false,
        };
        let (k0, k1) = ((s + 3) % 4, s);
        let mut chain = vec![corners[k0]];
        chain.extend_from_slice(side_ends);
        chain.push(corners[k1]);
        let axis = if s % 2 == 0 { 0 } else { 1 };
        let along: Vec<f64> = chain.iter().map(|&v| h.mould(v)[axis]).collect();
        let (a, b) = (along[0], along[along.len() - 1]);
        let count = ((b - a).abs() / (0.25 * layout.margin)).ceil().max(1.0) as usize;
        let (c0, c1) = (layout.corners[k0], layout.corners[k1]);
        let mut tops = vec![far_corners[k0]];
        for k in 1..count {
            let f = k as f64 / count as f64;
            let q = [c0[0] + f * (c1[0] - c0[0]), c0[1] + f * (c1[1] - c0[1]), zf];
            tops.push(h.add(q));
        }
        tops.push(far_corners[k1]);
        if bored {
            // An end face round the bore of an end piece: the chain may turn back along Y (round
            // a nose), so the face is triangulated as a polygon in (Y, Z).
            // Only the far corners on the far edge: points in a line would leave the ear
            // clipping a sliver.
            let mut ring: Vec<u32> = chain.clone();
            // A socket's mouth after its ruling's first end (chain index j + 1), last first so
            // the earlier indices hold.
            let mut mouths: Vec<&(usize, usize, [u32; 4])> =
                splices.iter().filter(|m| m.0 == s).collect();
            mouths.sort_by_key(|m| std::cmp::Reverse(m.1));
            for &(_, j, ids) in mouths {
                ring.splice(j + 2..j + 2, ids);
            }
            ring.push(far_corners[k1]);
            rim_far.push(far_corners[k0]);
            if let Some((_, fk)) = layout.flush_keys.iter().find(|(fs, _)| *fs == s) {
                let ids = fk.shape.map(|q| h.add(q));
                let [pa, qa, qb, pb, f] = ids;
                h.mesh.triangles.extend([[pa, qa, f], [qa, qb, f], [qb, pb, f]]);
                // The footprint `P F P` cut out of the flush face's outer edge, and the base
                // spliced into the top (bottom) face's rim, each in the edge's own order.
                let a_first = h.mould(far_corners[k0])[1] < h.mould(far_corners[k1])[1];
                if a_first {
                    ring.extend([pb, f, pa]);
                    rim_far.extend([pa, qa, qb, pb]);
                } else {
                    ring.extend([pa, f, pb]);
                    rim_far.extend([pb, qb, qa, pa]);
                }
            }
            ring.push(far_corners[k0]);
            let pts: Vec<[f64; 2]> = ring
                .iter()
                .map(|&v| {
                    let q = h.mould(v);
                    [q[1], q[2]]
                })
                .collect();
            if let Ok(tris) = crate::mesh::triangulate_polygon(&pts) {
                h.mesh.triangles.extend(tris.iter().map(|t| t.map(|i| ring[i])));
            }
            continue;
        }
        // The top nearest each edge vertex (in the order along the side).
        let nearest =
            |t: f64| (((t - a) / (b - a) * count as f64).round().clamp(0.0, count as f64)) as usize;
        for i in 0..chain.len() - 1 {
            let (g0, g1) = (nearest(along[i]), nearest(along[i + 1]));
            for g in g0..g1 {
                h.mesh.triangles.push([chain[i], tops[g + 1], tops[g]]);
            }
            h.mesh.triangles.push([chain[i], chain[i + 1], tops[g1]]);
        }
        rim_far.extend_from_slice(&tops[..tops.len() - 1]);
    }
    let centre = {
        let (mut x, mut y) = (0.0, 0.0);
        for &c in &layout.corners {
            x += 0.25 * c[0];
            y += 0.25 * c[1];
        }
        h.add([x, y, zf])
    };
    if !layout.flush_keys.is_empty() {
        // A key's base or a socket's mouth on the rim: the face as a polygon in (X, Y).
        let pts: Vec<[f64; 2]> = rim_far
            .iter()
            .map(|&v| {
                let q = h.mould(v);
                [q[0], q[1]]
            })
            .collect();
        let tris = crate::mesh::triangulate_polygon(&pts)?;
        h.mesh.triangles.extend(tris.iter().map(|t| t.map(|i| rim_far[i])));
        return Ok(h.mesh);
    }
    let n = rim_far.len();
    for i in 0..n {
        h.mesh.triangles.push([rim_far[i], rim_far[(i + 1) % n], centre]);
    }
    Ok(h.mesh)
}

/// A corner patch with a hole where the feature stands, and the pin (lower half) or the socket
/// (upper half).
fn locator(h: &mut Half<'_>, patch: [u32; 4], loc: &Locator, upper: bool) {
    let [cx, cy, cz] = loc.centre;
    let angle = |q: P3| (q[1] - cy).atan2(q[0] - cx);
    let mut sq: Vec<(f64, u32)> = patch.iter().map(|&v| (angle(h.mould(v)), v)).collect();
    sq.sort_by(|a, b| a.0.total_cmp(&b.0));
    // Ring angles: the four corner directions and the regular ones (half a step off the axes)
    // that are not within a quarter step of one of them.
    let step = std::f64::consts::TAU / loc.segments as f64;
    let apart = |a: f64| {
        sq.iter().all(|&(c, _)| {
            let d = (a - c).rem_euclid(std::f64::consts::TAU);
            d.min(std::f64::consts::TAU - d) > 0.25 * step
        })
    };
    let mut angles: Vec<(f64, Option<usize>)> = (0..loc.segments)
        .map(|i| -std::f64::consts::PI + (i as f64 + 0.5) * step)
        .filter(|&a| apart(a))
        .map(|a| (a, None))
        .collect();
    angles.extend(sq.iter().enumerate().map(|(k, &(a, _))| (a, Some(k))));
    angles.sort_by(|a, b| a.0.total_cmp(&b.0));
    let grow = if upper { loc.clearance } else { 0.0 };
    // Where the cone of radius r at the patch meets the tilted patch (the patch rises by
    // `slope · ρ sin θ` at distance ρ, the cone narrows by `taper` per unit height).
    let on_patch = |h: &mut Half<'_>, r: f64| -> Vec<u32> {
        angles
            .iter()
            .map(|&(a, _)| {
                let (s, c) = a.sin_cos();
                let rho = r / (1.0 + loc.slope * s * loc.taper);
                h.add([cx + rho * c, cy + rho * s, cz + loc.slope * rho * s])
            })
            .collect()
    };
    let hole = on_patch(h, loc.base + grow);
    let nr = hole.len();
    let corner_pos: Vec<usize> =
        (0..4).map(|k| angles.iter().position(|a| a.1 == Some(k)).unwrap_or(0)).collect();
    for k in 0..4 {
        let (a, b) = (corner_pos[k], corner_pos[(k + 1) % 4]);
        let len = (b + nr - a) % nr;
        let (sa, sb) = (sq[k].1, sq[(k + 1) % 4].1);
        let half = len / 2;
        for i in 0..len {
            let (p, q) = (hole[(a + i) % nr], hole[(a + i + 1) % nr]);
            h.mesh.triangles.push([p, q, if i < half { sa } else { sb }]);
        }
        h.mesh.triangles.push([sa, hole[(a + half) % nr], sb]);
    }
    // The conical wall and the flat end (the pin's top, the socket's floor).
    let z1 = cz + loc.height + grow;
    let r1 = loc.base + grow - (loc.height + grow) * loc.taper;
    let far: Vec<u32> = angles
        .iter()
        .map(|&(a, _)| {
            let (s, c) = a.sin_cos();
            h.add(loc.lean([cx + r1 * c, cy + r1 * s, z1]))
        })
        .collect();
    for i in 0..nr {
        let j = (i + 1) % nr;
        h.quad([hole[i], hole[j], far[j], far[i]]);
    }
    let c = h.add(loc.lean([cx, cy, z1]));
    for i in 0..nr {
        h.mesh.triangles.push([far[i], far[(i + 1) % nr], c]);
    }
}

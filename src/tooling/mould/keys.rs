//! Locating keys between an end piece and the halves: a wedge key of our own shape on the end
//! piece's wall, seated in a socket of the half it meets.
//!
//! **Shape.** The wall between an end piece and a half is the end ring carried along X to the
//! block's end face: planar facets, each spanned by one ring edge `a b` and its image `a' b'` on
//! the end face. On one such facet of each half's share of the ring the end piece carries a
//! five-cornered wedge: its base on the end face, a trapezoid `P_a Q_a Q_b P_b` (width `w` at the
//! wall, depth `δ = 0.4 w` across it, flanks leaning 10° inward), and its apex `F` on the wall at
//! `L = 1.5 w` inward from the end face, so the key runs out to nothing along the wall. Every
//! face of it but the base faces the blade's end (a component along the end piece's pull
//! reversed), so the end piece leaves along its pull with the keys; the base is open on the end
//! face. The half has the socket: the key scaled about the middle `M` of its base edge on the
//! wall by `λ = 1 + c / d_min`, `d_min` the least distance from `M` to the key's outer face and
//! flanks; the wall and the end face go through `M` and stay in place, every other face moves
//! out by `(λ − 1)` times its distance from `M`, the nearest by exactly the clearance `c` of the
//! pins and the others by more (a homothety keeps planes parallel and scales distances from its
//! centre).
//!
//! **Placement.** The facet is the widest one (key width `min(0.6 ℓ, m/4)` for an edge of length
//! `ℓ` and the margin `m`) whose middle lies in a window of the half's share of the ring counted
//! from the parting line's start at that end (the back line at the root, the front line at the
//! tip): 15–35 % for the upper half, 45–65 % for the lower. The two shares are walked the two
//! ways round the ring from that point, so a half turn of the end piece about its pull carries
//! the upper key to 65–85 % of the lower share, a mirror across the parting plane to 15–35 %,
//! a mirror across the pull to 65–85 % of the upper share: none onto a socket, even for a round
//! section whose bore fits every way.

use super::*;

/// Lean of a key's flanks from the normal of the wall.
const FLANK_DEG: f64 = 10.0;

/// A wedge key on one wall facet (see the module docs). Points in the mould frame, m.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct WallKey {
    /// The ring vertices of the facet's edge on the part, `a` then `b`.
    pub edge: [u32; 2],
    /// The key: `P_a, Q_a, Q_b, P_b` on the end face, `F` on the wall.
    pub key: [P3; 5],
    /// The socket: the key scaled about `centre`.
    pub socket: [P3; 5],
    /// `M`: the middle of the key's base edge on the wall.
    pub centre: P3,
    /// Unit direction along the facet (a to b) and inward along X, mould frame.
    along: P3,
    inward: P3,
}

/// Where along its share of the ring (from the parting line's start) each half's key stands:
/// the upper half's and the lower's.
pub(crate) const KEY_WINDOWS: [[f64; 2]; 2] = [[0.15, 0.35], [0.45, 0.65]];

/// The key on `arc` (the half's share of the closed `ring`, from the parting line's start at
/// this end) in the `window` of its length, on the end face `x_end` (mould frame); see the
/// module docs.
#[allow(clippy::too_many_arguments)]
pub(crate) fn wall_key(
    part: &Mesh,
    ring: &[u32],
    arc: &[u32],
    window: [f64; 2],
    x_end: f64,
    frame: &Frame,
    margin: f64,
    clearance: f64,
) -> Result<WallKey, MeshError> {
    let q = |v: u32| frame.to_mould(part.vertices[v as usize]);
    // The ring's winding in (Y, Z): its outward normal is on the right of a counter-clockwise edge.
    let pts: Vec<[f64; 2]> = ring.iter().map(|&v| [q(v)[1], q(v)[2]]).collect();
    let winding = crate::mesh::polygon_area(&pts).signum();
    let length = |j: usize| {
        let (a, b) = (q(arc[j]), q(arc[j + 1]));
        (a[1] - b[1]).hypot(a[2] - b[2])
    };
    let cum: Vec<f64> = std::iter::once(0.0)
        .chain((0..arc.len().saturating_sub(1)).scan(0.0, |s, j| {
            *s += length(j);
            Some(*s)
        }))
        .collect();
    let total = cum.last().copied().unwrap_or(0.0);
    let width = |j: usize| (0.6 * length(j)).min(0.25 * margin);
    let best = (0..arc.len().saturating_sub(1))
        .filter(|&j| {
            let f = 0.5 * (cum[j] + cum[j + 1]) / total;
            (window[0]..=window[1]).contains(&f)
        })
        .max_by(|&i, &j| width(i).total_cmp(&width(j)));
    let no_room = || {
        MeshError::Geometry(format!(
            "the end ring has no facet wide enough for a locating key against the clearance of \
             {:.2} mm",
            clearance * 1e3
        ))
    };
    let j = best.ok_or_else(no_room)?;
    let (a, b) = (q(arc[j]), q(arc[j + 1]));
    let l = length(j);
    let w = width(j);
    let along = [0.0, (b[1] - a[1]) / l, (b[2] - a[2]) / l];
    let ia = ring.iter().position(|&v| v == arc[j]).ok_or_else(no_room)?;
    let forward = ring[(ia + 1) % ring.len()] == arc[j + 1];
    let d = if forward { along } else { vec3::scale(along, -1.0) };
    let out = [0.0, winding * d[2], -winding * d[1]];
    let inward = [(a[0] - x_end).signum(), 0.0, 0.0];
    let room = (a[0] - x_end).abs().min((b[0] - x_end).abs());
    let (depth, reach) = (0.4 * w, 1.5 * w);
    let flank = depth * FLANK_DEG.to_radians().tan();
    let centre = [x_end, 0.5 * (a[1] + b[1]), 0.5 * (a[2] + b[2])];
    let at = |s: f64, e: f64, t: f64| {
        vec3::add(
            vec3::add(centre, vec3::scale(along, s)),
            vec3::add(vec3::scale(out, e), vec3::scale(inward, t)),
        )
    };
    let key = [
        at(-0.5 * w, 0.0, 0.0),
        at(-0.5 * w + flank, depth, 0.0),
        at(0.5 * w - flank, depth, 0.0),
        at(0.5 * w, 0.0, 0.0),
        at(0.0, 0.0, reach),
    ];
    let scale = grown(&key, centre, clearance).ok_or_else(no_room)?;
    if !(scale * w <= 0.95 * l && scale * reach <= 0.9 * room) {
        return Err(no_room());
    }
    let socket = key.map(|p| vec3::add(centre, vec3::scale(vec3::sub(p, centre), scale)));
    Ok(WallKey { edge: [arc[j], arc[j + 1]], key, socket, centre, along, inward })
}

/// The scale about `centre` (the middle of the base edge on the wall) that moves the nearest
/// of a wedge `key`'s outer face and flanks out by `clearance`: `1 + c / d_min`; `None` when
/// it is not finite.
pub(crate) fn grown(key: &[P3; 5], centre: P3, clearance: f64) -> Option<f64> {
    let plane_distance = |p: P3, r: P3, s: P3| {
        let n = vec3::cross(vec3::sub(r, p), vec3::sub(s, p));
        vec3::dot(vec3::sub(centre, p), n).abs() / vec3::norm(n)
    };
    let nearest = plane_distance(key[1], key[2], key[4])
        .min(plane_distance(key[0], key[1], key[4]))
        .min(plane_distance(key[3], key[2], key[4]));
    let scale = 1.0 + clearance / nearest;
    scale.is_finite().then_some(scale)
}

impl WallKey {
    /// Adds the key (`socket` false) or the socket to `mesh` (rotor frame) in place of the wall
    /// facet `a b b' a'` (vertex ids, `a b` as in `edge`): the facet less the key's footprint, the
    /// flanks and the outer face. Returns the ids of `P_a, Q_a, Q_b, P_b`, to be spliced into
    /// the end face between `a'` and `b'`.
    pub(crate) fn add(
        &self,
        mesh: &mut Mesh,
        frame: &Frame,
        facet: [u32; 4],
        socket: bool,
    ) -> Result<[u32; 4], MeshError> {
        let shape = if socket { &self.socket } else { &self.key };
        let ids = shape.map(|q| mesh.push_vertex(frame.to_rotor(q)));
        let [pa, qa, qb, pb, f] = ids;
        let [a, b, bf, af] = facet;
        // The facet with the footprint `P_b F P_a` cut out of its edge on the end face.
        let ring = [a, b, bf, pb, f, pa, af];
        let flat: Vec<[f64; 2]> = ring
            .iter()
            .map(|&v| {
                let r = vec3::sub(frame.to_mould(mesh.vertices[v as usize]), self.centre);
                [vec3::dot(r, self.along), vec3::dot(r, self.inward)]
            })
            .collect();
        let tris = crate::mesh::triangulate_polygon(&flat)?;
        mesh.triangles.extend(tris.iter().map(|t| t.map(|i| ring[i])));
        mesh.triangles.extend([[pa, qa, f], [qa, qb, f], [qb, pb, f]]);
        Ok([pa, qa, qb, pb])
    }

    /// The middle of the key's base edge, rotor frame, m.
    pub(crate) fn place(&self, frame: &Frame) -> P3 {
        frame.to_rotor(self.centre)
    }
}

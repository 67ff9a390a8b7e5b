//! Seats for core prints: the end piece at a printed end gets a pocket that holds each print.
//!
//! A print stands out of the part's end along the pitch axis (see [`crate::tooling::CorePrint`]),
//! so its seat lies in the end piece pulled along the span at that end, never in the halves: a
//! pocket along the pitch axis leaves the print as the end piece comes off along −X (root) or +X
//! (tip) when its walls lean inward towards the pocket's floor, which the print's taper gives
//! them (the taper is the least draft and 1°). A part whose end needs no end piece for its own
//! draft (a square end, parallel to the halves' pull) gets one all the same where a print
//! leaves: the halves pulled across the span could hold a print only if its section were parted
//! at its own silhouette, which a print's section is not made for.
//!
//! A [`Seat`] is a loop on the end trim (the hole in the cavity's end surface) and a loop of the
//! same corners in a plane `x = x_floor` (the pocket's floor). The part's end cap is replaced by
//! the cap holed by the seats (the holed caps of [`crate::tooling::CorePrint`]'s module), each
//! hole joined to its floor by a band of facets and the floor closed: the part and its seats as
//! one closed solid ([`seated_solid`]), whose new end surface becomes the end piece's cavity and
//! is drafted by the draft evaluator along the end piece's pull.

use super::halves::{build_mould_set, end_piece_part};
use super::*;
use crate::mesh::End;
use crate::tooling::prints::{band, cap_with_holes};

/// A pocket in an end piece: its hole on the end trim and its floor.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Seat {
    /// The hole's loop on the end trim, rotor frame, m.
    pub hole: Vec<P3>,
    /// The floor's loop, corner for corner with the hole, in the section plane `(y, z)`, m.
    pub floor: Vec<[f64; 2]>,
    /// The floor's plane `x = x_floor`, m.
    pub x_floor: f64,
}

/// The seats at one end of a part.
#[derive(Debug, Clone)]
pub(crate) struct SeatedEnd {
    /// Which end.
    pub end: End,
    /// The part's trim at that end (where its end ring lies).
    pub trim: EndTrim,
    /// The seats (none: the end keeps its cap).
    pub seats: Vec<Seat>,
    /// Largest facet side on the holed cap, m.
    pub max_side: f64,
}

/// `part` with its cap at `at.end` holed by the seats, each hole carried to its floor (closed,
/// outward); the side facets keep their indices and the cap ranges name the new caps.
pub(crate) fn seated_solid(part: &LoftedSolid, at: &SeatedEnd) -> Result<LoftedSolid, MeshError> {
    let f = &part.facets;
    if f.side.start != 0 || f.root_cap.start != f.side.end || f.tip_cap.start != f.root_cap.end {
        return Err(MeshError::Geometry(
            "a part to seat prints in must list its side, root cap and tip cap in order".into(),
        ));
    }
    let mut mesh = Mesh {
        vertices: part.mesh.vertices.clone(),
        triangles: part.mesh.triangles[f.side.clone()].to_vec(),
    };
    let mut ranges = [0..0, 0..0];
    for (k, end) in [End::Root, End::Tip].into_iter().enumerate() {
        let start = mesh.triangles.len();
        let (ring, cap) = match end {
            End::Root => (&part.root_ring, f.root_cap.clone()),
            End::Tip => (&part.tip_ring, f.tip_cap.clone()),
        };
        if end != at.end || at.seats.is_empty() {
            mesh.triangles.extend_from_slice(&part.mesh.triangles[cap]);
        } else {
            let holes: Vec<Vec<u32>> = at
                .seats
                .iter()
                .map(|s| s.hole.iter().map(|&p| mesh.push_vertex(p)).collect())
                .collect();
            cap_with_holes(&mut mesh, ring, &holes, at.trim, at.max_side)?;
            for (seat, hole) in at.seats.iter().zip(&holes) {
                if seat.floor.len() != hole.len() || hole.len() < 3 {
                    return Err(MeshError::Geometry(
                        "a print's seat has a floor of other corners than its hole".into(),
                    ));
                }
                let floor: Vec<u32> = seat
                    .floor
                    .iter()
                    .map(|q| mesh.push_vertex([seat.x_floor, q[0], q[1]]))
                    .collect();
                band(&mut mesh, hole, &floor);
                let plane = EndTrim::Plane { x: seat.x_floor };
                cap_with_holes(&mut mesh, &floor, &[], plane, f64::INFINITY)?;
            }
        }
        ranges[k] = start..mesh.triangles.len();
    }
    orient_outward(&mut mesh);
    let [root_cap, tip_cap] = ranges;
    Ok(LoftedSolid {
        mesh,
        facets: FacetRanges { side: f.side.clone(), root_cap, tip_cap },
        ..part.clone()
    })
}

/// The mould parts round `part` (see [`build_mould_parts`]) with the seats of `ends` in the end
/// pieces: an end piece where a print leaves even if the end would not need one, its cavity
/// the seated end surface (see the module docs).
pub(crate) fn build_seated_mould_parts(
    part: &LoftedSolid,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
    ends: &[SeatedEnd],
) -> Result<MouldParts, MeshError> {
    let set = build_mould_set(part, chord_angle, params, None, None)?;
    seat_mould_parts(set, part, chord_angle, params, ends)
}

/// Seats the prints of `ends` in the end pieces of `set`, a mould built round `part` by
/// [`build_mould_parts`]; where an end with seats has no end piece, the set is built again with
/// one there.
pub(crate) fn seat_mould_parts(
    mut set: MouldParts,
    part: &LoftedSolid,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
    ends: &[SeatedEnd],
) -> Result<MouldParts, MeshError> {
    let wanted = |e: End| ends.iter().any(|s| s.end == e && !s.seats.is_empty());
    let has = |set: &MouldParts, side: &str| set.end_pieces.iter().any(|p| p.1.side == side);
    let have = [has(&set, "root end"), has(&set, "tip end")];
    let need = [wanted(End::Root), wanted(End::Tip)];
    if (0..2).any(|e| need[e] && !have[e]) {
        let force = [have[0] || need[0], have[1] || need[1]];
        set = build_mould_set(part, chord_angle, params, Some(force), None)?;
    }
    for at in ends.iter().filter(|s| !s.seats.is_empty()) {
        reseat(&mut set, part, params, at)?;
    }
    Ok(set)
}

/// Replaces the end piece of `set` at `at.end` by one round the seated end of `part`.
pub(crate) fn reseat(
    set: &mut MouldParts,
    part: &LoftedSolid,
    params: &MouldParams,
    at: &SeatedEnd,
) -> Result<(), MeshError> {
    let side = match at.end {
        End::Root => "root end",
        End::Tip => "tip end",
    };
    let Some(k) = set.end_pieces.iter().position(|p| p.1.side == side) else {
        return Err(MeshError::Geometry(format!(
            "the mould has no {side} piece to seat a print in"
        )));
    };
    let sign = if at.end == End::Root { -1.0 } else { 1.0 };
    // The block's end face: the old piece's farthest point along the pull.
    let old = &set.end_pieces[k];
    let x_block =
        sign * old.0.vertices.iter().map(|p| sign * p[0]).fold(f64::NEG_INFINITY, f64::max);
    for seat in &at.seats {
        let room = sign * (x_block - seat.x_floor);
        if room.is_nan() || room < 2.0 * params.tolerance {
            return Err(MeshError::Settings(format!(
                "a core print reaches {:.1} mm from the mould block's {side} face: the mould margin \
                 leaves no floor under its seat (lengthen mould_margin_m or shorten \
                 core_print_length_mm)",
                room * 1e3
            )));
        }
    }
    let seated = seated_solid(part, at)?;
    // The keys and the frame of the set the halves' sockets were cut in.
    let keys = set.end_keys.get(k).cloned().unwrap_or_default();
    let root = at.end == End::Root;
    set.end_pieces[k] = end_piece_part(&seated, root, x_block, &set.frame, &keys, params)?;
    Ok(())
}

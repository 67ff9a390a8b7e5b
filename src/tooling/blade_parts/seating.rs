//! Seating the cores' prints in the blade's mould: each print's seat cut into the end piece at
//! its end (see the mould's seats), the end piece made where the end would not need one for its
//! own draft.

use super::*;
use crate::tooling::mould::{SeatedEnd, reseat, seat_mould_parts};
use crate::tooling::prints::{PrintedCore, SEAT_CLEARANCE, mould_seat, scaled_trim};

/// The mould `mould` (chosen round `outer`, the outer mould line, at the pull of chord angle
/// `angle`) with every print of `printed` seated in it; each seated print is given its seat's
/// clearance. A print at an end of a mould split along the span whose outer module has no end
/// piece there stays unseated (its drain plan says so).
pub(super) fn seat_prints(
    mould: Mould,
    outer: &LoftedSolid,
    angle: Angle,
    params: &ToolingParams,
    printed: &mut [PrintedCore],
    outer_trims: &Trims,
    max_side: f64,
) -> Result<Mould, MeshError> {
    if printed.is_empty() {
        return Ok(mould);
    }
    let f = params.mould_expansion_factor;
    let ends = [End::Root, End::Tip]
        .into_iter()
        .map(|end| {
            let seats = printed
                .iter()
                .filter(|p| p.print.end == end)
                .map(|p| mould_seat(&p.print, outer_trims.at(end), SEAT_CLEARANCE, f))
                .collect::<Result<Vec<_>, MeshError>>()?;
            Ok(SeatedEnd { end, trim: scaled_trim(outer_trims.at(end), f), seats, max_side })
        })
        .collect::<Result<Vec<_>, MeshError>>()?;
    let mould_params = MouldParams::pulled_at(
        angle,
        params.mould_margin,
        params.tolerance,
        params.min_draft,
        params.unit,
    );
    let mut seated = [false; 2];
    let mould = match mould {
        Mould::Whole(set) => {
            let mut part = outer.clone();
            if f != 1.0 {
                part.mesh.scale(f);
            }
            let set = seat_mould_parts(*set, &part, &|_x: f64| angle, &mould_params, &ends)
                .map_err(|e| MeshError::Geometry(format!("seating the core prints: {e}")))?;
            seated = [true; 2];
            Mould::Whole(Box::new(set))
        }
        Mould::Modular(mut m) => {
            let last = m.parts.len().saturating_sub(1);
            for (k, at) in ends.iter().enumerate().filter(|(_, a)| !a.seats.is_empty()) {
                let j = if k == 0 { 0 } else { last };
                let side = if k == 0 { "root end" } else { "tip end" };
                if let (Some(set), Some(solid)) = (m.parts.get_mut(j), m.solids.get(j)) {
                    if set.end_pieces.iter().any(|p| p.1.side == side) {
                        reseat(set, solid, &mould_params, at).map_err(|e| {
                            MeshError::Geometry(format!("seating the core prints: {e}"))
                        })?;
                        seated[k] = true;
                    }
                }
            }
            Mould::Modular(m)
        }
    };
    for p in printed.iter_mut() {
        let k = if p.print.end == End::Root { 0 } else { 1 };
        if seated[k] {
            p.print.seat_clearance = Some(SEAT_CLEARANCE);
        }
    }
    Ok(mould)
}

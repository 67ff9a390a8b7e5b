//! A print's seats: in the blade's mould, the print beyond the shell's outer end surface grown
//! by the seat's clearance across the pitch axis; in the core's casting mould, the whole print
//! from the core's end surface, scaled as the cavity is.

use super::*;
use crate::tooling::mould::Seat;

/// Clearance a side between a print and its seat in the blade's mould, across the pitch axis,
/// m: a sliding fit for a cast print, like the locating pins' (common practice). None at the
/// floor: the print's end face bears on it, which locates the core along the span.
pub(crate) const SEAT_CLEARANCE: f64 = 0.1e-3;

/// `trim` scaled by `s` about the rotor centre.
pub(crate) fn scaled_trim(trim: EndTrim, s: f64) -> EndTrim {
    match trim {
        EndTrim::Sphere { radius } => EndTrim::Sphere { radius: radius * s },
        EndTrim::Plane { x } => EndTrim::Plane { x: x * s },
    }
}

/// `poly` moved outward by `d` across each side.
fn grown(poly: &[[f64; 2]], d: f64) -> Result<Vec<[f64; 2]>, MeshError> {
    let m = inward_miters(poly)?;
    Ok(poly.iter().zip(&m).map(|(q, m)| [q[0] - d * m[0], q[1] - d * m[1]]).collect())
}

/// The seat of `print` in the blade's mould: the port grown by `clearance` and lifted onto the
/// outer mould line's trim `outer_trim`, down to the print's end face grown alike, all scaled by
/// `scale` about the rotor centre (the mould cavity's allowance).
pub(crate) fn mould_seat(
    print: &CorePrint,
    outer_trim: EndTrim,
    clearance: f64,
    scale: f64,
) -> Result<Seat, MeshError> {
    let port: Vec<[f64; 2]> = print.port.iter().map(|p| [p[1], p[2]]).collect();
    let hole = grown(&port, clearance)?
        .into_iter()
        .map(|q| lift_x(outer_trim, q).map(|p| vec3::scale(p, scale)))
        .collect::<Result<Vec<P3>, MeshError>>()?;
    let floor = grown(&print.outlet, clearance)?
        .into_iter()
        .map(|q| [q[0] * scale, q[1] * scale])
        .collect();
    Ok(Seat { hole, floor, x_floor: print.x_end * scale })
}

/// The seat of `print` in its core's casting mould: the whole print, from its entrance on the
/// core's trim `core_trim` to its end face, scaled by `scale` about the rotor centre (the
/// cavity's shrinkage allowance).
pub(crate) fn casting_seat(
    print: &CorePrint,
    core_trim: EndTrim,
    scale: f64,
) -> Result<Seat, MeshError> {
    let hole = print
        .section
        .iter()
        .map(|&q| lift_x(core_trim, q).map(|p| vec3::scale(p, scale)))
        .collect::<Result<Vec<P3>, MeshError>>()?;
    let floor = print.outlet.iter().map(|q| [q[0] * scale, q[1] * scale]).collect();
    Ok(Seat { hole, floor, x_floor: print.x_end * scale })
}

//! A print that cannot be made never costs the blade its tooling: a core whose print fails
//! (a cell nowhere deep enough for a tapered print) or whose printed body fails the solid check
//! (closed, outward, no self-intersection) is made without a print, and the reason is kept for
//! the summary.

use super::*;
use crate::mesh::{CheckParams, check_solid};

/// The core `solid` (named `name`) with its print at `end` (see [`print_core`]) when the print
/// can be made and the printed core bounds a solid; else the reason it cannot.
pub(crate) fn print_or_fall(
    name: &str,
    solid: &LoftedSolid,
    end: End,
    cell: &dyn SpanSurface,
    set: &PrintSetting,
) -> Result<PrintedCore, MeshError> {
    let printed = print_core(name, solid, end, cell, set)?;
    check_solid(&printed.mesh, "the printed core", &CheckParams::default())?;
    Ok(printed)
}

//! The output edge: the one place where files are written. Calculations return values (meshes,
//! bytes, text); the command line and the report write them through here.
//!
//! - Every file is written atomically ([`write_atomic`]: a temporary file in the same folder,
//!   flushed and synced, then a rename), so that a reader never sees half a file and a failed run
//!   leaves what was there before.
//! - A set of files written as a whole ([`FileSet`]): either the previous set stays untouched or
//!   the new set is complete.
//! - STL files of checked meshes ([`write_stl`], [`write_parts`]), the tooling manifest read back
//!   and the stale files of an earlier run ([`stale_files`], [`remove_stale`]), and the Matrix
//!   Market files of the modal model ([`export_matrix_market`]).

mod file_set;
mod manifest;
mod matrix_market;
mod stl;
mod write;

pub use file_set::{FileSet, SET_LIST, SetOutcome};
pub use manifest::{read_manifest, remove_stale, stale_files};
pub use matrix_market::export_matrix_market;
pub use stl::{
    write_part_set_with_progress, write_parts, write_parts_with_progress, write_stl,
    write_stl_digest,
};
pub use write::{ensure_folder, remove_leftovers, write_atomic, write_atomic_with};

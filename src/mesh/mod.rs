//! A general triangle-mesh kit that knows nothing of blades: points and vectors, the
//! indexed triangle mesh and its integral properties ([`Mesh`]), the checks a solid must pass
//! before it is written ([`check_solid`]: closed 2-manifold, outward, no degenerate facets, no
//! self-intersection, found through a spatial grid), the winding of a triangle soup outward,
//! planar polygons (area, ear clipping), and STL encoding in memory ([`encode_stl`],
//! [`encode_part_set_with_progress`]) with the SHA-256 digest of the bytes. Writing files is the
//! output edge's (`crate::output`).
//!
//! Lengths are metres; the [`LengthUnit`] of the output files is applied only when a mesh is
//! encoded, and places in errors are shown in it.
//!
//! ```
//! use layloft::mesh::{CheckParams, StlOptions, box_mesh, check_solid, encode_stl};
//!
//! # fn main() -> Result<(), layloft::mesh::MeshError> {
//! // A 0.1 x 0.2 x 0.3 m box: volume 0.006 m³, 12 facets, 84 + 50 × 12 bytes of binary STL.
//! let block = box_mesh([0.0; 3], [0.1, 0.2, 0.3]);
//! let summary = check_solid(&block, "block", &CheckParams::default())?;
//! assert!((summary.volume - 0.006).abs() < 1e-15 && summary.shells == 1);
//! let mut bytes = Vec::new();
//! encode_stl(&mut bytes, "block", &block, &StlOptions::default()).expect("in memory");
//! assert_eq!(bytes.len(), 84 + 50 * 12);
//! # Ok(())
//! # }
//! ```

mod check;
mod digest;
mod error;
pub(crate) mod intersect;
pub(crate) mod orient;
mod polygon;
mod queue;
mod sha_ni;
mod spatial;
mod stl;
#[cfg(test)]
pub(crate) mod test_rng;
mod triangles;
mod unit;
pub(crate) mod vec3;
mod word_hash;

pub use check::{CheckParams, MeshSummary, check_solid};
pub use digest::{Sha256, sha256_hex};
pub use error::{End, MeshError, Place};
pub use polygon::{polygon_area, triangulate_polygon};
pub use stl::{
    StlFormat, StlOptions, WrittenPart, binary_header, encode_part_set_knowing,
    encode_part_set_with_progress, encode_stl,
};
pub use triangles::{BoundingBox, Mesh, box_mesh};
pub use unit::LengthUnit;

pub(crate) use digest::DigestWriter;
pub(crate) use polygon::quad_centre_ok;
pub(crate) use queue::each_part;
pub(crate) use stl::{check_part_name, check_part_set};
pub(crate) use word_hash::{WordMap, WordSet};

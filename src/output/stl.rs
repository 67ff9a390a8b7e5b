//! STL files: one part written atomically ([`write_stl`]), or a set of parts, every one checked
//! before any is written ([`write_parts`]). The encoding and the checks are the mesh kit's
//! ([`crate::mesh::encode_stl`], [`crate::mesh::check_solid`]); here the bytes go to disk.

use std::path::Path;

use crate::Error;
use crate::mesh::{
    CheckParams, DigestWriter, Mesh, Sha256, StlOptions, WrittenPart, check_part_name,
    check_part_set, encode_stl,
};

/// Writes one part to `path` atomically. `name` (letters, digits, `-`, `_`) goes into the ASCII
/// `solid` line as `layloft-NAME`. The mesh is written as it is: check it first (see
/// [`write_parts`]).
pub fn write_stl(path: &Path, name: &str, mesh: &Mesh, options: &StlOptions) -> Result<(), Error> {
    write_stl_digest(path, name, mesh, options).map(|_| ())
}

/// [`write_stl`], giving the size in bytes and the SHA-256 digest of what was written.
pub fn write_stl_digest(
    path: &Path,
    name: &str,
    mesh: &Mesh,
    options: &StlOptions,
) -> Result<(u64, String), Error> {
    check_part_name(name).map_err(Error::Mesh)?;
    let mut digest = None;
    super::write_atomic_with(path, |w| {
        let mut d = DigestWriter { inner: w, digest: Sha256::new(), bytes: 0 };
        encode_stl(&mut d, name, mesh, options)?;
        digest = Some((d.bytes, d.digest));
        Ok(())
    })?;
    let (bytes, digest) = digest.unwrap_or_default();
    Ok((bytes, digest.finish_hex()))
}

/// Checks every part (see [`crate::mesh::check_solid`]) as computed and, except for self-intersection, as
/// rounded to single precision for the file; only when all pass writes each to
/// `DIR/NAME.stl`, creating `dir` if needed. A failed check writes nothing; each file is written
/// atomically, so none is ever half written (if the disk fails part-way, the files already
/// renamed into place are whole and the rest are untouched).
pub fn write_parts(
    dir: &Path,
    parts: &[(&str, &Mesh)],
    options: &StlOptions,
    check: &CheckParams,
) -> Result<Vec<WrittenPart>, Error> {
    write_parts_with_progress(dir, parts, options, check, &mut |_, _, _| {})
}

/// [`write_parts`], calling `progress(done, total, what)` after each part is checked and after
/// each file is written (`total` is twice the number of parts).
pub fn write_parts_with_progress(
    dir: &Path,
    parts: &[(&str, &Mesh)],
    options: &StlOptions,
    check: &CheckParams,
    progress: &mut dyn FnMut(usize, usize, &str),
) -> Result<Vec<WrittenPart>, Error> {
    write_part_set_with_progress(dir, parts, &[], options, check, progress)
}

/// [`write_parts_with_progress`] for `parts` and `copies`, rigid motions of parts among `parts`
/// (a mould part in its machining frame): a copy is checked like every part except for
/// self-intersection, which a rigid motion cannot create; all are checked before any is written.
pub fn write_part_set_with_progress(
    dir: &Path,
    parts: &[(&str, &Mesh)],
    copies: &[(&str, &Mesh)],
    options: &StlOptions,
    check: &CheckParams,
    progress: &mut dyn FnMut(usize, usize, &str),
) -> Result<Vec<WrittenPart>, Error> {
    let total = 2 * (parts.len() + copies.len());
    let mut done = check_part_set(parts, copies, &[], options, check, &mut |i, what| {
        progress(i, total, what);
    })
    .map_err(Error::Mesh)?;
    std::fs::create_dir_all(dir)
        .map_err(|source| Error::Write { path: dir.display().to_string(), source })?;
    let all: Vec<(&str, &Mesh)> = parts.iter().chain(copies).copied().collect();
    let n = all.len();
    for (i, (part, &(name, mesh))) in done.iter_mut().zip(&all).enumerate() {
        part.path = dir.join(&part.path);
        (part.size_bytes, part.sha256) = write_stl_digest(&part.path, name, mesh, options)?;
        progress(n + i + 1, total, &format!("wrote {name}.stl"));
    }
    Ok(done)
}

//! STL output: binary through `stl_io`, ASCII by our own writer, scaled to the output unit and
//! written atomically; and [`write_parts`], which checks every part before it writes any.
//!
//! STL stores single-precision coordinates without a unit; the unit the project names (mm by
//! default) is the scale applied here. Facet normals are the unit normals of the triangles as
//! they wind (outward for a checked solid).

use std::collections::HashMap;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::str::FromStr;

use super::check::{CheckParams, MeshSummary, check_solid};
use super::error::{MeshError, Place};
use super::manifest::{DigestWriter, Sha256};
use super::mesh::Mesh;
use crate::Error;
use crate::report::write_atomic_with;

/// The length unit of output files.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum LengthUnit {
    /// Millimetres (the default).
    #[default]
    Millimetre,
    /// Metres.
    Metre,
}

impl LengthUnit {
    /// Output units in one metre.
    pub fn per_metre(self) -> f64 {
        match self {
            LengthUnit::Millimetre => 1e3,
            LengthUnit::Metre => 1.0,
        }
    }

    /// The unit's symbol, as the project file spells it.
    pub fn symbol(self) -> &'static str {
        match self {
            LengthUnit::Millimetre => "mm",
            LengthUnit::Metre => "m",
        }
    }

    /// Decimals that show a micrometre.
    pub(crate) fn decimals(self) -> usize {
        match self {
            LengthUnit::Millimetre => 3,
            LengthUnit::Metre => 6,
        }
    }
}

impl FromStr for LengthUnit {
    type Err = MeshError;
    fn from_str(s: &str) -> Result<Self, MeshError> {
        match s.trim() {
            "mm" => Ok(LengthUnit::Millimetre),
            "m" => Ok(LengthUnit::Metre),
            other => Err(MeshError::Unit(other.to_string())),
        }
    }
}

/// Binary or ASCII STL.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum StlFormat {
    /// Binary STL (the default): 50 bytes a triangle.
    #[default]
    Binary,
    /// ASCII STL.
    Ascii,
}

/// How STL files are written.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct StlOptions {
    /// Unit of the coordinates in the file.
    pub unit: LengthUnit,
    /// Binary or ASCII.
    pub format: StlFormat,
}

fn facet(mesh: &Mesh, t: usize, s: f64) -> ([f32; 3], [[f32; 3]; 3]) {
    let n = mesh.triangle_normal(t).map(|c| c as f32);
    let v = mesh.corners(t).map(|p| p.map(|c| (c * s) as f32));
    (n, v)
}

/// The 80-byte header of a binary file: `layloft part NAME, unit UNIT` padded with spaces (it
/// never begins with `solid`, which some readers take for ASCII).
pub fn binary_header(name: &str, unit: LengthUnit) -> [u8; 80] {
    let mut header = [b' '; 80];
    let text = format!("layloft part {name}, unit {}", unit.symbol());
    let n = text.len().min(80);
    header[..n].copy_from_slice(&text.as_bytes()[..n]);
    header
}

/// Writes `mesh` as binary STL to `w`: the header, the facet count, then per facet the normal,
/// the three corners scaled to `unit` (little-endian `f32`) and a zero attribute word.
fn encode_binary(
    w: &mut dyn Write,
    name: &str,
    mesh: &Mesh,
    unit: LengthUnit,
) -> std::io::Result<()> {
    let count = u32::try_from(mesh.len())
        .map_err(|_| std::io::Error::other("more facets than binary STL can count"))?;
    w.write_all(&binary_header(name, unit))?;
    w.write_all(&count.to_le_bytes())?;
    let s = unit.per_metre();
    let mut record = [0u8; 50];
    for t in 0..mesh.len() {
        let (n, v) = facet(mesh, t, s);
        for (k, c) in n.iter().chain(v.iter().flatten()).enumerate() {
            record[4 * k..4 * k + 4].copy_from_slice(&c.to_le_bytes());
        }
        w.write_all(&record)?;
    }
    Ok(())
}

/// Writes `mesh` as ASCII STL to `w` under the solid name `name`.
fn encode_ascii(w: &mut dyn Write, name: &str, mesh: &Mesh, s: f64) -> std::io::Result<()> {
    writeln!(w, "solid {name}")?;
    for t in 0..mesh.len() {
        let (n, v) = facet(mesh, t, s);
        writeln!(w, "  facet normal {:e} {:e} {:e}", n[0], n[1], n[2])?;
        writeln!(w, "    outer loop")?;
        for p in v {
            writeln!(w, "      vertex {:e} {:e} {:e}", p[0], p[1], p[2])?;
        }
        writeln!(w, "    endloop")?;
        writeln!(w, "  endfacet")?;
    }
    writeln!(w, "endsolid {name}")
}

/// Encodes `mesh` as STL into `w` (no checks, no file): binary with the header
/// `layloft part NAME, unit UNIT`, or ASCII under the solid name `layloft-NAME`.
pub fn encode_stl(
    w: &mut dyn Write,
    name: &str,
    mesh: &Mesh,
    options: &StlOptions,
) -> std::io::Result<()> {
    let s = options.unit.per_metre();
    match options.format {
        StlFormat::Binary => encode_binary(w, name, mesh, options.unit),
        StlFormat::Ascii => encode_ascii(w, &format!("layloft-{name}"), mesh, s),
    }
}

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
    check_part_name(name)?;
    let mut digest = None;
    write_atomic_with(path, |w| {
        let mut d = DigestWriter { inner: w, digest: Sha256::new(), bytes: 0 };
        encode_stl(&mut d, name, mesh, options)?;
        digest = Some((d.bytes, d.digest));
        Ok(())
    })?;
    let (bytes, digest) = digest.unwrap_or_default();
    Ok((bytes, digest.finish_hex()))
}

fn check_part_name(name: &str) -> Result<(), MeshError> {
    let ok =
        !name.is_empty() && name.chars().all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_');
    if ok {
        Ok(())
    } else {
        Err(MeshError::Geometry(format!(
            "part name '{name}' must be letters, digits, '-' or '_' (it becomes a file name)"
        )))
    }
}

/// A part written by [`write_parts`].
#[derive(Debug, Clone, PartialEq)]
pub struct WrittenPart {
    /// The part's name.
    pub name: String,
    /// The file written.
    pub path: PathBuf,
    /// What the checks measured.
    pub summary: MeshSummary,
    /// Size of the file, bytes.
    pub size_bytes: u64,
    /// SHA-256 digest of the file, hexadecimal.
    pub sha256: String,
}

/// The mesh as the file will hold it: coordinates rounded to single precision in `unit`.
/// Fails when two used vertices round to the same point (a reader would join them).
fn as_written(mesh: &Mesh, part: &str, unit: LengthUnit) -> Result<Mesh, MeshError> {
    let s = unit.per_metre();
    let mut seen: HashMap<[u32; 3], usize> = HashMap::with_capacity(mesh.vertices.len());
    let mut used = vec![false; mesh.vertices.len()];
    mesh.triangles.iter().flatten().for_each(|&i| used[i as usize] = true);
    let mut rounded = Mesh {
        vertices: Vec::with_capacity(mesh.vertices.len()),
        triangles: mesh.triangles.clone(),
    };
    for (i, p) in mesh.vertices.iter().enumerate() {
        let q = p.map(|c| (c * s) as f32);
        if used[i]
            && let Some(&j) = seen.get(&q.map(f32::to_bits))
        {
            return Err(MeshError::Coincident {
                part: part.into(),
                a: j,
                b: i,
                at: Place { point: *p, unit },
            });
        }
        if used[i] {
            seen.insert(q.map(f32::to_bits), i);
        }
        rounded.vertices.push(q.map(|c| f64::from(c) / s));
    }
    Ok(rounded)
}

/// Checks every part (see [`check_solid`]) as computed and, except for self-intersection, as
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
    let mut done = check_part_set(parts, copies, options, check, &mut |i, what| {
        progress(i, total, what);
    })?;
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

/// Checks every part of `parts` and `copies` as [`write_part_set_with_progress`] does, then
/// encodes each as STL in memory: the parts with their files' contents (path `NAME.stl`,
/// relative), for a caller that puts the whole set in place itself, each file written once.
/// `progress(done, total, what)` is called after each part is checked and each is encoded.
pub fn encode_part_set_with_progress(
    parts: &[(&str, &Mesh)],
    copies: &[(&str, &Mesh)],
    options: &StlOptions,
    check: &CheckParams,
    progress: &mut dyn FnMut(usize, usize, &str),
) -> Result<Vec<(WrittenPart, Vec<u8>)>, Error> {
    let total = 2 * (parts.len() + copies.len());
    let done = check_part_set(parts, copies, options, check, &mut |i, what| {
        progress(i, total, what);
    })?;
    let all: Vec<(&str, &Mesh)> = parts.iter().chain(copies).copied().collect();
    let n = all.len();
    let mut out = Vec::with_capacity(n);
    for (i, (mut part, &(name, mesh))) in done.into_iter().zip(&all).enumerate() {
        let mut bytes = Vec::new();
        encode_stl(&mut bytes, name, mesh, options)
            .map_err(|e| Error::Mesh(MeshError::Geometry(format!("{name}: {e}"))))?;
        part.size_bytes = bytes.len() as u64;
        part.sha256 = super::manifest::sha256_hex(&bytes);
        out.push((part, bytes));
        progress(n + i + 1, total, &format!("encoded {name}.stl"));
    }
    Ok(out)
}

/// The checks of a part set (see [`write_part_set_with_progress`]); each part's path is
/// `NAME.stl`, relative. `progress(done, what)` after each part.
fn check_part_set(
    parts: &[(&str, &Mesh)],
    copies: &[(&str, &Mesh)],
    options: &StlOptions,
    check: &CheckParams,
    progress: &mut dyn FnMut(usize, &str),
) -> Result<Vec<WrittenPart>, Error> {
    let full = parts.len();
    let parts: Vec<(&str, &Mesh)> = parts.iter().chain(copies).copied().collect();
    let check = CheckParams { unit: options.unit, ..check.clone() };
    let mut done = Vec::with_capacity(parts.len());
    for (i, &(name, mesh)) in parts.iter().enumerate() {
        check_part_name(name)?;
        if parts[..i].iter().any(|&(other, _)| other == name) {
            return Err(MeshError::DuplicatePart(name.into()).into());
        }
        let own =
            CheckParams { self_intersection: check.self_intersection && i < full, ..check.clone() };
        let summary = check_solid(mesh, name, &own)?;
        let rounded = as_written(mesh, name, options.unit)?;
        check_solid(&rounded, name, &CheckParams { self_intersection: false, ..check.clone() })?;
        done.push(WrittenPart {
            name: name.into(),
            path: PathBuf::from(format!("{name}.stl")),
            summary,
            size_bytes: 0,
            sha256: String::new(),
        });
        progress(i + 1, &format!("checked {name}"));
    }
    Ok(done)
}

//! STL encoding in memory: binary and ASCII by our own writer, scaled to the output unit; and
//! [`encode_part_set_with_progress`], which checks every part of a set before it encodes any.
//! The files are written by the output edge (`crate::output`).
//!
//! STL stores single-precision coordinates without a unit; the unit the project names (mm by
//! default) is the scale applied here. Facet normals are the unit normals of the triangles as
//! they wind (outward for a checked solid).

use super::word_hash::WordMap;
use std::io::Write;
use std::path::PathBuf;

use super::check::{CheckParams, MeshSummary, check_moved, check_solid_keeping_shells};
use super::error::{MeshError, Place};
use super::queue::{each_part, in_order};
use super::triangles::Mesh;
use super::unit::LengthUnit;

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

pub(crate) fn check_part_name(name: &str) -> Result<(), MeshError> {
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

/// A part of a checked set: its file name and, once encoded or written, its size and digest.
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
    let mut seen: WordMap<[u32; 3], usize> =
        WordMap::with_capacity_and_hasher(mesh.vertices.len(), Default::default());
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

/// Checks every part of `parts` and `copies` as `output::write_part_set_with_progress` does, then
/// encodes each as STL in memory: the parts with their files' contents (path `NAME.stl`,
/// relative), for a caller that puts the whole set in place itself, each file written once.
/// `progress(done, total, what)` is called after each part is checked and each is encoded.
pub fn encode_part_set_with_progress(
    parts: &[(&str, &Mesh)],
    copies: &[(&str, &Mesh)],
    options: &StlOptions,
    check: &CheckParams,
    progress: &mut dyn FnMut(usize, usize, &str),
) -> Result<Vec<(WrittenPart, Vec<u8>)>, MeshError> {
    encode_part_set_knowing(parts, copies, &[], options, check, progress)
}

/// [`encode_part_set_with_progress`] where `clear[i]` says that part `i` of `parts` is, to the
/// bit, a mesh that has already passed the self-intersection test (see
/// [`crate::tooling::BladeTooling::known_clear`]): that test alone is not repeated for it (its
/// outcome depends on the mesh alone). Parts past the end of `clear` are tested.
pub fn encode_part_set_knowing(
    parts: &[(&str, &Mesh)],
    copies: &[(&str, &Mesh)],
    clear: &[bool],
    options: &StlOptions,
    check: &CheckParams,
    progress: &mut dyn FnMut(usize, usize, &str),
) -> Result<Vec<(WrittenPart, Vec<u8>)>, MeshError> {
    let total = 2 * (parts.len() + copies.len());
    let done = check_part_set(parts, copies, clear, options, check, &mut |i, what| {
        progress(i, total, what);
    })?;
    let all: Vec<(&str, &Mesh)> = parts.iter().chain(copies).copied().collect();
    let n = all.len();
    // Encoded and digested on all cores too, each file's bytes and digest its own.
    let encode = |i: usize| -> Result<(String, Vec<u8>), MeshError> {
        let (name, mesh) = all[i];
        let mut bytes = Vec::new();
        encode_stl(&mut bytes, name, mesh, options)
            .map_err(|e| MeshError::Geometry(format!("{name}: {e}")))?;
        Ok((super::digest::sha256_hex(&bytes), bytes))
    };
    let mut finished = 0;
    let encoded = in_order(each_part(n, encode, &mut |i, r| {
        if r.is_ok() {
            finished += 1;
            progress(n + finished, total, &format!("encoded {}.stl", all[i].0));
        }
    }))?;
    Ok(done
        .into_iter()
        .zip(encoded)
        .map(|(mut part, (sha256, bytes))| {
            part.size_bytes = bytes.len() as u64;
            part.sha256 = sha256;
            (part, bytes)
        })
        .collect())
}

/// The checks of a part set (see [`write_part_set_with_progress`]); each part's path is
/// `NAME.stl`, relative. A part `i` of `parts` with `clear[i]` has passed the self-intersection
/// test already (see [`encode_part_set_knowing`]). `progress(done, what)` after each part.
pub(crate) fn check_part_set(
    parts: &[(&str, &Mesh)],
    copies: &[(&str, &Mesh)],
    clear: &[bool],
    options: &StlOptions,
    check: &CheckParams,
    progress: &mut dyn FnMut(usize, &str),
) -> Result<Vec<WrittenPart>, MeshError> {
    let full = parts.len();
    let parts: Vec<(&str, &Mesh)> = parts.iter().chain(copies).copied().collect();
    let check = CheckParams { unit: options.unit, ..check.clone() };
    // The parts are checked on all cores (see `queue`); the first failure in the parts' order
    // is reported, as a check of one part after the other would find it.
    let one = |i: usize| -> Result<WrittenPart, MeshError> {
        let (name, mesh) = parts[i];
        check_part_name(name)?;
        if parts[..i].iter().any(|&(other, _)| other == name) {
            return Err(MeshError::DuplicatePart(name.into()));
        }
        let tested = i < full && !clear.get(i).copied().unwrap_or(false);
        let own =
            CheckParams { self_intersection: check.self_intersection && tested, ..check.clone() };
        // The part, then the part as the file holds it (coordinates rounded; two vertices that
        // round to one point fail in between): the triangles are the same, so what they alone
        // decide is checked once.
        let (summary, shells) = check_solid_keeping_shells(mesh, name, &own)?;
        let rounded = as_written(mesh, name, options.unit)?;
        let written = CheckParams { self_intersection: false, ..check.clone() };
        check_moved(&rounded, mesh, &shells, name, &written)?;
        Ok(WrittenPart {
            name: name.into(),
            path: PathBuf::from(format!("{name}.stl")),
            summary,
            size_bytes: 0,
            sha256: String::new(),
        })
    };
    let mut finished = 0;
    let results = each_part(parts.len(), one, &mut |i, r| {
        if r.is_ok() {
            finished += 1;
            progress(finished, &format!("checked {}", parts[i].0));
        }
    });
    in_order(results)
}

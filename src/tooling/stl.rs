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

/// Writes `mesh` as binary STL to `w`, coordinates scaled by `s` (output units per metre).
fn encode_binary(w: &mut dyn Write, mesh: &Mesh, s: f64) -> std::io::Result<()> {
    let facets = (0..mesh.len()).map(|t| {
        let (n, v) = facet(mesh, t, s);
        stl_io::Triangle { normal: stl_io::Normal::new(n), vertices: v.map(stl_io::Vertex::new) }
    });
    stl_io::write_stl(&mut &mut *w, facets)
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

/// Encodes `mesh` as STL into `w` (no checks, no file): binary, or ASCII under the solid name
/// `layloft-NAME`.
pub fn encode_stl(
    w: &mut dyn Write,
    name: &str,
    mesh: &Mesh,
    options: &StlOptions,
) -> std::io::Result<()> {
    let s = options.unit.per_metre();
    match options.format {
        StlFormat::Binary => encode_binary(w, mesh, s),
        StlFormat::Ascii => encode_ascii(w, &format!("layloft-{name}"), mesh, s),
    }
}

/// Writes one part to `path` atomically. `name` (letters, digits, `-`, `_`) goes into the ASCII
/// `solid` line as `layloft-NAME`. The mesh is written as it is: check it first (see
/// [`write_parts`]).
pub fn write_stl(path: &Path, name: &str, mesh: &Mesh, options: &StlOptions) -> Result<(), Error> {
    check_part_name(name)?;
    write_atomic_with(path, |w| encode_stl(w, name, mesh, options))
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
    let total = 2 * parts.len();
    let check = CheckParams { unit: options.unit, ..check.clone() };
    let mut done = Vec::with_capacity(parts.len());
    for (i, &(name, mesh)) in parts.iter().enumerate() {
        check_part_name(name)?;
        if parts[..i].iter().any(|&(other, _)| other == name) {
            return Err(MeshError::DuplicatePart(name.into()).into());
        }
        let summary = check_solid(mesh, name, &check)?;
        let rounded = as_written(mesh, name, options.unit)?;
        check_solid(&rounded, name, &CheckParams { self_intersection: false, ..check.clone() })?;
        done.push(WrittenPart {
            name: name.into(),
            path: dir.join(format!("{name}.stl")),
            summary,
        });
        progress(i + 1, total, &format!("checked {name}"));
    }
    std::fs::create_dir_all(dir)
        .map_err(|source| Error::Write { path: dir.display().to_string(), source })?;
    for (i, (part, &(name, mesh))) in done.iter().zip(parts).enumerate() {
        write_stl(&part.path, name, mesh, options)?;
        progress(parts.len() + i + 1, total, &format!("wrote {name}.stl"));
    }
    Ok(done)
}

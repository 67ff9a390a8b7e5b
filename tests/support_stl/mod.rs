//! An STL reading of a mesh that shares no code with the generator: the file is read with
//! `stl_io`, and closedness, 2-manifold edges, orientation and volume are judged here.
#![allow(dead_code)]

use std::collections::HashMap;
use std::path::Path;

/// What an independent reading finds in a mesh read from STL.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StlReading {
    /// Triangles in the file.
    pub triangles: usize,
    /// Every undirected edge is used exactly twice, once in each direction (closed, 2-manifold,
    /// consistently oriented).
    pub closed_oriented: bool,
    /// Signed volume by the divergence theorem, in the file's unit cubed.
    pub volume: f64,
}

/// Judges a mesh as `stl_io` indexes it (vertices merged where their coordinates are equal).
pub fn closed_outward(mesh: &stl_io::IndexedMesh) -> (bool, f64) {
    let mut directed: HashMap<(usize, usize), i32> = HashMap::new();
    for f in &mesh.faces {
        let v = f.vertices;
        for k in 0..3 {
            *directed.entry((v[k], v[(k + 1) % 3])).or_default() += 1;
        }
    }
    let manifold = directed.iter().all(|(&(a, b), &n)| n == 1 && directed.get(&(b, a)) == Some(&1));
    let mut vol = 0.0;
    for f in &mesh.faces {
        let p = f.vertices.map(|i| mesh.vertices[i].0.map(f64::from));
        let cross = [
            p[1][1] * p[2][2] - p[1][2] * p[2][1],
            p[1][2] * p[2][0] - p[1][0] * p[2][2],
            p[1][0] * p[2][1] - p[1][1] * p[2][0],
        ];
        vol += (p[0][0] * cross[0] + p[0][1] * cross[1] + p[0][2] * cross[2]) / 6.0;
    }
    (manifold, vol)
}

/// Reads an STL file (binary or ASCII) and judges it.
pub fn read_stl_file(path: &Path) -> StlReading {
    let mut file = std::fs::File::open(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    let mesh = stl_io::read_stl(&mut file).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    let (closed_oriented, volume) = closed_outward(&mesh);
    StlReading { triangles: mesh.faces.len(), closed_oriented, volume }
}

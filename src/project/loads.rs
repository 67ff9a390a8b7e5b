//! Load cases: speed, pitch, gravity, temperature change, distributed loads and the buoyancy of
//! a submerged blade.

use crate::units::Angle;

/// One row of a distributed load file: loads per unit span at a radius.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DistributedLoadRow {
    /// Radius, m.
    pub r: f64,
    /// Flapwise (out of the plane of rotation) force per length, N/m.
    pub f_flap: f64,
    /// Edgewise (in the plane of rotation) force per length, N/m.
    pub f_edge: f64,
    /// Pitching moment per length about the pitch axis, N·m/m.
    pub m_pitch: f64,
}

/// A load case (`[[load_case]]`).
#[derive(Debug, Clone, PartialEq)]
pub struct LoadCaseSpec {
    /// Name, unique in the project.
    pub name: String,
    /// Rotor speed, rad/s (`rpm` in the input).
    pub omega: f64,
    /// Pitch setting for this case (the rotor's pitch when not given).
    pub pitch: Option<Angle>,
    /// Distributed external loads, when the case names a file.
    pub distributed: Vec<DistributedLoadRow>,
    /// The file the distributed loads came from, for messages.
    pub distributed_file: Option<String>,
    /// Gravity vector in the rotor frame, m/s² (see docs/conventions.md: x radial along the pitch
    /// axis, y in the plane of rotation, z along the rotor axis downstream), when gravity is
    /// included.
    pub gravity: Option<[f64; 3]>,
    /// Factor on all loads of the case (1 unless given).
    pub load_factor: f64,
    /// Uniform temperature change from the stress-free state, K (0 unless given).
    pub delta_t: f64,
    /// Buoyancy of the blade in a `[fluid]`, taken off the gravity load. Not read from
    /// `blade.toml`: filled from the lofted outer mould line (`None` in air, or when not filled).
    pub buoyancy: Option<Buoyancy>,
}

/// The fluid displaced by the blade, for the buoyancy on a load case with gravity.
#[derive(Debug, Clone, PartialEq)]
pub struct Buoyancy {
    /// Fluid density, kg/m³.
    pub density: f64,
    /// Displaced area along the span, root to tip.
    pub sections: Vec<BuoyantSection>,
}

/// The area inside the outer mould line at one radius.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BuoyantSection {
    /// Radius, m.
    pub r: f64,
    /// Area inside the outer mould line, m².
    pub area: f64,
    /// Its centroid, chord frame `(y, z)` from the pitch axis, m.
    pub centroid: [f64; 2],
}

impl BuoyantSection {
    /// The area and centroid of a closed outline (chord frame points, m) by the shoelace
    /// formula; `None` for a degenerate outline.
    pub fn of_outline(r: f64, outline: &[[f64; 2]]) -> Option<Self> {
        let n = outline.len();
        let (mut a2, mut cy, mut cz) = (0.0, 0.0, 0.0);
        for i in 0..n {
            let (p, q) = (outline[i], outline[(i + 1) % n]);
            let cross = p[0] * q[1] - q[0] * p[1];
            a2 += cross;
            cy += (p[0] + q[0]) * cross;
            cz += (p[1] + q[1]) * cross;
        }
        if !(a2.is_finite() && a2.abs() > 0.0) {
            return None;
        }
        Some(BuoyantSection {
            r,
            area: 0.5 * a2.abs(),
            centroid: [cy / (3.0 * a2), cz / (3.0 * a2)],
        })
    }
}

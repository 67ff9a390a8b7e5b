//! Mould parts in their own machining frame: the part turned so that the direction in which the
//! casting leaves its cavity is +Z (the cavity opens upwards, towards the cutter), its back face
//! lies on z = 0 (on the machine table) and the whole part in the positive octant.
//!
//! The frame is a rigid motion: machining coordinates `q` of a rotor-frame point `p` are
//! `q = Rᵀ (p − o)`, and back `p = o + R q`, where the columns of `R` are the machining axes X, Y,
//! Z as rotor-frame unit vectors and `o` is the rotor-frame point at the machining origin. X is
//! the pitch axis (the part's length) made normal to Z, Y = Z × X. Nothing is scaled, so volumes,
//! areas and drafts carry over unchanged.

use crate::mesh::Mesh;
use crate::mesh::MeshError;
use crate::mesh::vec3::{self, P3};

/// The rigid motion from a part's machining frame back to the rotor frame: `p = origin + R q`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MachiningFrame {
    /// The machining axes X, Y, Z as unit vectors in the rotor frame (the columns of `R`).
    pub axes: [[f64; 3]; 3],
    /// The rotor-frame point at the machining origin, m.
    pub origin: [f64; 3],
}

impl MachiningFrame {
    /// The rotor-frame point of machining coordinates `q`.
    pub fn to_rotor(&self, q: [f64; 3]) -> [f64; 3] {
        let [x, y, z] = self.axes;
        let r =
            vec3::add(vec3::add(vec3::scale(x, q[0]), vec3::scale(y, q[1])), vec3::scale(z, q[2]));
        vec3::add(self.origin, r)
    }

    /// The machining coordinates of a rotor-frame point `p`.
    pub fn to_machining(&self, p: [f64; 3]) -> [f64; 3] {
        let d = vec3::sub(p, self.origin);
        self.axes.map(|a| vec3::dot(a, d))
    }
}

/// `mesh` in its machining frame, with the frame: +Z along `opening` (the unit direction,
/// rotor frame, in which the casting leaves the cavity), X along the pitch axis made normal to
/// it, the part moved into the positive octant so its lowest point (the back face of a mould
/// part) lies on z = 0.
pub fn to_machining_frame(
    mesh: &Mesh,
    opening: [f64; 3],
) -> Result<(Mesh, MachiningFrame), MeshError> {
    let len = vec3::norm(opening);
    if !(len.is_finite() && len > 0.0) {
        return Err(MeshError::Parameter {
            name: "machining Z direction length".into(),
            value: len,
            expected: "a finite, non-zero vector",
        });
    }
    let ez = vec3::scale(opening, 1.0 / len);
    // X: the pitch axis made normal to Z, or the rotor y axis when Z is along the pitch axis.
    let pick = |a: P3| vec3::sub(a, vec3::scale(ez, vec3::dot(a, ez)));
    let mut ex = pick([1.0, 0.0, 0.0]);
    if vec3::norm(ex) < 0.1 {
        ex = pick([0.0, 1.0, 0.0]);
    }
    let ex = vec3::scale(ex, 1.0 / vec3::norm(ex));
    let ey = vec3::cross(ez, ex);
    let turned = MachiningFrame { axes: [ex, ey, ez], origin: [0.0; 3] };
    let mut lo = [f64::INFINITY; 3];
    for &v in mesh.triangles.iter().flatten() {
        let q = turned.to_machining(mesh.vertices[v as usize]);
        for k in 0..3 {
            lo[k] = lo[k].min(q[k]);
        }
    }
    if !lo.iter().all(|c| c.is_finite()) {
        return Err(MeshError::Geometry("an empty part has no machining frame".into()));
    }
    let frame = MachiningFrame { axes: [ex, ey, ez], origin: turned.to_rotor(lo) };
    let mut out = mesh.clone();
    out.transform(|p| {
        // Coordinates at the minimum are exactly zero, not a round-off below it.
        let q = frame.to_machining(p);
        [0, 1, 2].map(|k| q[k].max(0.0))
    });
    Ok((out, frame))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::mesh::box_mesh;

    #[test]
    fn a_box_turned_upside_down_lands_in_the_positive_octant() {
        let mesh = box_mesh([0.1, -0.2, 0.3], [0.4, 0.1, 0.5]);
        let (m, f) = to_machining_frame(&mesh, [0.0, 0.0, -1.0]).unwrap();
        let bb = m.bounding_box().unwrap();
        for k in 0..3 {
            assert!(bb.min[k].abs() < 1e-15);
        }
        // Box sides 0.3, 0.3, 0.2 (geometry): X along the pitch axis, Z the old −z.
        assert!((bb.max[0] - 0.3).abs() < 1e-12 && (bb.max[2] - 0.2).abs() < 1e-12);
        // The old top z = 0.5 is the new bottom.
        assert!((f.origin[2] - 0.5).abs() < 1e-12);
        for (p, q) in mesh.vertices.iter().zip(&m.vertices) {
            assert!(vec3::dist(*p, f.to_rotor(*q)) < 1e-12);
        }
        assert!((m.signed_volume() - mesh.signed_volume()).abs() < 1e-15);
    }
}

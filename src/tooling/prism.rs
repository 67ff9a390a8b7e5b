//! Lofting a family of closed polygons given directly in the rotor frame's section plane (block
//! outlines, parting lines, anything not turned by the chord angle) into a closed prism-like
//! solid with planar end caps (ear clipping, [`crate::mesh::triangulate_polygon`]).

use super::grid::{LoftParams, refine};
use crate::mesh::vec3;
use crate::mesh::{Mesh, MeshError, polygon_area, quad_centre_ok, triangulate_polygon};

/// Lofts the family `outline(x)` of closed polygons in the section plane `(y, z)` of the rotor
/// frame (same corner count at every x, corners corresponding) between the planes `x[0]` and
/// `x[1]`, with spanwise stations chosen by `params` and planar ends by ear clipping.
pub fn loft_polygons(
    outline: &dyn Fn(f64) -> Vec<[f64; 2]>,
    x: [f64; 2],
    params: &LoftParams,
) -> Result<Mesh, MeshError> {
    params.validate()?;
    if !(x[0].is_finite() && x[1].is_finite() && x[0] < x[1]) {
        return Err(MeshError::Geometry(format!(
            "the planes of a polygon loft must be finite with x0 < x1; found {} and {}",
            x[0], x[1]
        )));
    }
    let at = |t: f64| if t >= 1.0 { x[1] } else { x[0] + (x[1] - x[0]) * t };
    let first = outline(x[0]);
    let n = first.len();
    let tol = 0.5 * params.tolerance;
    let point = |t: f64, i: usize, poly: &[[f64; 2]]| [at(t), poly[i][0], poly[i][1]];
    let ok = |a: f64, b: f64| {
        let (pa, pb) = (outline(at(a)), outline(at(b)));
        let mids: Vec<_> = [0.25, 0.5, 0.75]
            .iter()
            .map(|q| (a + (b - a) * q, outline(at(a + (b - a) * q))))
            .collect();
        let half = &mids[1].1;
        (0..n).all(|i| {
            let (qa, qb) = (point(a, i, &pa), point(b, i, &pb));
            let j = (i + 1) % n;
            let (ra, rb) = (point(a, j, &pa), point(b, j, &pb));
            let centre =
                vec3::lerp(point(0.5 * (a + b), i, half), point(0.5 * (a + b), j, half), 0.5);
            vec3::dist(qa, qb) <= params.max_edge
                && mids.iter().all(|(t, m)| vec3::dist_to_segment(point(*t, i, m), qa, qb) <= tol)
                && quad_centre_ok(centre, [qa, qb, ra, rb], tol)
        })
    };
    let stations = refine(1, ok).map_err(|t| {
        MeshError::Geometry(format!("the outline is not continuous near x = {:.6} m", at(t)))
    })?;
    let mut mesh = Mesh::new();
    let mut rings = Vec::with_capacity(stations.len());
    for &t in &stations {
        let poly = outline(at(t));
        if poly.len() != n || poly.iter().flatten().any(|c| !c.is_finite()) {
            return Err(MeshError::Geometry(format!(
                "the outline at x = {:.6} m has {} corners or a non-finite one; expected {n} finite",
                at(t),
                poly.len()
            )));
        }
        rings.push((0..n).map(|i| mesh.push_vertex(point(t, i, &poly))).collect::<Vec<u32>>());
    }
    // Side quads: facing outward for a clockwise outline (as the blade contour runs).
    for pair in rings.windows(2) {
        for i in 0..n {
            let i1 = (i + 1) % n;
            let (a, b, c, d) = (pair[0][i], pair[1][i], pair[0][i1], pair[1][i1]);
            mesh.triangles.push([a, b, c]);
            mesh.triangles.push([c, b, d]);
        }
    }
    let clockwise = polygon_area(&first) < 0.0;
    for (ring, tip, poly) in
        [(&rings[0], false, first), (&rings[rings.len() - 1], true, outline(x[1]))]
    {
        for [a, b, c] in triangulate_polygon(&poly)? {
            // Counter-clockwise in (y, z) faces +x: keep at the tip, turn at the root.
            let t = [ring[a], ring[b], ring[c]];
            mesh.triangles.push(if tip == clockwise { t } else { [t[0], t[2], t[1]] });
        }
    }
    if !clockwise {
        mesh.flip();
    }
    Ok(mesh)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::mesh::{CheckParams, check_solid};

    #[test]
    fn a_twisted_block_outline_lofts_to_a_closed_solid() {
        // A 0.2 x 0.1 m rectangle turned 30 degrees over 0.5 m (Cavalieri: volume 0.01 m³).
        let outline = |x: f64| {
            let (s, c) = (0.6 * x).sin_cos();
            [[-0.1, -0.05], [-0.1, 0.05], [0.1, 0.05], [0.1, -0.05]]
                .iter()
                .map(|&[y, z]| [c * y - s * z, s * y + c * z])
                .collect()
        };
        let params = LoftParams { tolerance: 1e-5, ..LoftParams::default() };
        let mesh = loft_polygons(&outline, [0.2, 0.7], &params).unwrap();
        let summary = check_solid(&mesh, "block", &CheckParams::default()).unwrap();
        // Ruled side faces between stations lose about tolerance times area.
        assert!((summary.volume - 0.01).abs() < 1e-5 * summary.area, "{}", summary.volume);
    }
}

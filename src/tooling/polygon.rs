//! Planar pieces: ear-clipping triangulation of a simple polygon, and lofting a family of
//! closed polygons given directly in the rotor frame's section plane (block outlines, parting
//! lines, anything not turned by the chord angle) into a closed prism-like solid with planar end
//! caps.
//!
//! Ear clipping (Meisters, "Polygons have ears", Amer. Math. Monthly 82 (1975) 648–651): a simple
//! polygon of n ≥ 4 corners has two non-overlapping ears; cutting one off leaves a simple polygon,
//! so n − 2 cuts triangulate it. O(n²), which suits the few hundred corners of an outline.

use super::error::MeshError;
use super::grid::{LoftParams, refine};
use super::mesh::Mesh;
use super::surface::polygon_area;
use super::vec3;

fn orient(a: [f64; 2], b: [f64; 2], c: [f64; 2]) -> f64 {
    (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
}

/// Triangulates the simple polygon `points` (either winding, the last point joining the first);
/// the triangles index `points` and wind counter-clockwise in the plane.
pub fn triangulate_polygon(points: &[[f64; 2]]) -> Result<Vec<[usize; 3]>, MeshError> {
    let n = points.len();
    if n < 3 {
        return Err(MeshError::Geometry(format!("a polygon needs 3 corners; found {n}")));
    }
    let area = polygon_area(points);
    if !(area.is_finite() && area != 0.0) {
        return Err(MeshError::Geometry("the polygon encloses no area".into()));
    }
    let mut ring: Vec<usize> = if area > 0.0 { (0..n).collect() } else { (0..n).rev().collect() };
    let mut out = Vec::with_capacity(n - 2);
    let scale = area.abs();
    while ring.len() > 3 {
        let m = ring.len();
        let ear = (0..m).find(|&i| {
            let (a, b, c) = (ring[(i + m - 1) % m], ring[i], ring[(i + 1) % m]);
            let (pa, pb, pc) = (points[a], points[b], points[c]);
            if orient(pa, pb, pc) <= 1e-14 * scale {
                return false;
            }
            // No other corner inside or on the candidate ear.
            ring.iter().all(|&k| {
                k == a
                    || k == b
                    || k == c
                    || !(orient(pa, pb, points[k]) >= 0.0
                        && orient(pb, pc, points[k]) >= 0.0
                        && orient(pc, pa, points[k]) >= 0.0)
            })
        });
        match ear {
            Some(i) => {
                out.push([ring[(i + m - 1) % m], ring[i], ring[(i + 1) % m]]);
                ring.remove(i);
            }
            None => {
                // Only collinear corners left to cut, or the polygon crosses itself.
                let straight = (0..m).find(|&i| {
                    let (a, b, c) = (ring[(i + m - 1) % m], ring[i], ring[(i + 1) % m]);
                    orient(points[a], points[b], points[c]).abs() <= 1e-14 * scale
                });
                match straight {
                    Some(i) if m > 3 => {
                        ring.remove(i);
                    }
                    _ => {
                        return Err(MeshError::Geometry(format!(
                            "the polygon is not simple: no ear among its {m} remaining corners"
                        )));
                    }
                }
            }
        }
    }
    if orient(points[ring[0]], points[ring[1]], points[ring[2]]) > 0.0 {
        out.push([ring[0], ring[1], ring[2]]);
    }
    Ok(out)
}

/// Whether the middle of the quad between lines `i` (`qa`, `qb`) and `i + 1` (`ra`, `rb`),
/// whichever diagonal splits it, lies within `tol` of the surface's own midpoint `centre`: this
/// bounds the error of a facet spanning a twisting edge.
pub(crate) fn quad_centre_ok(centre: [f64; 3], [qa, qb, ra, rb]: [[f64; 3]; 4], tol: f64) -> bool {
    vec3::dist(centre, vec3::lerp(qa, rb, 0.5)) <= tol
        && vec3::dist(centre, vec3::lerp(qb, ra, 0.5)) <= tol
}

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
    use crate::tooling::{CheckParams, check_solid};

    #[test]
    fn ear_clipping_covers_the_polygon_area() {
        // An L-shaped polygon with a collinear corner, both windings: the triangles' areas add up
        // to the shoelace area (Meisters' theorem: n − 2 triangles, less one per straight corner).
        let l = vec![
            [0.0, 0.0],
            [2.0, 0.0],
            [2.0, 1.0],
            [1.0, 1.0],
            [1.0, 2.0],
            [0.5, 2.0],
            [0.0, 2.0],
        ];
        for poly in [l.clone(), l.iter().rev().copied().collect::<Vec<_>>()] {
            let tris = triangulate_polygon(&poly).unwrap();
            let sum: f64 =
                tris.iter().map(|t| 0.5 * orient(poly[t[0]], poly[t[1]], poly[t[2]])).sum();
            assert!((sum - 3.0).abs() < 1e-12, "{sum}");
            assert!(tris.iter().all(|t| orient(poly[t[0]], poly[t[1]], poly[t[2]]) > 0.0));
        }
        let bow = [[0.0, 0.0], [1.0, 1.0], [1.0, 0.0], [0.0, 1.0]];
        assert!(triangulate_polygon(&bow).is_err());
    }

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

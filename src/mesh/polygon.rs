//! Planar polygons: the signed (shoelace) area, ear-clipping triangulation of a simple polygon,
//! and the test that bounds the error of a facet spanning a twisting quad.
//!
//! Ear clipping (Meisters, "Polygons have ears", Amer. Math. Monthly 82 (1975) 648–651): a simple
//! polygon of n ≥ 4 corners has two non-overlapping ears; cutting one off leaves a simple polygon,
//! so n − 2 cuts triangulate it. O(n²), which suits the few hundred corners of an outline.

use super::error::MeshError;
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

/// Signed area of a closed polygon in the plane (positive counter-clockwise), m².
pub fn polygon_area(points: &[[f64; 2]]) -> f64 {
    let n = points.len();
    (0..n)
        .map(|i| {
            let (a, b) = (points[i], points[(i + 1) % n]);
            a[0] * b[1] - b[0] * a[1]
        })
        .sum::<f64>()
        / 2.0
}

#[cfg(test)]
mod tests {
    use super::*;

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
}

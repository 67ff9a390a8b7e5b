//! Checks a mesh must pass before it is written: indices and finite coordinates, no degenerate
//! facets, every edge shared by exactly two triangles running it in opposite directions, one fan
//! of triangles around every vertex (a closed, oriented 2-manifold), every shell facing outward
//! (cavities inward), and no self-intersection.

use super::error::{MeshError, Place};
use super::spatial;
use super::triangles::{BoundingBox, Mesh};
use super::unit::LengthUnit;
use super::vec3::{self, P3};

/// Thresholds and switches of [`check_solid`].
#[derive(Debug, Clone, PartialEq)]
pub struct CheckParams {
    /// Unit in which places are named in errors.
    pub unit: LengthUnit,
    /// A facet is degenerate when its area is below `min_area_rel` times the square of the
    /// bounding-box diagonal.
    pub min_area_rel: f64,
    /// A facet is degenerate when its aspect `l_max² / (2 A)` (longest edge over the altitude
    /// to it; 1.15 for an equilateral triangle) exceeds this.
    pub max_aspect: f64,
    /// Whether to test every pair of nearby facets for intersection.
    pub self_intersection: bool,
}

impl Default for CheckParams {
    fn default() -> Self {
        CheckParams {
            unit: LengthUnit::Millimetre,
            min_area_rel: 1e-16,
            max_aspect: 1e7,
            self_intersection: true,
        }
    }
}

/// What a checked solid measures.
#[derive(Debug, Clone, PartialEq)]
pub struct MeshSummary {
    /// Number of triangles.
    pub triangles: usize,
    /// Number of vertices used by triangles.
    pub vertices: usize,
    /// Number of closed shells (1 for a plain solid, 2 for a hollow one).
    pub shells: usize,
    /// Enclosed volume, m³ (outer shells less cavities).
    pub volume: f64,
    /// Surface area, m² (all shells).
    pub area: f64,
    /// Bounding box, rotor frame, m.
    pub bounding_box: BoundingBox,
}

/// Checks that `mesh` bounds a solid (see the module docs) and measures it. `part` names the
/// mesh in errors.
pub fn check_solid(
    mesh: &Mesh,
    part: &str,
    params: &CheckParams,
) -> Result<MeshSummary, MeshError> {
    check_solid_keeping_shells(mesh, part, params).map(|(summary, _)| summary)
}

/// After [`check_solid_keeping_shells`] of a mesh, the check of `moved`, the same triangles on
/// vertices moved a little (rounded as a file holds them): what depends on the triangles alone
/// (indices, edge pairs, vertex fans, shells) was checked with the mesh, so `moved` is checked
/// only for what its coordinates decide (finite, facets not degenerate, shells outward), in the
/// order [`check_solid`] would check them, and fails as it would. Anything but the same
/// triangles on as many vertices gets the whole [`check_solid`].
pub(crate) fn check_moved(
    moved: &Mesh,
    of: &Mesh,
    shells: &Shells,
    part: &str,
    params: &CheckParams,
) -> Result<(), MeshError> {
    if moved.triangles != of.triangles || moved.vertices.len() != of.vertices.len() {
        return check_solid(moved, part, params).map(|_| ());
    }
    check_coordinates(moved, part, params)?;
    check_shell_orientation(moved, part, params, shells)
}

/// Every vertex finite and every facet sound (not degenerate); the bounding box.
fn check_coordinates(
    mesh: &Mesh,
    part: &str,
    params: &CheckParams,
) -> Result<BoundingBox, MeshError> {
    for (vertex, p) in mesh.vertices.iter().enumerate() {
        if !p.iter().all(|c| c.is_finite()) {
            return Err(MeshError::NonFinite { part: part.to_string(), vertex });
        }
    }
    let bbox = mesh.bounding_box().ok_or_else(|| MeshError::Empty { part: part.to_string() })?;
    check_facets(mesh, part, params, bbox.diagonal())?;
    Ok(bbox)
}

/// [`check_solid`], with the mesh's shells for [`check_moved`].
pub(crate) fn check_solid_keeping_shells(
    mesh: &Mesh,
    part: &str,
    params: &CheckParams,
) -> Result<(MeshSummary, Shells), MeshError> {
    let place = |p: P3| Place { point: p, unit: params.unit };
    let name = || part.to_string();
    let nv = mesh.vertices.len();
    for (t, tri) in mesh.triangles.iter().enumerate() {
        if let Some(&index) = tri.iter().find(|&&i| i as usize >= nv) {
            return Err(MeshError::Index { part: name(), triangle: t, index, count: nv });
        }
    }
    let bbox = check_coordinates(mesh, part, params)?;
    let twins = pair_edges(mesh, part, params)?;
    check_vertex_fans(mesh, part, params, &twins)?;
    let shells = shells(mesh, &twins);
    check_shell_orientation(mesh, part, params, &shells)?;
    if params.self_intersection
        && let Some((a, b)) = spatial::find_self_intersection(mesh)
    {
        return Err(MeshError::SelfIntersection {
            part: name(),
            a,
            b,
            at: place(mesh.triangle_centroid(a)),
        });
    }
    let used = {
        let mut seen = vec![false; nv];
        mesh.triangles.iter().flatten().for_each(|&i| seen[i as usize] = true);
        seen.iter().filter(|&&s| s).count()
    };
    let summary = MeshSummary {
        triangles: mesh.len(),
        vertices: used,
        shells: shells.count,
        volume: mesh.signed_volume(),
        area: mesh.area(),
        bounding_box: bbox,
    };
    Ok((summary, shells))
}

fn check_facets(mesh: &Mesh, part: &str, params: &CheckParams, diag: f64) -> Result<(), MeshError> {
    let min_area = params.min_area_rel * diag * diag;
    for t in 0..mesh.len() {
        let [a, b, c] = mesh.corners(t);
        let tri = mesh.triangles[t];
        let area = 0.5 * vec3::norm(vec3::area_vector(a, b, c));
        let longest = vec3::dist(a, b).max(vec3::dist(b, c)).max(vec3::dist(c, a));
        let reason = if tri[0] == tri[1] || tri[1] == tri[2] || tri[2] == tri[0] {
            Some("a vertex is repeated".to_string())
        } else if area <= min_area {
            let s = params.unit.per_metre();
            Some(format!("area {:.3e} {}²", area * s * s, params.unit.symbol()))
        } else if longest * longest / (2.0 * area) > params.max_aspect {
            Some(format!(
                "aspect {:.3e} (longest edge over its altitude) exceeds {:.1e}",
                longest * longest / (2.0 * area),
                params.max_aspect
            ))
        } else {
            None
        };
        if let Some(reason) = reason {
            return Err(MeshError::Degenerate {
                part: part.to_string(),
                triangle: t,
                at: Place { point: mesh.triangle_centroid(t), unit: params.unit },
                reason,
            });
        }
    }
    Ok(())
}

/// The twin of every half-edge: half-edge `3 t + k` runs from corner `k` to corner `k + 1` of
/// triangle `t`; its twin runs the other way in the neighbouring triangle.
fn pair_edges(mesh: &Mesh, part: &str, params: &CheckParams) -> Result<Vec<u32>, MeshError> {
    let place = |i: u32| Place { point: mesh.vertices[i as usize], unit: params.unit };
    // Half-edges bucketed by their lower vertex (a counting sort), then grouped by the other.
    let nv = mesh.vertices.len();
    let (first, mut slots) = super::triangles::half_edges_by_lower_vertex(mesh, nv);
    let start = |h: u32| mesh.triangles[h as usize / 3][h as usize % 3];
    let mut twins = vec![u32::MAX; slots.len()];
    let mut conflicts: Vec<(u32, u32)> = Vec::new();
    for lo in 0..nv {
        let bucket = &mut slots[first[lo] as usize..first[lo + 1] as usize];
        bucket.sort_unstable();
        let lo = lo as u32;
        let mut i = 0;
        while i < bucket.len() {
            let mut j = i + 1;
            while j < bucket.len() && bucket[j].0 == bucket[i].0 {
                j += 1;
            }
            let (hi, h0) = bucket[i];
            match j - i {
                1 => {
                    let (a, b) = if start(h0) == lo { (lo, hi) } else { (hi, lo) };
                    return Err(MeshError::OpenEdge {
                        part: part.to_string(),
                        triangle: h0 as usize / 3,
                        a: place(a),
                        b: place(b),
                    });
                }
                2 => {
                    let h1 = bucket[i + 1].1;
                    if start(h0) == start(h1) {
                        conflicts.push((h0 / 3, h1 / 3));
                    }
                    twins[h0 as usize] = h1;
                    twins[h1 as usize] = h0;
                }
                count => {
                    return Err(MeshError::NonManifoldEdge {
                        part: part.to_string(),
                        triangle: h0 as usize / 3,
                        count,
                        a: place(lo),
                        b: place(hi),
                    });
                }
            }
            i = j;
        }
    }
    if !conflicts.is_empty() {
        // The triangle on most conflicting edges is the one turned over.
        let mut count = std::collections::HashMap::<u32, usize>::new();
        for &(a, b) in &conflicts {
            *count.entry(a).or_default() += 1;
            *count.entry(b).or_default() += 1;
        }
        let (&flipped, _) = count
            .iter()
            .max_by_key(|&(&t, &n)| (n, std::cmp::Reverse(t)))
            .unwrap_or((&conflicts[0].0, &0));
        let neighbour = conflicts
            .iter()
            .find_map(|&(a, b)| {
                if a == flipped {
                    Some(b)
                } else if b == flipped {
                    Some(a)
                } else {
                    None
                }
            })
            .unwrap_or(flipped);
        return Err(MeshError::Orientation {
            part: part.to_string(),
            triangle: flipped as usize,
            neighbour: neighbour as usize,
            at: Place { point: mesh.triangle_centroid(flipped as usize), unit: params.unit },
        });
    }
    Ok(twins)
}

/// Walks the fan of triangles around every vertex through the twin half-edges; more than one
/// fan at a vertex means two sheets touch there.
fn check_vertex_fans(
    mesh: &Mesh,
    part: &str,
    params: &CheckParams,
    twins: &[u32],
) -> Result<(), MeshError> {
    let mut visited = vec![false; twins.len()];
    let mut fans = vec![0u32; mesh.vertices.len()];
    for h0 in 0..twins.len() {
        if visited[h0] {
            continue;
        }
        let v = mesh.triangles[h0 / 3][h0 % 3] as usize;
        fans[v] += 1;
        // Half-edge h leaves v; its twin enters v in the next triangle, whose outgoing
        // half-edge from v follows the twin.
        let mut h = h0;
        while !visited[h] {
            visited[h] = true;
            let twin = twins[h] as usize;
            h = 3 * (twin / 3) + (twin % 3 + 1) % 3;
        }
    }
    if let Some((vertex, &n)) = fans.iter().enumerate().find(|&(_, &n)| n > 1) {
        return Err(MeshError::NonManifoldVertex {
            part: part.to_string(),
            vertex,
            at: Place { point: mesh.vertices[vertex], unit: params.unit },
            fans: n as usize,
        });
    }
    Ok(())
}

/// Connected shells: the shell index of every triangle.
pub(crate) struct Shells {
    of_triangle: Vec<u32>,
    count: usize,
}

fn shells(mesh: &Mesh, twins: &[u32]) -> Shells {
    let mut of_triangle = vec![u32::MAX; mesh.len()];
    let mut count = 0;
    let mut stack = Vec::new();
    for seed in 0..mesh.len() {
        if of_triangle[seed] != u32::MAX {
            continue;
        }
        of_triangle[seed] = count;
        stack.push(seed);
        while let Some(t) = stack.pop() {
            for k in 0..3 {
                let n = twins[3 * t + k] as usize / 3;
                if of_triangle[n] == u32::MAX {
                    of_triangle[n] = count;
                    stack.push(n);
                }
            }
        }
        count += 1;
    }
    Shells { of_triangle, count: count as usize }
}

/// A shell inside an odd number of other shells bounds a cavity and must face inward (negative
/// signed volume); every other shell must face outward. Nesting is found by the parity of
/// crossings of a ray from a point of the shell.
fn check_shell_orientation(
    mesh: &Mesh,
    part: &str,
    params: &CheckParams,
    shells: &Shells,
) -> Result<(), MeshError> {
    let n = shells.count;
    let mut volume = vec![0.0; n];
    let mut first = vec![usize::MAX; n];
    let o = mesh.bounding_box().map(|b| b.centre()).unwrap_or([0.0; 3]);
    for t in 0..mesh.len() {
        let s = shells.of_triangle[t] as usize;
        let [a, b, c] = mesh.corners(t).map(|p| vec3::sub(p, o));
        volume[s] += vec3::dot(a, vec3::cross(b, c)) / 6.0;
        if first[s] == usize::MAX {
            first[s] = t;
        }
    }
    let mut bbox = vec![[[f64::INFINITY; 3], [f64::NEG_INFINITY; 3]]; n];
    for t in 0..mesh.len() {
        let s = shells.of_triangle[t] as usize;
        for p in mesh.corners(t) {
            for k in 0..3 {
                bbox[s][0][k] = bbox[s][0][k].min(p[k]);
                bbox[s][1][k] = bbox[s][1][k].max(p[k]);
            }
        }
    }
    for s in 0..n {
        let probe = mesh.triangle_centroid(first[s]);
        let mut depth = 0;
        for other in 0..n {
            let inside_box =
                (0..3).all(|k| bbox[other][0][k] <= probe[k] && probe[k] <= bbox[other][1][k]);
            if other != s && volume[other].abs() > volume[s].abs() && inside_box {
                let hits = (0..mesh.len())
                    .filter(|&t| shells.of_triangle[t] as usize == other)
                    .filter(|&t| ray_hits(probe, mesh.corners(t)))
                    .count();
                depth += hits % 2;
            }
        }
        let cavity = depth % 2 == 1;
        if (volume[s] > 0.0) == cavity || volume[s] == 0.0 {
            let k = params.unit.per_metre();
            return Err(MeshError::Facing {
                part: part.to_string(),
                role: if cavity { "cavity surface" } else { "outer surface" },
                at: Place {
                    point: mesh.vertices[mesh.triangles[first[s]][0] as usize],
                    unit: params.unit,
                },
                volume: volume[s] * k * k * k,
                unit: params.unit.symbol(),
            });
        }
    }
    Ok(())
}

/// Möller–Trumbore: does the ray from `p` along a fixed skew direction cross the triangle?
fn ray_hits(p: P3, [a, b, c]: [P3; 3]) -> bool {
    const DIR: P3 = [0.577_215_664_9, 0.618_033_988_7, 0.533_262_623_1];
    let e1 = vec3::sub(b, a);
    let e2 = vec3::sub(c, a);
    let q = vec3::cross(DIR, e2);
    let det = vec3::dot(e1, q);
    if det == 0.0 {
        return false;
    }
    let s = vec3::sub(p, a);
    let u = vec3::dot(s, q) / det;
    if !(0.0..=1.0).contains(&u) {
        return false;
    }
    let r = vec3::cross(s, e1);
    let v = vec3::dot(DIR, r) / det;
    if v < 0.0 || u + v > 1.0 {
        return false;
    }
    vec3::dot(e2, r) / det > 0.0
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::mesh::box_mesh;

    #[test]
    fn a_moved_mesh_is_judged_as_its_whole_check_judges_it() {
        // A hollow box (two shells, the inner turned inward), its vertices moved: a little
        // (sound), one corner onto another (a degenerate facet), mirrored (every shell turned
        // inside out), one coordinate not finite. The short check after the mesh's own gives
        // the whole check's verdict, word for word.
        let mut hollow = box_mesh([0.0; 3], [1.0, 0.6, 0.4]);
        let mut cavity = box_mesh([0.2, 0.1, 0.1], [0.8, 0.5, 0.3]);
        cavity.flip();
        hollow.merge(&cavity);
        let params = CheckParams::default();
        let (_, shells) = check_solid_keeping_shells(&hollow, "hollow", &params).unwrap();
        let moves: [&dyn Fn(&mut Mesh); 4] = [
            &|m| m.vertices.iter_mut().for_each(|p| p[0] += 1e-7 * p[1]),
            &|m| m.vertices[1] = m.vertices[0],
            &|m| m.vertices.iter_mut().for_each(|p| p[0] = -p[0]),
            &|m| m.vertices[5][2] = f64::NAN,
        ];
        let mut failures = 0;
        for (k, change) in moves.iter().enumerate() {
            let mut moved = hollow.clone();
            change(&mut moved);
            let whole = check_solid(&moved, "hollow", &params).map(|_| ());
            let short = check_moved(&moved, &hollow, &shells, "hollow", &params);
            assert_eq!(format!("{short:?}"), format!("{whole:?}"), "move {k}");
            failures += usize::from(whole.is_err());
        }
        // Three of the four moves must fail, or the comparison proves little.
        assert_eq!(failures, 3);
    }
}

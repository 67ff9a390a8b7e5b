//! End caps on the trim surfaces.
//!
//! A solid's cap is triangulated in chordwise columns: column `k` joins the end points of the
//! upper and lower lines at `u[k]` (at a closing segment, the column is that segment's points).
//! Inner points of a column are spaced so each facet's sag from the sphere stays within the
//! tolerance and facets stay near the chordwise spacing in size, then lifted onto the trim
//! surface (radially onto a sphere). Neighbouring columns are zipped together by their relative
//! position from upper to lower, so a very thin trailing edge gives thin but valid strips and a
//! sharp edge gives a fan. An annular cap (between an outer and an inner end contour of the same
//! grid) is a band of rings lerped between the two and lifted.
//!
//! Facets face outward for a contour that runs clockwise in the chord plane: +x-ish at the tip,
//! −x-ish at the root.

use super::grid::Grid;
use super::surface::EndKind;
use super::trim::EndTrim;
use crate::mesh::End;
use crate::mesh::Mesh;
use crate::mesh::vec3;

fn push(mesh: &mut Mesh, end: End, [a, b, c]: [u32; 3]) {
    mesh.triangles.push(match end {
        End::Tip => [a, b, c],
        End::Root => [a, c, b],
    });
}

/// Caps the end contour `ring` (ring order of `grid`) on `trim`; returns the middle vertex of
/// every column, front to back (every column has an even number of pieces, so the middles form
/// a line of the cap's edges from the front end point to the back one).
pub(crate) fn column_cap(
    mesh: &mut Mesh,
    grid: &Grid,
    ring: &[u32],
    trim: EndTrim,
    end: End,
    tol: f64,
    max_edge: f64,
) -> Vec<u32> {
    let k_last = grid.u.len() - 1;
    let p = |mesh: &Mesh, i: usize| mesh.vertices[ring[i] as usize];
    let h_cap = trim.chord_for_sag(tol).min(max_edge);
    let mut columns: Vec<Vec<u32>> = Vec::with_capacity(k_last + 1);
    for k in 0..=k_last {
        let (up, lo) = (grid.upper[k], grid.lower[k]);
        let closure = match k {
            0 => Some((grid.ends.front, &grid.front)),
            k if k == k_last => Some((grid.ends.back, &grid.back)),
            _ => None,
        };
        let column = match closure {
            Some((EndKind::Point, _)) => vec![ring[up]],
            Some((EndKind::Segment, inner)) => std::iter::once(ring[up])
                .chain(inner.iter().map(|&i| ring[i]))
                .chain(std::iter::once(ring[lo]))
                .collect(),
            None => {
                let (pu, pl) = (p(mesh, up), p(mesh, lo));
                let len = vec3::dist(pu, pl);
                let spacing = vec3::dist(pu, p(mesh, grid.upper[k - 1]))
                    .max(vec3::dist(pu, p(mesh, grid.upper[k + 1])));
                let h = h_cap.min(spacing.max(len * 1e-3));
                let n = ((len / h).ceil() as usize).clamp(1, 100_000);
                let n = n + n % 2;
                let mut column = vec![ring[up]];
                for i in 1..n {
                    column.push(mesh.push_vertex(trim.lift(vec3::lerp(
                        pu,
                        pl,
                        i as f64 / n as f64,
                    ))));
                }
                column.push(ring[lo]);
                column
            }
        };
        columns.push(column);
    }
    for pair in columns.windows(2) {
        zip_columns(mesh, &pair[0], &pair[1], end);
    }
    columns.iter().map(|c| c[(c.len() - 1) / 2]).collect()
}

/// Triangulates the strip between two columns (each from the upper chain to the lower) by
/// advancing along whichever column's next point is relatively nearer the upper end. When both
/// columns have an even number of pieces the walk passes through both middles at once, so the
/// edge joining them is an edge of the strip.
fn zip_columns(mesh: &mut Mesh, a: &[u32], b: &[u32], end: End) {
    let (na, nb) = (a.len() - 1, b.len() - 1);
    let (mut i, mut j) = (0, 0);
    while i < na || j < nb {
        // Compare (i + 1) / na with (j + 1) / nb without division.
        let advance_a = j == nb || (i < na && (i + 1) * nb <= (j + 1) * na);
        if advance_a {
            push(mesh, end, [a[i], a[i + 1], b[j]]);
            i += 1;
        } else {
            push(mesh, end, [a[i], b[j + 1], b[j]]);
            j += 1;
        }
    }
}

/// Caps the band between the outer end contour `outer` and the inner one `inner` (same ring
/// order and length) on `trim`, with intermediate rings where the band is wide.
pub(crate) fn annular_cap(
    mesh: &mut Mesh,
    outer: &[u32],
    inner: &[u32],
    trim: EndTrim,
    end: End,
    tol: f64,
    max_edge: f64,
) {
    let n = outer.len();
    let p = |mesh: &Mesh, v: u32| mesh.vertices[v as usize];
    let width =
        (0..n).map(|i| vec3::dist(p(mesh, outer[i]), p(mesh, inner[i]))).fold(0.0, f64::max);
    let h = trim.chord_for_sag(tol).min(max_edge);
    let segments = ((width / h).ceil() as usize).clamp(1, 100_000);
    let mut loops: Vec<Vec<u32>> = vec![outer.to_vec()];
    for s in 1..segments {
        let f = s as f64 / segments as f64;
        let ring = (0..n)
            .map(|i| {
                let q = vec3::lerp(p(mesh, outer[i]), p(mesh, inner[i]), f);
                mesh.push_vertex(trim.lift(q))
            })
            .collect();
        loops.push(ring);
    }
    loops.push(inner.to_vec());
    for pair in loops.windows(2) {
        let (a, b) = (&pair[0], &pair[1]);
        for i in 0..n {
            let i1 = (i + 1) % n;
            push(mesh, end, [a[i1], a[i], b[i]]);
            push(mesh, end, [a[i1], b[i], b[i1]]);
        }
    }
}

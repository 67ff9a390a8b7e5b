//! Parting a lofted part into its upper and lower sides along the loop of its parting lines,
//! and grouping the undercut facets of a half into connected regions.

use super::*;

/// The parting loop's four sides (front root → tip, tip cap front → back, back tip → root,
/// root cap back → front), each with both end vertices, and the loop as one closed list.
pub(super) fn parting_loop(part: &LoftedSolid) -> Result<([Vec<u32>; 4], Vec<u32>), MeshError> {
    let p = &part.parting;
    let sides = [
        p.front.clone(),
        p.tip.clone(),
        p.back.iter().rev().copied().collect::<Vec<u32>>(),
        p.root.iter().rev().copied().collect::<Vec<u32>>(),
    ];
    for k in 0..4 {
        let next = &sides[(k + 1) % 4];
        if sides[k].len() < 2 || sides[k].last() != next.first() {
            return Err(MeshError::Geometry(
                "the part has no closed parting loop (front, tip, back and root lines)".into(),
            ));
        }
    }
    let loop0 = sides.iter().flat_map(|s| s[..s.len() - 1].iter().copied()).collect();
    Ok((sides, loop0))
}

/// The facets on the upper side of the loop and those on the lower.
pub(super) fn split_faces(
    mesh: &Mesh,
    loop0: &[u32],
    seed: u32,
) -> Result<[Vec<usize>; 2], MeshError> {
    let n = loop0.len();
    let mut barrier = crate::mesh::WordSet::with_capacity_and_hasher(n, Default::default());
    for i in 0..n {
        let (a, b) = (loop0[i], loop0[(i + 1) % n]);
        barrier.insert((a.min(b), a.max(b)));
    }
    let adj = neighbours(mesh);
    let start = mesh
        .triangles
        .iter()
        .position(|t| t.contains(&seed))
        .ok_or_else(|| MeshError::Geometry("the upper line has no facet".into()))?;
    let mut upper = vec![false; mesh.len()];
    upper[start] = true;
    let mut stack = vec![start];
    while let Some(t) = stack.pop() {
        let tri = mesh.triangles[t];
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            let nb = adj[t][k].0;
            if nb == u32::MAX || barrier.contains(&(a.min(b), a.max(b))) || upper[nb as usize] {
                continue;
            }
            upper[nb as usize] = true;
            stack.push(nb as usize);
        }
    }
    // Every loop edge must have one facet on each side.
    for (t, tri) in mesh.triangles.iter().enumerate() {
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            let nb = adj[t][k].0;
            if nb != u32::MAX
                && barrier.contains(&(a.min(b), a.max(b)))
                && upper[t] == upper[nb as usize]
            {
                return Err(MeshError::Geometry(
                    "the parting loop does not divide the part into an upper and a lower side"
                        .into(),
                ));
            }
        }
    }
    let pick = |side: bool| (0..mesh.len()).filter(|&t| upper[t] == side).collect::<Vec<_>>();
    Ok([pick(true), pick(false)])
}

/// Connected regions of the undercut facets, largest first.
pub(super) fn undercut_regions(
    part: &LoftedSolid,
    draft: &DraftReport,
    pull: P3,
    unit: LengthUnit,
) -> Vec<Undercut> {
    // Most cavities draw: then there is nothing to group, and no adjacency to build.
    if draft.undercuts.is_empty() {
        return Vec::new();
    }
    let mesh = &part.mesh;
    let mut under = vec![false; mesh.len()];
    for &t in &draft.undercuts {
        under[t] = true;
    }
    let adj = neighbours(mesh);
    let mut seen = vec![false; mesh.len()];
    let mut out = Vec::new();
    for &seed in &draft.undercuts {
        if seen[seed] {
            continue;
        }
        seen[seed] = true;
        let mut stack = vec![seed];
        let (mut area, mut worst, mut worst_t) = (0.0, f64::INFINITY, seed);
        let mut x_range = [f64::INFINITY, f64::NEG_INFINITY];
        let mut kinds = [false; 3];
        while let Some(t) = stack.pop() {
            area += mesh.triangle_area(t);
            let s = vec3::dot(mesh.triangle_normal(t), pull);
            if s < worst {
                worst = s;
                worst_t = t;
            }
            for p in mesh.corners(t) {
                x_range = [x_range[0].min(p[0]), x_range[1].max(p[0])];
            }
            let f = &part.facets;
            kinds[if f.root_cap.contains(&t) {
                1
            } else if f.tip_cap.contains(&t) {
                2
            } else {
                0
            }] = true;
            for &(nb, _) in &adj[t] {
                if nb != u32::MAX && under[nb as usize] && !seen[nb as usize] {
                    seen[nb as usize] = true;
                    stack.push(nb as usize);
                }
            }
        }
        let region = ["surface", "root end", "tip end"]
            .iter()
            .zip(kinds)
            .filter(|(_, k)| *k)
            .map(|(n, _)| *n)
            .collect::<Vec<_>>()
            .join(" and ");
        out.push(Undercut {
            area,
            worst: Angle::from_rad(worst.clamp(-1.0, 1.0).asin()),
            at: Place { point: mesh.triangle_centroid(worst_t), unit },
            x_range,
            region,
        });
    }
    out.sort_by(|a, b| b.area.total_cmp(&a.area));
    out
}

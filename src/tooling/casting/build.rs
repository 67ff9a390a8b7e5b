//! Building one core's casting mould: the block round the scaled core, its halves and end
//! pieces, the pouring and vent channels, each part also in its machining frame.

use super::*;

/// Builds the casting mould of one core (see the module docs).
pub(crate) fn casting_mould(
    input: &CastingInput<'_>,
    params: &CastingParams,
) -> Result<CastingMould, MeshError> {
    let s = params.shrinkage;
    if !(-0.01..=0.06).contains(&s) {
        return Err(MeshError::Parameter {
            name: "core alloy shrinkage".into(),
            value: s,
            expected: "a linear shrinkage of -1 % to 6 %",
        });
    }
    let span = input.cell.span();
    let (lo, hi) = (0..=200)
        .map(|i| input.cell.chord_angle(span[0] + (span[1] - span[0]) * i as f64 / 200.0).deg())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| (a.min(v), b.max(v)));
    let turn = input.min_draft.deg() + 0.5;
    let candidates = [input.first, Angle::from_deg(hi + turn), Angle::from_deg(lo - turn)];
    // The print is cast with the core: its seat in the end piece at its end (scaled as the
    // cavity is), an end piece made there if the end would not need one.
    let seat_end = match input.print {
        Some(p) => {
            let trim = scaled_trim(input.trims.at(p.end), 1.0 + s);
            Some(SeatedEnd {
                end: p.end,
                trim,
                seats: vec![casting_seat(p, input.trims.at(p.end), 1.0 + s)?],
                max_side: trim.chord_for_sag(0.5 * input.tolerance).min(input.loft.max_edge),
            })
        }
        None => None,
    };
    let mut best: Option<(LoftedSolid, f64, Angle, MouldParts, [f64; 2])> = None;
    // The contour's samples, which no pull changes, worked out once for all the pulls tried.
    let samples = ContourSamples::over(input.cell, input.cell.span());
    let mut first_error = None;
    for angle in candidates {
        let solid = match loft_solid(
            &SilhouetteSurface::from_samples(input.cell, &samples, angle),
            input.trims,
            input.loft,
        ) {
            Ok(solid) => solid,
            // A pull whose parted surface cannot be lofted within the tolerance leaves the
            // others to try (see the module docs).
            Err(e) => {
                first_error.get_or_insert(e);
                continue;
            }
        };
        let nominal = solid.mesh.signed_volume();
        let mut cavity = solid;
        cavity.mesh.scale(1.0 + s);
        let mould = MouldParams::pulled_at(
            angle,
            input.margin,
            input.tolerance,
            input.min_draft,
            input.unit,
        );
        let set = match &seat_end {
            Some(at) => build_seated_mould_parts(
                &cavity,
                &|_x: f64| angle,
                &mould,
                std::slice::from_ref(at),
            )?,
            None => build_mould_parts(&cavity, &|_x: f64| angle, &mould)?,
        };
        let drafts =
            set.halves.iter().map(|h| &h.draft).chain(set.end_pieces.iter().map(|e| &e.1.draft));
        let score =
            drafts.fold([0.0, 0.0], |a, d| [a[0] + d.undercut_area, a[1] + d.below_min_area]);
        if best.as_ref().is_none_or(|b| score < b.4) {
            best = Some((cavity, nominal, angle, set, score));
        }
        if score == [0.0, 0.0] {
            break;
        }
    }
    let (cavity, core_volume, pull_angle, set, _) = best.ok_or_else(|| {
        first_error.unwrap_or_else(|| MeshError::Geometry("no pull to try".into()))
    })?;
    // The metal's cavity is the core's with the print's seat.
    let (cavity, core_volume) = match (&seat_end, input.print) {
        (Some(at), Some(p)) => (seated_solid(&cavity, at)?, core_volume + p.volume),
        _ => (cavity, core_volume),
    };
    let up = set.halves[0].pull;
    let cavity_volume = cavity.mesh.signed_volume();
    let MouldParts { half_meshes: [upper, lower], halves, end_pieces, .. } = set;

    // The pouring position's frame: (a, b) across the pull, h along it.
    let e1 = {
        let x = [1.0, 0.0, 0.0];
        let v = vec3::sub(x, vec3::scale(up, vec3::dot(x, up)));
        vec3::scale(v, 1.0 / vec3::norm(v))
    };
    let e2 = vec3::cross(up, e1);
    let frame = Plan { e1, e2, up };

    let mesh = &cavity.mesh;
    let highest = mesh
        .triangles
        .iter()
        .flatten()
        .map(|&v| mesh.vertices[v as usize])
        .max_by(|p, q| vec3::dot(*p, up).total_cmp(&vec3::dot(*q, up)))
        .ok_or_else(|| MeshError::Empty { part: input.name.into() })?;
    let side = cavity.facets.side.clone();
    let eligible: Vec<bool> = (0..mesh.len())
        .map(|t| side.contains(&t) && vec3::dot(mesh.triangle_normal(t), up) >= FACING_UP)
        .collect();
    let adj = neighbours(mesh);
    let index = PlanIndex::new(mesh, &eligible, &frame);
    let mut tops: Vec<u32> =
        (0..mesh.len()).filter(|&t| eligible[t]).flat_map(|t| mesh.triangles[t]).collect();
    tops.sort_unstable();
    tops.dedup();
    tops.sort_by(|&a, &b| {
        let h = |v: u32| vec3::dot(mesh.vertices[v as usize], up);
        h(b).total_cmp(&h(a))
    });
    // The channels narrow upwards at the least draft plus 1° (the upper half lifts off the
    // metal in them): the top has the set diameter, the foot is wider by the rise.
    let taper = (input.min_draft.deg() + 1.0).to_radians().tan();
    let z_top = upper.vertices.iter().map(|&p| vec3::dot(p, up)).fold(f64::NEG_INFINITY, f64::max);
    let place = |d: f64, avoid: &[usize], order: &[u32]| -> Result<Patch, MeshError> {
        for r in [0.5 * d, 0.25 * d, 0.125 * d] {
            for &v in order.iter().take(TRIES) {
                let p = mesh.vertices[v as usize];
                let c = frame.plan(p);
                let foot = r + (z_top - frame.height(p)) * taper;
                let Some(mut hole) = patch(mesh, &eligible, &index, &adj, &frame, c, foot) else {
                    continue;
                };
                if hole.facets.iter().any(|t| avoid.contains(t)) {
                    continue;
                }
                // The wall keeps the taper down to the circle's lowest corner.
                let low =
                    hole.circle.iter().map(|&q| frame.height(q)).fold(f64::INFINITY, f64::min);
                hole.top_radius = foot - (z_top - low) * taper;
                if hole.top_radius >= 0.5 * r {
                    return Ok(hole);
                }
            }
        }
        Err(MeshError::Geometry(format!(
            "{}: no place on the upper surface of the cavity takes a hole of {:.1} mm or less",
            input.name,
            d * 1e3
        )))
    };
    let vent = place(params.vent_diameter, &[], &tops)?;
    // The sprue: highest in the half of the span away from the vent.
    let xs = mesh.vertices.iter().map(|p| p[0]);
    let (x0, x1) = xs.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), x| (a.min(x), b.max(x)));
    let x_vent = vent.entry[0];
    let far_root = x_vent - x0 > x1 - x_vent;
    let mid = 0.5 * (x0 + x1);
    let far_half = |v: u32| {
        let x = mesh.vertices[v as usize][0];
        if far_root { x <= mid } else { x >= mid }
    };
    // Those in the far half first, then the rest, each in height order (`tops` has no repeats).
    let (mut order, rest): (Vec<u32>, Vec<u32>) = tops.iter().partition(|&&v| far_half(v));
    order.extend(rest);
    let sprue = place(params.sprue_diameter, &vent.facets, &order)?;

    // The holes cut into the metal and the upper half.
    let mut metal = mesh.clone();
    let mut half = upper;
    let mut channels = Vec::with_capacity(2);
    let mut outlets = Vec::with_capacity(2);
    let removed: Vec<usize> = vent.facets.iter().chain(&sprue.facets).copied().collect();
    let half_removed = matching_facets(&half, mesh, &removed)?;
    let mut half_new: Vec<[u32; 3]> = Vec::new();
    let mut metal_new: Vec<[u32; 3]> = Vec::new();
    let mut half_ids = position_ids(&half);
    for hole in [&sprue, &vent] {
        let (ring, annulus) = fill_patch(&mut metal, hole, &frame)?;
        metal_new.extend(annulus.iter().copied());
        let r_top = hole.top_radius;
        let top: Vec<P3> =
            circle(hole.centre, r_top).iter().map(|&q| frame.lift(q, z_top)).collect();
        let top_ids: Vec<u32> = top.iter().map(|&p| metal.push_vertex(p)).collect();
        // Wall (outward from the metal) and the cap at the top.
        let n = ring.len();
        for i in 0..n {
            let j = (i + 1) % n;
            metal_new.push([ring[i], ring[j], top_ids[j]]);
            metal_new.push([ring[i], top_ids[j], top_ids[i]]);
        }
        for i in 1..n - 1 {
            metal_new.push([top_ids[0], top_ids[i], top_ids[i + 1]]);
        }
        // The same facets, turned, for the half (its vertices found by position).
        // (The metal's top is open in the half: its facets are left out.)
        let first_new = metal_new.len() - annulus.len() - 2 * n - (n - 2);
        for tri in &metal_new[first_new..metal_new.len() - (n - 2)] {
            let ids = tri.map(|v| {
                let p = metal.vertices[v as usize];
                *half_ids.entry(key(p)).or_insert_with(|| half.push_vertex(p))
            });
            half_new.push([ids[0], ids[2], ids[1]]);
        }
        let entry = frame.lift(hole.centre, hole.entry_height);
        let outlet = frame.lift(hole.centre, z_top);
        let volume = channel_volume(&hole.circle, &top);
        channels.push((entry, outlet, 2.0 * hole.radius, 2.0 * r_top, volume));
        outlets.push(top);
    }
    metal.triangles = kept(&metal.triangles, &[&removed]);
    metal.triangles.extend(metal_new);
    compact(&mut metal);
    // The top face of the upper half, holed by both outlets.
    let top_faces: Vec<usize> = (0..half.len())
        .filter(|&t| {
            half.triangles[t].iter().all(|&v| {
                (vec3::dot(half.vertices[v as usize], up) - z_top).abs()
                    <= 1e-9 * (1.0 + z_top.abs())
            })
        })
        .collect();
    let top_new = holed_face(&mut half, &top_faces, &outlets, &frame, &mut half_ids)?;
    half.triangles = kept(&half.triangles, &[&half_removed, &top_faces]);
    half.triangles.extend(half_new);
    half.triangles.extend(top_new);
    compact(&mut half);

    let metal_volume = metal.signed_volume();
    let channel = |c: (P3, P3, f64, f64, f64)| Channel {
        entry: c.0,
        outlet: c.1,
        entry_diameter: c.2,
        outlet_diameter: c.3,
        volume: c.4,
    };
    let (sprue, vent) = (channel(channels[0]), channel(channels[1]));

    let b = halves[0].block_size;
    let block_volume = b[0] * b[1] * b[2];
    let mut parts = vec![
        CastPart { name: format!("{}-cast-upper", input.name), mesh: half, pull: halves[0].pull },
        CastPart { name: format!("{}-cast-lower", input.name), mesh: lower, pull: halves[1].pull },
    ];
    let mut ends = Vec::with_capacity(end_pieces.len());
    for (m, piece) in end_pieces {
        let name = format!("{}-cast-{}", input.name, piece.side.replace(' ', "-"));
        parts.push(CastPart { name, mesh: m, pull: piece.pull });
        ends.push(piece);
    }
    let mut machining = Vec::with_capacity(parts.len());
    for p in &parts {
        let (mesh, frame): (Mesh, MachiningFrame) =
            to_machining_frame(&p.mesh, vec3::scale(p.pull, -1.0))?;
        machining.push(MachinedPart {
            part: p.name.clone(),
            name: format!("{}-machining", p.name),
            mesh,
            frame,
        });
    }
    Ok(CastingMould {
        core: input.name.into(),
        pull_angle,
        up,
        shrinkage: s,
        core_volume,
        cavity_volume,
        metal_volume,
        highest,
        vent_shortfall: (vec3::dot(highest, up) - vec3::dot(vent.entry, up)).max(0.0),
        sprue,
        vent,
        halves,
        end_pieces: ends,
        block_volume,
        parts,
        metal,
        machining,
    })
}

/// The triangles whose index is in none of the lists `out`, in their order.
fn kept(triangles: &[[u32; 3]], out: &[&[usize]]) -> Vec<[u32; 3]> {
    let mut keep = vec![true; triangles.len()];
    for &t in out.iter().flat_map(|o| o.iter()) {
        if let Some(k) = keep.get_mut(t) {
            *k = false;
        }
    }
    triangles.iter().zip(keep).filter(|(_, k)| *k).map(|(t, _)| *t).collect()
}

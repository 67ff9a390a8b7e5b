//! The blade's mould: the pull chosen among a few candidates, two halves with end pieces, or
//! span-wise modules where no single pull draws the blade; and each core's casting mould.

use super::*;

/// The mould chosen by [`build_tooling`]: two halves (and end pieces), or span-wise modules.
pub(super) enum Mould {
    Whole(Box<MouldParts>),
    Modular(ModularMould),
}

/// The outer solid the shell is made from, the pull angle reported and the mould.
///
/// When the best single pull (`chosen`, see `choose_pull`) still leaves undercut facets on the
/// mould parts, or none lofts, [`span_modules`] finds the fewest stretches of the span each
/// drawn by one pull normal to the pitch axis (sampled every 4 mm or so, at least 48 and at most
/// 240 radii; the chosen pull kept where it draws a whole module):
///
/// - one stretch: the whole span draws along the pull it found, which the few candidates of
///   `choose_pull` missed; the mould of two halves along that pull is kept if it leaves less
///   undercut;
/// - several: [`loft_modules`] lofts each parted at its own silhouette and
///   [`build_modular_mould`] builds their halves in one block, end pieces at the outer ends;
///   kept if it leaves less undercut than the single pull. The shell is then lofted from the
///   outer surface parted at its edges (no one pull's silhouette parts every section), and the
///   reported pull angle is the first module's.
pub(super) fn choose_mould(
    chosen: Result<(LoftedSolid, Angle, MouldParts), MeshError>,
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    span: [f64; 2],
) -> Result<(LoftedSolid, Angle, Mould), MeshError> {
    let undercut = |set: &MouldParts| -> f64 {
        let ends = set.end_pieces.iter().map(|e| &e.1);
        set.halves.iter().chain(ends).map(|h| h.draft.undercut_area).sum()
    };
    let mut best = match chosen {
        Ok((solid, angle, set)) if undercut(&set) == 0.0 => {
            return Ok((solid, angle, Mould::Whole(Box::new(set))));
        }
        Ok((solid, angle, set)) => {
            Some((undercut(&set), solid, angle, Mould::Whole(Box::new(set))))
        }
        Err(e) => {
            let prefer = None;
            return match split_mould(outer, trims, loft, params, span, prefer) {
                Ok(Split::Many(m)) => {
                    let angle = m.modules[0].pull_angle;
                    Ok((loft_edges(outer, trims, loft)?, angle, Mould::Modular(m)))
                }
                Ok(Split::One(angle)) => {
                    let (solid, set) = single_mould(outer, trims, loft, params, angle)?;
                    Ok((solid, angle, Mould::Whole(Box::new(set))))
                }
                Err(_) => Err(e),
            };
        }
    };
    let prefer = best.as_ref().map(|b| b.2);
    // A failed split leaves the single pull's mould, its undercuts reported.
    let candidate = match split_mould(outer, trims, loft, params, span, prefer) {
        Ok(Split::Many(m)) => {
            let left: f64 = m.parts.iter().map(undercut).sum();
            let angle = m.modules[0].pull_angle;
            loft_edges(outer, trims, loft).ok().map(|s| (left, s, angle, Mould::Modular(m)))
        }
        Ok(Split::One(angle)) if Some(angle) == prefer => None,
        Ok(Split::One(angle)) => single_mould(outer, trims, loft, params, angle)
            .ok()
            .map(|(solid, set)| (undercut(&set), solid, angle, Mould::Whole(Box::new(set)))),
        Err(_) => None,
    };
    if let Some(c) = candidate {
        if best.as_ref().is_none_or(|b| c.0 < b.0) {
            best = Some(c);
        }
    }
    let (_, solid, angle, mould) =
        best.ok_or_else(|| MeshError::Geometry("no mould to choose".into()))?;
    Ok((solid, angle, mould))
}

/// The outer surface lofted parted at its edges (the shell of a mould split along the span).
pub(super) fn loft_edges(
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
) -> Result<LoftedSolid, MeshError> {
    loft_solid(outer, trims, loft)
        .map_err(|e| MeshError::Geometry(format!("the outer mould line: {e}")))
}

/// The outer surface parted at its silhouette along the pull of chord angle `angle`, and the
/// mould of two halves round it.
pub(super) fn single_mould(
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    angle: Angle,
) -> Result<(LoftedSolid, MouldParts), MeshError> {
    let solid = loft_solid(&SilhouetteSurface::new(outer, angle), trims, loft)
        .map_err(|e| MeshError::Geometry(format!("the outer mould line: {e}")))?;
    let set = mould_parts(&solid, params, angle)?;
    Ok((solid, set))
}

/// What [`span_modules`] found: one pull for the whole span, or a mould of several modules.
pub(super) enum Split {
    One(Angle),
    Many(ModularMould),
}

/// The mould split along the span (see [`choose_mould`]).
pub(super) fn split_mould(
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    span: [f64; 2],
    prefer: Option<Angle>,
) -> Result<Split, MeshError> {
    let samples = (((span[1] - span[0]) / 4e-3).ceil() as usize).clamp(48, 240);
    let modules = span_modules(outer, span, samples, prefer)?;
    if let [only] = modules.as_slice() {
        return Ok(Split::One(only.pull_angle));
    }
    let mut solids = loft_modules(outer, trims, loft, &modules)?;
    if params.mould_expansion_factor != 1.0 {
        for s in &mut solids {
            s.mesh.scale(params.mould_expansion_factor);
        }
    }
    let mould = MouldParams {
        pull: [0.0, 0.0, 1.0],
        margin: params.mould_margin,
        tolerance: params.tolerance,
        min_draft: params.min_draft,
        unit: params.unit,
    };
    build_modular_mould(&solids, &modules, &mould).map(Split::Many)
}

/// Adds the parts of a mould split along the span to `parts`: `mould-<k>-upper` and
/// `mould-<k>-lower` for module k (root first), then the end pieces; the first module's halves,
/// the end pieces and the split.
pub(super) fn push_modular_parts(
    mould: ModularMould,
    parts: &mut Vec<Part>,
) -> Result<([MouldHalf; 2], Vec<MouldHalf>, MouldModules), MeshError> {
    let (mut named, mut end_named) = (Vec::new(), Vec::new());
    let (mut halves, mut ends) = (Vec::new(), Vec::new());
    for (k, set) in mould.parts.into_iter().enumerate() {
        let [upper, lower] = set.half_meshes;
        named.push((format!("mould-{}-upper", k + 1), PartKind::MouldUpper, upper));
        named.push((format!("mould-{}-lower", k + 1), PartKind::MouldLower, lower));
        halves.extend(set.halves);
        for (mesh, piece) in set.end_pieces {
            end_named.push((
                format!("mould-{}", piece.side.replace(' ', "-")),
                PartKind::MouldEnd,
                mesh,
            ));
            ends.push(piece);
        }
    }
    for (name, kind, mesh) in named.into_iter().chain(end_named) {
        let nominal_volume = mesh.signed_volume();
        parts.push(Part { name, kind, mesh, nominal_volume });
    }
    let first: [MouldHalf; 2] = match halves.get(..2) {
        Some([a, b]) => [a.clone(), b.clone()],
        _ => return Err(MeshError::Geometry("a mould module without two halves".into())),
    };
    let split = MouldModules { modules: mould.modules, halves, block_size: mould.block_size };
    Ok((first, ends, split))
}

/// The casting mould of every core (see [`crate::tooling::CastingMould`]); a core whose mould cannot be
/// made is named with the reason instead, and the rest of the tooling stands.
pub(super) fn casting_moulds(
    cells: &[(CoreCell<'_>, Trims)],
    loft: &LoftParams,
    params: &ToolingParams,
    casting: &CastingParams,
    first: Angle,
    prints: &[&CorePrint],
) -> (Vec<CastingMould>, Vec<CastingNote>) {
    let (mut moulds, mut notes) = (Vec::new(), Vec::new());
    // Each core's mould is its own work: built on all cores, kept in the cores' order.
    let one = |i: usize| {
        let (cell, trims) = &cells[i];
        let name = format!("core-{}", i + 1);
        let input = CastingInput {
            name: &name,
            cell,
            trims,
            loft,
            first,
            print: prints.iter().copied().find(|p| p.core == name),
            margin: params.mould_margin,
            tolerance: params.tolerance,
            min_draft: params.min_draft,
            unit: params.unit,
        };
        Ok::<_, std::convert::Infallible>(casting_mould(&input, casting).map_err(|r| (name, r)))
    };
    for built in crate::mesh::each_part(cells.len(), one, &mut |_, _| {}).into_iter().flatten() {
        match built {
            Ok(Ok(m)) => moulds.push(m),
            Ok(Err((core, reason))) => notes.push(CastingNote::NoMould { core, reason }),
            Err(never) => match never {},
        }
    }
    (moulds, notes)
}

/// Chooses the mould's pull and lofts the outer mould line parted for it; the pull's chord
/// angle ψ (the upper half is pulled along `(0, −sin ψ, cos ψ)`) and the mould parts. The
/// parting always follows the silhouette along the pull ([`crate::tooling::parting`]), so a section whose
/// sides are graphs across the pull draws whatever its twist; what is left to choose is the
/// pull's angle about the pitch axis, tried in this order until the halves have no undercut
/// facet (the draft evaluator over their cavity facets, after the end pieces):
///
/// 1. normal to the chord at the middle station, for a sharp trailing edge (a section is then
///    turned against the pull by at most about half the twist);
/// 2. just beyond the greatest chord angle over the span (by 0.5°), then
/// 3. just beyond the least.
///
/// A blunt trailing edge skips the first: its flat base turns through the pull where a
/// section's chord angle equals the pull's, and no grid of rings parts a flat face exactly
/// there (the facets across that radius draw at a few hundredths of a degree either way).
/// With the pull beyond the range of chord angles, one corner of the base is the extreme
/// across the pull at every radius (for turns below 90° less the surface's slope at the
/// corner) and the base goes whole to one half. When no candidate removes every undercut, the
/// one with the least undercut area is kept and its undercuts are reported. Once the first
/// leaves undercuts, the others are built side by side and read in this order, so the choice
/// is the one made one after the other.
pub(super) fn choose_pull(
    blade: &Blade,
    outer: &BladeSurface<'_>,
    trims: &Trims,
    loft: &LoftParams,
    params: &ToolingParams,
    pitch: Angle,
    span: [f64; 2],
) -> Result<(LoftedSolid, Angle, MouldParts), MeshError> {
    let n = 200;
    let (lo, hi) = (0..=n)
        .map(|i| outer.chord_angle(span[0] + (span[1] - span[0]) * i as f64 / n as f64).deg())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| (a.min(v), b.max(v)));
    let mut candidates = Vec::with_capacity(3);
    if outer.back == EndKind::Point {
        candidates.push(pull_angle(blade, pitch));
    }
    candidates.extend([Angle::from_deg(hi + 0.5), Angle::from_deg(lo - 0.5)]);
    // A pull that does not draw every section may part the surface where it folds: the loft or
    // the mould can fail there, and the next candidate (or the split along the span, see
    // `choose_mould`) is tried.
    // The contour's samples, which no pull changes, worked out once for all the pulls tried.
    let samples = ContourSamples::over(outer, outer.span());
    let attempt = |angle: Angle| -> Result<(MouldParts, LoftedSolid), MeshError> {
        let solid =
            loft_solid(&SilhouetteSurface::from_samples(outer, &samples, angle), trims, loft)
                .map_err(|e| MeshError::Geometry(format!("the outer mould line: {e}")))?;
        Ok((mould_parts(&solid, params, angle)?, solid))
    };
    let undercut =
        |set: &MouldParts| -> f64 { set.halves.iter().map(|h| h.draft.undercut_area).sum() };
    // The first candidate alone (it draws most blades); when it leaves undercuts, the rest side
    // by side on two cores. Either way they are read in order below, so the choice is the one
    // made trying them one after the other (lazily, on one thread).
    let first = candidates.first().map(|&angle| attempt(angle));
    let first_draws = matches!(&first, Some(Ok((set, _))) if undercut(set) == 0.0);
    type Tried = Result<(MouldParts, LoftedSolid), MeshError>;
    let rest: Box<dyn Iterator<Item = Tried>> =
        if first_draws || crate::parallel::threads() < 2 || candidates.len() < 3 {
            Box::new(candidates.iter().skip(1).map(|&angle| attempt(angle)))
        } else {
            let together: Vec<Tried> = std::thread::scope(|s| {
                let attempt = &attempt;
                let handles: Vec<_> =
                    candidates[1..].iter().map(|&angle| s.spawn(move || attempt(angle))).collect();
                handles
                    .into_iter()
                    .map(|h| h.join().unwrap_or_else(|e| std::panic::resume_unwind(e)))
                    .collect()
            });
            Box::new(together.into_iter())
        };
    let mut best: Option<(LoftedSolid, Angle, MouldParts, f64)> = None;
    let mut failed = None;
    for (tried, &angle) in first.into_iter().chain(rest).zip(&candidates) {
        let (set, solid) = match tried {
            Ok(t) => t,
            Err(e) => {
                failed.get_or_insert(e);
                continue;
            }
        };
        let undercut = undercut(&set);
        if best.as_ref().is_none_or(|b| undercut < b.3) {
            best = Some((solid, angle, set, undercut));
        }
        if undercut == 0.0 {
            break;
        }
    }
    let (solid, angle, set, _) = match (best, failed) {
        (Some(b), _) => b,
        (None, Some(e)) => return Err(e),
        (None, None) => return Err(MeshError::Geometry("no pull direction to try".into())),
    };
    Ok((solid, angle, set))
}

/// The mould parts of the outer solid: cavity scaled by the expansion factor, the upper half
/// pulled normal to a chord at `angle`.
pub(super) fn mould_parts(
    outer: &LoftedSolid,
    params: &ToolingParams,
    angle: Angle,
) -> Result<MouldParts, MeshError> {
    let mut part = outer.clone();
    if params.mould_expansion_factor != 1.0 {
        part.mesh.scale(params.mould_expansion_factor);
    }
    let mould = MouldParams::pulled_at(
        angle,
        params.mould_margin,
        params.tolerance,
        params.min_draft,
        params.unit,
    );
    // The parting lines are the outer surface's silhouette along the pull: the parting surface
    // runs on from them across the pull.
    build_mould_parts(&part, &|_x: f64| angle, &mould)
}

/// Adds the mould parts to `parts`; the halves' and the end pieces' descriptions.
pub(super) fn push_mould_parts(
    set: MouldParts,
    parts: &mut Vec<Part>,
) -> ([MouldHalf; 2], Vec<MouldHalf>) {
    let [upper, lower] = set.half_meshes;
    let mut named = vec![
        ("mould-upper".to_string(), PartKind::MouldUpper, upper),
        ("mould-lower".to_string(), PartKind::MouldLower, lower),
    ];
    let mut ends = Vec::with_capacity(set.end_pieces.len());
    for (mesh, piece) in set.end_pieces {
        let name = format!("mould-{}", piece.side.replace(' ', "-"));
        named.push((name, PartKind::MouldEnd, mesh));
        ends.push(piece);
    }
    for (name, kind, mesh) in named {
        // A mould part is made as it is drawn: its volume is the part as written.
        let nominal_volume = mesh.signed_volume();
        parts.push(Part { name, kind, mesh, nominal_volume });
    }
    (set.halves, ends)
}

/// The chord angle the mould's pull is normal to: the chord's at the middle station.
pub(super) fn pull_angle(blade: &Blade, pitch: Angle) -> Angle {
    let r_mid = 0.5 * (blade.root_radius() + blade.tip_radius());
    blade.twist(r_mid) + pitch
}

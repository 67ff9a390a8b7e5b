//! Building a blade's tooling: the end trims, the cores cell by cell with their bulkheads and
//! prints, the shell, and the mould and casting moulds chosen in `mould_choice`.

use super::*;
use crate::mesh::{CheckParams, check_solid};
use crate::tooling::prints::PrintedCore;

/// A core cell through consecutive span segments: bounded in front by the leading-edge cut
/// (`None`) or web `k`'s back face, behind by web `k`'s front face or the trailing-edge cut.
#[derive(Debug, Clone, Copy)]
pub(super) struct CellSpan {
    pub(super) front: Option<usize>,
    pub(super) back: Option<usize>,
    pub(super) first: usize,
    pub(super) last: usize,
}

/// A web that starts or ends inside the span: a bulkhead across the cells it bounds.
#[derive(Debug, Clone, Copy)]
pub(super) struct Bulkhead {
    pub(super) r: f64,
    pub(super) thickness: f64,
}

/// How the tooling joins the chains of the blade's outline at the trailing edge: a point when
/// every station is sharp, else a closing segment (a blunt base) at every station, of no length
/// where a station is sharp or round. A blade whose trailing edge changes kind along the span (a
/// round root blending into flat-backed sections, a blunt root turning sharp outboard) keeps one
/// loft grid so: the base's length goes to zero towards the sharp stations and the loft contracts
/// the edges it leaves there (see `collapse`), so no facet of the parts lacks area.
///
/// Kept fallible for its callers; every blade has a kind today.
pub fn trailing_edge_kind(blade: &Blade) -> Result<EndKind, MeshError> {
    let blunt = blade.surfaces().blunt_trailing_edges();
    Ok(if blunt.iter().any(|&b| b) { EndKind::Segment } else { EndKind::Point })
}

/// Builds the tooling of `blade` (see the module docs). `progress(done, total, stage)` is called
/// as each part is lofted.
///
/// ```
/// use layloft::blade::Blade;
/// use layloft::input::read_project;
/// use layloft::mesh::{CheckParams, check_solid};
/// use layloft::tooling::{ToolingParams, build_tooling};
///
/// # fn main() -> Result<(), layloft::Error> {
/// let project = read_project("layups/mine-fan/blade.toml".as_ref())?;
/// let blade = Blade::from_project(&project)?;
/// let params = ToolingParams { tolerance: 0.5e-3, ..ToolingParams::default() };
/// let tooling = build_tooling(&blade, &params, &mut |_, _, _| {})?;
/// let names: Vec<&str> = tooling.parts.iter().map(|p| p.name.as_str()).collect();
/// let parts = ["core-1", "core-2", "shell", "mould-upper", "mould-lower"];
/// // The spherical ends undercut the halves' pull: an end piece at each end.
/// assert_eq!(names, [&parts[..], &["mould-root-end", "mould-tip-end"]].concat());
/// // The least clearance to the duct is the rotor's tip clearance.
/// let shell = &tooling.parts[2].mesh;
/// let reach = shell.vertices.iter().map(|p| p.iter().map(|c| c * c).sum::<f64>().sqrt());
/// let gap = project.rotor.tip_radius - reach.fold(0.0, f64::max);
/// assert!((gap - project.rotor.tip_clearance).abs() < 1e-9);
/// check_solid(shell, "shell", &CheckParams::default())?;
/// # Ok(())
/// # }
/// ```
pub fn build_tooling(
    blade: &Blade,
    params: &ToolingParams,
    progress: &mut dyn FnMut(usize, usize, &str),
) -> Result<BladeTooling, MeshError> {
    params.validate()?;
    let surfaces = blade.surfaces();
    let rotor = blade.rotor();
    let back = trailing_edge_kind(blade)?;
    let (r0, r1) = (blade.root_radius(), blade.tip_radius());
    let root_sphere = rotor.hub_radius + rotor.root_clearance;
    let tip_sphere = rotor.tip_radius - rotor.tip_clearance;
    let reach = section_reach(&surfaces, r0);
    if root_sphere <= reach {
        return Err(MeshError::Settings(format!(
            "the root sphere (hub_radius_m + root_clearance_m = {root_sphere:.4} m) does not reach \
             past the root section, which extends {reach:.4} m from the pitch axis: the sphere \
             cannot end the blade; expected hub_radius_m + root_clearance_m above {reach:.4} m, \
             a sphere about the rotor centre wide enough to cut across the whole root section \
             (the tooling carries the root section inboard from r = {r0:.4} m to that sphere)"
        )));
    }
    let x_lo = ((root_sphere * root_sphere - reach * reach).sqrt() - 0.05 * reach - 1e-3).max(0.0);
    let span = [x_lo, tip_sphere.max(r1) + 1e-3];
    let ends = EndSpheres {
        root: root_sphere,
        tip: tip_sphere,
        root_laminate: surfaces.least_skin_thickness(r0),
        tip_laminate: surfaces.least_skin_thickness(r1),
    };
    let pitch = params.pitch.unwrap_or(rotor.pitch);
    let outer = BladeSurface { surfaces: &surfaces, side: Side::Outer, pitch, span, back };
    let inner = BladeSurface { surfaces: &surfaces, side: Side::Inner, pitch, span, back };
    let loft = LoftParams { tolerance: params.tolerance, ..LoftParams::default() };

    // Where the cores close at the leading and trailing edges, solved every 4 mm or so along the
    // span and interpolated (each cut keeps a tenth of the least core thickness clear of where the
    // inner chains stop facing each other, far more than the interpolation moves it).
    let radii = span_samples(span);
    let cut_radii: Vec<f64> = {
        let n = ((span[1] - span[0]) / 4e-3).ceil().clamp(48.0, 600.0) as usize;
        (0..=n).map(|i| span[0] + (span[1] - span[0]) * i as f64 / n as f64).collect()
    };
    let base = |x: f64| surfaces.thickness(x, Surface::Upper, 1.0);
    let (mut le_y, mut te_y) = (Vec::with_capacity(cut_radii.len()), Vec::new());
    for &x in &cut_radii {
        let [front, back] = core_cuts(&inner, x, params.min_core_thickness, base(x))?;
        le_y.push(front);
        te_y.push(back);
    }
    let le_cut = Pchip::new(&cut_radii, &le_y);
    let te_cut = Pchip::new(&cut_radii, &te_y);
    let core_ends = blade
        .station_radii()
        .iter()
        .map(|&r| {
            let y = te_cut.eval(r);
            let (c, pa) = (blade.chord(r), blade.pitch_axis_frac(r));
            CoreEnd { r, y, chord_fraction: y / c + pa, solid_chord: (1.0 - pa) * c - y }
        })
        .collect();

    // Spanwise segments between web ends, and the cells of each.
    let bulkheads = bulkheads(&surfaces);
    let (outer_trims, inner_trims) = match params.ends {
        EndShape::Spheres => (
            Trims::spheres(root_sphere, tip_sphere),
            Trims::spheres(root_sphere + ends.root_laminate, tip_sphere - ends.tip_laminate),
        ),
        EndShape::Planes => {
            (Trims::planes(r0, r1), Trims::planes(r0 + ends.root_laminate, r1 - ends.tip_laminate))
        }
    };
    // Each cell is bounded by the leading-edge cut or a web's back face in front, and a web's
    // front face or the trailing-edge cut behind; it runs through every segment where that pair
    // bounds a cell, so a bulkhead closes only the cells that end at it.
    let segments: Vec<(Option<Bulkhead>, Option<Bulkhead>)> = (0..=bulkheads.len())
        .map(|seg| (seg.checked_sub(1).map(|i| bulkheads[i]), bulkheads.get(seg).copied()))
        .collect();
    let mut spans: Vec<CellSpan> = Vec::new();
    for (seg, &(lo, hi)) in segments.iter().enumerate() {
        let mid = match (lo, hi) {
            (Some(a), Some(b)) => 0.5 * (a.r + b.r),
            (Some(a), None) => 0.5 * (a.r + r1),
            (None, Some(b)) => 0.5 * (r0 + b.r),
            (None, None) => 0.5 * (r0 + r1),
        };
        let active: Vec<usize> = (0..blade.webs().len())
            .filter(|&k| {
                let w = &blade.webs()[k];
                mid >= w.r_start - 1e-9 && mid <= w.r_end + 1e-9
            })
            .collect();
        let mut bounds = vec![None];
        bounds.extend(active.iter().map(|&k| Some(k)));
        bounds.push(None);
        for pair in bounds.windows(2) {
            let (front, back) = (pair[0], pair[1]);
            match spans.iter_mut().find(|c| c.front == front && c.back == back && c.last + 1 == seg)
            {
                Some(c) => c.last = seg,
                None => spans.push(CellSpan { front, back, first: seg, last: seg }),
            }
        }
    }
    let mut cells: Vec<(CoreCell<'_>, Trims)> = Vec::with_capacity(spans.len());
    for c in &spans {
        let trims = Trims {
            root: segments[c.first]
                .0
                .map_or(inner_trims.root, |b| EndTrim::Plane { x: b.r + 0.5 * b.thickness }),
            tip: segments[c.last]
                .1
                .map_or(inner_trims.tip, |b| EndTrim::Plane { x: b.r - 0.5 * b.thickness }),
        };
        let face = |k: usize, sign: f64| {
            let w = blade.webs()[k].clone();
            let s = &surfaces;
            move |x: f64| {
                let xr = x.clamp(w.r_start, w.r_end);
                s.web_y(x, k) + sign * 0.5 * s.web_thickness(xr, k)
            }
        };
        // A bound outside the inner surface leaves the core no room: said with what bounds it
        // and what to change, as bad input.
        let bound_name = |b: Option<usize>, edge: &str| match b {
            None => format!("the {edge} edge (where the skins come within min_core_thickness_mm)"),
            Some(k) => format!("web '{}'", blade.webs()[k].name),
        };
        let no_room = |e: MeshError| match e {
            MeshError::Geometry(text) => MeshError::Settings(format!(
                "{text}: the core between {} and {} has no room there; expected each web at \
                 least min_core_thickness_mm of core depth away from the edges and from the \
                 other webs (move the web, or lower [tooling] min_core_thickness_mm)",
                bound_name(c.front, "leading"),
                bound_name(c.back, "trailing")
            )),
            other => other,
        };
        let exact = |x: f64, k: usize| {
            core_cuts(&inner, x, params.min_core_thickness, base(x)).map(|cuts| cuts[k])
        };
        let (exact_front, exact_back) = (|x: f64| exact(x, 0), |x: f64| exact(x, 1));
        let front = match c.front {
            None => CutBound::with_fallback(&inner, &radii, |x| le_cut.eval(x), Some(&exact_front)),
            Some(k) => CutBound::new(&inner, &radii, face(k, 1.0)),
        }
        .map_err(no_room)?;
        let back = match c.back {
            None => CutBound::with_fallback(&inner, &radii, |x| te_cut.eval(x), Some(&exact_back)),
            Some(k) => CutBound::new(&inner, &radii, face(k, -1.0)),
        }
        .map_err(no_room)?;
        cells.push((CoreCell { inner: &inner, front, back }, trims));
    }

    let total = cells.len() + 3;
    let mut done = 0;
    let mut step = |label: &str, progress: &mut dyn FnMut(usize, usize, &str)| {
        done += 1;
        progress(done, total, label);
    };
    let printing = params.print_fraction > 0.0;
    let side = |trim: EndTrim| trim.chord_for_sag(0.5 * params.tolerance).min(loft.max_edge);
    // The end each core's print leaves through: the root when the cell reaches it, else the
    // tip; `Err(())` for a core that reaches neither (it gets no print).
    let print_end = |span: &CellSpan| -> Option<Result<End, ()>> {
        if !printing {
            None
        } else if segments[span.first].0.is_none() {
            Some(Ok(End::Root))
        } else if segments[span.last].1.is_none() {
            Some(Ok(End::Tip))
        } else {
            Some(Err(()))
        }
    };
    // Each core lofted, and printed where it has a print (a print that cannot be made leaves
    // the core as with prints off, reported below).
    type Lofted = Result<(LoftedSolid, Option<(End, Result<PrintedCore, MeshError>)>), MeshError>;
    let core = |i: usize| -> Lofted {
        let ((cell, trims), span) = (&cells[i], &spans[i]);
        let name = format!("core-{}", i + 1);
        let solid = loft_solid(cell, trims, &loft)
            .map_err(|e| MeshError::Geometry(format!("{name}: {e}")))?;
        let printed = match print_end(span) {
            Some(Ok(end)) => {
                let set = PrintSetting {
                    fraction: params.print_fraction,
                    length: params.print_length,
                    core_trim: trims.at(end),
                    outer_trim: outer_trims.at(end),
                    max_side: side(trims.at(end)),
                    inset: 0.25 * params.min_core_thickness,
                    taper: print_taper(params.min_draft),
                };
                Some((end, print_or_fall(&name, &solid, end, cell, &set)))
            }
            _ => None,
        };
        Ok((solid, printed))
    };
    // The outer mould line is parted at its silhouette along the mould's pull, which is chosen
    // here (see `choose_pull`); the cores, which do not depend on it, are lofted beside it on a
    // second core. Failures are reported in the order of the work done one after the other: the
    // mould's first, then the cores' in their order.
    let mould_work = || {
        let chosen = choose_pull(blade, &outer, &outer_trims, &loft, params, pitch, span);
        choose_mould(chosen, &outer, &outer_trims, &loft, params, span)
    };
    let (chosen, lofted): (_, Vec<Lofted>) = if crate::parallel::threads() >= 2 {
        std::thread::scope(|scope| {
            let cores = scope.spawn(|| (0..cells.len()).map(core).collect());
            let chosen = mould_work();
            (chosen, cores.join().unwrap_or_else(|e| std::panic::resume_unwind(e)))
        })
    } else {
        let chosen = mould_work();
        let lofted = match &chosen {
            Ok(_) => (0..cells.len()).map(core).collect(),
            Err(_) => Vec::new(),
        };
        (chosen, lofted)
    };
    let (outer_solid, mould_pull_angle, mould) = chosen?;
    step("outer mould line", progress);
    let mut parts = Vec::with_capacity(total);
    let (mut printed, mut sealed, mut unprinted) = (Vec::new(), Vec::new(), Vec::new());
    let mut print_dropped = Vec::new();
    let mut clear = Vec::new();
    // Each printed core's part index, end and plain solid, in case the shell cannot take its
    // port (below).
    let mut plain = Vec::new();
    for (i, (lofted, span)) in lofted.into_iter().zip(&spans).enumerate() {
        let name = format!("core-{}", i + 1);
        let (solid, print) = lofted?;
        if matches!(print_end(span), Some(Err(()))) {
            unprinted.push(name.clone());
        }
        let mesh = match print {
            Some((end, Ok(p))) => {
                let mesh = p.mesh.clone();
                // As `print_or_fall` checked it, self-intersection included.
                clear.push(p.mesh.clone());
                printed.push(p);
                plain.push((parts.len(), end, solid.mesh));
                mesh
            }
            Some((end, Err(reason))) => {
                print_dropped.push(DroppedPrint { core: name.clone(), end, reason });
                sealed.push(solid.mesh.clone());
                solid.mesh
            }
            None => {
                sealed.push(solid.mesh.clone());
                solid.mesh
            }
        };
        let nominal_volume = mesh.signed_volume();
        let mut mesh = mesh;
        if params.core_shrink_factor != 1.0 {
            mesh.scale(params.core_shrink_factor);
        }
        parts.push(Part { name, kind: PartKind::Core, mesh, nominal_volume });
        step(&format!("core {}", i + 1), progress);
    }
    let plain_shell = |cavities: &[Mesh]| {
        let mut shell = outer_solid.mesh.clone();
        for core in cavities {
            let mut cavity = core.clone();
            cavity.flip();
            shell.merge(&cavity);
        }
        shell
    };
    let ported = if printed.is_empty() {
        None
    } else {
        // The shell is checked here for what its ports add (closed, oriented, no degenerate
        // facet); the check of every part before writing repeats it with the self-intersection
        // test.
        let topology =
            CheckParams { unit: params.unit, self_intersection: false, ..CheckParams::default() };
        Some(
            shell_with_ports(
                &outer_solid,
                &printed.iter().collect::<Vec<_>>(),
                &sealed.iter().collect::<Vec<_>>(),
                [outer_trims.root, outer_trims.tip],
                side(outer_trims.root).min(side(outer_trims.tip)),
            )
            .map_err(|e| MeshError::Geometry(format!("the shell's ports: {e}")))
            .and_then(|shell| {
                check_solid(&shell, "the shell with its ports", &topology).map(|_| shell)
            }),
        )
    };
    let shell = match ported {
        None => plain_shell(&sealed),
        Some(Ok(shell)) => shell,
        // A shell that cannot take the ports costs the cores their prints, not the blade its
        // tooling: every printed core is made as with prints off and reported, and the shell
        // is the one of prints off (cavities in core order).
        Some(Err(reason)) => {
            let mut cavities = Vec::with_capacity(sealed.len() + plain.len());
            let mut sealed_left = sealed.drain(..);
            let mut plain_left = plain.drain(..).peekable();
            let cores: Vec<usize> =
                (0..parts.len()).filter(|&k| parts[k].kind == PartKind::Core).collect();
            for k in cores {
                match plain_left.next_if(|(at, _, _)| *at == k) {
                    Some((_, end, mesh)) => {
                        let part = &mut parts[k];
                        part.nominal_volume = mesh.signed_volume();
                        part.mesh = mesh.clone();
                        if params.core_shrink_factor != 1.0 {
                            part.mesh.scale(params.core_shrink_factor);
                        }
                        print_dropped.push(DroppedPrint {
                            core: part.name.clone(),
                            end,
                            reason: reason.clone(),
                        });
                        cavities.push(mesh);
                    }
                    None => cavities.extend(sealed_left.next()),
                }
            }
            drop(sealed_left);
            printed.clear();
            plain_shell(&cavities)
        }
    };
    let shell_volume = shell.signed_volume();
    parts.push(Part {
        name: "shell".into(),
        kind: PartKind::Shell,
        mesh: shell,
        nominal_volume: shell_volume,
    });
    step("shell", progress);
    let max_side = side(outer_trims.root).min(side(outer_trims.tip));
    let mould = seat_prints(
        mould,
        &outer_solid,
        mould_pull_angle,
        params,
        &mut printed,
        &outer_trims,
        max_side,
    )?;
    let (moulds, end_pieces, modular) = match mould {
        Mould::Whole(set) => {
            let (moulds, end_pieces) = push_mould_parts(*set, &mut parts);
            (moulds, end_pieces, None)
        }
        Mould::Modular(m) => {
            let (moulds, end_pieces, modular) = push_modular_parts(m, &mut parts)?;
            (moulds, end_pieces, Some(modular))
        }
    };
    step("mould halves", progress);
    let root_extension = r0 - root_trim_x(&outer_solid);
    let mut machining = Vec::new();
    let descriptions: Vec<&MouldHalf> = match &modular {
        Some(m) => m.halves.iter().collect(),
        None => moulds.iter().collect(),
    };
    for (p, half) in
        parts.iter().filter(|p| p.kind.is_mould()).zip(descriptions.into_iter().chain(&end_pieces))
    {
        // The casting leaves a half's cavity against the half's own pull.
        let (mesh, frame) = to_machining_frame(&p.mesh, vec3::scale(half.pull, -1.0))?;
        let name = format!("{}-machining", p.name);
        machining.push(MachinedPart { part: p.name.clone(), name, mesh, frame });
    }
    let (casting, casting_notes) = match &params.casting {
        Some(c) => {
            let prints: Vec<&CorePrint> = printed.iter().map(|p| &p.print).collect();
            casting_moulds(&cells, &loft, params, c, mould_pull_angle, &prints)
        }
        None => (Vec::new(), Vec::new()),
    };
    Ok(BladeTooling {
        parts,
        core_ends,
        ends,
        root_extension: root_extension.max(0.0),
        tip_extension: (tip_sphere - r1).max(0.0),
        moulds,
        pitch,
        params: params.clone(),
        machining,
        end_pieces,
        mould_pull_angle,
        prints: printed.into_iter().map(|p| p.print).collect(),
        unprinted,
        print_dropped,
        casting,
        casting_notes,
        modular,
        clear,
    })
}

/// The least x of the root ring: where the root sphere meets the farthest line.
pub(super) fn root_trim_x(solid: &LoftedSolid) -> f64 {
    solid
        .root_ring
        .iter()
        .map(|&v| solid.mesh.vertices[v as usize][0])
        .fold(f64::INFINITY, f64::min)
}

/// The greatest distance of the outer contour at `r` from the pitch axis, m (400 points a
/// surface, plus 1 %).
pub(super) fn section_reach(surfaces: &BladeSurfaces<'_>, r: f64) -> f64 {
    let far = (0..=400)
        .flat_map(|i| {
            let u = i as f64 / 400.0;
            [surfaces.outer(r, Surface::Upper, u), surfaces.outer(r, Surface::Lower, u)]
        })
        .map(|p| p[0].hypot(p[1]))
        .fold(0.0, f64::max);
    1.01 * far
}

/// Web ends strictly inside the span, with the web laminate there, root first.
pub(super) fn bulkheads(surfaces: &BladeSurfaces<'_>) -> Vec<Bulkhead> {
    let blade = surfaces.blade();
    let (r0, r1) = (blade.root_radius(), blade.tip_radius());
    let mut out: Vec<Bulkhead> = Vec::new();
    for (k, w) in blade.webs().iter().enumerate() {
        for r in [w.r_start, w.r_end] {
            if r > r0 + 1e-9 && r < r1 - 1e-9 {
                let thickness = surfaces.web_thickness(r, k);
                match out.iter_mut().find(|b| (b.r - r).abs() < 1e-9) {
                    Some(b) => b.thickness = b.thickness.max(thickness),
                    None => out.push(Bulkhead { r, thickness }),
                }
            }
        }
    }
    out.sort_by(|a, b| a.r.total_cmp(&b.r));
    out
}

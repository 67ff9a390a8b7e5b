//! Span-wise modules: a mould of two halves per stretch of the span, each with its own pull and
//! parting, all in one block.

use super::*;

/// A mould of span-wise modules, each a mould of two halves pulled along its own direction
/// normal to the pitch axis (see [`crate::tooling::span_modules`] for how the modules are found).
#[derive(Debug, Clone)]
pub struct ModularMould {
    /// The modules, root first.
    pub modules: Vec<SpanModule>,
    /// Each module's part: the surface parted at its own silhouette, ended by the blade's trim
    /// at the outer ends and by the plane `x = const` where it meets its neighbour.
    pub solids: Vec<LoftedSolid>,
    /// Each module's halves and end pieces (only the first module can have a root end piece and
    /// only the last a tip end piece).
    pub parts: Vec<MouldParts>,
    /// Size of the whole block (all modules together) along the common frame's X, Y and Z, m.
    pub block_size: [f64; 3],
}

/// Lofts each module of `surface` parted at its silhouette along its own pull (its extremes
/// sampled over the module's radii, the outer modules out to the surface's ends): the blade's
/// `trims` at the outer ends, planes at the radii where modules meet. The modules should cover
/// the surface's whole span (see [`crate::tooling::span_modules`]).
pub fn loft_modules(
    surface: &dyn SpanSurface,
    trims: &Trims,
    loft: &LoftParams,
    modules: &[SpanModule],
) -> Result<Vec<LoftedSolid>, MeshError> {
    let last = modules.len().saturating_sub(1);
    modules
        .iter()
        .enumerate()
        .map(|(j, m)| {
            let t = Trims {
                root: if j == 0 { trims.root } else { EndTrim::Plane { x: m.x_range[0] } },
                tip: if j == last { trims.tip } else { EndTrim::Plane { x: m.x_range[1] } },
            };
            let span = surface.span();
            let range = [
                if j == 0 { span[0] } else { m.x_range[0] },
                if j == last { span[1] } else { m.x_range[1] },
            ];
            loft_solid(&SilhouetteSurface::over(surface, m.pull_angle, range), &t, loft)
                .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))
        })
        .collect()
}

/// The pull of a module of chord angle ψ: `(0, −sin ψ, cos ψ)`.
pub(super) fn module_pull(psi: Angle) -> P3 {
    let (s, c) = psi.rad().sin_cos();
    [0.0, -s, c]
}

/// Builds a mould of span-wise modules round the module parts `solids` (from [`loft_modules`],
/// scaled as the cavity is to be): every module is a mould of two halves pulled along its own
/// pull and parted at its own silhouette, the modules in one block whose frame is pulled along
/// the mean of the modules' pulls, with one extent across the span; a module's block ends flush
/// at the plane where it meets its neighbour (that face is normal to the pitch axis, parallel to
/// every pull, so the modules slide apart along it). `params.pull` is not used. The locating pins
/// of a module lean along its pull; a module between two others has no corner patch for them
/// and so no pins; it is located by the wedge keys across its flush faces (see `flush`).
pub fn build_modular_mould(
    solids: &[LoftedSolid],
    modules: &[SpanModule],
    params: &MouldParams,
) -> Result<ModularMould, MeshError> {
    if solids.len() != modules.len() || modules.is_empty() {
        return Err(MeshError::Geometry(format!(
            "{} module parts for {} mould modules",
            solids.len(),
            modules.len()
        )));
    }
    // The block's frame: the mean pull angle (the modules' angles unwrapped from the first).
    let first = modules[0].pull_angle.deg();
    let mean = modules
        .iter()
        .map(|m| first + (m.pull_angle.deg() - first + 90.0).rem_euclid(180.0) - 90.0)
        .sum::<f64>()
        / modules.len() as f64;
    let frame = frame_of(module_pull(Angle::from_deg(mean)));
    let last = modules.len() - 1;
    let block_of = |j: usize, yz: Option<[f64; 4]>| Block {
        frame,
        yz,
        flush: [
            (j > 0).then_some(modules[j].x_range[0]),
            (j < last).then_some(modules[j].x_range[1]),
        ],
    };
    // First each module's own extent across the span, then all built in their union.
    let mut yz = [f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY];
    let mut x = [f64::INFINITY, f64::NEG_INFINITY];
    for (j, (part, m)) in solids.iter().zip(modules).enumerate() {
        let module = MouldParams { pull: module_pull(m.pull_angle), ..params.clone() };
        let psi = m.pull_angle;
        let (sides, _) = parting_loop(part)?;
        let b = block_of(j, None);
        // (Extents only: the caps' middles are not checked here.)
        let l = layout(part, sides, &frame, &|_x| psi, &module, Some(&b), [true; 2], module.pull)
            .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))?;
        yz = [
            yz[0].min(l.ends[0].iter().map(|p| p[1]).fold(f64::INFINITY, f64::min)),
            yz[1].max(l.ends[2].iter().map(|p| p[1]).fold(f64::NEG_INFINITY, f64::max)),
            yz[2].min(l.z_bottom),
            yz[3].max(l.z_top),
        ];
        x = [x[0].min(l.corners[3][0]), x[1].max(l.corners[0][0])];
    }
    // Then their heights with the parting surfaces carried out to the common faces Y_a, Y_b:
    // a ruling along a module's chord line climbs (or falls) the further it runs when the
    // module's pull is turned from the block's, so each module's top and bottom are found
    // again with those faces, and the block takes the highest top and the lowest bottom.
    let across = yz;
    for (j, (part, m)) in solids.iter().zip(modules).enumerate() {
        let module = MouldParams { pull: module_pull(m.pull_angle), ..params.clone() };
        let psi = m.pull_angle;
        let (sides, _) = parting_loop(part)?;
        let b = block_of(j, Some(across));
        let l = layout(part, sides, &frame, &|_x| psi, &module, Some(&b), [true; 2], module.pull)
            .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))?;
        yz = [yz[0], yz[1], yz[2].min(l.z_bottom), yz[3].max(l.z_top)];
    }
    let mut parts = Vec::with_capacity(modules.len());
    for (j, (part, m)) in solids.iter().zip(modules).enumerate() {
        let module = MouldParams { pull: module_pull(m.pull_angle), ..params.clone() };
        let psi = m.pull_angle;
        let set = build_mould_set(part, &|_x| psi, &module, None, Some(&block_of(j, Some(yz))))
            .map_err(|e| MeshError::Geometry(format!("mould module {}: {e}", j + 1)))?;
        parts.push(set);
    }
    Ok(ModularMould {
        modules: modules.to_vec(),
        solids: solids.to_vec(),
        parts,
        block_size: [x[1] - x[0], yz[1] - yz[0], yz[3] - yz[2]],
    })
}

//! Where everything of a mould set lies ([`Layout`]), worked out from the part, the pull and the
//! chord angle that turns each section.

use super::*;

/// Where everything lies (see [`Layout`]); `chord_angle(x)` turns the section at radius x.
#[allow(clippy::too_many_arguments)]
pub(super) fn layout(
    part: &LoftedSolid,
    sides: [Vec<u32>; 4],
    frame: &Frame,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
    block: Option<&Block>,
    bored: [bool; 2],
    pull: P3,
) -> Result<Layout, MeshError> {
    let flush = block.map_or([None; 2], |b| b.flush);
    let q: Vec<P3> = part.mesh.vertices.iter().map(|&p| frame.to_mould(p)).collect();
    let (mut lo, mut hi) = ([f64::INFINITY; 3], [f64::NEG_INFINITY; 3]);
    for t in &part.mesh.triangles {
        for &v in t {
            for k in 0..3 {
                lo[k] = lo[k].min(q[v as usize][k]);
                hi[k] = hi[k].max(q[v as usize][k]);
            }
        }
    }
    let m = params.margin;
    let [mut xa, mut xb, mut ya, mut yb] = [lo[0] - m, hi[0] + m, lo[1] - m, hi[1] + m];
    if let Some(x) = flush[0] {
        xa = x;
    }
    if let Some(x) = flush[1] {
        xb = x;
    }
    if let Some([a, b, _, _]) = block.and_then(|b| b.yz) {
        (ya, yb) = (a, b);
    }
    let place = |v: u32| Place { point: part.mesh.vertices[v as usize], unit: params.unit };
    // Each side's vertices must advance steadily along it (X along the edges, Y across the caps).
    // (A bored end's side is replaced by the end ring.)
    for (s, line) in sides.iter().enumerate() {
        if (s == 3 && bored[0]) || (s == 1 && bored[1]) {
            continue;
        }
        let (axis, sign) = [(0, 1.0), (1, 1.0), (0, -1.0), (1, -1.0)][s];
        if let Some(w) = line
            .windows(2)
            .find(|w| (q[w[1] as usize][axis] - q[w[0] as usize][axis]) * sign <= 0.0)
        {
            return Err(MeshError::Geometry(format!(
                "the parting line doubles back near {}: the {} does not advance steadily",
                place(w[1]),
                ["front line", "tip cap's middle", "back line", "root cap's middle"][s]
            )));
        }
    }
    // Rulings: along the section's chord line from the front and back lines, along X from the
    // caps.
    let chord_ruling = |v: u32, aft: bool, y_face: f64| -> Result<P3, MeshError> {
        let p = part.mesh.vertices[v as usize];
        let (s, c) = chord_angle(p[0]).rad().sin_cos();
        let dir = vec3::scale([0.0, c, s], if aft { 1.0 } else { -1.0 });
        let d = [0.0, vec3::dot(dir, frame.ey), vec3::dot(dir, frame.ez)];
        let along = (y_face - q[v as usize][1]) / d[1];
        if !(d[1].abs() > 0.1 && along.is_finite() && along >= 0.0) {
            return Err(MeshError::Settings(format!(
                "the chord at {} is turned {:.1}° from the mould's parting direction: a two-part \
                 mould pulled normal to the middle chord cannot part there",
                place(v),
                d[2].atan2(d[1].abs()).to_degrees()
            )));
        }
        Ok(vec3::add(q[v as usize], vec3::scale(d, along)))
    };
    let ends: [Vec<P3>; 4] = [
        sides[0].iter().map(|&v| chord_ruling(v, false, ya)).collect::<Result<_, _>>()?,
        sides[1].iter().map(|&v| [xb, q[v as usize][1], q[v as usize][2]]).collect(),
        sides[2].iter().map(|&v| chord_ruling(v, true, yb)).collect::<Result<_, _>>()?,
        sides[3].iter().map(|&v| [xa, q[v as usize][1], q[v as usize][2]]).collect(),
    ];
    let last = |s: usize| ends[s][ends[s].len() - 1];
    let corners = [
        [xb, ya, last(0)[2]],
        [xb, yb, ends[2][0][2]],
        [xa, yb, last(2)[2]],
        [xa, ya, ends[0][0][2]],
    ];
    let parting_z = ends.iter().flatten().chain(corners.iter()).map(|p| p[2]);
    let mut z_top = parting_z.clone().fold(hi[2], f64::max) + m;
    let mut z_bottom = parting_z.fold(lo[2], f64::min) - m;
    if let Some([_, _, b, t]) = block.and_then(|b| b.yz) {
        (z_bottom, z_top) = (z_bottom.min(b), z_top.max(t));
    }
    // Pins lean along the pull where it is not the frame's Z (span-wise modules): `tan` of the
    // pull's angle from Z in the (Y, Z) plane.
    let lean = match block {
        Some(_) => vec3::dot(pull, frame.ey) / vec3::dot(pull, frame.ez),
        None => 0.0,
    };
    // Locating features at half the margin from the part's corner, on three corner patches.
    let (base, height) = (m / 6.0, m / 3.0);
    let taper = CONE_HALF_ANGLE_DEG.to_radians().tan();
    let segments = {
        let r = base + LOCATOR_CLEARANCE;
        let step = 2.0 * (1.0 - (params.tolerance / r).min(0.5)).acos();
        let n = (std::f64::consts::TAU / step).ceil().max(16.0) as usize;
        n.div_ceil(4) * 4
    };
    let mut locators = Vec::with_capacity(3);
    // A corner next to a flush end has no patch.
    let open = |c: usize| match c {
        0 | 1 => flush[1].is_none(),
        _ => flush[0].is_none(),
    };
    for corner in [3, 2, 1].into_iter().filter(|&c| open(c)) {
        let p = q[sides[corner][sides[corner].len() - 1] as usize];
        let k = corners[corner];
        let slope = (k[2] - p[2]) / (k[1] - p[1]);
        let (cx, cy) =
            (p[0] + 0.5 * m * (k[0] - p[0]).signum(), p[1] + 0.5 * m * (k[1] - p[1]).signum());
        let cz = p[2] + slope * (cy - p[1]);
        // The pin's axis along the pull: an affine lean that keeps the patch in place, by
        // `shear` per unit height above it along the patch's own Y direction (0, 1, slope).
        let shear = lean / (1.0 - slope * lean);
        let rise = (height + LOCATOR_CLEARANCE) * (1.0 + (slope * shear).max(0.0));
        if shear.is_nan() || shear.abs() >= 1.0 {
            return Err(MeshError::Settings(format!(
                "a module of the mould is pulled {:.1}° from its block's frame: its locating \
                 pins would lean too far",
                lean.atan().to_degrees()
            )));
        }
        if base - height * taper <= 0.0 || cz + rise >= z_top {
            return Err(MeshError::Settings(format!(
                "a mould margin of {:.1} mm leaves no room for the locating pins",
                m * 1e3
            )));
        }
        locators.push(Locator {
            corner,
            centre: [cx, cy, cz],
            slope,
            base,
            height,
            taper,
            clearance: LOCATOR_CLEARANCE,
            segments,
            shear,
        });
    }
    Ok(Layout {
        sides,
        ends,
        corners,
        z_top,
        z_bottom,
        margin: m,
        locators,
        bored: [false; 2],
        keys: Vec::new(),
        flush_keys: Vec::new(),
    })
}

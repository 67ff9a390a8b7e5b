//! Draft of a surface against the pull direction of a mould half.
//!
//! For a facet with outward unit normal `n` (outward from the part) and a mould half pulled
//! away along the unit vector `d`, the draft angle is `asin(n · d)`: 90° for a face the half
//! leaves squarely, 0° for a wall parallel to the pull, negative for a face turned away from the
//! pull (an undercut: the half cannot leave it without tearing the part). This is the local test
//! of mould design (common practice); a surface all of whose facets draw is a graph over the
//! plane normal to `d` when its projection does not fold, which the parting line ensures.

use crate::mesh::LengthUnit;
use crate::mesh::Mesh;
use crate::mesh::vec3;
use crate::mesh::{MeshError, Place};
use crate::units::Angle;

/// A facet parallel to the pull has `n · d` of round-off size; below `-ROUND_OFF` (a draft of
/// about −6e-8°) it counts as an undercut.
const ROUND_OFF: f64 = 1e-9;

/// How a set of facets draws along a pull direction.
#[derive(Debug, Clone, PartialEq)]
pub struct DraftReport {
    /// The least draft angle among the facets (negative: an undercut).
    pub min_draft: Angle,
    /// The facet with the least draft.
    pub triangle: usize,
    /// Its centroid, rotor frame.
    pub at: Place,
    /// Area of the facets whose draft is below the least acceptable, m².
    pub below_min_area: f64,
    /// Facets turned away from the pull (undercuts: draft below about −6e-8°, round-off
    /// aside), by index.
    pub undercuts: Vec<usize>,
    /// Their area, m².
    pub undercut_area: f64,
}

/// Evaluates the draft of `faces` of `mesh` (all facets when `None`) along `pull` against the
/// least acceptable draft `min_draft`. Places are named in `unit`.
pub fn evaluate_draft(
    mesh: &Mesh,
    faces: Option<&[usize]>,
    pull: [f64; 3],
    min_draft: Angle,
    unit: LengthUnit,
) -> Result<DraftReport, MeshError> {
    let len = vec3::norm(pull);
    if !(len.is_finite() && len > 0.0) {
        return Err(MeshError::Parameter {
            name: "pull direction length".into(),
            value: len,
            expected: "a finite, non-zero vector",
        });
    }
    let d = vec3::scale(pull, 1.0 / len);
    let all: Vec<usize>;
    let faces = match faces {
        Some(f) => f,
        None => {
            all = (0..mesh.len()).collect();
            &all
        }
    };
    let limit = min_draft.rad().sin();
    let mut worst: Option<(f64, usize)> = None;
    let (mut below, mut under_area, mut undercuts) = (0.0, 0.0, Vec::new());
    for &t in faces {
        if t >= mesh.len() {
            return Err(MeshError::Geometry(format!(
                "draft: facet {t} is past the mesh's {} facets",
                mesh.len()
            )));
        }
        let s = vec3::dot(mesh.triangle_normal(t), d).clamp(-1.0, 1.0);
        let area = mesh.triangle_area(t);
        if s < limit {
            below += area;
        }
        if s < -ROUND_OFF {
            under_area += area;
            undercuts.push(t);
        }
        if worst.is_none_or(|(w, _)| s < w) {
            worst = Some((s, t));
        }
    }
    let (s, triangle) = worst.ok_or_else(|| MeshError::Empty { part: "draft selection".into() })?;
    Ok(DraftReport {
        min_draft: Angle::from_rad(s.asin()),
        triangle,
        at: Place { point: mesh.triangle_centroid(triangle), unit },
        below_min_area: below,
        undercuts,
        undercut_area: under_area,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::tooling::{LoftParams, loft_polygons};

    #[test]
    fn a_tapered_block_draws_at_its_taper_angle() {
        // A frustum of a square pyramid, sides inclined 5 degrees to the pull (+x): pulled along
        // +x its side faces have draft 5 degrees (geometry of the inclined plane) and the end
        // face 90; pulled along -x the sides are undercuts of -5 degrees.
        let taper = 5f64.to_radians().tan();
        let outline = move |x: f64| {
            let h = 0.1 - x * taper;
            vec![[-h, -h], [-h, h], [h, h], [h, -h]]
        };
        let mesh = loft_polygons(&outline, [0.0, 0.5], &LoftParams::default()).unwrap();
        let sides: Vec<usize> =
            (0..mesh.len()).filter(|&t| mesh.triangle_normal(t)[0].abs() < 0.5).collect();
        let up = evaluate_draft(
            &mesh,
            Some(&sides),
            [1.0, 0.0, 0.0],
            Angle::from_deg(1.0),
            LengthUnit::Millimetre,
        )
        .unwrap();
        assert!((up.min_draft.deg() - 5.0).abs() < 1e-9, "{}", up.min_draft.deg());
        assert!(up.undercuts.is_empty() && up.below_min_area == 0.0);
        let down = evaluate_draft(
            &mesh,
            None,
            [-2.0, 0.0, 0.0],
            Angle::from_deg(1.0),
            LengthUnit::Millimetre,
        )
        .unwrap();
        assert!((down.min_draft.deg() + 90.0).abs() < 1e-9);
        let side_area: f64 = sides.iter().map(|&t| mesh.triangle_area(t)).sum();
        let tip_area = mesh.triangle_area(0) * 0.0 + 4.0 * (0.1 - 0.5 * taper).powi(2);
        assert!((down.undercut_area - side_area - tip_area).abs() < 1e-12);
        assert!(evaluate_draft(&mesh, None, [0.0; 3], Angle::ZERO, LengthUnit::Metre).is_err());
    }
}

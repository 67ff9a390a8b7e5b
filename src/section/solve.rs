//! The solver's entry point: checks the layout, runs the stages and gathers the properties.

use nalgebra::{DMatrix, Matrix4};

use super::contour::{Contour, Node, WallElement, build_contour, y_c};
use super::error::SectionError;
use super::mass::mass_properties;
use super::outline::{Point, chain_z_at, lerp, norm, sub};
use super::properties::SectionProperties;
use super::shear_flow::{ShearSolution, solve_shear};
use super::stiffness::{assemble, elastic_centre, principal, shift};
use super::wall::{WallCurvature, WallStiffness};
use super::warning::SectionWarning;
use crate::layout::SectionLayout;
use crate::units::Angle;

/// Tuning of the section solver.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SectionParams {
    /// Straight elements along the depth of each shear web (its stress recovery points).
    pub web_elements: usize,
    /// Wall thickness over local section depth above which a warning is given; 0.10 by default
    /// (common practice for thin-wall theory, no standard clause).
    pub thick_wall_ratio: f64,
    /// Longest mitre at a sharp corner of the offset midline, in half wall thicknesses (20 by
    /// default, a corner of about 6°); sharper corners are where walls meet and are cut away.
    pub max_mitre: f64,
    /// How the wall curvatures follow the beam ([`WallCurvature::Beam`] by default).
    pub wall_curvature: WallCurvature,
}

impl Default for SectionParams {
    fn default() -> Self {
        SectionParams {
            web_elements: 8,
            thick_wall_ratio: 0.10,
            max_mitre: 20.0,
            wall_curvature: WallCurvature::Beam,
        }
    }
}

/// A solved section: its properties together with the wall elements and the kernels that stress
/// recovery needs (see [`SolvedSection::wall_states`]).
#[derive(Debug, Clone)]
pub struct SolvedSection {
    /// Stiffness, centres and mass properties.
    pub properties: SectionProperties,
    pub(crate) contour: Contour,
    pub(crate) walls: Vec<WallStiffness>,
    pub(crate) cell_flow: DMatrix<f64>,
    pub(crate) shear: ShearSolution,
    pub(crate) compliance: Matrix4<f64>,
    pub(crate) wall_curvature: WallCurvature,
}

impl SolvedSection {
    /// Solves the section; see the module documentation for the method.
    pub fn solve(layout: &SectionLayout, params: &SectionParams) -> Result<Self, SectionError> {
        check_layout(layout)?;
        let r = layout.r;
        let walls = layout
            .laminates
            .iter()
            .enumerate()
            .map(|(index, l)| {
                WallStiffness::from_laminate(l).map_err(|source| SectionError::Laminate {
                    r,
                    index,
                    source,
                })
            })
            .collect::<Result<Vec<_>, _>>()?;
        let thickness: Vec<f64> = walls.iter().map(|w| w.thickness).collect();
        let contour = build_contour(layout, &thickness, params.web_elements, params.max_mitre)?;
        // The walls' laminate cannot hold more area than the outline encloses: such plies
        // would not fit in the mould, and the thin-wall sums would count the excess twice.
        let laminate_area: f64 =
            contour.elements.iter().map(|e| thickness[e.laminate] * e.length()).sum();
        let outline_area = polygon_area(&layout.outer).abs();
        if laminate_area > outline_area {
            return Err(SectionError::Overfull { r, laminate_area, outline_area });
        }
        let bad = |reason: &str| SectionError::Stiffness { r, reason: reason.to_string() };
        let mode = params.wall_curvature;
        let asm = assemble(&contour, &walls, mode)
            .ok_or_else(|| bad("singular: a cell wall has no shear stiffness"))?;
        let s0 = asm.stiffness;
        let compliance0 = spd_inverse(&s0).ok_or_else(|| bad("not positive definite"))?;
        let ec = elastic_centre(&compliance0).ok_or_else(|| bad("without bending stiffness"))?;
        let t = shift(ec);
        let stiffness = t.transpose() * s0 * t;
        let compliance = spd_inverse(&stiffness).ok_or_else(|| bad("not positive definite"))?;
        let shear = solve_shear(&contour, &walls, &asm, &compliance0, mode)
            .ok_or_else(|| bad("without a finite shear centre"))?;
        let mass = mass_properties(&contour, &walls);
        let (ei_principal, angle) =
            principal(stiffness[(2, 2)], stiffness[(3, 3)], stiffness[(2, 3)]);
        let used = contour.elements.iter().map(|e| thickness[e.laminate]);
        let wall_thickness = used.fold([f64::INFINITY, 0.0], |[lo, hi], t| [lo.min(t), hi.max(t)]);

        let mut warnings = Vec::new();
        let depth = depth_check(
            layout,
            &thickness,
            contour.merge,
            closed_corner(layout, &contour),
            params.thick_wall_ratio,
        );
        // The note on meeting trailing-edge walls is given only where the idealisation changes
        // a result: the torsion of a closed cell grows with the square of its enclosed area, so a
        // wedge aft of the meeting point holding under TE_NOTE_AREA of the section's area changes
        // the torsional stiffness by under about twice that.
        let te_matters = contour.merge.is_some_and(|x| {
            area_aft(&layout.outer, x[0]) > TE_NOTE_AREA * polygon_area(&layout.outer)
        });
        if let Some(x) = contour.merge.filter(|_| te_matters) {
            warnings.push(SectionWarning::WallsMeet {
                at_y_c: y_c(layout, x[0]),
                converging_from_y_c: depth.converging.map(|y| y_c(layout, y)),
                limit_ratio: params.thick_wall_ratio,
            });
        }
        if let Some((ratio, y)) = depth.worst {
            warnings.push(SectionWarning::ThickWall {
                ratio,
                at_y_c: y_c(layout, y),
                limit_ratio: params.thick_wall_ratio,
            });
        }
        if mass.mass.is_nan() || mass.mass <= 0.0 {
            warnings.push(SectionWarning::NoMass);
        }

        let properties = SectionProperties {
            r,
            chord: layout.chord,
            twist: layout.twist,
            stiffness,
            stiffness_pitch_axis: s0,
            ea: stiffness[(0, 0)],
            ei_flap: stiffness[(2, 2)],
            ei_edge: stiffness[(3, 3)],
            ei_cross: stiffness[(2, 3)],
            gj: stiffness[(1, 1)],
            extension_twist: stiffness[(0, 1)],
            flap_twist: stiffness[(1, 2)],
            edge_twist: stiffness[(1, 3)],
            ei_principal,
            principal_angle: Angle::from_rad(angle),
            elastic_centre: ec,
            shear_centre: shear.centre,
            mass_centre: mass.centre,
            mass_per_length: mass.mass,
            inertia: mass.inertia,
            wall_thickness,
            enclosed_area: contour.cell_areas.iter().sum(),
            warnings,
        };
        let p = &properties;
        let scalars = [p.mass_per_length, p.inertia.flap, p.inertia.edge, p.inertia.product];
        let finite = p.stiffness.iter().chain(p.stiffness_pitch_axis.iter()).all(|v| v.is_finite())
            && scalars.iter().chain(&p.ei_principal).all(|v| v.is_finite())
            && [p.elastic_centre, p.shear_centre, p.mass_centre]
                .iter()
                .flatten()
                .all(|v| v.is_finite());
        if !finite {
            return Err(bad("not finite"));
        }
        Ok(SolvedSection {
            properties,
            contour,
            walls,
            cell_flow: asm.cell_flow,
            shear,
            compliance,
            wall_curvature: mode,
        })
    }

    /// The wall elements: the closed outer loop first (from the leading edge, clockwise seen from
    /// the tip), then each web from its lower end, then any trailing-edge branches.
    pub fn elements(&self) -> &[WallElement] {
        &self.contour.elements
    }

    /// The beam-wall reduction of laminate `index` of the layout.
    pub fn wall_stiffness(&self, index: usize) -> Option<&WallStiffness> {
        self.walls.get(index)
    }

    /// How the wall curvatures follow the beam in this solution.
    pub fn wall_curvature(&self) -> WallCurvature {
        self.wall_curvature
    }

    /// Number of closed cells.
    pub fn cells(&self) -> usize {
        self.contour.cell_areas.len()
    }

    /// Area enclosed by the midline of each cell, m², leading-edge cell first.
    pub fn cell_areas(&self) -> &[f64] {
        &self.contour.cell_areas
    }
}

/// Solves one section and returns its properties; [`SolvedSection::solve`] keeps the wall data
/// for stress recovery as well.
pub fn solve_section(
    layout: &SectionLayout,
    params: &SectionParams,
) -> Result<SectionProperties, SectionError> {
    SolvedSection::solve(layout, params).map(|s| s.properties)
}

fn spd_inverse(s: &Matrix4<f64>) -> Option<Matrix4<f64>> {
    let d = s.diagonal();
    if d.iter().any(|&v| !v.is_finite() || v <= 0.0) {
        return None;
    }
    let scale = Matrix4::from_diagonal(&d.map(|v| 1.0 / v.sqrt()));
    let chol = (scale * s * scale).cholesky()?;
    Some(scale * chol.inverse() * scale)
}

fn check_layout(layout: &SectionLayout) -> Result<(), SectionError> {
    let r = layout.r;
    let degenerate = |reason: String| SectionError::Degenerate { r, reason };
    let layout_err = |what: String, expected: String, found: String| SectionError::Layout {
        r,
        what,
        expected,
        found,
    };
    if !r.is_finite() || !layout.pitch_axis_frac.is_finite() || !layout.twist.rad().is_finite() {
        return Err(degenerate("radius, twist or pitch axis is not a finite number".into()));
    }
    if !(layout.chord > 0.0 && layout.chord.is_finite()) {
        return Err(layout_err(
            "chord".into(),
            "a positive length".into(),
            layout.chord.to_string(),
        ));
    }
    let n = layout.outer.len();
    if n < 3 {
        return Err(degenerate(format!("{n} points; at least 3 are needed")));
    }
    if let Some(i) = layout.outer.iter().position(|p| !p[0].is_finite() || !p[1].is_finite()) {
        return Err(degenerate(format!("point {i} is not finite")));
    }
    if layout.segment_laminate.len() != n {
        return Err(layout_err(
            "segment_laminate".into(),
            format!("one laminate per outer segment ({n})"),
            layout.segment_laminate.len().to_string(),
        ));
    }
    let count = layout.laminates.len();
    let expected = || format!("a laminate index below {count}");
    if let Some(i) = layout.segment_laminate.iter().position(|&k| k >= count) {
        let found = layout.segment_laminate[i].to_string();
        return Err(layout_err(format!("laminate of outer segment {i}"), expected(), found));
    }
    if let Some(w) = layout.webs.iter().find(|w| w.laminate >= count) {
        let what = format!("laminate of web '{}'", w.name);
        return Err(layout_err(what, expected(), w.laminate.to_string()));
    }
    Ok(())
}

/// Where walls are thick against the local depth normal to the chord.
struct DepthCheck {
    /// The worst ratio above the limit and its place `y`, away from a converging trailing edge.
    worst: Option<(f64, f64)>,
    /// With walls meeting at the trailing edge: the foremost `y` behind the deepest place from
    /// which the ratio stays above the limit (reported with the meeting point instead).
    converging: Option<f64>,
}

/// The chordwise place `y` of the midline's trailing-edge corner when the outline ends in a
/// sharp closed trailing edge whose walls do not cross (their offset corner is a mitre ahead of
/// the edge); `None` for a blunt trailing edge or walls that meet (see [`Contour::merge`]).
fn closed_corner(layout: &SectionLayout, contour: &Contour) -> Option<f64> {
    if contour.merge.is_some() {
        return None;
    }
    let pts = &layout.outer;
    let n = pts.len();
    let i_te = (0..n).fold(0, |b, i| if pts[i][0] > pts[b][0] { i } else { b });
    // Sharp: both edges at the aftmost point run mostly along the chord (no base).
    let along = |a: Point, b: Point| {
        let d = sub(b, a);
        (d[0] / norm(d)).abs() >= 0.5
    };
    let sharp = along(pts[(i_te + n - 1) % n], pts[i_te]) && along(pts[i_te], pts[(i_te + 1) % n]);
    if !sharp {
        return None;
    }
    let k = contour.loop_nodes.iter().position(|n| matches!(n, Node::TrailingEdge))?;
    Some(contour.elements[k].start[0])
}

/// Wall thickness against the local depth normal to the chord, over the mostly chordwise walls.
/// Chord fraction behind the leading edge where the depth test of wall thickness begins.
const NOSE_FRACTION: f64 = 0.05;

/// The share of the section's area aft of the walls' meeting point above which the meeting is
/// noted: 0.25 %, a change of about 0.5 % in the torsional stiffness.
const TE_NOTE_AREA: f64 = 0.0025;

/// The area enclosed by a closed outline (either orientation).
fn polygon_area(pts: &[[f64; 2]]) -> f64 {
    let n = pts.len();
    (0..n)
        .map(|i| {
            let (a, b) = (pts[i], pts[(i + 1) % n]);
            a[0] * b[1] - b[0] * a[1]
        })
        .sum::<f64>()
        .abs()
        / 2.0
}

/// The area of the part of a closed outline at `y >= y0` (the outline clipped by the half-plane,
/// Sutherland–Hodgman).
fn area_aft(pts: &[[f64; 2]], y0: f64) -> f64 {
    let n = pts.len();
    let mut clipped: Vec<[f64; 2]> = Vec::with_capacity(n + 2);
    for i in 0..n {
        let (a, b) = (pts[i], pts[(i + 1) % n]);
        let (ina, inb) = (a[0] >= y0, b[0] >= y0);
        if ina {
            clipped.push(a);
        }
        if ina != inb {
            let t = (y0 - a[0]) / (b[0] - a[0]);
            clipped.push([y0, a[1] + t * (b[1] - a[1])]);
        }
    }
    if clipped.len() < 3 { 0.0 } else { polygon_area(&clipped) }
}

fn depth_check(
    layout: &SectionLayout,
    thickness: &[f64],
    merge: Option<Point>,
    corner: Option<f64>,
    limit: f64,
) -> DepthCheck {
    let pts = &layout.outer;
    let n = pts.len();
    let i_te = (0..n).fold(0, |b, i| if pts[i][0] > pts[b][0] { i } else { b });
    let mut upper: Vec<Point> = pts[..=i_te].to_vec();
    let mut lower: Vec<Point> = pts[i_te..].to_vec();
    lower.push(pts[0]);
    lower.reverse();
    // A blunt trailing edge's base is no part of either wall: the aftmost point may be either
    // corner of it, and a base square to a cambered mean line leans along the chord, so that
    // a depth taken to it would measure the base's lean (a fraction of a millimetre) instead of
    // the distance between the walls.
    for chain in [&mut upper, &mut lower] {
        while chain.len() > 2 && !chordwise(chain[chain.len() - 2], chain[chain.len() - 1]) {
            chain.pop();
        }
    }
    let mut samples: Vec<(f64, f64, f64)> = Vec::with_capacity(n); // (y, depth, ratio)
    for i in 0..n {
        let (a, b) = (pts[i], pts[(i + 1) % n]);
        if !chordwise(a, b) {
            continue;
        }
        let mid = lerp(a, b, 0.5);
        // The rounded nose is judged by its radius, not by a depth normal to the chord.
        if y_c(layout, mid[0]) < NOSE_FRACTION {
            continue;
        }
        let other = if i < i_te { &lower } else { &upper };
        // Aft of the midline's corner at a sharp closed trailing edge the walls are one solid
        // laminate, not thin walls: the depth there goes to nothing whatever the walls are.
        if corner.is_some_and(|y| mid[0] > y) {
            continue;
        }
        let Some(z) = chain_z_at(other, mid[0]) else { continue };
        let depth = (mid[1] - z).abs();
        if depth > 0.0 {
            samples.push((mid[0], depth, thickness[layout.segment_laminate[i]] / depth));
        }
    }
    let deepest = samples
        .iter()
        .fold((f64::NEG_INFINITY, 0.0), |b, s| if s.1 > b.0 { (s.1, s.0) } else { b })
        .1;
    let mut converging = None;
    if merge.is_some() || corner.is_some() {
        // Walk forward from the trailing edge while the ratio stays above the limit.
        let mut aft: Vec<&(f64, f64, f64)> = samples.iter().filter(|s| s.0 > deepest).collect();
        aft.sort_by(|a, b| b.0.total_cmp(&a.0));
        for s in aft {
            if s.2 <= limit {
                break;
            }
            converging = Some(s.0);
        }
    }
    let worst = samples.iter().filter(|s| s.2 > limit && converging.is_none_or(|y| s.0 < y)).fold(
        None,
        |b: Option<(f64, f64)>, s| if b.is_none_or(|b| s.2 > b.0) { Some((s.2, s.0)) } else { b },
    );
    DepthCheck { worst, converging }
}

/// Whether the segment from `a` to `b` runs mostly along the chord (a wall whose depth is
/// judged), not across it (a nose or a trailing-edge base).
fn chordwise(a: Point, b: Point) -> bool {
    let d = sub(b, a);
    (d[0] / norm(d)).abs() >= 0.7
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Areas by hand: a unit square cut at a quarter, and a wedge ending in a point, whose part
    /// aft of y = 0.9 is a similar triangle of a tenth the size (area scales with the square).
    #[test]
    fn area_aft_of_a_line_cuts_a_square_and_a_wedge() {
        let square = [[0.0, 0.0], [0.0, 1.0], [1.0, 1.0], [1.0, 0.0]];
        assert!((polygon_area(&square) - 1.0).abs() < 1e-12);
        assert!((area_aft(&square, 0.25) - 0.75).abs() < 1e-12);
        let wedge = [[0.0, -0.5], [1.0, 0.0], [0.0, 0.5]];
        assert!((area_aft(&wedge, 0.9) - 0.5 * 0.01).abs() < 1e-12);
    }
}

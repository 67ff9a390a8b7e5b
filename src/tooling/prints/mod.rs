//! Core prints and drain ports.
//!
//! A core that reaches an end of the blade (the root when it does, else the tip) is carried on
//! through that end into a **print**: a prism along the pitch axis whose section is the core's
//! end section shrunk towards its middle, which stands out beyond the shell's outer surface by
//! the print length and seats the core in the mould. The shell gets the matching **port**, the
//! same section through the end laminate; the alloy drains through it when the core melts in
//! the cure. A core closed at both ends by bulkheads has no print (its cell reaches no end).
//!
//! - **Section.** In the chord frame of the core's end (the cell's contour at the mean radius of
//!   the end contour) every vertical line meets the contour in one interval `[lo, hi]` (the
//!   chains are graphs over the chord, the closures straight). The section is that contour
//!   scaled by the print fraction `f` about an anchor, chordwise and, at each chordwise place,
//!   in relative depth `τ = (z − lo)/(hi − lo)`: `y' = y_a + f (y − y_a)`, `τ' = τ_a + f (τ − τ_a)`.
//!   The anchor is the end contour's lowest point in the drain orientation, moved a quarter of
//!   the least core thickness inside, so the print's entrance takes in the low corner of a
//!   domed end. The section lies strictly inside the contour for `f < 1`, point for point, so
//!   the print never breaks through the core's sides.
//! - **Caps with holes.** The core's end cap (holed by the print), and the shell's outer end cap
//!   (holed by every port at that end), are constrained Delaunay triangulations of the end
//!   contour and the holes projected on the section plane `(y, z)` (the `spade` crate), refined
//!   so that no facet is larger than an equilateral triangle whose side keeps the sag within
//!   the tolerance (`√(8 R tol)` on a sphere), then lifted along the pitch axis onto the trim
//!   surface. The boundary edges are kept as they are, so the caps share their edges with the
//!   lofted sides and with the print's and the port's walls.
//! - **Print and port.** The print's wall runs along the pitch axis from the core's end surface
//!   to the plane of its outer end, `print length` beyond the outermost point of the port on the
//!   shell's outer end surface, leaning inward by the taper (the mould's least draft and 1°):
//!   each corner of the section moves in by its miter times `tan θ` per unit length along the
//!   axis, so each side moves in parallel to itself and the seat in the mould's end piece draws
//!   (see the mould's seats). Columns of the section too shallow for the taper (a thin
//!   chordwise end) are dropped; a section that would fold all the same gets a straight print.
//!   The end face is a constrained Delaunay triangulation of its outline. The port's wall is
//!   the same wall between the shell's outer end surface and the core's.
//! - **Draining.** The mould stands with the pitch axis vertical, the print's end down; the
//!   print's end face is then the lowest of the core and its middle the drain point. The core's
//!   end surface (the floor over which the alloy runs to the print) is checked against the
//!   print's entrance: on a root sphere the floor is a dome, its rim lower than its middle
//!   (which is why the section is anchored at the lowest corner), and the depth by which the
//!   floor's lowest point lies below the entrance's lowest point is alloy that cannot drain
//!   with the mould upright (`pool_depth`, reported, flagged beyond 1 mm).

use std::collections::HashMap;

use spade::Triangulation;
use spade::{AngleLimit, ConstrainedDelaunayTriangulation, Point2, RefinementParameters};

use super::loft::LoftedSolid;
use super::surface::SpanSurface;
use super::trim::EndTrim;
use crate::mesh::Mesh;
use crate::mesh::orient::{compact, orient_outward};
use crate::mesh::polygon_area;
use crate::mesh::vec3::{self, P3};
use crate::mesh::{End, MeshError};
use crate::units::Angle;

mod caps;
mod fall;
mod seat;
mod section;
use caps::open_end;
pub(crate) use caps::unslither;
pub(crate) use caps::{band, cap_with_holes};
pub(crate) use fall::print_or_fall;
pub(crate) use seat::{SEAT_CLEARANCE, casting_seat, mould_seat, scaled_trim};
pub(crate) use section::inside;
pub(crate) use section::lift_x;
use section::{inward_miters, keeps_shape, print_section};

/// A core's print and the shell's port it passes through.
#[derive(Debug, Clone, PartialEq)]
pub struct CorePrint {
    /// The core's name (`core-1`, ...).
    pub core: String,
    /// The end of the blade it leaves through.
    pub end: End,
    /// The print's section in the section plane `(y, z)` of the rotor frame, m.
    pub section: Vec<[f64; 2]>,
    /// Area of the section, m².
    pub section_area: f64,
    /// The plane `x = x_end` of the print's outer end, m.
    pub x_end: f64,
    /// How far the print stands out beyond the shell's outer end surface, at the port's
    /// nearest point, m.
    pub length: f64,
    /// Volume of the print beyond the core's own end surface (nominal), m³.
    pub volume: f64,
    /// The drain point: the middle of the print's outer end face, rotor frame, m.
    pub drain_point: P3,
    /// Down, rotor frame, when the mould stands to drain this core (a unit vector along the
    /// pitch axis, towards the print's end).
    pub down: P3,
    /// How far the lowest point of the core's end surface lies below the lowest point of the
    /// print's entrance in that orientation (alloy that cannot run into the print), m.
    pub pool_depth: f64,
    /// How far the print's walls lean inward from the pitch axis towards its outer end (its
    /// taper; zero where the section is too thin to keep it).
    pub taper: Angle,
    /// The port: where the print's walls meet the shell's outer end surface, rotor frame, m.
    pub port: Vec<P3>,
    /// The print's outer end face in the section plane `(y, z)`, m (the section moved in by the
    /// taper).
    pub outlet: Vec<[f64; 2]>,
    /// The clearance a side of the print's seat in the mould, m (`None`: the mould has no seat
    /// for it).
    pub seat_clearance: Option<f64>,
}

/// What [`print_core`] gives: the core with its print, its print, and the core's body open at
/// the print's end for the shell (the body less its end cap, the end surface holed by the
/// print, and the entrance loop).
pub(crate) struct PrintedCore {
    pub mesh: Mesh,
    pub print: CorePrint,
    pub piece: Mesh,
    pub entrance: Vec<u32>,
}

/// The print's settings and the surfaces it passes.
pub(crate) struct PrintSetting {
    /// The section's fraction of the end section (linear).
    pub fraction: f64,
    /// Length beyond the shell's outer end surface, m.
    pub length: f64,
    /// The core's trim at the print's end.
    pub core_trim: EndTrim,
    /// The outer mould line's trim at that end.
    pub outer_trim: EndTrim,
    /// Largest facet side on the end caps, m.
    pub max_side: f64,
    /// Least gap between the print's section and the end contour, m.
    pub inset: f64,
    /// How far the print's walls lean inward from the pitch axis towards its outer end.
    pub taper: Angle,
}

/// A print's walls: each corner of the entrance runs on a straight line outward along the
/// pitch axis, moved inward by its miter times `lean` per unit length along the axis, so that
/// every side of the section moves in parallel to itself by `lean` per unit length.
struct Walls {
    /// `tan` of the taper.
    lean: f64,
    /// The port loop on the outer trim, rotor frame.
    port: Vec<P3>,
    /// The end face's section.
    outlet: Vec<[f64; 2]>,
    /// The end face's plane.
    x_end: f64,
}

impl Walls {
    fn new(
        section: &[[f64; 2]],
        from: &[P3],
        set: &PrintSetting,
        sign: f64,
        lean: f64,
    ) -> Result<Walls, MeshError> {
        let miters = inward_miters(section)?;
        let at = |i: usize, x: f64| {
            let d = lean * (x - from[i][0]).abs();
            [section[i][0] + miters[i][0] * d, section[i][1] + miters[i][1] * d]
        };
        // Where each line meets the outer trim (the trim's slope is small: a few steps).
        let mut port = Vec::with_capacity(section.len());
        for (i, &q) in section.iter().enumerate() {
            let mut p = lift_x(set.outer_trim, q)?;
            for _ in 0..8 {
                p = lift_x(set.outer_trim, at(i, p[0]))?;
            }
            port.push(p);
        }
        // The outermost point of the port along the print's direction, the length beyond it.
        let reach = port.iter().map(|p| sign * p[0]).fold(f64::NEG_INFINITY, f64::max);
        let x_end = sign * (reach + set.length);
        let outlet = (0..section.len()).map(|i| at(i, x_end)).collect();
        Ok(Walls { lean, port, outlet, x_end })
    }
}

/// The taper of a print's walls for a mould of least draft `min_draft`: that draft and 1°
/// more, as the casting moulds' sprues narrow (so the seat's walls draw with the least draft
/// to spare after the loop's slope on a spherical end takes a little of it).
pub(crate) fn print_taper(min_draft: Angle) -> Angle {
    Angle::from_deg(min_draft.deg() + 1.0)
}

/// Intervals along each side of a print's section.
const PRINT_INTERVALS: usize = 64;

/// The core `solid` (named `name`, chord angle `phi` at its end) with a print at `end`.
pub(crate) fn print_core(
    name: &str,
    solid: &LoftedSolid,
    end: End,
    cell: &dyn SpanSurface,
    set: &PrintSetting,
) -> Result<PrintedCore, MeshError> {
    let ring = match end {
        End::Root => &solid.root_ring,
        End::Tip => &solid.tip_ring,
    };
    let (sign, down) = match end {
        End::Root => (-1.0, [-1.0, 0.0, 0.0]),
        End::Tip => (1.0, [1.0, 0.0, 0.0]),
    };
    let pts: Vec<P3> = ring.iter().map(|&v| solid.mesh.vertices[v as usize]).collect();
    let x_c = pts.iter().map(|p| p[0]).sum::<f64>() / pts.len().max(1) as f64;
    // The end contour at the mean radius of the end, chord frame: the upper chain front to
    // back, the lower back to front (the closures are the edges between them).
    let m = 240;
    let mut contour: Vec<[f64; 2]> =
        (0..=m).map(|i| cell.upper(x_c, i as f64 / m as f64)).collect();
    contour.extend((0..=m).rev().map(|i| cell.lower(x_c, i as f64 / m as f64)));
    // Anchored at the lowest point of the end in the drain orientation.
    let lowest = pts
        .iter()
        .copied()
        .max_by(|a, b| (sign * a[0]).total_cmp(&(sign * b[0])))
        .ok_or_else(|| MeshError::Geometry("a core's end has no contour".into()))?;
    let (s, c) = cell.chord_angle(x_c).rad().sin_cos();
    let anchor = [lowest[1] * c + lowest[2] * s, -lowest[1] * s + lowest[2] * c];
    let to_rotor = |q: [f64; 2]| [q[0] * c - q[1] * s, q[0] * s + q[1] * c];
    let min_depth = least_depth(&contour, &to_rotor, set, sign)?;
    // How far the cell's contour moves across the end's span (a twisted or tapered cell under
    // a spherical end): a deepened column keeps that much more from the contour.
    let (x_lo, x_hi) =
        pts.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| (a.min(p[0]), b.max(p[0])));
    let outline_at = |x: f64| -> Vec<[f64; 2]> {
        let (s, c) = cell.chord_angle(x).rad().sin_cos();
        (0..=m)
            .map(|i| cell.upper(x, i as f64 / m as f64))
            .chain((0..=m).rev().map(|i| cell.lower(x, i as f64 / m as f64)))
            .map(|q| [q[0] * c - q[1] * s, q[0] * s + q[1] * c])
            .collect()
    };
    let (near, far) = (outline_at(x_lo), outline_at(x_hi));
    let drift = hausdorff(&near, &far).max(hausdorff(&far, &near));
    let wide_inset = set.inset + drift;
    let section: Vec<[f64; 2]> = print_section(
        &contour,
        anchor,
        set.fraction,
        set.inset,
        wide_inset,
        min_depth,
        PRINT_INTERVALS,
    )?
    .into_iter()
    .map(to_rotor)
    .collect();
    let section = thick_enough(section, set, sign)?;
    let mut piece = open_end(solid, end);
    let mut entrance = Vec::with_capacity(section.len());
    for &q in &section {
        entrance.push(piece.push_vertex(lift_x(set.core_trim, q)?));
    }
    let floor = cap_with_holes(
        &mut piece,
        ring,
        std::slice::from_ref(&entrance),
        set.core_trim,
        set.max_side,
    )?;
    let from: Vec<P3> = entrance.iter().map(|&v| piece.vertices[v as usize]).collect();
    // The tapered walls; a taper that would fold the end face (a thin section) is dropped and
    // the print made straight.
    let mut walls = Walls::new(&section, &from, set, sign, set.taper.rad().tan())?;
    if !keeps_shape(&section, &walls.outlet) {
        walls = Walls::new(&section, &from, set, sign, 0.0)?;
    }
    let x_end = walls.x_end;
    let mut mesh = piece.clone();
    let outlet: Vec<u32> =
        walls.outlet.iter().map(|q| mesh.push_vertex([x_end, q[0], q[1]])).collect();
    band(&mut mesh, &entrance, &outlet);
    cap_with_holes(&mut mesh, &outlet, &[], EndTrim::Plane { x: x_end }, f64::INFINITY)?;
    orient_outward(&mut mesh);
    compact(&mut mesh);
    let area = polygon_area(&section).abs();
    let n = walls.outlet.len() as f64;
    let centre = walls.outlet.iter().fold([0.0, 0.0], |a, q| [a[0] + q[0] / n, a[1] + q[1] / n]);
    let height = |p: P3| -vec3::dot(down, p);
    let entrance_low =
        entrance.iter().map(|&v| height(piece.vertices[v as usize])).fold(f64::INFINITY, f64::min);
    let floor_low =
        floor.iter().map(|&v| height(piece.vertices[v as usize])).fold(f64::INFINITY, f64::min);
    let volume = mesh.signed_volume() - solid.mesh.signed_volume();
    let print = CorePrint {
        core: name.to_string(),
        end,
        section_area: area,
        x_end,
        length: set.length,
        volume,
        drain_point: [x_end, centre[0], centre[1]],
        down,
        pool_depth: (entrance_low - floor_low).max(0.0),
        section,
        taper: Angle::from_rad(walls.lean.atan()),
        port: walls.port,
        outlet: walls.outlet,
        seat_clearance: None,
    };
    Ok(PrintedCore { mesh, print, piece, entrance })
}

/// The greatest distance from a point of `a` to the closed polygon `b`.
fn hausdorff(a: &[[f64; 2]], b: &[[f64; 2]]) -> f64 {
    let n = b.len();
    a.iter()
        .map(|p| {
            (0..n)
                .map(|i| {
                    let (u, v) = (b[i], b[(i + 1) % n]);
                    let d = [v[0] - u[0], v[1] - u[1]];
                    let l2 = d[0] * d[0] + d[1] * d[1];
                    let t = if l2 > 0.0 {
                        (((p[0] - u[0]) * d[0] + (p[1] - u[1]) * d[1]) / l2).clamp(0.0, 1.0)
                    } else {
                        0.0
                    };
                    (p[0] - u[0] - t * d[0]).hypot(p[1] - u[1] - t * d[1])
                })
                .fold(f64::INFINITY, f64::min)
        })
        .fold(0.0, f64::max)
}

/// The least depth of a print's section that keeps its taper: four times the inward lean over
/// the longest wall the print can have at this end (from the core's end surface under the end
/// `contour`, chord frame, to the print's outer end), so that a side of the section can move in
/// by the taper from both sides and keep half its depth.
fn least_depth(
    contour: &[[f64; 2]],
    to_rotor: &dyn Fn([f64; 2]) -> [f64; 2],
    set: &PrintSetting,
    sign: f64,
) -> Result<f64, MeshError> {
    let lean = set.taper.rad().tan();
    if lean <= 0.0 {
        return Ok(0.0);
    }
    let (mut reach, mut inner) = (f64::NEG_INFINITY, f64::INFINITY);
    for &q in contour {
        let r = to_rotor(q);
        reach = reach.max(sign * lift_x(set.outer_trim, r)?[0]);
        inner = inner.min(sign * lift_x(set.core_trim, r)?[0]);
    }
    Ok(4.0 * lean * (reach + set.length - inner).max(0.0))
}

/// The columns of `section` (the upper chain's points, then the lower chain's back, corner
/// for corner at the same chordwise place) with those next to the two end columns thinned, so
/// that no side next to a corner is shorter than three times the inward lean over the print's
/// longest wall (the sides moving in shorten a side next to a corner by the lean times the
/// corner's cotangent of half its angle).
fn thick_enough(
    section: Vec<[f64; 2]>,
    set: &PrintSetting,
    sign: f64,
) -> Result<Vec<[f64; 2]>, MeshError> {
    let lean = set.taper.rad().tan();
    let len = section.len();
    if lean <= 0.0 || len < 8 || len % 2 != 0 {
        return Ok(section);
    }
    let from: Vec<P3> =
        section.iter().map(|&q| lift_x(set.core_trim, q)).collect::<Result<_, _>>()?;
    let walls = Walls::new(&section, &from, set, sign, lean)?;
    let longest = from.iter().map(|p| (walls.x_end - p[0]).abs()).fold(0.0, f64::max);
    let need = 3.0 * lean * longest;
    // Every column is kept (a thin chordwise end is where a domed end drains: dropping it
    // would leave alloy standing); a section that folds all the same gets a straight print.
    let (k0, k1) = (0, len / 2);
    // At the four corners the sides moving in shorten the sides next to them by up to the
    // lean times the corner's cotangent of half its angle: the columns nearer an end column
    // than `need` are dropped, so no side next to a corner can turn over.
    let dist = |a: [f64; 2], b: [f64; 2]| (a[0] - b[0]).hypot(a[1] - b[1]);
    let far_from = |k: usize, e: usize| {
        dist(section[k], section[e]) >= need
            && dist(section[len - 1 - k], section[len - 1 - e]) >= need
    };
    let kept: Vec<usize> = (k0..k1)
        .filter(|&k| k == k0 || k == k1 - 1 || (far_from(k, k0) && far_from(k, k1 - 1)))
        .collect();
    if kept.len() < 3 {
        return Ok(section);
    }
    let mut out: Vec<[f64; 2]> = kept.iter().map(|&k| section[k]).collect();
    out.extend(kept.iter().rev().map(|&k| section[len - 1 - k]));
    Ok(out)
}

/// The shell: the outer solid `outer` with every core as a cavity, the printed cores' cavities
/// opened to the outside through their ports (see the module docs).
pub(crate) fn shell_with_ports(
    outer: &LoftedSolid,
    printed: &[&PrintedCore],
    sealed: &[&Mesh],
    trims: [EndTrim; 2],
    max_side: f64,
) -> Result<Mesh, MeshError> {
    let mut shell = outer.mesh.clone();
    let has = |end: End| printed.iter().any(|p| p.print.end == end);
    let (root_cap, tip_cap) = (outer.facets.root_cap.clone(), outer.facets.tip_cap.clone());
    let (cut_root, cut_tip) = (has(End::Root), has(End::Tip));
    // The caps at the ported ends are dropped (their vertices stay until compacted).
    shell.triangles = outer
        .mesh
        .triangles
        .iter()
        .enumerate()
        .filter(|(i, _)| !(cut_root && root_cap.contains(i) || cut_tip && tip_cap.contains(i)))
        .map(|(_, t)| *t)
        .collect();
    for (end, trim) in [(End::Root, trims[0]), (End::Tip, trims[1])] {
        let here: Vec<&&PrintedCore> = printed.iter().filter(|p| p.print.end == end).collect();
        if here.is_empty() {
            continue;
        }
        let ring = match end {
            End::Root => &outer.root_ring,
            End::Tip => &outer.tip_ring,
        };
        let mut ports = Vec::with_capacity(here.len());
        for p in &here {
            let port: Vec<u32> = p.print.port.iter().map(|&q| shell.push_vertex(q)).collect();
            ports.push(port);
        }
        cap_with_holes(&mut shell, ring, &ports, trim, max_side)?;
        for (p, port) in here.iter().zip(&ports) {
            let offset = shell.vertices.len() as u32;
            shell.merge(&p.piece);
            let entrance: Vec<u32> = p.entrance.iter().map(|&v| v + offset).collect();
            band(&mut shell, port, &entrance);
        }
    }
    orient_outward(&mut shell);
    compact(&mut shell);
    for core in sealed {
        let mut cavity = (*core).clone();
        cavity.flip();
        shell.merge(&cavity);
    }
    Ok(shell)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_rectangular_end_gives_the_rectangle_scaled_by_the_fraction() {
        // A 40 × 10 mm rectangle anchored at its middle: the section is the rectangle scaled by
        // f about its middle in both directions, area f² w h (geometry).
        let outline = [[-0.02, 0.005], [0.02, 0.005], [0.02, -0.005], [-0.02, -0.005]];
        for f in [0.3, 0.5, 0.8] {
            let section = print_section(&outline, [0.0, 0.0], f, 0.5e-3, 0.5e-3, 0.0, 8).unwrap();
            let area = polygon_area(&section).abs();
            assert!((area / (f * f * 0.04 * 0.01) - 1.0).abs() < 1e-9, "{f}: {area}");
        }
        // Anchored at a corner, the section keeps the fraction's area and stays the inset
        // scaled by 1 − f from that corner's sides.
        let (f, inset) = (0.5, 0.5e-3);
        let section = print_section(&outline, [0.02, -0.005], f, inset, inset, 0.0, 8).unwrap();
        let area = polygon_area(&section).abs();
        assert!((area / (f * f * 0.04 * 0.01) - 1.0).abs() < 1e-9, "{area}");
        let right = section.iter().map(|q| q[0]).fold(f64::NEG_INFINITY, f64::max);
        let bottom = section.iter().map(|q| q[1]).fold(f64::INFINITY, f64::min);
        assert!((0.02 - right - (1.0 - f) * inset).abs() < 1e-12, "{right}");
        let delta = inset / 0.01;
        assert!((bottom + 0.005 - 0.01 * delta * (1.0 - f)).abs() < 1e-12, "{bottom}");
    }

    #[test]
    fn miters_move_every_side_of_a_rectangle_in_parallel() {
        // A 40 × 10 mm rectangle with its sides cut into points: every corner moved in by d
        // times its miter gives the rectangle (40 − 2d) × (10 − 2d) (geometry), its shape kept;
        // moved in by more than half its depth it folds, and the check says so.
        let mut outline = Vec::new();
        for i in 0..8 {
            outline.push([-0.02 + 0.005 * i as f64, -0.005]);
        }
        for i in 0..8 {
            outline.push([0.02 - 0.005 * i as f64, 0.005]);
        }
        outline.insert(8, [0.02, -0.005]);
        outline.push([-0.02, 0.005]);
        let m = inward_miters(&outline).unwrap();
        let moved = |d: f64| -> Vec<[f64; 2]> {
            outline.iter().zip(&m).map(|(q, m)| [q[0] + d * m[0], q[1] + d * m[1]]).collect()
        };
        let d = 1e-3;
        let inner = moved(d);
        let area = polygon_area(&inner).abs();
        assert!((area - (0.04 - 2.0 * d) * (0.01 - 2.0 * d)).abs() < 1e-15, "{area}");
        assert!(keeps_shape(&outline, &inner));
        assert!(!keeps_shape(&outline, &moved(6e-3)));
    }

    #[test]
    fn an_elliptic_end_gives_the_closed_form_area() {
        // Ellipse of semi-axes a (chord) and b (depth) anchored at its middle: the section keeps
        // y' = f y and half the depth f b √(1 − y'²/a²), so its area is 2 f b ∫ √(1 − y²/a²) dy
        // over |y| ≤ f a = 2 f a b (f √(1 − f²) + asin f) (elementary integral); the polygon's
        // area converges on it as the points multiply.
        let (a, b) = (0.03, 0.006);
        let n = 4000;
        let outline: Vec<[f64; 2]> = (0..n)
            .map(|i| {
                let t = std::f64::consts::TAU * i as f64 / n as f64;
                [-a * t.cos(), b * t.sin()]
            })
            .collect();
        for f in [0.4, 0.6] {
            let section =
                print_section(&outline, [0.0, 0.0], f, 0.5e-3, 0.5e-3, 0.0, 2000).unwrap();
            let area = polygon_area(&section).abs();
            let exact = 2.0 * f * a * b * (f * (1.0 - f * f).sqrt() + f.asin());
            assert!((area / exact - 1.0).abs() < 1e-4, "{f}: {area} vs {exact}");
        }
    }

    #[test]
    fn a_holed_cap_on_a_sphere_is_within_the_tolerance_and_on_the_sphere_at_its_edges() {
        // A square ring on the sphere of radius 0.2 m with a square hole: every cap vertex lies
        // on the sphere, and the cap's area is the ring's less the hole's, projected, to within
        // the sag (the cap is a graph over the section plane).
        let r = 0.2;
        let trim = EndTrim::Sphere { radius: r };
        let square = |h: f64, n: usize| -> Vec<[f64; 2]> {
            let mut v = Vec::new();
            for i in 0..n {
                v.push([-h + 2.0 * h * i as f64 / n as f64, -h]);
            }
            for i in 0..n {
                v.push([h, -h + 2.0 * h * i as f64 / n as f64]);
            }
            for i in 0..n {
                v.push([h - 2.0 * h * i as f64 / n as f64, h]);
            }
            for i in 0..n {
                v.push([-h, h - 2.0 * h * i as f64 / n as f64]);
            }
            v
        };
        let mut mesh = Mesh::new();
        let ring: Vec<u32> =
            square(0.03, 12).iter().map(|&q| mesh.push_vertex(lift_x(trim, q).unwrap())).collect();
        let hole: Vec<u32> =
            square(0.01, 4).iter().map(|&q| mesh.push_vertex(lift_x(trim, q).unwrap())).collect();
        let h = trim.chord_for_sag(0.05e-3);
        cap_with_holes(&mut mesh, &ring, &[hole], trim, h).unwrap();
        for p in &mesh.vertices {
            assert!((vec3::norm(*p) / r - 1.0).abs() < 1e-12);
        }
        let projected: f64 = (0..mesh.len())
            .map(|t| {
                let [a, b, c] = mesh.corners(t);
                0.5 * vec3::area_vector(a, b, c)[0].abs()
            })
            .sum();
        let exact = 0.06 * 0.06 - 0.02 * 0.02;
        assert!((projected / exact - 1.0).abs() < 1e-9, "{projected} vs {exact}");
        // Every facet edge within the sag's chord (the refinement's area bound).
        for t in 0..mesh.len() {
            let [a, b, c] = mesh.corners(t);
            let longest = vec3::dist(a, b).max(vec3::dist(b, c)).max(vec3::dist(c, a));
            assert!(longest < 2.5 * h, "{longest} vs {h}");
        }
    }
}

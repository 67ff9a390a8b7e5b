//! Nesting the flat patterns of one material on its roll: bottom-left fill.
//!
//! The roll runs along `x` (its length, the warp) and is `width` wide in `y`. Patterns are taken
//! in order of decreasing area; each is tried in every rotation its fibres allow (0° and 180°
//! always, 90° and 270° too for a balanced fabric or an isotropic sheet, whose two directions are
//! alike) at a set of heights across the roll (the bottom edge, the top edge, the tops of the
//! patterns already placed and eight heights between), slid along the roll from its start in
//! 20 mm steps to the first place where it keeps `gap` from every pattern placed, then back in
//! steps of a quarter of the gap while it still does. The place with the least `x` (then the
//! least `y`) wins: bottom-left fill (Baker, Coffman & Rivest, "Orthogonal packings in two
//! dimensions", SIAM J. Comput. 9 (1980) 846–855, for rectangles; here with true outlines).
//! Outlines are simplified for the distance test by at most a quarter of the gap, so the true
//! outlines keep at least half the gap.

use super::vec3::polygon_area;
use crate::units::Angle;

/// One pattern to nest.
#[derive(Debug, Clone)]
pub struct NestItem {
    /// Outline, counter-clockwise, m.
    pub outline: Vec<[f64; 2]>,
    /// Whether 90° turns are allowed.
    pub quarter_turns: bool,
}

/// Where a pattern went.
#[derive(Debug, Clone)]
pub struct Placement {
    /// Index of the item.
    pub item: usize,
    /// Rotation applied about the outline's origin (0°, 90°, 180° or 270°).
    pub rotation: Angle,
    /// Translation applied after the rotation, m.
    pub offset: [f64; 2],
    /// The placed outline on the roll, m.
    pub outline: Vec<[f64; 2]>,
}

/// The nesting of one material.
#[derive(Debug, Clone)]
pub struct Nesting {
    /// Roll width, m.
    pub width: f64,
    /// Gap kept between patterns, m.
    pub gap: f64,
    /// Placements, in the order placed.
    pub placements: Vec<Placement>,
    /// Length of roll used, m.
    pub length: f64,
    /// Total pattern area, m².
    pub pattern_area: f64,
}

impl Nesting {
    /// Pattern area over the roll area used.
    pub fn utilisation(&self) -> f64 {
        if self.length > 0.0 { self.pattern_area / (self.length * self.width) } else { 0.0 }
    }

    /// Length used over the area bound (total pattern area over the width); never below 1.
    pub fn length_over_bound(&self) -> f64 {
        let bound = self.pattern_area / self.width;
        if bound > 0.0 { self.length / bound } else { 1.0 }
    }
}

/// A pattern that fits the roll in none of its allowed rotations.
#[derive(Debug, Clone, PartialEq)]
pub struct TooWide {
    /// Index of the item.
    pub item: usize,
    /// Its least width across the roll over the allowed rotations, m.
    pub least_width: f64,
}

#[derive(Debug, Clone)]
struct Shape {
    outline: Vec<[f64; 2]>,
    simple: Vec<[f64; 2]>,
    lo: [f64; 2],
    hi: [f64; 2],
}

pub(super) fn bbox(p: &[[f64; 2]]) -> ([f64; 2], [f64; 2]) {
    let mut lo = [f64::INFINITY; 2];
    let mut hi = [f64::NEG_INFINITY; 2];
    for q in p {
        for k in 0..2 {
            lo[k] = lo[k].min(q[k]);
            hi[k] = hi[k].max(q[k]);
        }
    }
    (lo, hi)
}

fn rotate(p: &[[f64; 2]], deg: f64) -> Vec<[f64; 2]> {
    let (s, c) = match deg as i32 {
        90 => (1.0, 0.0),
        180 => (0.0, -1.0),
        270 => (-1.0, 0.0),
        _ => (0.0, 1.0),
    };
    p.iter().map(|q| [c * q[0] - s * q[1], s * q[0] + c * q[1]]).collect()
}

/// Douglas–Peucker simplification of a closed outline within `tol`.
fn simplify(p: &[[f64; 2]], tol: f64) -> Vec<[f64; 2]> {
    fn dist(q: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
        let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
        let l2 = dx * dx + dy * dy;
        let t = if l2 > 0.0 {
            (((q[0] - a[0]) * dx + (q[1] - a[1]) * dy) / l2).clamp(0.0, 1.0)
        } else {
            0.0
        };
        (q[0] - a[0] - t * dx).hypot(q[1] - a[1] - t * dy)
    }
    fn rec(p: &[[f64; 2]], i: usize, j: usize, tol: f64, keep: &mut Vec<bool>) {
        if j <= i + 1 {
            return;
        }
        let (mut k, mut dmax) = (i, 0.0);
        for m in i + 1..j {
            let d = dist(p[m], p[i], p[j]);
            if d > dmax {
                dmax = d;
                k = m;
            }
        }
        if dmax > tol {
            keep[k] = true;
            rec(p, i, k, tol, keep);
            rec(p, k, j, tol, keep);
        }
    }
    if p.len() < 4 {
        return p.to_vec();
    }
    let n = p.len();
    // Split at the vertex farthest from the first.
    let far = (1..n)
        .max_by(|&a, &b| {
            let da = (p[a][0] - p[0][0]).hypot(p[a][1] - p[0][1]);
            let db = (p[b][0] - p[0][0]).hypot(p[b][1] - p[0][1]);
            da.total_cmp(&db)
        })
        .unwrap_or(n / 2);
    let mut closed = p.to_vec();
    closed.push(p[0]);
    let mut keep = vec![false; n + 1];
    keep[0] = true;
    keep[far] = true;
    rec(&closed, 0, far, tol, &mut keep);
    rec(&closed, far, n, tol, &mut keep);
    (0..n).filter(|&k| keep[k]).map(|k| p[k]).collect()
}

fn seg_dist(a: [f64; 2], b: [f64; 2], c: [f64; 2], d: [f64; 2]) -> f64 {
    let cross = |o: [f64; 2], p: [f64; 2], q: [f64; 2]| {
        (p[0] - o[0]) * (q[1] - o[1]) - (p[1] - o[1]) * (q[0] - o[0])
    };
    let (d1, d2, d3, d4) = (cross(a, b, c), cross(a, b, d), cross(c, d, a), cross(c, d, b));
    if ((d1 > 0.0) != (d2 > 0.0)) && ((d3 > 0.0) != (d4 > 0.0)) {
        return 0.0;
    }
    let pd = |q: [f64; 2], a: [f64; 2], b: [f64; 2]| {
        let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
        let l2 = dx * dx + dy * dy;
        let t = if l2 > 0.0 {
            (((q[0] - a[0]) * dx + (q[1] - a[1]) * dy) / l2).clamp(0.0, 1.0)
        } else {
            0.0
        };
        (q[0] - a[0] - t * dx).hypot(q[1] - a[1] - t * dy)
    };
    pd(a, c, d).min(pd(b, c, d)).min(pd(c, a, b)).min(pd(d, a, b))
}

fn inside(p: &[[f64; 2]], q: [f64; 2]) -> bool {
    super::vec3::point_in_polygon(p, q)
}

/// Whether `b` moved by `off` keeps `gap` from `a`.
fn clear(a: &Shape, b: &Shape, off: [f64; 2], gap: f64) -> bool {
    let (blo, bhi) = ([b.lo[0] + off[0], b.lo[1] + off[1]], [b.hi[0] + off[0], b.hi[1] + off[1]]);
    if blo[0] >= a.hi[0] + gap
        || bhi[0] + gap <= a.lo[0]
        || blo[1] >= a.hi[1] + gap
        || bhi[1] + gap <= a.lo[1]
    {
        return true;
    }
    let bs: Vec<[f64; 2]> = b.simple.iter().map(|q| [q[0] + off[0], q[1] + off[1]]).collect();
    let (na, nb) = (a.simple.len(), bs.len());
    for i in 0..na {
        let (p, q) = (a.simple[i], a.simple[(i + 1) % na]);
        let (lo, hi) = (
            [p[0].min(q[0]) - gap, p[1].min(q[1]) - gap],
            [p[0].max(q[0]) + gap, p[1].max(q[1]) + gap],
        );
        if hi[0] < blo[0] || lo[0] > bhi[0] || hi[1] < blo[1] || lo[1] > bhi[1] {
            continue;
        }
        for j in 0..nb {
            let (r, s) = (bs[j], bs[(j + 1) % nb]);
            if r[0].max(s[0]) < lo[0]
                || r[0].min(s[0]) > hi[0]
                || r[1].max(s[1]) < lo[1]
                || r[1].min(s[1]) > hi[1]
            {
                continue;
            }
            if seg_dist(p, q, r, s) < gap {
                return false;
            }
        }
    }
    !(inside(&a.simple, bs[0]) || inside(&bs, a.simple[0]))
}

/// Nests `items` on a roll `width` wide keeping `gap` between them (see the module docs).
pub fn nest(items: &[NestItem], width: f64, gap: f64) -> Result<Nesting, TooWide> {
    let tol = 0.25 * gap;
    let mut order: Vec<usize> = (0..items.len()).collect();
    let areas: Vec<f64> = items.iter().map(|i| polygon_area(&i.outline).abs()).collect();
    order.sort_by(|&a, &b| areas[b].total_cmp(&areas[a]));
    // Every pattern must fit in some rotation.
    for (k, it) in items.iter().enumerate() {
        let rots: &[f64] = if it.quarter_turns { &[0.0, 90.0] } else { &[0.0] };
        let least = rots
            .iter()
            .map(|&r| {
                let (lo, hi) = bbox(&rotate(&it.outline, r));
                hi[1] - lo[1]
            })
            .fold(f64::INFINITY, f64::min);
        if least > width {
            return Err(TooWide { item: k, least_width: least });
        }
    }
    let mut placed: Vec<(Shape, Placement)> = Vec::new();
    let total_len: f64 = items
        .iter()
        .map(|i| {
            let (lo, hi) = bbox(&i.outline);
            (hi[0] - lo[0]).max(hi[1] - lo[1]) + gap
        })
        .sum();
    let coarse = 0.02_f64.max(gap);
    let fine = (0.25 * gap).max(1e-4);
    for &k in &order {
        let it = &items[k];
        let rots: &[f64] =
            if it.quarter_turns { &[0.0, 90.0, 180.0, 270.0] } else { &[0.0, 180.0] };
        let mut best: Option<(f64, f64, Shape, f64, [f64; 2])> = None;
        for &rot in rots {
            let turned = rotate(&it.outline, rot);
            let (lo, hi) = bbox(&turned);
            if hi[1] - lo[1] > width {
                continue;
            }
            let outline: Vec<[f64; 2]> =
                turned.iter().map(|q| [q[0] - lo[0], q[1] - lo[1]]).collect();
            let (slo, shi) = bbox(&outline);
            let shape = Shape { simple: simplify(&outline, tol), outline, lo: slo, hi: shi };
            let h = shi[1];
            let mut ys = vec![0.0, width - h];
            ys.extend(placed.iter().map(|(s, _)| s.hi[1] + gap).filter(|&y| y + h <= width));
            ys.extend((1..9).map(|m| (width - h) * m as f64 / 9.0));
            for &y in &ys {
                let free = |x: f64| placed.iter().all(|(s, _)| clear(s, &shape, [x, y], gap));
                let mut x = 0.0;
                while !free(x) && x < total_len {
                    x += coarse;
                }
                if x > 0.0 {
                    while x - fine >= 0.0 && free(x - fine) {
                        x -= fine;
                    }
                }
                let better = match &best {
                    None => true,
                    Some((bx, by, ..)) => x < bx - 1e-9 || (x < bx + 1e-9 && y < *by),
                };
                if better {
                    best = Some((x, y, shape.clone(), rot, [-lo[0], -lo[1]]));
                }
            }
        }
        let Some((x, y, shape, rot, shift)) = best else {
            return Err(TooWide { item: k, least_width: f64::INFINITY });
        };
        let outline: Vec<[f64; 2]> = shape.outline.iter().map(|q| [q[0] + x, q[1] + y]).collect();
        let moved = Shape {
            simple: shape.simple.iter().map(|q| [q[0] + x, q[1] + y]).collect(),
            lo: [shape.lo[0] + x, shape.lo[1] + y],
            hi: [shape.hi[0] + x, shape.hi[1] + y],
            outline: outline.clone(),
        };
        let placement = Placement {
            item: k,
            rotation: Angle::from_deg(rot),
            offset: [shift[0] + x, shift[1] + y],
            outline,
        };
        placed.push((moved, placement));
    }
    let length = placed.iter().map(|(s, _)| s.hi[0]).fold(0.0, f64::max);
    Ok(Nesting {
        width,
        gap,
        pattern_area: areas.iter().sum(),
        length,
        placements: placed.into_iter().map(|(_, p)| p).collect(),
    })
}

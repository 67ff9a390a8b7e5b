//! The ply regions of a blade: each ply of the schedule as one region per skin (a `both` ply
//! cut at the leading and trailing edges) or on its web, with its boundary in the surface's
//! parameters, seed, fibre axis and net spacing, on the surface it lies on (see `skin.rs` for
//! a skin's ply level, `web.rs` for a web's plane).

mod skin;
mod web;

pub(crate) use skin::SkinLevel;
pub(crate) use web::WebPlane;

use super::PlyBookError;
use super::book::{PatternPlace, PlyBookParams};
use super::drape::DrapeSurface;
use super::pattern::RegionSpec;
use super::vec3::{cross, norm, sub};
use crate::blade::{Blade, Surface};
use crate::project::{PlySpec, Region};

/// The surface a region lies on.
pub(super) enum Level<'a> {
    Skin(SkinLevel<'a>),
    Web(WebPlane<'a>),
}

/// One ply region of the blade, ready to drape.
pub struct PlyRegion<'a> {
    /// Index of the ply in the schedule.
    pub ply: usize,
    /// `upper`, `lower` or `web:NAME`.
    pub surface_name: String,
    /// The region (parameters, seed, direction, spacing).
    pub spec: RegionSpec,
    pub(super) level: Level<'a>,
    pub(super) at: At,
    pub(super) span: [f64; 2],
    pub(super) chord: [f64; 2],
}

/// Where a region lies, to rebuild a part of it.
#[derive(Debug, Clone, Copy)]
pub(super) enum At {
    Skin(Surface),
    Web(usize),
}

impl PlyRegion<'_> {
    /// The surface the region lies on.
    pub fn surface(&self) -> &dyn DrapeSurface {
        match &self.level {
            Level::Skin(s) => s,
            Level::Web(w) => w,
        }
    }

    /// The region's range of the first parameter (radius), m.
    pub fn span(&self) -> [f64; 2] {
        self.span
    }

    /// The range of the second parameter at radius `a`.
    pub fn b_range(&self, a: f64) -> [f64; 2] {
        match &self.level {
            Level::Skin(s) => s.b_range(a, self.chord[0], self.chord[1]),
            Level::Web(_) => [0.0, 1.0],
        }
    }

    /// The region's area on its surface, m²: a grid of 96 by 24 parameter cells over the
    /// region, each split into two flat triangles.
    pub fn surface_area(&self) -> f64 {
        let (n, m) = (96, 24);
        let s = self.surface();
        let rows: Vec<Vec<[f64; 3]>> = (0..=n)
            .map(|i| {
                let a = self.span[0] + (self.span[1] - self.span[0]) * i as f64 / n as f64;
                let b = self.b_range(a);
                (0..=m).map(|j| s.point([a, b[0] + (b[1] - b[0]) * j as f64 / m as f64])).collect()
            })
            .collect();
        let tri = |p: [f64; 3], q: [f64; 3], r: [f64; 3]| {
            let (u, v) = (sub(q, p), sub(r, p));
            0.5 * norm(cross(u, v))
        };
        let mut area = 0.0;
        for i in 0..n {
            for j in 0..m {
                let (p, q, r, t) = (rows[i][j], rows[i + 1][j], rows[i + 1][j + 1], rows[i][j + 1]);
                area += tri(p, q, r) + tri(p, r, t);
            }
        }
        area
    }

    pub(super) fn place(&self, p: [f64; 2]) -> PatternPlace {
        match &self.level {
            Level::Skin(s) => {
                PatternPlace { r: p[0], along: s.chord_fraction(p[0], p[1].abs().clamp(0.0, 1.0)) }
            }
            Level::Web(_) => PatternPlace { r: p[0], along: p[1] },
        }
    }
}

fn zero_area(k: usize, p: &PlySpec, key: &str, found: String) -> PlyBookError {
    PlyBookError::ZeroArea { ply_index: k, ply: p.id.clone(), key: key.to_string(), found }
}

/// The ply regions of the blade in lay-up order (see the module docs).
pub fn ply_regions<'a>(
    blade: &'a Blade,
    params: &PlyBookParams,
) -> Result<Vec<PlyRegion<'a>>, PlyBookError> {
    let (root, tip) = (blade.root_radius(), blade.tip_radius());
    let mut out = Vec::new();
    for k in 0..blade.ply_count() {
        let Some(p) = blade.ply(k) else { continue };
        let span = [p.r_start.max(root), p.r_end.min(tip)];
        if !(span[1] - span[0] > 1e-6) {
            return Err(zero_area(
                k,
                p,
                "r_start_m, r_end_m",
                format!("{}..{} m within the blade's {root}..{tip} m", p.r_start, p.r_end),
            ));
        }
        let sides: Vec<Surface> = match &p.region {
            Region::Upper => vec![Surface::Upper],
            Region::Lower => vec![Surface::Lower],
            Region::Both => vec![Surface::Upper, Surface::Lower],
            Region::Web(_) => Vec::new(),
        };
        if let Region::Web(name) = &p.region {
            let Some(w) = blade.webs().iter().position(|w| &w.name == name) else { continue };
            let ws = WebPlane::new(blade, w).span();
            let span = [span[0].max(ws[0]), span[1].min(ws[1])];
            if !(span[1] - span[0] > 1e-6) {
                return Err(zero_area(
                    k,
                    p,
                    "r_start_m, r_end_m",
                    format!("{}..{} m outside web '{name}'", p.r_start, p.r_end),
                ));
            }
            out.push(web_region(blade, k, w, span, params));
            continue;
        }
        if !(p.to - p.from > 1e-6) {
            return Err(zero_area(k, p, "from, to", format!("{}..{}", p.from, p.to)));
        }
        for side in sides {
            out.push(skin_region(blade, k, side, span, [p.from, p.to], params));
        }
    }
    Ok(out)
}

/// The region of web ply `k` on web `w` over `span`.
pub(super) fn web_region<'a>(
    blade: &'a Blade,
    k: usize,
    w: usize,
    span: [f64; 2],
    params: &PlyBookParams,
) -> PlyRegion<'a> {
    let plane = WebPlane::new(blade, w);
    let name = &blade.webs()[w].name;
    let mid = 0.5 * (span[0] + span[1]);
    let height = {
        let a = plane.point([mid, 0.0]);
        let b = plane.point([mid, 1.0]);
        ((a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2) + (a[2] - b[2]).powi(2)).sqrt()
    };
    let spacing = spacing(span[1] - span[0], height, params);
    let boundary = rectangle(span, [0.0, 1.0], 48, 12);
    PlyRegion {
        ply: k,
        surface_name: format!("web:{name}"),
        spec: RegionSpec {
            boundary,
            seed: [mid, 0.5],
            axis: [1.0, 0.0, 0.0],
            angle: blade.ply(k).map_or(0.0, |p| p.angle.rad()),
            spacing,
            root_mark: [span[0], 0.5],
        },
        level: Level::Web(plane),
        at: At::Web(w),
        span,
        chord: [0.0, 1.0],
    }
}

/// The region of surface ply `k` on `side` over `span` and the chord fractions `chord`.
pub(super) fn skin_region<'a>(
    blade: &'a Blade,
    k: usize,
    side: Surface,
    span: [f64; 2],
    chord: [f64; 2],
    params: &PlyBookParams,
) -> PlyRegion<'a> {
    let level = SkinLevel::new(blade, side, k);
    let mid = 0.5 * (span[0] + span[1]);
    let n_r = 48;
    let n_c = 16;
    let radii: Vec<f64> =
        (0..=n_r).map(|i| span[0] + (span[1] - span[0]) * i as f64 / n_r as f64).collect();
    let ranges: Vec<[f64; 2]> =
        radii.iter().map(|&r| level.b_range(r, chord[0], chord[1])).collect();
    let mut boundary = Vec::new();
    for (r, b) in radii.iter().zip(&ranges) {
        boundary.push([*r, b[0]]);
    }
    let end = ranges[n_r];
    for m in 1..n_c {
        boundary.push([span[1], end[0] + (end[1] - end[0]) * m as f64 / n_c as f64]);
    }
    for (r, b) in radii.iter().zip(&ranges).rev() {
        boundary.push([*r, b[1]]);
    }
    let start = ranges[0];
    for m in (1..n_c).rev() {
        boundary.push([span[0], start[0] + (start[1] - start[0]) * m as f64 / n_c as f64]);
    }
    let bm = level.b_range(mid, chord[0], chord[1]);
    let c = blade.chord(mid);
    let arc = c * (chord[1] - chord[0]) * 1.1;
    // Cloth cells small enough to close round the nose: a fraction of the least chord.
    let least_chord = radii.iter().map(|&r| blade.chord(r)).fold(f64::INFINITY, f64::min);
    PlyRegion {
        ply: k,
        surface_name: match side {
            Surface::Upper => "upper",
            Surface::Lower => "lower",
        }
        .to_string(),
        spec: RegionSpec {
            boundary,
            seed: [mid, 0.5 * (bm[0] + bm[1])],
            axis: [1.0, 0.0, 0.0],
            angle: blade.ply(k).map_or(0.0, |p| p.angle.rad()),
            spacing: spacing(span[1] - span[0], arc, params)
                .min(params.chord_spacing * least_chord)
                .max(params.min_spacing),
            root_mark: [span[0], 0.5 * (start[0] + start[1])],
        },
        level: Level::Skin(level),
        at: At::Skin(side),
        span,
        chord,
    }
}

fn spacing(a: f64, b: f64, params: &PlyBookParams) -> f64 {
    (a.max(b) / params.links.max(4) as f64).min(a.min(b) / 6.0).max(params.min_spacing)
}

/// A parameter rectangle's boundary, counter-clockwise, `n` samples along `a` and `m` along `b`.
fn rectangle(a: [f64; 2], b: [f64; 2], n: usize, m: usize) -> Vec<[f64; 2]> {
    let mut out = Vec::new();
    for i in 0..n {
        out.push([a[0] + (a[1] - a[0]) * i as f64 / n as f64, b[0]]);
    }
    for j in 0..m {
        out.push([a[1], b[0] + (b[1] - b[0]) * j as f64 / m as f64]);
    }
    for i in (1..=n).rev() {
        out.push([a[0] + (a[1] - a[0]) * i as f64 / n as f64, b[1]]);
    }
    for j in (1..=m).rev() {
        out.push([a[0], b[0] + (b[1] - b[0]) * j as f64 / m as f64]);
    }
    out
}

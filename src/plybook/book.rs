//! The blade's ply book: every ply region draped, flattened, checked, nested and costed.

use super::PlyBookError;
use super::drape::DrapeSurface;
use super::nest::{NestItem, Nesting, nest};
use super::pattern::{DrapeFailure, FlatPattern, RegionSpec, drape_region};
use super::regions::{SkinLevel, WebPlane};
use super::vec3::{cross, norm, sub};
use crate::blade::{Blade, Surface};
use crate::material::{CuttingData, LaminaKind};
use crate::project::{PlySpec, Project, Region};

/// Settings of the ply book.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlyBookParams {
    /// Net links along the longer side of a region (the net spacing is that side over this,
    /// and at most a sixth of the shorter side).
    pub links: usize,
    /// Least net spacing, m.
    pub min_spacing: f64,
    /// Gap kept between nested patterns, m.
    pub gap: f64,
    /// Largest net spacing on a skin as a fraction of the least chord the ply covers.
    pub chord_spacing: f64,
    /// Least distance between a splice of a ply cut in pieces and a parallel splice of a ply
    /// laid before it on the same skin or web, m (25 mm by default, common practice).
    pub stagger: f64,
}

/// Butt splices of successive plies are staggered by at least 25 mm (common practice), so that
/// no two plies of a laminate are cut along one line.
pub const SPLICE_STAGGER: f64 = 0.025;

impl Default for PlyBookParams {
    fn default() -> Self {
        PlyBookParams {
            links: 60,
            min_spacing: 0.002,
            gap: 0.01,
            chord_spacing: 0.08,
            stagger: SPLICE_STAGGER,
        }
    }
}

/// How a ply material drapes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FabricKind {
    /// Unidirectional: the fibre path deviation is reported.
    Unidirectional,
    /// Woven or stitched, balanced (`E2 ≥ 0.8 E1`): checked against the locking angle.
    Fabric,
    /// An isotropic sheet (foam, metal): flattened, not checked.
    Sheet,
}

impl FabricKind {
    /// Key for JSON and CSV.
    pub fn key(self) -> &'static str {
        match self {
            FabricKind::Unidirectional => "unidirectional",
            FabricKind::Fabric => "fabric",
            FabricKind::Sheet => "sheet",
        }
    }

    /// Whether the fibres allow a quarter turn on the roll.
    pub fn quarter_turns(self) -> bool {
        !matches!(self, FabricKind::Unidirectional)
    }
}

/// A place on the blade: radius and chord fraction on a skin, or radius and height fraction on
/// a web (0 at the lower skin).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PatternPlace {
    /// Radius, m.
    pub r: f64,
    /// Chord fraction (skin) or height fraction (web).
    pub along: f64,
}

/// One pattern of the ply book.
#[derive(Debug, Clone)]
pub struct PatternEntry {
    /// File-safe name: the ply id and its surface (`skin-1-upper`, `web-1-spar`).
    pub name: String,
    /// The ply's id.
    pub ply: String,
    /// Lay-up order: the ply's position in the schedule, 1 = laid first (outer mould line).
    pub order: usize,
    /// Line of the ply in the plies file.
    pub line: usize,
    /// Material name.
    pub material: String,
    /// `upper`, `lower` or `web:NAME`.
    pub surface: String,
    /// Fibre angle, degrees.
    pub angle_deg: f64,
    /// How the material drapes.
    pub kind: FabricKind,
    /// Span range, m.
    pub r_range: [f64; 2],
    /// Chord-fraction range on a skin; `None` on a web.
    pub chord_range: Option<[f64; 2]>,
    /// The flat pattern.
    pub pattern: FlatPattern,
    /// Area of the flat pattern, m².
    pub area_m2: f64,
    /// Ply thickness, m.
    pub thickness_m: f64,
    /// Mass of the cut pattern, kg.
    pub mass_kg: f64,
    /// Cost, where the material has `cost_per_kg`.
    pub cost: Option<f64>,
    /// Locking angle of the material, rad.
    pub locking_angle: f64,
    /// Where the greatest shear is.
    pub max_shear_place: PatternPlace,
    /// Where the greatest fibre deviation is.
    pub max_deviation_place: PatternPlace,
}

impl PatternEntry {
    /// Whether a fabric shears past its locking angle somewhere.
    pub fn locks(&self) -> bool {
        self.kind == FabricKind::Fabric && self.pattern.max_shear.abs() > self.locking_angle
    }
}

/// The nesting of one material.
#[derive(Debug, Clone)]
pub struct MaterialNesting {
    /// Material name.
    pub material: String,
    /// The nesting; `placements[k].item` indexes `patterns`.
    pub nesting: Nesting,
    /// Indices into [`PlyBook::patterns`] of the patterns nested, in item order.
    pub patterns: Vec<usize>,
    /// Areal mass of the cloth, kg/m².
    pub areal_mass: f64,
    /// Mass of the roll used less the patterns, kg.
    pub scrap_kg: f64,
    /// Cost of the roll used, where the material has `cost_per_kg`.
    pub roll_cost: Option<f64>,
}

/// The ply book of a blade.
#[derive(Debug, Clone)]
pub struct PlyBook {
    /// Project name.
    pub project: String,
    /// Patterns in lay-up order.
    pub patterns: Vec<PatternEntry>,
    /// One nesting per material, in order of first use.
    pub nestings: Vec<MaterialNesting>,
    /// Draping warnings (locked fabric, large fibre deviation) with their place.
    pub warnings: Vec<String>,
    /// Regions that could not be draped, with the reason: left out of the book.
    pub failed: Vec<PlyBookError>,
    /// Ply regions cut in pieces because one piece would not drape: the pieces and their joins.
    pub splices: Vec<String>,
}

impl PlyBook {
    /// Total mass of the patterns, kg.
    pub fn pattern_mass_kg(&self) -> f64 {
        self.patterns.iter().map(|p| p.mass_kg).sum()
    }

    /// Total cost of the patterns, when every material has a cost.
    pub fn pattern_cost(&self) -> Option<f64> {
        self.patterns.iter().map(|p| p.cost).sum()
    }
}

/// The surface a region lies on.
pub(crate) enum Level<'a> {
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
    level: Level<'a>,
    at: At,
    span: [f64; 2],
    chord: [f64; 2],
}

/// Where a region lies, to rebuild a part of it.
#[derive(Debug, Clone, Copy)]
enum At {
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

    fn place(&self, p: [f64; 2]) -> PatternPlace {
        match &self.level {
            Level::Skin(s) => {
                PatternPlace { r: p[0], along: s.chord_fraction(p[0], p[1].abs().clamp(0.0, 1.0)) }
            }
            Level::Web(_) => PatternPlace { r: p[0], along: p[1] },
        }
    }
}

/// The largest relative difference between a pattern's area and its region's area on the
/// surface for a pattern the net covers whole (the drape keeps every link's length, so the two
/// agree to the shear's second-order area change and the outline's sampling).
const AREA_CHECK: f64 = 0.03;

/// The first outline vertex whose following edge crosses a later, non-adjacent edge.
fn self_crossing(p: &[[f64; 2]]) -> Option<usize> {
    let n = p.len();
    let orient = |a: [f64; 2], b: [f64; 2], c: [f64; 2]| {
        (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
    };
    for i in 0..n {
        let (a, b) = (p[i], p[(i + 1) % n]);
        for j in i + 2..n {
            if (j + 1) % n == i {
                continue;
            }
            let (c, d) = (p[j], p[(j + 1) % n]);
            let (d1, d2) = (orient(a, b, c), orient(a, b, d));
            let (d3, d4) = (orient(c, d, a), orient(c, d, b));
            if d1 * d2 < 0.0 && d3 * d4 < 0.0 {
                return Some(i);
            }
        }
    }
    None
}

fn zero_area(file: &str, p: &PlySpec, key: &str, found: String) -> PlyBookError {
    PlyBookError::ZeroArea {
        file: file.to_string(),
        line: p.line,
        ply: p.id.clone(),
        key: key.to_string(),
        found,
    }
}

/// The ply regions of the blade in lay-up order (see the module docs).
pub fn ply_regions<'a>(
    blade: &'a Blade,
    plies_file: &str,
    params: &PlyBookParams,
) -> Result<Vec<PlyRegion<'a>>, PlyBookError> {
    let (root, tip) = (blade.root_radius(), blade.tip_radius());
    let mut out = Vec::new();
    for k in 0..blade.ply_count() {
        let Some(p) = blade.ply(k) else { continue };
        let span = [p.r_start.max(root), p.r_end.min(tip)];
        if !(span[1] - span[0] > 1e-6) {
            return Err(zero_area(
                plies_file,
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
                    plies_file,
                    p,
                    "r_start_m, r_end_m",
                    format!("{}..{} m outside web '{name}'", p.r_start, p.r_end),
                ));
            }
            out.push(web_region(blade, k, w, span, params));
            continue;
        }
        if !(p.to - p.from > 1e-6) {
            return Err(zero_area(plies_file, p, "from, to", format!("{}..{}", p.from, p.to)));
        }
        for side in sides {
            out.push(skin_region(blade, k, side, span, [p.from, p.to], params));
        }
    }
    Ok(out)
}

/// The region of web ply `k` on web `w` over `span`.
fn web_region<'a>(
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
fn skin_region<'a>(
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

/// Most halvings of a region that cannot be draped in one piece (at most `2^5` pieces).
const MAX_SPLITS: usize = 5;

/// One attempt at draping and flattening a region: the flat pattern, or why it is not one to
/// cut. A net that folds over itself, or a flat pattern whose area departs from the region's
/// area on its surface, is not a pattern to cut.
fn attempt(
    region: &PlyRegion,
    file: &str,
    p: &PlySpec,
    name: &str,
) -> Result<FlatPattern, PlyBookError> {
    let err = |what: String| PlyBookError::Drape {
        file: file.to_string(),
        line: p.line,
        ply: p.id.clone(),
        pattern: name.to_string(),
        what,
    };
    let along = if region.surface_name.starts_with("web") { "height" } else { "x/c" };
    let flat = drape_region(region.surface(), &region.spec).map_err(|e| match e {
        DrapeFailure::Seed => err("the seed or the fibre direction is degenerate".to_string()),
        DrapeFailure::Unreached(q) => {
            let at = region.place(q);
            err(format!(
                "the net does not reach r = {:.4} m, {along} = {:.3} (the cloth would fold)",
                at.r, at.along
            ))
        }
    })?;
    let surface_area = region.surface_area();
    let mismatch = (flat.area - surface_area).abs() / surface_area;
    let crossing = self_crossing(&flat.outline);
    if crossing.is_some() || (flat.cut_short.is_empty() && mismatch > AREA_CHECK) {
        let at = crossing
            .map(|k| region.place(region.spec.boundary[k]))
            .or_else(|| flat.extrapolated.first().map(|&q| region.place(q)))
            .unwrap_or_else(|| region.place(region.spec.seed));
        return Err(err(format!(
            "the flat pattern {} ({:.4} m² against {:.4} m² of the region on its surface) near r = {:.3} m, {along} = {:.3}; left out of the book",
            if crossing.is_some() { "crosses itself" } else { "does not keep the region's area" },
            flat.area,
            surface_area,
            at.r,
            at.along
        )));
    }
    Ok(flat)
}

/// A splice line of a ply cut in pieces: across the span at a radius (over a range of chord
/// fractions, or of heights on a web), or along the span at a chord fraction (over a range of
/// radii).
#[derive(Debug, Clone)]
struct Splice {
    /// Index of the ply in the schedule.
    ply: usize,
    /// The skin or web (`upper`, `lower`, `web:NAME`).
    surface: String,
    /// Across the span (at a radius) rather than along it (at a chord fraction).
    across_span: bool,
    /// The radius (m) or the chord fraction of the line.
    at: f64,
    /// The chord fractions (heights) or radii the line runs over.
    extent: [f64; 2],
}

/// The splices between the pieces of a region (each the lower edge of a piece inside the
/// region).
fn splices_of(span: [f64; 2], chord: [f64; 2], pieces: &[(PlyRegion, FlatPattern)]) -> Vec<Splice> {
    let mut out = Vec::new();
    for (piece, _) in pieces {
        if piece.span[0] > span[0] + 1e-9 {
            out.push(Splice {
                ply: piece.ply,
                surface: piece.surface_name.clone(),
                across_span: true,
                at: piece.span[0],
                extent: piece.chord,
            });
        }
        if piece.chord[0] > chord[0] + 1e-9 {
            out.push(Splice {
                ply: piece.ply,
                surface: piece.surface_name.clone(),
                across_span: false,
                at: piece.chord[0],
                extent: piece.span,
            });
        }
    }
    out
}

/// Where to cut `[lo, hi]` in two: the middle, or where the middle lies within `clear` of a
/// splice of an earlier ply (`lines`: the ply and the line's place), the nearest place that
/// keeps `clear` from them all while each half keeps at least a quarter of the range. When no
/// place is clear of them all, the splices of the earliest plies are given up first, the
/// latest ply's kept as long as any; the plies whose splices could not be kept clear are
/// returned with the place.
fn stagger_cut(lo: f64, hi: f64, clear: f64, lines: &[(usize, f64)]) -> (f64, Vec<usize>) {
    let mid = 0.5 * (lo + hi);
    let window = [lo + 0.25 * (hi - lo), hi - 0.25 * (hi - lo)];
    let mut plies: Vec<usize> = lines.iter().map(|l| l.0).collect();
    plies.sort_unstable();
    plies.dedup();
    // The latest plies first; `keep` of them respected.
    plies.reverse();
    for keep in (1..=plies.len()).rev() {
        let kept = &plies[..keep];
        let near: Vec<f64> = lines.iter().filter(|l| kept.contains(&l.0)).map(|l| l.1).collect();
        let clear_of = |c: f64| near.iter().all(|&a| (c - a).abs() >= clear * (1.0 - 1e-9));
        let mut best: Option<f64> = None;
        let candidates =
            std::iter::once(mid).chain(near.iter().flat_map(|&a| [a - clear, a + clear]));
        for c in candidates {
            if c < window[0] || c > window[1] || !clear_of(c) {
                continue;
            }
            if best.is_none_or(|b| (c - mid).abs() < (b - mid).abs()) {
                best = Some(c);
            }
        }
        if let Some(c) = best {
            return (c, plies[keep..].to_vec());
        }
    }
    (mid, plies)
}

/// The two halves of a region: across the span where the region is at least as long as it is
/// wide on the surface (always on a web), else across the chord; at the middle, or off it to
/// keep [`PlyBookParams::stagger`] from the parallel splices of earlier plies on the same skin
/// or web (see [`stagger_cut`]; on a skin a chordwise distance is taken at the least chord of
/// the region's span, less than the distance on the surface). Also the earlier plies whose
/// splices the cut could not keep clear of.
fn halves<'a>(
    blade: &'a Blade,
    region: &PlyRegion<'a>,
    params: &PlyBookParams,
    earlier: &[Splice],
) -> ([PlyRegion<'a>; 2], Vec<usize>) {
    let (a, c) = (region.span, region.chord);
    let mid = 0.5 * (a[0] + a[1]);
    let k = region.ply;
    let across_span = match region.at {
        At::Web(_) => true,
        At::Skin(_) => a[1] - a[0] >= blade.chord(mid) * (c[1] - c[0]),
    };
    let overlaps = |e: [f64; 2], f: [f64; 2]| e[1].min(f[1]) - e[0].max(f[0]) > 1e-9;
    let lines: Vec<(usize, f64)> = earlier
        .iter()
        .filter(|s| s.surface == region.surface_name && s.across_span == across_span)
        .filter(|s| overlaps(s.extent, if across_span { c } else { a }))
        .map(|s| (s.ply, s.at))
        .collect();
    if across_span {
        let (m, missed) = stagger_cut(a[0], a[1], params.stagger, &lines);
        let pair = match region.at {
            At::Web(w) => [
                web_region(blade, k, w, [a[0], m], params),
                web_region(blade, k, w, [m, a[1]], params),
            ],
            At::Skin(side) => [
                skin_region(blade, k, side, [a[0], m], c, params),
                skin_region(blade, k, side, [m, a[1]], c, params),
            ],
        };
        return (pair, missed);
    }
    let least_chord = (0..=16)
        .map(|i| blade.chord(a[0] + (a[1] - a[0]) * i as f64 / 16.0))
        .fold(f64::INFINITY, f64::min);
    let (m, missed) = stagger_cut(c[0], c[1], params.stagger / least_chord, &lines);
    let side = match region.at {
        At::Skin(side) => side,
        At::Web(_) => Surface::Upper,
    };
    (
        [
            skin_region(blade, k, side, a, [c[0], m], params),
            skin_region(blade, k, side, a, [m, c[1]], params),
        ],
        missed,
    )
}

/// The pieces of a region, each with its flat pattern.
type Pieces<'a> = Vec<(PlyRegion<'a>, FlatPattern)>;

/// A drape attempt's outcome (see [`attempt`]).
type Attempt = Result<FlatPattern, PlyBookError>;

/// A region draped whole, or, where it cannot be draped in one piece (the net does not reach
/// it, folds over itself, loses area or ends short of it), split in halves (see [`halves`],
/// which staggers the cut from the `earlier` plies' splices) and each half draped the same way,
/// at most [`MAX_SPLITS`] times deep. When no split drapes whole the region's own result stands
/// (a pattern cut short, with its warning, or the failure). With the pieces, the earlier plies
/// a cut could not be staggered from. `whole` is the region's own attempt when it was already
/// made (see [`first_attempts`]). The two halves are draped side by side on two threads; their
/// results are taken in order, so the pieces are those of draping them one after the other.
#[allow(clippy::too_many_arguments)]
fn drape_pieces<'a>(
    blade: &'a Blade,
    region: PlyRegion<'a>,
    whole: Option<Attempt>,
    file: &str,
    p: &PlySpec,
    name: &str,
    params: &PlyBookParams,
    earlier: &[Splice],
    depth: usize,
) -> Result<(Pieces<'a>, Vec<usize>), PlyBookError> {
    let whole = whole.unwrap_or_else(|| attempt(&region, file, p, name));
    if matches!(&whole, Ok(f) if f.cut_short.is_empty()) || depth >= MAX_SPLITS {
        return whole.map(|f| (vec![(region, f)], Vec::new()));
    }
    let mut pieces = Vec::new();
    let ([first, second], mut missed) = halves(blade, &region, params, earlier);
    let drape_half =
        |half| drape_pieces(blade, half, None, file, p, name, params, earlier, depth + 1);
    let results = std::thread::scope(|scope| {
        let other = scope.spawn(|| drape_half(first));
        let second = drape_half(second);
        let first = other.join().unwrap_or_else(|e| std::panic::resume_unwind(e));
        [first, second]
    });
    for result in results {
        match result {
            Ok((v, m)) if v.iter().all(|(_, f)| f.cut_short.is_empty()) => {
                pieces.extend(v);
                missed.extend(m);
            }
            _ => return whole.map(|f| (vec![(region, f)], Vec::new())),
        }
    }
    missed.sort_unstable();
    missed.dedup();
    Ok((pieces, missed))
}

/// The pattern name of a region: the ply's id and its skin or web.
fn region_name(p: &PlySpec, region: &PlyRegion) -> String {
    format!("{}-{}", file_safe(&p.id), file_safe(region.surface_name.trim_start_matches("web:")))
}

/// Every region's first attempt, draped whole (see [`attempt`]), the regions shared out over
/// the machine's cores (at most [`THREADS`]); the attempts do not depend on each other, so the
/// results are those of one thread, in the regions' order. `None` for a region of a ply
/// without a material (left out of the book).
fn first_attempts<'a>(
    blade: &'a Blade,
    regions: Vec<PlyRegion<'a>>,
    file: &str,
) -> Vec<(PlyRegion<'a>, Option<Attempt>)> {
    let count = regions.len();
    let threads = crate::parallel::threads().clamp(1, THREADS);
    let queue = std::sync::Mutex::new(regions.into_iter().enumerate());
    let work = || {
        let mut done = Vec::new();
        loop {
            let next = match queue.lock() {
                Ok(mut q) => q.next(),
                Err(poisoned) => poisoned.into_inner().next(),
            };
            let Some((k, region)) = next else { break };
            let tried = match (blade.ply(region.ply), blade.ply_material(region.ply)) {
                (Some(p), Some(_)) => Some(attempt(&region, file, p, &region_name(p, &region))),
                _ => None,
            };
            done.push((k, region, tried));
        }
        done
    };
    let mut all: Vec<(usize, PlyRegion<'a>, Option<Attempt>)> = std::thread::scope(|scope| {
        let helpers: Vec<_> = (1..threads).map(|_| scope.spawn(work)).collect();
        let mut all = work();
        for h in helpers {
            all.extend(h.join().unwrap_or_else(|e| std::panic::resume_unwind(e)));
        }
        all
    });
    all.sort_by_key(|(k, _, _)| *k);
    debug_assert_eq!(all.len(), count);
    all.into_iter().map(|(_, region, tried)| (region, tried)).collect()
}

/// Most threads the first attempts are shared over.
const THREADS: usize = 8;

/// Builds the ply book of a blade: every ply region draped and flattened (in pieces where one
/// will not drape whole), checked, and the patterns of each material nested on its roll.
pub fn build_ply_book(
    blade: &Blade,
    project: &Project,
    params: &PlyBookParams,
) -> Result<PlyBook, PlyBookError> {
    let regions = ply_regions(blade, &project.files.plies, params)?;
    let mut patterns = Vec::with_capacity(regions.len());
    let mut warnings = Vec::new();
    let mut failed = Vec::new();
    let mut splices = Vec::new();
    let mut splice_lines: Vec<Splice> = Vec::new();
    let file = &project.files.plies;
    for (region, whole) in first_attempts(blade, regions, file) {
        let Some(p) = blade.ply(region.ply) else { continue };
        let Some(mat) = blade.ply_material(region.ply) else { continue };
        let cutting = project.materials.cutting(&p.material);
        let kind = match mat.kind {
            LaminaKind::Isotropic => FabricKind::Sheet,
            LaminaKind::Orthotropic if mat.e2 >= 0.8 * mat.e1 => FabricKind::Fabric,
            LaminaKind::Orthotropic => FabricKind::Unidirectional,
        };
        let name = region_name(p, &region);
        let extent = (region.span, region.chord, region.surface_name.clone());
        let (pieces, missed) =
            match drape_pieces(blade, region, whole, file, p, &name, params, &splice_lines, 0) {
                Ok(v) => v,
                Err(e) => {
                    failed.push(e);
                    continue;
                }
            };
        let count = pieces.len();
        if count > 1 {
            splices.push(splice_note(p, &name, &pieces, params.stagger));
            splice_lines.extend(splices_of(extent.0, extent.1, &pieces));
        }
        if !missed.is_empty() {
            let ids: Vec<String> = missed
                .iter()
                .filter_map(|&k| blade.ply(k).map(|q| format!("'{}'", q.id)))
                .collect();
            warnings.push(format!(
                "ply '{}' ({name}): a splice could not be kept {:.0} mm from the splices of ply {} on the same {} (the region is too small to move it): stagger them by hand or cut the ply elsewhere",
                p.id,
                params.stagger * 1e3,
                ids.join(", "),
                if extent.2.starts_with("web") { "web" } else { "skin" }
            ));
        }
        for (n, (region, flat)) in pieces.into_iter().enumerate() {
            let name = if count > 1 { piece_name(&name, n) } else { name.clone() };
            let mass = flat.area * mat.ply_thickness * mat.density;
            let entry = PatternEntry {
                name,
                ply: p.id.clone(),
                order: region.ply + 1,
                line: p.line,
                material: p.material.clone(),
                surface: region.surface_name.clone(),
                angle_deg: p.angle.deg(),
                kind,
                r_range: region.span,
                chord_range: matches!(region.level, Level::Skin(_)).then_some(region.chord),
                area_m2: flat.area,
                thickness_m: mat.ply_thickness,
                mass_kg: mass,
                cost: cutting.cost_per_kg.map(|c| c * mass),
                locking_angle: cutting.locking_angle,
                max_shear_place: region.place(flat.max_shear_at),
                max_deviation_place: region.place(flat.max_deviation_at),
                pattern: flat,
            };
            warnings.extend(drape_warning(&entry));
            let along = if region.surface_name.starts_with("web") { "height" } else { "x/c" };
            if let Some(&q) = entry.pattern.cut_short.first() {
                let at = region.place(q);
                warnings.push(format!(
                    "ply '{}' ({}): the draped net cannot be carried to r = {:.3} m, {along} = {:.3} (a cell of the cloth would fold), not even in pieces: the pattern ends short of the ply's region there ({} of {} outline points moved in, pattern area {:.4} m²); add a dart, and check by a trial lay-up",
                    entry.ply,
                    entry.name,
                    at.r,
                    at.along,
                    entry.pattern.cut_short.len(),
                    entry.pattern.outline.len(),
                    entry.area_m2
                ));
            }
            if let Some(&q) = entry.pattern.extrapolated.first() {
                let at = region.place(q);
                warnings.push(format!(
                    "ply '{}' ({}): the draped net stops short of the region near r = {:.3} m, {along} = {:.3} ({} outline points extrapolated): the cloth will not follow the surface there without a dart or a split; check by a trial lay-up",
                    entry.ply,
                    entry.name,
                    at.r,
                    at.along,
                    entry.pattern.extrapolated.len()
                ));
            }
            patterns.push(entry);
        }
    }
    let nestings = nest_materials(&patterns, project, params)?;
    Ok(PlyBook { project: project.name.clone(), patterns, nestings, warnings, failed, splices })
}

/// The label of piece `n` (from 0) of a pattern cut in pieces: a letter after the name.
fn piece_name(name: &str, n: usize) -> String {
    let letter = char::from(b'a' + (n % 26) as u8);
    format!("{name}-{letter}")
}

/// The note on a ply region cut in pieces: each piece with its range, and how they join.
fn splice_note(
    p: &PlySpec,
    name: &str,
    pieces: &[(PlyRegion, FlatPattern)],
    stagger: f64,
) -> String {
    let list: Vec<String> = pieces
        .iter()
        .enumerate()
        .map(|(n, (r, _))| {
            let mut s = format!("{} r {:.3}–{:.3} m", piece_name(name, n), r.span[0], r.span[1]);
            if matches!(r.at, At::Skin(_)) {
                s.push_str(&format!(", x/c {:.3}–{:.3}", r.chord[0], r.chord[1]));
            }
            s
        })
        .collect();
    format!(
        "ply '{}' ({name}) will not drape in one piece and is cut in {} pieces that do: {}; butt the pieces edge to edge along the splice lines (no overlap, so the kit's mass is the ply's) ; the cuts are placed at least {:.0} mm from the parallel splices of the plies laid before on the same surface (common practice)",
        p.id,
        pieces.len(),
        list.join("; "),
        stagger * 1e3
    )
}

fn drape_warning(e: &PatternEntry) -> Option<String> {
    let place = |p: PatternPlace| {
        if e.surface.starts_with("web") {
            format!("r = {:.3} m, height {:.2}", p.r, p.along)
        } else {
            format!("r = {:.3} m, x/c = {:.3}", p.r, p.along)
        }
    };
    match e.kind {
        FabricKind::Fabric if e.locks() => Some(format!(
            "ply '{}' ({}): the fabric shears {:.1}° at {}, past its locking angle of {:.1}°: it will wrinkle there; split the ply or add darts",
            e.ply,
            e.name,
            e.pattern.max_shear.to_degrees().abs(),
            place(e.max_shear_place),
            e.locking_angle.to_degrees()
        )),
        FabricKind::Unidirectional if e.pattern.max_deviation.to_degrees().abs() > 5.0 => {
            Some(format!(
                "ply '{}' ({}): the fibres deviate {:.1}° from the intended direction at {} (more than 5°, common practice)",
                e.ply,
                e.name,
                e.pattern.max_deviation.to_degrees().abs(),
                place(e.max_deviation_place)
            ))
        }
        _ => None,
    }
}

fn nest_materials(
    patterns: &[PatternEntry],
    project: &Project,
    params: &PlyBookParams,
) -> Result<Vec<MaterialNesting>, PlyBookError> {
    let mut materials: Vec<&str> = Vec::new();
    for p in patterns {
        if !materials.contains(&p.material.as_str()) {
            materials.push(&p.material);
        }
    }
    let mut out = Vec::new();
    for m in materials {
        let cutting: CuttingData = project.materials.cutting(m);
        let idx: Vec<usize> = (0..patterns.len()).filter(|&k| patterns[k].material == m).collect();
        let items: Vec<NestItem> = idx
            .iter()
            .map(|&k| NestItem {
                outline: patterns[k].pattern.outline.clone(),
                quarter_turns: patterns[k].kind.quarter_turns(),
            })
            .collect();
        let nesting = nest(&items, cutting.roll_width, params.gap).map_err(|e| {
            let p = &patterns[idx[e.item]];
            PlyBookError::RollTooNarrow {
                ply: p.ply.clone(),
                pattern: p.name.clone(),
                material: m.to_string(),
                file: project.files.materials.clone(),
                least_mm: e.least_width * 1e3,
                roll_mm: cutting.roll_width * 1e3,
            }
        })?;
        let first = &patterns[idx[0]];
        let areal_mass = first.mass_kg / first.area_m2;
        let roll_area = nesting.length * nesting.width;
        let scrap_kg = (roll_area - nesting.pattern_area).max(0.0) * areal_mass;
        out.push(MaterialNesting {
            material: m.to_string(),
            roll_cost: cutting.cost_per_kg.map(|c| c * roll_area * areal_mass),
            nesting,
            patterns: idx,
            areal_mass,
            scrap_kg,
        });
    }
    Ok(out)
}

/// Letters, digits, `-` and `_`; anything else becomes `-`.
fn file_safe(s: &str) -> String {
    s.chars()
        .map(|c| if c.is_ascii_alphanumeric() || c == '-' || c == '_' { c } else { '-' })
        .collect()
}

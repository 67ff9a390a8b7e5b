//! The reserve-factor map: the worst reserve factor over span and chord position, with the
//! critical location called out.
//!
//! Horizontal: radius. Vertical: chord fraction from the leading edge on the upper surface
//! (above 0) and on the lower surface (below 0, mirrored), webs in bands above the upper surface.
//! Each cell is the lowest reserve factor of any ply at that wall point over the cases drawn. The
//! wall panel with the lowest buckling reserve factor is marked with a diamond (every panel is
//! drawn on the buckling map beside this one, `buckling_map.rs`).

use crate::analysis::BladeModel;
use crate::report::plot::{Anchor, Figure, Marker, palette};
use crate::stress::{CaseStress, WallLocation};

/// Reserve-factor bins: upper bound and colour (our own scale; red below 1 means failure).
const BINS: [(f64, &str, &str); 8] = [
    (1.0, "#9e1b32", "below 1 (fails)"),
    (1.5, "#d9622b", "1 to 1.5"),
    (2.0, "#f0a23b", "1.5 to 2"),
    (3.0, "#f5d98b", "2 to 3"),
    (5.0, "#cfe3c8", "3 to 5"),
    (10.0, "#9cc7b4", "5 to 10"),
    (30.0, "#6aa2b8", "10 to 30"),
    (f64::INFINITY, "#dfe7ee", "30 or more, or none"),
];

fn colour(rf: f64) -> &'static str {
    BINS.iter().find(|(hi, ..)| rf < *hi).map(|b| b.1).unwrap_or(BINS[7].1)
}

/// Vertical position of a wall point on the map.
fn map_y(location: &WallLocation, webs: &[String]) -> f64 {
    match location {
        WallLocation::Surface { upper, x_c, .. } => {
            if *upper {
                *x_c
            } else {
                -*x_c
            }
        }
        WallLocation::Web { name, .. } => {
            let k = webs.iter().position(|w| w == name).unwrap_or(0);
            1.1 + 0.1 * k as f64
        }
    }
}

/// The frame shared by the maps over span and chord (reserve factors, buckling): radius across,
/// chord position up (upper surface above 0, lower below, one row per web above 1).
pub(crate) struct SpanChordMap {
    pub fig: Figure,
    pub webs: Vec<String>,
    pub radii: Vec<f64>,
    pub r0: f64,
    pub r1: f64,
}

impl SpanChordMap {
    pub fn new(model: &BladeModel, title: &str) -> Self {
        let webs: Vec<String> = model.blade.webs().iter().map(|w| w.name.clone()).collect();
        let mut fig = Figure::new(
            title,
            "radius from the rotor axis (m)",
            "chord position x/c: upper surface above 0, lower below; webs above 1",
        );
        fig.size(980.0, 600.0);
        let (r0, r1) = (model.blade.root_radius(), model.blade.tip_radius());
        let top = 1.05 + 0.1 * webs.len() as f64;
        fig.x_range(r0, r1).y_range(-1.0, top.max(1.0));
        SpanChordMap { fig, webs, radii: model.radii(), r0, r1 }
    }
}

/// The span `[left, right]` a station's column covers: halfway to its neighbours, the blade's
/// ends at the first and last station.
pub(crate) fn station_band(radii: &[f64], i: usize, r0: f64, r1: f64) -> (f64, f64) {
    let left = if i == 0 { r0 } else { 0.5 * (radii[i - 1] + radii[i]) };
    let right = if i + 1 == radii.len() { r1 } else { 0.5 * (radii[i] + radii[i + 1]) };
    (left, right)
}

/// The map as a standalone SVG.
pub fn stress_svg(model: &BladeModel, cases: &[CaseStress]) -> String {
    let names: Vec<&str> = cases.iter().map(|c| c.name.as_str()).collect();
    let title = format!("Lowest reserve factor over span and chord ({})", names.join(", "));
    let SpanChordMap { mut fig, webs, radii, r0, r1 } = SpanChordMap::new(model, &title);
    for i in 0..radii.len() {
        let (left, right) = station_band(&radii, i, r0, r1);
        // Worst over the cases, point by point (every case has the same points at a station).
        let mut points: Vec<(f64, f64, bool)> = Vec::new();
        for c in cases {
            let Some(st) = c.stations.get(i) else { continue };
            for (k, p) in st.points.iter().enumerate() {
                let rf = p.reserve_factor();
                let is_web = matches!(p.location, WallLocation::Web { .. });
                let y = map_y(&p.location, &webs);
                match points.get_mut(k) {
                    Some(q) => q.1 = q.1.min(rf),
                    None => points.push((y, rf, is_web)),
                }
            }
        }
        // Skin cells reach half way to their neighbours along the map's vertical.
        let mut skin: Vec<(f64, f64)> =
            points.iter().filter(|p| !p.2).map(|p| (p.0, p.1)).collect();
        skin.sort_by(|a, b| a.0.total_cmp(&b.0));
        // Neighbouring cells of one colour are drawn as one rectangle.
        let mut run: Option<(f64, f64, &str)> = None;
        for (j, &(y, rf)) in skin.iter().enumerate() {
            let lo = if j == 0 { -1.0 } else { 0.5 * (skin[j - 1].0 + y) };
            let hi = if j + 1 == skin.len() { 1.0 } else { 0.5 * (y + skin[j + 1].0) };
            let c = colour(rf);
            run = match run {
                Some((a, _, rc)) if rc == c => Some((a, hi, c)),
                Some((a, b, rc)) => {
                    fig.rect(left, a, right, b, rc, 1.0);
                    Some((lo, hi, c))
                }
                None => Some((lo, hi, c)),
            };
        }
        if let Some((a, b, c)) = run {
            fig.rect(left, a, right, b, c, 1.0);
        }
        for k in 0..webs.len() {
            let band = 1.1 + 0.1 * k as f64;
            let rf = points
                .iter()
                .filter(|p| p.2 && (p.0 - band).abs() < 1e-9)
                .map(|p| p.1)
                .fold(f64::INFINITY, f64::min);
            if points.iter().any(|p| p.2 && (p.0 - band).abs() < 1e-9) {
                fig.rect(left, band - 0.04, right, band + 0.04, colour(rf), 1.0);
            }
        }
    }
    for (k, w) in webs.iter().enumerate() {
        fig.label(r0, 1.1 + 0.1 * k as f64, &format!("web {w}"), palette::INK, Anchor::Start);
    }
    fig.line(&[(r0, 0.0), (r1, 0.0)], &crate::report::plot::LineStyle::solid(palette::INK, 1.0));
    // The critical location of the worst case.
    if let Some((case, c)) = cases
        .iter()
        .filter_map(|case| case.critical.as_ref().map(|c| (case, c)))
        .min_by(|a, b| a.1.reserve_factor.total_cmp(&b.1.reserve_factor))
    {
        let y = map_y(&c.location, &webs);
        fig.markers(&[(c.r, y)], Marker::Cross, 14.0, palette::INK);
        fig.markers(&[(c.r, y)], Marker::Ring, 22.0, palette::INK);
        let anchor = if c.r > 0.5 * (r0 + r1) { Anchor::End } else { Anchor::Start };
        let dx = if matches!(anchor, Anchor::End) { -0.01 } else { 0.01 } * (r1 - r0);
        fig.label(
            c.r + dx,
            y + 0.08,
            &format!(
                "lowest {:.2}: {}, {}, {}",
                c.reserve_factor,
                case.name,
                c.ply_id,
                c.mode.label()
            ),
            palette::INK,
            anchor,
        );
        fig.legend_marker("lowest reserve factor", Marker::Cross, palette::INK);
    }
    // The panel with the lowest buckling reserve factor (the buckling map shows every panel).
    let buckling = cases
        .iter()
        .filter_map(|c| c.least_buckling().map(|(i, j)| (c, i, j)))
        .map(|(c, i, j)| (c.buckling[i].r, &c.buckling[i].panels[j]))
        .min_by(|a, b| a.1.check.reserve_factor.total_cmp(&b.1.check.reserve_factor));
    if let Some((r, p)) = buckling.filter(|(_, p)| p.check.reserve_factor.is_finite()) {
        let y = match &p.panel.part {
            crate::buckling::PanelPart::Web { name } => {
                1.1 + 0.1 * webs.iter().position(|w| w == name).unwrap_or(0) as f64
            }
            crate::buckling::PanelPart::Skin => 0.5 * (map_y(&p.from, &webs) + map_y(&p.to, &webs)),
        };
        fig.markers(&[(r, y)], Marker::Diamond, 12.0, palette::INK);
        fig.label(
            r,
            y - 0.09,
            &format!("lowest buckling {:.2}: {}", p.check.reserve_factor, p.check.mode.label()),
            palette::INK,
            if r > 0.5 * (r0 + r1) { Anchor::End } else { Anchor::Start },
        );
        fig.legend_marker("panel of lowest buckling reserve factor", Marker::Diamond, palette::INK);
    }
    for (_, fill, text) in BINS {
        fig.legend_band(&format!("RF {text}"), fill, 1.0);
    }
    fig.render()
}

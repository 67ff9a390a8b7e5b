//! The buckling map beside the reserve-factor map: every wall panel of every station drawn over
//! span and chord position, coloured by its lowest buckling reserve factor over the cases drawn
//! (panel buckling and the sandwich modes), with the critical panel called out.
//!
//! Axes as on the reserve map: radius across; chord fraction from the leading edge on the upper
//! surface above 0 and on the lower surface below 0 (mirrored), webs in bands above 1.

use super::map::{SpanChordMap, station_band};
use crate::analysis::BladeModel;
use crate::buckling::PanelPart;
use crate::report::plot::{Anchor, Marker, palette};
use crate::stress::{CaseStress, WallLocation};

/// Reserve-factor bins, as on the reserve map (our own scale; red below 1 means buckling).
const BINS: [(f64, &str, &str); 7] = [
    (1.0, "#9e1b32", "below 1 (buckles)"),
    (1.5, "#d9622b", "1 to 1.5"),
    (2.0, "#f0a23b", "1.5 to 2"),
    (3.0, "#f5d98b", "2 to 3"),
    (5.0, "#cfe3c8", "3 to 5"),
    (10.0, "#9cc7b4", "5 to 10"),
    (f64::INFINITY, "#dfe7ee", "10 or more, or no compression"),
];

fn colour(rf: f64) -> &'static str {
    BINS.iter().find(|(hi, ..)| rf < *hi).map(|b| b.1).unwrap_or(BINS[6].1)
}

fn map_y(l: &WallLocation) -> f64 {
    match l {
        WallLocation::Surface { upper: true, x_c, .. } => *x_c,
        WallLocation::Surface { upper: false, x_c, .. } => -*x_c,
        WallLocation::Web { .. } => 1.1,
    }
}

/// The vertical extent of a panel on the map.
fn extent(p: &crate::stress::PanelResult, webs: &[String]) -> (f64, f64) {
    match &p.panel.part {
        PanelPart::Web { name } => {
            let k = webs.iter().position(|w| w == name).unwrap_or(0) as f64;
            (1.06 + 0.1 * k, 1.14 + 0.1 * k)
        }
        PanelPart::Skin => {
            let (a, b) = (map_y(&p.from), map_y(&p.to));
            (a.min(b), a.max(b))
        }
    }
}

/// The buckling map as a standalone SVG.
pub fn buckling_svg(model: &BladeModel, cases: &[CaseStress]) -> String {
    let names: Vec<&str> = cases.iter().map(|c| c.name.as_str()).collect();
    let title = format!("Lowest buckling reserve factor of each wall panel ({})", names.join(", "));
    let SpanChordMap { mut fig, webs, radii, r0, r1 } = SpanChordMap::new(model, &title);
    for i in 0..radii.len() {
        let (left, right) = station_band(&radii, i, r0, r1);
        let Some(first) = cases.first().and_then(|c| c.buckling.get(i)) else { continue };
        for (j, p) in first.panels.iter().enumerate() {
            let rf = cases
                .iter()
                .filter_map(|c| c.buckling.get(i).and_then(|s| s.panels.get(j)))
                .map(|q| q.check.reserve_factor)
                .fold(f64::INFINITY, f64::min);
            let (lo, hi) = extent(p, &webs);
            fig.rect(left, lo, right, hi, colour(rf), 1.0);
        }
    }
    for (k, w) in webs.iter().enumerate() {
        fig.label(r0, 1.1 + 0.1 * k as f64, &format!("web {w}"), palette::INK, Anchor::Start);
    }
    fig.line(&[(r0, 0.0), (r1, 0.0)], &crate::report::plot::LineStyle::solid(palette::INK, 1.0));
    let least =
        cases.iter().filter_map(|c| c.least_buckling().map(|(i, j)| (c, i, j))).min_by(|a, b| {
            let rf = |x: &(&CaseStress, usize, usize)| {
                x.0.buckling[x.1].panels[x.2].check.reserve_factor
            };
            rf(a).total_cmp(&rf(b))
        });
    if let Some((case, i, j)) = least {
        let p = &case.buckling[i].panels[j];
        if p.check.reserve_factor.is_finite() {
            let r = case.buckling[i].r;
            let (lo, hi) = extent(p, &webs);
            let y = 0.5 * (lo + hi);
            fig.markers(&[(r, y)], Marker::Cross, 14.0, palette::INK);
            fig.markers(&[(r, y)], Marker::Ring, 22.0, palette::INK);
            let anchor = if r > 0.5 * (r0 + r1) { Anchor::End } else { Anchor::Start };
            let dx = if matches!(anchor, Anchor::End) { -0.01 } else { 0.01 } * (r1 - r0);
            fig.label(
                r + dx,
                y + 0.08,
                &format!(
                    "lowest {:.2}: {}, {}",
                    p.check.reserve_factor,
                    case.name,
                    p.check.mode.label()
                ),
                palette::INK,
                anchor,
            );
            fig.legend_marker("lowest buckling reserve factor", Marker::Cross, palette::INK);
        }
    }
    for (_, fill, text) in BINS {
        fig.legend_band(&format!("RF {text}"), fill, 1.0);
    }
    fig.render()
}

//! The worst value of every ply at every station as CSV.

use std::fmt::Write as _;

use crate::stress::{CaseStress, WallLocation};

/// One row per load case, station and schedule ply: the ply's worst reserve factor at that
/// station, by the governing criterion and by each criterion, with where it occurs.
pub fn stress_csv(cases: &[CaseStress]) -> String {
    let mut out = String::from(
        "case,r_m,ply,ply_id,reserve_factor,criterion,mode,part,surface_or_web,x_c,z_m,\
         tsai_wu,max_stress,max_strain,hashin\n",
    );
    let cell = |v: f64| if v.is_finite() { format!("{v:.6}") } else { String::new() };
    for c in cases {
        for w in &c.ply_worst {
            let (part, place, x, z) = match &w.location {
                WallLocation::Surface { upper, x_c, solid } => (
                    if *solid { "solid_trailing_edge" } else { "skin" },
                    if *upper { "upper".to_string() } else { "lower".to_string() },
                    format!("{x_c:.4}"),
                    String::new(),
                ),
                WallLocation::Web { name, z } => {
                    ("web", name.clone(), String::new(), format!("{z:.5}"))
                }
            };
            let _ = writeln!(
                out,
                "{},{:.5},{},{},{},{},{},{},{},{},{},{},{},{},{}",
                csv_text(&c.name),
                w.r,
                w.ply + 1,
                csv_text(&w.ply_id),
                cell(w.reserve_factor),
                w.criterion.map(|k| k.key()).unwrap_or(""),
                w.mode.key(),
                part,
                csv_text(&place),
                x,
                z,
                cell(w.by_criterion[0]),
                cell(w.by_criterion[1]),
                cell(w.by_criterion[2]),
                cell(w.by_criterion[3]),
            );
        }
    }
    out
}

fn csv_text(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

//! The stress report: JSON, the station-by-ply CSV and the terminal summary of
//! [`crate::stress::CaseStress`] results.

use std::fmt::Write as _;

use serde_json::{Value, json};

use super::{Align, Table, fixed, sig4};
use crate::analysis::BladeModel;
use crate::stress::{CaseStress, Critical, PanelResult, WallLocation};

fn finite(v: f64) -> Value {
    if v.is_finite() { json!(v) } else { Value::Null }
}

fn location_json(l: &WallLocation) -> Value {
    match l {
        WallLocation::Surface { upper, x_c, solid } => json!({
            "part": if *solid { "solid_trailing_edge" } else { "skin" },
            "surface": if *upper { "upper" } else { "lower" },
            "x_c": x_c,
        }),
        WallLocation::Web { name, z } => json!({ "part": "web", "web": name, "z_m": z }),
    }
}

fn critical_json(c: &Critical) -> Value {
    json!({
        "reserve_factor": c.reserve_factor,
        "r_m": c.r,
        "location": location_json(&c.location),
        "ply": c.ply + 1,
        "ply_id": c.ply_id,
        "material": c.material,
        "angle_deg": c.angle_deg,
        "criterion": c.criterion.key(),
        "mode": c.mode.key(),
        "sigma1_Pa": c.stress_12.x,
        "sigma2_Pa": c.stress_12.y,
        "tau12_Pa": c.stress_12.z,
    })
}

fn panel_json(r: f64, index: usize, p: &PanelResult) -> Value {
    let panel = &p.panel;
    let c = &p.check;
    let (part, web) = match &panel.part {
        crate::buckling::PanelPart::Skin => ("skin", Value::Null),
        crate::buckling::PanelPart::Web { name } => ("web", json!(name)),
    };
    let wall = panel.sandwich.as_ref().or_else(|| panel.element_sandwich.iter().flatten().next());
    let sandwich = match (wall, &c.sandwich) {
        (Some(w), Some(f)) => json!({
            "core_material": w.core_material,
            "core_thickness_m": w.core_thickness,
            "face_thickness_m": w.face_thickness,
            "face_distance_m": w.face_distance,
            "shear_stiffness_N_m": w.shear_stiffness,
            "wrinkling_stress_Pa": w.wrinkling_stress,
            "wrinkling_factor": finite(f.wrinkling),
            "crimping_factor": finite(f.crimping),
            "core_shear_factor": finite(f.core_shear),
        }),
        _ => Value::Null,
    };
    json!({
        "r_m": r,
        "panel": index + 1,
        "part": part,
        "web": web,
        "from": location_json(&p.from),
        "to": location_json(&p.to),
        "width_m": panel.width,
        "radius_m": finite(panel.radius),
        "knock_down": panel.knock_down,
        "curvature_gain_N_m": panel.curvature_gain,
        "N_cr_N_m": finite(panel.critical.compression),
        "N_xs_cr_positive_N_m": finite(panel.critical.shear_positive),
        "N_xs_cr_negative_N_m": finite(panel.critical.shear_negative),
        "N_x_N_m": c.n_x,
        "N_xs_N_m": c.n_xs,
        "R_c": c.r_c,
        "R_s": c.r_s,
        "buckling_factor": finite(c.buckling),
        "sandwich": sandwich,
        "reserve_factor": finite(c.reserve_factor),
        "mode": c.mode.key(),
    })
}

/// Every panel of every station of a case, and the least.
fn buckling_json(c: &CaseStress) -> (Value, Value) {
    let rows: Vec<Value> = c
        .buckling
        .iter()
        .flat_map(|s| s.panels.iter().enumerate().map(move |(i, p)| panel_json(s.r, i, p)))
        .collect();
    let least = c
        .least_buckling()
        .map(|(i, j)| panel_json(c.buckling[i].r, j, &c.buckling[i].panels[j]))
        .unwrap_or(Value::Null);
    (Value::Array(rows), least)
}

/// Resultants along the span: rotor frame (force and moment about the pitch axis at the cut)
/// and the chord frame's beam resultants.
fn resultants_json(l: &crate::loads::SpanLoads) -> Value {
    let rows: Vec<Value> =
        l.r.iter()
            .zip(&l.rotor)
            .zip(&l.chord)
            .zip(&l.chord_angle)
            .map(|(((r, rot), b), phi)| {
                json!({
                    "r_m": r,
                    "chord_angle_deg": phi.to_degrees(),
                    "rotor_force_x_N": rot.force[0],
                    "rotor_force_y_N": rot.force[1],
                    "rotor_force_z_N": rot.force[2],
                    "rotor_moment_x_Nm": rot.moment[0],
                    "rotor_moment_y_Nm": rot.moment[1],
                    "rotor_moment_z_Nm": rot.moment[2],
                    "axial_force_N": b.n,
                    "torque_Nm": b.t,
                    "flap_moment_Nm": b.m_flap,
                    "edge_moment_Nm": b.m_edge,
                    "flap_shear_N": b.v_flap,
                    "edge_shear_N": b.v_edge,
                })
            })
            .collect();
    Value::Array(rows)
}

/// The JSON object of `layloft stress`: `cases`, each with `name`, `min_reserve_factor` and where
/// it occurs, `root` reactions, tip deflection, the pitch sweep and per-station minima.
pub fn stress_json(model: &BladeModel, cases: &[CaseStress]) -> Value {
    let cases: Vec<Value> = cases
        .iter()
        .map(|c| {
            let stations: Vec<Value> = c
                .stations
                .iter()
                .map(|s| {
                    let rf = s.points.iter().map(|p| p.reserve_factor()).fold(f64::INFINITY, f64::min);
                    json!({ "r_m": s.r, "min_reserve_factor": finite(rf) })
                })
                .collect();
            let (buckling, least) = buckling_json(c);
            let min_buckling =
                least.get("reserve_factor").cloned().unwrap_or(Value::Null);
            json!({
                "name": c.name,
                "rpm": c.rpm,
                "load_factor": c.load_factor,
                "min_reserve_factor": c.critical.as_ref().map(|k| json!(k.reserve_factor)).unwrap_or(Value::Null),
                "critical": c.critical.as_ref().map(critical_json).unwrap_or(Value::Null),
                "root": {
                    "radial_force_N": c.root.force[0],
                    "shear_in_plane_N": c.root.force[1],
                    "shear_out_of_plane_N": c.root.force[2],
                    "flap_moment_Nm": c.root.moment[1],
                    "edge_moment_Nm": c.root.moment[2],
                    "pitch_moment_Nm": c.root.moment[0],
                },
                "tip_deflection_m": c.tip_deflection.total,
                "tip_deflection_in_plane_m": c.tip_deflection.in_plane,
                "tip_deflection_out_of_plane_m": c.tip_deflection.out_of_plane,
                "tip_twist_deg": c.tip_deflection.twist.to_degrees(),
                "pitch_sweep": c.pitch_sweep.iter().map(|p| json!({
                    "pitch_deg": p.pitch.deg(),
                    "radial_force_N": p.radial_force,
                    "flap_moment_Nm": p.flap_moment,
                    "edge_moment_Nm": p.edge_moment,
                    "pitch_moment_Nm": p.pitch_moment,
                    "centrifugal_twisting_moment_Nm": p.centrifugal_twisting_moment,
                })).collect::<Vec<_>>(),
                "stations": stations,
                "resultants": resultants_json(&c.loads),
                "min_buckling_factor": min_buckling,
                "buckling_critical": least,
                "buckling": buckling,
            })
        })
        .collect();
    json!({
        "project": model.project.name,
        "cases": cases,
        "edge_fixity": model.project.buckling.edge_fixity,
        "not_covered": crate::buckling::NOT_COVERED,
        "cautions": crate::CAUTIONS,
    })
}

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

/// The lowest reserve factor of each case with where it occurs, one row per case.
pub fn critical_table(cases: &[CaseStress]) -> Table {
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("speed (rpm)", Align::Right),
        ("load factor", Align::Right),
        ("reserve factor", Align::Right),
        ("r (m)", Align::Right),
        ("where", Align::Left),
        ("ply", Align::Left),
        ("criterion, mode", Align::Left),
    ]);
    for c in cases {
        match &c.critical {
            Some(k) => t.row(vec![
                c.name.clone(),
                fixed(c.rpm, 0),
                fixed(c.load_factor, 2),
                fixed(k.reserve_factor, 2),
                fixed(k.r, 3),
                k.location.to_string(),
                format!("{} ({}, {}°)", k.ply_id, k.material, fixed(k.angle_deg, 0)),
                format!("{}, {}", k.criterion.label(), k.mode.label()),
            ]),
            None => {
                t.row(vec![c.name.clone(), fixed(c.rpm, 0), fixed(c.load_factor, 2), "none".into()])
            }
        }
    }
    t
}

/// The lowest buckling reserve factor of each case with its panel, one row per case.
pub fn buckling_table(cases: &[CaseStress]) -> Table {
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("buckling RF", Align::Right),
        ("mode", Align::Left),
        ("r (m)", Align::Right),
        ("panel", Align::Left),
        ("width (mm)", Align::Right),
        ("N_x (kN/m)", Align::Right),
        ("N_xs (kN/m)", Align::Right),
        ("N_cr (kN/m)", Align::Right),
    ]);
    for c in cases {
        match c.least_buckling() {
            Some((i, j)) => {
                let p = &c.buckling[i].panels[j];
                let k = &p.check;
                t.row(vec![
                    c.name.clone(),
                    if k.reserve_factor.is_finite() {
                        fixed(k.reserve_factor, 2)
                    } else {
                        "none".into()
                    },
                    k.mode.label().to_string(),
                    fixed(c.buckling[i].r, 3),
                    panel_place(p),
                    sig4(p.panel.width * 1e3),
                    sig4(k.n_x / 1e3),
                    sig4(k.n_xs / 1e3),
                    sig4(p.panel.critical.compression / 1e3),
                ]);
            }
            None => t.row(vec![c.name.clone(), "no panel".into()]),
        }
    }
    t
}

/// A panel's place in words: "upper surface x/c 0.150 to 0.330" or "web 'main'".
pub fn panel_place(p: &PanelResult) -> String {
    match (&p.panel.part, &p.from, &p.to) {
        (crate::buckling::PanelPart::Web { name }, ..) => format!("web '{name}'"),
        (
            _,
            WallLocation::Surface { upper: u0, x_c: a, .. },
            WallLocation::Surface { upper: u1, x_c: b, .. },
        ) => {
            let side = |u: &bool| if *u { "upper" } else { "lower" };
            if u0 == u1 {
                format!("{} skin x/c {:.3} to {:.3}", side(u0), a.min(*b), a.max(*b))
            } else {
                format!("skin from {} x/c {a:.3} to {} x/c {b:.3}", side(u0), side(u1))
            }
        }
        _ => format!("{} to {}", p.from, p.to),
    }
}

/// What the analysis does not cover, as an indented list.
pub fn not_covered_text() -> String {
    let mut out = String::from("Not covered by this analysis (check these by other means):\n");
    for line in crate::buckling::NOT_COVERED {
        let _ = writeln!(out, "  - {line}");
    }
    out
}

/// The terminal summary of `layloft stress`.
pub fn stress_text(model: &BladeModel, cases: &[CaseStress]) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "layloft stress — {}", model.project.name);
    out.push_str(&super::cautions_text());
    let _ = writeln!(out);
    let t = critical_table(cases);
    let _ =
        writeln!(out, "Lowest reserve factor per load case (strength ratio at the factored load):");
    out.push_str(&t.render(2));
    let _ = writeln!(out);
    let _ = writeln!(
        out,
        "Lowest buckling reserve factor per load case (wall panels, edge fixity {}; sandwich modes):",
        fixed(model.project.buckling.edge_fixity, 2)
    );
    out.push_str(&buckling_table(cases).render(2));
    let _ = writeln!(out);
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("radial (kN)", Align::Right),
        ("flap M (N·m)", Align::Right),
        ("edge M (N·m)", Align::Right),
        ("pitch M (N·m)", Align::Right),
        ("tip defl. (mm)", Align::Right),
        ("tip twist (°)", Align::Right),
    ]);
    for c in cases {
        t.row(vec![
            c.name.clone(),
            sig4(c.root.force[0] / 1e3),
            sig4(c.root.moment[1]),
            sig4(c.root.moment[2]),
            sig4(c.root.moment[0]),
            sig4(c.tip_deflection.total * 1e3),
            fixed(c.tip_deflection.twist.to_degrees(), 3),
        ]);
    }
    let _ = writeln!(out, "Root reactions (rotor frame, about the pitch axis) and tip deflection:");
    out.push_str(&t.render(2));
    // The pitching moment over the pitch range of the case that demands most of the actuator.
    let sizing = cases.iter().filter(|c| c.pitch_sweep.len() > 1).max_by(|a, b| {
        let peak =
            |c: &CaseStress| c.pitch_sweep.iter().map(|p| p.pitch_moment.abs()).fold(0.0, f64::max);
        peak(a).total_cmp(&peak(b))
    });
    if let Some(c) = sizing {
        let _ = writeln!(out);
        let _ = writeln!(
            out,
            "Pitching moment over the pitch range, case '{}' (the largest; every case in --json):",
            c.name
        );
        let mut t = Table::new(&[
            ("pitch (°)", Align::Right),
            ("pitch M (N·m)", Align::Right),
            ("of which centrifugal (N·m)", Align::Right),
        ]);
        for p in &c.pitch_sweep {
            t.row(vec![
                fixed(p.pitch.deg(), 1),
                sig4(p.pitch_moment),
                sig4(p.centrifugal_twisting_moment),
            ]);
        }
        out.push_str(&t.render(2));
    }
    let _ = writeln!(out);
    out.push_str(&not_covered_text());
    out
}

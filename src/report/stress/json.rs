//! The stress results as one JSON object, SI units in every key.

use serde_json::{Value, json};

use crate::analysis::BladeModel;
use crate::stress::{CaseStress, Critical, PanelResult, WallLocation};
use crate::units::rpm_of;

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
        "angle_deg": c.angle.deg(),
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
        "shear_curvature_gain_positive_N_m": panel.shear_curvature_gain[0],
        "shear_curvature_gain_negative_N_m": panel.shear_curvature_gain[1],
        "closed": panel.closed,
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
                "rpm": rpm_of(c.omega),
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

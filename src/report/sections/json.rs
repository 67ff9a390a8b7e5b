//! The sections report as JSON, SI units in every key.

use nalgebra::Matrix4;
use serde_json::{Map, Value, json};

use super::{SCALAR_KEYS, SectionsReport, clean_stiffness, laminate_label, scalar_values};
use crate::analysis::AnalysisStation;
use crate::blade::Blade;

fn num(v: f64) -> Value {
    // serde_json writes a non-finite f64 as null; say so explicitly.
    if v.is_finite() { json!(v) } else { Value::Null }
}

/// A 4x4 matrix as nested rows, round-off cleaned ([`clean_stiffness`]).
fn matrix(k: &Matrix4<f64>) -> Value {
    let k = clean_stiffness(k);
    Value::Array((0..4).map(|i| Value::Array((0..4).map(|j| num(k[(i, j)])).collect())).collect())
}

fn station(blade: &Blade, st: &AnalysisStation) -> Value {
    let p = &st.section.properties;
    let mut m = Map::new();
    for (k, v) in SCALAR_KEYS.iter().zip(scalar_values(p, st.layout.pitch_axis_frac)) {
        m.insert((*k).to_string(), num(v));
    }
    m.insert("stiffness_matrix_SI".into(), matrix(&p.stiffness));
    m.insert("stiffness_matrix_pitch_axis_SI".into(), matrix(&p.stiffness_pitch_axis));
    m.insert("cells".into(), json!(st.section.cells()));
    let webs: Vec<Value> = st
        .layout
        .webs
        .iter()
        .map(|w| json!({ "name": w.name, "y_m": num(w.y), "laminate": w.laminate }))
        .collect();
    m.insert("webs".into(), Value::Array(webs));
    let laminates: Vec<Value> = st
        .layout
        .laminates
        .iter()
        .enumerate()
        .map(|(k, l)| {
            let plies: Vec<&str> = st
                .schedule_plies(k)
                .into_iter()
                .filter_map(|i| blade.ply(i))
                .map(|s| s.id.as_str())
                .collect();
            json!({
                "index": k,
                "plies": plies,
                "thickness_m": num(l.thickness()),
                "areal_mass_kg_m2": num(l.areal_mass()),
                "label": laminate_label(blade, st, k),
            })
        })
        .collect();
    m.insert("laminates".into(), Value::Array(laminates));
    m.insert(
        "warnings".into(),
        json!(p.warnings.iter().map(ToString::to_string).collect::<Vec<_>>()),
    );
    Value::Object(m)
}

const UNITS: &str = "SI throughout; chord frame: y along the chord from the leading edge towards \
    the trailing edge, z normal to the chord towards the upper surface, origin on the pitch axis \
    (m). stiffness_matrix_SI: 4x4 about the elastic centre, rows and columns in the order axial, \
    twist, flap, edge, relating (eps, kappa_twist, kappa_flap, kappa_edge) to (N, T, M_flap, \
    M_edge); entry [0][0] in N, the rest of row and column 0 in N·m, the others in N·m²; \
    stiffness_matrix_pitch_axis_SI: the same referred to the pitch axis. principal_angle_deg: from \
    the y axis to the principal axis of the lesser bending stiffness, positive from y towards z. \
    inertia_*_kg_m: mass moments of inertia per unit length about the mass centre, kg·m²/m; flap \
    is the integral of rho (z - z_m)², edge of rho (y - y_m)². pitch_axis_frac: fraction of chord \
    from the leading edge.";

pub(super) fn report(r: &SectionsReport<'_>) -> Value {
    let model = r.model;
    let mut out = Map::new();
    let mut put = |k: &str, v: Value| {
        out.insert(k.to_string(), v);
    };
    put("project", json!(model.project.name));
    put("blade_mass_kg", num(r.mass.total_kg));
    put(
        "blade_mass",
        json!({
            "total_kg": num(r.mass.total_kg),
            "laminate_kg": num(r.mass.laminate_kg),
            "point_masses_kg": num(r.mass.point_masses_kg),
            "centre_r_m": num(r.mass.centre_radius_m),
            "static_moment_kg_m": num(r.mass.static_moment_kg_m),
        }),
    );
    put("contour_points", json!(model.project.sections.contour_points));
    put("units", json!(UNITS));
    let stations: Vec<Value> = model.stations.iter().map(|s| station(&model.blade, s)).collect();
    put("stations", Value::Array(stations));
    let warnings: Vec<Value> = r
        .warnings
        .iter()
        .map(|w| {
            json!({
                "message": w.first.to_string(),
                "r_m": w.radii,
                "text": w.to_string(),
            })
        })
        .collect();
    put("warnings", Value::Array(warnings));
    put("cautions", json!(crate::CAUTIONS));
    Value::Object(out)
}

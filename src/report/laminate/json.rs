//! The laminate report as JSON, SI units in every key.

use nalgebra::{Matrix3, Vector3};
use serde_json::{Map, Value, json};

use super::{FaceState, LaminateReport, face_state};
use crate::failure::{CriteriaRatios, Criterion, FirstPlyFailure};
use crate::laminate::{Deformation, LaminateLoad, PointState};

fn num(v: f64) -> Value {
    // serde_json writes a non-finite f64 as null; say so explicitly.
    if v.is_finite() { json!(v) } else { Value::Null }
}

fn matrix(m: &Matrix3<f64>) -> Value {
    Value::Array((0..3).map(|i| Value::Array((0..3).map(|j| num(m[(i, j)])).collect())).collect())
}

fn ratios(r: &CriteriaRatios) -> (Value, Value) {
    let mut ratio = Map::new();
    let mut mode = Map::new();
    for c in Criterion::ALL {
        let (rv, mv) = match r.by(c) {
            Some(s) => (s.finite().map_or(Value::Null, num), json!(s.mode.key())),
            None => (Value::Null, json!("not_applicable")),
        };
        ratio.insert(c.key().to_string(), rv);
        mode.insert(c.key().to_string(), mv);
    }
    (Value::Object(ratio), Value::Object(mode))
}

fn stress_12(p: &PointState) -> Map<String, Value> {
    let mut m = Map::new();
    m.insert("sigma1_Pa".into(), num(p.stress_12.x));
    m.insert("sigma2_Pa".into(), num(p.stress_12.y));
    m.insert("tau12_Pa".into(), num(p.stress_12.z));
    m
}

fn face(f: &FaceState, r: &CriteriaRatios, thermal: bool) -> Value {
    let t = &f.total;
    let mut m = stress_12(t);
    m.insert("z_m".into(), num(t.z));
    let put = |m: &mut Map<String, Value>, keys: [&str; 3], v: &Vector3<f64>| {
        for (k, x) in keys.iter().zip(v.iter()) {
            m.insert((*k).to_string(), num(*x));
        }
    };
    put(&mut m, ["sigma_x_Pa", "sigma_y_Pa", "tau_xy_Pa"], &t.stress_xy);
    put(&mut m, ["eps1", "eps2", "gamma12"], &t.strain_12);
    put(&mut m, ["eps_x", "eps_y", "gamma_xy"], &t.strain_xy);
    m.insert(
        "residual".into(),
        if thermal { Value::Object(stress_12(&f.residual)) } else { Value::Null },
    );
    let (ratio, mode) = ratios(r);
    m.insert("strength_ratio".into(), ratio);
    m.insert("failure_mode".into(), mode);
    Value::Object(m)
}

fn deformation(d: &Deformation) -> Value {
    json!({
        "eps_x": num(d.strain.x), "eps_y": num(d.strain.y), "gamma_xy": num(d.strain.z),
        "kappa_x_1_m": num(d.curvature.x), "kappa_y_1_m": num(d.curvature.y),
        "kappa_xy_1_m": num(d.curvature.z),
    })
}

fn first_failure(report: &LaminateReport, f: &FirstPlyFailure) -> Value {
    let ply = &report.laminate.plies()[f.ply];
    json!({
        "ply": f.ply + 1,
        "angle_deg": num(ply.angle.deg()),
        "material": ply.material.name,
        "face": f.face.key(),
        "criterion": f.criterion.key(),
        "mode": f.strength.mode.key(),
        "load_multiplier": num(f.strength.ratio),
    })
}

pub(super) fn report(r: &LaminateReport) -> Value {
    let [a, b, d] = r.clean_abd();
    let thermal = r.delta_t != 0.0;
    let lam = &r.laminate;
    let mut out = Map::new();
    let mut put = |k: &str, v: Value| {
        out.insert(k.to_string(), v);
    };
    put("layup", json!(r.code));
    put("ply_count", json!(lam.plies().len()));
    put("thickness_m", num(lam.thickness()));
    put("areal_mass_kg_m2", num(lam.areal_mass()));
    put("A_N_m", matrix(&a));
    put("B_N", matrix(&b));
    put("D_Nm", matrix(&d));
    let [ca, cb, cd] = r.clean_compliance();
    put(
        "abd_inverse",
        json!({ "a_m_N": matrix(&ca), "b_1_N": matrix(&cb), "d_1_Nm": matrix(&cd) }),
    );
    let (m, f) = (&r.membrane, &r.flexural);
    put("Ex_Pa", num(m.ex));
    put("Ey_Pa", num(m.ey));
    put("Gxy_Pa", num(m.gxy));
    put("nuxy", num(m.nuxy));
    put("Ex_flex_Pa", num(f.ex));
    put("Ey_flex_Pa", num(f.ey));
    put("Gxy_flex_Pa", num(f.gxy));
    put("nuxy_flex", num(f.nuxy));
    put("delta_T_K", num(r.delta_t));
    let (nt, mt) = lam.thermal_resultants(r.delta_t);
    put(
        "thermal_resultants",
        if thermal {
            json!({
                "NTx_N_m": num(nt.x), "NTy_N_m": num(nt.y), "NTxy_N_m": num(nt.z),
                "MTx_Nm_m": num(mt.x), "MTy_Nm_m": num(mt.y), "MTxy_Nm_m": num(mt.z),
            })
        } else {
            Value::Null
        },
    );
    let (load, strains) = match &r.load {
        Some(LaminateLoad::Resultants(l)) => (
            json!({
                "Nx_N_m": num(l.n.x), "Ny_N_m": num(l.n.y), "Nxy_N_m": num(l.n.z),
                "Mx_Nm_m": num(l.m.x), "My_Nm_m": num(l.m.y), "Mxy_Nm_m": num(l.m.z),
            }),
            Value::Null,
        ),
        Some(LaminateLoad::Deformation(d)) => (Value::Null, deformation(d)),
        None => (Value::Null, Value::Null),
    };
    put("load", load);
    put("strains_given", strains);
    put("midplane", r.midplane().map_or(Value::Null, |d| deformation(&d)));
    put(
        "midplane_thermal",
        match &r.response {
            Some(resp) if thermal => deformation(&r.clean_deformation(&resp.thermal)),
            _ => Value::Null,
        },
    );
    let plies: Vec<Value> = lam
        .plies()
        .iter()
        .zip(lam.ply_bounds())
        .enumerate()
        .map(|(i, (p, (zt, zb)))| {
            let mut m = Map::new();
            m.insert("ply".into(), json!(i + 1));
            m.insert("angle_deg".into(), num(p.angle.deg()));
            m.insert("material".into(), json!(p.material.name));
            m.insert("thickness_m".into(), num(p.thickness));
            m.insert("z_top_m".into(), num(zt));
            m.insert("z_bottom_m".into(), num(zb));
            let state = r.response.as_ref().map(|s| &s.plies[i]);
            let ratios_i = r.strength.as_ref().map(|s| &s.plies[i]);
            match (state, ratios_i) {
                (Some(s), Some(pr)) => {
                    let top = face_state(&s.top, &s.top_thermal);
                    let bottom = face_state(&s.bottom, &s.bottom_thermal);
                    m.insert("top".into(), face(&top, &pr.top, thermal));
                    m.insert("bottom".into(), face(&bottom, &pr.bottom, thermal));
                    let (ratio, mode) = ratios(&pr.worst());
                    m.insert("strength_ratio".into(), ratio);
                    m.insert("failure_mode".into(), mode);
                }
                _ => {
                    for k in ["top", "bottom", "strength_ratio", "failure_mode"] {
                        m.insert(k.into(), Value::Null);
                    }
                }
            }
            Value::Object(m)
        })
        .collect();
    put("plies", Value::Array(plies));
    put("first_ply_failure", r.first_ply_failure().map_or(Value::Null, |f| first_failure(r, &f)));
    put(
        "first_ply_failure_by_criterion",
        match &r.strength {
            Some(s) => Value::Object(
                Criterion::ALL
                    .iter()
                    .map(|&c| {
                        let v =
                            s.first_ply_failure_by(c).map_or(Value::Null, |f| first_failure(r, &f));
                        (c.key().to_string(), v)
                    })
                    .collect(),
            ),
            None => Value::Null,
        },
    );
    put("cautions", json!(crate::CAUTIONS));
    Value::Object(out)
}

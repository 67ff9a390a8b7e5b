//! The laminate report as a terminal summary.

use std::fmt::Write as _;

use crate::report::fixed;
use crate::report::table::wrap;

use nalgebra::Matrix3;

use super::{LaminateReport, face_state};
use crate::failure::{
    CriteriaRatios, Criterion, FailureMode, FirstPlyFailure, LaminateStrength, StrengthRatio,
};
use crate::laminate::{Deformation, LaminateLoad};

/// A number with about four significant digits: fixed where that reads well, else scientific.
fn g(v: f64) -> String {
    let a = v.abs();
    if v == 0.0 {
        "0".to_string()
    } else if !v.is_finite() {
        format!("{v}")
    } else if (1e-3..1e5).contains(&a) {
        let digits = (3 - a.log10().floor() as i32).clamp(0, 6) as usize;
        format!("{v:.digits$}")
    } else {
        format!("{v:.3e}")
    }
}

/// A ply angle in degrees: whole degrees without decimals, else to 0.01°.
fn angle(deg: f64) -> String {
    let r = (deg * 100.0).round() / 100.0;
    if r.fract() == 0.0 { format!("{r:.0}") } else { format!("{r}") }
}

fn short_mode(m: FailureMode) -> &'static str {
    match m {
        FailureMode::FibreTension => "FT",
        FailureMode::FibreCompression => "FC",
        FailureMode::MatrixTension => "MT",
        FailureMode::MatrixCompression => "MC",
        FailureMode::Shear => "S",
        FailureMode::Tension => "T",
        FailureMode::Compression => "C",
        FailureMode::None => "",
    }
}

fn ratio_cell(r: Option<StrengthRatio>) -> String {
    match r {
        None => "n/a".to_string(),
        Some(s) if !s.ratio.is_finite() => "none".to_string(),
        Some(s) => format!("{:.3} {}", s.ratio, short_mode(s.mode)),
    }
}

fn matrices(out: &mut String, blocks: [(&str, Matrix3<f64>, f64); 3]) {
    let _ = writeln!(out, "  {:<34}{:<34}{}", blocks[0].0, blocks[1].0, blocks[2].0);
    for i in 0..3 {
        let mut line = String::from("  ");
        for (_, m, scale) in &blocks {
            let row: Vec<String> =
                (0..3).map(|j| format!("{:>10}", g(m[(i, j)] / scale))).collect();
            let _ = write!(line, "{:<34}", row.join(""));
        }
        let _ = writeln!(out, "{}", line.trim_end());
    }
}

fn deformation_line(d: &Deformation) -> String {
    format!(
        "eps_x {}  eps_y {}  gamma_xy {}  kappa_x {}  kappa_y {}  kappa_xy {} 1/m",
        g(d.strain.x),
        g(d.strain.y),
        g(d.strain.z),
        g(d.curvature.x),
        g(d.curvature.y),
        g(d.curvature.z)
    )
}

fn first_failure_sentence(r: &LaminateReport, f: &FirstPlyFailure) -> String {
    let ply = &r.laminate.plies()[f.ply];
    let place = format!(
        "ply {} ({}°, {}, {})",
        f.ply + 1,
        angle(ply.angle.deg()),
        ply.material.name,
        f.face.label()
    );
    let how = format!("the {} criterion in {}", f.criterion.label(), f.strength.mode.label());
    let k = f.strength.ratio;
    if k == 0.0 {
        format!("the residual stresses alone fail {place}: {how}.")
    } else if k < 1.0 {
        format!(
            "{place} reaches {how} at {k:.3} times the applied load: the applied load fails it."
        )
    } else {
        format!("{place} reaches {how} at {k:.3} times the applied load.")
    }
}

pub(super) fn report(r: &LaminateReport) -> String {
    let mut out = String::new();
    let lam = &r.laminate;
    let _ = writeln!(out, "Laminate {}", r.code);
    let _ = writeln!(
        out,
        "  {} plies, {} mm thick, {} kg/m²; ply 1 is the outer face, z runs along the outward normal",
        lam.plies().len(),
        g(lam.thickness() * 1e3),
        g(lam.areal_mass())
    );
    out.push('\n');
    out.push_str(&crate::report::cautions_text());

    let _ = writeln!(out, "\nStack");
    let _ = writeln!(
        out,
        "  {:>4} {:>8}  {:<16} {:>8} {:>10} {:>12}",
        "ply", "angle°", "material", "t mm", "z top mm", "z bottom mm"
    );
    for (i, (p, (zt, zb))) in lam.plies().iter().zip(lam.ply_bounds()).enumerate() {
        let _ = writeln!(
            out,
            "  {:>4} {:>8}  {:<16} {:>8} {:>10} {:>12}",
            i + 1,
            angle(p.angle.deg()),
            p.material.name,
            fixed(p.thickness * 1e3, 4),
            fixed(zt * 1e3, 4),
            fixed(zb * 1e3, 4)
        );
    }

    let [a, b, d] = r.clean_abd();
    let _ = writeln!(out, "\nStiffness");
    matrices(&mut out, [("A, MN/m", a, 1e6), ("B, kN", b, 1e3), ("D, N·m", d, 1.0)]);

    let (m, f) = (&r.membrane, &r.flexural);
    let _ = writeln!(out, "\nEngineering constants   {:>10} {:>10}", "membrane", "flexural");
    for (name, x, y) in [
        ("Ex, GPa", m.ex / 1e9, f.ex / 1e9),
        ("Ey, GPa", m.ey / 1e9, f.ey / 1e9),
        ("Gxy, GPa", m.gxy / 1e9, f.gxy / 1e9),
        ("nuxy", m.nuxy, f.nuxy),
    ] {
        let _ = writeln!(out, "  {name:<21} {:>10} {:>10}", g(x), g(y));
    }

    let _ = writeln!(out, "\nLoad");
    match &r.load {
        Some(LaminateLoad::Resultants(l)) => {
            let _ = writeln!(
                out,
                "  Nx {} Ny {} Nxy {} N/m;  Mx {} My {} Mxy {} N·m/m",
                g(l.n.x),
                g(l.n.y),
                g(l.n.z),
                g(l.m.x),
                g(l.m.y),
                g(l.m.z)
            );
        }
        Some(LaminateLoad::Deformation(dm)) => {
            let _ = writeln!(out, "  midplane strains given: {}", deformation_line(dm));
        }
        None => {
            let _ = writeln!(out, "  no mechanical load given");
        }
    }
    if r.delta_t != 0.0 {
        let _ =
            writeln!(out, "  temperature change {} K (residual stresses included)", g(r.delta_t));
    }
    let (Some(resp), Some(strength)) = (&r.response, &r.strength) else {
        let _ = writeln!(
            out,
            "  stiffness only: give --load or --strains for ply stresses and first-ply failure"
        );
        return out;
    };
    let total = r.midplane().unwrap_or_default();
    let _ = writeln!(out, "  midplane: {}", deformation_line(&total));

    let _ = writeln!(
        out,
        "\nPly stresses in material axes, MPa, and strength ratios (load multiplier to failure)"
    );
    let _ = writeln!(
        out,
        "  {:>4} {:>7} {:<6} {:>9} {:>9} {:>9}  {:<10} {:<10} {:<10} Hashin",
        "ply", "angle°", "face", "sigma1", "sigma2", "tau12", "Tsai-Wu", "max stress", "max strain",
    );
    for (i, (state, ratios)) in resp.plies.iter().zip(&strength.plies).enumerate() {
        let angle = angle(lam.plies()[i].angle.deg());
        let faces: [(&str, _, &CriteriaRatios); 2] = [
            ("outer", face_state(&state.top, &state.top_thermal), &ratios.top),
            ("inner", face_state(&state.bottom, &state.bottom_thermal), &ratios.bottom),
        ];
        for (k, (name, fs, cr)) in faces.iter().enumerate() {
            let s = fs.total.stress_12 / 1e6;
            let cells: Vec<String> =
                Criterion::ALL.iter().map(|&c| format!("{:<10}", ratio_cell(cr.by(c)))).collect();
            let (ply_col, angle_col) = if k == 0 {
                ((i + 1).to_string(), angle.clone())
            } else {
                (String::new(), String::new())
            };
            let line = format!(
                "  {:>4} {:>7} {:<6} {:>9} {:>9} {:>9}  {}",
                ply_col,
                angle_col,
                name,
                fixed(s.x, 2),
                fixed(s.y, 2),
                fixed(s.z, 2),
                cells.join(" ")
            );
            let _ = writeln!(out, "{}", line.trim_end());
        }
    }
    wrap(
        &mut out,
        "  modes:",
        "    ",
        "FT/FC fibre tension/compression, MT/MC matrix tension/compression, S in-plane shear, \
         T/C tension/compression of an isotropic layer; none: no multiple of the load fails; \
         n/a: the criterion does not apply",
        96,
    );

    let _ = writeln!(out);
    match r.first_ply_failure() {
        Some(f) => {
            wrap(&mut out, "First-ply failure:", "  ", &first_failure_sentence(r, &f), 96);
            for c in Criterion::ALL {
                let line = match strength.first_ply_failure_by(c) {
                    Some(fc) => format!(
                        "{:.3} at ply {} ({}, {})",
                        fc.strength.ratio,
                        fc.ply + 1,
                        fc.face.label(),
                        fc.strength.mode.label()
                    ),
                    // No ply the criterion applies to (Hashin on isotropic layers only): "n/a",
                    // as in the ply table, not "none", which says no multiple fails.
                    None if !applies_to_any(strength, c) => "n/a".to_string(),
                    None => "none".to_string(),
                };
                let _ = writeln!(out, "  by {:<15} {line}", c.label());
            }
        }
        None => {
            let _ = writeln!(
                out,
                "First-ply failure: none; no multiple of this load fails a ply by the criteria that apply."
            );
        }
    }
    out
}

/// Whether criterion `c` applies to any ply face of the laminate (Hashin applies to no
/// isotropic layer).
fn applies_to_any(strength: &LaminateStrength, c: Criterion) -> bool {
    strength.plies.iter().any(|p| p.top.by(c).is_some() || p.bottom.by(c).is_some())
}

#[cfg(test)]
mod tests {
    use super::{fixed, g};

    #[test]
    fn numbers_read_with_four_significant_digits() {
        assert_eq!(g(69.684), "69.68");
        assert_eq!(g(0.29604), "0.2960");
        assert_eq!(g(1234.5), "1234");
        assert_eq!(g(-0.0), "0");
        assert_eq!(g(1.5e-6), "1.500e-6");
        assert_eq!(g(2.5e7), "2.500e7");
        assert_eq!(fixed(-1e-19, 4), "0.0000");
        assert_eq!(fixed(-0.25, 2), "-0.25");
    }
}

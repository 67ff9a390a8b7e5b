//! `layloft laminate` as a user meets it: the text summary, the JSON keys and values, the exit
//! status. Materials: `tests/data/kaw-t300.toml` (Kaw, *Mechanics of Composite Materials*, 2nd
//! ed., 2006, Table 2.1) and the invented demo `layups/mine-fan/materials.toml`.

use crate::support_cli::layloft;
use serde_json::Value;

const KAW: &str = "tests/data/kaw-t300.toml";
const DEMO: &str = "layups/mine-fan/materials.toml";

fn json(args: &[&str]) -> (Option<i32>, Value) {
    let mut all = args.to_vec();
    all.push("--json");
    let (code, stdout, stderr) = layloft(&all);
    let v = serde_json::from_str(&stdout).unwrap_or_else(|e| panic!("{e}: {stdout}\n{stderr}"));
    (code, v)
}

fn f(v: &Value) -> f64 {
    v.as_f64().unwrap_or_else(|| panic!("not a number: {v}"))
}

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

const QI: [&str; 7] =
    ["laminate", "--materials", KAW, "--material", "t300-5208", "--layup", "[0/±45/90]s"];

#[test]
fn stiffness_of_the_quasi_isotropic_laminate_as_json() {
    // Kaw 2006, §4.6 and REFERENCES.md: [0/±45/90]s of T300/5208 has E 69.68 GPa, nu 0.2960,
    // G 26.88 GPa (four figures: 5e-4).
    let (code, v) = json(&QI);
    assert_eq!(code, Some(0));
    assert!(rel(f(&v["thickness_m"]), 1e-3) < 1e-12);
    assert!(rel(f(&v["Ex_Pa"]), 69.68e9) < 5e-4);
    assert!(rel(f(&v["Ey_Pa"]), 69.68e9) < 5e-4);
    assert!(rel(f(&v["nuxy"]), 0.2960) < 5e-4);
    assert!(rel(f(&v["Gxy_Pa"]), 26.88e9) < 5e-4);
    for key in ["A_N_m", "B_N", "D_Nm"] {
        let m = v[key].as_array().unwrap();
        assert_eq!(m.len(), 3, "{key}");
        assert!(m.iter().all(|row| row.as_array().unwrap().len() == 3), "{key}");
    }
    // Symmetric: B is zero; quasi-isotropic: A11 = A22.
    assert!(
        v["B_N"]
            .as_array()
            .unwrap()
            .iter()
            .flat_map(|r| r.as_array().unwrap())
            .all(|x| f(x) == 0.0)
    );
    assert!(rel(f(&v["A_N_m"][0][0]), f(&v["A_N_m"][1][1])) < 1e-12);
    assert!(v["first_ply_failure"].is_null());
    let plies = v["plies"].as_array().unwrap();
    assert_eq!(plies.len(), 8);
    assert_eq!(f(&plies[1]["angle_deg"]).round(), 45.0);
    assert_eq!(plies[0]["material"], "t300-5208");
    assert!(rel(f(&plies[0]["z_top_m"]), 0.5e-3) < 1e-12, "ply 1 is the outer face, at +h/2");
    assert!(rel(f(&plies[7]["z_bottom_m"]), -0.5e-3) < 1e-12);
    assert!(plies[0]["top"].is_null() && plies[0]["strength_ratio"].is_null());
    assert_eq!(v["cautions"].as_array().unwrap().len(), layloft::CAUTIONS.len());
}

#[test]
fn stiffness_only_summary_reads_as_an_engineering_summary() {
    let (code, out, err) = layloft(&QI);
    assert_eq!(code, Some(0), "{err}");
    for text in [
        "Laminate [0/±45/90]s",
        "8 plies, 1.000 mm thick",
        "Design aid only",
        "A, MN/m",
        "Ex, GPa                    69.68",
        "nuxy                      0.2960",
        "stiffness only",
    ] {
        assert!(out.contains(text), "missing '{text}' in\n{out}");
    }
    assert!(!out.contains("First-ply failure"));
}

/// A unidirectional [0_4]T laminate, h = 0.5 mm, pulled along the fibres by Nx = 75 kN/m:
/// sigma1 = Nx/h = 150 MPa and sigma2 = tau12 = 0, so every criterion gives R = Xt/sigma1 = 10
/// (Tsai-Wu: F1 = 0 since Xt = Xc, F11 sigma1² R² = 1; maximum strain: eps1 = sigma1/E1
/// against Xt/E1; Hashin: (sigma1/Xt)² R² = 1), in fibre tension, at every ply.
#[test]
fn unidirectional_laminate_fails_at_the_fibre_strength() {
    let args = ["laminate", "--materials", KAW, "--material", "t300-5208", "--layup", "[0_4]T"];
    let mut with_load = args.to_vec();
    with_load.extend(["--load", "Nx=75e3"]);
    let (code, v) = json(&with_load);
    assert_eq!(code, Some(0));
    let fpf = &v["first_ply_failure"];
    assert_eq!(fpf["ply"], 1, "ties go to the outer ply");
    // All four criteria give 10 here; which one is reported is a matter of round-off.
    let criteria = ["tsai_wu", "max_stress", "max_strain", "hashin"];
    assert!(criteria.iter().any(|c| fpf["criterion"] == *c), "{fpf}");
    assert_eq!(fpf["mode"], "fibre_tension");
    assert!(rel(f(&fpf["load_multiplier"]), 10.0) < 1e-9);
    for p in v["plies"].as_array().unwrap() {
        assert!(rel(f(&p["top"]["sigma1_Pa"]), 150e6) < 1e-9);
        assert!(f(&p["bottom"]["sigma2_Pa"]).abs() < 1.0);
        for c in ["tsai_wu", "max_stress", "max_strain", "hashin"] {
            assert!(rel(f(&p["strength_ratio"][c]), 10.0) < 1e-9, "{c}");
            assert_eq!(p["failure_mode"][c], "fibre_tension");
        }
    }
    // 1 MN/m is 40/3 times the load above: a multiplier of 0.75, the load fails the laminate
    // and the exit status is 1.
    let mut over = args.to_vec();
    over.extend(["--load", "Nx=1e6"]);
    let (code, out, err) = layloft(&over);
    assert_eq!(code, Some(1), "{err}");
    assert!(out.contains("the applied load fails it"), "{out}");
    assert!(err.contains("the given load fails ply 1 (load multiplier 0.750"), "{err}");
}

#[test]
fn given_midplane_strain_gives_q11_times_the_strain() {
    // eps_x = 0.001 alone on a 0° ply: sigma1 = Q11 eps_x = 181.8 MPa (Kaw Example 2.6,
    // Q11 = 181.8 GPa, four figures: 5e-4).
    let (code, v) = json(&[
        "laminate",
        "--materials",
        KAW,
        "--material",
        "t300-5208",
        "--layup",
        "[0_2]T",
        "--strains",
        "ex=0.001",
    ]);
    assert_eq!(code, Some(0));
    assert!(rel(f(&v["plies"][0]["top"]["sigma1_Pa"]), 181.8e6) < 5e-4);
    assert_eq!(f(&v["strains_given"]["eps_x"]), 0.001);
    assert!(v["load"].is_null());
}

#[test]
fn a_zero_load_has_no_failure_and_infinite_ratios_are_null() {
    let mut args = QI.to_vec();
    args.extend(["--load", "Nx=0"]);
    let (code, v) = json(&args);
    assert_eq!(code, Some(0));
    assert!(v["first_ply_failure"].is_null());
    assert!(v["plies"][0]["strength_ratio"]["tsai_wu"].is_null());
    assert_eq!(v["plies"][0]["failure_mode"]["tsai_wu"], "none");
    let (_, out, _) = layloft(&args);
    assert!(out.contains("none"), "{out}");
    assert!(out.contains("First-ply failure: none"), "{out}");
}

#[test]
fn a_layer_without_strengths_is_not_applicable_and_the_others_still_fail() {
    let (code, v) = json(&[
        "laminate",
        "--materials",
        KAW,
        "--layup",
        "[0:unrated-sheet/0:t300-5208/90:t300-5208]s",
        "--load",
        "Nx=100e3",
    ]);
    assert_eq!(code, Some(0));
    assert!(v["plies"][0]["strength_ratio"]["tsai_wu"].is_null());
    assert_eq!(v["plies"][0]["failure_mode"]["hashin"], "not_applicable");
    let fpf = &v["first_ply_failure"];
    assert_eq!(f(&fpf["angle_deg"]), 90.0);
    assert_eq!(fpf["mode"], "matrix_tension");
    assert!(v["first_ply_failure_by_criterion"]["max_strain"]["ply"].as_u64().is_some());
}

#[test]
fn cooling_adds_residual_stresses_and_reports_them() {
    let mut args = QI.to_vec();
    args[6] = "[0/90]s";
    args.extend(["--load", "Nx=10e3", "--delta-t", "-100"]);
    let (code, v) = json(&args);
    assert_eq!(code, Some(0));
    assert_eq!(f(&v["delta_T_K"]), -100.0);
    // Cooling puts the matrix in transverse tension (validation_failure.rs has the closed form).
    let residual = f(&v["plies"][0]["top"]["residual"]["sigma2_Pa"]);
    assert!(residual > 20e6, "{residual}");
    assert!(v["thermal_resultants"]["NTx_N_m"].as_f64().unwrap() < 0.0);
    let (_, out, _) = layloft(&args);
    assert!(out.contains("temperature change -100.0 K"), "{out}");
}

#[test]
fn the_demo_materials_are_valid_and_a_hybrid_code_runs() {
    let (code, out, err) = layloft(&["materials", DEMO]);
    assert_eq!(code, Some(0), "{err}");
    for name in
        ["carbon-ud", "carbon-twill", "glass-ud", "glass-biax", "pvc-foam", "al-6082", "bi58sn42"]
    {
        assert!(out.contains(name), "{name} missing from\n{out}");
    }
    assert!(out.contains("safety: contains lead and cadmium"), "{out}");
    let (code, v) = json(&[
        "laminate",
        "--materials",
        DEMO,
        "--layup",
        "[0:carbon-twill/±45:glass-biax/0_4:carbon-ud]s",
        "--load",
        "Nx=250e3,Mx=20",
        "--delta-t",
        "-100",
    ]);
    assert_eq!(code, Some(0));
    let plies = v["plies"].as_array().unwrap();
    assert_eq!(plies.len(), 14);
    assert_eq!(plies[1]["material"], "glass-biax");
    assert_eq!(plies[13]["material"], "carbon-twill");
    assert!(f(&v["first_ply_failure"]["load_multiplier"]) > 1.0);
}

#[test]
fn help_shows_an_example() {
    let (code, out, _) = layloft(&["laminate", "--help"]);
    assert_eq!(code, Some(0));
    assert!(out.contains("Examples:") && out.contains("--layup '[0/±45/90]s'"), "{out}");
    assert!(out.contains("--delta-t"), "{out}");
}

#[test]
fn ply_thickness_override_scales_the_thickness() {
    let mut args = QI.to_vec();
    args.extend(["--ply-thickness-mm", "0.25"]);
    let (code, v) = json(&args);
    assert_eq!(code, Some(0));
    assert!(rel(f(&v["thickness_m"]), 2e-3) < 1e-12);
    // Moduli do not depend on the ply thickness when every ply has the same one.
    assert!(rel(f(&v["Ex_Pa"]), 69.68e9) < 5e-4);
}

#[test]
fn loads_and_temperatures_beyond_any_laminate_are_refused() {
    // Common practice: 1e9 N/m is 100 GPa through 10 mm, far past any ply; such a value is a
    // slip, and near the floating-point range it gave NaN stresses and "never fails". Refused
    // with the key, the value and the bound (exit 2); a load just inside still runs.
    let base = ["laminate", "--materials", KAW, "--material", "t300-5208", "--layup", "[0/45]T"];
    for (option, value, part) in [
        ("--load", "Nx=1e300", "Nx = 1e300 N/m lies beyond ±1e9 N/m"),
        ("--load", "Nx=1e308,Mx=1e308", "Nx = 1e308 N/m"),
        ("--load", "Mxy=-2e7", "Mxy = -2e7 N·m/m lies beyond ±1e7 N·m/m"),
        ("--strains", "ex=2", "ex = 2e0 lies beyond ±1e0"),
        ("--delta-t", "1e6", "within ±400 K"),
    ] {
        let mut args = base.to_vec();
        args.extend([option, value]);
        let (code, _, stderr) = layloft(&args);
        assert_eq!(code, Some(2), "{option} {value}: {stderr}");
        assert!(stderr.contains(part), "{option} {value}: {stderr}");
    }
    let mut args = base.to_vec();
    args.extend(["--load", "Nx=9e8"]);
    let (code, _, stderr) = layloft(&args);
    assert_eq!(code, Some(1), "fails a ply, but runs: {stderr}");
}

#[test]
fn a_criterion_that_applies_to_no_ply_is_not_applicable_in_the_summary() {
    // An isotropic foam sheet alone in uniaxial tension (invented load): Hashin does not apply
    // to an isotropic layer, so its first-ply line says "n/a", as the ply table does; "none"
    // would say that no multiple of the load fails. The other criteria name the ply.
    let (code, out, err) = layloft(&[
        "laminate",
        "--materials",
        "layups/mine-fan/materials.toml",
        "--layup",
        "[0:pvc-foam]T",
        "--load",
        "Nx=1e4",
    ]);
    assert_eq!(code, Some(0), "{err}");
    let line = |c: &str| out.lines().find(|l| l.trim_start().starts_with(&format!("by {c}")));
    assert!(line("Hashin").is_some_and(|l| l.trim_end().ends_with("n/a")), "{out}");
    assert!(line("Tsai-Wu").is_some_and(|l| l.contains("at ply 1")), "{out}");
}

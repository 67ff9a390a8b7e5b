//! Local buckling as a user meets it: the `stress` and `check` JSON keys, the `[buckling]`
//! setting, the `min_buckling_factor` criterion and the list of what is not covered.

use std::fs;
use std::path::Path;

use crate::support_run::Command;

const FAN: &str = "layups/mine-fan/blade.toml";

fn layloft() -> Command {
    Command::cargo_bin("layloft").unwrap()
}

/// A copy of the mine-fan demo with `blade.toml` changed by `edit`.
fn fan_copy(edit: impl Fn(String) -> String) -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    for entry in fs::read_dir("layups/mine-fan").unwrap() {
        let entry = entry.unwrap();
        fs::copy(entry.path(), dir.path().join(entry.file_name())).unwrap();
    }
    let path = dir.path().join("blade.toml");
    let text = fs::read_to_string(&path).unwrap();
    fs::write(&path, edit(text)).unwrap();
    dir
}

fn json(args: &[&str], blade: &Path) -> (serde_json::Value, i32) {
    let out = layloft().arg(args[0]).arg(blade).args(&args[1..]).output().unwrap();
    let code = out.status.code().unwrap_or(-1);
    (serde_json::from_slice(&out.stdout).unwrap(), code)
}

#[test]
fn stress_json_gives_every_panel_with_units() {
    let (j, code) = json(&["stress", "--json", "--case", "surge"], Path::new(FAN));
    assert_eq!(code, 0);
    let case = &j["cases"][0];
    let panels = case["buckling"].as_array().unwrap();
    assert!(panels.len() > 21 * 4, "{} panels", panels.len());
    for p in panels {
        for key in ["r_m", "width_m", "N_cr_N_m", "N_x_N_m", "N_xs_N_m", "knock_down"] {
            assert!(p[key].as_f64().is_some(), "{key}: {p}");
        }
        assert!(p["reserve_factor"].is_null() || p["reserve_factor"].as_f64().unwrap() > 0.0);
        assert!(
            ["panel_buckling", "face_wrinkling", "shear_crimping", "core_shear"]
                .contains(&p["mode"].as_str().unwrap())
        );
    }
    // The web is a sandwich: its panels carry the sandwich factors.
    let web = panels.iter().find(|p| p["part"] == "web").unwrap();
    assert!(web["sandwich"]["shear_stiffness_N_m"].as_f64().unwrap() > 0.0);
    assert!(web["sandwich"]["wrinkling_stress_Pa"].as_array().unwrap().len() == 2);
    let least = case["min_buckling_factor"].as_f64().unwrap();
    assert_eq!(case["buckling_critical"]["reserve_factor"].as_f64().unwrap(), least);
    assert!(j["not_covered"].as_array().unwrap().len() >= 5);
    assert_eq!(j["edge_fixity"].as_f64().unwrap(), 0.0);
}

#[test]
fn clamped_edges_raise_the_critical_loads() {
    let clamped = fan_copy(|t| format!("{t}\n[buckling]\nedge_fixity = \"clamped\"\n"));
    let (c, _) = json(&["stress", "--json", "--case", "surge"], &clamped.path().join("blade.toml"));
    let (s, _) = json(&["stress", "--json", "--case", "surge"], Path::new(FAN));
    let ncr = |j: &serde_json::Value, k: usize| j["cases"][0]["buckling"][k]["N_cr_N_m"].as_f64();
    let n = s["cases"][0]["buckling"].as_array().unwrap().len();
    for k in 0..n {
        let (a, b) = (ncr(&s, k).unwrap(), ncr(&c, k).unwrap());
        // Clamping the long edges raises k from 4 towards 6.97 (Timoshenko & Gere 1961); on a
        // sandwich whose load is set by the core's shear flexibility it gains little (Allen
        // 1969, ch. 4: the shear term does not depend on the edge rotation).
        if s["cases"][0]["buckling"][k]["sandwich"].is_null() {
            assert!(b > 1.2 * a, "panel {k}: {b} against {a}");
        } else {
            assert!(b >= a, "panel {k}: {b} against {a}");
        }
    }
    assert_eq!(c["edge_fixity"].as_f64().unwrap(), 1.0);
}

#[test]
fn check_reports_the_buckling_criterion_and_what_is_not_covered() {
    let (j, code) = json(&["check", "--json"], Path::new(FAN));
    assert_eq!(code, 0);
    let row = j["criteria"]
        .as_array()
        .unwrap()
        .iter()
        .find(|r| r["criterion"] == "min_buckling_factor")
        .expect("a buckling row");
    // Not set in the demo: the strength demand min_reserve_factor = 1.5 applies.
    assert_eq!(row["limit"].as_f64().unwrap(), 1.5);
    assert!(row["pass"].as_bool().unwrap());
    assert!(
        j["not_covered"]
            .as_array()
            .unwrap()
            .iter()
            .any(|l| l.as_str().unwrap().contains("fatigue"))
    );
    let text = layloft().args(["check", FAN]).output().unwrap();
    let text = String::from_utf8(text.stdout).unwrap();
    assert!(text.contains("least buckling reserve factor"), "{text}");
    assert!(text.contains("Not covered by this analysis"), "{text}");

    // A demand the demo cannot meet fails the check with exit status 1.
    let strict = fan_copy(|t| {
        t.replace("min_reserve_factor = 1.5", "min_reserve_factor = 1.5\nmin_buckling_factor = 50")
    });
    let (j, code) = json(&["check", "--json"], &strict.path().join("blade.toml"));
    assert_eq!(code, 1);
    assert!(!j["pass"].as_bool().unwrap());
}

#[test]
fn a_bad_edge_fixity_names_its_key() {
    for (value, says) in [
        (
            "\"pinned\"",
            "expected \"simply_supported\", \"clamped\" or a number from 0 to 1, found \"pinned\"",
        ),
        ("1.5", "expected a number from 0 (simply supported) to 1 (clamped), found 1.5"),
    ] {
        let bad = fan_copy(|t| format!("{t}\n[buckling]\nedge_fixity = {value}\n"));
        let out = layloft().arg("stress").arg(bad.path().join("blade.toml")).output().unwrap();
        assert_eq!(out.status.code(), Some(2));
        let err = String::from_utf8(out.stderr).unwrap();
        assert!(err.contains("buckling.edge_fixity") && err.contains(says), "{err}");
        assert!(!err.contains("panicked"));
    }
}

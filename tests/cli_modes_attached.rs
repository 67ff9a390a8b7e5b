//! `layloft modes` and `layloft check` on a demo blade given a tip weight, water round it and
//! guide vanes ahead of it: the frequencies move, the new JSON keys carry units, the check uses
//! the wet frequencies. The added data are invented for the test.

use std::fs;
use std::path::Path;

use crate::support_run::Command;

fn layloft() -> Command {
    Command::cargo_bin("layloft").unwrap()
}

/// The mine-fan demo copied into `dir` with `extra` appended to its blade.toml.
fn demo_with(dir: &Path, extra: &str) -> std::path::PathBuf {
    for entry in fs::read_dir("layups/mine-fan").unwrap() {
        let entry = entry.unwrap();
        fs::copy(entry.path(), dir.join(entry.file_name())).unwrap();
    }
    let path = dir.join("blade.toml");
    let mut toml = fs::read_to_string(&path).unwrap();
    toml.push_str(extra);
    fs::write(&path, toml).unwrap();
    path
}

/// `layloft check --json` of the project: the exit status and the frequency margin's row.
fn frequency_row(path: &Path) -> (Option<i32>, serde_json::Value) {
    let out = layloft().arg("check").arg(path).arg("--json").output().unwrap();
    let c: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let row = c["criteria"]
        .as_array()
        .unwrap()
        .iter()
        .find(|r| r["criterion"] == "frequency_margin_pct")
        .unwrap()
        .clone();
    (out.status.code(), row)
}

fn modes_json(path: &Path) -> serde_json::Value {
    let out = layloft().arg("modes").arg(path).arg("--json").output().unwrap();
    assert!(out.status.code() == Some(0) || out.status.code() == Some(1));
    serde_json::from_slice(&out.stdout).unwrap()
}

fn first_flap_hz(j: &serde_json::Value) -> f64 {
    j["speeds"][0]["modes"][0]["frequency_hz"].as_f64().unwrap()
}

#[test]
fn a_tip_weight_lowers_the_first_frequency_and_is_reported() {
    let bare_dir = tempfile::tempdir().unwrap();
    let bare = modes_json(&demo_with(bare_dir.path(), ""));
    let dir = tempfile::tempdir().unwrap();
    // A 100 g tip weight (the blade's laminate weighs about 0.6 kg), with rotary inertia.
    let path = demo_with(
        dir.path(),
        "\n[[point_mass]]\nname = \"tip-weight\"\nr_m = 0.88\nmass_kg = 0.1\ny_m = 0.01\n\
         inertia_x_kg_m2 = 2e-5\ninertia_y_kg_m2 = 1e-5\ninertia_z_kg_m2 = 1.5e-5\n",
    );
    let j = modes_json(&path);
    // The first mode (flap) at standstill falls: by Rayleigh's principle (common practice).
    assert!(
        first_flap_hz(&j) < 0.9 * first_flap_hz(&bare),
        "{} vs {}",
        first_flap_hz(&j),
        first_flap_hz(&bare)
    );
    assert_eq!(j["point_masses"].as_array().unwrap().len(), 2);
    assert_eq!(j["point_masses"][1]["mass_kg"], 0.1);
    assert_eq!(j["boundary_condition"], "clamped root");
    assert_eq!(j["tracks"][0]["track_number"], 1);
    let text = layloft().arg("modes").arg(&path).output().unwrap();
    let text = String::from_utf8_lossy(&text.stdout);
    assert!(text.contains("Boundary condition: root clamped"), "{text}");
    assert!(text.contains("Point masses: 2"), "{text}");
}

#[test]
fn in_water_behind_vanes_the_check_uses_the_wet_frequencies_and_the_vane_orders() {
    let dir = tempfile::tempdir().unwrap();
    let path = demo_with(
        dir.path(),
        "\n[fluid]\ndensity_kg_m3 = 1025\n\n[excitation]\nvanes = [11]\n\n\
         [[excitation.fixed]]\nname = \"gear mesh\"\nfrequency_Hz = 150\n",
    );
    let j = modes_json(&path);
    assert_eq!(j["fluid_density_kg_m3"], 1025.0);
    let pairs = j["dry_wet"][0]["modes"].as_array().unwrap();
    let first = &pairs[0];
    let (wet, dry) =
        (first["frequency_wet_Hz"].as_f64().unwrap(), first["frequency_dry_Hz"].as_f64().unwrap());
    // A thin hollow fan blade in water: the added mass is many times the blade's own.
    assert!(wet < 0.5 * dry, "{wet} vs {dry}");
    assert!((first_flap_hz(&j) - wet).abs() < 1e-9 * wet, "the sweep is wet");
    let labels: Vec<&str> =
        j["excitations"].as_array().unwrap().iter().map(|e| e["label"].as_str().unwrap()).collect();
    assert!(labels.contains(&"11P (11 vanes)") && labels.contains(&"22P (11 vanes)"), "{labels:?}");
    assert!(labels.contains(&"gear mesh 150 Hz"), "{labels:?}");
    let fixed =
        j["excitations"].as_array().unwrap().iter().find(|e| e["fixed_name"] == "gear mesh");
    assert_eq!(fixed.unwrap()["harmonic"], serde_json::Value::Null);
    // The demo's 10 % margin is not met in water: check fails on frequency with exit 1.
    let (code, row) = frequency_row(&path);
    assert_eq!(code, Some(1));
    assert_eq!(row["pass"], false);
    // The SVG draws the vane orders and the fixed line with their names.
    let svg = dir.path().join("c.svg");
    layloft().arg("modes").arg(&path).arg("--svg").arg(&svg).output().unwrap();
    let svg = fs::read_to_string(svg).unwrap();
    assert!(svg.contains("11P (11 vanes)") && svg.contains("gear mesh 150 Hz"));
    assert!(svg.contains("vane passing") && svg.contains("fixed frequency"));
}

/// A fan on a variable-speed drive (`rpm_min`, the least operating speed): the band over which
/// the margin is demanded runs from it to `rpm_max`. Below the speed where the demo's flap 1
/// meets a blade-passing order (its own crossing, read from `crossings[]`) the check fails with
/// a margin of 0 there (a mode on an excitation line: the margin's definition); from a least
/// speed above the crossing it passes, as the demo does without one.
#[test]
fn a_least_operating_speed_below_a_crossing_fails_the_margin() {
    let dir = tempfile::tempdir().unwrap();
    let path = demo_with(dir.path(), "");
    let toml = fs::read_to_string(&path).unwrap();
    let j = modes_json(&path);
    assert_eq!(j["rpm_min"], j["rpm_nominal"], "no least speed given: the nominal");
    let first = &j["crossings"][0];
    let crossing = first["rpm"].as_f64().unwrap();
    let nominal = j["rpm_nominal"].as_f64().unwrap();
    assert!(crossing < nominal, "the demo's crossing lies below its nominal speed");
    let check = |least: f64| {
        let line = format!("[rotor]\nrpm_min = {least}");
        fs::write(&path, toml.replacen("[rotor]", &line, 1)).unwrap();
        let (code, row) = frequency_row(&path);
        (code, row, modes_json(&path))
    };
    let (code, row, j) = check((0.8 * crossing).round());
    assert_eq!(code, Some(1));
    assert_eq!(row["pass"], false);
    assert_eq!(j["rpm_min"], (0.8 * crossing).round());
    let names: Vec<&str> =
        j["margins"].as_array().unwrap().iter().map(|m| m["speed"].as_str().unwrap()).collect();
    assert_eq!(names, ["minimum", "nominal", "maximum", "running"]);
    let running = &j["margins"][3];
    assert!((running["rpm"].as_f64().unwrap() / crossing - 1.0).abs() < 1e-3, "{running}");
    let least = running["modes"]
        .as_array()
        .unwrap()
        .iter()
        .map(|m| m["margin_pct"].as_f64().unwrap())
        .fold(f64::INFINITY, f64::min);
    assert!(least < 1e-6, "{running}");
    let (code, row, _) = check((crossing + 0.5 * (nominal - crossing)).round());
    assert_eq!(code, Some(0), "{row}");
    assert_eq!(row["pass"], true);
}

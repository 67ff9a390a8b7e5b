//! The command line as a shop engineer meets it: one way to name a project, the verdict where it
//! is needed, errors about folders in words, messages that name what exists. Each test runs the
//! binary as a user would (stdout, stderr, exit status, files on disk). The expectations are the
//! behaviour the README documents (common practice for command-line tools: the verdict last,
//! exit status 1 for a failed check, 2 for bad input, 3 for an output that cannot be written).

use std::fs;
use std::path::Path;

use crate::support_cli::layloft;

const FAN: &str = "layups/mine-fan";

/// A copy of the mine-fan demo in a temporary folder, with `edit` applied to its blade.toml.
fn fan_copy(edit: impl Fn(String) -> String) -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join(FAN);
    for entry in fs::read_dir(&src).unwrap() {
        let entry = entry.unwrap();
        if entry.path().is_file() {
            fs::copy(entry.path(), dir.path().join(entry.file_name())).unwrap();
        }
    }
    let toml = fs::read_to_string(dir.path().join("blade.toml")).unwrap();
    fs::write(dir.path().join("blade.toml"), edit(toml)).unwrap();
    dir
}

fn last_line(text: &str) -> &str {
    text.lines().rev().find(|l| !l.trim().is_empty()).unwrap_or("")
}

#[test]
fn every_command_takes_the_project_folder_or_its_blade_toml() {
    for cmd in ["sections", "stress", "modes", "check"] {
        for project in [FAN.to_string(), format!("{FAN}/blade.toml")] {
            let (code, out, err) = layloft(&[cmd, &project, "--json"]);
            assert_eq!(code, Some(0), "{cmd} {project}: {err}");
            assert!(out.trim_start().starts_with('{'), "{cmd} {project}: {out}");
        }
        let (code, help, _) = layloft(&[cmd, "--help"]);
        assert_eq!(code, Some(0));
        assert!(help.contains("<PROJECT>"), "{cmd} --help names the argument PROJECT:\n{help}");
    }
    let out = tempfile::tempdir().unwrap();
    let dest = out.path().join("t");
    // At a 0.5 mm tolerance (the demo's is 0.1 mm): the folder as the project, the melting
    // verdict (alloy against cure temperatures) and the summary's file do not depend on it.
    let (code, stdout, err) =
        layloft(&["tooling", FAN, "--out", dest.to_str().unwrap(), "--tolerance-mm", "0.5"]);
    assert_eq!(code, Some(0), "tooling on the folder: {err}");
    assert_eq!(last_line(&stdout), "Core-alloy melting check: PASS", "the verdict comes last");
    assert!(dest.join("tooling-summary.json").is_file());
}

#[test]
fn help_lists_the_commands_in_the_order_of_the_work_and_usage_comes_first() {
    let (_, help, _) = layloft(&["--help"]);
    let order = [
        "materials",
        "laminate",
        "sections",
        "stress",
        "modes",
        "check",
        "tooling",
        "report",
        "demo",
    ];
    let at: Vec<usize> = order
        .iter()
        .map(|c| help.find(&format!("\n  {c} ")).unwrap_or_else(|| panic!("{c} in:\n{help}")))
        .collect();
    assert!(at.windows(2).all(|w| w[0] < w[1]), "commands out of order:\n{help}");
    let (_, help, _) = layloft(&["materials", "--help"]);
    let usage = help.find("Usage:").expect("a usage line");
    let example = help.find("Examples:").expect("an example");
    assert!(usage < example, "materials --help shows the usage before the example:\n{help}");
}

#[test]
fn report_says_the_verdict_last_and_check_json_keys_carry_units() {
    // The tooling at a 0.5 mm tolerance (the demo's is 0.1 mm) keeps the run short: the verdict
    // line does not depend on it.
    let project = fan_copy(|t| {
        t.replace("min_reserve_factor = 1.5", "min_reserve_factor = 500")
            .replace("tolerance_mm = 0.1", "tolerance_mm = 0.5")
    });
    let out = tempfile::tempdir().unwrap();
    let dest = out.path().join("rep");
    let blade = project.path().join("blade.toml");
    let (code, stdout, err) =
        layloft(&["report", blade.to_str().unwrap(), "--out", dest.to_str().unwrap()]);
    assert_eq!(code, Some(1), "a failed check is exit 1: {err}");
    let last = last_line(&stdout);
    assert!(
        last.starts_with("Design check: FAIL: least reserve factor"),
        "the verdict is the last line and names what fails: {stdout}"
    );
    assert!(last.contains(">= 500"), "{last}");
    assert!(dest.join("report.html").is_file());

    let (code, stdout, _) = layloft(&["check", blade.to_str().unwrap(), "--json"]);
    assert_eq!(code, Some(1));
    let j: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    for row in j["criteria"].as_array().unwrap() {
        let key = row["criterion"].as_str().unwrap();
        let suffix = match key {
            "min_reserve_factor" | "min_buckling_factor" => "ratio",
            "frequency_margin_pct" => "pct",
            "max_mass_kg" => "kg",
            "max_tip_deflection_m" => "m",
            other => panic!("a criterion this test does not know: {other}"),
        };
        assert_eq!(row[format!("limit_{suffix}")], row["limit"], "{key}");
        assert_eq!(row[format!("found_{suffix}")], row["found"], "{key}");
    }
    let (code, stdout, _) = layloft(&["check", FAN]);
    assert_eq!(code, Some(0));
    assert_eq!(last_line(&stdout), "Design check: PASS (every criterion met)");
}

#[test]
fn folders_that_are_files_are_named_as_such() {
    let tmp = tempfile::tempdir().unwrap();
    let file = tmp.path().join("out");
    fs::write(&file, "not a folder").unwrap();
    let f = file.to_str().unwrap();
    let (code, _, err) = layloft(&["sections", FAN, "--csv", &format!("{f}/s.csv")]);
    assert_eq!(code, Some(3), "{err}");
    assert!(err.contains("is a file, not a folder"), "{err}");
    let (code, _, err) = layloft(&["sections", FAN, "--svg", f]);
    assert_eq!(code, Some(3), "{err}");
    assert!(err.contains("is a file, not a folder"), "{err}");
    let (code, _, err) = layloft(&["modes", FAN, "--svg", &format!("{f}/c.svg")]);
    assert_eq!(code, Some(3), "{err}");
    assert!(err.contains("is a file, not a folder"), "{err}");
    assert!(!err.contains(".layloft-"), "no temporary file name in the message: {err}");
    assert_eq!(fs::read_to_string(&file).unwrap(), "not a folder", "the file is left alone");
}

#[test]
fn messages_name_what_exists_and_what_is_unusual() {
    // A web name that is nowhere near an existing one: the webs that exist are listed.
    let p = fan_copy(|t| t);
    let plies = fs::read_to_string(p.path().join("plies.csv")).unwrap();
    assert!(plies.contains("web:main"), "the demo's plies name the web");
    fs::write(p.path().join("plies.csv"), plies.replacen("web:main", "web:zzzz", 1)).unwrap();
    let (code, _, err) = layloft(&["sections", p.path().to_str().unwrap()]);
    assert_eq!(code, Some(2));
    assert!(err.contains("no web named 'zzzz'") && err.contains("'web:main'"), "{err}");

    // A misspelt root-spring key is named as unknown, with the key it resembles.
    let p = fan_copy(|t| {
        t.replace(
            "[modal]\nelements = 40\nmodes = 8\n",
            "[modal]\nelements = 40\nmodes = 8\n\n[modal.root_springs]\naxial_N_m = 1e9\n\
             flap_Nm_rad = 1e6\nedge_Nm_rad = 1e6\ntorsion_Nm_rad = 1e5\nflapp = 3\n",
        )
    });
    assert!(fs::read_to_string(p.path().join("blade.toml")).unwrap().contains("flapp"));
    let (code, _, err) = layloft(&["modes", p.path().to_str().unwrap()]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("unknown key 'flapp'"), "{err}");

    // A load case above rpm_max is an overspeed case: run, and said; far above, refused.
    let p = fan_copy(|t| t.replace("rpm = 1090\n", "rpm = 1300\n"));
    let (code, _, err) = layloft(&["stress", p.path().to_str().unwrap()]);
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("'overspeed' runs at 1300 rpm, above rpm_max = 1090 rpm"), "{err}");
    let p = fan_copy(|t| t.replace("rpm = 1090\n", "rpm = 5000\n"));
    let (code, _, err) = layloft(&["sections", p.path().to_str().unwrap()]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("rpm") && err.contains("5000") && err.contains("blade.toml"), "{err}");
}

/// Every file of the report set in `dir` (as its list `.layloft-set` names them) with its bytes.
fn report_set(dir: &Path) -> Vec<(String, Vec<u8>)> {
    let list = fs::read_to_string(dir.join(".layloft-set")).expect("a report set has its list");
    let mut files: Vec<(String, Vec<u8>)> = list
        .lines()
        .filter(|l| !l.is_empty())
        .map(|l| (l.to_string(), fs::read(dir.join(l)).unwrap_or_default()))
        .collect();
    files.sort();
    files
}

#[test]
fn a_killed_report_leaves_the_old_set_or_the_new_one_whole() {
    // The tooling at a 0.5 mm tolerance (the demo's is 0.1 mm): what is checked is how the set
    // is written, not the meshes, and the coarser tooling makes each of the eight runs cheaper.
    let coarse = |t: String| t.replace("tolerance_mm = 0.1", "tolerance_mm = 0.5");
    let old_project = fan_copy(coarse);
    let new_project =
        fan_copy(|t| coarse(t).replace("min_reserve_factor = 1.5", "min_reserve_factor = 1.6"));
    let tmp = tempfile::tempdir().unwrap();
    let (out, reference) = (tmp.path().join("out"), tmp.path().join("reference"));
    let run = |project: &Path, dest: &Path| {
        let (code, _, err) =
            layloft(&["report", project.to_str().unwrap(), "--out", dest.to_str().unwrap()]);
        assert_eq!(code, Some(0), "{err}");
    };
    run(new_project.path(), &reference);
    let new_set = report_set(&reference);
    let started = std::time::Instant::now();
    run(old_project.path(), &out);
    let old_set = report_set(&out);
    let full = started.elapsed();
    assert_ne!(old_set, new_set, "the two reports differ");
    fs::write(out.join("my-notes.txt"), "kept").unwrap();

    for fraction in [0.15, 0.35, 0.55, 0.75, 0.9, 0.97] {
        let mut child = std::process::Command::new(env!("CARGO_BIN_EXE_layloft"))
            .args(["report", new_project.path().to_str().unwrap(), "--out"])
            .arg(&out)
            .current_dir(env!("CARGO_MANIFEST_DIR"))
            .stdout(std::process::Stdio::null())
            .stderr(std::process::Stdio::null())
            .spawn()
            .unwrap();
        std::thread::sleep(full.mul_f64(fraction));
        let _ = child.kill();
        let _ = child.wait();
        let found = report_set(&out);
        assert!(
            found == old_set || found == new_set,
            "killed at {:.0} % of a run: the report folder holds a mixed set",
            100.0 * fraction
        );
        assert_eq!(fs::read_to_string(out.join("my-notes.txt")).unwrap(), "kept");
    }
}

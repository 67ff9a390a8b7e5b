//! Snapshots of what every command prints on the invented demos (stdout, with temporary paths
//! replaced): a change in any number, word or layout of the text output shows up here as a diff
//! to review. These are regression checks, not checks against the outside world; the numbers
//! themselves are checked in the validation tests.
//!
//! `LAYLOFT_UPDATE_SNAPSHOTS=1 cargo test --test cli snapshot` rewrites the files in
//! `tests/snapshots/` after a reviewed change.

use std::path::Path;

use crate::support_cli::layloft;

fn check(name: &str, args: &[&str], expected_status: i32) {
    let (status, stdout, stderr) = layloft(args);
    assert_eq!(status, Some(expected_status), "layloft {args:?}: stderr\n{stderr}");
    compare(name, args, &stdout);
}

/// As [`check`] for a command that writes into the folder `--out OUT`: the folder's temporary
/// path is shown as `OUT` in the snapshot.
fn check_writing(name: &str, args: &[&str], expected_status: i32) {
    let dir = tempfile::tempdir().expect("temporary folder");
    let out = dir.path().join("out");
    let out = out.to_str().expect("a UTF-8 path");
    let mut all = args.to_vec();
    all.extend(["--out", out]);
    let (status, stdout, stderr) = layloft(&all);
    assert_eq!(status, Some(expected_status), "layloft {all:?}: stderr\n{stderr}");
    compare(name, args, &stdout.replace(out, "OUT"));
}

fn compare(name: &str, args: &[&str], stdout: &str) {
    let file =
        Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/snapshots").join(format!("{name}.txt"));
    if std::env::var_os("LAYLOFT_UPDATE_SNAPSHOTS").is_some() {
        std::fs::write(&file, stdout).expect("snapshot written");
        return;
    }
    let want = std::fs::read_to_string(&file)
        .unwrap_or_else(|e| panic!("{}: {e}; run with LAYLOFT_UPDATE_SNAPSHOTS=1", file.display()));
    if want != stdout {
        let first = want
            .lines()
            .zip(stdout.lines())
            .position(|(a, b)| a != b)
            .unwrap_or(want.lines().count().min(stdout.lines().count()));
        panic!(
            "layloft {args:?} prints something else than {} from line {}:\n  was: {:?}\n  now: {:?}",
            file.display(),
            first + 1,
            want.lines().nth(first).unwrap_or("(end)"),
            stdout.lines().nth(first).unwrap_or("(end)")
        );
    }
}

#[test]
fn materials_of_the_mine_fan() {
    check("materials-mine-fan", &["materials", "layups/mine-fan/materials.toml"], 0);
}

#[test]
fn laminate_of_the_readme() {
    check(
        "laminate-readme",
        &[
            "laminate",
            "--materials",
            "layups/mine-fan/materials.toml",
            "--layup",
            "[0:carbon-twill/±45:glass-biax/0:carbon-ud]s",
            "--load",
            "Nx=150e3,Mx=10",
            "--delta-t",
            "-100",
        ],
        0,
    );
}

#[test]
fn sections_stress_modes_and_check_of_both_demos() {
    for blade in ["mine-fan", "small-wind"] {
        let project = format!("layups/{blade}");
        for command in ["sections", "stress", "modes", "check"] {
            check(&format!("{command}-{blade}"), &["-q", command, &project], 0);
        }
    }
}

#[test]
fn tooling_plybook_and_report_of_the_mine_fan() {
    check_writing("tooling-mine-fan", &["-q", "tooling", "layups/mine-fan"], 0);
    check_writing("plybook-mine-fan", &["-q", "plybook", "layups/mine-fan"], 0);
    check_writing("report-mine-fan", &["-q", "report", "layups/mine-fan"], 0);
}

//! Every case under `tests/bad_inputs/` (format in its README): layloft must refuse the input
//! with exit status 2, say what `expected` says on stderr, print nothing on stdout and not panic.

use std::fs;
use std::path::{Path, PathBuf};

use assert_cmd::Command;

/// Splits an `args` line on whitespace; single quotes group words with spaces.
fn split_args(line: &str) -> Result<Vec<String>, String> {
    let mut args = Vec::new();
    let mut current = String::new();
    let mut in_word = false;
    let mut quoted = false;
    for c in line.trim_end_matches(['\n', '\r']).chars() {
        match c {
            '\'' => {
                quoted = !quoted;
                in_word = true;
            }
            c if c.is_whitespace() && !quoted => {
                if in_word {
                    args.push(std::mem::take(&mut current));
                    in_word = false;
                }
            }
            c => {
                current.push(c);
                in_word = true;
            }
        }
    }
    if quoted {
        return Err(format!("unbalanced single quote in: {line}"));
    }
    if in_word {
        args.push(current);
    }
    Ok(args)
}

fn cases() -> Vec<PathBuf> {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad_inputs");
    let mut dirs: Vec<PathBuf> = fs::read_dir(&root)
        .expect("tests/bad_inputs exists")
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| p.is_dir())
        .collect();
    dirs.sort();
    dirs
}

/// Runs one case; returns what went wrong, if anything.
fn check(case: &Path) -> Result<(), String> {
    let read =
        |f: &str| fs::read_to_string(case.join(f)).map_err(|e| format!("cannot read {f}: {e}"));
    let args = split_args(read("args")?.lines().next().unwrap_or_default())?;
    let expected = read("expected")?;
    let out = Command::cargo_bin("layloft")
        .map_err(|e| e.to_string())?
        .args(&args)
        .current_dir(case)
        .env("NO_COLOR", "1")
        .output()
        .map_err(|e| e.to_string())?;
    let stderr = String::from_utf8_lossy(&out.stderr);
    let stdout = String::from_utf8_lossy(&out.stdout);
    let mut faults = Vec::new();
    if out.status.code() != Some(2) {
        faults.push(format!("exit status {:?}, expected 2", out.status.code()));
    }
    for line in expected.lines().map(str::trim_end).filter(|l| !l.trim().is_empty()) {
        if !stderr.contains(line) {
            faults.push(format!("stderr lacks: {line}"));
        }
    }
    if stderr.contains("panicked") {
        faults.push("stderr shows a panic".to_string());
    }
    if !stdout.is_empty() {
        faults.push(format!("stdout is not empty: {stdout}"));
    }
    if faults.is_empty() {
        Ok(())
    } else {
        Err(format!("{}\n  stderr was:\n{stderr}", faults.join("\n  ")))
    }
}

#[test]
fn every_bad_input_gets_its_message_and_exit_status_2() {
    let cases = cases();
    assert!(cases.len() >= 15, "only {} cases under tests/bad_inputs", cases.len());
    let failures: Vec<String> = cases
        .iter()
        .filter_map(|c| {
            check(c).err().map(|e| format!("{}: {e}", c.file_name().unwrap().to_string_lossy()))
        })
        .collect();
    assert!(failures.is_empty(), "{} of {} cases failed:\n{}", failures.len(), cases.len(), {
        failures.join("\n")
    });
}

#[test]
fn args_lines_split_on_whitespace_with_single_quotes() {
    assert_eq!(
        split_args("laminate --load 'Nx=1, Mx=2'  --json\n").unwrap(),
        ["laminate", "--load", "Nx=1, Mx=2", "--json"]
    );
    assert_eq!(split_args("a '' b").unwrap(), ["a", "", "b"]);
    assert!(split_args("a 'b").is_err());
}

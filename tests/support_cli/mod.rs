//! Running the `layloft` binary as a user would, for the command-line tests.
#![allow(dead_code)]

use crate::support_run::Command;

/// Runs `layloft ARGS` from the package root without colour: exit status, stdout, stderr.
pub fn layloft(args: &[&str]) -> (Option<i32>, String, String) {
    let out = Command::cargo_bin("layloft")
        .expect("the layloft binary is built for the tests")
        .args(args)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .env("NO_COLOR", "1")
        .output()
        .expect("layloft runs");
    let text = |b: &[u8]| String::from_utf8_lossy(b).into_owned();
    (out.status.code(), text(&out.stdout), text(&out.stderr))
}

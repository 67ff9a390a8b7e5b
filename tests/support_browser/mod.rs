//! Checks of a rendered HTML report for integration tests: a static check of the markup that
//! needs nothing installed, and a run of Debian's headless Chromium that loads the page, dumps
//! the DOM, takes a screenshot and prints it to PDF, and reports the console messages.
//!
//! Whether a missing browser fails a test is decided by [`browser_required`]: the variable
//! `LAYLOFT_REQUIRE_BROWSER=1` (set by `.ci/run`) makes it a failure; without it the browser part
//! is skipped with a note and only the static check runs.
#![allow(dead_code, unused_imports)]

mod chromium;
pub mod sketch;
mod static_check;

pub use chromium::{Chromium, console_messages, drawn_figures};
pub use static_check::static_problems;

use std::io::Write as _;
use std::path::PathBuf;

/// Whether the environment demands the browser part (`LAYLOFT_REQUIRE_BROWSER=1`).
pub fn browser_required() -> bool {
    std::env::var("LAYLOFT_REQUIRE_BROWSER").is_ok_and(|v| v.trim() == "1")
}

/// The browser to use, or `None` after printing why the browser part is skipped. Panics with a
/// clear message when none is found and [`browser_required`] says it must be there.
pub fn browser_or_skip(test: &str) -> Option<Chromium> {
    match Chromium::find() {
        Some(c) => Some(c),
        None if browser_required() => panic!(
            "{test}: LAYLOFT_REQUIRE_BROWSER=1 but no Chromium was found (tried {}); install \
             Debian's chromium package (`apt-get install --no-install-recommends chromium`) or \
             unset LAYLOFT_REQUIRE_BROWSER to run the static check only",
            chromium::CANDIDATES.join(", ")
        ),
        None => {
            // Written to the stderr handle rather than with eprintln!, which the test harness
            // captures: the note is seen in every run, not only with --nocapture.
            // A banner, so that it stands out in cargo's output.
            let rule = "=".repeat(78);
            let _ = writeln!(
                std::io::stderr().lock(),
                "\n{rule}\nBROWSER CHECK SKIPPED ({test}): Chromium is not installed (tried {}).\n\
                 Only the static check of the markup ran. Install Debian's chromium package to\n\
                 run it; LAYLOFT_REQUIRE_BROWSER=1 makes a missing browser a failure.\n{rule}\n",
                chromium::CANDIDATES.join(", ")
            );
            None
        }
    }
}

/// `target/report-screenshots/`, created if needed: rendered pages, screenshots and PDFs are
/// kept there for people to look at.
pub fn screenshot_dir() -> PathBuf {
    // CARGO_TARGET_TMPDIR is `<target>/tmp`; its parent is the target folder in use.
    let tmp = PathBuf::from(env!("CARGO_TARGET_TMPDIR"));
    let dir = tmp.parent().map(|p| p.join("report-screenshots")).unwrap_or(tmp);
    std::fs::create_dir_all(&dir)
        .unwrap_or_else(|e| panic!("cannot create {}: {e}", dir.display()));
    dir
}

/// The mine-fan demo's report (`layloft report layups/mine-fan/blade.toml --out DIR`), run once
/// for every test of the binary that reads it: its folder (`report-mine-fan` beside
/// [`screenshot_dir`], written afresh by each run of the binary) and the command's output, whose
/// exit status each test checks as it needs. A test may add files of its own to the folder but
/// never changes the report's.
pub fn demo_report() -> &'static (PathBuf, std::process::Output) {
    static REPORT: std::sync::OnceLock<(PathBuf, std::process::Output)> =
        std::sync::OnceLock::new();
    REPORT.get_or_init(|| {
        let tmp = PathBuf::from(env!("CARGO_TARGET_TMPDIR"));
        let dir = tmp.parent().map(|p| p.join("report-mine-fan")).unwrap_or(tmp);
        if dir.exists() {
            std::fs::remove_dir_all(&dir)
                .unwrap_or_else(|e| panic!("cannot clear {}: {e}", dir.display()));
        }
        let output = crate::support_run::Command::cargo_bin("layloft")
            .expect("the binary")
            .current_dir(env!("CARGO_MANIFEST_DIR"))
            .args(["report", "layups/mine-fan/blade.toml", "--out"])
            .arg(&dir)
            .output()
            .expect("layloft runs");
        (dir, output)
    })
}

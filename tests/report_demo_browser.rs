//! The real report of the mine-fan demo (`layloft report`) in headless Chromium: it loads with no
//! console message and every figure the report lists has its drawing in the browser's DOM; the
//! screenshot is kept in `target/report-screenshots/demo-report.png` to be looked at.
//!
//! Without Chromium the static check of the markup still runs (`LAYLOFT_REQUIRE_BROWSER=1`
//! makes a missing browser a failure), as in `tests/report_browser.rs`.

use std::fs;

use crate::support_browser::{browser_or_skip, demo_report, screenshot_dir, static_problems};

/// The figures the report must show (issue 7): planform and twist, spanwise stiffness and mass,
/// section drawings, the reserve-factor map, the pitching moment over the pitch range, the
/// Campbell diagram and the mode shapes.
const EXPECTED: [&str; 8] = [
    "planform",
    "twist",
    "stiffness",
    "mass",
    "reserve-map",
    "pitch-moment",
    "campbell",
    "mode-shapes",
];

#[test]
fn the_demo_report_loads_cleanly_with_every_figure() {
    // The report run shared with the other tests of the binary that read it.
    let (dir, output) = demo_report();
    assert!(
        output.status.success(),
        "layloft report of the demo: {}\n{}",
        output.status,
        String::from_utf8_lossy(&output.stderr)
    );
    let page = dir.join("report.html");
    let html = fs::read_to_string(&page).unwrap();
    let ids: Vec<String> = html
        .match_indices("data-figure=\"")
        .map(|(i, m)| html[i + m.len()..].split('"').next().unwrap_or_default().to_string())
        .collect();
    for want in EXPECTED {
        assert!(ids.iter().any(|id| id == want), "figure {want} missing from {ids:?}");
    }
    assert!(ids.iter().filter(|id| id.starts_with("section-")).count() >= 3, "{ids:?}");
    let problems = static_problems(&html, &ids);
    assert!(problems.is_empty(), "static check:\n{}", problems.join("\n"));
    // Every file the report links to is there.
    for (i, m) in html.match_indices("href=\"") {
        let target = html[i + m.len()..].split('"').next().unwrap_or_default();
        if !target.starts_with('#') {
            assert!(dir.join(target).is_file(), "linked file {target} missing");
        }
    }

    let Some(browser) = browser_or_skip("the demo report") else { return };
    let shown = browser
        .render(&page, &screenshot_dir(), "demo-report", (1280, 16000))
        .unwrap_or_else(|e| panic!("{} could not render {}: {e}", browser.program, page.display()));
    assert!(shown.console.is_empty(), "console messages: {:#?}", shown.console);
    assert_eq!(shown.figures, ids, "figures with a drawing in the browser's DOM");
    assert!(shown.dom.contains("class=\"verdict verdict-pass\""));
}

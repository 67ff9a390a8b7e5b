//! The HTML report rendered in headless Chromium (skipped with a banner when Chromium is missing, unless `LAYLOFT_REQUIRE_BROWSER=1`).
//!
//! One test binary per purpose: each file named here is a module of it (see DEVELOPERS.md,
//! "Tests"). A new test file must be added to one of these lists; `laws` checks that none is left
//! out.

mod support_browser;
mod support_run;

#[path = "plybook_browser.rs"]
mod plybook_browser;
#[path = "report_browser.rs"]
mod report_browser;
#[path = "report_demo_browser.rs"]
mod report_demo_browser;
#[path = "report_labels_browser.rs"]
mod report_labels_browser;

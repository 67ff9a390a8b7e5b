//! The terminal output of `layloft check`.

use std::fmt::Write as _;

use super::words::{demand_text, found_text, place_text, verdict_text};
use crate::check::DesignCheck;
use crate::report::{Align, Table, cautions_text, not_covered_text};

/// The table of `layloft check`: the cautions, one row per criterion (demand, value found,
/// verdict, where), what the analysis does not cover, and the verdict as the last line.
pub fn check_text(
    project: &str,
    check: &DesignCheck,
    input_warnings: &[impl std::fmt::Display],
) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "layloft check — {project}");
    out.push_str(&cautions_text());
    let _ = writeln!(out);
    let mut t = Table::new(&[
        ("criterion", Align::Left),
        ("demand", Align::Right),
        ("found", Align::Right),
        ("verdict", Align::Left),
        ("where", Align::Left),
    ]);
    for r in &check.rows {
        t.row(vec![
            r.label.to_string(),
            demand_text(r),
            found_text(r),
            r.status.to_string(),
            place_text(&r.location),
        ]);
    }
    if t.is_empty() {
        let _ = writeln!(out, "The project sets no [criteria] and no load case: nothing checked.");
    } else {
        out.push_str(&t.render(2));
    }
    let _ = writeln!(out);
    out.push_str(&not_covered_text());
    // The verdict is the last line (nothing checked is not a pass).
    let _ = writeln!(out);
    let _ = writeln!(out, "{}", verdict_text(check, input_warnings));
    out
}

//! The design check as JSON: the full object of `layloft check --json` and the shorter
//! `check.json` of the report folder.

use serde_json::{Value, json};

use super::words::{place_text, shown_found, shown_limit, unit_key, unit_symbol};
use crate::check::{Bound, DesignCheck, Status};

/// The object of `layloft check --json`: every criterion with its limit, bound, value found
/// (`null` when not computed or infinite), unit, place and pass, the limit and value again
/// under keys that carry their unit, what the analysis does not cover and the cautions; the
/// project's input warnings when there are any; `"checked": false` when nothing was checked.
pub fn check_json(
    project: &str,
    check: &DesignCheck,
    input_warnings: &[impl std::fmt::Display],
) -> Value {
    let rows: Vec<Value> = check
        .rows
        .iter()
        .map(|r| {
            let found = shown_found(r).filter(|v| v.is_finite());
            let limit = shown_limit(r);
            let mut row = json!({
                "criterion": r.key,
                "label": r.label,
                "limit": limit,
                "bound": match r.bound { Bound::AtLeast => "at_least", Bound::AtMost => "at_most" },
                "found": found,
                "unit": unit_symbol(r),
                "where": place_text(&r.location),
                "pass": r.status == Status::Pass,
            });
            // The same limit and value under keys that carry their unit.
            row[format!("limit_{}", unit_key(r))] = json!(limit);
            row[format!("found_{}", unit_key(r))] = json!(found);
            row
        })
        .collect();
    let mut doc = json!({
        "project": project,
        "pass": check.passed(),
        "criteria": rows,
        "not_covered": crate::check::NOT_COVERED,
        "cautions": crate::CAUTIONS,
    });
    // Only when nothing was checked (`pass` is then false): a check without rows is no pass.
    if !check.checked() {
        doc["checked"] = json!(false);
    }
    // Only when there are any, so that the output of a project without them is unchanged.
    if !input_warnings.is_empty() {
        let words: Vec<String> = input_warnings.iter().map(ToString::to_string).collect();
        doc["input_warnings"] = json!(words);
    }
    doc
}

/// The `check.json` of the report folder: each criterion's limit, value found, unit, place and
/// pass.
pub fn check_file_json(project: &str, check: &DesignCheck) -> Value {
    let rows: Vec<Value> = check
        .rows
        .iter()
        .map(|r| {
            json!({
                "criterion": r.key, "limit": shown_limit(r),
                "found": shown_found(r).filter(|v| v.is_finite()), "unit": unit_symbol(r),
                "where": place_text(&r.location), "pass": r.status == Status::Pass,
            })
        })
        .collect();
    let mut doc = json!({ "project": project, "pass": check.passed(), "criteria": rows });
    if !check.checked() {
        doc["checked"] = json!(false);
    }
    doc
}

//! `layloft check`: the design check against the project's `[criteria]`, PASS or FAIL, with an
//! exit status a shop's own CI can use.

use std::fmt::Write as _;
use std::path::PathBuf;

use anyhow::anyhow;
use serde_json::json;

use layloft::check::{DesignCheck, Status, evaluate};
use layloft::report::{Align, Table};
use layloft::stress::{Detail, analyse_cases_detail};

use super::project::{load_model, run_modal};
use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft check layups/mine-fan/blade.toml
  layloft check layups/small-wind/blade.toml --json

Exit status: 0 when every criterion passes, 1 when any fails, 2 when the input is invalid
(3 when a computation fails). Criteria are those of the project's [criteria] table:
min_reserve_factor, min_buckling_factor (min_reserve_factor unless set), frequency_margin_pct,
max_mass_kg, max_tip_deflection_m. The check lists what the analysis does not cover.";

/// Checks the blade against the project's [criteria]: least reserve factor over every load
/// case, least buckling reserve factor of the wall panels, frequency margin to the rotor
/// harmonics, blade mass, tip deflection.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The blade project: its blade.toml, or the folder that holds it.
    #[arg(value_name = "PROJECT")]
    pub blade: PathBuf,

    /// Write one JSON object on stdout instead of the table.
    #[arg(long)]
    pub json: bool,
}

fn text(project: &layloft::project::Project, check: &DesignCheck) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "layloft check — {}", project.name);
    out.push_str(&layloft::report::cautions_text());
    let _ = writeln!(out);
    let mut t = Table::new(&[
        ("criterion", Align::Left),
        ("demand", Align::Right),
        ("found", Align::Right),
        ("verdict", Align::Left),
        ("where", Align::Left),
    ]);
    for r in &check.rows {
        let found = r.found_text();
        t.row(vec![
            r.label.to_string(),
            r.demand(),
            found,
            r.status.to_string(),
            r.location.clone(),
        ]);
    }
    if t.is_empty() {
        let _ = writeln!(out, "The project sets no [criteria]: nothing to check.");
        let _ = writeln!(out);
        out.push_str(&layloft::report::not_covered_text());
    } else {
        out.push_str(&t.render(2));
        let _ = writeln!(out);
        out.push_str(&layloft::report::not_covered_text());
        // The verdict is the last line.
        let _ = writeln!(out);
        let _ = writeln!(out, "{}", super::verdict(check, project));
    }
    out
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let model = load_model(&args.blade, out)?;
    let criteria = &model.project.criteria;
    let needs_stress = criteria.min_reserve_factor.is_some()
        || criteria.min_buckling_factor.is_some()
        || criteria.max_tip_deflection_m.is_some();
    let stress = if needs_stress && !model.project.load_cases.is_empty() {
        analyse_cases_detail(&model, None, Detail::Summary).map_err(layloft::Error::from)?
    } else {
        Vec::new()
    };
    let modal = match criteria.frequency_margin_pct {
        Some(_) => Some(run_modal(&model, out, None, None)?),
        None => None,
    };
    let check = evaluate(&model, &stress, modal.as_ref());
    if args.json {
        let rows: Vec<serde_json::Value> = check
            .rows
            .iter()
            .map(|r| {
                let found = r.found.filter(|v| v.is_finite());
                let mut row = json!({
                    "criterion": r.key,
                    "label": r.label,
                    "limit": r.limit,
                    "bound": match r.bound { layloft::check::Bound::AtLeast => "at_least", layloft::check::Bound::AtMost => "at_most" },
                    "found": found,
                    "unit": r.unit,
                    "where": r.location,
                    "pass": r.status == Status::Pass,
                });
                // The same limit and value under keys that carry their unit.
                row[format!("limit_{}", r.unit_key())] = json!(r.limit);
                row[format!("found_{}", r.unit_key())] = json!(found);
                row
            })
            .collect();
        let mut doc = json!({
            "project": model.project.name,
            "pass": check.passed(),
            "criteria": rows,
            "not_covered": layloft::check::NOT_COVERED,
            "cautions": layloft::CAUTIONS,
        });
        // Only when there are any, so that the output of a project without them is unchanged.
        if !model.project.input_warnings.is_empty() {
            doc["input_warnings"] = json!(model.project.input_warnings);
        }
        let text = serde_json::to_string_pretty(&doc)
            .map_err(|e| Failure::Run(anyhow!("cannot format the JSON report: {e}")))?;
        out.data(&text);
    } else {
        out.data(&text(&model.project, &check));
    }
    Ok(if check.passed() { Outcome::Success } else { Outcome::CheckFailed })
}

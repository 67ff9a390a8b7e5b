//! `layloft check`: the design check against the project's `[criteria]`, PASS or FAIL, with an
//! exit status a shop's own CI can use.

use std::path::PathBuf;

use anyhow::anyhow;
use layloft::check::evaluate;
use layloft::report::check::{check_json, check_text};
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

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let (model, sources) = load_model(&args.blade, out)?;
    let criteria = &model.project.criteria;
    // Strength and buckling are checked whenever there are load cases (see `evaluate`).
    let stress = if !model.project.load_cases.is_empty() {
        analyse_cases_detail(&model, None, Detail::Summary).map_err(layloft::Error::from)?
    } else {
        Vec::new()
    };
    let modal = match criteria.frequency_margin {
        Some(_) => Some(run_modal(&model, &sources, out, None, None)?),
        None => None,
    };
    let check = evaluate(&model, &stress, modal.as_ref());
    let p = &model.project;
    let warnings = model.verdict_warning_texts(&sources.warnings);
    if args.json {
        let doc = check_json(&p.name, &check, &warnings);
        let text = layloft::report::json_pretty(doc)
            .map_err(|e| Failure::Run(anyhow!("cannot format the JSON report: {e}")))?;
        out.data(&text);
    } else {
        out.data(&check_text(&p.name, &check, &warnings));
    }
    Ok(if check.passed() { Outcome::Success } else { Outcome::CheckFailed })
}

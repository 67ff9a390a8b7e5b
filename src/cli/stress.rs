//! `layloft stress`: ply stresses along the blade and the lowest reserve factor of each load case.

use std::path::PathBuf;

use anyhow::anyhow;

use layloft::report::{
    buckling_warning, ply_failure_warning, stress_csv, stress_json, stress_svg, stress_text,
    write_atomic,
};
use layloft::stress::analyse_cases;

use super::project::load_model;
use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft stress layups/mine-fan/blade.toml
  layloft stress layups/mine-fan/blade.toml --case overspeed --json
  layloft stress layups/small-wind/blade.toml --csv plies.csv --svg reserve-map.svg
  layloft stress layups/mine-fan/blade.toml --buckling-svg buckling-map.svg

The reserve factor is the strength ratio of the governing criterion (Tsai-Wu, maximum stress,
maximum strain, Hashin) at the factored load: the factor on the case's factored loads that brings
the first ply to failure. Every wall panel is also checked for local buckling (and, for a
sandwich wall, face wrinkling, shear crimping and core shear); edge fixity from [buckling].
Exit status 1 when a case's reserve factor is below 1 (a ply fails under the factored load)
or a panel's buckling reserve factor is below 1.";

/// Ply stresses at every station, wall point and ply for every load case; the lowest reserve
/// factor of each case with where it occurs; root reactions and the pitching moment over the
/// pitch range.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The blade project: its blade.toml, or the folder that holds it.
    #[arg(value_name = "PROJECT")]
    pub blade: PathBuf,

    /// Only this load case.
    #[arg(long, value_name = "NAME")]
    pub case: Option<String>,

    /// Write one JSON object on stdout (SI units in every key) instead of the summary.
    #[arg(long)]
    pub json: bool,

    /// Also write the worst value of every ply at every station as CSV to FILE.
    #[arg(long, value_name = "FILE")]
    pub csv: Option<PathBuf>,

    /// Also write the map of the worst reserve factor over span and contour as SVG to FILE.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,

    /// Also write the map of the buckling reserve factor of every wall panel as SVG to FILE.
    #[arg(long, value_name = "FILE")]
    pub buckling_svg: Option<PathBuf>,
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let (model, sources) = load_model(&args.blade, out)?;
    if model.project.load_cases.is_empty() {
        return Err(Failure::Input(anyhow!(
            "{}: the project has no [[load_case]] tables: nothing to check",
            sources.file
        )));
    }
    let cases = analyse_cases(&model, args.case.as_deref()).map_err(layloft::Error::from)?;
    if let Some(path) = &args.csv {
        write_atomic(path, stress_csv(&cases).as_bytes())?;
    }
    if let Some(path) = &args.svg {
        write_atomic(path, stress_svg(&model, &cases).as_bytes())?;
    }
    if let Some(path) = &args.buckling_svg {
        write_atomic(path, layloft::report::buckling_svg(&model, &cases).as_bytes())?;
    }
    if args.json {
        let text = layloft::report::json_pretty(stress_json(&model, &cases))
            .map_err(|e| Failure::Run(anyhow!("cannot format the JSON report: {e}")))?;
        out.data(&text);
    } else {
        out.data(&stress_text(&model, &cases));
    }
    let buckling = buckling_warning(&cases);
    if let Some(text) = &buckling {
        out.warn(text);
    }
    match ply_failure_warning(&cases) {
        None if buckling.is_none() => Ok(Outcome::Success),
        failing => {
            if let Some(text) = failing {
                out.warn(&text);
            }
            Ok(Outcome::CheckFailed)
        }
    }
}

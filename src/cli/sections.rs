//! `layloft sections`: stiffness, centres and mass properties of the blade's sections.
//!
//! The arguments are turned into a checked [`Config`] first (project read, `--at` radii parsed
//! and checked against the blade), then the sections are solved, the files asked for are written
//! (atomically) and the report is printed. Exit status 0, 2 for bad input, 3 when a file cannot
//! be written.

use std::path::{Path, PathBuf};

use anyhow::anyhow;

use layloft::analysis::BladeModel;
use layloft::input::{Sources, read_project_sourced};
use layloft::project::Project;
use layloft::report::{
    SectionsReport, section_svg, section_svg_names, write_atomic, write_atomic_with,
};

use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft sections layups/mine-fan/blade.toml
  layloft sections layups/mine-fan/blade.toml --json > sections.json
  layloft sections layups/small-wind --at 0.5,1.2,2.0 --svg drawings --csv sections.csv

Without --at the sections are solved at the project's analysis stations ([sections] in
blade.toml). --svg writes one drawing per section, named section-r0.600.svg for r = 0.6 m
(radius in metres, three decimals), and creates the folder when it does not exist. The CSV has
one row per station with the unit in every column name (r_m, EA_N, EI_flap_Nm2, ...).";

/// Section stiffness, centres and mass properties along the blade.
///
/// EA, EI flap/edge/cross, GJ, the coupling terms, the 4x4 stiffness, principal bending axes,
/// elastic, shear and mass centres, mass and mass moments of inertia per length, by thin-walled
/// section theory on the lofted blade and its ply schedule; optional CSV and to-scale drawings.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The blade project: its blade.toml, or the folder that holds it.
    #[arg(value_name = "PROJECT")]
    pub project: PathBuf,

    /// Write one JSON object on stdout (SI units in every key) instead of the summary.
    #[arg(long)]
    pub json: bool,

    /// Also write one CSV row per station to FILE (units in every column name).
    #[arg(long, value_name = "FILE")]
    pub csv: Option<PathBuf>,

    /// Solve at these radii (m, from the rotor axis) instead of the analysis stations, e.g.
    /// '0.5,0.75'.
    #[arg(long, value_name = "R1,R2,...", allow_hyphen_values = true)]
    pub at: Option<String>,

    /// Also write a to-scale SVG drawing of each section into DIR (created if missing).
    #[arg(long, value_name = "DIR")]
    pub svg: Option<PathBuf>,
}

/// The checked request.
struct Config {
    project: Project,
    sources: Sources,
    radii: Option<Vec<f64>>,
}

/// Radii from the value of `--at`: numbers in m separated by commas.
fn parse_radii(text: &str) -> Result<Vec<f64>, String> {
    let expected = "expected radii in m separated by commas, such as --at 0.5,0.75";
    if text.trim().is_empty() {
        return Err(format!("--at: {expected}; found nothing"));
    }
    text.split(',')
        .enumerate()
        .map(|(i, item)| {
            let item = item.trim();
            if item.is_empty() {
                return Err(format!("--at: item {} is empty; {expected}", i + 1));
            }
            match item.parse::<f64>() {
                Ok(r) if r.is_finite() => Ok(r),
                Ok(_) => Err(format!("--at: '{item}' is not a finite radius; {expected}")),
                Err(_) => Err(format!("--at: '{item}' is not a number; {expected}")),
            }
        })
        .collect()
}

fn configure(args: &Args) -> Result<Config, Failure> {
    let radii =
        args.at.as_deref().map(parse_radii).transpose().map_err(|e| Failure::Input(anyhow!(e)))?;
    let (project, sources) = read_project_sourced(&args.project).map_err(layloft::Error::from)?;
    if let (Some(radii), Some(root), Some(tip)) =
        (&radii, project.stations.first(), project.stations.last())
    {
        let (root, tip) = (root.r, tip.r);
        if let Some(r) = radii.iter().find(|&&r| r < root - 1e-9 || r > tip + 1e-9) {
            return Err(Failure::Input(anyhow!(
                "--at: r = {r} m is outside the blade, which runs from r = {root} m to r = {tip} m \
                 (the first and last stations in {})",
                sources.files.stations
            )));
        }
    }
    Ok(Config { project, sources, radii })
}

/// Writes one drawing per station into `dir`, creating it; returns the number written.
fn write_drawings(model: &BladeModel, dir: &Path) -> Result<usize, Failure> {
    layloft::report::ensure_folder(dir)
        .map_err(|e| Failure::Run(anyhow!("--svg {}: {e}", dir.display())))?;
    let names = section_svg_names(&model.radii());
    for (st, name) in model.stations.iter().zip(&names) {
        let svg = section_svg(&model.project.name, &model.blade, st);
        write_atomic(&dir.join(name), svg.as_bytes())?;
    }
    Ok(names.len())
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let config = configure(&args)?;
    let sources = config.sources;
    let model = match &config.radii {
        Some(radii) => BladeModel::build_at(config.project, radii),
        None => BladeModel::build(config.project),
    }
    .map_err(|e| layloft::Error::placed(e, &sources))?;
    let mut report = SectionsReport::new(&model);
    // The input's warnings first, as the reader keeps them apart from the model.
    report.warnings = model.warnings_with(&sources.warnings);
    if let Some(path) = &args.csv {
        let folder = path.parent().filter(|p| !p.as_os_str().is_empty()).unwrap_or(Path::new("."));
        if folder.exists() && !folder.is_dir() {
            return Err(Failure::Run(anyhow!(
                "--csv {}: {} is a file, not a folder",
                path.display(),
                folder.display()
            )));
        }
        if !folder.is_dir() {
            return Err(Failure::Run(anyhow!(
                "--csv {}: the folder {} does not exist",
                path.display(),
                folder.display()
            )));
        }
        write_atomic_with(path, |w| report.write_csv(w))?;
        out.note(&format!("wrote {} ({} stations)", path.display(), model.stations.len()));
    }
    if let Some(dir) = &args.svg {
        let count = write_drawings(&model, dir)?;
        out.note(&format!("wrote {count} section drawings into {}", dir.display()));
    }
    if args.json {
        let text = layloft::report::json_pretty(report.to_json())
            .map_err(|e| Failure::Run(anyhow!("cannot format the JSON report: {e}")))?;
        out.data(&text);
        for w in &report.warnings {
            out.warn(&w.to_string());
        }
    } else {
        out.data(&report.to_text());
    }
    Ok(Outcome::Success)
}

//! `layloft demo`: the whole job on a built-in demo blade, end to end, in one command.
//!
//! The demo projects live under `layups/` in the checkout; they are also built into the binary,
//! so that the command works from anywhere (the built-in copy is unpacked into a temporary folder
//! when `layups/NAME/blade.toml` is not found from the working folder).

use std::path::{Path, PathBuf};

use anyhow::anyhow;

use super::project::load_model;
use super::report::{Destination, write_report};
use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft demo                       # the mine-fan demo: report/ and meshes/ here
  layloft demo --blade small-wind --out wind-report

Both demos are invented scenarios (see layups/*/README.md). The report is report/report.html
(open it in a browser) and the tooling STL files are in meshes/; with --out DIR they go to DIR and
DIR/meshes.";

/// A built-in demo project: its folder name and files.
struct Demo {
    name: &'static str,
    files: &'static [(&'static str, &'static str)],
}

const DEMOS: [Demo; 2] = [
    Demo {
        name: "mine-fan",
        files: &[
            ("blade.toml", include_str!("../../layups/mine-fan/blade.toml")),
            ("stations.csv", include_str!("../../layups/mine-fan/stations.csv")),
            ("plies.csv", include_str!("../../layups/mine-fan/plies.csv")),
            ("materials.toml", include_str!("../../layups/mine-fan/materials.toml")),
            ("loads-nominal.csv", include_str!("../../layups/mine-fan/loads-nominal.csv")),
            ("loads-overspeed.csv", include_str!("../../layups/mine-fan/loads-overspeed.csv")),
            ("loads-surge.csv", include_str!("../../layups/mine-fan/loads-surge.csv")),
            ("tip-section.dat", include_str!("../../layups/mine-fan/tip-section.dat")),
        ],
    },
    Demo {
        name: "small-wind",
        files: &[
            ("blade.toml", include_str!("../../layups/small-wind/blade.toml")),
            ("stations.csv", include_str!("../../layups/small-wind/stations.csv")),
            ("plies.csv", include_str!("../../layups/small-wind/plies.csv")),
            ("materials.toml", include_str!("../../layups/small-wind/materials.toml")),
            ("loads-rated.csv", include_str!("../../layups/small-wind/loads-rated.csv")),
            ("loads-storm.csv", include_str!("../../layups/small-wind/loads-storm.csv")),
        ],
    },
];

/// Runs a built-in demo end to end: sections, stresses, modes, the design check and the report.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// Which demo: mine-fan (a ducted mine ventilation fan of 1.8 m rotor diameter) or
    /// small-wind (a small wind turbine of 5 m rotor diameter).
    #[arg(long, value_name = "NAME", default_value = "mine-fan")]
    pub blade: String,

    /// Folder for the report and its files (report/ in the working folder by default; the STL
    /// files then go to meshes/, else to DIR/meshes).
    #[arg(long, value_name = "DIR")]
    pub out: Option<PathBuf>,
}

/// The demo's `blade.toml`: the checkout's copy when there is one, else the built-in copy
/// unpacked into `scratch`.
fn locate(demo: &Demo, scratch: &Path) -> Result<PathBuf, Failure> {
    let here = Path::new("layups").join(demo.name).join("blade.toml");
    if here.is_file() {
        return Ok(here);
    }
    let dir = scratch.join(demo.name);
    std::fs::create_dir_all(&dir)
        .map_err(|e| Failure::Run(anyhow!("cannot unpack the demo into {}: {e}", dir.display())))?;
    for (name, text) in demo.files {
        std::fs::write(dir.join(name), text)
            .map_err(|e| Failure::Run(anyhow!("cannot unpack the demo file {name}: {e}")))?;
    }
    Ok(dir.join("blade.toml"))
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let demo = DEMOS.iter().find(|d| d.name == args.blade).ok_or_else(|| {
        let names: Vec<&str> = DEMOS.iter().map(|d| d.name).collect();
        Failure::Input(anyhow!(
            "--blade '{}': no such demo; the demos are {}",
            args.blade,
            names.join(", ")
        ))
    })?;
    let dest = match args.out {
        Some(dir) => Destination { meshes: dir.join("meshes"), out: dir },
        None => Destination { out: PathBuf::from("report"), meshes: PathBuf::from("meshes") },
    };
    // The built-in copy is unpacked inside the output folder, so that nothing is left elsewhere
    // when the run is killed; the folder is removed as soon as the project has been read.
    layloft::report::ensure_folder(&dest.out)?;
    let scratch =
        tempfile::Builder::new().prefix(".layloft-demo-").tempdir_in(&dest.out).map_err(|e| {
            Failure::Run(anyhow!("cannot make a scratch folder in {}: {e}", dest.out.display()))
        })?;
    let blade = locate(demo, scratch.path())?;
    let built_in = !blade.starts_with("layups");
    let shown = if built_in {
        format!("layups/{}/blade.toml (built-in copy)", demo.name)
    } else {
        blade.display().to_string()
    };
    out.note(&format!("demo '{}' (invented scenario) from {shown}", demo.name));
    let (model, mut sources) = load_model(&blade, out)?;
    drop(scratch);
    if built_in {
        sources.file = shown;
    }
    let check = write_report(&model, &sources, &dest, out)?;
    out.note(&format!("open {} in a browser", dest.out.join("report.html").display()));
    out.data(&super::verdict(&check, &model, &sources));
    let passed = check.passed();
    Ok(if passed { Outcome::Success } else { Outcome::CheckFailed })
}

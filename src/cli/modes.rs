//! `layloft modes`: natural frequencies of the spinning blade, the Campbell diagram, crossings
//! with the rotor harmonics and the margins at nominal and maximum speed.

use std::path::PathBuf;

use anyhow::anyhow;

use layloft::modal::SpeedRange;
use layloft::output::export_matrix_market;
use layloft::report::{
    campbell_csv, campbell_svg, modal_analysis_json, modal_text, mode_shapes_csv, rpm_text,
    write_atomic,
};
use layloft::units::{RotorSpeed, rpm_of};

use super::project::{load_model, run_modal};
use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft modes layups/mine-fan/blade.toml
  layloft modes layups/mine-fan/blade.toml --rpm 0:1200:20 --modes 6 --svg campbell.svg
  layloft modes layups/small-wind/blade.toml --json --shapes shapes.csv --export-matrices mtx/

Excitations are the rotor orders nP (n = 1 to [criteria] harmonics) and the blade-passing
orders; the margin of a mode is |f - f_excitation| / f_excitation of its nearest excitation.
Exit status 1 when a mode lies within the required margin ([criteria] frequency_margin_pct).";

/// Rotating-blade modes over the speed range, tracked into Campbell curves; crossings and
/// margins to the rotor harmonics.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The blade project: its blade.toml, or the folder that holds it.
    #[arg(value_name = "PROJECT")]
    pub blade: PathBuf,

    /// Speed sweep FROM:TO:STEP in rpm (0 to the rotor's rpm_max by default).
    #[arg(long, value_name = "FROM:TO:STEP", allow_hyphen_values = true)]
    pub rpm: Option<String>,

    /// Number of modes at each speed ([modal] modes by default).
    #[arg(long, value_name = "N")]
    pub modes: Option<usize>,

    /// Write one JSON object on stdout (SI units in every key) instead of the summary.
    #[arg(long)]
    pub json: bool,

    /// Also write the Campbell diagram as SVG to FILE.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,

    /// Also write the Campbell data (one row per speed and mode) as CSV to FILE.
    #[arg(long, value_name = "FILE")]
    pub csv: Option<PathBuf>,

    /// Also write the mode shapes at the nominal speed as CSV to FILE.
    #[arg(long, value_name = "FILE")]
    pub shapes: Option<PathBuf>,

    /// Write the constrained stiffness and mass matrices (Matrix Market) to DIR.
    #[arg(long = "export-matrices", value_name = "DIR")]
    pub export_matrices: Option<PathBuf>,

    /// Speed of the exported matrices, rpm (the nominal speed by default).
    #[arg(long = "matrices-rpm", value_name = "RPM", requires = "export_matrices")]
    pub matrices_rpm: Option<f64>,
}

fn parse_range(text: &str) -> Result<SpeedRange, Failure> {
    let parts: Vec<&str> = text.split(':').collect();
    let bad =
        || Failure::Input(anyhow!("--rpm '{text}': expected FROM:TO:STEP in rpm, e.g. 0:1200:20"));
    if parts.len() != 3 {
        return Err(bad());
    }
    let v: Vec<f64> = parts
        .iter()
        .map(|p| p.trim().parse::<f64>().ok().filter(|x| x.is_finite()))
        .collect::<Option<_>>()
        .ok_or_else(bad)?;
    let [from, to, step] = [v[0], v[1], v[2]].map(RotorSpeed::from_rpm);
    SpeedRange::new(from, to, step).map_err(|e| Failure::Input(anyhow!("--rpm '{text}': {e}")))
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let range = args.rpm.as_deref().map(parse_range).transpose()?;
    if let Some(n) = args.modes
        && !(1..=layloft::input::limits::MAX_MODES).contains(&n)
    {
        return Err(Failure::Input(anyhow!(
            "--modes: expected 1 to {} modes, found {n}",
            layloft::input::limits::MAX_MODES
        )));
    }
    let (model, sources) = load_model(&args.blade, out)?;
    let p = &model.project;
    // The bounds the project's own sweep keeps (`rotor.rpm_max`, `modal.rpm_step`) hold for a
    // sweep given here too: a tip speed a blade can reach, a number of eigen solutions in reason.
    if let Some(r) = &range {
        use layloft::input::limits::{sweep_excess, tip_speed_excess};
        let to = r.to.rpm();
        let words = tip_speed_excess(&to.to_string(), to, p.rotor.tip_radius)
            .or_else(|| sweep_excess(r.step.rpm(), to - r.from.rpm(), ""));
        if let Some(words) = words {
            return Err(Failure::Input(anyhow!("--rpm: {words}")));
        }
    }
    // As the project's `modal.modes`: no more modes than the beam elements resolve.
    if let Some(n) = args.modes
        && n > p.modal.elements
    {
        return Err(Failure::Input(anyhow!(
            "--modes: expected at most {} modes (no more than the {} beam elements of [modal] \
             elements resolve), found {n}",
            p.modal.elements,
            p.modal.elements
        )));
    }
    let analysis = run_modal(&model, &sources, out, range, args.modes)?;
    // A sweep of its own (`--rpm`) that leaves out a design speed checks no margin there: say so,
    // rather than let a missing margin pass for a clear one.
    let outside: Vec<String> = p
        .rotor
        .design_speeds()
        .into_iter()
        .filter(|(name, _)| !analysis.margins.iter().any(|m| m.name == *name))
        .map(|(name, w)| format!("the {name} speed ({} rpm)", rpm_text(rpm_of(w))))
        .collect();
    if !outside.is_empty() {
        out.warn(&format!(
            "the sweep from {} to {} rpm does not reach {}: no frequency margin is checked there \
             (sweep a range that holds it, or leave out --rpm)",
            rpm_text(analysis.range.from.rpm()),
            rpm_text(analysis.range.to.rpm()),
            outside.join(" or ")
        ));
    }
    let title = format!("Campbell diagram — {}", p.name);
    let rpm_nominal = rpm_of(p.rotor.omega_nominal);
    if let Some(path) = &args.svg {
        let svg = campbell_svg(
            &analysis.campbell,
            &analysis.excitations,
            &analysis.crossings,
            (rpm_of(p.rotor.omega_min), rpm_of(p.rotor.omega_max)),
            &title,
        );
        write_atomic(path, svg.as_bytes())?;
    }
    if let Some(path) = &args.csv {
        write_atomic(path, campbell_csv(&analysis.campbell).as_bytes())?;
    }
    if let Some(path) = &args.shapes {
        let nominal = RotorSpeed::from_rad_s(p.rotor.omega_nominal);
        let set = match analysis.at_speed(nominal) {
            Some(set) => set.clone(),
            None => analysis
                .model
                .modes(nominal, args.modes.unwrap_or(p.modal.modes))
                .map_err(layloft::Error::from)?,
        };
        write_atomic(path, mode_shapes_csv(&set).as_bytes())?;
    }
    if let Some(dir) = &args.export_matrices {
        let rpm = args.matrices_rpm.unwrap_or(rpm_nominal);
        let m = analysis
            .model
            .system_matrices(RotorSpeed::from_rpm(rpm))
            .map_err(layloft::Error::from)?;
        let files = export_matrix_market(dir, &m)?;
        out.note(&format!(
            "wrote {} files to {} (matrices at {rpm} rpm)",
            files.len(),
            dir.display()
        ));
    }
    if args.json {
        let json = modal_analysis_json(&analysis);
        let text = layloft::report::json_pretty(json)
            .map_err(|e| Failure::Run(anyhow!("cannot format the JSON report: {e}")))?;
        out.data(&text);
    } else {
        out.data(&modal_text(&p.name, &analysis));
    }
    match analysis.pass() {
        Some(false) => {
            out.warn("a mode lies within the required frequency margin of an excitation");
            Ok(Outcome::CheckFailed)
        }
        _ => Ok(Outcome::Success),
    }
}

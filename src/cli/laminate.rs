//! `layloft laminate`: stiffness, ply stresses and first-ply failure of one laminate.
//!
//! The arguments are turned into a checked [`Config`] first (materials read, code parsed, load
//! parsed), then the report is computed and printed. Exit status 1 when the given load already
//! fails a ply (first-ply load multiplier below 1).

use std::path::PathBuf;

use anyhow::anyhow;
use nalgebra::Vector3;

use layloft::laminate::{Deformation, Laminate, LaminateLoad, LayupCode, Resultants};
use layloft::material::{MaterialError, MaterialLibrary};
use layloft::report::LaminateReport;
use layloft::units::MM;

use super::pairs::parse_pairs;
use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft laminate --materials layups/mine-fan/materials.toml --material carbon-ud \\
      --layup '[0/±45/90]s' --load Nx=120e3,Mx=15
  layloft laminate --materials layups/mine-fan/materials.toml \\
      --layup '[0:carbon-ud/±45:glass-biax/0:carbon-ud]s' --load Nx=80e3,Nxy=20e3 \\
      --delta-t -100 --json

Plies are listed from the outer face inward (ply 1 is the outer face). The load multiplier is
the factor on the given mechanical load at which a ply first fails; residual thermal stresses
from --delta-t are held fixed. Exit status 1 when the given load already fails a ply.";

const LOAD_KEYS: [&str; 6] = ["Nx", "Ny", "Nxy", "Mx", "My", "Mxy"];
const STRAIN_KEYS: [&str; 6] = ["ex", "ey", "gxy", "kx", "ky", "kxy"];

/// Stiffness (A, B, D, engineering constants), ply stresses and strength ratios by Tsai-Wu,
/// maximum stress, maximum strain and Hashin, and the first-ply failure of one laminate.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The materials file (TOML with [lamina.NAME] and [isotropic.NAME] tables).
    #[arg(long, value_name = "FILE")]
    pub materials: PathBuf,

    /// Material of every ply the code does not name ('0:glass-ud' names one per ply).
    #[arg(long, value_name = "NAME")]
    pub material: Option<String>,

    /// Laminate code, outer face first: '[0/±45/90]s', '[0/90]2s', '[±45]3', '[(0/90)2/45]s',
    /// '[0/45/-45/90]T', or a ply-by-ply hybrid '[0:carbon-ud/45:glass-biax/0:carbon-ud]T'.
    #[arg(long, value_name = "CODE", allow_hyphen_values = true)]
    pub layup: String,

    /// Force resultants in N/m and moment resultants in N·m/m, e.g. 'Nx=1000,Mx=2.5'; keys Nx Ny
    /// Nxy Mx My Mxy, those left out are zero.
    #[arg(long, value_name = "LIST", allow_hyphen_values = true, conflicts_with = "strains")]
    pub load: Option<String>,

    /// Midplane strains (m/m) and curvatures (1/m) instead of a load, e.g. 'ex=0.002,kx=0.5';
    /// keys ex ey gxy kx ky kxy (gxy is the engineering shear strain), those left out are zero.
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    pub strains: Option<String>,

    /// Uniform temperature change in K: service less stress-free temperature (cooling from a
    /// 120 °C cure to 20 °C is -100). Needs CTEs for every ply material.
    #[arg(long = "delta-t", value_name = "K", allow_hyphen_values = true)]
    pub delta_t: Option<String>,

    /// Thickness of every ply in mm, in place of the materials' cured ply thickness.
    #[arg(long = "ply-thickness-mm", value_name = "MM", allow_hyphen_values = true)]
    pub ply_thickness_mm: Option<String>,

    /// Write one JSON object on stdout (SI units in every key) instead of the summary.
    #[arg(long)]
    pub json: bool,
}

/// The checked request.
struct Config {
    code: LayupCode,
    laminate: Laminate,
    load: Option<LaminateLoad>,
    delta_t: f64,
    json: bool,
}

fn number(option: &str, text: &str) -> Result<f64, Failure> {
    match text.trim().parse::<f64>() {
        Ok(x) if x.is_finite() => Ok(x),
        _ => Err(Failure::Input(anyhow!("{option}: '{text}' is not a finite number"))),
    }
}

fn material_context(e: MaterialError, file: &str, option: &str, value: &str) -> Failure {
    let message = match &e {
        MaterialError::Unknown { name, hint } => format!(
            "{option} '{value}': no material named '{name}' in {file}{}",
            hint.as_ref().map(|h| format!("; did you mean '{h}'?")).unwrap_or_default()
        ),
        MaterialError::NotAPly { .. } => format!("{option} '{value}': {file}: {e}"),
        _ => format!("{file}: {e}"),
    };
    Failure::Input(anyhow!(message))
}

/// The greatest magnitude of each key of `--load` (N/m for forces, N·m/m for moments) and of
/// `--strains` (strains, 1/m for curvatures): far beyond any laminate (a force of 1e9 N/m is
/// 100 GPa through 10 mm, a moment of 1e7 N·m/m as much at the faces of 25 mm; a strain of 1 is
/// a doubling), so that a value beyond them is a slip of the keyboard, not a load case.
const LOAD_LIMITS: [f64; 6] = [1e9, 1e9, 1e9, 1e7, 1e7, 1e7];
const STRAIN_LIMITS: [f64; 6] = [1.0, 1.0, 1.0, 1e4, 1e4, 1e4];

/// The least and greatest temperature change, K (as `delta_T_K` in a project).
const DELTA_T_LIMIT: f64 = 400.0;

/// `values` against `limits`, key by key.
fn within(
    option: &str,
    keys: &[&str],
    values: &[f64],
    limits: &[f64],
    units: [&str; 2],
) -> Result<(), Failure> {
    for (k, (&v, &limit)) in values.iter().zip(limits).enumerate() {
        if v.abs() > limit {
            let unit = units[k / 3];
            return Err(Failure::Input(anyhow!(
                "{option}: {} = {v:e}{unit} lies beyond ±{limit:e}{unit}; expected a value a \
                 laminate can meet",
                keys[k]
            )));
        }
    }
    Ok(())
}

fn load_from(args: &Args) -> Result<Option<LaminateLoad>, Failure> {
    let bad = |e: String| Failure::Input(anyhow!(e));
    if let Some(text) = &args.load {
        let v = parse_pairs("--load", text, &LOAD_KEYS).map_err(bad)?;
        within("--load", &LOAD_KEYS, &v, &LOAD_LIMITS, [" N/m", " N·m/m"])?;
        return Ok(Some(LaminateLoad::Resultants(Resultants {
            n: Vector3::new(v[0], v[1], v[2]),
            m: Vector3::new(v[3], v[4], v[5]),
        })));
    }
    if let Some(text) = &args.strains {
        let v = parse_pairs("--strains", text, &STRAIN_KEYS).map_err(bad)?;
        within("--strains", &STRAIN_KEYS, &v, &STRAIN_LIMITS, ["", " 1/m"])?;
        return Ok(Some(LaminateLoad::Deformation(Deformation {
            strain: Vector3::new(v[0], v[1], v[2]),
            curvature: Vector3::new(v[3], v[4], v[5]),
        })));
    }
    Ok(None)
}

fn configure(args: &Args) -> Result<Config, Failure> {
    let file = args.materials.display().to_string();
    let library: MaterialLibrary =
        layloft::input::read_materials(&args.materials).map_err(layloft::Error::from)?;
    let code: LayupCode = args.layup.parse().map_err(layloft::Error::from)?;
    if let Some(name) = &args.material {
        library.get(name).map_err(|e| material_context(e, &file, "--material", name))?;
    }
    let mut laminate =
        Laminate::from_code_in(&code, &library, args.material.as_deref()).map_err(|e| match e {
            layloft::laminate::LaminateError::Material(m) => {
                material_context(m, &file, "--layup", &args.layup)
            }
            other => Failure::Input(layloft::Error::from(other).into()),
        })?;
    if let Some(text) = &args.ply_thickness_mm {
        let t = number("--ply-thickness-mm", text)?;
        if t <= 0.0 {
            return Err(Failure::Input(anyhow!(
                "--ply-thickness-mm: expected a positive thickness in mm, found {text}"
            )));
        }
        laminate = laminate.with_ply_thickness(t * MM);
    }
    let delta_t = match &args.delta_t {
        Some(text) => number("--delta-t", text)?,
        None => 0.0,
    };
    if delta_t.abs() > DELTA_T_LIMIT {
        return Err(Failure::Input(anyhow!(
            "--delta-t: expected a temperature change within ±{DELTA_T_LIMIT} K (as delta_T_K \
             in a project), found {delta_t} K"
        )));
    }
    if delta_t != 0.0 {
        if let Some(p) = laminate.plies().iter().find(|p| p.material.cte.is_none()) {
            return Err(Failure::Input(anyhow!(
                "--delta-t {}: material '{}' has no thermal expansion coefficients in {file} \
                 (a1_ustrain_K and a2_ustrain_K for a lamina, cte_ustrain_K for an isotropic record)",
                args.delta_t.as_deref().unwrap_or_default(),
                p.material.name
            )));
        }
    }
    let load = load_from(args)?;
    Ok(Config { code, laminate, load, delta_t, json: args.json })
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let config = configure(&args)?;
    let report =
        LaminateReport::new(config.code.as_str(), config.laminate, config.load, config.delta_t)
            .map_err(|e| Failure::Input(layloft::Error::from(e).into()))?;
    if config.json {
        let text = layloft::report::json_pretty(report.to_json())
            .map_err(|e| Failure::Run(anyhow!("cannot format the JSON report: {e}")))?;
        out.data(&text);
    } else {
        out.data(&report.to_text());
    }
    match report.first_ply_failure() {
        Some(f) if f.strength.ratio < 1.0 => {
            out.warn(&format!(
                "the given load fails ply {} (load multiplier {:.3} by {})",
                f.ply + 1,
                f.strength.ratio,
                f.criterion.label()
            ));
            Ok(Outcome::CheckFailed)
        }
        _ => Ok(Outcome::Success),
    }
}

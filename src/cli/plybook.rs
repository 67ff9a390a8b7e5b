//! `layloft plybook`: every ply of the schedule as a flat pattern (DXF and SVG, true scale),
//! the patterns nested on each material's roll, and the kit (lay-up order, areas, masses, cost)
//! as CSV and JSON, written into one folder as one set.
//!
//! Exit status: 2 for input the ply book cannot use (a ply region with no area, a roll
//! narrower than a pattern, named with the ply and the key); 3 when a file cannot be written or
//! a computation fails.

use std::path::PathBuf;

use anyhow::anyhow;

use layloft::input::Sources;
use layloft::plybook::{PlyBookError, PlyBookParams, build_ply_book, plybook_files, plybook_json};
use layloft::report::{FileSet, plybook_error_text};

use super::project::load_model;
use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft plybook layups/small-wind/blade.toml --out plybook
  layloft plybook layups/small-wind --out plybook --json

Writes into the folder: plies/NAME.dxf and plies/NAME.svg for every pattern (true scale in
millimetres: outline, fibre arrow, label, a notch at the root end; seen from the mould side),
sheet-MATERIAL.svg (all patterns of a material) and nesting-MATERIAL.svg (the patterns nested on
the roll), kit.csv (lay-up order, outer mould line first) and plybook.json. The set replaces
the one an earlier run wrote in the folder; other files are left alone. A woven or stitched
fabric that shears past its locking_angle_deg is warned of with the place: it will wrinkle
there unless the ply is split or darted.";

/// Flat patterns of every ply, nested on the roll, with the kit and the draping check.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The blade project: its blade.toml, or the folder that holds it.
    #[arg(value_name = "PROJECT")]
    pub project: PathBuf,

    /// Folder for the ply book (created when missing).
    #[arg(long, value_name = "DIR")]
    pub out: PathBuf,

    /// Print the ply book as one JSON object on stdout (SI units in every key).
    #[arg(long)]
    pub json: bool,
}

/// Maps a ply-book error to its exit status: the user's input (2) or a computation (3).
/// The error is named in the project's files (`sources`).
pub(crate) fn failure(e: PlyBookError, sources: &Sources) -> Failure {
    let text = plybook_error_text(&e, sources);
    match e {
        PlyBookError::Drape { .. } | PlyBookError::Output { .. } => {
            Failure::Run(anyhow!(text).context("the ply book cannot be made"))
        }
        _ => Failure::Input(anyhow!(text)),
    }
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let (model, sources) = load_model(&args.project, out)?;
    let bar = out.progress(1, "ply book");
    let book = build_ply_book(&model.blade, &model.project, &PlyBookParams::default())
        .map_err(|e| failure(e, &sources))?;
    bar.finish();
    let laminate_kg = model.mass().laminate_kg;
    let words = layloft::report::plybook_warnings(&book);
    let files = plybook_files(&book, Some(laminate_kg), &sources.ply_lines, &words)
        .map_err(|e| failure(e, &sources))?;
    let mut set = FileSet::new();
    for (path, bytes) in files {
        set.add(path, bytes);
    }
    layloft::report::ensure_folder(&args.out).map_err(|e| Failure::Run(e.into()))?;
    set.commit(&args.out).map_err(|e| Failure::Run(e.into()))?;
    for w in &words {
        out.warn(w);
    }
    for e in &book.failed {
        out.warn(&plybook_error_text(e, &sources));
    }
    if args.json {
        let json = layloft::report::json_pretty(plybook_json(
            &book,
            Some(laminate_kg),
            &sources.ply_lines,
            &words,
        ))
        .map_err(|e| Failure::Run(anyhow!("cannot format the ply book as JSON: {e}")))?;
        out.data(&json);
    } else {
        out.data(&kit_text(&book, laminate_kg));
    }
    out.note(&format!(
        "wrote {} patterns (DXF and SVG), {} nesting drawings, kit.csv and plybook.json into {}",
        book.patterns.len(),
        book.nestings.len(),
        args.out.display()
    ));
    Ok(Outcome::Success)
}

/// The kit as a terminal table, then the rolls and the cautions.
fn kit_text(book: &layloft::plybook::PlyBook, laminate_kg: f64) -> String {
    use std::fmt::Write as _;
    let mut s = format!("Ply book of {} (lay-up order, outer mould line first)\n\n", book.project);
    let _ = writeln!(
        s,
        "{:>5}  {:<24} {:<14} {:>7} {:>15} {:>9} {:>8} {:>10}",
        "order", "pattern", "material", "angle", "r (m)", "area m²", "mass kg", "shear °"
    );
    for e in &book.patterns {
        let _ = writeln!(
            s,
            "{:>5}  {:<24} {:<14} {:>7.1} {:>7.3}–{:<7.3} {:>9.4} {:>8.4} {:>10.1}{}",
            e.order,
            e.name,
            e.material,
            e.angle.deg(),
            e.r_range[0],
            e.r_range[1],
            e.area_m2,
            e.mass_kg,
            e.pattern.max_shear.to_degrees(),
            if e.locks() { "  past locking" } else { "" }
        );
    }
    for p in &book.splices {
        let _ = writeln!(s, "\nCut in pieces: {p}.");
    }
    let _ = writeln!(
        s,
        "\nPatterns {:.3} kg against the laminate mass {:.3} kg of the sections (the patterns are cut on each ply's own level; webs between the skins' inner faces)",
        book.pattern_mass_kg(),
        laminate_kg
    );
    if let Some(c) = book.pattern_cost() {
        let _ = writeln!(s, "Cost of the patterns: {c:.2} (in the unit of cost_per_kg)");
    }
    let _ = writeln!(s, "\nRolls:");
    for m in &book.nestings {
        let n = &m.nesting;
        let _ = writeln!(
            s,
            "  {:<14} {:>5.0} mm wide: {:.3} m used, utilisation {:.1} %, {:.2} times the area bound, scrap {:.3} kg{}",
            m.material,
            n.width * 1e3,
            n.length,
            100.0 * n.utilisation(),
            n.length_over_bound(),
            m.scrap_kg,
            m.roll_cost.map(|c| format!(", roll cost {c:.2}")).unwrap_or_default()
        );
    }
    let _ = writeln!(s);
    for c in layloft::CAUTIONS {
        let _ = writeln!(s, "Caution: {c}");
    }
    s
}

//! `layloft report`: the whole job on one blade project — sections, stresses, modes, the design
//! check (and tooling) — written as one self-contained HTML report and the data files it refers
//! to.

use std::path::{Path, PathBuf};
use std::time::SystemTime;

use anyhow::anyhow;
use serde_json::Value;

use layloft::analysis::BladeModel;
use layloft::check::{DesignCheck, evaluate};
use layloft::report::html::utc_date;
use layloft::report::{
    FileSet, ReportInputs, SectionDrawing, SectionsReport, blade_report, campbell_csv,
    campbell_svg, modal_analysis_json, mode_shapes_csv, section_svg_screen, stress_csv,
    stress_json, stress_svg,
};

use super::project::{load_model, run_modal};
use super::tooling::{build_and_write, tell};
use super::{Failure, Outcome, Output};
use layloft::input::Sources;
use layloft::mesh::{StlFormat, StlOptions};
use layloft::plybook::{PlyBook, PlyBookError, PlyBookParams, build_ply_book, plybook_files};
use layloft::report::{ReportBlock, plybook_block, plybook_error_text, plybook_links};
use layloft::tooling::ToolingParams;
use layloft::units::{RotorSpeed, rpm_of};

const EXAMPLES: &str = "\
Examples:
  layloft report layups/mine-fan/blade.toml --out out/mine-fan
  layloft report layups/small-wind/blade.toml --out out/wind --meshes out/wind-stl

Writes DIR/report.html (open it in a browser; it prints well) and beside it the data it shows:
sections.json, sections.csv, stress.json, stress-plies.csv, reserve-map.svg, modes.json, campbell.csv, campbell.svg,
mode-shapes.csv, check.json; the tooling STL files and tooling-summary.json in DIR/meshes (or
--meshes). Exit status 1 when the design check fails (the report is written).";

/// The engineering report of a blade project: verdict, cautions, planform, section properties,
/// strength, vibration and tooling, with the data files it refers to.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The blade project: its blade.toml, or the folder that holds it.
    #[arg(value_name = "PROJECT")]
    pub blade: PathBuf,

    /// Folder for the report and its data files (created when missing).
    #[arg(long, value_name = "DIR")]
    pub out: PathBuf,

    /// Folder for the tooling STL files (DIR/meshes by default).
    #[arg(long, value_name = "DIR")]
    pub meshes: Option<PathBuf>,
}

/// Where a report run writes.
pub struct Destination {
    /// Report and data files.
    pub out: PathBuf,
    /// Tooling STL files and their summary.
    pub meshes: PathBuf,
}

/// `target` relative to the folder `from` (both made absolute), for links in the report.
fn relative(from: &Path, target: &Path) -> String {
    let abs = |p: &Path| std::fs::canonicalize(p).unwrap_or_else(|_| p.to_path_buf());
    let (a, b) = (abs(from), abs(target));
    let (ac, bc): (Vec<_>, Vec<_>) = (a.components().collect(), b.components().collect());
    let common = ac.iter().zip(&bc).take_while(|(x, y)| x == y).count();
    let mut rel = PathBuf::new();
    for _ in common..ac.len() {
        rel.push("..");
    }
    for c in &bc[common..] {
        rel.push(c);
    }
    rel.to_string_lossy().replace('\\', "/")
}

fn ensure_dir(dir: &Path) -> Result<(), Failure> {
    Ok(layloft::report::ensure_folder(dir)?)
}

fn json_text(v: Value) -> Result<String, Failure> {
    layloft::report::json_pretty(v).map_err(|e| Failure::Run(anyhow!("cannot format JSON: {e}")))
}

/// The tooling built, checked and written to `dest.meshes`, with its block for the report; the
/// files it wrote are added to `files`.
fn tooling_block(
    model: &BladeModel,
    sources: &Sources,
    dest: &Destination,
    out: &Output,
    files: &mut Vec<(String, String)>,
) -> Result<ReportBlock, Failure> {
    let p = &model.project;
    ensure_dir(&dest.meshes)?;
    let spec = p.tooling.clone().unwrap_or_default();
    let params = ToolingParams::from_spec(&spec)
        .map_err(|e| Failure::Input(anyhow!("{}: {}", sources.file, layloft::Error::from(e))))?;
    let stl = StlOptions { unit: params.unit, format: StlFormat::Binary };
    let tooling = build_and_write(p, sources, &model.blade, &params, &stl, &dest.meshes, out)?;
    tell(&tooling, out);
    let tooling_report = tooling.report(&p.name);
    let mut block = tooling_report.to_block();
    block.figures.push((
        "tooling-exploded".into(),
        "The mould parts drawn apart along their pull directions (blade dashed, pulls as arrows)"
            .into(),
        tooling_report.exploded_svg(),
    ));
    for w in &tooling.written {
        let name = w.path.file_name().map(|f| f.to_string_lossy().into_owned()).unwrap_or_default();
        files.push((relative(&dest.out, &w.path), format!("tooling part {name} (STL)")));
    }
    files.push((
        relative(&dest.out, &dest.meshes.join("tooling-summary.json")),
        "the tooling summary (JSON)".into(),
    ));
    files.push((
        relative(&dest.out, &dest.meshes.join("tooling-exploded.svg")),
        "the mould parts drawn apart along their pulls (SVG)".into(),
    ));
    files.push((
        relative(&dest.out, &dest.meshes.join("tooling-manifest.json")),
        "the list of the tooling files with their SHA-256 checksums (JSON)".into(),
    ));
    if p.tooling.is_none() {
        block.notes.push("The project has no [tooling] table: the stated defaults apply (mm, 0.1 mm tolerance, 30 mm block margin) and the core-alloy mass is not computed.".into());
    }
    Ok(block)
}

/// Runs every stage on `model` and writes the report; returns the design check.
///
/// The ply book, which needs only the lofted blade, is built on a second thread while the
/// other stages run; it is taken up where the report needs it, so that the outputs, the order
/// of the messages and the error reported first are those of one thread.
pub fn write_report(
    model: &BladeModel,
    sources: &Sources,
    dest: &Destination,
    out: &Output,
) -> Result<DesignCheck, Failure> {
    // The folders this run makes, taken away again when it fails before writing into them:
    // a failed report leaves no empty folder behind.
    let mut made: Vec<&Path> =
        [dest.out.as_path(), dest.meshes.as_path()].into_iter().filter(|d| !d.exists()).collect();
    let result = std::thread::scope(|s| {
        let book =
            s.spawn(|| build_ply_book(&model.blade, &model.project, &PlyBookParams::default()));
        write_report_with(model, sources, dest, out, move || {
            book.join().unwrap_or_else(|e| std::panic::resume_unwind(e))
        })
    });
    if result.is_err() {
        // Innermost first; `remove_dir` leaves a folder that holds anything.
        made.sort_by_key(|d| std::cmp::Reverse(d.components().count()));
        for dir in made {
            let _ = std::fs::remove_dir(dir);
        }
    }
    result
}

fn write_report_with(
    model: &BladeModel,
    sources: &Sources,
    dest: &Destination,
    out: &Output,
    ply_book: impl FnOnce() -> Result<PlyBook, PlyBookError>,
) -> Result<DesignCheck, Failure> {
    ensure_dir(&dest.out)?;
    // Both folders checked before either is written: a report folder that cannot take its set
    // would otherwise fail after the meshes were put in place.
    FileSet::check_target(&dest.out)?;
    FileSet::check_target(&dest.meshes)?;
    let p = &model.project;
    let stress = if p.load_cases.is_empty() {
        Vec::new()
    } else {
        layloft::stress::points_fit(model, p.load_cases.len()).map_err(layloft::Error::from)?;
        let bar = out.progress(p.load_cases.len() as u64, "load cases");
        let mut all = Vec::new();
        for case in &p.load_cases {
            bar.set_message(&case.name);
            all.push(layloft::stress::analyse_case(model, case).map_err(layloft::Error::from)?);
            bar.inc(1);
        }
        bar.finish();
        all
    };
    let modal = run_modal(model, sources, out, None, None)?;
    let nominal_speed = RotorSpeed::from_rad_s(p.rotor.omega_nominal);
    let nominal = match modal.at_speed(nominal_speed) {
        Some(set) => set.clone(),
        None => modal.model.modes(nominal_speed, p.modal.modes).map_err(layloft::Error::from)?,
    };
    let check = evaluate(model, &stress, Some(&modal));

    // Every file of the report is made in memory and written as one set at the end, so that a
    // failure or a killed run leaves the previous report whole.
    let mut set = FileSet::new();
    let mut files: Vec<(String, String)> = Vec::new();
    let mut put = |name: &str, label: &str, bytes: &[u8]| -> Result<(), Failure> {
        set.add(name, bytes);
        files.push((name.to_string(), label.to_string()));
        Ok(())
    };
    let sections_report = SectionsReport::new(model);
    put(
        "sections.json",
        "section properties at every station (JSON)",
        json_text(sections_report.to_json())?.as_bytes(),
    )?;
    let mut csv = Vec::new();
    sections_report
        .write_csv(&mut csv)
        .map_err(|e| Failure::Run(anyhow!("cannot format the section CSV: {e}")))?;
    put("sections.csv", "section properties at every station (CSV)", &csv)?;
    if !stress.is_empty() {
        put(
            "stress.json",
            "stress results of every load case (JSON)",
            json_text(stress_json(model, &stress))?.as_bytes(),
        )?;
        put(
            "stress-plies.csv",
            "worst value of every ply at every station (CSV)",
            stress_csv(&stress).as_bytes(),
        )?;
        put("reserve-map.svg", "reserve-factor map (SVG)", stress_svg(model, &stress).as_bytes())?;
        put(
            "buckling-map.svg",
            "buckling reserve factor of every wall panel (SVG)",
            layloft::report::buckling_svg(model, &stress).as_bytes(),
        )?;
    }
    let mjson = modal_analysis_json(&modal);
    put("modes.json", "modes, crossings and margins (JSON)", json_text(mjson)?.as_bytes())?;
    put(
        "campbell.csv",
        "Campbell data, one row per speed and mode (CSV)",
        campbell_csv(&modal.campbell).as_bytes(),
    )?;
    let title = format!("Campbell diagram — {}", p.name);
    let csvg = campbell_svg(
        &modal.campbell,
        &modal.excitations,
        &modal.crossings,
        (rpm_of(p.rotor.omega_min), rpm_of(p.rotor.omega_max)),
        &title,
    );
    put("campbell.svg", "Campbell diagram (SVG)", csvg.as_bytes())?;
    put(
        "mode-shapes.csv",
        "mode shapes at the nominal speed (CSV)",
        mode_shapes_csv(&nominal).as_bytes(),
    )?;
    let cjson = layloft::report::check::check_file_json(&p.name, &check);
    put("check.json", "the design check (JSON)", json_text(cjson)?.as_bytes())?;

    // Drawings of the root, mid-span and tip sections.
    let n = model.stations.len();
    let mut picks = vec![0, n / 2, n.saturating_sub(1)];
    picks.dedup();
    let section_drawings = picks
        .into_iter()
        .map(|i| {
            let st = &model.stations[i];
            SectionDrawing { r: st.layout.r, svg: section_svg_screen(&p.name, &model.blade, st) }
        })
        .collect();
    // Tooling: every part built and checked, then written beside the report. A blade the
    // tooling cannot make yet (a trailing edge that changes kind along the span) gets the reason
    // in the tooling section and as a warning; the rest of the report stands.
    let block = match layloft::tooling::trailing_edge_kind(&model.blade) {
        Ok(_) => tooling_block(model, sources, dest, out, &mut files)?,
        Err(e) => {
            let r = match &e {
                layloft::mesh::MeshError::StationShape { r, .. } => *r,
                _ => model.blade.root_radius(),
            };
            let place = layloft::Error::at_station(sources, r, e.into());
            let text = format!("no tooling was made: {place}");
            out.warn(&text);
            ReportBlock { warnings: vec![text], ..ReportBlock::default() }
        }
    };

    // The ply book: its files in a folder of the report's set.
    let book = ply_book().map_err(|e| super::plybook::failure(e, sources))?;
    let laminate_kg = model.mass().laminate_kg;
    let words = layloft::report::plybook_warnings(&book);
    for (path, bytes) in plybook_files(&book, Some(laminate_kg), &sources.ply_lines, &words)
        .map_err(|e| super::plybook::failure(e, sources))?
    {
        set.add(format!("plybook/{path}"), bytes);
    }
    for w in words.iter().cloned().chain(book.failed.iter().map(|e| plybook_error_text(e, sources)))
    {
        out.warn(&w);
    }
    files.extend(plybook_links(&book, "plybook"));
    let plybook = Some(plybook_block(&book, Some(laminate_kg), sources));

    let html = blade_report(&ReportInputs {
        model,
        sources,
        stress: &stress,
        modal: Some(&modal),
        nominal_modes: Some(&nominal),
        check: &check,
        section_drawings,
        tooling: Some(block),
        plybook,
        files,
        date: Some(utc_date(SystemTime::now())),
    });
    set.add("report.html", html.as_bytes());
    let outcome = set.commit(&dest.out)?;
    if !outcome.removed.is_empty() {
        let names: Vec<String> = outcome.removed.iter().map(|p| p.display().to_string()).collect();
        out.note(&format!(
            "removed {} file(s) of an earlier report that this one does not have: {}",
            names.len(),
            names.join(", ")
        ));
    }
    out.note(&format!("wrote {}", dest.out.join("report.html").display()));
    Ok(check)
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let (model, sources) = load_model(&args.blade, out)?;
    let meshes = args.meshes.clone().unwrap_or_else(|| args.out.join("meshes"));
    let check =
        write_report(&model, &sources, &Destination { out: args.out.clone(), meshes }, out)?;
    // The verdict is the last line, on stdout, so that it is seen and a script can read it.
    out.data(&super::verdict(&check, &model, &sources));
    let passed = check.passed();
    Ok(if passed { Outcome::Success } else { Outcome::CheckFailed })
}

//! `layloft tooling`: the blade's cores, laminate shell and mould halves as STL files, with the
//! tooling summary on stdout and as `tooling-summary.json` beside the files.
//!
//! The arguments and the project are turned into a checked configuration first (project read,
//! blade lofted, every station's walls checked against its depth, settings validated), then the
//! parts are built and checked, and only when every part passes are the files written. Exit
//! status 1 when the core alloy's melting check fails (the files are written all the same);
//! 2 for bad input or settings that cannot work for the blade; 3 when a file cannot be written or
//! a part cannot be built.

use std::path::{Path, PathBuf};

use anyhow::anyhow;

use layloft::Error;
use layloft::blade::Blade;
use layloft::input::{Sources, read_project_sourced};
use layloft::mesh::{
    CheckParams, Mesh, MeshError, StlFormat, StlOptions, WrittenPart, encode_part_set_knowing,
    sha256_hex,
};
use layloft::output::{FileSet, stale_files};
use layloft::project::Project;
use layloft::report::ToolingReport;
use layloft::tooling::{
    CastingNote, MANIFEST_FILE, Manifest, ManifestEntry, StaleFiles, ToolingParams, build_tooling,
    summarise,
};
use layloft::units::MM;

use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft tooling layups/mine-fan/blade.toml --out meshes
  layloft tooling layups/mine-fan/blade.toml --out meshes --ascii --tolerance-mm 0.05 --json

Writes one STL file per part into the folder (core-1.stl, core-2.stl, ..., shell.stl,
mould-upper.stl, mould-lower.stl), each mould part again in its machining frame
(mould-upper-machining.stl, ...), each core's casting mould (core-1-cast-upper.stl,
core-1-cast-lower.stl, end pieces where its ends need them, each also in its machining frame),
tooling-summary.json, tooling-exploded.svg (the mould parts
drawn apart along their pulls) and tooling-manifest.json (every file of
the set with its size and SHA-256). Files of an earlier run that the new set no longer holds are
removed, but only those the earlier manifest lists and that are unchanged since; any other file
in the folder is left alone. Every part is checked (closed,
2-manifold, outward, no degenerate or intersecting facets) before any file is written. The
[tooling] table of the project is optional; without it the stated defaults apply (mm, 0.1 mm
tolerance, 30 mm block margin, 2 mm least core thickness) and the core-alloy mass is not computed.
Exit status 1 when the core alloy would melt before the resin gels or never melt out.";

/// Cores, laminate shell and the two mould halves of a blade as STL, with volumes, masses, the
/// core alloy's melting check and the draft of each mould half.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The blade project: its blade.toml, or the folder that holds it.
    #[arg(value_name = "PROJECT")]
    pub project: PathBuf,

    /// Folder for the STL files and tooling-summary.json (created when missing).
    #[arg(long, value_name = "DIR")]
    pub out: PathBuf,

    /// Write ASCII STL instead of binary.
    #[arg(long)]
    pub ascii: bool,

    /// Chordal tolerance of every surface in mm, in place of the project's tolerance_mm.
    #[arg(long = "tolerance-mm", value_name = "MM", allow_hyphen_values = true)]
    pub tolerance_mm: Option<String>,

    /// Print the summary as one JSON object on stdout (SI units in every key).
    #[arg(long)]
    pub json: bool,
}

/// The checked request.
struct Config {
    project: Project,
    sources: Sources,
    blade: Blade,
    params: ToolingParams,
    stl: StlOptions,
}

fn input(e: impl Into<Error>) -> Failure {
    Failure::Input(e.into().into())
}

/// A mesh error is bad input when it is about the settings (named with the project file), else
/// a failed computation.
fn mesh_failure(sources: &Sources, e: MeshError) -> Failure {
    let file = &sources.file;
    match e {
        MeshError::Settings(text) => Failure::Input(anyhow!("{file}: {text}")),
        // A shape given at one station: named by that station's line of the stations file.
        MeshError::StationShape { r, .. } => input(Error::at_station(sources, r, Error::from(e))),
        MeshError::Parameter { .. } | MeshError::Unit(_) => {
            Failure::Input(anyhow!("{file}: {}", Error::from(e)))
        }
        other => Failure::Run(anyhow!("the tooling cannot be built: {other}")),
    }
}

fn configure(args: &Args) -> Result<Config, Failure> {
    let (project, sources) = read_project_sourced(&args.project).map_err(input)?;
    let blade = Blade::from_project(&project).map_err(|e| input(Error::in_files(e, &sources)))?;
    // Walls thicker than the section at a station are bad input, named by the plies file.
    for r in blade.station_radii() {
        blade
            .section_layout(r, project.sections.contour_points)
            .map_err(|e| input(Error::at_station(&sources, r, e.into())))?;
    }
    let spec = project.tooling.clone().unwrap_or_default();
    let mut params = ToolingParams::from_spec(&spec).map_err(|e| mesh_failure(&sources, e))?;
    if let Some(text) = &args.tolerance_mm {
        match text.trim().parse::<f64>() {
            Ok(t) if t.is_finite() && t > 0.0 => {
                // The same bounds as the project's tolerance_mm, against the blade's size.
                let st = &project.stations;
                let length = st.last().map_or(0.0, |s| s.r) - st.first().map_or(0.0, |s| s.r);
                let least_chord = st.iter().map(|s| s.chord).fold(f64::INFINITY, f64::min);
                let (lo, hi) = layloft::input::tolerance_range(length, least_chord);
                if t * MM < lo || t * MM > hi {
                    return Err(Failure::Input(anyhow!(
                        "--tolerance-mm: {}",
                        layloft::input::tolerance_message(t * MM, lo, hi)
                    )));
                }
                params.tolerance = t * MM
            }
            _ => {
                return Err(Failure::Input(anyhow!(
                    "--tolerance-mm: expected a positive tolerance in mm, found '{}'",
                    layloft::input::excerpt(text)
                )));
            }
        }
    }
    let format = if args.ascii { StlFormat::Ascii } else { StlFormat::Binary };
    let stl = StlOptions { unit: params.unit, format };
    Ok(Config { project, sources, blade, params, stl })
}

/// The tooling of a blade, built, checked and written.
pub struct Written {
    /// The parts and what their construction found.
    pub tooling: layloft::tooling::BladeTooling,
    /// The files, one per part.
    pub written: Vec<WrittenPart>,
    /// Masses and the melting check.
    pub summary: layloft::tooling::ToolingSummary,
    /// "binary STL in mm".
    pub format: String,
    /// Files of an earlier run in the folder that the new set does not hold.
    pub stale: StaleFiles,
}

impl Written {
    /// The report view of it.
    pub fn report<'a>(&'a self, name: &'a str) -> ToolingReport<'a> {
        ToolingReport {
            name,
            tooling: &self.tooling,
            written: &self.written,
            summary: &self.summary,
            format: &self.format,
            stale: &self.stale,
        }
    }
}

/// Builds every part, checks them all, then writes the STL files and `tooling-summary.json`
/// into `dir`, with progress bars on a terminal.
pub fn build_and_write(
    project: &Project,
    sources: &Sources,
    blade: &Blade,
    params: &ToolingParams,
    stl: &StlOptions,
    dir: &Path,
    out: &Output,
) -> Result<Written, Failure> {
    let mut bar = None;
    let mut tooling = build_tooling(blade, params, &mut |_, total, stage| {
        let b = bar.get_or_insert_with(|| out.progress(total as u64, "lofting"));
        b.set_message(&format!("lofted {stage}"));
        b.inc(1);
    })
    .map_err(|e| mesh_failure(sources, e))?;
    drop(bar);
    // The whole set is checked and encoded in memory, then put in place as one (`FileSet`),
    // so that a failure or a killed run leaves the earlier set whole; each file is written once.
    // A casting mould whose part fails its check costs its core the casting mould (a note, as
    // for one that cannot be built), not the blade its tooling: the set is checked again
    // without it.
    let (encoded, stale) = loop {
        let mut parts: Vec<(&str, &Mesh)> =
            tooling.parts.iter().map(|p| (p.name.as_str(), &p.mesh)).collect();
        let mut copies: Vec<(&str, &Mesh)> =
            tooling.machining.iter().map(|m| (m.name.as_str(), &m.mesh)).collect();
        // The cores' casting moulds, after the blade's parts and their machining frames.
        for m in &tooling.casting {
            parts.extend(m.parts.iter().map(|p| (p.name.as_str(), &p.mesh)));
            copies.extend(m.machining.iter().map(|c| (c.name.as_str(), &c.mesh)));
        }
        // The new set, and what an earlier run left in the folder that it does not hold.
        let mut set: Vec<String> =
            parts.iter().chain(&copies).map(|(n, _)| format!("{n}.stl")).collect();
        set.push(SUMMARY_FILE.into());
        set.push(EXPLODED_FILE.into());
        let stale = stale_files(dir, &set);
        let bar = out.progress(2 * (parts.len() + copies.len()) as u64, "checking");
        // The printed cores passed the self-intersection test when their prints were made.
        let clear: Vec<bool> = parts.iter().map(|(_, m)| tooling.known_clear(m)).collect();
        let checked = encode_part_set_knowing(
            &parts,
            &copies,
            &clear,
            stl,
            &CheckParams::default(),
            &mut |_, _, what| {
                bar.set_message(what);
                bar.inc(1);
            },
        );
        bar.finish();
        let failed = match checked {
            Ok(encoded) => break (encoded, stale),
            Err(m) => m,
        };
        let cast = failed.part().and_then(|name| {
            tooling.casting.iter().position(|c| {
                c.parts.iter().any(|p| p.name == name) || c.machining.iter().any(|p| p.name == name)
            })
        });
        let Some(k) = cast else {
            return Err(Failure::Run(anyhow!(
                "a part failed its check, nothing was written: {failed}"
            )));
        };
        let mould = tooling.casting.remove(k);
        tooling.casting_notes.push(CastingNote::NoMould { core: mould.core, reason: failed });
    };
    let summary = summarise(project, blade, &tooling);
    let format = format!(
        "{} STL in {}",
        if stl.format == StlFormat::Ascii { "ASCII" } else { "binary" },
        stl.unit.symbol()
    );
    let mut written = Vec::with_capacity(encoded.len());
    let mut contents = Vec::with_capacity(encoded.len());
    for (mut w, bytes) in encoded {
        let name = file_name(&w.path);
        w.path = dir.join(&name);
        contents.push((name, bytes));
        written.push(w);
    }
    let result = Written { tooling, written, summary, format, stale };
    let json = layloft::report::json_pretty(result.report(&project.name).to_json())
        .map_err(|e| Failure::Run(anyhow!("cannot format the JSON summary: {e}")))?;
    let mut files: Vec<ManifestEntry> = result
        .written
        .iter()
        .map(|w| ManifestEntry {
            file: file_name(&w.path),
            size_bytes: w.size_bytes,
            sha256: w.sha256.clone(),
        })
        .collect();
    files.push(ManifestEntry {
        file: SUMMARY_FILE.into(),
        size_bytes: json.len() as u64,
        sha256: sha256_hex(json.as_bytes()),
    });
    let svg = result.report(&project.name).exploded_svg();
    files.push(ManifestEntry {
        file: EXPLODED_FILE.into(),
        size_bytes: svg.len() as u64,
        sha256: sha256_hex(svg.as_bytes()),
    });
    let manifest = Manifest::new(stl.unit.symbol(), files);
    let mut fileset = FileSet::new();
    for (name, bytes) in contents {
        fileset.add(name, bytes);
    }
    fileset.add(SUMMARY_FILE, json.into_bytes());
    fileset.add(EXPLODED_FILE, svg.into_bytes());
    fileset.add(MANIFEST_FILE, manifest.to_json().into_bytes());
    // The tooling manifest decides which files of the earlier run go: those it lists unchanged.
    for name in &result.stale.remove {
        fileset.decide_old(name, false);
    }
    for (name, _) in &result.stale.kept {
        fileset.decide_old(name, true);
    }
    fileset.commit(dir).map_err(|e| Failure::Run(e.into()))?;
    Ok(result)
}

/// How many casting-mould parts the run wrote (each once more in its machining frame).
fn cast_parts(result: &Written) -> usize {
    result.tooling.casting.iter().map(|m| m.parts.len()).sum()
}

/// File name of the tooling summary in the output folder.
const SUMMARY_FILE: &str = "tooling-summary.json";

/// File name of the exploded drawing of the mould parts in the output folder.
pub const EXPLODED_FILE: &str = "tooling-exploded.svg";

/// Notes on stderr about undercuts, and warnings about a failed melting check; whether the
/// melting check failed.
pub fn tell(result: &Written, out: &Output) -> bool {
    for h in result.tooling.mould_halves() {
        if !h.undercuts.is_empty() {
            out.note(&format!(
                "the {} mould half has {} cm² of undercut in {} regions (see the summary)",
                h.side,
                layloft::report::sig4(h.draft.undercut_area * 1e4),
                h.undercuts.len()
            ));
        }
    }
    let stale = &result.stale;
    if !stale.remove.is_empty() {
        out.note(&format!(
            "removed {} file(s) of the earlier run that the new set no longer holds: {}",
            stale.remove.len(),
            stale.remove.join(", ")
        ));
    }
    for (file, why) in &stale.kept {
        out.warn(&format!(
            "{file} belonged to the earlier run and is not in the new set; left in place ({why})"
        ));
    }
    if let Some(why) = &stale.unreadable {
        out.warn(&format!("the earlier manifest cannot be used, no old file removed: {why}"));
    }
    let melt = &result.summary.melt;
    for f in melt.findings.iter().filter(|f| f.passed == Some(false)) {
        out.warn(&format!("core alloy: {}", f.note));
    }
    // A core closed at both ends by bulkheads cannot drain through a print: said on stderr, not
    // left to a line of the summary (the shop drills a drain to it and patches the shell, or the
    // webs change; the melting check itself is about temperatures).
    for core in sealed_cores(result) {
        out.warn(&format!(
            "core alloy: {core} is sealed between bulkheads: its alloy cannot leave the shell \
             through a print; drill a drain to it and patch the shell, or run one of its webs to \
             an end of the blade"
        ));
    }
    melt.failed()
}

/// The cores closed at both ends by bulkheads (no print, see `MeltNote::NoPrint`).
fn sealed_cores(result: &Written) -> Vec<&str> {
    result
        .summary
        .drain_findings
        .iter()
        .filter_map(|f| match &f.note {
            layloft::tooling::MeltNote::NoPrint { core } => Some(core.as_str()),
            _ => None,
        })
        .collect()
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let config = configure(&args)?;
    let result = build_and_write(
        &config.project,
        &config.sources,
        &config.blade,
        &config.params,
        &config.stl,
        &args.out,
        out,
    )?;
    let report = result.report(&config.project.name);
    if args.json {
        let json = layloft::report::json_pretty(report.to_json())
            .map_err(|e| Failure::Run(anyhow!("cannot format the JSON summary: {e}")))?;
        out.data(&json);
    } else {
        out.data(&report.to_text());
    }
    out.note(&format!(
        "wrote {} STL files (and {} in machining frames), {SUMMARY_FILE}, {EXPLODED_FILE} and \
         {MANIFEST_FILE} into {}",
        result.tooling.parts.len(),
        result.tooling.machining.len(),
        args.out.display()
    ));
    let cast = cast_parts(&result);
    if cast > 0 {
        out.note(&format!(
            "and {cast} STL files of the cores' casting moulds (core-N-cast-*.stl), and each \
             again in its machining frame"
        ));
    }
    for n in &result.tooling.casting_notes {
        out.note(&format!("casting moulds: {n}"));
    }
    let failed = tell(&result, out);
    if !args.json {
        // The verdict of the melting check is the last line.
        let findings = &result.summary.melt.findings;
        let verdict = if failed {
            "FAIL (see the warnings above)"
        } else if findings.iter().any(|f| f.passed == Some(true)) {
            "PASS"
        } else {
            "NOT CHECKED (the project names no core alloy and temperatures in [tooling])"
        };
        let sealed = sealed_cores(&result);
        if !sealed.is_empty() {
            out.data(&format!(
                "Core drainage: {} sealed between bulkheads (see the warnings above)",
                sealed.join(", ")
            ));
        }
        out.data(&format!("Core-alloy melting check: {verdict}"));
    }
    Ok(if failed { Outcome::CheckFailed } else { Outcome::Success })
}

fn file_name(p: &Path) -> String {
    p.file_name().map(|f| f.to_string_lossy().into_owned()).unwrap_or_default()
}

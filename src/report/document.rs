//! The engineering report of a blade: one self-contained HTML document with the design-check
//! verdict at the top, the cautions, and sections on the blade, its sections, strength,
//! vibration and tooling, each with its plots and tables.

use super::html::HtmlReport;
use super::modes::crossings_table;
use super::stress::critical_table;
use super::{
    Align, Table, campbell_svg, fixed, mass_svg, mode_shapes_svg, pitch_moment_svg, planform_svg,
    rpm_text, sig4, stiffness_svg, stress_svg, twist_svg,
};
use crate::analysis::BladeModel;
use crate::check::DesignCheck;
use crate::input::Sources;
use crate::modal::{ModalAnalysis, ModeSet};
use crate::stress::CaseStress;
use crate::units::{pct_of, rpm_of};

/// A drawing of one section for the report.
#[derive(Debug, Clone)]
pub struct SectionDrawing {
    /// Radius, m.
    pub r: f64,
    /// The SVG.
    pub svg: String,
}

/// A block of the report that a later stage supplies ready-made (the tooling summary).
#[derive(Debug, Clone, Default)]
pub struct ReportBlock {
    /// Paragraphs.
    pub paragraphs: Vec<String>,
    /// Tables with their captions.
    pub tables: Vec<(String, Table)>,
    /// Warnings.
    pub warnings: Vec<String>,
    /// Notes.
    pub notes: Vec<String>,
    /// Figures: id, caption and SVG drawing.
    pub figures: Vec<(String, String, String)>,
}

/// Everything the report shows.
#[derive(Debug, Clone)]
pub struct ReportInputs<'a> {
    /// The blade model.
    pub model: &'a BladeModel,
    /// Where the project was written (the project file named in the report) and its input
    /// warnings.
    pub sources: &'a Sources,
    /// Stress results of every load case.
    pub stress: &'a [CaseStress],
    /// The modal analysis.
    pub modal: Option<&'a ModalAnalysis>,
    /// Modes at the nominal speed, for the mode-shape plot.
    pub nominal_modes: Option<&'a ModeSet>,
    /// The design check.
    pub check: &'a DesignCheck,
    /// Drawings of chosen sections.
    pub section_drawings: Vec<SectionDrawing>,
    /// The tooling summary.
    pub tooling: Option<ReportBlock>,
    /// The ply book.
    pub plybook: Option<ReportBlock>,
    /// Side files (path relative to the report, label).
    pub files: Vec<(String, String)>,
    /// Date of the run (the library does not read the clock).
    pub date: Option<String>,
}

/// The report as HTML.
pub fn blade_report(inp: &ReportInputs<'_>) -> String {
    let m = inp.model;
    let p = &m.project;
    let r = &p.rotor;
    let mut doc = HtmlReport::new(p.name.clone());
    doc.subtitle(format!(
        "{} blades, radius {:.3}–{:.3} m, {}",
        r.blades,
        r.hub_radius,
        r.tip_radius,
        speeds_text(r)
    ));
    if let Some(d) = &inp.date {
        doc.date(d.clone());
    }
    doc.meta("project file", inp.sources.file.clone());
    doc.design_check(inp.check);
    doc.verdict_warnings(m.verdict_warning_texts(&inp.sources.warnings));

    blade_section(&mut doc, m);
    sections_section(&mut doc, m, inp.sources, &inp.section_drawings);
    strength_section(&mut doc, m, inp.stress);
    if let Some(modal) = inp.modal {
        vibration_section(&mut doc, m, modal, inp.nominal_modes);
    }
    if let Some(t) = &inp.tooling {
        block_section(&mut doc, "Tooling", t);
    }
    if let Some(t) = &inp.plybook {
        block_section(&mut doc, "Ply book", t);
    }
    if !inp.files.is_empty() {
        let s = doc.section("Data files");
        s.paragraph(
            "Every number of this report is also written as data, SI units in every field name.",
        );
        for (path, label) in &inp.files {
            s.link(path.clone(), label.clone());
        }
    }
    doc.render()
}

/// A section made of a ready-made block: paragraphs, tables, figures, warnings, notes.
fn block_section(doc: &mut HtmlReport, title: &str, t: &ReportBlock) {
    let s = doc.section(title);
    for para in &t.paragraphs {
        s.paragraph(para.clone());
    }
    for (caption, table) in &t.tables {
        s.table(caption.clone(), table);
    }
    for (id, caption, svg) in &t.figures {
        s.figure(id.clone(), caption.clone(), svg.clone());
    }
    for w in &t.warnings {
        s.warning(w.clone());
    }
    for n in &t.notes {
        s.note(n.clone());
    }
}

fn blade_section(doc: &mut HtmlReport, m: &BladeModel) {
    let p = &m.project;
    let r = &p.rotor;
    let mass = m.mass();
    let s = doc.section("The blade");
    s.facts([
        ("blades", r.blades.to_string()),
        ("hub and tip radius", format!("{:.3} m, {:.3} m", r.hub_radius, r.tip_radius)),
        (
            "stations",
            format!(
                "{} from r = {:.3} m to {:.3} m",
                p.stations.len(),
                m.blade.root_radius(),
                m.blade.tip_radius()
            ),
        ),
        ("speeds", speeds_text(r)),
        (
            "pitch",
            format!(
                "{:.1}° set, range {:.1}° to {:.1}°",
                r.pitch.deg(),
                r.pitch_range.0.deg(),
                r.pitch_range.1.deg()
            ),
        ),
        (
            "clearances",
            format!("root {:.1} mm, tip {:.1} mm", r.root_clearance * 1e3, r.tip_clearance * 1e3),
        ),
        ("plies in the schedule", p.plies.len().to_string()),
        (
            "blade mass",
            format!(
                "{:.3} kg ({:.3} kg laminates, {:.3} kg point masses), centre at r = {:.3} m",
                mass.total_kg, mass.laminate_kg, mass.point_masses_kg, mass.centre_radius_m
            ),
        ),
    ]);
    s.figure(
        "planform",
        "Planform: leading and trailing edges about the pitch axis, webs and stations.",
        planform_svg(m),
    );
    s.figure("twist", "Station twist along the span.", twist_svg(m));
}

fn sections_section(
    doc: &mut HtmlReport,
    m: &BladeModel,
    sources: &Sources,
    drawings: &[SectionDrawing],
) {
    let s = doc.section("Section properties");
    s.paragraph(if m.project.sections.wall_bending {
        "Thin-walled section theory on the wall midline, each wall laminate reduced for a beam wall \
         (hoop force free, hoop curvature held, span-wise and twisting curvature those of the beam, \
         so the walls' own bending counts), closed cells with one twist rate. Stiffness in the chord \
         frame through the elastic centre; centres as fractions of chord from the leading edge."
    } else {
        "Thin-walled section theory on the wall midline, each wall laminate reduced for a beam wall \
         (hoop force free, wall curvatures held at zero: membrane theory, set by [sections] \
         wall_bending = false), closed cells with one twist rate. Stiffness in the chord frame \
         through the elastic centre; centres as fractions of chord from the leading edge."
    });
    s.figure("stiffness", "Bending and torsion stiffness along the span.", stiffness_svg(m));
    s.figure("mass", "Mass per unit length along the span, with the point masses.", mass_svg(m));
    let mut t = Table::new(&[
        ("r (m)", Align::Right),
        ("chord (m)", Align::Right),
        ("EA (MN)", Align::Right),
        ("EI flap (kN·m²)", Align::Right),
        ("EI edge (kN·m²)", Align::Right),
        ("GJ (kN·m²)", Align::Right),
        ("m (kg/m)", Align::Right),
        ("EC (y/c)", Align::Right),
        ("SC (y/c)", Align::Right),
    ]);
    for st in &m.stations {
        let q = &st.section.properties;
        let yc = |y: f64| y / q.chord + st.layout.pitch_axis_frac;
        t.row(vec![
            fixed(q.r, 3),
            fixed(q.chord, 3),
            sig4(q.ea / 1e6),
            sig4(q.ei_flap / 1e3),
            sig4(q.ei_edge / 1e3),
            sig4(q.gj / 1e3),
            sig4(q.mass_per_length),
            fixed(yc(q.elastic_centre[0]), 3),
            fixed(yc(q.shear_centre[0]), 3),
        ]);
    }
    s.table(
        "Section properties at the analysis stations (EC elastic centre, SC shear centre).",
        &t,
    );
    for d in drawings {
        s.figure(
            format!("section-{:.3}", d.r),
            format!(
                "Section at r = {:.3} m to scale: walls shaded by laminate, webs and centres.",
                d.r
            ),
            d.svg.clone(),
        );
    }
    for w in m.warnings_with(&sources.warnings) {
        s.warning(w.to_string());
    }
}

fn strength_section(doc: &mut HtmlReport, m: &BladeModel, cases: &[CaseStress]) {
    let s = doc.section("Strength");
    if cases.is_empty() {
        s.note("The project has no load cases: strength was not checked.");
        return;
    }
    s.paragraph(
        "Loads integrated from the tip (centrifugal, gravity, distributed and point loads, factored), \
         ply stresses at every wall point of every station by classical laminate theory, strength \
         ratios by Tsai–Wu, maximum stress, maximum strain and Hashin. The reserve factor is the \
         strength ratio of the governing criterion at the factored load.",
    );
    let t = critical_table(cases);
    s.table("Lowest reserve factor of each load case and where it occurs.", &t);
    s.figure(
        "reserve-map",
        "Lowest reserve factor over span and chord position, all cases; the critical location marked.",
        stress_svg(m, cases),
    );
    s.heading("Local buckling and sandwich modes");
    s.paragraph(format!(
        "Every wall panel between webs, the leading edge, corners and the edges of ply regions \
         is taken as a long plate under the most compressive N_x and the largest shear flow along \
         it: critical loads from the wall's D matrix (edge fixity {:.2}: 0 simply supported, 1 \
         clamped), a curved-panel gain with the NASA SP-8007 knock-down, compression and shear \
         combined by R_c + R_s² = 1. Sandwich walls add the core's shear flexibility, face \
         wrinkling, shear crimping and core shear.",
        m.project.buckling.edge_fixity
    ));
    s.table(
        "Lowest buckling reserve factor of each load case and its panel.",
        &super::stress::buckling_table(cases),
    );
    s.figure(
        "buckling-map",
        "Lowest buckling reserve factor of every wall panel over span and chord, all cases.",
        super::buckling_svg(m, cases),
    );
    s.heading("Not covered by this analysis");
    for line in crate::buckling::NOT_COVERED {
        s.note(format!("Not covered: {line}."));
    }
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("radial (kN)", Align::Right),
        ("V in plane (N)", Align::Right),
        ("V out of plane (N)", Align::Right),
        ("M flap (N·m)", Align::Right),
        ("M edge (N·m)", Align::Right),
        ("M pitch (N·m)", Align::Right),
    ]);
    for c in cases {
        t.row(vec![
            c.name.clone(),
            sig4(c.root.force[0] / 1e3),
            sig4(c.root.force[1]),
            sig4(c.root.force[2]),
            sig4(c.root.moment[1]),
            sig4(c.root.moment[2]),
            sig4(c.root.moment[0]),
        ]);
    }
    s.table("Root reactions (rotor frame, moments about the pitch axis at the root).", &t);
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("tip deflection (mm)", Align::Right),
        ("in plane (mm)", Align::Right),
        ("out of plane (mm)", Align::Right),
        ("elastic tip twist (°)", Align::Right),
    ]);
    for c in cases {
        let d = &c.tip_deflection;
        t.row(vec![
            c.name.clone(),
            sig4(d.total * 1e3),
            sig4(d.in_plane * 1e3),
            sig4(d.out_of_plane * 1e3),
            fixed(d.twist.to_degrees(), 3),
        ]);
    }
    s.table("Tip deflection under the factored loads (small deflections, centrifugal stiffening not counted).", &t);
    if cases.iter().any(|c| c.pitch_sweep.len() > 1) {
        s.figure(
            "pitch-moment",
            "Pitching moment at the root over the pitch range: all loads (solid) and the centrifugal twisting moment (dashed). It sizes the pitch actuator and bearing.",
            pitch_moment_svg(cases),
        );
    }
}

fn vibration_section(
    doc: &mut HtmlReport,
    m: &BladeModel,
    a: &ModalAnalysis,
    nominal: Option<&ModeSet>,
) {
    let p = &m.project;
    let s = doc.section("Vibration");
    s.paragraph(format!(
        "Rotating beam finite elements along the pitch axis with the coupled section stiffness, \
         mass offsets, pretwist, centrifugal stiffening, spin softening and the propeller moment. \
         {} modes at each of {} speeds from {} to {} rpm, tracked by the modal assurance \
         criterion. Excitations: rotor orders 1P to {}P, the blade-passing orders{}.",
        a.campbell.speeds.first().map_or(0, |s| s.modes.len()),
        a.campbell.speeds.len(),
        rpm_text(a.range.from.rpm()),
        rpm_text(a.range.to.rpm()),
        p.criteria.harmonics,
        if a.excitations.iter().any(|e| !e.vanes.is_empty() || e.fixed.is_some()) {
            " and the machine's own excitations of [excitation]"
        } else {
            ""
        }
    ));
    for line in super::model_statement(a).lines() {
        s.paragraph(line.to_string());
    }
    if !a.dry.is_empty() {
        s.table(
            "Dry and wet frequencies (Hz): the sweep, crossings and margins use the wet ones.",
            &super::modes::dry_table(a),
        );
    }
    s.figure(
        "campbell",
        "Campbell diagram: natural frequencies against rotor speed, excitation lines, crossings, and the operating range shaded.",
        campbell_svg(&a.campbell, &a.excitations, &a.crossings, (rpm_of(p.rotor.omega_min), rpm_of(p.rotor.omega_max)), &format!("Campbell diagram — {}", p.name)),
    );
    for check in &a.margins {
        let mut t = Table::new(&[
            ("mode", Align::Left),
            ("frequency (Hz)", Align::Right),
            ("nearest excitation", Align::Left),
            ("excitation (Hz)", Align::Right),
            ("margin (%)", Align::Right),
            ("verdict", Align::Left),
        ]);
        for mm in &check.modes {
            let label = a
                .campbell
                .tracks
                .iter()
                .find(|t| t.id == mm.track)
                .map_or(String::new(), |t| t.label.clone());
            let verdict = match mm.pass {
                Some(true) => "PASS",
                Some(false) => "FAIL",
                None => "-",
            };
            t.row(vec![
                label,
                sig4(mm.frequency_hz),
                mm.excitation.label(),
                sig4(mm.excitation_hz),
                fixed(mm.margin * 100.0, 1),
                verdict.into(),
            ]);
        }
        s.table(
            format!(
                "Margins at the {} speed, {} rpm{}.",
                check.name,
                rpm_text(check.speed.rpm()),
                check.required.map(|v| format!(" (required {} %)", pct_of(v))).unwrap_or_default()
            ),
            &t,
        );
    }
    if !a.crossings.is_empty() {
        let t = crossings_table(a);
        s.table("Crossings of the modes with the excitation lines inside the speed range.", &t);
    }
    if let Some(set) = nominal {
        s.figure(
            "mode-shapes",
            format!(
                "The first mode shapes at the nominal speed, {} rpm.",
                rpm_text(set.speed.rpm())
            ),
            mode_shapes_svg(set, 4, &format!("Mode shapes at {} rpm", rpm_text(set.speed.rpm()))),
        );
    }
}

/// The rotor's speeds in words: `"<n> rpm nominal, <m> rpm maximum"`, led by `"<l> rpm least, "`
/// when its least operating speed (`rpm_min`) lies below the nominal.
fn speeds_text(r: &crate::project::Rotor) -> String {
    let least = if r.omega_min < r.omega_nominal {
        format!("{} rpm least, ", rpm_text(rpm_of(r.omega_min)))
    } else {
        String::new()
    };
    format!(
        "{least}{} rpm nominal, {} rpm maximum",
        rpm_text(rpm_of(r.omega_nominal)),
        rpm_text(rpm_of(r.omega_max))
    )
}

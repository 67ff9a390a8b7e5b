//! `layloft sections` as a user meets it: the text summary, the JSON keys and values, the CSV,
//! `--at`, the SVG drawings and the exit status, on the two invented demo blades.
//!
//! The numbers are checked against the library's own results for the same stations (the report
//! must carry them unchanged, units converted) and against laws any section stiffness obeys:
//! symmetry of the 4x4 matrix, the invariants of Mohr's circle for the principal bending
//! stiffnesses (trace and determinant of the 2x2 bending block; any strength-of-materials text,
//! e.g. Megson, *Aircraft Structures for Engineering Students*, §16.2), the polar moment as the
//! sum of the other two, and the blade mass as the integral of the mass per length.

use std::path::{Path, PathBuf};

use crate::support_cli::layloft;
use serde_json::Value;

use layloft::analysis::BladeModel;
use layloft::input::read_project;

const FAN: &str = "layups/mine-fan/blade.toml";
const WIND: &str = "layups/small-wind/blade.toml";

fn json(args: &[&str]) -> Value {
    let mut all = vec!["sections"];
    all.extend_from_slice(args);
    all.push("--json");
    let (code, stdout, stderr) = layloft(&all);
    assert_eq!(code, Some(0), "{stderr}");
    serde_json::from_str(&stdout).unwrap_or_else(|e| panic!("{e}: {stdout}\n{stderr}"))
}

fn f(v: &Value) -> f64 {
    v.as_f64().unwrap_or_else(|| panic!("not a number: {v}"))
}

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs().max(f64::MIN_POSITIVE)
}

fn model(project: &str) -> BladeModel {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR"));
    BladeModel::build(read_project(&dir.join(project)).unwrap()).unwrap()
}

const STATION_KEYS: [&str; 33] = [
    "r_m",
    "chord_m",
    "twist_deg",
    "pitch_axis_frac",
    "EA_N",
    "EI_flap_Nm2",
    "EI_edge_Nm2",
    "EI_cross_Nm2",
    "GJ_Nm2",
    "extension_twist_Nm",
    "flap_twist_Nm2",
    "edge_twist_Nm2",
    "stiffness_matrix_SI",
    "EI_principal_max_Nm2",
    "EI_principal_min_Nm2",
    "principal_angle_deg",
    "elastic_centre_y_m",
    "elastic_centre_z_m",
    "shear_centre_y_m",
    "shear_centre_z_m",
    "mass_centre_y_m",
    "mass_centre_z_m",
    "mass_kg_m",
    "inertia_flap_kg_m",
    "inertia_edge_kg_m",
    "inertia_polar_kg_m",
    "wall_thickness_min_m",
    "wall_thickness_max_m",
    "warnings",
    "laminates",
    "webs",
    "cells",
    "stiffness_matrix_pitch_axis_SI",
];

/// The model's stations: the evenly spaced analysis stations, and the thinner side of every ply
/// edge inside the span (a ply covers its span up to, not including, its end: the station at a
/// ply's end is the one without it, and the one without a ply that starts at `e` stands 1e-4 of
/// the span inboard of `e`), and both sides of a web's edge. A drop-off between two evenly
/// spaced stations would leave its thinner side unchecked.
fn check_edges_have_both_sides(m: &layloft::analysis::BladeModel) {
    let radii = m.radii();
    let (root, tip) = (m.blade.root_radius(), m.blade.tip_radius());
    let delta = 1e-4 * (tip - root);
    let has = |r: f64| radii.iter().any(|&x| (x - r).abs() < 1e-9 * (tip - root));
    for r in m.blade.analysis_radii(m.project.sections.analysis_stations) {
        assert!(has(r), "the analysis station at {r} m");
    }
    let inside = |e: f64| e > root + delta && e < tip;
    let mut edges = 0;
    for p in (0..m.blade.ply_count()).filter_map(|k| m.blade.ply(k)) {
        if inside(p.r_start) {
            assert!(has(p.r_start - delta), "inboard of the start at {}: {radii:?}", p.r_start);
            edges += 1;
        }
        if inside(p.r_end) {
            assert!(has(p.r_end), "at the end at {}: {radii:?}", p.r_end);
            edges += 1;
        }
    }
    for e in m.blade.webs().iter().flat_map(|w| [w.r_start, w.r_end]).filter(|&e| inside(e)) {
        assert!(has(e) && has(e - delta), "both sides of the web edge at {e} m: {radii:?}");
    }
    assert!(edges > 0, "the demos drop plies inside the span");
    assert!(radii.windows(2).all(|w| w[0] < w[1]), "radii in order, each once");
}

/// Every station of a JSON report: keys present, values the library's, laws obeyed.
fn check_stations(project: &str, v: &Value) {
    let m = model(project);
    let stations = v["stations"].as_array().unwrap();
    assert_eq!(stations.len(), m.stations.len());
    check_edges_have_both_sides(&m);
    for (s, st) in stations.iter().zip(&m.stations) {
        let p = &st.section.properties;
        for key in STATION_KEYS {
            assert!(!s[key].is_null(), "{project}: station lacks {key}: {s}");
        }
        // The library's numbers, carried unchanged (JSON round trip: 1e-12).
        for (key, want) in [
            ("r_m", p.r),
            ("chord_m", p.chord),
            ("EA_N", p.ea),
            ("EI_flap_Nm2", p.ei_flap),
            ("EI_edge_Nm2", p.ei_edge),
            ("GJ_Nm2", p.gj),
            ("mass_kg_m", p.mass_per_length),
            ("shear_centre_y_m", p.shear_centre[0]),
            ("elastic_centre_z_m", p.elastic_centre[1]),
            ("mass_centre_y_m", p.mass_centre[0]),
        ] {
            assert!(rel(f(&s[key]), want) < 1e-12, "{key}: {} vs {want}", s[key]);
        }
        assert!(rel(f(&s["twist_deg"]), p.twist.deg()) < 1e-12);
        let k: Vec<Vec<f64>> = s["stiffness_matrix_SI"]
            .as_array()
            .unwrap()
            .iter()
            .map(|row| row.as_array().unwrap().iter().map(f).collect())
            .collect();
        assert_eq!(k.len(), 4);
        for (i, row) in k.iter().enumerate() {
            assert_eq!(row.len(), 4);
            for (j, kij) in row.iter().enumerate() {
                assert_eq!(*kij, k[j][i], "stiffness [{i}][{j}] not symmetric");
            }
        }
        // Order axial, twist, flap, edge.
        let diag = [f(&s["EA_N"]), f(&s["GJ_Nm2"]), f(&s["EI_flap_Nm2"]), f(&s["EI_edge_Nm2"])];
        for (i, d) in diag.iter().enumerate() {
            assert!(*d > 0.0 && k[i][i] == *d, "diagonal {i}");
        }
        assert_eq!(k[2][3], f(&s["EI_cross_Nm2"]));
        assert_eq!(k[0][1], f(&s["extension_twist_Nm"]));
        assert_eq!(k[1][2], f(&s["flap_twist_Nm2"]));
        assert_eq!(k[1][3], f(&s["edge_twist_Nm2"]));
        // Mohr's circle: the principal pair keeps the trace and determinant of the bending block.
        let (ef, ee, ec) = (diag[2], diag[3], k[2][3]);
        let (hi, lo) = (f(&s["EI_principal_max_Nm2"]), f(&s["EI_principal_min_Nm2"]));
        assert!(hi >= lo && lo > 0.0);
        assert!(rel(hi + lo, ef + ee) < 1e-12);
        assert!(rel(hi * lo, ef * ee - ec * ec) < 1e-9);
        // Centres within the chord; mass properties consistent.
        let c = f(&s["chord_m"]);
        let pa = f(&s["pitch_axis_frac"]);
        for key in ["elastic_centre_y_m", "shear_centre_y_m", "mass_centre_y_m"] {
            let yc = f(&s[key]) / c + pa;
            assert!((0.0..=1.0).contains(&yc), "{key} at y/c = {yc}");
        }
        assert!(f(&s["mass_kg_m"]) > 0.0);
        let (fl, ed) = (f(&s["inertia_flap_kg_m"]), f(&s["inertia_edge_kg_m"]));
        assert!(rel(f(&s["inertia_polar_kg_m"]), fl + ed) < 1e-12 && fl > 0.0 && ed > fl);
        let (tmin, tmax) = (f(&s["wall_thickness_min_m"]), f(&s["wall_thickness_max_m"]));
        assert!(tmin > 0.0 && tmin <= tmax && tmax < 0.05 * c);
        assert!(s["warnings"].is_array());
        // Every laminate named by its plies and thickness.
        for lam in s["laminates"].as_array().unwrap() {
            let label = lam["label"].as_str().unwrap();
            assert!(label.ends_with(" mm") && label.contains('/'), "{label}");
        }
    }
}

#[test]
fn json_of_both_demos_has_every_key_and_the_solver_values() {
    for project in [FAN, WIND] {
        let v = json(&[project]);
        assert!(v["project"].as_str().unwrap().starts_with("Invented demo"));
        assert_eq!(v["cautions"].as_array().unwrap().len(), layloft::CAUTIONS.len());
        assert!(v["units"].as_str().unwrap().contains("axial, twist, flap, edge"));
        assert!(v["warnings"].as_array().is_some_and(|w| !w.is_empty()));
        check_stations(project, &v);
        // The blade mass (ply areas on a fine spanwise grid plus point masses) against the
        // trapezoidal integral of the sections' mass per length: two independent computations.
        // 3 %: the trapezoidal rule over ~20 stations smears the spanwise ply drops.
        let st = v["stations"].as_array().unwrap();
        let mut integral = 0.0;
        for w in st.windows(2) {
            let dr = f(&w[1]["r_m"]) - f(&w[0]["r_m"]);
            integral += 0.5 * dr * (f(&w[0]["mass_kg_m"]) + f(&w[1]["mass_kg_m"]));
        }
        let laminate = f(&v["blade_mass"]["laminate_kg"]);
        assert!(rel(integral, laminate) < 0.03, "{project}: {integral} vs {laminate} kg");
        let total = f(&v["blade_mass_kg"]);
        let points = f(&v["blade_mass"]["point_masses_kg"]);
        assert!(rel(total, laminate + points) < 1e-12 && points > 0.0);
    }
}

#[test]
fn text_summary_shows_cautions_mass_stations_and_grouped_warnings() {
    let (code, out, err) = layloft(&["sections", FAN]);
    assert_eq!(code, Some(0), "{err}");
    assert!(err.is_empty(), "{err}");
    let m = model(FAN);
    for needle in [
        "Sections of Invented demo: blade of a 1.8 m diameter variable-pitch mine ventilation fan",
        "Caution",
        "Design aid only",
        "EA MN",
        "EI flap kN·m²",
        "GJ kN·m²",
        "EC y/c",
    ] {
        assert!(out.contains(needle), "lacks {needle}:\n{out}");
    }
    // Warnings like one another are grouped with the stations they concern (the small wind
    // blade's thick walls; the mine fan's trailing-edge wedges are too small to change a result
    // and are not noted).
    let (code, wind, err) = layloft(&["sections", "layups/small-wind"]);
    assert_eq!(code, Some(0), "{err}");
    for needle in ["Warnings", "(and alike at"] {
        assert!(wind.contains(needle), "lacks {needle}:\n{wind}");
    }
    let mass = layloft::report::sig4(m.mass().total_kg);
    assert!(out.contains(&format!("mass {mass} kg")), "{out}");
    // One row per station: r, chord and EA in MN as the library has them.
    for st in &m.stations {
        let p = &st.section.properties;
        let row = out
            .lines()
            .find(|l| l.trim_start().starts_with(&format!("{:.5} ", p.r)))
            .unwrap_or_else(|| panic!("no row for r = {}:\n{out}", p.r));
        assert!(row.contains(&layloft::report::sig4(p.ea / 1e6)), "{row}");
        let ec = p.elastic_centre[0] / p.chord + st.layout.pitch_axis_frac;
        assert!(row.contains(&format!("{ec:.3}")), "{row}");
    }
}

#[test]
fn at_solves_the_radii_asked_for() {
    let v = json(&[FAN, "--at", "0.5, 0.8"]);
    let st = v["stations"].as_array().unwrap();
    assert_eq!(st.len(), 2);
    assert_eq!(f(&st[0]["r_m"]), 0.5);
    assert_eq!(f(&st[1]["r_m"]), 0.8);
    // The same section as the analysis station at that radius (0.4 + 0.025 k in this demo).
    let m = model(FAN);
    let same = m.stations.iter().find(|s| (s.layout.r - 0.5).abs() < 1e-12).unwrap();
    assert!(rel(f(&st[0]["EA_N"]), same.section.properties.ea) < 1e-12);
    assert!(rel(f(&st[0]["GJ_Nm2"]), same.section.properties.gj) < 1e-12);
}

#[test]
fn csv_has_units_in_every_column_and_the_json_values() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("sections.csv");
    let v = json(&[WIND, "--csv", path.to_str().unwrap()]);
    let text = std::fs::read_to_string(&path).unwrap();
    let mut lines = text.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let units = ["_m", "_N", "_Nm", "_Nm2", "_deg", "_kg_m", "_m2", "_frac"];
    for h in &header {
        assert!(units.iter().any(|u| h.ends_with(u)), "column '{h}' carries no unit");
    }
    for key in ["r_m", "EA_N", "EI_flap_Nm2", "GJ_Nm2", "mass_kg_m", "shear_centre_y_m"] {
        assert!(header.contains(&key), "{key}");
    }
    let rows: Vec<Vec<f64>> =
        lines.map(|l| l.split(',').map(|c| c.parse::<f64>().unwrap()).collect()).collect();
    let st = v["stations"].as_array().unwrap();
    assert_eq!(rows.len(), st.len());
    for (row, s) in rows.iter().zip(st) {
        assert_eq!(row.len(), header.len());
        for (h, x) in header.iter().zip(row) {
            assert!(rel(*x, f(&s[*h])) < 1e-15 || *x == f(&s[*h]), "{h}: {x} vs {}", s[*h]);
        }
    }
    // Written atomically: nothing else is left in the folder.
    assert_eq!(std::fs::read_dir(dir.path()).unwrap().count(), 1);
}

/// Whether `text` holds an '&' that starts no entity our writer uses, or a '>'.
fn raw_markup(text: &str) -> bool {
    let mut t = text.to_string();
    for e in ["&amp;", "&lt;", "&gt;", "&quot;", "&apos;"] {
        t = t.replace(e, "");
    }
    t.contains('&') || t.contains('>')
}

/// A small check that `text` is well-formed XML as our writer makes it: balanced tags, quoted
/// attributes, no raw '&' or '<' in text, one root element.
fn well_formed(text: &str) -> Result<(), String> {
    let mut stack: Vec<String> = Vec::new();
    let mut rest = text;
    let mut roots = 0;
    while let Some(open) = rest.find('<') {
        if raw_markup(&rest[..open]) {
            return Err(format!("raw '&' or '>' in text: {}", &rest[..open]));
        }
        let close = rest[open..].find('>').ok_or("unclosed tag")? + open;
        let tag = &rest[open + 1..close];
        rest = &rest[close + 1..];
        if let Some(name) = tag.strip_prefix('/') {
            match stack.pop() {
                Some(top) if top == name.trim() => {}
                other => return Err(format!("</{name}> closes {other:?}")),
            }
            continue;
        }
        if tag.matches('"').count() % 2 != 0 || tag.contains('<') || raw_markup(tag) {
            return Err(format!("bad attributes in <{tag}>"));
        }
        let name = tag.split_whitespace().next().unwrap_or_default().trim_end_matches('/');
        if stack.is_empty() {
            roots += 1;
        }
        if !tag.ends_with('/') {
            stack.push(name.to_string());
        }
    }
    if !stack.is_empty() || roots != 1 || !rest.trim().is_empty() {
        return Err(format!("unbalanced: {stack:?}, {roots} roots"));
    }
    Ok(())
}

#[test]
fn svg_drawings_are_well_formed_to_scale_and_name_the_centres() {
    let dir = tempfile::tempdir().unwrap();
    let out: PathBuf = dir.path().join("new/drawings");
    let (code, stdout, err) =
        layloft(&["sections", FAN, "--at", "0.4,0.65", "--svg", out.to_str().unwrap()]);
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("wrote 2 section drawings"), "{err}");
    assert!(stdout.contains("Stations"));
    let mut names: Vec<String> = std::fs::read_dir(&out)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    assert_eq!(names, ["section-r0.400.svg", "section-r0.650.svg"]);
    let m = model(FAN);
    for (name, r) in [("section-r0.400.svg", 0.4), ("section-r0.650.svg", 0.65)] {
        let svg = std::fs::read_to_string(out.join(name)).unwrap();
        well_formed(&svg).unwrap_or_else(|e| panic!("{name}: {e}"));
        assert!(svg.starts_with("<svg xmlns=\"http://www.w3.org/2000/svg\""));
        assert!(!svg.contains("NaN") && !svg.contains("inf"), "{name}");
        for needle in ["elastic centre", "shear centre", "mass centre", "pitch axis", "web main: "]
        {
            assert!(svg.contains(needle), "{name} lacks {needle}");
        }
        assert!(svg.contains("skin-out/skin-biax/"), "{name}: legend without ply stacks");
        // The centres in the legend are the solver's, in mm.
        let blade = layloft::blade::Blade::from_project(&m.project).unwrap();
        let (layout, _) =
            blade.section_layout_with_plies(r, m.project.sections.contour_points).unwrap();
        let p = layloft::section::solve_section(&layout, &Default::default()).unwrap();
        let ec = format!("elastic centre, y = {:.1} mm", p.elastic_centre[0] * 1e3);
        assert!(svg.contains(&ec), "{name} lacks {ec}");
        // To scale: the chord line, from the leading edge to the trailing edge, is the chord in
        // mm (three decimals written: 2e-3 mm), and the outer line spans about as much (camber
        // moves the leading-edge and trailing-edge points a little off the chord's ends).
        let chord_line = svg
            .split("<path d=\"")
            .skip(1)
            .filter_map(|p| p.split('"').next())
            .filter(|d| d.matches('M').count() == 1 && d.matches('H').count() == 1)
            .filter(|d| !d.contains(['L', 'V', 'Z']))
            .filter_map(|d| {
                let (start, end) = d.trim_start_matches('M').split_once('H')?;
                let x0: f64 = start.split_whitespace().next()?.parse().ok()?;
                Some(end.trim().parse::<f64>().ok()? - x0)
            })
            .fold(0.0, f64::max);
        assert!((chord_line - p.chord * 1e3).abs() < 2e-3, "{name}: chord line {chord_line} mm");
        let clip = svg.split("<clipPath").nth(1).unwrap();
        let d = clip.split(" d=\"").nth(1).unwrap().split('"').next().unwrap();
        let xs: Vec<f64> = d
            .split(['M', 'L'])
            .filter_map(|pt| pt.split_whitespace().next()?.parse().ok())
            .collect();
        let span = xs.iter().cloned().fold(f64::MIN, f64::max)
            - xs.iter().cloned().fold(f64::MAX, f64::min);
        assert!(rel(span, p.chord * 1e3) < 0.01, "{name}: outline spans {span} mm");
        let width: f64 =
            svg.split("viewBox=\"0 0 ").nth(1).unwrap().split(' ').next().unwrap().parse().unwrap();
        assert!(svg.contains(&format!("width=\"{}mm\"", svg_number(width))));
    }
}

fn svg_number(v: f64) -> String {
    let s = format!("{v:.3}");
    s.trim_end_matches('0').trim_end_matches('.').to_string()
}

#[test]
fn files_that_cannot_be_written_give_exit_status_3_and_no_output() {
    let dir = tempfile::tempdir().unwrap();
    let file = dir.path().join("plain-file");
    std::fs::write(&file, "x").unwrap();
    let (code, stdout, err) = layloft(&["sections", FAN, "--svg", file.to_str().unwrap()]);
    assert_eq!(code, Some(3), "{err}");
    assert!(stdout.is_empty());
    assert!(err.contains("layloft: error: --svg") && err.contains("plain-file"), "{err}");
    let csv = dir.path().join("missing/sections.csv");
    let (code, stdout, err) = layloft(&["sections", FAN, "--csv", csv.to_str().unwrap()]);
    assert_eq!(code, Some(3), "{err}");
    assert!(stdout.is_empty());
    assert!(err.contains("the folder") && err.contains("does not exist"), "{err}");
}

#[test]
fn help_shows_an_example() {
    let (code, out, _) = layloft(&["sections", "--help"]);
    assert_eq!(code, Some(0));
    assert!(out.contains("Examples:") && out.contains("layloft sections layups/mine-fan"));
    assert!(out.contains("--at") && out.contains("--svg") && out.contains("--csv"));
}

#[test]
fn a_twisted_blade_warns_of_the_area_its_sections_do_not_see() {
    // A blade of constant chord and section (NACA 0006, pitch axis at 0.35 chord) twisted at a
    // constant rate k = 300°/m: its surface is nearly a helicoid, whose area per unit radius
    // over a chordwise line y ∈ [y0, y1] is ∫ √(1 + k² y²) dy = [y √(1 + k² y²) + asinh(k y) /
    // k] / 2 (the helicoid's area element; do Carmo, *Differential Geometry of Curves and
    // Surfaces*, §2-5, from memory). The sections, cut square to the span, see the chord
    // length; the warning gives the ratio, here about 1.08, within 3 % of its excess (the
    // section's thickness turns its normal from the chord's near the nose).
    let dir = tempfile::tempdir().unwrap();
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("layups/mine-fan");
    for entry in std::fs::read_dir(&root).unwrap() {
        let entry = entry.unwrap();
        std::fs::copy(entry.path(), dir.path().join(entry.file_name())).unwrap();
    }
    let (c, k_deg) = (0.25, 300.0);
    let mut stations = String::from("r_m,chord_m,twist_deg,pitch_axis_frac,airfoil\n");
    for i in 0..=5 {
        let r = 0.40 + 0.1 * i as f64;
        stations += &format!("{r:.2},{c},{:.3},0.35,naca0006\n", 80.0 - k_deg * (r - 0.40));
    }
    std::fs::write(dir.path().join("stations.csv"), stations).unwrap();
    let project = read_project(&dir.path().join("blade.toml")).unwrap();
    let model = BladeModel::build(project).unwrap();
    let factor = model
        .blade
        .warnings()
        .iter()
        .find_map(|w| match w {
            layloft::blade::BladeWarning::Leaning { factor, .. } => Some(*factor),
            _ => None,
        })
        .expect("a leaning surface is warned of");
    let k = f64::to_radians(k_deg);
    let area = |y: f64| 0.5 * (y * (1.0 + k * k * y * y).sqrt() + (k * y).asinh() / k);
    let helicoid = (area(0.65 * c) - area(-0.35 * c)) / c;
    assert!(
        ((factor - 1.0) / (helicoid - 1.0) - 1.0).abs() < 0.03,
        "{factor} against the helicoid's {helicoid}"
    );
    // Untwisted, the same blade's surface runs along the span: no warning.
    let flat = std::fs::read_to_string(dir.path().join("stations.csv"))
        .unwrap()
        .lines()
        .map(|l| {
            let f: Vec<&str> = l.split(',').collect();
            if f[0] == "r_m" {
                l.to_string()
            } else {
                format!("{},{},10,{},{}", f[0], f[1], f[3], f[4])
            }
        })
        .collect::<Vec<_>>()
        .join("\n");
    std::fs::write(dir.path().join("stations.csv"), flat).unwrap();
    let model = BladeModel::build(read_project(&dir.path().join("blade.toml")).unwrap()).unwrap();
    assert!(
        !model
            .blade
            .warnings()
            .iter()
            .any(|w| matches!(w, layloft::blade::BladeWarning::Leaning { .. })),
        "no lean without twist or taper"
    );
}

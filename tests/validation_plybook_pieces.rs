//! The ply book made whole: a ply region that cannot be draped in one piece is cut into pieces
//! that can, and the kit then holds every ply of the schedule. Checked against independent
//! computations: the pieces of a region tile it (their span and chord ranges, and their areas
//! against the region's area on a fine triangle mesh of the surface), and the kit's mass
//! against the blade's laminate mass integrated by `sections` (the outline rule of
//! `blade::mass`, which never drapes anything).
//!
//! The blades: the invented demos, and a generated blade not in the repository (the mine-fan
//! outline made wider and more twisted, an unsymmetric schedule with a thick foam ramp under a
//! ±45° fabric on the upper skin only, and a fabric at 30° over the whole lower skin).

use std::path::Path;
use std::sync::OnceLock;

use crate::common::mesh_area;
use crate::common::shared::shared_ply_book;
use layloft::analysis::BladeModel;
use layloft::blade::Blade;
use layloft::input::read_project;
use layloft::plybook::{PlyBook, PlyBookParams, build_ply_book, ply_regions};
use layloft::project::Project;

fn demo(name: &str) -> Project {
    read_project(format!("layups/{name}/blade.toml").as_ref()).expect("demo project")
}

/// The generated blade in `dir` (see the module docs).
fn generated(dir: &Path) -> Project {
    generated_with(
        dir,
        "ply,material,angle_deg,r_start_m,r_end_m,region,from,to\n\
         outer,carbon-twill,45,0.40,0.90,both,0.00,1.00\n\
         skin,glass-biax,0,0.40,0.90,both,0.00,1.00\n\
         cap,carbon-ud,0,0.40,0.85,both,0.15,0.45\n\
         ramp-core,pvc-foam,0,0.50,0.80,upper,0.45,0.80\n\
         over-ramp,glass-biax,45,0.40,0.90,upper,0.00,1.00\n\
         lower-30,carbon-twill,30,0.40,0.90,lower,0.00,1.00\n\
         web-face-1,glass-biax,45,0.40,0.90,web:main,,\n\
         web-core,pvc-foam,0,0.40,0.90,web:main,,\n\
         web-face-2,glass-biax,45,0.40,0.90,web:main,,\n",
    )
}

/// The generated blade's outline in `dir` with the schedule `plies` (a `plies.csv`).
fn generated_with(dir: &Path, plies: &str) -> Project {
    let src = Path::new("layups/mine-fan");
    for f in ["blade.toml", "materials.toml", "tip-section.dat"] {
        std::fs::copy(src.join(f), dir.join(f)).expect("copy");
    }
    for f in ["loads-nominal.csv", "loads-overspeed.csv", "loads-surge.csv"] {
        std::fs::copy(src.join(f), dir.join(f)).expect("copy");
    }
    let stations = std::fs::read_to_string(src.join("stations.csv")).expect("stations");
    let mut out = String::new();
    for line in stations.lines() {
        let cells: Vec<&str> = line.split(',').collect();
        match cells[0].parse::<f64>() {
            Ok(_) if cells.len() == 5 => {
                let chord: f64 = cells[1].parse().expect("chord");
                let twist: f64 = cells[2].parse().expect("twist");
                out.push_str(&format!(
                    "{},{:.4},{:.2},{},{}\n",
                    cells[0],
                    1.3 * chord,
                    1.25 * twist,
                    cells[3],
                    cells[4]
                ));
            }
            _ => {
                out.push_str(line);
                out.push('\n');
            }
        }
    }
    std::fs::write(dir.join("stations.csv"), out).expect("stations");
    std::fs::write(dir.join("plies.csv"), plies).expect("plies");
    read_project(&dir.join("blade.toml")).expect("generated project")
}

fn book(project: &Project, blade: &Blade) -> PlyBook {
    build_ply_book(blade, project, &PlyBookParams::default()).expect("ply book")
}

/// A demo's model (sections at no extra radii) and its ply book with the default settings, built
/// once for every test of the binary that reads them: the book of a demo is the slowest thing
/// these tests compute, and a test that comes second waits for the first instead of repeating it.
fn demo_book(name: &str) -> (&'static BladeModel, &'static PlyBook) {
    static SMALL_WIND: OnceLock<BladeModel> = OnceLock::new();
    static MINE_FAN: OnceLock<BladeModel> = OnceLock::new();
    let cell = match name {
        "small-wind" => &SMALL_WIND,
        "mine-fan" => &MINE_FAN,
        other => panic!("no demo called {other}"),
    };
    let model = cell.get_or_init(|| BladeModel::build_at(demo(name), &[]).expect("model"));
    // The book of the model's own project (its blade is lofted from it), shared with the other
    // files of the binary that read the same book.
    (model, shared_ply_book(&model.project, &PlyBookParams::default()))
}

/// Every region of the schedule is in the kit, whole or in pieces that tile it: the pieces'
/// span × chord ranges add up to the region's, and their flat areas to the region's area on
/// the surface (the cloth is inextensible; a sheared cell covers cos(g) of its flat area, Mack
/// & Taylor 1956, so the pieces may exceed the region by up to 1/cos(g_max) − 1).
fn check_complete(blade: &Blade, book: &PlyBook) -> usize {
    assert!(book.failed.is_empty(), "left out: {:?}", book.failed);
    let regions = ply_regions(blade, &PlyBookParams::default()).unwrap();
    let mut split = 0;
    for region in &regions {
        let ply = blade.ply(region.ply).expect("ply");
        let pieces: Vec<_> = book
            .patterns
            .iter()
            .filter(|e| e.ply == ply.id && e.surface == region.surface_name)
            .collect();
        assert!(!pieces.is_empty(), "{} {}: no pattern", ply.id, region.surface_name);
        // The pieces tile the region's parameter rectangle (span × chord fraction).
        let span = region.span();
        let rect = |e: &layloft::plybook::PatternEntry| {
            let c = e.chord_range.unwrap_or([0.0, 1.0]);
            (e.r_range[1] - e.r_range[0]) * (c[1] - c[0])
        };
        let whole = {
            let c = pieces[0].chord_range.map_or([0.0, 1.0], |_| [ply.from, ply.to]);
            (span[1] - span[0]) * (c[1] - c[0])
        };
        let tiled: f64 = pieces.iter().map(|e| rect(e)).sum();
        assert!(
            (tiled - whole).abs() < 1e-9 * whole.max(1.0),
            "{}: pieces {tiled} of {whole}",
            ply.id
        );
        for (a, e) in pieces.iter().enumerate() {
            for f in &pieces[a + 1..] {
                let c1 = e.chord_range.unwrap_or([0.0, 1.0]);
                let c2 = f.chord_range.unwrap_or([0.0, 1.0]);
                let overlap_r = e.r_range[1].min(f.r_range[1]) - e.r_range[0].max(f.r_range[0]);
                let overlap_c = c1[1].min(c2[1]) - c1[0].max(c2[0]);
                assert!(
                    overlap_r <= 1e-12 || overlap_c <= 1e-12,
                    "{} and {} overlap",
                    e.name,
                    f.name
                );
            }
        }
        if pieces.iter().any(|e| !e.pattern.cut_short.is_empty()) {
            continue;
        }
        let (a1, a2) = (mesh_area(region, 200, 60), mesh_area(region, 400, 120));
        let surface = a2 + (a2 - a1) / 3.0;
        let area: f64 = pieces.iter().map(|e| e.area_m2).sum();
        let shear = pieces.iter().map(|e| e.pattern.max_shear.abs()).fold(0.0, f64::max);
        let rel = (area - surface) / surface;
        let allowance = (1.0 / shear.cos() - 1.0).clamp(5e-3, 0.03);
        assert!(
            rel > -5e-3 && rel < allowance,
            "{} {}: {} pieces {area} m², surface {surface} m² ({rel:e}, shear {}°)",
            ply.id,
            region.surface_name,
            pieces.len(),
            shear.to_degrees()
        );
        if pieces.len() > 1 {
            split += 1;
            for (k, e) in pieces.iter().enumerate() {
                assert!(e.name.ends_with(&format!("-{}", (b'a' + k as u8) as char)), "{}", e.name);
            }
        }
    }
    split
}

#[test]
fn every_ply_of_the_demos_is_in_the_kit() {
    // Before the split, small-wind `skin-2` (both skins) and mine-fan `skin-out` (both skins)
    // could not be draped whole and were left out with a warning.
    for name in ["small-wind", "mine-fan"] {
        let (model, book) = demo_book(name);
        let split = check_complete(&model.blade, book);
        assert!(split >= 2, "{name}: {split} regions cut in pieces");
        assert!(!book.splices.is_empty(), "{name}: the splices are described");
    }
}

#[test]
fn a_generated_blade_with_a_ramp_is_cut_into_pieces_that_drape() {
    let dir = tempfile::tempdir().expect("tempdir");
    let project = generated(dir.path());
    let blade = Blade::from_project(&project).expect("blade");
    let book = book(&project, &blade);
    // The ±45° and 30° fabrics over the whole wider, more twisted skin will not drape whole
    // (when written: `outer` both skins, `over-ramp`, `lower-30`, each in two pieces).
    let split = check_complete(&blade, &book);
    assert!(split >= 2, "only {split} regions cut in pieces");
    // Each pattern, piece or whole, is a pattern the net covers without folding.
    for e in &book.patterns {
        assert!(e.pattern.cut_short.is_empty(), "{} cut short", e.name);
        assert!(e.area_m2 > 0.0, "{}", e.name);
    }
}

/// The sum of the ply masses against the blade's laminate mass from `sections`. The two are
/// computed independently: the blade's mass weighs each station's section with every ply at its
/// depth (a ply laid on others lies on a curve moved inward by their thickness, shorter than the
/// outer mould line: Steiner's formula for parallel curves), the webs between the skins; the ply
/// book weighs the flat patterns cut on each ply's own level. The sections are cut square to the
/// span, where the surface runs on a slant with twist and taper: its area exceeds the contour
/// swept along the span by the lean ratio [`lean_ratio`], by which the sections' mass is scaled
/// here. Left in, and making the patterns the heavier: a sheared cell of cloth covers cos(g) of
/// its flat area on the mould (Mack & Taylor 1956), so a pattern that shears is larger than the
/// surface it covers. Before the blade's mass counted plies at their depth, this test took the
/// inward offset of the plies laid all round out of the sections' mass by hand, without the
/// lean (+0.48 % small-wind, +0.40 % mine-fan, +0.42 % generated). Issue 17 asks 0.5 %.
fn check_mass(model: &BladeModel, book: &PlyBook) -> (f64, f64) {
    (book.pattern_mass_kg(), model.mass().laminate_kg * lean_ratio(&model.blade))
}

/// The outer mould line's area in the rotor frame over that of its contours swept along the
/// span (each section's perimeter times `dr`), by central differences of the surface's points
/// on a 100 × 2·200 grid: 1 for a prismatic untwisted blade, more where twist and taper lean
/// the surface (the area element `|∂P/∂r × ∂P/∂u|` against `|∂P/∂u|`, any calculus text).
fn lean_ratio(blade: &Blade) -> f64 {
    use layloft::blade::Surface;
    let surfaces = blade.surfaces();
    let pitch = blade.rotor().pitch;
    let (r0, r1) = (blade.root_radius(), blade.tip_radius());
    let point = |r: f64, surface: Surface, u: f64| {
        let c = surfaces.outer(r, surface, u);
        let (s, co) = (blade.twist(r) + pitch).rad().sin_cos();
        [r, c[0] * co - c[1] * s, c[0] * s + c[1] * co]
    };
    let (n, m, h) = (100, 200, 1e-5);
    let (mut area, mut swept) = (0.0, 0.0);
    for i in 0..n {
        let r = r0 + (r1 - r0) * (i as f64 + 0.5) / n as f64;
        for surface in [Surface::Upper, Surface::Lower] {
            for j in 0..m {
                let (ua, ub) = (j as f64 / m as f64, (j + 1) as f64 / m as f64);
                let um = 0.5 * (ua + ub);
                let d_u: Vec<f64> =
                    (0..3).map(|k| point(r, surface, ub)[k] - point(r, surface, ua)[k]).collect();
                let d_r: Vec<f64> = (0..3)
                    .map(|k| {
                        (point(r + h, surface, um)[k] - point(r - h, surface, um)[k]) / (2.0 * h)
                    })
                    .collect();
                let cross = [
                    d_r[1] * d_u[2] - d_r[2] * d_u[1],
                    d_r[2] * d_u[0] - d_r[0] * d_u[2],
                    d_r[0] * d_u[1] - d_r[1] * d_u[0],
                ];
                area += cross.iter().map(|v| v * v).sum::<f64>().sqrt();
                swept += d_u.iter().map(|v| v * v).sum::<f64>().sqrt();
            }
        }
    }
    area / swept
}

#[test]
fn the_kit_weighs_what_the_sections_weigh() {
    let dir = tempfile::tempdir().expect("tempdir");
    let generated = BladeModel::build_at(generated(dir.path()), &[]).expect("model");
    let generated_book = book(&generated.project, &generated.blade);
    let blades = [
        ("small-wind", demo_book("small-wind")),
        ("mine-fan", demo_book("mine-fan")),
        ("generated", (&generated, &generated_book)),
    ];
    for (name, (model, book)) in blades {
        let (plies, laminate) = check_mass(model, book);
        let rel = (plies - laminate) / laminate;
        eprintln!("{name}: plies {plies} kg, sections times the lean {laminate} kg ({rel:e})");
        assert!(rel.abs() < 5e-3, "{name}: plies {plies} kg, sections {laminate} kg ({rel:e})");
    }
}

/// The splice lines of a book, from its patterns alone: each piece's lower edge inside its ply's
/// region (the root-side edge at a radius, the leading-edge-side edge at a chord fraction), with
/// the ply, the surface and the range the line runs over.
struct Line {
    ply: String,
    order: usize,
    surface: String,
    across_span: bool,
    at: f64,
    extent: [f64; 2],
}

fn splice_lines(blade: &Blade, book: &PlyBook) -> Vec<Line> {
    let mut out = Vec::new();
    for e in &book.patterns {
        let ply = blade.ply(e.order - 1).expect("ply");
        let chord = e.chord_range.unwrap_or([0.0, 1.0]);
        let from = if e.chord_range.is_some() { ply.from } else { 0.0 };
        let root = ply.r_start.max(blade.root_radius());
        if e.r_range[0] > root + 1e-9 {
            out.push(Line {
                ply: e.ply.clone(),
                order: e.order,
                surface: e.surface.clone(),
                across_span: true,
                at: e.r_range[0],
                extent: chord,
            });
        }
        if chord[0] > from + 1e-9 {
            out.push(Line {
                ply: e.ply.clone(),
                order: e.order,
                surface: e.surface.clone(),
                across_span: false,
                at: chord[0],
                extent: e.r_range,
            });
        }
    }
    out
}

#[test]
fn the_splices_of_successive_plies_on_a_skin_are_staggered() {
    // Four plies of cloth over the whole skin of the generated blade, each at an angle that
    // will not drape whole, so that each is cut and all at the same middle if nothing moved
    // them: two both skins, one the upper skin, one the lower. Their parallel splices on one
    // skin must lie at least the stagger apart (25 mm, common practice), measured on the
    // surface: a radius difference for cuts across the span, the least chord of the overlap
    // times the chord-fraction difference for cuts along it (no longer than the surface's
    // arc between them).
    let dir = tempfile::tempdir().expect("tempdir");
    let project = generated_with(
        dir.path(),
        "ply,material,angle_deg,r_start_m,r_end_m,region,from,to\n\
         outer,carbon-twill,45,0.40,0.90,both,0.00,1.00\n\
         second,carbon-twill,-45,0.40,0.90,both,0.00,1.00\n\
         third,glass-biax,45,0.40,0.90,upper,0.00,1.00\n\
         fourth,carbon-twill,30,0.40,0.90,lower,0.00,1.00\n\
         web-face,glass-biax,45,0.40,0.90,web:main,,\n",
    );
    let blade = Blade::from_project(&project).expect("blade");
    let params = PlyBookParams::default();
    assert_eq!(params.stagger, 0.025);
    let book = book(&project, &blade);
    check_complete(&blade, &book);
    let lines = splice_lines(&blade, &book);
    for w in &book.warnings {
        let w = w.to_string();
        assert!(!w.contains("could not be kept"), "{w}");
    }
    let mut pairs = 0;
    for (k, a) in lines.iter().enumerate() {
        for b in &lines[k + 1..] {
            if a.ply == b.ply || a.surface != b.surface || a.across_span != b.across_span {
                continue;
            }
            let overlap = [a.extent[0].max(b.extent[0]), a.extent[1].min(b.extent[1])];
            if overlap[1] - overlap[0] <= 1e-9 {
                continue;
            }
            let distance = if a.across_span {
                (a.at - b.at).abs()
            } else {
                let least = (0..=50)
                    .map(|i| blade.chord(overlap[0] + (overlap[1] - overlap[0]) * i as f64 / 50.0))
                    .fold(f64::INFINITY, f64::min);
                least * (a.at - b.at).abs()
            };
            pairs += 1;
            eprintln!(
                "{} {} (ply {}) and {} (ply {}) at {:.4} and {:.4}: {:.1} mm",
                a.surface,
                a.ply,
                a.order,
                b.ply,
                b.order,
                a.at,
                b.at,
                distance * 1e3
            );
            assert!(
                distance >= 0.025 - 1e-9,
                "{}: splices of '{}' and '{}' {:.1} mm apart",
                a.surface,
                a.ply,
                b.ply,
                distance * 1e3
            );
        }
    }
    // Not vacuous: plies were cut along parallel lines on a shared skin.
    assert!(pairs >= 2, "only {pairs} pairs of parallel splices on one skin");
}

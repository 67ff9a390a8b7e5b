//! The ply book's pattern drawing in a real browser: a pattern draped on a cylinder panel (an
//! invented test case) is drawn by `pattern_svg` and shown in a report page, which Debian's
//! headless Chromium must load without a console message and with the drawing in its DOM; the
//! static markup check runs always (see `tests/report_browser.rs` for the harness). The same
//! for the report's ply-book block: its nesting drawings are inline figures that must render.

use layloft::plybook::{
    DrapeSurface, FabricKind, MaterialNesting, NestItem, PatternEntry, PatternPlace, PlyBook,
    RegionSpec, drape_region, nest, pattern_svg,
};
use layloft::report::html::HtmlReport;
use layloft::report::plybook_block;
use layloft::units::Angle;

use crate::support_browser::{browser_or_skip, screenshot_dir, static_problems};

struct Cylinder {
    r: f64,
}

impl DrapeSurface for Cylinder {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let t = p[0] / self.r;
        [self.r * t.cos(), self.r * t.sin(), p[1]]
    }
}

fn entry() -> PatternEntry {
    let boundary: Vec<[f64; 2]> = (0..40)
        .map(|k| {
            let t = k as f64 / 40.0 * std::f64::consts::TAU;
            [0.15 + 0.1 * t.cos(), 0.3 + 0.25 * t.sin()]
        })
        .collect();
    let spec = RegionSpec {
        boundary,
        seed: [0.15, 0.3],
        axis: [0.0, 0.0, 1.0],
        angle: 30f64.to_radians(),
        spacing: 0.005,
        root_mark: [0.15, 0.05],
    };
    let pattern = drape_region(&Cylinder { r: 0.2 }, &spec).expect("the panel drapes");
    let area = pattern.area;
    PatternEntry {
        name: "skin-1-upper".into(),
        ply: "skin-1".into(),
        order: 1,
        material: "glass-biax".into(),
        surface: "upper".into(),
        angle: Angle::from_deg(30.0),
        kind: FabricKind::Fabric,
        r_range: [0.05, 0.55],
        chord_range: Some([0.0, 1.0]),
        pattern,
        area_m2: area,
        thickness_m: 5e-4,
        mass_kg: area * 5e-4 * 1850.0,
        cost: None,
        locking_angle: 40f64.to_radians(),
        max_shear_place: PatternPlace { r: 0.3, along: 0.5 },
        max_deviation_place: PatternPlace { r: 0.3, along: 0.5 },
    }
}

#[test]
fn a_pattern_drawing_loads_cleanly_with_its_outline_arrow_and_notch() {
    let e = entry();
    let svg = pattern_svg(&e);
    // The drawing itself: true scale in mm, one outline polygon, the fibre arrow, the notch.
    assert!(svg.starts_with("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\""));
    assert!(svg.contains("mm\" height=\""));
    assert_eq!(svg.matches("<polygon").count(), 2, "outline and arrow head");
    assert_eq!(svg.matches("<polyline").count(), 1, "the root notch");
    assert!(svg.contains("skin-1 upper"));
    let mut doc = HtmlReport::new("Ply book drawing (invented test panel)");
    doc.section("Ply book").figure("pattern-skin-1-upper", "Pattern skin-1-upper.", &svg);
    let html = doc.render();
    let ids = doc.figure_ids();
    let problems = static_problems(&html, &ids);
    assert!(problems.is_empty(), "static check:\n{}", problems.join("\n"));
    let page = screenshot_dir().join("plybook-pattern.html");
    layloft::report::write_atomic(&page, html.as_bytes()).unwrap_or_else(|e| panic!("{e}"));
    let Some(browser) = browser_or_skip("the ply-book pattern") else { return };
    let shown = browser
        .render(&page, &screenshot_dir(), "plybook-pattern", (1280, 1600))
        .unwrap_or_else(|e| panic!("{} could not render {}: {e}", browser.program, page.display()));
    assert!(shown.console.is_empty(), "console messages: {:#?}", shown.console);
    assert_eq!(shown.figures, ids, "the drawing is in the browser's DOM");
}

#[test]
fn the_report_block_shows_each_nesting_drawing_inline() {
    // Two pieces of one material (the panel and its copy under another name), nested on a roll.
    let a = entry();
    let mut b = entry();
    b.name = "skin-1-lower".into();
    b.surface = "lower".into();
    let items: Vec<NestItem> = [&a, &b]
        .iter()
        .map(|e| NestItem { outline: e.pattern.outline.clone(), quarter_turns: true })
        .collect();
    let nesting = nest(&items, 1.27, 0.01).expect("the panel fits the roll");
    let book = PlyBook {
        project: "invented test panel".into(),
        patterns: vec![a, b],
        nestings: vec![MaterialNesting {
            material: "glass-biax".into(),
            nesting,
            patterns: vec![0, 1],
            areal_mass: 0.925,
            scrap_kg: 0.1,
            roll_cost: None,
        }],
        warnings: Vec::new(),
        failed: Vec::new(),
        splices: Vec::new(),
    };
    let block = plybook_block(&book, None, &layloft::input::Sources::default());
    assert_eq!(block.figures.len(), 1, "one nesting drawing per material");
    let (id, caption, svg) = &block.figures[0];
    assert!(caption.contains("glass-biax"), "{caption}");
    assert!(svg.starts_with("<svg"), "an inline SVG drawing");
    for name in ["skin-1-upper", "skin-1-lower"] {
        assert!(svg.contains(&format!(">{name}</text>")), "{name} labelled on the nesting");
    }
    let mut doc = HtmlReport::new("Ply book nesting (invented test panel)");
    let section = doc.section("Ply book");
    for (id, caption, svg) in &block.figures {
        section.figure(id.clone(), caption.clone(), svg.clone());
    }
    let html = doc.render();
    let ids = doc.figure_ids();
    assert_eq!(ids.len(), 1, "{ids:?} for {id}");
    let problems = static_problems(&html, &ids);
    assert!(problems.is_empty(), "static check:\n{}", problems.join("\n"));
    let page = screenshot_dir().join("plybook-nesting.html");
    layloft::report::write_atomic(&page, html.as_bytes()).unwrap_or_else(|e| panic!("{e}"));
    let Some(browser) = browser_or_skip("the ply-book nesting") else { return };
    let shown = browser
        .render(&page, &screenshot_dir(), "plybook-nesting", (1280, 1600))
        .unwrap_or_else(|e| panic!("{} could not render {}: {e}", browser.program, page.display()));
    assert!(shown.console.is_empty(), "console messages: {:#?}", shown.console);
    assert_eq!(shown.figures, ids, "the nesting drawing is in the browser's DOM");
}

//! The ply book of a whole blade against independent computations: the DXF files read back
//! through the same crate to the same outlines, and each pattern's area against its region's
//! area on the surface, integrated here on a fine triangle mesh of the surface (not through the
//! net). The blade is the invented mine-fan demo (`layups/mine-fan/`).

use std::io::Cursor;

use crate::common::mesh_area;
use crate::common::shared::shared_ply_book;
use layloft::blade::Blade;
use layloft::input::read_project;
use layloft::plybook::{PlyBook, PlyBookParams, pattern_dxf, ply_regions};

fn mine_fan() -> (layloft::project::Project, Blade) {
    let project = read_project("layups/mine-fan/blade.toml".as_ref()).expect("demo project");
    let blade = Blade::from_project(&project).expect("demo blade");
    (project, blade)
}

/// The demo's ply book with the default settings (built once for the binary's tests, see
/// tests/common/shared.rs).
fn book(project: &layloft::project::Project, _blade: &Blade) -> &'static PlyBook {
    shared_ply_book(project, &PlyBookParams::default())
}

#[test]
fn dxf_files_read_back_to_the_same_outlines() {
    let (project, blade) = mine_fan();
    let book = book(&project, &blade);
    assert!(book.patterns.len() >= 20, "only {} patterns", book.patterns.len());
    for e in &book.patterns {
        let bytes = pattern_dxf(e).expect("dxf");
        // Read through the same crate the files are written with (`dxf`).
        let drawing = dxf::Drawing::load(&mut Cursor::new(bytes)).expect("the DXF reads back");
        let outlines: Vec<_> = drawing
            .entities()
            .filter(|ent| ent.common.layer == "OUTLINE")
            .filter_map(|ent| match &ent.specific {
                dxf::entities::EntityType::LwPolyline(p) => Some(p.clone()),
                _ => None,
            })
            .collect();
        assert_eq!(outlines.len(), 1, "{}: one closed outline", e.name);
        let poly = &outlines[0];
        assert!(poly.is_closed(), "{}: the outline is closed", e.name);
        assert_eq!(poly.vertices.len(), e.pattern.outline.len(), "{}", e.name);
        let worst = poly
            .vertices
            .iter()
            .zip(&e.pattern.outline)
            .map(|(v, q)| (v.x - q[0] * 1e3).hypot(v.y - q[1] * 1e3))
            .fold(0.0, f64::max);
        // DXF stores the coordinates in mm as decimal text; a micrometre is far below any cut.
        assert!(worst < 1e-3, "{}: outline moved by {worst} mm", e.name);
        for layer in ["FIBRE", "NOTCH", "LABEL"] {
            assert!(
                drawing.entities().any(|ent| ent.common.layer == layer),
                "{}: no {layer} entity",
                e.name
            );
        }
    }
}

#[test]
fn each_pattern_keeps_its_region_area_on_the_surface() {
    let (project, blade) = mine_fan();
    let book = book(&project, &blade);
    let regions = ply_regions(&blade, &PlyBookParams::default()).unwrap();
    let mut checked = 0;
    for e in book.patterns.iter().filter(|e| e.pattern.cut_short.is_empty()) {
        let region = regions
            .iter()
            .find(|r| {
                blade.ply(r.ply).is_some_and(|p| p.id == e.ply) && r.surface_name == e.surface
            })
            .expect("the pattern's region");
        // A piece of a region cut in pieces is checked with its fellows, their areas summed,
        // in `validation_plybook_pieces`.
        let ply = blade.ply(region.ply).expect("ply");
        let whole_chord = e.chord_range.is_none_or(|c| c == [ply.from, ply.to]);
        if e.r_range != region.span() || !whole_chord {
            continue;
        }
        // The mesh converges at second order: two meshes give the Richardson estimate.
        let (a1, a2) = (mesh_area(region, 200, 60), mesh_area(region, 400, 120));
        let surface = a2 + (a2 - a1) / 3.0;
        let rel = (e.area_m2 - surface) / surface;
        // Issue 17 asks 0.5 %. The cloth is inextensible: a cell sheared by g covers cos(g) of
        // its flat area on the surface, so a pattern is larger than its region by up to
        // 1/cos(g_max) - 1 where the fabric shears (Mack & Taylor 1956, the net's cell
        // geometry). Held to 0.5 % below and to 0.5 % or that shear allowance above, whichever
        // is larger; most of the demo's patterns shear under 5° and meet 0.5 % plainly.
        let allowance = (1.0 / e.pattern.max_shear.cos() - 1.0).max(5e-3);
        assert!(
            rel > -5e-3 && rel < allowance,
            "{}: pattern {} m², surface {} m² ({rel:e}, shear {}°)",
            e.name,
            e.area_m2,
            surface,
            e.pattern.max_shear.to_degrees()
        );
        if e.pattern.max_shear.to_degrees().abs() < 5.0 {
            assert!(rel.abs() < 5e-3, "{}: {rel:e} with little shear", e.name);
        }
        checked += 1;
    }
    assert!(checked >= 20, "only {checked} patterns checked");
}

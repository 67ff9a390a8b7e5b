//! Core prints seated in the mould's end pieces, and cast with their cores: on the invented
//! mine-fan demo (spherical ends, prints at the root), a copy with an invented rear web that
//! ends inside the span (one core prints through the tip) and the demo with planar ends (square
//! ends that need no end piece for their own draft get one where a print leaves).
//!
//! Sources and methods:
//! - Inside or outside a closed triangle mesh: the parity of the crossings of a ray with its
//!   facets (Jordan curve theorem; ray–triangle test of Möller & Trumbore, J. Graphics Tools 2
//!   (1997) 21–28), in `tests/common`, independent of the library's mesh code.
//! - A print in its seat (geometry): at points on the print's wall between the shell and its
//!   end face, moved out across the pitch axis by half the stated clearance, there is no mould
//!   (the gap); moved out by twice the clearance, the end piece; just past the print's end face
//!   along the pitch axis, the end piece (the print bears on the seat's floor).
//! - Draft: the library's draft evaluator along each part's pull (`asin(n·d)`, the local test
//!   of mould design, common practice); a print tapered by the least draft and 1° leaves every
//!   facet of its seat at least at the least draft.
//! - Volume balance (Cavalieri): the block is the mould parts, the shell and the cores with
//!   their prints, to 0.1 % (the seats' clearance gaps and the chords of the end caps are far
//!   smaller).
//! - Casting: the cavity is the core with its print scaled by `1 + s` about the rotor centre,
//!   so its volume is the printed core's times `(1 + s)³` (similar solids), to the mesh's
//!   tolerance (the casting mould lofts the core again, parted for its own pull).

use std::path::Path;

use crate::common::shared::shared_tooling;
use crate::common::{inside_mesh, mine_fan_with_rear_web};
use layloft::input::read_project;
use layloft::mesh::{CheckParams, End, check_solid};
use layloft::tooling::{BladeTooling, EndShape, PartKind, ToolingParams};

/// The tooling of `project` (shared with the other tests that build the same, see
/// tests/common/shared.rs).
fn build(project: &Path, ends: EndShape) -> &'static BladeTooling {
    let project = read_project(project).expect("the project reads");
    let spec = project.tooling.as_ref().expect("[tooling]");
    // Prints of half the core's end section (0.5, 15 mm long), the default, asked for explicitly.
    let params = ToolingParams {
        tolerance: 0.5e-3,
        ends,
        print_fraction: 0.5,
        ..ToolingParams::from_spec(spec).unwrap()
    };
    shared_tooling(&project, &params)
}

fn demo() -> std::path::PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("layups/mine-fan/blade.toml")
}

/// Every print sits in its seat with the stated clearance; returns how many points were tried.
fn check_seats(t: &BladeTooling) -> usize {
    let mut tried = 0;
    for p in &t.prints {
        let c = p.seat_clearance.expect("every print has a seat");
        assert!((c - 0.1e-3).abs() < 1e-15, "{}: clearance {c}", p.core);
        let name = match p.end {
            End::Root => "mould-root-end",
            End::Tip => "mould-tip-end",
        };
        let piece = &t.parts.iter().find(|x| x.name == name).expect("an end piece").mesh;
        let n = p.outlet.len();
        assert_eq!(p.port.len(), n);
        // The outlet's winding, for the outward normal of each side.
        let area2: f64 = (0..n)
            .map(|i| {
                let (a, b) = (p.outlet[i], p.outlet[(i + 1) % n]);
                a[0] * b[1] - b[0] * a[1]
            })
            .sum();
        for i in (0..n).step_by((n / 24).max(1)) {
            let j = (i + 1) % n;
            let (a, b) = (p.outlet[i], p.outlet[j]);
            let tng = [b[0] - a[0], b[1] - a[1]];
            let len = tng[0].hypot(tng[1]);
            if len < 2e-4 {
                continue;
            }
            let out = [area2.signum() * tng[1] / len, -area2.signum() * tng[0] / len];
            for f in [0.25, 0.5, 0.75] {
                // A point on the print's wall: along the side's middle line from the port to
                // the end face (both ends of the side run on straight lines).
                let mid = |q: [f64; 3], r: [f64; 3]| {
                    [0.5 * (q[0] + r[0]), 0.5 * (q[1] + r[1]), 0.5 * (q[2] + r[2])]
                };
                let from = mid(p.port[i], p.port[j]);
                let to = [p.x_end, 0.5 * (a[0] + b[0]), 0.5 * (a[1] + b[1])];
                let w = [0, 1, 2].map(|k| from[k] + f * (to[k] - from[k]));
                let at = |d: f64| [w[0], w[1] + d * out[0], w[2] + d * out[1]];
                assert!(!inside_mesh(piece, at(0.5 * c)), "{}: mould in the gap at {w:?}", p.core);
                assert!(
                    inside_mesh(piece, at(2.0 * c + 1e-5)),
                    "{}: no seat wall at {w:?}",
                    p.core
                );
                tried += 2;
            }
        }
        // The floor: just beyond the end face the end piece, just inside it the print.
        let cn = p
            .outlet
            .iter()
            .fold([0.0, 0.0], |s, q| [s[0] + q[0] / n as f64, s[1] + q[1] / n as f64]);
        let sign = if p.end == End::Root { -1.0 } else { 1.0 };
        assert!(inside_mesh(piece, [p.x_end + sign * 0.2e-3, cn[0], cn[1]]), "{}: floor", p.core);
        assert!(
            !inside_mesh(piece, [p.x_end - sign * 0.2e-3, cn[0], cn[1]]),
            "{}: in seat",
            p.core
        );
    }
    tried
}

/// Every mould part closed and outward, drawing at the least draft; the block balanced.
fn check_mould(t: &BladeTooling) {
    // Every print keeps its taper (a section too shallow for it is cut, not made straight).
    for p in &t.prints {
        let least = t.params.min_draft.deg() + 1.0;
        assert!((p.taper.deg() - least).abs() < 1e-9, "{}: taper {}", p.core, p.taper.deg());
    }
    for part in &t.parts {
        check_solid(&part.mesh, &part.name, &CheckParams::default()).expect("closed, outward");
    }
    let least = t.params.min_draft.deg();
    for h in t.moulds.iter().chain(&t.end_pieces) {
        assert_eq!(h.draft.undercut_area, 0.0, "{}", h.side);
    }
    for h in &t.end_pieces {
        // The seat's walls lean by the taper, its floor faces the pull: at least the least draft
        // (where every print at that end kept its taper; a section too thin for it is straight).
        let end = if h.side == "root end" { End::Root } else { End::Tip };
        if t.prints.iter().any(|p| p.end == end && p.taper.deg() <= 0.0) {
            continue;
        }
        assert!(h.draft.min_draft.deg() >= least, "{}: {}", h.side, h.draft.min_draft.deg());
        assert_eq!(h.draft.below_min_area, 0.0, "{}", h.side);
    }
    let v = |kind: PartKind| -> f64 {
        t.parts.iter().filter(|x| x.kind == kind).map(|x| x.mesh.signed_volume()).sum()
    };
    let filled = v(PartKind::Shell)
        + v(PartKind::Core)
        + v(PartKind::MouldUpper)
        + v(PartKind::MouldLower)
        + v(PartKind::MouldEnd);
    let [x, y, z] = t.moulds[0].block_size;
    let block = x * y * z;
    assert!((filled / block - 1.0).abs() < 1e-3, "parts {filled} vs block {block} m³");
}

/// Each casting mould casts its core with the print.
fn check_casting(t: &BladeTooling) {
    assert!(!t.casting_notes.iter().any(|n| n.to_string().contains("without their prints")));
    for m in &t.casting {
        let p = t.prints.iter().find(|p| p.core == m.core);
        let core = t.parts.iter().find(|x| x.name == m.core).unwrap();
        let area = core.mesh.area();
        let scale = (1.0 + m.shrinkage).powi(3);
        // The blade's printed core and the casting's cavity, two lofts: to the tolerance.
        let tol = t.params.tolerance * area;
        assert!(
            (m.cavity_volume - core.nominal_volume * scale).abs() < tol,
            "{}: cavity {} vs (core + print) {} x (1+s)³",
            m.core,
            m.cavity_volume,
            core.nominal_volume
        );
        assert!((m.core_volume - core.nominal_volume).abs() < tol, "{}", m.core);
        if let Some(p) = p {
            // The print is in the metal: a point in the middle of its end face, just inside.
            let n = p.outlet.len() as f64;
            let cn = p.outlet.iter().fold([0.0, 0.0], |s, q| [s[0] + q[0] / n, s[1] + q[1] / n]);
            let sign = if p.end == End::Root { -1.0 } else { 1.0 };
            let s = 1.0 + m.shrinkage;
            let q = [(p.x_end - sign * 1e-3) * s, cn[0] * s, cn[1] * s];
            assert!(inside_mesh(&m.metal, q), "{}: the print is cast", m.core);
        }
        check_solid(&m.metal, &m.core, &CheckParams::default()).expect("the metal is closed");
        for part in &m.parts {
            check_solid(&part.mesh, &part.name, &CheckParams::default()).expect("closed");
        }
        for h in m.halves.iter().chain(&m.end_pieces) {
            assert_eq!(h.draft.undercut_area, 0.0, "{} {}", m.core, h.side);
        }
        // The sprue and the vent meet the cavity: their entries lie on the metal's surface
        // within the tolerance, below their outlets.
        for ch in [&m.sprue, &m.vent] {
            assert!(ch.volume > 0.0);
            let rise = (0..3).map(|k| (ch.outlet[k] - ch.entry[k]) * m.up[k]).sum::<f64>();
            assert!(rise > 0.0, "{}", m.core);
        }
    }
}

#[test]
fn demo_prints_sit_in_seats_in_the_root_end_piece_and_are_cast_with_their_cores() {
    let t = build(&demo(), EndShape::Spheres);
    assert_eq!(t.prints.len(), 2);
    assert!(check_seats(t) >= 40);
    check_mould(t);
    check_casting(t);
    // No print is left to be pocketed by hand.
    let (_, findings) = layloft::tooling::drain_plan(t, t.params.tolerance);
    assert!(!findings.iter().any(|f| f.note.to_string().contains("NO SEAT")));
}

#[test]
fn a_print_through_the_tip_sits_in_the_tip_end_piece() {
    let dir = tempfile::tempdir().unwrap();
    let t = build(&mine_fan_with_rear_web(dir.path(), Some((0.0, 0.70))), EndShape::Spheres);
    assert!(t.prints.iter().any(|p| p.end == End::Tip));
    assert!(check_seats(t) >= 80);
    check_mould(t);
    check_casting(t);
}

#[test]
fn square_ends_get_an_end_piece_where_a_print_leaves() {
    // Planar ends are parallel to the halves' pull and need no end piece for their own draft;
    // the root, where the prints leave, gets one for their seats, the tip none.
    let t = build(&demo(), EndShape::Planes);
    let sides: Vec<&str> = t.end_pieces.iter().map(|h| h.side).collect();
    assert_eq!(sides, ["root end"]);
    check_seats(t);
    check_mould(t);
}

#[test]
fn a_thin_trailing_edge_cell_gets_a_tapered_print_that_sits_in_its_seat() {
    // An invented rear web at 75 % of the chord over the whole span: the cell behind it runs
    // from about 20 mm deep at the web to the 2 mm where the core closes (NACA 44xx thickness
    // at x/c = 0.75 less the shell's laminate, from memory), too thin at its back for a print
    // scaled from it to taper. The print stops where the cell grows too thin for the taper.
    let dir = tempfile::tempdir().unwrap();
    let project = mine_fan_with_rear_web(dir.path(), None);
    let toml = std::fs::read_to_string(&project)
        .unwrap()
        .replace("[[point_mass]]", "[[web]]\nname = \"rear\"\nchord_frac = 0.75\n\n[[point_mass]]");
    std::fs::write(&project, toml).unwrap();
    let plies = dir.path().join("plies.csv");
    let mut text = std::fs::read_to_string(&plies).unwrap();
    text.push_str(
        "rear-1,glass-biax,45,0.40,0.90,web:rear,,\nrear-2,glass-biax,-45,0.40,0.90,web:rear,,\n",
    );
    std::fs::write(&plies, text).unwrap();
    let t = build(&project, EndShape::Spheres);
    assert_eq!(t.prints.len(), 3);
    assert!(t.unprinted.is_empty());
    assert!(check_seats(t) >= 120);
    check_mould(t);
    check_casting(t);
}

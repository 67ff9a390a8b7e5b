//! Core prints and the shell's drain ports, on blades with one web (the invented mine-fan demo),
//! two webs (a copy with an invented rear web ending inside the span, so one core starts at a
//! bulkhead and reaches only the tip) and a web closed at both ends inside the span (two cores
//! sealed between bulkheads).
//!
//! Sources and methods:
//! - Inside or outside a closed triangle mesh: the parity of the crossings of a ray with its
//!   facets (Jordan curve theorem; ray–triangle test of Möller & Trumbore, J. Graphics Tools 2
//!   (1997) 21–28), written here independently of the library's mesh code. A point just inside
//!   the print's section, half-way through the end laminate, must lie in the port (outside the
//!   shell) and in the core; a point just outside the section there must lie in the shell and
//!   outside the core: the port and the print coincide to that offset.
//! - The drain point: the lowest point of the core with the mould stood as the summary says
//!   (down along the unit vector it gives) is the largest `down · p` over the core's vertices.
//! - Closed, outward meshes: the library's own mesh check (`check_solid`).

use std::path::Path;

use crate::common::mine_fan_with_rear_web;
use crate::common::shared::shared_tooling;
use layloft::blade::Blade;
use layloft::input::read_project;
use layloft::mesh::{CheckParams, End, check_solid};
use layloft::tooling::{BladeTooling, PartKind, ToolingParams, build_tooling, drain_plan};

type P3 = [f64; 3];

fn sub(a: P3, b: P3) -> P3 {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}
fn cross(a: P3, b: P3) -> P3 {
    [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}
fn dot(a: P3, b: P3) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/// Whether `p` lies inside the closed mesh: the parity of the crossings of a ray from `p`.
fn inside(mesh: &layloft::mesh::Mesh, p: P3) -> bool {
    // A direction with no special relation to the axes or the mesh.
    let d = [0.5773, 0.6123, -0.5404];
    let mut crossings = 0;
    for t in 0..mesh.len() {
        let [a, b, c] = mesh.corners(t);
        let (e1, e2) = (sub(b, a), sub(c, a));
        let h = cross(d, e2);
        let det = dot(e1, h);
        if det.abs() < 1e-18 {
            continue;
        }
        let s = sub(p, a);
        let u = dot(s, h) / det;
        if !(0.0..=1.0).contains(&u) {
            continue;
        }
        let q = cross(s, e1);
        let v = dot(d, q) / det;
        if v < 0.0 || u + v > 1.0 {
            continue;
        }
        if dot(e2, q) / det > 0.0 {
            crossings += 1;
        }
    }
    crossings % 2 == 1
}

/// The tooling of `project` (shared with the other tests that build the same, see
/// tests/common/shared.rs).
fn build(project: &Path, tol: f64) -> &'static BladeTooling {
    let project = read_project(project).expect("the project reads");
    let spec = project.tooling.as_ref().expect("[tooling]");
    // Prints asked for explicitly (on by default, at this fraction).
    let params = ToolingParams {
        tolerance: tol,
        print_fraction: 0.5,
        ..ToolingParams::from_spec(spec).unwrap()
    };
    shared_tooling(&project, &params)
}

/// The checks every print must pass (see the module docs); returns how many prints.
fn check_prints(t: &BladeTooling) -> usize {
    let part = |name: &str| t.parts.iter().find(|p| p.name == name).expect("part");
    let shell = &part("shell").mesh;
    check_solid(shell, "shell", &CheckParams::default()).expect("the shell is closed, outward");
    // The check before writing leaves out the self-intersection test only for a mesh that
    // passed it, to the bit, while the tooling was built: each printed core as written (unless
    // scaled for shrinkage), never the shell, never a core moved by one bit.
    assert!(!t.known_clear(shell));
    let e = t.ends;
    for p in &t.prints {
        let core = &part(&p.core).mesh;
        check_solid(core, &p.core, &CheckParams::default()).expect("the core is closed, outward");
        assert_eq!(t.known_clear(core), t.params.core_shrink_factor == 1.0, "{}", p.core);
        let mut nudged = core.clone();
        nudged.vertices[0][1] = f64::from_bits(nudged.vertices[0][1].to_bits() + 1);
        assert!(!t.known_clear(&nudged), "{}", p.core);
        // The drain point is the lowest point of the core stood as the summary says.
        let low = core.vertices.iter().map(|&v| dot(p.down, v)).fold(f64::NEG_INFINITY, f64::max);
        assert!(
            (low - dot(p.down, p.drain_point)).abs() < 1e-12,
            "{}: lowest {low} vs drain point {:?}",
            p.core,
            p.drain_point
        );
        // The print stands out `length` beyond the shell's end, at most the mould margin.
        assert!(p.length <= t.params.mould_margin, "{}", p.core);
        // Port and print coincide: points a tenth of the tolerance either side of the section's
        // outline, half-way through the end laminate (sphere radii from the rotor centre).
        let (r_out, r_core) = match p.end {
            End::Root => (e.root, e.root + e.root_laminate),
            End::Tip => (e.tip, e.tip - e.tip_laminate),
        };
        let r_mid = 0.5 * (r_out + r_core);
        let n = p.section.len();
        let area2: f64 = (0..n)
            .map(|i| {
                let (a, b) = (p.section[i], p.section[(i + 1) % n]);
                a[0] * b[1] - b[0] * a[1]
            })
            .sum();
        let delta = 0.1 * t.params.tolerance;
        let mut checked = 0;
        for i in (0..n).step_by((n / 24).max(1)) {
            // The middle of the outline's edge from point i, and the edge's inward normal
            // (left of the edge on a counter-clockwise outline).
            let (a, b) = (p.section[i], p.section[(i + 1) % n]);
            let tng = [b[0] - a[0], b[1] - a[1]];
            let len = tng[0].hypot(tng[1]);
            if len < 10.0 * delta {
                continue;
            }
            let q = [0.5 * (a[0] + b[0]), 0.5 * (a[1] + b[1])];
            let s = area2.signum();
            let inward = [-s * tng[1] / len, s * tng[0] / len];
            for (sign, in_port) in [(1.0, true), (-1.0, false)] {
                let y = q[0] + sign * delta * inward[0];
                let z = q[1] + sign * delta * inward[1];
                let x = (r_mid * r_mid - y * y - z * z).sqrt();
                let pt = [x, y, z];
                assert_eq!(inside(shell, pt), !in_port, "{} shell at {pt:?}", p.core);
                let in_core = inside(core, pt);
                assert_eq!(in_core, in_port, "{} core at {pt:?}", p.core);
                checked += 1;
            }
        }
        assert!(checked >= 40, "{}: {checked} points", p.core);
    }
    t.prints.len()
}

#[test]
fn one_web_demo_prints_seat_in_the_ports_at_the_root_and_drain_at_their_ends() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let t = build(&root.join("layups/mine-fan/blade.toml"), 0.5e-3);
    assert_eq!(check_prints(t), 2);
    assert!(t.prints.iter().all(|p| p.end == End::Root && p.down == [-1.0, 0.0, 0.0]));
    assert!(t.unprinted.is_empty());
    // The print's volume is its section times its length beyond the core's end at least.
    for p in &t.prints {
        assert!(p.volume > p.section_area * p.length, "{}", p.core);
    }
    let (orientation, findings) = drain_plan(t, t.params.tolerance);
    assert_eq!(orientation.len(), 1, "{orientation:?}");
    let words = orientation[0].to_string();
    assert!(words.contains("root end") && words.contains("core-1, core-2"));
    // One drain finding per print, and no warning that a seat is still to be cut by hand (the
    // end piece is pocketed for every print, see validation_print_seats.rs).
    let (seats, drains): (Vec<_>, Vec<_>) =
        findings.iter().partition(|f| f.note.to_string().contains("NO SEAT IN THE MOULD"));
    assert_eq!(drains.len(), 2);
    assert_eq!(seats.len(), 0);
    // The cores with their prints are the parts written.
    for p in &t.prints {
        let core = t.parts.iter().find(|x| x.name == p.core).unwrap();
        assert_eq!(core.kind, PartKind::Core);
    }
}

#[test]
fn a_core_that_starts_at_a_bulkhead_takes_its_print_through_the_tip() {
    // Two webs, the rear one from the root to r = 0.70 m: the front cell runs root to tip; the
    // two cells behind the main web end at the rear web's bulkhead, and the cell beyond it
    // starts there and reaches only the tip.
    let dir = tempfile::tempdir().unwrap();
    let t = build(&mine_fan_with_rear_web(dir.path(), Some((0.0, 0.70))), 0.5e-3);
    assert_eq!(check_prints(t), 4);
    let ends: Vec<(&str, End)> = t.prints.iter().map(|p| (p.core.as_str(), p.end)).collect();
    assert_eq!(
        ends,
        [("core-1", End::Root), ("core-2", End::Root), ("core-3", End::Root), ("core-4", End::Tip)]
    );
    assert_eq!(t.prints[3].down, [1.0, 0.0, 0.0]);
    let (orientation, _) = drain_plan(t, t.params.tolerance);
    assert_eq!(orientation.len(), 2, "{orientation:?}");
    let words = orientation[1].to_string();
    assert!(words.contains("tip end") && words.contains("core-4"));
}

#[test]
fn cores_sealed_between_bulkheads_get_no_print_and_are_flagged() {
    // The rear web from r = 0.55 to 0.75 m: behind the main web, the cells between its two
    // bulkheads reach neither end of the blade.
    let dir = tempfile::tempdir().unwrap();
    let t = build(&mine_fan_with_rear_web(dir.path(), Some((0.55, 0.75))), 0.5e-3);
    check_prints(t);
    assert_eq!(t.unprinted.len(), 2, "{:?}", t.unprinted);
    let (_, findings) = drain_plan(t, t.params.tolerance);
    for core in &t.unprinted {
        assert!(
            findings
                .iter()
                .any(|f| f.passed == Some(false) && f.note.to_string().contains(core.as_str())),
            "{core}"
        );
    }
    // The shell holds the sealed cores as closed cavities: one shell with ports, plus one
    // cavity shell each, all checked closed.
    let shell = &t.parts.iter().find(|p| p.name == "shell").unwrap().mesh;
    let s = check_solid(shell, "shell", &CheckParams::default()).unwrap();
    assert_eq!(s.shells, 1 + t.unprinted.len());
}

#[test]
fn planar_ends_take_prints_and_ports_as_closed_outward_parts() {
    // Planes at the first and last station: the holed end caps are flat; every core and the
    // shell pass the mesh check, and each drain point is its core's lowest point.
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let project = read_project(&root.join("layups/mine-fan/blade.toml")).unwrap();
    let spec = project.tooling.as_ref().unwrap();
    let params = ToolingParams {
        tolerance: 0.5e-3,
        ends: layloft::tooling::EndShape::Planes,
        print_fraction: 0.5,
        ..ToolingParams::from_spec(spec).unwrap()
    };
    let t = shared_tooling(&project, &params);
    assert_eq!(t.prints.len(), 2);
    for part in t.parts.iter().filter(|p| matches!(p.kind, PartKind::Core | PartKind::Shell)) {
        check_solid(&part.mesh, &part.name, &CheckParams::default()).expect("closed, outward");
    }
    for p in &t.prints {
        let core = &t.parts.iter().find(|x| x.name == p.core).unwrap().mesh;
        let low = core.vertices.iter().map(|&v| dot(p.down, v)).fold(f64::NEG_INFINITY, f64::max);
        assert!((low - dot(p.down, p.drain_point)).abs() < 1e-12, "{}", p.core);
        // A flat end drains whole: nothing of it lies below the print's entrance.
        assert!(p.pool_depth < 1e-12, "{}: {}", p.core, p.pool_depth);
    }
}

#[test]
fn ports_take_the_end_laminate_out_of_the_shell_and_prints_add_to_the_cores() {
    // Volume balance (Cavalieri): the same blade with prints off and on. Each core gains its
    // print beyond its end; the shell loses each port, the section times the end laminate to
    // within the dome's depth across the section (a sphere's sag, d²/8R over a section of
    // width d, bounded here by a tenth of the laminate volume).
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let project = read_project(&root.join("layups/mine-fan/blade.toml")).unwrap();
    let blade = Blade::from_project(&project).unwrap();
    let spec = project.tooling.as_ref().unwrap();
    let on = ToolingParams {
        tolerance: 0.5e-3,
        print_fraction: 0.5,
        ..ToolingParams::from_spec(spec).unwrap()
    };
    let off = ToolingParams { print_fraction: 0.0, ..on.clone() };
    let a = build_tooling(&blade, &off, &mut |_, _, _| {}).unwrap();
    let b = shared_tooling(&project, &on);
    let v = |t: &BladeTooling, name: &str| {
        t.parts.iter().find(|p| p.name == name).unwrap().mesh.signed_volume()
    };
    let mut ports = 0.0;
    for p in &b.prints {
        let gain = v(b, &p.core) - v(&a, &p.core);
        assert!((gain / p.volume - 1.0).abs() < 1e-9, "{}: {gain} vs {}", p.core, p.volume);
        ports += p.section_area * b.ends.root_laminate;
    }
    let lost = v(&a, "shell") - v(b, "shell");
    assert!((lost - ports).abs() < 0.1 * ports, "shell lost {lost} m³, ports {ports} m³");
}

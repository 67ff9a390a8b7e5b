//! The tooling build splits the mould along the span when no single pull draws the blade.
//!
//! The test blade (invented): a copy of the mine-fan demo with a thin, strongly cambered section
//! (8 % thick about a circular-arc camber line of 15 % sagitta, so the lower side is concave)
//! and 150° of twist (80° at the root to −70° at the tip). A section whose lower side is concave
//! draws on both halves only for pulls within a window narrower than half a turn about its chord
//! normal (the pull must keep the contour monotone across it: for the bare arc of the camber
//! line, 180° less twice its half-angle of 33°, geometry of the circular arc); the twist turns
//! the sections through more than such a window, so no single pull draws the blade and the
//! mould is made of span-wise modules.
//!
//! Sources and methods:
//! - Draft: a facet of outward normal `n` leaves a half pulled along `d` when `n · d ≥ 0` (the
//!   library's draft evaluator; the rule is common practice of mould design).
//! - Volume balance: disjoint solids that fill a box add up to its volume (Cavalieri); the
//!   sockets' clearance is the only intended gap.
//! - Point sampling: inside a closed mesh by the parity of a ray's crossings (Jordan curve
//!   theorem; ray–triangle test of Möller and Trumbore, J. Graphics Tools 2 (1997) 21–28), the
//!   test's own code in tests/common.
//! - Closed, outward meshes: the library's mesh check (`check_solid`).
//! - Distance from a point to a triangle mesh: the closest point of each triangle (Ericson,
//!   Real-Time Collision Detection, 2005, section 5.1.5), the test's own code.

use std::path::{Path, PathBuf};

use layloft::blade::Blade;
use layloft::input::read_project;
use layloft::mesh::{CheckParams, check_solid};
use layloft::tooling::{BladeTooling, PartKind, ToolingParams, build_tooling};

use crate::common::inside_mesh as inside;

/// Stations of the invented undercut blade (see the module docs).
const STATIONS: &str = "\
# INVENTED TEST DATA: strongly cambered and twisted so that no single mould pull draws it.
r_m,chord_m,twist_deg,pitch_axis_frac,airfoil
0.40,0.280,80.0,0.35,arc.dat
0.55,0.250,35.0,0.35,arc.dat
0.70,0.220,-10.0,0.35,arc.dat
0.90,0.190,-70.0,0.35,arc.dat
";

/// The invented section in Selig's order (upper surface trailing edge to leading edge, then
/// the lower back): NACA four-digit thickness of 8 % about a circular-arc camber line of 15 %
/// sagitta, each surface point at the half thickness normal to the camber line (Abbott and von
/// Doenhoff, Theory of Wing Sections, 1959, section 6.4), with the last coefficient −0.1036 in
/// place of −0.1015 so that the trailing edge closes (a common variant, from memory): a sharp
/// trailing edge (a blunt base parallel to a module's pull draws at a few thousandths of a degree
/// either way, see docs/decisions.md, 2026-12-03). Written in percent of the chord, so that it
/// is normalised from the point farthest from the trailing edge (0.17° off the file's own chord
/// line), the frame this blade's mould was built and checked in: read on its own chord line the
/// first module's upper half shows an undercut of 0.34 mm² at −0.38° (docs/decisions.md,
/// 2026-12-06, found and left).
fn arc_section() -> String {
    let (t, h) = (0.08, 0.15);
    let r = (0.25 + h * h) / (2.0 * h);
    let n = 60;
    let mut upper = Vec::new();
    let mut lower = Vec::new();
    for i in 0..=n {
        let x = 0.5 * (1.0 - (std::f64::consts::PI * i as f64 / n as f64).cos());
        let yt = 5.0
            * t
            * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
                - 0.1036 * x.powi(4));
        let w = (r * r - (x - 0.5) * (x - 0.5)).sqrt();
        let yc = w - (r - h);
        let theta = (-(x - 0.5) / w).atan();
        upper.push((x - yt * theta.sin(), yc + yt * theta.cos()));
        lower.push((x + yt * theta.sin(), yc - yt * theta.cos()));
    }
    let mut text = String::from(
        "INVENTED TEST SECTION (circular-arc camber 15 %, 8 % thick, sharp trailing edge)\n",
    );
    for (x, y) in upper.iter().rev().chain(lower.iter().skip(1)) {
        text.push_str(&format!("{:.4} {:.4}\n", 100.0 * x, 100.0 * y));
    }
    text
}

/// A copy of the mine-fan demo in `dir` with the stations `stations` (and the invented section).
fn copy_demo(dir: &Path, stations: &str) -> PathBuf {
    crate::support_run::copy_demo("mine-fan", dir);
    std::fs::write(dir.join("stations.csv"), stations).unwrap();
    std::fs::write(dir.join("arc.dat"), arc_section()).unwrap();
    dir.join("blade.toml")
}

fn build(stations: &str, tolerance: f64) -> BladeTooling {
    let dir = tempfile::tempdir().unwrap();
    let project = read_project(&copy_demo(dir.path(), stations)).expect("the project reads");
    let blade = Blade::from_project(&project).expect("the blade lofts");
    let spec = project.tooling.as_ref().expect("[tooling]");
    let params = ToolingParams { tolerance, ..ToolingParams::from_spec(spec).unwrap() };
    build_tooling(&blade, &params, &mut |_, _, _| {}).expect("the tooling builds")
}

#[test]
fn a_blade_no_single_pull_draws_gets_a_mould_of_modules_that_all_draw_and_fill_the_block() {
    let t = build(STATIONS, 0.3e-3);
    let split = t.modular.as_ref().expect("the mould is split along the span");
    let n = split.modules.len();
    assert!(n >= 2, "{:?}", split.modules);
    // The parts: cores, shell, each module's halves root first, then the end pieces (both ends
    // are spheres about the rotor centre, the root one concave).
    let names: Vec<&str> = t.parts.iter().map(|p| p.name.as_str()).collect();
    let mut expected: Vec<String> =
        names.iter().take_while(|n| n.starts_with("core")).map(|n| n.to_string()).collect();
    expected.push("shell".into());
    for k in 1..=n {
        expected.extend([format!("mould-{k}-upper"), format!("mould-{k}-lower")]);
    }
    expected.extend(["mould-root-end".to_string(), "mould-tip-end".to_string()]);
    assert_eq!(names, expected);
    // Every mould part is closed and outward, and has no undercut facet along its own pull;
    // below the least draft only next to the parting lines, where the silhouette is parallel
    // to the pull (a small share of the cavity).
    let halves = t.mould_halves();
    let moulds: Vec<_> = t.parts.iter().filter(|p| p.kind.is_mould()).collect();
    assert_eq!(halves.len(), moulds.len());
    for (p, h) in moulds.iter().zip(&halves) {
        check_solid(&p.mesh, &p.name, &CheckParams::default()).expect("closed, outward");
        assert!(h.undercuts.is_empty(), "{}: {:?}", p.name, h.undercuts);
        assert!(h.draft.undercut_area == 0.0, "{}", p.name);
        assert!(h.draft.min_draft.deg() >= -1e-6, "{}", p.name);
        assert!(h.draft.below_min_area < 0.02 * h.cavity_area, "{}", p.name);
    }
    // Each module's pull lies within its window (the window's width is what the search found;
    // its middle is the pull unless the single pull was kept).
    for m in &split.modules {
        assert!(m.window.deg() > 0.0 && m.x_range[1] > m.x_range[0], "{m:?}");
    }
    for w in split.modules.windows(2) {
        assert_eq!(w[0].x_range[1], w[1].x_range[0]);
    }
    // Machining frames for every mould part.
    let machined: Vec<&str> = t.machining.iter().map(|m| m.part.as_str()).collect();
    let mould_names: Vec<&str> = moulds.iter().map(|p| p.name.as_str()).collect();
    assert_eq!(machined, mould_names);

    // Volume balance: mould parts, shell and cores fill the block, the sockets' clearance (three
    // pins on the outer modules' open corners, each at most 0.1 mm times the socket's wall and
    // floor, with margin) and the difference between the shell's tessellation and the modules'
    // cavities aside: within 0.1 % of the block.
    let volume = |kind: fn(PartKind) -> bool| -> f64 {
        t.parts.iter().filter(|p| kind(p.kind)).map(|p| p.mesh.signed_volume()).sum()
    };
    let filled = volume(|k| k.is_mould()) + volume(|k| !k.is_mould());
    let [x, y, z] = split.block_size;
    let block = x * y * z;
    let gap = block - filled;
    eprintln!("block {block:.6e} m³, gap {gap:.4e} m³ ({:.3e})", gap / block);
    assert!(gap.abs() < 1e-3 * block, "gap {gap:e} m³ of {block:e}");

    // Point sampling of the block in its frame (X along the pitch axis, Z along the mean of the
    // modules' pulls): every point inside exactly one part.
    let mean = split.modules.iter().map(|m| m.pull_angle.rad()).sum::<f64>() / n as f64;
    let ez = [0.0, -mean.sin(), mean.cos()];
    let ey = [0.0, ez[2], -ez[1]];
    let (lo, hi) = moulds
        .iter()
        .flat_map(|p| p.mesh.vertices.iter())
        .map(|&p| [p[0], p[1] * ey[1] + p[2] * ey[2], p[1] * ez[1] + p[2] * ez[2]])
        .fold(([f64::INFINITY; 3], [f64::NEG_INFINITY; 3]), |(lo, hi), q| {
            ([0, 1, 2].map(|k| lo[k].min(q[k])), [0, 1, 2].map(|k| hi[k].max(q[k])))
        });
    for k in 0..3 {
        assert!(((hi[k] - lo[k]) / split.block_size[k] - 1.0).abs() < 1e-9, "axis {k}");
    }
    let mut seed = 777u64;
    let mut next = || {
        seed = seed.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
        (seed >> 11) as f64 / (1u64 << 53) as f64
    };
    let shell = &t.parts.iter().find(|p| p.name == "shell").expect("a shell").mesh;
    let (mut in_blade, mut near_surface) = (0, 0);
    for _ in 0..1000 {
        let q = [0, 1, 2].map(|k| lo[k] + (0.001 + 0.998 * next()) * (hi[k] - lo[k]));
        let p = [q[0], q[1] * ey[1] + q[2] * ez[1], q[1] * ey[2] + q[2] * ez[2]];
        let holders: Vec<&str> =
            t.parts.iter().filter(|x| inside(&x.mesh, p)).map(|x| x.name.as_str()).collect();
        // The shell is lofted parted at the section's edges and each module's cavity at its own
        // silhouette: two tessellations of one surface within the chordal tolerance of it, so a
        // point that close to the shell's surface may lie in the shell and a mould part.
        if holders.len() == 2
            && holders.contains(&"shell")
            && distance_to_mesh(shell, p) < t.params.tolerance
        {
            near_surface += 1;
            continue;
        }
        assert_eq!(holders.len(), 1, "{p:?} is inside {holders:?}");
        in_blade += usize::from(!holders[0].starts_with("mould"));
    }
    assert!(in_blade > 0, "no point fell in the blade");
    assert!(near_surface <= 3, "{near_surface} points in the shell and a mould part");
}

type P3 = [f64; 3];

fn sub(a: P3, b: P3) -> P3 {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}
fn dot(a: P3, b: P3) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}
fn along(a: P3, d: P3, s: f64) -> P3 {
    [a[0] + s * d[0], a[1] + s * d[1], a[2] + s * d[2]]
}

/// The least distance from `p` to the facets of `mesh`: the closest point of each triangle by
/// its Voronoi regions (Ericson, Real-Time Collision Detection, 2005, section 5.1.5).
fn distance_to_mesh(mesh: &layloft::mesh::Mesh, p: P3) -> f64 {
    let closest = |[a, b, c]: [P3; 3]| -> P3 {
        let (ab, ac, ap) = (sub(b, a), sub(c, a), sub(p, a));
        let (d1, d2) = (dot(ab, ap), dot(ac, ap));
        if d1 <= 0.0 && d2 <= 0.0 {
            return a;
        }
        let bp = sub(p, b);
        let (d3, d4) = (dot(ab, bp), dot(ac, bp));
        if d3 >= 0.0 && d4 <= d3 {
            return b;
        }
        let vc = d1 * d4 - d3 * d2;
        if vc <= 0.0 && d1 >= 0.0 && d3 <= 0.0 {
            return along(a, ab, d1 / (d1 - d3));
        }
        let cp = sub(p, c);
        let (d5, d6) = (dot(ab, cp), dot(ac, cp));
        if d6 >= 0.0 && d5 <= d6 {
            return c;
        }
        let vb = d5 * d2 - d1 * d6;
        if vb <= 0.0 && d2 >= 0.0 && d6 <= 0.0 {
            return along(a, ac, d2 / (d2 - d6));
        }
        let va = d3 * d6 - d5 * d4;
        if va <= 0.0 && (d4 - d3) >= 0.0 && (d5 - d6) >= 0.0 {
            return along(b, sub(c, b), (d4 - d3) / ((d4 - d3) + (d5 - d6)));
        }
        let denom = 1.0 / (va + vb + vc);
        along(along(a, ab, vb * denom), ac, vc * denom)
    };
    (0..mesh.len())
        .map(|t| {
            let q = closest(mesh.corners(t));
            dot(sub(p, q), sub(p, q)).sqrt()
        })
        .fold(f64::INFINITY, f64::min)
}

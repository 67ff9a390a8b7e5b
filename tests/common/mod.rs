//! Section layouts for the tests and benchmarks: tubes, boxes and NACA 00xx outlines built from
//! their defining formulas. All are test geometry, not blade data.
#![allow(dead_code)]

use std::f64::consts::PI;
use std::sync::Arc;

use layloft::laminate::{Laminate, LayupCode, Ply};
use layloft::material::Lamina;
use layloft::section::{SectionLayout, WebLayout};
use layloft::units::Angle;

pub mod shared;

/// An isotropic layer as a lamina: E, nu, sheet thickness (m), density (kg/m³).
pub fn isotropic(name: &str, e: f64, nu: f64, t: f64, rho: f64) -> Lamina {
    Lamina::builder(name)
        .elastic(e, e, e / (2.0 * (1.0 + nu)), nu)
        .ply_thickness(t)
        .density(rho)
        .build()
        .expect("valid isotropic layer")
}

/// One layer of `lamina`.
pub fn single(lamina: &Lamina) -> Laminate {
    Laminate::from_code(&"[0]".parse::<LayupCode>().expect("code"), lamina)
}

/// Plies at the given angles (degrees), outer face first.
pub fn plies(lamina: &Lamina, angles_deg: &[f64]) -> Laminate {
    let m = Arc::new(lamina.clone());
    Laminate::new(angles_deg.iter().map(|&a| Ply::new(m.clone(), Angle::from_deg(a))).collect())
}

/// AS4/3501-6 as used by Chandra, Stemple & Chopra, J. Aircraft 27(7) (1990) 619–626:
/// E11 = 20.59 Msi, E22 = 1.42 Msi, G12 = 0.87 Msi, nu12 = 0.42, ply 0.005 in (from memory).
pub fn as4_chandra() -> Lamina {
    let msi = 6.894_757e9;
    Lamina::builder("AS4/3501-6")
        .elastic(20.59 * msi, 1.42 * msi, 0.87 * msi, 0.42)
        .ply_thickness(0.005 * 0.0254)
        .density(1550.0)
        .build()
        .expect("valid lamina")
}

/// A section layout of the closed outline `outer` (chord and pitch axis from its extent).
pub fn layout(
    outer: Vec<[f64; 2]>,
    segment_laminate: Vec<usize>,
    laminates: Vec<Laminate>,
) -> SectionLayout {
    let ymin = outer.iter().map(|p| p[0]).fold(f64::INFINITY, f64::min);
    let ymax = outer.iter().map(|p| p[0]).fold(f64::NEG_INFINITY, f64::max);
    let chord = ymax - ymin;
    SectionLayout {
        r: 1.0,
        chord,
        twist: Angle::ZERO,
        pitch_axis_frac: -ymin / chord,
        outer,
        laminates,
        segment_laminate,
        webs: vec![],
    }
}

/// A circular tube of outer radius `ro` centred at the origin, `n` points from the leading edge
/// over the top (clockwise seen from the tip).
pub fn tube(ro: f64, n: usize, wall: Laminate) -> SectionLayout {
    let outer = (0..n)
        .map(|i| {
            let a = PI - 2.0 * PI * i as f64 / n as f64;
            [ro * a.cos(), ro * a.sin()]
        })
        .collect();
    layout(outer, vec![0; n], vec![wall])
}

/// A rectangular box, outer width `w` (y from 0 to w) and height `h` (z from -h/2 to h/2), each
/// side split into `m` edges. Laminates by side: `[top, aft, bottom, front]` indices into
/// `laminates`.
pub fn rect(
    w: f64,
    h: f64,
    m: usize,
    sides: [usize; 4],
    laminates: Vec<Laminate>,
) -> SectionLayout {
    let corners = [[0.0, h / 2.0], [w, h / 2.0], [w, -h / 2.0], [0.0, -h / 2.0]];
    let mut outer = Vec::new();
    let mut seg = Vec::new();
    // Front side upper half first: the outline starts at the leading edge (front side middle).
    let half = m.div_ceil(2).max(1);
    for k in 0..half {
        outer.push([0.0, h / 2.0 * k as f64 / half as f64]);
        seg.push(sides[3]);
    }
    for (s, c) in corners.iter().enumerate().take(3) {
        let next = corners[s + 1];
        for k in 0..m {
            let t = k as f64 / m as f64;
            outer.push([c[0] + (next[0] - c[0]) * t, c[1] + (next[1] - c[1]) * t]);
            seg.push(sides[s]);
        }
    }
    for k in 0..half {
        outer.push([0.0, -h / 2.0 + h / 2.0 * k as f64 / half as f64]);
        seg.push(sides[3]);
    }
    layout(outer, seg, laminates)
}

/// Adds a web at `y` (m, chord frame) with laminate `laminate`.
pub fn with_web(mut l: SectionLayout, name: &str, y: f64, laminate: usize) -> SectionLayout {
    l.webs.push(WebLayout { name: name.into(), y, laminate });
    l.webs.sort_by(|a, b| a.y.total_cmp(&b.y));
    l
}

/// NACA 00xx half thickness (NACA Report 824; Abbott & von Doenhoff, Theory of Wing Sections,
/// §6.4), closed trailing edge (-0.1036), as a fraction of chord.
pub fn naca00_half(t: f64, x: f64) -> f64 {
    5.0 * t
        * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
            - 0.1036 * x.powi(4))
}

/// A NACA 00xx outline of `chord` with `n` points (cosine spacing, plus a point at every x/c in
/// `breaks` on both surfaces so that laminate boundaries fall on vertices), leading edge at
/// y = -0.25 c (pitch axis at quarter chord), one laminate per segment chosen by
/// `pick(x/c, upper)` at the segment's middle.
pub fn naca00(
    t: f64,
    chord: f64,
    n: usize,
    breaks: &[f64],
    laminates: Vec<Laminate>,
    pick: impl Fn(f64, bool) -> usize,
) -> SectionLayout {
    let m = n / 2;
    let mut xs: Vec<f64> =
        (0..=m).map(|k| 0.5 * (1.0 - (PI * k as f64 / m as f64).cos())).collect();
    xs.extend(breaks.iter().copied().filter(|x| *x > 0.0 && *x < 1.0));
    xs.sort_by(f64::total_cmp);
    xs.dedup_by(|a, b| (*a - *b).abs() < 1e-9);
    let last = xs.len() - 1;
    let mut outer = Vec::with_capacity(2 * last);
    for &x in &xs {
        outer.push([(x - 0.25) * chord, naca00_half(t, x) * chord]);
    }
    for &x in xs[1..last].iter().rev() {
        outer.push([(x - 0.25) * chord, -naca00_half(t, x) * chord]);
    }
    let nn = outer.len();
    let seg = (0..nn)
        .map(|i| {
            let (a, b) = (outer[i], outer[(i + 1) % nn]);
            pick(0.5 * (a[0] + b[0]) / chord + 0.25, i < last)
        })
        .collect();
    let mut l = layout(outer, seg, laminates);
    l.pitch_axis_frac = 0.25;
    l
}

/// A diamond (rhombus) of half-chord `a` and half-height `b`: leading edge at y = 0, top vertex
/// at (a, b), trailing edge at (2a, 0), each side split into `m` edges clustered towards both of
/// its ends (cosine spacing), so that the vertices beside the sharp leading and trailing edges
/// lie closer together than a wall is thick. One laminate all round.
pub fn diamond(a: f64, b: f64, m: usize, wall: Laminate) -> SectionLayout {
    let corners = [[0.0, 0.0], [a, b], [2.0 * a, 0.0], [a, -b]];
    let mut outer = Vec::with_capacity(4 * m);
    for (s, c) in corners.iter().enumerate() {
        let next = corners[(s + 1) % 4];
        for k in 0..m {
            let t = 0.5 * (1.0 - (PI * k as f64 / m as f64).cos());
            outer.push([c[0] + (next[0] - c[0]) * t, c[1] + (next[1] - c[1]) * t]);
        }
    }
    let n = outer.len();
    layout(outer, vec![0; n], vec![wall])
}

/// Whether `p` is inside the closed mesh, by the parity of the crossings of a ray in a fixed,
/// skew direction (Möller and Trumbore, "Fast, minimum storage ray-triangle intersection",
/// 1997, for each crossing).
pub fn inside_mesh(mesh: &layloft::mesh::Mesh, p: [f64; 3]) -> bool {
    let d = [0.5773, 0.3141, 0.7536];
    let sub = |a: [f64; 3], b: [f64; 3]| [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
    let cross = |a: [f64; 3], b: [f64; 3]| {
        [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
    };
    let dot = |a: [f64; 3], b: [f64; 3]| a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    let mut count = 0;
    for t in &mesh.triangles {
        let [a, b, c] = t.map(|v| mesh.vertices[v as usize]);
        let (e1, e2) = (sub(b, a), sub(c, a));
        let h = cross(d, e2);
        let det = dot(e1, h);
        if det.abs() < 1e-18 {
            continue;
        }
        let s = sub(p, a);
        let u = dot(s, h) / det;
        let q = cross(s, e1);
        let v = dot(d, q) / det;
        if u < 0.0 || v < 0.0 || u + v > 1.0 {
            continue;
        }
        if dot(e2, q) / det > 0.0 {
            count += 1;
        }
    }
    count % 2 == 1
}

/// The area of a parameter region of a surface on a triangle mesh of `n × m` cells, each
/// split into two flat triangles (the surface's own point function, no net).
pub fn mesh_area(region: &layloft::plybook::PlyRegion, n: usize, m: usize) -> f64 {
    let s = region.surface();
    let span = region.span();
    let rows: Vec<Vec<[f64; 3]>> = (0..=n)
        .map(|i| {
            let a = span[0] + (span[1] - span[0]) * i as f64 / n as f64;
            let b = region.b_range(a);
            (0..=m).map(|j| s.point([a, b[0] + (b[1] - b[0]) * j as f64 / m as f64])).collect()
        })
        .collect();
    let tri = |p: [f64; 3], q: [f64; 3], r: [f64; 3]| {
        let u = [q[0] - p[0], q[1] - p[1], q[2] - p[2]];
        let v = [r[0] - p[0], r[1] - p[1], r[2] - p[2]];
        let c = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
        0.5 * (c[0] * c[0] + c[1] * c[1] + c[2] * c[2]).sqrt()
    };
    let mut area = 0.0;
    for i in 0..n {
        for j in 0..m {
            area += tri(rows[i][j], rows[i + 1][j], rows[i + 1][j + 1])
                + tri(rows[i][j], rows[i + 1][j + 1], rows[i][j + 1]);
        }
    }
    area
}

/// A copy of the mine-fan demo in `dir` with an invented rear web at 62 % chord from `from`
/// (0: the root) to `to` (m), or none; the path of its `blade.toml`.
pub fn mine_fan_with_rear_web(
    dir: &std::path::Path,
    rear: Option<(f64, f64)>,
) -> std::path::PathBuf {
    let src = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("layups/mine-fan");
    for e in std::fs::read_dir(&src).unwrap() {
        let e = e.unwrap();
        std::fs::copy(e.path(), dir.join(e.file_name())).unwrap();
    }
    if let Some((from, to)) = rear {
        let toml = dir.join("blade.toml");
        let start = if from > 0.0 { format!("r_start_m = {from}\n") } else { String::new() };
        let text = std::fs::read_to_string(&toml).unwrap().replace(
            "[[point_mass]]",
            &format!(
                "[[web]]\nname = \"rear\"\nchord_frac = 0.62\n{start}r_end_m = {to}\n\n[[point_mass]]"
            ),
        );
        std::fs::write(&toml, text).unwrap();
        let plies = dir.join("plies.csv");
        let mut text = std::fs::read_to_string(&plies).unwrap();
        let lo = if from > 0.0 { from } else { 0.40 };
        text.push_str(&format!("rear-1,glass-biax,45,{lo},{to},web:rear,,\n"));
        text.push_str(&format!("rear-2,glass-biax,-45,{lo},{to},web:rear,,\n"));
        std::fs::write(&plies, text).unwrap();
    }
    dir.join("blade.toml")
}

/// Writes an invented blade project into `dir`: a round aluminium tube, 100 mm outside, from
/// r = 0.20 to 1.20 m, 400 contour points; its `plies` (the rows of `plies.csv` after the
/// header, each ply 1 mm of material `al`: E 70 GPa, ν 0.3, 2700 kg/m³, strengths 300, 300 and
/// 170 MPa) and `extra` appended to `blade.toml` (load cases, criteria, settings). Returns the
/// path of `blade.toml`.
pub fn tube_project(dir: &std::path::Path, plies: &str, extra: &str) -> std::path::PathBuf {
    let write = |name: &str, text: &str| std::fs::write(dir.join(name), text).unwrap();
    write(
        "blade.toml",
        &format!(
            "name = \"tube (invented)\"\n[rotor]\nblades = 2\nhub_radius_m = 0.20\n\
             tip_radius_m = 1.20\nrpm_nominal = 600\nrpm_max = 1000\n[sections]\n\
             contour_points = 400\n{extra}"
        ),
    );
    let mut stations = String::from("r_m,chord_m,twist_deg,pitch_axis_frac,airfoil\n");
    for r in [0.20, 0.45, 0.70, 0.95, 1.20] {
        stations += &format!("{r},0.100,0,0.5,circle\n");
    }
    write("stations.csv", &stations);
    write(
        "plies.csv",
        &format!("ply,material,angle_deg,r_start_m,r_end_m,region,from,to\n{plies}"),
    );
    write(
        "materials.toml",
        "[isotropic.al]\nE_GPa = 70\nnu = 0.3\ndensity_kg_m3 = 2700\nply_thickness_mm = 1.0\n\
         tensile_strength_MPa = 300\ncompressive_strength_MPa = 300\nshear_strength_MPa = 170\n",
    );
    dir.join("blade.toml")
}

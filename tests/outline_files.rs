//! Coordinate files in every layout read to one geometry.
//!
//! `tests/data/outlines/` holds outlines made by the code below from published formulas (NACA
//! 4-digit thickness and mean line, Abbott & von Doenhoff, *Theory of Wing Sections*, 1959,
//! §6.4; circle; ellipse) and from plain geometry (box, diamond, D-spar, a flat-backed section),
//! each written in every layout a shop's files come in (see the README there). Run
//! `cargo test --test outline_files -- --ignored write_outline_files` to write them again; the
//! test `committed_files_are_the_generated_ones` keeps them in step with this code.
//!
//! Checks: every file of one shape reads to the same outline within 1e-9 chord whatever its
//! layout, closure and direction; the outline lies on the shape's formula within 1e-9 chord with
//! the leading edge at (0, 0) and the trailing-edge midpoint at (1, 0).

use std::f64::consts::PI;
use std::fs;
use std::path::{Path, PathBuf};

use layloft::airfoil::{Outline, parse_coordinates_noted};

type P = [f64; 2];

/// A shape: both surfaces from the leading edge to the trailing edge (sharing the leading-edge
/// point; sharing the trailing-edge point when it is sharp) and the points along a blunt base
/// strictly between its upper and lower corners, from the upper corner down.
struct Shape {
    name: &'static str,
    how: &'static str,
    upper: Vec<P>,
    lower: Vec<P>,
    base: Vec<P>,
    /// Distance of a point from the shape's boundary, chord fractions.
    off: fn(P) -> f64,
}

impl Shape {
    fn sharp(&self) -> bool {
        self.upper.last() == self.lower.last()
    }
}

fn cosine(n: usize) -> Vec<f64> {
    (0..n).map(|i| 0.5 * (1.0 - (PI * i as f64 / (n - 1) as f64).cos())).collect()
}

/// NACA 4-digit half thickness (Abbott & von Doenhoff §6.4) with the trailing-edge coefficient
/// `a4` (-0.1015 open, -0.1036 closed).
fn naca_yt(t: f64, a4: f64, x: f64) -> f64 {
    5.0 * t
        * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3) + a4 * x.powi(4))
}

fn naca0012_off(p: P) -> f64 {
    (p[1].abs() - naca_yt(0.12, -0.1036, p[0].clamp(0.0, 1.0))).abs()
}

fn circle_off(p: P) -> f64 {
    ((p[0] - 0.5).hypot(p[1]) - 0.5).abs()
}

fn ellipse_off(p: P) -> f64 {
    // Algebraic distance scaled to a length (exact on the curve, first order near it).
    let (a, b) = (0.5, 0.2);
    let f = ((p[0] - 0.5) / a).powi(2) + (p[1] / b).powi(2) - 1.0;
    (f * b / 2.0).abs()
}

fn box_off(p: P) -> f64 {
    // Box [0, 1] x [-0.15, 0.15]: distance to its boundary.
    let (dx, dz) = ((-p[0]).max(p[0] - 1.0).max(0.0), (p[1].abs() - 0.15).max(0.0));
    let outside = dx.hypot(dz);
    let inside = p[0].min(1.0 - p[0]).min(0.15 - p[1].abs()).max(0.0);
    outside + inside
}

fn diamond_off(p: P) -> f64 {
    // Diamond with corners (0, 0), (0.5, ±0.1), (1, 0).
    let h = 0.1 * (1.0 - (2.0 * p[0] - 1.0).abs());
    (p[1].abs() - h).abs()
}

fn dspar_off(p: P) -> f64 {
    // Round nose of radius 0.15 centred at (0.15, 0), flat top and bottom to x = 1, flat back.
    if p[0] < 0.15 {
        ((p[0] - 0.15).hypot(p[1]) - 0.15).abs()
    } else if p[0] > 1.0 - 1e-9 {
        if p[1].abs() <= 0.15 { (p[0] - 1.0).abs() } else { 1.0 }
    } else {
        (p[1].abs() - 0.15).abs()
    }
}

/// Flat-backed section: NACA 0018 thickness (open trailing edge) plus a thickness growing
/// linearly to 4 % chord at the trailing edge (an invented test shape).
fn flatback_yt(x: f64) -> f64 {
    naca_yt(0.18, -0.1015, x) + 0.02 * x
}

fn flatback_off(p: P) -> f64 {
    if p[0] > 1.0 - 1e-12 && p[1].abs() <= flatback_yt(1.0) + 1e-12 {
        return (p[0] - 1.0).abs();
    }
    (p[1].abs() - flatback_yt(p[0].clamp(0.0, 1.0))).abs()
}

fn shapes() -> Vec<Shape> {
    let mirror = |v: &[P]| v.iter().map(|p| [p[0], -p[1]]).collect::<Vec<P>>();
    let mut out = Vec::new();

    // NACA 0012, closed trailing edge, 41 cosine-spaced stations per surface.
    let upper: Vec<P> =
        cosine(41).iter().map(|&x| [x, naca_yt(0.12, -0.1036, x)]).collect::<Vec<P>>();
    let mut upper = upper;
    let last = upper.len() - 1;
    upper[last] = [1.0, 0.0];
    out.push(Shape {
        name: "naca0012-closed",
        how: "NACA 0012 with the closing coefficient -0.1036 (Abbott & von Doenhoff §6.4), 41 cosine-spaced stations per surface, trailing edge set to (1, 0)",
        lower: mirror(&upper),
        upper,
        base: vec![],
        off: naca0012_off,
    });

    // NACA 2412, open trailing edge, thickness laid off normal to the mean line.
    let (m, pc, t) = (0.02, 0.4, 0.12);
    let camber = |x: f64| {
        if x < pc {
            (m / (pc * pc) * (2.0 * pc * x - x * x), 2.0 * m / (pc * pc) * (pc - x))
        } else {
            let q = (1.0 - pc) * (1.0 - pc);
            (m / q * (1.0 - 2.0 * pc + 2.0 * pc * x - x * x), 2.0 * m / q * (pc - x))
        }
    };
    let surf = |sign: f64| -> Vec<P> {
        cosine(51)
            .iter()
            .map(|&x| {
                let yt = naca_yt(t, -0.1015, x);
                let (yc, slope) = camber(x);
                let th = slope.atan();
                [x - sign * yt * th.sin(), yc + sign * yt * th.cos()]
            })
            .collect()
    };
    out.push(Shape {
        name: "naca2412-open",
        how: "NACA 2412 (Abbott & von Doenhoff §6.4: thickness laid off normal to the mean line), open trailing edge, 51 cosine-spaced stations per surface",
        upper: surf(1.0),
        lower: surf(-1.0),
        base: vec![],
        off: |_| 0.0,
    });

    // Circle of unit diameter, 60 points per surface evenly along the arc.
    let arc = |half: f64, n: usize| -> Vec<P> {
        (0..n)
            .map(|i| {
                let phi = PI * i as f64 / (n - 1) as f64;
                if i == 0 {
                    [0.0, 0.0]
                } else if i == n - 1 {
                    [1.0, 0.0]
                } else {
                    [0.5 * (1.0 - phi.cos()), half * phi.sin()]
                }
            })
            .collect()
    };
    let upper = arc(0.5, 60);
    out.push(Shape {
        name: "circle",
        how: "circle of unit diameter, x = (1 - cos f)/2, y = ±sin(f)/2, 60 points per surface at even f",
        lower: mirror(&upper),
        upper,
        base: vec![],
        off: circle_off,
    });
    let upper = arc(0.2, 45);
    out.push(Shape {
        name: "ellipse-0.4",
        how: "ellipse of thickness 0.4 chord, x = (1 - cos f)/2, y = ±0.2 sin f, 45 points per surface at even f",
        lower: mirror(&upper),
        upper,
        base: vec![],
        off: ellipse_off,
    });

    // Box 1 x 0.3, points along every face: 4 up the front half, 11 along the top, 7 on the back.
    let mut upper: Vec<P> = (0..4).map(|i| [0.0, 0.05 * i as f64]).collect();
    upper.extend((1..=10).map(|i| [0.1 * i as f64, 0.15]));
    out.push(Shape {
        name: "box",
        how: "box 1 x 0.3 chord, points every 0.05 up the front face and every 0.1 along the top and bottom, five more along the back",
        lower: mirror(&upper),
        upper,
        base: (1..6).map(|i| [1.0, 0.15 - 0.05 * i as f64]).collect(),
        off: box_off,
    });

    // Diamond, thickness 0.2, 9 points along each face.
    let upper: Vec<P> = (0..=16)
        .map(|i| {
            let x = i as f64 / 16.0;
            [x, 0.1 * (1.0 - (2.0 * x - 1.0).abs())]
        })
        .collect();
    out.push(Shape {
        name: "diamond",
        how: "diamond with corners (0, 0), (0.5, ±0.1), (1, 0), 9 points along each face",
        lower: mirror(&upper),
        upper,
        base: vec![],
        off: diamond_off,
    });

    // D-spar: round nose radius 0.15, flat top and bottom, flat back with points along it.
    let mut upper: Vec<P> = (0..=12)
        .map(|i| {
            let a = PI - 0.5 * PI * i as f64 / 12.0;
            if i == 0 {
                [0.0, 0.0]
            } else if i == 12 {
                [0.15, 0.15]
            } else {
                [0.15 + 0.15 * a.cos(), 0.15 * a.sin()]
            }
        })
        .collect();
    upper.extend((1..=17).map(|i| [0.15 + 0.05 * i as f64, 0.15]));
    out.push(Shape {
        name: "d-spar",
        how: "D-spar: quarter circles of radius 0.15 round the nose (13 points), flat top and bottom every 0.05 chord, flat back with five points along it",
        lower: mirror(&upper),
        upper,
        base: (1..6).map(|i| [1.0, 0.15 - 0.05 * i as f64]).collect(),
        off: dspar_off,
    });

    // Flat-backed section.
    let upper: Vec<P> = cosine(61).iter().map(|&x| [x, flatback_yt(x)]).collect();
    let h = flatback_yt(1.0);
    out.push(Shape {
        name: "flatback",
        how: "NACA 0018 thickness (open trailing edge) plus a thickness growing linearly to 4 % chord at the trailing edge, 61 cosine-spaced stations per surface, five points along the base",
        lower: mirror(&upper),
        upper,
        base: (1..6).map(|i| [1.0, h - 2.0 * h * i as f64 / 6.0]).collect(),
        off: flatback_off,
    });
    out
}

/// The loop from the trailing edge (upper corner) over the upper surface and back along the
/// lower one; for a sharp edge the first point is repeated at the end.
fn te_loop(s: &Shape) -> Vec<P> {
    let mut v: Vec<P> = s.upper.iter().rev().copied().collect();
    v.extend(s.lower[1..].iter().copied());
    v
}

fn fmt(p: P) -> String {
    format!("{:?} {:?}", p[0], p[1])
}

/// (file name, text) of each layout of a shape.
fn layouts(s: &Shape) -> Vec<(String, String)> {
    let name = s.name;
    let mut out = Vec::new();
    let lines = |pts: &[P]| pts.iter().map(|&p| fmt(p)).collect::<Vec<_>>();
    let lp = te_loop(s);
    // 1. One loop from the trailing edge, LF, a title line.
    let mut t = vec![format!("{name} (test outline, one loop)")];
    t.extend(lines(&lp));
    out.push((format!("{name}.loop.dat"), t.join("\n") + "\n"));
    // 2. The same loop the other way round, CRLF line ends, comments and blank lines.
    let mut rev = lp.clone();
    rev.reverse();
    let mut t =
        vec![format!("{name} reversed"), "# points run clockwise".to_string(), String::new()];
    for (i, l) in lines(&rev).into_iter().enumerate() {
        if i == 5 {
            t.push(String::new());
            t.push("   # a comment in the middle".to_string());
        }
        t.push(l);
    }
    out.push((format!("{name}.reversed.dat"), t.join("\r\n") + "\r\n"));
    // 3. Sharp: the loop without its repeated closing point, BOM and CR-only line ends.
    //    Blunt: the base given as points, the loop starting in the middle of the base.
    if s.sharp() {
        let mut t = vec![format!("\u{feff}{name} open form")];
        t.extend(lines(&lp[..lp.len() - 1]));
        out.push((format!("{name}.loop-unclosed.dat"), t.join("\r") + "\r"));
    } else if !s.base.is_empty() {
        let k = s.base.len();
        let m = k / 2;
        let mut pts: Vec<P> = s.base[..=m].iter().rev().copied().collect();
        pts.extend(lp.iter().copied());
        pts.extend(s.base[m..].iter().rev().copied());
        let mut t = vec![format!("\u{feff}{name} base as points")];
        t.extend(lines(&pts));
        out.push((format!("{name}.loop-base-points.dat"), t.join("\r") + "\r"));
        // The loop closed at the upper corner, base points at the end.
        let mut pts = lp.clone();
        pts.extend(s.base.iter().rev().copied());
        pts.push(lp[0]);
        let mut t = vec![format!("{name} closed at a corner")];
        t.extend(lines(&pts));
        out.push((format!("{name}.loop-corner.dat"), t.join("\n") + "\n"));
    }
    // 4. Two surfaces from the leading edge, after a line of counts.
    let mut t = vec![
        format!("{name} two surfaces"),
        format!("{}. {}.", s.upper.len(), s.lower.len()),
        String::new(),
    ];
    t.extend(lines(&s.upper));
    t.push(String::new());
    t.extend(lines(&s.lower));
    out.push((format!("{name}.surfaces-counted.dat"), t.join("\n") + "\n"));
    // 5. Two surfaces without counts, comma separated, no title.
    let mut t: Vec<String> = s.upper.iter().map(|p| format!("{:?}, {:?}", p[0], p[1])).collect();
    t.extend(s.lower.iter().map(|p| format!("{:?}, {:?}", p[0], p[1])));
    out.push((format!("{name}.surfaces.csv"), t.join("\n") + "\n"));
    out
}

fn data_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/data/outlines")
}

#[test]
#[ignore = "writes tests/data/outlines/"]
fn write_outline_files() {
    fs::create_dir_all(data_dir()).unwrap();
    let mut list = String::new();
    for s in shapes() {
        list.push_str(&format!("- `{}.*`: {}.\n", s.name, s.how));
        for (file, text) in layouts(&s) {
            fs::write(data_dir().join(file), text).unwrap();
        }
    }
    fs::write(data_dir().join("README.md"), README.replace("{shapes}", &list)).unwrap();
}

const README: &str = "# Outlines in every layout

Written by `tests/outline_files.rs` (`cargo test --test outline_files -- --ignored
write_outline_files`) from the formulas below; `every_layout_reads_to_the_same_geometry` reads
each file and checks that all files of one shape give the same outline within 1e-9 chord, on the
shape's formula, leading edge at (0, 0), trailing-edge midpoint at (1, 0). Coordinates are written
with all their digits (Rust's shortest round-trip form). The shapes are test geometry, not
sections of any real blade.

Shapes (chord fractions):

{shapes}
Layouts, one file each:

- `NAME.loop.dat`: a title line, then one loop from the trailing edge over the upper surface to
  the leading edge and back along the lower surface; a sharp trailing edge is closed by repeating
  the first point, a blunt one is left open (the base runs from the last point to the first).
- `NAME.reversed.dat`: the same loop the other way round (lower surface first), CRLF line ends,
  comment lines and blank lines.
- `NAME.loop-unclosed.dat` (sharp edges): the loop without its repeated last point, with a
  byte-order mark and CR-only line ends.
- `NAME.loop-base-points.dat` (flat backs): the loop starting in the middle of the base with
  points along the base, closed by repeating the first point; BOM and CR-only line ends.
- `NAME.loop-corner.dat` (flat backs): the loop from the upper corner of the base, with the
  points along the base at the end and the corner repeated.
- `NAME.surfaces-counted.dat`: a title, a line with the two point counts, then the upper surface
  and the lower one, each from the leading edge to the trailing edge, separated by blank lines.
- `NAME.surfaces.csv`: the two surfaces without title or counts, comma separated.

`readme-loop.dat` and `readme-surfaces.dat` are the two examples of the README's *Section
shapes* (NACA 0012 closed, a few stations, values rounded to five places from the formula above;
the box 1 x 0.3 by hand); `the_readme_examples_read` reads them.
";

#[test]
fn committed_files_are_the_generated_ones() {
    for s in shapes() {
        for (file, text) in layouts(&s) {
            let on_disk = fs::read_to_string(data_dir().join(&file))
                .unwrap_or_else(|e| panic!("{file}: {e} (run the ignored write_outline_files)"));
            assert!(on_disk == text, "{file} differs from what the code writes");
        }
    }
}

fn max_diff(a: &[P], b: &[P]) -> f64 {
    assert_eq!(a.len(), b.len());
    a.iter().zip(b).map(|(p, q)| (p[0] - q[0]).hypot(p[1] - q[1])).fold(0.0, f64::max)
}

#[test]
fn every_layout_reads_to_the_same_geometry() {
    for s in shapes() {
        let mut reference: Option<(String, Outline)> = None;
        for (file, _) in layouts(&s) {
            let text = fs::read_to_string(data_dir().join(&file)).unwrap();
            let (o, notes) =
                parse_coordinates_noted(&text, &file).unwrap_or_else(|e| panic!("{file}: {e}"));
            if file.contains("reversed") {
                assert!(notes.iter().any(|n| n.contains("other way")), "{file}: {notes:?}");
            }
            // On the formula, leading edge at the origin, trailing-edge midpoint at (1, 0).
            for p in o.upper.iter().chain(&o.lower) {
                let d = (s.off)(*p);
                assert!(d < 1e-9, "{file}: point {p:?} is {d:e} off the shape");
            }
            assert!(o.upper[0][0].abs() < 1e-12 && o.upper[0][1].abs() < 1e-12, "{file}");
            let (u, l) = (o.upper[o.upper.len() - 1], o.lower[o.lower.len() - 1]);
            assert!(((u[0] + l[0]) / 2.0 - 1.0).abs() < 1e-12, "{file}: {u:?} {l:?}");
            assert!(((u[1] + l[1]) / 2.0).abs() < 1e-12, "{file}: {u:?} {l:?}");
            assert_eq!(o.blunt_te(), !s.sharp(), "{file}");
            assert!(o.upper.iter().map(|p| p[1]).sum::<f64>() > 0.0, "{file}: upper first");
            match &reference {
                None => reference = Some((file.clone(), o)),
                Some((rf, r)) => {
                    let d = max_diff(&o.upper, &r.upper).max(max_diff(&o.lower, &r.lower));
                    assert!(d < 1e-9, "{file} differs from {rf} by {d:e}");
                }
            }
        }
    }
}

#[test]
fn the_readme_examples_read() {
    // The two examples of README.md (Section shapes), kept as files beside the others.
    let text = fs::read_to_string(data_dir().join("readme-loop.dat")).unwrap();
    let (o, _) = parse_coordinates_noted(&text, "readme-loop.dat").unwrap();
    assert!(!o.blunt_te());
    assert!((o.max_depth().1 - 0.12).abs() < 0.01, "{:?}", o.max_depth());
    let text = fs::read_to_string(data_dir().join("readme-surfaces.dat")).unwrap();
    let (o, notes) = parse_coordinates_noted(&text, "readme-surfaces.dat").unwrap();
    assert!(notes.is_empty(), "{notes:?}");
    assert!(o.blunt_te());
    // The box 1 x 0.3: area 0.3, leading edge in the middle of the front face.
    assert!((o.area() - 0.3).abs() < 1e-12, "{}", o.area());
    assert_eq!(o.upper[0], [0.0, 0.0]);
    assert_eq!(o.corners().len(), 2, "the two front corners: {:?}", o.corners());
}

/// A line of point counts that does not match the surfaces (a surface's last point counted to
/// the other) is named at the counts line with what it says, not as a surface doubling back at
/// a point's line; the right counts read. The surfaces are NACA 0012's (Abbott & von Doenhoff,
/// Theory of Wing Sections, §6.4), each from the leading edge to the trailing edge, as the
/// counted layout of the coordinate files has them (common practice).
#[test]
fn point_counts_that_do_not_match_the_surfaces_are_named_at_their_line() {
    let half = |x: f64| {
        0.6 * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
            - 0.1015 * x.powi(4))
    };
    let xs: Vec<f64> =
        (0..=30).map(|k| 0.5 * (1.0 - (std::f64::consts::PI * k as f64 / 30.0).cos())).collect();
    let file = |counts: &str| {
        let mut text = format!("NACA 0012 (test data)\n{counts}\n\n");
        for sign in [1.0, -1.0] {
            for &x in &xs {
                text.push_str(&format!("{x:.6} {:.6}\n", sign * half(x)));
            }
            text.push('\n');
        }
        text
    };
    let (o, _) = parse_coordinates_noted(&file("31 31"), "counted.dat").unwrap();
    assert!((o.max_depth().1 - 0.12).abs() < 0.002, "{:?}", o.max_depth());
    for wrong in ["30 32", "32 30"] {
        let e = parse_coordinates_noted(&file(wrong), "counted.dat").unwrap_err().to_string();
        let (u, l) = wrong.split_once(' ').unwrap();
        assert!(
            e.starts_with(&format!(
                "counted.dat line 2: the point counts ({u} upper, {l} lower) do not match the \
                 surfaces"
            )),
            "{e}"
        );
    }
}

//! Airfoil outlines against independent integrations of the NACA Report 824 formulas.
//!
//! Reference values (REFERENCES.md, mark C: recomputed independently): areas per c² with an
//! open trailing edge 0009 0.061657, 0012 0.082210, 0015 0.102762, 0018 0.123315; 0012 closed
//! 0.081706; NACA 0012 perimeter without the base 2.03927 c. The test also integrates the
//! thickness formula itself (Gauss–Legendre after the substitution x = u², which removes the
//! square-root singularity at the leading edge), independently of the code under test.

use layloft::airfoil::{
    Naca4, Outline, clustered_stations, parse_coordinates, parse_coordinates_noted,
};

/// Area per c² of a symmetric 4-digit section: 2 ∫ y_t dx by 20-point Gauss–Legendre in u with
/// x = u², dx = 2u du (Abramowitz & Stegun, Handbook of Mathematical Functions, 1964, 25.4.30).
fn area_by_quadrature(t: f64, a4: f64) -> f64 {
    // 20-point Gauss–Legendre nodes and weights on [-1, 1] (A&S Table 25.4), positive half.
    const NODES: [(f64, f64); 10] = [
        (0.076_526_521_133_497_33, 0.152_753_387_130_725_85),
        (0.227_785_851_141_645_08, 0.149_172_986_472_603_75),
        (0.373_706_088_715_419_56, 0.142_096_109_318_382_05),
        (0.510_867_001_950_827_1, 0.131_688_638_449_176_63),
        (0.636_053_680_726_515, 0.118_194_531_961_518_42),
        (0.746_331_906_460_150_8, 0.101_930_119_817_240_44),
        (0.839_116_971_822_218_8, 0.083_276_741_576_704_75),
        (0.912_234_428_251_326, 0.062_672_048_334_109_06),
        (0.963_971_927_277_913_8, 0.040_601_429_800_386_94),
        (0.993_128_599_185_094_9, 0.017_614_007_139_152_12),
    ];
    let yt = |x: f64| {
        5.0 * t
            * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x
                + 0.2843 * x.powi(3)
                + a4 * x.powi(4))
    };
    let mut sum = 0.0;
    for (xi, w) in NODES {
        for s in [-xi, xi] {
            let u = 0.5 * (s + 1.0);
            sum += w * 0.5 * yt(u * u) * 2.0 * u;
        }
    }
    2.0 * sum
}

#[test]
fn quadrature_matches_published_areas() {
    // The independent integration itself reproduces the tabulated areas (REFERENCES.md).
    for (t, area) in [(0.09, 0.061657), (0.12, 0.082210), (0.15, 0.102762), (0.18, 0.123315)] {
        assert!((area_by_quadrature(t, -0.1015) - area).abs() < 2e-6, "t = {t}");
    }
    assert!((area_by_quadrature(0.12, -0.1036) - 0.081706).abs() < 2e-6);
}

#[test]
fn resampled_naca_outlines_have_the_integrated_area() {
    // With 200 clustered intervals per surface the polygon area is within 0.05 % of the integral
    // (the polygon's chordal error is second order in the spacing).
    for (code, closed, a4) in
        [("0012", false, -0.1015), ("0015", false, -0.1015), ("0012", true, -0.1036)]
    {
        let t: f64 = code[2..].parse::<f64>().unwrap() / 100.0;
        let outline = Outline::from_naca(&Naca4::parse(code, closed).unwrap(), 801)
            .resample(&clustered_stations(200));
        let exact = area_by_quadrature(t, a4);
        let rel = (outline.area() - exact).abs() / exact;
        assert!(rel < 5e-4, "{code} closed={closed}: {} vs {exact} ({rel:e})", outline.area());
    }
}

#[test]
fn naca_0012_perimeter_and_thickness() {
    // Perimeter without the base 2.03927 c (REFERENCES.md, C).
    let outline = Outline::from_naca(&Naca4::parse("0012", false).unwrap(), 801)
        .resample(&clustered_stations(400));
    assert!((outline.perimeter_without_base() - 2.03927).abs() < 2e-4);
    // Maximum thickness 12 % of chord at about 30 % chord (Report 824).
    let (x, depth) = outline.max_depth();
    assert!((depth - 0.12).abs() < 3e-4 && (x - 0.30).abs() < 0.02, "{x} {depth}");
}

#[test]
fn coordinate_file_round_trips_a_naca_outline() {
    // Write a NACA 0015 outline in file order, read it back: the same area and a blunt base.
    let naca = Outline::from_naca(&Naca4::parse("0015", false).unwrap(), 81);
    let mut text = String::from("NACA 0015 test outline\n");
    for p in naca.upper.iter().rev() {
        text.push_str(&format!("{:.7} {:.7}\n", p[0], p[1]));
    }
    for p in &naca.lower[1..] {
        text.push_str(&format!("{:.7}, {:.7}\n", p[0], p[1]));
    }
    let read = parse_coordinates(&text, "naca0015.dat").unwrap();
    assert!(read.blunt_te());
    assert!((read.area() - naca.area()).abs() / naca.area() < 1e-4);
}

#[test]
fn a_file_in_millimetres_turned_off_its_chord_reads_as_fractions_and_says_so() {
    // The NACA 0015 outline at a 190 mm chord, turned 5° (a rotation and a uniform scale keep
    // the shape: the same area in chord fractions, Euclid), read back to the area of the
    // fractions to 1e-4, with one note on the scale and one on the turn; the fractions' own
    // file reads without either.
    let naca = Outline::from_naca(&Naca4::parse("0015", false).unwrap(), 81);
    let file = |scale: f64, turn_deg: f64| {
        let (s, c) = turn_deg.to_radians().sin_cos();
        let mut text = String::new();
        for p in naca.upper.iter().rev().chain(&naca.lower[1..]) {
            let (x, y) = (scale * p[0], scale * p[1]);
            text.push_str(&format!("{:.9} {:.9}\n", x * c - y * s, x * s + y * c));
        }
        text
    };
    let (read, notes) = parse_coordinates_noted(&file(190.0, 5.0), "tip-mm.dat").unwrap();
    assert!((read.area() - naca.area()).abs() / naca.area() < 1e-4);
    assert_eq!(notes.len(), 2, "{notes:?}");
    assert!(notes[0].contains("is 190.000 ") && notes[0].contains("scaled"), "{notes:?}");
    assert!(notes[1].contains("turned 5.00°"), "{notes:?}");
    let (_, notes) = parse_coordinates_noted(&file(1.0, 0.0), "tip.dat").unwrap();
    assert!(notes.is_empty(), "{notes:?}");
}

#[test]
fn malformed_coordinate_files_say_where() {
    let good: Vec<String> = {
        let o = Outline::from_naca(&Naca4::parse("0012", false).unwrap(), 21);
        let mut v: Vec<String> =
            o.upper.iter().rev().map(|p| format!("{} {}", p[0], p[1])).collect();
        v.extend(o.lower[1..].iter().map(|p| format!("{} {}", p[0], p[1])));
        v
    };
    // Too few points.
    let e = parse_coordinates("1 0\n0.5 0.05\n0 0\n0.5 -0.05\n1 0\n", "a.dat").unwrap_err();
    assert_eq!(e.to_string(), "a.dat: the outline has 5 points: expected at least 10");
    // Doubling back on the upper surface (swap two points: line 4 then goes back towards the TE).
    let mut doubled = good.clone();
    doubled.swap(2, 3);
    let e = parse_coordinates(&doubled.join("\n"), "b.dat").unwrap_err().to_string();
    assert!(e.starts_with("b.dat line") && e.contains("doubles back"), "{e}");
    // Crossing itself: move one lower point above the upper surface.
    let mut crossed = good.clone();
    crossed[30] = "0.5 0.2".to_string();
    let e = parse_coordinates(&crossed.join("\n"), "c.dat").unwrap_err().to_string();
    assert!(e.contains("crosses itself") || e.contains("doubles back"), "{e}");
    // Not a number.
    let mut bad = good.clone();
    bad[5] = "0.7 x".to_string();
    let e = parse_coordinates(&bad.join("\n"), "d.dat").unwrap_err().to_string();
    assert_eq!(e, "d.dat line 6: expected two numbers 'x y' in chord fractions, found '0.7 x'");
}

/// NACA 4-digit surfaces written out here from the section's equations, independently of
/// `layloft::airfoil::Naca4`: thickness `y_t = 5 t (0.2969 √x − 0.1260 x − 0.3516 x² + 0.2843 x³
/// − 0.1015 x⁴)`, mean line `y_c = m/p² (2 p x − x²)` ahead of `p` and `m/(1 − p)² ((1 − 2p) + 2 p x
/// − x²)` behind it, the thickness laid off normal to the mean line: `x_u = x − y_t sin θ`,
/// `y_u = y_c + y_t cos θ`, `x_l = x + y_t sin θ`, `y_l = y_c − y_t cos θ` with `tan θ = dy_c/dx`
/// (Abbott & von Doenhoff, *Theory of Wing Sections*, 1959, §6.4, eqs. 6.1–6.4 as recalled from
/// memory). `n` cosine-spaced stations per surface, both from the leading edge (0, 0) to the open
/// trailing edge, whose midpoint is the mean line's end (1, 0).
fn naca4_surfaces(m: f64, p: f64, t: f64, n: usize) -> (Vec<[f64; 2]>, Vec<[f64; 2]>) {
    let (mut upper, mut lower) = (Vec::new(), Vec::new());
    for i in 0..n {
        let x = 0.5 * (1.0 - (std::f64::consts::PI * i as f64 / (n - 1) as f64).cos());
        let yt = 5.0
            * t
            * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
                - 0.1015 * x.powi(4));
        let (yc, dyc) = if x < p {
            (m / (p * p) * (2.0 * p * x - x * x), 2.0 * m / (p * p) * (p - x))
        } else {
            let q = (1.0 - p) * (1.0 - p);
            (m / q * ((1.0 - 2.0 * p) + 2.0 * p * x - x * x), 2.0 * m / q * (p - x))
        };
        let (s, c) = dyc.atan().sin_cos();
        upper.push([x - yt * s, yc + yt * c]);
        lower.push([x + yt * s, yc - yt * c]);
    }
    (upper, lower)
}

/// A Selig file (one loop: trailing edge, upper surface, leading edge, lower surface) and a
/// Lednicer file (a line of counts, then each surface from the leading edge) of the surfaces,
/// with each point mapped by `f` and printed to nine decimals.
fn selig_and_lednicer(
    upper: &[[f64; 2]],
    lower: &[[f64; 2]],
    f: impl Fn([f64; 2]) -> [f64; 2],
) -> (String, String) {
    let line = |p: [f64; 2]| {
        let q = f(p);
        format!("{:.9} {:.9}\n", q[0], q[1])
    };
    let mut selig = String::from("NACA 4412\n");
    upper.iter().rev().chain(&lower[1..]).for_each(|&p| selig.push_str(&line(p)));
    let mut lednicer = format!("NACA 4412\n{}. {}.\n\n", upper.len(), lower.len());
    upper.iter().for_each(|&p| lednicer.push_str(&line(p)));
    lednicer.push('\n');
    lower.iter().for_each(|&p| lednicer.push_str(&line(p)));
    (selig, lednicer)
}

/// Area and centroid of an outline, from its closed polygon (shoelace formula).
fn area_centroid(o: &Outline) -> (f64, [f64; 2]) {
    let poly = o.closed_polygon();
    let (mut a, mut cx, mut cy) = (0.0, 0.0, 0.0);
    for i in 0..poly.len() {
        let (p, q) = (poly[i], poly[(i + 1) % poly.len()]);
        let w = p[0] * q[1] - q[0] * p[1];
        a += w;
        cx += (p[0] + q[0]) * w;
        cy += (p[1] + q[1]) * w;
    }
    (a / 2.0, [cx / (3.0 * a), cy / (3.0 * a)])
}

#[test]
fn a_cambered_file_on_its_chord_line_keeps_its_frame() {
    // NACA 4412 drawn on its chord line, as the standard Selig and Lednicer files are: the
    // leading-edge point at (0, 0) and the trailing edge's middle at (1, 0). The point farthest
    // from the trailing edge lies on the upper surface a little ahead of (0, 0); the file keeps
    // its own frame all the same, with no note, and reads to the built-in naca4412 (the same
    // equations at the built-in's 801 stations per surface: area and centroid to 1e-6, the
    // round-off of nine printed decimals being far below it; the old reading took the farthest
    // point for the leading edge and turned the section, by 0.16° at 201 stations and 0.27° at
    // 61, with a note).
    let builtin = Outline::from_naca(&Naca4::parse("4412", false).unwrap(), 801);
    let (a0, c0) = area_centroid(&builtin);
    let (upper, lower) = naca4_surfaces(0.04, 0.4, 0.12, 801);
    let (selig, lednicer) = selig_and_lednicer(&upper, &lower, |p| p);
    for (name, text) in [("naca4412.dat", &selig), ("naca4412-lednicer.dat", &lednicer)] {
        let (o, notes) = parse_coordinates_noted(text, name).unwrap();
        assert!(notes.is_empty(), "{name}: {notes:?}");
        let (a, c) = area_centroid(&o);
        assert!((a / a0 - 1.0).abs() < 1e-6, "{name}: area {a} against {a0}");
        assert!((c[0] / c0[0] - 1.0).abs() < 1e-6, "{name}: centroid {c:?} against {c0:?}");
        assert!((c[1] / c0[1] - 1.0).abs() < 1e-6, "{name}: centroid {c:?} against {c0:?}");
        // Resampled as the blade resamples every station: the same outline.
        let st = clustered_stations(120);
        let (ra, rc) = area_centroid(&o.resample(&st));
        let (ra0, rc0) = area_centroid(&builtin.resample(&st));
        assert!((ra / ra0 - 1.0).abs() < 1e-6, "{name}: resampled area {ra} against {ra0}");
        assert!((rc[1] / rc0[1] - 1.0).abs() < 1e-6, "{name}: resampled {rc:?} against {rc0:?}");
    }
    // At the 61 and 201 stations per surface of common files: no note, every point where the
    // file put it (to its nine decimals).
    for n in [61, 201] {
        let (upper, lower) = naca4_surfaces(0.04, 0.4, 0.12, n);
        let (selig, lednicer) = selig_and_lednicer(&upper, &lower, |p| p);
        for text in [selig, lednicer] {
            let (o, notes) = parse_coordinates_noted(&text, "naca4412.dat").unwrap();
            assert!(notes.is_empty(), "{n} stations: {notes:?}");
            let d = o
                .upper
                .iter()
                .zip(&upper)
                .chain(o.lower.iter().zip(&lower))
                .map(|(p, q)| (p[0] - q[0]).hypot(p[1] - q[1]))
                .fold(0.0, f64::max);
            assert!(d < 1e-8, "{n} stations: a point moved by {d:e}");
        }
    }
}

#[test]
fn a_cambered_file_off_its_chord_line_is_still_normalised() {
    // The same NACA 4412 at a 190 mm chord, turned 3° and moved off the origin: not on its chord
    // line, so it is scaled and turned onto the chord from the point farthest from the trailing
    // edge, with the notes. A turn, a shift and a uniform scale keep the shape (Euclid), so the
    // reading is the built-in outline taken onto that chord: its area over the square of the
    // farthest point's distance from the trailing edge (to 1e-6, the nine decimals' round-off
    // being far below it), turned by 3° less the angle of that point below the chord line.
    let builtin = Outline::from_naca(&Naca4::parse("4412", false).unwrap(), 801);
    let (a0, _) = area_centroid(&builtin);
    let (upper, lower) = naca4_surfaces(0.04, 0.4, 0.12, 801);
    let te = [1.0, 0.0];
    let far = upper
        .iter()
        .chain(&lower)
        .copied()
        .max_by(|p, q| (p[0] - te[0]).hypot(p[1]).total_cmp(&(q[0] - te[0]).hypot(q[1])))
        .unwrap();
    let long = (far[0] - te[0]).hypot(far[1]);
    let turn = 3.0 + (-far[1]).atan2(te[0] - far[0]).to_degrees();
    let (s, c) = 3f64.to_radians().sin_cos();
    let moved = |p: [f64; 2]| {
        let (x, y) = (190.0 * p[0], 190.0 * p[1]);
        [x * c - y * s + 12.0, x * s + y * c - 5.0]
    };
    let (selig, lednicer) = selig_and_lednicer(&upper, &lower, moved);
    for text in [selig, lednicer] {
        let (o, notes) = parse_coordinates_noted(&text, "tip-mm.dat").unwrap();
        assert_eq!(notes.len(), 2, "{notes:?}");
        assert!(notes[0].contains("scaled"), "{notes:?}");
        assert!(notes[1].contains(&format!("turned {turn:.2}°")), "{turn}: {notes:?}");
        let (a, _) = area_centroid(&o);
        let expected = a0 / (long * long);
        assert!((a / expected - 1.0).abs() < 1e-6, "area {a} against {expected}");
        assert_eq!(o.upper[0], [0.0, 0.0]);
        let (u, l) = (o.upper[o.upper.len() - 1], o.lower[o.lower.len() - 1]);
        assert!(((u[0] + l[0]) / 2.0 - 1.0).abs() < 1e-12 && ((u[1] + l[1]) / 2.0).abs() < 1e-12);
    }
}

#[test]
fn a_naca_4412_file_gives_the_built_in_section_on_a_blade() {
    // The mine-fan demo with its naca4412 station (r = 0.75 m) given as a Selig file of the same
    // section (the equations above at the built-in's 801 stations): the section solved there has
    // the built-in's stiffness, mass and centres to 1e-6 (relative; centres of the chord), and
    // the blade gives no note on the file (the old reading turned it onto the chord from the
    // point farthest from the trailing edge).
    use layloft::blade::{Blade, BladeWarning};
    use layloft::input::read_project;
    use layloft::section::{SectionParams, solve_section};
    let demo = std::path::Path::new("layups/mine-fan");
    let dir = tempfile::tempdir().unwrap();
    for entry in std::fs::read_dir(demo).unwrap() {
        let path = entry.unwrap().path();
        std::fs::copy(&path, dir.path().join(path.file_name().unwrap())).unwrap();
    }
    let solve = |dir: &std::path::Path| {
        let blade = Blade::from_project(&read_project(&dir.join("blade.toml")).unwrap()).unwrap();
        let layout = blade.section_layout(0.75, 240).unwrap();
        (solve_section(&layout, &SectionParams::default()).unwrap(), blade.warnings())
    };
    let (p0, _) = solve(dir.path());
    let (upper, lower) = naca4_surfaces(0.04, 0.4, 0.12, 801);
    let (selig, _) = selig_and_lednicer(&upper, &lower, |p| p);
    // Named for the section it holds: a file, not the code `4412.dat` (which was refused).
    std::fs::write(dir.path().join("naca4412.dat"), selig).unwrap();
    let stations = std::fs::read_to_string(dir.path().join("stations.csv")).unwrap();
    assert!(stations.contains(",naca4412\n"));
    let stations = stations.replace(",naca4412\n", ",naca4412.dat\n");
    std::fs::write(dir.path().join("stations.csv"), stations).unwrap();
    let (p, notes) = solve(dir.path());
    assert!(!notes.iter().any(|w| matches!(w, BladeWarning::CoordinateFile(_))), "{notes:?}");
    let chord = 0.212;
    for (what, a, b) in [
        ("EA", p.ea, p0.ea),
        ("EI flap", p.ei_flap, p0.ei_flap),
        ("EI edge", p.ei_edge, p0.ei_edge),
        ("GJ", p.gj, p0.gj),
        ("mass", p.mass_per_length, p0.mass_per_length),
    ] {
        assert!((a / b - 1.0).abs() < 1e-6, "{what}: {a:e} against {b:e}");
    }
    for (what, a, b) in [
        ("elastic centre", p.elastic_centre, p0.elastic_centre),
        ("mass centre", p.mass_centre, p0.mass_centre),
    ] {
        let d = (a[0] - b[0]).hypot(a[1] - b[1]) / chord;
        assert!(d < 1e-6, "{what}: {a:?} against {b:?}");
    }
}

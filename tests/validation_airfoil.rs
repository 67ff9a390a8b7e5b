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

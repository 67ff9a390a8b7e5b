//! The HTML report in a real browser: a sample report built with `layloft::report::html` (its
//! figures drawn by simple SVG sketches here, every number invented) is loaded by Debian's
//! headless Chromium with a closed network. It must load without a console message, show every
//! figure with its drawing, give a screenshot and print to A4 with each section on a new page.
//!
//! The browser is an independent general-purpose HTML parser and renderer; where it is missing
//! the static check of the markup still runs (and `LAYLOFT_REQUIRE_BROWSER=1` makes the missing
//! browser a failure). Screenshots and PDFs are kept in `target/report-screenshots/`.

use std::f64::consts::PI;
use std::path::PathBuf;

use layloft::report::html::HtmlReport;
use layloft::report::{Align, Table, fixed, sig4};

use crate::support_browser::sketch::{COLOURS, Series, colour_map, line_plot, outline};
use crate::support_browser::{
    browser_or_skip, console_messages, drawn_figures, screenshot_dir, static_problems,
};

/// Invented sample fan: hub 0.40 m, tip 0.90 m, 990 rpm nominal, 1090 rpm at overspeed.
fn chord(r: f64) -> f64 {
    0.16 - 0.09 * (r - 0.40) / 0.50
}

fn twist_deg(r: f64) -> f64 {
    32.0 - 20.0 * (r - 0.40) / 0.50
}

/// A frequency rising with speed as `f² = f0² + S (rpm/60)²`: the Southwell form, used here
/// only to draw plausible sample curves.
fn mode_hz(f0: f64, s: f64, rpm: f64) -> f64 {
    (f0 * f0 + s * (rpm / 60.0).powi(2)).sqrt()
}

fn span(n: usize) -> Vec<f64> {
    (0..=n).map(|k| 0.40 + 0.50 * k as f64 / n as f64).collect()
}

fn sample_report() -> HtmlReport {
    let mut report = HtmlReport::new("Sample fan blade (invented data)");
    report
        .subtitle("10 blades, 0.40 to 0.90 m, 990 rpm nominal, 1090 rpm overspeed")
        .date("2026-12-01")
        .meta("Input", "layups/sample/blade.toml")
        .meta("Load case", "overspeed × 1.35")
        .verdict(
            false,
            [
                "minimum reserve factor 1.28 at r = 0.47 m, upper spar cap ply 3 (demand ≥ 1.5)",
                "frequency margin 7.4 % to 3P at 1090 rpm (demand ≥ 10 %)",
                "blade mass 0.84 kg (limit 1.2 kg)",
            ],
        )
        .caution("Sample data: every number in this report is invented for a test.");

    let r = span(40);
    let le: Vec<(f64, f64)> = r.iter().map(|&x| (x, 0.3 * chord(x))).collect();
    let te: Vec<(f64, f64)> = r.iter().rev().map(|&x| (x, -0.7 * chord(x))).collect();
    let planform: Vec<(f64, f64)> = le.iter().chain(te.iter()).copied().collect();
    let mut stations = Table::new(&[
        ("station", Align::Left),
        ("r (m)", Align::Right),
        ("chord (mm)", Align::Right),
        ("twist (°)", Align::Right),
        ("airfoil", Align::Left),
    ]);
    for (k, x) in span(4).iter().enumerate() {
        stations.row(vec![
            format!("{}", k + 1),
            fixed(*x, 3),
            fixed(chord(*x) * 1e3, 1),
            fixed(twist_deg(*x), 1),
            if k < 2 { "NACA 4415".into() } else { "NACA 4412".into() },
        ]);
    }
    report
        .section("Blade geometry")
        .paragraph("Planform seen from the pressure side, pitch axis at 30 % chord, and the twist of the chord line from the plane of rotation.")
        .figure("planform", "Planform to scale. Leading edge up; the pitch axis is the zero line.", outline(&[(planform, "#d9e9ec")], "r from 0.40 m (root) to 0.90 m (tip); chord to scale"))
        .figure("twist", "Twist along the span.", line_plot(("r (m)", 0.4, 0.9), ("twist (°)", 10.0, 35.0), &[Series { name: "twist", points: r.iter().map(|&x| (x, twist_deg(x))).collect(), colour: COLOURS[0], dashed: false }], &[]))
        .table("Stations as given.", &stations)
        .link("stations.csv", "stations after interpolation, every 5 mm");

    let ei = |x: f64, base: f64| base * (chord(x) / 0.16).powi(3);
    report
        .section("Mass and stiffness")
        .figure(
            "stiffness",
            "Bending stiffness along the span, chord frame through the elastic centre.",
            line_plot(
                ("r (m)", 0.4, 0.9),
                ("EI (N·m²)", 0.0, 2500.0),
                &[
                    Series {
                        name: "EI flap",
                        points: r.iter().map(|&x| (x, ei(x, 900.0))).collect(),
                        colour: COLOURS[0],
                        dashed: false,
                    },
                    Series {
                        name: "EI edge",
                        points: r.iter().map(|&x| (x, ei(x, 2300.0))).collect(),
                        colour: COLOURS[1],
                        dashed: false,
                    },
                ],
                &[],
            ),
        )
        .figure(
            "mass",
            "Mass per length.",
            line_plot(
                ("r (m)", 0.4, 0.9),
                ("mass (kg/m)", 0.0, 3.0),
                &[Series {
                    name: "m",
                    points: r.iter().map(|&x| (x, 2.6 * chord(x) / 0.16)).collect(),
                    colour: COLOURS[2],
                    dashed: false,
                }],
                &[],
            ),
        )
        .facts([
            ("Blade mass", "0.84 kg"),
            ("Centre of mass", "r = 0.59 m"),
            ("EA at root", "41.2 MN"),
            ("GJ at root", "310 N·m²"),
        ])
        .link("sections.csv", "section properties at every station")
        .link("sections.json", "the same with the full 4x4 stiffness matrices");

    let t: Vec<f64> = (0..=48).map(|k| k as f64 / 48.0).collect();
    let section_ring = |offset: f64| -> Vec<(f64, f64)> {
        t.iter()
            .map(|s| {
                let a = 2.0 * PI * s;
                let x = 0.5 + 0.5 * a.cos();
                let y = 0.12 * (a.sin()) * (1.0 - 0.7 * x)
                    - offset * a.sin().signum() * (1.0 - x * 0.5);
                (x, y)
            })
            .collect()
    };
    report
        .section("Sections and plies")
        .heading("Station 2, r = 0.525 m")
        .figure("section-r0-525", "Section at r = 0.525 m with its outer skin and spar caps (thickness exaggerated 5 times).", outline(&[(section_ring(0.0), "#c9dde1"), (section_ring(0.025), "#ffffff")], "chord 137.5 mm; plies outer face first: [0/±45/0]s carbon twill, caps 4 × 0° carbon UD"))
        .note("Ply thicknesses are drawn five times their size so that each ply can be seen.");

    let map: Vec<Vec<f64>> = (0..12)
        .map(|i| {
            (0..30)
                .map(|j| 1.28 + 0.06 * (i as f64 - 3.0).abs() + 0.05 * (j as f64 - 4.0).abs())
                .collect()
        })
        .collect();
    let mut reserve = Table::new(&[
        ("criterion", Align::Left),
        ("reserve factor (-)", Align::Right),
        ("r (m)", Align::Right),
        ("place", Align::Left),
    ]);
    reserve.row(vec![
        "Tsai-Wu".into(),
        sig4(1.28),
        fixed(0.47, 3),
        "upper spar cap, ply 3, fibre tension".into(),
    ]);
    reserve.row(vec![
        "maximum stress".into(),
        sig4(1.41),
        fixed(0.47, 3),
        "upper spar cap, ply 3, fibre tension".into(),
    ]);
    reserve.row(vec![
        "Hashin".into(),
        sig4(1.39),
        fixed(0.48, 3),
        "upper spar cap, ply 3, fibre tension".into(),
    ]);
    report
        .section("Strength")
        .figure("reserve-map", "Reserve factor by Tsai-Wu over the span and the wall contour; the critical location is outlined.", colour_map(&map, "r from 0.40 m to 0.90 m", "contour from LE", (3, 4)))
        .table("Lowest reserve factor by criterion, overspeed × 1.35.", &reserve)
        .warning("The minimum reserve factor 1.28 is below the demanded 1.5, at r = 0.47 m in the upper spar cap.");

    let pitch: Vec<f64> = (0..=45).map(|k| -15.0 + k as f64).collect();
    report
        .section("Root reactions")
        .figure(
            "pitching-moment",
            "Centrifugal twisting moment about the pitch axis over the pitch range at 1090 rpm.",
            line_plot(
                ("pitch (°)", -15.0, 30.0),
                ("moment (N·m)", -4.0, 4.0),
                &[Series {
                    name: "M pitch",
                    points: pitch
                        .iter()
                        .map(|p| (*p, -3.1 * (2.0 * (p + 22.0) * PI / 180.0).sin()))
                        .collect(),
                    colour: COLOURS[3],
                    dashed: false,
                }],
                &[],
            ),
        )
        .facts([
            ("Centrifugal force", "5.42 kN"),
            ("Flap moment", "63.0 N·m"),
            ("Edge moment", "21.5 N·m"),
            ("Largest pitching moment", "3.10 N·m"),
        ]);

    let rpm: Vec<f64> = (0..=55).map(|k| 20.0 * k as f64).collect();
    let mut lines = vec![
        Series {
            name: "flap 1",
            points: rpm.iter().map(|w| (*w, mode_hz(38.0, 1.2, *w))).collect(),
            colour: COLOURS[0],
            dashed: false,
        },
        Series {
            name: "edge 1",
            points: rpm.iter().map(|w| (*w, mode_hz(95.0, 0.2, *w))).collect(),
            colour: COLOURS[1],
            dashed: false,
        },
    ];
    for n in 1..=6 {
        lines.push(Series {
            name: ["1P", "2P", "3P", "4P", "5P", "6P"][n - 1],
            points: vec![(0.0, 0.0), (1100.0, n as f64 * 1100.0 / 60.0)],
            colour: COLOURS[5],
            dashed: true,
        });
    }
    // Where flap 1 meets 3P: sqrt(f0² + S Ω²) = 3 Ω gives Ω = f0 / sqrt(9 − S).
    let cross_hz = 38.0 / (9.0f64 - 1.2).sqrt();
    let mode_shape = |k: f64| -> Vec<(f64, f64)> {
        span(40)
            .iter()
            .map(|x| {
                let s = (x - 0.4) / 0.5;
                (*x, (k * s).sin() * s)
            })
            .collect()
    };
    report
        .section("Frequencies")
        .figure("campbell", "Campbell diagram: blade frequencies against rotor speed with the rotor harmonics 1P to 6P. The circle marks a crossing inside the speed range.", line_plot(("rotor speed (rpm)", 0.0, 1100.0), ("frequency (Hz)", 0.0, 110.0), &lines, &[(cross_hz * 60.0, 3.0 * cross_hz, "3P")]))
        .figure("mode-shapes", "First mode shapes at 990 rpm, normalised to a unit tip deflection.", line_plot(("r (m)", 0.4, 0.9), ("deflection (-)", -1.2, 1.2), &[
            Series { name: "flap 1", points: mode_shape(1.2), colour: COLOURS[0], dashed: false },
            Series { name: "edge 1", points: mode_shape(1.6), colour: COLOURS[1], dashed: false },
            Series { name: "flap 2", points: mode_shape(4.6), colour: COLOURS[2], dashed: false },
        ], &[]))
        .link("campbell.csv", "frequency of every mode at every speed")
        .link("modes.json", "mode shapes and their classification");

    let mut tooling = Table::new(&[
        ("part", Align::Left),
        ("material", Align::Left),
        ("volume (cm³)", Align::Right),
        ("mass (kg)", Align::Right),
        ("file", Align::Left),
    ]);
    tooling.row(vec![
        "core, cell 1".into(),
        "Bi58Sn42 (sample)".into(),
        sig4(212.4),
        sig4(1.842),
        "core-1.stl".into(),
    ]);
    tooling.row(vec![
        "core, cell 2".into(),
        "Bi58Sn42 (sample)".into(),
        sig4(95.1),
        sig4(0.8247),
        "core-2.stl".into(),
    ]);
    tooling.row(vec![
        "shell".into(),
        "laminate".into(),
        sig4(410.0),
        sig4(0.84),
        "shell.stl".into(),
    ]);
    tooling.row(vec![
        "mould, upper half".into(),
        "tooling board".into(),
        sig4(5210.0),
        sig4(3.647),
        "mould-upper.stl".into(),
    ]);
    tooling.row(vec![
        "mould, lower half".into(),
        "tooling board".into(),
        sig4(5184.0),
        sig4(3.629),
        "mould-lower.stl".into(),
    ]);
    report
        .section("Tooling")
        .table("Parts to make, volumes and masses.", &tooling)
        .warning(
            "Between r = 0.86 m and the tip the inner surfaces meet: no room for a core there.",
        )
        .link("stl/core 1.stl", "core of cell 1, mm")
        .link("stl/mould-upper.stl", "upper mould half, mm")
        .link("tooling.json", "volumes, masses and mesh checks");
    report
}

fn write_page(name: &str, html: &str) -> PathBuf {
    let path = screenshot_dir().join(name);
    layloft::report::write_atomic(&path, html.as_bytes()).unwrap_or_else(|e| panic!("{e}"));
    path
}

#[test]
fn the_sample_report_loads_cleanly_with_every_figure_and_prints_a_page_per_section() {
    let report = sample_report();
    let html = report.render();
    let ids = report.figure_ids();
    assert_eq!(ids.len(), 9, "{ids:?}");
    let problems = static_problems(&html, &ids);
    assert!(problems.is_empty(), "static check:\n{}", problems.join("\n"));
    let page = write_page("sample-report.html", &html);

    let Some(browser) = browser_or_skip("the sample report") else { return };
    let shown = browser
        .render(&page, &screenshot_dir(), "sample-report", (1280, 7200))
        .unwrap_or_else(|e| panic!("{} could not render {}: {e}", browser.program, page.display()));
    eprintln!(
        "{}: screenshot {}, PDF {} ({} pages)",
        browser.version,
        shown.screenshot.display(),
        shown.pdf.display(),
        shown.pdf_pages
    );
    assert!(shown.console.is_empty(), "console messages: {:#?}", shown.console);
    assert_eq!(shown.figures, ids, "figures with a drawing in the browser's DOM");
    assert_eq!(shown.screenshot_size, (1280, 7200));
    // One page for the title, verdict, cautions and contents, then each of the seven sections
    // starts a new page (the print stylesheet's break before every section).
    assert!(shown.pdf_pages > 7, "{} pages for 7 sections", shown.pdf_pages);
    assert!(shown.dom.contains("class=\"verdict verdict-fail\""));
}

#[test]
fn hostile_text_stays_text_in_the_browser() {
    let evil = "<script>console.error('escaped?')</script><img src=x onerror=\"console.error(1)\">";
    let mut report = HtmlReport::new(evil);
    report.meta(evil, evil).verdict(true, [evil]).caution(evil);
    let mut t = Table::new(&[(evil, Align::Left), ("n (-)", Align::Right)]);
    t.row(vec![evil.into(), "1".into()]);
    report
        .section(evil)
        .paragraph(evil)
        .figure(evil, evil, "<svg viewBox=\"0 0 1 1\"></svg>")
        .table(evil, &t)
        .facts([(evil, evil)])
        .note(evil)
        .warning(evil)
        .link(evil, evil);
    let html = report.render();
    let problems = static_problems(&html, &report.figure_ids());
    assert!(problems.is_empty(), "static check:\n{}", problems.join("\n"));
    assert!(!html.contains("<script") && !html.contains("<img"));
    let page = write_page("hostile-text.html", &html);

    let Some(browser) = browser_or_skip("hostile text") else { return };
    let (dom, console) = browser.load(&page).unwrap_or_else(|e| panic!("{e}"));
    assert!(console.is_empty(), "escaped text ran: {console:#?}");
    assert!(!dom.contains("<script") && !dom.contains("<img"));
    assert_eq!(drawn_figures(&dom), report.figure_ids());
}

#[test]
fn the_browser_check_sees_console_errors_and_missing_drawings() {
    // A control: a page that logs an error, throws, and has a figure without a drawing. If the
    // harness did not notice, the checks above could not fail.
    let page = write_page(
        "control.html",
        "<!DOCTYPE html><html><head><meta charset=\"utf-8\"><title>control</title></head><body>\
         <figure data-figure=\"drawn\"><svg viewBox=\"0 0 1 1\"></svg></figure>\
         <figure data-figure=\"empty\"><p>no drawing</p></figure>\
         <script>console.error('control error'); missing_function();</script></body></html>",
    );
    let Some(browser) = browser_or_skip("the control page") else { return };
    let (dom, console) = browser.load(&page).unwrap_or_else(|e| panic!("{e}"));
    let texts: Vec<&str> = console.iter().map(|m| m.text.as_str()).collect();
    assert!(texts.iter().any(|t| t.contains("control error")), "{texts:?}");
    assert!(
        texts.iter().any(|t| t.starts_with("Uncaught") && t.contains("missing_function")),
        "{texts:?}"
    );
    assert_eq!(drawn_figures(&dom), ["drawn"]);
}

#[test]
fn console_lines_of_both_log_formats_are_read() {
    let stderr = "\
[1:1:1201/1.0:ERROR:dbus/bus.cc:405] Failed to connect to the bus: no socket
[2:2:1201/1.1:INFO:CONSOLE:3] \"an error, with a comma\", source: file:///r.html (3)
[3:3:1201/1.2:INFO:CONSOLE(7)] \"Uncaught ReferenceError: f is not defined\", source: file:///r.html (7)
/usr/bin/chromium: 9: [: 1234: unexpected operator";
    let got = console_messages(stderr);
    assert_eq!(got.len(), 2, "{got:#?}");
    assert_eq!(got[0].text, "an error, with a comma");
    assert_eq!(got[0].source, "file:///r.html (3)");
    assert!(got[1].text.starts_with("Uncaught ReferenceError"));
    assert_eq!(
        drawn_figures(
            "<figure id=\"a\" data-figure=\"a\"><svg></svg></figure><figure data-figure=\"b\"></figure>"
        ),
        ["a"]
    );
}

#[test]
fn the_static_check_finds_broken_markup_network_references_and_nan() {
    let ok = "<!DOCTYPE html><html><head><style>a{}</style></head><body><p>a &amp; b &#39; &#x3C;</p>\
              <svg xmlns=\"http://www.w3.org/2000/svg\"><path d=\"M0 0\"/></svg><br></body></html>";
    assert!(static_problems(ok, &[]).is_empty(), "{:?}", static_problems(ok, &[]));
    let cases = [
        ("<div><p>x</div>", "closes <p>"),
        ("<div>", "never closed"),
        ("<p>a < b</p>", "'<' in text"),
        ("<p>R&D</p>", "'&'"),
        ("<img src=\"https://example.org/x.png\">", "network resource"),
        ("<a href=\"//cdn.example.org/x\">x</a>", "network resource"),
        ("<style>@import 'x.css';</style>", "@import"),
        ("<p style=\"background:url(http://x/y.png)\">x</p>", "network resource"),
        ("<p>EI NaN N·m²</p>", "'NaN'"),
        ("<p>ratio inf</p>", "'inf'"),
    ];
    for (html, expected) in cases {
        let found = static_problems(html, &[]);
        assert!(
            found.iter().any(|p| p.contains(expected)),
            "{html}: expected '{expected}' in {found:?}"
        );
    }
    let missing = static_problems("<p>x</p>", &["campbell".to_string()]);
    assert_eq!(missing, ["figure 'campbell' is missing"]);
}

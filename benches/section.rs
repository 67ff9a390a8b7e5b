//! Section properties of 50 stations at 400 contour points each: NACA 0015 outlines (Report 824
//! formula) of varying chord with a skin, a spar cap over 0.15–0.45 c and one web at 0.3 c.
//! Layouts are built outside the timed loop; the figure is the time to solve all 50.

#[path = "../tests/common/mod.rs"]
mod common;

#[path = "kit/mod.rs"]
mod kit;
use kit::Runner;
use layloft::section::{SectionLayout, SectionParams, solve_section};

fn stations() -> Vec<SectionLayout> {
    let m = common::as4_chandra();
    let skin = common::plies(&m, &[45.0, -45.0, 0.0, -45.0, 45.0]);
    let cap = common::plies(&m, &[45.0, -45.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, -45.0, 45.0]);
    let web = common::plies(&m, &[45.0, -45.0, -45.0, 45.0]);
    (0..50)
        .map(|k| {
            let chord = 0.30 - 0.004 * k as f64;
            let l = common::naca00(
                0.15,
                chord,
                400,
                &[0.15, 0.45],
                vec![skin.clone(), cap.clone(), web.clone()],
                |x, _| usize::from((0.15..0.45).contains(&x)),
            );
            let mut l = common::with_web(l, "main", 0.05 * chord, 2);
            l.r = 0.2 + 0.01 * k as f64;
            l
        })
        .collect()
}

fn bench_sections(c: &mut Runner) {
    let layouts = stations();
    let params = SectionParams::default();
    c.bench_function("50 sections x 400 points", |b| {
        b.iter(|| {
            layouts
                .iter()
                .map(|l| {
                    solve_section(std::hint::black_box(l), &params).map(|p| p.ea).unwrap_or(0.0)
                })
                .sum::<f64>()
        })
    });
}

bench_main!(bench_sections);

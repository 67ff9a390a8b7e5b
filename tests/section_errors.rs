//! Layouts the section solver must refuse with a clear message (and never panic on), and the
//! warnings it must give where the thin-wall idealisation is strained.

use crate::common::*;
use layloft::section::{SectionError, SectionParams, solve_section};

fn steel(t: f64) -> layloft::laminate::Laminate {
    single(&isotropic("steel", 210e9, 0.3, t, 7850.0))
}

fn message(l: &layloft::section::SectionLayout) -> String {
    match solve_section(l, &SectionParams::default()) {
        Ok(_) => panic!("expected an error"),
        Err(e) => e.to_string(),
    }
}

#[test]
fn a_web_outside_the_section_names_the_web_and_its_place() {
    let l = with_web(rect(0.2, 0.05, 2, [0; 4], vec![steel(2e-3)]), "rear", 0.25, 0);
    let m = message(&l);
    assert!(
        m.contains("web 'rear'") && m.contains("y/c = 1.25") && m.contains("r = 1.0000"),
        "{m}"
    );
}

#[test]
fn walls_thicker_than_the_section_is_deep_name_the_place() {
    // 30 mm walls in a 50 mm deep box: the upper and lower midlines cross everywhere.
    let l = rect(0.2, 0.05, 4, [0; 4], vec![steel(30e-3)]);
    let e = solve_section(&l, &SectionParams::default()).unwrap_err();
    assert!(matches!(e, SectionError::WallsMeet { .. }), "{e}");
    assert!(e.to_string().contains("thicker than the local depth at y/c"), "{e}");
}

#[test]
fn a_contour_the_wrong_way_round_is_refused() {
    let mut l = tube(0.05, 64, steel(1e-3));
    l.outer.reverse();
    let m = message(&l);
    assert!(m.contains("counter-clockwise"), "{m}");
}

#[test]
fn degenerate_contours_are_refused() {
    let mut l = tube(0.05, 64, steel(1e-3));
    l.outer.truncate(2);
    l.segment_laminate.truncate(2);
    assert!(message(&l).contains("at least 3"));

    let mut l = tube(0.05, 64, steel(1e-3));
    l.outer[5] = l.outer[4];
    assert!(message(&l).contains("repeated point"), "{}", message(&l));

    let mut l = tube(0.05, 64, steel(1e-3));
    l.outer[7][1] = f64::NAN;
    assert!(message(&l).contains("not finite"));

    let mut l = tube(0.05, 64, steel(1e-3));
    l.outer.swap(10, 40);
    assert!(message(&l).contains("crosses itself"), "{}", message(&l));
}

#[test]
fn bad_laminate_references_are_refused() {
    let mut l = tube(0.05, 64, steel(1e-3));
    l.segment_laminate[3] = 4;
    let m = message(&l);
    assert!(m.contains("outer segment 3") && m.contains("below 1") && m.contains("found 4"), "{m}");

    let mut l = tube(0.05, 64, steel(1e-3));
    l.segment_laminate.pop();
    assert!(message(&l).contains("segment_laminate"));

    let mut l = tube(0.05, 64, steel(1e-3));
    l.laminates[0] = layloft::laminate::Laminate::new(vec![]);
    assert!(message(&l).contains("no plies"), "{}", message(&l));
}

#[test]
fn two_webs_at_one_place_are_refused() {
    let l = rect(0.2, 0.05, 2, [0; 4], vec![steel(2e-3)]);
    let l = with_web(with_web(l, "a", 0.08, 0), "b", 0.08, 0);
    assert!(message(&l).contains("same place"), "{}", message(&l));
}

#[test]
fn thick_walls_are_warned_about_not_hidden() {
    // 6 mm walls in a 40 mm deep box: 15 % of the depth (warned above 10 %, common practice).
    let l = rect(0.2, 0.04, 4, [0; 4], vec![steel(6e-3)]);
    let p = solve_section(&l, &SectionParams::default()).unwrap();
    assert!(
        p.warnings.iter().any(|w| w.to_string().contains("15 % of the local depth")),
        "{:?}",
        p.warnings
    );
}

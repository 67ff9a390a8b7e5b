//! Nesting on the roll as a law, over random pattern sets: no two placed patterns overlap, none
//! leaves the roll, the roll length is never below the area bound (total area over width), and
//! every pattern keeps its shape (a rigid turn and shift of its outline).

use layloft::plybook::{NestItem, nest, polygon_area};
use proptest::prelude::*;

/// Whether segments `ab` and `cd` cross or touch (orientation tests, exact for our purpose:
/// a placement closer than the gap would already fail the distance check below).
fn segments_meet(a: [f64; 2], b: [f64; 2], c: [f64; 2], d: [f64; 2]) -> bool {
    let orient = |p: [f64; 2], q: [f64; 2], r: [f64; 2]| {
        (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0])
    };
    let (d1, d2) = (orient(a, b, c), orient(a, b, d));
    let (d3, d4) = (orient(c, d, a), orient(c, d, b));
    (d1 * d2 <= 0.0) && (d3 * d4 <= 0.0)
}

/// Even–odd point in polygon, written here independently of the library.
fn contains(poly: &[[f64; 2]], q: [f64; 2]) -> bool {
    let mut inside = false;
    let n = poly.len();
    for i in 0..n {
        let (a, b) = (poly[i], poly[(i + n - 1) % n]);
        if (a[1] > q[1]) != (b[1] > q[1]) {
            let x = a[0] + (q[1] - a[1]) * (b[0] - a[0]) / (b[1] - a[1]);
            if q[0] < x {
                inside = !inside;
            }
        }
    }
    inside
}

/// Two simple polygons overlap when an edge of one meets an edge of the other or one holds a
/// vertex of the other (polygon intersection by edges and containment).
fn overlap(p: &[[f64; 2]], q: &[[f64; 2]]) -> bool {
    let (n, m) = (p.len(), q.len());
    for i in 0..n {
        for j in 0..m {
            if segments_meet(p[i], p[(i + 1) % n], q[j], q[(j + 1) % m]) {
                return true;
            }
        }
    }
    contains(p, q[0]) || contains(q, p[0])
}

/// A star-shaped outline about the origin: `k` radii at equal angles, counter-clockwise, m.
fn outline(radii: &[f64], stretch: f64) -> Vec<[f64; 2]> {
    let k = radii.len();
    (0..k)
        .map(|i| {
            let t = std::f64::consts::TAU * i as f64 / k as f64;
            [stretch * radii[i] * t.cos(), radii[i] * t.sin()]
        })
        .collect()
}

fn pattern_set() -> impl Strategy<Value = Vec<(Vec<f64>, f64, bool)>> {
    prop::collection::vec(
        (prop::collection::vec(0.05..0.25_f64, 5..12), 1.0..6.0_f64, any::<bool>()),
        1..9,
    )
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(48))]

    #[test]
    fn nested_patterns_never_overlap_nor_leave_the_roll(set in pattern_set(), width in 0.6..1.6_f64) {
        let gap = 0.01;
        let items: Vec<NestItem> = set
            .iter()
            .map(|(radii, stretch, turns)| NestItem { outline: outline(radii, *stretch), quarter_turns: *turns })
            .collect();
        match nest(&items, width, gap) {
            Err(e) => {
                // Refused only when the pattern is wider than the roll in every allowed turn.
                let it = &items[e.item];
                let span = |k: usize| {
                    let v: Vec<f64> = it.outline.iter().map(|p| p[k]).collect();
                    v.iter().cloned().fold(f64::NEG_INFINITY, f64::max) - v.iter().cloned().fold(f64::INFINITY, f64::min)
                };
                let least = if it.quarter_turns { span(0).min(span(1)) } else { span(1) };
                prop_assert!(least > width, "refused a pattern {least} m wide on a {width} m roll");
            }
            Ok(n) => {
                prop_assert_eq!(n.placements.len(), items.len());
                let tol = 1e-9;
                for p in &n.placements {
                    for q in &p.outline {
                        prop_assert!(q[0] >= -tol && q[0] <= n.length + tol, "x {} beyond 0..{}", q[0], n.length);
                        prop_assert!(q[1] >= -tol && q[1] <= width + tol, "y {} off the {} m roll", q[1], width);
                    }
                    // A rigid motion: the area is kept.
                    let (a, b) = (polygon_area(&p.outline).abs(), polygon_area(&items[p.item].outline).abs());
                    prop_assert!((a - b).abs() <= 1e-9 * b);
                }
                for i in 0..n.placements.len() {
                    for j in i + 1..n.placements.len() {
                        prop_assert!(!overlap(&n.placements[i].outline, &n.placements[j].outline),
                            "patterns {} and {} overlap", n.placements[i].item, n.placements[j].item);
                    }
                }
                let total: f64 = items.iter().map(|i| polygon_area(&i.outline).abs()).sum();
                prop_assert!(n.length >= total / width * (1.0 - 1e-12), "length {} below the area bound {}", n.length, total / width);
                prop_assert!(n.length_over_bound() >= 1.0 - 1e-12);
            }
        }
    }
}

//! A mould split along the span for a blade that no single pull draws.
//!
//! The test shape (invented): a crescent section of 100 mm chord, both sides circular arcs
//! through the leading and trailing edges bulging the same way (sagittas 45 and 34 mm, both below
//! the half chord), turned by a chord angle from −30° to +30° along the span, ends on spheres about the rotor centre.
//!
//! Sources (geometry):
//! - A circular arc of chord c and sagitta h has radius `R = (c²/4 + h²) / (2h)` and spans
//!   `±β` about its middle with `sin β = c / (2R)`.
//! - A facet's outward normal seen in the section plane is the contour's normal; the concave
//!   lower arc's normals span `±β₂` about the chord normal, so a half pulled normal to the pitch
//!   axis draws it only when the pull lies within `90° − β₂` of the chord normal (a contour
//!   monotone across the pull): a window of `180° − 2β₂` about the chord angle φ(x). A single
//!   pull draws every section only if the span's range of chord angles fits in that window;
//!   here it does not (60° against about 43°), and two windows cover it: two modules are the
//!   fewest.
//! - Volume of a box; the parts, the sockets' clearance aside, fill it (Cavalieri: disjoint
//!   solids that cover a box add up to its volume), checked also point by point by ray parity
//!   (Möller and Trumbore, "Fast, minimum storage ray-triangle intersection", 1997, for each
//!   crossing).

use std::f64::consts::PI;

use layloft::mesh::{CheckParams, LengthUnit, Mesh, check_solid};
use layloft::tooling::{
    ChainEnds, EndKind, FnSurface, LoftParams, MouldParams, SpanSurface, Trims,
    build_modular_mould, loft_modules, span_modules,
};
use layloft::units::Angle;

use crate::common::inside_mesh as inside;

const CHORD: f64 = 0.1;
const SAG_UPPER: f64 = 0.045;
const SAG_LOWER: f64 = 0.034;

/// A circular arc through (−c/2, 0) and (c/2, 0) of sagitta h at parameter u ∈ [0, 1] (front to
/// back), moved so the pitch axis lies at a quarter chord.
fn arc(h: f64, u: f64) -> [f64; 2] {
    let r = (CHORD * CHORD / 4.0 + h * h) / (2.0 * h);
    let beta = (CHORD / (2.0 * r)).asin();
    let t = -beta + 2.0 * beta * u;
    [r * t.sin() + 0.25 * CHORD, h - r + r * t.cos()]
}

fn twist(x: f64) -> Angle {
    Angle::from_deg(-30.0 + 60.0 * (x - 0.2) / 0.6)
}

fn crescent() -> impl SpanSurface {
    FnSurface {
        span: [0.2, 0.8],
        upper: |_x: f64, u: f64| arc(SAG_UPPER, u),
        lower: |_x: f64, u: f64| arc(SAG_LOWER, u),
        chord_angle: twist,
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
    }
}

fn mould_params() -> MouldParams {
    MouldParams {
        pull: [0.0, 0.0, 1.0],
        margin: 0.02,
        tolerance: 2e-4,
        min_draft: Angle::from_deg(1.0),
        unit: LengthUnit::Millimetre,
    }
}

fn check(mesh: &Mesh, part: &str) -> f64 {
    match check_solid(mesh, part, &CheckParams::default()) {
        Ok(s) => s.volume,
        Err(e) => panic!("{e}"),
    }
}

#[test]
fn a_crescent_no_single_pull_draws_is_split_into_the_fewest_modules_and_every_part_draws() {
    let blade = crescent();
    let loft = LoftParams { tolerance: 2e-4, ..LoftParams::default() };
    let trims = Trims::spheres(0.3, 0.7);
    // The window of drawing pulls about each chord angle (see the module docs).
    let r2 = (CHORD * CHORD / 4.0 + SAG_LOWER * SAG_LOWER) / (2.0 * SAG_LOWER);
    let beta2 = (CHORD / (2.0 * r2)).asin().to_degrees();
    let window = 180.0 - 2.0 * beta2;
    assert!(window < 60.0 && 2.0 * window > 60.0, "{window}° against 60° of twist");
    // The search runs over the whole surface (the loft reaches below x = 0.3 where the root
    // sphere meets the edges).
    let modules = span_modules(&blade, blade.span(), 160, Some(Angle::ZERO)).unwrap();
    assert_eq!(modules.len(), 2, "{modules:?}");
    for m in &modules {
        // The module's pull lies in the window of every one of its sections (0.5° steps).
        for x in [m.x_range[0], m.x_range[1]] {
            let off = (m.pull_angle - twist(x)).deg();
            assert!(off.abs() <= 0.5 * window + 0.5, "x {x}: pull {off}° off the chord normal");
        }
    }
    assert!((modules[0].x_range[1] - modules[1].x_range[0]).abs() < 1e-15);

    let solids = loft_modules(&blade, &trims, &loft, &modules).unwrap();
    let mould = build_modular_mould(&solids, &modules, &mould_params()).unwrap();
    let mut volume = 0.0;
    let mut meshes: Vec<(&Mesh, String)> = Vec::new();
    for (j, (set, solid)) in mould.parts.iter().zip(&mould.solids).enumerate() {
        volume += check(&solid.mesh, "module part");
        meshes.push((&solid.mesh, format!("part {j}")));
        for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
            volume += check(mesh, half.side);
            assert!(half.undercuts.is_empty(), "module {j} {}: {:?}", half.side, half.undercuts);
            assert!(half.draft.min_draft.deg() >= -1e-6, "module {j} {}", half.side);
            // Below the least draft only next to the parting line, where the silhouette is
            // parallel to the pull: a small share of the cavity.
            assert!(half.draft.below_min_area < 0.01 * half.cavity_area, "module {j}");
            meshes.push((mesh, format!("module {j} {}", half.side)));
        }
        for (mesh, piece) in &set.end_pieces {
            volume += check(mesh, piece.side);
            assert!(piece.undercuts.is_empty(), "module {j} {}", piece.side);
            meshes.push((mesh, format!("module {j} {}", piece.side)));
        }
    }
    // Locating pins: each pin (lower half) and its socket (upper half) lie on one axis along the
    // module's pull, through the point where the axis meets the parting surface: the pin's flat
    // top and the socket's floor have their centre vertices on that line (the socket deeper by
    // its clearance), so the socket leaves the pin along the pull even where the module's pull is
    // turned from the block's frame (15° here).
    for (j, set) in mould.parts.iter().enumerate() {
        let d = set.halves[0].pull;
        for &base in &set.halves[0].locators {
            let on_axis = |mesh: &Mesh| -> Vec<f64> {
                mesh.vertices
                    .iter()
                    .filter_map(|&p| {
                        let w = [p[0] - base[0], p[1] - base[1], p[2] - base[2]];
                        let t = w[0] * d[0] + w[1] * d[1] + w[2] * d[2];
                        let off = [w[0] - t * d[0], w[1] - t * d[1], w[2] - t * d[2]];
                        let r = (off[0] * off[0] + off[1] * off[1] + off[2] * off[2]).sqrt();
                        (r < 1e-9 && t > 1e-6).then_some(t)
                    })
                    .collect()
            };
            let (pin, socket) = (on_axis(&set.half_meshes[1]), on_axis(&set.half_meshes[0]));
            assert_eq!((pin.len(), socket.len()), (1, 1), "module {j}: {pin:?} {socket:?}");
            assert!(socket[0] > pin[0] && socket[0] - pin[0] < 2e-4, "{pin:?} {socket:?}");
        }
    }
    // The pins of the whole block register it one way only: turned half a turn about the pull
    // (X and Y mirrored about the block's middle) or mirrored across the span or across the
    // chord, some pin finds no socket within 1 mm.
    let pins: Vec<[f64; 3]> =
        mould.parts.iter().flat_map(|set| set.halves[0].locators.iter().copied()).collect();
    assert_eq!(pins.len(), 3);
    let centre = |k: usize| {
        let (lo, hi) = pins
            .iter()
            .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| (a.min(p[k]), b.max(p[k])));
        0.5 * (lo + hi)
    };
    for flip in [[true, true], [true, false], [false, true]] {
        let image = |p: [f64; 3]| {
            let mut q = p;
            for k in 0..2 {
                if flip[k] {
                    q[k] = 2.0 * centre(k) - p[k];
                }
            }
            q
        };
        let unmatched = pins.iter().any(|&p| {
            let q = image(p);
            pins.iter().all(|r| ((q[0] - r[0]).powi(2) + (q[1] - r[1]).powi(2)).sqrt() > 1e-3)
        });
        assert!(unmatched, "the pins are symmetric under {flip:?}");
    }
    // The concave root end goes to an end piece of the first module, and only there.
    assert_eq!(
        mould.parts[0].end_pieces.iter().map(|e| e.1.side).collect::<Vec<_>>(),
        ["root end"]
    );
    assert!(mould.parts[1].end_pieces.iter().all(|e| e.1.side == "tip end"));

    // Volume balance: the block less the sockets' clearance (three pins in all: two at the
    // first module's root corners, one at the last module's tip corner; each at most
    // 0.1 mm · (π (r_b + r_t) s + π r_t²) for base radius m/6 and height m/3, with 10 % for
    // the lean and the facets).
    // And two keys on each end piece, their sockets c off faces of less than 0.15 m² each (see
    // validation_tooling.rs).
    let pieces: usize = mould.parts.iter().map(|set| set.end_pieces.len()).sum();
    let [x, y, z] = mould.block_size;
    let gap = x * y * z - volume;
    let (rb, h) = (0.02 / 6.0, 0.02 / 3.0);
    let rt = rb - h * 10f64.to_radians().tan();
    let bound = 3.0 * 1e-4 * PI * ((rb + rt) * h * 1.2 + rt * rt) * 1.2
        + 2.0 * pieces as f64 * 1e-4 * 0.15 * 0.02 * 0.02;
    assert!(gap > 0.0 && gap < bound, "{gap:e} vs {bound:e}");
    assert!(gap / (x * y * z) < 1e-3);

    // Point sampling of the block in its own frame (the mean pull along Z).
    let ez = mould.parts[0].halves[0].pull;
    let ez1 = mould.parts[1].halves[0].pull;
    let mid = [0.0, ez[1] + ez1[1], ez[2] + ez1[2]];
    let n = (mid[1] * mid[1] + mid[2] * mid[2]).sqrt();
    let ez = [0.0, mid[1] / n, mid[2] / n];
    let ey = [0.0, ez[2], -ez[1]];
    let (lo, hi) = meshes
        .iter()
        .flat_map(|(m, _)| m.vertices.iter())
        .map(|&p| [p[0], p[1] * ey[1] + p[2] * ey[2], p[1] * ez[1] + p[2] * ez[2]])
        .fold(([f64::INFINITY; 3], [f64::NEG_INFINITY; 3]), |(lo, hi), q| {
            ([0, 1, 2].map(|k| lo[k].min(q[k])), [0, 1, 2].map(|k| hi[k].max(q[k])))
        });
    for k in 0..3 {
        assert!(((hi[k] - lo[k]) / mould.block_size[k] - 1.0).abs() < 1e-9, "axis {k}");
    }
    let mut seed = 4242u64;
    let mut next = || {
        seed = seed.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
        (seed >> 11) as f64 / (1u64 << 53) as f64
    };
    let mut in_part = 0;
    for _ in 0..600 {
        let q = [0, 1, 2].map(|k| lo[k] + (0.001 + 0.998 * next()) * (hi[k] - lo[k]));
        let p = [q[0], q[1] * ey[1] + q[2] * ez[1], q[1] * ey[2] + q[2] * ez[2]];
        let holders: Vec<&str> =
            meshes.iter().filter(|(m, _)| inside(m, p)).map(|(_, n)| n.as_str()).collect();
        assert_eq!(holders.len(), 1, "{p:?} is inside {holders:?}");
        in_part += usize::from(holders[0].starts_with("part"));
    }
    assert!(in_part > 0, "no point fell in the blade");
}

/// A circular arc through (−c/2, 0) and (c/2, 0) spanning `±beta` about its middle (beyond a
/// semicircle when `beta` > 90°), at parameter u ∈ [0, 1].
fn wide_arc(beta: f64, u: f64) -> [f64; 2] {
    let r = 0.5 * CHORD / beta.sin();
    let t = -beta + 2.0 * beta * u;
    [r * t.sin(), -r * beta.cos() + r * t.cos()]
}

#[test]
fn a_section_folded_across_every_pull_is_refused_by_its_radius() {
    // Both sides arcs of more than a half circle (300° and 280°): whatever the direction, the
    // inner arc holds at least one of its extremes across it and the outer arc another, so the
    // contour turns at least four times (geometry) and no split along the span helps.
    let hook = FnSurface {
        span: [0.2, 0.8],
        upper: |_x: f64, u: f64| wide_arc(150f64.to_radians(), u),
        lower: |_x: f64, u: f64| wide_arc(140f64.to_radians(), u),
        chord_angle: |_x: f64| Angle::ZERO,
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
    };
    let err = span_modules(&hook, hook.span(), 12, None).unwrap_err().to_string();
    assert!(err.contains("radius 200.0 mm") && err.contains("every pull"), "{err}");
    // The crescent of the test above draws at every radius along some pull.
    let blade = crescent();
    assert!(span_modules(&blade, blade.span(), 12, None).is_ok());
}

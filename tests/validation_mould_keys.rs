//! Locating keys between a mould's end pieces and its halves, on invented test blades: a round
//! tube ended on spheres about the rotor centre (a plug of round outline would seat in any turn
//! about its pull but for its keys), and the twisted crescent of two span-wise modules.
//!
//! Sources (geometry):
//! - Point in a solid by ray parity (Möller and Trumbore, "Fast, minimum storage ray-triangle
//!   intersection", 1997, for each crossing); point in a polygon by crossing parity (Jordan curve
//!   theorem).
//! - The bore of an end piece is its end ring carried along the pitch axis: a point whose
//!   (Y, Z) lies outside the ring's outline and inside the end piece belongs to a key; such a point
//!   lies in a socket of one half only.
//! - A half turn about the pitch axis through the round outline's centre maps the bore onto
//!   itself: the keys alone decide whether the turned end piece fits.

use layloft::mesh::{CheckParams, LengthUnit, Mesh, check_solid};
use layloft::tooling::{
    ChainEnds, EndKind, FnSurface, LoftParams, LoftedSolid, MouldParams, MouldParts, SpanSurface,
    Trims, build_modular_mould, build_mould_parts, loft_modules, loft_solid, span_modules,
};
use layloft::units::Angle;

use crate::common::inside_mesh as inside;

const MARGIN: f64 = 0.02;
/// The clearance of every socket round its key (and of the pins), m.
const CLEARANCE: f64 = 1e-4;

fn mould_params() -> MouldParams {
    MouldParams {
        pull: [0.0, 0.0, 1.0],
        margin: MARGIN,
        tolerance: 4e-4,
        min_draft: Angle::from_deg(1.0),
        unit: LengthUnit::Millimetre,
    }
}

fn tube(r: f64) -> impl SpanSurface {
    use std::f64::consts::PI;
    FnSurface {
        span: [0.2, 0.8],
        upper: move |_x: f64, u: f64| [-r * (PI * u).cos(), r * (PI * u).sin()],
        lower: move |_x: f64, u: f64| [-r * (PI * u).cos(), -r * (PI * u).sin()],
        chord_angle: |_x: f64| Angle::ZERO,
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
    }
}

/// A circular arc through (−c/2, 0) and (c/2, 0) of sagitta h (the crescent of the span-wise
/// modules' test, 100 mm chord, pitch axis at a quarter chord).
fn arc(h: f64, u: f64) -> [f64; 2] {
    let c = 0.1;
    let r = (c * c / 4.0 + h * h) / (2.0 * h);
    let beta = (c / (2.0 * r)).asin();
    let t = -beta + 2.0 * beta * u;
    [r * t.sin() + 0.25 * c, h - r + r * t.cos()]
}

/// INVENTED TEST BLADE: a crescent twisted through 60° over the span (also the module keys' test).
pub(crate) fn crescent() -> impl SpanSurface {
    FnSurface {
        span: [0.2, 0.8],
        upper: |_x: f64, u: f64| arc(0.045, u),
        lower: |_x: f64, u: f64| arc(0.034, u),
        chord_angle: |x: f64| Angle::from_deg(-30.0 + 60.0 * (x - 0.2) / 0.6),
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
    }
}

fn in_polygon(poly: &[[f64; 2]], p: [f64; 2]) -> bool {
    let mut inside = false;
    for i in 0..poly.len() {
        let (a, b) = (poly[i], poly[(i + 1) % poly.len()]);
        if (a[1] > p[1]) != (b[1] > p[1])
            && p[0] < a[0] + (p[1] - a[1]) / (b[1] - a[1]) * (b[0] - a[0])
        {
            inside = !inside;
        }
    }
    inside
}

/// The points of a grid round each key of the end piece `e` of `set` that lie in the end piece
/// outside the bore of `part`'s end ring, per key; asserting on the way that no grid point lies
/// in two parts and that every key point stands the clearance off both halves.
fn key_points(part: &LoftedSolid, set: &MouldParts, e: usize) -> Vec<Vec<[f64; 3]>> {
    let (piece, what) = &set.end_pieces[e];
    let ring = if what.side == "root end" { &part.root_ring } else { &part.tip_ring };
    let bore: Vec<[f64; 2]> = ring
        .iter()
        .map(|&v| {
            let p = part.mesh.vertices[v as usize];
            [p[1], p[2]]
        })
        .collect();
    let inward = if what.side == "root end" { 1.0 } else { -1.0 };
    let reach = 0.3 * MARGIN;
    let n = 14;
    let mut out = Vec::new();
    for &m in &what.locators {
        let mut keys = Vec::new();
        let mut holders = [0usize; 2];
        for i in 0..n {
            for j in 0..=n {
                for k in 0..=n {
                    let p = [
                        m[0] + inward * reach * (i as f64 + 0.5) / n as f64,
                        // (Off the key's middle, which lies on the wall's plane.)
                        m[1] + reach * (2.0 * (j as f64 + 0.37) / (n + 1) as f64 - 1.0),
                        m[2] + reach * (2.0 * (k as f64 + 0.41) / (n + 1) as f64 - 1.0),
                    ];
                    if in_polygon(&bore, [p[1], p[2]]) {
                        continue;
                    }
                    let in_piece = inside(piece, p);
                    let in_half = set.half_meshes.iter().map(|h| inside(h, p)).collect::<Vec<_>>();
                    let count = usize::from(in_piece) + in_half.iter().filter(|&&b| b).count();
                    assert!(count <= 1, "{p:?} lies in {count} parts");
                    for (h, &b) in in_half.iter().enumerate() {
                        holders[h] += usize::from(b);
                    }
                    if in_piece {
                        keys.push(p);
                    }
                }
            }
        }
        // Round the key only one half: the key seats in that half's socket.
        assert!(
            (holders[0] == 0) != (holders[1] == 0),
            "{}: key at {m:?} lies between both halves {holders:?}",
            what.side
        );
        // The clearance: a key point moved by 0.95 c any way (26 directions) is in no half.
        for &p in &keys {
            for d in (0..27).filter(|&d| d != 13) {
                let u = [(d / 9) as f64 - 1.0, ((d / 3) % 3) as f64 - 1.0, (d % 3) as f64 - 1.0];
                let l = (u[0] * u[0] + u[1] * u[1] + u[2] * u[2]).sqrt();
                let q = [0, 1, 2].map(|a| p[a] + 0.95 * CLEARANCE * u[a] / l);
                for h in &set.half_meshes {
                    assert!(!inside(h, q), "{}: {q:?} within the clearance", what.side);
                }
            }
        }
        out.push(keys);
    }
    out
}

fn closed(mesh: &Mesh, name: &str) {
    if let Err(e) = check_solid(mesh, name, &CheckParams::default()) {
        panic!("{e}");
    }
}

#[test]
fn a_round_plug_has_a_key_into_each_half_and_seats_one_way_only() {
    let blade = tube(0.03);
    let loft = LoftParams { tolerance: 4e-4, ..LoftParams::default() };
    let part = loft_solid(&blade, &Trims::spheres(0.3, 0.7), &loft).unwrap();
    let set = build_mould_parts(&part, &|_x| Angle::ZERO, &mould_params()).unwrap();
    assert_eq!(set.end_pieces.iter().map(|p| p.1.side).collect::<Vec<_>>(), ["root end"]);
    let mut volume = part.mesh.signed_volume();
    for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
        closed(mesh, half.side);
        volume += mesh.signed_volume();
    }
    let (piece, what) = &set.end_pieces[0];
    closed(piece, what.side);
    volume += piece.signed_volume();
    // Two keys, one into each half.
    assert_eq!(what.locators.len(), 2);
    let keys = key_points(&part, &set, 0);
    assert!(
        keys.iter().all(|k| k.len() >= 3),
        "{:?}",
        keys.iter().map(Vec::len).collect::<Vec<_>>()
    );
    // Turned half a turn about the pitch axis through the outline's centre (y, z → −y, −z), or
    // mirrored across the chord (z → −z) or across the pull (y → −y), the bore still fits, but
    // key points land inside a half: the plug seats one way only.
    for (name, map) in
        [("half turn", [-1.0, -1.0]), ("mirror z", [1.0, -1.0]), ("mirror y", [-1.0, 1.0])]
    {
        let clash = keys.iter().flatten().filter(|p| {
            let q = [p[0], map[0] * p[1], map[1] * p[2]];
            set.half_meshes.iter().any(|h| inside(h, q))
        });
        assert!(clash.count() > 0, "{name}: the keys fit");
    }
    // Volume balance: the block less the clearances of pins and sockets, within 0.1 %.
    let [x, y, z] = set.halves[0].block_size;
    let gap = x * y * z - volume;
    assert!(gap > 0.0 && gap < 1e-3 * x * y * z, "{gap:e} of {:e}", x * y * z);
}

#[test]
fn the_end_pieces_of_a_two_module_mould_key_into_their_halves() {
    let blade = crescent();
    let loft = LoftParams { tolerance: 4e-4, ..LoftParams::default() };
    let modules = span_modules(&blade, blade.span(), 160, Some(Angle::ZERO)).unwrap();
    assert_eq!(modules.len(), 2);
    let solids = loft_modules(&blade, &Trims::spheres(0.3, 0.7), &loft, &modules).unwrap();
    let mould = build_modular_mould(&solids, &modules, &mould_params()).unwrap();
    let mut pieces = 0;
    for (set, part) in mould.parts.iter().zip(&mould.solids) {
        for (e, (mesh, what)) in set.end_pieces.iter().enumerate() {
            closed(mesh, what.side);
            assert_eq!(what.locators.len(), 2, "{}", what.side);
            let keys = key_points(part, set, e);
            assert!(keys.iter().all(|k| k.len() >= 3), "{}", what.side);
            pieces += 1;
        }
        for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
            closed(mesh, half.side);
        }
    }
    assert!(pieces >= 1);
}

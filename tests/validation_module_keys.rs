//! Locating keys across the flush faces where the span-wise modules of a mould meet, on the
//! invented twisted crescent of two modules (also used by the end-piece keys' test).
//!
//! Sources (geometry):
//! - Point in a solid by ray parity (Möller and Trumbore, "Fast, minimum storage ray-triangle
//!   intersection", J. Graphics Tools 2 (1997) 21–28, for each crossing; Jordan curve theorem),
//!   the test's own code in tests/common.
//! - Distance between parallel planes: the distance of any point of one from the other along
//!   the unit normal (Euclidean geometry); a homothety maps each plane to a parallel one.
//! - A rigid half turn about the pitch axis, or a mirror across the middle of the block's
//!   width or height, keeps the block's outline: only the keys decide whether the turned
//!   module fits.

use layloft::mesh::{CheckParams, LengthUnit, Mesh, check_solid};
use layloft::tooling::{
    LoftParams, ModularMould, MouldParams, SpanSurface, Trims, build_modular_mould, loft_modules,
    span_modules,
};
use layloft::units::Angle;

use crate::common::inside_mesh as inside;
use crate::validation_mould_keys::crescent;

const MARGIN: f64 = 0.02;
/// The clearance of every socket round its key, m.
const CLEARANCE: f64 = 1e-4;

type P3 = [f64; 3];

fn sub(a: P3, b: P3) -> P3 {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}
fn dot(a: P3, b: P3) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}
fn cross(a: P3, b: P3) -> P3 {
    [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}
fn unit(a: P3) -> P3 {
    let n = dot(a, a).sqrt();
    [a[0] / n, a[1] / n, a[2] / n]
}
fn lerp(a: P3, b: P3, t: f64) -> P3 {
    [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), a[2] + t * (b[2] - a[2])]
}

fn mould() -> ModularMould {
    let blade = crescent();
    // A coarse tolerance keeps the test quick.
    let loft = LoftParams { tolerance: 1e-3, ..LoftParams::default() };
    let modules = span_modules(&blade, blade.span(), 160, Some(Angle::ZERO)).unwrap();
    assert_eq!(modules.len(), 2);
    let solids = loft_modules(&blade, &Trims::spheres(0.3, 0.7), &loft, &modules).unwrap();
    let params = MouldParams {
        pull: [0.0, 0.0, 1.0],
        margin: MARGIN,
        tolerance: 1e-3,
        min_draft: Angle::from_deg(1.0),
        unit: LengthUnit::Millimetre,
    };
    build_modular_mould(&solids, &modules, &params).unwrap()
}

/// Points filling the wedge `c` (`P_a, Q_a, Q_b, P_b, F`): its two tetrahedra sampled by
/// barycentric weights kept off the faces.
fn wedge_points(c: &[P3; 5]) -> Vec<P3> {
    let mut out = Vec::new();
    for tet in [[c[0], c[1], c[2], c[4]], [c[0], c[2], c[3], c[4]]] {
        for i in 1..5 {
            for j in 1..5 {
                for k in 1..5 {
                    let (a, b, d) = (i as f64 / 16.0, j as f64 / 16.0, k as f64 / 16.0);
                    let w = 1.0 - a - b - d;
                    let mut p = [0.0; 3];
                    for (q, f) in tet.iter().zip([w, a, b, d]) {
                        for x in 0..3 {
                            p[x] += f * q[x];
                        }
                    }
                    out.push(p);
                }
            }
        }
    }
    out
}

/// The unit outward normal of the key's face `a b c` (away from `inner`, a point of the key)
/// and the face's distance from the parallel face of the socket.
fn face_gap(key: &[P3; 5], socket: &[P3; 5], [a, b, c]: [usize; 3]) -> (P3, f64) {
    let mut n = unit(cross(sub(key[b], key[a]), sub(key[c], key[a])));
    let inner = lerp(lerp(key[0], key[3], 0.5), key[4], 0.3);
    if dot(n, sub(inner, key[a])) > 0.0 {
        n = [-n[0], -n[1], -n[2]];
    }
    let m = unit(cross(sub(socket[b], socket[a]), sub(socket[c], socket[a])));
    assert!(dot(n, m).abs() > 1.0 - 1e-12, "socket face not parallel to the key's");
    (n, dot(sub(socket[a], key[a]), n))
}

#[test]
fn modules_key_across_their_flush_faces_and_register_one_way() {
    let mould = mould();
    let [first, second] = [&mould.parts[0], &mould.parts[1]];
    // Every pair of module parts sharing the flush face (upper with upper, lower with lower)
    // has one key on the root-side module and its socket in the tip-side one.
    for set in [first, second] {
        for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
            // Closed, outward and free of self-intersection (the library's mesh check).
            if let Err(e) = check_solid(mesh, half.side, &CheckParams::default()) {
                panic!("{e}");
            }
        }
    }
    assert_eq!(first.module_keys.len(), 2);
    assert_eq!(second.module_keys.len(), 2);
    let all: Vec<&Mesh> = mould
        .parts
        .iter()
        .flat_map(|s| s.half_meshes.iter().chain(s.end_pieces.iter().map(|p| &p.0)))
        .collect();
    for (k, upper) in [(0, true), (1, false)] {
        let key = first.module_keys.iter().find(|m| m.upper == upper).unwrap();
        let socket = second.module_keys.iter().find(|m| m.upper == upper).unwrap();
        assert!(!key.socket && socket.socket);
        let (holder, other) = (&first.half_meshes[k], &second.half_meshes[k]);
        // The socket stands the clearance off the key's nearest face and no nearer on any.
        let gaps: Vec<(P3, f64)> = [[1, 2, 4], [0, 1, 4], [3, 2, 4]]
            .iter()
            .map(|&f| face_gap(&key.corners, &socket.corners, f))
            .collect();
        let least = gaps.iter().map(|g| g.1).fold(f64::INFINITY, f64::min);
        assert!((least - CLEARANCE).abs() < 1e-9, "least gap {least:e}");
        // Points of the key lie in its module's half and in no other part.
        let points = wedge_points(&key.corners);
        for &p in &points {
            assert!(inside(holder, p), "key point {p:?} not in its half");
            assert!(!inside(other, p), "key point {p:?} in the socket's half");
            assert_eq!(all.iter().filter(|m| inside(m, p)).count(), 1, "{p:?}");
        }
        // Half the clearance off each outer face of the key (at the face's middle) is the gap:
        // in no part; the socket's far side (the key's middle pushed out by twice the largest
        // gap) is the neighbour's solid.
        for (f, (n, g)) in [[1, 2, 4], [0, 1, 4], [3, 2, 4]].iter().zip(&gaps) {
            let c = f.iter().fold([0.0; 3], |s, &i| {
                [
                    s[0] + key.corners[i][0] / 3.0,
                    s[1] + key.corners[i][1] / 3.0,
                    s[2] + key.corners[i][2] / 3.0,
                ]
            });
            let at = |d: f64| [c[0] + d * n[0], c[1] + d * n[1], c[2] + d * n[2]];
            assert_eq!(all.iter().filter(|m| inside(m, at(0.5 * CLEARANCE))).count(), 0);
            assert!(inside(other, at(g + 0.5 * CLEARANCE)), "no solid beyond the socket");
        }
        // The block's middle across the span, from the neighbour's vertices in the frame of the
        // key's edge (Y along P_a → P_b, Z normal to it and the pitch axis).
        let ey = unit(sub(key.corners[3], key.corners[0]));
        let ez = cross([1.0, 0.0, 0.0], ey);
        let span = |e: P3| {
            let vs = second.half_meshes.iter().flat_map(|m| m.vertices.iter());
            let (lo, hi) = vs.fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), v| {
                (lo.min(dot(*v, e)), hi.max(dot(*v, e)))
            });
            0.5 * (lo + hi)
        };
        let (cy, cz) = (span(ey), span(ez));
        for (name, [sy, sz]) in
            [("half turn", [-1.0, -1.0]), ("mirror y", [-1.0, 1.0]), ("mirror z", [1.0, -1.0])]
        {
            let clash = points.iter().filter(|&&p| {
                let (y, z) = (dot(p, ey), dot(p, ez));
                let (y2, z2) = (cy + sy * (y - cy), cz + sz * (z - cz));
                let q = [
                    p[0] + (y2 - y) * ey[0] + (z2 - z) * ez[0],
                    p[1] + (y2 - y) * ey[1] + (z2 - z) * ez[1],
                    p[2] + (y2 - y) * ey[2] + (z2 - z) * ez[2],
                ];
                second.half_meshes.iter().any(|m| inside(m, q))
            });
            assert_eq!(clash.count(), points.len(), "{name}: a key lands on a socket");
        }
    }
}

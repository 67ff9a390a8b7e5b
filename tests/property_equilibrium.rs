//! Equilibrium as a law: for random valid blades and load cases, the root reactions equal the
//! integral of the applied loads and the centrifugal field (an independent midpoint sum of the
//! force and moment densities written out here), plus the point masses.

use crate::support::beam_section;
use layloft::loads::{LoadDistribution, span_loads};
use layloft::project::{DistributedLoadRow, LoadCaseSpec, PointMass};
use layloft::section::MassInertia;
use layloft::units::{Angle, rpm_to_rad_s};
use proptest::prelude::*;

#[derive(Debug, Clone)]
struct Blade {
    r0: f64,
    len: f64,
    m0: f64,
    m1: f64,
    y0: f64,
    z0: f64,
    twist0: f64,
    twist1: f64,
    i_edge: f64,
    rpm: f64,
    pitch: f64,
    flap: [f64; 2],
    edge: [f64; 2],
    gravity: [f64; 3],
    factor: f64,
    point: (f64, f64),
}

fn blades() -> impl Strategy<Value = Blade> {
    (
        (0.0..2.0f64, 0.3..5.0f64, 0.1..20.0f64, 0.1..20.0f64),
        (-0.05..0.05f64, -0.02..0.02f64, -10.0..60.0f64, -10.0..60.0f64, 0.0..0.01f64),
        (0.0..3000.0f64, -20.0..30.0f64),
        (prop::array::uniform2(-500.0..500.0f64), prop::array::uniform2(-200.0..200.0f64)),
        (prop::array::uniform3(-10.0..10.0f64), 0.5..2.0f64, (0.0..1.0f64, 0.0..2.0f64)),
    )
        .prop_map(|(a, b, c, d, e)| Blade {
            r0: a.0,
            len: a.1,
            m0: a.2,
            m1: a.3,
            y0: b.0,
            z0: b.1,
            twist0: b.2,
            twist1: b.3,
            i_edge: b.4,
            rpm: c.0,
            pitch: c.1,
            flap: d.0,
            edge: d.1,
            gravity: e.0,
            factor: e.1,
            point: e.2,
        })
}

fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 64, rng_seed: proptest::test_runner::RngSeed::Fixed(7), failure_persistence: None, ..ProptestConfig::default() })]

    #[test]
    fn root_reactions_balance_the_applied_loads(b in blades()) {
        let r1 = b.r0 + b.len;
        let lin = |a: f64, c: f64, r: f64| a + (c - a) * (r - b.r0) / b.len;
        let inertia = MassInertia { flap: 0.0, edge: b.i_edge, polar: b.i_edge, product: 0.0 };
        let sections: Vec<_> = (0..6)
            .map(|i| {
                let r = b.r0 + b.len * i as f64 / 5.0;
                beam_section(r, 1e8, 1e4, 1e5, 1e6, lin(b.m0, b.m1, r), [b.y0, b.z0], inertia, lin(b.twist0, b.twist1, r))
            })
            .collect();
        let case = LoadCaseSpec {
            name: "random".into(),
            omega: rpm_to_rad_s(b.rpm),
            pitch: None,
            distributed: vec![
                DistributedLoadRow { r: b.r0, f_flap: b.flap[0], f_edge: b.edge[0], m_pitch: 0.0 },
                DistributedLoadRow { r: r1, f_flap: b.flap[1], f_edge: b.edge[1], m_pitch: 0.0 },
            ],
            distributed_file: None,
            gravity: Some(b.gravity),
            load_factor: b.factor,
            delta_t: 0.0,
            buoyancy: None,
        };
        let pm = PointMass { name: "p".into(), r: b.r0 + b.point.0 * b.len, mass: b.point.1, y: 0.0, z: 0.0, inertia: [0.0; 3] };
        let pitch = Angle::from_deg(b.pitch);
        let loads = span_loads(&LoadDistribution::new(&sections, std::slice::from_ref(&pm), &case, pitch).unwrap());
        let root = loads.root();

        // Independent sum: force density and its moment about the root point on the pitch axis.
        let w2 = rpm_to_rad_s(b.rpm).powi(2);
        let n = 4000;
        let h = b.len / n as f64;
        let (mut f, mut m) = ([0.0; 3], [0.0; 3]);
        let mut add = |p: [f64; 3], df: [f64; 3], dmx: f64| {
            let dm = cross([p[0] - b.r0, p[1], p[2]], df);
            for i in 0..3 {
                f[i] += df[i];
                m[i] += dm[i];
            }
            m[0] += dmx;
        };
        for i in 0..n {
            let r = b.r0 + (i as f64 + 0.5) * h;
            let phi = (lin(b.twist0, b.twist1, r) + b.pitch).to_radians();
            let (s, c) = phi.sin_cos();
            let (ym, zm) = (b.y0 * c - b.z0 * s, b.y0 * s + b.z0 * c);
            let mass = lin(b.m0, b.m1, r) * h;
            let g = b.gravity;
            let k = b.factor;
            add([r, ym, zm], [k * mass * (w2 * r + g[0]), k * mass * (w2 * ym + g[1]), k * mass * g[2]],
                -k * w2 * 0.5 * b.i_edge * (2.0 * phi).sin() * h);
            add([r, 0.0, 0.0], [0.0, k * lin(b.edge[0], b.edge[1], r) * h, k * lin(b.flap[0], b.flap[1], r) * h], 0.0);
        }
        let k = b.factor;
        add([pm.r, 0.0, 0.0], [k * pm.mass * (w2 * pm.r + b.gravity[0]), k * pm.mass * b.gravity[1], k * pm.mass * b.gravity[2]], 0.0);

        let scale_f = f.iter().map(|v| v.abs()).fold(1.0, f64::max);
        let scale_m = m.iter().map(|v| v.abs()).fold(1.0, f64::max);
        for i in 0..3 {
            prop_assert!((root.force[i] - f[i]).abs() < 1e-5 * scale_f, "force {i}: {} vs {}", root.force[i], f[i]);
            prop_assert!((root.moment[i] - m[i]).abs() < 1e-5 * scale_m, "moment {i}: {} vs {}", root.moment[i], m[i]);
        }
    }
}

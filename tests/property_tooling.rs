//! Laws of the tooling kernel over seeded random inputs (proptest with a fixed seed): volumes of
//! lofted ellipses against the closed form π a b L for any twist and pitch (Cavalieri's
//! principle), invariance under rigid motions, and every lofted solid passing its checks.

use std::f64::consts::PI;

use layloft::tooling::{
    ChainEnds, CheckParams, EndKind, FnSurface, LoftParams, Trims, check_solid, loft_solid,
};
use layloft::units::Angle;
use proptest::prelude::*;

proptest! {
    #![proptest_config(ProptestConfig {
        cases: 16,
        rng_seed: proptest::test_runner::RngSeed::Fixed(0x006c_6179_6c6f_6674),
        ..ProptestConfig::default()
    })]

    #[test]
    fn twisted_ellipses_keep_their_volume(
        a in 0.01f64..0.08,
        ratio in 0.05f64..1.0,
        twist_deg in -90.0f64..90.0,
        offset in -0.02f64..0.02,
        pitch_deg in -30.0f64..30.0,
    ) {
        let b = a * ratio;
        let surface = FnSurface {
            span: [0.0, 1.5],
            upper: move |_x: f64, u: f64| [offset - a * (PI * u).cos(), b * (PI * u).sin()],
            lower: move |_x: f64, u: f64| [offset - a * (PI * u).cos(), -b * (PI * u).sin()],
            chord_angle: move |x: f64| Angle::from_deg(pitch_deg + twist_deg * x),
            ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
        };
        let tol = 2e-5;
        let params = LoftParams { tolerance: tol, ..LoftParams::default() };
        let solid = loft_solid(&surface, &Trims::planes(0.3, 1.2), &params).unwrap();
        let s = check_solid(&solid.mesh, "ellipse", &CheckParams::default()).unwrap();
        // Cavalieri: every section x = const is the ellipse of area pi a b.
        prop_assert!((s.volume - PI * a * b * 0.9).abs() <= tol * s.area);
        // A rigid motion keeps volume and area (to rounding); turning the facets over negates it.
        let mut moved = solid.mesh.clone();
        moved.rotate_x(Angle::from_deg(twist_deg));
        moved.translate([0.3, -1.0, 2.0]);
        prop_assert!((moved.signed_volume() / s.volume - 1.0).abs() < 1e-9);
        prop_assert!((moved.area() / s.area - 1.0).abs() < 1e-12);
        moved.flip();
        prop_assert!((moved.signed_volume() / s.volume + 1.0).abs() < 1e-9);
    }
}

//! Laws of the tooling kernel over seeded random inputs (proptest with a fixed seed): volumes of
//! lofted ellipses against the closed form π a b L for any twist and pitch (Cavalieri's
//! principle), invariance under rigid motions, and every lofted solid passing its checks.

use std::f64::consts::PI;

use layloft::mesh::{CheckParams, check_solid};
use layloft::tooling::{ChainEnds, EndKind, FnSurface, LoftParams, Trims, loft_solid};
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

/// Composite Simpson's rule on [a, b] with n (even) intervals.
fn simpson(f: impl Fn(f64) -> f64, a: f64, b: f64, n: usize) -> f64 {
    let h = (b - a) / n as f64;
    let inner: f64 = (1..n).map(|i| f(a + h * i as f64) * if i % 2 == 1 { 4.0 } else { 2.0 }).sum();
    (f(a) + f(b) + inner) * h / 3.0
}

fn demo_blade() -> layloft::blade::Blade {
    let project = layloft::input::read_project("layups/mine-fan/blade.toml".as_ref()).unwrap();
    layloft::blade::Blade::from_project(&project).unwrap()
}

proptest! {
    #![proptest_config(ProptestConfig {
        cases: 12,
        rng_seed: proptest::test_runner::RngSeed::Fixed(0x7261_6d70_7321),
        ..ProptestConfig::default()
    })]

    #[test]
    fn ramped_ply_edges_keep_the_laminate_of_the_schedule(r in 0.405f64..0.895, upper in any::<bool>()) {
        // The smooth step 3s² − 2s³ is antisymmetric about its centre, so a ramped edge adds
        // as much laminate on one side as it takes on the other: across the chord, the ramped
        // thickness integrates to the schedule's step thickness (both by Simpson's rule on
        // 20000 intervals, which resolves every 1:20 ramp). Radii within a spanwise ramp (half
        // of 20 ply thicknesses about a ply end) are left out: there the schedule steps.
        let blade = demo_blade();
        let near_drop = (0..blade.ply_count()).filter_map(|i| blade.ply(i)).any(|p| {
            (p.r_end - r).abs() < 0.006 || (p.r_start - r).abs() < 0.006
        });
        prop_assume!(!near_drop);
        let s = blade.surfaces();
        let side = if upper { layloft::blade::Surface::Upper } else { layloft::blade::Surface::Lower };
        let ramped = simpson(|x| s.thickness(r, side, x), 0.0, 1.0, 20_000);
        let step = simpson(|x| blade.surface_thickness(r, side, x), 0.0, 1.0, 20_000);
        // Simpson on a step function errs by about one interval times the step at each edge.
        prop_assert!((ramped - step).abs() < 8.0 * 2e-3 / 20_000.0, "r {r}: {ramped:e} vs {step:e}");
    }
}

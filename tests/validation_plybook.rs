//! The kinematic drape against closed-form geometry: developable surfaces drape to their exact
//! developments, and the net on a sphere follows the equation of a Chebyshev net.

use layloft::plybook::{DrapeSurface, RegionSpec, drape_region, polygon_area};

/// A circular cylinder of radius `r` about z; parameters (arc length around, height), m.
struct Cylinder {
    r: f64,
}

impl DrapeSurface for Cylinder {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let t = p[0] / self.r;
        [self.r * t.cos(), self.r * t.sin(), p[1]]
    }
}

/// A circular cone with its apex at the origin, half-angle `beta` about z; parameters (slant
/// distance from the apex, azimuth in rad).
struct Cone {
    beta: f64,
}

impl DrapeSurface for Cone {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let (s, c) = self.beta.sin_cos();
        [p[0] * s * p[1].cos(), p[0] * s * p[1].sin(), p[0] * c]
    }
}

/// A sphere of radius `r` by its exponential map at the north pole: parameters are the
/// tangent-plane coordinates at the pole (geodesic polar coordinates), m.
struct Sphere {
    r: f64,
}

impl DrapeSurface for Sphere {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let rho = p[0].hypot(p[1]);
        let a = rho / self.r;
        let sinc = if a < 1e-8 { 1.0 - a * a / 6.0 } else { a.sin() / a };
        [p[0] * sinc, p[1] * sinc, self.r * a.cos()]
    }
}

/// The boundary of a parameter rectangle, counter-clockwise, `n` points per side.
fn rectangle(a: [f64; 2], b: [f64; 2], n: usize) -> Vec<[f64; 2]> {
    let mut out = Vec::new();
    let lerp = |x: [f64; 2], t: f64| x[0] + (x[1] - x[0]) * t;
    for i in 0..n {
        out.push([lerp(a, i as f64 / n as f64), b[0]]);
    }
    for i in 0..n {
        out.push([a[1], lerp(b, i as f64 / n as f64)]);
    }
    for i in 0..n {
        out.push([lerp(a, 1.0 - i as f64 / n as f64), b[1]]);
    }
    for i in 0..n {
        out.push([a[0], lerp(b, 1.0 - i as f64 / n as f64)]);
    }
    out
}

fn dist(p: [f64; 2], q: [f64; 2]) -> f64 {
    (p[0] - q[0]).hypot(p[1] - q[1])
}

/// Compares a flat pattern with the exact development of the same boundary points: every
/// distance between eight marked points (corners, edge middles), the area, and the extents
/// along and across the fibres (the exact fibre direction in the development is `fibre`).
fn check_development(flat: &[[f64; 2]], exact: &[[f64; 2]], fibre: [f64; 2], n: usize, tol: f64) {
    let marks: Vec<usize> = (0..8).map(|k| k * n / 2).collect();
    let mut worst: f64 = 0.0;
    for &i in &marks {
        for &j in &marks {
            if i < j {
                let (a, b) = (dist(flat[i], flat[j]), dist(exact[i], exact[j]));
                worst = worst.max((a - b).abs() / b);
            }
        }
    }
    let (a, b) = (polygon_area(flat), polygon_area(exact));
    assert!(worst < tol, "distances differ by {worst:e} relative");
    assert!(((a - b) / b).abs() < tol, "area {a} against {b}");
    // Extents along (x in the flat pattern) and across the fibres.
    let extent = |pts: &[[f64; 2]], d: [f64; 2]| {
        let v: Vec<f64> = pts.iter().map(|p| p[0] * d[0] + p[1] * d[1]).collect();
        v.iter().cloned().fold(f64::NEG_INFINITY, f64::max)
            - v.iter().cloned().fold(f64::INFINITY, f64::min)
    };
    let along = (extent(flat, [1.0, 0.0]), extent(exact, fibre));
    let across = (extent(flat, [0.0, 1.0]), extent(exact, [-fibre[1], fibre[0]]));
    assert!(((along.0 - along.1) / along.1).abs() < tol, "along the fibres {along:?}");
    assert!(((across.0 - across.1) / across.1).abs() < tol, "across the fibres {across:?}");
}

#[test]
fn a_cylinder_panel_drapes_to_its_exact_development() {
    // Exact development of a cylinder: (arc length, height) (an isometry; any geometry text).
    let surface = Cylinder { r: 0.2 };
    let n = 40;
    for angle_deg in [0.0_f64, 30.0, 45.0, -60.0] {
        let boundary = rectangle([0.0, 0.35], [0.0, 0.5], n);
        let spec = RegionSpec {
            boundary: boundary.clone(),
            seed: [0.17, 0.26],
            axis: [0.0, 0.0, 1.0],
            angle: angle_deg.to_radians(),
            spacing: 0.005,
            root_mark: [0.1, 0.0],
        };
        let pattern = drape_region(&surface, &spec).unwrap();
        // In the development the axis is (0, 1) and the normal S_a × S_b points outward, so
        // the fibre is (0, 1) turned counter-clockwise by the angle.
        let t = angle_deg.to_radians();
        let fibre = [-t.sin(), t.cos()];
        check_development(&pattern.outline, &boundary, fibre, n, 1e-6);
        // Zero up to the discretisation: 1e-5 rad is 0.0006°.
        assert!(pattern.max_shear.abs() < 1e-5, "shear {} rad", pattern.max_shear);
        assert!(pattern.max_deviation.abs() < 1e-5, "deviation {}", pattern.max_deviation);
    }
}

#[test]
fn a_cone_panel_drapes_to_its_exact_development() {
    // Exact development of a cone of half-angle beta: the point at slant distance s and
    // azimuth phi unrolls to polar coordinates (s, phi sin(beta)) (any geometry text).
    let beta = 25f64.to_radians();
    let surface = Cone { beta };
    let n = 40;
    let boundary = rectangle([0.3, 0.6], [0.0, 1.2], n);
    let exact: Vec<[f64; 2]> = boundary
        .iter()
        .map(|p| {
            let psi = p[1] * beta.sin();
            [p[0] * psi.cos(), p[0] * psi.sin()]
        })
        .collect();
    for angle_deg in [0.0_f64, 45.0] {
        let seed = [0.45, 0.6];
        let spec = RegionSpec {
            boundary: boundary.clone(),
            seed,
            axis: [0.0, 0.0, 1.0],
            angle: angle_deg.to_radians(),
            spacing: 0.0025,
            root_mark: [0.3, 0.6],
        };
        let pattern = drape_region(&surface, &spec).unwrap();
        // The axis projected at the seed is the ruling: radial in the development.
        let psi = seed[1] * beta.sin();
        let (s, c) = angle_deg.to_radians().sin_cos();
        let radial = [psi.cos(), psi.sin()];
        let fibre = [c * radial[0] - s * radial[1], s * radial[0] + c * radial[1]];
        // Extents across the fibres are not invariant to the development's rotation unless
        // measured in its own fibre frame, which `fibre` gives.
        // Issue 17: 1e-6 relative. (The generators are traced in quarter links: with whole
        // links the discrete geodesics drift at second order in the spacing, 4.5e-6 here.)
        check_development(&pattern.outline, &exact, fibre, n, 1e-6);
        // Zero up to the discretisation: 1e-5 rad is 0.0006°.
        assert!(pattern.max_shear.abs() < 1e-5, "shear {} rad", pattern.max_shear);
    }
}

/// Shear angle of a Chebyshev net on a surface of constant curvature `k` whose generators are
/// orthogonal geodesics: `γ_uv = k cos γ`, `γ = 0` on both generators (u, v arc lengths along
/// the threads). This is the Gauss equation of a Chebyshev net, `ω_uv = −K sin ω` with
/// `ω = π/2 − γ` the angle between the threads (Chebyshev, "Sur la coupe des vêtements", 1878;
/// Ghys, L'Enseignement Math. 57 (2011) — from memory), the continuous limit of the pin-jointed
/// net of Mack & Taylor (1956). Geodesic generators have zero geodesic curvature, `−ω_u = 0`
/// along them, hence `γ = 0` there. Solved here by a second-order characteristic scheme
/// (independent of the drape), step `h`.
fn chebyshev_shear(k: f64, u: f64, v: f64, h: f64) -> f64 {
    let (nu, nv) = ((u / h).round() as usize, (v / h).round() as usize);
    let mut g = vec![vec![0.0_f64; nv + 1]; nu + 1];
    for i in 1..=nu {
        for j in 1..=nv {
            let base = g[i - 1][j] + g[i][j - 1] - g[i - 1][j - 1];
            let mut x = base;
            for _ in 0..6 {
                let mean = 0.25 * (g[i - 1][j] + g[i][j - 1] + g[i - 1][j - 1] + x);
                x = base + h * h * k * mean.cos();
            }
            g[i][j] = x;
        }
    }
    g[nu][nv]
}

#[test]
fn a_hemisphere_draped_from_its_pole_follows_the_chebyshev_net() {
    let r = 0.1;
    let surface = Sphere { r };
    let d = r / 40.0;
    let half = 1.3 * r;
    let spec = RegionSpec {
        boundary: rectangle([-half, half], [-half, half], 20),
        seed: [0.0, 0.0],
        axis: [1.0, 0.0, 0.0],
        angle: 0.0,
        spacing: d,
        root_mark: [0.0, -half],
    };
    let net = layloft::plybook::drape(
        &surface,
        &layloft::plybook::DrapeSpec {
            seed: spec.seed,
            warp: [1.0, 0.0, 0.0],
            spacing: d,
            bounds: [[-1.5 * r, 1.5 * r], [-1.5 * r, 1.5 * r]],
            region: None,
        },
    )
    .unwrap();
    let k = 1.0 / (r * r);
    let mut checked = 0;
    let mut worst: f64 = 0.0;
    let mut largest: f64 = 0.0;
    for (i, j) in [(10, 10), (20, 20), (30, 30), (40, 40), (48, 48), (20, 40), (40, 10), (50, 20)] {
        for (si, sj) in [(1, 1), (-1, 1), (-1, -1), (1, -1)] {
            let Some(g) = net.shear(si * i, sj * j) else { continue };
            // Quadrants with opposite signs of i j shear the other way.
            let reference =
                (si * sj) as f64 * chebyshev_shear(k, i as f64 * d, j as f64 * d, d / 8.0);
            worst = worst.max((g - reference).abs());
            largest = largest.max(reference.abs());
            checked += 1;
        }
    }
    assert!(checked >= 28, "only {checked} nodes reached");
    assert!(largest.to_degrees() > 30.0, "largest shear checked {}°", largest.to_degrees());
    assert!(worst.to_degrees() < 0.5, "worst difference {}°", worst.to_degrees());
    // The region drapes and flattens too.
    let pattern = drape_region(&surface, &spec).unwrap();
    assert!(pattern.max_shear.to_degrees().abs() > 20.0);
}

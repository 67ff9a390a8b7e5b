//! Helpers shared by integration tests: sections with given beam properties.
#![allow(dead_code)]

use layloft::section::{MassInertia, SectionProperties};
use layloft::units::Angle;
use nalgebra::Matrix4;

/// A section with uncoupled stiffness on the pitch axis (elastic centre at the origin), mass per
/// length `m` with its centre at `(y_m, z_m)` and the given mass moments about the mass centre.
#[allow(clippy::too_many_arguments)]
pub fn beam_section(
    r: f64,
    ea: f64,
    gj: f64,
    ei_flap: f64,
    ei_edge: f64,
    m: f64,
    mass_centre: [f64; 2],
    inertia: MassInertia,
    twist_deg: f64,
) -> SectionProperties {
    let k = Matrix4::from_diagonal(&nalgebra::Vector4::new(ea, gj, ei_flap, ei_edge));
    SectionProperties {
        r,
        chord: 0.1,
        twist: Angle::from_deg(twist_deg),
        stiffness: k,
        stiffness_pitch_axis: k,
        ea,
        ei_flap,
        ei_edge,
        ei_cross: 0.0,
        gj,
        extension_twist: 0.0,
        flap_twist: 0.0,
        edge_twist: 0.0,
        ei_principal: [ei_flap.max(ei_edge), ei_flap.min(ei_edge)],
        principal_angle: Angle::ZERO,
        elastic_centre: [0.0, 0.0],
        shear_centre: [0.0, 0.0],
        mass_centre,
        mass_per_length: m,
        inertia,
        wall_thickness: [1e-3, 1e-3],
        enclosed_area: 0.0,
        warnings: Vec::new(),
    }
}

/// `n` equal sections from `r0` to `r1`.
pub fn uniform_blade(
    r0: f64,
    r1: f64,
    n: usize,
    f: impl Fn(f64) -> SectionProperties,
) -> Vec<SectionProperties> {
    (0..n).map(|i| f(r0 + (r1 - r0) * i as f64 / (n - 1) as f64)).collect()
}

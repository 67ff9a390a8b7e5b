//! End trims: where each line of a lofted surface ends on a sphere about the rotor centre (or on
//! a plane x = const), found by safeguarded Newton iteration (Newton steps kept inside a
//! shrinking bisection bracket, Press et al., *Numerical Recipes*, 3rd ed., 2007, §9.4).
//!
//! On a line of constant parameter the rotor-frame point is `p(x) = (x, R(φ) c(x))`, so
//! `|p|² = x² + |c(x)|²` whatever the chord angle: the root of `|p(x)| = R` is the same at every
//! pitch setting, which is why spherical ends keep the clearance to the hub and the duct constant
//! while the blade pitches (common practice).

use crate::mesh::vec3::{self, P3};
use crate::mesh::{End, MeshError};

/// The surface that ends a solid at its root or its tip.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum EndTrim {
    /// A sphere of `radius` (m) about the rotor centre (the origin of the rotor frame).
    Sphere {
        /// Radius, m.
        radius: f64,
    },
    /// The plane `x = const` (m), normal to the pitch axis.
    Plane {
        /// Position along the pitch axis, m.
        x: f64,
    },
}

/// The trims at both ends of a solid. The solid keeps `|p| ≥ R_root` and `|p| ≤ R_tip`
/// (spheres), or `x ≥ x_root` and `x ≤ x_tip` (planes).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Trims {
    /// At the root (nearer the rotor axis).
    pub root: EndTrim,
    /// At the tip.
    pub tip: EndTrim,
}

impl Trims {
    /// Spherical ends of radii `r_root < r_tip` about the rotor centre, m.
    pub fn spheres(r_root: f64, r_tip: f64) -> Self {
        Trims { root: EndTrim::Sphere { radius: r_root }, tip: EndTrim::Sphere { radius: r_tip } }
    }

    /// Planar ends at `x_root < x_tip`, m.
    pub fn planes(x_root: f64, x_tip: f64) -> Self {
        Trims { root: EndTrim::Plane { x: x_root }, tip: EndTrim::Plane { x: x_tip } }
    }

    /// The trim at `end`.
    pub fn at(&self, end: End) -> EndTrim {
        match end {
            End::Root => self.root,
            End::Tip => self.tip,
        }
    }

    pub(crate) fn validate(&self) -> Result<(), MeshError> {
        for end in [End::Root, End::Tip] {
            let (name, value) = match self.at(end) {
                EndTrim::Sphere { radius } => (format!("{end} trim radius (m)"), radius),
                EndTrim::Plane { x } => (format!("{end} trim plane x (m)"), x),
            };
            let positive = matches!(self.at(end), EndTrim::Sphere { .. });
            if !value.is_finite() || (positive && value <= 0.0) {
                return Err(MeshError::Parameter {
                    name,
                    value,
                    expected: if positive { "a positive length" } else { "a finite number" },
                });
            }
        }
        Ok(())
    }
}

impl EndTrim {
    pub(crate) fn describe(&self) -> String {
        match *self {
            EndTrim::Sphere { radius } => format!("sphere of radius {radius:.6} m"),
            EndTrim::Plane { x } => format!("plane x = {x:.6} m"),
        }
    }

    /// Residual along a line: positive beyond the trim (towards the tip), zero on it; for a
    /// sphere `|p| − R`, for a plane `x − x_trim`, m.
    fn residual(&self, x: f64, c: [f64; 2]) -> f64 {
        match *self {
            EndTrim::Sphere { radius } => {
                let r2 = x * x + c[0] * c[0] + c[1] * c[1];
                (r2 - radius * radius) / (r2.sqrt() + radius)
            }
            EndTrim::Plane { x: x0 } => x - x0,
        }
    }

    /// Moves `p` onto the trim surface: radially onto the sphere, along x onto the plane.
    pub(crate) fn lift(&self, p: P3) -> P3 {
        match *self {
            EndTrim::Sphere { radius } => vec3::scale(p, radius / vec3::norm(p)),
            EndTrim::Plane { x } => [x, p[1], p[2]],
        }
    }

    /// The longest chord of the trim surface whose sag stays within `tol`: `√(8 R tol)` on a
    /// sphere (sag of a chord h is about h²/8R), unlimited on a plane.
    pub(crate) fn chord_for_sag(&self, tol: f64) -> f64 {
        match *self {
            EndTrim::Sphere { radius } => (8.0 * radius * tol).sqrt(),
            EndTrim::Plane { .. } => f64::INFINITY,
        }
    }
}

/// Where the line `x -> c(x)` (chord frame) ends on `trim`, searched within `span`. `line` names
/// the line in errors.
pub(crate) fn solve_end(
    c: &dyn Fn(f64) -> [f64; 2],
    span: [f64; 2],
    trim: EndTrim,
    end: End,
    line: &str,
) -> Result<f64, MeshError> {
    let f = |x: f64| trim.residual(x, c(x));
    let (mut a, mut b) = (span[0], span[1]);
    let (fa, fb) = (f(a), f(b));
    let fail = |reason: String| MeshError::Trim { end, trim: trim.describe(), reason };
    let dist = |x: f64| {
        let p = c(x);
        (x * x + p[0] * p[0] + p[1] * p[1]).sqrt()
    };
    if !(fa.is_finite() && fb.is_finite()) {
        return Err(fail(format!("cannot be found: the {line} line is not finite in the span")));
    }
    if fa > 0.0 {
        return Err(fail(format!(
            "does not cut the surface: its {line} line already starts beyond the trim, at \
             {:.6} m from the rotor centre (x = {a:.6} m)",
            dist(a)
        )));
    }
    if fb < 0.0 {
        return Err(fail(format!(
            "does not cut the surface: its {line} line ends short of the trim, at {:.6} m from \
             the rotor centre (x = {b:.6} m)",
            dist(b)
        )));
    }
    if fa == 0.0 {
        return Ok(a);
    }
    if fb == 0.0 {
        return Ok(b);
    }
    let scale = a.abs().max(b.abs()).max(span[1] - span[0]);
    let mut x = 0.5 * (a + b);
    for _ in 0..200 {
        let fx = f(x);
        if fx.abs() <= 1e-14 * scale {
            return Ok(x);
        }
        if fx < 0.0 {
            a = x;
        } else {
            b = x;
        }
        if b - a <= 4.0 * f64::EPSILON * scale {
            return Ok(if f(a).abs() < f(b).abs() { a } else { b });
        }
        // Newton step with a central-difference slope; bisect when it leaves the bracket.
        let h = 1e-7 * scale;
        let (xl, xr) = ((x - h).max(span[0]), (x + h).min(span[1]));
        let slope = (f(xr) - f(xl)) / (xr - xl);
        let newton = x - fx / slope;
        x = if slope.is_finite() && slope != 0.0 && newton > a && newton < b {
            newton
        } else {
            0.5 * (a + b)
        };
    }
    Err(fail(format!("did not converge on the {line} line between x = {a:.9} and {b:.9} m")))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn line_ends_land_on_the_sphere_and_the_plane() {
        // A line parallel to x at distance 0.05 m: |p| = R at x = sqrt(R² − 0.05²) (Pythagoras).
        let c = |_x: f64| [0.03, -0.04];
        let sphere = EndTrim::Sphere { radius: 0.5 };
        let x = solve_end(&c, [0.1, 1.0], sphere, End::Tip, "test").unwrap();
        assert!((x - (0.25f64 - 0.0025).sqrt()).abs() < 1e-15);
        // A cone c = (0.1 x, 0): |p| = x √1.01.
        let cone = |x: f64| [0.1 * x, 0.0];
        let x = solve_end(&cone, [0.1, 1.0], sphere, End::Root, "test").unwrap();
        assert!((x * 1.01f64.sqrt() / 0.5 - 1.0).abs() < 1e-14);
        let plane = EndTrim::Plane { x: 0.3 };
        assert_eq!(solve_end(&cone, [0.1, 1.0], plane, End::Root, "test").unwrap(), 0.3);
        // Lifting puts a point exactly on the trim surface.
        let p = sphere.lift([0.4, 0.1, -0.2]);
        assert!((vec3::norm(p) - 0.5).abs() < 1e-15);
        assert!(solve_end(&c, [0.6, 1.0], sphere, End::Tip, "upper u = 0").is_err());
        assert!(solve_end(&c, [0.1, 0.4], sphere, End::Tip, "upper u = 0").is_err());
    }
}

//! Built-in section shapes given by name in `stations.csv`: `circle` (a round root, to fit a
//! bearing or a bonded ring) and `ellipse:T` with `T` the thickness over chord.
//!
//! Points: `x = (1 − cos φ) / 2`, `y = ± (T / 2) sin φ` for `φ` evenly spaced from 0 to π (the
//! parametric ellipse with semi-axes 1/2 and T/2, centre (1/2, 0)); for a circle `T = 1`, and the
//! points are evenly spaced along the arc.

use super::{AirfoilError, Outline};

/// A built-in section shape.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Shape {
    /// A circle whose diameter is the chord.
    Circle,
    /// An ellipse with the chord as its long axis.
    Ellipse {
        /// Thickness over chord, above 0 and at most 1.
        thickness: f64,
    },
}

impl Shape {
    /// Parses `circle` or `ellipse:T` (case and spaces ignored); `Ok(None)` when the text names
    /// no built-in shape.
    pub fn parse(text: &str) -> Result<Option<Shape>, AirfoilError> {
        let t: String = text.chars().filter(|c| !c.is_whitespace()).collect();
        let t = t.to_ascii_lowercase();
        if t == "circle" {
            return Ok(Some(Shape::Circle));
        }
        let Some(rest) = t.strip_prefix("ellipse") else { return Ok(None) };
        let Some(value) = rest.strip_prefix(':') else {
            return Err(AirfoilError::Shape(format!(
                "'{text}': an ellipse needs its thickness over chord, such as ellipse:0.4"
            )));
        };
        let thickness: f64 = value.parse().map_err(|_| {
            AirfoilError::Shape(format!(
                "'{text}': the ellipse thickness over chord '{value}' is not a number; expected a fraction such as ellipse:0.4"
            ))
        })?;
        if !(thickness > 0.0 && thickness <= 1.0 && thickness.is_finite()) {
            let hint = if thickness > 1.0 { " (a percentage? write 0.4 for 40 %)" } else { "" };
            return Err(AirfoilError::Shape(format!(
                "'{text}': expected an ellipse thickness over chord above 0 and at most 1, found {value}{hint}"
            )));
        }
        Ok(Some(Shape::Ellipse { thickness }))
    }

    /// Thickness over chord.
    pub fn thickness(&self) -> f64 {
        match self {
            Shape::Circle => 1.0,
            Shape::Ellipse { thickness } => *thickness,
        }
    }

    /// The outline with `n` points per surface (at least 3), leading edge (0, 0), trailing edge
    /// (1, 0), closed.
    pub fn outline(&self, n: usize) -> Outline {
        let n = n.max(3);
        let half = self.thickness() / 2.0;
        let point = |i: usize, sign: f64| {
            let phi = std::f64::consts::PI * i as f64 / (n - 1) as f64;
            let x = if i == n - 1 { 1.0 } else { 0.5 * (1.0 - phi.cos()) };
            let y = if i == 0 || i == n - 1 { 0.0 } else { sign * half * phi.sin() };
            [x, y]
        };
        Outline {
            upper: (0..n).map(|i| point(i, 1.0)).collect(),
            lower: (0..n).map(|i| point(i, -1.0)).collect(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_and_bad_parameters() {
        assert_eq!(Shape::parse("Circle").unwrap(), Some(Shape::Circle));
        assert_eq!(Shape::parse("ellipse:0.4").unwrap(), Some(Shape::Ellipse { thickness: 0.4 }));
        assert_eq!(Shape::parse("naca0012").unwrap(), None);
        for bad in ["ellipse:0", "ellipse:x", "ellipse", "ellipse:-1", "ellipse:40", "ellipse:nan"]
        {
            assert!(Shape::parse(bad).is_err(), "{bad}");
        }
    }

    #[test]
    fn circle_area_is_pi_over_four() {
        // Area of a circle of unit diameter, pi / 4; a polygon of m sides inscribed in it has
        // (m / 2) sin(2 pi / m) r² (elementary geometry).
        let o = Shape::Circle.outline(201);
        let m = 400.0;
        let exact = 0.5 * m * (2.0 * std::f64::consts::PI / m).sin() * 0.25;
        assert!((o.area() - exact).abs() < 1e-12, "{} {exact}", o.area());
    }
}

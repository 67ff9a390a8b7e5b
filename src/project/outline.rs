//! The blade's outline along the span: stations (radius, chord, twist, pitch axis) and the
//! airfoil each one gives.

use std::path::PathBuf;

use crate::units::Angle;

/// How a station's airfoil is given.
#[derive(Debug, Clone, PartialEq)]
pub enum AirfoilSpec {
    /// A NACA 4-digit code such as `0012` or `4415`; `closed_te` closes the trailing edge
    /// (the coefficient -0.1036 instead of -0.1015).
    Naca4 {
        /// The four digits.
        code: String,
        /// Closed trailing edge.
        closed_te: bool,
    },
    /// A coordinate file, as the reader found it next to the project, with the outline read
    /// from it and notes on what was changed to read it (points reversed, repeats removed).
    File {
        /// The file.
        path: PathBuf,
        /// The outline it gives, in chord fractions.
        outline: crate::airfoil::Outline,
        /// What was changed to read it, each note naming the file.
        notes: Vec<String>,
    },
    /// A built-in shape: `circle` or `ellipse:T`.
    Shape(crate::airfoil::Shape),
}

/// One row of `stations.csv`.
#[derive(Debug, Clone, PartialEq)]
pub struct Station {
    /// Radius, m.
    pub r: f64,
    /// Chord, m.
    pub chord: f64,
    /// Twist (chord angle to the plane of rotation before the pitch setting).
    pub twist: Angle,
    /// Pitch axis position as a fraction of chord from the leading edge.
    pub pitch_axis_frac: f64,
    /// The airfoil.
    pub airfoil: AirfoilSpec,
}

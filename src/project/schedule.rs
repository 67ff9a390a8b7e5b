//! What the blade is built of and carries: the ply schedule (plies and the regions they cover),
//! the shear webs and the point masses fixed to the blade.

use crate::units::Angle;

/// Where on the section a ply lies.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Region {
    /// Upper surface, between `from` and `to` (chord fractions from the leading edge).
    Upper,
    /// Lower surface, between `from` and `to`.
    Lower,
    /// Both surfaces, between `from` and `to`.
    Both,
    /// The whole depth of the named web.
    Web(String),
}

/// One row of `plies.csv`.
#[derive(Debug, Clone, PartialEq)]
pub struct PlySpec {
    /// The ply's label from the `ply` column.
    pub id: String,
    /// Material name (a record of the materials file).
    pub material: String,
    /// Fibre angle from the blade axis in the wall frame (see docs/conventions.md).
    pub angle: Angle,
    /// Span range covered, m (radius).
    pub r_start: f64,
    /// End of the span range covered, m (radius).
    pub r_end: f64,
    /// Surface or web.
    pub region: Region,
    /// Chord fraction from the leading edge where the ply starts (surface plies).
    pub from: f64,
    /// Chord fraction from the leading edge where the ply ends (surface plies).
    pub to: f64,
}

/// A shear web (`[[web]]`), normal to the chord.
#[derive(Debug, Clone, PartialEq)]
pub struct WebSpec {
    /// Name, referred to by `web:NAME` plies.
    pub name: String,
    /// Chord fraction from the leading edge.
    pub chord_frac: f64,
    /// Span range of the web, m; the whole blade when not given.
    pub r_start: f64,
    /// End of the span range of the web, m.
    pub r_end: f64,
}

/// A point mass fixed to the blade (balance weight, root fitting).
#[derive(Debug, Clone, PartialEq)]
pub struct PointMass {
    /// Label.
    pub name: String,
    /// Radius, m.
    pub r: f64,
    /// Mass, kg.
    pub mass: f64,
    /// Chordwise offset from the pitch axis (chord frame y), m.
    pub y: f64,
    /// Offset normal to the chord (chord frame z), m.
    pub z: f64,
    /// Mass moments of inertia about the mass's own centre, kg·m², about axes parallel to the
    /// chord frame: `[x` (the pitch axis), `y` (the chord), `z` (normal to the chord)`]`. Zero
    /// for a point mass without rotary inertia.
    pub inertia: [f64; 3],
}

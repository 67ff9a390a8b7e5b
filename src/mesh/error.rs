//! `MeshError`: everything the mesh kit and the tooling built on it can refuse, each with the
//! part and the place.

use std::fmt;

use super::unit::LengthUnit;

/// A point in the rotor frame, shown in the unit of the output files.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Place {
    /// Rotor-frame coordinates, m.
    pub point: [f64; 3],
    /// The unit the point is shown in.
    pub unit: LengthUnit,
}

impl fmt::Display for Place {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let s = self.unit.per_metre();
        let d = self.unit.decimals();
        let [x, y, z] = self.point;
        write!(f, "({:.d$}, {:.d$}, {:.d$}) {}", x * s, y * s, z * s, self.unit.symbol())
    }
}

/// Which end of a lofted solid.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum End {
    /// The end nearer the rotor axis.
    Root,
    /// The far end.
    Tip,
}

impl fmt::Display for End {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            End::Root => "root",
            End::Tip => "tip",
        })
    }
}

/// Why a mesh could not be built, or why a built mesh failed its checks.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum MeshError {
    /// A parameter outside its range.
    #[error("{name} must be {expected}; found {value}")]
    Parameter {
        /// The parameter, by the name a user knows it.
        name: String,
        /// What was given.
        value: f64,
        /// What is accepted.
        expected: &'static str,
    },
    /// A surface does not reach an end trim, or the trims cross.
    #[error("{end} trim ({trim}) {reason}")]
    Trim {
        /// Which end.
        end: End,
        /// The trim, in words with its size.
        trim: String,
        /// What went wrong and where.
        reason: String,
    },
    /// Surfaces or contours that cannot be combined as asked.
    #[error("{0}")]
    Geometry(String),
    /// Settings that cannot work for this blade (a hub sphere smaller than the root section, a
    /// margin that leaves no room for the locating features, ...): bad input rather than a
    /// failed computation.
    #[error("{0}")]
    Settings(String),
    /// Like [`MeshError::Settings`], but caused by the shape given at one station, so that the
    /// message can name that station's line of the stations file.
    #[error("{text}")]
    StationShape {
        /// Radius of the station, m.
        r: f64,
        /// What cannot work, in words.
        text: String,
    },
    /// The chordal tolerance could not be met by refinement (a discontinuous surface).
    #[error(
        "the {direction} grid cannot meet the tolerance near {at}: the surface is not continuous \
         there"
    )]
    Refinement {
        /// "chordwise" or "spanwise".
        direction: &'static str,
        /// Where refinement stopped.
        at: Place,
    },
    /// A length unit that is not known.
    #[error("unknown length unit '{0}': expected \"mm\" or \"m\"")]
    Unit(String),
    /// A part has no triangles.
    #[error("{part}: the mesh has no triangles")]
    Empty {
        /// The part.
        part: String,
    },
    /// A vertex index past the vertex list.
    #[error("{part}: triangle {triangle} refers to vertex {index}, but there are {count} vertices")]
    Index {
        /// The part.
        part: String,
        /// Triangle index.
        triangle: usize,
        /// The bad vertex index.
        index: u32,
        /// Number of vertices.
        count: usize,
    },
    /// A vertex coordinate that is NaN or infinite.
    #[error("{part}: vertex {vertex} has a coordinate that is not a finite number")]
    NonFinite {
        /// The part.
        part: String,
        /// Vertex index.
        vertex: usize,
    },
    /// A facet of (near) zero area or a needle.
    #[error("{part}: triangle {triangle} at {at} is degenerate: {reason}")]
    Degenerate {
        /// The part.
        part: String,
        /// Triangle index.
        triangle: usize,
        /// Its centroid.
        at: Place,
        /// Area or aspect, in words.
        reason: String,
    },
    /// An edge used by one triangle only: a hole.
    #[error(
        "{part}: the surface is open: the edge from {a} to {b} belongs to triangle {triangle} only"
    )]
    OpenEdge {
        /// The part.
        part: String,
        /// The triangle that has the edge.
        triangle: usize,
        /// Edge start.
        a: Place,
        /// Edge end.
        b: Place,
    },
    /// An edge used by more than two triangles.
    #[error(
        "{part}: the edge from {a} to {b} is shared by {count} triangles (the first is {triangle}); \
         a closed 2-manifold surface has exactly two"
    )]
    NonManifoldEdge {
        /// The part.
        part: String,
        /// The first triangle on the edge.
        triangle: usize,
        /// Number of triangles on the edge.
        count: usize,
        /// Edge start.
        a: Place,
        /// Edge end.
        b: Place,
    },
    /// Two neighbours that run along their shared edge the same way: one is turned over.
    #[error(
        "{part}: triangle {triangle} at {at} is turned over: it runs along its edge with triangle \
         {neighbour} in the same direction"
    )]
    Orientation {
        /// The part.
        part: String,
        /// The triangle judged flipped (the one with most such edges).
        triangle: usize,
        /// A neighbour across a conflicting edge.
        neighbour: usize,
        /// The flipped triangle's centroid.
        at: Place,
    },
    /// Separate fans of triangles meeting at one vertex.
    #[error(
        "{part}: the surface touches itself at the vertex {at}: {fans} separate fans of triangles meet there"
    )]
    NonManifoldVertex {
        /// The part.
        part: String,
        /// Vertex index.
        vertex: usize,
        /// The vertex.
        at: Place,
        /// Number of fans.
        fans: usize,
    },
    /// A closed shell whose signed volume has the wrong sign.
    #[error(
        "{part}: the {role} at {at} is turned the wrong way (signed volume {volume:.6e} {unit}³): \
         triangles must wind counter-clockwise seen from outside the material"
    )]
    Facing {
        /// The part.
        part: String,
        /// "outer surface" or "cavity surface".
        role: &'static str,
        /// A vertex of the shell.
        at: Place,
        /// Signed volume of the shell in the output unit cubed.
        volume: f64,
        /// The unit symbol.
        unit: &'static str,
    },
    /// Two vertices that become one when rounded to the single precision of STL.
    #[error(
        "{part}: vertices {a} and {b} coincide at {at} once rounded to single precision in the \
         file; the surface is meshed more finely than STL can hold: loosen the tolerance"
    )]
    Coincident {
        /// The part.
        part: String,
        /// One vertex index.
        a: usize,
        /// The other.
        b: usize,
        /// Where.
        at: Place,
    },
    /// Two parts given the same name (they would be written to one file).
    #[error("two parts are named '{0}'; each part needs its own file name")]
    DuplicatePart(String),
    /// Two facets of the surface cross or touch.
    #[error("{part}: the surface intersects itself: triangles {a} and {b} meet near {at}")]
    SelfIntersection {
        /// The part.
        part: String,
        /// One triangle.
        a: usize,
        /// The other.
        b: usize,
        /// The centroid of `a`.
        at: Place,
    },
}

impl MeshError {
    /// The part a failed check names, if it names one.
    pub fn part(&self) -> Option<&str> {
        use MeshError::*;
        match self {
            Empty { part }
            | Index { part, .. }
            | NonFinite { part, .. }
            | Degenerate { part, .. }
            | OpenEdge { part, .. }
            | NonManifoldEdge { part, .. }
            | Orientation { part, .. }
            | NonManifoldVertex { part, .. }
            | Facing { part, .. }
            | Coincident { part, .. }
            | SelfIntersection { part, .. } => Some(part),
            DuplicatePart(part) => Some(part),
            Parameter { .. }
            | Trim { .. }
            | Geometry(_)
            | Settings(_)
            | StationShape { .. }
            | Refinement { .. }
            | Unit(_) => None,
        }
    }
}

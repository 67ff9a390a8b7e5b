//! Airfoil outlines: NACA 4-digit sections (NACA Report 824), built-in shapes (`circle`,
//! `ellipse:T`), coordinate files, resampling at normalised arc length with clustering at the
//! leading and trailing edges (corners kept), and blending between stations.
//!
//! Outlines are in chord fractions with the leading edge at (0, 0) and the trailing edge at
//! (1, 0); both surfaces run from the leading edge to the trailing edge (each advancing along the
//! chord; a straight face across it, at a box's front or a flat back, may stand still). Coordinate
//! files come in one loop (trailing edge, upper surface, leading edge, lower surface) or as two
//! surfaces, in either direction, with or without a repeated closing point or a line of counts
//! (`file.rs`); the loop is then oriented, its trailing edge (a point or a straight base) and
//! leading edge found (a file already on its chord line keeps its frame), and normalised to the
//! chord line (`normalise.rs`), refusing a loop that crosses or touches itself.
//!
//! ```
//! use layloft::airfoil::{Naca4, Outline, clustered_stations};
//!
//! # fn main() -> Result<(), layloft::airfoil::AirfoilError> {
//! let section = Naca4::parse("0012", false)?;
//! let outline = Outline::from_naca(&section, 400).resample(&clustered_stations(200));
//! // Area of NACA 0012 with an open trailing edge: 0.08221 c² (integral of the Report 824
//! // thickness formula).
//! assert!((outline.area() - 0.08221).abs() < 2e-4);
//! # Ok(())
//! # }
//! ```

mod file;
mod naca;
mod normalise;
mod outline;
mod plane;
mod shapes;

pub use file::{CoordinateError, parse_coordinates, parse_coordinates_noted};
pub use naca::Naca4;
pub use outline::{Outline, clustered_stations};
pub use shapes::Shape;

/// What can be wrong with an airfoil.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum AirfoilError {
    /// A NACA code that is not four digits of a valid section.
    #[error(
        "'{code}' is not a NACA 4-digit code: expected four digits such as 0012 or 4415 (thickness above zero; camber needs its position)"
    )]
    NacaCode {
        /// The code given.
        code: String,
    },
    /// Too few points to describe an outline.
    #[error(
        "the outline has {found} point{}: expected at least {needed}",
        if *found == 1 { "" } else { "s" }
    )]
    TooFewPoints {
        /// Points found.
        found: usize,
        /// Points needed.
        needed: usize,
    },
    /// Two consecutive points at the same place.
    #[error("line {line}: the point repeats the one before it")]
    Repeated {
        /// Line of the repeated point.
        line: usize,
    },
    /// The point farthest from the trailing edge is an end point.
    #[error(
        "no leading edge: the outline must run from the trailing edge round the leading edge and back"
    )]
    NoLeadingEdge,
    /// A surface that goes backwards along the chord.
    #[error("line {line}: the {surface} surface doubles back towards the leading edge")]
    DoublesBack {
        /// Which surface.
        surface: String,
        /// Line where it turns back.
        line: usize,
    },
    /// The lower surface is given first.
    #[error(
        "the outline runs over the lower surface first: expected trailing edge, upper surface, leading edge, lower surface"
    )]
    LowerFirst,
    /// All points on one line or at one place: no area, no chord.
    #[error(
        "the outline encloses no area: its points lie on one line, so it has no chord or no depth"
    )]
    NoArea,
    /// A built-in shape with a bad name or parameter.
    #[error("{0}")]
    Shape(String),
    /// Two segments of the outline cross (or touch: a figure-eight).
    #[error("the outline crosses itself between lines {line_a} and {line_b}")]
    Crossing {
        /// Line of one segment.
        line_a: usize,
        /// Line of the other.
        line_b: usize,
    },
}

impl Outline {
    /// The outline of a NACA 4-digit section with `n` cosine-spaced points per surface.
    pub fn from_naca(section: &Naca4, n: usize) -> Outline {
        let (upper, lower) = section.surfaces(n);
        Outline { upper, lower }
    }
}

//! What can make a section unsolvable.

use crate::laminate::LaminateError;
use crate::text::fixed;

/// A section layout that cannot be solved. Every variant names the radius `r` (m) and, where
/// there is one, the chordwise place as `y/c` measured from the leading edge.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SectionError {
    /// The outline is too short, not finite, or has a zero-length edge.
    #[error("section at r = {r:.4} m: degenerate outer contour: {reason}")]
    Degenerate {
        /// Radius, m.
        r: f64,
        /// What is wrong, in words.
        reason: String,
    },
    /// A laminate index, or the number of segment laminates, does not fit the layout.
    #[error("section at r = {r:.4} m: {what}: expected {expected}, found {found}")]
    Layout {
        /// Radius, m.
        r: f64,
        /// Which list or item.
        what: String,
        /// What was expected.
        expected: String,
        /// What was found.
        found: String,
    },
    /// A laminate that cannot be reduced for a wall (no plies, or singular).
    #[error("section at r = {r:.4} m: laminate {index}: {source}")]
    Laminate {
        /// Radius, m.
        r: f64,
        /// Index into the layout's laminates.
        index: usize,
        /// The reason.
        #[source]
        source: LaminateError,
    },
    /// The outline runs the wrong way round.
    #[error(
        "section at r = {r:.4} m: the outer contour runs counter-clockwise seen from the tip; \
         expected leading edge → upper surface → trailing edge → lower surface"
    )]
    Orientation {
        /// Radius, m.
        r: f64,
    },
    /// The outline crosses itself.
    #[error(
        "section at r = {r:.4} m: the outer contour crosses itself at y/c = {}",
        fixed(*y_c, 4)
    )]
    SelfCrossing {
        /// Radius, m.
        r: f64,
        /// Chordwise place from the leading edge, fraction of chord.
        y_c: f64,
    },
    /// Walls thicker than the local depth: the upper and lower wall midlines cross away from
    /// the trailing edge.
    #[error(
        "section at r = {r:.4} m: the laminates are thicker than the local depth at y/c = {}: \
         the upper and lower wall midlines cross there (thinner plies or a deeper section needed)",
        fixed(*y_c, 4)
    )]
    WallsMeet {
        /// Radius, m.
        r: f64,
        /// Chordwise place from the leading edge, fraction of chord.
        y_c: f64,
    },
    /// A web whose line does not reach the upper or lower wall midline.
    #[error(
        "section at r = {r:.4} m: web '{web}' at y/c = {} misses the {side} wall",
        fixed(*y_c, 4)
    )]
    WebMissesWall {
        /// Radius, m.
        r: f64,
        /// The web's name.
        web: String,
        /// Chordwise place, fraction of chord from the leading edge.
        y_c: f64,
        /// `upper` or `lower`.
        side: &'static str,
    },
    /// A web behind the point where the trailing-edge walls meet, or two webs at one place or
    /// whose laminates overlap.
    #[error("section at r = {r:.4} m: web '{web}' at y/c = {}: {reason}", fixed(*y_c, 4))]
    WebPlacement {
        /// Radius, m.
        r: f64,
        /// The web's name.
        web: String,
        /// Chordwise place, fraction of chord from the leading edge.
        y_c: f64,
        /// What is wrong.
        reason: String,
    },
    /// The walls hold more laminate than the outline encloses.
    #[error(
        "section at r = {r:.4} m: the walls hold {:.0} mm² of laminate, more than the {:.0} mm² \
         the outline encloses: the plies cannot fit; expected fewer or thinner plies here, or a \
         deeper section",
        laminate_area * 1e6,
        outline_area * 1e6
    )]
    Overfull {
        /// Radius, m.
        r: f64,
        /// Thickness times midline length summed over the walls and webs, m².
        laminate_area: f64,
        /// Area the outer mould line encloses, m².
        outline_area: f64,
    },
    /// The solved stiffness is not positive definite or not finite (a wall without stiffness).
    #[error("section at r = {r:.4} m: the section stiffness is {reason}")]
    Stiffness {
        /// Radius, m.
        r: f64,
        /// What is wrong.
        reason: String,
    },
}

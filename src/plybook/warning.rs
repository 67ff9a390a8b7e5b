//! The ply book's warnings as values: which ply and pattern, where on it, and the numbers the
//! words need. The report puts them into words (`report/warnings.rs`); angles are radians,
//! lengths metres, areas square metres.

use super::book::PatternPlace;

/// A warning of the ply book about one pattern or ply region.
#[derive(Debug, Clone, PartialEq)]
pub struct PlyBookWarning {
    /// The ply's index in the schedule (0-based: lay-up order less one).
    pub row: usize,
    /// The ply's id.
    pub ply: String,
    /// The pattern's name (the ply region's, for a splice).
    pub pattern: String,
    /// Whether the pattern lies on a web (places are then radius and height fraction) rather
    /// than a skin (radius and chord fraction).
    pub web: bool,
    /// What is wrong, with its numbers.
    pub issue: PlyBookIssue,
}

/// What a ply-book warning is about.
#[derive(Debug, Clone, PartialEq)]
pub enum PlyBookIssue {
    /// A splice of a ply cut in pieces could not be kept the stagger from the splices of other
    /// plies on the same skin or web (the region is too small to move it).
    SpliceNotStaggered {
        /// The stagger asked for, m.
        stagger: f64,
        /// The ids of the plies whose splices are too near.
        others: Vec<String>,
    },
    /// A woven or stitched fabric shears past its locking angle: it will wrinkle there.
    FabricLocks {
        /// The greatest shear angle (magnitude), rad.
        shear: f64,
        /// The material's locking angle, rad.
        locking_angle: f64,
        /// Where the shear is greatest.
        at: PatternPlace,
    },
    /// The fibres of a unidirectional ply deviate from the intended direction past the limit.
    FibreDeviation {
        /// The greatest deviation (magnitude), rad.
        deviation: f64,
        /// The limit of the check, rad.
        limit: f64,
        /// Where the deviation is greatest.
        at: PatternPlace,
    },
    /// The draped net cannot be carried to a place of the region, not even in pieces: the
    /// pattern ends short of the region there.
    CutShort {
        /// The first place the net could not reach.
        at: PatternPlace,
        /// Outline points moved in.
        moved: usize,
        /// Outline points in all.
        points: usize,
        /// The pattern's area, m².
        area: f64,
    },
    /// The draped net stops short of the region near a place: outline points were
    /// extrapolated.
    Extrapolated {
        /// The first extrapolated place.
        at: PatternPlace,
        /// Outline points extrapolated.
        extrapolated: usize,
    },
}

//! The analysis chain's own error: the blade's or the section's, with the radius where it arose.
//! It names no file: the edge (the command line, or a caller holding the project's file
//! positions) turns it into the crate's error placed at the station nearest the radius.

use crate::blade::BladeError;
use crate::section::SectionError;

/// What can go wrong when building a blade model.
#[derive(Debug, thiserror::Error)]
pub enum AnalysisError {
    /// Lofting the blade from the project.
    #[error(transparent)]
    Blade(#[from] BladeError),
    /// Laying out or solving the section at one analysis station.
    #[error("{source}")]
    Station {
        /// Radius of the station, m.
        r: f64,
        /// What went wrong there (boxed: a section error is large).
        source: Box<StationError>,
    },
}

/// What went wrong at one analysis station.
#[derive(Debug, thiserror::Error)]
pub enum StationError {
    /// The wall layout (plies, webs, walls too thick).
    #[error(transparent)]
    Blade(#[from] BladeError),
    /// The section solver.
    #[error(transparent)]
    Section(#[from] SectionError),
}

impl AnalysisError {
    /// The radius where the error arose, for an error at a station.
    pub fn radius(&self) -> Option<f64> {
        match self {
            AnalysisError::Station { r, .. } => Some(*r),
            AnalysisError::Blade(_) => None,
        }
    }
}

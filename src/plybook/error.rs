//! The ply book's own error: bad input named by the ply (its index in the schedule and its id)
//! and key, a region the cloth cannot cover, a file that cannot be made. The command line names
//! the plies file and the ply's line (`report::plybook_error_text`).

/// What can go wrong when making the ply book.
#[derive(Debug, Clone, thiserror::Error)]
pub enum PlyBookError {
    /// A ply region with no area.
    #[error("ply '{ply}' (row {} of the ply schedule): the region has no area ({key}: {found})", .ply_index + 1)]
    ZeroArea {
        /// Index of the ply in the schedule (outermost first).
        ply_index: usize,
        /// The ply's id.
        ply: String,
        /// The keys at fault.
        key: String,
        /// What was found.
        found: String,
    },
    /// A pattern wider than its roll in every rotation allowed.
    #[error(
        "ply '{ply}' ({pattern}): the pattern is {least_mm:.0} mm wide at its narrowest allowed turn, wider than the roll of '{material}' (roll_width_mm = {roll_mm:.0}); give a wider roll or split the ply"
    )]
    RollTooNarrow {
        /// The ply's id.
        ply: String,
        /// The pattern.
        pattern: String,
        /// The material.
        material: String,
        /// The pattern's least width, mm.
        least_mm: f64,
        /// The roll width, mm.
        roll_mm: f64,
    },
    /// A region the net could not cover.
    #[error(
        "ply '{ply}' (row {} of the ply schedule) ({pattern}): the cloth cannot be draped over the region: {what}",
        .ply_index + 1
    )]
    Drape {
        /// Index of the ply in the schedule (outermost first).
        ply_index: usize,
        /// The ply's id.
        ply: String,
        /// The pattern.
        pattern: String,
        /// What failed, with the place.
        what: String,
    },
    /// A file of the ply book that could not be made.
    #[error("the ply book's file {file} cannot be made: {what}")]
    Output {
        /// The file, relative to the ply book's folder.
        file: String,
        /// What failed.
        what: String,
    },
}

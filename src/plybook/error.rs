//! The ply book's own error: bad input named with the file, line, ply and key, a region the
//! cloth cannot cover, a file that cannot be made.

/// What can go wrong when making the ply book.
#[derive(Debug, Clone, thiserror::Error)]
pub enum PlyBookError {
    /// A ply region with no area.
    #[error("{file} line {line}, ply '{ply}': the region has no area ({key}: {found})")]
    ZeroArea {
        /// The plies file.
        file: String,
        /// Line of the ply.
        line: usize,
        /// The ply's id.
        ply: String,
        /// The keys at fault.
        key: String,
        /// What was found.
        found: String,
    },
    /// A pattern wider than its roll in every rotation allowed.
    #[error(
        "ply '{ply}' ({pattern}): the pattern is {least_mm:.0} mm wide at its narrowest allowed turn, wider than the roll of '{material}' (roll_width_mm = {roll_mm:.0} in {file}); give a wider roll or split the ply"
    )]
    RollTooNarrow {
        /// The ply's id.
        ply: String,
        /// The pattern.
        pattern: String,
        /// The material.
        material: String,
        /// The materials file.
        file: String,
        /// The pattern's least width, mm.
        least_mm: f64,
        /// The roll width, mm.
        roll_mm: f64,
    },
    /// A region the net could not cover.
    #[error(
        "{file} line {line}, ply '{ply}' ({pattern}): the cloth cannot be draped over the region: {what}"
    )]
    Drape {
        /// The plies file.
        file: String,
        /// Line of the ply.
        line: usize,
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

//! Warnings about the blade as a whole: values, turned into words by the report
//! (`report::warnings`).

/// A warning about the whole blade.
#[derive(Debug, Clone, PartialEq)]
pub enum BladeWarning {
    /// What was changed to read an airfoil coordinate file (points reversed, repeats removed),
    /// in the words of the coordinate reader, which names the file.
    CoordinateFile(String),
    /// The blade is short for its chord: beam theory is strained.
    Stubby {
        /// Span from the first to the last station, m.
        span: f64,
        /// Mean chord over the span, m.
        mean_chord: f64,
    },
    /// The surface leans from the span direction (twist, taper): the sections, cut square to
    /// the span, see less laminate than the surface holds.
    Leaning {
        /// Radius where it leans most, m.
        r: f64,
        /// The surface's area over that of the strips the section sees there (at least 1).
        factor: f64,
    },
}

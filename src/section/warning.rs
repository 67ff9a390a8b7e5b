//! Where the thin-wall idealisation of one section is strained: values with the places and
//! numbers, turned into words by the report (`report::warnings`).

/// A warning about one solved section.
#[derive(Debug, Clone, PartialEq)]
pub enum SectionWarning {
    /// The upper and lower walls meet ahead of the trailing edge; aft of the meeting point the
    /// walls are taken as solid laminate on the mean line, carrying no torsional shear flow.
    WallsMeet {
        /// Where they meet, chord fraction from the leading edge.
        at_y_c: f64,
        /// Where the walls first pass the thick-wall ratio of the local depth going aft, chord
        /// fraction, when they do.
        converging_from_y_c: Option<f64>,
        /// The thick-wall ratio (wall thickness over local depth) of the check.
        limit_ratio: f64,
    },
    /// A wall is thick for its local depth: the thin-wall stiffness there is approximate.
    ThickWall {
        /// The greatest wall thickness over local depth.
        ratio: f64,
        /// Where it occurs, chord fraction.
        at_y_c: f64,
        /// The ratio below which thin-wall theory is usually trusted (common practice).
        limit_ratio: f64,
    },
    /// The walls have no mass: the mass centre is put at the pitch axis.
    NoMass,
}

impl SectionWarning {
    /// Whether two warnings are of one kind (alike but for their numbers), for grouping the
    /// warnings of many stations into one line.
    pub fn same_kind(&self, other: &SectionWarning) -> bool {
        match (self, other) {
            (
                SectionWarning::WallsMeet { converging_from_y_c: a, .. },
                SectionWarning::WallsMeet { converging_from_y_c: b, .. },
            ) => a.is_some() == b.is_some(),
            (SectionWarning::ThickWall { .. }, SectionWarning::ThickWall { .. })
            | (SectionWarning::NoMass, SectionWarning::NoMass) => true,
            _ => false,
        }
    }
}

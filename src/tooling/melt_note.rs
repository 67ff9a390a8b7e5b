//! What each comparison of the melting and draining checks found, as values: the report words
//! them (`report/tooling/words.rs`). Temperatures are [`Temperature`]s, lengths metres, areas
//! square metres.

use crate::mesh::End;
use crate::units::Temperature;

/// A stage of the resin's process the core alloy is compared against.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ProcessStage {
    /// Resin injection.
    Injection,
    /// Gelation of the resin.
    Gelation,
    /// The cure.
    Cure,
}

/// What one comparison of the melting or draining check found.
#[derive(Debug, Clone, PartialEq)]
pub enum MeltNote {
    /// The project names no core alloy: nothing compared.
    NoAlloy,
    /// The alloy record gives no melting range (`solidus_C`, `liquidus_C`).
    NoMeltingRange {
        /// The alloy's name.
        alloy: String,
    },
    /// No temperature is given for a stage.
    NoTemperature {
        /// The stage.
        stage: ProcessStage,
    },
    /// The alloy stays solid through a stage: its solidus lies above the stage's temperature.
    SolidThrough {
        /// The stage (injection or gelation).
        stage: ProcessStage,
        /// The alloy's solidus.
        solidus: Temperature,
        /// The stage's temperature.
        at: Temperature,
    },
    /// The alloy melts before the resin gels: its solidus is not above the stage's temperature.
    MeltsBeforeGel {
        /// The stage (injection or gelation).
        stage: ProcessStage,
        /// The alloy's solidus.
        solidus: Temperature,
        /// The stage's temperature.
        at: Temperature,
    },
    /// The alloy melts out in the cure: its liquidus lies below the cure temperature.
    MeltsOut {
        /// The alloy's liquidus.
        liquidus: Temperature,
        /// The cure temperature.
        cure: Temperature,
    },
    /// The alloy never melts out: its liquidus is not below the cure temperature.
    NeverMeltsOut {
        /// The alloy's liquidus.
        liquidus: Temperature,
        /// The cure temperature.
        cure: Temperature,
    },
    /// A core drains through its print: its end surface lies at most `depth` below the print's
    /// entrance (a film).
    Drains {
        /// The core's part name.
        core: String,
        /// The end its print is at.
        end: End,
        /// Greatest depth of the end surface below the entrance, m.
        depth: f64,
    },
    /// Alloy pools at a core's end: its end surface lies up to `depth` below the print's
    /// entrance with the mould upright.
    Pools {
        /// The core's part name.
        core: String,
        /// The end its print is at.
        end: End,
        /// Greatest depth of the end surface below the entrance, m.
        depth: f64,
    },
    /// The mould parts are not pocketed for a print: its seat is to be cut by hand.
    NoSeat {
        /// The core's part name.
        core: String,
        /// The end its print is at.
        end: End,
        /// The print's section, m².
        section_area: f64,
        /// Centre of the print's section (y, z), m, rotor frame.
        centre: [f64; 2],
        /// How far the pocket runs, x in m, rotor frame.
        x_end: f64,
    },
    /// A core whose print could not be made: it is sealed in the shell as with prints off.
    PrintDropped {
        /// The core's part name.
        core: String,
        /// The end its print would have left through.
        end: End,
        /// Why the print could not be made.
        reason: crate::mesh::MeshError,
    },
    /// A core without a print: bulkheads close both of its ends.
    NoPrint {
        /// The core's part name.
        core: String,
    },
}

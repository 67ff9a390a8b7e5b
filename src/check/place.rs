//! Where a criterion's governing value occurs, as data: the report puts it into words.

use crate::modal::Excitation;
use crate::stress::{PanelResult, WallLocation};
use crate::units::RotorSpeed;

/// Where the governing value of a criterion occurs.
#[derive(Debug, Clone, PartialEq)]
pub enum Place {
    /// No place is stated (a row built without one).
    Unstated,
    /// A place given in words by the caller that built the row (rows not made by
    /// [`crate::check::evaluate`]).
    Named(String),
    /// The governing ply of a load case.
    Ply {
        /// The load case.
        case: String,
        /// Radius of the station, m.
        r_m: f64,
        /// The wall point.
        location: WallLocation,
        /// The schedule ply's identity.
        ply_id: String,
    },
    /// The wall panel with the least buckling reserve factor of a load case.
    Panel {
        /// The load case.
        case: String,
        /// Radius of the station, m.
        r_m: f64,
        /// The panel, its extent and its check.
        panel: Box<PanelResult>,
    },
    /// The mode with the least frequency margin.
    Mode {
        /// The mode's track label (`None` when the mode is on no track).
        track: Option<String>,
        /// Its frequency, Hz.
        frequency_hz: f64,
        /// Whether the frequencies are those in the surrounding fluid.
        wet: bool,
        /// The nearest excitation.
        excitation: Excitation,
        /// The excitation's frequency, Hz.
        excitation_hz: f64,
        /// The name of the speed checked (nominal, maximum).
        speed: String,
        /// That speed.
        rotor_speed: RotorSpeed,
    },
    /// The blade's mass, split.
    Mass {
        /// Mass of the laminates, kg.
        laminate_kg: f64,
        /// Mass of the point masses, kg.
        point_masses_kg: f64,
    },
    /// A load case as a whole.
    Case {
        /// The load case.
        name: String,
    },
    /// Every load case was analysed and no ply has a failure index (nothing can fail).
    NoPlyCanFail,
    /// Every load case was analysed and the walls hold no panel.
    NoWallPanel,
    /// The project has no load case.
    NoLoadCase,
    /// The modal analysis was not run.
    ModalNotRun,
}

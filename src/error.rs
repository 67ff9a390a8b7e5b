//! The crate-level error: every module's error, wrapped so that `?` carries the reason up. The
//! errors below the reader name a station or ply by index and a place by radius, never a file;
//! here, given the project's positions ([`Sources`]), they are placed in the file and at the
//! line where the user wrote what caused them.

use crate::analysis::{AnalysisError, StationError};
use crate::blade::BladeError;
use crate::input::{InputError, Location, Sources};
use crate::laminate::LaminateError;
use crate::loads::LoadsError;
use crate::material::MaterialError;
use crate::mesh::MeshError;
use crate::modal::ModalError;
use crate::plybook::PlyBookError;
use crate::section::SectionError;
use crate::stress::StressError;

/// Any error layloft's library can return.
#[derive(Debug, thiserror::Error)]
pub enum Error {
    /// Bad input: a file, line or key and what was wrong with it.
    #[error(transparent)]
    Input(#[from] InputError),
    /// A material record or reference.
    #[error(transparent)]
    Material(#[from] MaterialError),
    /// A laminate code or laminate.
    #[error(transparent)]
    Laminate(#[from] LaminateError),
    /// The blade geometry or ply schedule.
    #[error(transparent)]
    Blade(#[from] BladeError),
    /// Load cases.
    #[error(transparent)]
    Loads(#[from] LoadsError),
    /// A section that cannot be solved.
    #[error(transparent)]
    Section(#[from] SectionError),
    /// Stress recovery.
    #[error(transparent)]
    Stress(#[from] StressError),
    /// A tooling mesh that cannot be built or fails its checks.
    #[error(transparent)]
    Mesh(#[from] MeshError),
    /// The modal analysis: bad model data or speeds, or an eigen solution that failed.
    #[error(transparent)]
    Modal(#[from] ModalError),
    /// The ply book: a region that cannot be draped, a roll too narrow.
    #[error(transparent)]
    PlyBook(#[from] PlyBookError),
    /// Writing an output file.
    #[error("cannot write {path}: {source}")]
    Write {
        /// The file or folder.
        path: String,
        /// The reason.
        #[source]
        source: std::io::Error,
    },
}

impl Error {
    /// An analysis error placed in the project's files: an error at a station is placed at the
    /// station nearest its radius (see [`Error::at_station`]); an error of lofting the blade
    /// names its own place ([`Error::in_files`]).
    pub fn placed(e: AnalysisError, sources: &Sources) -> Error {
        match e {
            AnalysisError::Blade(e) => Error::in_files(e, sources),
            AnalysisError::Station { r, source } => Error::at_station(sources, r, (*source).into()),
        }
    }

    /// A blade error in the words of the project's files: a station's airfoil at its line of the
    /// stations file, walls too thick with the plies file and the line of the nearest station, a
    /// hole in the skin or a web without plies with the plies file; other errors as they are.
    pub fn in_files(e: BladeError, sources: &Sources) -> Error {
        let plies = Location::file(sources.files.plies.clone());
        match e {
            BladeError::Airfoil { station, message } => {
                InputError::at(sources.station(station), message).into()
            }
            BladeError::TooThick { r, station, x, upper_mm, lower_mm, depth_mm } => {
                let text = format!(
                    "at r = {r:.4} m (station near line {}), x/c = {} {}",
                    sources.station_line(station),
                    crate::text::fixed(x, 3),
                    BladeError::thicker_text(upper_mm, lower_mm, depth_mm)
                );
                InputError::at(plies, text).into()
            }
            e @ (BladeError::NoPlies { .. } | BladeError::WebWithoutPlies { .. }) => {
                InputError::at(plies, e.to_string()).into()
            }
            other => other.into(),
        }
    }

    /// An error of the section at radius `r` placed at the nearest station of the stations file,
    /// so that the user knows where to look. Errors that carry their own place are left at it:
    /// input errors, and the blade errors that name a station (an airfoil, walls too thick),
    /// which go to their line ([`Error::in_files`]).
    pub fn at_station(sources: &Sources, r: f64, e: Error) -> Error {
        let e = match e {
            Error::Input(_) => return e,
            Error::Blade(b @ (BladeError::Airfoil { .. } | BladeError::TooThick { .. })) => {
                return Error::in_files(b, sources);
            }
            Error::Blade(b) => Error::in_files(b, sources),
            other => other,
        };
        let location = match sources.nearest_station(r) {
            Some(i) => sources.station(i).with_field("r_m"),
            None => Location::file(sources.files.stations.clone()),
        };
        InputError::at(location, format!("{e} (this is the station nearest to r = {r:.4} m)"))
            .into()
    }
}

impl From<StationError> for Error {
    fn from(e: StationError) -> Self {
        match e {
            StationError::Blade(e) => e.into(),
            StationError::Section(e) => e.into(),
        }
    }
}

/// The analysis error as it is, not placed in the project's files (for a caller without them;
/// the command line uses [`Error::placed`]).
impl From<AnalysisError> for Error {
    fn from(e: AnalysisError) -> Self {
        match e {
            AnalysisError::Blade(e) => e.into(),
            AnalysisError::Station { source, .. } => (*source).into(),
        }
    }
}

//! The crate-level error: every module's error, wrapped so that `?` carries the reason up. An
//! error of the analysis chain, which names a radius but no file, is placed here at the station
//! nearest that radius, where the project's file positions are known.

use crate::analysis::{AnalysisError, StationError};
use crate::blade::BladeError;
use crate::input::{InputError, Location};
use crate::laminate::LaminateError;
use crate::loads::LoadsError;
use crate::material::MaterialError;
use crate::mesh::MeshError;
use crate::modal::ModalError;
use crate::plybook::PlyBookError;
use crate::project::Project;
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
    /// An analysis error placed in the project's files: an error at a station that names no line
    /// of an input file is placed at the nearest station of the stations file (see
    /// [`Error::at_station`]); an error of lofting the blade names its own place.
    pub fn placed(e: AnalysisError, project: &Project) -> Error {
        match e {
            AnalysisError::Blade(e) => e.into(),
            AnalysisError::Station { r, source } => Error::at_station(project, r, (*source).into()),
        }
    }

    /// An error of the section at radius `r` that names no line of an input file (a section
    /// error, or a blade error naming only the plies file, such as a web without plies) placed
    /// at the nearest station of the stations file, so that the user knows where to look; input
    /// errors, which carry their own place, are left as they are.
    pub fn at_station(project: &Project, r: f64, e: Error) -> Error {
        if let Error::Input(_) = e {
            return e;
        }
        let text = e.to_string();
        if text.contains(" line ") {
            return e;
        }
        let nearest =
            project.stations.iter().min_by(|a, b| (a.r - r).abs().total_cmp(&(b.r - r).abs()));
        let location = match nearest {
            Some(s) => Location::line(project.files.stations.clone(), s.line).with_field("r_m"),
            None => Location::file(project.files.stations.clone()),
        };
        InputError::at(location, format!("{text} (this is the station nearest to r = {r:.4} m)"))
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
